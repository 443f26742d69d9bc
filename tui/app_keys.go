package tui

import (
	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"
)

// key routes a key press: keys that work everywhere, the overlays, the
// focused pane's own keys, the root's single-letter commands, and last the
// focused pane again (a form's navigate-mode keys).
func (m *Model) key(msg tea.KeyPressMsg) tea.Cmd {
	m.flash = ""
	k := m.keys
	if m.ps.prompt != nil {
		return m.promptKey(msg)
	}
	switch {
	case key.Matches(msg, k.Quit):
		return m.quit()
	case key.Matches(msg, k.SaveNow):
		return m.saveNow()
	case key.Matches(msg, k.UnitsAny):
		return m.toggleUnits()
	}
	if m.showHelp {
		if key.Matches(msg, k.Help, k.Leave, k.QuitNav) || msg.String() == "enter" {
			m.showHelp = false
		}
		return nil
	}
	if m.jobs.open {
		return m.jobKey(msg)
	}
	if m.showResult && m.lay.Narrow {
		// The Result fills the narrow screen: = or esc goes back to the
		// pane, and the root's commands work; nothing reaches the pane
		// hidden under it.
		if key.Matches(msg, k.Result, k.Leave) {
			m.showResult = false
			m.st.gen++
			return nil
		}
		if cmd, ok := m.command(msg); ok {
			return cmd
		}
		m.flash = "= or esc goes back to the pane"
		return nil
	}
	p := m.panes[m.focus]
	if m.focus.isForm() {
		return m.formKey(msg)
	}
	if p.Claims(msg) {
		cmd, _ := p.Key(msg)
		if e := m.log.takeEntered(); e != nil {
			return tea.Batch(cmd, m.update(e))
		}
		return cmd
	}
	if cmd, ok := m.command(msg); ok {
		return cmd
	}
	cmd, _ := p.Key(msg)
	if msg.Text != "" && !key.Matches(msg, k.Up, k.Down) {
		m.flash = "“" + msg.Text + "” does nothing here. Keys: 1–4 forms, 5–9 and 0 views, ? all keys"
	}
	return cmd
}

// command runs the root's navigate-mode commands (single letters and the
// pane keys); ok is false when the key is not one of them.
func (m *Model) command(msg tea.KeyPressMsg) (tea.Cmd, bool) {
	k := m.keys
	switch {
	case key.Matches(msg, k.QuitNav):
		return m.quit(), true
	case key.Matches(msg, k.Help):
		m.showHelp = true
		return nil, true
	case key.Matches(msg, k.Units):
		return m.toggleUnits(), true
	case key.Matches(msg, k.Save):
		m.flash = "saving now (every change is saved anyway)"
		return m.saveNow(), true
	case key.Matches(msg, k.Mouse):
		m.mouse = !m.mouse
		m.flash = "mouse off: the terminal selects text again"
		if m.mouse {
			m.flash = "mouse on: tap a tab, a field, a step or a cell (shift-drag selects text)"
		}
		return nil, true
	case key.Matches(msg, k.Open) && m.share != nil:
		m.flash = "this screen is on the crew server's job; other jobs are opened on the server's own machine"
		return nil, true
	case key.Matches(msg, k.Open):
		m.jobs.open = true
		m.jobs.loading = true
		return listJobsCmd(m.dir), true
	case key.Matches(msg, k.Result) && m.lay.Narrow && !m.typing():
		m.showResult = !m.showResult
		return nil, true
	case key.Matches(msg, k.NextPane):
		return m.setFocus((m.focus + 1) % paneCount), true
	case key.Matches(msg, k.PrevPane):
		return m.setFocus((m.focus + paneCount - 1) % paneCount), true
	}
	for i, b := range k.PaneKeys {
		if key.Matches(msg, b) {
			return m.setFocus(PaneID(i)), true
		}
	}
	return nil, false
}

// formKey handles a key in a form pane: field moves that run on into the
// next form, typing, pickers, and the root's commands in navigate mode.
func (m *Model) formKey(msg tea.KeyPressMsg) tea.Cmd {
	k := m.keys
	f := m.forms[m.focus]
	switch {
	case key.Matches(msg, k.NextField):
		m.move(+1, true)
		return m.saveResume()
	case key.Matches(msg, k.PrevField):
		m.move(-1, true)
		return m.saveResume()
	case key.Matches(msg, k.Leave):
		if !f.Editing() {
			m.flash = "navigate mode: press enter to type in the marked field"
			return nil
		}
		id := f.Selected().ID
		if e := f.CancelEdit(); e != nil {
			m.flash = "put back what was there before"
			cmd := m.applyEdit(*e)
			m.commit(id)
			return cmd
		}
		m.commit(id)
		return nil
	}
	picker := f.SelectedIsPicker()
	if !picker && f.Editing() {
		switch {
		case msg.String() == "up":
			m.move(-1, false)
			return m.saveResume()
		case msg.String() == "down":
			m.move(+1, false)
			return m.saveResume()
		case key.Matches(msg, k.Edit):
			m.endEdit()
			return nil
		case key.Matches(msg, k.Restore):
			return m.restoreField()
		}
		cmd, edit := f.Key(msg)
		if edit != nil {
			return tea.Batch(cmd, m.applyEdit(*edit))
		}
		return cmd
	}
	if cmd, ok := m.command(msg); ok {
		return cmd
	}
	switch {
	case key.Matches(msg, k.Up):
		m.move(-1, false)
		return m.saveResume()
	case key.Matches(msg, k.Down):
		m.move(+1, false)
		return m.saveResume()
	case !picker && key.Matches(msg, k.Edit):
		f.StartEditing()
		return nil
	}
	if picker {
		if _, edit := f.Key(msg); edit != nil {
			return m.applyEdit(*edit)
		}
		return nil
	}
	if msg.Text != "" {
		m.flash = "not typing: press enter first to type in “" + f.Selected().Label + "”"
	}
	return nil
}

// move selects the next (+1) or previous (−1) field; with cross it runs on
// into the next or previous form at either end (tab and shift-tab), else it
// stops at the ends (↑/↓).
func (m *Model) move(d int, cross bool) {
	f := m.forms[m.focus]
	editing := f.Editing()
	if editing {
		m.commit(f.Selected().ID) // leaving a field ends typing in it
	}
	if f.Move(d) || !cross {
		if editing {
			f.StartEditing()
		}
		return
	}
	f.StopEditing()
	next := (int(m.focus) + d + formCount) % formCount
	m.focus = PaneID(next)
	m.focusPanes()
	nf := m.forms[next]
	if d > 0 {
		nf.First()
	} else {
		nf.Last()
	}
	if editing {
		nf.StartEditing()
	}
}

// setFocus selects a pane.
func (m *Model) setFocus(p PaneID) tea.Cmd {
	if m.focus.isForm() && m.forms[m.focus].Editing() {
		m.endEdit()
	}
	m.focus = p
	m.showResult = false
	if paneTable[p].lower {
		m.lower = p
	}
	m.focusPanes()
	var fit tea.Cmd
	if p == PaneLog {
		fit = m.refit() // the plan may have changed since the last fit
	}
	return tea.Batch(m.saveResume(), fit)
}

// endEdit ends typing in the focused form's field, keeping the text, and
// records it as the field's last valid text when it reads as valid.
func (m *Model) endEdit() {
	f := m.forms[m.focus]
	id := f.Selected().ID
	f.StopEditing()
	m.commit(id)
}

// paste sends pasted text to the focused pane's input (a form starts typing
// in its selected field).
func (m *Model) paste(text string) tea.Cmd {
	if m.showHelp || m.jobs.open {
		return nil
	}
	cmd, edit := m.panes[m.focus].Paste(text)
	if edit != nil {
		return tea.Batch(cmd, m.applyEdit(*edit))
	}
	return cmd
}

// click acts on a left click: a tab selects its pane; a click in a pane on
// screen focuses it and lets it choose what was tapped.
func (m *Model) click(ms tea.Mouse) tea.Cmd {
	if !m.mouse || ms.Button != tea.MouseLeft || m.lay.TooSmall || m.showHelp || m.jobs.open {
		return nil
	}
	if m.lay.Narrow {
		switch {
		case ms.Y == m.lay.Verdict.Y || ms.Y == m.lay.Tabs.Y:
			m.showResult = !m.showResult // a tap on the answer opens it, or closes it
			return nil
		case m.showResult:
			return nil
		}
	}
	if ms.Y == m.lay.Tabs.Y {
		for i, sp := range m.tabSpans() {
			if ms.X >= sp.x0 && ms.X < sp.x1 {
				return m.setFocus(PaneID(i))
			}
		}
		return nil
	}
	target, at, ok := m.paneAt(ms.X, ms.Y)
	if !ok {
		return nil
	}
	var cmds []tea.Cmd
	if target != m.focus {
		cmds = append(cmds, m.setFocus(target))
	} else if target.isForm() && m.forms[target].Editing() {
		m.endEdit()
	}
	cmd, edit := m.panes[target].Click(ms.X-at.X, ms.Y-at.Y)
	cmds = append(cmds, cmd)
	if edit != nil {
		cmds = append(cmds, m.applyEdit(*edit))
	}
	if target.isForm() {
		cmds = append(cmds, m.saveResume())
	}
	return tea.Batch(cmds...)
}

// paneAt is the pane drawn at (x, y) and where it is on the screen.
func (m *Model) paneAt(x, y int) (PaneID, rect, bool) {
	in := func(r rect) bool { return x >= r.X && x < r.X+r.W && y >= r.Y && y < r.Y+r.H }
	l := m.lay
	switch {
	case in(l.Main):
		if l.Wide && !m.focus.isForm() {
			return m.form, l.Main, true
		}
		return m.focus, l.Main, true
	case l.Wide && in(l.Side):
		return PaneSide, l.Side, true
	case l.Wide && in(l.Lower):
		return m.lowerPane(), l.Lower, true
	}
	return 0, rect{}, false
}
