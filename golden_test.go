package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"drawdown/calc/testkit"
)

// Golden outputs of the command line, in testdata/: `go test . -update`
// rewrites them. Review the diff before committing and say in the commit
// why each file changed: the figures come from calc, presets and model, so a
// change there shows here. The calc text output (testdata/calc/*.txt) is
// expected to change when its wording moves to the presentation layer.

// golden compares got with testdata/<name> through the house's one golden
// helper (go test . -update rewrites it).
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	testkit.Golden(t, filepath.Join("testdata", name), got)
}

// The three JSON cases: a steady siphon with no tank, a drain of a tank
// with its curve, and a transfer into a receiving vessel. The scenarios are
// invented.
var jsonCases = []struct {
	name string
	args []string
}{
	{"steady", []string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m",
		"--fitting", "strainer-basket", "--fitting", "bend-90-r4"}},
	{"drain", []string{"--hose", "38mm", "--hose-length", "9m", "--lift", "0.5m", "--drop", "1.6m",
		"--tank", "vertical-cylinder", "--tank-diameter", "1.5m", "--tank-height", "1.8m", "--level", "1.2m", "--curve"}},
	{"transfer", []string{"--hose-id", "25mm", "--hose-length", "6m", "--lift", "0.3m", "--drop", "1.2m",
		"--tank", "vertical-cylinder", "--tank-diameter", "1.1m", "--level", "0.9m",
		"--receiver", "rectangular", "--receiver-length", "1.2m", "--receiver-width", "1m", "--receiver-height", "0.4m",
		"--receiver-floor", "-1.5m"}},
}

// TestGoldenCalcJSON: the whole JSON document for each case. Besides the
// bytes: it parses, it has the schema key, and no number carries more than
// jsonDigits significant figures.
func TestGoldenCalcJSON(t *testing.T) {
	for _, c := range jsonCases {
		out, stderr, code := runCmd(t, append(append([]string{"calc"}, c.args...), "--json")...)
		if code != 0 {
			t.Fatalf("%s: exit %d: %s", c.name, code, stderr)
		}
		golden(t, "calc/"+c.name+".json", []byte(out))
		dec := json.NewDecoder(strings.NewReader(out))
		dec.UseNumber()
		var doc map[string]any
		if err := dec.Decode(&doc); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if doc["schema"] != calcSchema {
			t.Errorf("%s: schema %v", c.name, doc["schema"])
		}
		walkNumbers(doc, func(n json.Number) {
			if d := sigDigits(string(n)); d > jsonDigits {
				t.Errorf("%s: %s has %d significant figures", c.name, n, d)
			}
		})
		if c.name == "drain" {
			curve, _ := doc["drain"].(map[string]any)["curve"].([]any)
			if len(curve) < 2 {
				t.Errorf("drain: --json --curve gave %d curve points", len(curve))
			}
		}
	}
}

func walkNumbers(v any, f func(json.Number)) {
	switch x := v.(type) {
	case json.Number:
		f(x)
	case map[string]any:
		for _, e := range x {
			walkNumbers(e, f)
		}
	case []any:
		for _, e := range x {
			walkNumbers(e, f)
		}
	}
}

// sigDigits counts the significant figures of a JSON number.
func sigDigits(s string) int {
	mant, _, _ := strings.Cut(strings.ToLower(s), "e")
	digits := strings.TrimLeft(strings.ReplaceAll(strings.TrimPrefix(mant, "-"), ".", ""), "0")
	if !strings.Contains(mant, ".") {
		digits = strings.TrimRight(digits, "0")
	}
	return len(digits)
}

func TestSigDigits(t *testing.T) {
	for s, want := range map[string]int{"101325": 6, "0.000962417": 6, "1.5": 2, "0": 0, "-1.81": 3, "1e+06": 1, "1.23456e-07": 6, "1200": 2} {
		if got := sigDigits(s); got != want {
			t.Errorf("sigDigits(%q) = %d, want %d", s, got, want)
		}
	}
}

// TestGoldenOutputs: the text a user sees from calc (SI and US), the
// catalogue listing, the top-level and calc help, and the record of a job
// file.
func TestGoldenOutputs(t *testing.T) {
	cases := []struct {
		file string
		args []string
	}{
		{"calc/drain.txt", append([]string{"calc"}, jsonCases[1].args[:len(jsonCases[1].args)-1]...)}, // without --curve
		{"calc/steady-us.txt", []string{"calc", "--hose-id", "1in", "--hose-length", "40ft", "--lift", "5ft", "--drop", "8ft", "--units", "us"}},
		{"presets.txt", []string{"presets"}},
		{"help.txt", []string{"--help"}},
		{"calc-help.txt", []string{"calc", "--help"}},
	}
	for _, c := range cases {
		out, stderr, code := runCmd(t, c.args...)
		if code != 0 || stderr != "" {
			t.Fatalf("%v: exit %d: %s", c.args, code, stderr)
		}
		golden(t, c.file, []byte(out))
	}
}

// TestGoldenReport: `drawdown report` on a job file (the built-in demo job,
// saved as testdata/jobs/bund-b2.json) at a fixed time: the record on
// standard output, and the two files it writes.
func TestGoldenReport(t *testing.T) {
	saved := reportNow
	reportNow = func() time.Time { return time.Date(2026, time.March, 14, 11, 0, 0, 0, time.FixedZone("GMT", 0)) }
	t.Cleanup(func() { reportNow = saved })
	job := filepath.Join("testdata", "jobs", "bund-b2.json")
	out, stderr, code := runCmd(t, "report", job, "--stdout")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	golden(t, "report/bund-b2-record.md", []byte(out))
	dir := t.TempDir()
	paths, stderr, code := runCmd(t, "report", job, "--out", dir)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if want := filepath.Join(dir, "bund-b2-record.md") + "\n" + filepath.Join(dir, "bund-b2-readings.csv") + "\n"; paths != want {
		t.Errorf("printed %q, want %q", paths, want)
	}
	md, err := os.ReadFile(filepath.Join(dir, "bund-b2-record.md"))
	if err != nil || !bytes.Equal(md, []byte(out)) {
		t.Errorf("the record file differs from --stdout (%v)", err)
	}
	csv, err := os.ReadFile(filepath.Join(dir, "bund-b2-readings.csv"))
	if err != nil {
		t.Fatal(err)
	}
	golden(t, "report/bund-b2-readings.csv", csv)
}
