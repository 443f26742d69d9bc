package model

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"drawdown/presets"
)

// TestJournalEveryEntry: every field of Job has a job-file key in the
// journal's table, and the entries journalled in their own way are the ones
// meant; a field added to Job is journalled whole with no other change.
func TestJournalEveryEntry(t *testing.T) {
	if n := reflect.TypeFor[Job]().NumField(); len(jobEntries) != n {
		t.Fatalf("journal table has %d entries for %d Job fields", len(jobEntries), n)
	}
	want := map[string]entryKind{"schema": entrySkip, "version": entrySkip, "resume": entrySkip, "updated": entryStamp,
		"inputs": entryMap, "last_good": entryMap, "log": entryList, "readings": entryList, "checklist": entrySteps, "flow_tests": entryList,
		"name": entryReplace, "draft": entryReplace, "site_facts": entryReplace, "release": entryReplace}
	for key, k := range want {
		if e, ok := jobEntryByKey[key]; !ok || e.kind != k {
			t.Errorf("entry %q: kind %v, want %v", key, e.kind, k)
		}
	}
	for _, e := range jobEntries {
		if e.key == "" || e.key == "-" {
			t.Errorf("Job field %d has no job-file key", e.index)
		}
	}
}

// edit is one change a screen makes to a job.
type edit func(j *Job, r *rand.Rand, at time.Time)

var edits = []edit{
	func(j *Job, r *rand.Rand, _ time.Time) { // typing in a field
		ids := []FieldID{FieldHoseLength, FieldHoseID, FieldLift, FieldDrop, FieldTankLevel}
		id := ids[r.IntN(len(ids))]
		j.Set(id, j.Inputs[id]+string(rune('0'+r.IntN(10))))
	},
	func(j *Job, r *rand.Rand, _ time.Time) { // erasing
		id := FieldHoseLength
		if s := j.Inputs[id]; s != "" {
			j.Set(id, s[:len(s)-1])
		}
	},
	func(j *Job, r *rand.Rand, at time.Time) { j.AddLog(at, fmt.Sprintf("log line %d", r.IntN(1000))) },
	func(j *Job, r *rand.Rand, at time.Time) { // a mark
		s := j.Checklist.Steps[r.IntN(len(j.Checklist.Steps))]
		j.Checklist.Mark(s.ID, StateDone, "", "", at)
	},
	func(j *Job, r *rand.Rand, _ time.Time) { // a note
		s := j.Checklist.Steps[r.IntN(len(j.Checklist.Steps))]
		j.Checklist.SetNote(s.ID, fmt.Sprintf("note %d", r.IntN(100)))
	},
	func(j *Job, r *rand.Rand, at time.Time) { // a reading
		j.Readings = append(j.Readings, Reading{At: at, Level: 0.35 * r.Float64()})
	},
	func(j *Job, r *rand.Rand, at time.Time) { // a flow test
		_ = j.AddFlowTest(FlowTest{At: at, Volume: 0.01, Seconds: 5 + 10*r.Float64(), By: "crew"})
	},
	func(j *Job, r *rand.Rand, at time.Time) { // a draft being typed
		j.Draft = Draft{Kind: DraftNote, Step: j.Checklist.Steps[0].ID, Text: j.Draft.Text + "x", At: at}
	},
	func(j *Job, _ *rand.Rand, _ time.Time) { j.Draft = Draft{} },
	func(j *Job, r *rand.Rand, at time.Time) { j.SetInfo(InfoSite, fmt.Sprintf("site %d", r.IntN(9)), at) },
	func(j *Job, _ *rand.Rand, _ time.Time) { // units
		if j.Units == SI {
			j.SetUnits(US)
		} else {
			j.SetUnits(SI)
		}
	},
	func(j *Job, _ *rand.Rand, _ time.Time) { j.Commit(FieldHoseLength, nil) },
	func(j *Job, r *rand.Rand, at time.Time) { j.Started = at },
	func(j *Job, r *rand.Rand, _ time.Time) { j.Resume.Pane = fmt.Sprint(r.IntN(9)) }, // a move: nothing journalled
	func(j *Job, r *rand.Rand, _ time.Time) { // the checklist rebuilt (steps dropped)
		if len(j.Checklist.Steps) > 3 && r.IntN(4) == 0 {
			j.Checklist.Dropped = append(j.Checklist.Dropped, j.Checklist.Steps[len(j.Checklist.Steps)-1])
			j.Checklist.Steps = j.Checklist.Steps[:len(j.Checklist.Steps)-1]
		}
	},
	func(j *Job, r *rand.Rand, _ time.Time) { // an input and the checklist rebuilt for it (the context's figures move)
		j.Set(FieldHoseLength, fmt.Sprintf("%d m", 8+r.IntN(10)))
		j.RebuildChecklist(Compute(*j, presets.Builtin()))
	},
	func(j *Job, _ *rand.Rand, _ time.Time) { // the log cut (never done by the screen; must still replay)
		if len(j.Log) > 2 {
			j.Log = j.Log[:len(j.Log)-2]
		}
	},
}

// encoded is the job file of j without the two entries not journalled on
// their own: the resume position (checkpoints only) and the time stamp
// (written with another change only).
func encoded(t *testing.T, j Job) string {
	t.Helper()
	j.Resume, j.Updated = Resume{}, time.Time{}
	var b bytes.Buffer
	if err := encode(&b, j); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// TestJournalReplay: 2,000 random edits, each recorded; the job file plus
// the journal, read back at random moments and at the end, is the live job
// (the resume position aside, which is written at checkpoints only).
// Checkpoints at random moments drop the records they hold.
func TestJournalReplay(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "job.json")
	j := DemoJob()
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer s.Abandon()
	r := rand.New(rand.NewPCG(15, 1))
	at := t0
	records := 0
	for i := range 2000 {
		at = at.Add(time.Second)
		edits[r.IntN(len(edits))](&j, r, at)
		j.Updated = at
		c, err := s.Record(&j)
		if err != nil {
			t.Fatal(err)
		}
		if c.Recorded {
			records++
		}
		if r.IntN(100) == 0 {
			seq := s.Seq()
			if _, err := s.Checkpoint(j.Clone(), seq); err != nil {
				t.Fatal(err)
			}
			if err := s.Compact(seq); err != nil {
				t.Fatal(err)
			}
		}
		if i%97 == 0 || i == 1999 {
			got, err := Load(path)
			if err != nil {
				t.Fatalf("edit %d: %v", i, err)
			}
			if a, b := encoded(t, got), encoded(t, j); a != b {
				t.Fatalf("edit %d: job file and journal differ from the live job:\n%s", i, firstDiff(a, b))
			}
		}
	}
	t.Logf("2000 edits, %d records", records)
}

func firstDiff(a, b string) string {
	la, lb := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := range min(len(la), len(lb)) {
		if la[i] != lb[i] {
			return fmt.Sprintf("line %d:\n  read back: %s\n  live:      %s", i+1, la[i], lb[i])
		}
	}
	return fmt.Sprintf("lengths %d and %d lines", len(la), len(lb))
}

// TestJournalNothingChanged: a move (the resume position) and a recompute
// that only stamps the time write nothing; an edit writes one line.
func TestJournalNothingChanged(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	j := DemoJob()
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer s.Abandon()
	size := func() int64 {
		fi, err := os.Stat(JournalPath(path))
		if err != nil {
			t.Fatal(err)
		}
		return fi.Size()
	}
	before := size()
	j.Resume = Resume{Pane: "Checklist", StepID: "run.start", Step: 14}
	j.Updated = t0.Add(time.Hour)
	if c, err := s.Record(&j); err != nil || c.Recorded {
		t.Errorf("a move recorded %+v, %v", c, err)
	}
	if size() != before {
		t.Errorf("a move wrote %d bytes", size()-before)
	}
	j.Set(FieldHoseLength, "12.5 m")
	if c, err := s.Record(&j); err != nil || !c.Recorded || c.Checkpoint {
		t.Errorf("an edit: %+v, %v", c, err)
	}
	b, _ := os.ReadFile(JournalPath(path))
	if n := bytes.Count(b, []byte("\n")); n != 2 {
		t.Errorf("journal has %d lines, want the header and one record:\n%s", n, b)
	}
	if !bytes.Contains(b, []byte(`"inputs":{"hose.length":"12.5 m"}`)) || !bytes.Contains(b, []byte(`"updated"`)) {
		t.Errorf("record: %s", b)
	}
	j.Readings = append(j.Readings, Reading{At: t0, Level: 0.3})
	if c, _ := s.Record(&j); !c.Checkpoint {
		t.Error("a reading does not call for a checkpoint")
	}
	if err := j.AddFlowTest(FlowTest{At: t0, Volume: 0.01, Seconds: 12}); err != nil {
		t.Fatal(err)
	}
	if c, _ := s.Record(&j); !c.Checkpoint {
		t.Error("a flow test does not call for a checkpoint")
	}
	b, _ = os.ReadFile(JournalPath(path))
	if !bytes.Contains(b, []byte(`"flow_tests":{"from":0,"add":[{"at":`)) {
		t.Errorf("a flow test is not journalled as an appended entry:\n%s", b)
	}
	j.Checklist.Mark(j.Checklist.Steps[0].ID, StateDone, "", "", t0)
	if c, _ := s.Record(&j); !c.Checkpoint {
		t.Error("a checklist mark does not call for a checkpoint")
	}
}

// TestJournalContextOnly: typing a figure the checklist quotes changes the
// checklist's context and the steps that quote it, not its shape: the
// record holds the context and those steps, not the whole checklist (with a
// 100 KB note on a step that does not change, the record stays small), and
// it calls for no checkpoint; replayed, it gives the live job.
func TestJournalContextOnly(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	j := DemoJob()
	last := j.Checklist.Steps[len(j.Checklist.Steps)-1].ID
	if err := j.Checklist.SetNote(last, strings.Repeat("gas 0 % LEL at the rim; ", 100<<10/24)); err != nil {
		t.Fatal(err)
	}
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer s.Abandon()
	before := j.Checklist.Context
	for _, v := range []string{"12.5 m", "30 m", "14 m"} {
		j.Set(FieldHoseLength, v)
		j.RebuildChecklist(Compute(j, presets.Builtin()))
		fi0, _ := os.Stat(JournalPath(path))
		c, err := s.Record(&j)
		if err != nil || !c.Recorded || c.Checkpoint {
			t.Errorf("hose %s: %+v, %v (want recorded, no checkpoint)", v, c, err)
		}
		fi1, _ := os.Stat(JournalPath(path))
		if n := fi1.Size() - fi0.Size(); n > 8<<10 {
			t.Errorf("hose %s: a record of %d bytes", v, n)
		}
	}
	if j.Checklist.Context == before {
		t.Fatal("the context did not change: the test shows nothing")
	}
	b, _ := os.ReadFile(JournalPath(path))
	if !bytes.Contains(b, []byte(`"checklist_context":`)) || bytes.Contains(b, []byte(`"checklist":`)) {
		t.Errorf("records do not hold the context alone:\n%.2000s", b)
	}
	got, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if encoded(t, got) != encoded(t, j) {
		t.Error("the job file and its journal do not read back as the live job")
	}
}

// TestJournalVersion1: a journal in format version 1 (before
// "checklist_context") still reads and applies.
func TestJournalVersion1(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	s, err := CreateSession(path, DemoJob(), SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	s.Abandon()
	_, mark, _, err := loadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	v1 := `{"schema":"drawdown-journal","version":1,"job":"` + mark.ID + `"}` + "\n" +
		`{"n":` + fmt.Sprint(mark.Seq+1) + `,"inputs":{"hose.length":"30 m"}}` + "\n"
	if err := os.WriteFile(JournalPath(path), []byte(v1), 0o600); err != nil {
		t.Fatal(err)
	}
	got, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if got.Inputs[FieldHoseLength] != "30 m" {
		t.Errorf("a version 1 journal was not applied: hose length %q", got.Inputs[FieldHoseLength])
	}
}

// TestJournalTorn: the journal cut at every byte of its last record (a
// power loss mid-write) reads as the records before it; the cut record is
// reported and left out; the records before are never lost.
func TestJournalTorn(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	j := DemoJob()
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var states []string
	for i := range 4 {
		j.Set(FieldHoseLength, fmt.Sprintf("1%d m", i))
		j.AddLog(t0, fmt.Sprintf("edit %d", i))
		if _, err := s.Record(&j); err != nil {
			t.Fatal(err)
		}
		states = append(states, encoded(t, j))
	}
	s.Abandon()
	full, _ := os.ReadFile(JournalPath(path))
	lastStart := bytes.LastIndexByte(full[:len(full)-1], '\n') + 1
	for cut := lastStart; cut < len(full); cut++ {
		os.WriteFile(JournalPath(path), full[:cut], 0o600)
		got, mark, note, err := loadWithJournal(path)
		if err != nil {
			t.Fatal(err)
		}
		if mark.Seq != 3 || encoded(t, got) != states[2] {
			t.Fatalf("cut at byte %d: read to record %d", cut, mark.Seq)
		}
		if cut > lastStart && !strings.Contains(note, "cut short") {
			t.Errorf("cut at byte %d: note %q", cut, note)
		}
	}
	// Garbage after the last record (a power loss that left zeros).
	os.WriteFile(JournalPath(path), append(append([]byte{}, full...), make([]byte, 100)...), 0o600)
	if got, mark, _, _ := loadWithJournal(path); mark.Seq != 4 || encoded(t, got) != states[3] {
		t.Errorf("zeros after the journal: read to record %d", mark.Seq)
	}
}

// TestJournalForeign: a journal of another state of the file (another
// session ID: an older copy restored, a file replaced by hand) is never
// applied.
func TestJournalForeign(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "job.json")
	j := DemoJob()
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	j.Set(FieldHoseLength, "99 m")
	s.Record(&j)
	s.Abandon()
	// The job file is replaced by a plain save (no journal mark).
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	got, err := Load(path)
	if err != nil || got.Inputs[FieldHoseLength] != "12 m" {
		t.Errorf("a foreign journal was applied: %q, %v", got.Inputs[FieldHoseLength], err)
	}
}

// TestJournalCostFlat: recording an edit costs the same with 10,000
// readings and log lines as with none (it compares the ends of the lists,
// never the lists): the bytes written per edit do not grow, and the time
// per edit stays within 3× (a generous margin on a shared machine; it is
// about 1× measured).
func TestJournalCostFlat(t *testing.T) {
	per := func(n int) (time.Duration, int64) {
		path := filepath.Join(t.TempDir(), "job.json")
		j := DemoJob()
		for i := range n {
			j.Readings = append(j.Readings, Reading{At: t0.Add(time.Duration(i) * time.Minute), Level: 0.3})
			j.AddLog(t0, "level reading")
		}
		s, err := CreateSession(path, j, SessionOptions{})
		if err != nil {
			t.Fatal(err)
		}
		defer s.Abandon()
		const edits = 400
		start := time.Now()
		for i := range edits {
			j.Set(FieldHoseLength, fmt.Sprintf("%d m", 10+i%2))
			if _, err := s.Record(&j); err != nil {
				t.Fatal(err)
			}
		}
		el := time.Since(start)
		fi, _ := os.Stat(JournalPath(path))
		return el / edits, fi.Size() / edits
	}
	best := func(n int) (time.Duration, int64) {
		d, b := per(n)
		for range 2 {
			if d2, _ := per(n); d2 < d {
				d = d2
			}
		}
		return d, b
	}
	d0, b0 := best(0)
	d1, b1 := best(10000)
	t.Logf("per edit: %v and %d bytes with no readings; %v and %d bytes with 10,000", d0, b0, d1, b1)
	if b1 != b0 {
		t.Errorf("bytes per edit grow with the readings: %d → %d", b0, b1)
	}
	if d1 > 3*d0+50*time.Microsecond {
		t.Errorf("time per edit grows with the readings: %v → %v", d0, d1)
	}
}
