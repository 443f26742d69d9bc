package model

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"drawdown/calc"
)

// DrainCurve is a simulated drain: levels (m) at times (s) counted from the
// start level, times increasing, the last point at the stop; Flows (m³/s)
// is the siphon's outflow at each point (nil when the simulator does not
// give it; flow tests then cannot join a fit). Stop is the stop reason code
// (target, intake, crest, equal, settles) when the simulator knows it.
type DrainCurve struct {
	Times  []float64
	Levels []float64
	Flows  []float64
	Stop   string
}

// LevelAt interpolates the curve linearly at t seconds; before the start it
// gives the first level and after the stop the stop level. An empty curve
// gives NaN (callers check Len first).
func (c DrainCurve) LevelAt(t float64) float64 {
	n := min(len(c.Times), len(c.Levels))
	if n == 0 {
		return math.NaN()
	}
	if t <= c.Times[0] {
		return c.Levels[0]
	}
	if t >= c.Times[n-1] {
		return c.Levels[n-1]
	}
	i, _ := slices.BinarySearch(c.Times[:n], t)
	// c.Times[i-1] < t ≤ c.Times[i]
	t0, t1 := c.Times[i-1], c.Times[i]
	if t1 <= t0 {
		return c.Levels[i]
	}
	return c.Levels[i-1] + (c.Levels[i]-c.Levels[i-1])*(t-t0)/(t1-t0)
}

// TimeAt is the first time (s) at which the curve falls to level h, and
// false when it never does.
func (c DrainCurve) TimeAt(h float64) (float64, bool) {
	n := min(len(c.Times), len(c.Levels))
	if n == 0 || c.Levels[0] < h {
		return 0, false
	}
	for i := 1; i < n; i++ {
		if c.Levels[i] <= h {
			l0, l1 := c.Levels[i-1], c.Levels[i]
			if l0 == l1 {
				return c.Times[i], true
			}
			return c.Times[i-1] + (c.Times[i]-c.Times[i-1])*(l0-h)/(l0-l1), true
		}
	}
	return 0, false
}

// FlowAtLevel is the siphon's flow where the curve passes level h,
// interpolated linearly in level: the first flow above the start level, the
// last below the stop. ok is false without flows.
func (c DrainCurve) FlowAtLevel(h float64) (float64, bool) {
	n := min(len(c.Levels), len(c.Flows))
	if n == 0 {
		return 0, false
	}
	if h >= c.Levels[0] {
		return c.Flows[0], true
	}
	for i := 1; i < n; i++ {
		if c.Levels[i] <= h {
			l0, l1 := c.Levels[i-1], c.Levels[i]
			if l0 == l1 {
				return c.Flows[i], true
			}
			return c.Flows[i-1] + (c.Flows[i]-c.Flows[i-1])*(l0-h)/(l0-l1), true
		}
	}
	return c.Flows[n-1], true
}

// End is the time of the last point (the stop), s.
func (c DrainCurve) End() float64 {
	if len(c.Times) == 0 {
		return 0
	}
	return c.Times[len(c.Times)-1]
}

// FitParams are what a fit may change in the plan: the extra loss
// coefficient ΔK added to the run's ΣK (≥ 0) and the inflow into the
// source, m³/s (≥ 0).
type FitParams struct {
	ExtraK float64
	Inflow float64
}

// Simulator runs the planned drain from startLevel (m) with the parameters
// p and returns the curve with times counted from that start. ΔK = 0 with
// the plan's inflow is the plan.
type Simulator func(p FitParams, startLevel float64) (DrainCurve, error)

// DurationOf converts seconds to a Duration, saturating instead of
// overflowing (a drain of centuries is still a finite answer).
func DurationOf(s float64) time.Duration {
	const maxS = float64(math.MaxInt64/int64(time.Second)) - 1
	switch {
	case math.IsNaN(s) || s <= 0:
		return 0
	case s >= maxS:
		return time.Duration(maxS) * time.Second
	}
	return time.Duration(s * float64(time.Second))
}

// PlannedAt returns the plan's level at time t, given the planned curve
// (started at start, the time flow started). With a zero start the curve is
// aligned on the first reading instead: its time is placed where the plan
// passes its level. ok is false when neither alignment is possible.
func PlannedAt(plan DrainCurve, start time.Time, first Reading, t time.Time) (level float64, ok bool) {
	if len(plan.Times) == 0 || len(plan.Times) != len(plan.Levels) {
		return 0, false
	}
	if !start.IsZero() {
		return plan.LevelAt(t.Sub(start).Seconds()), true
	}
	if first.At.IsZero() {
		return 0, false
	}
	t0, found := plan.TimeAt(first.Level)
	if !found {
		if first.Level > plan.Levels[0] {
			t0 = 0
		} else {
			return 0, false
		}
	}
	return plan.LevelAt(t0 + t.Sub(first.At).Seconds()), true
}

// DrainSimulator wraps calc.PlanDrain as a Simulator for the planned drain
// in: each call re-plans from startLevel with p.ExtraK added to the hose's
// down-leg fittings (KDownLeg) and p.Inflow as the drain's inflow
// (calc.DrainInput.Inflow). The extra loss lowers the flow but leaves the
// crest-pressure check as planned: a loss at a clogging intake would also
// lower the crest pressure, but the fit cannot tell where the loss sits, so
// the re-predicted crest stop is the plan's. A negative ΔK or inflow is an
// error (the fit never reports a negative loss).
//
// With a receiver, the receiver's starting level is moved up by the volume
// the source has already lost between the planned start level and
// startLevel (a volume balance on the two tanks). A startLevel at or below
// the target gives a one-point curve (nothing left to drain).
func DrainSimulator(in calc.DrainInput) Simulator {
	base := in
	return func(p FitParams, startLevel float64) (DrainCurve, error) {
		for _, v := range []float64{p.ExtraK, p.Inflow, startLevel} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return DrainCurve{}, errors.New("simulate drain: extra loss, inflow or start level not finite")
			}
		}
		if p.ExtraK < 0 || p.Inflow < 0 {
			return DrainCurve{}, fmt.Errorf("simulate drain: extra loss %g and inflow %g m³/s must not be negative", p.ExtraK, p.Inflow)
		}
		d := base
		d.Siphon.Hose.KDownLeg += p.ExtraK
		d.Inflow = calc.FlowRate(p.Inflow)
		if d.Tank != nil && startLevel > float64(d.Tank.Height()) {
			startLevel = float64(d.Tank.Height())
		}
		switch {
		case startLevel <= float64(d.Target):
			return DrainCurve{Times: []float64{0}, Levels: []float64{startLevel}, Flows: []float64{0}, Stop: string(calc.StopTarget)}, nil
		case startLevel <= float64(d.Siphon.Geometry.Intake):
			return DrainCurve{Times: []float64{0}, Levels: []float64{startLevel}, Flows: []float64{0}, Stop: string(calc.StopIntake)}, nil
		}
		if d.Receiver != nil && d.Tank != nil {
			r := *d.Receiver
			moved := d.Tank.Volume(d.Siphon.Geometry.Surface) - d.Tank.Volume(calc.Length(startLevel))
			if moved > 0 && r.Tank != nil {
				r.Level = calc.LevelForVolume(r.Tank, r.Tank.Volume(r.Level)+moved)
			}
			d.Receiver = &r
		}
		d.Siphon.Geometry.Surface = calc.Length(startLevel)
		pl, err := calc.PlanDrain(d)
		if err != nil {
			return DrainCurve{}, err
		}
		c := PlanCurve(pl)
		if len(c.Times) == 0 {
			c.Times, c.Levels, c.Flows = []float64{0}, []float64{startLevel}, []float64{float64(pl.StartFlow)}
		}
		return c, nil
	}
}

// PlanCurve converts a calc drain plan's curve to a DrainCurve (for the
// record and the planned-versus-observed comparison).
func PlanCurve(p calc.DrainPlan) DrainCurve {
	c := DrainCurve{Stop: string(p.StopReason)}
	c.Times = make([]float64, 0, len(p.Curve))
	c.Levels = make([]float64, 0, len(p.Curve))
	c.Flows = make([]float64, 0, len(p.Curve))
	for _, pt := range p.Curve {
		c.Times = append(c.Times, float64(pt.Time))
		c.Levels = append(c.Levels, float64(pt.Level))
		c.Flows = append(c.Flows, float64(pt.Flow))
	}
	return c
}
