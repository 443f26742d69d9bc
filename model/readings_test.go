package model

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"drawdown/calc"
	"drawdown/presets"
)

// Readings generated from a known drain recover its extra loss coefficient
// and its finish. Source: the analytic drain (readings_helpers_test.go);
// exact data, so the fit must return the generating ΔK to solver
// tolerance.
func TestFitRecoversExtraK(t *testing.T) {
	cases := []struct {
		name   string
		trueK  float64
		relTol float64 // on ΔK
		absTol float64
	}{
		{"on plan", 0, 0, 0.02},
		{"screen partly blocked", 5, 0.01, 0},
		{"long kinked route", 40, 0.01, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			rs := gen{d: rdPond, extraK: constK(tc.trueK), h0: 2.0, every: 15 * time.Minute, n: 9}.readings()
			f, err := FitReadings(rs, nil, rdPond.sim, FitOptions{})
			if err != nil {
				t.Fatal(err)
			}
			tol := math.Max(tc.absTol, tc.relTol*math.Abs(tc.trueK))
			if math.Abs(f.ExtraK-tc.trueK) > tol {
				t.Errorf("ΔK = %.4f, want %.4f ± %.4f (analytic drain)", f.ExtraK, tc.trueK, tol)
			}
			last := rs[len(rs)-1]
			want := last.At.Add(DurationOf(rdPond.stopTime(FitParams{ExtraK: tc.trueK}, last.Level)))
			if d := f.Finish.Sub(want); math.Abs(d.Seconds()) > 0.01*want.Sub(last.At).Seconds()+1 {
				t.Errorf("Finish = %v, want %v (analytic stop time)", f.Finish, want)
			}
			if math.Abs(f.StopLevel-rdPond.hs) > 1e-9 || f.Stop != "intake" {
				t.Errorf("stop = %g %q", f.StopLevel, f.Stop)
			}
			if f.Slowing || f.Faster || f.InflowFitted {
				t.Errorf("steady drain flagged: slowing %v, faster %v, inflow fitted %v", f.Slowing, f.Faster, f.InflowFitted)
			}
			if f.RMS > 1e-4 {
				t.Errorf("RMS = %g m on exact data", f.RMS)
			}
		})
	}
}

// Readings that fall faster than the plan allows with no extra loss (the
// drop or the level typed too small) never give a negative loss: ΔK is 0
// and Faster says so. Source: the analytic drain, the data made with a
// smaller resistance (R = 9) than the plan's (R0 = 12).
func TestFitFasterThanPlanned(t *testing.T) {
	quick := rdPond
	quick.R0 = 9
	rs := gen{d: quick, extraK: constK(0), h0: 2.0, every: 15 * time.Minute, n: 6, res: 0.001}.readings()
	f, err := FitReadings(rs, nil, rdPond.sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if f.ExtraK != 0 || !f.Faster || f.FallRatio <= 1 {
		t.Errorf("faster drain: ΔK %g, faster %v, fall ratio %.3f; want 0, true, > 1", f.ExtraK, f.Faster, f.FallRatio)
	}
	// A bucket test faster than the plan's flow says the same.
	ft := flowTests(quick, 0, 0, 2.0, []float64{600}, 0, 1)
	g, err := FitReadings(nil, ft, rdPond.sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if g.ExtraK != 0 || !g.Faster || g.FlowRatio < 1.1 {
		t.Errorf("fast flow test: ΔK %g, faster %v, flow ratio %.3f", g.ExtraK, g.Faster, g.FlowRatio)
	}
	// On plan: not faster.
	h, _ := FitReadings(gen{d: rdPond, extraK: constK(0), h0: 2.0, every: 15 * time.Minute, n: 6, res: 0.001}.readings(), nil, rdPond.sim, FitOptions{})
	if h.Faster {
		t.Errorf("on-plan readings called faster (fall ratio %.4f)", h.FallRatio)
	}
}

// Readings with noise: 13 readings over 2 h with ±5 mm uniform noise (σ =
// 2.9 mm) on a 1.6 m fall. The rate of fall from such readings carries
// about 1.5 % (1σ) error, i.e. about 3 % in the total resistance R (flow ∝
// R^−½): analytic estimate from ordinary least squares, derived here. The
// tolerances sit at that statistical limit: mean |ΔR|/R ≤ 3 %, worst of 50
// seeds ≤ 8 %. The noise must not read as slowing.
func TestFitNoiseRobust(t *testing.T) {
	const trueK, seeds = 8.0, 50
	var worstR, sumR float64
	for seed := uint64(1); seed <= seeds; seed++ {
		rs := gen{d: rdPond, extraK: constK(trueK), h0: 2.0, every: 10 * time.Minute, n: 13, noise: 0.005, seed: seed}.readings()
		f, err := FitReadings(rs, nil, rdPond.sim, FitOptions{})
		if err != nil {
			t.Fatal(err)
		}
		eR := math.Abs(f.ExtraK-trueK) / (rdPond.R0 + trueK)
		sumR += eR
		worstR = math.Max(worstR, eR)
		if f.Slowing {
			t.Errorf("seed %d: noise flagged as slowing (ratio %.2f ± %.2f)", seed, f.RateRatio, f.RateRatioSigma)
		}
	}
	t.Logf("ΔK=%.0f on R0=%.0f, ±5 mm noise, 13 readings over 2 h: total resistance error mean %.1f %%, worst %.1f %%",
		trueK, rdPond.R0, 100*sumR/seeds, 100*worstR)
	if sumR/seeds > 0.03 || worstR > 0.08 {
		t.Errorf("resistance error mean %.1f %% (max 3 %%), worst %.1f %% (max 8 %%)", 100*sumR/seeds, 100*worstR)
	}
}

// Readings and flow tests together tell extra loss from inflow, with noise:
// levels with ±1 mm noise typed to the millimetre, three 10 L bucket tests
// each off by 3 % (1σ). Expected spread, derived here: three tests pin the
// flow to about 1.7 %, so R to 3.5 % (ΔK ± 0.6 on R = 17); the readings pin
// the net fall to 0.1 %, so Qᵢₙ = Q − A·dh/dt to about 7·10⁻⁵ m³/s (6 %).
// The tolerances are 3σ (30 seeds). Source: the analytic drain with inflow.
func TestFitLossAndInflow(t *testing.T) {
	const trueK, trueQ = 5.0, 1.2e-3 // m³/s: 72 L/min of rain and seepage into the pond
	exact := gen{d: rdPond, extraK: constK(trueK), q: trueQ, h0: 2.0, every: 15 * time.Minute, n: 9}.readings()
	ft := flowTests(rdPond, trueK, trueQ, 2.0, []float64{0, 1800, 3600}, 0, 1)
	f, err := FitReadings(exact, ft, rdPond.sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !f.InflowFitted || math.Abs(f.ExtraK-trueK) > 0.05 || math.Abs(f.Inflow-trueQ) > 0.01*trueQ {
		t.Errorf("exact data: ΔK %.4f (want %g), inflow %.4g (want %g), fitted %v", f.ExtraK, trueK, f.Inflow, trueQ, f.InflowFitted)
	}
	last := exact[len(exact)-1]
	want := last.At.Add(DurationOf(rdPond.stopTime(FitParams{trueK, trueQ}, last.Level)))
	if d := math.Abs(f.Finish.Sub(want).Seconds()); d > 0.01*want.Sub(last.At).Seconds()+1 {
		t.Errorf("finish %v, want %v (analytic, with inflow)", f.Finish, want)
	}

	// Readings alone with the inflow unknown read the slow fall as loss
	// (the issue's complaint): ΔK well above the truth.
	g, _ := FitReadings(exact, nil, rdPond.sim, FitOptions{})
	if g.InflowFitted || g.ExtraK < 2*trueK {
		t.Errorf("readings alone: ΔK %.2f, inflow fitted %v; want the inflow read as loss", g.ExtraK, g.InflowFitted)
	}
	// With the inflow known (typed), readings alone recover ΔK.
	h, _ := FitReadings(exact, nil, rdPond.sim, FitOptions{Inflow: trueQ})
	if math.Abs(h.ExtraK-trueK) > 0.05 {
		t.Errorf("inflow typed: ΔK %.4f, want %g", h.ExtraK, trueK)
	}

	const seeds = 30
	var sumK, sumQ, worstK, worstQ float64
	for seed := uint64(1); seed <= seeds; seed++ {
		rs := gen{d: rdPond, extraK: constK(trueK), q: trueQ, h0: 2.0, every: 15 * time.Minute, n: 9, noise: 0.001, res: 0.001, seed: seed}.readings()
		ft := flowTests(rdPond, trueK, trueQ, 2.0, []float64{0, 1800, 3600}, 0.03, seed)
		f, err := FitReadings(rs, ft, rdPond.sim, FitOptions{})
		if err != nil {
			t.Fatal(err)
		}
		eK, eQ := math.Abs(f.ExtraK-trueK), math.Abs(f.Inflow-trueQ)/trueQ
		sumK, sumQ = sumK+eK, sumQ+eQ
		worstK, worstQ = math.Max(worstK, eK), math.Max(worstQ, eQ)
	}
	t.Logf("ΔK %g, inflow %g m³/s, ±1 mm readings, 3 %% bucket tests, %d seeds: |ΔK error| mean %.2f, worst %.2f; inflow error mean %.1f %%, worst %.1f %%",
		trueK, trueQ, seeds, sumK/seeds, worstK, 100*sumQ/seeds, 100*worstQ)
	if worstK > 1.8 || worstQ > 0.20 {
		t.Errorf("worst ΔK error %.2f (max 1.8), worst inflow error %.1f %% (max 20 %%)", worstK, 100*worstQ)
	}
}

// Flow tests alone pin ΔK (the inflow held at the plan's); without a
// reading there is no finish to re-predict. Source: the analytic flow
// Q = k·√(h − z).
func TestFitFlowTestsOnly(t *testing.T) {
	ft := flowTests(rdPond, 5, 0, 2.0, []float64{0, 600}, 0, 1)
	f, err := FitReadings(nil, ft, rdPond.sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(f.ExtraK-5) > 0.01 || f.InflowFitted || !f.Finish.IsZero() || f.NTests != 2 {
		t.Errorf("flow tests only: %+v", f)
	}
	// A test without a level takes the readings' level at its time.
	ft[1].Level = 0
	rs := gen{d: rdPond, extraK: constK(5), h0: 2.0, every: 5 * time.Minute, n: 4}.readings()
	g, err := FitReadings(rs, ft, rdPond.sim, FitOptions{})
	if err != nil || math.Abs(g.ExtraK-5) > 0.05 {
		t.Errorf("test level from readings: ΔK %.3f, %v", g.ExtraK, err)
	}
	if _, err := FitReadings(nil, ft[1:], rdPond.sim, FitOptions{}); err == nil || !strings.Contains(err.Error(), "level at the test is not known") {
		t.Errorf("test without level or readings: %v", err)
	}
}

// The slowing flag: a screen that blinds part-way (the loss climbing in
// the second hour) is flagged and its loss now fitted; a drain slower than
// planned all along, and a clean drain read with noise, are not: the plan's
// own slowdown (the falling head) is not a fault. Source: common practice
// (flow sags as air gathers at the crest or the screen clogs,
// field-practice §2.6, §4.2); the drains are the analytic one.
func TestFitSlowing(t *testing.T) {
	clog := func(t float64) float64 {
		if t < 3600 {
			return 2
		}
		return 2 + 60*(t-3600)/3600 // screen blinding over the second hour
	}
	cases := []struct {
		name    string
		g       gen
		slowing bool
	}{
		{"strainer clogging in the second hour", gen{d: rdPond, extraK: clog, h0: 2.0, every: 10 * time.Minute, n: 13, res: 0.001}, true},
		{"clogging, read to the centimetre", gen{d: rdPond, extraK: clog, h0: 2.0, every: 10 * time.Minute, n: 13, res: 0.01}, true},
		{"slower than planned all along", gen{d: rdPond, extraK: constK(30), h0: 2.0, every: 10 * time.Minute, n: 13, res: 0.001}, false},
		{"clean drain to its stop", gen{d: rdPond, extraK: constK(0), h0: 2.0, every: 10 * time.Minute, n: 13, res: 0.001}, false},
		{"clean drain, short", gen{d: rdPond, extraK: constK(0), h0: 2.0, every: 2 * time.Minute, n: 4, res: 0.001}, false},
		{"clean drain with inflow", gen{d: rdPond, extraK: constK(3), q: 2e-3, h0: 2.0, every: 10 * time.Minute, n: 13, res: 0.001}, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			rs := tc.g.readings()
			f, err := FitReadings(rs, nil, rdPond.sim, FitOptions{Inflow: tc.g.q})
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("rate ratio %.3f ± %.3f (plan's own %.3f), judged %v, ΔK %.2f, late ΔK %.2f", f.RateRatio, f.RateRatioSigma, f.PlanRatio, f.SlowingJudged, f.ExtraK, f.LateK)
			if f.Slowing != tc.slowing || !f.SlowingJudged {
				t.Errorf("slowing %v (judged %v), want %v", f.Slowing, f.SlowingJudged, tc.slowing)
			}
			if tc.slowing && !(f.LateFitted && f.LateK > f.ExtraK) {
				t.Errorf("loss now %.2f not above the whole fit's %.2f", f.LateK, f.ExtraK)
			}
		})
	}
	// False alarms on clean drains read with ±2 mm noise, typed to the mm.
	fires := 0
	const seeds = 100
	for seed := uint64(1); seed <= seeds; seed++ {
		rs := gen{d: rdPond, extraK: constK(4), h0: 2.0, every: 10 * time.Minute, n: 10, noise: 0.002, res: 0.001, seed: seed}.readings()
		if f, _ := FitReadings(rs, nil, rdPond.sim, FitOptions{}); f.Slowing {
			fires++
		}
	}
	t.Logf("clean drain, ±2 mm noise typed to the mm: slowing raised on %d of %d", fires, seeds)
	if fires > 3 {
		t.Errorf("slowing raised on %d of %d clean drains", fires, seeds)
	}
}

// The issue's measured case, on the demo's own plan (bund B2, 40 m²):
// readings 0.333, 0.328, 0.325 m, falling 5 mm in the first 86 s (3.5
// mm/min) and 3 mm in the next 2 min (1.5 mm/min), where the plan falls
// about 2.0 mm/min at both. The right answer: no negative loss, not
// "faster than planned", the slowing raised (the rate more than halved
// while the plan's barely changes; the typed millimetres resolve it), the
// loss now positive and the finish pushed later than the plan's.
func TestFitIssueCase(t *testing.T) {
	j := DemoJob()
	p := Compute(j, presets.Builtin())
	if p.Drain == nil {
		t.Fatal("demo has no drain plan")
	}
	t0 := time.Date(2026, 5, 14, 10, 0, 0, 0, time.UTC)
	for _, r := range []struct {
		text string
		s    float64
	}{{"0.333", 0}, {"0.328", 86}, {"0.325", 206}} {
		rd, err := NewReading(r.text, SI, t0.Add(DurationOf(r.s)), "")
		if err != nil {
			t.Fatal(err)
		}
		j.Readings = append(j.Readings, rd)
	}
	f, err := FitJob(&j, &p)
	if err != nil || f == nil {
		t.Fatal(err)
	}
	t.Logf("ΔK %.3f, faster %v, slowing %v (ratio %.2f ± %.2f, plan's %.3f), loss now %.2f, finish %v",
		f.ExtraK, f.Faster, f.Slowing, f.RateRatio, f.RateRatioSigma, f.PlanRatio, f.LateK, f.Finish)
	if f.ExtraK < 0 || f.Faster || !f.Slowing || !f.LateFitted || f.LateK <= 0 {
		t.Errorf("issue case: ΔK %.3f, faster %v, slowing %v, loss now %.3f", f.ExtraK, f.Faster, f.Slowing, f.LateK)
	}
	plan := PlanCurve(*p.Drain)
	tPlan, _ := plan.TimeAt(0.325)
	planFinish := t0.Add(DurationOf(plan.End() - tPlan + 206 - 206))
	if !f.Finish.After(t0.Add(206 * time.Second).Add(DurationOf(plan.End() - tPlan))) {
		t.Errorf("finish %v not later than the plan's from 0.325 m (%v)", f.Finish, planFinish)
	}
}

func TestFitFewReadings(t *testing.T) {
	one := []Reading{{At: rdT0, Level: 1.5}}
	for _, rs := range [][]Reading{nil, one, {{At: rdT0, Level: 1.5}, {At: rdT0, Level: 1.4}}} {
		if _, err := FitReadings(rs, nil, rdPond.sim, FitOptions{}); !errors.Is(err, ErrFewReadings) {
			t.Errorf("%d readings: err = %v, want ErrFewReadings", len(rs), err)
		}
	}
	if !strings.Contains(ErrFewReadings.Error(), "at least two") {
		t.Error("message does not say how many readings are needed")
	}
	bad := []Reading{{At: rdT0, Level: math.NaN()}, {At: rdT0.Add(time.Hour), Level: 1}}
	if _, err := FitReadings(bad, nil, rdPond.sim, FitOptions{}); err == nil || !strings.Contains(err.Error(), "reading 1") {
		t.Errorf("NaN level: err = %v", err)
	}
	if _, err := FitReadings([]Reading{{Level: 1}, {At: rdT0, Level: 1}}, nil, rdPond.sim, FitOptions{}); err == nil {
		t.Error("reading without a time accepted")
	}
	if _, err := FitReadings(one, []FlowTest{{At: rdT0, Volume: 0.01, Seconds: 0}}, rdPond.sim, FitOptions{}); err == nil || !strings.Contains(err.Error(), "flow test 1") {
		t.Errorf("bad flow test: %v", err)
	}
	if _, err := FitReadings(one, nil, nil, FitOptions{}); err == nil {
		t.Error("nil simulator accepted")
	}
}

// Unsorted input gives the same answer and is not modified.
func TestFitUnsorted(t *testing.T) {
	rs := gen{d: rdPond, extraK: constK(5), h0: 2.0, every: 15 * time.Minute, n: 6}.readings()
	shuffled := []Reading{rs[3], rs[0], rs[5], rs[1], rs[4], rs[2]}
	keep := append([]Reading(nil), shuffled...)
	a, _ := FitReadings(rs, nil, rdPond.sim, FitOptions{})
	b, _ := FitReadings(shuffled, nil, rdPond.sim, FitOptions{})
	if math.Abs(a.ExtraK-b.ExtraK) > 1e-9 {
		t.Errorf("order changed the fit: %g vs %g", a.ExtraK, b.ExtraK)
	}
	for i := range keep {
		if keep[i] != shuffled[i] {
			t.Fatal("input modified")
		}
	}
}

// A level that does not fall at all hits the upper bound and says so.
func TestFitNotDraining(t *testing.T) {
	rs := []Reading{{At: rdT0, Level: 1.8}, {At: rdT0.Add(30 * time.Minute), Level: 1.8}, {At: rdT0.Add(time.Hour), Level: 1.8}}
	f, err := FitReadings(rs, nil, rdPond.sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !f.AtKMax || f.ExtraK < 199 || f.Faster {
		t.Errorf("not-draining fit: %+v", f)
	}
	for _, v := range []float64{f.ExtraK, f.RMS, f.PlanRMS, f.FallRatio, f.StopLevel, f.RateRatio, f.RateRatioSigma, f.Inflow} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Errorf("non-finite value in %+v", f)
		}
	}
}

func TestDrainCurveInterp(t *testing.T) {
	c := DrainCurve{Times: []float64{0, 10, 20}, Levels: []float64{2, 1, 0.5}, Flows: []float64{3, 2, 1}}
	for _, tc := range []struct{ t, want float64 }{{-5, 2}, {0, 2}, {5, 1.5}, {10, 1}, {15, 0.75}, {99, 0.5}} {
		if got := c.LevelAt(tc.t); got != tc.want {
			t.Errorf("LevelAt(%g) = %g, want %g", tc.t, got, tc.want)
		}
	}
	for _, tc := range []struct{ h, want float64 }{{3, 3}, {2, 3}, {1.5, 2.5}, {0.75, 1.5}, {0.1, 1}} {
		if got, ok := c.FlowAtLevel(tc.h); !ok || got != tc.want {
			t.Errorf("FlowAtLevel(%g) = %g, want %g", tc.h, got, tc.want)
		}
	}
	if tt, ok := c.TimeAt(1.5); !ok || tt != 5 {
		t.Errorf("TimeAt(1.5) = %g %v", tt, ok)
	}
	if _, ok := c.TimeAt(0.1); ok {
		t.Error("TimeAt below the stop found")
	}
	first := Reading{At: rdT0, Level: 1.5}
	if lv, ok := PlannedAt(c, time.Time{}, first, rdT0.Add(5*time.Second)); !ok || lv != 1 {
		t.Errorf("PlannedAt aligned = %g %v", lv, ok)
	}
	if lv, ok := PlannedAt(c, rdT0, first, rdT0.Add(15*time.Second)); !ok || lv != 0.75 {
		t.Errorf("PlannedAt from start = %g %v", lv, ok)
	}
	rs := []Reading{{At: rdT0, Level: 2}, {At: rdT0.Add(100 * time.Second), Level: 1}}
	for _, tc := range []struct{ s, want float64 }{{50, 1.5}, {-100, 3}, {150, 0.5}, {1000, 0}} {
		if h, ok := levelAtTime(rs, rdT0.Add(DurationOf(tc.s))); !ok || math.Abs(h-tc.want) > 1e-12 {
			if tc.s < 0 {
				h, ok = levelAtTime(rs, rdT0.Add(-100*time.Second))
				if ok && math.Abs(h-tc.want) < 1e-12 {
					continue
				}
			}
			t.Errorf("levelAtTime(%g s) = %g, want %g", tc.s, h, tc.want)
		}
	}
}

func BenchmarkFitReadings(b *testing.B) {
	rs := gen{d: rdPond, extraK: constK(5), h0: 2.0, every: 10 * time.Minute, n: 13, noise: 0.005, seed: 1}.readings()
	b.ReportAllocs()
	var sink Fit
	for b.Loop() {
		sink, _ = FitReadings(rs, nil, rdPond.sim, FitOptions{})
	}
	_ = sink
}

// sumpDrain is an invented case on the real planner: a 3 m vertical tank of
// water at 15 °C (density, viscosity and vapour pressure from IAPWS-IF97 and
// IAPWS 2008 as tabulated in calc/testdata/reference/water-and-atmosphere.md,
// rounded), drained by a 25 mm, 12 m hose over a 0.6 m lift to an outlet
// 1.2 m below the floor.
func sumpDrain(t testing.TB) calc.DrainInput {
	t.Helper()
	tank, err := calc.NewVerticalCylinder(1.6, 2.5)
	if err != nil {
		t.Fatal(err)
	}
	return calc.DrainInput{
		Siphon: calc.Siphon{
			Fluid:       calc.Fluid{Density: 999.1, Viscosity: 1.138e-3, VaporPressure: 1705},
			AtmPressure: 101325,
			Hose:        calc.Hose{Diameter: 0.025, Length: 12, Roughness: 1.5e-6, KEntrance: 0.78, KUpLeg: 0.3, KDownLeg: 0.6},
			Hoses:       1,
			Geometry:    calc.Geometry{Surface: 2.2, Intake: 0.1, Crest: 2.8, Outlet: -1.2},
		},
		Tank:        tank,
		CurvePoints: 400,
	}
}

// Readings and a flow test taken off the real planner's curve with a known
// extra loss recover it: the planner itself is the oracle (checked in calc
// against the closed forms of calc/testdata/reference/hydraulics.md §7), so this
// checks the fit and DrainSimulator's plumbing, including a first reading
// taken 20 minutes after the start.
func TestFitOnPlannedDrain(t *testing.T) {
	in := sumpDrain(t)
	sim := DrainSimulator(in)
	for _, trueK := range []float64{0, 3, 15} {
		truth, err := sim(FitParams{ExtraK: trueK}, float64(in.Siphon.Geometry.Surface))
		if err != nil {
			t.Fatal(err)
		}
		var rs []Reading
		for i := 0; i < 10; i++ {
			s := 1200 + float64(i)*600
			rs = append(rs, Reading{At: rdT0.Add(time.Duration(s) * time.Second), Level: truth.LevelAt(s)})
		}
		f, err := FitReadings(rs, nil, sim, FitOptions{})
		if err != nil {
			t.Fatal(err)
		}
		// interpolation of a 400-point curve limits the recovery
		tol := math.Max(0.05, 0.02*trueK)
		if math.Abs(f.ExtraK-trueK) > tol {
			t.Errorf("ΔK = %.3f, want %.3f ± %.3f (planner with known ΔK)", f.ExtraK, trueK, tol)
		}
		wantFinish := rdT0.Add(time.Duration(truth.End() * float64(time.Second)))
		if d := math.Abs(f.Finish.Sub(wantFinish).Seconds()); d > 0.01*truth.End() {
			t.Errorf("ΔK %.0f: finish off by %.0f s of %.0f s", trueK, d, truth.End())
		}
		if math.Abs(f.StopLevel-truth.Levels[len(truth.Levels)-1]) > 0.005 || f.Stop != truth.Stop {
			t.Errorf("stop %.3f %s, want %.3f %s", f.StopLevel, f.Stop, truth.Levels[len(truth.Levels)-1], truth.Stop)
		}
		t.Logf("ΔK %.0f: fitted %.4f, finish error %.1f s of %.0f s, stop %s", trueK, f.ExtraK, f.Finish.Sub(wantFinish).Seconds(), truth.End(), f.Stop)
		// A bucket test at 30 min joins the fit.
		q, _ := truth.FlowAtLevel(truth.LevelAt(1800))
		ft := []FlowTest{{At: rdT0.Add(30 * time.Minute), Volume: 0.01, Seconds: 0.01 / q, Level: truth.LevelAt(1800)}}
		g, err := FitReadings(rs[:4], ft, sim, FitOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(g.ExtraK-trueK) > tol || g.Stopped || math.Abs(g.Finish.Sub(wantFinish).Seconds()) > 0.01*truth.End() {
			t.Errorf("ΔK %.0f mid-drain with a flow test: ΔK %.3f, finish %v (stopped %v), want %v", trueK, g.ExtraK, g.Finish, g.Stopped, wantFinish)
		}
	}
	if _, err := sim(FitParams{ExtraK: -0.1}, 2); err == nil {
		t.Error("negative extra loss accepted")
	}
	if c, _ := sim(FitParams{}, 0.05); len(c.Times) != 1 || c.Stop != "intake" {
		t.Errorf("start below the intake: %+v", c)
	}
}

// ExampleFitReadings fits three readings taken off an analytic drain made
// with an extra loss of ΔK = 5 (see torricelli).
func ExampleFitReadings() {
	d := torricelli{A: 144, a: math.Pi * 0.05 * 0.05 / 4, z: -1.5, hs: 0.2, R0: 12}
	start := time.Date(2026, 5, 14, 8, 0, 0, 0, time.UTC)
	var rs []Reading
	for _, min := range []float64{0, 30, 60} {
		rs = append(rs, Reading{At: start.Add(time.Duration(min) * time.Minute), Level: d.level(FitParams{ExtraK: 5}, 2.0, min*60)})
	}
	f, err := FitReadings(rs, nil, d.sim, FitOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("extra K %.2f, stop at %.2f m (%s)\n", f.ExtraK, f.StopLevel, f.Stop)
	// Output: extra K 5.00, stop at 0.20 m (intake)
}

func BenchmarkFitReadingsPlanner(b *testing.B) {
	in := sumpDrain(b)
	sim := DrainSimulator(in)
	truth, err := sim(FitParams{ExtraK: 3}, float64(in.Siphon.Geometry.Surface))
	if err != nil {
		b.Fatal(err)
	}
	var rs []Reading
	for i := 0; i < 10; i++ {
		s := 600 + float64(i)*300
		rs = append(rs, Reading{At: rdT0.Add(time.Duration(s) * time.Second), Level: truth.LevelAt(s)})
	}
	b.ReportAllocs()
	var sink Fit
	for b.Loop() {
		sink, _ = FitReadings(rs, nil, sim, FitOptions{})
	}
	_ = sink
}
func TestNewReading(t *testing.T) {
	r, err := NewReading("42 cm", US, rdT0, " clear ")
	if err != nil || math.Abs(r.Level-0.42) > 1e-12 || r.Note != "clear" || !r.At.Equal(rdT0) {
		t.Errorf("NewReading(42 cm) = %+v, %v", r, err)
	}
	r, err = NewReading("1.5", US, rdT0, "")
	if err != nil || math.Abs(r.Level-1.5*0.3048) > 1e-12 { // 1 ft = 0.3048 m exactly (NIST SP 811)
		t.Errorf("bare number in US = %+v, %v", r, err)
	}
	for _, bad := range []string{"", "NaN", "0x10", "2000 m"} {
		if _, err := NewReading(bad, SI, rdT0, ""); err == nil {
			t.Errorf("NewReading(%q) accepted", bad)
		}
	}
	if _, err := NewReading("0.4", SI, time.Time{}, ""); err == nil {
		t.Error("reading without a time accepted")
	}
}

// On the real planner with an inflow (calc's A(h)·dh/dt = Qᵢₙ − Q(h), checked
// there against the closed form with inflow): readings and two bucket tests
// taken off its curve give back the extra loss and the inflow together.
func TestFitLossAndInflowOnPlanner(t *testing.T) {
	in := sumpDrain(t)
	sim := DrainSimulator(in)
	base, err := sim(FitParams{}, float64(in.Siphon.Geometry.Surface))
	if err != nil {
		t.Fatal(err)
	}
	trueK, trueQ := 3.0, 0.25*base.Flows[0]
	truth, err := sim(FitParams{ExtraK: trueK, Inflow: trueQ}, float64(in.Siphon.Geometry.Surface))
	if err != nil {
		t.Fatal(err)
	}
	var rs []Reading
	for i := 0; i < 8; i++ {
		s := 600 + float64(i)*600
		rs = append(rs, Reading{At: rdT0.Add(DurationOf(s)), Level: truth.LevelAt(s)})
	}
	var ft []FlowTest
	for _, s := range []float64{900, 3000} {
		h := truth.LevelAt(s)
		q, _ := truth.FlowAtLevel(h)
		ft = append(ft, FlowTest{At: rdT0.Add(DurationOf(s)), Volume: 0.01, Seconds: 0.01 / q, Level: h})
	}
	f, err := FitReadings(rs, ft, sim, FitOptions{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("planner: ΔK %.3f (true %g), inflow %.4g m³/s (true %.4g)", f.ExtraK, trueK, f.Inflow, trueQ)
	if !f.InflowFitted || math.Abs(f.ExtraK-trueK) > 0.1 || math.Abs(f.Inflow-trueQ) > 0.03*trueQ {
		t.Errorf("ΔK %.3f (want %g ± 0.1), inflow %.4g (want %.4g ± 3 %%)", f.ExtraK, trueK, f.Inflow, trueQ)
	}
}
