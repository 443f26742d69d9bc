package present

// The forecast in words: liquid coming in, whether the siphon keeps up, the
// slow tail, the likely range and what drives it, the flow tests and a pump
// to finish.

import (
	"strconv"
	"strings"

	"drawdown/calc"
	"drawdown/model"
)

// Forecast is the part of the drain plan that looks ahead, worded. Every
// field is "" when it does not apply.
type Forecast struct {
	// Inflow is what comes in and from where ("6.67 L/min: rain 10 mm/h on
	// 40.0 m²"); InflowShort the flow alone ("6.67 L/min in").
	Inflow, InflowShort string
	// KeepsUp says whether the siphon outruns the inflow down to its stop;
	// Settles, when it does not, where the level settles (short, for the
	// screen: "settles at 0.21 m").
	KeepsUp, Settles string
	// SettlesAt is the settle level alone ("0.21 m").
	SettlesAt string
	// Time90 is the time to move 90 % of the volume the plan moves.
	Time90 string
	// Finish is the likely range of the level the drain ends at ("" when
	// it does not move between the cases).
	Finish string
	// Driver names the input that moves the time most ("the hose's inside
	// roughness"); Narrow says what would narrow the range.
	Driver, Narrow string
	// Pump is the finishing pump's time, or that it cannot keep up.
	Pump string
	// Higher says that some cases of the range stop well above the level
	// the time is for, and where ("" when none does).
	Higher string
}

// driverWords names a band input as the trade says it.
func driverWords(i calc.BandInput) string {
	switch i {
	case calc.InputRoughness:
		return "the hose's inside roughness"
	case calc.InputFittings:
		return "the losses in the fittings and the intake"
	case calc.InputBore:
		return "the hose's real bore"
	case calc.InputHeights:
		return "the measured heights (lift and drop)"
	case calc.InputFlowTest:
		return "the flow tests' own scatter"
	case calc.BandInputs:
	}
	return i.String()
}

// narrowWords says what would narrow a range that input i drives.
func narrowWords(i calc.BandInput) string {
	switch i {
	case calc.InputRoughness, calc.InputFittings, calc.InputBore:
		return "a one-minute bucket test at the outlet (a few repeats, each fill at least a few seconds) would narrow it"
	case calc.InputHeights:
		return "measuring the lift and the drop again, to the centimetre, would narrow it"
	case calc.InputFlowTest:
		return "more bucket tests, with a bigger container, would narrow it"
	case calc.BandInputs:
	}
	return ""
}

// RangeDriver is the band's main input as JSON's drain.range_driver gives
// it: its stable code ("roughness", "fittings", "bore", "heights",
// "flow_test"), "" without a band.
func RangeDriver(p model.Plan) string {
	if p.Band == nil || !p.Band.Effects[p.Band.Driver].Used {
		return ""
	}
	return p.Band.Driver.String()
}

// forecastOf words p's forecast (p has a drain).
func forecastOf(p model.Plan, f Figures) Forecast {
	var out Forecast
	d := p.Drain
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	if in := p.Inflow; in.Total > 0 {
		out.InflowShort = f.Of(model.DimFlow, float64(in.Total)) + " in"
		out.Inflow = f.Of(model.DimFlow, float64(in.Total)) + ": " + strings.Join(inflowParts(in, f), ", ")
		switch {
		case d.Overflows:
			out.KeepsUp = "the inflow outruns the siphon: the level rises to the brim (" + L(d.SettleLevel) + ") and spills over in " + Duration(float64(d.Time))
			out.Settles, out.SettlesAt = "rises to the brim", L(d.SettleLevel)
		case d.SettleFound && d.Rises:
			out.KeepsUp = "the inflow outruns the siphon at the start: the level rises and settles at " + L(d.SettleLevel) + " above the floor"
			out.Settles, out.SettlesAt = "rises, settles at "+L(d.SettleLevel), L(d.SettleLevel)
		case d.SettleFound:
			out.KeepsUp = "the siphon cannot keep up below " + L(d.SettleLevel) + ": the level settles there, where its flow falls to the inflow"
			out.Settles, out.SettlesAt = "settles at "+L(d.SettleLevel), L(d.SettleLevel)
		default:
			out.KeepsUp = "the siphon keeps up: its flow stays above the inflow down to the stop"
		}
	}
	if d.Time90 > 0 && d.Time-d.Time90 > 60 {
		out.Time90 = Duration(float64(d.Time90))
	}
	if b := p.Band; b != nil {
		if b.Unreached {
			out.Higher = "at the slow end it stops higher, at " + L(b.UnreachedLevel) + ": the range's short times are to that level"
		}
		if b.FinishHigh-b.FinishLow >= 0.005 {
			out.Finish = Range(L(b.FinishLow), L(b.FinishHigh))
		}
		if RangeDriver(p) != "" && b.TimeHigh-b.TimeLow > 1 {
			out.Driver = "mostly " + driverWords(b.Driver)
			out.Narrow = narrowWords(b.Driver)
			if b.Driver == calc.InputFlowTest || len(p.Tests) > 0 && b.Driver != calc.InputHeights {
				out.Narrow = "more bucket tests, with a bigger container, would narrow it"
			}
		}
	}
	switch {
	case p.PumpFallsBehind:
		out.Pump = "a pump at " + f.Of(model.DimFlow, float64(p.PumpRate)) + " cannot keep up with the inflow of " + f.Of(model.DimFlow, float64(p.Inflow.Total))
	case p.PumpFinish > 0:
		out.Pump = "a pump at " + f.Of(model.DimFlow, float64(p.PumpRate)) + " lifts the " + f.Of(model.DimVolume, float64(d.Residual)) +
			" left in " + Duration(float64(p.PumpFinish))
		if p.Inflow.Total > 0 {
			out.Pump += ", against the inflow"
		}
	}
	return out
}

// inflowParts lists where the inflow comes from.
func inflowParts(in model.Inflow, f Figures) []string {
	var parts []string
	if in.Rain > 0 {
		on := "on " + f.Of(model.DimArea, in.Catchment)
		if in.CatchmentIsTank {
			on = "on the tank's " + f.Of(model.DimArea, in.Catchment)
		}
		parts = append(parts, "rain "+f.Of(model.DimRate, in.RainRate)+" "+on)
	}
	if in.Rise > 0 {
		parts = append(parts, "rise "+f.Of(model.DimRate, in.RiseRate)+" with the siphon stopped")
	}
	if in.Seepage > 0 {
		parts = append(parts, "seepage "+f.Of(model.DimFlow, float64(in.Seepage)))
	}
	return parts
}

// TestLine compares the flow tests with the plan: what they measured, what
// the fittings gave, and that the plan now runs on the tests ("" without
// tests). Warn is set when the tests are faster or slower than any loss
// can explain: the heights or the bore typed are then suspect.
func TestLine(p model.Plan, f Figures) Line {
	if p.TestFit == nil || len(p.Tests) == 0 {
		return Line{}
	}
	fit := p.TestFit
	var sum float64
	for _, t := range p.Tests {
		sum += float64(t.Flow)
	}
	n := len(p.Tests)
	mean := f.Of(model.DimFlow, sum/float64(n))
	tests := "flow test"
	if n > 1 {
		tests = strconv.Itoa(n) + " flow tests"
	}
	planned := f.Of(model.DimFlow, float64(p.PlannedFlow)/float64(max(p.Siphon.Hoses, 1)))
	per := ""
	if p.Siphon.Hoses > 1 {
		per = " per hose"
	}
	short := tests + ": " + mean + per + ", planned " + planned
	long := short + "; the plan is fitted to the tests"
	st := Info
	switch {
	case fit.Faster:
		st = Warn
		short += "; " + FitFaster
		long += ", but they run faster than any hose could with these heights: " + FitFaster
	case fit.Slower:
		st = Warn
		short += "; far slower: check for air at the crest or a blocked intake"
		long += ", but they run slower than any loss explains: check for air at the crest, a blocked intake or a kinked hose"
	case fit.ExtraK > 0.05:
		long += " (extra loss ΣK +" + strconv.FormatFloat(fit.ExtraK, 'f', 2, 64) + ")"
	case fit.ExtraK < -0.05:
		long += " (loss ΣK " + Minus + strconv.FormatFloat(-fit.ExtraK, 'f', 2, 64) + ")"
	}
	return Line{Status: st, Short: short, Long: long}
}

// inflowHint is the warning when the inflow beats the siphon: the tank
// fills and spills, or the level settles above where the siphon would
// stop. More hoses or a bigger bore move more; a pump can take the rest.
func inflowHint(p model.Plan, f Figures) (Line, bool) {
	d := p.Drain
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	in := f.Of(model.DimFlow, float64(p.Inflow.Total))
	switch {
	case d.Overflows:
		return Line{Code: "inflow_spills", Status: Warn,
			Short: "inflow " + in + " outruns the siphon: it spills over in " + Duration(float64(d.Time)),
			Long: "the inflow (" + in + ") is more than the siphon moves: the level rises and the tank spills over its brim in " +
				Duration(float64(d.Time)) + "; add hoses in parallel, a bigger bore or a pump, or divert the inflow"}, true
	case d.SettleFound:
		return Line{Code: "inflow_settles", Status: Warn,
			Short: "inflow " + in + ": the level settles at " + L(d.SettleLevel),
			Long: "the inflow (" + in + ") matches the siphon's flow at " + L(d.SettleLevel) + " above the floor: the level settles there " +
				"and goes no lower; add hoses in parallel, a bigger bore or a pump to get below it"}, true
	}
	return Line{}, false
}
