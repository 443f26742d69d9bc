package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"drawdown/model"
	"drawdown/presets"
)

func completeValues(t *testing.T, words ...string) ([]string, string) {
	t.Helper()
	cands, path := completeWords(words, func() *presets.Catalogue { return loadCatalogue(nil) })
	var out []string
	for _, c := range cands {
		out = append(out, c.value)
	}
	return out, path
}

// TestCompleteWords: what Tab offers after each kind of word. The catalogue
// IDs come from the built-in catalogue at completion time.
func TestCompleteWords(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	cat := presets.Builtin()
	cases := []struct {
		words []string
		want  []string // all of these offered
		never []string // none of these
		path  string
	}{
		{[]string{""}, []string{"calc", "presets", "report", "help", "version", "completion"}, []string{"__complete"}, ""},
		{[]string{"ca"}, []string{"calc"}, []string{"presets"}, ""},
		{[]string{"--"}, []string{"--help", "--version"}, nil, ""},
		{[]string{"help", ""}, []string{"calc", "report"}, nil, ""},
		{[]string{"completion", ""}, []string{"bash", "zsh", "fish"}, nil, ""},
		{[]string{"calc", "--li"}, []string{"--liquid", "--lift"}, []string{"--level"}, ""},
		{[]string{"calc", "--lift", "1m", "--li"}, []string{"--liquid"}, []string{"--lift"}, ""},                // given once
		{[]string{"calc", "--fitting", "coupling", "--fi"}, []string{"--fitting"}, nil, ""},                     // repeatable
		{[]string{"calc", "--liquid", "wa"}, []string{"water", "wastewater"}, []string{"gasoline"}, ""},         // catalogue liquids
		{[]string{"calc", "--liquid=wa"}, []string{"--liquid=water"}, nil, ""},                                  // zsh, fish
		{[]string{"calc", "--liquid", "=", "wa"}, []string{"water"}, nil, ""},                                   // bash splits at =
		{[]string{"calc", "--hose", ""}, []string{cat.Hoses()[0].ID}, nil, ""},                                  // hose sizes
		{[]string{"calc", "--material", ""}, []string{cat.Materials()[0].ID}, nil, ""},                          // materials
		{[]string{"calc", "--fitting", "coupling,ball"}, []string{"coupling,ball-valve"}, nil, ""},              // after the comma
		{[]string{"calc", "--tank-preset", ""}, []string{cat.Tanks()[0].ID}, []string{"custom"}, ""},            // tanks
		{[]string{"calc", "--priming", ""}, []string{string(model.PrimingMethods()[0])}, []string{"mouth"}, ""}, // never by mouth
		{[]string{"calc", "--tank", ""}, []string{"vertical-cylinder", "sphere", "table"}, nil, ""},
		{[]string{"calc", "--receiver", ""}, []string{"rectangular"}, []string{"table"}, ""},
		{[]string{"calc", "--units", ""}, []string{"si", "us"}, nil, ""},
		{[]string{"calc", "--tank-table", ""}, nil, nil, "file"},
		{[]string{"calc", "--lift", ""}, nil, nil, ""}, // a number: nothing to offer
		{[]string{"report", ""}, nil, nil, "file"},
		{[]string{"report", "job", "--out", ""}, nil, nil, "dir"},
		{[]string{"report", "--s"}, []string{"--stdout"}, nil, ""},
		{[]string{"nope", "--"}, []string{"--help"}, nil, ""},
	}
	for _, c := range cases {
		got, path := completeValues(t, c.words...)
		for _, w := range c.want {
			if !slices.Contains(got, w) {
				t.Errorf("%q: %q not offered (got %v)", c.words, w, got)
			}
		}
		for _, n := range c.never {
			if slices.Contains(got, n) {
				t.Errorf("%q: %q offered", c.words, n)
			}
		}
		if path != c.path {
			t.Errorf("%q: path completion %q, want %q", c.words, path, c.path)
		}
	}
	// Every liquid of the catalogue is offered.
	got, _ := completeValues(t, "calc", "--liquid", "")
	for _, l := range cat.Liquids() {
		if !slices.Contains(got, l.ID) {
			t.Errorf("liquid %s not offered", l.ID)
		}
	}
}

// TestCompleteUserPresets: a liquid from the user's presets file is offered,
// read at completion time.
func TestCompleteUserPresets(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	cfg := t.TempDir()
	t.Setenv("XDG_CONFIG_HOME", cfg)
	path := presets.UserFile()
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	// The user file format of presets/doc.go.
	toml := "[[hose]]\nid = \"63mm\"\ninside_diameter_mm = 63\nsource = \"measured (invented)\"\n"
	if err := os.WriteFile(path, []byte(toml), 0o644); err != nil {
		t.Fatal(err)
	}
	got, _ := completeValues(t, "calc", "--hose", "63")
	if !slices.Contains(got, "63mm") {
		t.Errorf("user hose not offered: %v", got)
	}
}

// TestCompleteJobs: report completes the names of the jobs in the jobs
// folder.
func TestCompleteJobs(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	if err := model.SaveAtomic(filepath.Join(dir, "bund-b2.json"), model.DemoJob()); err != nil {
		t.Fatal(err)
	}
	got, path := completeValues(t, "report", "bu")
	if !slices.Contains(got, "bund-b2") || path != "file" {
		t.Errorf("got %v, path %q", got, path)
	}
}

// TestCompleteCommand: the hidden command prints value<TAB>note lines and
// the path directive last.
func TestCompleteCommand(t *testing.T) {
	out, _, code := runCmd(t, "__complete", "calc", "--tank", "sph")
	if code != 0 || out != "sphere\tsphere\n" {
		t.Errorf("exit %d %q", code, out)
	}
	out, _, _ = runCmd(t, "__complete", "calc", "--tank-table", "")
	if out != ":file\n" {
		t.Errorf("%q", out)
	}
}

// fakeDrawdown puts a "drawdown" on PATH that runs this test binary as
// drawdown, for the shells to call.
func fakeDrawdown(t *testing.T) string {
	t.Helper()
	bin := t.TempDir()
	// GORACE: a race-enabled binary otherwise sleeps 1 s at exit.
	script := "#!/bin/sh\nDRAWDOWN_TEST_MAIN=1 GORACE=atexit_sleep_ms=0 exec " + shellQuote(os.Args[0]) + " \"$@\"\n"
	if err := os.WriteFile(filepath.Join(bin, "drawdown"), []byte(script), 0o755); err != nil {
		t.Fatal(err)
	}
	t.Setenv("PATH", bin+string(os.PathListSeparator)+os.Getenv("PATH"))
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	return bin
}

func shellQuote(s string) string { return "'" + strings.ReplaceAll(s, "'", `'\''`) + "'" }

func shell(t *testing.T, name string, args ...string) string {
	t.Helper()
	cmd := exec.Command(name, args...)
	cmd.Dir = t.TempDir()
	if err := os.WriteFile(filepath.Join(cmd.Dir, "tank-chart.csv"), []byte("0,0\n1,100\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("%s: %v: %s", name, err, stderr.String())
	}
	return out.String()
}

// TestBashCompletion runs the bash script in bash as bash's completion
// would: COMP_WORDS and COMP_CWORD set, the function called, COMPREPLY read.
func TestBashCompletion(t *testing.T) {
	if _, err := exec.LookPath("bash"); err != nil {
		t.Fatal("bash is needed for this test (CI runs in bash)")
	}
	fakeDrawdown(t)
	cases := []struct {
		words string // the words as bash splits them; the last is completed
		want  string // COMPREPLY, one a line
	}{
		{"drawdown ca", "calc\n"},
		{"drawdown completion ", "bash\nzsh\nfish\n"},
		{"drawdown calc --liquid wa", "water\nwastewater\n"},
		{"drawdown calc --liquid = wa", "water\nwastewater\n"}, // --liquid=wa
		{"drawdown calc --tank sp", "sphere\n"},
		{"drawdown calc --tank-table tank", "tank-chart.csv\n"},
		{"drawdown calc --hose-id 25mm --hose-l", "--hose-length\n"},
	}
	for _, c := range cases {
		words := strings.Split(c.words, " ")
		var arr []string
		for _, w := range words {
			arr = append(arr, shellQuote(w))
		}
		script := "source <(drawdown completion bash)\nCOMP_WORDS=(" + strings.Join(arr, " ") + ")\nCOMP_CWORD=" +
			itoa(len(words)-1) + "\n_drawdown_complete\nprintf '%s\\n' \"${COMPREPLY[@]}\"\n"
		if got := shell(t, "bash", "-c", script); got != c.want {
			t.Errorf("%q: got %q, want %q", c.words, got, c.want)
		}
	}
}

// TestZshCompletion runs the zsh script with zsh's completion functions
// stood in for (_describe prints what it is given, _files says it was
// called): it checks the script's own logic, not zsh's completion system.
// It needs zsh, and says so when it is missing.
func TestZshCompletion(t *testing.T) {
	if _, err := exec.LookPath("zsh"); err != nil {
		t.Skip("zsh is not installed; the zsh script is not exercised")
	}
	fakeDrawdown(t)
	stubs := "compdef() { :; }\n_describe() { print -l -- \"${(@P)${@[-1]}}\"; }\n_files() { print -- \"_files $*\"; }\n"
	cases := []struct{ words, want string }{
		{"drawdown calc --liquid wa", "water:Fresh water\nwastewater:Wastewater (sewage)\n"},
		{"drawdown calc --liquid=wa", "--liquid=water:Fresh water\n--liquid=wastewater:Wastewater (sewage)\n"},
		{"drawdown calc --tank-table ", "_files \n"},
		{"drawdown report x --out ", "_files -/\n"},
	}
	for _, c := range cases {
		words := strings.Split(c.words, " ")
		var arr []string
		for _, w := range words {
			arr = append(arr, shellQuote(w))
		}
		script := stubs + "eval \"$(drawdown completion zsh)\"\nwords=(" + strings.Join(arr, " ") + ")\nCURRENT=" + itoa(len(words)) + "\n_drawdown_complete\n"
		if got := shell(t, "zsh", "-f", "-c", script); got != c.want {
			t.Errorf("%q: got %q, want %q", c.words, got, c.want)
		}
	}
}

// TestFishCompletion asks fish itself what it would complete (complete -C).
// It needs fish, and says so when it is missing.
func TestFishCompletion(t *testing.T) {
	if _, err := exec.LookPath("fish"); err != nil {
		t.Skip("fish is not installed; the fish script is not exercised")
	}
	fakeDrawdown(t)
	t.Setenv("HOME", t.TempDir())
	cases := []struct{ line, want string }{
		// fish sorts what it offers
		{"drawdown calc --liquid wa", "wastewater\tWastewater (sewage)\nwater\tFresh water\n"},
		{"drawdown calc --liquid=wa", "--liquid=wastewater\tWastewater (sewage)\n--liquid=water\tFresh water\n"},
		{"drawdown calc --tank-table tank", "tank-chart.csv\n"},
		{"drawdown completion z", "zsh\tsource <(drawdown completion zsh) after compinit\n"},
	}
	for _, c := range cases {
		script := "drawdown completion fish | source\ncomplete -C " + shellQuote(c.line) + "\n"
		if got := shell(t, "fish", "--no-config", "-c", script); got != c.want {
			t.Errorf("%q: got %q, want %q", c.line, got, c.want)
		}
	}
}

func itoa(n int) string { return strconv.Itoa(n) }
