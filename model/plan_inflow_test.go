package model

import (
	"math"
	"testing"
	"time"

	"drawdown/presets"
)

// A flow test moves the demo's plan to the flow measured (the losses are
// fitted to it: calc.FitToTests) and narrows the time range; the readings
// fit still starts from the plan as the fittings give it.
func TestComputeFlowTests(t *testing.T) {
	cat := presets.Builtin()
	j := DemoJob()
	j.FlowTests = nil
	p0 := Compute(j, cat)
	if !p0.OK() || p0.Drain == nil {
		t.Fatal(p0.Err)
	}
	q := 0.9 * float64(p0.Result.Flow)
	j.FlowTests = []FlowTest{{At: time.Unix(1e9, 0), Volume: q * 12, Seconds: 12}}
	p1 := Compute(j, cat)
	if got := float64(p1.Result.Flow); math.Abs(got-q) > 2e-3*q {
		t.Errorf("flow after a test at 90 %%: %g m³/s, want %g (the fit reproduces the test)", got, q)
	}
	if p1.PlannedFlow != p0.Result.Flow {
		t.Errorf("planned flow %g, want %g", p1.PlannedFlow, p0.Result.Flow)
	}
	if w0, w1 := p0.TimeHigh-p0.TimeLow, p1.TimeHigh-p1.TimeLow; !(w1 < w0) {
		t.Errorf("time range %g s after the test, %g s before: want narrower", w1, w0)
	}
	if in := p1.PlannedDrain(); in.Siphon.Hose.KDownLeg != p0.DrainIn.Siphon.Hose.KDownLeg {
		t.Errorf("PlannedDrain keeps the fitted losses: K down-leg %g, planned %g", in.Siphon.Hose.KDownLeg, p0.DrainIn.Siphon.Hose.KDownLeg)
	}
}

// Rain on the demo bund: 10 mm/h on its 40 m² plan area is 6.67 L/min
// (definition: intensity × area), and the drain takes longer.
func TestComputeRain(t *testing.T) {
	cat := presets.Builtin()
	j := DemoJob()
	p0 := Compute(j, cat)
	j.Inputs[FieldRain] = "10 mm/h"
	p1 := Compute(j, cat)
	want := 0.010 / 3600 * 40
	if got := float64(p1.Inflow.Total); math.Abs(got-want) > 1e-12 {
		t.Errorf("inflow %g m³/s, want %g", got, want)
	}
	if !p1.Inflow.CatchmentIsTank || p1.DrainIn.Inflow != p1.Inflow.Total {
		t.Errorf("catchment %v, drain inflow %g", p1.Inflow, p1.DrainIn.Inflow)
	}
	if !(p1.Drain.Time > p0.Drain.Time) {
		t.Errorf("with rain %g s, dry %g s", p1.Drain.Time, p0.Drain.Time)
	}
	j.Inputs[FieldCatchment] = "600 m2"
	j.Inputs[FieldRain] = "25 mm/h"
	p2 := Compute(j, cat)
	if !p2.Drain.SettleFound {
		t.Errorf("25 mm/h on 600 m² (250 L/min) against an 82 L/min siphon: want the level to rise and settle; stop %q", p2.Drain.StopReason)
	}
}
