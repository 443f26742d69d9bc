package calc

import "math"

// pathState is the siphon at one path position, as the planner sees it.
type pathState struct {
	hs, hr, out, H float64
	q0             float64 // flow without gulped air (all hoses)
	q              float64 // flow (all hoses)
	c              float64 // flowing crest limit at the full-gravity flow
	air, prime     float64 // intake levels at q0
	choked         bool
}

// eval returns the state at path position x: the full-gravity flow from the
// table, the choked flow where the crest limits it, the intake's levels and
// the gulping flow between them (see Solve, which this follows).
func (p *planner) eval(x float64) pathState {
	var e pathState
	e.hs, e.hr, e.out, e.H = p.state(x)
	if e.H <= 0 {
		e.air, e.prime = p.intake, p.intake
		return e
	}
	qg, c := p.tab.at(e.H)
	e.c = c
	qc := math.Inf(1)
	if p.hasChoke {
		if d := p.runHeight - (p.crest - e.hs); d > 0 {
			qc, _ = p.chk.at(d)
		} else {
			qc = 0
		}
	}
	e.q0 = min(qg, qc)
	e.choked = qc < qg
	if p.fixed != nil {
		e.air, e.prime, e.q = p.intake, p.intake, e.q0
		return e
	}
	e.air, e.prime = p.c.im.levels(e.q0 / p.c.n)
	e.q = e.q0
	if a := gulpVoid(e.hs, e.air, e.prime); a > 0 {
		he := e.H - float64(GulpHeadLoss(a, Length(p.intake), Length(e.out)))
		qd, _ := p.tab.at(he)
		e.q = min(qd, qc)
	}
	return e
}

// The drain's events, each with a function g that is positive while the
// drain goes on and turns non-positive at the event.
const (
	evChoke    = iota // the crest reaches its running limit at full-gravity flow
	evWorking         // the lift passes the working crest height
	evAir             // the level falls to where air starts
	evPrime           // the level falls to where prime is lost
	evClear           // the down-leg velocity falls below the air-clearing velocity
	evCollapse        // the crest vacuum passes the hose's rating
	evCount
)

// events returns the event functions at x; with crestOnly, only the two
// that need no more than the full-gravity table (the others are left at 1).
func (p *planner) events(x float64, crestOnly bool) (g [evCount]float64) {
	if crestOnly {
		hs, _, _, H := p.state(x)
		if H <= 0 {
			return [evCount]float64{-1, -1, 1, 1, 1, 1}
		}
		_, c := p.tab.at(H)
		lift := p.crest - hs
		return [evCount]float64{c - p.runAllow - lift, c - p.workAllow - lift, 1, 1, 1, 1}
	}
	e := p.eval(x)
	if e.H <= 0 {
		for i := range g {
			g[i] = -1
		}
		return g
	}
	lift := p.crest - e.hs
	g[evChoke] = e.c - p.runAllow - lift
	g[evWorking] = e.c - p.workAllow - lift
	g[evAir] = e.hs - e.air
	g[evPrime] = e.hs - e.prime
	g[evClear], g[evCollapse] = 1, 1
	if p.fixed != nil {
		return g
	}
	c := &p.c
	vc := c.vC // the outlet moves only in a transfer
	if p.hasRcv {
		vc = airClearing(c.D, p.crest-e.out, c.lDown, c.geo.DownLegSlope)
	}
	g[evClear] = e.q/(c.n*c.area) - vc
	if p.rating >= 0 {
		rg := c.rho * StandardGravity
		maxCrest := (c.patm - c.pv) / rg
		vac := min(rg*(lift+maxCrest-e.c), c.patm-c.pRun)
		if e.choked {
			vac = c.patm - c.pRun
		}
		g[evCollapse] = p.rating - vac
	}
	return g
}

// scanRoots scans the events in want over the map m at n+1 points and
// returns, for each, the first x at which it turns non-positive (located by
// Brent's method) and whether it did.
func (p *planner) scanRoots(m xmap, n int, tol float64, want [evCount]bool) (roots [evCount]float64, found [evCount]bool) {
	var prevX, prevG [evCount]float64
	crestOnly := !want[evAir] && !want[evPrime] && !want[evClear] && !want[evCollapse]
	for k := 0; k <= n; k++ {
		x, _ := m.at(float64(k) / float64(n))
		g := p.events(x, crestOnly)
		open := 0
		for e := range g {
			if !want[e] || found[e] {
				continue
			}
			switch {
			case g[e] > 0:
				open++
			case k == 0:
				roots[e], found[e] = 0, true
			default:
				ev := e
				f := func(x float64) float64 { return p.events(x, crestOnly)[ev] }
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

// gHead is H(x) − target for root finding on the geometry alone.
func (p *planner) gHead(x, target float64) float64 {
	_, _, _, H := p.state(x)
	return H - target
}

// geoLimits returns the path limits of the geometric stops: the level down
// to the intake, the target, the receiver's brim, equal levels (and x0,
// where the levels would meet).
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
	xBottom = p.xAtLevel(p.intake)
	if p.target >= 0 {
		xTarget = p.xAtLevel(p.target)
	}
	xFull = p.vrCap - p.vr0
	lim := min(xBottom, xFull)
	tol := 1e-13 * max(p.vs0, 1e-9)
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

// xTol is the path tolerance that corresponds to about 1e-10 m of level.
func (p *planner) xTol(x float64) float64 {
	if !p.hasRcv {
		return 1e-10 * max(1, p.h0)
	}
	hs, _, _, _ := p.state(x)
	return 1e-10 * max(float64(p.src.Area(Length(hs))), 1e-6)
}
