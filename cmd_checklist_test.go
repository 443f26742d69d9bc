package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"drawdown/calc/testkit"
)

// checklistCases are the golden checklists of issue 12 §8, each reviewed
// step by step against field-practice.md in testdata/checklists/REVIEW.md.
// Every job is invented; the sizes of the catalogue tanks are the
// catalogue's (invented typical sizes).
var checklistCases = []struct {
	name string
	args []string
}{
	{"water", []string{"--liquid", "water", "--temp", "15C", "--hose-id", "25mm", "--hose-length", "8m", "--lift", "0.5m", "--drop", "1.5m",
		"--priming", "hand-pump", "--pump-stroke", "0.2L", "--discharge", "storm"}},
	{"gasoline", []string{"--liquid", "gasoline", "--temp", "15C", "--hose-id", "13mm", "--hose-length", "2m", "--lift", "0.3m", "--drop", "0.8m",
		"--priming", "hand-pump", "--pump-stroke", "30mL", "--discharge", "container"}},
	{"diesel", []string{"--liquid", "diesel", "--temp", "15C", "--hose-id", "19mm", "--hose-length", "3m", "--lift", "0.4m", "--drop", "1m",
		"--priming", "shake-valve", "--discharge", "container"}},
	{"sewage-wet-well", []string{"--liquid", "wastewater", "--temp", "12C", "--tank-preset", "wet-well", "--level", "3.2m", "--intake-height", "0.3m",
		"--hose-id", "50mm", "--hose-length", "12m", "--lift", "1m", "--drop", "1.2m", "--priming", "pump-start", "--discharge", "sewer"}},
	{"vault-outside", []string{"--liquid", "water", "--temp", "10C", "--tank-preset", "valve-vault", "--level", "0.9m",
		"--hose-id", "38mm", "--hose-length", "10m", "--lift", "1.3m", "--drop", "1.5m", "--priming", "hand-pump", "--pump-stroke", "0.3L", "--discharge", "storm"}},
	{"vault-entry", []string{"--liquid", "water", "--temp", "10C", "--tank-preset", "valve-vault", "--level", "0.9m", "--entry",
		"--hose-id", "38mm", "--hose-length", "10m", "--lift", "1.3m", "--drop", "1.5m", "--priming", "hand-pump", "--pump-stroke", "0.3L", "--discharge", "storm"}},
	{"pond", []string{"--liquid", "water", "--temp", "15C", "--tank-preset", "farm-pond", "--level", "1.5m",
		"--hose-id", "75mm", "--hose-length", "40m", "--lift", "0.8m", "--drop", "2m", "--material", "pvc-pipe", "--priming", "crest-port",
		"--open-water", "--discharge", "storm", "--overnight", "--air-temp", "12C"}},
	{"freezing-night", []string{"--liquid", "water", "--temp", "4C", "--hose-id", "25mm", "--hose-length", "15m", "--lift", "0.6m", "--drop", "1.2m",
		"--priming", "hand-pump", "--pump-stroke", "0.3L", "--discharge", "storm", "--air-temp", "-6C", "--overnight"}},
	{"bund-release", []string{"--liquid", "water", "--temp", "8C", "--tank-preset", "bund", "--level", "0.3m", "--hose-id", "38mm", "--hose-length", "8m",
		"--lift", "0.5m", "--drop", "1.2m", "--priming", "hand-pump", "--pump-stroke", "0.3L", "--discharge", "storm", "--may-carry-oil"}},
}

// A golden file changes only in a commit that says why each step changed,
// with the review in testdata/checklists/REVIEW.md brought up to date
// (go test -update rewrites them; calc/testkit).
func TestChecklistGolden(t *testing.T) {
	for _, tc := range checklistCases {
		t.Run(tc.name, func(t *testing.T) {
			out, stderr, code := runCmd(t, append([]string{"checklist"}, tc.args...)...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			testkit.Golden(t, filepath.Join("testdata", "checklists", tc.name+".golden"), []byte(out))
		})
	}
}

// Every golden step is named in the review with its rule (issue 12 §8): the
// review lists each case and each step text's number.
func TestChecklistReviewCoversGoldens(t *testing.T) {
	review, err := os.ReadFile(filepath.Join("testdata", "checklists", "REVIEW.md"))
	if err != nil {
		t.Fatalf("review missing: %v", err)
	}
	for _, tc := range checklistCases {
		g, err := os.ReadFile(filepath.Join("testdata", "checklists", tc.name+".golden"))
		if err != nil {
			t.Fatal(err)
		}
		head := "## " + tc.name + " ("
		i := bytes.Index(review, []byte(head))
		if i < 0 {
			t.Errorf("REVIEW.md has no section %q", head)
			continue
		}
		n := strings.Count(string(g), "\n") - 2 // heading and closing line
		if !bytes.Contains(review[i:], []byte("("+strconv.Itoa(n)+" steps)")) {
			t.Errorf("REVIEW.md section %s does not say %d steps: was the golden reviewed after it changed?", tc.name, n)
		}
	}
}

// The --json contract: a top-level list of {id, section, text, caution,
// source}, every key present on every step.
func TestChecklistJSONContract(t *testing.T) {
	out, stderr, code := runCmd(t, "checklist", "--liquid", "gasoline", "--discharge", "container", "--confined", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var steps []map[string]any
	if err := json.Unmarshal([]byte(out), &steps); err != nil {
		t.Fatal(err)
	}
	if len(steps) < 20 {
		t.Fatalf("%d steps", len(steps))
	}
	ids := map[string]bool{}
	for _, s := range steps {
		for _, k := range []string{"id", "section", "text", "caution", "source"} {
			if _, ok := s[k].(string); !ok {
				t.Errorf("step %v: key %s missing or not text", s["id"], k)
			}
		}
		if len(s) != 5 {
			t.Errorf("step %v has keys beyond the contract: %v", s["id"], s)
		}
		ids[s["id"].(string)] = true
	}
	for _, id := range []string{"hazard.cs.permit", "hazard.cs.oxygen", "hazard.cs.attendant", "setup.bonding"} {
		if !ids[id] {
			t.Errorf("gasoline in a confined space: no %s", id)
		}
	}
}

// Bad input: exit 2 and one line that names the flag; --help: exit 0.
func TestChecklistUsage(t *testing.T) {
	for _, tc := range []struct {
		args []string
		code int
		says string
	}{
		{[]string{"--help"}, 0, ""},
		{[]string{"--discharge", "river"}, 2, "--discharge"},
		{[]string{"--discharge"}, 2, "--discharge needs a value"},
		{[]string{"--air-temp", "hot"}, 2, "--air-temp"},
		{[]string{"--air-temp=-80C"}, 2, "--air-temp: -80 °C is out of range; accepted -60 °C to 60 °C"},
		{[]string{"--confined=yes"}, 2, "--confined takes no value"},
		{[]string{"--entry"}, 2, "--entry"},
		{[]string{"--liquid", "lava"}, 2, "--liquid"},
		{[]string{"--temp", "abc"}, 2, "--temp"},
		{[]string{"--bogus"}, 2, "--bogus"},
		{[]string{"--hose-id", "25mm"}, 2, "--hose-length is required"},
		{[]string{"--curve"}, 2, "--curve"},
		{[]string{"--tank-preset", "lagoon"}, 2, "--tank-preset"},
	} {
		out, stderr, code := runCmd(t, append([]string{"checklist"}, tc.args...)...)
		if code != tc.code {
			t.Errorf("%v: exit %d, want %d (%s)", tc.args, code, tc.code, stderr)
		}
		if tc.code == 0 {
			if !strings.Contains(out, "usage: drawdown checklist") || stderr != "" {
				t.Errorf("%v: help %q / %q", tc.args, out, stderr)
			}
			continue
		}
		if strings.Count(stderr, "\n") != 1 || !strings.Contains(stderr, tc.says) || out != "" {
			t.Errorf("%v: stderr %q, want one line with %q", tc.args, stderr, tc.says)
		}
	}
}

// A catalogue tank flagged confined pre-sets the fact from the command line
// too; without hose and heights the checklist still prints.
func TestChecklistTankPresetConfined(t *testing.T) {
	out, stderr, code := runCmd(t, "checklist", "--tank-preset", "sump-pit", "--discharge", "sewer")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, "confined space, worked from outside") || !strings.Contains(out, "Test the atmosphere from outside the space, oxygen first") {
		t.Errorf("sump pit not confined:\n%s", out)
	}
}

func FuzzChecklistArgs(f *testing.F) {
	for _, tc := range checklistCases {
		f.Add(strings.Join(tc.args, "\x00"))
	}
	f.Setenv("DRAWDOWN_HOME", f.TempDir())
	f.Setenv("XDG_CONFIG_HOME", f.TempDir())
	f.Add("--air-temp\x00-1e400")
	f.Add("--discharge=\x1b[31m")
	f.Fuzz(func(t *testing.T, s string) {
		args := strings.Split(s, "\x00")
		var out, errb bytes.Buffer
		code := run(append([]string{"checklist"}, args...), &out, &errb)
		switch code {
		case 0:
			if strings.Contains(out.String(), "NaN") || strings.Contains(out.String(), "Inf") {
				t.Errorf("%q: NaN or Inf in output", args)
			}
		case 1, 2:
			if strings.Count(errb.String(), "\n") > 2 {
				t.Errorf("%q: more than one line of refusal: %q", args, errb.String())
			}
		default:
			t.Errorf("%q: exit %d", args, code)
		}
		if strings.ContainsRune(out.String(), 0x1b) {
			t.Errorf("%q: an escape reached the output", args)
		}
	})
}
