package tui

import (
	"strings"
	"testing"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// TestEditingRules types each editing rule a gloved technician relies on,
// through the root's Update as the program runs it.
func TestEditingRules(t *testing.T) {
	hoseLen := func(m *Model) string { return m.job.Inputs[model.FieldHoseLength] }

	t.Run("enter selects the text and the first key replaces it", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = selectField(t, m, model.FieldHoseLength)
		m = press(t, m, "enter")
		m = typeText(t, m, "40ft")
		m = press(t, m, "enter")
		if got := hoseLen(m); got != "40ft" {
			t.Errorf("typed over %q, field holds %q", "12 m", got)
		}
	})
	t.Run("an arrow or End keeps the text for editing", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = selectField(t, m, model.FieldHoseLength)
		m = press(t, m, "enter", "end", "backspace")
		m = typeText(t, m, "ft")
		if got := hoseLen(m); got != "12 ft" {
			t.Errorf("edited %q into %q, want %q", "12 m", got, "12 ft")
		}
	})
	t.Run("esc puts back the text from before", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = selectField(t, m, model.FieldHoseLength)
		m = press(t, m, "enter")
		m = typeText(t, m, "99")
		m = press(t, m, "esc")
		if got := hoseLen(m); got != "12 m" || m.forms[m.focus].Editing() {
			t.Errorf("after esc: %q, editing %v", got, m.forms[m.focus].Editing())
		}
	})
	t.Run("ctrl+u clears the field as in a shell", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = selectField(t, m, model.FieldHoseLength)
		m = press(t, m, "enter", "end", "ctrl+u")
		if got := hoseLen(m); got != "" || m.job.Units != model.SI {
			t.Errorf("after ctrl+u: %q, units %v", got, m.job.Units)
		}
	})
	t.Run("last valid is the last committed value, not a prefix", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = enterField(t, m, model.FieldHoseLength, "40ft")
		want := m.st.sheet.Flow
		// Clear it and type rubbish: on the way the field reads "" and
		// then "a", "ab", "abc"; none is committed, so the plan shown
		// stays the 40 ft one, marked stale.
		m = selectField(t, m, model.FieldHoseLength)
		m = press(t, m, "enter", "ctrl+u")
		m = typeText(t, m, "abc")
		if !m.st.stale || m.st.sheet.Flow != want {
			t.Errorf("stale %v, flow %q, want the 40 ft flow %q", m.st.stale, m.st.sheet.Flow, want)
		}
		if got := m.job.LastGood[model.FieldHoseLength]; got != "40ft" {
			t.Errorf("last valid text %q", got)
		}
		// The link drops mid-edit: the job file holds "abc" and the last
		// valid text; reopened, the screen shows the 40 ft plan, stale,
		// not "no result".
		j := m.Job()
		r := New(Options{Start: Start{Job: j}, NoSave: true})
		r = send(t, r, tea.WindowSizeMsg{Width: 80, Height: 24})
		if !r.st.hasPlan || !r.st.stale || r.st.sheet.Flow != want {
			t.Errorf("reopened: plan %v, stale %v, flow %q, want %q", r.st.hasPlan, r.st.stale, r.st.sheet.Flow, want)
		}
		if f := frame(r); strings.Contains(f, "NO RESULT") {
			t.Errorf("reopened screen has no result:\n%s", f)
		}
		// ctrl+r puts the last valid text back.
		r = selectField(t, r, model.FieldHoseLength)
		r = press(t, r, "enter", "ctrl+r", "enter")
		if got := r.job.Inputs[model.FieldHoseLength]; got != "40ft" || r.st.stale {
			t.Errorf("ctrl+r: %q, stale %v", got, r.st.stale)
		}
	})
	t.Run("errors in the units typed", func(t *testing.T) {
		for _, c := range []struct {
			sys        model.System
			text, want string
		}{{model.SI, "-40C", "°C"}, {model.US, "-40F", "°F"}} {
			m := newTestModel(t, 80, 24)
			if c.sys == model.US {
				m = press(t, m, "u")
			}
			m = enterField(t, m, model.FieldTemp, c.text)
			msg := m.st.problem
			if !strings.Contains(msg, c.want) || strings.Contains(msg, " K ") || strings.Contains(msg, " K;") {
				t.Errorf("%s: %q", c.text, msg)
			}
		}
	})
	t.Run("paste goes into the field", func(t *testing.T) {
		m := newTestModel(t, 80, 24)
		m = selectField(t, m, model.FieldHoseLength)
		m = send(t, m, tea.PasteMsg{Content: "1.5m\n"})
		if got := hoseLen(m); got != "1.5m" {
			t.Errorf("pasted: %q", got)
		}
	})
}

// A tap on a tab selects its pane; a tap on a field's row selects the
// field, and a second tap starts typing in it; a tap on a checklist step
// selects it.
func TestMouseTaps(t *testing.T) {
	m := newTestModel(t, 80, 24)
	click := func(m *Model, x, y int) *Model {
		return send(t, m, tea.MouseClickMsg{X: x, Y: y, Button: tea.MouseLeft})
	}
	sp := m.tabSpans()
	m = click(m, sp[PaneLift].x0+1, m.lay.Tabs.Y)
	if m.focus != PaneLift {
		t.Fatalf("tap on the Lift tab: focus %v", m.focus)
	}
	// The Drop field is the second row of the Lift form (row 2 of the pane).
	m = click(m, 3, m.lay.Main.Y+2)
	if id := m.forms[PaneLift].Selected().ID; id != model.FieldDrop {
		t.Errorf("tap on the second row selected %s", id)
	}
	m = click(m, 3, m.lay.Main.Y+2)
	if !m.forms[PaneLift].Editing() {
		t.Error("a second tap did not start typing")
	}
	m = click(m, sp[PaneChecklist].x0+1, m.lay.Tabs.Y)
	m = click(m, 3, m.lay.Main.Y+3) // the third step
	if m.checklist.cur != 2 {
		t.Errorf("tap on the third step: cursor %d", m.checklist.cur)
	}
	m = press(t, m, "m")
	m = click(m, sp[PaneHose].x0+1, m.lay.Tabs.Y)
	if m.focus == PaneHose {
		t.Error("a tap worked with the mouse off")
	}
}
