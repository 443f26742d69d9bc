package calc

import "strconv"

// Warning is one warning with its stable code and a message in SI units for
// records and the JSON output. Screens word their own text from the code and
// the Result so that they can use the technician's unit system. (These
// sentences sit next to the decisions; the presentation layer may move
// them.)
type Warning struct {
	Code    WarnCode
	Message string
}

// WarningList returns r's warnings in code order with SI messages. It
// allocates; call it when formatting, not in the solver's hot path.
func (r Result) WarningList() []Warning {
	var out []Warning
	for _, c := range r.Warnings.Codes() {
		out = append(out, Warning{Code: c, Message: r.message(c)})
	}
	return out
}

func m1(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

// kPa formats a gauge pressure in kPa.
func kPa(v float64) string { return strconv.FormatFloat(v/1000, 'f', 1, 64) + " kPa" }

func (r Result) message(c WarnCode) string {
	switch c {
	case WarnLaminar:
		return "laminar flow (Re " + strconv.FormatFloat(r.Reynolds, 'f', 0, 64) + "): a viscous liquid or small hose; flow is much lower than for water"
	case WarnTransitional:
		return "transitional flow (Re " + strconv.FormatFloat(r.Reynolds, 'f', 0, 64) + " between 2000 and 4000): friction is uncertain, expect the flow band to be wide"
	case WarnCrestNearLimit:
		return "crest is " + m1(-float64(r.CrestMargin)) + " m above the working limit of " + m1(float64(r.WorkingCrestHeight)) +
			" m: dissolved gas will gather at the crest; lower the crest or expect to re-prime"
	case WarnCannotRun:
		return "crest is too high: even at vanishing flow the crest would fall below its running limit (" + m1(float64(r.RunningCrestHeight)) +
			" m above the surface; the liquid boils at " + m1(float64(r.MaxCrestHeight)) + " m); the siphon will not run"
	case WarnNoDrop:
		return "the outlet is not below the source surface (head " + m1(float64(r.Head)) + " m): the siphon will not run"
	case WarnAirCollects:
		return "down-leg velocity " + m1(float64(r.Velocity)) + " m/s is below the " + m1(float64(r.AirClearingVelocity)) +
			" m/s needed to carry air down: air will collect at the crest and slowly break the siphon"
	case WarnNearBoiling:
		return "the liquid's vapour pressure is more than half the barometric pressure: it is close to boiling and the usable lift is small"
	case WarnHoseShort:
		return "the hose is shorter than the straight route from intake over the crest to the outlet: check the hose length and heights"
	case WarnIntakeShallow:
		return "the surface is below where air starts (" + m1(float64(r.AirStartsLevel)) + " m): a vortex draws air in and the siphon gulps and slows (head lost " +
			m1(float64(r.GulpHead)) + " m); a board or raft over the intake stops the vortex"
	case WarnBoiling:
		return "the liquid boils at this site's barometric pressure: no siphon can run; let it cool"
	case WarnPrimeLost:
		return "the surface is down to where the intake loses its prime (" + m1(float64(r.PrimeLostLevel)) + " m): its opening draws air and the siphon will not run"
	case WarnAirDrawn:
		return "air drawn in at the intake would not be carried over the crest (or a vortex would draw a floating film in): the siphon will not run from this level"
	case WarnChoked:
		return "the full-gravity flow would take the crest below its running limit: the siphon runs choked, the up-leg limits the flow; part-close a valve at the outlet (K " +
			strconv.FormatFloat(r.OutletThrottleK, 'f', 1, 64) + ") to hold it steadily"
	case WarnHoseCollapse:
		return "the crest vacuum (" + kPa(float64(r.CrestVacuum)) + ") is more than the hose is rated for (" + kPa(float64(r.HoseVacuumRating)) +
			"): it would collapse; use suction hose"
	case WarnHoseVacuum:
		return "with the intake blocked or while vacuum priming the hose sees " + kPa(float64(r.HoseVacuumWorst)) + " of vacuum, more than its rating of " +
			kPa(float64(r.HoseVacuumRating))
	case WarnHoseNotRated:
		return "the hose sees up to " + kPa(float64(r.HoseVacuumWorst)) + " of vacuum and has no known rating: check it will not flatten"
	case WarnThrottleOutlet:
		return "throttle at the outlet only: a valve at the intake or on the up-leg lowers the crest pressure"
	}
	return c.String()
}
