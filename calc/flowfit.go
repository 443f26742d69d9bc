package calc

import "math"

// FlowCheck is one measured flow of the siphon (a bucket-and-stopwatch test
// at one hose's outlet): Flow, m³/s, with the source at Level, m on the
// plan's datum (above the tank floor; without a tank the surface is 0).
// Weight is its weight in the fit (0 counts as 1).
type FlowCheck struct {
	Flow   FlowRate
	Level  Length
	Weight float64
}

func (c FlowCheck) check() error {
	if err := checkPositive(QuantityMaxFlow, "measured flow", float64(c.Flow), float64(MaxFlowRate), "m³/s"); err != nil {
		return err
	}
	if err := checkRange(QuantitySurface, "level at the flow test", float64(c.Level), -MaxElevation, MaxElevation, "m"); err != nil {
		return err
	}
	return checkRange(QuantityMaxFlow, "flow test weight", c.Weight, 0, 1e6, "")
}

// TestFit is a siphon's losses fitted to measured flows (FitToTests).
type TestFit struct {
	// Siphon is the siphon with the fitted losses.
	Siphon Siphon
	// ExtraK is the change of ΣK that fits: added to the down-leg when ≥ 0,
	// the entrance, intake, up-leg and down-leg scaled by (ΣK + ΔK)/ΣK when
	// < 0.
	ExtraK float64
	// Ratio is the measured flow over the planned one before the fit (the
	// weighted geometric mean over the tests), and FittedRatio after it.
	Ratio, FittedRatio float64
	// Faster: the tests are faster than the plan can be with no fitting
	// losses (the fit stops at ΣK = 0); Slower: slower than with ΣK at
	// its maximum. Either way the heights or the bore typed are likely off.
	Faster, Slower bool
}

// fitKMax bounds the added ΣK of a fit.
const fitKMax = 500

// FitToTests fits the siphon's minor losses to measured flows, each scaled
// by scale (1 for the flows as measured; the band moves it by the tests'
// uncertainty): the ΔK that minimises Σ wᵢ·(ln Q(hᵢ; ΔK) − ln(scale·Qᵢ))²,
// with Q(h; ΔK) the flow per hose Solve gives with the source at hᵢ (a
// bucket catches one hose's outlet). One fitted loss is all that a flow
// test can tell: it cannot say whether the extra loss is in the wall, the
// fittings or a bore smaller than typed, so it lumps them, as the readings
// fit does (model.DrainSimulator). Solved by Brent's method on ln Q − ln Q_m
// when every test is at one level, else by golden-section search (Kiefer
// 1953) over ΔK ∈ [−ΣK, 500]. A permit's cap (MaxFlow) becomes its valve at
// the start first.
func FitToTests(s Siphon, tests []FlowCheck, scale float64) TestFit {
	fit := TestFit{Siphon: s, Ratio: 1, FittedRatio: 1}
	if len(tests) == 0 || !(scale > 0) {
		return fit
	}
	if s.MaxFlow > 0 {
		if r, err := Solve(s); err == nil {
			s.Hose.OutletK = math.Min(s.Hose.OutletK+r.MaxFlowThrottleK, MaxK)
		}
		s.MaxFlow = 0
		fit.Siphon = s
	}
	sum := s.Hose.KEntrance + s.Hose.KUpLeg + s.Hose.KDownLeg + s.Intake.K
	with := func(dk float64) Siphon {
		t := s
		switch {
		case dk >= 0:
			t.Hose.KDownLeg = math.Min(t.Hose.KDownLeg+dk, MaxK)
		case sum > 0:
			f := math.Max((sum+dk)/sum, 0)
			t.Hose.KEntrance *= f
			t.Hose.KUpLeg *= f
			t.Hose.KDownLeg *= f
			t.Intake.K *= f
		}
		return t
	}
	// resid is the weighted mean of ln(Q/Q_m) and the sum of squares.
	resid := func(dk float64) (mean, sse float64) {
		t := with(dk)
		var wsum float64
		for _, c := range tests {
			w := c.Weight
			if w == 0 {
				w = 1
			}
			t.Geometry.Surface = c.Level
			q := 1e-12
			if r, err := Solve(t); err == nil && r.Verdict != WillNotRun && r.FlowPerHose > 0 {
				q = float64(r.FlowPerHose)
			}
			d := math.Log(q / (scale * float64(c.Flow)))
			mean += w * d
			sse += w * d * d
			wsum += w
		}
		return mean / wsum, sse
	}
	m0, _ := resid(0)
	fit.Ratio = math.Exp(-m0)
	oneLevel := true
	for _, c := range tests {
		oneLevel = oneLevel && c.Level == tests[0].Level
	}
	lo, hi := -sum, fitKMax-s.Hose.KDownLeg
	if hi <= 0 {
		hi = 0
	}
	var dk float64
	if oneLevel {
		mLo, _ := resid(lo)
		mHi, _ := resid(hi)
		g := func(x float64) float64 { m, _ := resid(x); return m }
		switch {
		case mLo <= 0:
			dk, fit.Faster = lo, mLo < -1e-9
		case mHi > 0:
			dk, fit.Slower = hi, true
		default:
			dk = brent(g, lo, hi, mLo, mHi, 1e-9*(1+hi-lo), false)
		}
	} else {
		const phi = 0.6180339887498949
		a, b := lo, hi
		x1, x2 := b-phi*(b-a), a+phi*(b-a)
		_, f1 := resid(x1)
		_, f2 := resid(x2)
		for range 60 {
			if f1 < f2 {
				b, x2, f2 = x2, x1, f1
				x1 = b - phi*(b-a)
				_, f1 = resid(x1)
			} else {
				a, x1, f1 = x1, x2, f2
				x2 = a + phi*(b-a)
				_, f2 = resid(x2)
			}
		}
		dk = (a + b) / 2
		fit.Faster = dk-lo < 1e-6*(1+hi-lo)
		fit.Slower = hi-dk < 1e-6*(1+hi-lo)
	}
	fit.ExtraK = dk
	fit.Siphon = with(dk)
	fit.Siphon.Geometry = s.Geometry
	m1, _ := resid(dk)
	fit.FittedRatio = math.Exp(-m1)
	return fit
}

// BucketUncertainty is the relative standard uncertainty of the mean of n
// bucket-and-stopwatch tests of mean duration t, s: a container volume good
// to ±vol (relative; the same container each time, so it does not average
// out) and a hand stopwatch good to ±dt at each end (at random, so it
// averages as 1/√n), each read as the bounds of a rectangular distribution
// (u = a/√3, GUM 4.3.7) and combined in quadrature (GUM 5.1.2):
//
//	u² = (vol/√3)² + 2·(dt/√3)²/(n·t²)
//
// Common practice for a bucket test (from memory): a marked bucket reads to
// about ±3 %, a hand-started stopwatch to about ±0.3 s each end; a container
// that takes at least a few seconds to fill keeps the timing part small.
func BucketUncertainty(vol, dt, t float64, n int) float64 {
	if n < 1 || !(t > 0) {
		return 0
	}
	a := vol / math.Sqrt(3)
	b := dt / math.Sqrt(3)
	return math.Sqrt(a*a + 2*b*b/(float64(n)*t*t))
}
