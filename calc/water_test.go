package calc

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// Sources of the check values below. The tags in brackets follow the
// collected reference note calc/testdata/reference/water-and-atmosphere.md:
//
//	[P]  published check value from the standard's own verification table;
//	[P2] published value from a secondary publication (handbook, paper);
//	[C]  computed by the reference note's independent evaluator from the
//	     standard's equations — a regression value, not a published number;
//	[M]  from memory, unconfirmed.
const (
	srcIF97T35      = "IAPWS R7-97(2012) IF97, Table 35 [P]"
	srcIF97T36      = "IAPWS R7-97(2012) IF97, Table 36 [P]"
	srcIF97T5       = "IAPWS R7-97(2012) IF97, Table 5 [P]"
	srcR1208T4      = "IAPWS R12-08 (2008), Table 4, computed with μ̄2 = 1 [P]"
	srcNoteSat      = "reference note §1, Eq. (30)/(31) evaluated independently [C]"
	srcNoteRho      = "reference note §2, 1-atm table, IF97 Region 1 column [C]"
	srcNoteMu       = "reference note §3, 1-atm table, R12-08 with IF97 density [C]"
	srcSR709        = "IAPWS SR7-09 (2009), Table 6 (IAPWS-95 based) [P]"
	srcR1308        = "IAPWS R13-08 (2008), Table 8, pure-water part g_p (IAPWS-95 based) [P]"
	srcITTC         = "ITTC Recommended Procedure 7.5-02-01-03 (2011), Table 1, fresh water [P2]"
	srcTanaka       = "Tanaka et al. 2001, Metrologia 38, 301, doi:10.1088/0026-1394/38/4/3, recommended table [P2]"
	srcPerry        = "Perry's Chemical Engineers' Handbook, 9th ed., Table 2-135, saturated liquid [P2]"
	srcISO3666      = "ISO/TR 3666:1998, viscosity of water at 20 °C, 1.0016 mPa·s [M] (value from memory)"
	srcWaterPhysics = "physical property (analytic expectation)"
	srcCommonWtr    = "common practice: water boils below 100 °C at altitude"
)

// Water's own bounds that the tests walk: IF97 Region 1 ends at 623.15 K;
// R12-08's viscosity covers the fluid to 1173.15 K and, for the liquid, up
// to about 1 GPa, inside 1250 kg/m³.
const (
	waterRegion1MaxTemperature   = 623.15  // K
	waterViscosityMaxTemperature = 1173.15 // K
	waterViscosityMaxDensity     = 1250.0  // kg/m³
)

func TestWaterSaturationPressureIF97(t *testing.T) {
	tests := []struct {
		name   string
		T      Temperature
		want   Pressure
		relTol float64
		source string
	}{
		{"300 K", 300, 0.353658941e-2 * 1e6, 1e-8, srcIF97T35},
		{"500 K", 500, 0.263889776e+1 * 1e6, 1e-8, srcIF97T35},
		{"600 K", 600, 0.123443146e+2 * 1e6, 1e-8, srcIF97T35},
	}
	for _, tc := range tests {
		got, err := WaterSaturationPressure(tc.T)
		if err != nil {
			t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
		}
		testkit.Close(t, tc.name+": p_s (Pa)", float64(got), float64(tc.want), tc.relTol, tc.source)
	}
}

// TestWaterSaturationTemperatureIF97 checks Eq. (31), which Water uses to
// name the boiling point in its ErrBoiling error.
func TestWaterSaturationTemperatureIF97(t *testing.T) {
	tests := []struct {
		name   string
		p      Pressure
		want   Temperature
		relTol float64
		source string
	}{
		{"0.1 MPa", 0.1e6, 0.372755919e+3, 1e-8, srcIF97T36},
		{"1 MPa", 1e6, 0.453035632e+3, 1e-8, srcIF97T36},
		{"10 MPa", 10e6, 0.584149488e+3, 1e-8, srcIF97T36},
		// Half a unit of the last printed digit (Appendix B general rule).
		{"1 atm", 101325, 373.1243, 0.00005 / 373.1243, srcNoteSat},
	}
	for _, tc := range tests {
		got := waterSatTemperature(float64(tc.p))
		testkit.Close(t, tc.name+": T_s (K)", got, float64(tc.want), tc.relTol, tc.source)
	}
}

// TestWaterSaturationPressureFieldRange checks Eq. (30) over the range a
// drain meets, against the reference note's computed table (kPa to four
// decimals; tolerance half a unit of the last digit, 0.05 Pa).
func TestWaterSaturationPressureFieldRange(t *testing.T) {
	tests := []struct {
		celsius float64
		kPa     float64
	}{
		{0.01, 0.6117}, {5, 0.8726}, {10, 1.2282}, {15, 1.7057}, {20, 2.3392},
		{25, 3.1697}, {30, 4.2467}, {40, 7.3844}, {50, 12.3513}, {60, 19.9458},
		{70, 31.2006}, {80, 47.4147}, {90, 70.1824}, {100, 101.4180},
	}
	for _, tc := range tests {
		got, err := WaterSaturationPressure(Celsius(tc.celsius))
		if err != nil {
			t.Fatalf("%g °C: unexpected error %v", tc.celsius, err)
		}
		if !testkit.Within(float64(got), tc.kPa*1e3, 0.05/(tc.kPa*1e3)) {
			t.Errorf("%g °C: p_s = %.4f Pa, want %.1f Pa ±0.05 Pa (%s)", tc.celsius, float64(got), tc.kPa*1e3, srcNoteSat)
		}
	}
	// Lower end of Region 4: p_s(273.15 K) = 611.2127 Pa.
	got, err := WaterSaturationPressure(273.15)
	if err != nil || !testkit.Within(float64(got), 611.2127, 0.00005/611.2127) {
		t.Errorf("p_s(273.15 K) = %.6f Pa, %v; want 611.2127 Pa ±0.00005 (%s)", float64(got), err, srcNoteSat)
	}
}

// TestWaterSaturationRoundTrip: Eq. (30) and Eq. (31) solve the same
// quadratic, IF97 Eq. (29), so each inverts the other up to rounding.
func TestWaterSaturationRoundTrip(t *testing.T) {
	for T := 273.15; T <= 647.0; T += 0.37 {
		p, err := WaterSaturationPressure(Temperature(T))
		if err != nil {
			t.Fatalf("p_s(%g K): %v", T, err)
		}
		if float64(p) < waterMinSaturationPressure {
			continue // 273.15 K lies 0.0003 Pa below Eq. (31)'s stated lower bound
		}
		back := waterSatTemperature(float64(p))
		testkit.Close(t, fmt.Sprintf("T_s(p_s(%g K))", T), back, T, 1e-12, "IF97 Eq. (29): Eq. (30) and (31) are mutual inverses")
	}
}

func TestWaterVaporPressureRises(t *testing.T) {
	prev := 0.0
	for T := 273.15; T <= waterCriticalTemperature; T += 0.25 {
		p, err := WaterSaturationPressure(Temperature(T))
		if err != nil {
			t.Fatalf("%g K: %v", T, err)
		}
		if float64(p) <= prev {
			t.Fatalf("p_s(%g K) = %g Pa is not above the previous %g Pa (%s: vapour pressure rises with temperature)", T, float64(p), prev, srcWaterPhysics)
		}
		prev = float64(p)
	}
}

func TestWaterDensityIF97Table5(t *testing.T) {
	tests := []struct {
		name   string
		T      Temperature
		p      Pressure
		v      float64 // specific volume, m³/kg
		relTol float64
		source string
	}{
		{"300 K, 3 MPa", 300, 3e6, 0.100215168e-2, 1e-8, srcIF97T5},
		{"300 K, 80 MPa", 300, 80e6, 0.971180894e-3, 1e-8, srcIF97T5},
		{"500 K, 3 MPa", 500, 3e6, 0.120241800e-2, 1e-8, srcIF97T5},
	}
	for _, tc := range tests {
		// Eq. (7) as Water evaluates it; through Water itself where the
		// state is inside Water's range (0–100 °C).
		rho := waterRegion1Density(float64(tc.T), float64(tc.p))
		if tc.T <= waterToolMaxTemperature {
			f, err := Water(tc.T, tc.p)
			if err != nil {
				t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
			}
			rho = float64(f.Density)
		}
		testkit.Close(t, tc.name+": v (m³/kg)", 1/rho, tc.v, tc.relTol, tc.source)
	}
}

// TestWaterRegion1PowerLadder checks the fast evaluation of γ_π against a
// plain one with math.Pow, term by term from IF97 Table 2, over the whole of
// Region 1 (analytic: the same sum evaluated two ways).
func TestWaterRegion1PowerLadder(t *testing.T) {
	for T := 273.15; T <= 623.15; T += 7.3 {
		for _, p := range []float64{611.3, 1e4, 101325, 1e6, 2e7, 1e8} {
			if p < waterSatPressure(T) {
				continue
			}
			pi := p / region1PStar
			tau := region1TStar / T
			var gpi float64
			for _, tm := range region1Terms {
				gpi -= tm.N * float64(tm.I) * math.Pow(7.1-pi, float64(tm.I-1)) * math.Pow(tau-1.222, float64(tm.J))
			}
			want := 1 / (waterGasConstant * T / p * pi * gpi)
			if got := waterRegion1Density(T, p); !testkit.Within(got, want, 1e-13) {
				t.Errorf("ρ(%g K, %g Pa) = %.15g, plain sum gives %.15g (analytic)", T, p, got, want)
			}
		}
	}
}

func TestWaterDensityOneAtmosphere(t *testing.T) {
	const atm = 101325.0
	tests := []struct {
		name   string
		T      Temperature
		p      Pressure // 0 means saturated: p = p_s(T)
		want   Density
		tol    float64
		rel    bool
		source string
	}{
		// IF97 Region 1 at 1 atm, printed to 4 decimals: half a unit.
		{"0 °C", Celsius(0), atm, 999.8443, 5e-5, false, srcNoteRho},
		{"4 °C", Celsius(4), atm, 999.9754, 5e-5, false, srcNoteRho},
		{"5 °C", Celsius(5), atm, 999.9669, 5e-5, false, srcNoteRho},
		{"10 °C", Celsius(10), atm, 999.7015, 5e-5, false, srcNoteRho},
		{"15 °C", Celsius(15), atm, 999.1011, 5e-5, false, srcNoteRho},
		{"20 °C", Celsius(20), atm, 998.2061, 5e-5, false, srcNoteRho},
		{"25 °C", Celsius(25), atm, 997.0480, 5e-5, false, srcNoteRho},
		{"30 °C", Celsius(30), atm, 995.6521, 5e-5, false, srcNoteRho},
		{"40 °C", Celsius(40), atm, 992.2243, 5e-5, false, srcNoteRho},
		{"50 °C", Celsius(50), atm, 988.0475, 5e-5, false, srcNoteRho},
		{"60 °C", Celsius(60), atm, 983.2106, 5e-5, false, srcNoteRho},
		{"70 °C", Celsius(70), atm, 977.7793, 5e-5, false, srcNoteRho},
		{"80 °C", Celsius(80), atm, 971.8029, 5e-5, false, srcNoteRho},
		{"90 °C", Celsius(90), atm, 965.3187, 5e-5, false, srcNoteRho},
		{"100 °C saturated", Celsius(100), 0, 958.3543, 5e-5, false, srcNoteRho},

		// Published IAPWS-95-based values. IF97 Region 1 is consistent with
		// IAPWS-95 to about 15 ppm here; the note suggests 2e-5 relative.
		{"SR7-09 273.15 K, 1 atm", 273.15, atm, 999.843071, 2e-5, true, srcSR709},
		{"SR7-09 313.15 K, 1 atm", 313.15, atm, 992.216354, 2e-5, true, srcSR709},
		{"SR7-09 273.15 K, 100 MPa", 273.15, 100e6, 1045.27793, 2e-5, true, srcSR709},
		{"R13-08 273.15 K, 1 atm", 273.15, atm, 1 / 0.100015694e-2, 2e-5, true, srcR1308},
		{"R13-08 353 K, 1 atm", 353, atm, 1 / 0.102892956e-2, 2e-5, true, srcR1308},
		{"ITTC 10 °C", Celsius(10), atm, 999.7025, 2e-5, true, srcITTC},
		{"ITTC 15 °C", Celsius(15), atm, 999.1026, 2e-5, true, srcITTC},
		{"ITTC 20 °C", Celsius(20), atm, 998.2072, 2e-5, true, srcITTC},
		{"ITTC 25 °C", Celsius(25), atm, 997.0476, 2e-5, true, srcITTC},
		{"ITTC 30 °C", Celsius(30), atm, 995.6495, 2e-5, true, srcITTC},
		{"ITTC 40 °C", Celsius(40), atm, 992.2164, 2e-5, true, srcITTC},
		// Tanaka's SMOW table is within 1.2 ppm of IAPWS-95 at 0–40 °C.
		{"Tanaka 0 °C", Celsius(0), atm, 999.8428, 2e-5, true, srcTanaka},
		{"Tanaka 4 °C", Celsius(4), atm, 999.9749, 2e-5, true, srcTanaka},
		{"Tanaka 20 °C", Celsius(20), atm, 998.2067, 2e-5, true, srcTanaka},
		{"Tanaka 40 °C", Celsius(40), atm, 992.2152, 2e-5, true, srcTanaka},
	}
	for _, tc := range tests {
		p := tc.p
		if p == 0 {
			var err error
			if p, err = WaterSaturationPressure(tc.T); err != nil {
				t.Fatal(err)
			}
		}
		f, err := Water(tc.T, p)
		if err != nil {
			t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
		}
		tol := tc.tol
		if !tc.rel {
			tol /= float64(tc.want)
		}
		testkit.Close(t, tc.name+": ρ (kg/m³)", float64(f.Density), float64(tc.want), tol, tc.source)
	}
}

// TestWaterDensityMaximum: liquid water is densest near 4 °C (IF97 puts the
// maximum at 3.97 °C at 1 atm; IAPWS-95 at 3.98 °C); above it the density
// falls all the way to boiling, below it the density rises.
func TestWaterDensityMaximum(t *testing.T) {
	const atm = 101325.0
	rho := func(c float64) float64 {
		f, err := Water(Celsius(c), atm)
		if err != nil {
			t.Fatalf("%g °C: %v", c, err)
		}
		return float64(f.Density)
	}
	// Tenths of a degree, 4.0 °C to 99.9 °C (T_s(1 atm) = 99.974 °C).
	for k := 40; k < 999; k++ {
		c := float64(k) / 10
		if rho(c+0.1) >= rho(c) {
			t.Fatalf("ρ(%.1f °C) ≥ ρ(%.1f °C) (%s: density falls with T above 4 °C)", c+0.1, c, srcWaterPhysics)
		}
	}
	for k := 0; k < 39; k++ {
		c := float64(k) / 10
		if rho(c+0.1) <= rho(c) {
			t.Fatalf("ρ(%.1f °C) ≤ ρ(%.1f °C) (%s: density rises from 0 °C to its maximum)", c+0.1, c, srcWaterPhysics)
		}
	}
}

func TestWaterViscosityR1208Table4(t *testing.T) {
	tests := []struct {
		name   string
		T      Temperature
		rho    Density
		muMicr float64 // µPa·s, published to 6 decimals
	}{
		// Liquid states.
		{"298.15 K, 998", 298.15, 998, 889.735100},
		{"298.15 K, 1200", 298.15, 1200, 1437.649467},
		{"373.15 K, 1000", 373.15, 1000, 307.883622},
		{"433.15 K, 1000", 433.15, 1000, 217.685358},
		// Vapour and supercritical states, inside the accepted rectangle.
		{"433.15 K, 1", 433.15, 1, 14.538324},
		{"873.15 K, 1", 873.15, 1, 32.619287},
		{"873.15 K, 100", 873.15, 100, 35.802262},
		{"873.15 K, 600", 873.15, 600, 77.430195},
		{"1173.15 K, 1", 1173.15, 1, 44.217245},
		{"1173.15 K, 100", 1173.15, 100, 47.640433},
		{"1173.15 K, 400", 1173.15, 400, 64.154608},
	}
	// Appendix B: 1e-6 µPa·s absolute (published to 6 decimals).
	const tol = 1e-6
	for _, tc := range tests {
		// R12-08 with μ̄2 = 1, as Water evaluates it at its own density.
		g := waterMu(float64(tc.T), float64(tc.rho)) * 1e6
		testkit.Close(t, tc.name+": μ (µPa·s)", g, tc.muMicr, tol/tc.muMicr, srcR1208T4)
	}
}

// TestWaterViscosityFiniteOverRange: everywhere in the accepted rectangle
// the result is finite and positive, even for (T, ρ) pairs that are not a
// real fluid state.
func TestWaterViscosityFiniteOverRange(t *testing.T) {
	for T := waterMinTemperature; T <= waterViscosityMaxTemperature; T += 9 {
		for _, rho := range []float64{1e-300, 1e-3, 1, 50, 322, 600, 900, 1000, 1100, 1250} {
			mu := waterMu(T, rho)
			if math.IsNaN(mu) || math.IsInf(mu, 0) || mu <= 0 {
				t.Errorf("waterMu(%g K, %g kg/m³) = %v; want finite and positive", T, rho, mu)
			}
		}
	}
}

func TestWaterViscosityOneAtmosphere(t *testing.T) {
	const atm = 101325.0
	tests := []struct {
		name   string
		T      Temperature
		p      Pressure // 0 means saturated: p = p_s(T)
		muMicr float64  // µPa·s
		relTol float64
		source string
	}{
		// Appendix B: 5e-5 relative for R12-08 with IF97 or IAPWS-95 density.
		{"0 °C", Celsius(0), atm, 1791.751, 5e-5, srcNoteMu},
		{"4 °C", Celsius(4), atm, 1567.290, 5e-5, srcNoteMu},
		{"10 °C", Celsius(10), atm, 1305.901, 5e-5, srcNoteMu},
		{"15 °C", Celsius(15), atm, 1137.569, 5e-5, srcNoteMu},
		{"20 °C", Celsius(20), atm, 1001.597, 5e-5, srcNoteMu},
		{"25 °C", Celsius(25), atm, 890.022, 5e-5, srcNoteMu},
		{"30 °C", Celsius(30), atm, 797.222, 5e-5, srcNoteMu},
		{"40 °C", Celsius(40), atm, 652.731, 5e-5, srcNoteMu},
		{"50 °C", Celsius(50), atm, 546.522, 5e-5, srcNoteMu},
		{"60 °C", Celsius(60), atm, 466.043, 5e-5, srcNoteMu},
		{"70 °C", Celsius(70), atm, 403.557, 5e-5, srcNoteMu},
		{"80 °C", Celsius(80), atm, 354.058, 5e-5, srcNoteMu},
		{"90 °C", Celsius(90), atm, 314.181, 5e-5, srcNoteMu},
		{"100 °C saturated", Celsius(100), 0, 281.585, 5e-5, srcNoteMu},

		// ISO value, 5 significant digits: half a unit of the last.
		{"ISO 20 °C", Celsius(20), atm, 1001.6, 0.05 / 1001.6, srcISO3666},

		// Perry's saturated-liquid table; it appears to follow the older
		// IAPS 1985 formulation and differs by up to 0.084 %, so the note
		// suggests 0.1 %.
		{"Perry 273.16 K", 273.16, 0, 1791.2, 1e-3, srcPerry},
		{"Perry 280 K", 280, 0, 1433.7, 1e-3, srcPerry},
		{"Perry 290 K", 290, 0, 1084.0, 1e-3, srcPerry},
		{"Perry 300 K", 300, 0, 853.84, 1e-3, srcPerry},
		{"Perry 310 K", 310, 0, 693.54, 1e-3, srcPerry},
		{"Perry 320 K", 320, 0, 577.02, 1e-3, srcPerry},
		{"Perry 330 K", 330, 0, 489.49, 1e-3, srcPerry},
		{"Perry 340 K", 340, 0, 421.97, 1e-3, srcPerry},
		{"Perry 350 K", 350, 0, 368.77, 1e-3, srcPerry},
		{"Perry 360 K", 360, 0, 326.10, 1e-3, srcPerry},
		{"Perry 370 K", 370, 0, 291.36, 1e-3, srcPerry},
		{"Perry 380 K", 380, 0, 262.69, 1e-3, srcPerry},
		{"Perry 390 K", 390, 0, 238.77, 1e-3, srcPerry},
	}
	for _, tc := range tests {
		p := tc.p
		if p == 0 {
			var err error
			if p, err = WaterSaturationPressure(tc.T); err != nil {
				t.Fatal(err)
			}
		}
		var mu float64
		if tc.T <= waterToolMaxTemperature {
			f, err := Water(tc.T, p)
			if err != nil {
				t.Fatalf("%s: unexpected error %v (%s)", tc.name, err, tc.source)
			}
			mu = float64(f.Viscosity)
		} else {
			// above Water's range (Perry's 380 and 390 K rows): the same
			// evaluators Water calls
			mu = waterMu(float64(tc.T), waterRegion1Density(float64(tc.T), float64(p)))
		}
		testkit.Close(t, tc.name+": μ (µPa·s)", mu*1e6, tc.muMicr, tc.relTol, tc.source)
	}
}

// TestWaterPassesValidate: every Water result is a valid Fluid, with the
// vapour pressure of Eq. (30).
func TestWaterPassesValidate(t *testing.T) {
	for _, c := range []float64{0, 4, 12.5, 20, 37, 60, 85, 99} {
		for _, p := range []Pressure{70000, 101325, 250000} {
			if c > 90 && p < 100000 {
				continue // boils (T_s(70 kPa) = 89.9 °C)
			}
			T := Celsius(c)
			f, err := Water(T, p)
			if err != nil {
				t.Fatalf("Water(%g °C, %g Pa): %v", c, float64(p), err)
			}
			if pv, _ := WaterSaturationPressure(T); f.VaporPressure != pv {
				t.Errorf("Water(%g °C, %g Pa): p_v %v, Eq. (30) gives %v", c, float64(p), f.VaporPressure, pv)
			}
			if err := f.Validate(); err != nil {
				t.Errorf("Water(%g °C, %g Pa) fails Fluid.Validate: %v", c, float64(p), err)
			}
		}
	}
}

func TestWaterViscosityFallsWithTemperature(t *testing.T) {
	prev := math.Inf(1)
	for c := 0.0; c <= 99.0; c += 0.5 {
		f, err := Water(Celsius(c), 101325)
		if err != nil {
			t.Fatalf("%g °C: %v", c, err)
		}
		if float64(f.Viscosity) >= prev {
			t.Fatalf("μ(%g °C) = %g Pa·s did not fall (%s: liquid viscosity falls with temperature)", c, float64(f.Viscosity), srcWaterPhysics)
		}
		prev = float64(f.Viscosity)
	}
}

// TestWaterBoilsAtAltitude: at 2000 m the standard atmosphere gives about
// 79.5 kPa, where water boils near 93.3 °C; 100 °C water cannot be liquid.
func TestWaterBoilsAtAltitude(t *testing.T) {
	p, err := StandardAtmosphere(2000)
	if err != nil {
		t.Fatal(err)
	}
	_, err = Water(Celsius(100), p)
	if !errors.Is(err, ErrBoiling) {
		t.Fatalf("Water(100 °C, %g Pa) error = %v, want ErrBoiling (%s)", float64(p), err, srcCommonWtr)
	}
	var re *RangeError
	if !errors.As(err, &re) || re.Quantity != "water temperature" {
		t.Fatalf("want *RangeError on water temperature, got %#v", err)
	}
	ts := Temperature(waterSatTemperature(float64(p)))
	if re.Max != float64(ts) || ts.Celsius() < 93 || ts.Celsius() > 94 {
		t.Errorf("boiling point at 2000 m: Max = %g K, T_s = %v, want about 93.3 °C", re.Max, ts)
	}
	// With the error comes the saturated liquid, for Solve's verdict.
	fl, _ := Water(Celsius(100), p)
	if pv, _ := WaterSaturationPressure(Celsius(100)); fl.VaporPressure != pv || fl.Validate() != nil || !(fl.Density > 950) {
		t.Errorf("boiling water's fluid %+v", fl)
	}
	s := Siphon{Fluid: fl, AtmPressure: p, Hoses: 1, Hose: Hose{Diameter: 0.025, Length: 10},
		Geometry: Geometry{Surface: 0, Intake: -0.3, Crest: 1, Outlet: -2}}
	if r, err := Solve(s); err != nil || r.Verdict != WillNotRun || r.Why != WarnBoiling {
		t.Errorf("Solve with boiling water: %v %v %v", r.Verdict, r.Why, err)
	}
	// Just below the boiling point it is liquid; just above it boils.
	if _, err := Water(ts-0.01, p); err != nil {
		t.Errorf("Water(T_s − 0.01 K) = %v, want liquid", err)
	}
	if _, err := Water(ts+0.01, p); !errors.Is(err, ErrBoiling) {
		t.Errorf("Water(T_s + 0.01 K) = %v, want ErrBoiling", err)
	}
	// At sea level 100 °C water boils too (T_s(1 atm) = 99.974 °C).
	if _, err := Water(Celsius(100), StandardSeaLevelPressure); !errors.Is(err, ErrBoiling) {
		t.Errorf("Water(100 °C, 1 atm) = %v, want ErrBoiling (%s, T_s = 373.1243 K)", err, srcNoteSat)
	}
	// Below the triple-point pressure water boils at any temperature.
	_, err = Water(Celsius(0), 500)
	if !errors.Is(err, ErrBoiling) || !errors.As(err, &re) || re.Quantity != "absolute pressure" {
		t.Errorf("Water(0 °C, 500 Pa) = %v, want ErrBoiling on absolute pressure", err)
	}
}

func TestWaterInvalidInput(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		name     string
		call     func() (float64, error)
		quantity string
		sentinel error
	}{
		{"p_s NaN", func() (float64, error) { v, e := WaterSaturationPressure(Temperature(nan)); return float64(v), e }, "water temperature", ErrNotFinite},
		{"p_s +Inf", func() (float64, error) { v, e := WaterSaturationPressure(Temperature(inf)); return float64(v), e }, "water temperature", ErrNotFinite},
		{"p_s below 273.15 K", func() (float64, error) { v, e := WaterSaturationPressure(273.14); return float64(v), e }, "water temperature", ErrOutOfRange},
		{"p_s above critical", func() (float64, error) { v, e := WaterSaturationPressure(647.1); return float64(v), e }, "water temperature", ErrOutOfRange},
		{"Water T NaN", func() (float64, error) { f, e := Water(Temperature(nan), 1e5); return float64(f.Density), e }, "water temperature", ErrNotFinite},
		{"Water T −1 °C", func() (float64, error) { f, e := Water(Celsius(-1), 1e5); return float64(f.Density), e }, "water temperature", ErrOutOfRange},
		{"Water T 101 °C", func() (float64, error) { f, e := Water(Celsius(101), 1e6); return float64(f.Density), e }, "water temperature", ErrOutOfRange},
		{"Water p NaN", func() (float64, error) { f, e := Water(300, Pressure(nan)); return float64(f.Density), e }, "absolute pressure", ErrNotFinite},
		{"Water p zero", func() (float64, error) { f, e := Water(300, 0); return float64(f.Density), e }, "absolute pressure", ErrOutOfRange},
		{"Water p huge", func() (float64, error) { f, e := Water(300, 1e9); return float64(f.Density), e }, "absolute pressure", ErrOutOfRange},
	}
	for _, tc := range tests {
		v, err := tc.call()
		var re *RangeError
		if !errors.As(err, &re) {
			t.Errorf("%s: error %v, want *RangeError", tc.name, err)
			continue
		}
		if re.Quantity != tc.quantity || !errors.Is(err, tc.sentinel) {
			t.Errorf("%s: got quantity %q, error %v; want %q wrapping %v", tc.name, re.Quantity, err, tc.quantity, tc.sentinel)
		}
		if v != 0 || math.IsNaN(v) {
			t.Errorf("%s: value %g returned with an error, want 0", tc.name, v)
		}
		if math.IsNaN(re.Min) || math.IsNaN(re.Max) {
			t.Errorf("%s: NaN in accepted range: %v", tc.name, err)
		}
	}
}

// FuzzWater: any (T, p) gives either an error or finite, positive values
// that pass Fluid.Validate. Never a panic, NaN or Inf.
func FuzzWater(f *testing.F) {
	f.Add(293.15, 101325.0)
	f.Add(273.15, 611.2127)
	f.Add(373.15, 101418.0)
	f.Add(373.15, 79501.0)
	f.Add(300.0, 1e8)
	f.Add(math.NaN(), 1e5)
	f.Add(300.0, math.Inf(-1))
	f.Fuzz(func(t *testing.T, T, p float64) {
		fl, err := Water(Temperature(T), Pressure(p))
		if err != nil {
			var re *RangeError
			if !errors.As(err, &re) {
				t.Fatalf("Water(%g, %g): error %v is not a *RangeError", T, p, err)
			}
			return
		}
		for _, v := range []float64{float64(fl.Density), float64(fl.Viscosity), float64(fl.VaporPressure)} {
			if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
				t.Fatalf("Water(%g, %g) = %+v: not finite and positive", T, p, fl)
			}
		}
		if err := fl.Validate(); err != nil {
			t.Fatalf("Water(%g, %g) = %+v fails Validate: %v", T, p, fl, err)
		}
		if float64(fl.VaporPressure) > p {
			t.Fatalf("Water(%g, %g): vapour pressure %g above p without ErrBoiling", T, p, float64(fl.VaporPressure))
		}
	})
}

var (
	waterSinkFluid Fluid
	waterSinkErr   error
)

func BenchmarkWater(b *testing.B) {
	for _, c := range []float64{2, 20, 90} {
		b.Run(fmt.Sprintf("%g°C", c), func(b *testing.B) {
			T := Celsius(c)
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				waterSinkFluid, waterSinkErr = Water(T, 95000)
			}
		})
	}
}

func ExampleWater() {
	site, _ := StandardAtmosphere(1500) // site 1500 m above sea level
	w, err := Water(Celsius(15), site)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("barometric pressure %.1f kPa\n", float64(site)/1e3)
	fmt.Printf("water at 15 °C: density %.2f kg/m³, viscosity %.4f mPa·s, vapour pressure %.3f kPa\n",
		float64(w.Density), float64(w.Viscosity)*1e3, float64(w.VaporPressure)/1e3)

	// Water at 98 °C boils there; the error says up to what temperature it
	// stays liquid.
	_, err = Water(Celsius(98), site)
	var re *RangeError
	if errors.As(err, &re) && errors.Is(err, ErrBoiling) {
		fmt.Printf("boils: liquid up to %.1f °C\n", Temperature(re.Max).Celsius())
	}
	// Output:
	// barometric pressure 84.6 kPa
	// water at 15 °C: density 999.09 kg/m³, viscosity 1.1376 mPa·s, vapour pressure 1.706 kPa
	// boils: liquid up to 95.0 °C
}
