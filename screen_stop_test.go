//go:build linux

package main

import (
	"syscall"
	"testing"
	"time"

	"drawdown/model"
)

// draftInputs are the inputs whose text, typed and not entered, must
// survive a stop: the keys that open each one on the demo job and the text
// typed in it.
var draftInputs = []struct {
	name  string
	open  []string
	text  string
	kind  model.DraftKind
	shown string // what the next start shows of the restored draft
}{
	{"field", []string{"j", "\r", "→"}, "9", model.DraftField, "draft restored in the field Hose length"},
	{"checklist note", []string{"8", "n"}, "gas 0 ppm", model.DraftNote, "(draft) "},
	{"skip reason", []string{"8", "s"}, "no power", model.DraftReason, "(draft) "},
	{"level reading", []string{"9", "r"}, "0.31", model.DraftReading, "(draft) "},
}

// stopKinds are the ways a screen is stopped from outside, with the stop
// line each must log.
var stopKinds = []struct {
	name string
	stop func(s *screen)
	ctty bool
	line string
}{
	{"SIGHUP", func(s *screen) { s.cmd.Process.Signal(syscall.SIGHUP) }, true, "stopped (SIGHUP); job saved"},
	{"SIGTERM", func(s *screen) { s.cmd.Process.Signal(syscall.SIGTERM) }, true, "stopped (SIGTERM); job saved"},
	{"SIGINT", func(s *screen) { s.cmd.Process.Signal(syscall.SIGINT) }, true, "stopped (SIGINT); job saved"},
	// The terminal closes and no signal comes (the pty is not the
	// program's controlling terminal): its input gives EIO.
	{"closed pty", func(s *screen) { s.hangUp() }, false, "stopped (the terminal closed: end of input); job saved"},
}

// TestScreenDraftSignals: text typed in each input and not entered is
// kept as the job's draft when the screen is stopped by SIGHUP, SIGTERM,
// SIGINT or a terminal that closes under it, with the stop line logged
// every time; the next start puts the draft back, marked as a draft.
// Each stop is tried 5 times on each of the 4 inputs (20 runs a stop).
func TestScreenDraftSignals(t *testing.T) {
	rounds := 5
	if testing.Short() {
		rounds = 1
	}
	for _, stop := range stopKinds {
		t.Run(stop.name, func(t *testing.T) {
			runs, kept, logged := 0, 0, 0
			for r := range rounds {
				for _, in := range draftInputs {
					home, path := jobHome(t, 0)
					s := startScreenOn(t, home, 80, 24, stop.ctty)
					if !s.waitFor("Bund B2", 10*time.Second) {
						t.Fatal("no first frame")
					}
					s.quiet(100*time.Millisecond, 3*time.Second)
					for _, k := range in.open {
						if k == "→" {
							s.send("\x1b[C") // keeps the text: nothing changes on screen
							continue
						}
						s.key(k, 30*time.Millisecond)
					}
					for _, c := range in.text {
						s.key(string(c), 20*time.Millisecond)
					}
					stop.stop(s)
					if !s.wait(5 * time.Second) {
						t.Fatalf("%s, %s: still running 5 s after the stop", stop.name, in.name)
					}
					runs++
					j, err := model.Load(path)
					if err != nil {
						t.Fatalf("%s, %s: %v", stop.name, in.name, err)
					}
					wantText := in.text
					if in.kind == model.DraftField {
						wantText = "12 m" + in.text
					}
					if j.Draft.Kind == in.kind && j.Draft.Text == wantText {
						kept++
					} else {
						t.Errorf("%s, %s: draft %+v, want %s %q", stop.name, in.name, j.Draft, in.kind, wantText)
					}
					if n := len(j.Log); n > 0 && j.Log[n-1].Text == stop.line {
						logged++
					} else {
						t.Errorf("%s, %s: last log line %q, want %q", stop.name, in.name, lastLog(j), stop.line)
					}
					if r == 0 {
						// The next start puts it back, marked as a draft.
						s2 := startScreen(t, home, 80, 24)
						if !s2.waitFor(in.shown, 5*time.Second) {
							t.Errorf("%s, %s: the next start does not show %q", stop.name, in.name, in.shown)
						}
						if !s2.quit(5 * time.Second) {
							t.Errorf("%s, %s: the next start does not quit", stop.name, in.name)
						}
					}
				}
			}
			t.Logf("%s: %d runs; draft kept in %d; stop line logged in %d", stop.name, runs, kept, logged)
		})
	}
}

func lastLog(j model.Job) string {
	if len(j.Log) == 0 {
		return ""
	}
	return j.Log[len(j.Log)-1].Text
}
