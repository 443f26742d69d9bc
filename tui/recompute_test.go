package tui

import (
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// respell writes a field's text another way that reads the same: spaces
// around it, no space before the unit, a picker in capitals. The unit
// conversions are exact in binary (m → mm of a value in whole metres).
func respell(r *rand.Rand, id model.FieldID, text string) string {
	f, _ := model.FieldByID(id)
	switch r.IntN(3) {
	case 0:
		return "  " + text + " "
	case 1:
		if f.IsPicker() {
			return strings.ToUpper(text)
		}
		return strings.ReplaceAll(text, " ", "")
	}
	return text + "\t"
}

// TestInputsKey: texts that read the same give the same key and, computed,
// the same plan and sheet; a changed value gives another key. A field that
// does not read gives none (the plan's errors must be made again).
func TestInputsKey(t *testing.T) {
	cat := presets.Builtin()
	base := model.DemoJob()
	key0, ok := inputsKey(&base, cat)
	if !ok {
		t.Fatal("the demo job has no key")
	}
	sheetOf := func(j model.Job) (model.Plan, present.Sheet) {
		p := model.Compute(j, cat)
		return p, present.Build(p, j.Units, model.ContextFor(j, p).Hazards)
	}
	p0, s0 := sheetOf(base)
	r := rand.New(rand.NewPCG(1, 2))
	ids := make([]model.FieldID, 0, len(base.Inputs))
	for id := range base.Inputs {
		ids = append(ids, id)
	}
	for i := 0; i < 200; i++ {
		j := base.Clone()
		for _, id := range ids {
			if r.IntN(3) == 0 {
				j.Inputs[id] = respell(r, id, j.Inputs[id])
			}
		}
		key, ok := inputsKey(&j, cat)
		if !ok || key != key0 {
			t.Fatalf("respelt inputs %v read differently", j.Inputs)
		}
		p, s := sheetOf(j)
		if !reflect.DeepEqual(s, s0) || !reflect.DeepEqual(p.Drain, p0.Drain) || p.Siphon != p0.Siphon {
			t.Fatalf("same key, another plan for %v", j.Inputs)
		}
	}
	// The same lengths in other units, and the job in US units.
	j := base.Clone()
	j.Inputs[model.FieldHoseLength] = "12000 mm"
	j.Inputs[model.FieldTankLength] = "800cm"
	j.SetUnits(model.US)
	if key, ok := inputsKey(&j, cat); !ok || key != key0 {
		t.Errorf("the demo in US units reads differently")
	}
	// Changed values change the key.
	for id, text := range map[model.FieldID]string{model.FieldHoseLength: "12.5 m", model.FieldLiquid: "diesel",
		model.FieldTankShape: "vertical-cylinder", model.FieldTemp: "9 °C"} {
		j := base.Clone()
		j.Inputs[id] = text
		if key, ok := inputsKey(&j, cat); ok && key == key0 {
			t.Errorf("%s = %q reads as the demo", id, text)
		}
	}
	// A field that does not read, and one that does not apply.
	j = base.Clone()
	j.Inputs[model.FieldHoseLength] = "12 x"
	if _, ok := inputsKey(&j, cat); ok {
		t.Error("an unreadable length gave a key")
	}
	j = base.Clone()
	j.Inputs[model.FieldTankDiameter] = "whatever" // not used by a rectangular tank
	if key, ok := inputsKey(&j, cat); !ok || key != key0 {
		t.Error("a field that does not apply changed the key")
	}
}

// TestRecomputeSkipped: a key that changes nothing physical (the unit
// letter of a value, a trailing space) does not make a new plan, and a
// units toggle words the same plan again, exactly as a full recompute
// would.
func TestRecomputeSkipped(t *testing.T) {
	m := newTestModel(t, 120, 40)
	m = selectField(t, m, model.FieldHoseLength)
	m = press(t, m, "enter", "end") // typing in "12 m", text kept
	m = press(t, m, "backspace")    // "12 " is still 12 m; the plan is made once, without its ranges, while typing
	if !m.st.plan.Quick {
		t.Error("the plan while typing has its ranges (they wait for the typing to end)")
	}
	gen := m.planGen
	m = press(t, m, "m", "space")
	if m.planGen != gen {
		t.Errorf("the plan was made again %d times for the same length", m.planGen-gen)
	}
	m = press(t, m, "backspace", "backspace", "backspace", "5") // "125" m
	if m.planGen == gen {
		t.Fatal("no new plan for a new length")
	}
	m = press(t, m, "esc")
	if m.st.plan.Quick {
		t.Error("the ranges did not come back when the typing ended")
	}
	gen = m.planGen
	m = press(t, m, "f2") // US units
	if m.planGen != gen {
		t.Error("a units toggle made a new plan")
	}
	p := model.Compute(m.job, m.cat)
	if want := present.ForJob(m.job, p, m.job.Units); !reflect.DeepEqual(m.st.sheet, want) {
		t.Errorf("sheet after the toggle differs from a full recompute:\n%+v\nwant\n%+v", m.st.sheet, want)
	}
	if !strings.Contains(frame(m), "ft") {
		t.Error("the screen is not in US units after the toggle")
	}
	// A change of liquid rebuilds the checklist and words the hazards again.
	m = enterField(t, m, model.FieldLiquid, "diesel")
	p = model.Compute(m.job, m.cat)
	if want := present.ForJob(m.job, p, m.job.Units); !reflect.DeepEqual(m.st.sheet, want) {
		t.Errorf("sheet after a liquid change differs from a full recompute")
	}
}

// BenchmarkInputsKey is the check that decides whether a keystroke
// recomputes.
func BenchmarkInputsKey(b *testing.B) {
	cat := presets.Builtin()
	j := model.DemoJob()
	b.ReportAllocs()
	for b.Loop() {
		if _, ok := inputsKey(&j, cat); !ok {
			b.Fatal("no key")
		}
	}
}

// BenchmarkKeystrokeUnitLetter is a keystroke that changes nothing
// physical: the unit letter of the hose length erased and typed again
// ("12 m" ⇄ "12 "), so the plan is not made again.
func BenchmarkKeystrokeUnitLetter(b *testing.B) {
	m := newTestModel(b, 80, 24)
	m = selectField(b, m, model.FieldHoseLength)
	m = press(b, m, "enter", "end")
	keys := []tea.KeyPressMsg{keyMsg("backspace"), {Code: 'm', Text: "m"}}
	b.ReportAllocs()
	b.ResetTimer()
	var sink int
	for i := 0; i < b.N; i++ {
		next, _ := m.Update(keys[i%2])
		m = next.(*Model)
		sink += len(m.View().Content)
	}
	if sink == 0 {
		b.Fatal("empty view")
	}
}

// benchDigits types a digit and erases it in the hose length ("12.5" ⇄
// "12."): each key gives a new plan.
func benchDigits(b *testing.B, w, h int) {
	m := newTestModel(b, w, h)
	m = selectField(b, m, model.FieldHoseLength)
	m = press(b, m, "enter", "end", "backspace", "backspace", ".") // "12."
	keys := []tea.KeyPressMsg{{Code: '5', Text: "5"}, keyMsg("backspace")}
	b.ReportAllocs()
	b.ResetTimer()
	var sink int
	for i := 0; i < b.N; i++ {
		next, _ := m.Update(keys[i%2])
		m = next.(*Model)
		sink += len(m.View().Content)
	}
	if sink == 0 {
		b.Fatal("empty view")
	}
}

// TestRefitOnlyWhenNew: focusing the Log again with the same plan and
// readings asks for no new fit of the readings; a new plan does.
func TestRefitOnlyWhenNew(t *testing.T) {
	m := newTestModel(t, 80, 24)
	t0 := testClock
	for i := 0; i < 3; i++ {
		m.job.Readings = append(m.job.Readings, model.Reading{At: t0.Add(time.Duration(i) * time.Minute), Level: 0.35 - 0.01*float64(i)})
	}
	m = press(t, m, "9")
	seq := m.fitSeq
	if m.fit == nil && m.fitErr == nil {
		t.Fatal("no fit of the readings")
	}
	m = press(t, m, "1", "9")
	if m.fitSeq != seq {
		t.Errorf("the Log focused again fitted the same readings again (%d fits)", m.fitSeq-seq)
	}
	m = enterField(t, m, model.FieldHoseLength, "15 m")
	m = press(t, m, "9")
	if m.fitSeq == seq {
		t.Error("a new plan was not fitted")
	}
}
