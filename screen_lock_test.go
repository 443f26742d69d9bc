//go:build linux

package main

import (
	"strconv"
	"testing"
	"time"

	"drawdown/model"
)

// TestScreenLock: two screens on one job, as two technicians with one
// job open in two terminals. The second is told who holds it (process and
// host) and offered read-only or a take-over; read-only saves nothing; on
// a take-over the second gets every edit the first had made, and the
// first, at its next key, says it is read-only now and to whom it lost
// the job; its later keys are not saved. Nothing either typed is lost or
// overwritten unseen.
func TestScreenLock(t *testing.T) {
	home, path := jobHome(t, 0)
	a := startScreen(t, home, 80, 24)
	if !a.waitFor("Bund B2", 10*time.Second) {
		t.Fatal("A: no first frame")
	}
	a.quiet(50*time.Millisecond, 2*time.Second)
	// A types a hose length (journalled, not yet written whole).
	a.key("j", 20*time.Millisecond)
	a.key("\r", 20*time.Millisecond)
	for _, k := range []string{"1", "4", " ", "m", "\r"} {
		a.key(k, 20*time.Millisecond)
	}

	b := startScreen(t, home, 80, 24)
	pid := strconv.Itoa(a.cmd.Process.Pid)
	if !b.waitFor("This job is open in another drawdown", 10*time.Second) || !b.waitFor("process "+pid, time.Second) {
		t.Fatalf("B was not told that process %s holds the job", pid)
	}
	// Read-only: B sees A's edit and saves nothing of its own.
	b.key("r", 50*time.Millisecond)
	if !b.waitFor("read-only", 2*time.Second) || !b.waitFor("14 m", 2*time.Second) {
		t.Error("B read-only: no read-only mark, or A's hose length not shown")
	}
	if !b.quit(5 * time.Second) {
		t.Fatal("B read-only did not quit")
	}
	if j, _ := model.Load(path); j.Inputs[model.FieldHoseLength] != "14 m" {
		t.Errorf("after B read-only, hose length %q", j.Inputs[model.FieldHoseLength])
	}

	// B again, taking the job over.
	b = startScreen(t, home, 80, 24)
	if !b.waitFor("This job is open in another drawdown", 10*time.Second) {
		t.Fatal("B: no lock prompt")
	}
	b.key("t", 100*time.Millisecond)
	if !b.waitFor("took the job over from process "+pid, 3*time.Second) && !b.waitFor("14 m", time.Second) {
		t.Error("B took over without A's edit")
	}
	// A's next key: read-only now, naming B.
	a.key("k", 50*time.Millisecond) // a move
	a.key("\r", 50*time.Millisecond)
	a.key("9", 50*time.Millisecond) // an edit A cannot save
	if !a.waitFor("read-only", 3*time.Second) || !a.waitFor("process "+strconv.Itoa(b.cmd.Process.Pid), time.Second) {
		t.Error("A did not say it lost the job to B")
	}
	// B types; B's edit is saved, A's later one is not.
	b.key("1", 50*time.Millisecond) // the Hose pane
	b.key("k", 50*time.Millisecond)
	b.key("k", 50*time.Millisecond)
	if !a.quit(5*time.Second) || !b.quit(5*time.Second) {
		t.Fatal("a screen did not quit")
	}
	j, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if got := j.Inputs[model.FieldHoseLength]; got != "14 m" {
		t.Errorf("hose length %q: A's edit before the take-over must stay, its edit after must not land", got)
	}
	if _, held, _ := model.ReadLock(path); held {
		t.Error("the lock is still held after both quit")
	}
}
