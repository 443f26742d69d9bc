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
	// none: the drain runs until the intake loses its prime (or air stops
	// it), the crest limit, or equal levels. A target is always honoured:
	// the plan never goes below it (DrainPlan.TargetBelowPrimeLost says when
	// the intake stops it first).
	Target Length
	// Receiver, if not nil, makes the plan a transfer into it.
	Receiver *Receiver
	// Inflow is liquid coming into the source while the siphon runs (rain
	// on the catchment, seepage, leakage), m³/s, constant; zero means none.
	// The level then obeys A(h)·dh/dt = Inflow − Q(h).
	Inflow FlowRate
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

	// AirStartsLevel is the source level at which air starts to be drawn in
	// at the intake (vortex onset at the intake face, see Intake), m above
	// the floor; PrimeLostLevel the level at which the intake loses its
	// prime. Both follow the flow, so each is where the falling level meets
	// it; when the path ends first, each is the level the intake sets at the
	// flow of the path's end. With a cover over the intake (or a floating
	// intake) they are equal.
	AirStartsLevel Length
	PrimeLostLevel Length
	// TargetBelowPrimeLost is true when a target was given below the
	// prime-lost level: the intake stops the drain above it.
	TargetBelowPrimeLost bool
	// GulpTime is the time from where air starts to the stop (the siphon
	// gulps air and slows), s; GulpTimeLost the part of it that the gulping
	// costs over the same levels without air (see GulpVoidMax), s. Both 0
	// when the plan stops before air starts.
	GulpTime, GulpTimeLost Seconds

	// CrestLimitLevel is the source level at which the lift grows to the
	// running crest height (Result.RunningCrestHeight, less EqualHead):
	// there the choked flow tapers to nothing and the plan stops for the
	// crest. CrestLimitFound is false when the path from the start level to
	// the intake never reaches it (JSON null). It is reported even when the
	// plan stops earlier for another reason.
	CrestLimitLevel Length
	CrestLimitFound bool
	// ChokeLevel is the level below which the siphon runs choked (the
	// full-gravity flow would take the crest below its running limit; the
	// up-leg limits the flow); ChokeFound is false when never. It is the
	// start level when it runs choked from the start.
	ChokeLevel Length
	ChokeFound bool
	// WorkingLimitLevel is the level below which the lift exceeds the
	// working crest height (the gas-release allowance is used up: expect
	// gas to gather at the crest); WorkingLimitFound is false when never.
	// It is the start level when the crest is already past it.
	WorkingLimitLevel Length
	WorkingLimitFound bool
	// AirGatherLevel is the level below which the down-leg velocity is
	// under the air-clearing velocity: air gathers at the crest from there
	// on; AirGatherFound is false when never. The start level when from the
	// start.
	AirGatherLevel Length
	AirGatherFound bool
	// CollapseLevel is the level below which the crest vacuum while flowing
	// exceeds the hose's rating (the hose may collapse); CollapseFound is
	// false when never or when the hose has no rating.
	CollapseLevel Length
	CollapseFound bool

	// ReceiverLevel is the receiver's level above its floor at the stop
	// (0 without a receiver).
	ReceiverLevel Length
	// EqualHead is the head used for the "equal" stop, m.
	EqualHead Length

	// Inflow is DrainInput.Inflow, m³/s. SettleLevel is the level where the
	// siphon's flow equals it, when the plan stops there (SettleFound; the
	// StopReason is StopSettles): below the start level when the siphon
	// falls behind as the level drops, above it when the inflow outruns the
	// siphon from the start and the level rises (Rises). With Overflows the
	// flow never catches up below the brim: SettleLevel is the brim, where
	// the excess spills over, and Time the time to reach it. When the siphon
	// keeps up (Inflow > 0, SettleFound false) the flow stays above the
	// inflow down to the stop.
	Inflow                        FlowRate
	SettleLevel                   Length
	SettleFound, Rises, Overflows bool
	// Time90 is the time to move 90 % of Volume, s: with the slow tail of a
	// drain it is well short of Time.
	Time90 Seconds

	// Start is the steady solution at the start level (with Siphon.MaxFlow:
	// the capped one; the valve it needs, Start.MaxFlowThrottleK, stays set
	// for the whole drain).
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
// that moment, as Solve gives it. With v the volume moved out of the source,
//
//	dv/dt = Q,  t = ∫₀^v_stop dv / Q
//
// and without a receiver, in the source level h (v = V(h₀) − V(h)),
//
//	dh/dt = −Q(h)/A(h),  t = ∫_{h_stop}^{h₀} A(h)/Q(h) dh
//
// (the quasi-steady tank-draining equation, as in Çengel & Cimbala, Fluid
// Mechanics: Fundamentals and Applications, Ch. 5 example "Discharge of water
// from a tank"; closed forms for cylinders and spheres in the project's
// reference notes, calc/testdata/reference/hydraulics.md §7).
//
// Method. The full-gravity flow depends on the levels only through the head
// H, so it and the flowing crest limit C(H) are solved (the energy equation
// of Solve) at 6–24 heads spaced evenly in ln H and interpolated by local
// cubics in u = √H, Q as u·φ(u) (φ is constant for fixed losses, linear in u
// for laminar flow). Where the siphon runs choked the flow depends only on
// the crest's headroom Δ = RunningCrestHeight − lift, and a second table in
// √Δ holds it. At each level Q is the smaller of the two, with the head less
// the gulping loss between the air-starts and prime-lost levels (see
// Intake). The stop is the first of:
//
//   - target:  h = Target;
//   - intake:  h = the prime-lost level at the flow there;
//   - air:     h = the air-starts level, when a floating film may be drawn
//     in with no cover over the intake, or, while gulping, where the
//     down-leg no longer clears air (V < V_c);
//   - crest:   lift = RunningCrestHeight − EqualHead (the choked flow
//     tapers to nothing);
//   - equal:   H = EqualHead;
//   - receiver_full: the receiver holds its brim volume;
//   - settles: with an inflow Q_in, within SettleMargin of the level h_s
//     where Q(h_s) = Q_in, when h_s lies above every other stop.
//
// Inflow. With liquid coming in at a constant Q_in (rain on the catchment,
// seepage, leakage) the source level obeys the volume balance
//
//	A(h)·dh/dt = Q_in − Q(h),  t = ∫_{h_stop}^{h₀} A(h)/(Q(h) − Q_in) dh
//
// (conservation of mass for a control volume, Çengel & Cimbala Ch. 5; the
// inflow-outflow tank of any hydrology text's level-pool routing). The
// integrand grows as 1/(h − h_s) towards the settle level, so the time to it
// is infinite and the plan stops SettleMargin above it, integrating in
// u = −ln(h − h_s) where the integrand is smooth. When Q_in ≥ Q(h₀) the
// level rises instead, t = ∫_{h₀}^{h_end} A/(Q_in − Q) dh with Solve at each
// node, to within SettleMargin of the level where Q = Q_in, or to the brim.
// The volume moved by the siphon is V(h₀) − V(h_stop) + Q_in·t. Inflow
// with a Receiver is refused (a transfer's two levels are then no longer
// tied by one volume).
//
// Events that follow the flow are located on the interpolants by Brent's
// method (R.P. Brent, Algorithms for Minimization without Derivatives, 1973,
// ch. 4). The time integral is taken by composite 4-point Gauss–Lobatto
// quadrature in a variable w with the path position x = x₀ − w², x₀ the
// point where the flow vanishes (levels equal, or the crest's headroom gone);
// near it Q ∝ √(x₀ − x), so the integrand has a 1/√ singularity in x but is
// smooth in w and the integral is finite.
//
// Accuracy: the test suite checks the closed forms of
// calc/testdata/reference/hydraulics.md §7 to 1e-6 and an independent fixed-step
// Runge–Kutta integration with Solve at every step to 0.1 %; against an
// adaptive Dormand–Prince 5(4) integration at tolerance 1e-12 the time to
// the stop is within 7.6e-7 (intake), 1.0e-5 (levels equal) and 8.6e-7
// (crest) on the three cases of calc/dopri_drain_test.go.
//
// Special cases:
//   - a siphon that does not run at the start gives a plan of zero time whose
//     StopReason says why (crest for a crest too high, a boiling liquid or a
//     collapsing hose; equal for no drop; intake for prime lost; air when
//     air drawn in would not be cleared);
//   - a head at the start of EqualHead or less: equal, zero time;
//   - a receiver already full: receiver_full, zero time.
//
// Errors: Solve's errors for the siphon; a *RangeError for a start level not
// in (0, tank height], an intake not in [0, start level), a target not in
// [0, start level), a curve size not in {0} ∪ [2, MaxCurvePoints], a receiver
// level not in [0, its height], a receiver floor beyond ±MaxElevation, an
// inflow not in [0, MaxFlowRate] or given with a receiver; an
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
// the path limits, the hose's constants and the flow tables.
type planner struct {
	s        Siphon // at the start, with a MaxFlow valve set and MaxFlow cleared
	src, rcv Tank
	hasRcv   bool
	points   int

	h0, intake, crest, hoseEnd float64
	rcvFloor, vs0, vr0, vrCap  float64
	target                     float64 // < 0: none
	qin                        float64 // inflow, m³/s
	eps                        float64

	// hose constants (see siphonCase)
	c                   siphonCase
	runHeight, runAllow float64 // RunningCrestHeight; (p_run − p_v)/(ρg)
	workAllow           float64 // (p_work − p_v)/(ρg)
	film                bool    // stop where air starts
	rating              float64 // gauge vacuum the hose is rated for; < 0 none

	// tank heights and brim volumes, and the last levels found (Newton's
	// starting points for the next inverse of V(h) along a transfer)
	srcTop, srcFull, rcvTop float64
	lastHs, lastHr          float64

	fixed    *fixedLoss
	tab      flowTable // full-gravity flow and crest limit in √H
	chk      flowTable // choked flow in √Δ
	hasChoke bool
	start    Result
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
	if err := p.initTarget(in.Target); err != nil {
		return err
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
	if err := p.initReceiver(in.Receiver, top); err != nil {
		return err
	}
	if err := p.initInflow(in.Inflow); err != nil {
		return err
	}
	// Validate the siphon itself at the start.
	start, err := p.solveAt(0)
	if err != nil {
		return err
	}
	p.start = start
	if p.fixed == nil {
		p.initHose(start)
	}
	return nil
}

func (p *planner) initTarget(t Length) error {
	p.target = -1
	if t == 0 {
		return nil
	}
	if err := checkRange(QuantityTarget, "target level", float64(t), 0, p.h0, "m"); err != nil {
		return err
	}
	if float64(t) >= p.h0 {
		return &RangeError{What: QuantityTarget, Quantity: "target level", Value: float64(t), Min: 0, Max: p.h0, Unit: "m",
			Err: ErrOutOfRange, Note: "the target must be below the start level"}
	}
	p.target = float64(t)
	return nil
}

func (p *planner) initReceiver(r *Receiver, top float64) error {
	if r == nil {
		return nil
	}
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
	p.srcFull = float64(p.src.Volume(Length(top)))
	p.lastHs, p.lastHr = -1, -1
	return nil
}

// initHose fixes the hose for the drain (a MaxFlow valve set at the start
// stays set) and keeps the constants the tables and events need.
func (p *planner) initHose(start Result) {
	if p.s.MaxFlow > 0 {
		p.s.Hose.OutletK += start.MaxFlowThrottleK
		p.s.MaxFlow = 0
	}
	var r Result
	p.c.init(&p.s, &r)
	p.runHeight = float64(r.RunningCrestHeight)
	rg := p.c.rho * StandardGravity
	p.runAllow = (p.c.pRun - p.c.pv) / rg
	p.workAllow = p.c.workAllow
	in := p.s.Intake
	p.film = in.FilmRisk && !in.Covered
	p.rating = -1
	if rating, ok := hoseRating(p.s.Hose); ok {
		p.rating = rating
	}
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

// xAtLevel is the path position at which the source level is h.
func (p *planner) xAtLevel(h float64) float64 {
	if !p.hasRcv {
		return p.h0 - h
	}
	return p.vs0 - float64(p.src.Volume(Length(h)))
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
