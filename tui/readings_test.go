package tui

import (
	"math"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// Level readings typed in the Log pane land in the job with the root's
// clock, digits go into the reading (not to pane switching), and two
// readings are fitted against the plan.
func TestReadingsInLogPane(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = press(t, m, "9", "r")
	if !m.typing() {
		t.Fatal("r in the Log pane did not open the reading input")
	}
	m = typeText(t, m, "0.34 m")
	m = press(t, m, "enter")
	if len(m.job.Readings) != 1 || math.Abs(m.job.Readings[0].Level-0.34) > 1e-12 || !m.job.Readings[0].At.Equal(testClock) {
		t.Fatalf("readings %+v", m.job.Readings)
	}
	if m.focus != PaneLog {
		t.Fatalf("typing a digit switched the pane to %v", m.focus)
	}
	// A second reading 20 minutes later, as the drain runs.
	m.now = func() time.Time { return testClock.Add(20 * time.Minute) }
	m = press(t, m, "r")
	m = typeText(t, m, "0.31")
	m = press(t, m, "enter")
	if len(m.job.Readings) != 2 {
		t.Fatalf("readings %+v", m.job.Readings)
	}
	got := frame(m)
	if !strings.Contains(got, "Readings: 2") {
		t.Errorf("no readings summary:\n%s", got)
	}
	if m.fit == nil && m.fitErr == nil {
		t.Error("no fit after two readings")
	}
	// A reading that does not parse keeps the input open with its message.
	m = press(t, m, "r")
	m = typeText(t, m, "deep")
	m = press(t, m, "enter")
	if len(m.job.Readings) != 2 || !m.typing() || !strings.Contains(frame(m), "✗") {
		t.Errorf("bad reading accepted or silent:\n%s", frame(m))
	}
	m = press(t, m, "esc")
	if m.typing() {
		t.Error("esc did not close the reading input")
	}
}

// w in the Log pane writes the record beside the job file.
func TestRecordKey(t *testing.T) {
	dir := t.TempDir()
	m := newTestModel(t, 80, 24)
	m.path = dir + "/bund.json"
	next, cmd := m.Update(keyMsg("9"))
	m = runCmd(t, next.(*Model), cmd, 0)
	next, cmd = m.Update(keyMsg("w"))
	m = next.(*Model)
	msg := cmd()
	if _, ok := msg.(RecordWriteMsg); !ok {
		t.Fatalf("w gave %T", msg)
	}
	next, cmd = m.Update(msg)
	m = next.(*Model)
	written := cmd().(recordWrittenMsg)
	if written.err != nil || len(written.paths) != 2 {
		t.Fatalf("record: %+v", written)
	}
	for _, p := range written.paths {
		if !strings.HasPrefix(p, dir+"/bund-") {
			t.Errorf("record written to %s, want beside the job", p)
		}
	}
	m = send(t, m, tea.Msg(written))
	if !strings.Contains(m.flash, "record written") {
		t.Errorf("flash %q", m.flash)
	}
}

// Marking the last checklist step closes the job out; putting a step back
// to do reopens it.
func TestCloseOut(t *testing.T) {
	m := newTestModel(t, 80, 24)
	for _, s := range m.job.Checklist.Steps {
		m = send(t, m, ChecklistMarkMsg{ID: s.ID, State: model.StateSkipped, Reason: "test run"})
	}
	if m.job.Closed.IsZero() {
		t.Fatal("job not closed after every step was marked")
	}
	first := m.job.Checklist.Steps[0].ID
	m = send(t, m, ChecklistMarkMsg{ID: first, State: model.StatePending})
	if !m.job.Closed.IsZero() {
		t.Error("job still closed with a step to do")
	}
}

// Choosing a catalogue tank in the Tank pane fills its shape and sizes.
func TestTankPresetPicker(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m.applyEdit(FieldEdit{ID: model.FieldTankPreset, Text: "drum-208"})
	tp, _ := m.cat.Tank("drum-208")
	if m.job.Inputs[model.FieldTankShape] != tp.Shape || m.job.Inputs[model.FieldTankDiameter] == "" {
		t.Errorf("preset not applied: %v", m.job.Inputs)
	}
}
