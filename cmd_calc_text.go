package main

import (
	"fmt"
	"io"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// writeText lays out the plan's sheet for people. Every word and figure
// comes from package present; this only arranges them. Its cyclomatic
// complexity (~27) is one condition per optional row, in print order.
func writeText(w io.Writer, p model.Plan, o calcOptions) {
	s := present.Build(p, o.units, p.Hazards)
	f := present.Figures{Sys: o.units}
	fmt.Fprintf(w, "Siphon: %s\n", s.Verdict.Line())
	row := func(label, text string) { fmt.Fprintf(w, "  %-10s %s\n", label, text) }
	if s.Fix != "" {
		row("Change", s.Fix)
	}
	fact := func(label string) { row(label, s.Fact(label)) }
	fact("Liquid")
	fact("Site")
	fact("Hose")
	fact("Heights")
	if s.Runs {
		flow := s.Flow
		if s.FlowRange != "" {
			flow += " (range " + s.FlowRange + ")"
		}
		row("Flow", flow)
		row("Velocity", s.Speed+" (Re "+s.Reynolds+", Darcy f "+s.Friction+")")
		if s.FlowTest.Long != "" {
			row("Tested", s.FlowTest.Long)
		}
	}
	c := s.Crest
	limits := "lift " + c.Lift + "; working limit " + c.Working + " (margin " + c.Margin + ")"
	if c.ShowThisFlow {
		limits += "; limit at this flow " + c.ThisFlow
	}
	limits += "; at zero flow " + c.NoFlow
	row("Crest", c.Status.Symbol()+" "+c.Says[0])
	row("", limits)
	row("", "crest pressure "+s.CrestPressure)
	fact("Vacuum")
	if s.Throttle != "" {
		row("Throttle", s.Throttle)
	}
	fact("Intake")
	fact("Priming")

	if d := s.Drain; d != nil {
		fmt.Fprintf(w, "Drain (%s)\n", d.Shape)
		tm := d.Time
		if d.TimeRange != "" {
			tm += " (range " + d.TimeRange + ")"
		}
		fc := d.Forecast
		row("Time", tm)
		if fc.Inflow != "" {
			row("Inflow", fc.Inflow)
			row("", fc.KeepsUp)
		}
		if fc.Time90 != "" {
			row("To 90 %", fc.Time90+" to move 90 % of it; the slow tail takes the rest")
		}
		if fc.Driver != "" {
			row("Range", fc.Driver+"; "+fc.Narrow)
		}
		if fc.Higher != "" {
			row("", fc.Higher)
		}
		stop := d.StopLevel + " above the floor"
		if fc.Finish != "" {
			stop += " (likely " + fc.Finish + ")"
		}
		row("Stops at", stop+": "+d.StopLong)
		row("Moved", d.Volume+"; left in the tank "+d.Residual)
		if fc.Pump != "" {
			row("Pump", fc.Pump)
		}
		for _, line := range d.AirLines() {
			row("Air", line)
		}
		if d.Receiver != "" {
			row("Receiver", "level "+d.Receiver)
		}
		if d.CrestBoils != "" {
			row("Crest", "the crest would boil once the level falls to "+d.CrestBoils)
		}
		if o.curve {
			fmt.Fprintf(w, "\n  %12s  %12s  %14s\n", "time", "level", "flow")
			for _, pt := range p.Drain.Curve {
				fmt.Fprintf(w, "  %12s  %12s  %14s\n", present.Duration(float64(pt.Time)),
					f.Of(model.DimLength, float64(pt.Level)), f.Of(model.DimFlow, float64(pt.Flow)))
			}
		}
	}
	if len(s.Warnings) > 0 || len(s.Hints) > 0 {
		fmt.Fprintln(w, "Warnings")
		for _, x := range s.Warnings {
			fmt.Fprintf(w, "  %s %s\n", x.Status.Symbol(), x.Long)
		}
		for _, x := range s.Hints {
			fmt.Fprintf(w, "  %s %s\n", x.Status.Symbol(), x.Long)
		}
	}
	if len(s.Notes) > 0 {
		fmt.Fprintln(w, "Assumed")
		for _, n := range s.Notes {
			fmt.Fprintf(w, "  - %s\n", n)
		}
	}
	fmt.Fprintln(w, "Cautions")
	for _, c := range s.Cautions {
		fmt.Fprintf(w, "  * %s\n", c)
	}
	fmt.Fprintln(w, presets.PlanNotPermit)
}
