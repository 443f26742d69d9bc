package tui

import (
	"bytes"
	"os"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// The tests run a change of pane's checkpoint at once (runCmd waits for
// every command); TestPaneSettle checks the wait itself.
func init() { paneSettle = 0 }

// TestPaneSettle: a change of pane writes the job file whole only once the
// pane has stayed paneSettle: looking through the views one after another
// writes nothing until the last one settles, and then once, with the
// resume position.
func TestPaneSettle(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	defer func(d time.Duration) { paneSettle = d }(paneSettle)
	paneSettle = time.Hour
	dir, _ := model.JobsDir()
	path := model.NewJobPath(dir, "demo")
	m := New(Options{Start: Start{Job: model.DemoJob(), Dir: dir, Path: path, Fresh: true}, Now: func() time.Time { return testClock }})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	file, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"5", "6", "7", "8"} {
		m = sendNoWait(t, m, keyMsg(k))
	}
	if fi, _ := os.Stat(path); !os.SameFile(file, fi) {
		t.Fatal("a look through the views rewrote the job file at once")
	}
	m = send(t, m, paneSettledMsg{seq: m.ps.paneSeq - 1}) // a pane left since
	if fi, _ := os.Stat(path); !os.SameFile(file, fi) {
		t.Fatal("a pane no longer shown was checkpointed")
	}
	m = send(t, m, paneSettledMsg{seq: m.ps.paneSeq})
	got, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if fi, _ := os.Stat(path); os.SameFile(file, fi) || got.Resume.Pane != "Checklist" {
		t.Errorf("the settled pane was not checkpointed: resume %+v", got.Resume)
	}
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
}

// sendNoWait is send, running only the commands that answer within 200 ms
// (not the wait of a change of pane).
func sendNoWait(t testing.TB, m *Model, msg tea.Msg) *Model {
	t.Helper()
	next, cmd := m.Update(msg)
	m = next.(*Model)
	var run func(cmd tea.Cmd, depth int)
	run = func(cmd tea.Cmd, depth int) {
		if cmd == nil || depth > 4 {
			return
		}
		ch := make(chan tea.Msg, 1)
		go func() { ch <- cmd() }()
		var msg tea.Msg
		select {
		case msg = <-ch:
		case <-time.After(200 * time.Millisecond):
			return
		}
		switch msg := msg.(type) {
		case nil, tea.QuitMsg:
		case tea.BatchMsg:
			for _, c := range msg {
				run(c, depth+1)
			}
		default:
			next, c := m.Update(msg)
			m = next.(*Model)
			run(c, depth+1)
		}
	}
	run(cmd, 0)
	return m
}

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
