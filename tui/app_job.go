package tui

import (
	"strconv"
	"strings"

	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

// Changes to the job. Each one changes m.job, recomputes the plan when an
// input changed, touches the state the panes show, logs what the technician
// chose and returns the save.

// applyEdit stores a field's new text, recomputes and saves.
func (m *Model) applyEdit(e FieldEdit) tea.Cmd {
	prevPreset := strings.TrimSpace(m.job.Inputs[model.FieldTankPreset])
	_ = m.job.Set(e.ID, e.Text) // the error comes back with the plan's field errors
	if e.ID == model.FieldTankPreset {
		if t, ok := m.cat.Tank(e.Text); ok {
			if prev := m.job.TankSizesText(); prev != "" && (prevPreset == "" || prevPreset == "custom") {
				// Keep what was typed by hand before the catalogue
				// replaced it; browsing from one catalogue tank to the
				// next logs nothing.
				m.job.AddLog(m.now(), "Tank sizes typed before the catalogue choice: "+prev)
			}
			m.job.ApplyTankPreset(t)
			m.flash = "tank set from the catalogue: " + t.Name + "; now set the liquid level"
		}
	}
	m.recompute()
	return m.save()
}

// restoreField puts back the field's last valid text (ctrl+r).
func (m *Model) restoreField() tea.Cmd {
	f := m.forms[m.focus]
	id := f.Selected().ID
	old, ok := m.job.LastGood[id]
	switch {
	case !ok:
		m.flash = "no earlier valid text for this field"
		return nil
	case old == m.job.Inputs[id]:
		m.flash = "nothing to undo: the field holds its last valid text"
		return nil
	}
	f.SetText(old)
	return m.applyEdit(FieldEdit{ID: id, Text: old})
}

// recompute runs model.Compute, words the plan once (present.Build) and
// hands both to the panes. It is the only place the plan changes. When an
// input is wrong, the plan from each wrong field's last valid text (the job's
// LastGood, kept in the job file) stands in, marked stale.
func (m *Model) recompute() {
	if m.sameInputs() {
		return // nothing physical changed (app.go)
	}
	compute := model.Compute
	if m.typingField() {
		compute = model.ComputeQuick
	}
	p := compute(m.job, m.cat)
	m.keepInputs(p.OK())
	// The checklist's context is derived again from the job as it stands
	// and this plan after every compute (model.ContextFor): nothing in it
	// sticks, and a wrong field never leaves the checklist built for the
	// last valid liquid (glycol at a temperature outside its data still
	// gets its toxic step).
	m.job.RebuildChecklist(p)
	m.st.errs = p.FieldErrors
	m.st.stale = !p.OK()
	m.st.problem = ""
	if !p.OK() {
		m.st.problem = present.FirstProblem(m.st.errs)
		if m.st.problem == "" {
			m.st.problem = p.Err.Error() // no field to blame: the plan's own error
		}
		if in, ok := m.job.LastGoodInputs(p.FieldErrors); ok {
			last := m.job // the same job and facts, with each wrong field's last valid text
			last.Inputs = in
			if lp := compute(last, m.cat); lp.OK() {
				p = lp
			}
		}
	}
	if p.OK() {
		m.st.plan, m.st.hasPlan = p, true
		m.st.sheet = present.ForJob(m.job, p, m.job.Units)
		m.planGen++
	} else if !m.st.hasPlan {
		m.st.sheet = present.Build(p, m.job.Units, 0)
	}
	m.touch()
}

// commit records the field's text as its last valid text when typing in it
// ends and it reads as valid (model.Job.Commit).
func (m *Model) commit(id model.FieldID) {
	if id != "" && m.job.Commit(id, m.cat) {
		m.st.gen++
	}
}

func (m *Model) toggleUnits() tea.Cmd {
	sys := model.US
	if m.job.Units == model.US {
		sys = model.SI
	}
	m.job.SetUnits(sys)
	m.job.AddLog(m.now(), "units switched to "+sys.String())
	m.recompute()
	m.flash = "units: " + sysName(sys) + "; what you typed keeps its unit"
	return m.save()
}

func sysName(s model.System) string {
	if s == model.US {
		return "US (ft, in, psi, °F, gal)"
	}
	return "SI (m, mm, kPa, °C, L)"
}

// adopt takes a What-if cell as the job's hose.
func (m *Model) adopt(a WhatIfAdoptMsg) tea.Cmd {
	sys := m.job.Units
	l := model.Format(model.DimLength, a.Length, sys)
	d := model.Format(model.DimDiameter, a.Diameter, sys)
	n := strconv.Itoa(max(a.Hoses, 1))
	_ = m.job.Set(model.FieldHoseLength, l)
	_ = m.job.Set(model.FieldHoseID, d)
	_ = m.job.Set(model.FieldHoseCount, n)
	m.job.AddLog(m.now(), "what-if: hose changed to "+n+" × "+d+" bore, "+l+" long")
	m.recompute()
	m.flash = "now using " + n + " × " + d + ", " + l + " (see the Hose pane)"
	return m.save()
}

// mark records a checklist step's state with the time (model.Job.Mark: it
// logs the step by its label and closes or reopens the job), and saves.
func (m *Model) mark(c ChecklistMarkMsg) tea.Cmd {
	now := m.now()
	wasClosed := !m.job.Closed.IsZero()
	if err := m.job.Mark(c.ID, c.State, c.Reason, "", now); err != nil {
		m.flash = err.Error()
		m.checklist.Refused(c.ID) // keep the cursor on the step that was refused
		return nil
	}
	if !wasClosed && !m.job.Closed.IsZero() {
		m.flash = "job closed out: write the record with w in the Log pane"
	}
	if c.Current != "" {
		m.job.Resume.StepID = c.Current
		m.job.Resume.Step = m.job.Checklist.Index(c.Current)
	}
	m.touch()
	return m.save()
}

// jobEdit makes a change to the job from the Job pane with the root's
// clock: the model's setter checks the text and logs the change. A site
// fact can change the checklist and the plan (water that may carry oil
// stops the drain where air starts), so the plan is computed again.
func (m *Model) jobEdit(e JobEditMsg) tea.Cmd {
	if err := e.Do(&m.job, m.now()); err != nil {
		m.jobp.Refused(err.Error())
		return nil
	}
	m.jobp.Taken()
	m.flash = "saved: " + e.What
	m.recompute()
	return m.save()
}

// note replaces a checklist step's note.
func (m *Model) note(n ChecklistNoteMsg) tea.Cmd {
	if err := m.job.Checklist.SetNote(n.ID, n.Note); err != nil {
		m.flash = err.Error()
		return nil
	}
	m.touch()
	return m.save()
}

func (m *Model) recordWritten(msg recordWrittenMsg) tea.Cmd {
	if msg.err != nil {
		m.flash = "✗ record not written: " + msg.err.Error()
		return nil
	}
	m.flash = "record written: " + strings.Join(msg.paths, ", ")
	m.job.AddLog(m.now(), "job record written: "+strings.Join(msg.paths, ", "))
	m.touch()
	return m.save()
}

// loaded replaces the job with one opened from the job list.
func (m *Model) loaded(msg jobLoadedMsg) tea.Cmd {
	if msg.err != nil {
		m.jobs.err = msg.err
		return nil
	}
	m.jobs.open = false
	m.job = msg.job
	if m.job.Inputs == nil {
		m.job.Inputs = map[model.FieldID]string{}
	}
	if m.job.LastGood == nil {
		m.job.CommitAll(m.cat)
	}
	m.path = msg.path
	m.markedAs = ""
	m.st = screenState{job: &m.job}
	m.shown = [paneCount]uint64{}
	checklist := NewChecklistView(m.styles, m.keys, nil)
	*m.checklist = checklist
	m.checklist.SetChecklist(m.job.Checklist)
	m.checklist.SetCurrent(m.job.Resume.StepID)
	m.resume()
	m.recompute()
	m.resize(m.width, m.height)
	m.focusPanes()
	return m.save()
}

// whatIfMsg carries a What-if grid computed in the background.
type whatIfMsg struct {
	seq   uint64
	table WhatIfTable
	ok    bool
	err   error
}

// whatIfCmd computes the What-if grid for the present plan when the pane is
// on screen and the plan changed since the last grid. The sweep is a few
// dozen drain plans (several milliseconds), so it runs as a command tagged
// with a counter; it captures copies of what it needs, never the model.
func (m *Model) whatIfCmd() tea.Cmd {
	on := m.focus == PaneWhatIf || (m.lay.Wide && m.lowerPane() == PaneWhatIf)
	if !on || m.whatIfGen == m.planGen || !m.st.hasPlan {
		return nil
	}
	m.whatIfGen = m.planGen
	m.whatIfSeq++
	seq := m.whatIfSeq
	p := m.st.plan
	in := p.DrainIn
	if p.Drain == nil {
		in = calc.DrainInput{Siphon: p.Siphon}
	}
	hasTank := p.Drain != nil
	h := p.Siphon.Hose
	hoses := p.Siphon.Hoses
	return func() tea.Msg {
		ls, ds := calc.AroundChoice(h.Length, h.Diameter)
		g, err := calc.WhatIf(in, ls, ds)
		if err != nil {
			return whatIfMsg{seq: seq, err: err}
		}
		return whatIfMsg{seq: seq, ok: true, table: WhatIfFromGrid(g, float64(h.Length), float64(h.Diameter), hoses, hasTank)}
	}
}

// whatIfReady takes a grid when it is for the latest plan.
func (m *Model) whatIfReady(msg whatIfMsg) {
	if msg.seq != m.whatIfSeq {
		return
	}
	if msg.err != nil || !msg.ok {
		m.whatif.ClearTable()
		return
	}
	m.whatif.SetTable(msg.table)
}
