package calc

import (
	"errors"
	"math"
)

// Curve sizes.
const (
	// DefaultCurvePoints is the number of curve points when DrainInput
	// leaves CurvePoints at zero.
	DefaultCurvePoints = 200
	// MaxCurvePoints bounds DrainInput.CurvePoints.
	MaxCurvePoints = 1000
)

// ErrNoTank reports a drain plan asked for without a tank (or a receiver
// without its tank).
var ErrNoTank = errors.New("no tank given")

// Receiver is a receiving vessel for a transfer: the hose end sits in it, its
// level rises as the source falls, and the head shrinks from both ends.
type Receiver struct {
	Tank Tank
	// Floor is the elevation of the receiver's floor on the source tank's
	// datum (source floor = 0), m; negative when it stands lower.
	Floor Length
	// Level is the receiver's starting level above its own floor, m.
	Level Length
}

// DrainInput is one drain (or transfer) to plan.
type DrainInput struct {
	// Siphon at the start: Geometry.Surface is the start level above the
	// source tank's floor; Intake, Crest and Outlet are elevations on the
	// same datum and stay fixed during the drain. With a Receiver, Outlet is
	// the elevation of the hose end inside it.
	Siphon Siphon
	// Tank is the source vessel.
	Tank Tank
	// Target is the level at which to stop, m above the floor. Zero means
	// none: the drain runs until the intake uncovers (intake + required
	// submergence), the crest limit, or equal levels.
	Target Length
	// Receiver, if not nil, makes the plan a transfer into it.
	Receiver *Receiver
	// CurvePoints is the number of points in DrainPlan.Curve: 0 means
	// DefaultCurvePoints; otherwise 2 to MaxCurvePoints.
	CurvePoints int
}

// DrainPoint is one point of the drain curve.
type DrainPoint struct {
	Time  Seconds  // since the start, s
	Level Length   // source level above its floor, m
	Flow  FlowRate // all hoses, m³/s
	// ReceiverLevel is the receiver's level above its floor, m (0 without
	// a receiver).
	ReceiverLevel Length
}

// DrainPlan is the result of PlanDrain. All values are SI and finite.
type DrainPlan struct {
	Time       Seconds    // time from the start to the stop, s
	Volume     Volume     // volume moved out of the source, m³
	StopLevel  Length     // source level at the stop, m above its floor
	StopReason StopReason // why it stops
	Residual   Volume     // volume left in the source at the stop, m³

	StartFlow FlowRate // flow at the start (all hoses), m³/s
	EndFlow   FlowRate // flow just before the stop, m³/s

	// CrestLimitLevel is the source level at which the flowing crest
	// pressure falls to the vapour pressure (the lift has grown to the
	// flowing crest limit), searched from the start level down to the
	// intake; CrestLimitFound is false when that never happens there (JSON
	// null). It is reported even when the plan stops earlier for another
	// reason.
	CrestLimitLevel Length
	CrestLimitFound bool
	// WorkingLimitLevel is the level below which the lift exceeds the
	// working crest height (the gas-release allowance is used up: expect
	// gas to gather at the crest); WorkingLimitFound is false when never.
	// It is the start level when the crest is already past it.
	WorkingLimitLevel Length
	WorkingLimitFound bool

	// ReceiverLevel is the receiver's level above its floor at the stop
	// (0 without a receiver).
	ReceiverLevel Length
	// EqualHead is the head used for the "equal" stop, m.
	EqualHead Length

	// Start is the steady solution at the start level.
	Start Result

	// Curve holds the level and flow against time from the start to the
	// stop, at most the requested number of points, first and last
	// included. Points are spaced evenly in a variable that crowds them
	// towards both ends and where the level changes slowly (near equal
	// levels).
	Curve []DrainPoint
}

// PlanDrain plans a drain (or, with a Receiver, a transfer) quasi-steadily:
// the flow at each moment is the steady flow Q of the siphon at the levels of
// that moment. With v the volume moved out of the source,
//
//	dv/dt = Q(H),  H = z_surface(v) − z_outlet(v)
//	t = ∫₀^v_stop dv / Q(H(v))
//
// and without a receiver, in the source level h (v = V(h₀) − V(h)),
//
//	dh/dt = −Q(h)/A(h),  t = ∫_{h_stop}^{h₀} A(h)/Q(h − z_outlet) dh
//
// (the quasi-steady tank-draining equation, as in Çengel & Cimbala, Fluid
// Mechanics: Fundamentals and Applications, Ch. 5 example "Discharge of water
// from a tank"; closed forms for cylinders and spheres in the project's
// reference notes, shared/reference/hydraulics.md §7).
//
// Method. Q depends on the levels only through the head H (the lift enters
// only the crest check), so Q(H), the required intake submergence S(H) and the
// flowing crest limit C(H) are sampled from Solve at 6–24 heads spaced evenly
// in ln H between the lowest reachable head and the start head (in a stand-in
// geometry with the plan's smallest lift and the real up-leg), and
// interpolated by local cubics in u = √H, Q as u·φ(u) (φ is constant for fixed
// losses, linear in u for laminar flow). The stop is the first of:
//
//   - target:  h = Target;
//   - intake:  h − z_intake = S(H);
//   - crest:   z_crest − h = C(H), where Solve's verdict flips to WillNotRun
//     (located on the interpolant by Brent's method, then confirmed with
//     Solve in the real geometry by bisection to 1e-7 m);
//   - equal:   H = EqualHead;
//   - receiver_full: the receiver holds its brim volume.
//
// The time integral is taken by composite 4-point Gauss–Lobatto quadrature
// in a variable w with h − z_outlet = w² (transfers: v = v₀ − w², v₀ the
// volume at which the levels would meet). Near equal levels Q ∝ √H, so
// A/Q·dh has a 1/√H singularity in h but is smooth in w; the integral is
// finite. Brent's method: R.P. Brent, Algorithms for Minimization without
// Derivatives (1973), ch. 4.
//
// Accuracy: the test suite checks the closed forms of
// shared/reference/hydraulics.md §7 to 1e-6 and an independent fixed-step
// Runge–Kutta integration with Solve at every step to 0.1 %.
//
// Special cases:
//   - a siphon that does not run at the start gives a plan of zero time whose
//     StopReason says why (crest; equal for no drop; intake for an intake
//     above the surface or too shallow);
//   - a head at the start of EqualHead or less: equal, zero time;
//   - a receiver already full: receiver_full, zero time.
//
// Errors: Solve's errors for the siphon; a *RangeError for a start level not
// in (0, tank height], an intake not in [0, start level), a target not in
// [0, start level), a curve size not in {0} ∪ [2, MaxCurvePoints], a receiver
// level not in [0, its height], a receiver floor beyond ±MaxElevation; an
// error wrapping ErrNoTank when a tank is missing.
//
// Caution: the plan is an estimate from measured inputs and a steady-flow
// model; it does not make a drain safe or lawful. Watch the drain, and follow
// local codes, permits and licensed practice for the site and the discharge.
//
// PlanDrain allocates only the curve.
func PlanDrain(in DrainInput) (DrainPlan, error) {
	var p planner
	if err := p.init(&in, in.CurvePoints); err != nil {
		return DrainPlan{}, err
	}
	return p.run()
}

// planner holds one drain plan's fixed data: the start siphon, the tanks,
// the path limits and the flow table sampled from Solve.
type planner struct {
	s        Siphon // at the start
	src, rcv Tank
	hasRcv   bool
	points   int

	h0, intake, crest, hoseEnd float64
	rcvFloor, vs0, vr0, vrCap  float64
	target                     float64 // < 0: none
	eps                        float64
	allowance                  float64
	lUp                        float64

	// tank heights and brim volumes, and the last levels found (Newton's
	// starting points for the next inverse of V(h) along a transfer)
	srcTop, srcFull, rcvTop float64
	lastHs, lastHr          float64

	fixed *fixedLoss
	tab   flowTable
	start Result
}

func (p *planner) init(in *DrainInput, points int) error {
	if in.Tank == nil {
		return &RangeError{What: QuantitySourceTank, Quantity: "source tank", Err: ErrNoTank, Unit: "", Min: math.Inf(-1), Max: math.Inf(1),
			Note: "a drain plan needs the tank's shape and size"}
	}
	p.s = in.Siphon
	p.src = in.Tank
	p.eps = float64(EqualHead)
	top := float64(in.Tank.Height())
	g := in.Siphon.Geometry
	if err := checkPositive(QuantityStartLevel, "start level", float64(g.Surface), top, "m"); err != nil {
		return err
	}
	p.h0 = float64(g.Surface)
	if err := checkRange(QuantityIntake, "intake height", float64(g.Intake), 0, p.h0, "m"); err != nil {
		if re, ok := err.(*RangeError); ok && g.Intake > g.Surface {
			re.Err = ErrGeometry
			re.Note = "the intake must be below the start level"
		}
		return err
	}
	if in.Target != 0 {
		if err := checkRange(QuantityTarget, "target level", float64(in.Target), 0, p.h0, "m"); err != nil {
			return err
		}
		if in.Target >= g.Surface {
			return &RangeError{What: QuantityTarget, Quantity: "target level", Value: float64(in.Target), Min: 0, Max: p.h0, Unit: "m",
				Err: ErrOutOfRange, Note: "the target must be below the start level"}
		}
		p.target = float64(in.Target)
	} else {
		p.target = -1
	}
	switch {
	case points == 0:
		p.points = DefaultCurvePoints
	case points < 0: // internal: no curve
		p.points = 0
	default:
		if err := checkRange(QuantityCurvePoints, "curve points", float64(points), 2, MaxCurvePoints, ""); err != nil {
			return err
		}
		p.points = points
	}
	p.intake = float64(g.Intake)
	p.crest = float64(g.Crest)
	p.hoseEnd = float64(g.Outlet)
	p.vs0 = float64(in.Tank.Volume(g.Surface))
	if r := in.Receiver; r != nil {
		if r.Tank == nil {
			return &RangeError{What: QuantityReceiverTank, Quantity: "receiving tank", Err: ErrNoTank, Min: math.Inf(-1), Max: math.Inf(1),
				Note: "a transfer needs the receiver's shape and size"}
		}
		if err := checkRange(QuantityReceiverFloor, "receiver floor elevation", float64(r.Floor), -MaxElevation, MaxElevation, "m"); err != nil {
			return err
		}
		if err := checkRange(QuantityReceiverLevel, "receiver level", float64(r.Level), 0, float64(r.Tank.Height()), "m"); err != nil {
			return err
		}
		p.hasRcv = true
		p.rcv = r.Tank
		p.rcvFloor = float64(r.Floor)
		p.vr0 = float64(r.Tank.Volume(r.Level))
		p.vrCap = float64(r.Tank.Volume(r.Tank.Height()))
		p.rcvTop = float64(r.Tank.Height())
		p.srcTop = top
		p.srcFull = float64(in.Tank.Volume(Length(top)))
		p.lastHs, p.lastHr = -1, -1
	}
	// Validate the siphon itself at the start.
	start, err := p.solveAt(0)
	if err != nil {
		return err
	}
	p.start = start
	if p.fixed == nil {
		// Solve's gas-release allowance, as it applies it
		p.allowance = float64(start.FlowingCrestLimit - start.WorkingCrestHeight)
		L := float64(p.s.Hose.Length)
		p.lUp = float64(p.s.Hose.UpLegLength)
		if p.lUp == 0 {
			p.lUp = math.Max(p.crest-p.intake, 0)
		}
		p.lUp = math.Min(p.lUp, L)
	}
	return nil
}

// state returns the source level, the receiver level above its floor, the
// outlet elevation and the head at path position x. x is the source level
// fallen (no receiver) or the volume moved (transfer).
func (p *planner) state(x float64) (hs, hr, out, H float64) {
	if !p.hasRcv {
		hs = p.h0 - x
		return hs, 0, p.hoseEnd, hs - p.hoseEnd
	}
	hs = levelFrom(p.src, p.vs0-x, p.srcTop, p.srcFull, p.lastHs)
	hr = levelFrom(p.rcv, p.vr0+x, p.rcvTop, p.vrCap, p.lastHr)
	p.lastHs, p.lastHr = hs, hr
	out = math.Max(p.hoseEnd, p.rcvFloor+hr)
	return hs, hr, out, hs - out
}

// dvdx is the volume moved per unit of x.
func (p *planner) dvdx(hs float64) float64 {
	if p.hasRcv {
		return 1
	}
	return float64(p.src.Area(Length(hs)))
}

// realSiphon is the siphon at path position x.
func (p *planner) realSiphon(x float64) Siphon {
	s := p.s
	hs, hr, out, _ := p.state(x)
	s.Geometry.Surface = Length(hs)
	s.Geometry.Outlet = Length(out)
	if p.hasRcv {
		s.Geometry.OutletSubmerged = p.rcvFloor+hr >= p.hoseEnd
	}
	return s
}

// solveAt runs Solve in the real geometry at x.
func (p *planner) solveAt(x float64) (Result, error) {
	if p.fixed != nil {
		_, _, _, H := p.state(x)
		var r Result
		r.Head = Length(H)
		if H <= 0 {
			r.Verdict = WillNotRun
			r.Why = WarnNoDrop
			return r, nil
		}
		q := p.fixed.c * p.fixed.area * math.Sqrt(2*p.fixed.g*H)
		r.Flow, r.FlowPerHose = FlowRate(q), FlowRate(q)
		r.Velocity = Velocity(q / p.fixed.area)
		r.FlowingCrestLimit, r.MaxCrestHeight, r.WorkingCrestHeight = 1e6, 1e6, 1e6
		return r, nil
	}
	return Solve(p.realSiphon(x))
}

// run plans the drain: the stops known at the start, then the flow table,
// the events on it, the first stop and the time integral.
func (p *planner) run() (DrainPlan, error) {
	var plan DrainPlan
	plan.EqualHead = Length(p.eps)
	start := p.start
	plan.Start = start
	plan.StopLevel = Length(p.h0)
	plan.Residual = Volume(p.vs0)
	_, hr0, _, H0 := p.state(0)
	plan.ReceiverLevel = Length(hr0)

	stopNow := func(why StopReason) (DrainPlan, error) {
		plan.StopReason = why
		plan.StartFlow = start.Flow
		plan.EndFlow = start.Flow
		if p.points > 0 {
			plan.Curve = []DrainPoint{{Level: Length(p.h0), Flow: start.Flow, ReceiverLevel: Length(hr0)}}
		}
		return plan, nil
	}
	if why, ok := p.stopAtStart(&plan); ok {
		return stopNow(why)
	}

	xBottom, xTarget, xFull, xEqual, x0, haveX0 := p.geoLimits()
	xMax := math.Min(math.Min(xBottom, xFull), xEqual)
	if xMax <= 0 || H0 <= p.eps {
		if p.hasRcv && xFull <= 0 {
			return stopNow(StopReceiverFull)
		}
		return stopNow(StopEqual)
	}
	_, _, _, hLo := p.state(xMax)
	hLo = math.Max(hLo, math.Min(p.eps, H0))
	if err := p.build(hLo, H0); err != nil {
		return plan, err
	}

	// Events on the interpolated flow table.
	const scanN = 64
	roots, found := p.scanRoots(newXmap(x0, haveX0, xMax), scanN, p.xTol(0))
	p.reportLimits(&plan, roots, found)

	xStop, why := xMax, StopEqual
	first := func(x float64, ok bool, r StopReason) {
		if ok && x <= xStop {
			xStop, why = x, r
		}
	}
	first(xBottom, xBottom < xEqual, StopIntake)
	first(xFull, true, StopReceiverFull)
	first(xTarget, true, StopTarget)
	first(roots[evIntake], found[evIntake], StopIntake)
	first(roots[evCrest], found[evCrest], StopCrest)
	if why == StopCrest && p.fixed == nil {
		var err error
		if xStop, err = p.polishCrest(xStop, xMax); err != nil {
			return plan, err
		}
		hs, _, _, _ := p.state(xStop)
		plan.CrestLimitLevel = Length(hs)
	}
	if xStop <= 0 {
		return stopNow(why)
	}
	plan.StopReason = why
	p.integrate(&plan, newXmap(x0, haveX0, xStop))
	plan.StartFlow = start.Flow
	return plan, nil
}

// stopAtStart reports the stop of a siphon that does not drain at all from
// the start level, and fills the crest and working limits known there.
func (p *planner) stopAtStart(plan *DrainPlan) (StopReason, bool) {
	start := p.start
	if start.Verdict == WillNotRun {
		switch start.Why {
		case WarnCannotRun:
			plan.CrestLimitLevel, plan.CrestLimitFound = Length(p.h0), true
			plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(p.h0), true
			return StopCrest, true
		case WarnIntakeShallow:
			return StopIntake, true
		default: // WarnNoDrop: the levels are already equal or reversed
		}
		return StopEqual, true
	}
	if start.Verdict == RunsNearLimit {
		plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(p.h0), true
	}
	if start.Warnings.Has(WarnIntakeShallow) {
		return StopIntake, true
	}
	return "", false
}

// reportLimits fills the levels at which the crest and working limits are
// reached, from the event roots.
func (p *planner) reportLimits(plan *DrainPlan, roots [3]float64, found [3]bool) {
	if found[evCrest] {
		hs, _, _, _ := p.state(roots[evCrest])
		plan.CrestLimitLevel, plan.CrestLimitFound = Length(hs), true
	}
	if !plan.WorkingLimitFound && found[evWorking] {
		hs, _, _, _ := p.state(roots[evWorking])
		plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(hs), true
	}
}
