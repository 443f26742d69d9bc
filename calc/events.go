package calc

import "math"

// event names a drain event located on the flow table: the level falls to
// intake + required submergence (evIntake), the lift reaches the flowing crest
// limit (evCrest) or the working crest height (evWorking). Each has an event
// function g that is positive while the drain goes on.
type event int

const (
	evIntake event = iota
	evCrest
	evWorking
)

// g is the event function for ev at x: positive while the drain goes on.
func (p *planner) g(ev event, x float64) float64 {
	hs, _, _, H := p.state(x)
	if H <= 0 {
		return -1
	}
	_, s, c := p.tab.at(H)
	switch ev {
	case evIntake:
		return hs - p.intake - s
	case evCrest:
		return c - (p.crest - hs)
	default:
		return c - p.allowance - (p.crest - hs)
	}
}

// gHead is H(x) − target for root finding on the geometry alone.
func (p *planner) gHead(x, target float64) float64 {
	_, _, _, H := p.state(x)
	return H - target
}

// scanRoots scans the intake, crest and working-limit events over the map m
// at n+1 points and returns, for each, the first x at which it turns
// non-positive (located by Brent's method) and whether it did.
func (p *planner) scanRoots(m xmap, n int, tol float64) (roots [3]float64, found [3]bool) {
	evs := [3]event{evIntake, evCrest, evWorking}
	var prevX [3]float64
	var prevG [3]float64
	open := 0
	for k := 0; k <= n; k++ {
		x, _ := m.at(float64(k) / float64(n))
		hs, _, _, H := p.state(x)
		var g [3]float64
		if H <= 0 {
			g = [3]float64{-1, -1, -1}
		} else {
			_, sub, c := p.tab.at(H)
			g = [3]float64{hs - p.intake - sub, c - (p.crest - hs), c - p.allowance - (p.crest - hs)}
		}
		open = 0
		for e := range evs {
			if found[e] {
				continue
			}
			switch {
			case g[e] > 0:
				open++
			case k == 0:
				roots[e], found[e] = 0, true
			default:
				ev := evs[e]
				f := func(x float64) float64 { return p.g(ev, x) }
				roots[e], found[e] = brent(f, prevX[e], x, prevG[e], g[e], tol, true), true
			}
			prevX[e], prevG[e] = x, g[e]
		}
		if open == 0 {
			break
		}
	}
	return roots, found
}

// x limits (path variable) for the geometric stops.
func (p *planner) geoLimits() (xBottom, xTarget, xFull, xEqual, x0 float64, haveX0 bool) {
	inf := math.Inf(1)
	xTarget, xFull, xEqual = inf, inf, inf
	if !p.hasRcv {
		xBottom = p.h0 - p.intake
		if p.target >= 0 {
			xTarget = p.h0 - p.target
		}
		x0 = p.h0 - p.hoseEnd
		xEqual = x0 - p.eps
		return xBottom, xTarget, xFull, xEqual, x0, true
	}
	xBottom = p.vs0 - float64(p.src.Volume(Length(p.intake)))
	if p.target >= 0 {
		xTarget = p.vs0 - float64(p.src.Volume(Length(p.target)))
	}
	xFull = p.vrCap - p.vr0
	lim := math.Min(xBottom, xFull)
	tol := 1e-13 * math.Max(p.vs0, 1e-9)
	_, _, _, H0 := p.state(0)
	_, _, _, Hl := p.state(lim)
	if Hl <= 0 && H0 > 0 {
		x0 = brent(func(x float64) float64 { return p.gHead(x, 0) }, 0, lim, H0, Hl, tol, false)
		haveX0 = true
	}
	if Hl <= p.eps && H0 > p.eps {
		xEqual = brent(func(x float64) float64 { return p.gHead(x, p.eps) }, 0, lim, H0-p.eps, Hl-p.eps, tol, true)
	} else if H0 <= p.eps {
		xEqual = 0
	}
	return xBottom, xTarget, xFull, xEqual, x0, haveX0
}

// levelTol is the path tolerance that corresponds to about 1e-9 m of level.
func (p *planner) xTol(x float64) float64 {
	if !p.hasRcv {
		return 1e-10 * math.Max(1, p.h0)
	}
	hs, _, _, _ := p.state(x)
	return 1e-10 * math.Max(float64(p.src.Area(Length(hs))), 1e-6)
}

// polishCrest moves the crest stop found on the interpolant onto the point
// where Solve's verdict flips in the real geometry, keeping the running side.
func (p *planner) polishCrest(x, xMax float64) (float64, error) {
	runs := func(x float64) (bool, error) {
		r, err := p.solveAt(x)
		return r.Verdict != WillNotRun, err
	}
	d0 := p.xTol(x) * 100
	// a: running; step back until it is.
	a, d := x, d0
	okA, err := runs(a)
	for i := 0; err == nil && !okA && a > 0 && i < 40; i++ {
		a = math.Max(a-d, 0)
		d *= 4
		okA, err = runs(a)
	}
	if err != nil {
		return x, err
	}
	if !okA {
		return 0, nil
	}
	// b: not running; step forward until it is not.
	b := a
	d = d0
	for i := 0; i < 60; i, d = i+1, d*4 {
		b = math.Min(a+d, xMax)
		okB, err := runs(b)
		if err != nil {
			return x, err
		}
		if !okB {
			break
		}
		a = b
		if b >= xMax {
			return b, nil
		}
	}
	for i := 0; i < 60 && b-a > 10*d0; i++ {
		m := (a + b) / 2
		ok, err := runs(m)
		if err != nil {
			return x, err
		}
		if ok {
			a = m
		} else {
			b = m
		}
	}
	return a, nil
}
