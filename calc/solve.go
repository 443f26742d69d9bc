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
// and f = FrictionFactor(ρVD/μ, ε/D). N identical hoses in parallel share H;
// the total flow is N·V·πD²/4. The equation is solved for V by fixed-point
// iteration V ← √(2gH/(1 + ΣK + f(V)L/D)), which contracts (rate < ½ in
// laminar flow, ≈ 1/8 in rough turbulent flow) because f·V² grows with V;
// iterations stop at a relative change below 1e-12.
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
	V, f, re, _ := solveVelocity(H, kSum, L/D, rho*D/mu, rr)

	kCrest := 1 + s.Hose.KEntrance + s.Hose.KUpLeg + f*lUp/D
	velHead := V * V / (2 * g)
	r.FlowingCrestLimit = r.MaxCrestHeight - Length(kCrest*velHead)
	r.WorkingCrestHeight = r.FlowingCrestLimit - Length(allowance)
	r.CrestMargin = r.WorkingCrestHeight - Length(lift)
	r.CrestPressure = Pressure(patm - rho*g*lift - rho*g*kCrest*velHead)
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

// solveVelocity solves H = (V²/2g)(1 + k + f(Re)·lOverD) for V by fixed-point
// iteration. reOverV is ρD/μ. It returns V, f, Re and the last 1/√f iterate.
func solveVelocity(H, k, lOverD, reOverV, rr float64) (V, f, re, x float64) {
	twoGH := 2 * StandardGravity * H
	f = 0.02
	V = math.Sqrt(twoGH / (1 + k + f*lOverD))
	for i := 0; i < 500; i++ {
		re = reOverV * V
		if re >= ReTurbulentMin {
			x = colebrookX(re, rr, x)
			f = 1 / (x * x)
		} else {
			f = friction(re, rr, 0)
		}
		vNew := math.Sqrt(twoGH / (1 + k + f*lOverD))
		d := vNew - V
		V = vNew
		if math.Abs(d) <= 1e-12*V {
			break
		}
	}
	re = reOverV * V
	return V, f, re, x
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
	if err := checkRange("barometric pressure", float64(s.AtmPressure), MinAtmPressure, MaxAtmPressure, "Pa"); err != nil {
		return err
	}
	if s.Fluid.VaporPressure >= s.AtmPressure {
		return &RangeError{Quantity: "liquid vapour pressure", Value: float64(s.Fluid.VaporPressure),
			Min: 0, Max: float64(s.AtmPressure), Unit: "Pa", Err: ErrBoiling,
			Note: "the liquid boils at this site's barometric pressure"}
	}
	h := s.Hose
	if err := checkPositive("hose inside diameter", float64(h.Diameter), MaxDiameter, "m"); err != nil {
		return err
	}
	if err := checkPositive("hose length", float64(h.Length), MaxHoseLength, "m"); err != nil {
		return err
	}
	if err := checkRange("hose roughness", float64(h.Roughness), 0, float64(h.Diameter)/2, "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange {
			re.Err = ErrGeometry
			re.Note = "roughness must be less than half the inside diameter"
		}
		return err
	}
	if err := checkRange("up-leg length", float64(h.UpLegLength), 0, float64(h.Length), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange {
			re.Err = ErrGeometry
			re.Note = "the up-leg is part of the hose"
		}
		return err
	}
	for _, k := range [...]struct {
		name string
		v    float64
	}{{"entrance loss coefficient", h.KEntrance}, {"up-leg fittings loss coefficient", h.KUpLeg}, {"down-leg fittings loss coefficient", h.KDownLeg}} {
		if err := checkRange(k.name, k.v, 0, MaxK, ""); err != nil {
			return err
		}
	}
	if err := checkRange("number of hoses", float64(s.Hoses), 1, MaxHoses, ""); err != nil {
		return err
	}
	g := s.Geometry
	for _, z := range [...]struct {
		name string
		v    Length
	}{{"source surface elevation", g.Surface}, {"intake elevation", g.Intake}, {"crest elevation", g.Crest}, {"outlet elevation", g.Outlet}} {
		if err := checkRange(z.name, float64(z.v), -MaxElevation, MaxElevation, "m"); err != nil {
			return err
		}
	}
	if g.Crest < g.Intake {
		return &RangeError{Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Intake), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the intake"}
	}
	if !g.OutletSubmerged && g.Crest < g.Outlet {
		return &RangeError{Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Outlet), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the outlet"}
	}
	return nil
}
