package presets

import (
	"slices"

	"drawdown/calc"
)

// IntakeKind is how the hose end draws from the source. It decides which
// geometry matters: the face the liquid enters through (for the vortex
// criteria), the top of the opening (where the prime is lost), a suction
// plate's rated draw-down level, a floating intake's depth.
type IntakeKind uint8

// Intake kinds.
const (
	// BareHung: a bare hose end hung with its mouth clear of the floor
	// (the default when no intake is chosen).
	BareHung IntakeKind = iota
	// BareFloor: a bare hose end lying on the floor.
	BareFloor
	// StrainerIntake: a strainer (basket or perforated drum) on the floor.
	StrainerIntake
	// FootValveIntake: a foot valve with its strainer, standing on the floor.
	FootValveIntake
	// SuctionPlate: a flat low-level suction plate, rated to draw down to
	// a stated level.
	SuctionPlate
	// BoardIntake: a bare end hung clear of the floor with a board or raft
	// floated over it against the air-entraining vortex.
	BoardIntake
	// FloatingIntake: an inlet held by a float a fixed depth below the
	// surface; it stops when the float grounds.
	FloatingIntake
)

var intakeKindNames = [...]string{"bare-hung", "bare-floor", "strainer", "foot-valve", "suction-plate", "board", "floating"}

// String returns the kind's name as the preset file writes it.
func (k IntakeKind) String() string {
	if int(k) < len(intakeKindNames) {
		return intakeKindNames[k]
	}
	return "unknown"
}

// ParseIntakeKind is the inverse of String.
func ParseIntakeKind(s string) (IntakeKind, bool) {
	i := slices.Index(intakeKindNames[:], s)
	return IntakeKind(max(i, 0)), i >= 0
}

// IntakeKinds returns the kinds in a fixed order.
func IntakeKinds() []IntakeKind {
	out := make([]IntakeKind, len(intakeKindNames))
	for i := range out {
		out[i] = IntakeKind(i)
	}
	return out
}

// DefaultIntake is the ID of the intake assumed when none is chosen: a bare
// hose end hung at the intake height.
const DefaultIntake = "bare-hung"

// Intake is a way of taking liquid into the hose, with its entrance loss
// and the geometry the intake physics needs. Sizes that scale with the hose
// are given in hose bores: a size is its fixed part plus its bores times
// the hose's inside diameter (FaceDiameter, MouthHeight).
type Intake struct {
	ID      string
	Aliases []string
	Name    string
	Kind    IntakeKind
	// K is the entrance loss coefficient referred to the velocity in the
	// hose (h = K V²/2g), entrance shape and any screen or valve included.
	K          KRange
	FromMemory bool   // K not confirmed in its cited source
	KSource    string // where K comes from
	// Face, FaceBores: the diameter of the face the liquid enters through
	// (a bare end's bore, a strainer's diameter), the size the HI 9.8 and
	// Gordon vortex criteria take.
	Face      calc.Length
	FaceBores float64
	// Mouth, MouthBores: the height above the floor of the top of the
	// opening (a hung end's mouth, a strainer's top row of holes); the
	// prime is lost when the surface falls to it. Not used by a floating
	// intake.
	Mouth      calc.Length
	MouthBores float64
	// OpenRatio is a screen's open area over its face area (0 to 1); 0 for
	// no screen.
	OpenRatio float64
	// DrawDown is the level above the floor a suction plate is rated to
	// draw the liquid down to (SuctionPlate only).
	DrawDown calc.Length
	// Depth is a floating intake's mouth depth below the surface
	// (FloatingIntake only).
	Depth  calc.Length
	Source string // where the geometry comes from
	Note   string
	Origin string
}

// FaceDiameter returns the diameter of the intake's entry face for a hose
// of inside diameter bore.
func (in Intake) FaceDiameter(bore calc.Length) calc.Length {
	return in.Face + calc.Length(in.FaceBores)*bore
}

// MouthHeight returns the height above the floor of the top of the
// intake's opening for a hose of inside diameter bore.
func (in Intake) MouthHeight(bore calc.Length) calc.Length {
	return in.Mouth + calc.Length(in.MouthBores)*bore
}

// Intake returns the intake with the given ID or alias.
func (c *Catalogue) Intake(id string) (Intake, bool) {
	in, ok := findAliased(c.intakes, norm(id), func(in Intake) (string, []string) { return in.ID, in.Aliases })
	in.Aliases = slices.Clone(in.Aliases)
	return in, ok
}

// Intakes returns the intakes in catalogue order (a copy).
func (c *Catalogue) Intakes() []Intake {
	return cloneAliased(c.intakes, func(in *Intake) *[]string { return &in.Aliases })
}
