package present

import "drawdown/calc"

// WhatIfTag is the one word a What-if cell shows for a hose that does not
// lower the level at all, naming why (the footer gives StopShort in full):
// a cell never says "at once" without its reason.
func WhatIfTag(r calc.StopReason) string {
	switch r {
	case calc.StopTarget:
		return "at target"
	case calc.StopIntake:
		return "intake dry"
	case calc.StopAir:
		return "air now"
	case calc.StopCrest:
		return "crest"
	case calc.StopEqual:
		return "level"
	case calc.StopReceiverFull:
		return "rcv full"
	case calc.StopSettles:
		return "settles"
	}
	return "no fall"
}
