package model

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"time"
)

// JobSchema is the "schema" value of every job file; a JSON file without it
// is not a drawdown job.
const JobSchema = "drawdown-job"

// JobVersion is the job-file format version this build writes. Older
// versions are migrated on load (see migrate); newer ones are refused.
// Version 3 added the draft and the journal mark (journal.go).
const JobVersion = 3

// Job is one drain: who, where, the inputs as typed, the site facts, the
// checklist, the level readings, the release record and the log, and where
// the technician was in the screens. It is saved as JSON (see Encode) after
// every change.
//
// Inputs keeps the raw text of each field exactly as typed, so nothing typed
// is ever lost, not even text that does not parse; Value parses it in the
// job's unit system on demand.
//
// The job's state (planned, draining, closed) is derived, not stored: see
// State.
type Job struct {
	Schema  string `json:"schema"`  // always JobSchema
	Version int    `json:"version"` // JobVersion when written by this build

	Name string `json:"name"`
	// Template is the ID of the template the job started from ("" for a
	// blank job); see Templates.
	Template string `json:"template,omitempty"`
	Site     string `json:"site,omitempty"`
	Location string `json:"location,omitempty"` // free text: yard, bund, vault number
	// Date is the day of the work as YYYY-MM-DD ("" until set).
	Date string       `json:"date,omitempty"`
	Crew []CrewMember `json:"crew,omitempty"`
	// Supervisor is the responsible supervisor; for a containment release,
	// the person under whose supervision the valve is opened and resealed
	// (40 CFR 112.8(c)(3)).
	Supervisor string `json:"supervisor,omitempty"`
	Notes      string `json:"notes,omitempty"`
	// Source describes the vessel drained ("bund B2, concrete, 8 × 5 m");
	// Receiver where the liquid goes ("east ditch", "IBC tote 3"). Free
	// text for the record; the geometry is in Inputs.
	Source   string `json:"source,omitempty"`
	Receiver string `json:"receiver,omitempty"`

	// Units is the unit system for display and for bare numbers.
	Units System `json:"units"`
	// Inputs maps a field to its text as typed. An absent field is empty.
	Inputs map[FieldID]string `json:"inputs"`
	// Facts are the crew's answers about the site (SiteFacts).
	Facts SiteFacts `json:"site_facts,omitzero"`

	Checklist Checklist `json:"checklist"`
	Readings  []Reading `json:"readings,omitempty"`
	// FlowTests are bucket-and-stopwatch tests of the flow (FlowTest).
	FlowTests []FlowTest `json:"flow_tests,omitempty"`
	Release   Release    `json:"release,omitzero"`
	Log       []LogEntry `json:"log,omitempty"`

	// Started and Stopped are when the siphon started and stopped running
	// (zero until they happen).
	Started time.Time `json:"started,omitzero"`
	Stopped time.Time `json:"stopped,omitzero"`
	// Closed is when the job was closed out (record complete); zero while
	// open.
	Closed time.Time `json:"closed,omitzero"`

	Resume Resume `json:"resume"`

	// LastGood holds, for each field, its text as last committed (typing
	// finished) while it read as a valid value: the "last valid" text that
	// stands in while the field is being retyped or is wrong, and that
	// ctrl+r puts back. It is saved with the job, so it survives a dropped
	// link mid-edit.
	LastGood map[FieldID]string `json:"last_good,omitempty"`

	// Draft is text being typed and not yet entered (a field, a step's
	// note or skip reason, a level reading), kept so that a dropped link
	// or a closed terminal loses none of it; see Draft.
	Draft Draft `json:"draft,omitzero"`

	Created time.Time `json:"created,omitzero"`
	Updated time.Time `json:"updated,omitzero"`
}

// CrewMember is one person on the job and their role ("lead", "attendant",
// "entrant", "tester").
type CrewMember struct {
	Name string `json:"name"`
	Role string `json:"role,omitempty"`
}

// Resume is where the technician was, so that a reopened job (after a dropped
// SSH link, say) shows the same pane, field and checklist step.
type Resume struct {
	// Pane is the screen pane's name as the UI knows it (the UI has more
	// panes than the four input panes of Pane).
	Pane  string  `json:"pane,omitempty"`
	Field FieldID `json:"field,omitempty"`
	// Step is the checklist step index; StepID its ID, which survives a
	// rebuilt checklist when the index does not.
	Step   int    `json:"step"`
	StepID string `json:"step_id,omitempty"`
}

// LogEntry is one line of the job's log: something the technician or the
// tool recorded, with its time.
type LogEntry struct {
	At   time.Time `json:"at"`
	Text string    `json:"text"`
	// By is the crew member whose change the entry records (the name on
	// their key, on the crew server); "" on a lone screen.
	By string `json:"by,omitempty"`
}

// NewJob returns a blank job in the current format: the name, the unit
// system and the creation time, nothing else (no text of any template). Its
// checklist is built at the first RebuildChecklist.
func NewJob(name string, units System, now time.Time) Job {
	return Job{
		Schema:  JobSchema,
		Version: JobVersion,
		Name:    name,
		Units:   units,
		Inputs:  map[FieldID]string{},
		Created: now,
		Updated: now,
	}
}

// ErrUnknownField is wrapped by the error Set returns for a field ID that is
// not in the field table.
var ErrUnknownField = errors.New("unknown field")

// Set stores text for the field exactly as typed (text that is only spaces
// clears the field) and reports whether it can be used: nil, or a
// *FieldError naming the field's label and its accepted range in the job's
// unit system. The text is stored even when it is wrong, so nothing typed is
// lost. Picker entries are checked against the fixed lists only (outlet, tank
// shape, priming method); catalogue entries (liquid, material, fittings) are
// checked when the plan is computed.
func (j *Job) Set(id FieldID, text string) error {
	if j.Inputs == nil {
		j.Inputs = map[FieldID]string{}
	}
	if strings.TrimSpace(text) == "" {
		delete(j.Inputs, id)
	} else {
		j.Inputs[id] = text
	}
	f, ok := FieldByID(id)
	if !ok {
		return errors.New("field " + strconv.Quote(string(id)) + ": " + ErrUnknownField.Error())
	}
	if f.IsPicker() {
		return f.ValidateChoice(text, nil)
	}
	if strings.TrimSpace(text) == "" && (f.Optional || f.Default != "") {
		return nil
	}
	_, err := f.Validate(text, j.Units)
	return err
}

// Text returns the field's text as typed ("" when empty).
func (j Job) Text(id FieldID) string { return j.Inputs[id] }

// Has reports whether something is typed in the field.
func (j Job) Has(id FieldID) bool { return strings.TrimSpace(j.Inputs[id]) != "" }

// Choice returns a picker's entry, or its Default when empty.
func (j Job) Choice(id FieldID) string {
	if s := strings.TrimSpace(j.Inputs[id]); s != "" {
		return s
	}
	f, _ := FieldByID(id)
	return f.Default
}

// Value parses the field in the job's unit system and returns it in SI
// units. An empty field takes its Default; an empty field without one gives
// an error wrapping ErrNotSet (expected for Optional fields: test with
// errors.Is). Text that does not parse or is out of range gives the
// *FieldError of FieldSpec.Validate. Value never returns NaN or ±Inf.
func (j Job) Value(id FieldID) (float64, error) {
	f, ok := FieldByID(id)
	if !ok {
		return 0, errors.New("field " + strconv.Quote(string(id)) + ": " + ErrUnknownField.Error())
	}
	text := j.Inputs[id]
	if strings.TrimSpace(text) == "" {
		text = f.Default
	}
	return f.Validate(text, j.Units)
}

// InputErrors checks every field that has text (pickers against their fixed
// lists only) and returns the errors by field; nil when all are usable.
// Required fields left empty are not reported here: which ones are needed
// depends on the tank shape, and the plan reports them.
func (j Job) InputErrors() map[FieldID]error {
	var out map[FieldID]error
	for id, text := range j.Inputs {
		if strings.TrimSpace(text) == "" {
			continue
		}
		var err error
		f, ok := FieldByID(id)
		switch {
		case !ok:
			err = errors.New("field " + strconv.Quote(string(id)) + ": " + ErrUnknownField.Error())
		case f.IsPicker():
			err = f.ValidateChoice(text, nil)
		default:
			_, err = f.Validate(text, j.Units)
		}
		if err != nil {
			if out == nil {
				out = map[FieldID]error{}
			}
			out[id] = err
		}
	}
	return out
}

// SetUnits switches the unit system. A bare number typed under the old
// system ("25" meaning 25 mm) gets the old system's unit appended ("25 mm")
// so that its meaning does not change; all other text is kept as typed.
func (j *Job) SetUnits(sys System) {
	if sys == j.Units {
		return
	}
	for id, text := range j.Inputs {
		f, ok := FieldByID(id)
		if !ok || f.IsPicker() || f.Dim == DimNumber {
			continue
		}
		old, err1 := Parse(f.Dim, text, j.Units)
		now, err2 := Parse(f.Dim, text, sys)
		if err1 == nil && err2 == nil && !sameFloat(old, now) {
			j.Inputs[id] = strings.TrimSpace(text) + " " + DefaultUnit(f.Dim, j.Units)
		}
	}
	j.Units = sys
}

func sameFloat(a, b float64) bool { return a == b || math.Abs(a-b) <= 1e-12*math.Abs(a) }

// AddLog appends a log line.
func (j *Job) AddLog(at time.Time, text string) {
	j.Log = append(j.Log, LogEntry{At: at, Text: text})
}

// Clone returns a deep copy, safe to hand to a save command while the UI
// keeps editing the original.
func (j Job) Clone() Job {
	c := j
	c.Inputs = make(map[FieldID]string, len(j.Inputs))
	for k, v := range j.Inputs {
		c.Inputs[k] = v
	}
	if j.LastGood != nil {
		c.LastGood = make(map[FieldID]string, len(j.LastGood))
		for k, v := range j.LastGood {
			c.LastGood[k] = v
		}
	}
	c.Readings = append([]Reading(nil), j.Readings...)
	if j.FlowTests != nil {
		c.FlowTests = append([]FlowTest(nil), j.FlowTests...)
	}
	c.Log = append([]LogEntry(nil), j.Log...)
	c.Crew = append([]CrewMember(nil), j.Crew...)
	c.Release.Photos = append([]Photo(nil), j.Release.Photos...)
	c.Release.Samples = append([]Sample(nil), j.Release.Samples...)
	c.Checklist.Steps = append([]Step(nil), j.Checklist.Steps...)
	c.Checklist.Dropped = append([]Step(nil), j.Checklist.Dropped...)
	if j.Readings == nil {
		c.Readings = nil
	}
	if j.Log == nil {
		c.Log = nil
	}
	if j.Crew == nil {
		c.Crew = nil
	}
	if j.Release.Photos == nil {
		c.Release.Photos = nil
	}
	if j.Release.Samples == nil {
		c.Release.Samples = nil
	}
	if j.Checklist.Steps == nil {
		c.Checklist.Steps = nil
	}
	if j.Checklist.Dropped == nil {
		c.Checklist.Dropped = nil
	}
	return c
}
