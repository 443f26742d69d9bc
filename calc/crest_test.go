package calc

import (
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// chokedCase is the choked example: one 25 mm hose 30 m long (smooth
// rubber, ε 0.01 mm), lift 5.5 m, drop 12 m, intake 0.3 m deep with a
// re-entrant end (K 0.78, Crane TP-410), at 1,500 m (U.S. Standard
// Atmosphere 1976), water at celsius °C (IAPWS).
func chokedCase(t *testing.T, celsius float64) Siphon {
	t.Helper()
	p, err := StandardAtmosphere(1500)
	if err != nil {
		t.Fatal(err)
	}
	w, err := Water(Celsius(celsius), p)
	if err != nil {
		t.Fatal(err)
	}
	return Siphon{Fluid: w, AtmPressure: p, Hoses: 1,
		Hose:     Hose{Diameter: 0.025, Length: 30, Roughness: 0.01e-3, KEntrance: 0.78},
		Geometry: Geometry{Surface: 0, Intake: -0.3, Crest: 5.5, Outlet: -12}}
}

// handChoked solves the up-leg's energy balance by hand-style fixed-point
// iteration, independently of Solve: with the crest at the running limit
// p_run = p_v + 0.1·p_atm,
//
//	p_atm − ρg·lift − (ρV²/2)(1 + K_ent + f·L_up/D) = p_run
//
// with f from Colebrook–White iterated as 1/√f = −2 log10(ε/3.7D + 2.51/(Re√f)).
func handChoked(s Siphon) (V, pRun float64) {
	rho, mu := float64(s.Fluid.Density), float64(s.Fluid.Viscosity)
	patm, pv := float64(s.AtmPressure), float64(s.Fluid.VaporPressure)
	D, eps := float64(s.Hose.Diameter), float64(s.Hose.Roughness)
	lift := float64(s.Geometry.Lift())
	lUp := float64(s.Geometry.Crest - s.Geometry.Intake)
	pRun = pv + 0.1*patm
	dh := (patm-pRun)/(rho*StandardGravity) - lift
	f := 0.02
	for i := 0; i < 200; i++ {
		V = math.Sqrt(2 * StandardGravity * dh / (1 + s.Hose.KEntrance + f*lUp/D))
		re := rho * V * D / mu
		x := 1 / math.Sqrt(f)
		for j := 0; j < 100; j++ {
			x = -2 * math.Log10(eps/(3.7*D)+2.51*x/re)
		}
		f = 1 / (x * x)
	}
	return V, pRun
}

// TestChokedAgainstEnergyBalance: the choked example runs choked
// at 20 °C and at 15 °C. Worked by hand (the iteration above, printed to four
// figures in the comment): at 20 °C, p_atm 84 560 Pa, ρ 998.20 kg/m³, p_v
// 2339 Pa, so p_run = 10 795 Pa, the crest's headroom is 7.535 − 5.5 =
// 2.035 m and V = 2.428 m/s (Re 60 480, f 0.02153), Q = 1.192 L/s, where the
// full-gravity flow (2.964 m/s) would take the crest to 1712 Pa, below even
// p_v. At 15 °C: V = 2.443 m/s, Q = 1.199 L/s; full gravity takes the crest to
// 1767 Pa, just above p_v (1706 Pa) and far below p_run. The outlet throttle
// K from the energy equation: 12.32 (20 °C) and 11.28 (15 °C).
func TestChokedAgainstEnergyBalance(t *testing.T) {
	for _, c := range []struct {
		celsius, qLs, k float64
	}{{20, 1.192, 12.32}, {15, 1.199, 11.28}} {
		s := chokedCase(t, c.celsius)
		r, err := Solve(s)
		if err != nil {
			t.Fatal(err)
		}
		if r.Verdict != RunsChoked || r.Verdict.String() != "runs choked" || !r.Warnings.Has(WarnChoked) {
			t.Fatalf("%g °C: verdict %v, warnings %v", c.celsius, r.Verdict, r.Warnings.Codes())
		}
		V, pRun := handChoked(s)
		testkit.Close(t, "choked velocity (m/s)", float64(r.Velocity), V, 1e-9, "energy balance of the up-leg, iterated by hand")
		testkit.Close(t, "running crest pressure (Pa)", float64(r.RunningCrestPressure), pRun, 1e-12, "p_v + 0.1·p_atm")
		testkit.Close(t, "crest pressure (Pa)", float64(r.CrestPressure), pRun, 1e-9, "the crest sits at the running limit")
		testkit.Close(t, "choked flow (L/s)", float64(r.Flow)*1000, c.qLs, 0.0005/c.qLs, "worked by hand, 4 figures")
		testkit.Close(t, "throttle K", r.OutletThrottleK, c.k, 0.005/c.k, "energy equation, worked by hand")
		if !r.HasOutletThrottle || !r.Warnings.Has(WarnThrottleOutlet) || !(r.GravityFlow > r.Flow) {
			t.Errorf("%g °C: throttle %v, gravity flow %v", c.celsius, r.HasOutletThrottle, r.GravityFlow)
		}
		// the flowing crest limit is at the flow, not the zero-flow value
		if !(r.FlowingCrestLimit < r.MaxCrestHeight) {
			t.Errorf("%g °C: flowing crest limit %v not below the zero-flow %v", c.celsius, r.FlowingCrestLimit, r.MaxCrestHeight)
		}
		if r.Fix.Code != FixThrottle {
			t.Errorf("%g °C: fix %v, want throttle", c.celsius, r.Fix.Code)
		}
	}
}

// TestThrottleKEnergyEquation: with the computed outlet throttle set, the
// hose carries the choked flow at full gravity and the crest sits at the
// running limit (energy equation: H = (V²/2g)(1 + ΣK + K_t + f·L/D)).
func TestThrottleKEnergyEquation(t *testing.T) {
	s := chokedCase(t, 20)
	r, _ := Solve(s)
	s.Hose.OutletK = r.OutletThrottleK * (1 + 1e-9) // on the running side
	rt, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	testkit.Close(t, "throttled flow (m³/s)", float64(rt.Flow), float64(r.Flow), 1e-8, "the throttle K reproduces the choked flow")
	testkit.Close(t, "throttled crest pressure (Pa)", float64(rt.CrestPressure), float64(r.RunningCrestPressure), 1e-6, "running limit")
	if rt.Verdict == RunsChoked || rt.HasOutletThrottle {
		t.Errorf("throttled hose still choked: %v", rt.Verdict)
	}
	V, D, L := float64(rt.Velocity), float64(s.Hose.Diameter), float64(s.Hose.Length)
	H := V * V / (2 * StandardGravity) * (1 + s.Hose.KMinor() + rt.FrictionFactor*L/D)
	testkit.Close(t, "energy balance (m)", H, 12, 1e-10, "Darcy–Weisbach with the throttle in ΣK")
}

// TestMaxFlowThrottle: a permit's cap is met by an outlet valve whose K the
// energy equation gives; the capped flow is the cap; the down-leg is checked
// at that flow; the crest pressure rises (the valve sits after the crest).
func TestMaxFlowThrottle(t *testing.T) {
	s := demoCase()
	free, _ := Solve(s)
	s.MaxFlow = free.Flow / 2
	r, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	testkit.Close(t, "capped flow (m³/s)", float64(r.Flow), float64(s.MaxFlow), 1e-12, "the cap")
	if !(r.MaxFlowThrottleK > 0) || r.OutletThrottleK != r.MaxFlowThrottleK || !r.HasOutletThrottle || !r.Warnings.Has(WarnThrottleOutlet) {
		t.Errorf("throttle %g / %g (%v)", r.MaxFlowThrottleK, r.OutletThrottleK, r.HasOutletThrottle)
	}
	if !(r.CrestPressure > free.CrestPressure) {
		t.Errorf("an outlet valve should raise the crest pressure: %v vs %v", r.CrestPressure, free.CrestPressure)
	}
	// the energy equation with the valve gives the cap
	s2 := s
	s2.MaxFlow = 0
	s2.Hose.OutletK = r.MaxFlowThrottleK
	rv, _ := Solve(s2)
	testkit.Close(t, "flow with the valve set (m³/s)", float64(rv.Flow), float64(s.MaxFlow), 1e-9, "energy equation")
	// a cap the siphon never reaches needs no valve
	s.MaxFlow = free.Flow * 2
	if r, _ := Solve(s); r.HasOutletThrottle || r.Flow != free.Flow {
		t.Errorf("unreached cap: %v %v", r.HasOutletThrottle, r.Flow)
	}
	// throttled far enough the down-leg no longer clears air (Wisner et al.)
	s.MaxFlow = free.Flow / 20
	if r, _ := Solve(s); !r.Warnings.Has(WarnAirCollects) {
		t.Errorf("V %v against V_c %v: no air warning", r.Velocity, r.AirClearingVelocity)
	}
	// a fitting before the crest lowers the crest pressure; after it, raises
	s = demoCase()
	s.Hose.KUpLeg = 5
	up, _ := Solve(s)
	s.Hose.KUpLeg, s.Hose.OutletK = 0, 5
	down, _ := Solve(s)
	if !(up.CrestPressure < free.CrestPressure && down.CrestPressure > free.CrestPressure) || up.Flow != down.Flow {
		t.Errorf("K 5 before the crest: %v, after: %v, none: %v", up.CrestPressure, down.CrestPressure, free.CrestPressure)
	}
}

// TestCrestLimitsVolatile: a volatile liquid's crest limits are margins on
// its bubble point (crest.go), a water-like liquid's on the barometric
// pressure.
func TestCrestLimitsVolatile(t *testing.T) {
	f := Fluid{Density: 740, Viscosity: 0.5e-3, VaporPressure: 50e3}
	pr, pw := crestPressures(f, 101325)
	if pr != 50e3+0.1*101325 || pw != 50e3+101325.0/3 {
		t.Errorf("water-like: %g %g", pr, pw)
	}
	f.Volatile = true
	pr, pw = crestPressures(f, 101325)
	testkit.Close(t, "bubble-point running limit", pr, 55e3, 1e-12, "p_v·1.10")
	testkit.Close(t, "bubble-point working limit", pw, 67.5e3, 1e-12, "p_v·1.35")
	s := demoCase()
	s.Fluid = f
	s.Geometry.Crest = 2.5
	r, _ := Solve(s)
	testkit.Close(t, "working crest pressure", float64(r.WorkingCrestPressure), 67.5e3, 1e-12, "Result carries p_work")
}

// TestFixFigures: each fix figure does what it says (Solve's own
// equations, checked at the boundary).
func TestFixFigures(t *testing.T) {
	s := demoCase()
	s.Geometry.Crest = 7.2
	s.Hose.Length = 20
	r, _ := Solve(s)
	if r.Verdict != RunsNearLimit || r.Fix.Code != FixLowerCrest || !r.Fix.HasCrestHeight {
		t.Fatalf("verdict %v fix %+v", r.Verdict, r.Fix)
	}
	low := s
	low.Geometry.Crest = r.Fix.CrestHeight - 0.001
	if rl, _ := Solve(low); rl.Verdict != Runs {
		t.Errorf("crest 1 mm under the fix figure: %v (margin %v)", rl.Verdict, rl.CrestMargin)
	}
	low.Geometry.Crest = r.Fix.CrestHeight + 0.001
	if rl, _ := Solve(low); rl.Verdict != RunsNearLimit {
		t.Errorf("crest 1 mm over the fix figure: %v", rl.Verdict)
	}
	// the throttle figure holds the crest at the working limit (a crest
	// under the zero-flow working height, (p_atm − p_work)/(ρg) = 6.72 m
	// here, or no throttle can)
	if r.Fix.HasThrottle || r.Fix.CrestHeightThrottled > 7.2 {
		t.Errorf("7.2 m crest: throttle figure %v, throttled height %v", r.Fix.HasThrottle, r.Fix.CrestHeightThrottled)
	}
	s.Geometry.Crest = 6.5
	r, _ = Solve(s)
	if r.Verdict != RunsNearLimit || !r.Fix.HasThrottle {
		t.Fatalf("6.5 m crest: %v, no throttle figure", r.Verdict)
	}
	th := s
	th.Hose.OutletK = r.Fix.ThrottleK
	rt, _ := Solve(th)
	testkit.Close(t, "throttled flow (m³/s)", float64(rt.Flow), float64(r.Fix.ThrottleFlow), 1e-8, "the fix's throttle flow")
	testkit.Close(t, "crest margin at the throttle (m)", float64(rt.CrestMargin)+1, 1, 1e-8, "the crest at its working limit")
	// cooling: hot water (p_v 60 kPa, about 86 °C) over a 2 m crest is
	// near its limit; a vapour pressure just under the figure runs
	cool := demoCase()
	cool.Geometry.Crest = 2
	cool.Fluid.VaporPressure = 60e3
	rc, _ := Solve(cool)
	if rc.Verdict != RunsNearLimit || !rc.Fix.HasMaxVaporPressure || rc.Fix.MaxVaporPressure >= 60e3 {
		t.Fatalf("hot water: %v, %+v", rc.Verdict, rc.Fix)
	}
	cool.Fluid.VaporPressure = rc.Fix.MaxVaporPressure * 0.999
	if rc, _ := Solve(cool); rc.Verdict != Runs {
		t.Errorf("p_v just under the fix figure: %v", rc.Verdict)
	}
	if r.Fix.HasMaxVaporPressure {
		t.Errorf("6.5 m crest: no cooling can hold it, got %v", r.Fix.MaxVaporPressure)
	}
	// no drop: a pump
	nd := demoCase()
	nd.Geometry.Outlet = 0.5
	if r, _ := Solve(nd); r.Verdict != WillNotRun || r.Fix.Code != FixPump || !r.Fix.NeedsPump {
		t.Errorf("no drop: %v %+v", r.Verdict, r.Fix)
	}
	// too high a crest: lower it
	hi := demoCase()
	hi.Geometry.Crest = 9.8
	hi.Geometry.Outlet = -12
	hi.Hose.Length = 30
	if r, _ := Solve(hi); r.Verdict != WillNotRun || r.Why != WarnCannotRun || r.Fix.Code != FixLowerCrest ||
		!(r.FlowingCrestLimit < r.MaxCrestHeight) {
		t.Errorf("crest 9.8 m: %v %v %+v, flowing limit %v", r.Verdict, r.Why, r.Fix, r.FlowingCrestLimit)
	}
}

// TestBoilingIsAVerdict: a liquid whose vapour pressure reaches the site's
// barometric pressure gives WillNotRun (WarnBoiling, fix: cool), not an
// input error (issue 11 §7).
func TestBoilingIsAVerdict(t *testing.T) {
	s := demoCase()
	s.Fluid.VaporPressure = 101325
	r, err := Solve(s)
	if err != nil {
		t.Fatal(err)
	}
	if r.Verdict != WillNotRun || r.Why != WarnBoiling || r.Fix.Code != FixCool || r.Flow != 0 {
		t.Errorf("boiling: %v %v %v", r.Verdict, r.Why, r.Fix.Code)
	}
	// the vapour pressure to cool to: the zero-flow crest pressure
	// p_atm − ρ g lift less the dissolved-gas allowance p_atm/3 (hand
	// derivation from the hydrostatic crest pressure, crest.go)
	lift := float64(s.Geometry.Crest - s.Geometry.Surface)
	want := 101325 - float64(s.Fluid.Density)*StandardGravity*lift - 101325.0/3
	if !r.Fix.HasMaxVaporPressure {
		t.Fatal("boiling: no vapour pressure to cool to")
	}
	testkit.Close(t, "vapour pressure to cool to (Pa)", float64(r.Fix.MaxVaporPressure), want, 1e-12, "hydrostatic crest pressure, worked by hand")
}
