package calc

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// drainWater is liquid water at 15 °C: ρ = 999.10 kg/m³ (IF97 Region 1),
// μ = 1.1375e-3 Pa·s (IAPWS 2008), p_v = 1705.8 Pa (IF97 Region 4), as
// tabulated in calc/testdata/reference/water-and-atmosphere.md §2–§3.
var drainWater = Fluid{Density: 999.10, Viscosity: 1.1375e-3, VaporPressure: 1705.8}

// planFixed plans with the constant-coefficient orifice law Q = C·a·√(2gH)
// in place of Solve, and the given equal-head tolerance.
func planFixed(in DrainInput, c, a, g, eps float64) (DrainPlan, error) {
	var p planner
	p.fixed = &fixedLoss{c: c, area: a, g: g}
	if err := p.init(&in, in.CurvePoints); err != nil {
		return DrainPlan{}, err
	}
	p.eps = eps
	return p.run()
}

func circle(d float64) float64 { return math.Pi * d * d / 4 }

// torricelliCylinder is the closed form for a vertical cylinder of plan area
// A through an outlet of area a with coefficient C, head h0 → h1
// (calc/testdata/reference/hydraulics.md §7):  t = (A/(C a))·√(2/g)·(√h0 − √h1).
func torricelliCylinder(A, a, C, g, h0, h1 float64) float64 {
	return A / (C * a) * math.Sqrt(2/g) * (math.Sqrt(h0) - math.Sqrt(h1))
}

// TestDrainClosedForms checks the planner, run with a constant loss
// coefficient (Torricelli form, friction held fixed), against published and
// analytic drain times.
func TestDrainClosedForms(t *testing.T) {
	const g = StandardGravity
	const gFt = 32.2 * 0.3048 // 32.2 ft/s² as used by the US-unit textbook problems
	ft := 0.3048
	in2 := 0.0254 * 0.0254
	cases := []struct {
		name          string
		tank          Tank
		level, target float64
		outlet        float64 // outlet elevation above the floor
		intake        float64
		C, a, g       float64
		want, tol     float64
		reason        StopReason
		source        string
	}{
		{"SI vertical cylinder 1 m → 0", mustTank(NewVerticalCylinder(1, 1)), 1, 0, 0, 0,
			0.61, circle(0.025), g, 1184.5, 5e-5, StopEqual,
			"hydraulics.md §7 check value 'SI vertical cylinder' 1184.5 s [computed there]: D_t 1 m, 25 mm orifice, C_d 0.61"},
		{"horizontal cylinder full → empty", mustTank(NewHorizontalCylinder(1.2, 2)), 1.2, 0, 0, 0,
			0.61, circle(0.030), g, 1835.71, 1e-5, StopEqual,
			"hydraulics.md §7: R 0.6 m, L 2 m, 30 mm outlet, C_d 0.61 → 1835.71 s (closed form, quadrature-verified there)"},
		{"horizontal cylinder 1.0 → 0.3 m", mustTank(NewHorizontalCylinder(1.2, 2)), 1.0, 0.3, 0, 0,
			0.61, circle(0.030), g, 1067.42, 1e-5, StopTarget,
			"hydraulics.md §7: same tank, partial 1.0 → 0.3 m → 1067.42 s"},
		{"sphere full → empty", mustTank(NewSphere(1.2)), 1.2, 0, 0, 0,
			0.61, circle(0.030), g, 692.04, 1e-5, StopEqual,
			"hydraulics.md §7: sphere R 0.6 m, 30 mm outlet, C_d 0.61 → 692.04 s"},
		{"Çengel & Cimbala tank discharge 4 ft → 2 ft", mustTank(NewVerticalCylinder(Length(3*ft), Length(4*ft))), 4 * ft, 2 * ft, 0, 0,
			1, circle(0.5 * 0.0254), gFt, 757, 5e-4, StopTarget,
			"Çengel & Cimbala, Fluid Mechanics, Ch. 5 example 'Discharge of water from a tank': 757 s (book answer from memory; recomputed 756.8 s in hydraulics.md §7)"},
		{"Çengel & Cimbala gasoline siphon, 4 L at a steady head", mustTank(NewVerticalCylinder(10, 2)), 1.5, 1.5 - 0.004/circle(10), 0.75, 0,
			1, circle(0.005), 9.81, 53.1, 1e-3, StopTarget,
			"Çengel & Cimbala, Fluid Mechanics, Ch. 5 example 'Siphoning out gasoline from a fuel tank' (5 mm hose, outlet 0.75 m below the surface, frictionless, g 9.81): 4 L in 53.1 s (book answer from memory; recomputed 53.1 s in hydraulics.md §7). A wide tank keeps the head steady as in the book"},
		{"engineeringprep.com problem 435", mustTank(NewVerticalCylinder(Length(4*ft), Length(6*ft))), 6 * ft, 2 * ft, 0, 0,
			1, 5 * in2, gFt, 93.38, 1e-4, StopTarget,
			"engineeringprep.com problem 435 (D_t 4 ft, A_o 5 in², 6 → 2 ft, no losses): site answer 94 s from rounded intermediates, exact 93.38 s [computed, hydraulics.md §7]"},
	}
	for _, c := range cases {
		in := DrainInput{
			Tank:   c.tank,
			Target: Length(c.target),
			Siphon: Siphon{Geometry: Geometry{Surface: Length(c.level), Intake: Length(c.intake), Crest: Length(c.level), Outlet: Length(c.outlet)}},
		}
		plan, err := planFixed(in, c.C, c.a, c.g, 1e-12)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !testkit.Within(float64(plan.Time), c.want, c.tol) {
			t.Errorf("%s: time %.3f s, want %.3f s ±%g (%s)", c.name, plan.Time, c.want, c.tol, c.source)
		}
		if plan.StopReason != c.reason {
			t.Errorf("%s: stop %q, want %q", c.name, plan.StopReason, c.reason)
		}
	}
}

// TestDrainTorricelliExact compares the planner with the closed form at full
// precision over a range of heads, outlets below the floor and stop levels
// (hydraulics.md §7, "outlet below the tank bottom by Δ": t = (A/(C a))·√(2/g)
// ·(√(y₀+Δ) − √(y₁+Δ))).
func TestDrainTorricelliExact(t *testing.T) {
	A := circle(1.3)
	a := circle(0.02)
	for _, c := range []struct{ h0, target, outlet float64 }{
		{1.5, 0.2, 0}, {1.5, 0.2, -3}, {0.3, 0.01, -10}, {2, 0.5, 0.4}, {2, 0, 0.4},
	} {
		tk := mustTank(NewVerticalCylinder(1.3, 2))
		in := DrainInput{Tank: tk, Target: Length(c.target),
			Siphon: Siphon{Geometry: Geometry{Surface: Length(c.h0), Intake: 0, Crest: Length(c.h0), Outlet: Length(c.outlet)}}}
		eps := 1e-3
		plan, err := planFixed(in, 0.6, a, StandardGravity, eps)
		if err != nil {
			t.Fatal(err)
		}
		h1 := math.Max(c.target, 0) - c.outlet
		if c.target == 0 {
			h1 = eps
		}
		want := torricelliCylinder(A, a, 0.6, StandardGravity, c.h0-c.outlet, h1)
		if !testkit.Within(float64(plan.Time), want, 1e-8) {
			t.Errorf("%+v: %.9g s, closed form %.9g s", c, plan.Time, want)
		}
		// the curve follows the closed form too
		for _, pt := range plan.Curve {
			tw := torricelliCylinder(A, a, 0.6, StandardGravity, c.h0-c.outlet, float64(pt.Level)-c.outlet)
			if math.Abs(float64(pt.Time)-tw) > 1e-6*want {
				t.Fatalf("%+v: curve point at %g m: %g s, closed form %g s", c, pt.Level, pt.Time, tw)
			}
		}
	}
}

// TestDrainSerwayFishTank: Serway & Jewett, Physics for Scientists and
// Engineers, Problem 14.74: a 0.500 m cubic fish tank emptied by a siphon
// tube of 2.00 cm² whose outlet is 10.0 m below the surface, g = 9.8 m/s²;
// holding the head at d (d ≫ h) the book's method gives t = A h/(a√(2gd)) =
// 44.6 s (statement confirmed, value computed: hydraulics.md §7). The
// quasi-steady plan lets the head fall from 10.0 to 9.5 m, so it takes a
// little longer: 45.22 s (closed form, vertical prism).
func TestDrainSerwayFishTank(t *testing.T) {
	tk := mustTank(NewRectangular(0.5, 0.5, 0.5))
	in := DrainInput{Tank: tk, Siphon: Siphon{Geometry: Geometry{Surface: 0.5, Intake: 0, Crest: 0.6, Outlet: -9.5}}}
	plan, err := planFixed(in, 1, 2e-4, 9.8, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	exact := torricelliCylinder(0.25, 2e-4, 1, 9.8, 10, 9.5)
	if !testkit.Within(float64(plan.Time), exact, 1e-8) {
		t.Errorf("time %.4f s, closed form %.4f s", plan.Time, exact)
	}
	if !testkit.Within(float64(plan.Time), 44.6, 0.015) {
		t.Errorf("time %.2f s, textbook 44.6 s within 1.5 %%", plan.Time)
	}
	if plan.StopReason != StopIntake || plan.Residual > 1e-9 {
		t.Errorf("stop %q residual %g", plan.StopReason, plan.Residual)
	}
}

// TestTransferClosedForm: two vertical prisms joined by a constant-coefficient
// pipe. With H = h₁ − h₂, dH/dt = −Q(1/A₁ + 1/A₂) and Q = C a √(2gH):
//
//	t = 2(√H₀ − √H₁) / (C a √(2g) (1/A₁ + 1/A₂))      (analytic, derived here)
func TestTransferClosedForm(t *testing.T) {
	src := mustTank(NewVerticalCylinder(1.2, 2.5))
	A1 := circle(1.2)
	for _, c := range []struct {
		name     string
		rcv      Tank
		floor    float64
		level    float64
		reason   StopReason
		fullStop bool
	}{
		{"equal levels", mustTank(NewRectangular(1, 0.8, 3)), -0.5, 0.3, StopEqual, false},
		{"receiver fills", mustTank(NewRectangular(1, 0.8, 0.9)), -0.5, 0.3, StopReceiverFull, true},
	} {
		A2 := 0.8
		in := DrainInput{Tank: src, Receiver: &Receiver{Tank: c.rcv, Floor: Length(c.floor), Level: Length(c.level)},
			Siphon: Siphon{Geometry: Geometry{Surface: 2, Intake: 0, Crest: 2.2, Outlet: -0.5}}}
		eps := 1e-6
		plan, err := planFixed(in, 0.55, circle(0.032), StandardGravity, eps)
		if err != nil {
			t.Fatal(err)
		}
		H0 := 2 - (c.floor + c.level)
		H1 := eps
		if c.fullStop {
			// the receiver rises 0.6 m, the source falls 0.6·A2/A1
			H1 = (2 - 0.6*A2/A1) - (c.floor + 0.9)
		}
		want := 2 * (math.Sqrt(H0) - math.Sqrt(H1)) / (0.55 * circle(0.032) * math.Sqrt(2*StandardGravity) * (1/A1 + 1/A2))
		if !testkit.Within(float64(plan.Time), want, 1e-7) {
			t.Errorf("%s: %.6f s, closed form %.6f s", c.name, plan.Time, want)
		}
		if plan.StopReason != c.reason {
			t.Errorf("%s: stop %q, want %q", c.name, plan.StopReason, c.reason)
		}
		// volume moved shows up in the receiver
		got := float64(c.rcv.Volume(plan.ReceiverLevel) - c.rcv.Volume(Length(c.level)))
		if !testkit.Within(got, float64(plan.Volume), 1e-9) {
			t.Errorf("%s: receiver gained %g, moved %g", c.name, got, plan.Volume)
		}
	}
}

// baseSiphon is an invented field case: water at 15 °C, sea level, one 25 mm
// smooth rubber hose 10 m long (ε 0.01 mm, Çengel & Cimbala Table 8-2 via
// hydraulics.md §3), re-entrant intake K 0.78 (Crane TP-410) and a coupling
// on the down-leg K 0.5 (our choice).
func baseSiphon(level, intake, crest, outlet float64) Siphon {
	return Siphon{
		Fluid: drainWater, AtmPressure: 101325, Hoses: 1,
		Hose:     Hose{Diameter: 0.025, Length: 10, Roughness: 0.01e-3, KEntrance: 0.78, KDownLeg: 0.5},
		Geometry: Geometry{Surface: Length(level), Intake: Length(intake), Crest: Length(crest), Outlet: Length(outlet)},
	}
}

// bruteDrain is the independent reference: it integrates dv/dt = Q(v) in
// time by the classical fourth-order Runge–Kutta method with fixed steps dt,
// calling Solve in the real geometry at every stage, and stops at the first
// step where an event fires, interpolating the time of the event linearly
// within that step (bisection on Solve's verdict for the intake and air
// stops, which Solve reports as WillNotRun with WarnPrimeLost or
// WarnAirDrawn).
func bruteDrain(in DrainInput, dt float64) (tStop, hStop float64, why StopReason, err error) {
	src := in.Tank
	g := in.Siphon.Geometry
	vs0 := float64(src.Volume(g.Surface))
	var rcv Tank
	var vr0, vrCap, floor float64
	if in.Receiver != nil {
		rcv = in.Receiver.Tank
		vr0 = float64(rcv.Volume(in.Receiver.Level))
		vrCap = float64(rcv.Volume(rcv.Height()))
		floor = float64(in.Receiver.Floor)
	}
	base := in.Siphon
	if base.MaxFlow > 0 {
		r0, err := Solve(base)
		if err != nil {
			return 0, 0, "", err
		}
		base.Hose.OutletK += r0.MaxFlowThrottleK
		base.MaxFlow = 0
	}
	at := func(v float64) (hs, H float64, r Result, e error) {
		s := base
		hs = float64(LevelForVolume(src, Volume(vs0-v)))
		out := float64(g.Outlet)
		if rcv != nil {
			hr := floor + float64(LevelForVolume(rcv, Volume(vr0+v)))
			s.Geometry.OutletSubmerged = hr >= out
			out = math.Max(out, hr)
		}
		s.Geometry.Surface, s.Geometry.Outlet = Length(hs), Length(out)
		r, e = Solve(s)
		return hs, hs - out, r, e
	}
	q := func(v float64) float64 {
		_, _, r, _ := at(v)
		return float64(r.Flow)
	}
	eps := float64(EqualHead)
	// event values, positive while running; the intake and air events are ±1
	events := func(v float64) (ev [6]float64, hs float64, e error) {
		hs, H, r, e := at(v)
		ev[0] = math.Inf(1)
		if in.Target > 0 {
			ev[0] = hs - float64(in.Target)
		}
		ev[1] = 1
		if r.Verdict == WillNotRun && r.Why == WarnPrimeLost {
			ev[1] = -1
		}
		ev[2] = float64(r.RunningCrestHeight) - (float64(g.Crest) - hs) - eps
		ev[3] = H - eps
		ev[4] = math.Inf(1)
		if rcv != nil {
			ev[4] = vrCap - vr0 - v
		}
		ev[5] = 1
		if r.Verdict == WillNotRun && r.Why == WarnAirDrawn {
			ev[5] = -1
		}
		return ev, hs, e
	}
	reasons := [6]StopReason{StopTarget, StopIntake, StopCrest, StopEqual, StopReceiverFull, StopAir}
	v, t := 0.0, 0.0
	prev, hs, err := events(0)
	if err != nil {
		return 0, 0, "", err
	}
	for i := 0; i < 2_000_000; i++ {
		k1 := q(v)
		k2 := q(v + dt/2*k1)
		k3 := q(v + dt/2*k2)
		k4 := q(v + dt*k3)
		vn := v + dt/6*(k1+2*k2+2*k3+k4)
		cur, hn, err := events(vn)
		if err != nil {
			return 0, 0, "", err
		}
		best, bestF := -1, 2.0
		for k := range cur {
			if cur[k] > 0 {
				continue
			}
			f := 1.0
			if k == 1 || k == 5 {
				lo, hi := v, vn
				for j := 0; j < 60; j++ {
					m := (lo + hi) / 2
					if e, _, _ := events(m); e[k] > 0 {
						lo = m
					} else {
						hi = m
					}
				}
				f = (lo - v) / (vn - v)
			} else if !math.IsInf(prev[k], 1) {
				f = prev[k] / (prev[k] - cur[k])
			}
			if f < bestF {
				best, bestF = k, f
			}
		}
		if best >= 0 {
			vs := v + bestF*(vn-v)
			hStop = float64(LevelForVolume(src, Volume(vs0-vs)))
			return t + bestF*dt, hStop, reasons[best], nil
		}
		v, t, prev, hs = vn, t+dt, cur, hn
		_ = hs
	}
	return t, hs, "", errors.New("brute force did not stop")
}

// TestDrainMatchesBruteForce: the fast plan agrees with the brute-force
// Runge–Kutta integration (Solve at every stage, 20 000 steps) within 0.1 %
// in time and 1 mm in stop level, over shapes, stop reasons and flow regimes.
// Source: independent numerical integration of the same quasi-steady model.
func TestDrainMatchesBruteForce(t *testing.T) {
	diesel := Fluid{Density: 840, Viscosity: 3.0e-3, VaporPressure: 300}   // 3.6 mm²/s, inside the EN 590 range 2.0–4.5 mm²/s at 40 °C (hydraulics.md §8.2)
	glycol := Fluid{Density: 1070, Viscosity: 9.0e-3, VaporPressure: 1500} // illustrative cold glycol mix: Melinder's table gives 4.9 mPa·s for EG 50 vol% at 15 °C (hydraulics.md §8.3); colder is thicker
	oil := Fluid{Density: 870, Viscosity: 0.1, VaporPressure: 100}         // about ISO VG 100 (100 mm²/s) at 40 °C (hydraulics.md §8.4), rounded
	with := func(s Siphon, f func(*Siphon)) Siphon { f(&s); return s }
	cases := []struct {
		name   string
		in     DrainInput
		reason StopReason
	}{
		{"vertical cylinder to intake", DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)),
			Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}, StopIntake},
		{"vertical cylinder to equal (outlet above floor)", DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)),
			Siphon: baseSiphon(1.4, 0.05, 1.9, 0.5)}, StopEqual},
		{"horizontal cylinder to target", DrainInput{Tank: mustTank(NewHorizontalCylinder(1.6, 3)), Target: 0.4,
			Siphon: baseSiphon(1.5, 0.05, 2.2, -1)}, StopTarget},
		{"cone bottom through the cone", DrainInput{Tank: mustTank(NewConeBottom(1.5, 0.8, 2.5)),
			Siphon: baseSiphon(2.2, 0.1, 2.8, -1.5)}, StopIntake},
		{"sphere", DrainInput{Tank: mustTank(NewSphere(2)),
			Siphon: baseSiphon(1.9, 0.15, 2.5, -1)}, StopIntake},
		{"sloped pit, two hoses", DrainInput{Tank: mustTank(NewSlopedPit(3, 2, 1.5, 1.2)),
			Siphon: with(baseSiphon(1.0, 0.05, 1.6, -1.5), func(s *Siphon) { s.Hoses = 2; s.Hose.Diameter = 0.038; s.Hose.Length = 15 })}, StopIntake},
		{"table", DrainInput{Tank: mustTank(NewTable([]float64{0, 0.3, 0.6, 1.0, 1.5}, []float64{0, 0.1, 0.35, 0.9, 1.6})),
			Siphon: baseSiphon(1.45, 0.05, 1.9, 0.2)}, StopEqual},
		{"crest limit as the lift grows", DrainInput{Tank: mustTank(NewVerticalCylinder(1.5, 2)),
			Siphon: with(baseSiphon(1.9, 0.05, 9.6, -3), func(s *Siphon) { s.Hose.Length = 25 })}, StopCrest},
		{"diesel, transitional at the end", DrainInput{Tank: mustTank(NewVerticalCylinder(1.0, 1.5)),
			Siphon: with(baseSiphon(1.4, 0.05, 1.8, 0.6), func(s *Siphon) { s.Fluid = diesel })}, StopEqual},
		{"glycol mix crossing transition", DrainInput{Tank: mustTank(NewVerticalCylinder(1.0, 1.5)),
			Siphon: with(baseSiphon(1.4, 0.05, 1.8, -0.8), func(s *Siphon) { s.Fluid = glycol; s.Hose.Diameter = 0.019 })}, StopIntake},
		// The laminar oil is too slow to clear air (V < V_c, Wisner et al.):
		// once air starts to be drawn in it gathers at the crest.
		{"laminar oil", DrainInput{Tank: mustTank(NewRectangular(1, 0.6, 1)),
			Siphon: with(baseSiphon(0.9, 0.05, 1.2, -1), func(s *Siphon) { s.Fluid = oil; s.Hose.Diameter = 0.032 })}, StopAir},
		{"transfer into a horizontal cylinder", DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 2)),
			Receiver: &Receiver{Tank: mustTank(NewHorizontalCylinder(1.4, 2.5)), Floor: -0.4, Level: 0.1},
			Siphon:   baseSiphon(1.8, 0.05, 2.3, -1.1)}, StopEqual},
		{"transfer until the receiver is full", DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 2)),
			Receiver: &Receiver{Tank: mustTank(NewRectangular(0.8, 0.8, 1)), Floor: -1.5, Level: 0.1},
			Siphon:   baseSiphon(1.8, 0.05, 2.3, -1.4)}, StopReceiverFull},
	}
	steps := 20000.0
	if testing.Short() {
		steps = 4000
	}
	for _, c := range cases {
		plan, err := PlanDrain(c.in)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if plan.StopReason != c.reason {
			t.Errorf("%s: stop %q, want %q", c.name, plan.StopReason, c.reason)
		}
		tb, hb, why, err := bruteDrain(c.in, float64(plan.Time)/steps)
		if err != nil {
			t.Errorf("%s: brute force: %v", c.name, err)
			continue
		}
		if why != plan.StopReason || !testkit.Within(float64(plan.Time), tb, 1e-3) || math.Abs(float64(plan.StopLevel)-hb) > 1e-3 {
			t.Errorf("%s: plan %.4f s to %.5f m (%s); brute force %.4f s to %.5f m (%s)",
				c.name, plan.Time, plan.StopLevel, plan.StopReason, tb, hb, why)
		} else {
			t.Logf("%s: plan %.4f s, brute force %.4f s (%.1e), stop %.5f m (%s)", c.name, plan.Time, tb,
				float64(plan.Time)/tb-1, plan.StopLevel, why)
		}
	}
}

var (
	sinkPlan DrainPlan
	sinkTime float64
)

// benchDrainInput is the benchmark case: a vertical cylinder drained to the
// intake with a 200-point curve.
func benchDrainInput() DrainInput {
	return DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2), CurvePoints: 200}
}

func BenchmarkPlanDrain(b *testing.B) {
	in := benchDrainInput()
	b.ReportAllocs()
	for b.Loop() {
		sinkPlan, _ = PlanDrain(in)
	}
}

// BenchmarkBruteForceDrain is the reference integration of the same case
// (RK4, 20 000 steps, Solve at every stage), for the speed-up ratio.
func BenchmarkBruteForceDrain(b *testing.B) {
	in := benchDrainInput()
	plan, _ := PlanDrain(in)
	dt := float64(plan.Time) / 20000
	b.ReportAllocs()
	for b.Loop() {
		sinkTime, _, _, _ = bruteDrain(in, dt)
	}
}

// crestCase drains a tank with a high crest so that the lift reaches the
// flowing crest limit on the way down (invented case).
func crestCase() DrainInput {
	s := baseSiphon(1.9, 0.05, 9.6, -3)
	s.Hose.Length = 25
	return DrainInput{Tank: mustTank(NewVerticalCylinder(1.5, 2)), Siphon: s}
}

// solveLevel is Solve for s with the surface at level h.
func solveLevel(t *testing.T, s Siphon, h Length) Result {
	t.Helper()
	s.Geometry.Surface = h
	r, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestDrainCrestStop: the crest stop lies where the lift reaches Solve's
// running crest height less EqualHead, to 1e-9 m; just past the running
// height Solve will not run (cannot run); between the choke level and the
// stop Solve runs choked, above it not; the working-limit level lies above
// the choke level (properties of the crest limits in crest.go and Solve's
// doc: p_work > p_run).
func TestDrainCrestStop(t *testing.T) {
	in := crestCase()
	plan, err := PlanDrain(in)
	if err != nil {
		t.Fatal(err)
	}
	if plan.StopReason != StopCrest || !plan.CrestLimitFound || plan.CrestLimitLevel != plan.StopLevel {
		t.Fatalf("plan %+v", plan.StopReason)
	}
	at := func(h Length) Result { return solveLevel(t, in.Siphon, h) }
	r := at(plan.StopLevel)
	if want := in.Siphon.Geometry.Crest - r.RunningCrestHeight + EqualHead; math.Abs(float64(plan.StopLevel-want)) > 1e-9 {
		t.Errorf("crest stop %.9f m, running crest height puts it at %.9f m", plan.StopLevel, want)
	}
	if r.Verdict != RunsChoked {
		t.Errorf("at the crest stop Solve says %v, want runs choked", r.Verdict)
	}
	if r := at(plan.StopLevel - EqualHead - 1e-6); r.Verdict != WillNotRun || r.Why != WarnCannotRun {
		t.Errorf("past the running crest height Solve says %v (%v)", r.Verdict, r.Why)
	}
	// Solve's verdict turns from runs to runs-near-limit at the working
	// limit (a lower crest, so that this happens during the drain).
	low := in
	low.Siphon.Geometry.Crest = 6.2
	pl, err := PlanDrain(low)
	if err != nil {
		t.Fatal(err)
	}
	if pl.Start.Verdict != Runs || !pl.WorkingLimitFound || pl.CrestLimitFound {
		t.Fatalf("low crest: start %v, working limit %v, crest limit %v", pl.Start.Verdict, pl.WorkingLimitFound, pl.CrestLimitFound)
	}
	if r := solveLevel(t, low.Siphon, pl.WorkingLimitLevel+1e-5); r.Verdict != Runs {
		t.Errorf("just above the working limit level Solve says %v", r.Verdict)
	}
	if r := solveLevel(t, low.Siphon, pl.WorkingLimitLevel-1e-5); r.Verdict != RunsNearLimit {
		t.Errorf("just below the working limit level Solve says %v", r.Verdict)
	}
	// Stopping at a target above it still reports where the crest stops it.
	in.Target = plan.StopLevel + 0.2
	pt, err := PlanDrain(in)
	if err != nil {
		t.Fatal(err)
	}
	if pt.StopReason != StopTarget || !pt.CrestLimitFound || math.Abs(float64(pt.CrestLimitLevel-plan.CrestLimitLevel)) > 1e-9 {
		t.Errorf("target plan: %s, crest limit %g (found %v), want %g", pt.StopReason, pt.CrestLimitLevel, pt.CrestLimitFound, plan.CrestLimitLevel)
	}
}

// TestDrainChokeLevel: the crest case chokes from the start; with a lower
// crest the siphon chokes on the way down, where Solve's verdict turns to
// runs choked, and the working limit (p_work > p_run) is passed before that.
func TestDrainChokeLevel(t *testing.T) {
	in := crestCase()
	plan, err := PlanDrain(in)
	if err != nil {
		t.Fatal(err)
	}
	if plan.Start.Verdict != RunsChoked || !plan.ChokeFound || plan.ChokeLevel != in.Siphon.Geometry.Surface {
		t.Errorf("start %v, choke level %g (found %v)", plan.Start.Verdict, plan.ChokeLevel, plan.ChokeFound)
	}
	mid := in
	mid.Siphon.Geometry.Crest = 8.8
	pm, err := PlanDrain(mid)
	if err != nil {
		t.Fatal(err)
	}
	if pm.Start.Verdict == RunsChoked || !pm.ChokeFound || !(pm.ChokeLevel > pm.StopLevel) {
		t.Fatalf("crest 8.8 m: start %v, choke level %g (found %v), stop %g (%s)", pm.Start.Verdict, pm.ChokeLevel, pm.ChokeFound, pm.StopLevel, pm.StopReason)
	}
	if r := solveLevel(t, mid.Siphon, pm.ChokeLevel-1e-5); r.Verdict != RunsChoked {
		t.Errorf("just below the choke level Solve says %v", r.Verdict)
	}
	if r := solveLevel(t, mid.Siphon, pm.ChokeLevel+1e-5); r.Verdict == RunsChoked {
		t.Errorf("just above the choke level Solve says %v", r.Verdict)
	}
	if !pm.WorkingLimitFound || !(pm.WorkingLimitLevel > pm.ChokeLevel) {
		t.Errorf("working limit %g (found %v) should be above the choke level %g", pm.WorkingLimitLevel, pm.WorkingLimitFound, pm.ChokeLevel)
	}
}

// TestDrainIntakeStopMatchesSolve: at an intake stop the level is the
// prime-lost level Solve gives there (the prime-lost depth over the opening), to
// 1e-6 m: just above it Solve runs (gulping), just below it the prime is
// lost.
func TestDrainIntakeStopMatchesSolve(t *testing.T) {
	in := benchDrainInput()
	plan, err := PlanDrain(in)
	if err != nil {
		t.Fatal(err)
	}
	r := solveLevel(t, in.Siphon, plan.StopLevel+1e-6)
	if plan.StopReason != StopIntake || math.Abs(float64(plan.StopLevel-r.PrimeLostLevel)) > 1e-6 || plan.PrimeLostLevel != plan.StopLevel {
		t.Errorf("stop %s at %g m: Solve's prime-lost level %g m, plan's %g", plan.StopReason, plan.StopLevel, r.PrimeLostLevel, plan.PrimeLostLevel)
	}
	if r.Verdict == WillNotRun || !r.Warnings.Has(WarnIntakeShallow) || !(r.GulpVoid > 0) {
		t.Errorf("just above the stop Solve says %v, gulping %g", r.Verdict, r.GulpVoid)
	}
	if r := solveLevel(t, in.Siphon, plan.StopLevel-1e-6); r.Verdict != WillNotRun || r.Why != WarnPrimeLost {
		t.Errorf("just below the stop Solve says %v (%v)", r.Verdict, r.Why)
	}
	if plan.CrestLimitFound {
		t.Errorf("no crest limit expected with a 0.5 m lift, got %g", plan.CrestLimitLevel)
	}
	if !testkit.Within(float64(plan.EndFlow), float64(r.Flow), 1e-4) || plan.StartFlow != plan.Start.Flow {
		t.Errorf("end flow %g, Solve %g", plan.EndFlow, r.Flow)
	}
	if !testkit.Within(float64(plan.Volume+plan.Residual), float64(in.Tank.Volume(in.Siphon.Geometry.Surface)), 1e-12) {
		t.Errorf("volume moved %g + residual %g ≠ start volume", plan.Volume, plan.Residual)
	}
	if !(plan.AirStartsLevel > plan.PrimeLostLevel) || !(plan.GulpTime > 0) || !(plan.GulpTimeLost > 0) || plan.GulpTimeLost >= plan.GulpTime {
		t.Errorf("air starts %g, prime lost %g, gulping %g s (lost %g s)", plan.AirStartsLevel, plan.PrimeLostLevel, plan.GulpTime, plan.GulpTimeLost)
	}
}

// TestDrainCurve: the curve has the requested points, starts at the start,
// ends at the stop, and time rises while level and flow fall (quasi-steady
// model: Q rises with head).
func TestDrainCurve(t *testing.T) {
	for _, n := range []int{0, 2, 3, 57, 200, MaxCurvePoints} {
		in := benchDrainInput()
		in.Siphon.Geometry.Outlet = 0.5 // stop at equal levels: the slow tail
		in.CurvePoints = n
		plan, err := PlanDrain(in)
		if err != nil {
			t.Fatal(err)
		}
		want := n
		if n == 0 {
			want = DefaultCurvePoints
		}
		c := plan.Curve
		if len(c) != want {
			t.Fatalf("%d points asked, %d given", n, len(c))
		}
		if c[0].Time != 0 || c[0].Level != in.Siphon.Geometry.Surface || c[len(c)-1].Level != plan.StopLevel || c[len(c)-1].Time != plan.Time {
			t.Errorf("ends %+v … %+v", c[0], c[len(c)-1])
		}
		for i := 1; i < len(c); i++ {
			if !(c[i].Time > c[i-1].Time) || !(c[i].Level < c[i-1].Level) || !(c[i].Flow < c[i-1].Flow) || !(c[i].Flow > 0) {
				t.Fatalf("n=%d point %d not monotone: %+v after %+v", n, i, c[i], c[i-1])
			}
		}
	}
}

// TestDrainStopsAtOnce: cases that cannot drain give a zero-time plan with
// the reason.
func TestDrainStopsAtOnce(t *testing.T) {
	tank := mustTank(NewVerticalCylinder(1.2, 1.5))
	// Expected reasons follow Solve's verdict rules (calc/solve.go doc) and
	// the stop rules in PlanDrain's doc.
	cases := []struct {
		name   string
		in     DrainInput
		reason StopReason
	}{
		{"crest above the barometric limit", DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 12, -2)}, StopCrest},
		{"outlet above the surface", DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 1.9, 1.45)}, StopEqual},
		{"head under 1 cm", DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 1.9, 1.395)}, StopEqual},
		{"prime lost: 2 mm over the mouth", DrainInput{Tank: tank, Siphon: baseSiphon(0.052, 0.05, 1.9, -2)}, StopIntake},
		{"intake at the surface", DrainInput{Tank: tank, Siphon: baseSiphon(0.7, 0.7, 1.9, -2)}, StopIntake},
		{"air with a film and no board", DrainInput{Tank: tank, Siphon: func() Siphon {
			s := baseSiphon(0.1, 0.05, 1.9, -2)
			s.Intake.FilmRisk = true
			return s
		}()}, StopAir},
		{"boiling liquid", DrainInput{Tank: tank, Siphon: func() Siphon {
			s := baseSiphon(1.4, 0.05, 1.9, -2)
			s.Fluid.VaporPressure = 101325
			return s
		}()}, StopCrest},
		{"lay-flat hose", DrainInput{Tank: tank, Siphon: func() Siphon {
			s := baseSiphon(1.4, 0.05, 1.9, -2)
			s.Hose.Vacuum = VacuumNone
			return s
		}()}, StopCrest},
		{"receiver already full", DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 1.9, -2),
			Receiver: &Receiver{Tank: mustTank(NewRectangular(1, 1, 0.5)), Floor: -2.5, Level: 0.5}}, StopReceiverFull},
	}
	for _, c := range cases {
		plan, err := PlanDrain(c.in)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if plan.StopReason != c.reason || plan.Time != 0 || plan.Volume != 0 || len(plan.Curve) != 1 ||
			plan.StopLevel != c.in.Siphon.Geometry.Surface {
			t.Errorf("%s: %s after %g s, %g m³, %d points", c.name, plan.StopReason, plan.Time, plan.Volume, len(plan.Curve))
		}
	}
}

func TestDrainBadInput(t *testing.T) {
	tank := mustTank(NewVerticalCylinder(1.2, 1.5))
	ok := DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}
	mod := func(f func(*DrainInput)) DrainInput { in := ok; f(&in); return in }
	cases := []struct {
		name string
		in   DrainInput
		is   error
	}{
		{"no tank", mod(func(in *DrainInput) { in.Tank = nil }), ErrNoTank},
		{"level above the brim", mod(func(in *DrainInput) { in.Siphon.Geometry.Surface = 1.6 }), ErrOutOfRange},
		{"level zero", mod(func(in *DrainInput) { in.Siphon.Geometry.Surface = 0 }), ErrOutOfRange},
		{"level NaN", mod(func(in *DrainInput) { in.Siphon.Geometry.Surface = Length(math.NaN()) }), ErrNotFinite},
		{"intake below the floor", mod(func(in *DrainInput) { in.Siphon.Geometry.Intake = -0.1 }), ErrOutOfRange},
		{"intake above the level", mod(func(in *DrainInput) { in.Siphon.Geometry.Intake = 1.45 }), ErrGeometry},
		{"target above the level", mod(func(in *DrainInput) { in.Target = 1.4 }), ErrOutOfRange},
		{"target negative", mod(func(in *DrainInput) { in.Target = -0.2 }), ErrOutOfRange},
		{"one curve point", mod(func(in *DrainInput) { in.CurvePoints = 1 }), ErrOutOfRange},
		{"too many curve points", mod(func(in *DrainInput) { in.CurvePoints = MaxCurvePoints + 1 }), ErrOutOfRange},
		{"receiver without tank", mod(func(in *DrainInput) { in.Receiver = &Receiver{} }), ErrNoTank},
		{"receiver overfull", mod(func(in *DrainInput) { in.Receiver = &Receiver{Tank: tank, Level: 2} }), ErrOutOfRange},
		{"bad hose", mod(func(in *DrainInput) { in.Siphon.Hose.Diameter = 0 }), ErrOutOfRange},
	}
	for _, c := range cases {
		_, err := PlanDrain(c.in)
		if !errors.Is(err, c.is) {
			t.Errorf("%s: got %v, want %v", c.name, err, c.is)
		}
		var re *RangeError
		if !errors.As(err, &re) {
			t.Errorf("%s: not a *RangeError: %v", c.name, err)
		}
	}
}

// FuzzPlanDrain: any input gives an error or a finite plan with a known stop
// reason; it never panics or hangs.
func FuzzPlanDrain(f *testing.F) {
	f.Add(1.4, 0.05, 1.9, -2.0, 0.025, 10.0, 1.2, 0.0, 0.0, false, uint8(0), false, false, 0.0)
	f.Add(1.9, 0.05, 9.6, -3.0, 0.025, 25.0, 1.5, 0.0, 0.0, false, uint8(2), true, false, 0.0)
	f.Add(1.8, 0.05, 2.3, -1.1, 0.025, 10.0, 1.2, 0.3, -0.4, true, uint8(5), false, true, 1e-3)
	f.Add(0.2, 0.19, 0.3, 0.1, 0.3, 0.5, 50.0, 0.195, 0.0, false, uint8(1), true, true, 0.0)
	f.Fuzz(func(t *testing.T, level, intake, crest, outlet, diam, length, tankD, target, rcvFloor float64, rcv bool,
		kind uint8, film, cover bool, qmax float64) {
		tk, err := NewVerticalCylinder(Length(tankD), 2)
		if err != nil {
			return
		}
		s := baseSiphon(level, intake, crest, outlet)
		s.Hose.Diameter, s.Hose.Length = Length(diam), Length(length)
		s.Intake = Intake{Kind: IntakeKind(kind % 6), FaceDiameter: 0.08, Height: 0.03, FloatDepth: 0.05, FilmRisk: film, Covered: cover}
		s.MaxFlow = FlowRate(qmax)
		in := DrainInput{Tank: tk, Siphon: s, Target: Length(target), CurvePoints: 20}
		if rcv {
			in.Receiver = &Receiver{Tank: mustTank(NewHorizontalCylinder(1.4, 2.5)), Floor: Length(rcvFloor), Level: 0.1}
		}
		plan, err := PlanDrain(in)
		if err != nil {
			return
		}
		vals := []float64{float64(plan.Time), float64(plan.Volume), float64(plan.StopLevel), float64(plan.Residual),
			float64(plan.StartFlow), float64(plan.EndFlow), float64(plan.CrestLimitLevel), float64(plan.WorkingLimitLevel), float64(plan.ReceiverLevel),
			float64(plan.AirStartsLevel), float64(plan.PrimeLostLevel), float64(plan.GulpTime), float64(plan.GulpTimeLost),
			float64(plan.ChokeLevel), float64(plan.AirGatherLevel), float64(plan.CollapseLevel)}
		for _, p := range plan.Curve {
			vals = append(vals, float64(p.Time), float64(p.Level), float64(p.Flow), float64(p.ReceiverLevel))
		}
		for i, v := range vals {
			if math.IsNaN(v) || math.IsInf(v, 0) || v < -MaxElevation {
				t.Fatalf("value %d not finite: %g (%+v)", i, v, plan)
			}
		}
		switch plan.StopReason {
		case StopTarget, StopIntake, StopAir, StopCrest, StopEqual, StopReceiverFull:
		default:
			t.Fatalf("stop reason %q", plan.StopReason)
		}
		if len(plan.Curve) > 20 || plan.Time < 0 || plan.Volume < 0 || plan.StopLevel > s.Geometry.Surface ||
			plan.GulpTimeLost > plan.GulpTime || plan.GulpTime > plan.Time*(1+1e-9) {
			t.Fatalf("plan %+v", plan)
		}
		if target > 0 && plan.StopLevel < Length(target)*(1-1e-9) {
			t.Fatalf("drained past the target %v to %v", target, plan.StopLevel)
		}
	})
}

// BenchmarkPlanTransfer: a transfer into a horizontal cylinder (both levels
// found by inverting V(h) at every node), 200-point curve.
func BenchmarkPlanTransfer(b *testing.B) {
	in := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 2)),
		Receiver: &Receiver{Tank: mustTank(NewHorizontalCylinder(1.4, 2.5)), Floor: -0.4, Level: 0.1},
		Siphon:   baseSiphon(1.8, 0.05, 2.3, -1.1)}
	b.ReportAllocs()
	for b.Loop() {
		sinkPlan, _ = PlanDrain(in)
	}
}

// An invented job: a 1.2 m upright tank holding 1.4 m of rain water is
// emptied with one 25 mm hose, 10 m long, over a rim 0.5 m above the water to
// a ditch 2 m below the tank floor.
func ExamplePlanDrain() {
	tank, err := NewVerticalCylinder(1.2, 1.5)
	if err != nil {
		panic(err)
	}
	plan, err := PlanDrain(DrainInput{
		Tank: tank,
		Siphon: Siphon{
			Fluid:       Fluid{Density: 999.10, Viscosity: 1.1375e-3, VaporPressure: 1705.8}, // water at 15 °C
			AtmPressure: 101325,
			Hoses:       1,
			Hose:        Hose{Diameter: 0.025, Length: 10, Roughness: 0.01e-3, KEntrance: 0.78, KDownLeg: 0.5},
			Geometry:    Geometry{Surface: 1.4, Intake: 0.05, Crest: 1.9, Outlet: -2},
		},
	})
	if err != nil {
		panic(err)
	}
	fmt.Printf("start flow %.2f L/min\n", float64(plan.StartFlow)*60000)
	fmt.Printf("stops at %.3f m (%s) after %.0f min\n", float64(plan.StopLevel), plan.StopReason, float64(plan.Time)/60)
	fmt.Printf("moved %.3f m³, left %.3f m³\n", float64(plan.Volume), float64(plan.Residual))
	// The bare hose end draws air from 0.31 m down: it gulps and slows for
	// the last part of the drain (plan.AirStartsLevel, plan.GulpTime).
	// Output:
	// start flow 72.31 L/min
	// stops at 0.096 m (intake) after 23 min
	// moved 1.475 m³, left 0.108 m³
}
