package present

import (
	"strconv"

	"drawdown/calc"
	"drawdown/model"
)

// Warning is one warning of a plan, worded for people.
type Warning struct {
	Line
	// Decides is set for the warning the verdict line already states (the
	// deciding code of a WILL NOT RUN, the crest of a NEAR LIMIT): a screen
	// that shows the verdict leaves it out of its list.
	Decides bool
}

// WarningsOf words the warnings of a steady result in code order, in the
// unit system of f. Code is calc.WarnCode's stable string (the JSON code).
func WarningsOf(r calc.Result, f Figures) []Warning {
	var out []Warning
	for _, c := range r.Warnings.Codes() {
		w := Warning{Line: warningLine(r, c, f)}
		w.Decides = (r.Verdict == calc.WillNotRun && c == r.Why) ||
			(r.Verdict == calc.RunsNearLimit && c == calc.WarnCrestNearLimit)
		out = append(out, w)
	}
	return out
}

func warningLine(r calc.Result, c calc.WarnCode, f Figures) Line {
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	V := func(v calc.Velocity) string { return f.Of(model.DimVelocity, float64(v)) }
	re := strconv.FormatFloat(r.Reynolds, 'f', 0, 64)
	l := Line{Code: c.String(), Status: Warn}
	switch c {
	case calc.WarnLaminar:
		l.Status = Info
		l.Short = "laminar flow: thick liquid or small hose"
		l.Long = "laminar flow (Re " + re + "): a viscous liquid or a small hose; the flow is much lower than for water"
	case calc.WarnTransitional:
		l.Short = "flow between laminar and turbulent: figures uncertain"
		l.Long = "transitional flow (Re " + re + ", between 2000 and 4000): friction is uncertain; expect the flow range to be wide"
	case calc.WarnCrestNearLimit:
		l.Short = "crest above the working limit"
		l.Long = "the crest is " + L(-r.CrestMargin) + " above the working limit of " + L(r.WorkingCrestHeight) +
			": dissolved gas will gather at the crest; lower the crest or expect to re-prime"
	case calc.WarnCannotRun:
		l.Status = Bad
		l.Short = "crest too high: the liquid boils there"
		l.Long = "the crest is too high: the liquid would boil there (limit " + L(r.FlowingCrestLimit) +
			" above the surface at this flow, " + L(r.MaxCrestHeight) + " at zero flow); the siphon will not run"
	case calc.WarnNoDrop:
		l.Status = Bad
		l.Short = "outlet not below the surface"
		l.Long = "the outlet is not below the source surface (head " + L(r.Head) + "): the siphon will not run"
	case calc.WarnAirCollects:
		l.Short = "air gathers at the crest (flow too slow to carry it down): it will slowly break"
		l.Long = "the down-leg velocity " + V(r.Velocity) + " is below the " + V(r.AirClearingVelocity) +
			" needed to carry air down: air will collect at the crest and slowly break the siphon"
	case calc.WarnNearBoiling:
		l.Short = "liquid near boiling: little lift possible"
		l.Long = "the liquid's vapour pressure is more than half the barometric pressure: it is close to boiling and the usable lift is small"
	case calc.WarnHoseShort:
		l.Short = "hose shorter than the route: check length and heights"
		l.Long = "the hose is shorter than the straight route from the intake over the crest to the outlet: check the hose length and the heights"
	case calc.WarnIntakeShallow:
		if r.Verdict == calc.WillNotRun && r.Why == calc.WarnIntakeShallow {
			l.Status = Bad
			l.Short = "intake above the surface"
			l.Long = "the intake is above the liquid surface: it draws air and the siphon will not run"
			break
		}
		l.Short = "intake too shallow: a vortex will draw air"
		l.Long = "the intake is shallower than the " + L(r.RequiredSubmergence) +
			" needed against air-drawing vortices: lower the intake or cover it with a board"
	default:
		l.Short, l.Long = c.String(), c.String()
	}
	return l
}
