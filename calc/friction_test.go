package calc

import (
	"testing"

	"drawdown/calc/testkit"
)

func TestFrictionColebrook(t *testing.T) {
	// Colebrook–White values. Sources: the `fluids` library test point
	// (Caleb Bell, fluids, commit 091070e9, Colebrook(1e5, 1e-4)) and the
	// Colebrook grid computed at 40 digits by two methods (fixed point and the
	// Lambert-W closed form), both as collected in calc/testdata/reference/
	// hydraulics.md §1.3. The grid is printed to 10 significant figures.
	cases := []struct {
		name   string
		re, rr float64
		want   float64
		tol    float64
		source string
	}{
		{"fluids test point", 1e5, 1e-4, 0.018513866077471648, 1e-10, "fluids test suite, Colebrook(Re=1e5, eD=1e-4)"},
		{"smooth 1e5", 1e5, 0, 0.01798977308427384, 1e-10, "fluids test suite, smooth Re=1e5"},
		{"grid 4e3 smooth", 4e3, 0, 0.03990701406, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 4e3 1e-3", 4e3, 1e-3, 0.04091038986, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e4 1e-5", 1e4, 1e-5, 0.03089842305, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e4 5e-2", 1e4, 5e-2, 0.07380127564, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e6 1e-4", 1e6, 1e-4, 0.01344143769, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e7 1e-6", 1e7, 1e-6, 0.008213180404, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e8 smooth", 1e8, 0, 0.005940466352, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"grid 1e8 1e-2", 1e8, 1e-2, 0.03790432339, 5e-10, "hydraulics.md §1.3 Colebrook grid [computed]"},
		{"extra point", 3e4, 2e-4, 0.02401803621, 5e-10, "hydraulics.md §1.3 extra point [computed]"},
		// Crane TP-410M (2009) Example 7-1: water at 30 °C in smooth 50 mm
		// plastic pipe, Re = 100 600, f = 0.0179 (quoted in the fluids notebook
		// "7.1 Smooth Pipe (Plastic)"). Crane reads its chart to 3 figures;
		// Colebrook gives 0.01797 (hydraulics.md §1.3), so allow 0.5 %.
		{"Crane 7-1", 100600, 0, 0.0179, 0.005, "Crane TP-410M Example 7-1 (chart value, 3 significant figures)"},
	}
	for _, c := range cases {
		testkit.Close(t, c.name+": f", friction(c.re, c.rr, 0), c.want, c.tol, c.source)
	}
}

func TestFrictionLaminar(t *testing.T) {
	// Hagen–Poiseuille: f = 64/Re. fluids.friction_laminar check Re=128 →
	// f = 0.5 (hydraulics.md §1.1).
	for _, re := range []float64{1, 128, 500, 1999, 2000} {
		if got := friction(re, 1e-3, 0); !testkit.Within(got, 64/re, 1e-15) {
			t.Errorf("Re %g: f = %g, want 64/Re = %g (Hagen–Poiseuille, analytic)", re, got, 64/re)
		}
	}
}

func TestFrictionTransitionContinuous(t *testing.T) {
	// Property: the documented transition meets 64/Re at 2000 and
	// Colebrook–White at 4000, with no jump at either end.
	for _, rr := range []float64{0, 1e-4, 1e-3, 1e-2, 5e-2} {
		for _, edge := range []float64{ReLaminarMax, ReTurbulentMin} {
			below := friction(edge*(1-1e-9), rr, 0)
			above := friction(edge*(1+1e-9), rr, 0)
			if !testkit.Within(below, above, 1e-6) {
				t.Errorf("ε/D %g: jump at Re %g: %g vs %g", rr, edge, below, above)
			}
		}
		// Churchill 1977 in the middle of the band, as a sanity bound: the
		// shifted curve stays within 10 % of it (hydraulics.md §1.1 gives
		// Churchill 0.03084 at Re 2300 and 0.04297 at 3000, smooth).
		if rr == 0 {
			for _, c := range []struct{ re, want float64 }{{2300, 0.03084}, {3000, 0.04297}} {
				got := friction(c.re, 0, 0)
				if !testkit.Within(got, c.want, 0.10) {
					t.Errorf("Re %g: f = %g, Churchill %g", c.re, got, c.want)
				}
			}
		}
	}
}
