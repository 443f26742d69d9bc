package model

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"time"

	"drawdown/presets"
)

func TestEncodeDecodeRoundTrip(t *testing.T) {
	j := DemoJob()
	j.Readings = []Reading{{At: t0, Level: 0.35, Note: "start"}, {At: t0.Add(10 * time.Minute), Level: 0.31}}
	j.AddLog(t0, "siphon started")
	j.Started = t0
	j.Resume = Resume{Pane: "Checklist", Field: FieldLift, Step: 3, StepID: "x"}
	var buf bytes.Buffer
	if err := encode(&buf, j); err != nil {
		t.Fatal(err)
	}
	first := buf.String()
	got, err := decode(&buf)
	if err != nil {
		t.Fatal(err)
	}
	var again bytes.Buffer
	if err := encode(&again, got); err != nil {
		t.Fatal(err)
	}
	if again.String() != first {
		t.Errorf("encode→decode→encode changed the bytes:\n%s\n---\n%s", first, again.String())
	}
	if got.Resume != j.Resume || got.Units != j.Units || len(got.Inputs) != len(j.Inputs) ||
		!got.Started.Equal(j.Started) || len(got.Readings) != 2 || len(got.Checklist.Steps) != len(j.Checklist.Steps) {
		t.Errorf("round trip lost data: %+v", got)
	}
	if !strings.Contains(first, `"schema": "drawdown-job"`) || !strings.Contains(first, `"version": 3`) ||
		!strings.Contains(first, `"units": "SI"`) {
		t.Errorf("header missing:\n%s", first[:200])
	}
}

func TestEncodeRefusesNaN(t *testing.T) {
	j := NewJob("nan", SI, t0)
	j.Readings = []Reading{{At: t0, Level: math.NaN()}}
	var buf bytes.Buffer
	if err := encode(&buf, j); err == nil {
		t.Error("NaN reading encoded")
	}
	if buf.Len() != 0 {
		t.Error("partial output written")
	}
}

func TestDecodeFixtures(t *testing.T) {
	cases := []struct {
		file string
		err  error
		says string
	}{
		{"job-v3.json", nil, ""},
		{"job-v2.json", nil, ""},
		{"job-v1.json", nil, ""},
		{"job-v0.json", nil, ""},
		{"job-future.json", ErrFutureVersion, "newer drawdown (format version 4; this build reads versions 0 to 3)"},
		{"job-damaged.json", ErrDamaged, "not valid JSON at byte"},
		{"not-a-job.json", ErrNotJob, "not a drawdown job"},
		{"job-minus1.json", ErrDamaged, "format version -1 does not exist"},
		{"job-wrong-type.json", ErrDamaged, `the entry "inputs" holds a list where an object belongs`},
		{"empty.json", ErrDamaged, "empty"},
	}
	for _, c := range cases {
		path := filepath.Join("testdata", c.file)
		j, err := Load(path)
		if c.err == nil {
			if err != nil {
				t.Errorf("%s: %v", c.file, err)
			}
			continue
		}
		if !errors.Is(err, c.err) {
			t.Errorf("%s: error %v does not wrap %v", c.file, err, c.err)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.says) || !strings.Contains(msg, path) || !strings.Contains(msg, "left unchanged") {
			t.Errorf("%s: message %q should name the path, say %q and that the file was left unchanged", c.file, msg, c.says)
		}
		if j.Name != "" {
			t.Errorf("%s: partial job returned", c.file)
		}
	}
}

func TestFixtureFormatStable(t *testing.T) {
	// The v3 fixture must re-encode to the same bytes: the file format of
	// version 3 has not drifted.
	b, err := os.ReadFile(filepath.Join("testdata", "job-v3.json"))
	if err != nil {
		t.Fatal(err)
	}
	j, err := decode(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	encode(&out, j)
	if !bytes.Equal(out.Bytes(), b) {
		t.Errorf("version-3 fixture re-encodes differently; if the format changed on purpose, bump JobVersion and add a migration")
	}
}

// The version-1 demo file (written by the first format, with the crew's
// site facts and two hazard objects inside the checklist context) comes up
// to version 2: facts in site_facts, "environmental" on water as may carry
// oil, crew as names with roles, every checklist mark kept; once rebuilt
// from the job and its plan its checklist equals the demo's own.
func TestMigrateV1Fixture(t *testing.T) {
	for _, name := range []string{"job-v1.json", "job-v0.json"} {
		j, err := Load(filepath.Join("testdata", name))
		if err != nil {
			t.Fatal(err)
		}
		if j.Version != JobVersion {
			t.Errorf("%s: version %d", name, j.Version)
		}
		want := SiteFacts{Discharge: DischargeStorm, MayCarryOil: true}
		if j.Facts != want {
			t.Errorf("%s: site facts %+v, want %+v", name, j.Facts, want)
		}
		if !reflect.DeepEqual(j.Crew, []CrewMember{{Name: "A. Marsh", Role: "lead"}, {Name: "T. Okoro"}}) {
			t.Errorf("%s: crew %+v", name, j.Crew)
		}
		ctx := j.Checklist.Context
		if ctx.Hazards != presets.Of(presets.Environmental) || ctx.Discharge != DischargeStorm || ctx.Method != PrimeHandPump || !ctx.MayCarryOil {
			t.Errorf("%s: migrated context %+v", name, ctx)
		}
		steps := len(j.Checklist.Steps)
		j.RebuildChecklist(Compute(j, presets.Builtin()))
		demo := DemoJob()
		if got, want := unmarked(j.Checklist.Steps), unmarked(demo.Checklist.Steps); !reflect.DeepEqual(got, want) {
			t.Errorf("%s: rebuilt checklist differs from the demo's (%d steps before, %d after, demo %d)", name, steps, len(got), len(want))
		}
	}
	// Version-1 facts the demo does not use: a confined sewage vault with
	// an open edge, "same-site" discharge, a sheen, a fuel's class.
	raw := map[string]json.RawMessage{"schema": json.RawMessage(`"drawdown-job"`), "version": json.RawMessage(`1`),
		"crew": json.RawMessage(`"P. Lund; R. Oyelaran (attendant)"`),
		"checklist": json.RawMessage(`{"context":{"hazards":{"biohazard":true,"environmental":true},"confined_space":true,` +
			`"open_edge":true,"discharge":"same-site","sheen_seen":true,"extra_hazards":{"flammable":true,"flammable_class":"IB"}},"steps":[]}`)}
	b, err := migrate(raw, 1)
	if err != nil {
		t.Fatal(err)
	}
	j, err := decodeBytes(b)
	if err != nil {
		t.Fatal(err)
	}
	want := SiteFacts{ConfinedSpace: true, OpenWater: true, Discharge: DischargeStorm, SheenSeen: true}
	if j.Facts != want || j.Checklist.Context.Class != presets.ClassIB ||
		j.Checklist.Context.Hazards != presets.Of(presets.Biohazard, presets.Environmental, presets.Flammable) {
		t.Errorf("migrated: facts %+v, context %+v", j.Facts, j.Checklist.Context)
	}
	if !reflect.DeepEqual(j.Crew, []CrewMember{{Name: "P. Lund"}, {Name: "R. Oyelaran", Role: "attendant"}}) {
		t.Errorf("crew %+v", j.Crew)
	}
	raw["crew"] = json.RawMessage(`["x"]`)
	raw["version"] = json.RawMessage(`1`)
	if _, err := migrate(raw, 1); err == nil {
		t.Error("a version-1 crew that is not text was accepted")
	}
}

func TestMigrateHook(t *testing.T) {
	// A stand-in step from a pretend version -1 that called the name
	// "title": the hook runs each step and stamps the current version.
	migrations[-1] = func(raw map[string]json.RawMessage) error {
		raw["name"] = raw["title"]
		delete(raw, "title")
		return nil
	}
	t.Cleanup(func() { delete(migrations, -1) })
	raw := map[string]json.RawMessage{
		"schema": json.RawMessage(`"drawdown-job"`), "version": json.RawMessage(`-1`),
		"title": json.RawMessage(`"old pit"`),
	}
	b, err := migrate(raw, -1)
	if err != nil {
		t.Fatal(err)
	}
	j, err := decodeBytes(b)
	if err != nil || j.Name != "old pit" || j.Version != JobVersion {
		t.Errorf("migrated job = %+v, %v", j, err)
	}
}

func TestMigrateUnknownVersion(t *testing.T) {
	if _, err := migrate(map[string]json.RawMessage{}, -2); err == nil || !strings.Contains(err.Error(), "no conversion from version -2") {
		t.Errorf("migrate(-2): %v", err)
	}
}

func TestSaveAtomicAndLoad(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "sub", "job.json")
	j := DemoJob()
	if err := SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if runtime.GOOS != "windows" && fi.Mode().Perm() != 0o600 {
		t.Errorf("mode %v, want 0600 (issue 6 §4)", fi.Mode().Perm())
	}
	j.Inputs[FieldLift] = "0.7 m"
	if err := SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	got, err := Load(path)
	if err != nil || got.Inputs[FieldLift] != "0.7 m" {
		t.Fatalf("Load = %v, %v", got.Inputs[FieldLift], err)
	}
	left, _ := filepath.Glob(filepath.Join(dir, "sub", ".*tmp*"))
	if len(left) != 0 {
		t.Errorf("temporary files left: %v", left)
	}
}

func TestSaveAtomicNeverOverwritesUnreadable(t *testing.T) {
	for _, fixture := range []string{"job-damaged.json", "job-future.json", "not-a-job.json"} {
		dir := t.TempDir()
		path := filepath.Join(dir, "job.json")
		orig, _ := os.ReadFile(filepath.Join("testdata", fixture))
		os.WriteFile(path, orig, 0o600)
		err := SaveAtomic(path, DemoJob())
		if !errors.Is(err, ErrWouldOverwrite) || !strings.Contains(err.Error(), path) || !strings.Contains(err.Error(), "not overwritten") {
			t.Errorf("%s: SaveAtomic = %v", fixture, err)
		}
		now, _ := os.ReadFile(path)
		if !bytes.Equal(now, orig) {
			t.Errorf("%s: file changed", fixture)
		}
		// What the first screen's "keep it aside" does (SetAsideDamaged):
		// every byte kept, then the path is free for a new save.
		keep, err := SetAsideDamaged(path)
		if err != nil || keep != path+".damaged" {
			t.Fatalf("%s: SetAsideDamaged = %q, %v", fixture, keep, err)
		}
		kept, _ := os.ReadFile(keep)
		if !bytes.Equal(kept, orig) {
			t.Errorf("%s: damaged copy differs", fixture)
		}
		if err := SaveAtomic(path, DemoJob()); err != nil {
			t.Errorf("%s: save after setting aside: %v", fixture, err)
		}
		if _, err := Load(path); err != nil {
			t.Errorf("%s: after setting aside: %v", fixture, err)
		}
		// A second one keeps the first copy and makes another.
		os.WriteFile(path, []byte("{"), 0o600)
		keep2, err := SetAsideDamaged(path)
		if err != nil || keep2 != path+".damaged-2" {
			t.Errorf("%s: second SetAsideDamaged = %q, %v", fixture, keep2, err)
		}
	}
}

func TestHomeAndLastJob(t *testing.T) {
	home := t.TempDir()
	t.Setenv("DRAWDOWN_HOME", home)
	d, err := JobsDir()
	if err != nil || d != filepath.Join(home, "jobs") {
		t.Errorf("JobsDir = %q, %v", d, err)
	}
	if p, err := LastJobPath(); err != nil || p != "" {
		t.Errorf("LastJobPath before any = %q, %v", p, err)
	}
	path := filepath.Join(d, "a.json")
	if err := SetLastJob(path); err != nil {
		t.Fatal(err)
	}
	if p, err := LastJobPath(); err != nil || p != path {
		t.Errorf("LastJobPath = %q, %v", p, err)
	}
	t.Setenv("DRAWDOWN_HOME", "")
	xdg := t.TempDir()
	t.Setenv("XDG_DATA_HOME", xdg)
	if d, _ := JobsDir(); d != filepath.Join(xdg, "drawdown", "jobs") {
		t.Errorf("JobsDir with XDG_DATA_HOME = %q", d)
	}
}

func TestJobPathsAndList(t *testing.T) {
	if got := JobFileName("Bund B2 — rainwater release!"); got != "bund-b2-rainwater-release.json" {
		t.Errorf("JobFileName = %q", got)
	}
	if got := JobFileName("../../etc"); got != "etc.json" {
		t.Errorf("JobFileName(../../etc) = %q", got)
	}
	dir := t.TempDir()
	p1 := NewJobPath(dir, "Pit 3")
	if err := SaveAtomic(p1, NewJob("Pit 3", SI, t0)); err != nil {
		t.Fatal(err)
	}
	p2 := NewJobPath(dir, "Pit 3")
	if p2 == p1 || filepath.Base(p2) != "pit-3-2.json" {
		t.Errorf("NewJobPath = %q after %q", p2, p1)
	}
	later := NewJob("Vault 7", US, t0)
	later.Updated = t0.Add(time.Hour)
	SaveAtomic(p2, later)
	os.WriteFile(filepath.Join(dir, "broken.json"), []byte("{"), 0o600)
	list, err := ListJobs(dir)
	if err != nil || len(list) != 3 {
		t.Fatalf("ListJobs = %v, %v", list, err)
	}
	var names []string
	for _, s := range list {
		if s.Err != nil {
			names = append(names, "!")
		} else {
			names = append(names, s.Name)
		}
	}
	if !strings.Contains(strings.Join(names, ","), "Vault 7,Pit 3") || !strings.Contains(strings.Join(names, ","), "!") {
		t.Errorf("ListJobs order/contents: %v", names)
	}
}

func FuzzDecode(f *testing.F) {
	for _, name := range []string{"job-v2.json", "job-v1.json", "job-future.json", "job-damaged.json", "not-a-job.json", "job-v0.json", "job-wrong-type.json"} {
		b, err := os.ReadFile(filepath.Join("testdata", name))
		if err != nil {
			f.Fatal(err) // a missing fixture fails, never skips
		}
		f.Add(b)
	}
	var buf bytes.Buffer
	encode(&buf, NewJob("x", US, t0))
	f.Add(buf.Bytes())
	f.Add([]byte(`{"schema":"drawdown-job","version":1,"inputs":{"lift":"\u0000"},"units":"us"}`))
	f.Add([]byte(`{"schema":"drawdown-job","version":1,"readings":[{"at":"2026-01-01T00:00:00+05:30","level_m":1e308}]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		j, err := decode(bytes.NewReader(data))
		if err != nil {
			var fe *JobFileError
			if !errors.As(err, &fe) || fe.Detail == "" {
				t.Fatalf("error %v is not a *JobFileError with a message", err)
			}
			return
		}
		var b1, b2 bytes.Buffer
		if err := encode(&b1, j); err != nil {
			t.Fatalf("decoded job does not encode: %v", err)
		}
		j2, err := decode(bytes.NewReader(b1.Bytes()))
		if err != nil {
			t.Fatalf("encoded job does not decode: %v\n%s", err, b1.String())
		}
		if err := encode(&b2, j2); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(b1.Bytes(), b2.Bytes()) {
			t.Fatalf("encode→decode→encode differs:\n%s\n---\n%s", b1.String(), b2.String())
		}
	})
}

// The kill test (issue 6 §4): a writer process saves successive versions of
// a job as fast as it can and is killed (SIGKILL on Unix) at a random moment,
// many times over. After every kill the file must load and hold either the
// last save the writer reported complete or the one in flight, whole.

const killEnv = "DRAWDOWN_KILL_TEST_FILE"

// killPayload builds save number n: its log length and notes are tied to n
// so that a file mixing two saves would be caught.
func killPayload(n int) Job {
	j := DemoJob()
	j.Name = "kill test"
	j.Notes = "save " + strconv.Itoa(n)
	for i := 0; i < 200+n%50; i++ {
		j.AddLog(t0.Add(time.Duration(i)*time.Second), fmt.Sprintf("entry %d of save %d %s", i, n, strings.Repeat("·", 100)))
	}
	return j
}

func checkKillFile(j Job) (int, error) {
	n, err := strconv.Atoi(strings.TrimPrefix(j.Notes, "save "))
	if err != nil {
		return 0, fmt.Errorf("notes %q", j.Notes)
	}
	if len(j.Log) != 200+n%50 {
		return 0, fmt.Errorf("save %d has %d log entries, want %d", n, len(j.Log), 200+n%50)
	}
	for i, e := range j.Log {
		if !strings.HasPrefix(e.Text, fmt.Sprintf("entry %d of save %d ", i, n)) {
			return 0, fmt.Errorf("save %d log entry %d is %q", n, i, e.Text[:30])
		}
	}
	return n, nil
}

// TestKillWriterProcess is the writer; it runs only when started by
// TestKillDuringSave.
func TestKillWriterProcess(t *testing.T) {
	path := os.Getenv(killEnv)
	if path == "" {
		t.Skip("writer process for TestKillDuringSave")
	}
	n := 0
	if j, err := Load(path); err == nil {
		if n, err = checkKillFile(j); err != nil {
			fmt.Println("bad", err)
			os.Exit(3)
		}
	}
	fmt.Println("ready")
	for {
		n++
		if err := SaveAtomic(path, killPayload(n)); err != nil {
			fmt.Println("error", err)
			os.Exit(3)
		}
		fmt.Println("saved", n)
	}
}

func TestKillDuringSave(t *testing.T) {
	if runtime.GOOS == "js" || runtime.GOOS == "wasip1" {
		t.Skip("no processes")
	}
	rounds, budget := 80, 25*time.Second
	if testing.Short() {
		rounds, budget = 10, 10*time.Second
	}
	path := filepath.Join(t.TempDir(), "job.json")
	rng := rand.New(rand.NewPCG(6, 4))
	start := time.Now()
	last, done, saves, inFlight := 0, 0, 0, 0
	saveTime := 5 * time.Millisecond // running estimate of one save
	for done < rounds && time.Since(start) < budget {
		cmd := exec.Command(os.Args[0], "-test.run=^TestKillWriterProcess$", "-test.count=1")
		cmd.Env = append(os.Environ(), killEnv+"="+path)
		out, err := cmd.StdoutPipe()
		if err != nil {
			t.Fatal(err)
		}
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		sc := bufio.NewScanner(out)
		if !sc.Scan() || sc.Text() != "ready" {
			cmd.Process.Kill()
			cmd.Wait()
			t.Fatalf("round %d: writer did not start: %q", done, sc.Text())
		}
		// Kill at a random moment: after a random number (0–4) of saves
		// this round, plus a random part of the time one save takes, so
		// that kills fall before, during and between writes.
		lines := make(chan string, 1024)
		go func() {
			for sc.Scan() {
				lines <- sc.Text()
			}
			close(lines)
		}()
		roundStart := time.Now()
		wantSaves, got := rng.IntN(5), 0
		var tail []string
	wait:
		for got < wantSaves {
			select {
			case line, ok := <-lines:
				if !ok {
					break wait
				}
				tail = append(tail, line)
				got++
			case <-time.After(5 * time.Second):
				break wait
			}
		}
		perSave := saveTime
		if got > 0 {
			perSave = time.Since(roundStart) / time.Duration(got)
			saveTime = (saveTime + perSave) / 2
		}
		time.Sleep(time.Duration(rng.Int64N(int64(2*perSave) + 1)))
		cmd.Process.Kill()
		for line := range lines {
			tail = append(tail, line)
		}
		for _, line := range tail {
			if n, ok := strings.CutPrefix(line, "saved "); ok {
				last, _ = strconv.Atoi(n)
				saves++
			} else {
				t.Fatalf("round %d: writer said %q", done, line)
			}
		}
		cmd.Wait()
		if last == 0 {
			done++
			continue // killed before the first save ever completed
		}
		j, err := Load(path)
		if err != nil {
			t.Fatalf("round %d: after kill the file does not load: %v", done, err)
		}
		n, err := checkKillFile(j)
		if err != nil {
			t.Fatalf("round %d: %v", done, err)
		}
		// The file holds the last reported save, or the one in flight
		// (renamed before the writer could report it).
		if n != last && n != last+1 {
			t.Fatalf("round %d: file holds save %d; last completed %d", done, n, last)
		}
		if n == last+1 {
			inFlight++
		}
		last = n
		done++
	}
	temps, _ := filepath.Glob(filepath.Join(filepath.Dir(path), ".job.json.tmp-*"))
	t.Logf("%d kills in %v; %d saves reported; %d kills caught a save renamed but not yet reported; %d stray temporary files (removed by later saves after %v)",
		done, time.Since(start).Round(time.Millisecond), saves, inFlight, len(temps), staleTemp)
	if done < 10 {
		t.Errorf("only %d kill rounds ran", done)
	}
}

func TestStoreErrorsAndHousekeeping(t *testing.T) {
	dir := t.TempDir()
	// A missing file: the message names the path.
	missing := filepath.Join(dir, "nope.json")
	if _, err := Load(missing); err == nil || !strings.Contains(err.Error(), missing) || !errors.Is(err, os.ErrNotExist) {
		t.Errorf("Load(missing) = %v", err)
	}
	// A folder that cannot be made (a file is in the way).
	blocker := filepath.Join(dir, "file")
	os.WriteFile(blocker, nil, 0o600)
	if err := SaveAtomic(filepath.Join(blocker, "job.json"), DemoJob()); err == nil {
		t.Error("SaveAtomic under a file succeeded")
	}
	// A stale temporary file left by a killed writer goes at the next save;
	// a fresh one (another writer's save in flight) stays.
	path := filepath.Join(dir, "job.json")
	stale := filepath.Join(dir, ".job.json.tmp-111")
	fresh := filepath.Join(dir, ".job.json.tmp-222")
	os.WriteFile(stale, []byte("{"), 0o600)
	os.WriteFile(fresh, []byte("{"), 0o600)
	old := time.Now().Add(-2 * staleTemp)
	os.Chtimes(stale, old, old)
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(stale); !errors.Is(err, os.ErrNotExist) {
		t.Error("stale temporary file kept")
	}
	if _, err := os.Stat(fresh); err != nil {
		t.Error("fresh temporary file removed")
	}
}

func TestHomeFallback(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", "")
	t.Setenv("XDG_DATA_HOME", "relative/ignored") // XDG requires an absolute path
	h := t.TempDir()
	t.Setenv("HOME", h)
	got, err := Home()
	if err != nil {
		t.Fatal(err)
	}
	if runtime.GOOS == "linux" && got != filepath.Join(h, ".local", "share", "drawdown") {
		t.Errorf("Home = %q", got)
	}
}

// encode and decode put the shipped encodeBytes and decodeBytes (what
// SaveAtomic and Load call) over a buffer, for the round-trip tests.
func encode(w *bytes.Buffer, j Job) error {
	b, err := encodeBytes(j)
	if err != nil {
		return err
	}
	w.Write(b)
	return nil
}

func decode(r io.Reader) (Job, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return Job{}, err
	}
	return decodeBytes(data)
}
