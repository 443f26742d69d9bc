package model

import (
	"strconv"
	"strings"
	"time"
)

// The job's own entries (who, where, when), its state, and what the screen
// and the commands do to a job as a whole: rename, duplicate, close, reopen,
// mark a step, rebuild the checklist. Each change that a person makes is
// logged in plain words at the time the caller gives; call these when the
// person commits a choice, not while a picker is browsed.

// InfoField names one of the job's free-text entries.
type InfoField string

// The job's free-text entries, in the order a form shows them.
const (
	InfoSite       InfoField = "site"
	InfoLocation   InfoField = "location"
	InfoDate       InfoField = "date"
	InfoSupervisor InfoField = "supervisor"
	InfoSource     InfoField = "vessel"
	InfoReceiver   InfoField = "destination"
	InfoNotes      InfoField = "notes"
)

// InfoFields lists the job's free-text entries in form order. The name has
// its own call (Rename) and the crew theirs (AddCrew, RemoveCrew).
func InfoFields() []InfoField {
	return []InfoField{InfoSite, InfoLocation, InfoDate, InfoSupervisor, InfoSource, InfoReceiver, InfoNotes}
}

// Label is the entry's name on a form and in the log.
func (f InfoField) Label() string {
	switch f {
	case InfoSite:
		return "Site"
	case InfoLocation:
		return "Location"
	case InfoDate:
		return "Date"
	case InfoSupervisor:
		return "Responsible supervisor"
	case InfoSource:
		return "Source vessel"
	case InfoReceiver:
		return "Where it goes (description)"
	case InfoNotes:
		return "Notes"
	}
	return string(f)
}

func (j *Job) info(f InfoField) *string {
	switch f {
	case InfoSite:
		return &j.Site
	case InfoLocation:
		return &j.Location
	case InfoDate:
		return &j.Date
	case InfoSupervisor:
		return &j.Supervisor
	case InfoSource:
		return &j.Source
	case InfoReceiver:
		return &j.Receiver
	case InfoNotes:
		return &j.Notes
	}
	return nil
}

// Info returns the entry's text ("" when empty or unknown).
func (j Job) Info(f InfoField) string {
	if p := j.info(f); p != nil {
		return *p
	}
	return ""
}

// dateLayout is the form of Job.Date: an ISO 8601 calendar date.
const dateLayout = "2006-01-02"

// SetInfo stores the entry's text and logs the change. Surrounding space is
// trimmed; control characters are refused (line breaks only in the notes);
// the date must read as YYYY-MM-DD. On error nothing changes and the error
// names the entry.
func (j *Job) SetInfo(f InfoField, text string, at time.Time) error {
	p := j.info(f)
	if p == nil {
		return &InputError{Field: string(f), Detail: "not an entry of the job"}
	}
	max, lines := maxLine, false
	if f == InfoNotes {
		max, lines = maxNotes, true
	}
	text, err := cleanText(f.Label(), text, max, lines)
	if err != nil {
		return err
	}
	if f == InfoDate && text != "" {
		if _, err := time.Parse(dateLayout, text); err != nil {
			return &InputError{Field: f.Label(), Detail: strconv.Quote(text) + " is not a date; accepted YYYY-MM-DD, e.g. 2026-03-14"}
		}
	}
	if *p == text {
		return nil
	}
	*p = text
	switch {
	case f == InfoNotes:
		j.AddLog(at, "Notes changed")
	case text == "":
		j.AddLog(at, f.Label()+": cleared")
	default:
		j.AddLog(at, f.Label()+": "+text)
	}
	return nil
}

// CrewText lists the crew for one line: "A. Marsh (lead), T. Okoro".
func (j Job) CrewText() string {
	parts := make([]string, 0, len(j.Crew))
	for _, c := range j.Crew {
		if c.Role != "" {
			parts = append(parts, c.Name+" ("+c.Role+")")
		} else {
			parts = append(parts, c.Name)
		}
	}
	return strings.Join(parts, ", ")
}

// AddCrew adds a person and their role (the role may be empty) and logs it.
func (j *Job) AddCrew(name, role string, at time.Time) error {
	name, err := cleanLine("Crew name", name, maxLine)
	if err != nil {
		return err
	}
	if name == "" {
		return &InputError{Field: "Crew name", Detail: "give the person's name"}
	}
	if role, err = cleanLine("Crew role", role, maxLine); err != nil {
		return err
	}
	j.Crew = append(j.Crew, CrewMember{Name: name, Role: role})
	j.AddLog(at, "Crew: "+name+" added"+roleText(role))
	return nil
}

// RemoveCrew removes the i-th person (from 0) and logs it.
func (j *Job) RemoveCrew(i int, at time.Time) error {
	if i < 0 || i >= len(j.Crew) {
		return &InputError{Field: "Crew", Detail: "there is no person " + strconv.Itoa(i+1) + " on the crew list"}
	}
	c := j.Crew[i]
	j.Crew = append(j.Crew[:i:i], j.Crew[i+1:]...)
	j.AddLog(at, "Crew: "+c.Name+" removed"+roleText(c.Role))
	return nil
}

func roleText(role string) string {
	if role == "" {
		return ""
	}
	return " (" + role + ")"
}

// Rename gives the job a new name (1 to 200 characters, no control
// characters) and logs the old and the new. The job file keeps its path.
func (j *Job) Rename(name string, at time.Time) error {
	name, err := cleanLine("Job name", name, maxLine)
	if err != nil {
		return err
	}
	if name == "" {
		return &InputError{Field: "Job name", Detail: "give the job a name"}
	}
	if name == j.Name {
		return nil
	}
	old := j.Name
	j.Name = name
	j.AddLog(at, "Job renamed from “"+old+"” to “"+name+"”")
	return nil
}

// Duplicate returns a new job named name for the same site and set-up: the
// template, site, location, crew, supervisor, notes, source, receiver, unit
// system, inputs and site facts are copied (not a recorded sheen); the date,
// checklist marks, readings, release record, log and times are not. The
// copy's checklist is built at its first RebuildChecklist; its log starts
// with where it came from.
func (j Job) Duplicate(name string, now time.Time) (Job, error) {
	name, err := cleanLine("Job name", name, maxLine)
	if err != nil {
		return Job{}, err
	}
	if name == "" {
		return Job{}, &InputError{Field: "Job name", Detail: "give the new job a name"}
	}
	d := NewJob(name, j.Units, now)
	src := j.Clone()
	d.Template, d.Site, d.Location, d.Crew, d.Supervisor = src.Template, src.Site, src.Location, src.Crew, src.Supervisor
	d.Notes, d.Source, d.Receiver, d.Inputs, d.Facts = src.Notes, src.Source, src.Receiver, src.Inputs, src.Facts
	d.Facts.SheenSeen, d.Facts.SheenNote, d.Facts.SheenAt = false, "", time.Time{}
	d.AddLog(now, "Job started as a copy of “"+j.Name+"”")
	return d, nil
}

// JobState is where a job stands. It is derived from the job (State), never
// stored.
type JobState string

// Job states.
const (
	// JobPlanned: the siphon has not started.
	JobPlanned JobState = "planned"
	// JobDraining: the siphon started (Started is set, or the checklist's
	// start step is done) and the job is not closed.
	JobDraining JobState = "draining"
	// JobClosed: the job was closed out (Closed is set).
	JobClosed JobState = "closed"
)

// State derives the job's state from Closed, Started and the checklist's
// start step.
func (j Job) State() JobState {
	switch {
	case !j.Closed.IsZero():
		return JobClosed
	case !j.Started.IsZero():
		return JobDraining
	}
	if i := j.Checklist.Index("run.start"); i >= 0 && j.Checklist.Steps[i].State == StateDone {
		return JobDraining
	}
	return JobPlanned
}

// Close closes the job out at time at and logs it. A job may be closed with
// steps still to do (a job abandoned or handed over): the log says how many.
func (j *Job) Close(at time.Time) error {
	if at.IsZero() {
		return &InputError{Field: "Close the job", Detail: "a time is needed"}
	}
	if !j.Closed.IsZero() {
		return &InputError{Field: "Close the job", Detail: "the job is already closed"}
	}
	j.Closed = at
	text := "Job closed"
	if n := j.Checklist.Progress().Pending; n > 0 {
		text += " with " + strconv.Itoa(n) + " checklist steps still to do"
	}
	j.AddLog(at, text)
	return nil
}

// Reopen opens a closed job again and logs it.
func (j *Job) Reopen(at time.Time) error {
	if j.Closed.IsZero() {
		return &InputError{Field: "Reopen the job", Detail: "the job is not closed"}
	}
	j.Closed = time.Time{}
	j.AddLog(at, "Job reopened")
	return nil
}

// Mark marks checklist step id (see Checklist.Mark), logs the mark by the
// step's label, and keeps the job's state in step: when every step is
// marked the job closes; when a step of a closed job is put back to do, the
// job reopens. On error nothing changes; the *MarkError names the step by
// its label, never its ID.
func (j *Job) Mark(id string, state StepState, reason, note string, at time.Time) error {
	if err := j.Checklist.Mark(id, state, reason, note, at); err != nil {
		return err
	}
	s := j.Checklist.Steps[j.Checklist.Index(id)]
	j.AddLog(at, "Checklist: "+s.LogText())
	pr := j.Checklist.Progress()
	switch {
	case pr.Total > 0 && pr.Pending == 0 && j.Closed.IsZero():
		j.Closed = at
		j.AddLog(at, "Job closed out: every checklist step is marked")
	case pr.Pending > 0 && !j.Closed.IsZero() && state == StatePending:
		j.Closed = time.Time{}
		j.AddLog(at, "Job reopened: a checklist step is to do again")
	}
	return nil
}

// RebuildChecklist derives the checklist context from the job and its plan
// (ContextFor) and rebuilds the checklist, keeping every recorded mark
// (Checklist.Rebuild). Call it after every compute.
func (j *Job) RebuildChecklist(p Plan) {
	j.Checklist = j.Checklist.Rebuild(ContextFor(*j, p))
}
