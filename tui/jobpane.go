package tui

import (
	"strings"
	"time"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// JobEditMsg asks the root to change the job as a whole: an entry, the
// crew, a site fact, the release record, its state. Do makes the change
// through the model's own setter (which checks the text and logs it) at the
// root's clock; the pane never changes the job itself. What names the
// change for the help line.
type JobEditMsg struct {
	What string
	Do   func(j *model.Job, at time.Time) error
}

// jobRowKind is what a row of the Job pane does.
type jobRowKind int

const (
	rowHeading jobRowKind = iota // a section title
	rowText                      // enter types its text; enter again saves it
	rowFlag                      // enter or space flips yes / no
	rowChoice                    // enter browses the choices with ←/→; enter takes one
	rowAction                    // enter types what the action needs, then does it
	rowItem                      // a listed entry (a crew member); d removes it
)

// jobRow is one row of the Job pane, built from the job on every Show.
type jobRow struct {
	kind  jobRowKind
	label string
	value string // as shown
	// prompt is the input's hint; initial the text the input starts with.
	prompt, initial string
	// set applies typed text (rowText, rowAction); flip a flag; remove a
	// listed entry. Each returns the change for the root.
	set    func(text string) JobEditMsg
	flip   func() JobEditMsg
	remove func() JobEditMsg
	// choices and chosen for rowChoice; pick applies choice i.
	choices []string
	chosen  int
	pick    func(i int) JobEditMsg
}

// JobPane shows and edits the job itself: its name and entries, the crew,
// the site facts the checklist is built from, a sheen seen, the record of
// a containment release, and the job's state. Every change goes to the
// root as a JobEditMsg.
type JobPane struct {
	rows    []jobRow
	cur     int
	top     int
	w, h    int
	styles  Styles
	keys    JobKeys
	focused bool

	loc      *time.Location // times are shown in it
	typing   bool
	browsing bool // ←/→ over a rowChoice's choices
	browse   int
	input    textinput.Model
	errText  string
}

// NewJobPane returns an empty Job pane.
func NewJobPane(st Styles, km KeyMap, loc *time.Location) JobPane {
	if loc == nil {
		loc = time.Local
	}
	ti := textinput.New()
	ti.Prompt = "› "
	ti.CharLimit = 400
	ts := ti.Styles()
	ts.Cursor.Blink = false // a blinking cursor streams bytes over SSH
	ti.SetStyles(ts)
	ti.SetVirtualCursor(false) // the root places the terminal's own cursor
	return JobPane{styles: st, keys: km.Job, input: ti, cur: 1, loc: loc}
}

// SetSize sets the pane's size in cells.
func (p *JobPane) SetSize(w, h int) {
	p.w, p.h = max(w, 0), max(h, 0)
	p.input.SetWidth(max(p.w-4, 1))
}

// SetStyles replaces the styles.
func (p *JobPane) SetStyles(st Styles) { p.styles = st }

// Show rebuilds the rows from the job.
func (p *JobPane) Show(st *screenState) {
	p.rows = jobRows(*st.job, p.loc)
	p.cur = clamp(p.cur, 0, max(len(p.rows)-1, 0))
	if len(p.rows) > 0 && p.rows[p.cur].kind == rowHeading {
		p.move(1)
	}
}

// Focus gives the pane the focus.
func (p *JobPane) Focus() { p.focused = true }

// Blur takes the focus and drops a half-typed entry (the job is unchanged).
func (p *JobPane) Blur() {
	p.focused = false
	p.closeInput()
}

// Typing reports whether keys go into the text input.
func (p *JobPane) Typing() bool { return p.typing }

func (p *JobPane) closeInput() {
	p.typing, p.browsing, p.errText = false, false, ""
	p.input.Blur()
	p.input.Reset()
}

// Refused shows why the root refused a change and, when it was typed,
// keeps the input open so that it can be corrected.
func (p *JobPane) Refused(msg string) { p.errText = msg }

// Taken closes the input after the root made the change.
func (p *JobPane) Taken() { p.closeInput() }

// move goes n rows up or down, over the headings.
func (p *JobPane) move(n int) {
	i := p.cur
	for {
		i += n
		if i < 0 || i >= len(p.rows) {
			return
		}
		if p.rows[i].kind != rowHeading {
			p.cur = i
			return
		}
	}
}

func emit(e JobEditMsg) tea.Cmd { return func() tea.Msg { return e } }

// ShortHelp lists the keys that do something now.
func (p *JobPane) ShortHelp() []key.Binding {
	k := p.keys
	switch {
	case p.typing:
		return []key.Binding{k.Submit, k.Cancel}
	case p.browsing:
		return []key.Binding{k.Next, k.Prev, k.Submit, k.Cancel}
	}
	out := []key.Binding{k.Up, k.Down}
	if p.cur < len(p.rows) {
		switch p.rows[p.cur].kind {
		case rowText:
			out = append([]key.Binding{k.Edit}, out...)
		case rowFlag:
			out = append([]key.Binding{k.Flip}, out...)
		case rowChoice:
			out = append([]key.Binding{k.Choose}, out...)
		case rowAction:
			out = append([]key.Binding{k.Act}, out...)
		case rowItem:
			out = append([]key.Binding{k.Remove}, out...)
		case rowHeading:
		}
	}
	return out
}

// Claims takes the pane's own keys, and every key while typing.
func (p *JobPane) Claims(msg tea.KeyPressMsg) bool {
	return p.typing || p.browsing || key.Matches(msg, p.ShortHelp()...)
}

// Key handles a key with the pane focused.
func (p *JobPane) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) {
	k := p.keys
	switch {
	case p.typing:
		switch {
		case key.Matches(msg, k.Cancel):
			p.closeInput()
			return nil, nil
		case key.Matches(msg, k.Submit):
			return emit(p.rows[p.cur].set(p.input.Value())), nil
		}
		var cmd tea.Cmd
		p.input, cmd = p.input.Update(msg)
		p.errText = ""
		return cmd, nil
	case p.browsing:
		r := p.rows[p.cur]
		n := len(r.choices)
		switch {
		case key.Matches(msg, k.Cancel):
			p.closeInput()
		case key.Matches(msg, k.Next):
			p.browse = (p.browse + 1) % n
		case key.Matches(msg, k.Prev):
			p.browse = (p.browse + n - 1) % n
		case key.Matches(msg, k.Submit):
			i := p.browse
			p.closeInput()
			return emit(r.pick(i)), nil
		}
		return nil, nil
	}
	switch {
	case key.Matches(msg, k.Up):
		p.move(-1)
	case key.Matches(msg, k.Down):
		p.move(1)
	case p.cur >= len(p.rows):
	default:
		return p.act(msg), nil
	}
	return nil, nil
}

// act does what the key means on the selected row.
func (p *JobPane) act(msg tea.KeyPressMsg) tea.Cmd {
	k := p.keys
	r := p.rows[p.cur]
	switch r.kind {
	case rowText, rowAction:
		if key.Matches(msg, k.Edit) {
			return p.openInput(r)
		}
	case rowFlag:
		if key.Matches(msg, k.Flip) {
			return emit(r.flip())
		}
	case rowChoice:
		if key.Matches(msg, k.Choose) && len(r.choices) > 0 {
			p.browsing, p.browse = true, max(r.chosen, 0)
		}
	case rowItem:
		if key.Matches(msg, k.Remove) && r.remove != nil {
			return emit(r.remove())
		}
	case rowHeading:
	}
	return nil
}

func (p *JobPane) openInput(r jobRow) tea.Cmd {
	p.typing, p.errText = true, ""
	p.input.Reset()
	p.input.SetValue(r.initial)
	p.input.CursorEnd()
	p.input.Placeholder = r.prompt
	return p.input.Focus()
}

// Paste puts pasted text into the entry being typed.
func (p *JobPane) Paste(text string) (tea.Cmd, *FieldEdit) {
	if !p.typing {
		return nil, nil
	}
	var cmd tea.Cmd
	p.input, cmd = p.input.Update(tea.PasteMsg{Content: oneLineText(text)})
	return cmd, nil
}

// Click selects the row under the pointer.
func (p *JobPane) Click(_, y int) (tea.Cmd, *FieldEdit) {
	if p.typing || p.browsing {
		return nil, nil
	}
	i := p.top + y - 1 // the title line
	if i >= 0 && i < len(p.rows) && p.rows[i].kind != rowHeading {
		p.cur = i
	}
	return nil, nil
}

// CursorPos is the terminal cursor in the entry being typed, or nil.
func (p *JobPane) CursorPos() *tea.Cursor {
	if !p.typing || p.w <= 0 || p.h <= 0 {
		return nil
	}
	c := p.input.Cursor()
	if c == nil {
		return nil
	}
	n := 2 // the label and the input at the foot, then the error line
	if p.errText != "" {
		n++
	}
	c.Y = p.h - n + 1
	c.X = min(c.X, p.w-1)
	if c.Y < 0 || c.Y >= p.h {
		return nil
	}
	return c
}

// splitPair reads "first, second" (the second may be empty).
func splitPair(text string) (string, string) {
	a, b, _ := strings.Cut(text, ",")
	return strings.TrimSpace(a), strings.TrimSpace(b)
}
