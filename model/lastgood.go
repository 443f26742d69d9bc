package model

import (
	"strings"

	"drawdown/presets"
)

// Commit records field id's present text as its last valid text when it
// reads as a valid value (a picker entry in the catalogue's list, a number
// in its accepted range); an empty field that may be empty clears the
// record. It reports whether the text was valid. The screen calls it when
// typing in a field ends, never on each keystroke: "last valid" is what was
// finished, not a half-typed prefix ("4" on the way from "40ft" to "abc").
func (j *Job) Commit(id FieldID, cat *presets.Catalogue) bool {
	f, ok := FieldByID(id)
	if !ok {
		return false
	}
	text := j.Inputs[id]
	var err error
	switch {
	case strings.TrimSpace(text) == "":
		if !f.Optional && f.Default == "" {
			return false
		}
		delete(j.LastGood, id)
		return true
	case f.IsPicker():
		err = f.ValidateChoice(text, cat)
	default:
		_, err = f.Validate(text, j.Units)
	}
	if err != nil {
		return false
	}
	if j.LastGood == nil {
		j.LastGood = map[FieldID]string{}
	}
	j.LastGood[id] = text
	return true
}

// CommitAll records every valid field as its last valid text (a job opened
// from an older file, or made by a template, starts with them).
func (j *Job) CommitAll(cat *presets.Catalogue) {
	for id := range j.Inputs {
		j.Commit(id, cat)
	}
}

// LastGoodInputs is the job's inputs with each field that has a problem in
// errs replaced by its last valid text, for the plan that stands in while
// those fields are wrong. ok is false when a field with a problem has no
// last valid text.
func (j Job) LastGoodInputs(errs map[FieldID]error) (in map[FieldID]string, ok bool) {
	in = make(map[FieldID]string, len(j.Inputs))
	for k, v := range j.Inputs {
		in[k] = v
	}
	ok = true
	for id := range errs {
		if id == "" {
			continue
		}
		v, has := j.LastGood[id]
		if !has {
			ok = false
			continue
		}
		in[id] = v
	}
	return in, ok
}
