package calc

import "math"

// initInflow checks and keeps the inflow (see PlanDrain, "Inflow").
func (p *planner) initInflow(q FlowRate) error {
	if err := checkRange(QuantityInflow, "inflow", float64(q), 0, float64(MaxFlowRate), "m³/s"); err != nil {
		return err
	}
	if q > 0 && p.hasRcv {
		return &RangeError{What: QuantityInflow, Quantity: "inflow", Value: float64(q), Min: 0, Max: 0, Unit: "m³/s",
			Err: ErrOutOfRange, Note: "inflow is planned for a drain, not a transfer into a receiver"}
	}
	p.qin = float64(q)
	return nil
}

// settleRoot returns the first path position where the flow falls to the
// inflow (Q(x) − Q_in turns non-positive), located by Brent's method on the
// interpolated flow, and whether the path reaches it.
func (p *planner) settleRoot(m xmap, n int, tol float64) (float64, bool) {
	if p.qin <= 0 {
		return 0, false
	}
	g := func(x float64) float64 { return p.eval(x).q - p.qin }
	prevX, prevG := 0.0, g(0)
	if prevG <= 0 {
		return 0, true
	}
	for k := 1; k <= n; k++ {
		x, _ := m.at(float64(k) / float64(n))
		gx := g(x)
		if gx <= 0 {
			return brent(g, prevX, x, prevG, gx, tol, true), true
		}
		prevX, prevG = x, gx
	}
	return 0, false
}

// time90 returns the time at which the volume moved reaches 90 % of total,
// by bisection on the path parameter σ; at(σ) gives the path position and
// the time there.
func (p *planner) time90(total float64, at func(sg float64) (x, t float64)) float64 {
	if !(total > 0) {
		return 0
	}
	moved := func(sg float64) (float64, float64) {
		x, t := at(sg)
		if p.hasRcv {
			return x, t
		}
		return p.vs0 - float64(p.src.Volume(Length(p.h0-x))) + p.qin*t, t
	}
	lo, hi := 0.0, 1.0
	for range 60 {
		mid := (lo + hi) / 2
		if v, _ := moved(mid); v < 0.9*total {
			lo = mid
		} else {
			hi = mid
		}
	}
	_, t := moved(hi)
	return t
}

// riseNodes is the number of quadrature intervals for a rising level.
const riseNodes = 32

// rise plans a level that rises because the inflow outruns the siphon from
// the start: to within SettleMargin of the level where the siphon's flow has
// grown to the inflow, or to the brim when it never does (the tank
// overflows). The flow at each level is Solve's, in the start geometry with
// the surface there; t = ∫ A/(Q_in − Q) dh by the composite Gauss–Lobatto
// rule, in u = −ln(h_s − h) when it settles.
func (p *planner) rise(plan *DrainPlan) error {
	top := float64(p.src.Height())
	qAt := func(h float64) (float64, error) {
		r, err := p.solveAt(p.h0 - h)
		if err != nil {
			return 0, err
		}
		return float64(r.Flow), nil
	}
	plan.Rises = true
	plan.StopReason = StopSettles
	plan.SettleFound = true
	plan.StartFlow = p.start.Flow
	qTop, err := qAt(top)
	if err != nil {
		return err
	}
	hs, end := top, top
	var m xmap
	switch {
	case qTop < p.qin:
		plan.Overflows = true
		m = newXmap(0, false, p.h0, top)
	default:
		f := func(h float64) float64 {
			q, _ := qAt(h)
			return p.qin - q
		}
		hs = p.h0
		if fa := p.qin - float64(p.start.Flow); fa > 0 && top > p.h0 {
			hs = brent(f, p.h0, top, fa, p.qin-qTop, 1e-9, false)
		}
		end = max(hs-float64(SettleMargin), p.h0)
		if hs > p.h0 {
			m = newSettleXmap(hs, p.h0, end)
		} else {
			m = newXmap(0, false, p.h0, p.h0)
		}
	}
	plan.SettleLevel = Length(hs)
	var solveErr error
	rate := func(sg float64) (float64, float64) {
		h, dhds := m.at(sg)
		q, err := qAt(h)
		if err != nil {
			solveErr = err
			return 0, 0
		}
		if !(p.qin > q) {
			return 0, 0
		}
		w := math.Abs(dhds) * float64(p.src.Area(Length(h))) / (p.qin - q)
		return w, w
	}
	var ts, fs, ts0, fs0 [riseNodes + 1]float64
	if end > p.h0 {
		lobatto(rate, ts[:], fs[:], ts0[:], fs0[:])
	}
	if solveErr != nil {
		return solveErr
	}
	plan.Time = Seconds(ts[riseNodes])
	plan.StopLevel = Length(end)
	plan.Residual = p.src.Volume(Length(end))
	plan.Volume = Volume(max(p.qin*float64(plan.Time)-(float64(plan.Residual)-p.vs0), 0))
	qEnd, err := qAt(end)
	if err != nil {
		return err
	}
	plan.EndFlow = FlowRate(qEnd)
	plan.Time90 = Seconds(p.riseTime90(float64(plan.Volume), m, ts[:], fs[:]))
	if nc := p.points; nc > 0 {
		plan.Curve = make([]DrainPoint, nc)
		for i := range plan.Curve {
			sg := float64(i) / float64(nc-1)
			h, _ := m.at(sg)
			q, _ := qAt(h)
			plan.Curve[i] = DrainPoint{Time: Seconds(hermite(ts[:], fs[:], sg)), Level: Length(h), Flow: FlowRate(q)}
		}
		plan.Curve[nc-1].Time = plan.Time
	}
	return nil
}

// riseTime90 is time90 for a rising level: the volume moved is the inflow
// less the rise, Q_in·t − (V(h) − V(h₀)).
func (p *planner) riseTime90(total float64, m xmap, ts, fs []float64) float64 {
	if !(total > 0) {
		return 0
	}
	lo, hi := 0.0, 1.0
	moved := func(sg float64) (float64, float64) {
		h, _ := m.at(sg)
		t := hermite(ts, fs, sg)
		return p.qin*t - (float64(p.src.Volume(Length(h))) - p.vs0), t
	}
	for range 60 {
		mid := (lo + hi) / 2
		if v, _ := moved(mid); v < 0.9*total {
			lo = mid
		} else {
			hi = mid
		}
	}
	_, t := moved(hi)
	return t
}
