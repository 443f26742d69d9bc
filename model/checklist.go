package model

import (
	"errors"
	"strings"
	"time"
)

// The prime-and-drain checklist. BuildChecklist turns the facts of a job (the
// liquid's hazards, the priming method, the site) into an ordered list of
// steps in six sections; steps that do not apply are left out. The technician
// marks each step done, skipped (with a reason) or not applicable, with the
// time it happened and an optional note. The checklist is a plain value that
// the Job embeds and that serialises to JSON.
//
// The steps paraphrase the field-practice brief (/work/shared/field-practice.md
// §2 priming methods, §3 safety, §5 the record), which in turn paraphrases
// public guidance; each caution names the family of rule it comes from and
// defers to the site's written program, local codes and permits. The
// checklist records what the crew confirms. It never decides that a space, a
// liquid or a discharge is safe, and it never authorises a discharge.

// Section is one part of the checklist, in working order.
type Section string

// The sections in the order they are worked.
const (
	SectionHazard   Section = "hazard"
	SectionSetup    Section = "setup"
	SectionPrime    Section = "prime"
	SectionRun      Section = "run"
	SectionStop     Section = "stop"
	SectionCloseOut Section = "closeout"
)

// Sections lists the sections in working order.
func Sections() []Section {
	return []Section{SectionHazard, SectionSetup, SectionPrime, SectionRun, SectionStop, SectionCloseOut}
}

// Title is the heading shown for the section.
func (s Section) Title() string {
	switch s {
	case SectionHazard:
		return "Hazard check"
	case SectionSetup:
		return "Set-up"
	case SectionPrime:
		return "Prime"
	case SectionRun:
		return "Run and watch"
	case SectionStop:
		return "Stop and drain the hose"
	case SectionCloseOut:
		return "Close out"
	}
	return string(s)
}

// StepState is where a step stands. The zero value is not a valid state;
// BuildChecklist sets every step to StatePending.
type StepState string

// Step states.
const (
	StatePending       StepState = "pending"
	StateDone          StepState = "done"
	StateSkipped       StepState = "skipped" // needs a reason
	StateNotApplicable StepState = "n/a"
)

// Valid reports whether s is one of the four states.
func (s StepState) Valid() bool {
	switch s {
	case StatePending, StateDone, StateSkipped, StateNotApplicable:
		return true
	}
	return false
}

// Label is the word shown beside a step (never colour alone).
func (s StepState) Label() string {
	switch s {
	case StatePending:
		return "to do"
	case StateDone:
		return "done"
	case StateSkipped:
		return "skipped"
	case StateNotApplicable:
		return "not applicable"
	}
	return string(s)
}

// Step is one checklist item with its state.
type Step struct {
	// ID identifies the step across rebuilds, for the program only: it is
	// never shown to a person (Title is).
	ID      string  `json:"id"`
	Section Section `json:"section"`
	// Title is the step's short label for a list, the log and the record
	// ("Sewage protective equipment").
	Title string `json:"title,omitempty"`
	Text  string `json:"text"`
	// Caution is a short warning shown with the step, deferring to local
	// codes and permits; empty where none is needed.
	Caution string `json:"caution,omitempty"`
	// Rule names the family of rule or guidance behind the step, e.g.
	// "OSHA 29 CFR 1910.146"; "common practice" for a trade habit.
	Rule string `json:"rule,omitempty"`
	// Required: a rule or the job's safety asks for the step, so marking
	// it not applicable needs a reason (skipping any step always does).
	Required bool `json:"required,omitempty"`
	// NoteRequired: marking the step done needs a note with the fact it
	// asks for (a permit number, a gas reading with time and initials, the
	// result of a sheen check, an authorisation). The checklist is gated on
	// facts the crew records, never on the tool's judgement.
	NoteRequired bool      `json:"note_required,omitempty"`
	State        StepState `json:"state"`
	At           time.Time `json:"at,omitzero"`
	Reason       string    `json:"reason,omitempty"` // why it was skipped or not applicable
	Note         string    `json:"note,omitempty"`
	// By is the crew member who last marked the step or wrote its note
	// (the name on their key, on the crew server); "" on a lone screen.
	By string `json:"by,omitempty"`
}

// Label is the step's title, or the start of its text for a step written
// before titles existed; never its ID.
func (s Step) Label() string {
	if s.Title != "" {
		return s.Title
	}
	t := s.Text
	if i := strings.IndexAny(t, ":;."); i > 0 {
		t = t[:i]
	}
	return t
}

// LogText is the log line for the step's current mark, in plain words:
// "Sewage protective equipment: skipped (no sewage on site)".
func (s Step) LogText() string {
	t := s.Label() + ": " + s.State.Label()
	if s.Reason != "" {
		t += " (" + s.Reason + ")"
	}
	return t
}

// Checklist is the ordered list of steps built for a job, plus the context it
// was built from (a record: ContextFor never reads it back). Dropped keeps
// steps that were marked but no longer apply after a change, so that
// nothing recorded is lost; a later Rebuild restores them if they apply
// again.
type Checklist struct {
	Context ChecklistContext `json:"context"`
	Steps   []Step           `json:"steps"`
	Dropped []Step           `json:"dropped,omitempty"`
}

// Errors wrapped by *MarkError; test with errors.Is.
var (
	// ErrUnknownStep: the step is not (or no longer) in the checklist.
	ErrUnknownStep = errors.New("that step is not in this checklist (it may no longer apply)")
	// ErrReasonRequired: a skip, or not-applicable on a required step,
	// without a reason.
	ErrReasonRequired = errors.New("a reason is needed")
	// ErrNoteRequired: a step that asks for a recorded fact marked done
	// without a note.
	ErrNoteRequired = errors.New("this step is done only with its reading or reference in the note")
	// ErrNoTime: a mark without a time.
	ErrNoTime = errors.New("a time is needed to mark it")
	// ErrBadState: a state that is not one of the four.
	ErrBadState = errors.New("the state is not one of to do, done, skipped, not applicable")
)

// MarkError is a refused mark, in plain words for the person who made it:
// the step's label (never its ID) and what is missing.
type MarkError struct {
	Step  string    // the step's Label, "" for an unknown step
	State StepState // the state asked for
	Err   error     // one of the Err* sentinels above
}

func (e *MarkError) Error() string {
	msg := e.Err.Error()
	switch {
	case errors.Is(e.Err, ErrReasonRequired) && e.State == StateSkipped:
		msg = "a reason is needed to skip it"
	case errors.Is(e.Err, ErrReasonRequired):
		msg = "a reason is needed to mark it not applicable: a rule asks for this step"
	}
	if e.Step == "" {
		return msg
	}
	return e.Step + ": " + msg
}

// Unwrap returns the sentinel.
func (e *MarkError) Unwrap() error { return e.Err }

// Index returns the position of the step with this ID, or -1.
func (c *Checklist) Index(id string) int {
	for i := range c.Steps {
		if c.Steps[i].ID == id {
			return i
		}
	}
	return -1
}

// Mark sets the state of step id at time at (from the caller's clock).
//
//   - StateSkipped needs a non-blank reason; so does StateNotApplicable on
//     a Required step.
//   - StateDone on a step with NoteRequired needs a note (given now or
//     already on the step).
//   - StateDone, StateSkipped and StateNotApplicable need a non-zero time.
//   - StatePending undoes a mark: the time and reason are cleared.
//
// A non-empty note replaces the step's note; an empty note keeps it. On error
// the checklist is unchanged and the error is a *MarkError that names the
// step by its label. Job.Mark also logs the mark and closes or reopens the
// job; the screen and the commands call that.
func (c *Checklist) Mark(id string, state StepState, reason, note string, at time.Time) error {
	i := c.Index(id)
	if i < 0 {
		return &MarkError{State: state, Err: ErrUnknownStep}
	}
	s := &c.Steps[i]
	fail := func(err error) error { return &MarkError{Step: s.Label(), State: state, Err: err} }
	if !state.Valid() {
		return fail(ErrBadState)
	}
	reason = strings.TrimSpace(reason)
	if reason == "" && (state == StateSkipped || state == StateNotApplicable && s.Required) {
		return fail(ErrReasonRequired)
	}
	if state == StateDone && s.NoteRequired && strings.TrimSpace(note) == "" && strings.TrimSpace(s.Note) == "" {
		return fail(ErrNoteRequired)
	}
	if state != StatePending && at.IsZero() {
		return fail(ErrNoTime)
	}
	s.State = state
	if state == StatePending {
		s.At = time.Time{}
		s.Reason = ""
	} else {
		s.At = at
		s.Reason = reason
	}
	if strings.TrimSpace(note) != "" {
		s.Note = note
	}
	return nil
}

// SetNote replaces the note of step id without changing its state.
func (c *Checklist) SetNote(id, note string) error {
	i := c.Index(id)
	if i < 0 {
		return &MarkError{Err: ErrUnknownStep}
	}
	c.Steps[i].Note = note
	return nil
}

// CurrentIndex is the index of the first pending step, or -1 when none is
// left.
func (c *Checklist) CurrentIndex() int {
	for i := range c.Steps {
		if c.Steps[i].State == StatePending || c.Steps[i].State == "" {
			return i
		}
	}
	return -1
}

// Current returns the first pending step and true, or false when every step
// is marked.
func (c *Checklist) Current() (Step, bool) {
	i := c.CurrentIndex()
	if i < 0 {
		return Step{}, false
	}
	return c.Steps[i], true
}

// Progress counts steps by state.
type Progress struct {
	Total, Pending, Done, Skipped, NotApplicable int
}

// Marked is the number of steps no longer pending.
func (p Progress) Marked() int { return p.Total - p.Pending }

// Progress counts the checklist's steps by state.
func (c *Checklist) Progress() Progress {
	p := Progress{Total: len(c.Steps)}
	for _, s := range c.Steps {
		switch s.State {
		case StateDone:
			p.Done++
		case StateSkipped:
			p.Skipped++
		case StateNotApplicable:
			p.NotApplicable++
		default:
			p.Pending++
		}
	}
	return p
}

// Rebuild builds the checklist for a changed context (another liquid or
// method) and carries over the state, time, reason and note of every step
// whose ID survives. Marked steps that no longer apply move to Dropped, and
// come back if a later context needs them again, so nothing recorded is lost.
// The text and caution always come from the new build.
func (c Checklist) Rebuild(ctx ChecklistContext) Checklist {
	next := BuildChecklist(ctx)
	old := make(map[string]Step, len(c.Steps)+len(c.Dropped))
	for _, s := range c.Dropped {
		old[s.ID] = s
	}
	for _, s := range c.Steps {
		old[s.ID] = s
	}
	kept := make(map[string]bool, len(next.Steps))
	for i := range next.Steps {
		s := &next.Steps[i]
		if o, ok := old[s.ID]; ok {
			s.State, s.At, s.Reason, s.Note = o.State, o.At, o.Reason, o.Note
			if !s.State.Valid() {
				s.State = StatePending
			}
			kept[s.ID] = true
		}
	}
	for _, list := range [][]Step{c.Steps, c.Dropped} {
		for _, s := range list {
			if kept[s.ID] || (s.State == StatePending && s.Note == "") {
				continue
			}
			kept[s.ID] = true
			next.Dropped = append(next.Dropped, s)
		}
	}
	return next
}
