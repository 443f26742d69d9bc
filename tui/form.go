package tui

import (
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// FormPane is one input pane (Hose, Lift & outlet, Liquid & site, Tank): a
// column of typed fields (bubbles textinput) and pickers built from the
// model's field table. It shows the raw text as typed and, beside it, the
// value as it was read, in the job's unit system; an invalid field gets its
// message under it with a ✗.
//
// The pane never owns the job: after each edit it reports the field and the
// new text to the root (the edit result of Update), which calls Job.Set and
// model.Compute and then hands the outcome back with SetJob.
type FormPane struct {
	pane    model.Pane
	fields  []formField
	cursor  int
	editing bool
	w, h    int
	styles  Styles
	keys    KeyMap
	sys     model.System
	gen     int      // bumped when styles or size change: every row is drawn again
	help    []string // the selected field's help, wrapped (see renderRows)
	// inactive: another pane has the focus (wide screens show the form
	// anyway); the selection marker is hidden.
	inactive bool
}

// SetActive shows or hides the selection marker (a form on screen while
// another pane has the focus is inactive).
func (f *FormPane) SetActive(on bool) {
	if f.inactive == !on {
		return
	}
	f.inactive = !on
	f.gen++
	f.renderRows()
}

// formField is one row of a form.
type formField struct {
	spec    model.FieldSpec
	input   textinput.Model // typed fields
	choices []model.Choice  // pickers
	sub     int             // highlighted choice of a multi picker

	// Derived in SetJob (never in View).
	raw     string // text as stored in the job
	shown   string // the value as read, in the job's unit system, or the choice label
	errText string // the field's error, "" when fine
	used    bool   // false when the field does not apply (e.g. tank width of a cylinder)

	// shown was worked out for this raw text and unit system.
	described bool
	descRaw   string
	descSys   model.System

	// The row as drawn, and the key it was drawn for (see renderRows).
	line     string
	errLines []string
	key      rowKey
	rendered bool
}

// FieldEdit is what an edit in a form reports to the root: a field and its
// new raw text.
type FieldEdit struct {
	ID   model.FieldID
	Text string
}

// NewFormPane builds the form of one pane from the field table. cat gives
// the picker entries.
func NewFormPane(p model.Pane, cat *presets.Catalogue, st Styles, km KeyMap) FormPane {
	f := FormPane{pane: p, styles: st, keys: km}
	for _, spec := range model.FieldsIn(p) {
		ff := formField{spec: spec, used: true}
		if spec.IsPicker() {
			ff.choices = spec.Choices(cat)
		} else {
			ti := textinput.New()
			ti.Prompt = ""
			ti.SetVirtualCursor(false)
			ti.CharLimit = 40
			switch {
			case spec.Default != "":
				ti.Placeholder = spec.Default
			case spec.Optional:
				ti.Placeholder = "auto"
			}
			ff.input = ti
		}
		f.fields = append(f.fields, ff)
	}
	f.SetStyles(st)
	return f
}

// Title is the pane's name.
func (f FormPane) Title() string { return f.pane.String() }

// SetStyles replaces the styles (after a background-colour change).
func (f *FormPane) SetStyles(st Styles) {
	f.styles = st
	ts := textinput.Styles{
		Focused: textinput.StyleState{Text: st.InputFocused, Placeholder: st.Muted, Prompt: st.Input},
		Blurred: textinput.StyleState{Text: st.Input, Placeholder: st.Muted, Prompt: st.Input},
		Cursor:  textinput.CursorStyle{Color: st.cursorColor(), Shape: tea.CursorBlock, Blink: false},
	}
	for i := range f.fields {
		if !f.fields[i].spec.IsPicker() {
			f.fields[i].input.SetStyles(ts)
		}
	}
	f.gen++
	f.renderRows()
}

// SetSize sets the pane's size in cells.
func (f *FormPane) SetSize(w, h int) {
	f.w, f.h = max(w, 0), max(h, 0)
	iw := f.inputWidth()
	for i := range f.fields {
		if !f.fields[i].spec.IsPicker() {
			f.fields[i].input.SetWidth(iw)
		}
	}
	f.gen++
	f.renderRows()
}

// Column widths: marker, label, input, converted value.
const (
	markerW    = 2
	minLabelW  = 12
	maxLabelW  = 22
	minInputW  = 9
	maxInputW  = 14
	minShownW  = 10
	formColGap = 1
)

func (f FormPane) labelWidth() int {
	lw := f.w - markerW - f.inputWidth() - minShownW - 2*formColGap
	return clamp(lw, minLabelW, maxLabelW)
}

func (f FormPane) inputWidth() int {
	return clamp((f.w-markerW)/4, minInputW, maxInputW)
}

// SetJob refreshes every row from the job: the raw text, the value as read
// and the field's error. errs holds the errors of the last Set and Compute.
func (f *FormPane) SetJob(j *model.Job, errs map[model.FieldID]error) {
	f.sys = j.Units
	for i := range f.fields {
		ff := &f.fields[i]
		ff.raw = j.Inputs[ff.spec.ID]
		ff.used = model.Applies(j.Inputs, ff.spec.ID)
		if !ff.spec.IsPicker() && ff.input.Value() != ff.raw {
			ff.input.SetValue(ff.raw)
		}
		ff.errText = ""
		if err := errs[ff.spec.ID]; err != nil && ff.used {
			ff.errText = present.FieldProblem(ff.spec, err)
		}
		if !ff.described || ff.descRaw != ff.raw || ff.descSys != f.sys {
			ff.shown = ff.describe(f.sys)
			ff.described, ff.descRaw, ff.descSys = true, ff.raw, f.sys
		}
		if ff.spec.Multi && len(ff.choices) > 0 {
			ff.sub = clamp(ff.sub, 0, len(ff.choices)-1)
		}
	}
	if f.cursor >= len(f.fields) {
		f.cursor = 0
	}
	// The rows are drawn when the form is on screen (the root calls
	// renderRows for the visible form), not for all four on each keystroke.
}

// describe is the value as read, shown beside the raw text.
func (ff *formField) describe(sys model.System) string {
	raw := strings.TrimSpace(ff.raw)
	if ff.spec.IsPicker() {
		if ff.spec.Multi {
			return multiLabel(ff.choices, raw)
		}
		id := raw
		if id == "" {
			id = ff.spec.Default
		}
		if id == "" {
			return "— choose —"
		}
		for _, c := range ff.choices {
			if strings.EqualFold(c.ID, id) {
				return c.Label
			}
		}
		return id
	}
	text := raw
	if text == "" {
		if ff.spec.Default == "" {
			return ""
		}
		text = ff.spec.Default
	}
	v, err := model.Parse(ff.spec.Dim, text, sys)
	if err != nil {
		return ""
	}
	if ff.spec.Dim == model.DimNumber {
		if raw == "" {
			return "= " + strconv.FormatFloat(v, 'g', 4, 64)
		}
		return "" // a plain number reads as typed
	}
	return "= " + model.Format(ff.spec.Dim, v, sys)
}

// multiLabel shows a comma-separated list of choice IDs as "2× elbow, screen".
func multiLabel(choices []model.Choice, raw string) string {
	counts := multiCounts(raw)
	if len(counts) == 0 {
		return "none"
	}
	var parts []string
	for _, c := range choices {
		if n := counts[strings.ToLower(c.ID)]; n > 0 {
			s := c.Label
			if n > 1 {
				s = strconv.Itoa(n) + "× " + s
			}
			parts = append(parts, s)
			delete(counts, strings.ToLower(c.ID))
		}
	}
	for id := range counts {
		parts = append(parts, id)
	}
	return strings.Join(parts, ", ")
}

func multiCounts(raw string) map[string]int {
	counts := map[string]int{}
	for _, p := range strings.Split(raw, ",") {
		if p = strings.ToLower(strings.TrimSpace(p)); p != "" {
			counts[p]++
		}
	}
	return counts
}

// multiAdd adds (n = 1) or removes (n = −1) one of id in a comma list.
func multiAdd(raw, id string, n int) string {
	var ids []string
	removed := false
	for _, p := range strings.Split(raw, ",") {
		p = strings.TrimSpace(p)
		if p == "" {
			continue
		}
		if n < 0 && !removed && strings.EqualFold(p, id) {
			removed = true
			continue
		}
		ids = append(ids, p)
	}
	if n > 0 {
		ids = append(ids, id)
	}
	return strings.Join(ids, ",")
}

// Focused field and mode.

// Editing reports whether typing goes into the selected field.
func (f FormPane) Editing() bool { return f.editing }

// Selected is the spec of the selected field.
func (f FormPane) Selected() model.FieldSpec {
	if len(f.fields) == 0 {
		return model.FieldSpec{}
	}
	return f.fields[f.cursor].spec
}

// SelectedIsPicker reports whether the selected field is a picker.
func (f FormPane) SelectedIsPicker() bool { return f.Selected().IsPicker() }

// Cursor is the field index (for resume).
func (f FormPane) Cursor() int { return f.cursor }

// SetCursor selects a field by index (for resume).
func (f *FormPane) SetCursor(i int) {
	if len(f.fields) == 0 {
		return
	}
	f.blurInput()
	f.cursor = clamp(i, 0, len(f.fields)-1)
	if f.editing {
		f.focusInput()
	}
	f.renderRows()
}

// SelectField selects a field by ID; false if the pane has no such field.
func (f *FormPane) SelectField(id model.FieldID) bool {
	for i := range f.fields {
		if f.fields[i].spec.ID == id {
			f.SetCursor(i)
			return true
		}
	}
	return false
}

// StartEditing puts the selected field into typing mode.
func (f *FormPane) StartEditing() {
	f.editing = true
	f.focusInput()
	f.renderRows()
}

// StopEditing leaves typing mode (navigate mode).
func (f *FormPane) StopEditing() {
	f.editing = false
	f.blurInput()
	f.renderRows()
}

func (f *FormPane) focusInput() {
	if len(f.fields) == 0 {
		return
	}
	ff := &f.fields[f.cursor]
	if !ff.spec.IsPicker() {
		ff.input.Focus()
		ff.input.CursorEnd()
	}
}

func (f *FormPane) blurInput() {
	if len(f.fields) == 0 {
		return
	}
	ff := &f.fields[f.cursor]
	if !ff.spec.IsPicker() {
		ff.input.Blur()
	}
}

// Move selects the next (+1) or previous (−1) field. It returns false when
// the move would leave the pane (the root then goes to the next pane).
// Fields that do not apply to the job ("not used here") are passed over.
func (f *FormPane) Move(d int) bool {
	for n := f.cursor + d; n >= 0 && n < len(f.fields); n += d {
		if f.fields[n].used {
			f.SetCursor(n)
			return true
		}
	}
	return false
}

// First and Last select the first or last field in use.
func (f *FormPane) First() {
	f.SetCursor(0)
	if !f.fields[0].used {
		f.Move(+1)
	}
}

// Last selects the last field in use.
func (f *FormPane) Last() {
	f.SetCursor(len(f.fields) - 1)
	if !f.fields[f.cursor].used {
		f.Move(-1)
	}
}

// Update handles a key for the selected field. The root has already taken
// the global keys (tab, esc, quit, units…). edit is non-nil when the field's
// text changed; the root then stores it, recomputes and redraws the rows.
// Update works in place (a pointer receiver, unlike the bubbles widgets):
// the form carries four text inputs and is updated on every keystroke.
func (f *FormPane) Update(msg tea.Msg) (tea.Cmd, *FieldEdit) {
	if len(f.fields) == 0 {
		return nil, nil
	}
	km, ok := msg.(tea.KeyPressMsg)
	ff := &f.fields[f.cursor]
	if ff.spec.IsPicker() {
		if !ok {
			return nil, nil
		}
		e := f.pickerKey(km)
		if e == nil {
			f.renderRows()
		}
		return nil, e
	}
	if !f.editing {
		return nil, nil
	}
	if ok && key.Matches(km, f.keys.Restore) {
		return nil, nil
	}
	before := ff.input.Value()
	var cmd tea.Cmd
	ff.input, cmd = ff.input.Update(msg)
	if v := ff.input.Value(); v != before {
		return cmd, &FieldEdit{ID: ff.spec.ID, Text: v}
	}
	f.renderRows() // the cursor moved
	return cmd, nil
}

// pickerKey cycles a picker (left/right/enter) or, in a multi picker, moves
// the highlight (left/right) and adds or removes one (space, +, −).
func (f *FormPane) pickerKey(km tea.KeyPressMsg) *FieldEdit {
	ff := &f.fields[f.cursor]
	n := len(ff.choices)
	if n == 0 {
		return nil
	}
	if ff.spec.Multi {
		switch {
		case key.Matches(km, f.keys.Next):
			ff.sub = (ff.sub + 1) % n
		case key.Matches(km, f.keys.Prev):
			ff.sub = (ff.sub + n - 1) % n
		case key.Matches(km, f.keys.Toggle), km.String() == "+", key.Matches(km, f.keys.Edit):
			return &FieldEdit{ID: ff.spec.ID, Text: multiAdd(ff.raw, ff.choices[ff.sub].ID, 1)}
		case km.String() == "-", km.String() == "backspace", km.String() == "delete":
			return &FieldEdit{ID: ff.spec.ID, Text: multiAdd(ff.raw, ff.choices[ff.sub].ID, -1)}
		}
		return nil
	}
	cur := -1
	id := strings.TrimSpace(ff.raw)
	if id == "" {
		id = ff.spec.Default
	}
	for i, c := range ff.choices {
		if strings.EqualFold(c.ID, id) {
			cur = i
		}
	}
	next := cur
	switch {
	case key.Matches(km, f.keys.Next), key.Matches(km, f.keys.Edit), key.Matches(km, f.keys.Toggle):
		next = (cur + 1) % n
	case key.Matches(km, f.keys.Prev):
		next = (cur + n - 1) % n
		if cur < 0 {
			next = n - 1
		}
	default:
		return nil
	}
	return &FieldEdit{ID: ff.spec.ID, Text: ff.choices[next].ID}
}

// CursorPos is the real terminal cursor for the field being typed in,
// relative to the pane's top-left corner, or nil.
func (f *FormPane) CursorPos() *tea.Cursor {
	if !f.editing || len(f.fields) == 0 {
		return nil
	}
	ff := f.fields[f.cursor]
	if ff.spec.IsPicker() {
		return nil
	}
	if !ff.input.Focused() {
		return nil
	}
	_, off := inputWindow(ff.input.Value(), ff.input.Position(), f.inputWidth())
	c := tea.NewCursor(off, 0)
	c.Shape = tea.CursorBlock
	c.Color = f.styles.cursorColor()
	row := f.selectedLine()
	top := f.scrollTop(row)
	if row-top < 0 || row-top >= f.bodyHeight() {
		return nil
	}
	c.X += markerW + f.labelWidth() + formColGap
	c.Y = 1 + row - top // below the title line
	return c
}

// inputWindow is the part of a field's text that shows in w cells with the
// cursor at pos (runes): the text from its start, or scrolled so that the
// cursor stays in view. off is the cursor's column in the window.
func inputWindow(v string, pos, w int) (string, int) {
	r := []rune(v)
	pos = clamp(pos, 0, len(r))
	start := 0
	if pos >= w {
		start = pos - w + 1
	}
	end := min(len(r), start+w)
	return string(r[start:end]), pos - start
}

// inputCell draws a typed field's text, exactly w cells: the text as typed
// (the part around the cursor when it is longer than the cell), or the
// default or "auto" hint in muted text. The text input widget keeps the editing; the
// drawing is ours, with the fixed escape sequences of Styles.fast, as it is
// redone on every keystroke. The terminal's own cursor marks the place.
func (f *FormPane) inputCell(ff *formField, focused bool, w int) string {
	st := f.styles
	v := ff.input.Value()
	if v == "" {
		return st.fast.Muted.Render(padRight(ansi.Truncate(ff.input.Placeholder, w, "…"), w))
	}
	text, _ := inputWindow(v, ff.input.Position(), w)
	if cellWidth(text) > w {
		text = ansi.Truncate(text, w, "")
	}
	p := st.fast.Input
	if focused && f.editing {
		p = st.fast.InputFocused
	}
	return p.Render(text) + strings.Repeat(" ", max(w-cellWidth(text), 0))
}

// Rendering. The pane is: a title line, the field rows (with error lines),
// and at the bottom the selected field's help.

// selectedLine is the line index of the selected field (rows without the
// rendering).
func (f FormPane) selectedLine() int {
	n := 0
	for i := 0; i < f.cursor && i < len(f.fields); i++ {
		n += 1 + len(f.fields[i].errLines)
	}
	return n
}

// rows lays out the field rows as lines and returns the line index of the
// selected field.
func (f FormPane) rows() ([]string, int) {
	lines := make([]string, 0, len(f.fields)+4)
	sel := 0
	for i := range f.fields {
		if i == f.cursor {
			sel = len(lines)
		}
		lines = append(lines, f.fields[i].line)
		lines = append(lines, f.fields[i].errLines...)
	}
	return lines, sel
}

// rowKey is everything a row's rendering depends on; a row is drawn again
// only when its key changes (this runs on every keystroke).
type rowKey struct {
	raw, shown, errText string
	focused, used, edit bool
	pos, sub, w, gen    int
	value               string
}

// renderRows redraws the rows whose key changed. Every method that changes
// what a row shows ends by calling it, so View only assembles.
func (f *FormPane) renderRows() {
	for i := range f.fields {
		ff := &f.fields[i]
		k := rowKey{raw: ff.raw, shown: ff.shown, errText: ff.errText, focused: i == f.cursor, used: ff.used,
			edit: f.editing, pos: ff.input.Position(), sub: ff.sub, w: f.w, gen: f.gen, value: ff.input.Value()}
		if ff.rendered && k == ff.key {
			continue
		}
		ff.key, ff.rendered = k, true
		ff.line, ff.errLines = f.renderRow(i)
	}
	f.help = f.makeHelpLines()
}

func (f *FormPane) renderRow(i int) (string, []string) {
	st := f.styles
	lw, iw := f.labelWidth(), f.inputWidth()
	sw := max(f.w-markerW-lw-iw-2*formColGap, 0)
	ff := &f.fields[i]
	focused := i == f.cursor && !f.inactive
	marker := "  "
	labelSt := st.fast.Label
	if focused {
		marker = "▶ "
		labelSt = st.fast.LabelFocused
	}
	if !ff.used {
		labelSt = st.fast.Muted
	}
	label := labelSt.Render(padRight(ansi.Truncate(ff.spec.Label, lw, "…"), lw))
	var body string
	switch {
	case ff.spec.IsPicker():
		body = f.pickerCell(ff, focused, iw+formColGap+sw)
	case !ff.used:
		body = st.fast.Muted.Render(padRight("not used here", iw+formColGap+sw))
	default:
		in := f.inputCell(ff, focused, iw)
		shown := ff.shown
		sst := st.fast.Unit
		if ff.errText != "" {
			shown, sst = "✗ invalid", st.fast.Danger
			if focused {
				shown = "✗ below"
			}
		}
		body = in + " " + sst.Render(ansi.Truncate(shown, sw, "…"))
	}
	return marker + label + " " + body, nil
}

func (f FormPane) pickerCell(ff *formField, focused bool, w int) string {
	st := f.styles
	if ff.spec.Multi {
		text := ff.shown
		if focused && len(ff.choices) > 0 {
			c := ff.choices[ff.sub]
			n := multiCounts(ff.raw)[strings.ToLower(c.ID)]
			text = "◀ " + c.Label + " ▶ ×" + strconv.Itoa(n)
		}
		return st.fast.Input.Render(ansi.Truncate(text, w, "…"))
	}
	text := ff.shown
	if focused {
		text = "◀ " + text + " ▶"
	}
	s := st.fast.Input
	if focused {
		s = st.fast.InputFocused
	}
	if ff.errText != "" {
		return st.fast.Danger.Render(ansi.Truncate("✗ "+text, w, "…"))
	}
	return s.Render(ansi.Truncate(text, w, "…"))
}

// helpLines is the selected field's help (and the chosen entry's note, and
// the list of fittings when the fittings picker is selected).
func (f FormPane) helpLines() []string { return f.help }

// helpHeight is the fixed height of the help area at the foot of a form, so
// that rows never move while typing (a moving form costs bytes on a slow
// link and loses the eye).
const helpHeight = 3

// makeHelpLines works out the foot of the form (in renderRows): the selected
// field's error in full when it has one, else its help.
func (f FormPane) makeHelpLines() []string {
	if len(f.fields) == 0 {
		return nil
	}
	ff := f.fields[f.cursor]
	w := max(f.w-2, 10)
	var out []string
	if ff.errText != "" {
		for _, l := range wrapText("✗ "+ff.errText, w, helpHeight) {
			out = append(out, f.styles.fast.Danger.Render(l))
		}
		return out
	}
	text := ff.spec.Help
	if ff.spec.IsPicker() {
		if ff.spec.Multi {
			text = "Chosen: " + ff.shown + ". " + text
		} else {
			for _, c := range ff.choices {
				if strings.EqualFold(c.ID, strings.TrimSpace(ff.raw)) && c.Note != "" {
					text = c.Note + " " + text
				}
			}
			// The row may cut the choice short: name it in full here.
			text = ff.shown + ". " + text
		}
	} else if r := ff.spec.RangeText(f.sys); r != "" {
		text += " Accepted " + r + "."
	}
	if cellWidth(ff.spec.Label) > f.labelWidth() {
		text = ff.spec.Label + ": " + text // the row cuts the label short
	}
	for _, l := range wrapText(text, w, helpHeight) {
		out = append(out, f.styles.fast.Muted.Render(l))
	}
	return out
}

func (f FormPane) bodyHeight() int {
	return max(f.h-1-helpHeight-1, 1)
}

func (f FormPane) scrollTop(sel int) int {
	bh := f.bodyHeight()
	if sel < bh-1 {
		return 0
	}
	return sel - bh + 2
}

// View renders the pane in exactly w×h cells.
func (f FormPane) View() string {
	if f.w <= 0 || f.h <= 0 {
		return ""
	}
	st := f.styles
	title := st.fast.PaneTitle.Render(f.Title())
	mode := "  navigate: enter to type"
	if f.editing {
		mode = "  typing: esc when done"
		if f.SelectedIsPicker() {
			mode = "  choosing: ←/→"
		}
	}
	if f.inactive {
		mode = "  keys 1–4 to edit"
	}
	title += st.fast.Muted.Render(mode)
	rows, sel := f.rows()
	bh := f.bodyHeight()
	top := f.scrollTop(sel)
	out := []string{title}
	for i := top; i < len(rows) && i < top+bh; i++ {
		out = append(out, rows[i])
	}
	for len(out) < 1+bh {
		out = append(out, "")
	}
	out = append(out, st.fast.Muted.Render(strings.Repeat("─", max(f.w-1, 0))))
	out = append(out, f.helpLines()...)
	return fitBlock(out, f.w, f.h)
}

// ShortHelp lists the form's keys that work now.
func (f *FormPane) ShortHelp() []key.Binding { return f.keys.formHelp(f.editing, f.SelectedIsPicker()) }

// Focus shows the selection marker; Blur hides it (a form on screen while
// another pane has the focus).
func (f *FormPane) Focus() { f.SetActive(true) }

// Blur hides the selection marker.
func (f *FormPane) Blur() { f.SetActive(false) }

// Typing reports whether keys go into the selected field's text.
func (f *FormPane) Typing() bool { return f.editing && !f.SelectedIsPicker() }

// Claims takes every key while typing; the root sends navigate-mode keys on
// after its own commands.
func (f *FormPane) Claims(tea.KeyPressMsg) bool { return f.Typing() }

// Key handles a key for the selected field (Update).
func (f *FormPane) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) { return f.Update(msg) }

// Show refreshes the rows from the job and the plan's field problems, and
// draws them.
func (f *FormPane) Show(st *screenState) {
	f.SetJob(st.job, st.errs)
	f.renderRows()
}
