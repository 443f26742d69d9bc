package calc

import "strconv"

// Warning is one warning with its stable code and a message in SI units for
// records and the JSON output. Screens word their own text from the code and
// the Result so that they can use the technician's unit system.
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
		return "crest is too high: at the crest the liquid would boil (limit " + m1(float64(r.FlowingCrestLimit)) +
			" m above the surface at this flow, " + m1(float64(r.MaxCrestHeight)) + " m at zero flow); the siphon will not run"
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
		if r.Verdict == WillNotRun && r.Why == WarnIntakeShallow {
			return "the intake is above the liquid surface: it draws air and the siphon will not run"
		}
		return "intake shallower than the " + m1(float64(r.RequiredSubmergence)) +
			" m needed against air-drawing vortices: lower the intake or cover it with a board"
	}
	return c.String()
}
