package main

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// bund is an 8 × 5 m bund, 0.35 m of water, 1 m deep, drained by a 12 m
// hose of 38 mm bore (an invented site).
var bund = []string{"--hose-id", "38mm", "--hose-length", "12m", "--lift", "1m", "--drop", "2m",
	"--tank", "rectangular", "--tank-length", "8m", "--tank-width", "5m", "--level", "0.35m", "--tank-height", "1m"}

func drainOf(t *testing.T, m map[string]any) map[string]any {
	t.Helper()
	d, ok := m["drain"].(map[string]any)
	if !ok {
		t.Fatalf("no drain object: %v", m)
	}
	return d
}

func num(t *testing.T, m map[string]any, key string) float64 {
	t.Helper()
	v, ok := m[key].(float64)
	if !ok {
		t.Fatalf("%s = %v, want a number", key, m[key])
	}
	return v
}

func near(t *testing.T, what string, got, want, rel float64, source string) {
	t.Helper()
	if math.Abs(got-want) > rel*math.Abs(want) {
		t.Errorf("%s = %.6g, want %.6g within %.2g (%s)", what, got, want, rel, source)
	}
}

// The inflow flags of issue 13's contract, each converted to m³/s. The
// expected values are the arithmetic of the definitions (rain depth per
// time × area; rise × the bund's plan area; NIST SP 811 B.8 for the US
// gallon, 3.785411784 L, and the inch, 25.4 mm).
func TestCalcInflowFlags(t *testing.T) {
	for _, c := range []struct {
		name string
		args []string
		want float64
	}{
		{"rain on the bund's own area", []string{"--rain", "10mm/h"}, 0.010 / 3600 * 40},
		{"rain on a catchment", []string{"--rain", "10mm/h", "--catchment", "100m2"}, 0.010 / 3600 * 100},
		{"rain in US units", []string{"--rain", "0.5in/h", "--catchment", "1000ft2"}, 0.5 * 0.0254 / 3600 * 1000 * 0.3048 * 0.3048},
		{"rise with the siphon stopped", []string{"--rise-rate", "12mm/h"}, 0.012 / 3600 * 40},
		{"seepage in L/s", []string{"--inflow", "0.5L/s"}, 0.5e-3},
		{"seepage in m3/h", []string{"--inflow", "1.8m3/h"}, 0.5e-3},
		{"seepage in gpm", []string{"--inflow", "5gpm"}, 5 * 3.785411784e-3 / 60},
		{"seepage in L/min", []string{"--inflow", "30L/min"}, 0.5e-3},
		{"all three add", []string{"--rain", "10mm/h", "--rise-rate", "12mm/h", "--inflow", "0.5L/s"}, 0.010/3600*40 + 0.012/3600*40 + 0.5e-3},
	} {
		d := drainOf(t, calcJSON(t, append(append([]string{}, bund...), c.args...)...))
		near(t, c.name+": inflow_m3_s", num(t, d, "inflow_m3_s"), c.want, 1e-5, "definition")
	}
}

// Keeps up or settles. At the settle level the siphon's steady flow equals
// the inflow (the definition of the equilibrium, A·dh/dt = 0): the steady
// flow computed with the level set to settle_level_m must be the inflow.
// The drain's own check against the closed form with inflow is in
// calc/drain_inflow_test.go.
func TestCalcSettles(t *testing.T) {
	keeps := drainOf(t, calcJSON(t, append(append([]string{}, bund...), "--rain", "10mm/h")...))
	if keeps["settle_level_m"] != nil || keeps["stop_reason"] == "settles" {
		t.Errorf("10 mm/h on 40 m² (6.7 L/min against 148 L/min): settle %v, stop %v; want keeps up",
			keeps["settle_level_m"], keeps["stop_reason"])
	}
	// 0.9 m of water, the crest 1 m over it and the outlet 2 m under it;
	// 2.2 L/s comes in, less than the 2.5 L/s the siphon starts at.
	full := []string{"--hose-id", "38mm", "--hose-length", "12m", "--tank", "rectangular", "--tank-length", "8m",
		"--tank-width", "5m", "--tank-height", "1m"}
	start := append(append([]string{}, full...), "--level", "0.9m", "--lift", "1m", "--drop", "2m", "--inflow", "2.2L/s")
	d := drainOf(t, calcJSON(t, start...))
	if d["stop_reason"] != "settles" {
		t.Fatalf("2.2 L/s into the bund: stop %v, want settles", d["stop_reason"])
	}
	hs := num(t, d, "settle_level_m")
	stop := num(t, d, "stop_level_m")
	if !(stop > hs && stop-hs <= 0.0100001) {
		t.Errorf("stop %g m: want within 1 cm above the settle level %g m (contract)", stop, hs)
	}
	// The same hose, crest and outlet, with the water standing at hs.
	at := append(append([]string{}, full...), "--level", strconvFormat(hs)+"m",
		"--lift", strconvFormat(1.9-hs)+"m", "--drop", strconvFormat(hs+1.1)+"m")
	near(t, "steady flow at the settle level", num(t, calcJSON(t, at...), "flow_m3_s"), 2.2e-3, 1e-3, "equilibrium Q(h_s) = Q_in")
	t90 := num(t, d, "time_to_90pct_s")
	if tt := num(t, d, "time_s"); !(t90 > 0 && t90 < tt) {
		t.Errorf("time to 90 %% %g s, time %g s", t90, tt)
	}
}

func strconvFormat(v float64) string { return strconv.FormatFloat(v, 'f', 6, 64) }

// A pump to finish: t = V_left / (Q_pump − Q_in) (volume balance).
func TestCalcPumpFinish(t *testing.T) {
	d := drainOf(t, calcJSON(t, append(append([]string{}, bund...), "--pump-rate", "100L/min", "--rain", "10mm/h")...))
	left := num(t, d, "residual_m3")
	want := left / (100e-3/60 - 0.010/3600*40)
	near(t, "pump_finish_s", num(t, d, "pump_finish_s"), want, 1e-5, "volume balance")
	none := drainOf(t, calcJSON(t, bund...))
	if none["pump_finish_s"] != nil {
		t.Errorf("pump_finish_s %v without a pump rate, want null", none["pump_finish_s"])
	}
	behind := drainOf(t, calcJSON(t, append(append([]string{}, bund...), "--pump-rate", "10L/min", "--inflow", "20L/min")...))
	if behind["pump_finish_s"] != nil || behind["pump_falls_behind"] != true {
		t.Errorf("a 10 L/min pump against 20 L/min in: %v, %v", behind["pump_finish_s"], behind["pump_falls_behind"])
	}
}

// A flow test moves the plan to the flow measured and narrows the range.
func TestCalcMeasuredFlow(t *testing.T) {
	plain := calcJSON(t, bund...)
	q0 := num(t, plain, "flow_m3_s")
	measured := 0.9 * q0 // a test 10 % slower than planned
	litres := measured * 1000 * 12
	test := strconvFormat(litres) + "L/12s"
	m := calcJSON(t, append(append([]string{}, bund...), "--measured-flow", test, "--measured-flow", test)...)
	near(t, "flow after the test", num(t, m, "flow_m3_s"), measured, 2e-3, "the fit reproduces the measured flow at the start level")
	near(t, "planned_flow_m3_s", num(t, m, "planned_flow_m3_s"), q0, 1e-5, "the plan before the fit")
	w0 := num(t, drainOf(t, plain), "time_high_s") - num(t, drainOf(t, plain), "time_low_s")
	w1 := num(t, drainOf(t, m), "time_high_s") - num(t, drainOf(t, m), "time_low_s")
	if !(w1 < w0) {
		t.Errorf("time range %g s after two flow tests, %g s before: want narrower", w1, w0)
	}
	if num(t, m, "flow_tests") != 2 {
		t.Errorf("flow_tests %v", m["flow_tests"])
	}
	// A rate read off a meter is a flow test too.
	rate := calcJSON(t, append(append([]string{}, bund...), "--measured-flow", "20L/min")...)
	near(t, "20 L/min as a test", num(t, rate, "flow_m3_s"), 20e-3/60, 2e-3, "definition")
	// The band's main input is named.
	if drv := drainOf(t, plain)["range_driver"]; drv == "" || drv == nil {
		t.Errorf("range_driver %v", drv)
	}
}

// Bad inflow input: one line naming the flag and the range in the user's
// units; exit 2.
func TestCalcInflowBadInput(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--rain", "600mm/h"}, "--rain"},
		{[]string{"--rain", "10L/min"}, "--rain"},
		{[]string{"--catchment", "-5m2", "--rain", "5mm/h"}, "--catchment"},
		{[]string{"--bore-tolerance", "40%"}, "--bore-tolerance"},
		{[]string{"--measured-flow", "10L"}, "--measured-flow"},
		{[]string{"--measured-flow", "0L/12s"}, "--measured-flow"},
		{[]string{"--pump-rate", "fast"}, "--pump-rate"},
	} {
		_, stderr, code := runCmd(t, append(append([]string{"calc"}, bund...), c.args...)...)
		if code != ExitUsage || !strings.Contains(stderr, c.want) || strings.Count(strings.TrimSpace(stderr), "\n") > 0 {
			t.Errorf("%v: exit %d, %q; want exit 2 and one line naming %s", c.args, code, stderr, c.want)
		}
		if strings.Contains(stderr, "NaN") || strings.Contains(stderr, "Inf") {
			t.Errorf("%v: %q", c.args, stderr)
		}
	}
}
