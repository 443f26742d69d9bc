package calc

import (
	"errors"
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// Sources; tags as in calc/testdata/reference/water-and-atmosphere.md (see
// water_test.go). USSA76 table entries were read from the printed tables by
// third parties [S]; the note found two independent copies that agree
// with each other and with the defining formula.
const (
	srcUSSA76TableI = "U.S. Standard Atmosphere 1976, Table I (geometric altitude), via third-party copies [S]"
	srcUSSA76TableH = "U.S. Standard Atmosphere 1976, geopotential-altitude table, via a third-party reading [S]"
	srcUSSA76Exact  = "reference note §4, Eq. (33a) evaluated independently with the USSA76 constants [C]"
	srcISAPa        = "ISA table values in Pa quoted by independent implementations (reference note §4) [S]"
	srcUSSA76P0     = "U.S. Standard Atmosphere 1976, Table 2: P0 = 101325 Pa (definition)"
)

// ussa76Geometric converts a geopotential altitude H (m′) to geometric
// altitude z = r0·H/(r0 − H) (the inverse of USSA76 Eq. (18)).
func ussa76Geometric(h float64) Length {
	return Length(ussa76R0 * h / (ussa76R0 - h))
}

func TestStandardAtmosphereSeaLevel(t *testing.T) {
	p, err := StandardAtmosphere(0)
	if err != nil || p != 101325 || StandardSeaLevelPressure != 101325 {
		t.Errorf("StandardAtmosphere(0) = %v, %v; want exactly 101325 Pa (%s)", float64(p), err, srcUSSA76P0)
	}
}

// TestStandardAtmosphereTables checks the printed USSA76 pressures. The
// printed pressures are truncated, not rounded (reference note §4 and
// Appendix B), so the rule is table ≤ computed < table + 1 unit of the last
// printed digit.
func TestStandardAtmosphereTables(t *testing.T) {
	tests := []struct {
		name   string
		z      Length  // geometric altitude, m
		table  float64 // printed pressure, Pa
		unit   float64 // one unit of the last printed digit, Pa
		source string
	}{
		{"Z 50 m", 50, 1.0072e5, 10, srcUSSA76TableI},
		{"Z 500 m", 500, 95461, 1, srcUSSA76TableI},
		{"Z 550 m", 550, 94890, 1, srcUSSA76TableI},
		{"Z 850 m", 850, 91523, 1, srcUSSA76TableI},
		{"Z 1000 m", 1000, 898.76e2, 1, srcUSSA76TableI},
		{"Z 2000 m", 2000, 795.01e2, 1, srcUSSA76TableI},
		{"Z 2500 m", 2500, 74691, 1, srcUSSA76TableI},
		{"Z 3000 m", 3000, 701.21e2, 1, srcUSSA76TableI},
		{"Z 5000 m", 5000, 540.48e2, 1, srcUSSA76TableI},
		{"Z 6500 m", 6500, 44075, 1, srcUSSA76TableI},
		{"Z 9000 m", 9000, 30800, 1, srcUSSA76TableI},
		{"Z 11000 m", 11000, 22699, 1, srcUSSA76TableI},
		// Geopotential table, entered at the equivalent geometric altitude.
		{"H 1000 m′", ussa76Geometric(1000), 898.74e2, 1, srcUSSA76TableH},
		{"H 3000 m′", ussa76Geometric(3000), 701.08e2, 1, srcUSSA76TableH},
		{"H 4500 m′", ussa76Geometric(4500), 577.28e2, 1, srcUSSA76TableH},
	}
	for _, tc := range tests {
		got, err := StandardAtmosphere(tc.z)
		if err != nil {
			t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
		}
		if g := float64(got); !(g >= tc.table && g < tc.table+tc.unit) {
			t.Errorf("%s: p = %.3f Pa, want in [%g, %g) Pa (truncated table) (%s)", tc.name, g, tc.table, tc.table+tc.unit, tc.source)
		}
	}
}

func TestStandardAtmosphereFormula(t *testing.T) {
	tests := []struct {
		name   string
		z      Length
		want   float64 // Pa
		tol    float64 // Pa, absolute
		source string
	}{
		// Printed to 0.001 Pa: half a unit (Appendix B).
		{"H 500 m′", ussa76Geometric(500), 95460.839, 0.0005, srcUSSA76Exact},
		{"H 1000 m′", ussa76Geometric(1000), 89874.571, 0.0005, srcUSSA76Exact},
		{"H 1500 m′", ussa76Geometric(1500), 84556.005, 0.0005, srcUSSA76Exact},
		{"H 2000 m′", ussa76Geometric(2000), 79495.216, 0.0005, srcUSSA76Exact},
		{"H 2500 m′", ussa76Geometric(2500), 74682.534, 0.0005, srcUSSA76Exact},
		{"H 3000 m′", ussa76Geometric(3000), 70108.545, 0.0005, srcUSSA76Exact},
		{"H 4000 m′", ussa76Geometric(4000), 61640.235, 0.0005, srcUSSA76Exact},
		{"H 4500 m′", ussa76Geometric(4500), 57728.323, 0.0005, srcUSSA76Exact},
		{"H 5000 m′", ussa76Geometric(5000), 54019.912, 0.0005, srcUSSA76Exact},
		// Printed to 0.01 Pa.
		{"Z 50 m", 50, 100725.79, 0.005, srcUSSA76Exact},
		{"Z 2500 m", 2500, 74691.76, 0.005, srcUSSA76Exact},
		{"Z 11000 m", 11000, 22699.96, 0.005, srcUSSA76Exact},
		// ISA values in Pa to 0.1 Pa: half a unit.
		{"ISA 1000 m′", ussa76Geometric(1000), 89874.6, 0.05, srcISAPa},
		{"ISA 2000 m′", ussa76Geometric(2000), 79495.2, 0.05, srcISAPa},
		{"ISA 4000 m′", ussa76Geometric(4000), 61640.2, 0.05, srcISAPa},
		{"ISA 5000 m′", ussa76Geometric(5000), 54019.9, 0.05, srcISAPa},
	}
	for _, tc := range tests {
		got, err := StandardAtmosphere(tc.z)
		if err != nil {
			t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
		}
		// tol is absolute, in Pa: over |want| for the one rule
		testkit.Close(t, tc.name+": p (Pa)", float64(got), tc.want, tc.tol/tc.want, tc.source)
	}
}

func TestStandardAtmosphereFallsWithAltitude(t *testing.T) {
	prev := math.Inf(1)
	for z := -1000; z <= 11000; z += 10 {
		p, err := StandardAtmosphere(Length(z))
		if err != nil {
			t.Fatalf("%d m: %v", z, err)
		}
		if float64(p) >= prev || p <= 0 {
			t.Fatalf("p(%d m) = %g Pa did not fall (%s: pressure falls with altitude)", z, float64(p), srcWaterPhysics)
		}
		prev = float64(p)
	}
	// Below sea level the pressure exceeds P0 (z = −1000 m: about 113.9 kPa,
	// from Eq. (33a)).
	if p, _ := StandardAtmosphere(-1000); p <= StandardSeaLevelPressure || p > 114000 {
		t.Errorf("p(−1000 m) = %v, want a little under 114 kPa (%s)", p, srcWaterPhysics)
	}
}

func TestStandardAtmosphereInvalid(t *testing.T) {
	for _, tc := range []struct {
		z        float64
		sentinel error
	}{
		{math.NaN(), ErrNotFinite},
		{math.Inf(1), ErrNotFinite},
		{math.Inf(-1), ErrNotFinite},
		{-1000.5, ErrOutOfRange},
		{11000.5, ErrOutOfRange},
		{-6356766, ErrOutOfRange}, // r0 + z = 0 would divide by zero
	} {
		p, err := StandardAtmosphere(Length(tc.z))
		var re *RangeError
		if !errors.As(err, &re) || re.Quantity != "altitude" || !errors.Is(err, tc.sentinel) {
			t.Errorf("StandardAtmosphere(%g) error = %v, want *RangeError on altitude wrapping %v", tc.z, err, tc.sentinel)
			continue
		}
		if p != 0 || re.Min != -1000 || re.Max != 11000 || re.Unit != "m" {
			t.Errorf("StandardAtmosphere(%g) = %v, range [%g, %g] %s; want 0 and [-1000, 11000] m", tc.z, p, re.Min, re.Max, re.Unit)
		}
	}
}

var atmosphereSink Pressure

func BenchmarkStandardAtmosphere(b *testing.B) {
	b.ReportAllocs()
	var err error
	for i := 0; i < b.N; i++ {
		atmosphereSink, err = StandardAtmosphere(Length(i & 4095))
	}
	_ = err
}
