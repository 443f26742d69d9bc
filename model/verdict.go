package model

import "drawdown/calc"

// VerdictReason is the short reason beside a "will not run" or "near the
// limit" verdict, in the technician's words; "" when the siphon simply runs.
// The screen and the text output both use it.
func VerdictReason(r calc.Result) string {
	switch {
	case r.Verdict == calc.RunsNearLimit:
		return "crest above the working limit: gas gathers, expect to re-prime"
	case r.Verdict != calc.WillNotRun:
		return ""
	}
	switch r.Why {
	case calc.WarnNoDrop:
		return "outlet is not below the liquid surface"
	case calc.WarnCannotRun:
		return "crest too high: the liquid boils at the crest"
	case calc.WarnIntakeShallow:
		return "the intake is above the liquid surface"
	default: // the other codes never decide a verdict
	}
	return "see the warnings"
}
