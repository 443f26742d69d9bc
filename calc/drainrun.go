package calc

// run plans the drain: the stops known at the start, then the flow tables,
// the events on them, the first stop and the time integral. Its
// cyclomatic complexity (~29) is the early returns of each stage, kept in
// order in one place so the sequence reads top to bottom.
func (p *planner) run() (DrainPlan, error) {
	var plan DrainPlan
	plan.EqualHead = Length(p.eps)
	start := p.start
	plan.Start = start
	plan.StopLevel = Length(p.h0)
	plan.Residual = Volume(p.vs0)
	_, hr0, _, H0 := p.state(0)
	plan.ReceiverLevel = Length(hr0)
	plan.AirStartsLevel, plan.PrimeLostLevel = start.AirStartsLevel, start.PrimeLostLevel
	plan.Inflow = FlowRate(p.qin)
	targetBelow := func() bool { return p.target >= 0 && p.target < float64(plan.PrimeLostLevel) }

	stopNow := func(why StopReason) (DrainPlan, error) {
		plan.TargetBelowPrimeLost = targetBelow()
		plan.StopReason = why
		plan.StartFlow = start.Flow
		plan.EndFlow = start.Flow
		if p.points > 0 {
			plan.Curve = []DrainPoint{{Level: Length(p.h0), Flow: start.Flow, ReceiverLevel: Length(hr0)}}
		}
		return plan, nil
	}
	if why, ok := p.stopAtStart(&plan); ok {
		return stopNow(why)
	}
	if p.qin > 0 && p.qin >= float64(start.Flow) {
		if err := p.rise(&plan); err != nil {
			return DrainPlan{}, err
		}
		plan.TargetBelowPrimeLost = targetBelow()
		return plan, nil
	}

	xBottom, xTarget, xFull, xEqual, x0, haveX0 := p.geoLimits()
	xMax := min(min(xBottom, xFull), xEqual)
	if xMax <= 0 || H0 <= p.eps {
		if p.hasRcv && xFull <= 0 {
			return stopNow(StopReceiverFull)
		}
		return stopNow(StopEqual)
	}
	_, _, _, hLo := p.state(xMax)
	hLo = max(hLo, min(p.eps, H0))
	// the gulping head reaches down to (1 − GulpVoidMax) of the head
	p.build(hLo*(1-GulpVoidMax), H0)

	xCrest, okCrest, x0Crest := p.crestStop(xMax)
	if okCrest && xCrest <= 0 {
		plan.CrestLimitLevel, plan.CrestLimitFound = Length(p.h0), true
		return stopNow(StopCrest)
	}

	// Events on the interpolated flow tables: first where it chokes (the
	// choked table starts there), then all.
	scan := newXmap(x0, haveX0, 0, xMax)
	const scanN = 64
	tolX := p.xTol(0)
	var want [evCount]bool
	if p.fixed == nil {
		want[evChoke] = true
		r1, f1 := p.scanRoots(scan, scanN, tolX, want)
		if f1[evChoke] {
			p.chokeTable(r1[evChoke], xMax)
		}
	}
	for i := range want {
		want[i] = true
	}
	roots, found := p.scanRoots(scan, scanN, tolX, want)
	p.reportLimits(&plan, roots, found, xMax)
	if okCrest {
		plan.CrestLimitLevel, plan.CrestLimitFound = Length(p.h0-xCrest), true
		if p.hasRcv {
			hs, _, _, _ := p.state(xCrest)
			plan.CrestLimitLevel = Length(hs)
		}
	}

	xStop, why := xMax, StopEqual
	first := func(x float64, ok bool, r StopReason) {
		if ok && x <= xStop {
			xStop, why = x, r
		}
	}
	first(xBottom, xBottom < xEqual, StopIntake)
	first(xFull, true, StopReceiverFull)
	first(xTarget, true, StopTarget)
	first(roots[evPrime], found[evPrime], StopIntake)
	if found[evAir] {
		switch {
		case p.film:
			first(roots[evAir], true, StopAir)
		case found[evClear]:
			first(max(roots[evAir], roots[evClear]), true, StopAir)
		}
	}
	first(xCrest, okCrest, StopCrest)
	var xs float64
	if x, ok := p.settleRoot(scan, scanN, tolX); ok && x < xStop {
		xs = x
		xStop, why = max(x-float64(SettleMargin), 0), StopSettles
		plan.SettleLevel, plan.SettleFound = Length(p.h0-x), true
	}
	if xStop <= 0 {
		return stopNow(why)
	}
	plan.StopReason = why
	xz, haveZ := x0, haveX0
	if why == StopCrest {
		xz, haveZ = x0Crest, true
	}
	m := newXmap(xz, haveZ, 0, xStop)
	if why == StopSettles {
		m = newSettleXmap(xs, 0, xStop)
	}
	xa, gulp := roots[evAir], found[evAir] && roots[evAir] < xStop
	p.integrate(&plan, m, xa, gulp)
	plan.StartFlow = start.Flow
	plan.TargetBelowPrimeLost = targetBelow()
	return plan, nil
}

// crestStop returns the path position where the lift reaches the running
// crest height less EqualHead (the crest stop), whether the path reaches it,
// and the position where the headroom is gone (the flow vanishes there).
func (p *planner) crestStop(xMax float64) (x float64, ok bool, x0 float64) {
	if p.fixed != nil {
		return 0, false, 0
	}
	h := p.crest - p.runHeight + p.eps
	if h >= p.h0 {
		return 0, true, 0
	}
	x = p.xAtLevel(h)
	x0 = p.xAtLevel(h - p.eps)
	if p.hasRcv && h <= 0 {
		return 0, false, 0
	}
	return x, x <= xMax, x0
}

// chokeTable builds the choked-flow table from the headroom where the siphon
// chokes (path position xc) down to EqualHead/2.
func (p *planner) chokeTable(xc, xMax float64) {
	hc, _, _, _ := p.state(xc)
	dHi := p.runHeight - (p.crest - hc)
	dLo := p.eps / 2
	if dHi > dLo {
		p.buildChoke(dLo, dHi)
	}
	_ = xMax
}

// stopAtStart reports the stop of a siphon that does not drain at all from
// the start level, and fills the limits known there.
func (p *planner) stopAtStart(plan *DrainPlan) (StopReason, bool) {
	start := p.start
	h0 := Length(p.h0)
	switch start.Verdict {
	case WillNotRun:
		switch start.Why {
		case WarnCannotRun:
			plan.CrestLimitLevel, plan.CrestLimitFound = h0, true
			plan.WorkingLimitLevel, plan.WorkingLimitFound = h0, true
			return StopCrest, true
		case WarnBoiling, WarnHoseCollapse:
			return StopCrest, true
		case WarnPrimeLost:
			return StopIntake, true
		case WarnAirDrawn:
			return StopAir, true
		default: // WarnNoDrop: the levels are already equal or reversed
		}
		return StopEqual, true
	case RunsChoked:
		plan.ChokeLevel, plan.ChokeFound = h0, true
		plan.WorkingLimitLevel, plan.WorkingLimitFound = h0, true
	case RunsNearLimit:
		plan.WorkingLimitLevel, plan.WorkingLimitFound = h0, true
	case Runs:
	}
	return "", false
}

// reportLimits fills the levels at which the events happen, from their
// roots; the intake's levels default to those at the path's end.
func (p *planner) reportLimits(plan *DrainPlan, roots [evCount]float64, found [evCount]bool, xMax float64) {
	level := func(x float64) Length {
		hs, _, _, _ := p.state(x)
		return Length(hs)
	}
	end := p.eval(xMax)
	plan.AirStartsLevel, plan.PrimeLostLevel = Length(end.air), Length(end.prime)
	if found[evAir] {
		plan.AirStartsLevel = level(roots[evAir])
	}
	if found[evPrime] {
		plan.PrimeLostLevel = level(roots[evPrime])
	}
	if found[evChoke] && !plan.ChokeFound {
		plan.ChokeLevel, plan.ChokeFound = level(roots[evChoke]), true
	}
	if found[evWorking] && !plan.WorkingLimitFound {
		plan.WorkingLimitLevel, plan.WorkingLimitFound = level(roots[evWorking]), true
	}
	if found[evClear] {
		plan.AirGatherLevel, plan.AirGatherFound = level(roots[evClear]), true
	}
	if found[evCollapse] {
		plan.CollapseLevel, plan.CollapseFound = level(roots[evCollapse]), true
	}
}
