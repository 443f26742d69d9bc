package calc

import (
	"testing"

	"drawdown/calc/testkit"
)

// TestRingBuckling: Timoshenko & Gere's long-tube formula, checked by hand
// and in its radius form. A PVC-like tube (E 2.4 GPa, ν 0.4, from memory for
// the material), t 1.5 mm on a 25 mm bore: D = 26.5 mm,
// (t/D)³ = 1.8136e-4, 2E/(1 − ν²) = 5.7143e9 Pa, p_cr = 1.0363 MPa.
func TestRingBuckling(t *testing.T) {
	w := Wall{Thickness: 0.0015, Modulus: 2.4e9, Poisson: 0.4}
	p := float64(RingBucklingPressure(w, 0.025))
	testkit.Close(t, "ring buckling (Pa)", p, 1.0363e6, 0.00005e6/1.0363e6, "worked by hand, 5 figures")
	r := (0.025 + 0.0015) / 2
	radius := 2.4e9 / (4 * (1 - 0.16)) * (0.0015 / r) * (0.0015 / r) * (0.0015 / r)
	testkit.Close(t, "radius form E/(4(1−ν²))(t/r)³", p, radius, 1e-12, "Timoshenko & Gere, the same formula in r")
	// Solve rates a from-wall hose at p_cr/CollapseSafetyFactor
	s := demoCase()
	s.Hose.Vacuum, s.Hose.Wall = VacuumFromWall, w
	res, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	testkit.Close(t, "from-wall rating (Pa)", float64(res.HoseVacuumRating), p/CollapseSafetyFactor, 1e-12, "ring buckling over the safety factor")
	// a thin wall collapses under the flowing crest vacuum
	s.Hose.Wall.Thickness = 0.0002
	if res, _ := Solve(s); res.Verdict != WillNotRun || res.Why != WarnHoseCollapse || !res.Fix.NeedsSuctionHose {
		t.Errorf("0.2 mm wall: %v %v (rating %v, crest vacuum %v)", res.Verdict, res.Why, res.HoseVacuumRating, res.CrestVacuum)
	}
}

// TestHoseVacuum: the worst vacuum is the largest of flowing, blocked intake
// (ρg(z_crest − z_outlet)) and vacuum priming (ρg·lift) (hydrostatics); lay-flat
// never runs with the crest under vacuum; a rated hose fails past its rating
// while flowing and is warned about past it in the worst case; an unrated
// one is warned about.
func TestHoseVacuum(t *testing.T) {
	s := demoCase() // lift 1.5 m, drop 2.5 m, water at 15 °C
	r, _ := Solve(s)
	rg := 999.10 * StandardGravity
	testkit.Close(t, "blocked intake vacuum (Pa)", float64(r.HoseVacuumBlocked), rg*4.0, 1e-12, "ρg(z_crest − z_outlet)")
	testkit.Close(t, "priming vacuum (Pa)", float64(r.HoseVacuumPriming), rg*1.5, 1e-12, "ρg·lift")
	testkit.Close(t, "worst vacuum (Pa)", float64(r.HoseVacuumWorst), rg*4.0, 1e-12, "the blocked intake is the worst here")
	testkit.Close(t, "crest vacuum (Pa gauge)", float64(r.CrestVacuum), 101325-float64(r.CrestPressure), 1e-12, "p_atm − p_crest")
	if r.HoseRated || !r.Warnings.Has(WarnHoseNotRated) || r.Verdict != Runs {
		t.Errorf("unrated hose: rated %v, warnings %v, %v", r.HoseRated, r.Warnings.Codes(), r.Verdict)
	}
	// lay-flat: never a runs verdict when the crest is under vacuum
	s.Hose.Vacuum = VacuumNone
	if r, _ := Solve(s); r.Verdict != WillNotRun || r.Why != WarnHoseCollapse || r.Fix.Code != FixSuctionHose ||
		!r.HoseRated || r.HoseVacuumRating != 0 {
		t.Errorf("lay-flat: %v %v %v", r.Verdict, r.Why, r.Fix.Code)
	}
	// rated for 30 kPa: it runs (crest vacuum about 17 kPa) but a blocked
	// intake (39 kPa) is past its rating
	s.Hose.Vacuum, s.Hose.VacuumRating = VacuumRated, 30e3
	if r, _ := Solve(s); r.Verdict != Runs || !r.Warnings.Has(WarnHoseVacuum) || !r.Fix.NeedsSuctionHose {
		t.Errorf("rated 30 kPa: %v, warnings %v, crest vacuum %v", r.Verdict, r.Warnings.Codes(), r.CrestVacuum)
	}
	// rated for 10 kPa: it collapses while flowing
	s.Hose.VacuumRating = 10e3
	if r, _ := Solve(s); r.Verdict != WillNotRun || r.Why != WarnHoseCollapse || r.Fix.MinVacuumRating != r.HoseVacuumWorst {
		t.Errorf("rated 10 kPa: %v %v", r.Verdict, r.Why)
	}
}
