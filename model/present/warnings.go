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
			(r.Verdict == calc.RunsNearLimit && c == calc.WarnCrestNearLimit) ||
			(r.Verdict == calc.RunsChoked && c == calc.WarnChoked)
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
		l.Long = "the crest is too high: even at vanishing flow it would fall below its running limit (" + L(r.RunningCrestHeight) +
			" above the surface; the liquid boils at " + L(r.MaxCrestHeight) + "); the siphon will not run"
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
		l.Short = "air is drawn in at the intake: it gulps and slows"
		l.Long = "the surface is below where air starts (" + L(r.AirStartsLevel) + "): a vortex draws air in and the siphon gulps and slows (" +
			L(r.GulpHead) + " of head lost); a board or raft over the intake stops the vortex"
	case calc.WarnBoiling:
		l.Status = Bad
		l.Short = "the liquid boils at this site's pressure"
		l.Long = "the liquid boils at this site's barometric pressure: no siphon can run; let it cool"
	case calc.WarnPrimeLost:
		l.Status = Bad
		l.Short = "the intake has lost its prime"
		l.Long = "the surface is down to where the intake loses its prime (" + L(r.PrimeLostLevel) + "): its opening draws air and the siphon will not run"
	case calc.WarnAirDrawn:
		l.Status = Bad
		l.Short = "air drawn in would not be cleared"
		l.Long = "air drawn in at the intake would not be carried over the crest, or a vortex would draw a floating film in: the siphon will not run from this level"
	case calc.WarnChoked:
		l.Short = "runs choked: throttle at the outlet"
		l.Long = "the full-gravity flow would take the crest below its running limit: the siphon runs choked, the up-leg limits the flow; part-close a valve at the outlet (K " +
			strconv.FormatFloat(r.OutletThrottleK, 'f', 1, 64) + ") to hold it steadily"
	case calc.WarnHoseCollapse:
		l.Status = Bad
		l.Short = "the hose would flatten: use suction hose"
		l.Long = "the crest vacuum (" + Vacuum(r.CrestVacuum, f.Sys) + ") is more than the hose is rated for (" + Vacuum(r.HoseVacuumRating, f.Sys) +
			"): it would collapse; use suction hose"
	case calc.WarnHoseVacuum:
		l.Short = "blocked or vacuum-primed, the hose may flatten"
		l.Long = "with the intake blocked or while vacuum priming the hose sees " + Vacuum(r.HoseVacuumWorst, f.Sys) + " of vacuum, more than its rating of " +
			Vacuum(r.HoseVacuumRating, f.Sys)
	case calc.WarnHoseNotRated:
		l.Status = Info
		l.Short = "hose vacuum rating unknown: check it"
		l.Long = "the hose sees up to " + Vacuum(r.HoseVacuumWorst, f.Sys) + " of vacuum and has no known rating: check it will not flatten"
	case calc.WarnThrottleOutlet:
		l.Status = Info
		l.Short = "throttle at the outlet only"
		l.Long = "throttle at the outlet only: a valve at the intake or on the up-leg lowers the crest pressure"
	default:
		l.Short, l.Long = c.String(), c.String()
	}
	return l
}
