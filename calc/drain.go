package calc

import (
	"errors"
	"math"
	"strconv"
)

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

// fixedLoss replaces Solve with a constant-coefficient orifice law,
// Q = C·a·√(2gH), for checks against the closed forms (tests only).
type fixedLoss struct {
	c, area, g float64
}

// tableMax is the most heads at which Solve is sampled.
const tableMax = 24

// flowTable holds Solve's results at heads H_j spaced evenly in ln H:
// u_j = √H_j, φ_j = Q_j/u_j, S_j and the flowing crest limit C_j.
type flowTable struct {
	n     int
	u     [tableMax]float64
	phi   [tableMax]float64
	sub   [tableMax]float64
	crest [tableMax]float64
	// inv[j][i] is 1/∏(u_{j+i} − u_{j+k}), k ≠ i: Lagrange denominators of
	// the stencil starting at j.
	inv [tableMax][4]float64
}

// prepare computes the Lagrange denominators once the samples are in.
func (t *flowTable) prepare() {
	for j := 0; j+3 < t.n; j++ {
		for i := 0; i < 4; i++ {
			d := 1.0
			for k := 0; k < 4; k++ {
				if k != i {
					d *= t.u[j+i] - t.u[j+k]
				}
			}
			t.inv[j][i] = 1 / d
		}
	}
}

// at returns Q, S and the flowing crest limit at head H. With u = √H it
// interpolates φ = Q/u, S and C by the cubic through the four nearest samples
// in u (Lagrange form); φ is nearly constant for fixed losses and linear in u
// for laminar flow, so Q = u·φ(u) keeps the √H behaviour near equal levels
// exactly. Outside the sampled heads the end cubic is extended (the plan never
// asks far outside).
func (t *flowTable) at(H float64) (q, s, c float64) {
	u := math.Sqrt(max(H, 0))
	n := t.n
	if n == 1 {
		return u * t.phi[0], t.sub[0], t.crest[0]
	}
	if n < 4 {
		// linear between the two nearest samples
		j := 0
		if n == 3 && u > t.u[1] {
			j = 1
		}
		w := (u - t.u[j]) / (t.u[j+1] - t.u[j])
		return u * (t.phi[j] + w*(t.phi[j+1]-t.phi[j])), t.sub[j] + w*(t.sub[j+1]-t.sub[j]),
			t.crest[j] + w*(t.crest[j+1]-t.crest[j])
	}
	// k: last sample with u_k ≤ u (binary search), stencil k−1 … k+2
	lo, hi := 0, n-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if t.u[mid] <= u {
			lo = mid
		} else {
			hi = mid
		}
	}
	j := lo - 1
	if j < 0 {
		j = 0
	}
	if j > n-4 {
		j = n - 4
	}
	d0, d1, d2, d3 := u-t.u[j], u-t.u[j+1], u-t.u[j+2], u-t.u[j+3]
	inv := &t.inv[j]
	d01, d23 := d0*d1, d2*d3
	l0 := d1 * d23 * inv[0]
	l1 := d0 * d23 * inv[1]
	l2 := d01 * d3 * inv[2]
	l3 := d01 * d2 * inv[3]
	q = u * (l0*t.phi[j] + l1*t.phi[j+1] + l2*t.phi[j+2] + l3*t.phi[j+3])
	s = l0*t.sub[j] + l1*t.sub[j+1] + l2*t.sub[j+2] + l3*t.sub[j+3]
	c = l0*t.crest[j] + l1*t.crest[j+1] + l2*t.crest[j+2] + l3*t.crest[j+3]
	return max(q, 0), s, c
}

// xmap maps s ∈ [0, 1] to the path variable x (source level fallen, or volume
// moved) either linearly or through w with x = x0 − w².
type xmap struct {
	sq         bool
	x0, wa, wb float64
	xe         float64
}

func newXmap(x0 float64, haveX0 bool, xe float64) xmap {
	if haveX0 && x0 >= xe && x0 > 0 {
		return xmap{sq: true, x0: x0, wa: math.Sqrt(x0), wb: math.Sqrt(math.Max(x0-xe, 0)), xe: xe}
	}
	return xmap{xe: xe}
}

// at returns x(s) and dx/ds.
func (m xmap) at(s float64) (x, dxds float64) {
	if !m.sq {
		return s * m.xe, m.xe
	}
	w := m.wa + s*(m.wb-m.wa)
	x = m.x0 - w*w
	if s >= 1 {
		x = m.xe
	}
	return x, 2 * w * (m.wa - m.wb)
}

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
		return &RangeError{Quantity: "source tank", Err: ErrNoTank, Unit: "", Min: math.Inf(-1), Max: math.Inf(1),
			Note: "a drain plan needs the tank's shape and size"}
	}
	p.s = in.Siphon
	p.src = in.Tank
	p.eps = float64(EqualHead)
	top := float64(in.Tank.Height())
	g := in.Siphon.Geometry
	if err := checkPositive("start level", float64(g.Surface), top, "m"); err != nil {
		return err
	}
	p.h0 = float64(g.Surface)
	if err := checkRange("intake height", float64(g.Intake), 0, p.h0, "m"); err != nil {
		if re, ok := err.(*RangeError); ok && g.Intake > g.Surface {
			re.Err = ErrGeometry
			re.Note = "the intake must be below the start level"
		}
		return err
	}
	if in.Target != 0 {
		if err := checkRange("target level", float64(in.Target), 0, p.h0, "m"); err != nil {
			return err
		}
		if in.Target >= g.Surface {
			return &RangeError{Quantity: "target level", Value: float64(in.Target), Min: 0, Max: p.h0, Unit: "m",
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
		if err := checkRange("curve points", float64(points), 2, MaxCurvePoints, ""); err != nil {
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
			return &RangeError{Quantity: "receiving tank", Err: ErrNoTank, Min: math.Inf(-1), Max: math.Inf(1),
				Note: "a transfer needs the receiver's shape and size"}
		}
		if err := checkRange("receiver floor elevation", float64(r.Floor), -MaxElevation, MaxElevation, "m"); err != nil {
			return err
		}
		if err := checkRange("receiver level", float64(r.Level), 0, float64(r.Tank.Height()), "m"); err != nil {
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

// sample runs Solve for head H in a stand-in geometry with the smallest lift
// of the plan and the real up-leg, and returns Q, S and the flowing crest
// limit. ok is false if even that geometry will not run.
func (p *planner) sample(H float64) (q, sub, crest float64, ok bool, err error) {
	if p.fixed != nil {
		return p.fixed.c * p.fixed.area * math.Sqrt(2*p.fixed.g*H), 0, 1e6, true, nil
	}
	s := p.s
	lift := math.Max(math.Min(p.crest-p.h0, 0), -500)
	s.Geometry.Surface = Length(H / 2)
	s.Geometry.Outlet = Length(-H / 2)
	s.Geometry.Crest = Length(H/2 + lift)
	s.Geometry.Intake = s.Geometry.Crest
	s.Geometry.OutletSubmerged = true
	s.Hose.UpLegLength = Length(p.lUp)
	r, err := Solve(s)
	if err != nil {
		return 0, 0, 0, false, err
	}
	if r.Verdict == WillNotRun {
		return 0, float64(r.RequiredSubmergence), float64(r.FlowingCrestLimit), false, nil
	}
	return float64(r.Flow), float64(r.RequiredSubmergence), float64(r.FlowingCrestLimit), true, nil
}

// build fills the flow table for heads in [hLo, hHi].
func (p *planner) build(hLo, hHi float64) error {
	t := &p.tab
	zr := math.Log(hHi / hLo)
	n := int(math.Ceil(zr/0.3)) + 5
	if zr < 1e-9 {
		n = 1
	} else if n > tableMax {
		n = tableMax
	} else if n < 6 {
		n = 6
	}
	if p.fixed != nil && n > 4 {
		n = 4
	}
	t.n = n
	dz := 0.0
	if n > 1 {
		dz = zr / float64(n-1)
	}
	for j := 0; j < n; j++ {
		H := hLo * math.Exp(float64(j)*dz)
		if j == n-1 {
			H = hHi
		}
		q, s, c, ok, err := p.sample(H)
		if err != nil {
			return err
		}
		if !ok || !(q > 0) {
			// Only reachable when the crest fails at zero lift: stand in a
			// tiny flow and a crest limit below any lift so that the crest
			// event fires here.
			q = 1e-300
			c = math.Min(c, -1e3)
		}
		t.u[j] = math.Sqrt(H)
		t.phi[j] = q / t.u[j]
		t.sub[j] = s
		t.crest[j] = c
	}
	t.prepare()
	return nil
}

type event int

const (
	evIntake event = iota
	evCrest
	evWorking
)

// g is the event function for ev at x: positive while the drain goes on.
func (p *planner) g(ev event, x float64) float64 {
	hs, _, _, H := p.state(x)
	if H <= 0 {
		return -1
	}
	_, s, c := p.tab.at(H)
	switch ev {
	case evIntake:
		return hs - p.intake - s
	case evCrest:
		return c - (p.crest - hs)
	default:
		return c - p.allowance - (p.crest - hs)
	}
}

// gHead is H(x) − target for root finding on the geometry alone.
func (p *planner) gHead(x, target float64) float64 {
	_, _, _, H := p.state(x)
	return H - target
}

// brent finds a root of f in [a, b] with f(a) > 0 ≥ f(b) (Brent 1973, ch. 4,
// "zero"), to |b − a| ≤ tol. It returns the end that is still positive when
// keepPos is set, else the best estimate.
func brent(f func(float64) float64, a, b, fa, fb, tol float64, keepPos bool) float64 {
	c, fc := a, fa
	d := b - a
	e := d
	pos := a
	for i := 0; i < 200; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		if fb >= 0 {
			pos = b
		} else if fc >= 0 {
			pos = c
		}
		tol1 := 2*1e-16*math.Abs(b) + tol/2
		m := (c - b) / 2
		if math.Abs(m) <= tol1 || fb == 0 {
			break
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var pp, q float64
			if a == c {
				pp = 2 * m * s
				q = 1 - s
			} else {
				qq := fa / fc
				r := fb / fc
				pp = s * (2*m*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if pp > 0 {
				q = -q
			} else {
				pp = -pp
			}
			if 2*pp < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = pp / q
			} else {
				d = m
				e = d
			}
		} else {
			d = m
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = f(b)
	}
	if keepPos {
		if fb >= 0 {
			return b
		}
		return pos
	}
	return b
}

// scanRoots scans the intake, crest and working-limit events over the map m
// at n+1 points and returns, for each, the first x at which it turns
// non-positive (located by Brent's method) and whether it did.
func (p *planner) scanRoots(m xmap, n int, tol float64) (roots [3]float64, found [3]bool) {
	evs := [3]event{evIntake, evCrest, evWorking}
	var prevX [3]float64
	var prevG [3]float64
	open := 0
	for k := 0; k <= n; k++ {
		x, _ := m.at(float64(k) / float64(n))
		hs, _, _, H := p.state(x)
		var g [3]float64
		if H <= 0 {
			g = [3]float64{-1, -1, -1}
		} else {
			_, sub, c := p.tab.at(H)
			g = [3]float64{hs - p.intake - sub, c - (p.crest - hs), c - p.allowance - (p.crest - hs)}
		}
		open = 0
		for e := range evs {
			if found[e] {
				continue
			}
			switch {
			case g[e] > 0:
				open++
			case k == 0:
				roots[e], found[e] = 0, true
			default:
				ev := evs[e]
				f := func(x float64) float64 { return p.g(ev, x) }
				roots[e], found[e] = brent(f, prevX[e], x, prevG[e], g[e], tol, true), true
			}
			prevX[e], prevG[e] = x, g[e]
		}
		if open == 0 {
			break
		}
	}
	return roots, found
}

// x limits (path variable) for the geometric stops.
func (p *planner) geoLimits() (xBottom, xTarget, xFull, xEqual, x0 float64, haveX0 bool) {
	inf := math.Inf(1)
	xTarget, xFull, xEqual = inf, inf, inf
	if !p.hasRcv {
		xBottom = p.h0 - p.intake
		if p.target >= 0 {
			xTarget = p.h0 - p.target
		}
		x0 = p.h0 - p.hoseEnd
		xEqual = x0 - p.eps
		return xBottom, xTarget, xFull, xEqual, x0, true
	}
	xBottom = p.vs0 - float64(p.src.Volume(Length(p.intake)))
	if p.target >= 0 {
		xTarget = p.vs0 - float64(p.src.Volume(Length(p.target)))
	}
	xFull = p.vrCap - p.vr0
	lim := math.Min(xBottom, xFull)
	tol := 1e-13 * math.Max(p.vs0, 1e-9)
	_, _, _, H0 := p.state(0)
	_, _, _, Hl := p.state(lim)
	if Hl <= 0 && H0 > 0 {
		x0 = brent(func(x float64) float64 { return p.gHead(x, 0) }, 0, lim, H0, Hl, tol, false)
		haveX0 = true
	}
	if Hl <= p.eps && H0 > p.eps {
		xEqual = brent(func(x float64) float64 { return p.gHead(x, p.eps) }, 0, lim, H0-p.eps, Hl-p.eps, tol, true)
	} else if H0 <= p.eps {
		xEqual = 0
	}
	return xBottom, xTarget, xFull, xEqual, x0, haveX0
}

// levelTol is the path tolerance that corresponds to about 1e-9 m of level.
func (p *planner) xTol(x float64) float64 {
	if !p.hasRcv {
		return 1e-10 * math.Max(1, p.h0)
	}
	hs, _, _, _ := p.state(x)
	return 1e-10 * math.Max(float64(p.src.Area(Length(hs))), 1e-6)
}

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
	if start.Verdict == WillNotRun {
		switch start.Why {
		case WarnCannotRun:
			plan.CrestLimitLevel, plan.CrestLimitFound = Length(p.h0), true
			plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(p.h0), true
			return stopNow(StopCrest)
		case WarnIntakeShallow:
			return stopNow(StopIntake)
		default: // WarnNoDrop: the levels are already equal or reversed
		}
		return stopNow(StopEqual)
	}
	if start.Verdict == RunsNearLimit {
		plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(p.h0), true
	}
	if start.Warnings.Has(WarnIntakeShallow) {
		return stopNow(StopIntake)
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
	scan := newXmap(x0, haveX0, xMax)
	const scanN = 64
	tolX := p.xTol(0)
	roots, found := p.scanRoots(scan, scanN, tolX)
	xIntake, okI := roots[0], found[0]
	xCrest, okC := roots[1], found[1]
	if okC {
		hs, _, _, _ := p.state(xCrest)
		plan.CrestLimitLevel, plan.CrestLimitFound = Length(hs), true
	}
	if !plan.WorkingLimitFound {
		if xw, ok := roots[2], found[2]; ok {
			hs, _, _, _ := p.state(xw)
			plan.WorkingLimitLevel, plan.WorkingLimitFound = Length(hs), true
		}
	}

	xStop, why := xMax, StopEqual
	if xBottom <= xStop && xBottom < xEqual {
		xStop, why = xBottom, StopIntake
	}
	if xFull <= xStop {
		xStop, why = xFull, StopReceiverFull
	}
	if xTarget <= xStop {
		xStop, why = xTarget, StopTarget
	}
	if okI && xIntake <= xStop {
		xStop, why = xIntake, StopIntake
	}
	if okC && xCrest <= xStop {
		xStop, why = xCrest, StopCrest
	}
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

// polishCrest moves the crest stop found on the interpolant onto the point
// where Solve's verdict flips in the real geometry, keeping the running side.
func (p *planner) polishCrest(x, xMax float64) (float64, error) {
	runs := func(x float64) (bool, error) {
		r, err := p.solveAt(x)
		return r.Verdict != WillNotRun, err
	}
	d0 := p.xTol(x) * 100
	// a: running; step back until it is.
	a, d := x, d0
	okA, err := runs(a)
	for i := 0; err == nil && !okA && a > 0 && i < 40; i++ {
		a = math.Max(a-d, 0)
		d *= 4
		okA, err = runs(a)
	}
	if err != nil {
		return x, err
	}
	if !okA {
		return 0, nil
	}
	// b: not running; step forward until it is not.
	b := a
	d = d0
	for i := 0; i < 60; i, d = i+1, d*4 {
		b = math.Min(a+d, xMax)
		okB, err := runs(b)
		if err != nil {
			return x, err
		}
		if !okB {
			break
		}
		a = b
		if b >= xMax {
			return b, nil
		}
	}
	for i := 0; i < 60 && b-a > 10*d0; i++ {
		m := (a + b) / 2
		ok, err := runs(m)
		if err != nil {
			return x, err
		}
		if ok {
			a = m
		} else {
			b = m
		}
	}
	return a, nil
}

// Gauss–Lobatto 4-point rule on [−1, 1]: nodes ±1, ±1/√5, weights 1/6, 5/6;
// exact for polynomials of degree ≤ 5 (Lobatto integration, Abramowitz &
// Stegun, Handbook of Mathematical Functions, 25.4.32).
const lobattoInner = 0.4472135954999579

// quadIntervals is the number of quadrature intervals over the drain.
const quadIntervals = 64

// integrate fills the time, volume, stop values and the curve over [0, xe].
//
// The path parameter s ∈ [0, 1] is itself written as s = σ²(3 − 2σ), which
// crowds the quadrature nodes at both ends: a full horizontal cylinder starts
// with A ∝ √(D − h), an integrable kink that this smooths out. t(σ) is
// integrated by the composite Gauss–Lobatto rule on quadIntervals equal steps
// in σ; curve points, evenly spaced in σ, take t from the cubic Hermite
// interpolant of t and dt/dσ at the step ends (error O(Δσ⁴)).
func (p *planner) integrate(plan *DrainPlan, m xmap) {
	// dt/dσ at σ
	rate := func(sg float64) float64 {
		x, dxds := m.at(sg * sg * (3 - 2*sg))
		hs, _, _, H := p.state(x)
		if H <= 0 {
			return 0
		}
		q, _, _ := p.tab.at(H)
		if !(q > 0) {
			return 0
		}
		return 6 * sg * (1 - sg) * dxds * p.dvdx(hs) / q
	}
	var ts, fs [quadIntervals + 1]float64
	ds := 1.0 / quadIntervals
	fs[0] = rate(0)
	for k := 0; k < quadIntervals; k++ {
		mid := (float64(k) + 0.5) * ds
		fb := rate(float64(k+1) * ds)
		fi := rate(mid-lobattoInner*ds/2) + rate(mid+lobattoInner*ds/2)
		ts[k+1] = ts[k] + ds/2*((fs[k]+fb)/6+fi*5/6)
		fs[k+1] = fb
	}
	if nc := p.points; nc > 0 {
		plan.Curve = make([]DrainPoint, nc)
		for i := range plan.Curve {
			sg := float64(i) / float64(nc-1)
			k := int(sg * quadIntervals)
			if k >= quadIntervals {
				k = quadIntervals - 1
			}
			r := sg*quadIntervals - float64(k) // 0…1 within the step
			r2, r3 := r*r, r*r*r
			t := (2*r3-3*r2+1)*ts[k] + (r3-2*r2+r)*ds*fs[k] + (-2*r3+3*r2)*ts[k+1] + (r3-r2)*ds*fs[k+1]
			t = max(ts[k], min(ts[k+1], t))
			x, _ := m.at(sg * sg * (3 - 2*sg))
			hs, hr, _, H := p.state(x)
			q, _, _ := p.tab.at(max(H, 0))
			plan.Curve[i] = DrainPoint{Time: Seconds(t), Level: Length(hs), Flow: FlowRate(q), ReceiverLevel: Length(hr)}
		}
	}
	hs, hr, _, H := p.state(m.xe)
	q, _, _ := p.tab.at(math.Max(H, 0))
	plan.Time = Seconds(ts[quadIntervals])
	plan.StopLevel = Length(hs)
	plan.ReceiverLevel = Length(hr)
	plan.Residual = p.src.Volume(Length(hs))
	if p.hasRcv {
		plan.Volume = Volume(m.xe)
	} else {
		plan.Volume = Volume(p.vs0 - float64(plan.Residual))
	}
	plan.EndFlow = FlowRate(q)
	if n := len(plan.Curve); n > 0 {
		plan.Curve[n-1].Time = plan.Time
	}
}
