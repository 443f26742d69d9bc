package tui

import (
	"strconv"

	"drawdown/model"
)

// Drafts: the text being typed in an input, kept with the job (Job.Draft)
// at each keystroke and put back on the next open, marked as a draft. The
// inputs answer through two hooks each: Draft (what is being typed) and
// RestoreDraft (open the input again with that text).

// currentDraft is the text being typed now, in the focused pane's input.
func (m *Model) currentDraft() model.Draft {
	switch {
	case m.focus.isForm():
		if id, text, before, ok := m.forms[m.focus].Draft(); ok {
			return model.Draft{Kind: model.DraftField, Field: id, Text: text, Before: before}
		}
	case m.focus == PaneChecklist:
		if reason, step, text, ok := m.checklist.Draft(); ok {
			k := model.DraftNote
			if reason {
				k = model.DraftReason
			}
			return model.Draft{Kind: k, Step: step, Text: text}
		}
	case m.focus == PaneLog:
		if text, ok := m.log.Draft(); ok {
			return model.Draft{Kind: model.DraftReading, Text: text}
		}
	}
	return model.Draft{}
}

// keepDraft puts the text being typed in the job, when it changed (the
// journal then carries it).
func (m *Model) keepDraft() {
	d := m.currentDraft()
	if d.Same(m.job.Draft) {
		return
	}
	if !d.IsZero() {
		d.At = m.now()
	}
	m.job.Draft = d
}

// restoreDraft opens the input the job's draft was typed in, with its
// text, marked as a draft, and says so in the log and on the help line. A
// draft whose field or step is gone is logged, so that its text is kept.
func (m *Model) restoreDraft() {
	d := m.job.Draft
	if d.IsZero() {
		return
	}
	at := ""
	if !d.At.IsZero() {
		at = " (typed " + d.At.In(m.loc()).Format("15:04") + ")"
	}
	what, ok := "", false
	switch d.Kind {
	case model.DraftField:
		spec, found := model.FieldByID(d.Field)
		for i, f := range m.forms {
			if found && f.RestoreDraft(d.Field, d.Text, d.Before) {
				m.focus, m.form = PaneID(i), PaneID(i)
				ok = true
				break
			}
		}
		what = "the field " + spec.Label
	case model.DraftNote, model.DraftReason:
		idx := m.job.Checklist.Index(d.Step)
		if idx >= 0 {
			m.focus = PaneChecklist
			m.focusPanes()
			ok = m.checklist.RestoreDraft(d.Kind == model.DraftReason, d.Step, d.Text)
		}
		what = "the note of step " + strconv.Itoa(idx+1)
		if d.Kind == model.DraftReason {
			what = "the reason to skip step " + strconv.Itoa(idx+1)
		}
	case model.DraftReading:
		m.focus, m.lower = PaneLog, PaneLog
		m.focusPanes()
		ok = m.log.RestoreDraft(d.Text)
		what = "a level reading"
	}
	if !ok {
		// Nowhere to put it back: the text goes in the log, not lost.
		m.job.AddLog(m.now(), "a draft from the last session could not be put back (its field or step is gone); it read: "+strconv.Quote(d.Text))
		m.job.Draft = model.Draft{}
		m.touch()
		return
	}
	m.focusPanes()
	m.flash = "draft restored in " + what + at + ": not entered yet — enter enters it, esc drops it"
	m.job.AddLog(m.now(), "draft restored from the last session in "+what+at+": "+strconv.Quote(d.Text))
	m.touch()
}
