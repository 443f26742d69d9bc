package tui

import (
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// A form's keys: typing into a field, cycling a picker, ticking fittings in
// a multi picker.

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
	if ok && f.fresh {
		// The whole text is selected: a character replaces it, a delete
		// clears it, a move keeps it for editing.
		f.fresh = false
		switch {
		case km.Text != "":
			ff.input.SetValue("")
		case km.Code == tea.KeyBackspace || km.Code == tea.KeyDelete:
			ff.input.SetValue("")
			f.renderRows()
			if before != "" {
				return nil, &FieldEdit{ID: ff.spec.ID, Text: ""}
			}
			return nil, nil
		}
	}
	var cmd tea.Cmd
	ff.input, cmd = ff.input.Update(msg)
	if v := ff.input.Value(); v != before {
		return cmd, &FieldEdit{ID: ff.spec.ID, Text: v}
	}
	f.renderRows() // the cursor moved
	return cmd, nil
}

// pasteText puts pasted text into the selected typed field: it replaces the
// whole text when that is still selected (or when the field is not being
// typed in: pasting starts typing), else it goes in at the cursor. Line
// breaks and control characters become spaces; the edit is the new text.
func (f *FormPane) pasteText(text string) *FieldEdit {
	if len(f.fields) == 0 || f.fields[f.cursor].spec.IsPicker() {
		return nil
	}
	if !f.editing {
		f.StartEditing()
	}
	ff := &f.fields[f.cursor]
	text = strings.TrimSpace(oneLineText(text))
	v := ff.input.Value()
	if f.fresh {
		v = ""
		f.fresh = false
		ff.input.SetValue("")
	}
	ff.input, _ = ff.input.Update(tea.PasteMsg{Content: text})
	f.renderRows()
	if nv := ff.input.Value(); nv != v || text != "" {
		return &FieldEdit{ID: ff.spec.ID, Text: nv}
	}
	return nil
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
