package record

import (
	"bufio"
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// Input is everything a record is written from.
type Input struct {
	Job  model.Job
	Plan model.Plan // model.Compute(model.Job, catalogue)
	// Fit, when nil, is computed from the job's readings and Plan.DrainIn
	// (when there are at least two readings and a drain plan).
	Fit *model.Fit
	// Cautions lists cautions shown on screen that are not checklist
	// cautions (the caller's list, e.g. the liquid's hazard lines); each is
	// printed once.
	Cautions []string
	// Now is when the record is written. Its location is the record's time
	// zone: every time in the record is shown in it, with its offset.
	Now time.Time
}

// timeLayout shows date, time, zone abbreviation and offset, so an entry
// stands alone (field-practice §5.2).
const timeLayout = "2006-01-02 15:04 MST (UTC-07:00)"

// Write writes the Markdown record of r. It returns the first write
// error. It never prints NaN or Inf: a value that cannot be given is shown as
// "—" or explained.
func Write(w io.Writer, r Input) error {
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
	rw.line("# Drain record: " + mdText(name))
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
	rw.row("Date of the work", orDash(j.Date))
	rw.row("Crew (role)", orDash(j.CrewText()))
	rw.row("Responsible supervisor", orDash(j.Supervisor))
	rw.row("Source vessel", orDash(j.Source))
	rw.row("Where it goes", orDash(j.Receiver))
	if p.Liquid.Name != "" {
		rw.row("Liquid", p.Liquid.Name)
	} else {
		rw.row("Liquid", orDash(j.Text(model.FieldLiquid)))
	}
	if p.Liquid.Name != "" || p.Hazards != 0 {
		rw.row("Liquid hazard tags", p.Hazards.String())
	}
	ctx := j.Checklist.Context
	if ctx.Hazards != 0 {
		rw.row("Hazards the checklist is built for", ctx.Hazards.String())
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
	} else if m := j.Text(model.FieldPriming); m != "" {
		rw.row("Priming method", m)
	}
	rw.row("Job created", rw.tmOr(j.Created, "not recorded"))
	started := flowStart(j)
	rw.row("Flow started", rw.tmOr(started, "not recorded"))
	stopped := flowStop(j)
	rw.row("Flow stopped", rw.tmOr(stopped, "not recorded"))
	if !started.IsZero() && !stopped.IsZero() && stopped.After(started) {
		rw.row("Running time", present.Duration(stopped.Sub(started).Seconds()))
	}
	rw.row("Job closed out", rw.tmOr(j.Closed, "not yet: checklist steps still to do"))
	rw.line("")

	rw.inputs(j, p)
	rw.plan(j, p)
	rw.warnings(j, p)
	rw.checklist(j.Checklist)
	fit, fitErr := r.fit()
	rw.readings(j, p, started, fit, fitErr)
	rw.flowTests(j)
	rw.volume(j, p)
	if ctx.OilCheck || j.Release.Recorded() {
		rw.release(j)
	}
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
	if i := j.Checklist.Index("closeout.signoff"); i >= 0 && j.Checklist.Steps[i].State == model.StateDone {
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
	rw.line(presets.RecordDisclaimer)
	if rw.err != nil {
		return rw.err
	}
	return rw.w.Flush()
}

// fit returns r.Fit, or fits the job's readings to the plan.
func (r Input) fit() (*model.Fit, error) {
	if r.Fit != nil {
		return r.Fit, nil
	}
	if len(r.Job.Readings) == 0 && len(r.Job.FlowTests) == 0 {
		return nil, nil
	}
	if !planComputed(r.Plan) {
		return nil, errors.New("no plan to compare with (the plan could not be computed)")
	}
	if r.Plan.Drain == nil || r.Plan.DrainIn.Tank == nil {
		return nil, errors.New("no drain plan to compare with (the tank is not described)")
	}
	return model.FitJob(&r.Job, &r.Plan)
}

// flowStart is the job's start time, or the time the "flow started" step
// was marked done.
func flowStart(j model.Job) time.Time {
	if !j.Started.IsZero() {
		return j.Started
	}
	if i := j.Checklist.Index("run.start"); i >= 0 && j.Checklist.Steps[i].State == model.StateDone {
		return j.Checklist.Steps[i].At
	}
	return time.Time{}
}

// flowStop is the job's stop time, or the time the "record the stop" step
// was marked done.
func flowStop(j model.Job) time.Time {
	if !j.Stopped.IsZero() {
		return j.Stopped
	}
	if i := j.Checklist.Index("stop.record"); i >= 0 && j.Checklist.Steps[i].State == model.StateDone {
		return j.Checklist.Steps[i].At
	}
	return time.Time{}
}

type recWriter struct {
	w   *bufio.Writer
	err error
	loc *time.Location
	sys model.System
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

func (rw *recWriter) f(d model.Dim, si float64) string { return present.Figures{Sys: rw.sys}.Of(d, si) }

// level shows a level reading to the millimetre (SI) or the hundredth of a
// foot (US), finer than Format's field rounding, so that readings a few
// millimetres apart stay distinct in the record.
func (rw *recWriter) level(si float64) string {
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return "—"
	}
	if rw.sys == model.US {
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
