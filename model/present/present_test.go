package present

import (
	"strings"
	"testing"
	"time"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/presets"
)

// Every warning code calc can raise is worded, short and long, in both unit
// systems, with no NaN, Inf or raw code in the words.
func TestWarningWords(t *testing.T) {
	r := calc.Result{Verdict: calc.Runs, Reynolds: 3000, Velocity: 0.4, AirClearingVelocity: 0.6,
		Head: 1.5, CrestMargin: -0.3, WorkingCrestHeight: 6.4, FlowingCrestLimit: 9.8, MaxCrestHeight: 10.1,
		RequiredSubmergence: 0.12}
	for c := calc.WarnCode(1); c.String() != "unknown"; c++ {
		r.Warnings.Add(c)
	}
	for _, sys := range []model.System{model.SI, model.US} {
		ws := WarningsOf(r, Figures{Sys: sys})
		if len(ws) != len(r.Warnings.Codes()) {
			t.Fatalf("%v: %d warnings worded of %d", sys, len(ws), len(r.Warnings.Codes()))
		}
		for _, w := range ws {
			for _, text := range []string{w.Short, w.Long} {
				if text == "" || text == w.Code || strings.Contains(text, "NaN") || strings.Contains(text, "Inf") {
					t.Errorf("%v %s: %q", sys, w.Code, text)
				}
			}
		}
	}
}

// Every fix calc can name is worded with its figure in both unit systems
// and with no NaN or Inf; RUNS has none.
func TestFixWords(t *testing.T) {
	water, _ := presets.Builtin().Liquid("water")
	x := calc.Fix{CrestHeight: 3.36, HasCrestHeight: true, CrestHeightThrottled: 6.7, MaxVaporPressure: 37e3, HasMaxVaporPressure: true,
		ThrottleFlow: 1.19e-3, ThrottleK: 12.3, HasThrottle: true, MinVacuumRating: 34e3}
	for c := calc.FixCode(1); c.String() != "unknown"; c++ {
		x.Code = c
		r := calc.Result{Verdict: calc.WillNotRun, Fix: x}
		for _, sys := range []model.System{model.SI, model.US} {
			w := FixOf(r, water, Figures{Sys: sys})
			if w == "" || strings.Contains(w, "NaN") || strings.Contains(w, "Inf") || w == c.String() {
				t.Errorf("%v %v: %q", sys, c, w)
			}
		}
	}
	if w := FixOf(calc.Result{Verdict: calc.Runs}, water, Figures{}); w != "" {
		t.Errorf("runs: fix %q", w)
	}
}

// Every stop reason has its words, and none is the bare JSON code.
func TestStopWords(t *testing.T) {
	for _, r := range []calc.StopReason{calc.StopTarget, calc.StopIntake, calc.StopAir, calc.StopCrest, calc.StopEqual, calc.StopReceiverFull, ""} {
		if s, l := StopShort(r), StopLong(r); s == "" || l == "" || (r != "" && (s == string(r) || l == string(r))) {
			t.Errorf("%q: short %q, long %q", r, s, l)
		}
	}
}

func TestDuration(t *testing.T) {
	for _, tc := range []struct {
		s    float64
		want string
	}{{0, "0 s"}, {45, "45 s"}, {600, "10 min"}, {7800, "2 h 10 min"}, {7200, "2 h"}, {3 * 86400, "3 d"}, {-1, "—"}, {2e9, "more than 30 years"}} {
		if got := Duration(tc.s); got != tc.want {
			t.Errorf("Duration(%g) = %q, want %q", tc.s, got, tc.want)
		}
	}
}

// One minus sign for people: negative figures carry U+2212; Signed gives
// the plus sign to a positive margin and none to zero.
func TestFiguresMinus(t *testing.T) {
	f := Figures{Sys: model.SI}
	if got := f.Of(model.DimLength, -1.81); got != "−1.81 m" {
		t.Errorf("Of(−1.81 m) = %q", got)
	}
	if got := f.Signed(model.DimLength, 0.3); got != "+0.30 m" {
		t.Errorf("Signed(0.3 m) = %q", got)
	}
	if got := f.Signed(model.DimLength, 0); got != "0.00 m" {
		t.Errorf("Signed(0) = %q", got)
	}
	if got := Range("60.4 L/min", "100 L/min"); got != "60.4–100 L/min" {
		t.Errorf("Range = %q", got)
	}
}

// The one crest status against the verdict, over lifts from 0 to past the
// theoretical limit for water at 10 °C at sea level ((p_atm − p_v)/(ρg)
// ≈ 10.2 m): Bad exactly when the siphon will not run for its crest, Warn
// exactly when it runs near the limit or choked, OK otherwise. This is the rule the
// Result pane and the side view both show (they used to decide it twice).
func TestCrestStatusFollowsVerdict(t *testing.T) {
	cat := presets.Builtin()
	for lift := 0.0; lift <= 11; lift += 0.25 {
		j := model.NewJob("crest", model.SI, time.Time{})
		j.Inputs = map[model.FieldID]string{model.FieldHoseID: "25 mm", model.FieldHoseLength: "20 m",
			model.FieldLift: model.Format(model.DimLength, lift, model.SI), model.FieldDrop: "3 m", model.FieldTemp: "10 °C"}
		p := model.Compute(j, cat)
		if !p.OK() {
			t.Fatalf("lift %g: %v", lift, p.Err)
		}
		s := Build(p, model.SI, p.Hazards)
		r := p.Result
		want := OK
		switch {
		case r.Verdict == calc.WillNotRun && r.Why == calc.WarnCannotRun:
			want = Bad
		case r.Verdict == calc.RunsNearLimit, r.Verdict == calc.RunsChoked:
			want = Warn
		}
		if s.Crest.Status != want {
			t.Errorf("lift %g m: verdict %v, crest status %v, want %v", lift, r.Verdict, s.Crest.Status, want)
		}
		if s.Verdict.Code != r.Verdict || s.Verdict.Word == "" {
			t.Errorf("lift %g m: verdict %+v", lift, s.Verdict)
		}
	}
}

// The forecast in words on the demo bund: dry, in light rain (keeps up),
// with seepage the siphon cannot match (settles), and in a downpour on a
// wide catchment (spills). The words name the case and carry no NaN.
func TestForecastWords(t *testing.T) {
	cat := presets.Builtin()
	for _, c := range []struct {
		name   string
		inputs map[model.FieldID]string
		hint   string
		keeps  string
	}{
		{"dry", nil, "", ""},
		{"light rain", map[model.FieldID]string{model.FieldRain: "5 mm/h"}, "", "keeps up"},
		{"seepage", map[model.FieldID]string{model.FieldSeepage: "78 L/min"}, "inflow_settles", "cannot keep up"},
		{"downpour", map[model.FieldID]string{model.FieldRain: "25 mm/h", model.FieldCatchment: "400 m2"}, "inflow_spills", "outruns"},
		{"pump", map[model.FieldID]string{model.FieldPumpRate: "200 L/min"}, "", ""},
	} {
		j := model.DemoJob()
		for id, v := range c.inputs {
			j.Inputs[id] = v
		}
		p := model.Compute(j, cat)
		s := Build(p, model.SI, p.Hazards)
		if s.Drain == nil {
			t.Fatalf("%s: no drain: %v", c.name, p.Err)
		}
		fc := s.Drain.Forecast
		if !strings.Contains(fc.KeepsUp, c.keeps) || (c.keeps == "") != (fc.KeepsUp == "") {
			t.Errorf("%s: keeps-up line %q, want %q", c.name, fc.KeepsUp, c.keeps)
		}
		var got string
		for _, h := range s.Hints {
			if strings.HasPrefix(h.Code, "inflow_") {
				got = h.Code
			}
		}
		if got != c.hint {
			t.Errorf("%s: hint %q, want %q", c.name, got, c.hint)
		}
		if c.name == "pump" && !strings.Contains(fc.Pump, "200 L/min") {
			t.Errorf("pump line %q", fc.Pump)
		}
		for _, text := range []string{fc.Inflow, fc.KeepsUp, fc.Settles, fc.Time90, fc.Finish, fc.Driver, fc.Narrow, fc.Pump} {
			if strings.Contains(text, "NaN") || strings.Contains(text, "Inf") {
				t.Errorf("%s: %q", c.name, text)
			}
		}
	}
}
