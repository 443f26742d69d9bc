package presets

import (
	"errors"
	"math"
	"strings"
	"testing"

	"drawdown/calc/testkit"
)

// The vacuum rating of each built-in material, gauge, positive for vacuum.
// Sources: NFPA 1962 (2013) service-tests suction hose at 22 inHg
// (= 22 × 3386.389 Pa, NIST SP 811: 74.50 kPa); a maker's note gives
// -0.06 to -0.08 MPa for standard PVC steel-wire suction hose; garden and
// plain hose carry no rating and lay-flat holds none (common practice).
func TestVacuumRatings(t *testing.T) {
	c := Builtin()
	cases := []struct {
		id    string
		class VacuumClass
		kPa   float64
	}{
		{"suction-smooth", VacuumRated, 22 * 3386.389 / 1000}, // 1 inHg = 3386.389 Pa (NIST SP 811)
		{"suction-corrugated", VacuumRated, 60},
		{"garden-hose", VacuumNotRated, 0},
		{"rubber-smooth", VacuumNotRated, 0},
		{"pvc-smooth", VacuumNotRated, 0},
		{"pvc-pipe", VacuumNotRated, 0},
		{"lay-flat", VacuumNone, 0},
		{"steel", VacuumRated, 101.325},
		{"galvanised", VacuumRated, 101.325},
		{"copper", VacuumRated, 101.325},
	}
	for _, k := range cases {
		m, ok := c.Material(k.id)
		if !ok {
			t.Fatalf("no %s", k.id)
		}
		if m.VacuumClass != k.class || !testkit.Within(float64(m.Vacuum)/1000, k.kPa, (0.01)/math.Abs(k.kPa)) {
			t.Errorf("%s: %v %v, want %v %g kPa", k.id, m.VacuumClass, m.Vacuum, k.class, k.kPa)
		}
		if m.Collapses != (k.class == VacuumNone) {
			t.Errorf("%s: collapses %v with vacuum %v", k.id, m.Collapses, m.VacuumClass)
		}
	}
	for _, m := range c.Materials() {
		if m.VacuumSource == "" {
			t.Errorf("%s: no vacuum source", m.ID)
		}
		if m.Vacuum > FullVacuum || m.Vacuum < 0 {
			t.Errorf("%s: %v beyond full vacuum", m.ID, m.Vacuum)
		}
	}
}

// The full-vacuum claims against ring buckling of a long tube (Timoshenko
// & Gere, Theory of Elastic Stability, 2nd ed., §7.5: p = 2E/(1-ν²)·(t/D)³,
// analytic; E and ν from memory): every Sch 40 steel size holds over 30 MPa,
// 300 times full vacuum; copper at t/D = 0.025 about 4 MPa.
func TestFullVacuumRingBuckling(t *testing.T) {
	ring := func(e, nu, tD float64) float64 { return 2 * e / (1 - nu*nu) * tD * tD * tD }
	least := math.Inf(1)
	for _, s := range Builtin().Series() {
		if s.ID != "sch40" {
			continue
		}
		for _, n := range s.Sizes {
			least = math.Min(least, ring(200e9, 0.3, float64(n.Wall/n.OD)))
		}
	}
	if !(least > 30e6) {
		t.Errorf("Sch 40 ring buckling %.3g Pa", least)
	}
	if cu := ring(117e9, 0.34, 0.025); !testkit.Within(cu, 4.1e6, 0.05) {
		t.Errorf("copper ring buckling %.3g Pa", cu)
	}
}

// The vacuum keys of a user material.
func TestUserVacuum(t *testing.T) {
	const head = "[[material]]\nid = \"m\"\nroughness_mm = 1\nsource = \"s\"\n"
	ok := []struct {
		body  string
		class VacuumClass
		pa    float64
	}{
		{"", VacuumNotRated, 0},
		{"vacuum_kpa = 85\n", VacuumRated, 85000},
		{"vacuum = \"rated\"\nvacuum_kpa = 101.325\n", VacuumRated, 101325},
		{"collapses = true\n", VacuumNone, 0},
		{"vacuum = \"none\"\n", VacuumNone, 0},
		{"vacuum = \"not rated\"\n", VacuumNotRated, 0},
	}
	for _, k := range ok {
		c, err := LoadUser(strings.NewReader(head+k.body), "p.toml")
		if err != nil {
			t.Errorf("%q: %v", k.body, err)
			continue
		}
		m, _ := c.Material("m")
		if m.VacuumClass != k.class || float64(m.Vacuum) != k.pa || m.Collapses != (k.class == VacuumNone) {
			t.Errorf("%q: %+v", k.body, m)
		}
	}
	bad := []struct {
		body, field, want string
	}{
		{"vacuum = \"maybe\"\n", "vacuum", `use "rated"`},
		{"vacuum = \"rated\"\n", "vacuum_kpa", "missing"},
		{"vacuum = \"none\"\nvacuum_kpa = 50\n", "vacuum_kpa", `only with vacuum = "rated"`},
		{"collapses = true\nvacuum_kpa = 50\n", "collapses", "holds no vacuum"},
		{"collapses = true\nvacuum = \"rated\"\nvacuum_kpa = 50\n", "collapses", "holds no vacuum"},
		{"collapses = true\nvacuum = \"not rated\"\n", "collapses", `vacuum is "not rated"`},
		{"vacuum_kpa = 150\n", "vacuum_kpa", "accepted 1 to 101.33 kPa"},
		{"vacuum_kpa = -20\n", "vacuum_kpa", "out of range"},
	}
	for _, k := range bad {
		_, err := LoadUser(strings.NewReader(head+k.body), "p.toml")
		var pe *ParseError
		if !errors.As(err, &pe) || !strings.HasSuffix(pe.Field, k.field) || !strings.Contains(err.Error(), k.want) {
			t.Errorf("%q: %v; want %s: %s", k.body, err, k.field, k.want)
		}
	}
	if VacuumClass(9).String() != "unknown" {
		t.Error("unknown class")
	}
}
