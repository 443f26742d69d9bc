package model

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"drawdown/calc"
)

// The job record: a Markdown document a supervisor or a compliance officer
// can read on its own, long after the job (field-practice §5: identity,
// times with their zone, what went where, condition checks, quantities,
// safety steps, exceptions, sign-off), and a CSV of the level readings and
// the planned curve. Both are written from a ReportInput; nothing here reads
// a clock or a file.

// ReportInput is everything a record is written from.
type ReportInput struct {
	Job  Job
	Plan Plan // Compute(Job, catalogue)
	// Fit, when nil, is computed from the job's readings and Plan.DrainIn
	// (when there are at least two readings and a drain plan).
	Fit *Fit
	// Cautions lists cautions shown on screen that are not checklist
	// cautions (the caller's list, e.g. the liquid's hazard lines); each is
	// printed once.
	Cautions []string
	// Now is when the record is written. Its location is the record's time
	// zone: every time in the record is shown in it, with its offset.
	Now time.Time
}

// recordDisclaimer closes every record.
const recordDisclaimer = "This record plans and records the job. It does not authorise a discharge " +
	"and does not declare any space, liquid or discharge safe; local codes, permits, the site's " +
	"written program and licensed practice govern."

// timeLayout shows date, time, zone abbreviation and offset, so an entry
// stands alone (field-practice §5.2).
const timeLayout = "2006-01-02 15:04 MST (UTC-07:00)"

// WriteReport writes the Markdown record of r. It returns the first write
// error. It never prints NaN or Inf: a value that cannot be given is shown as
// "—" or explained.
func WriteReport(w io.Writer, r ReportInput) error {
	rw := &recWriter{w: bufio.NewWriter(w), loc: r.Now.Location(), sys: r.Job.Units}
	if rw.loc == nil {
		rw.loc = time.UTC
	}
	j := r.Job
	p := r.Plan

	name := j.Name
	if strings.TrimSpace(name) == "" {
		name = "(unnamed job)"
	}
	rw.line("# Drain record: " + oneLine(name))
	rw.line("")
	rw.line("Record written " + rw.tm(r.Now) + ". Unit system: " + j.Units.String() +
		". All times are shown in " + zoneName(r.Now) + ".")
	rw.line("")

	// Identity and times.
	rw.line("## Job")
	rw.line("")
	rw.line("| Item | Entry |")
	rw.line("| --- | --- |")
	rw.row("Job", name)
	rw.row("Site", orDash(j.Site))
	rw.row("Location", orDash(j.Location))
	rw.row("Crew", orDash(j.Crew))
	if p.Liquid.Name != "" {
		rw.row("Liquid", p.Liquid.Name)
	} else {
		rw.row("Liquid", orDash(j.Text(FieldLiquid)))
	}
	if p.Liquid.Name != "" || p.Hazards != 0 {
		rw.row("Liquid hazard tags", p.Hazards.String())
	}
	ctx := j.Checklist.Context
	if hz := ctx.Hazards.List(); len(hz) > 0 {
		rw.row("Hazards the checklist is built for", strings.Join(hz, ", "))
	}
	if ctx.Discharge != "" {
		rw.row("Discharge to", ctx.Discharge.Label())
	}
	if ctx.SheenSeen {
		if ctx.Held() {
			rw.row("Sheen, odour or discoloration", "recorded: release held, liquid to be collected")
		} else {
			rw.row("Sheen, odour or discoloration", "recorded")
		}
	}
	rw.row("Confined space", yesNo(ctx.ConfinedSpace))
	if ctx.Method != "" {
		rw.row("Priming method", ctx.Method.Label())
	} else if m := j.Text(FieldPriming); m != "" {
		rw.row("Priming method", m)
	}
	rw.row("Job created", rw.tmOr(j.Created, "not recorded"))
	started := flowStart(j)
	rw.row("Flow started", rw.tmOr(started, "not recorded"))
	stopped := flowStop(j)
	rw.row("Flow stopped", rw.tmOr(stopped, "not recorded"))
	if !started.IsZero() && !stopped.IsZero() && stopped.After(started) {
		rw.row("Running time", FormatDuration(stopped.Sub(started).Seconds()))
	}
	rw.row("Job closed out", rw.tmOr(j.Closed, "not yet: checklist steps still to do"))
	rw.line("")

	rw.inputs(j, p)
	rw.plan(p)
	rw.warnings(p)
	rw.checklist(j.Checklist)
	fit, fitErr := r.fit()
	rw.readings(j, p, started, fit, fitErr)
	rw.volume(j, p)
	rw.log(j)

	rw.line("## Notes")
	rw.line("")
	if strings.TrimSpace(j.Notes) == "" {
		rw.line("None.")
	} else {
		lines := strings.Split(strings.TrimSpace(j.Notes), "\n")
		for i, l := range lines {
			if i < len(lines)-1 {
				rw.line(mdText(l) + "  ") // Markdown line break
			} else {
				rw.line(mdText(l))
			}
		}
	}
	rw.line("")

	rw.cautions(r, p)

	// Sign-off (field-practice §5.1): the step's note if the crew recorded
	// it, and lines to sign on paper.
	rw.line("## Sign-off")
	rw.line("")
	if i := j.Checklist.Index("closeout.signoff"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
		s := j.Checklist.Steps[i]
		rw.line("Recorded in the checklist at " + rw.tm(s.At) + ": " + mdText(orDash(s.Note)) + ".")
		rw.line("")
	}
	rw.line("Work done by (name, signature, date): ______________________________")
	rw.line("")
	rw.line("Supervisor or inspector (name, signature, date): ______________________________")
	rw.line("")

	rw.line("---")
	rw.line("")
	rw.line(recordDisclaimer)
	if rw.err != nil {
		return rw.err
	}
	return rw.w.Flush()
}

// fit returns r.Fit, or fits the job's readings to the plan.
func (r ReportInput) fit() (*Fit, error) {
	if r.Fit != nil {
		return r.Fit, nil
	}
	if len(r.Job.Readings) == 0 {
		return nil, nil
	}
	if !planComputed(r.Plan) {
		return nil, errors.New("no plan to compare with (the plan could not be computed)")
	}
	if r.Plan.Drain == nil || r.Plan.DrainIn.Tank == nil {
		return nil, errors.New("no drain plan to compare with (the tank is not described)")
	}
	f, err := FitReadings(r.Job.Readings, DrainSimulator(r.Plan.DrainIn),
		FitOptions{SumK: r.Plan.Siphon.Hose.KMinor()})
	if err != nil {
		return nil, err
	}
	return &f, nil
}

// flowStart is the job's start time, or the time the "flow started" step
// was marked done.
func flowStart(j Job) time.Time {
	if !j.Started.IsZero() {
		return j.Started
	}
	if i := j.Checklist.Index("run.start"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
		return j.Checklist.Steps[i].At
	}
	return time.Time{}
}

// flowStop is the job's stop time, or the time the "record the stop" step
// was marked done.
func flowStop(j Job) time.Time {
	if !j.Stopped.IsZero() {
		return j.Stopped
	}
	if i := j.Checklist.Index("stop.record"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
		return j.Checklist.Steps[i].At
	}
	return time.Time{}
}

type recWriter struct {
	w   *bufio.Writer
	err error
	loc *time.Location
	sys System
}

func (rw *recWriter) line(s string) {
	if rw.err != nil {
		return
	}
	_, rw.err = rw.w.WriteString(s + "\n")
}

func (rw *recWriter) row(cells ...string) {
	for i, c := range cells {
		cells[i] = cell(c)
	}
	rw.line("| " + strings.Join(cells, " | ") + " |")
}

func (rw *recWriter) tm(t time.Time) string { return t.In(rw.loc).Format(timeLayout) }

func (rw *recWriter) tmOr(t time.Time, none string) string {
	if t.IsZero() {
		return none
	}
	return rw.tm(t)
}

// clock is the short time for table rows: date only when it differs from
// the day before.
func (rw *recWriter) clock(t time.Time) string {
	if t.IsZero() {
		return "—"
	}
	return t.In(rw.loc).Format("2006-01-02 15:04")
}

func (rw *recWriter) f(d Dim, si float64) string { return Format(d, si, rw.sys) }

// level shows a level reading to the millimetre (SI) or the hundredth of a
// foot (US), finer than Format's field rounding, so that readings a few
// millimetres apart stay distinct in the record.
func (rw *recWriter) level(si float64) string {
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return "—"
	}
	if rw.sys == US {
		return trimNegZero(strconv.FormatFloat(si/0.3048, 'f', 2, 64)) + " ft"
	}
	return trimNegZero(strconv.FormatFloat(si, 'f', 3, 64)) + " m"
}

func trimNegZero(s string) string {
	if strings.HasPrefix(s, "-") && strings.Trim(s[1:], "0.") == "" {
		return s[1:]
	}
	return s
}

func (rw *recWriter) inputs(j Job, p Plan) {
	rw.line("## Inputs")
	rw.line("")
	rw.line("| Field | As typed | Value used |")
	rw.line("| --- | --- | --- |")
	n := 0
	for _, f := range Fields() {
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

// stopReasonText words a calc stop reason for the record.
func stopReasonText(s string) string {
	switch calc.StopReason(s) {
	case calc.StopTarget:
		return "target level reached"
	case calc.StopIntake:
		return "intake would draw air: level at intake plus required submergence"
	case calc.StopAir:
		return "air drawn in at the intake would not be cleared"
	case calc.StopCrest:
		return "crest pressure limit reached as the lift grew"
	case calc.StopEqual:
		return "levels equal; flow tapers to nothing"
	case calc.StopReceiverFull:
		return "receiving vessel full"
	case "":
		return "—"
	}
	return s
}

func (rw *recWriter) plan(p Plan) {
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
	r := p.Result
	rw.line("| Item | Value |")
	rw.line("| --- | --- |")
	verdict := r.Verdict.String()
	if r.Verdict == calc.WillNotRun && r.Why != 0 {
		verdict += " (" + r.Why.String() + ")"
	}
	rw.row("Verdict", verdict)
	baro := " (standard atmosphere at the site altitude)"
	if p.FromBaro {
		baro = " (barometer reading)"
	}
	rw.row("Barometric pressure", rw.f(DimPressure, float64(p.AtmPressure))+baro)
	if r.Verdict != calc.WillNotRun {
		flow := rw.f(DimFlow, float64(r.Flow))
		if p.FlowLow > 0 && p.FlowHigh > 0 {
			flow += " (range " + rw.f(DimFlow, float64(p.FlowLow)) + " to " + rw.f(DimFlow, float64(p.FlowHigh)) + ")"
		}
		rw.row("Flow at the start", flow)
		rw.row("Flow regime", r.Regime.String())
	}
	rw.row("Driving head (drop)", rw.f(DimLength, float64(r.Head)))
	rw.row("Working crest height above the surface", rw.f(DimLength, float64(r.WorkingCrestHeight)))
	rw.row("Crest margin (working height less lift)", rw.f(DimLength, float64(r.CrestMargin)))
	rw.row("Hose volume to prime", rw.f(DimVolume, float64(r.PrimingVolume)))
	if p.PumpStrokes > 0 {
		rw.row("Hand-pump strokes to prime", strconv.Itoa(p.PumpStrokes))
	}
	if d := p.Drain; d != nil {
		tm := FormatDuration(float64(d.Time))
		if p.TimeLow > 0 && p.TimeHigh > 0 {
			tm += " (range " + FormatDuration(float64(p.TimeLow)) + " to " + FormatDuration(float64(p.TimeHigh)) + ")"
		}
		rw.row("Start level", rw.f(DimLength, float64(p.Siphon.Geometry.Surface)))
		rw.row("Time to the stop", tm)
		rw.row("Stop level", rw.f(DimLength, float64(d.StopLevel)))
		rw.row("Stop reason", stopReasonText(string(d.StopReason)))
		rw.row("Volume to move", rw.f(DimVolume, float64(d.Volume)))
		rw.row("Volume left in the source", rw.f(DimVolume, float64(d.Residual)))
	}
	rw.line("")
}

// planComputed tells a Plan from Compute (which always sets at least one
// hose) from a zero Plan.
func planComputed(p Plan) bool { return p.Err == nil && p.Siphon.Hoses >= 1 }

func (rw *recWriter) warnings(p Plan) {
	rw.line("## Warnings")
	rw.line("")
	var ws []calc.Warning
	if planComputed(p) {
		ws = p.Result.WarningList()
	}
	if len(ws) == 0 {
		rw.line("None from the plan.")
	}
	for _, w := range ws {
		rw.line("- `" + w.Code.String() + "`: " + mdText(w.Message) + " (SI units)")
	}
	rw.line("")
}

func (rw *recWriter) checklist(c Checklist) {
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
	for _, sec := range Sections() {
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

func stateWord(s StepState) string {
	if s == "" {
		return StatePending.Label()
	}
	return s.Label()
}

func reasonNote(s Step) string {
	var parts []string
	if s.Reason != "" {
		parts = append(parts, "reason: "+s.Reason)
	}
	if s.Note != "" {
		parts = append(parts, "note: "+s.Note)
	}
	return strings.Join(parts, "; ")
}

func (rw *recWriter) readings(j Job, p Plan, start time.Time, fit *Fit, fitErr error) {
	rw.line("## Level readings against the plan")
	rw.line("")
	if len(j.Readings) == 0 {
		rw.line("No level readings were entered.")
		rw.line("")
		return
	}
	rs := sortedReadings(j.Readings)
	var plan DrainCurve
	if p.Drain != nil {
		plan = PlanCurve(*p.Drain)
	}
	if start.IsZero() && len(plan.Times) > 0 {
		rw.line("Flow start time not recorded: the plan is aligned on the first reading's level.")
		rw.line("")
	}
	rw.line("| Time | Level | Planned | Observed − planned | Note |")
	rw.line("| --- | --- | --- | --- | --- |")
	for _, r := range rs {
		planned, diff := "—", "—"
		if lv, ok := PlannedAt(plan, start, rs[0], r.At); ok {
			planned = rw.level(lv)
			diff = signed(rw.level(r.Level - lv))
		}
		rw.row(rw.clock(r.At), rw.level(r.Level), planned, diff, r.Note)
	}
	rw.line("")
	switch {
	case fitErr != nil:
		rw.line("Comparison with the plan: " + mdText(fitErr.Error()) + ".")
	case fit != nil:
		rw.line("Comparison with the plan (fitted to " + strconv.Itoa(fit.N) + " readings):")
		rw.line("")
		rw.line("- " + mdText(fit.Message) + ".")
		rw.line("- Effective extra loss coefficient ΔK: " + strconv.FormatFloat(fit.ExtraK, 'f', 2, 64) +
			"; level residual " + rw.level(fit.RMS) + " RMS (plan as typed: " + rw.level(fit.PlanRMS) + ").")
		if fit.Stopped {
			rw.line("- The readings show the drain at its stop: " + rw.level(fit.StopLevel) +
				" (" + stopReasonText(fit.Stop) + "), reached about " + rw.tm(fit.Finish) + ".")
		} else {
			rw.line("- Re-predicted from the last reading: stop at " + rw.level(fit.StopLevel) +
				" (" + stopReasonText(fit.Stop) + ") about " + rw.tm(fit.Finish) + ".")
		}
		if fit.SlowingJudged {
			state := "not slowing faster than planned"
			if fit.Slowing {
				state = "SLOWING faster than planned: check for air at the crest or a clogging intake"
			}
			rw.line(fmt.Sprintf("- Recent readings: %s (recent fall %.0f %% of what the earlier readings predict).", state, 100*fit.RecentRatio))
		}
	}
	rw.line("")
}

func sortedReadings(in []Reading) []Reading {
	rs := append([]Reading(nil), in...)
	for i := 1; i < len(rs); i++ { // insertion sort: few readings, stable
		for k := i; k > 0 && rs[k].At.Before(rs[k-1].At); k-- {
			rs[k], rs[k-1] = rs[k-1], rs[k]
		}
	}
	return rs
}

func signed(s string) string {
	if strings.HasPrefix(s, "-") || s == "—" {
		return s
	}
	if strings.Trim(strings.Fields(s)[0], "0.") == "" {
		return s
	}
	return "+" + s
}

func (rw *recWriter) volume(j Job, p Plan) {
	rw.line("## Volume discharged")
	rw.line("")
	planned := ""
	if p.Drain != nil {
		planned = " The plan moves " + rw.f(DimVolume, float64(p.Drain.Volume)) + " to its stop."
	}
	if p.Tank == nil {
		rw.line("Not estimated: the tank is not described." + planned)
		rw.line("")
		return
	}
	if len(j.Readings) == 0 {
		rw.line("Not estimated: no level readings." + planned)
		rw.line("")
		return
	}
	rs := sortedReadings(j.Readings)
	start := float64(p.Siphon.Geometry.Surface)
	end := rs[len(rs)-1].Level
	v := float64(p.Tank.Volume(calc.Length(start)) - p.Tank.Volume(calc.Length(end)))
	if !(v > 0) {
		v = 0
	}
	rw.line("Estimated " + rw.f(DimVolume, v) + ": from the starting level " + rw.level(start) +
		" to the last reading " + rw.level(end) + " (" + rw.clock(rs[len(rs)-1].At) + "), over the tank shape as described." + planned)
	rw.line("")
}

func (rw *recWriter) log(j Job) {
	if len(j.Log) == 0 {
		return
	}
	rw.line("## Log")
	rw.line("")
	rw.line("| Time | Entry |")
	rw.line("| --- | --- |")
	for _, e := range j.Log {
		rw.row(rw.clock(e.At), e.Text)
	}
	rw.line("")
}

func (rw *recWriter) cautions(r ReportInput, p Plan) {
	rw.line("## Cautions shown")
	rw.line("")
	seen := map[string]bool{}
	add := func(text, rule string) {
		text = strings.TrimSpace(text)
		if text == "" || seen[text] {
			return
		}
		seen[text] = true
		if rule != "" && rule != rulePractice {
			text += " (" + rule + ")"
		}
		rw.line("- " + mdText(text))
	}
	for _, h := range p.Hazards.List() {
		add(h.Description(), "")
	}
	if p.Liquid.Note != "" {
		add(p.Liquid.Note, "")
	}
	for _, c := range r.Cautions {
		add(c, "")
	}
	for _, s := range r.Job.Checklist.Steps {
		add(s.Caution, s.Rule)
	}
	add("Never start a siphon by mouth.", "")
	add(deferLocal, "")
	rw.line("")
}

// cell makes text safe inside a Markdown table cell.
func cell(s string) string {
	s = strings.ReplaceAll(s, "\r\n", " ")
	s = strings.ReplaceAll(s, "\n", " ")
	s = strings.ReplaceAll(s, "|", `\|`)
	return strings.TrimSpace(s)
}

// mdText keeps free text from breaking the record's structure: one line, no
// leading heading or list markers.
func mdText(s string) string {
	s = oneLine(s)
	if strings.HasPrefix(s, "#") || strings.HasPrefix(s, "---") {
		s = `\` + s
	}
	return s
}

func oneLine(s string) string {
	return strings.TrimSpace(strings.Join(strings.Fields(s), " "))
}

func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func zoneName(t time.Time) string {
	name, off := t.Zone()
	sign := "+"
	if off < 0 {
		sign, off = "-", -off
	}
	return fmt.Sprintf("%s (UTC%s%02d:%02d)", name, sign, off/3600, off%3600/60)
}

// WriteReadingsCSV writes the job's level readings and the planned curve as
// CSV, SI units named in the headers:
//
//	kind,time,elapsed_s,level_m,planned_level_m,note
//
// kind is "reading" or "plan". time is RFC 3339 in r.Now's zone, empty for
// plan points when neither a start time nor a reading fixes the clock.
// elapsed_s counts from the flow start (or, without one, from the first
// reading for readings and from the plan's start for plan points). level_m is
// the observed level (reading rows only); planned_level_m is the plan's level
// at that time (empty when the plan cannot be placed on the clock).
func WriteReadingsCSV(w io.Writer, r ReportInput) error {
	loc := r.Now.Location()
	if loc == nil {
		loc = time.UTC
	}
	cw := csv.NewWriter(w)
	num := func(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
	_ = cw.Write([]string{"kind", "time", "elapsed_s", "level_m", "planned_level_m", "note"})
	rs := sortedReadings(r.Job.Readings)
	start := flowStart(r.Job)
	var plan DrainCurve
	if r.Plan.Drain != nil {
		plan = PlanCurve(*r.Plan.Drain)
	}
	origin := start
	if origin.IsZero() && len(rs) > 0 {
		origin = rs[0].At
	}
	for _, rd := range rs {
		planned := ""
		if len(rs) > 0 {
			if lv, ok := PlannedAt(plan, start, rs[0], rd.At); ok {
				planned = num(round6(lv))
			}
		}
		_ = cw.Write([]string{"reading", rd.At.In(loc).Format(time.RFC3339), num(round3(rd.At.Sub(origin).Seconds())),
			num(round6(rd.Level)), planned, rd.Note})
	}
	// Plan points on the clock: from the start time, or placed so that the
	// plan passes the first reading's level at its time.
	var planZero time.Time
	switch {
	case !start.IsZero():
		planZero = start
	case len(rs) > 0:
		if t0, ok := plan.TimeAt(rs[0].Level); ok {
			planZero = rs[0].At.Add(-secondsDuration(t0))
		}
	}
	for i := range plan.Times {
		ts := ""
		if !planZero.IsZero() {
			ts = planZero.Add(secondsDuration(plan.Times[i])).In(loc).Format(time.RFC3339)
		}
		_ = cw.Write([]string{"plan", ts, num(round3(plan.Times[i])), "", num(round6(plan.Levels[i])), ""})
	}
	cw.Flush()
	return cw.Error()
}

func round3(v float64) float64 { return math.Round(v*1e3) / 1e3 }
func round6(v float64) float64 { return math.Round(v*1e6) / 1e6 }
