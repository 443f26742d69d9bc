package tui

import "charm.land/bubbles/v2/key"

// KeyMap is every key the screens answer to, with its help text. The help
// line and the full help screen are generated from it, so help cannot drift
// from behaviour. Keys are chosen for gloves: single letters and digits in
// navigate mode; a few ctrl keys that also work while typing in a field.
//
// Focus model: in a form the selected field is either being edited (typing
// goes into it) or not (navigate mode: letters are commands). Esc leaves a
// field; Enter, or simply typing a digit-free letter command, acts in
// navigate mode. The top bar always says which mode is on.
type KeyMap struct {
	// Anywhere, also while typing.
	NextField key.Binding
	PrevField key.Binding
	Quit      key.Binding // ctrl+c
	SaveNow   key.Binding // ctrl+s
	UnitsAny  key.Binding // ctrl+u
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
	Clear   key.Binding // ctrl+w handled by the text input; listed for help
	Restore key.Binding // ctrl+r: put back the last valid text of the field

	// Navigate mode only (single keys).
	QuitNav  key.Binding // q
	Units    key.Binding // u
	Save     key.Binding // s
	Open     key.Binding // o
	PrevPane key.Binding // [
	NextPane key.Binding // ]
	Panes    key.Binding // 1-9 (help entry only)

	// Log pane.
	AddReading  key.Binding // r: type a level reading
	WriteRecord key.Binding // w: write the job record and readings CSV
	PaneKeys    [9]key.Binding
	PaneNames   [9]string
}

// DefaultKeyMap returns the key map drawdown ships with.
func DefaultKeyMap() KeyMap {
	k := KeyMap{
		NextField: key.NewBinding(key.WithKeys("tab"), key.WithHelp("tab", "next field")),
		PrevField: key.NewBinding(key.WithKeys("shift+tab"), key.WithHelp("shift+tab", "prev field")),
		Quit:      key.NewBinding(key.WithKeys("ctrl+c"), key.WithHelp("ctrl+c", "save and quit")),
		SaveNow:   key.NewBinding(key.WithKeys("ctrl+s"), key.WithHelp("ctrl+s", "save now")),
		UnitsAny:  key.NewBinding(key.WithKeys("ctrl+u"), key.WithHelp("ctrl+u", "SI ⇄ US units")),
		Help:      key.NewBinding(key.WithKeys("?", "f1"), key.WithHelp("?", "all keys")),
		Leave:     key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "stop typing")),
		CloseHelp: key.NewBinding(key.WithKeys("esc", "?"), key.WithHelp("esc/?", "close this help")),

		Up:      key.NewBinding(key.WithKeys("up", "k"), key.WithHelp("↑/k", "field up")),
		Down:    key.NewBinding(key.WithKeys("down", "j"), key.WithHelp("↓/j", "field down")),
		Edit:    key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "type in field")),
		Done:    key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "done")),
		UpDown:  key.NewBinding(key.WithKeys("up", "down"), key.WithHelp("↑↓", "field")),
		Prev:    key.NewBinding(key.WithKeys("left", "h"), key.WithHelp("←", "prev choice")),
		Next:    key.NewBinding(key.WithKeys("right", "l"), key.WithHelp("→/enter", "next choice")),
		Toggle:  key.NewBinding(key.WithKeys("space", "x"), key.WithHelp("space", "tick / untick")),
		Clear:   key.NewBinding(key.WithKeys("ctrl+w"), key.WithHelp("ctrl+w", "delete word")),
		Restore: key.NewBinding(key.WithKeys("ctrl+r"), key.WithHelp("ctrl+r", "undo field edit")),

		QuitNav:  key.NewBinding(key.WithKeys("q"), key.WithHelp("q", "save and quit")),
		Units:    key.NewBinding(key.WithKeys("u"), key.WithHelp("u", "SI ⇄ US")),
		Save:     key.NewBinding(key.WithKeys("s"), key.WithHelp("s", "save")),
		Open:     key.NewBinding(key.WithKeys("o"), key.WithHelp("o", "open a job")),
		PrevPane: key.NewBinding(key.WithKeys("["), key.WithHelp("[", "prev pane")),
		NextPane: key.NewBinding(key.WithKeys("]"), key.WithHelp("]", "next pane")),
		Panes:    key.NewBinding(key.WithKeys("1", "2", "3", "4", "5", "6", "7", "8", "9"), key.WithHelp("1-9", "pane")),
	}
	k.AddReading = key.NewBinding(key.WithKeys("r"), key.WithHelp("r", "level reading (in 9)"))
	k.WriteRecord = key.NewBinding(key.WithKeys("w"), key.WithHelp("w", "job record (in 9)"))
	k.PaneNames = [9]string{"Hose", "Lift & outlet", "Liquid & site", "Tank", "Side view",
		"Drain curve", "What-if", "Checklist", "Log"}
	for i := range k.PaneKeys {
		d := string(rune('1' + i))
		k.PaneKeys[i] = key.NewBinding(key.WithKeys(d), key.WithHelp(d, k.PaneNames[i]))
	}
	return k
}

// shortHelp is the one-line help for the present state. Only keys that do
// something now are listed.
func (k KeyMap) shortHelp(editing, picker, form bool) []key.Binding {
	// Most needed first: the line is cut at the right on a narrow screen.
	switch {
	case picker:
		return []key.Binding{k.Next, k.Prev, k.UpDown, k.Panes, k.Help, k.QuitNav, k.Units}
	case editing:
		return []key.Binding{k.Done, k.Leave, k.NextField, k.Quit, k.UnitsAny, k.Restore}
	case form:
		return []key.Binding{k.Edit, k.UpDown, k.Panes, k.Help, k.QuitNav, k.Units, k.Open}
	}
	return []key.Binding{k.Panes, k.Help, k.QuitNav, k.Units, k.Open, k.Save}
}

// fullHelp is the full help screen, in columns.
func (k KeyMap) fullHelp() [][]key.Binding {
	panes := make([]key.Binding, 0, len(k.PaneKeys)+2)
	panes = append(panes, k.PaneKeys[:]...)
	panes = append(panes, k.PrevPane, k.NextPane)
	return [][]key.Binding{
		{k.NextField, k.PrevField, k.Up, k.Down, k.Edit, k.Leave, k.Prev, k.Next, k.Toggle, k.Restore},
		panes,
		{k.QuitNav, k.Units, k.Save, k.Open, k.Help, k.Quit, k.SaveNow, k.UnitsAny, k.AddReading, k.WriteRecord},
	}
}
