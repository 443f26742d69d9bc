package tui

import (
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/model/record"
)

// Field readings, flow tests and the job record, from the Log pane (issue:
// readings against the plan; the record "from a key in the UI"; issue 13:
// readings with their times, corrections, flow tests).

// ReadingAddMsg asks the root to add a level reading typed in the Log pane:
// the level, and "@ TIME" when not taken now (model.ParseReadingEntry). The
// root stamps it with its clock.
type ReadingAddMsg struct{ Text string }

// ReadingEditMsg asks the root to correct reading Index (of the job's
// readings) to the level and time typed.
type ReadingEditMsg struct {
	Index int
	Text  string
}

// FlowTestAddMsg asks the root to add a flow test typed in the Log pane
// (model.ParseFlowTestEntry), stamped with the root's clock.
type FlowTestAddMsg struct{ Text string }

// RecordWriteMsg asks the root to write the job record and readings CSV.
type RecordWriteMsg struct{}

// fitMsg carries the fit of the readings against the plan.
type fitMsg struct {
	seq uint64
	fit *model.Fit
	err error
}

// recordWrittenMsg reports the record files written (or why not).
type recordWrittenMsg struct {
	paths []string
	err   error
}

// fitCmd fits the readings and flow tests against the drain plan off the
// update loop (the fit runs the drain planner a few hundred times: tens of
// milliseconds). j is a copy.
func fitCmd(j model.Job, p model.Plan, seq uint64) tea.Cmd {
	return func() tea.Msg {
		f, err := model.FitJob(&j, &p)
		return fitMsg{seq: seq, fit: f, err: err}
	}
}

// recordCmd writes <job>-record.md and <job>-readings.csv beside the job
// file (or in the current folder when the job is not saved), atomically.
func recordCmd(j model.Job, p model.Plan, jobPath string, now time.Time) tea.Cmd {
	return func() tea.Msg {
		in := record.Input{Job: j, Plan: p, Now: now}
		var md, csv strings.Builder
		if err := record.Write(&md, in); err != nil {
			return recordWrittenMsg{err: err}
		}
		if err := record.WriteCSV(&csv, in); err != nil {
			return recordWrittenMsg{err: err}
		}
		dir, base := ".", model.JobFileName(j.Name)
		if jobPath != "" {
			dir, base = filepath.Dir(jobPath), filepath.Base(jobPath)
		} else if wd, err := os.Getwd(); err == nil {
			dir = wd
		}
		base = strings.TrimSuffix(base, ".json")
		var paths []string
		for _, f := range []struct{ name, data string }{{base + "-record.md", md.String()}, {base + "-readings.csv", csv.String()}} {
			path := filepath.Join(dir, f.name)
			if err := model.WriteFileAtomic(path, []byte(f.data)); err != nil {
				return recordWrittenMsg{err: err}
			}
			paths = append(paths, path)
		}
		return recordWrittenMsg{paths: paths}
	}
}

// addReading records a level reading typed in the Log pane, at the time
// typed or now, and refits the readings against the plan.
func (m *Model) addReading(msg ReadingAddMsg) tea.Cmd {
	now := m.now()
	sys := m.job.Units
	r, err := model.ParseReadingEntry(msg.Text, sys, now, m.loc())
	if err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return nil
	}
	if why := m.aboveTank(r); why != "" {
		m.log.ReadingError(why)
		return nil
	}
	m.job.Readings = append(m.job.Readings, r)
	words := "level reading " + present.ReadingLevel(r, sys)
	if !r.At.Equal(now) {
		words += " taken at " + r.At.In(m.loc()).Format("15:04:05")
	}
	m.job.AddLog(now, words)
	m.log.ReadingTaken()
	m.fit, m.fitErr = nil, nil
	m.showReadings()
	m.touch()
	return tea.Batch(m.save(), m.refit())
}

// correctReading replaces a reading's level and time with those typed, and
// writes the job whole: a correction is not an append, which is all the
// journal keeps of the readings.
func (m *Model) correctReading(msg ReadingEditMsg) tea.Cmd {
	now := m.now()
	sys := m.job.Units
	if msg.Index < 0 || msg.Index >= len(m.job.Readings) {
		m.log.ReadingError("✗ that reading is no longer in the job")
		return nil
	}
	r, err := model.ParseReadingEntry(msg.Text, sys, now, m.loc())
	if err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return nil
	}
	if why := m.aboveTank(r); why != "" {
		m.log.ReadingError(why)
		return nil
	}
	old := m.job.Readings[msg.Index]
	clock := func(t time.Time) string { return t.In(m.loc()).Format("15:04:05") }
	words := present.ReadingLevel(old, sys) + " at " + clock(old.At) + " → " + present.ReadingLevel(r, sys) + " at " + clock(r.At)
	if err := m.job.CorrectReading(msg.Index, r, now, words); err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return nil
	}
	m.readRev++
	m.log.ReadingTaken()
	m.fit, m.fitErr = nil, nil
	m.showReadings()
	m.touch()
	m.ps.want = true // a checkpoint: the journal would not hold the change
	return tea.Batch(m.save(), m.refit())
}

// addFlowTest records a flow test typed in the Log pane, stamped now, with
// the source level from the readings or the plan when none is typed.
func (m *Model) addFlowTest(msg FlowTestAddMsg) tea.Cmd {
	now := m.now()
	sys := m.job.Units
	f, err := model.ParseFlowTestEntry(msg.Text, sys, now)
	if err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return nil
	}
	if !(f.Level > 0) && m.st.hasPlan {
		p := m.st.plan
		f.Level = model.FlowTestLevel(&m.job, &p, now)
	}
	if err := m.job.AddFlowTest(f); err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return nil
	}
	m.job.AddLog(now, "flow test "+present.FlowTestLine(f, sys))
	m.log.ReadingTaken()
	m.recompute() // the plan is fitted to the tests and its range narrows
	m.fit, m.fitErr = nil, nil
	m.showReadings()
	m.touch()
	m.ps.want = true // kept whole at once, as a reading is
	return tea.Batch(m.save(), m.refit())
}

// aboveTank words why a reading above the tank's height is refused ("" when
// it is not).
func (m *Model) aboveTank(r model.Reading) string {
	top, ok := m.tankTop()
	if !ok || r.Level <= top {
		return ""
	}
	f := present.Figures{Sys: m.job.Units}
	return "✗ level reading " + present.ReadingLevel(r, m.job.Units) + " is above the tank (" + f.Of(model.DimLength, top) + ")"
}

// tankTop is the source tank's height when the plan has a tank.
func (m *Model) tankTop() (float64, bool) {
	if !m.st.hasPlan || m.st.plan.Tank == nil {
		return 0, false
	}
	return float64(m.st.plan.Tank.Height()), true
}

// refit fits the job's readings and flow tests against the last valid plan,
// as a command.
func (m *Model) refit() tea.Cmd {
	if m.fitCurrent() {
		return nil // the same plan and readings as the last fit (app.go)
	}
	m.fitSeq++
	p := m.st.plan
	enough := len(m.job.Readings) >= 2 || len(m.job.FlowTests) > 0
	if !enough || !m.st.hasPlan || p.Drain == nil {
		m.fit, m.fitErr = nil, nil
		if (len(m.job.Readings) > 0 || len(m.job.FlowTests) > 0) && (!m.st.hasPlan || p.Drain == nil) {
			m.fitErr = model.ErrNoDrainPlan
		}
		m.showReadings()
		return nil
	}
	return fitCmd(m.job.Clone(), p, m.fitSeq)
}

// fitted takes the fit of the readings when it is the latest one asked for.
func (m *Model) fitted(msg fitMsg) {
	if msg.seq != m.fitSeq {
		return
	}
	m.fit, m.fitErr = msg.fit, msg.err
	m.showReadings()
}

// showReadings gives the Log pane the readings, flow tests and the fit's
// summary, worded now (never in View).
func (m *Model) showReadings() {
	m.log.SetSummary(readingsSummary(&m.job, m.fit, m.fitErr, m.loc()))
	m.log.SetReadings(readingRows(&m.job, m.loc()))
}

// readingsSummary words the readings and their fit for the Log pane, in the
// job's units. A line to act on starts with "!".
func readingsSummary(j *model.Job, f *model.Fit, fitErr error, loc *time.Location) []string {
	n := len(j.Readings)
	if n == 0 && len(j.FlowTests) == 0 {
		return []string{"No level readings yet: press r to add one as the drain runs, f for a bucket test."}
	}
	var out []string
	if n > 0 {
		last := j.Readings[0]
		for _, r := range j.Readings {
			if !r.At.Before(last.At) {
				last = r
			}
		}
		out = append(out, "Readings: "+strconv.Itoa(n)+", last "+present.ReadingLevel(last, j.Units)+" at "+last.At.In(loc).Format("15:04"))
	}
	if errors.Is(fitErr, model.ErrFewReadings) {
		fitErr = nil
	}
	for _, l := range present.FitSummary(f, fitErr, present.FitWords{Sys: j.Units, Clock: func(t time.Time) string { return t.In(loc).Format("15:04") }}) {
		if l.Warn {
			out = append(out, "! "+l.Text)
		} else {
			out = append(out, l.Text)
		}
	}
	return out
}

// readingRow is one line of the Log pane's list of readings and flow
// tests; index is the reading's index in the job (−1 for a flow test).
type readingRow struct {
	at    time.Time
	text  string
	index int
	entry string // the reading as ParseReadingEntry reads it back (a correction starts from it)
}

// readingRows lists the readings and flow tests, oldest first.
func readingRows(j *model.Job, loc *time.Location) []readingRow {
	rows := make([]readingRow, 0, len(j.Readings)+len(j.FlowTests))
	for i, r := range j.Readings {
		t := r.At.In(loc).Format("15:04:05") + "  " + present.ReadingLevel(r, j.Units)
		if r.Note != "" {
			t += "  " + r.Note
		}
		rows = append(rows, readingRow{at: r.At, text: present.Clean(t), index: i, entry: model.ReadingEntryText(r, j.Units, loc)})
	}
	for _, f := range j.FlowTests {
		rows = append(rows, readingRow{at: f.At, text: present.Clean(f.At.In(loc).Format("15:04:05") + "  flow " + present.FlowTestLine(f, j.Units)), index: -1})
	}
	for i := 1; i < len(rows); i++ { // insertion sort: stable, nearly sorted
		for k := i; k > 0 && rows[k].at.Before(rows[k-1].at); k-- {
			rows[k], rows[k-1] = rows[k-1], rows[k]
		}
	}
	return rows
}
