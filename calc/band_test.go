package calc

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"drawdown/calc/testkit"
)

// TestFlowBandBrackets: the slow and fast cases bracket the nominal flow, and
// each input moved alone moves the flow the way the energy equation says
// (Darcy–Weisbach: more drop → more flow; more roughness or ΣK → less).
func TestFlowBandBrackets(t *testing.T) {
	s := baseSiphon(1.4, 0.05, 1.9, -2)
	nom, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	lo, hi, err := FlowBand(s, Tolerance{})
	if err != nil {
		t.Fatal(err)
	}
	if !(lo < nom.Flow && nom.Flow < hi) {
		t.Fatalf("band %g … %g does not bracket %g", lo, hi, nom.Flow)
	}
	// The likely range by hand (GUM: each input alone to the slow end of
	// its range, rectangular bounds a → u = a/√3, combined in quadrature,
	// k = 2): the drop 3 cm less (and the lift 3 cm more), ε doubled, ΣK
	// ×1.5, the bore 3 % less.
	var sum float64
	for _, move := range []func(s *Siphon){
		func(s *Siphon) { s.Geometry.Outlet += 0.03; s.Geometry.Crest += 0.03 },
		func(s *Siphon) { s.Hose.Roughness *= 2 },
		func(s *Siphon) { s.Hose.KEntrance *= 1.5; s.Hose.KDownLeg *= 1.5 },
		func(s *Siphon) { s.Hose.Diameter *= 0.97 },
	} {
		c := s
		move(&c)
		r, _ := Solve(c)
		d := float64(nom.Flow - r.Flow)
		sum += d * d
	}
	byHand := float64(nom.Flow) - 2/math.Sqrt(3)*math.Sqrt(sum)
	if !testkit.Within(float64(lo), byHand, 1e-9) {
		t.Errorf("low flow %g, by hand %g", lo, byHand)
	}
	// A tighter tolerance gives a narrower band.
	lo2, hi2, err := FlowBand(s, Tolerance{Height: 0.005, RoughnessLow: 0.008e-3, RoughnessHigh: 0.012e-3, KLow: 1.28, KHigh: 1.4})
	if err != nil {
		t.Fatal(err)
	}
	if !(lo < lo2 && lo2 < nom.Flow && nom.Flow < hi2 && hi2 < hi) {
		t.Errorf("tight band %g … %g not inside %g … %g around %g", lo2, hi2, lo, hi, nom.Flow)
	}
	// A smooth hose (ε = 0) still gets a roughness range.
	smooth := s
	smooth.Hose.Roughness = 0
	lo3, hi3, err := FlowBand(smooth, Tolerance{Height: 1e-9, KLow: 1.28, KHigh: 1.28})
	if err != nil {
		t.Fatal(err)
	}
	if !(lo3 < hi3) {
		t.Errorf("smooth hose band %g … %g", lo3, hi3)
	}
}

func TestBandBadInput(t *testing.T) {
	s := baseSiphon(1.4, 0.05, 1.9, -2)
	for _, tol := range []Tolerance{
		{Height: -0.01},
		{Height: Length(math.NaN())},
		{RoughnessLow: 2e-3, RoughnessHigh: 1e-3},
		{RoughnessLow: 0.02, RoughnessHigh: 0.03}, // above D/2
		{KLow: 3, KHigh: 2},
		{KLow: -1, KHigh: 2},
	} {
		_, _, err := FlowBand(s, tol)
		var re *RangeError
		if !errors.As(err, &re) {
			t.Errorf("%+v: want *RangeError, got %v", tol, err)
		}
	}
}

// TestPlanBand: the drain-time band holds the nominal time, and the slow plan
// takes longer than the fast one for a drain to the intake (same stop rule).
func TestPlanBand(t *testing.T) {
	in := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}
	b, err := planBand(in, Tolerance{})
	if err != nil {
		t.Fatal(err)
	}
	if !(b.TimeLow < b.Nominal.Time && b.Nominal.Time < b.TimeHigh) {
		t.Errorf("time band %g … %g around %g", b.TimeLow, b.TimeHigh, b.Nominal.Time)
	}
	if b.Slow.Time <= b.Fast.Time || b.FlowLow >= b.FlowHigh {
		t.Errorf("slow %g s / fast %g s; flows %g … %g", b.Slow.Time, b.Fast.Time, b.FlowLow, b.FlowHigh)
	}
	if b.Slow.Curve != nil || b.SlowWillNotRun {
		t.Errorf("band plans carry no curve; slow case runs")
	}
	// A transfer band works too, and a slow case that cannot start is flagged.
	tr := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 2)),
		Receiver: &Receiver{Tank: mustTank(NewRectangular(1, 1, 2)), Floor: -0.5, Level: 0.2},
		Siphon:   baseSiphon(1.8, 0.05, 2.3, -0.5)}
	if _, err := planBand(tr, Tolerance{}); err != nil {
		t.Fatal(err)
	}
	edge := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, 1.38)}
	be, err := planBand(edge, Tolerance{})
	if err != nil {
		t.Fatal(err)
	}
	if !be.SlowWillNotRun || be.FlowLow != 0 || be.TimeHigh < be.Nominal.Time {
		t.Errorf("edge band: %+v", be)
	}
}

// TestPlanBandFrom: given the nominal plan PlanDrain has just made (curve
// and all), the band is the same as PlanBand's, for a drain, a transfer, a
// slow case that cannot start, a crest-limit stop and a target stop.
func TestPlanBandFrom(t *testing.T) {
	target := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2), Target: 0.6}
	cases := map[string]DrainInput{
		"drain": {Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2)},
		"transfer": {Tank: mustTank(NewVerticalCylinder(1.2, 2)),
			Receiver: &Receiver{Tank: mustTank(NewRectangular(1, 1, 2)), Floor: -0.5, Level: 0.2},
			Siphon:   baseSiphon(1.8, 0.05, 2.3, -0.5)},
		"slow will not run": {Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, 1.38)},
		"crest limit":       crestCase(),
		"target":            target,
	}
	for name, in := range cases {
		want, err := planBand(in, Tolerance{})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		nominal, err := PlanDrain(in)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		got, err := PlanBandFrom(in, nominal, Tolerance{})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("%s: from the nominal plan\n%+v\nwant\n%+v", name, got, want)
		}
		if len(nominal.Curve) == 0 {
			t.Errorf("%s: the caller's curve was taken", name)
		}
	}
}
