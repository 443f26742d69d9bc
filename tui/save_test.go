package tui

import (
	"bytes"
	"os"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// TestJournalFromScreen: what the screen writes for each kind of key. A
// move writes nothing; each typed key writes one journal record (and
// nothing else); a change of pane is a checkpoint: the job file is written
// whole, with the resume position, and the journal drops what it held.
func TestJournalFromScreen(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, _ := model.JobsDir()
	path := model.NewJobPath(dir, "demo")
	m := New(Options{Start: Start{Job: model.DemoJob(), Dir: dir, Path: path, Fresh: true}, Now: func() time.Time { return testClock }})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	journal := model.JournalPath(path)
	lines := func() int {
		b, err := os.ReadFile(journal)
		if err != nil {
			t.Fatal(err)
		}
		return bytes.Count(b, []byte("\n"))
	}
	stat := func() os.FileInfo {
		fi, err := os.Stat(path)
		if err != nil {
			t.Fatal(err)
		}
		return fi
	}
	start, file := lines(), stat()
	m = press(t, m, "down", "down", "up", "down")
	if n := lines(); n != start {
		t.Errorf("4 moves wrote %d journal lines", n-start)
	}
	if !os.SameFile(file, stat()) {
		t.Error("a move rewrote the job file")
	}
	m = press(t, m, "enter", "right", "5", "backspace", "7")
	if n := lines() - start; n != 3 {
		t.Errorf("3 typed keys wrote %d journal lines", n)
	}
	if !os.SameFile(file, stat()) {
		t.Error("a typed key rewrote the job file")
	}
	m = press(t, m, "esc", "8") // Esc puts the text back (one record), 8 is the Checklist
	if n := lines(); n != 1 {
		t.Errorf("after a change of pane the journal has %d lines, want the header only", n)
	}
	got, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if got.Resume.Pane != "Checklist" {
		t.Errorf("resume position %+v after the checkpoint", got.Resume)
	}
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
}
