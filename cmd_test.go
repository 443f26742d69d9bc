package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"drawdown/model"
)

func runCmd(t *testing.T, args ...string) (string, string, int) {
	t.Helper()
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return out.String(), errb.String(), code
}

// The "done when" case: every design §4 key is present with a real,
// finite value.
func TestCalcJSONKeys(t *testing.T) {
	out, stderr, code := runCmd(t, "calc", "--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"atm_pressure_pa", "vapor_pressure_pa", "density_kg_m3", "viscosity_pa_s", "max_crest_height_m",
		"flowing_crest_limit_m", "working_crest_height_m", "crest_pressure_pa", "flow_m3_s", "flow_low_m3_s", "flow_high_m3_s",
		"velocity_m_s", "reynolds", "friction_factor", "priming_volume_m3"} {
		v, ok := m[k].(float64)
		if !ok || math.IsNaN(v) || v <= 0 {
			t.Errorf("%s = %v; want a positive number", k, m[k])
		}
	}
	if m["regime"] != "turbulent" {
		t.Errorf("regime %v", m["regime"])
	}
	if _, ok := m["warnings"].([]any); !ok {
		t.Errorf("warnings = %v; want a list", m["warnings"])
	}
	if lo, q, hi := m["flow_low_m3_s"].(float64), m["flow_m3_s"].(float64), m["flow_high_m3_s"].(float64); !(lo < q && q < hi) {
		t.Errorf("band %g < %g < %g does not hold", lo, q, hi)
	}
	// Sea level, water at 15 °C: 101325 Pa (USSA76) and p_v 1705.8 Pa (IF97).
	if p := m["atm_pressure_pa"].(float64); math.Abs(p-101325) > 0.01 {
		t.Errorf("atm %g", p)
	}
	if pv := m["vapor_pressure_pa"].(float64); math.Abs(pv-1705.8) > 0.5 {
		t.Errorf("p_v %g", pv)
	}
}

func TestCalcDrainJSON(t *testing.T) {
	out, stderr, code := runCmd(t, "calc", "--hose-id", "1in", "--hose-length", "8m", "--lift", "0.4m", "--drop", "1.8m",
		"--tank", "vertical-cylinder", "--tank-diameter", "1.2m", "--level", "1.1m", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var m struct {
		Drain map[string]any `json:"drain"`
	}
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"time_s", "time_low_s", "time_high_s", "volume_m3", "stop_level_m", "residual_m3"} {
		if v, ok := m.Drain[k].(float64); !ok || v < 0 || math.IsNaN(v) {
			t.Errorf("drain.%s = %v", k, m.Drain[k])
		}
	}
	if _, ok := m.Drain["crest_limit_level_m"]; !ok {
		t.Error("drain.crest_limit_level_m missing (null when never)")
	}
	for _, k := range []string{"air_starts_level_m", "prime_lost_level_m"} {
		if _, ok := m.Drain[k].(float64); !ok {
			t.Errorf("drain.%s = %v", k, m.Drain[k])
		}
	}
	switch m.Drain["stop_reason"] {
	case "target", "intake", "air", "crest", "equal":
	default:
		t.Errorf("stop_reason %v", m.Drain["stop_reason"])
	}
}

func TestCalcBadInput(t *testing.T) {
	cases := []struct {
		args []string
		flag string
	}{
		{[]string{"--hose-id", "0mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m"}, "--hose-id"},
		{[]string{"--hose-id", "NaN", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m"}, "--hose-id"},
		{[]string{"--hose-id", "25mm", "--hose-length", "inf", "--lift", "1.5m", "--drop", "2.5m"}, "--hose-length"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "0x10", "--drop", "2.5m"}, "--lift"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m"}, "--drop"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--temp", "1e400"}, "--temp"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--liquid", "lava"}, "--liquid"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--intake", "sieve"}, "--intake"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--max-flow", "-1L/s"}, "--max-flow"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--outlet-k", "x"}, "--outlet-k"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--roughness", "9mm"}, "--roughness"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--frobnicate", "3"}, "--frobnicate"},
		{[]string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--tank", "sphere"}, "--level"},
	}
	for _, c := range cases {
		_, stderr, code := runCmd(t, append([]string{"calc"}, c.args...)...)
		if code != 2 {
			t.Errorf("%v: exit %d, want 2", c.args, code)
		}
		if strings.Count(strings.TrimSpace(stderr), "\n") != 0 || !strings.Contains(stderr, c.flag) {
			t.Errorf("%v: stderr %q; want one line naming %s", c.args, stderr, c.flag)
		}
	}
}

func TestCalcTextUS(t *testing.T) {
	out, stderr, code := runCmd(t, "calc", "--hose-id", "1in", "--hose-length", "40ft", "--lift", "5ft", "--drop", "8ft", "--units", "us")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, want := range []string{"Siphon: RUNS", "gal/min", "ft", "°F", "Never start a siphon by mouth"} {
		if !strings.Contains(out, want) {
			t.Errorf("text output lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "NaN") || strings.Contains(out, "Inf") {
		t.Errorf("non-finite value in output:\n%s", out)
	}
}

func TestReportCommand(t *testing.T) {
	home := t.TempDir()
	t.Setenv("DRAWDOWN_HOME", home)
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, "bund-b2.json")
	if err := model.SaveAtomic(path, model.DemoJob()); err != nil {
		t.Fatal(err)
	}
	out := t.TempDir()
	var so, se bytes.Buffer
	if code := run([]string{"report", "bund-b2", "--out", out}, &so, &se); code != 0 {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	md, err := os.ReadFile(filepath.Join(out, "bund-b2-record.md"))
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Bund B2", "does not authorise"} {
		if !strings.Contains(string(md), want) {
			t.Errorf("record lacks %q", want)
		}
	}
	if _, err := os.Stat(filepath.Join(out, "bund-b2-readings.csv")); err != nil {
		t.Error(err)
	}
	so.Reset()
	se.Reset()
	if code := run([]string{"report", "no-such-job"}, &so, &se); code != 2 || !strings.Contains(se.String(), "no-such-job") {
		t.Errorf("missing job: exit %d, %q", code, se.String())
	}
}

// A transfer into a receiving vessel: the volume moved out of the source
// lands in the receiver (volume balance, analytic: 1.2 m × 1.0 m plan area),
// and a small receiver stops the transfer when full.
func TestCalcTransfer(t *testing.T) {
	base := []string{"calc", "--hose-id", "25mm", "--hose-length", "6m", "--lift", "0.3m", "--drop", "1.2m",
		"--tank", "vertical-cylinder", "--tank-diameter", "1.1m", "--level", "0.9m",
		"--receiver", "rectangular", "--receiver-length", "1.2m", "--receiver-width", "1m", "--receiver-floor", "-1.5m", "--json"}
	for _, c := range []struct {
		height string
		reason string
	}{{"1m", ""}, {"0.4m", "receiver_full"}} {
		out, stderr, code := runCmd(t, append(base, "--receiver-height", c.height)...)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		var m struct {
			Drain struct {
				Volume   float64  `json:"volume_m3"`
				Reason   string   `json:"stop_reason"`
				Receiver *float64 `json:"receiver_level_m"`
			} `json:"drain"`
		}
		if err := json.Unmarshal([]byte(out), &m); err != nil {
			t.Fatal(err)
		}
		// JSON numbers carry 6 significant figures: a relative 1e-5 is the
		// rounding of two of them.
		if m.Drain.Receiver == nil || math.Abs(*m.Drain.Receiver*1.2-m.Drain.Volume) > 1e-5*m.Drain.Volume {
			t.Errorf("receiver %s: level %v for %g m³ moved; want volume/1.2 m²", c.height, m.Drain.Receiver, m.Drain.Volume)
		}
		if c.reason != "" && m.Drain.Reason != c.reason {
			t.Errorf("receiver %s: stop %q, want %q", c.height, m.Drain.Reason, c.reason)
		}
	}
	_, stderr, code := runCmd(t, append(base[:len(base)-1], "--receiver-floor", "x")...)
	if code != 2 || !strings.Contains(stderr, "--receiver-") {
		t.Errorf("bad receiver: exit %d %q", code, stderr)
	}
}

func TestCalcTankPreset(t *testing.T) {
	out, stderr, code := runCmd(t, "calc", "--hose-id", "25mm", "--hose-length", "8m", "--lift", "0.4m", "--drop", "1.5m",
		"--tank-preset", "tote-1000", "--level", "0.8m", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.Contains(out, `"drain"`) {
		t.Errorf("no drain plan from a catalogue tank:\n%s", out)
	}
	if _, stderr, code := runCmd(t, "calc", "--hose-id", "25mm", "--hose-length", "8m", "--lift", "0.4m", "--drop", "1.5m",
		"--tank-preset", "bathtub", "--level", "0.8m"); code != 2 || !strings.Contains(stderr, "--tank-preset") {
		t.Errorf("unknown preset: exit %d %q", code, stderr)
	}
}

// FuzzCalcArgs feeds the calc command arbitrary flag lists: it never
// panics, exits 0 or 2 (1 only for a file it cannot read), prints no NaN or
// Inf, and a refusal is one line on stderr.
//
// ci-fuzz-execs: 50000 (each input runs the whole calc command)
func FuzzCalcArgs(f *testing.F) {
	f.Add("--hose-id 25mm --hose-length 12m --lift 1.5m --drop 2.5m --json")
	f.Add("--hose-id 1in --hose-length 40ft --lift 5ft --drop 8ft --units us --tank sphere --tank-diameter 2m --level 1.5m --curve")
	f.Add("--hose-id 3/4in --hose-length 5m --lift 9m --drop 1m --liquid gasoline --temp 30C --altitude 2500m")
	f.Add("--hose-id 25mm --hose-length 6m --lift 0.3m --drop 1.2m --tank vertical-cylinder --tank-diameter 1.1m --level 0.9m --receiver sphere --receiver-diameter 1m --receiver-floor -1.5m")
	f.Add("--hose-id 25mm --hose-length 12m --lift 1.5m --drop 2.5m --lift 2m")
	f.Add("--fitting coupling --fitting=ball-valve --hose 25mm --hose-length 5m --lift 1m --drop 2m --bogus")
	f.Add("--help --json")
	t0 := f.TempDir()
	f.Fuzz(func(t *testing.T, line string) {
		args := append([]string{"calc"}, strings.Fields(line)...)
		for _, a := range args {
			if strings.Contains(a, "tank-table") || strings.Contains(a, "report") {
				return // no file access from the fuzzer
			}
		}
		t.Setenv("DRAWDOWN_HOME", t0)
		t.Setenv("XDG_CONFIG_HOME", t0)
		var out, errb bytes.Buffer
		code := run(args, &out, &errb)
		switch code {
		case 0:
			if s := out.String(); strings.Contains(s, "NaN") || strings.Contains(s, "+Inf") || strings.Contains(s, "-Inf") {
				t.Fatalf("non-finite output for %q:\n%s", line, s)
			}
		case 2:
			if e := strings.TrimSpace(errb.String()); e == "" || strings.Contains(e, "\n") {
				t.Fatalf("refusal for %q is not one line: %q", line, e)
			}
		case 1:
		default:
			t.Fatalf("exit %d for %q", code, line)
		}
	})
}

// TestFlagErrors: each flag error names the flag, is one line, exit 2
// (design §4; issue 16 item 4 for the twice-given and unknown flags).
func TestFlagErrors(t *testing.T) {
	base := []string{"calc", "--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m"}
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"--lift", "2m"}, "--lift given twice"},
		{[]string{"--json", "--json"}, "--json given twice"},
		{[]string{"--hose-id=30mm"}, "--hose-id given twice"},
		{[]string{"--bogus"}, "unknown flag --bogus"},
		{[]string{"--bogus", "3"}, "unknown flag --bogus"},
		{[]string{"--json=yes"}, "--json takes no value"},
		{[]string{"--temp"}, "--temp needs a value"},
		{[]string{"extra"}, `unexpected argument "extra"`},
		{[]string{"--receiver-bogus", "1m"}, "unknown flag --receiver-bogus"},
		{[]string{"--hose", "25mm"}, "--hose and --hose-id"},
	}
	for _, c := range cases {
		_, stderr, code := runCmd(t, append(append([]string{}, base...), c.args...)...)
		if code != 2 || !strings.Contains(stderr, c.want) || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q; want one line with %q", c.args, code, stderr, c.want)
		}
	}
	for _, c := range []struct{ args []string }{
		{[]string{"report", "a", "--out", "x", "--out", "y"}},
		{[]string{"report", "--bogus"}},
		{[]string{"report", "a", "b"}},
		{[]string{"presets", "--bogus"}},
		{[]string{"presets", "extra"}},
		{[]string{"completion", "tcsh"}},
		{[]string{"version", "--bogus"}},
	} {
		_, stderr, code := runCmd(t, c.args...)
		if code != 2 || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q", c.args, code, stderr)
		}
	}
}

// TestFlagRepeat: --fitting may repeat (its values add up to one list); the
// flag table keeps every value in order.
func TestFlagRepeat(t *testing.T) {
	vals, _, err := parseCalcArgs([]string{"--fitting", "strainer-basket", "--fitting=coupling", "--fitting", "bend-90-r4,ball-valve"})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := vals[model.FieldHoseFittings], "strainer-basket,coupling,bend-90-r4,ball-valve"; got != want {
		t.Errorf("fittings %q, want %q", got, want)
	}
	// A negative value after a flag is the flag's value, not a flag.
	_, o, err := parseCalcArgs([]string{"--receiver", "sphere", "--receiver-floor", "-1.5m"})
	if err != nil || o.receiver == nil || o.receiver.Floor != "-1.5m" {
		t.Errorf("receiver %+v, %v", o.receiver, err)
	}
	// A command adding its own flags to calc's: the calc part reads as
	// before and the command's own flag is left for it.
	defs := append(calcFlagTable(), flagDef{name: "measured-flow", arg: "Q", repeat: true})
	pf, err := parseFlags("checklist", []string{"--lift", "1m", "--measured-flow", "20L/min", "--measured-flow", "21L/min"}, defs, 0)
	if err != nil {
		t.Fatal(err)
	}
	vals, _, err = calcValues(pf)
	if err != nil || vals[model.FieldLift] != "1m" || len(pf.all("measured-flow")) != 2 {
		t.Errorf("vals %v, measured %v, %v", vals, pf.all("measured-flow"), err)
	}
	if len(calcFlagDefs) == len(defs) {
		t.Error("calcFlagTable returned the table itself, not a copy")
	}
}

// TestCalcFlagTable: every job field the command line sets has one flag, and
// no name is in the table twice.
func TestCalcFlagTable(t *testing.T) {
	seen := map[string]bool{}
	for _, d := range calcFlagDefs {
		if seen[d.name] {
			t.Errorf("--%s twice in the table", d.name)
		}
		seen[d.name] = true
		if d.field != "" {
			if _, ok := model.FieldByID(d.field); !ok {
				t.Errorf("--%s sets unknown field %q", d.name, d.field)
			}
		}
		if d.help == "" {
			t.Errorf("--%s has no help", d.name)
		}
	}
	// design §4's flag names, kept exactly.
	for _, name := range []string{"liquid", "temp", "density", "viscosity", "vapor-pressure", "altitude", "baro", "hose-id", "hose-length",
		"upleg-length", "intake-depth", "roughness", "k-minor", "hoses", "lift", "drop", "tank", "tank-diameter", "tank-length",
		"tank-width", "cone-height", "side-slope", "tank-table", "level", "target-level", "intake-height", "json"} {
		if !seen[name] {
			t.Errorf("design §4 flag --%s is missing", name)
		}
	}
}

// TestReportBesideJob: without --out the record is written beside the job
// file, wherever the command is run from.
func TestReportBesideJob(t *testing.T) {
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	t.Setenv("XDG_CONFIG_HOME", t.TempDir())
	dir := t.TempDir()
	path := filepath.Join(dir, "pit-7.json")
	if err := model.SaveAtomic(path, model.DemoJob()); err != nil {
		t.Fatal(err)
	}
	t.Chdir(t.TempDir())
	var so, se bytes.Buffer
	if code := run([]string{"report", path}, &so, &se); code != 0 {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	for _, name := range []string{"pit-7-record.md", "pit-7-readings.csv"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Errorf("%s not beside the job: %v", name, err)
		}
		if !strings.Contains(so.String(), filepath.Join(dir, name)) {
			t.Errorf("path of %s not printed: %q", name, so.String())
		}
	}
	if entries, _ := os.ReadDir("."); len(entries) != 0 {
		t.Errorf("wrote into the current folder: %v", entries)
	}
}

// TestCalcTankTable: --tank table with the sample calibration tables in
// testdata/tables drains as the shape they were computed from. The cistern
// table holds the analytic volume of a horizontal cylinder (circular-segment
// area times length) every 5 cm, so between rows the straight-line
// interpolation differs from the round tank by a little: 1 % on the volume
// and time is ample. The US sump table (a spreadsheet export: byte-order
// mark, CRLF, quoted cells, inches and US gallons named in the header) is a
// 4 ft × 3 ft box, where straight lines are exact (rounding to 0.01 gal
// aside).
func TestCalcTankTable(t *testing.T) {
	hose := []string{"calc", "--hose-id", "25mm", "--hose-length", "10m", "--lift", "0.8m", "--drop", "2m", "--level", "1.2m", "--json"}
	cases := []struct {
		table string
		shape []string
		units string
		tol   float64
	}{
		{"testdata/tables/cistern-horizontal.csv", []string{"--tank", "horizontal-cylinder", "--tank-diameter", "1.5m", "--tank-length", "3m"}, "si", 0.01},
		{"testdata/tables/sump-us.csv", []string{"--tank", "rectangular", "--tank-length", "4ft", "--tank-width", "3ft", "--tank-height", "4ft"}, "us", 1e-4},
	}
	type drain struct {
		Drain struct {
			Time   float64 `json:"time_s"`
			Volume float64 `json:"volume_m3"`
			Stop   float64 `json:"stop_level_m"`
		} `json:"drain"`
	}
	for _, c := range cases {
		var got, want drain
		for _, run := range []struct {
			args []string
			into *drain
		}{
			{append(append([]string{}, hose...), "--units", c.units, "--tank", "table", "--tank-table", c.table), &got},
			{append(append(append([]string{}, hose...), "--units", c.units), c.shape...), &want},
		} {
			out, stderr, code := runCmd(t, run.args...)
			if code != 0 {
				t.Fatalf("%v: exit %d: %s", run.args, code, stderr)
			}
			if err := json.Unmarshal([]byte(out), run.into); err != nil {
				t.Fatal(err)
			}
		}
		if want.Drain.Volume <= 0 {
			t.Fatalf("%s: no drain", c.table)
		}
		for _, q := range []struct {
			name      string
			got, want float64
		}{{"time", got.Drain.Time, want.Drain.Time}, {"volume", got.Drain.Volume, want.Drain.Volume}, {"stop level", got.Drain.Stop, want.Drain.Stop}} {
			if math.Abs(q.got-q.want) > c.tol*q.want {
				t.Errorf("%s: %s %g, the shape gives %g", c.table, q.name, q.got, q.want)
			}
		}
	}
}

// TestCalcTankTableRefused: a bad calibration file gets one line naming
// --tank-table and the cause, exit 2, at once (a named pipe is never opened
// for reading, so nothing waits on it).
func TestCalcTankTableRefused(t *testing.T) {
	dir := t.TempDir()
	big := filepath.Join(dir, "big.csv")
	if err := os.WriteFile(big, bytes.Repeat([]byte("# padding line\n"), 80000), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct{ path, want string }{
		{"testdata/tables/decimal-comma.csv", `line 3, level: "0,5" has a decimal comma`},
		{dir, "is a folder"},
		{big, "at most 1 MiB"},
		{filepath.Join(dir, "missing.csv"), "no such file"},
	}
	if _, err := os.Stat("/dev/zero"); err == nil {
		cases = append(cases, struct{ path, want string }{"/dev/zero", "is a device"})
	}
	if fifo := filepath.Join(dir, "fifo"); mkfifo(fifo) == nil {
		cases = append(cases, struct{ path, want string }{fifo, "is a named pipe"})
	}
	base := []string{"calc", "--hose-id", "25mm", "--hose-length", "10m", "--lift", "0.8m", "--drop", "2m", "--level", "0.8m", "--tank", "table", "--tank-table"}
	for _, c := range cases {
		_, stderr, code := runCmd(t, append(base, c.path)...)
		if code != 2 || !strings.Contains(stderr, "--tank-table") || !strings.Contains(stderr, c.want) || strings.Count(stderr, "\n") != 1 {
			t.Errorf("%s: exit %d, %q; want one line with %q", c.path, code, stderr, c.want)
		}
	}
	if _, stderr, code := runCmd(t, "calc", "--hose-id", "25mm", "--hose-length", "10m", "--lift", "0.8m", "--drop", "2m", "--level", "0.8m", "--tank", "table"); code != 2 || !strings.Contains(stderr, "--tank-table FILE") {
		t.Errorf("table without a file: exit %d %q", code, stderr)
	}
}
