package model

import (
	"fmt"
	"time"
	"unicode/utf8"
)

// DraftKind names the input a draft was typed in.
type DraftKind string

// The inputs that keep a draft.
const (
	// DraftField: a form field being typed in. Its text is in Inputs as
	// well (a field is stored at each keystroke); the draft says that the
	// typing was not finished, and what the field held before it began.
	DraftField DraftKind = "field"
	// DraftNote: a checklist step's note being typed.
	DraftNote DraftKind = "note"
	// DraftReason: the reason for skipping a checklist step being typed.
	DraftReason DraftKind = "reason"
	// DraftReading: a level reading being typed in the Log pane.
	DraftReading DraftKind = "reading"
)

// Draft is text being typed and not yet entered. There is at most one: one
// input takes keys at a time. The screen keeps it up to date at each
// keystroke (it goes to the journal like any edit) and puts it back, marked
// as a draft, when the job is opened again.
type Draft struct {
	Kind  DraftKind `json:"kind"`
	Field FieldID   `json:"field,omitempty"` // DraftField
	Step  string    `json:"step,omitempty"`  // DraftNote and DraftReason: the step's ID
	Text  string    `json:"text"`
	// Before is a field's text when the typing began (Esc puts it back).
	Before string `json:"before,omitempty"`
	// At is when the draft was last typed in.
	At time.Time `json:"at,omitzero"`
}

// IsZero reports whether there is no draft.
func (d Draft) IsZero() bool { return d == Draft{} }

// Same reports whether d and o are the same text in the same input (At
// aside).
func (d Draft) Same(o Draft) bool {
	d.At, o.At = time.Time{}, time.Time{}
	return d == o
}

// maxDraft bounds a draft's text, in bytes: the longest input on the screen
// takes 300 characters (a step's note), 4 bytes each at most.
const maxDraft = 4 * 300

// Validate checks a draft read from a file: a known kind, the entries its
// kind needs, text that is UTF-8 and not longer than any input takes.
func (d Draft) Validate() error {
	if d.IsZero() {
		return nil
	}
	switch d.Kind {
	case DraftField:
		if _, ok := FieldByID(d.Field); !ok {
			return fmt.Errorf("the draft names the field %q, which this build does not have", d.Field)
		}
	case DraftNote, DraftReason:
		if d.Step == "" {
			return fmt.Errorf("the draft of a step's %s names no step", d.Kind)
		}
	case DraftReading:
	default:
		return fmt.Errorf("the draft's kind %q is not one of field, note, reason, reading", d.Kind)
	}
	if len(d.Text) > maxDraft || len(d.Before) > maxDraft {
		return fmt.Errorf("the draft's text is longer than any input takes (%d bytes at most)", maxDraft)
	}
	if !utf8.ValidString(d.Text) || !utf8.ValidString(d.Before) {
		return fmt.Errorf("the draft's text is not UTF-8")
	}
	return nil
}
