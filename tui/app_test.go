package tui

import (
	"bytes"
	"image/color"
	"math"
	"math/rand/v2"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/colorprofile"
	"github.com/charmbracelet/x/ansi"

	"drawdown/calc"
	"drawdown/calc/testkit"
	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// Test helpers: build the root on the demo job with a fixed clock and no
// saving, drive Update with key messages, run returned commands inline.

var testClock = time.Date(2026, time.March, 14, 8, 0, 0, 0, time.UTC)

func newTestModel(t testing.TB, w, h int) *Model {
	t.Helper()
	m := New(Options{Start: Start{Job: model.DemoJob()}, NoSave: true,
		Now: func() time.Time { return testClock }, Loc: time.UTC})
	return send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
}

// send delivers one message and runs what it returns (saves are off, so the
// commands are cheap and local).
func send(t testing.TB, m *Model, msg tea.Msg) *Model {
	t.Helper()
	next, cmd := m.Update(msg)
	m = next.(*Model)
	return runCmd(t, m, cmd, 0)
}

func runCmd(t testing.TB, m *Model, cmd tea.Cmd, depth int) *Model {
	if cmd == nil || depth > 4 {
		return m
	}
	msg := cmd()
	switch msg := msg.(type) {
	case nil:
		return m
	case tea.BatchMsg:
		for _, c := range msg {
			m = runCmd(t, m, c, depth+1)
		}
		return m
	case tea.QuitMsg:
		return m
	}
	next, c := m.Update(msg)
	return runCmd(t, next.(*Model), c, depth+1)
}

// keyMsg builds a key press from its name ("enter", "shift+tab", "ctrl+u",
// "5", "a").
func keyMsg(name string) tea.KeyPressMsg {
	special := map[string]rune{"enter": tea.KeyEnter, "esc": tea.KeyEscape, "tab": tea.KeyTab,
		"up": tea.KeyUp, "down": tea.KeyDown, "left": tea.KeyLeft, "right": tea.KeyRight,
		"backspace": tea.KeyBackspace, "space": tea.KeySpace, "f1": tea.KeyF1, "f2": tea.KeyF2,
		"end": tea.KeyEnd, "home": tea.KeyHome}
	if name == "shift+tab" {
		return tea.KeyPressMsg{Code: tea.KeyTab, Mod: tea.ModShift}
	}
	if strings.HasPrefix(name, "ctrl+") {
		return tea.KeyPressMsg{Code: rune(name[5]), Mod: tea.ModCtrl}
	}
	if c, ok := special[name]; ok {
		return tea.KeyPressMsg{Code: c}
	}
	r := []rune(name)[0]
	return tea.KeyPressMsg{Code: r, Text: name}
}

func press(t testing.TB, m *Model, keys ...string) *Model {
	t.Helper()
	for _, k := range keys {
		m = send(t, m, keyMsg(k))
	}
	return m
}

// typeText types s one rune at a time.
func typeText(t testing.TB, m *Model, s string) *Model {
	t.Helper()
	for _, r := range s {
		m = send(t, m, tea.KeyPressMsg{Code: r, Text: string(r)})
	}
	return m
}

// selectField goes to the field's pane (digit key in navigate mode) and
// moves down to it.
func selectField(t testing.TB, m *Model, id model.FieldID) *Model {
	t.Helper()
	spec, ok := model.FieldByID(id)
	if !ok {
		t.Fatalf("no field %s", id)
	}
	if m.typing() {
		m = press(t, m, "esc")
	}
	m = press(t, m, string(rune('1'+int(spec.Pane))))
	f := m.forms[spec.Pane]
	for i := 0; i < 20 && f.Selected().ID != id; i++ {
		m = press(t, m, "down")
		f = m.forms[spec.Pane]
	}
	if f.Selected().ID != id {
		t.Fatalf("could not reach field %s", id)
	}
	return m
}

// enterField replaces a typed field's text the way a technician does:
// select it, enter, backspace over the old text, type, enter.
func enterField(t testing.TB, m *Model, id model.FieldID, text string) *Model {
	t.Helper()
	m = selectField(t, m, id)
	m = press(t, m, "enter")
	for range []rune(m.job.Inputs[id]) {
		m = press(t, m, "backspace")
	}
	m = typeText(t, m, text)
	return press(t, m, "enter")
}

func frame(m *Model) string { return ansi.Strip(m.View().Content) }

// checkScreen asserts a whole frame is exactly w×h cells with no NaN/Inf.
func checkScreen(t *testing.T, m *Model) string {
	t.Helper()
	plain := frame(m)
	paneCheckFrame(t, plain, m.width, m.height)
	return plain
}

// TestScreen: golden frames of the main screen and each view, at the
// minimum size and a larger one.
func TestScreen(t *testing.T) {
	cases := []struct {
		name string
		w, h int
		keys []string
	}{
		{"hose_80x24", 80, 24, nil},
		{"lift_80x24", 80, 24, []string{"2"}},
		{"liquid_80x24", 80, 24, []string{"3"}},
		{"tank_80x24", 80, 24, []string{"4"}},
		{"side_80x24", 80, 24, []string{"5"}},
		{"curve_80x24", 80, 24, []string{"6"}},
		{"whatif_80x24", 80, 24, []string{"7"}},
		{"checklist_80x24", 80, 24, []string{"8"}},
		{"log_80x24", 80, 24, []string{"9"}},
		{"job_80x24", 80, 24, []string{"0"}},
		{"help_80x24", 80, 24, []string{"?"}},
		{"typing_80x24", 80, 24, []string{"down", "enter"}},
		{"us_units_80x24", 80, 24, []string{"u"}},
		{"hose_120x40", 120, 40, nil},
		{"side_120x40", 120, 40, []string{"5"}},
		{"curve_120x40", 120, 40, []string{"6"}},
		{"whatif_120x40", 120, 40, []string{"7"}},
		{"checklist_120x40", 120, 40, []string{"8"}},
		{"log_120x40", 120, 40, []string{"9"}},
		{"job_120x40", 120, 40, []string{"0"}},
		{"narrow_79x24", 79, 24, nil},
		{"narrow_50x30", 50, 30, nil},
		{"narrow_result_50x30", 50, 30, []string{"="}},
		{"narrow_checklist_40x20", 40, 20, []string{"8"}},
		{"narrow_job_40x20", 40, 20, []string{"0"}},
		{"too_small_39x20", 39, 20, nil},
		{"too_small_40x10", 40, 10, nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := newTestModel(t, c.w, c.h)
			m = press(t, m, c.keys...)
			paneGolden(t, m.View().Content, c.w, c.h)
		})
	}
}

// TestStaleResult: an invalid field shows its message beside it and the last
// valid result stays on screen, marked stale.
func TestStaleResult(t *testing.T) {
	m := newTestModel(t, 80, 24)
	before := m.result.Sheet()
	// Every prefix of "1 mm" after the old text is erased is invalid, so the
	// last valid plan is the one for "38" (bare: 38 mm).
	m = enterField(t, m, model.FieldHoseID, "1 mm")
	got := checkScreen(t, m)
	// Accepted range from model.FieldSpec (3 to 600 mm).
	if !strings.Contains(got, "✗ Hose inside diameter") || !strings.Contains(got, "3 to 600") {
		t.Errorf("no field message with the accepted range:\n%s", got)
	}
	if !strings.Contains(got, "STALE") {
		t.Errorf("result not marked stale:\n%s", got)
	}
	after := m.result.Sheet()
	if after.Flow != before.Flow || !m.result.Stale() {
		t.Errorf("last valid result not kept: flow %v → %v, stale %v", before.Flow, after.Flow, m.result.Stale())
	}
	if m.job.Inputs[model.FieldHoseID] != "1 mm" {
		t.Errorf("typed text lost: %q", m.job.Inputs[model.FieldHoseID])
	}
	paneGolden(t, m.View().Content, 80, 24)
	// ctrl+r puts back the last valid text: what was there when typing in
	// the field last ended with a valid value (the demo's "38 mm"), not a
	// prefix that happened to read on the way ("1").
	m = selectField(t, m, model.FieldHoseID)
	m = press(t, m, "enter", "ctrl+r")
	if m.st.stale || m.job.Inputs[model.FieldHoseID] != "38 mm" {
		t.Errorf("ctrl+r: stale %v, text %q", m.st.stale, m.job.Inputs[model.FieldHoseID])
	}
}

// TestTypedScenario types a whole case through Update and checks the numbers
// on screen against model.Compute for the same inputs (itself checked
// against published values in model and calc), plus the Darcy–Weisbach
// energy balance as an analytic identity.
func TestTypedScenario(t *testing.T) {
	// An invented case: a 25 m run of 1 in hose over a 1.2 m wall, 3 m drop,
	// from a 2 m vertical cylinder holding 1.5 m, intake 10 cm off the floor.
	inputs := []struct {
		id   model.FieldID
		text string
	}{
		{model.FieldHoseID, "1in"},
		{model.FieldHoseLength, "25 m"},
		{model.FieldLift, "1.2m"},
		{model.FieldDrop, "3 m"},
		{model.FieldTankHeight, "2 m"},
		{model.FieldTankLevel, "1.5m"},
		{model.FieldIntakeHeight, "10 cm"},
		{model.FieldTemp, "59F"},
	}
	m := newTestModel(t, 80, 24)
	// Tank shape: cycle the picker to vertical-cylinder.
	m = selectField(t, m, model.FieldTankShape)
	for i := 0; i < 10 && m.job.Inputs[model.FieldTankShape] != "vertical-cylinder"; i++ {
		m = press(t, m, "right")
	}
	m = enterField(t, m, model.FieldTankDiameter, "2 m")
	for _, in := range inputs {
		m = enterField(t, m, in.id, in.text)
	}
	want := model.DemoJob()
	want.Inputs[model.FieldTankShape] = "vertical-cylinder"
	delete(want.Inputs, model.FieldTankLength)
	delete(want.Inputs, model.FieldTankWidth)
	want.Inputs[model.FieldTankDiameter] = "2 m"
	for _, in := range inputs {
		if got := m.job.Inputs[in.id]; got != in.text {
			t.Errorf("%s: stored %q, typed %q", in.id, got, in.text)
		}
		want.Inputs[in.id] = in.text
	}
	m.job.Inputs[model.FieldTankLength] = ""
	m.job.Inputs[model.FieldTankWidth] = ""
	p := model.Compute(want, presets.Builtin())
	if !p.OK() || p.Drain == nil {
		t.Fatalf("reference plan failed: %v", p.Err)
	}
	if m.st.stale || !m.st.hasPlan {
		t.Fatalf("screen plan stale: %v", m.st.problem)
	}
	got := checkScreen(t, m)
	r := p.Result
	for _, s := range []string{
		model.Format(model.DimFlow, float64(r.Flow), model.SI),
		model.Format(model.DimVelocity, float64(r.Velocity), model.SI),
		present.Duration(float64(p.Drain.Time)),
		model.Format(model.DimLength, float64(r.WorkingCrestHeight), model.SI),
		model.Format(model.DimLength, float64(r.MaxCrestHeight), model.SI),
	} {
		if !strings.Contains(got, s) {
			t.Errorf("screen lacks %q:\n%s", s, got)
		}
	}
	if sh := present.Build(p, model.SI, p.Hazards); m.st.sheet.Flow != sh.Flow || m.st.sheet.Drain.Time != sh.Drain.Time {
		t.Errorf("shown flow %s, time %s; Compute gives %s, %s", m.st.sheet.Flow, m.st.sheet.Drain.Time, sh.Flow, sh.Drain.Time)
	}
	// Analytic: H = V²/(2g)·(1 + ΣK + f·L/D) (Darcy–Weisbach, design §3),
	// ΣK the hose's fittings and the intake's own entrance loss.
	s := p.Siphon
	v := float64(r.Velocity)
	h := v * v / (2 * calc.StandardGravity) *
		(1 + s.Hose.KMinor() + s.Intake.K + r.FrictionFactor*float64(s.Hose.Length)/float64(s.Hose.Diameter))
	if math.Abs(h-float64(r.Head))/float64(r.Head) > 0.01 {
		t.Errorf("energy balance: V²/2g(1+ΣK+fL/D) = %g m, head %g m", h, float64(r.Head))
	}
	// Switch units: the same flow in gal/min.
	m = press(t, m, "esc", "u")
	got = checkScreen(t, m)
	if s := model.Format(model.DimFlow, float64(r.Flow), model.US); !strings.Contains(got, s) {
		t.Errorf("US screen lacks %q:\n%s", s, got)
	}
}

// TestNoNaNInf throws awkward text at every typed field and checks the
// frames for NaN and Inf. The form echoes what was typed (nothing typed is
// lost), so for text that itself spells NaN or Inf only the columns right of
// the form (the Result pane) and the drawn views are checked.
func TestNoNaNInf(t *testing.T) {
	bad := []string{"0", "-1", "1e400", "NaN", "-Inf", "0x10", "1/0", "99999999", "-", "1e-300"}
	m := newTestModel(t, 80, 24)
	for _, f := range model.Fields() {
		if !model.Applies(m.job.Inputs, f.ID) {
			continue // "not used here": the selection passes over it
		}
		if f.IsPicker() {
			m = selectField(t, m, f.ID)
			for i := 0; i < 3; i++ {
				m = press(t, m, "right")
				checkScreen(t, m)
			}
			continue
		}
		for _, text := range bad {
			m = enterField(t, m, f.ID, text)
			echo := strings.ContainsAny(strings.ToLower(text), "ni")
			plain := frame(m)
			if echo {
				var right []string
				for _, l := range strings.Split(plain, "\n") {
					r := []rune(l)
					right = append(right, string(r[min(m.lay.Main.W, len(r)):]))
				}
				plain = strings.Join(right, "\n")
			}
			for _, w := range []string{"NaN", "Inf", "inf", "nan"} {
				if strings.Contains(plain, w) {
					t.Fatalf("%s = %q: frame contains %q:\n%s", f.ID, text, w, frame(m))
				}
			}
		}
		m = press(t, m, "ctrl+r")
	}
	// The drawn views and the wide screen after all that.
	for _, p := range []string{"5", "6", "9"} {
		checkScreen(t, press(t, m, p))
	}
	checkScreen(t, send(t, m, tea.WindowSizeMsg{Width: 120, Height: 40}))
}

// TestResize shrinks the screen from 120×40 to 1×1 and back; every frame is
// exactly the terminal's size, from 40×20 to 80×24 the narrow layout keeps
// the verdict on screen, and below 40×20 it says the terminal is too small.
func TestResize(t *testing.T) {
	m := newTestModel(t, 120, 40)
	m = press(t, m, "down", "enter") // typing, so a cursor is placed
	sizes := [][2]int{{120, 40}, {100, 30}, {80, 24}, {79, 24}, {80, 23}, {60, 20}, {40, 12}, {20, 5}, {10, 3}, {1, 1}, {0, 0}, {80, 24}, {200, 60}}
	for _, s := range sizes {
		m = send(t, m, tea.WindowSizeMsg{Width: s[0], Height: s[1]})
		v := m.View()
		plain := ansi.Strip(v.Content)
		if s[0] > 0 && s[1] > 0 {
			paneCheckFrame(t, plain, s[0], s[1])
		}
		small := s[0] < NarrowMinWidth || s[1] < NarrowMinHeight
		if small && s[0] >= 20 && s[1] >= 5 && !strings.Contains(plain, "Terminal too small") {
			t.Errorf("%dx%d: no size message:\n%s", s[0], s[1], plain)
		}
		if narrow := !small && (s[0] < MinWidth || s[1] < MinHeight); narrow && !strings.Contains(plain, "RUNS") {
			t.Errorf("%dx%d: narrow layout without the verdict:\n%s", s[0], s[1], plain)
		}
		if small && v.Cursor != nil {
			t.Errorf("%dx%d: cursor placed on the size message", s[0], s[1])
		}
		if c := v.Cursor; c != nil && (c.X >= s[0] || c.Y >= s[1]) {
			t.Errorf("%dx%d: cursor off screen at %d,%d", s[0], s[1], c.X, c.Y)
		}
	}
}

// TestCursorSteady: the real cursor sits in the field being typed in and
// never blinks (a blinking cursor writes to the terminal while idle).
func TestCursorSteady(t *testing.T) {
	m := newTestModel(t, 80, 24)
	if m.View().Cursor != nil {
		t.Error("cursor shown in navigate mode")
	}
	m = press(t, m, "down", "enter")
	c := m.View().Cursor
	if c == nil || c.Blink {
		t.Fatalf("typing: cursor %+v", c)
	}
	lines := strings.Split(frame(m), "\n")
	row := []rune(lines[c.Y])
	// Cursor just after "12 m" in the Hose length row.
	if !strings.Contains(string(row), "Hose length") || string(row[c.X-4:c.X]) != "12 m" {
		t.Errorf("cursor at %d,%d in %q", c.X, c.Y, string(row))
	}
}

// TestKeysModes: letters are commands only in navigate mode.
func TestKeysModes(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = press(t, m, "down", "enter", "end") // typing in Hose length, keeping its text
	m = typeText(t, m, "u")                 // goes into the field, no unit switch
	if m.job.Units != model.SI || m.job.Inputs[model.FieldHoseLength] != "12 mu" {
		t.Errorf("typing mode: units %v, text %q", m.job.Units, m.job.Inputs[model.FieldHoseLength])
	}
	m = press(t, m, "backspace", "enter", "u") // navigate: u switches units
	if m.job.Units != model.US {
		t.Errorf("navigate mode: u did not switch units")
	}
	m = press(t, m, "enter", "f2") // F2 works while typing
	if m.job.Units != model.SI {
		t.Errorf("F2 while typing did not switch units")
	}
	m = press(t, m, "esc", "8")
	if m.focus != PaneChecklist {
		t.Errorf("8 went to %v", m.focus)
	}
	m = press(t, m, "tab")
	m = press(t, m, "1", "?")
	if !m.showHelp || !strings.Contains(frame(m), "All keys") {
		t.Error("? did not open the help screen")
	}
	m = press(t, m, "esc")
	if m.showHelp {
		t.Error("esc did not close help")
	}
	// Pickers cycle with ←/→ in navigate mode.
	m = selectField(t, m, model.FieldOutletSubmerged)
	m = press(t, m, "right")
	if m.job.Inputs[model.FieldOutletSubmerged] != "yes" {
		t.Errorf("picker: %q", m.job.Inputs[model.FieldOutletSubmerged])
	}
	// Multi picker: space adds the highlighted fitting, - removes it.
	m = selectField(t, m, model.FieldHoseFittings)
	before := m.job.Inputs[model.FieldHoseFittings]
	m = press(t, m, "space")
	if n := strings.Count(m.job.Inputs[model.FieldHoseFittings], ","); n != strings.Count(before, ",")+1 {
		t.Errorf("fittings after space: %q (was %q)", m.job.Inputs[model.FieldHoseFittings], before)
	}
	m = press(t, m, "-")
	if multiLabel(m.forms[0].fields[4].choices, m.job.Inputs[model.FieldHoseFittings]) !=
		multiLabel(m.forms[0].fields[4].choices, before) {
		t.Errorf("fittings after -: %q (was %q)", m.job.Inputs[model.FieldHoseFittings], before)
	}
}

// TestResume: a job reopens at the pane and field it was left on.
func TestResume(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = selectField(t, m, model.FieldDrop)
	j := m.Job()
	if j.Resume.Pane != "Lift & outlet" || j.Resume.Field != model.FieldDrop {
		t.Fatalf("resume not recorded: %+v", j.Resume)
	}
	m2 := New(Options{Start: Start{Job: j}, NoSave: true})
	if m2.focus != PaneLift || m2.forms[PaneLift].Selected().ID != model.FieldDrop {
		t.Errorf("reopened at %v / %s", m2.focus, m2.forms[PaneLift].Selected().ID)
	}
}

// TestSaveCommand: each change saves a copy of the job through a command;
// a save finishing after a later change is followed by another.
func TestSaveCommand(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	st := Start{Job: model.DemoJob(), Dir: dir, Path: model.NewJobPath(dir, "demo"), Fresh: true}
	m := New(Options{Start: st})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	m = enterField(t, m, model.FieldHoseLength, "15 m")
	got, err := model.Load(st.Path)
	if err != nil {
		t.Fatal(err)
	}
	if got.Inputs[model.FieldHoseLength] != "15 m" {
		t.Errorf("saved hose length %q", got.Inputs[model.FieldHoseLength])
	}
	if last, _ := model.LastJobPath(); last == "" {
		t.Error("last job not recorded")
	}
	if !strings.Contains(frame(m), "✓ saved") {
		t.Errorf("no saved mark:\n%s", frame(m))
	}
	// Stale reply is dropped.
	m2, _ := m.Update(jobSavedMsg{seq: m.saveSeq + 5, err: errTest})
	if m2.(*Model).saveErr != nil {
		t.Error("stale save reply was used")
	}
	// The exit save (main, after Run) writes the latest job.
	m = enterField(t, m, model.FieldDrop, "2 m")
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
	if got, err := model.Load(st.Path); err != nil || got.Inputs[model.FieldDrop] != "2 m" {
		t.Errorf("exit save: %v, drop %q", err, got.Inputs[model.FieldDrop])
	}
	// A start with this folder resumes the job.
	s := OpenStart()
	if s.Path == "" || s.Job.Inputs[model.FieldHoseLength] != "15 m" || s.Fresh {
		t.Errorf("OpenStart: %q %q", s.Path, s.Job.Inputs[model.FieldHoseLength])
	}
}

type testErr string

func (e testErr) Error() string { return string(e) }

const errTest = testErr("disk full")

// BenchmarkKeystroke is one keystroke at 80×24 that changes the plan: a
// digit typed and erased in the hose length ("12.5" ⇄ "12."), Update
// (Job.Set, model.Compute with the drain plan and its band, the sheet) and
// View (see benchDigits).
func BenchmarkKeystroke(b *testing.B) { benchDigits(b, 80, 24) }

// sgrToken shows an SGR escape as ⟨params⟩ so that a golden file with the
// attributes stays readable.
var sgrToken = regexp.MustCompile("\x1b\\[([0-9;:]*)m")

// TestNoColor renders the main screen under NO_COLOR the way the renderer
// does (colorprofile's colourless ASCII profile) and keeps the attributes
// that remain in the golden file as ⟨n⟩ tokens. No colour may survive, and
// the focus and the status must still show: inverse (reverse) display (7) for the
// selected field and tab, bold (1) for the verdict, and words and symbols.
func TestNoColor(t *testing.T) {
	env := []string{"TERM=xterm-256color", "NO_COLOR=1"}
	prof := colorprofile.Env(env)
	if prof != colorprofile.Ascii {
		t.Fatalf("NO_COLOR gives profile %v, want Ascii", prof)
	}
	m := newTestModel(t, 80, 24)
	m = enterField(t, m, model.FieldLift, "12 m") // over the limit: WILL NOT RUN
	var buf bytes.Buffer
	w := &colorprofile.Writer{Forward: &buf, Profile: prof}
	if _, err := w.WriteString(m.View().Content); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for _, sgr := range sgrToken.FindAllStringSubmatch(out, -1) {
		for _, p := range strings.FieldsFunc(sgr[1], func(r rune) bool { return r == ';' || r == ':' }) {
			n, _ := strconv.Atoi(p)
			if (n >= 30 && n <= 49) || (n >= 90 && n <= 107) {
				t.Fatalf("colour SGR %q left under NO_COLOR", sgr[0])
			}
		}
	}
	plain := ansi.Strip(out)
	for _, want := range []string{"✗ WILL NOT RUN", "▶ Lift over crest", "[2 Lift]"} {
		if !strings.Contains(plain, want) {
			t.Errorf("NO_COLOR screen lacks %q:\n%s", want, plain)
		}
	}
	if !strings.Contains(out, "\x1b[7m") && !strings.Contains(out, ";7m") {
		t.Error("no inverse (reverse) display for the focus under NO_COLOR")
	}
	readable := sgrToken.ReplaceAllString(out, "⟨$1⟩")
	testkit.Golden(t, filepath.Join("testdata", t.Name()+".golden"), []byte(readable))
	// On a 16-colour terminal only the 16 basic colours may appear.
	buf.Reset()
	w.Profile = colorprofile.ANSI
	_, _ = w.WriteString(m.View().Content)
	if strings.Contains(buf.String(), "38;5;") || strings.Contains(buf.String(), "38;2;") {
		t.Error("extended colours on a 16-colour terminal")
	}
}

// TestStopMsg: on SIGHUP or SIGTERM main sends StopMsg; the screen logs it
// and quits (main then saves the job it returns).
func TestStopMsg(t *testing.T) {
	m := newTestModel(t, 80, 24)
	next, cmd := m.Update(StopMsg{Reason: "SIGHUP"})
	if cmd == nil {
		t.Fatal("no quit command")
	}
	if _, ok := cmd().(tea.QuitMsg); !ok {
		t.Error("StopMsg did not quit")
	}
	j := next.(*Model).Job()
	if n := len(j.Log); n == 0 || !strings.Contains(j.Log[n-1].Text, "SIGHUP") {
		t.Errorf("stop not logged: %+v", j.Log)
	}
}

// BenchmarkKeystrokeWide is the same keystroke at 120×40, where the Side
// view and the Drain curve are on screen and redrawn too.
func BenchmarkKeystrokeWide(b *testing.B) { benchDigits(b, 120, 40) }

// TestLightBackground: the styles follow the terminal's background.
func TestLightBackground(t *testing.T) {
	m := newTestModel(t, 80, 24)
	if !m.styles.IsDark {
		t.Fatal("dark assumed until the terminal answers")
	}
	m = send(t, m, tea.BackgroundColorMsg{Color: color.White})
	if m.styles.IsDark {
		t.Error("light background not taken")
	}
	checkScreen(t, m)
}

// TestCellWidth: the fast width agrees with ansi.StringWidth on the
// characters the screens use, and falls back for the others.
func TestCellWidth(t *testing.T) {
	st := NewStyles(true)
	for _, s := range []string{"", "abc", "✓ RUNS", "▶ ◀ · … ≈ ░ ┌─┐│└┘ ━┃┏┓▲▼ ⠒⢦⣀ ■ ┊ ⇄ ΣK µm °C ×2 –",
		st.fast.OK.Render("✓ RUNS") + " " + st.fast.Muted.Render("x"), "日本語", "e\u0301", "a\tb"} {
		if got, want := cellWidth(s), ansi.StringWidth(s); got != want {
			t.Errorf("cellWidth(%q) = %d, ansi.StringWidth = %d", s, got, want)
		}
	}
}

// TestJobList: o lists the job folder, d starts a new job from the demo in a
// new file, enter opens the one selected.
func TestJobList(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	first := model.NewJobPath(dir, "demo")
	m := New(Options{Start: Start{Job: model.DemoJob(), Dir: dir, Path: first, Fresh: true},
		Now: func() time.Time { return testClock }})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	m = enterField(t, m, model.FieldHoseLength, "20 m")
	m = press(t, m, "o")
	if !m.jobs.open || len(m.jobs.jobs) != 1 {
		t.Fatalf("job list: open %v, %d jobs", m.jobs.open, len(m.jobs.jobs))
	}
	if !strings.Contains(frame(m), "Jobs  enter open") {
		t.Errorf("no job list on screen:\n%s", frame(m))
	}
	m = press(t, m, "d")
	if m.jobs.open || m.path == first || m.job.Inputs[model.FieldHoseLength] != "12 m" {
		t.Fatalf("new demo job: open %v, path %s, length %q", m.jobs.open, m.path, m.job.Inputs[model.FieldHoseLength])
	}
	m = press(t, m, "o")
	if len(m.jobs.jobs) != 2 {
		t.Fatalf("%d jobs listed after the new one", len(m.jobs.jobs))
	}
	for i, j := range m.jobs.jobs {
		if j.Path == first {
			m.jobs.cursor = i
		}
	}
	m = press(t, m, "enter")
	if m.path != first || m.job.Inputs[model.FieldHoseLength] != "20 m" {
		t.Errorf("reopened %s with length %q", m.path, m.job.Inputs[model.FieldHoseLength])
	}
}

// TestFieldMoves: ↑/↓ stay in the pane and pass over fields that do not
// apply; tab goes on into the next pane.
func TestFieldMoves(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = press(t, m, "1", "up")
	if m.focus != PaneHose || m.forms[PaneHose].Cursor() != 0 {
		t.Errorf("up at the top left the pane: %v field %d", m.focus, m.forms[PaneHose].Cursor())
	}
	m = press(t, m, "4", "down", "down") // catalogue, shape; rectangular tank: diameter does not apply
	if id := m.forms[PaneTank].Selected().ID; id != model.FieldTankLength {
		t.Errorf("down from the shape went to %s", id)
	}
	m = press(t, m, "1")
	for i := 0; i < 12; i++ {
		m = press(t, m, "tab")
	}
	if m.focus != PaneLift {
		t.Errorf("tab past the last Hose field: focus %v", m.focus)
	}
}

// nanInfWord finds NaN or Inf written as a number would be.
var nanInfWord = regexp.MustCompile(`(?i)(^|[^a-z])(nan|[+-]?inf(inity)?)([^a-z]|$)`)

// TestRandomKeys drives the screen with a long seeded random run of keys
// and resizes: no panic, every frame exactly the terminal's size, no NaN or
// Inf outside the echo of typed text (the typed alphabet has no n, a, i, f).
func TestRandomKeys(t *testing.T) {
	keys := []string{"tab", "shift+tab", "up", "down", "left", "right", "enter", "esc", "backspace", "space",
		"1", "2", "3", "4", "5", "6", "7", "8", "9", "0", ".", "-", "m", "c", "k", "x", "s", "d", "u", "o", "?",
		"[", "]", "ctrl+r", "ctrl+u", "+", "/", "e", "h", "j", "l"}
	sizes := [][2]int{{80, 24}, {120, 40}, {100, 30}, {79, 24}, {30, 8}}
	for _, seed := range []uint64{5, 11, 23, 42} {
		randomKeys(t, rand.New(rand.NewPCG(seed, 17)), keys, sizes, 1500)
	}
}

func randomKeys(t *testing.T, rng *rand.Rand, keys []string, sizes [][2]int, steps int) {
	m := newTestModel(t, 80, 24)
	for step := 0; step < steps; step++ {
		if rng.IntN(100) == 0 {
			s := sizes[rng.IntN(len(sizes))]
			m = send(t, m, tea.WindowSizeMsg{Width: s[0], Height: s[1]})
		}
		k := keys[rng.IntN(len(keys))]
		m = press(t, m, k)
		plain := frame(m)
		lines := strings.Split(plain, "\n")
		if len(lines) != m.height {
			t.Fatalf("step %d (key %q): %d lines at %d×%d", step, k, len(lines), m.width, m.height)
		}
		for i, l := range lines {
			if w := ansi.StringWidth(l); w != m.width {
				t.Fatalf("step %d (key %q): line %d is %d cells at %d×%d:\n%s", step, k, i, w, m.width, m.height, plain)
			}
		}
		// Whole words only: the checklist's own text says "disinfected".
		if bad := nanInfWord.FindString(plain); bad != "" {
			t.Fatalf("step %d (key %q): frame shows %q:\n%s", step, k, bad, plain)
		}
	}
}

// TestFirstFrameOnEveryPane: a job left on any pane reopens on it, and the
// first frame (drawn before any message, the window size included) draws
// without a panic. Reopening on the Job pane panicked: its rows were built
// only when the first message synced the panes.
func TestFirstFrameOnEveryPane(t *testing.T) {
	for _, s := range paneTable {
		t.Run(s.name, func(t *testing.T) {
			j := model.DemoJob()
			j.Resume.Pane = s.name
			m := New(Options{Start: Start{Job: j}, NoSave: true})
			_ = frame(m)
			m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
			checkScreen(t, m)
			m = send(t, m, tea.WindowSizeMsg{Width: 46, Height: 28})
			checkScreen(t, m)
		})
	}
}
