package present

import (
	"math"
	"strconv"
	"strings"
	"time"

	"drawdown/calc"
	"drawdown/model"
)

// Readings and flow tests in words: every line about them the Log pane,
// the record and the command line show is made here.

// LevelTo writes a level (m) in sys's length unit with as many decimals as
// a resolution res (m) needs, so a level typed "0.333" shows "0.333 m", not
// "0.33 m". A resolution of 0 (not known) or coarser than Format's rounding
// gives Format's own figure.
func LevelTo(si, res float64, sys model.System) string {
	name := model.DefaultUnit(model.DimLength, sys)
	scale := 1.0
	if name == "ft" {
		scale = 0.3048 // m per ft, exact (NIST SP 811)
	}
	dec := 2 // Format's centimetre in SI
	if name == "ft" {
		dec = -1 // feet and inches: Format's
		if res > 0 && res < 0.00635 {
			dec = 1 // finer than Format's quarter inch: decimal feet
		}
	}
	if res > 0 && !math.IsInf(res, 0) {
		if d := int(math.Ceil(-math.Log10(res/scale) - 1e-9)); d > dec {
			dec = min(d, 5)
		}
	}
	if dec < 0 || (name == "m" && dec <= 2) || math.IsNaN(si) || math.IsInf(si, 0) {
		return Figures{Sys: sys}.Of(model.DimLength, si)
	}
	return typographic(strconv.FormatFloat(si/scale, 'f', dec, 64) + " " + name)
}

// ReadingLevel is a reading's level to the precision it was typed; one
// whose resolution is not known (an older file) shows to the millimetre
// (SI) or the hundredth of a foot (US), so readings a few millimetres apart
// stay distinct.
func ReadingLevel(r model.Reading, sys model.System) string {
	res := r.Resolution
	if !(res > 0) {
		res = 0.001
		if sys == model.US {
			res = 0.003048
		}
	}
	return LevelTo(r.Level, res, sys)
}

// FallRate writes a rate of fall (m/s, positive falling) as a technician
// reads it off a rod: mm/min (SI) or in/min (US), three figures at most.
func FallRate(ms float64, sys model.System) string {
	if math.IsNaN(ms) || math.IsInf(ms, 0) {
		return "—"
	}
	v, u := ms*60e3, "mm/min"
	if sys == model.US {
		v, u = ms*60/0.0254, "in/min"
	}
	dec := 1
	switch a := math.Abs(v); {
	case a >= 100:
		dec = 0
	case a < 1:
		dec = 2
	}
	return typographic(strconv.FormatFloat(v, 'f', dec, 64) + " " + u)
}

// FlowTestLine is one flow test: "10 L in 12 s: 50 L/min at 0.310 m".
func FlowTestLine(t model.FlowTest, sys model.System) string {
	f := Figures{Sys: sys}
	s := f.Of(model.DimVolume, t.Volume) + " in " + strconv.FormatFloat(t.Seconds, 'f', -1, 64) + " s: " +
		f.Of(model.DimFlow, t.Flow())
	if t.Level > 0 {
		s += " at " + LevelTo(t.Level, 0.001, sys)
	}
	if n := strings.TrimSpace(t.Note); n != "" {
		s += " (" + n + ")"
	}
	return s
}

// FitLine is one line about the fit; Warn marks one to act on.
type FitLine struct {
	Text string
	Warn bool
}

// Fit messages, as the screen and the record show them.
const (
	// FitFaster: the readings (or flow tests) run faster than the plan
	// allows even with no extra loss — the heights typed are suspect, not
	// the hose.
	FitFaster = "faster than planned: check the drop and the level"
	// FitFarSlower: the level barely falls at all.
	FitFarSlower = "draining far slower than planned: check for air at the crest, a blocked intake or a stopped siphon"
	// FitSlowing: the rate falls faster than the plan's own slowdown.
	FitSlowing = "SLOWING faster than planned: check for air at the crest or a clogging intake"
)

// FitWords says how FitSummary words a fit: the unit system, how a clock
// time is written (the screen: "15:04" in its zone; the record: date, time
// and zone), and whether stop reasons are given in full (the record).
type FitWords struct {
	Sys   model.System
	Clock func(time.Time) string
	Long  bool
}

// FitSummary words the fit of the readings and flow tests against the plan:
// what the observations say, the inflow, the slowing flag and the
// re-predicted finish.
func FitSummary(f *model.Fit, err error, w FitWords) []FitLine {
	if err != nil {
		return []FitLine{{Text: "Against the plan: " + err.Error()}}
	}
	if f == nil {
		return nil
	}
	sys, clock := w.Sys, w.Clock
	if clock == nil {
		clock = func(t time.Time) string { return t.Format("15:04") }
	}
	stop := StopShort
	if w.Long {
		stop = StopLong
	}
	fig := Figures{Sys: sys}
	var out []FitLine
	k := "fitted extra loss ΔK " + strconv.FormatFloat(f.ExtraK, 'f', 2, 64)
	switch {
	case f.AtKMax:
		out = append(out, FitLine{Text: FitFarSlower, Warn: true})
	case f.Faster:
		why := ""
		switch {
		case f.FallRatio > 1:
			why = " (the level falls at " + pct(f.FallRatio) + " of the plan's rate with no extra loss)"
		case f.FlowRatio > 1:
			why = " (the bucket tests run at " + pct(f.FlowRatio) + " of the planned flow)"
		}
		out = append(out, FitLine{Text: FitFaster + why, Warn: true})
	case f.FallRatio > 0:
		out = append(out, FitLine{Text: "level falling at " + pct(f.FallRatio) + " of plan; " + k})
	case f.FlowRatio > 0:
		out = append(out, FitLine{Text: "bucket tests at " + pct(f.FlowRatio) + " of the planned flow; " + k})
	default:
		out = append(out, FitLine{Text: k})
	}
	switch {
	case f.InflowFitted && f.Inflow < 1e-9:
		out = append(out, FitLine{Text: "no inflow found (readings and flow tests together)"})
	case f.InflowFitted:
		out = append(out, FitLine{Text: "inflow fitted from the readings and flow tests together: " + fig.Of(model.DimFlow, f.Inflow)})
	case f.Inflow > 0:
		out = append(out, FitLine{Text: "inflow as planned: " + fig.Of(model.DimFlow, f.Inflow) + " (a flow test would let the fit tell it from extra loss)"})
	}
	if f.Slowing {
		s := FitSlowing + ". Now " + FallRate(f.LateRate, sys) + ", " + pct(f.LateRate/f.EarlyRate) +
			" of the earlier " + FallRate(f.EarlyRate, sys) + " (the plan's own: " + pct(f.PlanRatio) + ")"
		if f.LateFitted {
			s += "; loss now ΔK " + strconv.FormatFloat(f.LateK, 'f', 2, 64)
		}
		out = append(out, FitLine{Text: s, Warn: true})
	}
	switch {
	case f.Finish.IsZero():
		out = append(out, FitLine{Text: "take a level reading to re-predict the finish"})
	case f.Stopped:
		out = append(out, FitLine{Text: "at its stop: " + LevelTo(f.StopLevel, 0.001, sys) + " (" +
			stop(calc.StopReason(f.Stop)) + "), reached about " + clock(f.Finish)})
	default:
		from := "re-predicted"
		if f.Slowing && f.LateFitted {
			from = "re-predicted with the loss now"
		}
		out = append(out, FitLine{Text: from + " from the last reading: stop about " + clock(f.Finish) + " at " +
			LevelTo(f.StopLevel, 0.001, sys) + " (" + stop(calc.StopReason(f.Stop)) + ")"})
	}
	return out
}

func pct(r float64) string {
	if math.IsNaN(r) || math.IsInf(r, 0) {
		return "—"
	}
	return strconv.Itoa(int(math.Round(100*r))) + " %"
}
