package model

import (
	"slices"
	"strconv"
)

// Sharing one job among several screens (the crew server). Each screen
// keeps its own copy of the job; a Tracker turns what a screen changed in
// its copy into an Edit (the same changes a journal record holds), and the
// one owner of the job applies the Edits of every screen in the order they
// come (Edit.Apply), then journals the result through its Session. An Edit
// is applied to the job as the owner has it, not as the screen had it:
// appended log entries, readings and flow tests go at the end of the lists
// as they stand (two people adding a reading at once both keep theirs), a
// changed step is found by its ID, a field by its ID. What the screen
// alone owns is never shared: the draft (the text being typed, each
// screen its own) and the resume position.

// An Edit is one screen's change to a shared job.
type Edit struct {
	r journalRecord
	// The lists' edits that append (the rest replace the whole list, a
	// correction).
	logAppend, readAppend, flowAppend bool
	// steps by ID, for the changed steps (Apply finds them by ID).
	stepIDs map[string]string
}

// Empty reports whether the edit changes nothing.
func (e *Edit) Empty() bool {
	r := &e.r
	return len(r.Set) == 0 && len(r.Inputs) == 0 && len(r.LastGood) == 0 && len(r.Steps) == 0 &&
		r.Log == nil && r.Readings == nil && r.Flows == nil
}

// A Tracker follows one screen's copy of a shared job: Diff returns what
// changed since the last Diff or Reset.
type Tracker struct {
	snap journalSnap
}

// NewTracker starts tracking from j.
func NewTracker(j *Job) *Tracker { return &Tracker{snap: newSnap(j)} }

// Reset makes j the job the next Diff is taken against (the shared job as
// the owner last sent it, with this screen's edits still on their way).
func (t *Tracker) Reset(j *Job) { t.snap = newSnap(j) }

// Diff returns the edit that turns the tracked job into j, or nil when
// nothing shared changed, and tracks j from then on. When by is not "",
// each log entry, reading and flow test added without a name, and each
// step marked or noted, is signed with it in j first (the crew member whose
// key the screen was opened with).
func (t *Tracker) Diff(j *Job, by string) (*Edit, error) {
	if by != "" {
		t.sign(j, by)
	}
	r, changed, _, err := t.snap.diff(j)
	if err != nil || r == nil {
		return nil, err
	}
	e := &Edit{r: *r}
	delete(e.r.Set, "draft")
	e.logAppend = r.Log != nil && r.Log.From == t.snap.logN
	e.readAppend = r.Readings != nil && r.Readings.From == t.snap.readN
	e.flowAppend = r.Flows != nil && r.Flows.From == t.snap.flowN
	for k := range r.Steps {
		if e.stepIDs == nil {
			e.stepIDs = map[string]string{}
		}
		e.stepIDs[k] = r.Steps[k].ID
	}
	t.snap.take(j, changed)
	if _, stamp := e.r.Set["updated"]; stamp && len(e.r.Set) == 1 {
		delete(e.r.Set, "updated") // only the draft changed: nothing shared
	}
	if e.Empty() {
		return nil, nil
	}
	return e, nil
}

// sign puts by on what j added or marked since the tracked job.
func (t *Tracker) sign(j *Job, by string) {
	s := &t.snap
	if n := s.logN; len(j.Log) > n && (n == 0 || j.Log[n-1] == s.logLast) {
		for i := n; i < len(j.Log); i++ {
			if j.Log[i].By == "" {
				j.Log[i].By = by
			}
		}
	}
	if n := s.readN; len(j.Readings) > n && (n == 0 || j.Readings[n-1] == s.readLast) {
		for i := n; i < len(j.Readings); i++ {
			if j.Readings[i].By == "" {
				j.Readings[i].By = by
			}
		}
	}
	if n := s.flowN; len(j.FlowTests) > n && (n == 0 || j.FlowTests[n-1] == s.flowLast) {
		for i := n; i < len(j.FlowTests); i++ {
			if j.FlowTests[i].By == "" {
				j.FlowTests[i].By = by
			}
		}
	}
	old := s.job.Checklist.Steps
	for i := range j.Checklist.Steps {
		st := &j.Checklist.Steps[i]
		k := slices.IndexFunc(old, func(o Step) bool { return o.ID == st.ID })
		if k < 0 {
			continue
		}
		o := old[k]
		if st.State != o.State || st.Note != o.Note || st.Reason != o.Reason || !st.At.Equal(o.At) {
			st.By = by
		}
	}
}

// Apply applies the edit to j, the shared job as its owner has it (see the
// package's note on sharing). A step the edit changed that j no longer has
// is left out; so is a correction of a list that j no longer holds the
// start of.
func (e *Edit) Apply(j *Job) error {
	r := e.r // a copy: the list edits are moved to the lists as they stand
	if r.Log != nil && e.logAppend {
		r.Log = &listEdit[LogEntry]{From: len(j.Log), Add: r.Log.Add}
	}
	if r.Readings != nil && e.readAppend {
		r.Readings = &listEdit[Reading]{From: len(j.Readings), Add: r.Readings.Add}
	}
	if r.Flows != nil && e.flowAppend {
		r.Flows = &listEdit[FlowTest]{From: len(j.FlowTests), Add: r.Flows.Add}
	}
	if r.Steps != nil {
		steps := j.Checklist.Steps
		if _, whole := r.Set["checklist"]; whole {
			steps = nil // replaced whole by this edit: its indexes stand
		}
		moved := map[string]Step{}
		for k, s := range r.Steps {
			if steps == nil {
				moved[k] = s
				continue
			}
			if i := slices.IndexFunc(steps, func(o Step) bool { return o.ID == e.stepIDs[k] }); i >= 0 {
				moved[strconv.Itoa(i)] = s
			}
		}
		r.Steps = moved
	}
	return r.apply(j)
}
