package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"drawdown/calc"
	"drawdown/model"
)

// writeText prints the plan for people, in the chosen unit system.
func writeText(w io.Writer, p model.Plan, o calcOptions) {
	sys := o.units
	f := func(d model.Dim, v float64) string { return model.Format(d, v, sys) }
	r := p.Result
	s := p.Siphon
	g := s.Geometry

	verdict := strings.ToUpper(r.Verdict.String())
	switch r.Verdict {
	case calc.RunsNearLimit:
		verdict = "RUNS, NEAR THE CREST LIMIT"
	case calc.WillNotRun:
		verdict = "WILL NOT RUN — " + model.VerdictReason(r)
	default: // calc.Runs: the verdict word as it is
	}
	fmt.Fprintf(w, "Siphon: %s\n", verdict)
	row := func(label, text string) { fmt.Fprintf(w, "  %-10s %s\n", label, text) }

	row("Liquid", fmt.Sprintf("%s at %s: %s, %s, vapour pressure %s", p.Liquid.Name, f(model.DimTemperature, float64(p.Temperature)),
		f(model.DimDensity, float64(s.Fluid.Density)), f(model.DimViscosity, float64(s.Fluid.Viscosity)), f(model.DimPressure, float64(s.Fluid.VaporPressure))))
	site := "standard atmosphere at the site altitude"
	if p.FromBaro {
		site = "barometer reading"
	}
	row("Site", f(model.DimPressure, float64(s.AtmPressure))+" ("+site+")")
	row("Hose", fmt.Sprintf("%d × %s bore, %s long, %s (ε %s), ΣK %.2f", s.Hoses, f(model.DimDiameter, float64(s.Hose.Diameter)),
		f(model.DimLength, float64(s.Hose.Length)), p.Material.Name, f(model.DimRoughness, float64(s.Hose.Roughness)), s.Hose.KMinor()))
	row("Heights", fmt.Sprintf("lift %s over the crest, drop %s to the outlet, intake %s below the surface",
		f(model.DimLength, float64(g.Lift())), f(model.DimLength, float64(g.Drop())), f(model.DimLength, float64(g.IntakeDepth()))))
	if r.Verdict != calc.WillNotRun {
		row("Flow", fmt.Sprintf("%s (range %s to %s)", f(model.DimFlow, float64(r.Flow)), f(model.DimFlow, float64(p.FlowLow)), f(model.DimFlow, float64(p.FlowHigh))))
		row("Velocity", fmt.Sprintf("%s, %s (Re %s, Darcy f %.4f)", speed(float64(r.Velocity), sys), r.Regime, strconv.FormatFloat(r.Reynolds, 'f', 0, 64), r.FrictionFactor))
	}
	row("Crest", fmt.Sprintf("lift %s; working limit %s (margin %s); limit at this flow %s; theoretical %s",
		f(model.DimLength, float64(g.Lift())), f(model.DimLength, float64(r.WorkingCrestHeight)), f(model.DimLength, float64(r.CrestMargin)),
		f(model.DimLength, float64(r.FlowingCrestLimit)), f(model.DimLength, float64(r.MaxCrestHeight))))
	row("", "crest pressure "+f(model.DimPressure, float64(r.CrestPressure))+" absolute")
	row("Intake", fmt.Sprintf("needs %s of liquid over it against vortices; it is %s deep",
		f(model.DimLength, float64(r.RequiredSubmergence)), f(model.DimLength, float64(g.IntakeDepth()))))
	prime := f(model.DimVolume, float64(r.PrimingVolume)) + " to fill the hose"
	if s.Hoses > 1 {
		prime += "s"
	}
	if p.PumpStrokes > 0 {
		prime += fmt.Sprintf(", about %d hand-pump strokes", p.PumpStrokes)
	}
	row("Priming", prime)

	if d := p.Drain; d != nil {
		fmt.Fprintf(w, "Drain (%s)\n", strings.ReplaceAll(p.Tank.Shape(), "-", " "))
		row("Time", fmt.Sprintf("%s (range %s to %s)", model.FormatDuration(float64(d.Time)), model.FormatDuration(float64(p.TimeLow)), model.FormatDuration(float64(p.TimeHigh))))
		row("Stops at", fmt.Sprintf("%s above the floor: %s", f(model.DimLength, float64(d.StopLevel)), d.StopReason.Text()))
		row("Moved", fmt.Sprintf("%s; left in the tank %s", f(model.DimVolume, float64(d.Volume)), f(model.DimVolume, float64(d.Residual))))
		if p.Receiver != nil {
			row("Receiver", fmt.Sprintf("level %s above its floor at the stop (brim %s)", f(model.DimLength, float64(d.ReceiverLevel)),
				f(model.DimLength, float64(p.Receiver.Tank.Height()))))
		}
		if d.CrestLimitFound {
			row("Crest", "the crest would boil once the level falls to "+f(model.DimLength, float64(d.CrestLimitLevel)))
		}
		if o.curve {
			fmt.Fprintf(w, "\n  %12s  %12s  %14s\n", "time", "level", "flow")
			for _, pt := range d.Curve {
				fmt.Fprintf(w, "  %12s  %12s  %14s\n", model.FormatDuration(float64(pt.Time)), f(model.DimLength, float64(pt.Level)), f(model.DimFlow, float64(pt.Flow)))
			}
		}
	}
	if ws := r.WarningList(); len(ws) > 0 {
		fmt.Fprintln(w, "Warnings")
		for _, x := range ws {
			fmt.Fprintf(w, "  ! %s\n", x.Message)
		}
	}
	if len(p.Notes) > 0 {
		fmt.Fprintln(w, "Assumed")
		for _, n := range p.Notes {
			fmt.Fprintf(w, "  - %s\n", n)
		}
	}
	fmt.Fprintln(w, "Cautions")
	for _, c := range p.Cautions() {
		fmt.Fprintf(w, "  * %s\n", c)
	}
	fmt.Fprintln(w, "This is a plan, not a permit: local codes, permits and licensed practice govern entry,")
	fmt.Fprintln(w, "discharge and the handling of the liquid.")
}

func speed(v float64, sys model.System) string {
	if sys == model.US {
		return strconv.FormatFloat(v/0.3048, 'f', 2, 64) + " ft/s"
	}
	return strconv.FormatFloat(v, 'f', 2, 64) + " m/s"
}
