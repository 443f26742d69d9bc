package tui

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
	"drawdown/model/record"
)

// Field readings and the job record, from the Log pane (issue: readings
// against the plan; the record "from a key in the UI").

// ReadingAddMsg asks the root to add a level reading typed in the Log pane.
// The root stamps it with its clock.
type ReadingAddMsg struct{ Text string }

// RecordWriteMsg asks the root to write the job record and readings CSV.
type RecordWriteMsg struct{}

// fitMsg carries the fit of the readings against the plan.
type fitMsg struct {
	seq uint64
	fit model.Fit
	err error
}

// recordWrittenMsg reports the record files written (or why not).
type recordWrittenMsg struct {
	paths []string
	err   error
}

// fitCmd fits the readings against the drain plan off the update loop (the
// fit runs the drain planner a few hundred times: about 20 ms).
func fitCmd(readings []model.Reading, in calc.DrainInput, sumK float64, seq uint64) tea.Cmd {
	rs := append([]model.Reading(nil), readings...)
	return func() tea.Msg {
		f, err := model.FitReadings(rs, model.DrainSimulator(in), model.FitOptions{SumK: sumK})
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

// readingsSummary words the readings and their fit for the Log pane, in the
// job's units. It is computed when the fit arrives, never in View.
func readingsSummary(j *model.Job, f *model.Fit, fitErr error, loc *time.Location) []string {
	n := len(j.Readings)
	if n == 0 {
		return []string{"No level readings yet: press r to add one as the drain runs."}
	}
	last := j.Readings[n-1]
	sys := j.Units
	out := []string{"Readings: " + strconv.Itoa(n) + ", last " + present.Figures{Sys: sys}.Of(model.DimLength, last.Level) +
		" at " + last.At.In(loc).Format("15:04")}
	switch {
	case fitErr != nil:
		out = append(out, "Against the plan: "+fitErr.Error())
	case f != nil:
		if f.Message != "" {
			out = append(out, f.Message)
		}
		if !f.Finish.IsZero() && !f.Stopped {
			out = append(out, "Re-predicted stop "+f.Finish.In(loc).Format("15:04")+" at "+
				present.Figures{Sys: sys}.Of(model.DimLength, f.StopLevel))
		}
		if f.Slowing {
			out = append(out, "! slowing faster than planned: check for air at the crest or a clogged intake")
		}
	}
	return out
}
