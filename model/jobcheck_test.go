package model

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// nested is a job file with the inputs object wrapped n deep in lists.
func nested(n int) []byte {
	return []byte(`{"schema": "drawdown-job", "version": 3, "name": "deep", "notes": ` +
		strings.Repeat("[", n) + strings.Repeat("]", n) + `}`)
}

// TestJobBoundsLinear: the bounds scan takes a number of steps linear in
// the file's size, whatever its shape (counted, not timed, so that a busy
// machine cannot fail it), and refuses a file past 64 levels or a
// 1,024-character key path before the decoder sees it; a 48 KB file nested
// 16,000 deep (the shape that cost the preset reader 42 s) is refused at
// once.
func TestJobBoundsLinear(t *testing.T) {
	shapes := map[string]func(n int) []byte{
		"flat list": func(n int) []byte { return []byte(`{"log": [` + strings.Repeat(`{"text": "a"},`, n) + `{}]}`) },
		"long text": func(n int) []byte { return []byte(`{"notes": "` + strings.Repeat(`ab\"`, n) + `"}`) },
		"deep at 64, repeated": func(n int) []byte {
			return []byte(`{"x": [` + strings.Repeat(strings.Repeat("[", 62)+strings.Repeat("]", 62)+",", n) + `0]}`)
		},
		"many keys": func(n int) []byte { return []byte(`{"inputs": {` + strings.Repeat(`"k": "v",`, n) + `"z": "v"}}`) },
	}
	for name, make := range shapes {
		var ratios []float64
		for _, n := range []int{100, 1600} {
			data := make(n)
			b := jsonBounds{data: data}
			if err := b.run(); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			ratios = append(ratios, float64(b.steps)/float64(len(data)))
		}
		if ratios[1] > 1.05*ratios[0] || ratios[1] > 1.01 {
			t.Errorf("%s: steps per byte %.3f at 100, %.3f at 1,600: not linear", name, ratios[0], ratios[1])
		}
	}
	// The limits, both sides.
	if err := checkJSONBounds(nested(63)); err != nil { // 63 lists inside the job object: 64 levels
		t.Errorf("64 levels refused: %v", err)
	}
	if err := checkJSONBounds(nested(64)); !errors.Is(err, ErrTooDeep) {
		t.Errorf("65 levels: %v", err)
	}
	key := func(n int) []byte { return []byte(`{"inputs": {"` + strings.Repeat("k", n) + `": "v"}}`) }
	if err := checkJSONBounds(key(1024 - len("inputs."))); err != nil {
		t.Errorf("a key path of 1,024 characters refused: %v", err)
	}
	if err := checkJSONBounds(key(1025 - len("inputs."))); !errors.Is(err, ErrKeyPathTooLong) {
		t.Errorf("a key path of 1,025 characters: %v", err)
	}
	start := time.Now()
	_, err := decode(bytes.NewReader(nested(16000)))
	if !errors.Is(err, ErrTooDeep) || !errors.Is(err, ErrDamaged) {
		t.Errorf("16,000 deep: %v", err)
	}
	t.Logf("a %d-byte file nested 16,000 deep refused in %v", len(nested(16000)), time.Since(start))
}

// badJobs is the bad-input table for job files: each answer is one line in
// words that names the entry and what it accepts, never a Go type name.
var badJobs = []struct {
	name, file string
	err        error
	says       string
}{
	{"nested 65 deep", string(nested(64)), ErrTooDeep, "more than 64 levels of objects and lists"},
	{"key path over 1,024", `{"inputs": {"` + strings.Repeat("k", 1100) + `": "v"}}`, ErrKeyPathTooLong, "key path longer than 1024 characters"},
	{"reading of 1e300 m", `{"schema": "drawdown-job", "version": 3, "readings": [{"at": "2026-03-14T09:00:00Z", "level_m": 1e300}]}`,
		ErrDamaged, "reading 1 of 1: level 1e+300 m is out of range; accepted 0 to 1000 m"},
	{"reading of −5 m", `{"schema": "drawdown-job", "version": 3, "readings": [{"at": "2026-03-14T09:00:00Z", "level_m": 0.3}, {"at": "2026-03-14T09:05:00Z", "level_m": -5}]}`,
		ErrDamaged, "reading 2 of 2: level -5 m is below the tank floor; accepted 0 to 1000 m, measured up from the floor"},
	{"flow test of no time", `{"schema": "drawdown-job", "version": 3, "flow_tests": [{"at": "2026-03-14T09:00:00Z", "volume_m3": 0.01, "seconds": 0}]}`,
		ErrDamaged, "flow test 1 of 1: time out of range; accepted more than 0 to 3600 s"},
	{"flow test of 1e300 m³", `{"schema": "drawdown-job", "version": 3, "flow_tests": [{"at": "2026-03-14T09:00:00Z", "volume_m3": 1e300, "seconds": 12}]}`,
		ErrDamaged, "flow test 1 of 1: volume out of range; accepted more than 0 to 10 m³"},
	{"reading without a time", `{"schema": "drawdown-job", "version": 3, "readings": [{"level_m": 0.2}]}`, ErrDamaged, "reading 1 of 1: a time is required"},
	{"level as text", `{"schema": "drawdown-job", "version": 3, "readings": [{"at": "2026-03-14T09:00:00Z", "level_m": "high"}]}`,
		ErrDamaged, `the entry "readings.level_m" holds text where a number belongs`},
	{"a number past float range", `{"schema": "drawdown-job", "version": 3, "readings": [{"at": "2026-03-14T09:00:00Z", "level_m": 1e400}]}`,
		ErrDamaged, `the entry "readings.level_m" holds a number (1e400), too large to be read`},
	{"a time that does not read", `{"schema": "drawdown-job", "version": 3, "created": "yesterday"}`,
		ErrDamaged, `the time "yesterday" does not read; times are written like 2026-03-14T09:05:00Z`},
	{"inputs as a list", `{"schema": "drawdown-job", "version": 3, "inputs": ["38 mm"]}`, ErrDamaged, `the entry "inputs" holds a list where an object belongs`},
	{"crew as a number", `{"schema": "drawdown-job", "version": 3, "crew": 3}`, ErrDamaged, `the entry "crew" holds a number where a list belongs`},
	{"a draft of no kind", `{"schema": "drawdown-job", "version": 3, "draft": {"kind": "poem", "text": "x"}}`, ErrDamaged, `the draft's kind "poem" is not one of field, note, reason, reading`},
	{"units unknown", `{"schema": "drawdown-job", "version": 3, "units": "furlongs"}`, ErrDamaged, `unit system "furlongs" not known; accepted SI or US`},
	{"a list, not a job", `[1, 2]`, ErrDamaged, "the file holds a list, not a job object"},
	{"cut short", `{"schema": "drawdown-job", "version": 3, "name": "pit`, ErrDamaged, "not valid JSON at byte"},
	{"the journal entry wrong", `{"schema": "drawdown-job", "version": 3, "journal": "x"}`, ErrDamaged, `the "journal" entry is not an object`},
}

// goWords are signs of Go's own words in a message.
var goWords = []string{"float64", "int64", "uint64", "[]", "map[", "Go struct", "Go value", "json:", "model.", "*model", "time.Time", "2006-01-02"}

// TestJobFileBadInput: each bad job file in the table is refused with its
// answer, in one line, with the path, saying the file was left unchanged,
// and with no Go type name in it. The answers are listed in the README's
// Reliability section.
func TestJobFileBadInput(t *testing.T) {
	dir := t.TempDir()
	for _, c := range badJobs {
		path := filepath.Join(dir, "bad.json")
		os.WriteFile(path, []byte(c.file), 0o600)
		_, err := Load(path)
		if !errors.Is(err, c.err) {
			t.Errorf("%s: %v, want %v", c.name, err, c.err)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.says) || !strings.Contains(msg, path) || !strings.Contains(msg, "left unchanged") || strings.Contains(msg, "\n") {
			t.Errorf("%s: %q\n  want one line with the path, %q and \"left unchanged\"", c.name, msg, c.says)
		}
		for _, w := range goWords {
			if strings.Contains(strings.ReplaceAll(msg, path, "PATH"), w) {
				t.Errorf("%s: %q uses Go's words (%q)", c.name, msg, w)
			}
		}
		t.Logf("%-28s → %s", c.name, strings.TrimPrefix(msg, "job file "+path+": "))
	}
}

// TestNewReadingRange: a typed level below the floor or past the range is
// refused in the user's units.
func TestNewReadingRange(t *testing.T) {
	cases := []struct {
		text string
		sys  System
		says string
	}{
		{"-5 m", SI, `level reading "-5 m" is below the tank floor; accepted 0 to 1000 m, measured up from the tank floor`},
		{"-2 ft", US, `level reading "-2 ft" is below the tank floor; accepted 0 to 3281 ft`},
		{"2 km", SI, `cannot read "2 km" as a length`},
		{"1e300", SI, "number too large"},
		{"1500 m", SI, `level reading "1500 m" is out of range; accepted 0 to 1000 m`},
	}
	for _, c := range cases {
		_, err := NewReading(c.text, c.sys, t0, "")
		if err == nil || !strings.Contains(err.Error(), c.says) {
			t.Errorf("%q: %v; want %q", c.text, err, c.says)
		}
		if err != nil && len(err.Error()) > 200 {
			t.Errorf("%q: %d characters", c.text, len(err.Error()))
		}
		t.Logf("typed %-8q → %v", c.text, err)
	}
	if _, err := NewReading("0 m", SI, t0, ""); err != nil {
		t.Errorf("a level on the floor: %v", err)
	}
}

// FuzzReadJournal: any journal file reads without a panic, and replaying
// it onto the demo job never panics and leaves a job that encodes.
//
// ci-fuzz-execs: 50000 (each input replays a journal onto a whole job)
func FuzzReadJournal(f *testing.F) {
	f.Add([]byte(`{"schema":"drawdown-journal","version":1,"job":"a"}` + "\n" + `{"n":1,"inputs":{"hose.length":"3 m"}}` + "\n"))
	f.Add([]byte(`{"schema":"drawdown-journal","version":1,"job":"a"}` + "\n" + `{"n":1,"steps":{"99":{}}}` + "\n"))
	f.Add([]byte(`{"schema":"drawdown-journal","version":1,"job":"a"}` + "\n" + `{"n":1,"log":{"from":-1,"add":[]}}` + "\n"))
	f.Add([]byte(`{"schema":"drawdown-journal","version":1,"job":"a"}` + "\n" + `{"n":1,"set":{"name":3,"checklist":{"steps":[]}}}` + "\n"))
	f.Add([]byte(`{"schema":"drawdown-journal","version":9,"job":"a"}` + "\n"))
	f.Add([]byte("{\"n\":2}\n\x00\x00"))
	demo := DemoJob()
	f.Fuzz(func(t *testing.T, data []byte) {
		jl, err := parseJournal(bytes.NewReader(data))
		if err != nil {
			return
		}
		j := demo.Clone()
		jl.replay(&j, JournalMark{ID: "a"})
		if checkJob(&j) == nil {
			var b bytes.Buffer
			if err := encode(&b, j); err != nil {
				t.Fatalf("a replayed job does not encode: %v", err)
			}
		}
	})
}

// FuzzLockFile: any lock file reads without a panic; a lock file that no
// process holds never keeps a job from being opened, whatever it holds.
//
// ci-fuzz-execs: 50000 (each input writes and locks a real file)
func FuzzLockFile(f *testing.F) {
	f.Add([]byte(`{"schema":"drawdown-lock","version":1,"pid":4121,"host":"van-2","since":"2026-03-14T09:00:05Z","token":"ab"}`))
	f.Add([]byte(`{"schema":"drawdown-lock","pid":-1,"since":"x"}`))
	f.Add([]byte("\x00\xff"))
	dir := f.TempDir()
	job := filepath.Join(dir, "job.json")
	f.Fuzz(func(t *testing.T, data []byte) {
		os.WriteFile(LockPath(job), data, 0o600)
		if _, held, err := ReadLock(job); err != nil || held {
			t.Fatalf("a lock file no process holds: held %v, %v", held, err)
		}
	})
}

// TestStaleLockGarbage: a lock file no process holds never keeps a job
// from being opened, whatever it holds (cut short, another program's, a
// record of a process long gone).
func TestStaleLockGarbage(t *testing.T) {
	job := filepath.Join(t.TempDir(), "job.json")
	for _, data := range []string{"", "{", "\x00\xff", `{"schema":"drawdown-lock","pid":1,"host":"elsewhere","token":"x"}`, `[]`} {
		os.WriteFile(LockPath(job), []byte(data), 0o600)
		l, err := AcquireLock(job, LockOwner{})
		if err != nil {
			t.Errorf("lock file %q keeps the job: %v", data, err)
			continue
		}
		l.Release()
	}
}
