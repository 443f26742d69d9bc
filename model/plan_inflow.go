package model

// Liquid coming in while the siphon runs, flow tests that correct the
// plan, and a pump that finishes what the siphon leaves.

import (
	"math"

	"drawdown/calc"
)

// Inflow is the liquid coming into the source while the siphon runs, by
// where it comes from, m³/s. Total is what the drain plan is given
// (calc.DrainInput.Inflow): the level then obeys A(h)·dh/dt = Qᵢₙ − Q(h).
type Inflow struct {
	// Rain is the rain intensity × the catchment area (Catchment, m²;
	// CatchmentIsTank when the tank's own plan area at its brim was taken).
	Rain            calc.FlowRate
	RainRate        float64 // m/s as entered
	Catchment       float64
	CatchmentIsTank bool
	// Rise is the level's rate of rise with the siphon stopped × the
	// surface area at the start level (the liquid coming in, whatever its
	// source, as the level shows it).
	Rise     calc.FlowRate
	RiseRate float64 // m/s as entered
	// Seepage is a steady inflow typed as a flow.
	Seepage calc.FlowRate
	Total   calc.FlowRate
}

// A bucket test's reading errors, as bounds (common practice, from memory;
// see calc.BucketUncertainty): a marked container to about ±3 % of its
// volume, a hand stopwatch to about ±0.3 s at each end.
const (
	bucketVolumeError = 0.03
	stopwatchError    = 0.3 // s
)

// inflow reads the inflow fields against the tank t (the rain's default
// catchment is its plan area at the brim; the rise rate is turned into a
// flow over the surface area at the start level).
func (c *computer) inflow(t calc.Tank, level float64) Inflow {
	var in Inflow
	if v, ok := c.num(FieldRain); ok && v > 0 {
		in.RainRate = v
		if a, ok := c.num(FieldCatchment); ok {
			in.Catchment = a
		} else {
			in.Catchment, in.CatchmentIsTank = float64(t.Area(t.Height())), true
			c.note("rain falls on the tank's own plan area at its brim (" + shown(DimArea, in.Catchment, c.in.Units) +
				"); give the catchment area when roofs or a yard shed into it")
		}
		in.Rain = calc.FlowRate(v * in.Catchment)
	}
	if v, ok := c.num(FieldRiseRate); ok && v > 0 {
		in.RiseRate = v
		in.Rise = calc.FlowRate(v * float64(t.Area(calc.Length(level))))
		if in.Rain > 0 {
			c.note("the rise rate and the rain are added: a rise measured in the same rain already holds it")
		}
	}
	if v, ok := c.num(FieldSeepage); ok {
		in.Seepage = calc.FlowRate(v)
	}
	in.Total = in.Rain + in.Rise + in.Seepage
	return in
}

// flowChecks turns the job's flow tests into calc's form: each at its own
// level, or at the start level when none was kept (the test was taken just
// after the start). Weights are equal.
func (c *computer) flowChecks() []calc.FlowCheck {
	if len(c.in.FlowTests) == 0 {
		return nil
	}
	out := make([]calc.FlowCheck, 0, len(c.in.FlowTests))
	for _, t := range c.in.FlowTests {
		if q := t.Flow(); !(q > 0) || math.IsInf(q, 0) || !(t.Level >= 0) {
			continue // a bad entry never reaches the plan (the job check reports it)
		}
		lv := t.Level
		if lv <= 0 {
			lv = float64(c.p.Siphon.Geometry.Surface)
		}
		out = append(out, calc.FlowCheck{Flow: calc.FlowRate(t.Flow()), Level: calc.Length(lv), Weight: 1})
	}
	return out
}

// fitTests fits the siphon's losses to the flow tests, when there are any,
// and solves it again: the plan then runs at the flow the tests support.
// PlannedFlow keeps the flow as planned from the fittings, for the line
// that compares the two.
func (c *computer) fitTests() {
	p := &c.p
	p.Tests = c.flowChecks()
	if len(p.Tests) == 0 {
		return
	}
	fit := calc.FitToTests(p.Siphon, p.Tests, 1)
	r, err := calc.Solve(fit.Siphon)
	if err != nil {
		c.note("the flow tests could not be fitted: " + err.Error())
		p.Tests = nil
		return
	}
	p.PlannedFlow = p.Result.Flow
	p.Unfitted = p.Siphon
	p.TestFit = &fit
	p.Siphon = fit.Siphon
	p.Result = r
}

// PlannedDrain is the drain input as planned from the fittings: DrainIn
// with the siphon's losses as they were before the fit to the flow tests.
// The readings fit starts from it, so that it weighs the flow tests and the
// readings together rather than against a plan already fitted to the tests.
func (p Plan) PlannedDrain() calc.DrainInput {
	in := p.DrainIn
	if p.TestFit == nil {
		return in
	}
	g := in.Siphon.Geometry
	in.Siphon = p.Unfitted
	in.Siphon.Geometry = g
	return in
}

// tolTests adds the flow tests to a tolerance.
func (c *computer) tolTests(t *calc.Tolerance) {
	n := len(c.p.Tests)
	if n == 0 {
		return
	}
	var secs float64
	for _, f := range c.in.FlowTests {
		secs += f.Seconds
	}
	t.Tests = c.p.Tests
	t.TestUncertainty = calc.BucketUncertainty(bucketVolumeError, stopwatchError, secs/float64(len(c.in.FlowTests)), n)
}

// pumpFinish works out how long a pump of the rate typed takes to lift what
// the siphon leaves above the floor, against the inflow: t = V_left /
// (Q_pump − Qᵢₙ). PumpFinish is 0 when no rate is typed;
// PumpFallsBehind when the inflow matches or outruns the pump.
func (c *computer) pumpFinish() {
	p := &c.p
	v, ok := c.num(FieldPumpRate)
	if !ok || p.Drain == nil {
		return
	}
	p.PumpRate = calc.FlowRate(v)
	net := v - float64(p.Inflow.Total)
	if net <= 0 {
		p.PumpFallsBehind = true
		return
	}
	p.PumpFinish = calc.Seconds(float64(p.Drain.Residual) / net)
}
