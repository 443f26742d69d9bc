package model

import (
	"drawdown/calc"
)

// tolerance states the input uncertainties for the band: the height
// tolerance the technician set, roughness over the material's published
// range (or the override exactly), and ΣK from the fittings' low values to
// their high values, at least calc.KFactorHigh times the central sum
// (handbook K are lower bounds at siphon velocities).
func (c *computer) tolerance() calc.Tolerance {
	p := &c.p
	t := calc.Tolerance{RoughnessLow: p.RoughLow, RoughnessHigh: p.RoughHigh}
	if v, ok := c.num(FieldTolHeight); ok {
		t.Height = calc.Length(v)
		if v == 0 {
			t.Height = 1e-9 // "no tolerance" (zero means the default in calc)
		}
	}
	k := p.Siphon.Hose.KMinor()
	t.KLow = min(p.KLow, k)
	t.KHigh = max(p.KHigh, calc.KFactorHigh*k)
	if v, ok := c.num(FieldTolBore); ok {
		t.Bore = v
		if v == 0 {
			t.Bore = 1e-9 // "no tolerance" (zero means the default in calc)
		}
	}
	c.tolTests(&t)
	return t
}

// band fills FlowLow and FlowHigh (calc.FlowBand). When the band cannot be
// computed, it collapses to the central flow and a note says so.
func (c *computer) band() {
	p := &c.p
	if c.in.Quick {
		p.Quick, p.FlowLow, p.FlowHigh = true, p.Result.Flow, p.Result.Flow
		return
	}
	lo, hi, err := calc.FlowBand(p.Siphon, c.tolerance())
	if err != nil {
		lo, hi = p.Result.Flow, p.Result.Flow
		c.note("no flow range: " + err.Error())
	}
	// The central value always lies inside its own band.
	p.FlowLow = min(lo, p.Result.Flow)
	p.FlowHigh = max(hi, p.Result.Flow)
}

// drainBand fills TimeLow and TimeHigh (calc.PlanBandFrom: the nominal plan
// is the drain just planned, not planned again).
func (c *computer) drainBand() {
	p := &c.p
	p.TimeLow, p.TimeHigh = p.Drain.Time, p.Drain.Time
	if c.in.Quick {
		return
	}
	b, err := calc.PlanBandFrom(p.DrainIn, *p.Drain, c.tolerance())
	if err != nil {
		c.note("no time range: " + err.Error())
		return
	}
	p.Band = &b
	p.TimeLow = min(b.TimeLow, p.Drain.Time)
	p.TimeHigh = max(b.TimeHigh, p.Drain.Time)
	p.SlowMayNotStart = b.SlowWillNotRun
	if b.SlowWillNotRun {
		c.note("at the slow end of the height, roughness and fitting tolerances the siphon would not start: the longest time has no bound")
	}
}
