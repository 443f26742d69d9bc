package tui

import (
	"strconv"
	"strings"

	"drawdown/model/present"

	"github.com/charmbracelet/x/ansi"
)

// Drawing a form: the field rows with their typed text and the value as
// read, the error line, and the selected field's help at the foot. Rows are
// drawn in Update (renderRows) only when what they show changed.

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
	text = oneCellText(text)
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
	other               string
}

// renderRows redraws the rows whose key changed. Every method that changes
// what a row shows ends by calling it, so View only assembles.
func (f *FormPane) renderRows() {
	for i := range f.fields {
		ff := &f.fields[i]
		k := rowKey{raw: ff.raw, shown: ff.shown, errText: ff.errText, focused: i == f.cursor, used: ff.used,
			edit: f.editing, pos: ff.input.Position(), sub: ff.sub, w: f.w, gen: f.gen, value: ff.input.Value(),
			other: f.others[ff.spec.ID]}
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
			// A word, not an arrow: the message is at the foot of the
			// form when the field is selected. An empty field is
			// needed, not wrong.
			shown, sst = "✗ invalid", st.fast.Danger
			if strings.TrimSpace(ff.raw) == "" {
				shown = "✗ needed"
			}
		}
		if who := f.others[ff.spec.ID]; who != "" {
			// Someone else on the shared job is typing in this field.
			shown, sst = "✎ "+present.Clean(who)+" typing", st.fast.Warning
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
			text = "◀ " + present.Clean(c.Label) + " ▶ ×" + strconv.Itoa(n)
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
			text = "Chosen: " + present.Clean(ff.shown) + ". " + text
		} else {
			for _, c := range ff.choices {
				if strings.EqualFold(c.ID, strings.TrimSpace(ff.raw)) && c.Note != "" {
					text = present.Clean(c.Note) + " " + text
				}
			}
			// The row may cut the choice short: name it in full here
			// (a user preset's name is data: cleaned). Nothing chosen
			// yet: the help alone.
			if strings.TrimSpace(ff.raw) != "" || ff.spec.Default != "" {
				text = present.Clean(ff.shown) + ". " + text
			}
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
