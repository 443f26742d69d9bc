package tui

import (
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"

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
	pane model.Pane
	// others names, by field, who else on a shared job is typing in it.
	others  map[model.FieldID]string
	fields  []formField
	cursor  int
	editing bool
	w, h    int
	styles  Styles
	keys    KeyMap
	sys     model.System
	// before is the field's text when typing in it began (Esc puts it
	// back); fresh: that text is still selected whole, and the first
	// character typed replaces it.
	before string
	fresh  bool
	gen    int      // bumped when styles or size change: every row is drawn again
	help   []string // the selected field's help, wrapped (see renderRows)
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
	base    []model.Choice  // the priming picker's choices before markUnsuited
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
			case spec.Optional && spec.Blank != "":
				ti.Placeholder = spec.Blank
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
		if ff.spec.ID == model.FieldPriming {
			ff.markUnsuited(j.Checklist.Context)
		}
		if !ff.described || ff.descRaw != ff.raw || ff.descSys != f.sys {
			ff.shown = present.Clean(ff.describe(f.sys)) // choice labels may come from a user's presets
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

// markUnsuited marks the priming methods that do not suit the job in the
// picker, with why (model.MethodSuits): they stay choosable, never
// silently listed.
func (ff *formField) markUnsuited(ctx model.ChecklistContext) {
	if ff.base == nil {
		ff.base = ff.choices
	}
	out := make([]model.Choice, len(ff.base))
	for i, c := range ff.base {
		if ok, why := model.MethodSuits(model.PrimingMethod(c.ID), ctx); !ok {
			c.Label += " — unsuited here"
			c.Note = "Unsuited here: " + why + "."
		}
		out[i] = c
	}
	ff.choices = out
	ff.described = false
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
	return "= " + present.Figures{Sys: sys}.Of(ff.spec.Dim, v)
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
//
// The whole text is selected: the first character typed replaces it, while
// an arrow, Home or End keeps it for editing. The text from before is kept,
// so that Esc can put it back (CancelEdit).
func (f *FormPane) StartEditing() {
	f.editing = true
	if len(f.fields) > 0 {
		f.before = f.fields[f.cursor].input.Value()
		f.fresh = !f.fields[f.cursor].spec.IsPicker() && f.before != ""
	}
	f.focusInput()
	f.renderRows()
}

// Draft is the field being typed in and its text, when typing changed it
// (drafts.go keeps it with the job); before is its text when typing began.
func (f *FormPane) Draft() (id model.FieldID, text, before string, ok bool) {
	if !f.editing || len(f.fields) == 0 || f.SelectedIsPicker() {
		return "", "", "", false
	}
	ff := &f.fields[f.cursor]
	text = ff.input.Value()
	return ff.spec.ID, text, f.before, text != f.before
}

// RestoreDraft selects the field and types on in it with text, the cursor
// at its end; Esc still puts back before. It reports whether the form has
// the field.
func (f *FormPane) RestoreDraft(id model.FieldID, text, before string) bool {
	if !f.SelectField(id) || f.SelectedIsPicker() {
		return false
	}
	f.StartEditing()
	f.fields[f.cursor].input.SetValue(text)
	f.fields[f.cursor].input.CursorEnd()
	f.before, f.fresh = before, false
	f.renderRows()
	return true
}

// StopEditing leaves typing mode (navigate mode), keeping what was typed.
func (f *FormPane) StopEditing() {
	f.editing, f.fresh = false, false
	f.blurInput()
	f.renderRows()
}

// CancelEdit leaves typing mode and puts back the text from before the
// edit; the edit is non-nil when that changes the field.
func (f *FormPane) CancelEdit() *FieldEdit {
	if !f.editing || len(f.fields) == 0 {
		f.StopEditing()
		return nil
	}
	ff := &f.fields[f.cursor]
	var e *FieldEdit
	if !ff.spec.IsPicker() && ff.input.Value() != f.before {
		ff.input.SetValue(f.before)
		e = &FieldEdit{ID: ff.spec.ID, Text: f.before}
	}
	f.StopEditing()
	return e
}

// SetText replaces the selected field's text as typed (ctrl+r); the field
// stays in the mode it is in.
func (f *FormPane) SetText(text string) {
	if len(f.fields) == 0 || f.fields[f.cursor].spec.IsPicker() {
		return
	}
	ff := &f.fields[f.cursor]
	ff.input.SetValue(text)
	ff.input.CursorEnd()
	f.fresh = false
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

// Paste puts pasted text into the selected field (pasteText).
func (f *FormPane) Paste(text string) (tea.Cmd, *FieldEdit) { return nil, f.pasteText(text) }

// Key handles a key for the selected field (Update).
func (f *FormPane) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) { return f.Update(msg) }

// Show refreshes the rows from the job and the plan's field problems, and
// draws them.
func (f *FormPane) Show(st *screenState) {
	f.SetJob(st.job, st.errs)
	f.renderRows()
}

// Click selects the field on the row at (x, y), relative to the pane; a
// click on the field already selected starts typing in it (a typed field)
// or takes the next choice (a picker). Fields that do not apply are passed
// over. The root ends typing in the previous field first.
func (f *FormPane) Click(x, y int) (tea.Cmd, *FieldEdit) {
	if y < 1 || y > f.bodyHeight() || len(f.fields) == 0 {
		return nil, nil
	}
	line := f.scrollTop(f.selectedLine()) + y - 1
	for i := range f.fields {
		n := 1 + len(f.fields[i].errLines)
		if line < n {
			if !f.fields[i].used {
				return nil, nil
			}
			if i != f.cursor {
				f.SetCursor(i)
				return nil, nil
			}
			if f.fields[i].spec.IsPicker() {
				return nil, f.pickerKey(tea.KeyPressMsg{Code: tea.KeyRight})
			}
			if !f.editing {
				f.StartEditing()
			}
			return nil, nil
		}
		line -= n
	}
	return nil, nil
}
