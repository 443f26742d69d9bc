package present

import (
	"strconv"

	"drawdown/calc"
)

// StopShort is a drain's stop reason on one screen line.
func StopShort(r calc.StopReason) string {
	switch r {
	case calc.StopTarget:
		return "target level reached"
	case calc.StopIntake:
		return "intake loses its prime"
	case calc.StopAir:
		return "air starts at the intake"
	case calc.StopCrest:
		return "crest limit reached"
	case calc.StopEqual:
		return "levels equal, flow tapers off"
	case calc.StopReceiverFull:
		return "receiver full"
	case calc.StopSettles:
		return "level settles: inflow matches the siphon"
	case "":
		return "end of plan"
	}
	return string(r)
}

// StopLong is a drain's stop reason as a sentence, for the command line and
// the record.
func StopLong(r calc.StopReason) string {
	switch r {
	case calc.StopTarget:
		return "the target level is reached"
	case calc.StopIntake:
		return "the intake loses its prime: the level is down to the top of its opening"
	case calc.StopAir:
		return "air starts to be drawn in at the intake and would not be cleared (or would draw a floating film in): the drain stops there"
	case calc.StopCrest:
		return "the crest pressure falls to the vapour pressure as the lift grows; the column breaks at the crest"
	case calc.StopEqual:
		return "the levels come within " + strconv.FormatFloat(float64(calc.EqualHead)*100, 'g', 3, 64) +
			" cm of each other; the flow tapers to nothing"
	case calc.StopReceiverFull:
		return "the receiving vessel is full"
	case calc.StopSettles:
		return "the siphon's flow falls to the inflow and the level settles; the plan ends within " +
			strconv.FormatFloat(float64(calc.SettleMargin)*100, 'g', 3, 64) + " cm of it"
	case "":
		return "the plan ends"
	}
	return string(r)
}
