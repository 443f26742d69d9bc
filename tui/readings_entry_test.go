package tui

import (
	"math"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// savedModel is the demo on a job file in a temporary home, saving as the
// screen does (journal and checkpoints), with the test clock.
func savedModel(t *testing.T, now *time.Time) (*Model, string) {
	t.Helper()
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, _ := model.JobsDir()
	path := model.NewJobPath(dir, "demo")
	m := New(Options{Start: Start{Job: model.DemoJob(), Dir: dir, Path: path, Fresh: true}, Now: func() time.Time { return *now }, Loc: time.UTC})
	return send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24}), path
}

// Readings typed with their times, shown as typed, and one corrected: the
// correction is on disk at once (a checkpoint; the journal only appends
// readings), before the program ends.
func TestReadingTimesAndCorrection(t *testing.T) {
	now := testClock // 08:00 UTC
	m, path := savedModel(t, &now)
	m = press(t, m, "9")
	for _, in := range []string{"0.333 @ 07:50", "0.328 @ -5 min", "0.325"} {
		m = press(t, m, "r")
		m = typeText(t, m, in)
		m = press(t, m, "enter")
	}
	rs := m.job.Readings
	wantAt := []time.Time{testClock.Add(-10 * time.Minute), testClock.Add(-5 * time.Minute), testClock}
	if len(rs) != 3 {
		t.Fatalf("readings %+v", rs)
	}
	for i, r := range rs {
		if !r.At.Equal(wantAt[i]) || r.Resolution != 0.001 {
			t.Errorf("reading %d at %v (res %g), want %v", i, r.At, r.Resolution, wantAt[i])
		}
	}
	got := frame(m)
	for _, s := range []string{"07:50:00  0.333 m", "07:55:00  0.328 m", "08:00:00  0.325 m"} {
		if !strings.Contains(got, s) {
			t.Errorf("%q not on the Log pane:\n%s", s, got)
		}
	}
	// e chooses the newest reading; ↑ the one before; enter opens it as typed.
	m = press(t, m, "e", "up", "enter")
	if !m.typing() || !strings.Contains(frame(m), "0.328 m @ 2026-03-14 07:55:00") {
		t.Fatalf("correction input:\n%s", frame(m))
	}
	m = press(t, m, "ctrl+u")
	m = typeText(t, m, "0.327 @ 07:56")
	m = press(t, m, "enter")
	if r := m.job.Readings[1]; r.Level != 0.327 || !r.At.Equal(testClock.Add(-4*time.Minute)) {
		t.Fatalf("corrected reading %+v", r)
	}
	if last := m.job.Log[len(m.job.Log)-1].Text; !strings.Contains(last, "0.328 m at 07:55:00 → 0.327 m at 07:56:00") {
		t.Errorf("log %q", last)
	}
	disk, err := model.Load(path) // the file and its journal, as a crash would leave them
	if err != nil {
		t.Fatal(err)
	}
	if r := disk.Readings[1]; r.Level != 0.327 || !r.At.Equal(testClock.Add(-4*time.Minute)) {
		t.Errorf("on disk the reading is %+v; the correction did not survive", r)
	}
	// A time still to come is refused with the forms accepted.
	m = press(t, m, "r")
	m = typeText(t, m, "0.32 @ 2026-03-14 09:00")
	m = press(t, m, "enter")
	if len(m.job.Readings) != 3 || !strings.Contains(frame(m), "is later") {
		t.Errorf("future reading accepted or silent:\n%s", frame(m))
	}
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
}

// A flow test typed in the Log pane: stamped now, with the plan's level
// (the drain not started: its start level), listed with the readings in
// the job's units, fitted, and on disk.
func TestFlowTestInLogPane(t *testing.T) {
	now := testClock
	m, path := savedModel(t, &now)
	m = press(t, m, "9", "f")
	m = typeText(t, m, "10L/12s; bucket at the ditch")
	m = press(t, m, "enter")
	if len(m.job.FlowTests) != 1 {
		t.Fatalf("flow tests %+v", m.job.FlowTests)
	}
	ft := m.job.FlowTests[0]
	if !ft.At.Equal(testClock) || math.Abs(ft.Flow()-0.01/12) > 1e-15 || math.Abs(ft.Level-0.35) > 1e-9 || ft.Note != "bucket at the ditch" {
		t.Errorf("flow test %+v (want 10 L in 12 s at the demo's start level 0.35 m)", ft)
	}
	got := frame(m)
	if !strings.Contains(got, "flow 10.0 L in 12 s: 50.0 L/min") { // 10 L / 12 s = 50 L/min
		t.Errorf("flow test not listed:\n%s", got)
	}
	if m.fit == nil || m.fit.NTests != 1 || !strings.Contains(got, "bucket tests at") {
		t.Errorf("flow test not fitted (%+v, %v):\n%s", m.fit, m.fitErr, got)
	}
	disk, err := model.Load(path)
	if err != nil || len(disk.FlowTests) != 1 {
		t.Errorf("flow test on disk: %+v, %v", disk.FlowTests, err)
	}
	m = press(t, m, "f")
	m = typeText(t, m, "10L")
	m = press(t, m, "enter")
	if len(m.job.FlowTests) != 1 || !strings.Contains(frame(m), "type the volume caught") {
		t.Errorf("bad flow test accepted or silent:\n%s", frame(m))
	}
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
}
