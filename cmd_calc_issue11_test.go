package main

import (
	"encoding/json"
	"math"
	"testing"
)

// calcJSON runs `drawdown calc --json` and decodes the object.
func calcJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	out, stderr, code := runCmd(t, append(append([]string{"calc"}, args...), "--json")...)
	if code != 0 {
		t.Fatalf("%v: exit %d: %s", args, code, stderr)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	return m
}

// The command-line contract of issue 11: the verdict words, fix present
// unless it runs, the throttle and vacuum keys always present (null when
// they do not apply). Cases worked in calc's tests against their sources:
// the choked case against a hand-derived energy balance (1.192 L/s, outlet
// K 12.32 at 20 °C, calc/crest_test.go), boiling at the site as a verdict.
func TestCalcVerdictContract(t *testing.T) {
	choked := []string{"--hose-id", "25mm", "--hose-length", "30m", "--lift", "5.5m", "--drop", "12m", "--altitude", "1500m", "--temp", "20C"}
	cases := []struct {
		name    string
		args    []string
		verdict string
		check   func(t *testing.T, m map[string]any)
	}{
		{"runs", []string{"--hose-id", "38mm", "--hose-length", "12m", "--lift", "0.6m", "--drop", "1.5m", "--material", "suction-smooth"}, "runs",
			func(t *testing.T, m map[string]any) {
				if _, ok := m["fix"]; ok {
					t.Error("fix present on runs")
				}
				if m["outlet_throttle_k"] != nil {
					t.Errorf("outlet_throttle_k %v, want null", m["outlet_throttle_k"])
				}
				if v, ok := m["hose_vacuum_rating_pa"].(float64); !ok || v <= 0 {
					t.Errorf("suction hose rating %v", m["hose_vacuum_rating_pa"])
				}
			}},
		{"choked", choked, "runs choked", func(t *testing.T, m map[string]any) {
			k, ok := m["outlet_throttle_k"].(float64)
			if !ok || math.Abs(k-12.32)/12.32 > 0.005 {
				t.Errorf("outlet_throttle_k %v, want 12.32 (energy balance by hand)", m["outlet_throttle_k"])
			}
			if q := m["flow_m3_s"].(float64); math.Abs(q-1.192e-3)/1.192e-3 > 0.005 {
				t.Errorf("choked flow %v, want 1.192e-3", q)
			}
			if m["hose_vacuum_rating_pa"] != nil {
				t.Errorf("garden-rubber default hose: rating %v, want null (not rated)", m["hose_vacuum_rating_pa"])
			}
		}},
		{"boiling at the site", []string{"--hose-id", "25mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2.5m", "--temp", "99C", "--altitude", "3000m"}, "will not run", nil},
		{"lay-flat on the up-leg", []string{"--hose-id", "38mm", "--hose-length", "12m", "--lift", "1.5m", "--drop", "2m", "--material", "lay-flat"}, "will not run", nil},
		{"permit cap", []string{"--hose-id", "38mm", "--hose-length", "12m", "--lift", "1m", "--drop", "2m", "--max-flow", "30gpm"}, "runs",
			func(t *testing.T, m map[string]any) {
				// 30 US gpm = 1.8927e-3 m³/s (NIST SP 811 gallon)
				if q := m["flow_m3_s"].(float64); math.Abs(q-1.89271e-3) > 1e-8 {
					t.Errorf("capped flow %v, want 1.89271e-3", q)
				}
				if k, ok := m["outlet_throttle_k"].(float64); !ok || !(k > 0) {
					t.Errorf("outlet_throttle_k %v", m["outlet_throttle_k"])
				}
			}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := calcJSON(t, c.args...)
			if m["verdict"] != c.verdict {
				t.Fatalf("verdict %v, want %q", m["verdict"], c.verdict)
			}
			if fix, _ := m["fix"].(string); c.verdict != "runs" && fix == "" {
				t.Error("no fix for a verdict other than runs")
			}
			for _, k := range []string{"outlet_throttle_k", "hose_vacuum_worst_pa", "hose_vacuum_rating_pa"} {
				if _, ok := m[k]; !ok {
					t.Errorf("key %s missing", k)
				}
			}
			if v, ok := m["hose_vacuum_worst_pa"].(float64); !ok || v < 0 {
				t.Errorf("hose_vacuum_worst_pa %v", m["hose_vacuum_worst_pa"])
			}
			if c.check != nil {
				c.check(t, m)
			}
		})
	}
}

// Issue 11, done when: the demo bund with a strainer lying on its floor
// drains to within a few centimetres of the floor; a board over the intake
// never drains less; a calibration table runs from the command line.
func TestCalcIntakeKinds(t *testing.T) {
	bund := []string{"--hose-id", "38mm", "--hose-length", "12m", "--lift", "0.6m", "--drop", "1.5m", "--material", "suction-corrugated",
		"--temp", "8C", "--altitude", "45m", "--tank", "rectangular", "--tank-length", "8m", "--tank-width", "5m", "--level", "0.35m"}
	stop := func(extra ...string) (float64, string) {
		m := calcJSON(t, append(append([]string{}, bund...), extra...)...)
		d := m["drain"].(map[string]any)
		return d["stop_level_m"].(float64), d["stop_reason"].(string)
	}
	if lv, why := stop("--intake", "strainer-flat", "--intake-height", "0"); lv > 0.04 || why != "intake" {
		t.Errorf("flat strainer on the floor: stops at %v m (%s)", lv, why)
	}
	film, why := stop("--intake", "bare-hung", "--may-carry-oil")
	board, _ := stop("--intake", "board", "--may-carry-oil")
	if why != "air" || board > film {
		t.Errorf("film: bare end stops at %v (%s), with a board %v; a board never drains less", film, why, board)
	}
	if _, _, code := runCmd(t, "calc", "--hose-id", "25mm", "--hose-length", "10m", "--lift", "0.5m", "--drop", "2m",
		"--tank", "table", "--tank-table", "testdata/tables/cistern-horizontal.csv", "--level", "1m"); code != 0 {
		t.Errorf("--tank table: exit %d", code)
	}
}
