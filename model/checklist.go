package model

import (
	"errors"
	"fmt"
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

// PrimingMethod names a way of filling the hose before the siphon runs. Only
// Step is one checklist item with its state.
type Step struct {
	ID      string  `json:"id"`
	Section Section `json:"section"`
	Text    string  `json:"text"`
	// Caution is a short warning shown with the step, deferring to local
	// codes and permits; empty where none is needed.
	Caution string `json:"caution,omitempty"`
	// Rule names the family of rule or guidance behind the step, e.g.
	// "OSHA 29 CFR 1910.146"; "common practice" for a trade habit.
	Rule string `json:"rule,omitempty"`
	// NoteRequired: marking the step done needs a note with the fact it
	// asks for (a permit number, a gas reading with time and initials, the
	// result of a sheen check, an authorisation). The checklist is gated on
	// facts the crew records, never on the tool's judgement.
	NoteRequired bool      `json:"note_required,omitempty"`
	State        StepState `json:"state"`
	At           time.Time `json:"at,omitzero"`
	Reason       string    `json:"reason,omitempty"` // why it was skipped or not applicable
	Note         string    `json:"note,omitempty"`
}

// Checklist is the ordered list of steps built for a job, plus the context it
// was built from. Dropped keeps steps that were marked but no longer apply
// after a change of liquid or method, so that nothing recorded is lost; a
// later Rebuild restores them if they apply again.
type Checklist struct {
	Context ChecklistContext `json:"context"`
	Steps   []Step           `json:"steps"`
	Dropped []Step           `json:"dropped,omitempty"`
}

// ErrUnknownStep is returned by Mark for an ID not in the checklist.
var ErrUnknownStep = errors.New("no such checklist step")

// ErrReasonRequired is returned by Mark when a step is skipped without a
// reason.
var ErrReasonRequired = errors.New("a reason is required to skip a step")

// ErrNoteRequired is returned by Mark when a step that asks for a recorded
// fact is marked done without a note.
var ErrNoteRequired = errors.New("this step is done only with its reading or reference in the note")

// WithSheen rebuilds the checklist with the sheen flag set or cleared (see
// ChecklistContext.SheenSeen), keeping every mark.
func (c Checklist) WithSheen(seen bool) Checklist {
	ctx := c.Context
	ctx.SheenSeen = seen
	return c.Rebuild(ctx)
}

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
//   - StateSkipped needs a non-blank reason.
//   - StateDone on a step with NoteRequired needs a note (given now or
//     already on the step).
//   - StateDone, StateSkipped and StateNotApplicable need a non-zero time.
//   - StatePending undoes a mark: the time and reason are cleared.
//
// A non-empty note replaces the step's note; an empty note keeps it. On error
// the checklist is unchanged.
func (c *Checklist) Mark(id string, state StepState, reason, note string, at time.Time) error {
	i := c.Index(id)
	if i < 0 {
		return fmt.Errorf("checklist step %q: %w", id, ErrUnknownStep)
	}
	if !state.Valid() {
		return fmt.Errorf("checklist step %q: state %q is not one of pending, done, skipped, n/a", id, state)
	}
	reason = strings.TrimSpace(reason)
	if state == StateSkipped && reason == "" {
		return fmt.Errorf("checklist step %q: %w", id, ErrReasonRequired)
	}
	if state == StateDone && c.Steps[i].NoteRequired && strings.TrimSpace(note) == "" && strings.TrimSpace(c.Steps[i].Note) == "" {
		return fmt.Errorf("checklist step %q: %w", id, ErrNoteRequired)
	}
	if state != StatePending && at.IsZero() {
		return fmt.Errorf("checklist step %q: a time is required to mark it %s", id, state.Label())
	}
	s := &c.Steps[i]
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
		return fmt.Errorf("checklist step %q: %w", id, ErrUnknownStep)
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
