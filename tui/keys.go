package tui

import (
	"charm.land/bubbles/v2/key"
)

// KeyMap is every key the screen answers to, with its help text: the
// root's, the forms', and each view's own (Checklist, What-if, Log, the job
// list). The help line and the full help screen are generated from it, so
// help cannot drift from behaviour. Keys are chosen for gloves: single
// letters and digits in navigate mode; a few ctrl keys that also work while
// typing in a field.
//
// Focus model: in a form the selected field is either being edited (typing
// goes into it) or not (navigate mode: letters are commands). Esc leaves a
// field; Enter starts typing in navigate mode. The top bar always says which
// mode is on.
type KeyMap struct {
	// Anywhere, also while typing.
	NextField key.Binding
	PrevField key.Binding
	Quit      key.Binding // ctrl+c
	SaveNow   key.Binding // ctrl+s
	UnitsAny  key.Binding // F2 (ctrl+u clears a field, as in a shell)
	Help      key.Binding // ? or F1
	Leave     key.Binding // esc: stop editing / close an overlay
	CloseHelp key.Binding // esc or ? on the help screen

	// Form movement.
	Up      key.Binding
	Down    key.Binding
	Edit    key.Binding // enter: type in the field (navigate mode)
	Done    key.Binding // enter: done typing (the same key, for the help line)
	UpDown  key.Binding // ↑/↓ for the help line (Up and Down do the work)
	Prev    key.Binding // left: previous choice in a picker
	Next    key.Binding // right: next choice in a picker
	Toggle  key.Binding // space: tick a fitting in a multi picker
	Clear   key.Binding // ctrl+u clears to the start, as in a shell (the text input's own key); listed for help
	Restore key.Binding // ctrl+r: put back the last valid text of the field

	// Navigate mode only (single keys).
	QuitNav  key.Binding // q
	Units    key.Binding // u
	Save     key.Binding // s
	Open     key.Binding // o
	Mouse    key.Binding // m: mouse on / off
	Result   key.Binding // =: the Result in place of the pane (narrow screen)
	PrevPane key.Binding // [
	NextPane key.Binding // ]
	Panes    key.Binding // the pane keys as one help entry
	// PaneKeys select the panes, in the order of paneTable.
	PaneKeys []key.Binding

	// Log pane.
	AddReading     key.Binding // r: type a level reading (with its time when not now)
	AddFlowTest    key.Binding // f: type a bucket-and-stopwatch flow test
	CorrectReading key.Binding // e: choose a reading and correct its level and time
	WriteRecord    key.Binding // w: write the job record and readings CSV
	ScrollUp       key.Binding // ↑: older entries
	ScrollDown     key.Binding // ↓: newer entries

	Checklist ChecklistKeys
	WhatIf    WhatIfKeys
	Jobs      JobListKeys
	Job       JobKeys
}

// JobKeys are the Job pane's keys.
type JobKeys struct {
	Up, Down   key.Binding
	Edit       key.Binding // enter: type the entry
	Flip       key.Binding // enter or space: yes / no
	Choose     key.Binding // enter: browse the choices
	Act        key.Binding // enter: do the row's action
	Remove     key.Binding // d: remove a listed entry
	Next, Prev key.Binding // →/← over the choices
	Submit     key.Binding // enter while typing or choosing
	Cancel     key.Binding // esc while typing or choosing
}

// ChecklistKeys are the Checklist pane's keys.
type ChecklistKeys struct {
	Up, Down   key.Binding
	Done       key.Binding // d or enter
	Skip       key.Binding // s: asks for a reason
	NotApplies key.Binding // x: not applicable
	Reopen     key.Binding // backspace: back to "to do"
	Note       key.Binding // n: add or change the note
	Submit     key.Binding // enter while typing
	Cancel     key.Binding // esc while typing
}

// WhatIfKeys are the What-if pane's keys.
type WhatIfKeys struct {
	Up, Down, Left, Right, Adopt key.Binding
}

// JobListKeys are the keys of the open-job overlay.
type JobListKeys struct {
	Open, New, Copy, Demo, Back key.Binding
	// Up and Down move in the list; Next, Prev and Pick choose what a new
	// job starts from; Create names it and makes it.
	Up, Down, Next, Prev, Pick, Create key.Binding
}

// paneKeyNames are the keys that select panes, in tab order: the digits,
// then 0. A table with more panes than keys leaves the rest to [ and ].
var paneKeyNames = []string{"1", "2", "3", "4", "5", "6", "7", "8", "9", "0"}

// DefaultKeyMap returns the key map drawdown ships with.
func DefaultKeyMap() KeyMap {
	k := KeyMap{
		NextField: key.NewBinding(key.WithKeys("tab"), key.WithHelp("tab", "next field")),
		PrevField: key.NewBinding(key.WithKeys("shift+tab"), key.WithHelp("shift+tab", "prev field")),
		Quit:      key.NewBinding(key.WithKeys("ctrl+c"), key.WithHelp("ctrl+c", "save and quit")),
		SaveNow:   key.NewBinding(key.WithKeys("ctrl+s"), key.WithHelp("ctrl+s", "save now")),
		UnitsAny:  key.NewBinding(key.WithKeys("f2"), key.WithHelp("F2", "SI ⇄ US units")),
		Help:      key.NewBinding(key.WithKeys("?", "f1"), key.WithHelp("?", "all keys")),
		Leave:     key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "cancel the edit")),
		CloseHelp: key.NewBinding(key.WithKeys("esc", "?"), key.WithHelp("esc/?", "close this help")),

		Up:      key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "field up")),
		Down:    key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "field down")),
		Edit:    key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "type in field")),
		Done:    key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "done")),
		UpDown:  key.NewBinding(key.WithKeys("up", "down"), key.WithHelp("↑↓", "field")),
		Prev:    key.NewBinding(key.WithKeys("left", "h"), key.WithHelp("←", "prev choice")),
		Next:    key.NewBinding(key.WithKeys("right", "l"), key.WithHelp("→/enter", "next choice")),
		Toggle:  key.NewBinding(key.WithKeys("space", "x"), key.WithHelp("space", "tick / untick")),
		Clear:   key.NewBinding(key.WithKeys("ctrl+u"), key.WithHelp("ctrl+u", "clear the field")),
		Restore: key.NewBinding(key.WithKeys("ctrl+r"), key.WithHelp("ctrl+r", "last valid text")),

		QuitNav:  key.NewBinding(key.WithKeys("q"), key.WithHelp("q", "save and quit")),
		Units:    key.NewBinding(key.WithKeys("u"), key.WithHelp("u", "SI ⇄ US")),
		Save:     key.NewBinding(key.WithKeys("s"), key.WithHelp("s", "save")),
		Open:     key.NewBinding(key.WithKeys("o"), key.WithHelp("o", "jobs: open, new, copy")),
		Mouse:    key.NewBinding(key.WithKeys("m"), key.WithHelp("m", "mouse on/off")),
		Result:   key.NewBinding(key.WithKeys("="), key.WithHelp("=", "result (narrow screen)")),
		PrevPane: key.NewBinding(key.WithKeys("["), key.WithHelp("[", "prev pane")),
		NextPane: key.NewBinding(key.WithKeys("]"), key.WithHelp("]", "next pane")),

		AddReading:     key.NewBinding(key.WithKeys("r"), key.WithHelp("r", "reading")),
		AddFlowTest:    key.NewBinding(key.WithKeys("f"), key.WithHelp("f", "flow test")),
		CorrectReading: key.NewBinding(key.WithKeys("e"), key.WithHelp("e", "correct")),
		WriteRecord:    key.NewBinding(key.WithKeys("w"), key.WithHelp("w", "job record")),
		ScrollUp:       key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "older")),
		ScrollDown:     key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "newer")),

		Checklist: ChecklistKeys{
			Up:         key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "prev step")),
			Down:       key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "next step")),
			Done:       key.NewBinding(key.WithKeys("d", "enter"), key.WithHelp("d/enter", "done")),
			Skip:       key.NewBinding(key.WithKeys("s"), key.WithHelp("s", "skip (reason)")),
			NotApplies: key.NewBinding(key.WithKeys("x"), key.WithHelp("x", "not applicable")),
			Reopen:     key.NewBinding(key.WithKeys("backspace"), key.WithHelp("⌫", "back to to-do")),
			Note:       key.NewBinding(key.WithKeys("n"), key.WithHelp("n", "note")),
			Submit:     key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "save")),
			Cancel:     key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "cancel")),
		},
		WhatIf: WhatIfKeys{
			Up:    key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "shorter hose")),
			Down:  key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "longer hose")),
			Left:  key.NewBinding(key.WithKeys("left", "h"), key.WithHelp("←/h", "smaller bore")),
			Right: key.NewBinding(key.WithKeys("right", "l"), key.WithHelp("→/l", "larger bore")),
			Adopt: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "use this hose")),
		},
		Job: JobKeys{
			Up:     key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "up")),
			Down:   key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "down")),
			Edit:   key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "type it")),
			Flip:   key.NewBinding(key.WithKeys("enter", "space"), key.WithHelp("enter", "yes ⇄ no")),
			Choose: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "choose")),
			Act:    key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "record it")),
			Remove: key.NewBinding(key.WithKeys("d", "delete"), key.WithHelp("d", "remove")),
			Next:   key.NewBinding(key.WithKeys("right", "l"), key.WithHelp("→", "next choice")),
			Prev:   key.NewBinding(key.WithKeys("left", "h"), key.WithHelp("←", "prev choice")),
			Submit: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "save")),
			Cancel: key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "cancel")),
		},
		Jobs: JobListKeys{
			Open: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "open")),
			New:  key.NewBinding(key.WithKeys("n"), key.WithHelp("n", "new job")),
			Copy: key.NewBinding(key.WithKeys("c"), key.WithHelp("c", "copy this job")),
			Demo: key.NewBinding(key.WithKeys("d"), key.WithHelp("d", "new demo job")),
			Back: key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "back")),

			Up:     key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "up")),
			Down:   key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "down")),
			Next:   key.NewBinding(key.WithKeys("right", "l"), key.WithHelp("→", "next")),
			Prev:   key.NewBinding(key.WithKeys("left", "h"), key.WithHelp("←", "prev")),
			Pick:   key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "start from this")),
			Create: key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "create it")),
		},
	}
	n := min(int(paneCount), len(paneKeyNames))
	k.PaneKeys = make([]key.Binding, n)
	for i := range n {
		d := paneKeyNames[i]
		k.PaneKeys[i] = key.NewBinding(key.WithKeys(d), key.WithHelp(d, paneTable[i].name))
	}
	k.Panes = key.NewBinding(key.WithKeys(paneKeyNames[:n]...),
		key.WithHelp(paneKeyNames[0]+"-"+paneKeyNames[n-1], "pane"))
	return k
}

// formHelp is the one-line help in a form. Only keys that do something now
// are listed, most needed first: the line is cut at the right on a narrow
// screen.
func (k KeyMap) formHelp(editing, picker bool) []key.Binding {
	switch {
	case picker:
		return []key.Binding{k.Next, k.Prev, k.UpDown, k.Panes, k.Help, k.QuitNav, k.Units}
	case editing:
		return []key.Binding{k.Done, k.Leave, k.Clear, k.NextField, k.Restore, k.Quit, k.UnitsAny}
	}
	return []key.Binding{k.Edit, k.UpDown, k.Panes, k.Help, k.QuitNav, k.Units, k.Open}
}

// navHelp is the root's navigate-mode commands for the help line of a view,
// without those whose key the view's own keys take (in the Checklist, s is
// "skip", not "save").
func (k KeyMap) navHelp(own []key.Binding) []key.Binding {
	taken := map[string]bool{}
	for _, b := range own {
		for _, s := range b.Keys() {
			taken[s] = true
		}
	}
	var out []key.Binding
	for _, b := range []key.Binding{k.Panes, k.Help, k.QuitNav, k.Units, k.Open, k.Save} {
		free := true
		for _, s := range b.Keys() {
			free = free && !taken[s]
		}
		if free {
			out = append(out, b)
		}
	}
	return out
}

// fullHelp is the full help screen, in columns.
func (k KeyMap) fullHelp() [][]key.Binding {
	panes := make([]key.Binding, 0, len(k.PaneKeys)+2)
	panes = append(panes, k.PaneKeys...)
	panes = append(panes, k.PrevPane, k.NextPane)
	return [][]key.Binding{
		{k.NextField, k.PrevField, k.Up, k.Down, k.Edit, k.Leave, k.Clear, k.Prev, k.Next, k.Toggle, k.Restore},
		panes,
		{k.QuitNav, k.Units, k.Save, k.Open, k.Mouse, k.Result, k.Help, k.Quit, k.SaveNow, k.UnitsAny},
	}
}

// fullHelpTitles head the columns of fullHelp.
var fullHelpTitles = []string{"In a form", "Panes", "Anywhere"}

// viewKeys are one view's own keys for the full help screen.
type viewKeys struct {
	name string
	keys []key.Binding
}

// viewHelp lists the keys each view answers besides the root's.
func (k KeyMap) viewHelp() []viewKeys {
	c, w := k.Checklist, k.WhatIf
	return []viewKeys{
		{paneTable[PaneChecklist].name, []key.Binding{c.Done, c.Skip, c.NotApplies, c.Note, c.Reopen}},
		{paneTable[PaneWhatIf].name, []key.Binding{w.Up, w.Down, w.Left, w.Right, w.Adopt}},
		{paneTable[PaneLog].name, []key.Binding{k.AddReading, k.AddFlowTest, k.CorrectReading, k.WriteRecord, k.ScrollUp, k.ScrollDown}},
		{paneTable[PaneJob].name, []key.Binding{k.Job.Edit, k.Job.Flip, k.Job.Remove, k.Job.Cancel}},
	}
}
