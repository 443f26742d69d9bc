package model

import (
	"testing"
	"time"
)

// TestShareAppends: two screens add a reading and a log line each from the
// same job; applied in either order, the owner's job keeps all four, each
// signed by who added it, and a screen's edit still on its way, applied
// again on the owner's job, keeps its own.
func TestShareAppends(t *testing.T) {
	t0 := time.Date(2026, 3, 14, 9, 0, 0, 0, time.UTC)
	base := DemoJob()
	owner := base.Clone()
	a, b := base.Clone(), base.Clone()
	ta, tb := NewTracker(&a), NewTracker(&b)
	a.Readings = append(a.Readings, Reading{At: t0, Level: 0.3})
	a.AddLog(t0, "level reading 0.30 m")
	b.Readings = append(b.Readings, Reading{At: t0, Level: 0.4})
	b.AddLog(t0, "level reading 0.40 m")
	ea, err := ta.Diff(&a, "Ana")
	if err != nil || ea == nil {
		t.Fatal(ea, err)
	}
	eb, err := tb.Diff(&b, "Ben")
	if err != nil || eb == nil {
		t.Fatal(eb, err)
	}
	if err := ea.Apply(&owner); err != nil {
		t.Fatal(err)
	}
	// Ben's screen takes the owner's job with its own edit on top.
	again := owner.Clone()
	if err := eb.Apply(&again); err != nil {
		t.Fatal(err)
	}
	if err := eb.Apply(&owner); err != nil {
		t.Fatal(err)
	}
	for _, j := range []Job{owner, again} {
		n := len(base.Readings)
		if len(j.Readings) != n+2 || j.Readings[n].By != "Ana" || j.Readings[n+1].By != "Ben" {
			t.Errorf("readings %+v", j.Readings[n:])
		}
		if m := len(base.Log); len(j.Log) != m+2 || j.Log[m].By != "Ana" || j.Log[m+1].By != "Ben" {
			t.Errorf("log %+v", j.Log[m:])
		}
	}
	// The next edit of Ben's screen, from the job it was given.
	tb.Reset(&again)
	again.Readings = append(again.Readings, Reading{At: t0.Add(time.Minute), Level: 0.35})
	e, err := tb.Diff(&again, "Ben")
	if err != nil || e == nil {
		t.Fatal(e, err)
	}
	if err := e.Apply(&owner); err != nil {
		t.Fatal(err)
	}
	if len(owner.Readings) != len(base.Readings)+3 {
		t.Errorf("%d readings, want %d", len(owner.Readings), len(base.Readings)+3)
	}
}
