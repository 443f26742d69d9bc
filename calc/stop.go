package calc

import "strconv"

// StopReason says why a drain plan ends. The strings are stable codes used in
// the JSON output (drain.stop_reason) and in job records.
type StopReason string

// Stop reasons.
const (
	// StopTarget: the source level reached the target level.
	StopTarget StopReason = "target"
	// StopIntake: the level reached intake + required submergence; below it
	// the intake draws air (vortices) and the siphon breaks.
	StopIntake StopReason = "intake"
	// StopCrest: as the level fell the lift grew until the flowing crest
	// pressure reached the vapour pressure; the column breaks at the crest.
	StopCrest StopReason = "crest"
	// StopEqual: the levels came within EqualHead of each other (the source
	// surface and the outlet, or the receiving surface); the flow tapers to
	// nothing.
	StopEqual StopReason = "equal"
	// StopReceiverFull: a transfer filled the receiving vessel to its brim.
	StopReceiverFull StopReason = "receiver_full"
)

// Text is a short plain description of the stop for records and the command
// line's human-readable output.
func (r StopReason) Text() string {
	switch r {
	case StopTarget:
		return "the target level is reached"
	case StopIntake:
		return "the intake draws air: the level is down to intake + the submergence needed against vortices"
	case StopCrest:
		return "the crest pressure falls to the vapour pressure as the lift grows; the column breaks at the crest"
	case StopEqual:
		return "the levels come within " + strconv.FormatFloat(float64(EqualHead)*100, 'g', 3, 64) + " cm of each other; the flow tapers to nothing"
	case StopReceiverFull:
		return "the receiving vessel is full"
	}
	return string(r)
}

// EqualHead is the head at which a drain is reported as having reached
// "levels equal". The flow falls to zero as the head does, so the last
// centimetre would take very long (for laminar flow, for ever); 1 cm is
// well inside the error of heights taped in the field (see
// DefaultHeightTolerance). Our choice; the plan reports it in EqualHead.
const EqualHead Length = 0.01
