package calc

import "math"

// GasAllowanceFraction is the share of the barometric pressure kept in hand
// at the crest for dissolved gas coming out of solution, air leaks and
// measurement error: the working crest height keeps the crest absolute
// pressure at or above p_v + p_atm/3.
//
// Common practice: about two-thirds of the theoretical lift is the most that
// is relied on in the field (wildland-fire pump hydraulics training quotes
// 22.5 ft ≈ 6.9 m for water at sea level; see shared field-practice brief
// §4.1), and siphon-spillway design keeps crest pressure above roughly −7 to
// −8 m of water at sea level, i.e. 70–80 % of the barometric limit (Novak et
// al., Hydraulic Structures; from memory, not confirmed).
const GasAllowanceFraction = 1.0 / 3

// NearBoilingFraction: a vapour pressure above this share of the barometric
// pressure earns WarnNearBoiling (our threshold: half the atmosphere is gone
// before any lift at all).
const NearBoilingFraction = 0.5

// Accepted input ranges for Solve.
const (
	MinAtmPressure = 20e3  // Pa; about 11 km altitude
	MaxAtmPressure = 120e3 // Pa
	MaxDiameter    = 2.0   // m
	MaxHoseLength  = 10e3  // m
	MaxK           = 1000.0
	MaxHoses       = 100
	MaxElevation   = 1000.0 // m, |z| on the job datum
	// MaxRelativeRoughness bounds ε/D. Colebrook–White is fitted to data up
	// to ε/D ≈ 0.05 (Moody 1944); twice that is still answered, beyond it the
	// input is a mistake (a roughness typed in the wrong unit).
	MaxRelativeRoughness = 0.1
)

// Solve computes the steady flow of a siphon and checks its crest, down-leg
// and intake.
//
// Energy equation from the source surface to the outlet, per hose
// (Darcy–Weisbach with minor losses):
//
//	H = z_surface − z_outlet = (V²/2g) · (1 + ΣK + f·L/D)
//
// where the 1 is the velocity head leaving a free outlet (or the exit loss
// K = 1 into a receiving surface), ΣK = K_entrance + K_up-leg + K_down-leg,
// and f = friction(ρVD/μ, ε/D) (see friction.go: Hagen–Poiseuille,
// Colebrook–White, and a shifted Churchill curve between). N identical hoses
// in parallel share H; the total flow is N·V·πD²/4. The equation is solved for V by fixed-point
// branch: closed form when laminar, Newton's method on 1/√f when turbulent,
// bracketing in the transition (see solveVelocity); the result satisfies the
// energy equation to about 1e-12 relative.
//
// Crest pressure while flowing (absolute), energy equation surface → crest:
//
//	p_crest = p_atm − ρg(z_crest − z_surface) − (ρV²/2)(1 + K_entrance + K_up-leg + f·L_up/D)
//
// Crest heights above the surface reported in Result:
//
//	MaxCrestHeight     = (p_atm − p_v)/(ρg)                       (zero flow)
//	FlowingCrestLimit  = MaxCrestHeight − (V²/2g)(1 + K_ent + K_up + f·L_up/D)
//	WorkingCrestHeight = FlowingCrestLimit − GasAllowanceFraction·p_atm/(ρg)
//
// (ASDSO Dam Safety Toolbox, "Siphons": the lift cannot exceed the local
// atmospheric pressure adjusted for vapour pressure and friction losses.)
//
// Air at the crest: bubbles and pockets are carried down the down-leg only
// when the velocity reaches (Wisner, Mohsen & Kouwen 1975, J. Hydraulics Div.
// ASCE 101(HY2), as given in Sanks, Pumping Station Design)
//
//	V_c = √(gD) · (0.825 + 0.25 √(sin θ))
//
// with θ the mean down-leg slope, sin θ = (z_crest − z_outlet)/L_down,
// clamped to [0, 1]. Below it, WarnAirCollects.
//
// Intake submergence against air-drawing vortices (ANSI/HI 9.8, Rotodynamic
// Pumps for Pump Intake Design):
//
//	S = D (1 + 2.3 F_D),  F_D = V/√(gD)
//
// An intake shallower than S earns WarnIntakeShallow; an intake above the
// surface cannot run.
//
// Special cases:
//   - H ≤ 0 (outlet at or above the surface): WillNotRun, WarnNoDrop, no flow.
//   - lift ≥ MaxCrestHeight, or p_crest ≤ p_v at the solved flow:
//     WillNotRun, WarnCannotRun, no flow (the liquid boils at the crest and the
//     column breaks).
//   - intake above the surface: WillNotRun, WarnIntakeShallow.
//   - p_v ≥ p_atm: error wrapping ErrBoiling.
//
// Solve does not allocate.
func Solve(s Siphon) (Result, error) {
	var r Result
	if err := validateSiphon(&s); err != nil {
		return r, err
	}
	rho := float64(s.Fluid.Density)
	mu := float64(s.Fluid.Viscosity)
	pv := float64(s.Fluid.VaporPressure)
	patm := float64(s.AtmPressure)
	D := float64(s.Hose.Diameter)
	L := float64(s.Hose.Length)
	g := StandardGravity
	geo := s.Geometry
	lift := float64(geo.Lift())
	H := float64(geo.Drop())
	area := math.Pi * D * D / 4

	lUp := float64(s.Hose.UpLegLength)
	if lUp == 0 {
		lUp = math.Max(float64(geo.Crest-geo.Intake), 0)
	}
	lUp = math.Min(lUp, L)
	lDown := L - lUp

	r.Head = Length(H)
	r.PrimingVolume = Volume(float64(s.Hoses) * area * L)
	r.MaxCrestHeight = Length((patm - pv) / (rho * g))
	r.RequiredSubmergence = Length(D)
	r.AirClearingVelocity = Velocity(airClearing(D, float64(geo.Crest-geo.Outlet), lDown))

	if pv > NearBoilingFraction*patm {
		r.Warnings.Add(WarnNearBoiling)
	}
	straightUp := math.Max(float64(geo.Crest-geo.Intake), 0)
	straightDown := math.Max(float64(geo.Crest-geo.Outlet), 0)
	if L < straightUp+straightDown {
		r.Warnings.Add(WarnHoseShort)
	}

	allowance := GasAllowanceFraction * patm / (rho * g)
	notRunning := func(why WarnCode) (Result, error) {
		r.Verdict = WillNotRun
		r.Why = why
		r.Warnings.Add(why)
		r.Regime = NoFlow
		r.FlowingCrestLimit = r.MaxCrestHeight
		r.WorkingCrestHeight = r.MaxCrestHeight - Length(allowance)
		r.CrestMargin = r.WorkingCrestHeight - Length(lift)
		r.CrestPressure = Pressure(patm - rho*g*lift)
		return r, nil
	}
	switch {
	case geo.Intake > geo.Surface:
		return notRunning(WarnIntakeShallow)
	case H <= 0:
		return notRunning(WarnNoDrop)
	case lift >= float64(r.MaxCrestHeight):
		return notRunning(WarnCannotRun)
	}

	kSum := s.Hose.KMinor()
	rr := float64(s.Hose.Roughness) / D
	V, f, re := solveVelocity(H, kSum, L/D, rho*D/mu, rr)

	kCrest := 1 + s.Hose.KEntrance + s.Hose.KUpLeg + f*lUp/D
	velHead := V * V / (2 * g)
	r.FlowingCrestLimit = r.MaxCrestHeight - Length(kCrest*velHead)
	r.WorkingCrestHeight = r.FlowingCrestLimit - Length(allowance)
	r.CrestMargin = r.WorkingCrestHeight - Length(lift)
	r.CrestPressure = Pressure(crestPressure(patm, rho, lift, V, kCrest))
	if float64(r.CrestPressure) <= pv {
		return notRunning(WarnCannotRun)
	}

	r.Velocity = Velocity(V)
	r.FlowPerHose = FlowRate(V * area)
	r.Flow = FlowRate(V * area * float64(s.Hoses))
	r.Reynolds = re
	r.FrictionFactor = f
	switch {
	case re <= ReLaminarMax:
		r.Regime = Laminar
		r.Warnings.Add(WarnLaminar)
	case re < ReTurbulentMin:
		r.Regime = Transitional
		r.Warnings.Add(WarnTransitional)
	default:
		r.Regime = Turbulent
	}
	r.RequiredSubmergence = Length(D * (1 + 2.3*V/math.Sqrt(g*D)))
	if geo.IntakeDepth() < r.RequiredSubmergence {
		r.Warnings.Add(WarnIntakeShallow)
	}
	if V < float64(r.AirClearingVelocity) {
		r.Warnings.Add(WarnAirCollects)
	}
	if r.CrestMargin < 0 {
		r.Verdict = RunsNearLimit
		r.Warnings.Add(WarnCrestNearLimit)
	}
	return r, nil
}

// solveVelocity solves the energy equation
//
//	φ(V) = V²·(A + f(cV)·B) − 2gH = 0,  A = 1 + ΣK, B = L/D, c = ρD/μ
//
// for the hose velocity V. φ increases with V in every regime (f·V² grows
// with V), so the root is unique and is found branch by branch:
//
//   - laminar: with f = 64/Re, φ is the quadratic A·V² + (64B/c)·V − 2gH,
//     solved in closed form; accepted when its Re ≤ 2000;
//   - turbulent: substituting V(x) = √(2gH/(A + B/x²)) with x = 1/√f into
//     Colebrook–White leaves one equation in x,
//     R(x) = x + 2 log10( ε/(3.7D) + 2.51·√(A x² + B)/(c √(2gH)) ) = 0,
//     with R′ > 1, solved by Newton's method; accepted when its Re ≥ 4000;
//   - otherwise the root lies in 2000 < Re < 4000 and is bracketed there;
//     the Illinois variant of regula falsi finds it.
//
// It returns V, the Darcy f and Re; f is friction at that Re, the same
// function the friction checks test.
func solveVelocity(H, k, lOverD, reOverV, rr float64) (V, f, re float64) {
	twoGH := 2 * StandardGravity * H
	A := 1 + k
	B := lOverD
	c := reOverV

	// Laminar branch, closed form (the cancellation-free root of the quadratic).
	bl := 64 * B / c
	V = 2 * twoGH / (bl + math.Sqrt(bl*bl+4*A*twoGH))
	if re = c * V; re <= ReLaminarMax {
		return V, friction(re, rr, 0), re
	}
	// Above Re 2000 the transitional f exceeds 64/Re, so the laminar root
	// is an upper bound for the transitional one.
	vLam := V

	// Turbulent branch, Newton on x = 1/√f.
	a := rr / 3.7
	beta := 2.51 / (c * math.Sqrt(twoGH))
	const k10 = 2 / math.Ln10
	x := 7.0 // f ≈ 0.02
	for i := 0; i < 60; i++ {
		q := math.Sqrt(A*x*x + B)
		s := a + beta*q
		r := x + k10*math.Log(s)
		d := r / (1 + k10*beta*A*x/(q*s))
		x -= d
		if x <= 0 {
			x = 1e-3
		}
		// Newton converges quadratically: after a step of 1e-7·x the
		// error left is of order 1e-14·x, and friction() below confirms
		// x against Colebrook–White itself.
		if math.Abs(d) <= 1e-7*x {
			break
		}
	}
	V = math.Sqrt(twoGH / (A + B/(x*x)))
	if re = c * V; re >= ReTurbulentMin {
		return V, friction(re, rr, x), re
	}

	// Transitional band: Illinois regula falsi on V. Colebrook–White lies
	// above the shifted Churchill curve in the band (they meet at 4000), so
	// the turbulent root is a lower bound, as the laminar root is an upper
	// one; each bound is checked and replaced by the band's end if it fails.
	vTurb := V
	lo, hi := transitionShift(rr)
	phi := func(v float64) float64 {
		return v*v*(A+transitionFriction(c*v, rr, lo, hi)*B) - twoGH
	}
	v0, v1 := math.Max(ReLaminarMax/c, vTurb), math.Min(ReTurbulentMin/c, vLam)
	p0, p1 := phi(v0), phi(v1)
	if p0 > 0 {
		v0 = ReLaminarMax / c
		p0 = phi(v0)
	}
	if p1 < 0 {
		v1 = ReTurbulentMin / c
		p1 = phi(v1)
	}
	side := 0
	V = v0
	for i := 0; i < 200 && p0 != p1; i++ {
		V = (v0*p1 - v1*p0) / (p1 - p0)
		p := phi(V)
		if p == 0 || math.Abs(v1-v0) <= 1e-11*V || math.Abs(p) <= 1e-12*twoGH {
			break
		}
		if (p > 0) == (p1 > 0) {
			v1, p1 = V, p
			if side == -1 {
				p0 /= 2
			}
			side = -1
		} else {
			v0, p0 = V, p
			if side == 1 {
				p1 /= 2
			}
			side = 1
		}
	}
	re = c * V
	// friction(re, rr, 0) in this band, with the shift already computed
	return V, transitionFriction(re, rr, lo, hi), re
}

// crestPressure is the absolute crest pressure while flowing (Bernoulli with
// losses, source surface → crest): p_atm − ρg·lift − kCrest·ρV²/2, where
// kCrest = 1 + K_entrance + K_up-leg + f·L_up/D.
func crestPressure(patm, rho, lift, v, kCrest float64) float64 {
	return patm - rho*StandardGravity*lift - kCrest*rho*v*v/2
}

// airClearing is the Wisner et al. (1975) air-clearing velocity for inside
// diameter D (m), fall from crest to outlet dz (m) over down-leg length l (m).
func airClearing(D, dz, l float64) float64 {
	sin := 1.0
	if l > 0 {
		sin = math.Min(math.Max(dz/l, 0), 1)
	}
	return math.Sqrt(StandardGravity*D) * (0.825 + 0.25*math.Sqrt(sin))
}

func validateSiphon(s *Siphon) error {
	if err := s.Fluid.Validate(); err != nil {
		return err
	}
	if err := checkRange(QuantityAtmPressure, "barometric pressure", float64(s.AtmPressure), MinAtmPressure, MaxAtmPressure, "Pa"); err != nil {
		return err
	}
	if s.Fluid.VaporPressure >= s.AtmPressure {
		return &RangeError{What: QuantityVaporPressure, Quantity: "liquid vapour pressure", Value: float64(s.Fluid.VaporPressure),
			Min: 0, Max: float64(s.AtmPressure), Unit: "Pa", Err: ErrBoiling,
			Note: "the liquid boils at this site's barometric pressure"}
	}
	h := s.Hose
	if err := checkPositive(QuantityHoseDiameter, "hose inside diameter", float64(h.Diameter), MaxDiameter, "m"); err != nil {
		return err
	}
	if err := checkPositive(QuantityHoseLength, "hose length", float64(h.Length), MaxHoseLength, "m"); err != nil {
		return err
	}
	if err := checkRange(QuantityRoughness, "hose roughness", float64(h.Roughness), 0, MaxRelativeRoughness*float64(h.Diameter), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange && h.Roughness > 0 {
			re.Err = ErrGeometry
			re.Note = "roughness must be under a tenth of the inside diameter; the Moody chart ends at ε/D = 0.05"
		}
		return err
	}
	if err := checkRange(QuantityUpLegLength, "up-leg length", float64(h.UpLegLength), 0, float64(h.Length), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange {
			re.Err = ErrGeometry
			re.Note = "the up-leg is part of the hose"
		}
		return err
	}
	for _, k := range [...]struct {
		what Quantity
		name string
		v    float64
	}{{QuantityKEntrance, "entrance loss coefficient", h.KEntrance}, {QuantityKUpLeg, "up-leg fittings loss coefficient", h.KUpLeg},
		{QuantityKDownLeg, "down-leg fittings loss coefficient", h.KDownLeg}} {
		if err := checkRange(k.what, k.name, k.v, 0, MaxK, ""); err != nil {
			return err
		}
	}
	if err := checkRange(QuantityHoses, "number of hoses", float64(s.Hoses), 1, MaxHoses, ""); err != nil {
		return err
	}
	g := s.Geometry
	for _, z := range [...]struct {
		what Quantity
		name string
		v    Length
	}{{QuantitySurface, "source surface elevation", g.Surface}, {QuantityIntake, "intake elevation", g.Intake},
		{QuantityCrest, "crest elevation", g.Crest}, {QuantityOutlet, "outlet elevation", g.Outlet}} {
		if err := checkRange(z.what, z.name, float64(z.v), -MaxElevation, MaxElevation, "m"); err != nil {
			return err
		}
	}
	if g.Crest < g.Intake {
		return &RangeError{What: QuantityCrest, Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Intake), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the intake"}
	}
	if !g.OutletSubmerged && g.Crest < g.Outlet {
		return &RangeError{What: QuantityCrest, Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Outlet), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the outlet"}
	}
	return nil
}
