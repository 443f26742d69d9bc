package model

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"time"
)

// FitOptions tunes FitReadings. Zero values take the defaults.
type FitOptions struct {
	// KMax bounds the search for ΔK (it starts at 0: the fit never reports
	// a negative loss). Default 200.
	KMax float64
	// Inflow is the plan's inflow, m³/s, held when the fit does not fit it
	// (without both readings and a flow test).
	Inflow float64
	// InflowMax bounds the fitted inflow, m³/s. Default three times the
	// plan's starting flow.
	InflowMax float64
	// SlowFraction: a recent rate of fall below (1 − SlowFraction) of the
	// earlier rate, beyond the plan's own slowdown and beyond the readings'
	// uncertainty, raises Slowing. Default 0.2.
	SlowFraction float64
	// ReadingSigma is the standard uncertainty of a reading whose
	// resolution is not known, m. Default 1 mm/√12 (a tape read to the
	// millimetre).
	ReadingSigma float64
	// FlowSigma is the relative standard uncertainty of one flow test.
	// Default 0.05 (a stopwatch to a few tenths of a second over ten
	// seconds or more, a container's marks to a few per cent; common
	// practice, from memory).
	FlowSigma float64
}

func (o FitOptions) withDefaults() FitOptions {
	if !(o.KMax > 0) || math.IsInf(o.KMax, 0) {
		o.KMax = 200
	}
	if !(o.Inflow >= 0) || math.IsInf(o.Inflow, 0) {
		o.Inflow = 0
	}
	if !(o.SlowFraction > 0 && o.SlowFraction < 1) {
		o.SlowFraction = 0.2
	}
	if !(o.ReadingSigma > 0) || math.IsInf(o.ReadingSigma, 0) {
		o.ReadingSigma = 0.001 / math.Sqrt(12)
	}
	if !(o.FlowSigma > 0 && o.FlowSigma < 1) {
		o.FlowSigma = 0.05
	}
	return o
}

// Fit is the result of comparing readings and flow tests with the plan.
type Fit struct {
	N      int // readings used
	NTests int // flow tests used

	// ExtraK is the fitted effective extra loss coefficient ΔK, never
	// negative: what the run loses beyond the plan.
	ExtraK float64
	// Inflow is the inflow the fit used, m³/s: fitted when InflowFitted
	// (readings and flow tests together), else the plan's.
	Inflow       float64
	InflowFitted bool
	// AtKMax: the fit stopped at KMax; the level falls far slower than any
	// loss coefficient explains (air, a blocked intake, a stopped siphon).
	AtKMax bool
	// Faster: the level falls (or the flow tests run) faster than the plan
	// allows even with no extra loss, by more than the readings'
	// uncertainty: the typed drop or level is likely wrong.
	Faster bool
	// RMS is the root-mean-square level residual of the fit, m; PlanRMS the
	// residual of the plan as typed (ΔK = 0, the plan's inflow).
	RMS, PlanRMS float64
	// FallRatio is the observed fall divided by the plan's fall over the
	// same time from the same first level (1 = on plan), up to the last
	// reading taken before the plan's stop; 0 when not judged.
	FallRatio float64
	// FlowRatio is the mean of the flow tests' measured over planned flow
	// at their levels (ΔK = 0); 0 without flow tests.
	FlowRatio float64

	// Finish is the re-predicted stop time and StopLevel the stop level (m),
	// from the last reading with the fitted parameters (the loss now, when
	// slowing); Stop the stop reason code. Stopped is true when the
	// simulation from the last reading gives no further fall. Finish is
	// zero without a reading.
	Finish    time.Time
	StopLevel float64
	Stop      string
	Stopped   bool

	Slow // the slowing judgement (readings_slow.go)
}

// ErrFewReadings is returned when neither two level readings at different
// times nor a flow test are given.
var ErrFewReadings = errors.New("need at least two level readings at different times, or a flow test, to compare with the plan")

// fitData is the readings and flow tests as the fit uses them: sorted, each
// with its standard uncertainty, and the simulation's start.
type fitData struct {
	rs     []Reading
	sig    []float64 // each reading's standard uncertainty, m
	tests  []FlowTest
	levels []float64 // each test's source level, m
	start  float64   // level the simulations start from, m
	opt    FitOptions
}

// FitReadings fits the plan to the readings and flow tests by weighted
// least squares (a χ² fit; Press et al., Numerical Recipes, 3rd ed., §15.1):
//
//	χ²(ΔK, Qᵢₙ) = Σᵢ ((hᵢ − ĥ(tᵢ) − c)/σᵢ)² + Σⱼ ((Qⱼ − Q̂(Hⱼ))/(s·Qⱼ))²
//
// where ĥ is the Simulator's level curve placed so that it passes the first
// reading's level h₁ at its time t₁ (the start time and the starting level
// typed into the plan need not be known exactly); c is a level offset
// fitted in closed form (the weighted mean residual), so an error in the
// first reading does not anchor the whole fit; σᵢ is the reading's standard
// uncertainty, the resolution typed over √12 (a rectangular distribution of
// half-width half a step: JCGM 100:2008, GUM §4.3.7) or ReadingSigma; Qⱼ is
// a flow test's measured flow at source level Hⱼ, Q̂ the simulated siphon
// flow at that level, s = FlowSigma.
//
// A flow test pins the siphon's flow at a level, which depends on ΔK only;
// the readings' fall rate A·dh/dt = Qᵢₙ − Q(h) depends on both. So with
// readings and a flow test, ΔK ∈ [0, KMax] and Qᵢₙ ∈ [0, InflowMax] are
// fitted together (extra loss told apart from inflow); otherwise only ΔK,
// with the plan's inflow held. The minimum is found on a coarse grid
// (fine near 0, coarse near KMax) and refined by golden-section searches
// (Kiefer 1953; Numerical Recipes §10.2), one parameter at a time.
//
// A flow test without a level (Level 0) takes the readings' level at its
// time (linear between readings, the nearest two outside them). The
// readings need not be sorted; they are not modified. Readings or tests that
// fail Validate are an error.
func FitReadings(readings []Reading, tests []FlowTest, sim Simulator, opt FitOptions) (Fit, error) {
	opt = opt.withDefaults()
	if sim == nil {
		return Fit{}, errors.New("fit readings: no drain plan to compare with")
	}
	d, err := newFitData(readings, tests, opt)
	if err != nil {
		return Fit{}, err
	}
	plan0 := FitParams{Inflow: opt.Inflow}
	c0, err := sim(plan0, d.start)
	if err != nil {
		return Fit{}, fmt.Errorf("fit readings: %w", err)
	}
	if len(d.tests) > 0 && len(c0.Flows) == 0 {
		return Fit{}, errors.New("fit readings: the plan gives no flow to compare the flow tests with")
	}
	if d.opt.InflowMax <= 0 || math.IsInf(d.opt.InflowMax, 0) || math.IsNaN(d.opt.InflowMax) {
		d.opt.InflowMax = 1e-4
		if len(c0.Flows) > 0 {
			d.opt.InflowMax = max(3*c0.Flows[0], 1e-4)
		}
	}
	fitQ := len(d.rs) >= 2 && len(d.tests) > 0
	f := Fit{N: len(d.rs), NTests: len(d.tests), InflowFitted: fitQ}
	p, chi := d.minimise(sim, fitQ, d.rs)
	if math.IsInf(chi, 1) {
		return Fit{}, errors.New("fit readings: no simulation of the plan succeeded")
	}
	f.ExtraK, f.Inflow = p.ExtraK, p.Inflow
	f.AtKMax = d.opt.KMax-p.ExtraK < 1e-3*(1+d.opt.KMax)
	if len(d.rs) > 0 {
		f.RMS = d.levelRMS(sim, p, d.rs)
		f.PlanRMS = d.levelRMS(sim, plan0, d.rs)
	}
	d.compare(&f, c0)
	if len(d.rs) >= 3 {
		f.Slow = d.slowing(sim, p)
	}
	now := p
	if f.Slowing && f.LateFitted {
		now.ExtraK = f.LateK
	}
	d.predict(&f, sim, now)
	if f.Slowing {
		f.Faster = false // the mean over a slowing drain says nothing of the drop typed
	}
	return f, nil
}

func newFitData(readings []Reading, tests []FlowTest, opt FitOptions) (*fitData, error) {
	d := &fitData{opt: opt}
	for i, r := range readings {
		if err := r.Validate(); err != nil {
			return nil, fmt.Errorf("reading %d: %w", i+1, err)
		}
		d.rs = append(d.rs, r)
	}
	slices.SortStableFunc(d.rs, func(a, b Reading) int { return a.At.Compare(b.At) })
	for i, t := range tests {
		if err := t.Validate(); err != nil {
			return nil, fmt.Errorf("flow test %d: %w", i+1, err)
		}
		d.tests = append(d.tests, t)
	}
	slices.SortStableFunc(d.tests, func(a, b FlowTest) int { return a.At.Compare(b.At) })
	spanned := len(d.rs) >= 2 && d.rs[len(d.rs)-1].At.After(d.rs[0].At)
	if !spanned && len(d.tests) == 0 {
		return nil, ErrFewReadings
	}
	if !spanned && len(d.rs) >= 2 {
		d.rs = d.rs[len(d.rs)-1:] // readings all at one time: the last only places the level
	}
	for _, r := range d.rs {
		s := r.Resolution / math.Sqrt(12)
		if !(s > 0) {
			s = opt.ReadingSigma
		}
		d.sig = append(d.sig, s)
	}
	for i, t := range d.tests {
		h := t.Level
		if !(h > 0) {
			var ok bool
			if h, ok = levelAtTime(d.rs, t.At); !ok {
				return nil, fmt.Errorf("flow test %d: the source level at the test is not known; type it with the test, or take a level reading", i+1)
			}
		}
		d.levels = append(d.levels, h)
	}
	switch {
	case len(d.rs) > 0:
		d.start = d.rs[0].Level
	default:
		d.start = 0
	}
	for _, h := range d.levels {
		d.start = max(d.start, h)
	}
	return d, nil
}

// levelAtTime is the readings' level at t: linear between the two readings
// around it, or along the nearest two outside them; a single reading gives
// its own level. ok is false without readings.
func levelAtTime(rs []Reading, t time.Time) (float64, bool) {
	switch len(rs) {
	case 0:
		return 0, false
	case 1:
		return rs[0].Level, true
	}
	i, _ := slices.BinarySearchFunc(rs, t, func(r Reading, t time.Time) int { return r.At.Compare(t) })
	i = min(max(i, 1), len(rs)-1)
	a, b := rs[i-1], rs[i]
	dt := b.At.Sub(a.At).Seconds()
	if dt <= 0 {
		return b.Level, true
	}
	h := a.Level + (b.Level-a.Level)*t.Sub(a.At).Seconds()/dt
	return max(h, 0), true
}

// aligned is the simulated curve from d.start and the time on it of the
// first of rs (where it passes that reading's level).
func (d *fitData) aligned(sim Simulator, p FitParams, rs []Reading) (DrainCurve, float64, error) {
	start := d.start
	if len(rs) > 0 && rs[0].Level > start {
		start = rs[0].Level
	}
	c, err := sim(p, start)
	if err != nil {
		return c, 0, err
	}
	if len(c.Times) == 0 || len(c.Times) != len(c.Levels) {
		return c, 0, errors.New("simulation returned an empty curve")
	}
	tau := 0.0
	if len(rs) > 0 {
		if t, ok := c.TimeAt(rs[0].Level); ok {
			tau = t
		}
	}
	return c, tau, nil
}

// chi2 is χ²(p) over the readings rs and d's flow tests.
func (d *fitData) chi2(sim Simulator, p FitParams, rs []Reading) float64 {
	return d.chi2With(sim, p, rs, d.tests)
}

// chi2With is χ²(p) over the readings rs and the flow tests tests.
func (d *fitData) chi2With(sim Simulator, p FitParams, rs []Reading, tests []FlowTest) float64 {
	c, tau, err := d.aligned(sim, p, rs)
	if err != nil {
		return math.Inf(1)
	}
	s := levelChi2(c, tau, rs, d.sigOf(rs))
	for j, t := range tests {
		q, ok := c.FlowAtLevel(d.levels[j])
		if !ok {
			return math.Inf(1)
		}
		m := t.Flow()
		r := (m - q) / (d.opt.FlowSigma * m)
		s += r * r
	}
	if math.IsNaN(s) {
		return math.Inf(1)
	}
	return s
}

// sigOf is the uncertainties of rs, a run of d.rs.
func (d *fitData) sigOf(rs []Reading) []float64 {
	if len(rs) == 0 {
		return nil
	}
	for i := range d.rs {
		if d.rs[i].At.Equal(rs[0].At) && len(d.rs)-i >= len(rs) {
			return d.sig[i : i+len(rs)]
		}
	}
	return d.sig[:len(rs)]
}

// levelChi2 is Σ((hᵢ − ĥ(τ + tᵢ − t₁) − c)/σᵢ)² less its best offset c
// (the weighted mean residual).
func levelChi2(c DrainCurve, tau float64, rs []Reading, sig []float64) float64 {
	if len(rs) < 2 {
		return 0
	}
	var sw, swr, swr2 float64
	for i, r := range rs {
		res := r.Level - c.LevelAt(tau+r.At.Sub(rs[0].At).Seconds())
		w := 1 / (sig[i] * sig[i])
		sw += w
		swr += w * res
		swr2 += w * res * res
	}
	return max(swr2-swr*swr/sw, 0)
}

// levelRMS is the RMS level residual (after the offset) of p over rs, m.
func (d *fitData) levelRMS(sim Simulator, p FitParams, rs []Reading) float64 {
	c, tau, err := d.aligned(sim, p, rs)
	if err != nil || len(rs) == 0 {
		return 0
	}
	var sum, sum2 float64
	for _, r := range rs {
		res := r.Level - c.LevelAt(tau+r.At.Sub(rs[0].At).Seconds())
		sum += res
		sum2 += res * res
	}
	n := float64(len(rs))
	return math.Sqrt(max(sum2-sum*sum/n, 0) / n)
}

// minimise finds the parameters of least χ² over rs (and d's tests): ΔK
// alone, or ΔK and Qᵢₙ when fitQ.
func (d *fitData) minimise(sim Simulator, fitQ bool, rs []Reading) (FitParams, float64) {
	const nK, nQ = 32, 8
	kMax, qMax := d.opt.KMax, d.opt.InflowMax
	ks := make([]float64, nK+1)
	span := math.Log1p(kMax)
	for i := range ks {
		ks[i] = math.Expm1(span * float64(i) / nK)
	}
	ks[nK] = kMax
	qs := []float64{d.opt.Inflow}
	if fitQ {
		qs = make([]float64, nQ+1)
		for i := range qs {
			qs[i] = qMax * float64(i) / nQ
		}
	}
	best, bestChi := FitParams{Inflow: qs[0]}, math.Inf(1)
	bi := 0
	for i, k := range ks {
		for _, q := range qs {
			p := FitParams{ExtraK: k, Inflow: q}
			if v := d.chi2(sim, p, rs); v < bestChi {
				best, bestChi, bi = p, v, i
			}
		}
	}
	if math.IsInf(bestChi, 1) {
		return best, bestChi
	}
	kLo, kHi := ks[max(bi-1, 0)], ks[min(bi+1, nK)]
	if !fitQ {
		q := best.Inflow
		k, v := goldenMin(func(k float64) float64 { return d.chi2(sim, FitParams{k, q}, rs) }, kLo, kHi, 1e-7*(1+kHi))
		if v <= bestChi {
			best, bestChi = FitParams{k, q}, v
		}
	} else {
		// The valley of χ² runs diagonally (more loss and less inflow fall
		// alike): a simplex search follows it, from the grid's best with
		// steps of the grid's spacing.
		qStep := qs[1] - qs[0]
		kStep := math.Max(kHi-kLo, 1e-3) / 2
		p, v := nelderMead(func(x [2]float64) float64 {
			if x[0] < 0 || x[0] > kMax || x[1] < 0 || x[1] > qMax {
				return math.Inf(1)
			}
			return d.chi2(sim, FitParams{x[0], x[1]}, rs)
		}, [2]float64{best.ExtraK, best.Inflow}, [2]float64{kStep, qStep / 2}, [2]float64{1e-6 * (1 + kMax), 1e-9 * qMax})
		if v <= bestChi {
			best, bestChi = FitParams{p[0], p[1]}, v
		}
	}
	// The ends themselves (golden-section search never lands on them).
	for _, p := range []FitParams{{0, best.Inflow}, {best.ExtraK, 0}} {
		if !fitQ && p.Inflow != best.Inflow {
			continue
		}
		if v := d.chi2(sim, p, rs); v <= bestChi {
			best, bestChi = p, v
		}
	}
	return best, bestChi
}

// compare fills the plan comparisons: the fall ratio, the flow ratio and
// whether the readings or tests are faster than the plan allows.
func (d *fitData) compare(f *Fit, plan DrainCurve) {
	rs := d.rs
	tau := 0.0
	if len(rs) > 0 {
		if t, ok := plan.TimeAt(rs[0].Level); ok {
			tau = t
		}
	}
	faster := false
	if len(rs) >= 2 {
		last := 0
		for i := range rs {
			if tau+rs[i].At.Sub(rs[0].At).Seconds() <= plan.End() {
				last = i
			}
		}
		if last > 0 {
			planFall := rs[0].Level - plan.LevelAt(tau+rs[last].At.Sub(rs[0].At).Seconds())
			obsFall := rs[0].Level - rs[last].Level
			if planFall > 0 {
				f.FallRatio = obsFall / planFall
				sig := math.Hypot(d.sig[0], d.sig[last]) / planFall
				faster = f.FallRatio-2*sig > 1
			}
		}
	}
	if len(d.tests) > 0 && len(plan.Flows) > 0 {
		var sum float64
		for j, t := range d.tests {
			q, _ := plan.FlowAtLevel(d.levels[j])
			if q > 0 {
				sum += t.Flow() / q
			}
		}
		f.FlowRatio = sum / float64(len(d.tests))
		sig := d.opt.FlowSigma / math.Sqrt(float64(len(d.tests)))
		faster = faster || f.FlowRatio-2*sig > 1
	}
	f.Faster = faster && f.ExtraK < 1e-3
}

// predict re-predicts the finish from the last reading with p.
func (d *fitData) predict(f *Fit, sim Simulator, p FitParams) {
	if len(d.rs) == 0 {
		return
	}
	rs := d.rs
	last := rs[len(rs)-1]
	if c, err := sim(p, last.Level); err == nil && len(c.Times) > 0 {
		f.Finish = last.At.Add(DurationOf(c.End()))
		f.StopLevel = c.Levels[len(c.Levels)-1]
		f.Stop = c.Stop
		f.Stopped = c.End() <= 0 || last.Level-f.StopLevel <= stoppedFall
	} else {
		f.Finish, f.StopLevel, f.Stopped = last.At, last.Level, true
	}
	if f.Stopped && len(rs) >= 2 {
		// When the last reading is already at the stop, the stop came when
		// the fitted curve from the first reading reached it (not after the
		// last reading).
		if c, err := sim(p, rs[0].Level); err == nil && len(c.Times) > 0 {
			if end := rs[0].At.Add(DurationOf(c.End())); end.Before(f.Finish) {
				f.Finish = end
			}
			if c.Stop != "" {
				f.Stop = c.Stop
			}
			f.StopLevel = c.Levels[len(c.Levels)-1]
		}
	}
}
