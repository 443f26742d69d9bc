package record

import (
	"fmt"
	"strconv"
	"strings"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

func (rw *recWriter) inputs(j model.Job, p model.Plan) {
	rw.line("## Inputs")
	rw.line("")
	rw.line("| Field | As typed | Value used |")
	rw.line("| --- | --- | --- |")
	n := 0
	for _, f := range model.Fields() {
		text := j.Text(f.ID)
		if strings.TrimSpace(text) == "" {
			continue
		}
		n++
		used := ""
		switch {
		case p.FieldErrors[f.ID] != nil:
			used = "not usable: " + p.FieldErrors[f.ID].Error()
		case f.IsPicker():
			used = text
		default:
			v, err := f.Validate(text, j.Units)
			if err != nil {
				used = "not usable: " + err.Error()
			} else {
				used = rw.f(f.Dim, v)
			}
		}
		rw.row(f.Label, text, used)
	}
	if n == 0 {
		rw.row("(nothing typed)", "", "")
	}
	rw.line("")
	if len(p.Notes) > 0 {
		rw.line("Assumed by the tool:")
		rw.line("")
		for _, s := range p.Notes {
			rw.line("- " + mdText(s))
		}
		rw.line("")
	}
}

func (rw *recWriter) plan(j model.Job, p model.Plan) {
	rw.line("## Plan")
	rw.line("")
	if p.Err != nil {
		rw.line("No plan could be computed: " + mdText(p.Err.Error()) + ".")
		rw.line("")
		return
	}
	if !planComputed(p) {
		rw.line("No plan was given with this record.")
		rw.line("")
		return
	}
	s := present.ForJob(j, p, rw.sys)
	rw.line("| Item | Value |")
	rw.line("| --- | --- |")
	rw.row("Verdict", s.Verdict.Line())
	if s.Fix != "" {
		rw.row("What to change", s.Fix)
	}
	for _, label := range []string{"Site", "Hose", "Heights"} {
		rw.row(label, s.Fact(label))
	}
	if s.Runs {
		flow := s.Flow
		if s.FlowRange != "" {
			flow += " (range " + s.FlowRange + ")"
		}
		rw.row("Flow at the start", flow)
		rw.row("Velocity", s.Speed)
		if s.FlowTest.Long != "" {
			rw.row("Flow tests against the plan", s.FlowTest.Long)
		}
	}
	c := s.Crest
	rw.row("Crest", c.Status.Symbol()+" "+c.Says[0])
	rw.row("Working crest height above the surface", c.Working)
	rw.row("Crest margin (working height less lift)", c.Margin)
	rw.row("Hose vacuum", s.Vacuum)
	if s.Throttle != "" {
		rw.row("Outlet throttle", s.Throttle)
	}
	rw.row("Intake", s.Fact("Intake"))
	rw.row("Priming", s.Fact("Priming"))
	if d := s.Drain; d != nil {
		tm := d.Time
		if d.TimeRange != "" {
			tm += " (range " + d.TimeRange + ")"
		}
		rw.row("Start level", rw.f(model.DimLength, float64(p.Siphon.Geometry.Surface)))
		rw.row("Time to the stop", tm)
		rw.row("Stop level", d.StopLevel)
		rw.row("Stop reason", d.StopLong)
		rw.row("Volume to move", d.Volume)
		rw.row("Volume left in the source", d.Residual)
		for _, line := range d.AirLines() {
			rw.row("Air and hose", line)
		}
		fc := d.Forecast
		if fc.Inflow != "" {
			rw.row("Inflow while draining", fc.Inflow)
			rw.row("Keeps up", fc.KeepsUp)
		}
		if fc.Time90 != "" {
			rw.row("Time to move 90 % of the volume", fc.Time90)
		}
		if fc.Finish != "" {
			rw.row("Likely stop level", fc.Finish)
		}
		if fc.Driver != "" {
			rw.row("Time range", fc.Driver+"; "+fc.Narrow)
		}
		if fc.Higher != "" {
			rw.row("Time range", fc.Higher)
		}
		if fc.Pump != "" {
			rw.row("Pump to finish", fc.Pump)
		}
	}
	rw.line("")
}

// planComputed tells a Plan from Compute (which always sets at least one
// hose) from a zero Plan.
func planComputed(p model.Plan) bool { return p.Err == nil && p.Siphon.Hoses >= 1 }

func (rw *recWriter) warnings(j model.Job, p model.Plan) {
	rw.line("## Warnings")
	rw.line("")
	var ws []present.Line
	if planComputed(p) {
		s := present.ForJob(j, p, rw.sys)
		for _, w := range s.Warnings {
			ws = append(ws, w.Line)
		}
		ws = append(ws, s.Hints...)
	}
	if len(ws) == 0 {
		rw.line("None from the plan.")
	}
	for _, w := range ws {
		rw.line("- " + w.Status.Symbol() + " " + mdText(w.Long))
	}
	rw.line("")
}

func (rw *recWriter) checklist(c model.Checklist) {
	rw.line("## Checklist")
	rw.line("")
	if len(c.Steps) == 0 {
		rw.line("No checklist was built for this job.")
		rw.line("")
		return
	}
	pr := c.Progress()
	rw.line(fmt.Sprintf("%d of %d steps marked: %d done, %d skipped, %d not applicable, %d still to do.",
		pr.Marked(), pr.Total, pr.Done, pr.Skipped, pr.NotApplicable, pr.Pending))
	rw.line("")
	for _, sec := range model.Sections() {
		first := true
		for i, s := range c.Steps {
			if s.Section != sec {
				continue
			}
			if first {
				rw.line("### " + sec.Title())
				rw.line("")
				rw.line("| # | Step | State | Time | Reason / note |")
				rw.line("| --- | --- | --- | --- | --- |")
				first = false
			}
			rw.row(strconv.Itoa(i+1), s.Text, stateWord(s.State), rw.clock(s.At), reasonNote(s))
		}
		if !first {
			rw.line("")
		}
	}
	if len(c.Dropped) > 0 {
		rw.line("### Steps marked earlier that no longer apply")
		rw.line("")
		rw.line("(The liquid or method changed after these were marked.)")
		rw.line("")
		rw.line("| Step | State | Time | Reason / note |")
		rw.line("| --- | --- | --- | --- |")
		for _, s := range c.Dropped {
			rw.row(s.Text, stateWord(s.State), rw.clock(s.At), reasonNote(s))
		}
		rw.line("")
	}
}

func stateWord(s model.StepState) string {
	if s == "" {
		return model.StatePending.Label()
	}
	return s.Label()
}

func reasonNote(s model.Step) string {
	var parts []string
	if s.Reason != "" {
		parts = append(parts, "reason: "+s.Reason)
	}
	if s.Note != "" {
		parts = append(parts, "note: "+s.Note)
	}
	if s.By != "" {
		parts = append(parts, "by: "+s.By)
	}
	return strings.Join(parts, "; ")
}

func (rw *recWriter) cautions(r Input, p model.Plan) {
	rw.line("## Cautions shown")
	rw.line("")
	seen := map[string]bool{}
	add := func(text, rule string) {
		text = strings.TrimSpace(text)
		if text == "" || seen[text] {
			return
		}
		seen[text] = true
		if rule != "" && rule != "common practice" {
			text += " (" + rule + ")"
		}
		rw.line("- " + mdText(text))
	}
	if planComputed(p) {
		for _, c := range present.Cautions(p) {
			add(c, "")
		}
	} else {
		add(presets.NeverByMouth, "")
	}
	for _, c := range r.Cautions {
		add(c, "")
	}
	for _, s := range r.Job.Checklist.Steps {
		add(s.Caution, s.Rule)
	}
	add(presets.DeferLocal, "")
	rw.line("")
}
