package calc

import "math"

// IntakeKind is the kind of device on the suction end of the hose. It sets
// where the intake's opening is, what face the approaching liquid sees, and so
// the two levels at which the intake stops the siphon (see Intake).
type IntakeKind uint8

// Intake kinds. The zero value is the default of the command line and the
// screen: a bare hose end hung at the intake height.
const (
	// IntakeBareHung: a bare hose end hung with its mouth facing down,
	// clear of the floor. Geometry.Intake is the mouth.
	IntakeBareHung IntakeKind = iota
	// IntakeBareFloor: a bare hose end lying on the floor, its mouth facing
	// sideways. Geometry.Intake is the floor under it; the mouth's top is
	// one face diameter up.
	IntakeBareFloor
	// IntakeStrainer: a strainer (perforated basket or drum) on the hose
	// end. Geometry.Intake is its base; Intake.Height is the top row of
	// holes; Intake.FaceDiameter its body diameter; Intake.OpenArea the holes'
	// total open area.
	IntakeStrainer
	// IntakeFootValve: a foot valve with its strainer, as IntakeStrainer
	// (the valve's loss goes in Intake.K).
	IntakeFootValve
	// IntakeSuctionPlate: a flat low-level suction plate lying on the
	// floor. Intake.Height is the draw-down level it is rated for, above
	// Geometry.Intake (its base); Intake.FaceDiameter the plate's size.
	IntakeSuctionPlate
	// IntakeFloating: a floating intake whose mouth hangs Intake.FloatDepth
	// below the surface. It stops when it grounds: Geometry.Intake is the
	// lowest its mouth can go (the floor under it).
	IntakeFloating
	intakeKindCount
)

var intakeKindNames = [...]string{"bare-hung", "bare-floor", "strainer", "foot-valve", "suction-plate", "floating"}

// String returns the kind's stable code.
func (k IntakeKind) String() string {
	if int(k) >= len(intakeKindNames) {
		return "unknown"
	}
	return intakeKindNames[k]
}

// Intake describes the suction end of a Siphon. The zero Intake is a bare
// hose end hung at Geometry.Intake, with the hose bore as its face.
//
// Two levels follow from it, each the top of the opening (TopOfOpening)
// plus a depth of liquid over it:
//
//   - air starts: the depth at which an air-entraining vortex forms at the
//     intake face (vortex onset, Gordon 1970; see AirStartsSubmergence);
//     below it the siphon gulps air and slows (see GulpVoidMax);
//   - prime lost: the depth at which the opening itself draws air (see
//     intakeModel): the siphon breaks.
//
// A board or raft over the intake (Covered), or a floating intake's float,
// keeps vortices from forming: air starts where prime is lost.
type Intake struct {
	Kind IntakeKind
	// FaceDiameter is the diameter of the face the liquid approaches: the
	// mouth of a bare end (0 means the hose bore), the body of a strainer or
	// foot valve, the size of a suction plate, m.
	FaceDiameter Length
	// Height is the height above Geometry.Intake of the top of the opening:
	// the top row of a strainer's holes, a suction plate's rated draw-down
	// level. For a bare end 0 means the kind's own (the mouth for a hung end,
	// one face diameter for an end lying on the floor), m.
	Height Length
	// OpenArea is the total open area of a strainer's holes, m²; 0 means the
	// face area. The flow through the holes sets the prime-lost depth.
	OpenArea Area
	// K is the device's entrance loss coefficient (strainer, foot valve),
	// referred to the hose velocity. Solve adds it to Hose.KEntrance: both
	// lie before the crest.
	K float64
	// FloatDepth is a floating intake's mouth depth below the surface, m.
	FloatDepth Length
	// Covered is true when a board or raft floats over the intake.
	Covered bool
	// FilmRisk is true when the liquid may carry a floating film (bund and
	// storm water, product over water): an air-entraining vortex would draw
	// it in, so without a cover the siphon must stop where air starts.
	FilmRisk bool
}

// Limits on the intake's sizes.
const (
	MaxIntakeSize = 2.0  // m, face diameter, height, float depth
	MaxOpenArea   = 10.0 // m²
)

// GordonCAsymmetric and GordonCSymmetric are Gordon's coefficients in
// S = C·V·√D for the critical submergence of an intake, converted to SI (S
// and D in m, V in m/s): the published 0.4 (asymmetrical approach) and 0.3
// (symmetrical) are for feet and feet per second, and C_SI = C_ft·√(1/0.3048)
// (J.L. Gordon, "Vortices at intakes", Water Power 22, 1970; coefficients as
// collected in calc/testdata/reference/hydraulics.md §6, from memory there). In
// dimensionless form S/D = C_SI·√g·F_D: 2.27·F_D and 1.70·F_D.
const (
	GordonCAsymmetric = 0.4 / sqrtFoot
	GordonCSymmetric  = 0.3 / sqrtFoot
	sqrtFoot          = 0.5520869496736904 // √0.3048
)

// GulpVoidMax is the void fraction of the mixture in the hose when the level
// has fallen from where air starts to where prime is lost. Our model, not a
// published figure: between the two levels the vortex, then the uncovering
// mouth, draws air in; carried down with the flow it makes the columns below
// the intake lighter, so the siphon pulls less (see GulpHeadLoss). The void
// fraction is taken to grow linearly with the fall below the air-starts
// level, from 0 there to GulpVoidMax at prime lost. A quarter is our round
// figure for a mouth that gulps slugs of air as it uncovers; entrainment by
// a full air-core vortex alone is much smaller (measured for large
// horizontal intakes by Möller, Detert & Boes, "Vortex-induced air
// entrainment rates at intakes", J. Hydraul. Eng. 2015,
// doi:10.1061/(ASCE)HY.1943-7900.0001036; their rates are not used here).
const GulpVoidMax = 0.25

// MinPrimeDepth is the least depth of liquid over the opening that keeps it
// sealed: our allowance for ripples and for a level read off a floor, 5 mm.
const MinPrimeDepth Length = 0.005

// intakeGeom is an Intake resolved against the hose: the face diameter, the
// top of the opening above Geometry.Intake and the area that sets the
// prime-lost depth.
type intakeGeom struct {
	face, top, holes float64
}

func resolveIntake(in Intake, bore float64) intakeGeom {
	g := intakeGeom{face: float64(in.FaceDiameter), top: float64(in.Height), holes: float64(in.OpenArea)}
	if g.face == 0 {
		g.face = bore
	}
	if in.Kind == IntakeBareFloor && g.top == 0 {
		g.top = g.face
	}
	if in.Kind == IntakeFloating {
		g.top = 0
	}
	if g.holes == 0 {
		g.holes = math.Pi * g.face * g.face / 4
	}
	return g
}

// AirStartsSubmergence returns the depth of liquid over the top of the
// intake's opening at which an air-entraining vortex forms, for a flow q
// (m³/s) through an intake face of diameter d (m), by Gordon (1970) for an
// asymmetrical approach:
//
//	S = C·V·√d,  V = q/(πd²/4),  C = GordonCAsymmetric (SI)
//
// The face is the intake device's own (a strainer's body, not the hose
// bore), and V the velocity of the approach to it. The plan uses Gordon's
// criterion, not ANSI/HI 9.8 (see SubmergenceHI): Gordon's is fitted to the
// onset of air-entraining vortices at intakes in service, which is what air
// starts means here, while HI 9.8 is a design rule for pump bells that adds
// a full diameter of margin (S_HI = d + 2.3·V·√(d/g) ≈ d + S_Gordon). A hose
// end in a tank, pit or bund seldom has a symmetrical approach, so the
// asymmetrical coefficient is used. At the small scale of a hose end,
// viscosity and surface tension delay vortices (Anwar, Weller & Amphlett,
// "Similarity of free-vortex at horizontal intake", J. Hydraul. Res. 16(2),
// 1978, 95–105, doi:10.1080/00221687809499623), so Gordon's figure is on the
// early side.
func AirStartsSubmergence(q FlowRate, d Length) Length {
	dd := float64(d)
	v := float64(q) / (math.Pi * dd * dd / 4)
	return Length(GordonCAsymmetric * v * math.Sqrt(dd))
}

// SubmergenceHI returns the ANSI/HI 9.8 submergence for a flow q through an
// inlet of diameter d (Hydraulic Institute, Rotodynamic Pumps for Pump Intake
// Design):
//
//	S = d (1 + 2.3 F_d),  F_d = V/√(g d),  V = q/(πd²/4)
//
// It is a design rule for pump bells, reported beside the plan's own
// criterion for reference; it is never a stop for a hose end.
func SubmergenceHI(q FlowRate, d Length) Length {
	dd := float64(d)
	v := float64(q) / (math.Pi * dd * dd / 4)
	return Length(dd * (1 + 2.3*v/math.Sqrt(StandardGravity*dd)))
}

// The prime-lost depth is the depth of liquid over the top of the opening
// at which the opening draws air, for a flow q through open area a (m²):
//
//	d = max(V_a²/(2g), MinPrimeDepth),  V_a = q/(2a)
//
// Our model: the liquid approaching an opening converges on it like a
// potential-flow sink, at half the opening's velocity q/a over a hemisphere
// of the opening's size, and Bernoulli's equation draws the surface above it
// down by the velocity head of that approach; the opening uncovers when the
// liquid over it is no deeper than that (the same picture as the critical
// spherical sink surface of Yıldırım and Kocabaş, from memory). It is small
// for a strainer with ample open area and grows with the square of the flow
// for a bare end.
//
// intakeModel is an Intake resolved for fast evaluation along a drain: the
// levels are linear (air starts) and quadratic (prime lost) in the flow.
type intakeModel struct {
	top, prime0           float64 // top of the opening; a fixed prime-lost level (plate, floating)
	fixedPrime            bool    // prime0 holds
	fixedAir, covered     bool    // air starts where prime is lost
	gordonPerQ, primePerQ float64 // S = gordonPerQ·q; drawdown = primePerQ·q²
}

func newIntakeModel(in Intake, g intakeGeom, base float64) intakeModel {
	m := intakeModel{top: base + g.top, covered: in.Covered}
	m.gordonPerQ = float64(AirStartsSubmergence(1, Length(g.face)))
	m.primePerQ = 1 / (8 * StandardGravity * g.holes * g.holes)
	switch in.Kind {
	case IntakeFloating:
		m.prime0, m.fixedPrime = base+float64(in.FloatDepth), true
		m.fixedAir = true
	case IntakeSuctionPlate:
		m.prime0, m.fixedPrime = m.top, true
	default: // the opening's top plus the prime-lost depth
	}
	return m
}

// levels returns the elevations at which air starts and prime is lost for a
// flow q through one hose: the top of the opening plus AirStartsSubmergence,
// and plus the prime-lost depth above (a floating intake grounds, a suction plate stops
// at its rated level); with a cover, air starts where prime is lost.
func (m *intakeModel) levels(q float64) (air, prime float64) {
	prime = m.prime0
	if !m.fixedPrime {
		prime = m.top + max(m.primePerQ*q*q, float64(MinPrimeDepth))
	}
	if m.fixedAir || m.covered {
		return prime, prime
	}
	return max(m.top+m.gordonPerQ*q, prime), prime
}

// gulpVoid is the void fraction at level h between the air-starts and
// prime-lost levels (see GulpVoidMax).
func gulpVoid(h, air, prime float64) float64 {
	if h >= air || air <= prime {
		return 0
	}
	return GulpVoidMax * min((air-h)/(air-prime), 1)
}

// GulpHeadLoss is the head a gulping siphon loses, m: with void fraction α in
// the hose below the intake the columns from the intake down to the outlet
// weigh (1 − α) as much, so the driving head falls by α·(z_intake − z_outlet)
// (hydrostatics of the mixture, homogeneous flow; the air's own friction is
// not counted).
func GulpHeadLoss(alpha float64, intake, outlet Length) Length {
	return Length(alpha * max(float64(intake-outlet), 0))
}

func validateIntake(in Intake) error {
	if in.Kind >= intakeKindCount {
		return &RangeError{What: QuantityIntakeKind, Quantity: "intake kind", Value: float64(in.Kind), Min: 0,
			Max: float64(intakeKindCount - 1), Err: ErrOutOfRange}
	}
	for _, c := range [...]struct {
		what Quantity
		name string
		v    float64
		hi   float64
		unit string
	}{
		{QuantityIntakeSize, "intake face diameter", float64(in.FaceDiameter), MaxIntakeSize, "m"},
		{QuantityIntakeHeight, "height of the intake's opening", float64(in.Height), MaxIntakeSize, "m"},
		{QuantityIntakeOpenArea, "intake open area", float64(in.OpenArea), MaxOpenArea, "m²"},
		{QuantityIntakeK, "intake loss coefficient", in.K, MaxK, ""},
		{QuantityFloatDepth, "floating intake depth", float64(in.FloatDepth), MaxIntakeSize, "m"},
	} {
		if err := checkRange(c.what, c.name, c.v, 0, c.hi, c.unit); err != nil {
			return err
		}
	}
	if in.Kind == IntakeFloating && in.FloatDepth <= 0 {
		return &RangeError{What: QuantityFloatDepth, Quantity: "floating intake depth", Value: float64(in.FloatDepth),
			Min: 0, Max: MaxIntakeSize, Unit: "m", Err: ErrOutOfRange, Note: "a floating intake hangs below the surface"}
	}
	return nil
}
