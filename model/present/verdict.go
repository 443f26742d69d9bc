package present

import "drawdown/calc"

// Verdict is the first answer a technician reads.
type Verdict struct {
	Code   calc.Verdict
	Word   string // "RUNS", "RUNS — NEAR LIMIT", "WILL NOT RUN"
	Status Status
	// Reason is the short why beside a verdict other than RUNS ("" when it
	// simply runs).
	Reason string
}

// Line is the verdict and its reason on one line, for the command line and
// the record ("RUNS — CHOKED: the up-leg limits the flow: …").
func (v Verdict) Line() string {
	if v.Reason == "" {
		return v.Word
	}
	return v.Word + ": " + v.Reason
}

// VerdictOf words a steady result's verdict.
func VerdictOf(r calc.Result) Verdict {
	v := Verdict{Code: r.Verdict}
	switch r.Verdict {
	case calc.Runs:
		v.Word, v.Status = "RUNS", OK
	case calc.RunsNearLimit:
		v.Word, v.Status = "RUNS — NEAR LIMIT", Warn
		v.Reason = "crest above the working limit: gas gathers, expect to re-prime"
	case calc.RunsChoked:
		v.Word, v.Status = "RUNS — CHOKED", Warn
		v.Reason = "the up-leg limits the flow, a valve at the outlet holds the crest"
	case calc.WillNotRun:
		v.Word, v.Status = "WILL NOT RUN", Bad
		v.Reason = whyNot(r.Why)
	default:
		v.Word, v.Status = "UNKNOWN", Warn
	}
	return v
}

// whyNot is the short reason a siphon will not run, from the deciding code.
func whyNot(c calc.WarnCode) string {
	switch c {
	case calc.WarnNoDrop:
		return "outlet is not below the liquid surface"
	case calc.WarnCannotRun:
		return "crest too high: the liquid boils at the crest"
	case calc.WarnIntakeShallow:
		return "the intake is above the liquid surface"
	case calc.WarnBoiling:
		return "the liquid boils at this site's pressure"
	case calc.WarnPrimeLost:
		return "the intake has lost its prime: its opening draws air"
	case calc.WarnAirDrawn:
		return "air drawn in at the intake would not be cleared"
	case calc.WarnHoseCollapse:
		return "the hose would flatten under the crest's vacuum"
	default: // the other codes never decide a verdict
	}
	return "see the warnings"
}
