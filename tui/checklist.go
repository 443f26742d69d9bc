package tui

import (
	"strconv"
	"strings"
	"time"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// ChecklistMarkMsg asks the root to mark a checklist step (model.Checklist.
// Mark): done, skipped with a reason, not applicable, or back to pending.
// The root adds the time from its clock and saves the job; the pane never
// changes the job itself.
type ChecklistMarkMsg struct {
	ID     string
	State  model.StepState
	Reason string // required (non-blank) for model.StateSkipped
	// Current is the step selected after this mark (the pane moves on
	// after "done"), for the root to save so a reopened job resumes there.
	Current string
}

// ChecklistNoteMsg asks the root to replace a step's note
// (model.Checklist.SetNote).
type ChecklistNoteMsg struct {
	ID, Note string
}

// ChecklistStepMsg tells the root which step the technician is on, so that
// reopening the job resumes at the same step.
type ChecklistStepMsg struct {
	ID string
}

// ckMode is what the pane's input line is doing.
type ckMode int

const (
	ckBrowse   ckMode = iota // moving and marking
	ckReason                 // typing a reason to skip
	ckReasonNA               // typing why a required step does not apply
	ckNote                   // typing a note
)

// ChecklistView steps through the job's checklist: a scrolling list of the
// steps with their state ([✓] done, [ ] to do, [↷] skipped, [–] not
// applicable), the progress ("7/19 done"), and the selected step in full
// with its caution in a box. Marks and notes go to the root as messages.
type ChecklistView struct {
	w, h    int
	cl      model.Checklist
	cur     int // selected step
	mode    ckMode
	input   textinput.Model
	errText string // shown under the input, e.g. a missing reason
	draft   bool   // the input holds a draft put back from the last session
	keys    ChecklistKeys
	styles  Styles
	focused bool

	// A mark moves the selection on; the same key again within
	// markBounce, on the step it moved to, is a bounce (a gloved finger, a
	// sticky key) and is ignored once. now is the root's clock.
	now      func() time.Time
	lastKey  string
	lastAt   time.Time
	lastStep int
}

// markBounce is how soon after a mark the same key on the next step is
// taken for a bounce: 1 s (our choice: two Enters 0.48 s apart marked two
// hazard steps; reading a step takes longer than a second).
const markBounce = time.Second

// NewChecklistView returns an empty Checklist pane.
func NewChecklistView(st Styles, km KeyMap, now func() time.Time) ChecklistView {
	ti := textinput.New()
	ti.Prompt = "› "
	ti.CharLimit = 300
	ts := ti.Styles()
	ts.Cursor.Blink = false // a blinking cursor streams bytes over SSH
	ti.SetStyles(ts)
	ti.SetVirtualCursor(false) // the root places the terminal's own cursor (CursorPos)
	if now == nil {
		now = time.Now
	}
	return ChecklistView{input: ti, keys: km.Checklist, styles: st, now: now, lastStep: -1}
}

// SetSize sets the pane's size in cells; View fills exactly w×h.
func (v *ChecklistView) SetSize(w, h int) {
	v.w, v.h = max(w, 0), max(h, 0)
	v.input.SetWidth(max(v.w-4, 1))
}

// SetStyles replaces the styles.
func (v *ChecklistView) SetStyles(st Styles) { v.styles = st }

// SetChecklist gives the checklist to show (a copy of the job's). The
// selection stays on the same step ID when it still exists, else goes to
// the first step still to do.
func (v *ChecklistView) SetChecklist(c model.Checklist) {
	id := v.CurrentID()
	v.cl = c
	if i := v.cl.Index(id); id != "" && i >= 0 {
		v.cur = i
		return
	}
	v.cur = max(v.cl.CurrentIndex(), 0)
	if n := len(v.cl.Steps); v.cur >= n {
		v.cur = max(n-1, 0)
	}
}

// SetCurrent selects the step with this ID (from the saved job), if any.
func (v *ChecklistView) SetCurrent(id string) {
	if i := v.cl.Index(id); i >= 0 {
		v.cur = i
	}
}

// CurrentID is the selected step's ID ("" when the list is empty).
func (v ChecklistView) CurrentID() string {
	if v.cur < 0 || v.cur >= len(v.cl.Steps) {
		return ""
	}
	return v.cl.Steps[v.cur].ID
}

// CursorPos is the terminal cursor for the reason or note being typed,
// relative to the pane's top-left corner, or nil when not typing.
func (v ChecklistView) CursorPos() *tea.Cursor {
	if v.mode == ckBrowse || v.w <= 0 || v.h <= 0 {
		return nil
	}
	c := v.input.Cursor()
	if c == nil {
		return nil
	}
	n := 2 // label and input lines at the bottom, then the error line
	if v.errText != "" {
		n++
	}
	row := v.h - n + 1
	if row < 0 || row >= v.h {
		return nil
	}
	c.Y = row
	c.X = min(c.X, v.w-1)
	return c
}

// Typing reports whether the pane is reading text (a reason or a note): the
// root must then pass every key to it, letters included.
func (v ChecklistView) Typing() bool { return v.mode != ckBrowse }

// Focus gives the pane the focus.
func (v *ChecklistView) Focus() { v.focused = true }

// Blur removes the focus and abandons any half-typed reason or note.
func (v *ChecklistView) Blur() {
	v.focused = false
	v.closeInput()
}

// Focused reports whether the pane has the focus.
func (v ChecklistView) Focused() bool { return v.focused }

func (v *ChecklistView) closeInput() {
	v.mode, v.draft = ckBrowse, false
	v.errText = ""
	v.input.Blur()
	v.input.Reset()
}

func (v *ChecklistView) openInput(m ckMode, value, hint string) tea.Cmd {
	v.mode = m
	v.errText = ""
	v.input.Reset()
	v.input.SetValue(value)
	v.input.CursorEnd()
	v.input.Placeholder = hint
	return v.input.Focus()
}

// Draft is the reason or note being typed, when it says something new
// (drafts.go keeps it with the job): reason tells a skip reason from a note.
func (v ChecklistView) Draft() (reason bool, step, text string, ok bool) {
	if v.mode == ckBrowse || v.cur < 0 || v.cur >= len(v.cl.Steps) {
		return false, "", "", false
	}
	text = v.input.Value()
	if v.mode == ckNote {
		return false, v.CurrentID(), text, text != v.cl.Steps[v.cur].Note
	}
	return true, v.CurrentID(), text, text != ""
}

// RestoreDraft selects the step and opens its reason or note input again
// with text, marked as a draft. It reports whether the step is there.
func (v *ChecklistView) RestoreDraft(reason bool, step, text string) bool {
	if v.cl.Index(step) < 0 {
		return false
	}
	v.SetCurrent(step)
	mode, hint := ckNote, "e.g. gas reading, permit number, initials"
	if reason {
		mode, hint = ckReason, "why is this step skipped?"
	}
	v.openInput(mode, text, hint)
	v.draft = true
	return true
}

func ckStepCmd(id string) tea.Cmd {
	return func() tea.Msg { return ChecklistStepMsg{ID: id} }
}

func ckEmit(m tea.Msg) tea.Cmd { return func() tea.Msg { return m } }

// Update handles the pane's keys while it has the focus.
func (v ChecklistView) Update(msg tea.Msg) (ChecklistView, tea.Cmd) {
	if !v.focused {
		return v, nil
	}
	k, isKey := msg.(tea.KeyPressMsg)
	if v.mode != ckBrowse {
		if isKey {
			switch {
			case key.Matches(k, v.keys.Cancel):
				v.closeInput()
				return v, nil
			case key.Matches(k, v.keys.Submit):
				return v.submit()
			}
		}
		var cmd tea.Cmd
		v.input, cmd = v.input.Update(msg)
		if isKey {
			v.errText = ""
		}
		return v, cmd
	}
	if !isKey || len(v.cl.Steps) == 0 {
		return v, nil
	}
	id := v.CurrentID()
	n := len(v.cl.Steps)
	v.errText = ""
	switch {
	case key.Matches(k, v.keys.Up):
		if v.cur > 0 {
			v.cur--
			return v, ckStepCmd(v.CurrentID())
		}
	case key.Matches(k, v.keys.Down):
		if v.cur < n-1 {
			v.cur++
			return v, ckStepCmd(v.CurrentID())
		}
	case key.Matches(k, v.keys.Done), key.Matches(k, v.keys.NotApplies):
		state := model.StateDone
		if key.Matches(k, v.keys.NotApplies) {
			state = model.StateNotApplicable
			if v.cl.Steps[v.cur].Required {
				// A required step is not waved off: it takes a reason.
				return v, v.openInput(ckReasonNA, "", "why does this required step not apply here?")
			}
		}
		now := v.now()
		if k.String() == v.lastKey && v.cur == v.lastStep && now.Sub(v.lastAt) < markBounce {
			v.lastKey = "" // once: a second press marks the step
			v.errText = "! a repeat within a second was ignored: press again to mark this step"
			return v, nil
		}
		v.errText = ""
		v.advance()
		v.lastKey, v.lastAt, v.lastStep = k.String(), now, v.cur
		return v, ckEmit(ChecklistMarkMsg{ID: id, State: state, Current: v.CurrentID()})
	case key.Matches(k, v.keys.Reopen):
		if v.cl.Steps[v.cur].State != model.StatePending {
			return v, ckEmit(ChecklistMarkMsg{ID: id, State: model.StatePending, Current: id})
		}
	case key.Matches(k, v.keys.Skip):
		return v, v.openInput(ckReason, "", "why is this step skipped?")
	case key.Matches(k, v.keys.Note):
		return v, v.openInput(ckNote, v.cl.Steps[v.cur].Note, "e.g. gas reading, permit number, initials")
	}
	return v, nil
}

// Refused puts the selection back on step id when the root refused its
// mark (a required step skipped without a reason): the cursor does not run
// on past a step that was not marked.
func (v *ChecklistView) Refused(id string) {
	if i := v.cl.Index(id); i >= 0 {
		v.cur = i
	}
	v.lastKey = ""
}

// advance moves the selection on after a step is marked (not past the
// last step).
func (v *ChecklistView) advance() {
	if v.cur < len(v.cl.Steps)-1 {
		v.cur++
	}
}

// submit ends typing: a skip needs a non-blank reason.
func (v ChecklistView) submit() (ChecklistView, tea.Cmd) {
	id := v.CurrentID()
	text := strings.TrimSpace(v.input.Value())
	switch v.mode {
	case ckReason, ckReasonNA:
		state, what := model.StateSkipped, "to skip a step"
		if v.mode == ckReasonNA {
			state, what = model.StateNotApplicable, "to mark a required step not applicable"
		}
		if text == "" {
			v.errText = "✗ a reason is required " + what
			return v, nil
		}
		v.closeInput()
		v.advance()
		return v, ckEmit(ChecklistMarkMsg{ID: id, State: state, Reason: text, Current: v.CurrentID()})
	case ckNote:
		v.closeInput()
		return v, ckEmit(ChecklistNoteMsg{ID: id, Note: text})
	case ckBrowse:
	}
	return v, nil
}

// ShortHelp lists the keys that do something now.
func (v ChecklistView) ShortHelp() []key.Binding {
	if v.mode != ckBrowse {
		return []key.Binding{v.keys.Submit, v.keys.Cancel}
	}
	return []key.Binding{v.keys.Done, v.keys.Skip, v.keys.Note, v.keys.NotApplies, v.keys.Reopen, v.keys.Up, v.keys.Down}
}

// Claims takes the pane's own keys, and every key while typing.
func (v *ChecklistView) Claims(msg tea.KeyPressMsg) bool {
	return v.Typing() || key.Matches(msg, v.ShortHelp()...)
}

// Key handles a key with the pane focused.
func (v *ChecklistView) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) {
	var cmd tea.Cmd
	*v, cmd = v.Update(msg)
	return cmd, nil
}

// Paste puts pasted text into the reason or note being typed.
func (v *ChecklistView) Paste(text string) (tea.Cmd, *FieldEdit) {
	if !v.Typing() {
		return nil, nil
	}
	var cmd tea.Cmd
	v.input, cmd = v.input.Update(tea.PasteMsg{Content: oneLineText(text)})
	return cmd, nil
}

// Show gives the pane the job's checklist.
func (v *ChecklistView) Show(st *screenState) { v.SetChecklist(st.job.Checklist) }

// ckSymbol is the state's mark in the list: never colour alone.
func ckSymbol(s model.StepState) (string, drawClass) {
	switch s {
	case model.StateDone:
		return "[✓]", clsOK
	case model.StateSkipped:
		return "[↷]", clsWarn
	case model.StateNotApplicable:
		return "[–]", clsMuted
	case model.StatePending:
	}
	return "[ ]", clsText
}

// progressText is "7/19 done · 2 skipped · 1 n/a".
func (v *ChecklistView) progressText() string {
	p := v.cl.Progress()
	s := strconv.Itoa(p.Done) + "/" + strconv.Itoa(p.Total) + " done"
	if p.Skipped > 0 {
		s += " · " + strconv.Itoa(p.Skipped) + " skipped"
	}
	if p.NotApplicable > 0 {
		s += " · " + strconv.Itoa(p.NotApplicable) + " n/a"
	}
	return s
}

// stateLine says the selected step's state in words, with its time.
func ckStateLine(s model.Step) (string, drawClass) {
	at := ""
	if !s.At.IsZero() {
		at = " " + s.At.Format("15:04")
	}
	sym, cls := ckSymbol(s.State)
	switch s.State {
	case model.StateDone:
		return sym + " done" + at, cls
	case model.StateSkipped:
		return sym + " skipped" + at + ": " + present.Clean(s.Reason), cls
	case model.StateNotApplicable:
		t := sym + " not applicable" + at
		if s.Reason != "" {
			t += ": " + present.Clean(s.Reason)
		}
		return t, cls
	case model.StatePending:
	}
	return sym + " to do", cls
}

// ckLayout is how the pane shares its room: the input line at the foot
// while typing, the selected step's detail (beside the list when wide,
// under it otherwise), and the list's width and height.
type ckLayout struct {
	input, detail []drawLine
	wide          bool
	listW, listH  int
}

func (v ChecklistView) layout() ckLayout {
	w, h := v.w, v.h
	var l ckLayout
	step := v.cl.Steps[min(max(v.cur, 0), len(v.cl.Steps)-1)]
	if v.mode == ckBrowse && v.errText != "" {
		l.input = append(l.input, drawPlain(v.errText, clsWarn))
	}
	if v.mode != ckBrowse {
		label := "Reason to skip (required):"
		switch v.mode {
		case ckNote:
			label = "Note for this step:"
		case ckReasonNA:
			label = "Why this required step does not apply (required):"
		default:
		}
		if v.draft {
			label = "(draft) " + label // put back from the last session
		}
		iv := v.input.View()
		l.input = append(l.input, drawPlain(label, clsTitle), drawLine{{text: iv, raw: true, width: cellWidth(iv)}})
		if v.errText != "" {
			l.input = append(l.input, drawPlain(v.errText, clsDanger))
		}
	}
	l.wide = w >= 100 && h >= 8
	l.listW = w
	detailW := w
	if l.wide {
		l.listW = w * 55 / 100
		detailW = w - l.listW - 1
	}
	// Height budget: title 1, then list and detail share the rest; the
	// list keeps at least three rows (or what is left in a tiny pane).
	room := h - 1 - len(l.input)
	if l.wide {
		l.listH = room
		l.detail = v.detailLines(step, detailW, h-1)
		return l
	}
	dh := max(room-3, 0)
	if room < 6 {
		dh = 0
	}
	l.detail = v.detailLines(step, detailW, min(dh, max(room*65/100, 0)))
	l.listH = room - len(l.detail)
	return l
}

// ckRow is one row of the step list: a step, or a section's heading.
type ckRow struct {
	step int           // index into the steps, or -1 for a heading
	head model.Section // the heading's section
}

// listRows lays out the step list for listH rows: one row per step, with a
// heading row where a section starts when there is room for them (12 rows
// or more), and top, the first row shown, so that the selection stays in
// view with some steps after it.
func (v ChecklistView) listRows(listH int) (rows []ckRow, top int) {
	steps := v.cl.Steps
	rows = make([]ckRow, 0, len(steps)+6)
	curRow := 0
	for i, s := range steps {
		if listH >= 12 && (i == 0 || s.Section != steps[i-1].Section) {
			rows = append(rows, ckRow{step: -1, head: s.Section})
		}
		if i == v.cur {
			curRow = len(rows)
		}
		rows = append(rows, ckRow{step: i})
	}
	if listH > 0 && len(rows) > listH {
		top = min(max(curRow-listH/3, 0), len(rows)-listH)
		if top > 0 && rows[top-1].step < 0 && curRow-top+1 < listH {
			top-- // keep a section's heading with its first step
		}
	}
	return rows, top
}

// stepLine is step i's row in the list: marker, state symbol, text.
func (v ChecklistView) stepLine(i, listW int) drawLine {
	s := v.cl.Steps[i]
	sym, cls := ckSymbol(s.State)
	mark := "  "
	if i == v.cur {
		mark = "▶ "
	}
	text := present.Clean(s.Text)
	if s.Caution != "" {
		text = "! " + text // a caution goes with this step
	}
	switch {
	case i == v.cur && v.focused:
		l := drawLine{{text: clip(mark+sym+" "+text, listW), cls: clsSelected}}.fit(listW)
		l[len(l)-1].cls = clsSelected // keep the reversed bar across the whole width
		return l
	case s.State == model.StateNotApplicable:
		return drawPlain(mark+sym+" "+text, clsMuted)
	}
	return drawLine{{text: mark + sym, cls: cls}, {text: " " + text}}
}

// View draws the pane: progress line, step list, the selected step with
// its caution box, and the input line while typing. Exactly w×h cells.
func (v ChecklistView) View() string {
	w, h := v.w, v.h
	if w <= 0 || h <= 0 {
		return ""
	}
	st := &v.styles
	steps := v.cl.Steps
	if len(steps) == 0 {
		return st.drawLines([]drawLine{drawPlain("Checklist: no steps yet — choose the liquid and the priming method.", clsText)}, w, h)
	}
	step := steps[min(max(v.cur, 0), len(steps)-1)]
	lay := v.layout()
	input, detail, wide, listW, listH := lay.input, lay.detail, lay.wide, lay.listW, lay.listH
	lines := []drawLine{drawPlain("Checklist · "+v.progressText()+" · "+step.Section.Title(), clsTitle)}
	rows, top := v.listRows(listH)
	var list []drawLine
	for _, r := range rows[top:] {
		if len(list) >= listH {
			break
		}
		if r.step < 0 {
			list = append(list, drawPlain("── "+r.head.Title()+" ", clsMuted))
			continue
		}
		list = append(list, v.stepLine(r.step, listW))
	}
	if wide {
		for i := 0; i < max(len(list), len(detail)); i++ {
			var l, r drawLine
			if i < len(list) {
				l = list[i]
			}
			if i < len(detail) {
				r = detail[i]
			}
			row := append(l.fit(listW), drawSeg{text: " "})
			lines = append(lines, append(row, r...))
		}
	} else {
		for len(list) < listH {
			list = append(list, nil)
		}
		lines = append(lines, list...)
		lines = append(lines, detail...)
	}
	// The input goes last, at the bottom of the pane (all of the pane when
	// it is tiny).
	if len(input) > h {
		input = input[len(input)-h:]
	}
	for len(lines) < h-len(input) {
		lines = append(lines, nil)
	}
	lines = append(lines[:min(len(lines), h-len(input))], input...)
	return st.drawLines(lines, w, h)
}
