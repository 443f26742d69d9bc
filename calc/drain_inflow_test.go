package calc

import (
	"errors"
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// torricelliInflow is the closed form for a vertical prism of plan area A
// drained through a constant-coefficient outlet, Q = k√H with k = C·a·√(2g),
// while Q_in comes in: A dH/dt = Q_in − k√H. With u = √H and u_s = Q_in/k
// (the settle head is u_s²), separating the variables,
//
//	t = (2A/k)·[(u₀ − u₁) + u_s·ln((u₀ − u_s)/(u₁ − u_s))]
//
// (analytic, derived here from the volume balance; with Q_in = 0 it is the
// Torricelli drain time of hydraulics.md §7).
func torricelliInflow(A, k, qin, h0, h1 float64) float64 {
	u0, u1, us := math.Sqrt(h0), math.Sqrt(h1), qin/k
	return 2 * A / k * ((u0 - u1) + us*math.Log((u0-us)/(u1-us)))
}

// TestInflowClosedForm checks the planner with inflow, run with a constant
// loss coefficient, against the closed form above: the settle level is where
// k√H = Q_in (the analytic equilibrium), the time is to within SettleMargin
// of it, and every curve point lies on the closed form; a target above the
// settle level is reached in the time the closed form gives.
func TestInflowClosedForm(t *testing.T) {
	const C, g = 0.6, StandardGravity
	A, a := 2.0*1.5, circle(0.03)
	k := C * a * math.Sqrt(2*g)
	for _, c := range []struct {
		name            string
		h0, outlet, qin float64
		target          float64
		reason          StopReason
	}{
		{"settles, outlet at the floor", 1.2, 0, 0.4 * k, 0, StopSettles},   // H_s = 0.16 m
		{"settles, outlet 2 m below", 1.2, -2, 1.6 * k, 0, StopSettles},     // H_s = 2.56 m, level 0.56 m
		{"target above the settle level", 1.2, 0, 0.5 * k, 0.5, StopTarget}, // H_s = 0.25 m
		{"keeps up to the floor", 1.2, -1, 0.2 * k, 0, StopIntake},          // H_s = 0.04 m, below the floor's head 1 m
		{"small inflow, settles just above the floor", 1.0, 0, 0.3 * k, 0, StopSettles},
	} {
		tk := mustTank(NewRectangular(2, 1.5, 1.5))
		in := DrainInput{Tank: tk, Target: Length(c.target), Inflow: FlowRate(c.qin),
			Siphon: Siphon{Geometry: Geometry{Surface: Length(c.h0), Intake: 0, Crest: Length(c.h0), Outlet: Length(c.outlet)}}}
		plan, err := planFixed(in, C, a, g, 1e-6)
		if err != nil {
			t.Fatal(c.name, err)
		}
		if plan.StopReason != c.reason {
			t.Fatalf("%s: stop %q, want %q", c.name, plan.StopReason, c.reason)
		}
		hs := (c.qin/k)*(c.qin/k) + c.outlet // level of the analytic equilibrium
		h1 := math.Max(c.target, 0)
		switch c.reason {
		case StopSettles:
			testkit.Close(t, c.name+": settle level (m)", float64(plan.SettleLevel), hs, 1e-9, "k√H_s = Q_in")
			h1 = hs + float64(SettleMargin)
		case StopIntake:
			if plan.SettleFound {
				t.Errorf("%s: keeps up, yet a settle level %g", c.name, plan.SettleLevel)
			}
		default: // a target stop: the level ends at the target
		}
		want := torricelliInflow(A, k, c.qin, c.h0-c.outlet, h1-c.outlet)
		testkit.Close(t, c.name+": time (s)", float64(plan.Time), want, 1e-7, "closed form with inflow")
		for _, pt := range plan.Curve {
			tw := torricelliInflow(A, k, c.qin, c.h0-c.outlet, float64(pt.Level)-c.outlet)
			if math.Abs(float64(pt.Time)-tw) > 1e-6*want {
				t.Fatalf("%s: curve at %g m: %g s, closed form %g s", c.name, pt.Level, pt.Time, tw)
			}
		}
		// the siphon moves the fall of the level plus what came in
		moved := A*(c.h0-h1) + c.qin*want
		testkit.Close(t, c.name+": volume moved (m³)", float64(plan.Volume), moved, 1e-7, "volume balance")
	}
}

// rk4Inflow is the independent reference: A(h)·dh/dt = Q_in − Q(h) by the
// classical fourth-order Runge–Kutta method with fixed steps dt, calling
// Solve in the real geometry at every stage, until h is within margin of
// hs; the crossing is interpolated linearly within the last step.
func rk4Inflow(in DrainInput, hs, dt float64) (float64, error) {
	f := func(h float64) float64 {
		s := in.Siphon
		s.Geometry.Surface = Length(h)
		r, _ := Solve(s)
		return (float64(in.Inflow) - float64(r.Flow)) / float64(in.Tank.Area(Length(h)))
	}
	h, t := float64(in.Siphon.Geometry.Surface), 0.0
	stop := hs + float64(SettleMargin)
	rising := f(h) > 0
	if rising {
		stop = hs - float64(SettleMargin)
	}
	for i := 0; i < 5_000_000; i++ {
		k1 := f(h)
		k2 := f(h + dt/2*k1)
		k3 := f(h + dt/2*k2)
		k4 := f(h + dt*k3)
		hn := h + dt/6*(k1+2*k2+2*k3+k4)
		if (!rising && hn <= stop) || (rising && hn >= stop) {
			return t + dt*(h-stop)/(h-hn), nil
		}
		h, t = hn, t+dt
	}
	return t, errors.New("no settle")
}

// settleBySolve finds the settle level by bisection on Solve itself, in
// [lo, hi], independently of the planner's tables.
func settleBySolve(in DrainInput, lo, hi float64) float64 {
	q := func(h float64) float64 {
		s := in.Siphon
		s.Geometry.Surface = Length(h)
		r, _ := Solve(s)
		return float64(r.Flow) - float64(in.Inflow)
	}
	up := q(hi) > 0
	for range 80 {
		m := (lo + hi) / 2
		if (q(m) > 0) == up {
			hi = m
		} else {
			lo = m
		}
	}
	return (lo + hi) / 2
}

// TestInflowMatchesRK4: with the full energy equation (Solve), the planner's
// settle level matches bisection on Solve to 0.1 mm and its time an
// independent fixed-step RK4 integration to 0.2 %, falling and rising.
func TestInflowMatchesRK4(t *testing.T) {
	s := baseSiphon(1.0, 0.05, 1.4, -1.5)
	r0, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		frac float64 // inflow as a fraction of the start flow
	}{{"falls behind as the level drops", 0.9}, {"settles low", 0.75}, {"rises: the inflow outruns it", 1.08}} {
		in := DrainInput{Tank: mustTank(NewVerticalCylinder(0.8, 1.5)), Siphon: s, Inflow: FlowRate(c.frac * float64(r0.Flow))}
		plan, err := PlanDrain(in)
		if err != nil {
			t.Fatal(err)
		}
		if plan.StopReason != StopSettles || !plan.SettleFound {
			t.Fatalf("%s: stop %q", c.name, plan.StopReason)
		}
		lo, hi := 0.06, 1.0
		if c.frac > 1 {
			lo, hi = 1.0, 1.5
		}
		hs := settleBySolve(in, lo, hi)
		if math.Abs(float64(plan.SettleLevel)-hs) > 1e-4 {
			t.Errorf("%s: settle %.6f m, bisection on Solve %.6f m", c.name, plan.SettleLevel, hs)
		}
		if plan.Rises != (c.frac > 1) || plan.Overflows {
			t.Errorf("%s: rises %v overflows %v", c.name, plan.Rises, plan.Overflows)
		}
		want, err := rk4Inflow(in, hs, 0.5)
		if err != nil {
			t.Fatal(err)
		}
		testkit.Close(t, c.name+": time (s)", float64(plan.Time), want, 2e-3, "RK4 with Solve at every stage")
		if !(plan.Time90 > 0 && plan.Time90 < plan.Time) {
			t.Errorf("%s: time to 90 %% %g of %g", c.name, plan.Time90, plan.Time)
		}
	}
}

// TestInflowBund: the figures. 25 mm/h of rain on a 600 m² bund is
// 4.17 L/s (250 L/min), more than a 38 mm siphon moves at a 1 m drop, so the
// level rises; 10 mm/h on a 40 m² bund is 6.7 L/min (1.11e-4 m³/s), which
// a 38 mm siphon keeps up with.
func TestInflowBund(t *testing.T) {
	s := Siphon{Fluid: drainWater, AtmPressure: 101325, Hoses: 1,
		Hose:     Hose{Diameter: 0.038, Length: 15, Roughness: 0.01e-3, KEntrance: 0.78, KDownLeg: 0.5},
		Geometry: Geometry{Surface: 0.3, Intake: 0.02, Crest: 1.0, Outlet: -0.7}}
	big := DrainInput{Tank: mustTank(NewRectangular(30, 20, 0.5)), Siphon: s, Inflow: FlowRate(0.025 / 3600 * 600)}
	plan, err := PlanDrain(big)
	if err != nil {
		t.Fatal(err)
	}
	if !plan.Rises || plan.StopReason != StopSettles || plan.StartFlow >= big.Inflow {
		t.Errorf("600 m² at 25 mm/h: rises %v stop %q, start flow %g vs inflow %g", plan.Rises, plan.StopReason, plan.StartFlow, big.Inflow)
	}
	if !plan.Overflows || plan.SettleLevel != 0.5 {
		t.Errorf("600 m² at 25 mm/h: overflows %v, settles at %g", plan.Overflows, plan.SettleLevel)
	}
	// closed check of the rising time: at most the time to fill the 0.2 m
	// with the inflow alone less the largest siphon flow on the way, at
	// least with the start flow
	fill := 600 * 0.2
	lo := fill / float64(big.Inflow-plan.StartFlow)
	hi := fill / float64(big.Inflow-plan.EndFlow)
	if !(float64(plan.Time) > lo && float64(plan.Time) < hi) {
		t.Errorf("time to the brim %g s not in (%g, %g)", plan.Time, lo, hi)
	}
	small := DrainInput{Tank: mustTank(NewRectangular(8, 5, 0.5)), Siphon: s, Inflow: FlowRate(0.010 / 3600 * 40)}
	testkit.Close(t, "10 mm/h on 40 m² (L/min)", float64(small.Inflow)*60000, 6.667, 1e-3, "the issue: 6.7 L/min")
	p2, err := PlanDrain(small)
	if err != nil {
		t.Fatal(err)
	}
	if p2.Rises || p2.SettleFound {
		t.Errorf("40 m² at 10 mm/h should keep up: %+v", p2.StopReason)
	}
}

func TestInflowBadInput(t *testing.T) {
	s := baseSiphon(1.0, 0.05, 1.4, -1.5)
	tk := mustTank(NewVerticalCylinder(0.8, 1.5))
	for _, in := range []DrainInput{
		{Tank: tk, Siphon: s, Inflow: -1e-3},
		{Tank: tk, Siphon: s, Inflow: FlowRate(math.NaN())},
		{Tank: tk, Siphon: s, Inflow: FlowRate(math.Inf(1))},
		{Tank: tk, Siphon: s, Inflow: 1e-3, Receiver: &Receiver{Tank: tk}},
	} {
		_, err := PlanDrain(in)
		var re *RangeError
		if !errors.As(err, &re) || re.What != QuantityInflow {
			t.Errorf("inflow %g: want a RangeError on the inflow, got %v", in.Inflow, err)
		}
	}
}
