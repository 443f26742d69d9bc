package model

import (
	"math"
	"time"
)

// Slow is the judgement of whether the siphon slows faster than planned.
type Slow struct {
	// SlowingJudged: enough readings, falling enough for their resolution,
	// to judge (at least three, the early window's fall over twice its
	// uncertainty).
	SlowingJudged bool
	// Slowing: the recent rate of fall, relative to the earlier rate, is
	// below (1 − SlowFraction) of the plan's own ratio over the same levels,
	// by more than twice its standard uncertainty.
	Slowing bool
	// EarlyRate and LateRate are the observed rates of fall (m/s, positive
	// falling) over the earlier readings and the latest third (at least
	// two); EarlyFrom..LateTo bound them in time.
	EarlyRate, LateRate float64
	LateFrom            time.Time
	// PlanRatio is the plan's (fitted) late-over-early rate at the same
	// levels: its own slowdown (below 1 as the head falls, lower still with
	// an inflow). RateRatio is the observed late-over-early ratio over
	// PlanRatio (1 = slowing as planned), RateRatioSigma its standard
	// uncertainty from the readings' resolution.
	PlanRatio, RateRatio, RateRatioSigma float64
	// LateK is ΔK fitted on the latest readings alone (the loss now), with
	// the inflow as fitted; LateFitted says it was.
	LateK      float64
	LateFitted bool
}

// slowing judges the readings d.rs (at least three) against the fitted
// parameters p.
//
// The readings are cut into an early and a late window sharing one
// reading, the late one the latest third of the intervals (at least one).
// The rate of fall in each is the least-squares slope of level on time, its
// standard uncertainty σ/√Σ(t − t̄)² (the slope's standard error with the
// readings' uncertainty σ; Taylor, An Introduction to Error Analysis, 2nd
// ed., §8.4). The plan's rates over the same level bands come from the
// simulated curve with p, so its own slowdown (the head falling, an inflow)
// is not taken for a fault. ρ = (late/early observed)/(late/early planned),
// with σ_ρ by first-order propagation; Slowing when ρ + 2σ_ρ < 1 −
// SlowFraction. The usual causes are air gathering at the crest and a
// clogging intake screen (field-practice §2.6, §4.2; common practice).
func (d *fitData) slowing(sim Simulator, p FitParams) Slow {
	var s Slow
	rs, n := d.rs, len(d.rs)
	m := max(1, (n-1)/3) // late intervals
	split := n - 1 - m
	early, late := rs[:split+1], rs[split:]
	// The readings' scatter about each window's line, when the windows
	// have readings to spare, replaces a typed resolution that is finer
	// than the surface can be read (a ripple, a wind-set).
	sig := scaledSigma(d.sig, early, late, split)
	re, se := fallRate(early, sig[:split+1])
	rl, sl := fallRate(late, sig[split:])
	s.EarlyRate, s.LateRate, s.LateFrom = re, rl, late[0].At
	if !(re > 2*se) {
		return s // the early fall is within the readings' resolution
	}
	c, err := sim(p, rs[0].Level)
	if err != nil {
		return s
	}
	pe, ok1 := bandRate(c, early[0].Level, early[len(early)-1].Level)
	pl, ok2 := bandRate(c, late[0].Level, late[len(late)-1].Level)
	if !ok1 || !ok2 || !(pe > 0) {
		return s // the plan stops before these levels: nothing to compare
	}
	s.SlowingJudged = true
	s.PlanRatio = pl / pe
	if !(s.PlanRatio > 0) {
		return s
	}
	s.RateRatio = rl / re / s.PlanRatio
	s.RateRatioSigma = math.Hypot(sl/re, rl*se/(re*re)) / s.PlanRatio
	s.Slowing = s.RateRatio+2*s.RateRatioSigma < 1-d.opt.SlowFraction
	if s.Slowing {
		lo := fitData{rs: late, sig: d.sig[split:], start: late[0].Level, opt: d.opt}
		k, chi := lo.minimiseK(sim, p.Inflow)
		if !math.IsInf(chi, 1) {
			s.LateK, s.LateFitted = k, true
		}
	}
	return s
}

// minimiseK fits ΔK alone to d's readings (no flow tests) with the inflow
// held at q.
func (d *fitData) minimiseK(sim Simulator, q float64) (float64, float64) {
	o := *d
	o.tests, o.levels = nil, nil
	o.opt.Inflow = q
	p, chi := o.minimise(sim, false, o.rs)
	return p.ExtraK, chi
}

// fallRate is the least-squares rate of fall of rs (m/s, positive falling)
// and its standard uncertainty, the readings' uncertainties sig taken as
// their RMS.
func fallRate(rs []Reading, sig []float64) (rate, sigma float64) {
	n := float64(len(rs))
	if len(rs) < 2 {
		return 0, math.Inf(1)
	}
	var st, sh, s2 float64
	t0 := rs[0].At
	for i, r := range rs {
		st += r.At.Sub(t0).Seconds()
		sh += r.Level
		s2 += sig[i] * sig[i]
	}
	tm, hm := st/n, sh/n
	var stt, sth float64
	for _, r := range rs {
		dt := r.At.Sub(t0).Seconds() - tm
		stt += dt * dt
		sth += dt * (r.Level - hm)
	}
	if !(stt > 0) {
		return 0, math.Inf(1)
	}
	return -sth / stt, math.Sqrt(s2/n) / math.Sqrt(stt)
}

// bandRate is the curve's mean rate of fall between levels hi and lo (m/s):
// (hi − lo) over the time it takes, or, for a band narrower than the
// curve's resolution, the slope where it passes their middle. ok is false
// when the curve does not reach lo.
func bandRate(c DrainCurve, hi, lo float64) (float64, bool) {
	if hi < lo {
		hi, lo = lo, hi
	}
	t1, ok1 := c.TimeAt(hi)
	t2, ok2 := c.TimeAt(lo)
	if !ok2 {
		return 0, false
	}
	if !ok1 {
		t1 = 0
		hi = c.Levels[0]
	}
	if t2 > t1 && hi-lo > 0 {
		return (hi - lo) / (t2 - t1), true
	}
	mid := (hi + lo) / 2
	tm, ok := c.TimeAt(mid)
	if !ok {
		return 0, false
	}
	dt := max(c.End()*1e-3, 1e-3)
	return (c.LevelAt(tm-dt) - c.LevelAt(tm+dt)) / (2 * dt), true
}

// scaledSigma is the readings' uncertainties, each raised to the pooled
// scatter s of the readings about their window's least-squares line when
// the two windows leave at least two degrees of freedom:
//
//	s² = Σ residuals² / Σ (nₖ − 2)
//
// (the residual standard deviation of a straight-line fit; Taylor, An
// Introduction to Error Analysis, 2nd ed., §8.3).
func scaledSigma(sig []float64, early, late []Reading, split int) []float64 {
	var ss float64
	dof := 0
	for _, w := range [][]Reading{early, late} {
		if len(w) < 3 {
			continue
		}
		ss += lineResiduals(w)
		dof += len(w) - 2
	}
	if dof < 2 {
		return sig
	}
	s := math.Sqrt(ss / float64(dof))
	out := make([]float64, len(sig))
	for i, v := range sig {
		out[i] = max(v, s)
	}
	return out
}

// lineResiduals is the sum of squared residuals of rs about its
// least-squares line of level on time.
func lineResiduals(rs []Reading) float64 {
	n := float64(len(rs))
	t0 := rs[0].At
	var st, sh float64
	for _, r := range rs {
		st += r.At.Sub(t0).Seconds()
		sh += r.Level
	}
	tm, hm := st/n, sh/n
	var stt, sth, shh float64
	for _, r := range rs {
		dt, dh := r.At.Sub(t0).Seconds()-tm, r.Level-hm
		stt += dt * dt
		sth += dt * dh
		shh += dh * dh
	}
	if !(stt > 0) {
		return shh
	}
	return max(shh-sth*sth/stt, 0)
}
