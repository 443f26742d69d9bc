package model

import (
	"errors"
	"fmt"
	"time"
)

// ErrNoDrainPlan is FitJob's answer when the plan has no drain to compare
// the readings with (it could not be computed, or the tank is not
// described).
var ErrNoDrainPlan = errors.New("no drain plan to compare with: describe the tank in pane 4")

// FitJob fits the job's readings and flow tests against its plan: the one
// fit the screen, the command line and the record show. It returns nil and
// no error when there is nothing to fit yet (no flow test and fewer than
// two readings).
func FitJob(j *Job, p *Plan) (*Fit, error) {
	if len(j.FlowTests) == 0 && len(j.Readings) < 2 {
		return nil, nil
	}
	if !p.OK() || p.Drain == nil || p.DrainIn.Tank == nil {
		return nil, ErrNoDrainPlan
	}
	f, err := FitReadings(j.Readings, j.FlowTests, DrainSimulator(p.PlannedDrain()),
		FitOptions{Inflow: float64(p.DrainIn.Inflow)})
	if err != nil {
		return nil, err
	}
	return &f, nil
}

// DrainStart is the one time base of a job's drain: when the siphon
// started (Job.Started), else the time the checklist's "flow started" step
// was marked done, else the first reading's time; zero when none is known.
// Every time in the readings CSV counts from it.
func DrainStart(j *Job) time.Time {
	if !j.Started.IsZero() {
		return j.Started
	}
	if i := j.Checklist.Index("run.start"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
		return j.Checklist.Steps[i].At
	}
	var first time.Time
	for _, r := range j.Readings {
		if first.IsZero() || r.At.Before(first) {
			first = r.At
		}
	}
	return first
}

// FlowTestLevel is the source level to keep with a flow test taken at t
// when none is typed: the readings' level at t when the test falls within
// or after them (levelAtTime), else the plan's level at t counted from the
// drain's start, else 0 (not known; the fit then takes it from the
// readings).
func FlowTestLevel(j *Job, p *Plan, t time.Time) float64 {
	rs := append([]Reading(nil), j.Readings...)
	sortReadings(rs)
	if len(rs) > 0 && !t.Before(rs[0].At) {
		if h, ok := levelAtTime(rs, t); ok {
			return h
		}
	}
	if p.OK() && p.Drain != nil {
		start := j.Started
		if start.IsZero() {
			if i := j.Checklist.Index("run.start"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
				start = j.Checklist.Steps[i].At
			}
		}
		plan := PlanCurve(*p.Drain)
		switch {
		case !start.IsZero():
			return plan.LevelAt(t.Sub(start).Seconds())
		case len(rs) > 0:
			if h, ok := PlannedAt(plan, time.Time{}, rs[0], t); ok {
				return h
			}
		default:
			return float64(p.DrainIn.Siphon.Geometry.Surface) // not started: the start level
		}
	}
	return 0
}

func sortReadings(rs []Reading) {
	for i := 1; i < len(rs); i++ { // insertion sort: few readings, stable
		for k := i; k > 0 && rs[k].At.Before(rs[k-1].At); k-- {
			rs[k], rs[k-1] = rs[k-1], rs[k]
		}
	}
}

// CorrectReading replaces reading i (its time and level) with r, keeping
// its note, and logs the change at now (before and after, in words the
// caller gives). A correction is not an append: the journal does not hold
// it (listDiff), so the caller writes the job whole after it (tui: a
// checkpoint).
func (j *Job) CorrectReading(i int, r Reading, now time.Time, words string) error {
	if i < 0 || i >= len(j.Readings) {
		return fmt.Errorf("level reading %d: there are %d readings", i+1, len(j.Readings))
	}
	r.Note = j.Readings[i].Note
	if err := r.Validate(); err != nil {
		return err
	}
	j.Readings[i] = r
	j.AddLog(now, "level reading corrected: "+words)
	return nil
}
