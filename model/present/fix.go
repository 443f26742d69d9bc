package present

import (
	"strconv"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/presets"
)

// FixOf words what to change when a siphon does not simply run: the change
// calc names first, with its figure in the technician's units (lower the
// crest below X; let it cool to T; throttle the outlet to Q; use a suction
// hose rated for V; pump). "" when the verdict is RUNS. The liquid turns a
// vapour pressure into the temperature to cool to.
func FixOf(r calc.Result, liq presets.Liquid, f Figures) string {
	x := r.Fix
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	switch x.Code {
	case calc.FixNone:
		return ""
	case calc.FixLowerCrest:
		if x.HasCrestHeight {
			return "lower the crest to " + L(x.CrestHeight) + " above the surface or less"
		}
		return "lower the crest to " + L(x.CrestHeightThrottled) + " above the surface or less, with a valve part-closed at the outlet"
	case calc.FixCool:
		if x.HasMaxVaporPressure {
			if t, ok := liq.VaporTemperature(x.MaxVaporPressure); ok {
				return "let the liquid cool to " + f.Of(model.DimTemperature, float64(t)) + " or below, or lower the crest"
			}
		}
		return "let the liquid cool, or pump it"
	case calc.FixThrottle:
		lower := ""
		if r.Verdict == calc.RunsChoked && x.HasCrestHeight {
			lower = ", or lower the crest to " + L(x.CrestHeight) + " above the surface"
		}
		if x.HasThrottle {
			return "part-close a valve at the outlet to about " + f.Of(model.DimFlow, float64(x.ThrottleFlow)) +
				" (outlet K " + strconv.FormatFloat(x.ThrottleK, 'f', 1, 64) + ")" + lower + "; never throttle at the intake or the up-leg"
		}
		return "part-close a valve at the outlet; never throttle at the intake or the up-leg"
	case calc.FixSuctionHose:
		return "use suction hose rated for at least " + Vacuum(x.MinVacuumRating, f.Sys) + " of vacuum"
	case calc.FixPump:
		if r.Why == calc.WarnNoDrop {
			return "put the outlet below the source surface, or pump"
		}
		return "no siphon can do this: use a pump"
	case calc.FixLowerIntake:
		return "lower the intake or use a low-level suction plate"
	case calc.FixCoverIntake:
		return "float a board or raft over the intake, so that no vortex draws a floating film in"
	default:
	}
	return ""
}

// Vacuum words a gauge vacuum as hoses are rated: kPa and inHg (or inHg
// alone in US units). 1 inHg = 3386.389 Pa (NIST SP 811).
func Vacuum(pa calc.Pressure, sys model.System) string {
	inHg := strconv.FormatFloat(float64(pa)/3386.389, 'f', 1, 64) + " inHg"
	if sys == model.US {
		return inHg
	}
	return strconv.FormatFloat(float64(pa)/1000, 'f', 0, 64) + " kPa (" + inHg + ")"
}
