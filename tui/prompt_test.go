package tui

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// damagedHome makes a data folder whose last job is a damaged file.
func damagedHome(t *testing.T) (path string, data []byte) {
	t.Helper()
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	os.MkdirAll(dir, 0o700)
	path = filepath.Join(dir, "pump-house.json")
	data = []byte(`{"schema": "drawdown-job", "version": 3, "name": "Pump house", "inputs": {"hose.id": "25 mm"`)
	os.WriteFile(path, data, 0o600)
	if err := model.SetLastJob(path); err != nil {
		t.Fatal(err)
	}
	return path, data
}

// TestDamagedStart: a damaged last job is named on the first screen with
// the reason and three choices; it is never opened as the demo silently.
// k keeps it aside as NAME.damaged, every byte, and opens the demo in a new
// file, saved and recorded as the last job; d opens the demo and leaves
// the file as it is.
func TestDamagedStart(t *testing.T) {
	path, data := damagedHome(t)
	st := OpenStart()
	if st.Prompt == nil || st.Prompt.Kind != PromptDamaged || st.Session != nil {
		t.Fatalf("OpenStart: prompt %+v, session %v", st.Prompt, st.Session)
	}
	m := New(Options{Start: st})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	f := frame(m)
	for _, want := range []string{"The last job cannot be read", "pump-house.json", "not valid JSON", "d  open the demo job",
		"o  open another job", "k  keep the file aside as pump-", "house.json.damaged, every byte"} {
		if !strings.Contains(f, want) {
			t.Errorf("first screen lacks %q:\n%s", want, f)
		}
	}
	if strings.Contains(f, "✓ saved") {
		t.Errorf("a damaged start says saved:\n%s", f)
	}
	m = press(t, m, "k")
	if kept, err := os.ReadFile(path + ".damaged"); err != nil || string(kept) != string(data) {
		t.Errorf("damaged copy: %q, %v", kept, err)
	}
	if _, err := os.Stat(path); !errors.Is(err, os.ErrNotExist) {
		t.Error("the damaged file is still listed as a job")
	}
	if m.ps.prompt != nil || m.ps.sess == nil || m.path == path {
		t.Fatalf("after k: prompt %v, session %v, path %s", m.ps.prompt, m.ps.sess, m.path)
	}
	if j, err := model.Load(m.path); err != nil || j.Name != model.DemoJob().Name {
		t.Errorf("the demo job was not saved: %v", err)
	}
	if last, _ := model.LastJobPath(); last != m.path {
		t.Errorf("last job %q, want %q", last, m.path)
	}
	if !strings.Contains(frame(m), "✓ saved") {
		t.Errorf("no saved mark after the choice:\n%s", frame(m))
	}
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}

	// d: the demo, the damaged file left where it was.
	path, data = damagedHome(t)
	m = New(Options{Start: OpenStart()})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	m = press(t, m, "d")
	if b, _ := os.ReadFile(path); string(b) != string(data) || m.ps.sess == nil {
		t.Errorf("after d: damaged file changed, or no session (%v)", m.ps.sess)
	}
	Finish(m, "")
}

// TestLockedStart: the last job is held by another holder (here another
// lock in this process, which the advisory lock tells apart like another
// process). The first screen names the holder; r shows the job read-only
// and saves nothing; t takes it over, and the old holder loses it.
func TestLockedStart(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, _ := model.JobsDir()
	path := filepath.Join(dir, "pit.json")
	j := model.DemoJob()
	j.Inputs[model.FieldHoseLength] = "17 m"
	if err := model.SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	model.SetLastJob(path)
	other, err := model.AcquireLock(path, model.LockOwner{Server: "10.0.0.5:2222"})
	if err != nil {
		t.Fatal(err)
	}
	defer other.Release()
	st := OpenStart()
	if st.Prompt == nil || st.Prompt.Kind != PromptLocked || !st.ReadOnly {
		t.Fatalf("OpenStart: %+v", st.Prompt)
	}
	m := New(Options{Start: st})
	m = send(t, m, tea.WindowSizeMsg{Width: 100, Height: 30})
	f := frame(m)
	for _, want := range []string{"This job is open in another drawdown", "the drawdown server at 10.0.0.5:2222", "r  open it read-only", "t  take it over"} {
		if !strings.Contains(f, want) {
			t.Errorf("first screen lacks %q:\n%s", want, f)
		}
	}
	// the help line names the prompt's keys, not the pane's behind it
	help := f[strings.LastIndex(strings.TrimRight(f, "\n"), "\n")+1:]
	if !strings.Contains(help, "t take it over") || strings.Contains(help, "save and quit") || strings.Contains(help, "enter") {
		t.Errorf("help line under the lock prompt: %q", help)
	}
	m = press(t, m, "r")
	if !m.ps.readOnly || !m.noSave || !strings.Contains(frame(m), "read-only") {
		t.Errorf("r: read-only %v, not saving %v", m.ps.readOnly, m.noSave)
	}
	m = enterField(t, m, model.FieldHoseLength, "30 m")
	if got, _ := model.Load(path); got.Inputs[model.FieldHoseLength] != "17 m" {
		t.Errorf("read-only saved: %q", got.Inputs[model.FieldHoseLength])
	}
	Finish(m, "")

	// Again, and take it over this time.
	m = New(Options{Start: OpenStart()})
	m = send(t, m, tea.WindowSizeMsg{Width: 100, Height: 30})
	m = press(t, m, "t")
	if m.ps.sess == nil || m.ps.readOnly || m.noSave {
		t.Fatalf("t: session %v, read-only %v, %v %v", m.ps.sess, m.ps.readOnly, m.jobs.err, m.saveErr)
	}
	var lost *model.LockLostError
	if err := other.Held(); !errors.As(err, &lost) {
		t.Errorf("the old holder still holds it: %v", err)
	}
	m = enterField(t, m, model.FieldHoseLength, "31 m")
	if err := Finish(m, ""); err != nil {
		t.Fatal(err)
	}
	if got, _ := model.Load(path); got.Inputs[model.FieldHoseLength] != "31 m" {
		t.Errorf("after the take-over: %q", got.Inputs[model.FieldHoseLength])
	}
}
