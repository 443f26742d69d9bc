package calc

import "strconv"

// StopReason says why a drain plan ends. The strings are stable codes used in
// the JSON output (drain.stop_reason) and in job records.
type StopReason string

// Stop reasons.
const (
	// StopTarget: the source level reached the target level.
	StopTarget StopReason = "target"
	// StopIntake: the level fell to where the intake loses its prime (its
	// opening draws air; see Intake); the siphon breaks.
	StopIntake StopReason = "intake"
	// StopAir: stopped where air starts to be drawn in at the intake,
	// because the air would not be carried over the crest (the down-leg is
	// too slow to clear it) or a vortex would draw a floating film in with
	// no cover over the intake.
	StopAir StopReason = "air"
	// StopCrest: as the level fell the lift grew to the running crest
	// height; the choked flow tapers to nothing and the column breaks at
	// the crest. Also the stop at once of a siphon whose liquid boils at the
	// site or whose hose collapses under the crest vacuum (Start.Why says
	// which).
	StopCrest StopReason = "crest"
	// StopEqual: the levels came within EqualHead of each other (the source
	// surface and the outlet, or the receiving surface); the flow tapers to
	// nothing.
	StopEqual StopReason = "equal"
	// StopReceiverFull: a transfer filled the receiving vessel to its brim.
	StopReceiverFull StopReason = "receiver_full"
	// StopSettles: with liquid coming in (DrainInput.Inflow) the siphon's
	// flow falls to the inflow at a level above every other stop, where the
	// level holds (DrainPlan.SettleLevel); the plan ends when the level is
	// within SettleMargin of it. Also a level that rises because the inflow
	// outruns the siphon: it settles higher, or at the brim when the tank
	// overflows (DrainPlan.Overflows).
	StopSettles StopReason = "settles"
)

// Text is a short plain description of the stop for records and the command
// line's human-readable output.
func (r StopReason) Text() string {
	switch r {
	case StopTarget:
		return "the target level is reached"
	case StopIntake:
		return "the intake loses its prime: its opening draws air"
	case StopAir:
		return "air starts to be drawn in at the intake and would not be carried over the crest"
	case StopCrest:
		return "the lift grows to the crest's running limit; the flow tapers to nothing and the column breaks at the crest"
	case StopEqual:
		return "the levels come within " + strconv.FormatFloat(float64(EqualHead)*100, 'g', 3, 64) + " cm of each other; the flow tapers to nothing"
	case StopReceiverFull:
		return "the receiving vessel is full"
	case StopSettles:
		return "the siphon's flow falls to the inflow and the level settles; the plan ends within " +
			strconv.FormatFloat(float64(SettleMargin)*100, 'g', 3, 64) + " cm of it"
	}
	return string(r)
}

// EqualHead is the head at which a drain is reported as having reached
// "levels equal". The flow falls to zero as the head does, so the last
// centimetre would take very long (for laminar flow, for ever); 1 cm is
// well inside the error of heights taped in the field (see
// DefaultHeightTolerance). Our choice; the plan reports it in EqualHead.
const EqualHead Length = 0.01

// SettleMargin is how near the level must come to the level where it
// settles (the siphon's flow equals the inflow) for the plan to end there:
// the level approaches it exponentially and never reaches it. 1 cm, as
// EqualHead (the contract: "the time to come within 1 cm of it").
const SettleMargin Length = 0.01
