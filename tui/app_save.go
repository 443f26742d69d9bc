package tui

import tea "charm.land/bubbletea/v2"

// The save state machine: every change is saved at once, one save in flight
// at a time; a change during a save marks the job dirty and another save
// follows when the first is back.

// quit stops the program; main saves once more after it ends (SaveFinal).
func (m *Model) quit() tea.Cmd {
	m.quitting = true
	return tea.Quit
}

// save starts a save of a copy of the job, or marks the job dirty when a
// save is in flight.
func (m *Model) save() tea.Cmd {
	if m.noSave {
		return nil
	}
	if m.saving {
		m.dirty = true
		return nil
	}
	m.saving, m.dirty = true, false
	m.saveSeq++
	mark := m.markedAs != m.path
	return saveCmd(m.path, m.job.Clone(), m.saveSeq, mark)
}

// saveResume records where the technician is, then saves.
func (m *Model) saveResume() tea.Cmd {
	r := &m.job.Resume
	r.Pane = m.focus.String()
	if m.focus.isForm() {
		r.Field = m.forms[m.focus].Selected().ID
	}
	if id := m.checklist.CurrentID(); id != "" {
		r.StepID, r.Step = id, m.job.Checklist.Index(id)
	}
	return m.save()
}

// saved takes a save's reply; a stale one is dropped.
func (m *Model) saved(msg jobSavedMsg) tea.Cmd {
	if msg.seq != m.saveSeq {
		return nil
	}
	m.saving = false
	m.saveErr = msg.err
	if msg.err == nil {
		m.lastSaved = msg.at
		m.markedAs = msg.path
	}
	if m.dirty {
		return m.save()
	}
	return nil
}
