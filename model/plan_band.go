package model

import (
	"strings"

	"drawdown/calc"
	"drawdown/presets"
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
	return t
}

// band fills FlowLow and FlowHigh (calc.FlowBand). When the band cannot be
// computed, it collapses to the central flow and a note says so.
func (c *computer) band() {
	p := &c.p
	lo, hi, err := calc.FlowBand(p.Siphon, c.tolerance())
	if err != nil {
		lo, hi = p.Result.Flow, p.Result.Flow
		c.note("no flow range: " + err.Error())
	}
	// The central value always lies inside its own band.
	p.FlowLow = min(lo, p.Result.Flow)
	p.FlowHigh = max(hi, p.Result.Flow)
}

// drainBand fills TimeLow and TimeHigh (calc.PlanBand).
func (c *computer) drainBand() {
	p := &c.p
	p.TimeLow, p.TimeHigh = p.Drain.Time, p.Drain.Time
	b, err := calc.PlanBand(p.DrainIn, c.tolerance())
	if err != nil {
		c.note("no time range: " + err.Error())
		return
	}
	p.TimeLow = min(b.TimeLow, p.Drain.Time)
	p.TimeHigh = max(b.TimeHigh, p.Drain.Time)
	p.SlowMayNotStart = b.SlowWillNotRun
	if b.SlowWillNotRun {
		c.note("at the slow end of the height, roughness and fitting tolerances the siphon would not start: the longest time has no bound")
	}
}

// Cautions lists the cautions that go with this plan, for the screen, the
// text output and the record: one line per hazard of the liquid at its
// temperature, the liquid's own note, the hose wall's note when it cannot
// hold a vacuum, and always the rule against starting by mouth. They defer
// to local codes and permits; they never declare anything safe.
func (p Plan) Cautions() []string {
	out := []string{presets.NeverByMouth}
	for _, h := range p.Hazards.List() {
		out = append(out, capitalise(h.Description())+".")
	}
	if p.Hazards.Has(presets.Flammable) && !strings.Contains(p.Liquid.Note, "local-code") {
		out = append(out, "Whether a hose siphon may be used for this liquid at a workplace is a question for local fire code and the employer (OSHA 29 CFR 1910.106, NFPA 30, NFPA 77).")
	}
	if p.Liquid.Note != "" {
		out = append(out, p.Liquid.Note)
	}
	if p.Material.Collapses {
		out = append(out, p.Material.Name+" flattens under suction: a siphon's crest runs below atmospheric pressure. Use suction hose or solid-wall pipe.")
	}
	return out
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
