package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"drawdown/model"
)

// runIn runs a command with DRAWDOWN_HOME set to home.
func runIn(t *testing.T, home string, args ...string) (string, string, int) {
	t.Helper()
	t.Setenv("DRAWDOWN_HOME", home)
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return out.String(), errb.String(), code
}

// demoWords are the demo scenario's names: none may reach a job that did
// not start from the demo (issue 12 §1).
var demoWords = []string{"Harrowfen", "Marsh", "Okoro", "Pell", "Bund B2", "east ditch"}

func TestNewAndJobs(t *testing.T) {
	home := t.TempDir()
	out, stderr, code := runIn(t, home, "new", "Vault 7 dewatering", "--site", "Elmstead works")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	path := strings.TrimSpace(out)
	if filepath.Dir(path) != filepath.Join(home, "jobs") || filepath.Base(path) != "vault-7-dewatering.json" {
		t.Errorf("path %q", path)
	}
	j, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if j.Name != "Vault 7 dewatering" || j.Site != "Elmstead works" || j.Template != "" || len(j.Inputs) != 0 || len(j.Checklist.Steps) == 0 || j.Date == "" {
		t.Errorf("blank job: %+v", j)
	}
	raw, _ := os.ReadFile(path)
	for _, w := range demoWords {
		if strings.Contains(string(raw), w) {
			t.Errorf("blank job carries the demo's %q", w)
		}
	}
	out, stderr, code = runIn(t, home, "new", "Pump house sump", "--template", "sump-pit", "--units", "us")
	if code != 0 {
		t.Fatalf("template: exit %d: %s", code, stderr)
	}
	s, err := model.Load(strings.TrimSpace(out))
	if err != nil || !s.Facts.ConfinedSpace || s.Units != model.US || s.Template != "sump-pit" {
		t.Errorf("sump-pit job: %+v, %v", s, err)
	}
	// A second job of the same name gets its own file.
	out, _, code = runIn(t, home, "new", "Vault 7 dewatering")
	if code != 0 || filepath.Base(strings.TrimSpace(out)) != "vault-7-dewatering-2.json" {
		t.Errorf("second job: %q", out)
	}
	os.WriteFile(filepath.Join(home, "jobs", "broken.json"), []byte("{"), 0o600)
	out, stderr, code = runIn(t, home, "jobs")
	if code != 0 {
		t.Fatalf("jobs: exit %d: %s", code, stderr)
	}
	for _, want := range []string{"NAME", "SITE", "DATE", "STATE", "Vault 7 dewatering", "Elmstead works", j.Date, "planned", "Pump house sump", "(cannot be read)"} {
		if !strings.Contains(out, want) {
			t.Errorf("jobs lacks %q:\n%s", want, out)
		}
	}
	// The screen's first start in a fresh home opens the demo: new does not
	// change the last-opened job.
	if p, err := model.LastJobPath(); err != nil || p != "" {
		t.Errorf("last job after new = %q, %v", p, err)
	}
}

func TestNewAndJobsUsage(t *testing.T) {
	home := t.TempDir()
	for _, tc := range []struct {
		args []string
		code int
		says string
	}{
		{[]string{"new", "--help"}, 0, "usage: drawdown new"},
		{[]string{"jobs", "--help"}, 0, "usage: drawdown jobs"},
		{[]string{"new"}, 2, "which name?"},
		{[]string{"new", " "}, 2, "which name?"},
		{[]string{"new", "a", "b"}, 2, `unexpected argument "b" after "a"`},
		{[]string{"new", "x", "--template", "lagoon"}, 2, "--template: “lagoon” is not a template; accepted demo, sump-pit, pond"},
		{[]string{"new", "x", "--site"}, 2, "--site needs a value"},
		{[]string{"new", "x", "--site", "yard\x1b[2J"}, 2, "--site: control characters"},
		{[]string{"new", "x", "--units", "furlongs"}, 2, "--units"},
		{[]string{"new", "x", "--colour", "red"}, 2, "unknown flag --colour"},
		{[]string{"jobs", "extra"}, 2, "unexpected argument"},
	} {
		out, stderr, code := runIn(t, home, tc.args...)
		if code != tc.code {
			t.Errorf("%v: exit %d, want %d (%s)", tc.args, code, tc.code, stderr)
		}
		got := stderr
		if tc.code == 0 {
			got = out
		} else if strings.Count(stderr, "\n") != 1 {
			t.Errorf("%v: not one line: %q", tc.args, stderr)
		}
		if !strings.Contains(got, tc.says) {
			t.Errorf("%v: %q lacks %q", tc.args, got, tc.says)
		}
	}
	out, _, code := runIn(t, t.TempDir(), "jobs")
	if code != 0 || !strings.Contains(out, "No jobs yet") {
		t.Errorf("empty jobs folder: %d %q", code, out)
	}
}
