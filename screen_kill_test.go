//go:build linux

package main

import (
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"drawdown/model"
)

// TestScreenKill is the kill test: the real program on a pty, typing into
// a field, is killed with SIGKILL (no chance to clean up) at 200 random
// moments: between keys, while a key is in flight (read, journalled,
// drawn), and while the job file is being written whole (ctrl+s starts a
// checkpoint among the keys). After every kill the job loads, and it holds
// every key whose frame the screen had shown and at most the one in
// flight besides: a killed process loses at most the keystroke in flight.
// The next start removes the temporary copies the kills left.
func TestScreenKill(t *testing.T) {
	rounds := 200
	if testing.Short() {
		rounds = 20
	}
	home, path := jobHome(t, 0)
	base, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	base.Resume = model.Resume{Pane: "Hose", Field: model.FieldHoseLength}
	rng := rand.New(rand.NewPCG(16, 200))
	kept, lost, midCheckpoint, keys := 0, 0, 0, 0
	maxTemps := 0
	start := time.Now()
	for r := range rounds {
		os.Remove(model.JournalPath(path))
		if err := model.SaveAtomic(path, base); err != nil {
			t.Fatal(err)
		}
		s := startScreen(t, home, 80, 24)
		if !s.waitFor("Bund B2", 10*time.Second) {
			t.Fatalf("round %d: no first frame", r)
		}
		s.quiet(30*time.Millisecond, 2*time.Second)
		s.key("\r", 15*time.Millisecond) // type in the hose length, "12 m" selected
		s.send("\x1b[C")                 // → keeps it
		typed, acked := "", 0
		checkpoint := false
		for range rng.IntN(6) {
			if rng.IntN(3) == 0 {
				s.master.WriteString("\x13") // ctrl+s: the file written whole
				checkpoint = true
			}
			d := string(rune('0' + rng.IntN(10)))
			s.key(d, 5*time.Millisecond)
			typed += d
			acked = len(typed)
		}
		if rng.IntN(4) == 0 {
			s.master.WriteString("\x13")
			checkpoint = true
		}
		// The key in flight, and the kill a random moment after it: 0 to
		// 8 ms (a key takes 2 to 5 ms to be read, journalled and drawn).
		d := string(rune('0' + rng.IntN(10)))
		s.master.WriteString(d)
		typed += d
		for end := time.Now().Add(time.Duration(rng.Int64N(int64(8 * time.Millisecond)))); time.Now().Before(end); {
		}
		s.cmd.Process.Signal(syscall.SIGKILL)
		if !s.wait(5 * time.Second) {
			t.Fatalf("round %d: not dead after SIGKILL", r)
		}
		keys += len(typed)
		j, err := model.Load(path)
		if err != nil {
			t.Fatalf("round %d: after the kill the job does not load: %v", r, err)
		}
		got, ok := strings.CutPrefix(j.Inputs[model.FieldHoseLength], "12 m")
		if !ok || !strings.HasPrefix(typed, got) || len(got) < acked {
			t.Fatalf("round %d: the job holds %q after typing %q (%d keys shown on screen)", r, j.Inputs[model.FieldHoseLength], "12 m"+typed, acked)
		}
		if len(got) == len(typed) {
			kept++
		} else {
			lost++
		}
		temps, _ := filepath.Glob(filepath.Join(filepath.Dir(path), ".*.tmp-*"))
		if len(temps) > 0 && checkpoint {
			midCheckpoint++
		}
		maxTemps = max(maxTemps, len(temps))
	}
	temps, _ := filepath.Glob(filepath.Join(filepath.Dir(path), ".*.tmp-*"))
	s := startScreen(t, home, 80, 24)
	s.waitFor("Bund B2", 10*time.Second)
	s.quiet(30*time.Millisecond, 2*time.Second)
	after, _ := filepath.Glob(filepath.Join(filepath.Dir(path), ".*.tmp-*"))
	tq := time.Now()
	if !s.quit(5 * time.Second) {
		t.Error("the last start did not quit")
	}
	t.Log("quit", time.Since(tq))
	t.Logf("%d kills in %v, %d keys typed; the key in flight was kept %d times and lost %d times; "+
		"%d kills fell while the job file was being written whole (a temporary copy left); "+
		"temporary copies: at most %d after a kill, %d before the last start, %d after it",
		rounds, time.Since(start).Round(time.Second), keys, kept, lost, midCheckpoint, maxTemps, len(temps), len(after))
	if len(after) != 0 {
		t.Errorf("the start left %d temporary copies: %v", len(after), after)
	}
}
