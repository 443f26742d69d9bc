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

// MaxFlowRate bounds Siphon.MaxFlow, m³/s.
const MaxFlowRate = 100.0

// Solve computes the steady flow of a siphon and checks its crest, intake,
// down-leg and hose.
//
// Energy equation from the source surface to the outlet, per hose
// (Darcy–Weisbach with minor losses):
//
//	H = z_surface − z_outlet = (V²/2g) · (1 + ΣK + f·L/D)
//
// where the 1 is the velocity head leaving a free outlet (or the exit loss
// K = 1 into a receiving surface), ΣK = K_entrance + K_intake + K_up-leg +
// K_down-leg + K_outlet, and f = friction(ρVD/μ, ε/D) (see friction.go:
// Hagen–Poiseuille, Colebrook–White, and a shifted Churchill curve between).
// N identical hoses in parallel share H; the total flow is N·V·πD²/4. The
// equation is solved for V branch by branch (see solveVelocity); the result
// satisfies it to about 1e-12 relative.
//
// Crest pressure while flowing (absolute), energy equation surface → crest;
// only the losses before the crest count (entrance, intake device, up-leg),
// so a valve at the outlet raises the crest pressure:
//
//	p_crest = p_atm − ρg(z_crest − z_surface) − (ρV²/2)(1 + K_ent + K_intake + K_up + f·L_up/D)
//
// Crest limits (see crest.go): the running limit p_run and the working limit
// p_work above the vapour pressure p_v. Heights above the surface reported:
//
//	MaxCrestHeight     = (p_atm − p_v)/(ρg)                        (zero flow)
//	RunningCrestHeight = (p_atm − p_run)/(ρg)                      (zero flow)
//	FlowingCrestLimit  = MaxCrestHeight − (V²/2g)(1 + K_ent + K_intake + K_up + f·L_up/D)
//	WorkingCrestHeight = FlowingCrestLimit − (p_work − p_v)/(ρg)
//
// (ASDSO Dam Safety Toolbox, "Siphons": the lift cannot exceed the local
// atmospheric pressure adjusted for vapour pressure and friction losses.)
//
// Choked running: when the full-gravity flow would take p_crest below p_run,
// the up-leg limits the flow: the crest sits at p_run and
//
//	RunningCrestHeight − lift = (V²/2g)(1 + K_ent + K_intake + K_up + f·L_up/D)
//
// gives V; the verdict is RunsChoked and OutletThrottleK the outlet valve
// that makes the whole hose carry that V (energy equation above with K_outlet
// added). The head the valve does not take is lost at the crest in a pocket
// of vapour and gas, which is why the valve is the steady way to run it.
//
// A maximum discharge (Siphon.MaxFlow) is met by an outlet valve: its K
// comes from the energy equation at the capped V (MaxFlowThrottleK), and the
// capped flow is then checked like any other.
//
// Intake (see Intake): air starts at the depth Gordon (1970) gives at the
// intake face, AirStartsSubmergence; prime is lost at the prime-lost depth
// over the opening (intake.go). Between the two the siphon gulps air: the
// void fraction grows to
// GulpVoidMax and the head falls by GulpHeadLoss; the flow is solved with
// that head. It runs on while the down-leg clears the air, and will not run
// (WarnAirDrawn) when it does not or when Intake.FilmRisk is set without a
// cover. ANSI/HI 9.8 is reported (SubmergenceHI) but never stops a hose end.
//
// Air at the crest: bubbles and pockets are carried down the down-leg only
// when the velocity reaches (Wisner, Mohsen & Kouwen 1975, J. Hydraulics Div.
// ASCE 101(HY2), as given in Sanks, Pumping Station Design; small-pipe tests
// at 25 and 38 mm found the same trend, May, Allen & Nelson 2018, Int. J.
// Hydraulic Eng. 7(3):51–57, doi:10.5923/j.ijhe.20180703.02)
//
//	V_c = √(gD) · (0.825 + 0.25 √(sin θ))
//
// with θ the steepest down-leg slope (Geometry.DownLegSlope) or, without
// one, the mean slope (z_crest − z_outlet)/L_down, clamped to [0, 1]. Below
// it, WarnAirCollects.
//
// Hose collapse (see collapse.go): the worst gauge vacuum of flowing, a
// blocked intake and vacuum priming is compared with the hose's rating. A
// crest vacuum while flowing beyond the rating (for lay-flat hose: any
// vacuum) is WillNotRun (WarnHoseCollapse); a worst case beyond it is
// WarnHoseVacuum; an unrated hose under vacuum is WarnHoseNotRated.
//
// Verdicts, in order: WillNotRun (Why says why), RunsChoked, RunsNearLimit
// (CrestMargin < 0), Runs. Result.Fix names the change and its figures.
//
// Special cases (each WillNotRun with no flow):
//   - p_v ≥ p_atm: WarnBoiling (the liquid boils at the site; a verdict, not
//     an input error).
//   - H ≤ 0 (outlet at or above the surface): WarnNoDrop.
//   - lift ≥ RunningCrestHeight: WarnCannotRun (even at vanishing flow the
//     crest would not hold).
//   - surface at or below the prime-lost level: WarnPrimeLost.
//
// Solve does not allocate.
func Solve(s Siphon) (Result, error) {
	var r Result
	if err := validateSiphon(&s); err != nil {
		return r, err
	}
	var c siphonCase
	c.init(&s, &r)
	c.solve(&r)
	c.fix(&r)
	return r, nil
}

// siphonCase holds one Solve's inputs in float64 and what follows from them.
type siphonCase struct {
	in                         Intake
	geo                        Geometry
	maxFlow                    float64
	volatile                   bool
	rho, pv, patm, D, L, area  float64
	lift, H, lUp, lDown, n     float64
	reOverV, rr                float64
	kUp, kSum                  float64 // before the crest (with entrance and intake); all (no exit)
	pRun, pWork, workAllow     float64
	ig                         intakeGeom
	im                         intakeModel
	gravityV, gravityF         float64 // full-gravity solution (no cap, no choke)
	flowSolved, upLegAsLaid    bool
	vC                         float64 // air-clearing velocity
	blockedVacuum, primeVacuum float64
}

func (c *siphonCase) init(s *Siphon, r *Result) {
	c.in, c.geo, c.maxFlow, c.volatile = s.Intake, s.Geometry, float64(s.MaxFlow), s.Fluid.Volatile
	c.rho = float64(s.Fluid.Density)
	c.pv = float64(s.Fluid.VaporPressure)
	c.patm = float64(s.AtmPressure)
	c.D = float64(s.Hose.Diameter)
	c.L = float64(s.Hose.Length)
	c.n = float64(s.Hoses)
	geo := s.Geometry
	c.lift = float64(geo.Lift())
	c.H = float64(geo.Drop())
	c.area = math.Pi * c.D * c.D / 4
	c.lUp = float64(s.Hose.UpLegLength)
	c.upLegAsLaid = c.lUp == 0
	if c.lUp == 0 {
		c.lUp = max(float64(geo.Crest-geo.Intake), 0)
	}
	c.lUp = min(c.lUp, c.L)
	c.lDown = c.L - c.lUp
	c.reOverV = c.rho * c.D / float64(s.Fluid.Viscosity)
	c.rr = float64(s.Hose.Roughness) / c.D
	h := s.Hose
	c.kUp = h.KEntrance + s.Intake.K + h.KUpLeg
	c.kSum = c.kUp + h.KDownLeg + h.OutletK
	c.pRun, c.pWork = crestPressures(s.Fluid, c.patm)
	c.workAllow = (c.pWork - c.pv) / (c.rho * StandardGravity)
	c.ig = resolveIntake(s.Intake, c.D)
	c.im = newIntakeModel(s.Intake, c.ig, float64(s.Geometry.Intake))

	rg := c.rho * StandardGravity
	r.Head = Length(c.H)
	r.PrimingVolume = Volume(c.n * c.area * c.L)
	r.MaxCrestHeight = Length((c.patm - c.pv) / rg)
	r.RunningCrestHeight = Length((c.patm - c.pRun) / rg)
	r.RunningCrestPressure, r.WorkingCrestPressure = Pressure(c.pRun), Pressure(c.pWork)
	c.vC = airClearing(c.D, float64(geo.Crest-geo.Outlet), c.lDown, geo.DownLegSlope)
	r.AirClearingVelocity = Velocity(c.vC)
	c.blockedVacuum, c.primeVacuum = staticVacuums(c.rho, c.patm, c.pv, geo)
	r.HoseVacuumBlocked, r.HoseVacuumPriming = Pressure(c.blockedVacuum), Pressure(c.primeVacuum)
	rating, rated := hoseRating(h)
	r.HoseVacuumRating, r.HoseRated = Pressure(rating), rated
	// the intake's levels at zero flow, until a flow is solved
	air, prime := c.im.levels(0)
	r.AirStartsLevel, r.PrimeLostLevel = Length(air), Length(prime)
	r.IntakeTop = Length(c.im.top)

	if c.pv > NearBoilingFraction*c.patm {
		r.Warnings.Add(WarnNearBoiling)
	}
	straightUp := max(float64(geo.Crest-geo.Intake), 0)
	straightDown := max(float64(geo.Crest-geo.Outlet), 0)
	if c.L < straightUp+straightDown {
		r.Warnings.Add(WarnHoseShort)
	}
}

// velocity solves the energy equation for head H with the fittings kSum.
func (c *siphonCase) velocity(H, kSum float64) (V, f, re float64) {
	return solveVelocity(H, kSum, c.L/c.D, c.reOverV, c.rr)
}

// crestAt fills the crest figures of r for hose velocity V with friction f.
func (c *siphonCase) crestAt(r *Result, V, f float64) {
	kCrest := 1 + c.kUp + f*c.lUp/c.D
	r.FlowingCrestLimit = r.MaxCrestHeight - Length(kCrest*V*V/(2*StandardGravity))
	r.WorkingCrestHeight = r.FlowingCrestLimit - Length(c.workAllow)
	r.CrestMargin = r.WorkingCrestHeight - Length(c.lift)
	r.CrestPressure = Pressure(crestPressure(c.patm, c.rho, c.lift, V, kCrest))
	r.CrestVacuum = Pressure(c.patm) - r.CrestPressure
}

// notRunning sets r to the verdict WillNotRun for why. The flowing crest
// figures stay those at the full-gravity flow when one was solved.
func (c *siphonCase) notRunning(r *Result, why WarnCode) {
	r.Verdict = WillNotRun
	r.Why = why
	r.Warnings.Add(why)
	r.Regime = NoFlow
	r.Flow, r.FlowPerHose, r.Velocity, r.Reynolds, r.FrictionFactor = 0, 0, 0, 0, 0
	r.GulpVoid, r.GulpHead = 0, 0
	r.HasOutletThrottle, r.OutletThrottleK, r.MaxFlowThrottleK = false, 0, 0
	r.Warnings.Remove(WarnThrottleOutlet) // no valve setting for a siphon that does not run
	if c.flowSolved {
		c.crestAt(r, c.gravityV, c.gravityF)
	} else {
		c.crestAt(r, 0, 0)
	}
	// no flow: the crest holds its static pressure
	r.CrestPressure = Pressure(c.patm - c.rho*StandardGravity*c.lift)
	r.CrestVacuum = Pressure(c.patm) - r.CrestPressure
	r.HoseVacuumWorst = Pressure(max(max(c.blockedVacuum, c.primeVacuum), float64(r.CrestVacuum)))
}

// solve runs the checks in order and fills r.
func (c *siphonCase) solve(r *Result) {
	geo := c.geo
	switch {
	case c.pv >= c.patm:
		c.notRunning(r, WarnBoiling)
		return
	case c.H <= 0:
		c.notRunning(r, WarnNoDrop)
		return
	}
	var gRe float64
	c.gravityV, c.gravityF, gRe = c.velocity(c.H, c.kSum)
	c.flowSolved = true
	r.GravityFlow = FlowRate(c.n * c.gravityV * c.area)
	switch {
	case float64(geo.Surface) <= float64(r.PrimeLostLevel):
		c.notRunning(r, WarnPrimeLost) // the opening is out of the liquid
		return
	case c.lift >= float64(r.RunningCrestHeight):
		c.notRunning(r, WarnCannotRun)
		return
	}
	V, f, re := c.flow(r, c.H, c.gravityV, c.gravityF, gRe)
	// intake: levels at this flow, gulping between them
	air, prime := c.im.levels(V * c.area)
	r.AirStartsLevel, r.PrimeLostLevel = Length(air), Length(prime)
	r.RequiredSubmergence = Length(air - c.im.top)
	r.SubmergenceHI = SubmergenceHI(FlowRate(V*c.area), Length(c.ig.face))
	r.FaceVelocity = Velocity(V * c.area / (math.Pi * c.ig.face * c.ig.face / 4))
	h := float64(geo.Surface)
	if h <= prime {
		c.notRunning(r, WarnPrimeLost)
		return
	}
	if h < air {
		if c.in.FilmRisk && !c.in.Covered {
			c.notRunning(r, WarnAirDrawn)
			return
		}
		r.GulpVoid = gulpVoid(h, air, prime)
		r.GulpHead = GulpHeadLoss(r.GulpVoid, geo.Intake, geo.Outlet)
		he := c.H - float64(r.GulpHead)
		V, f, re = c.velocity(he, c.kSum)
		V, f, re = c.flow(r, he, V, f, re)
		r.Warnings.Add(WarnIntakeShallow)
		if V < c.vC {
			c.notRunning(r, WarnAirDrawn)
			return
		}
	}
	r.Velocity = Velocity(V)
	r.FlowPerHose = FlowRate(V * c.area)
	r.Flow = FlowRate(V * c.area * c.n)
	r.Reynolds = re
	r.FrictionFactor = f
	c.crestAt(r, V, f)
	if c.collapse(r) {
		return
	}
	c.verdict(r, V)
}

// flow takes the full-gravity solution V, f, re for driving head H through
// the cap, then the crest (choked running). It sets the throttle figures of
// r.
func (c *siphonCase) flow(r *Result, H, V, f, re float64) (float64, float64, float64) {
	r.MaxFlowThrottleK, r.OutletThrottleK, r.HasOutletThrottle = 0, 0, false
	r.Verdict = Runs
	throttled := false
	if q := c.maxFlow; q > 0 && c.n*V*c.area > q {
		V = q / (c.n * c.area)
		re = c.reOverV * V
		f = friction(re, c.rr, 0)
		r.MaxFlowThrottleK = throttleK(V, H, c.kSum, c.L/c.D, c.reOverV, c.rr)
		throttled = true
	}
	if crestPressure(c.patm, c.rho, c.lift, V, 1+c.kUp+f*c.lUp/c.D) < c.pRun {
		// choked: the up-leg carries what the crest can hold at p_run
		dh := float64(r.RunningCrestHeight) - c.lift
		V, f, re = solveVelocity(dh, c.kUp, c.lUp/c.D, c.reOverV, c.rr)
		r.Verdict = RunsChoked
		throttled = true
	}
	if throttled {
		r.OutletThrottleK = throttleK(V, H, c.kSum, c.L/c.D, c.reOverV, c.rr)
		r.HasOutletThrottle = true
		r.Warnings.Add(WarnThrottleOutlet)
	}
	return V, f, re
}

// collapse checks the hose against its vacuum rating; it reports whether
// the hose collapses (the verdict is then set).
func (c *siphonCase) collapse(r *Result) bool {
	flowing := float64(r.CrestVacuum)
	worst := max(max(c.blockedVacuum, c.primeVacuum), flowing)
	r.HoseVacuumWorst = Pressure(worst)
	rating, rated := float64(r.HoseVacuumRating), r.HoseRated
	switch {
	case !rated:
		if worst > 0 {
			r.Warnings.Add(WarnHoseNotRated)
		}
	case flowing > rating:
		c.notRunning(r, WarnHoseCollapse)
		return true
	case worst > rating:
		r.Warnings.Add(WarnHoseVacuum)
	}
	return false
}

// verdict sets the running verdict and its warnings for hose velocity V.
func (c *siphonCase) verdict(r *Result, V float64) {
	switch {
	case r.Reynolds <= ReLaminarMax:
		r.Regime = Laminar
		r.Warnings.Add(WarnLaminar)
	case r.Reynolds < ReTurbulentMin:
		r.Regime = Transitional
		r.Warnings.Add(WarnTransitional)
	default:
		r.Regime = Turbulent
	}
	if V < c.vC {
		r.Warnings.Add(WarnAirCollects)
	}
	switch {
	case r.Verdict == RunsChoked:
		r.Warnings.Add(WarnChoked)
	case r.CrestMargin < 0:
		r.Verdict = RunsNearLimit
		r.Warnings.Add(WarnCrestNearLimit)
	}
}

// fix fills r.Fix: the figures for each change and the one named first.
func (c *siphonCase) fix(r *Result) {
	x := &r.Fix
	rg := c.rho * StandardGravity
	x.CrestHeightThrottled = Length((c.patm - c.pWork) / rg)
	x.NeedsPump = c.H <= 0 || x.CrestHeightThrottled <= 0
	if c.flowSolved {
		kCrest := 1 + c.kUp + c.gravityF*c.lUp/c.D
		vh := c.gravityV * c.gravityV / (2 * StandardGravity)
		// lift + vh·(1 + kUp + f·L_up/D) = (p_atm − p_work)/(ρg); an up-leg
		// laid straight (UpLegLength 0) grows with the lift it climbs
		ch := (c.patm-c.pWork)/rg - vh*kCrest
		if c.upLegAsLaid {
			a := vh * (1 + c.kUp + c.gravityF*max(float64(c.geo.Surface-c.geo.Intake), 0)/c.D)
			ch = ((c.patm-c.pWork)/rg - a) / (1 + vh*c.gravityF/c.D)
		}
		if ch > 0 {
			x.CrestHeight, x.HasCrestHeight = Length(ch), true
		}
		// the vapour pressure that puts the full-gravity crest at p_work
		c.coolTo(x, Pressure(crestPressure(c.patm, c.rho, c.lift, c.gravityV, kCrest)))
		// the throttle that holds the crest at p_work (only asked for when
		// the crest is past it)
		if dh := float64(x.CrestHeightThrottled) - c.lift; dh > 0 && r.Verdict != Runs {
			vw, _, _ := solveVelocity(dh, c.kUp, c.lUp/c.D, c.reOverV, c.rr)
			if vw < c.gravityV {
				x.ThrottleFlow = FlowRate(c.n * vw * c.area)
				x.ThrottleK = throttleK(vw, c.H, c.kSum, c.L/c.D, c.reOverV, c.rr)
				x.HasThrottle = true
			}
		}
	} else if c.H > 0 {
		// no flow was solved (the liquid boils at the site): the crest
		// pressure at zero flow bounds the cooling from above (any flow
		// lowers the crest pressure)
		c.coolTo(x, Pressure(c.patm-rg*c.lift))
	}
	if r.Verdict == RunsChoked && r.HasOutletThrottle {
		// choked, the throttle to name is the one that holds the running
		// flow steadily (the crest at its running limit)
		x.ThrottleFlow, x.ThrottleK, x.HasThrottle = r.Flow, r.OutletThrottleK, true
	}
	rating := float64(r.HoseVacuumRating)
	if r.Why == WarnHoseCollapse || r.Warnings.Has(WarnHoseVacuum) || (r.HoseRated && rating == 0 && r.HoseVacuumWorst > 0) {
		x.NeedsSuctionHose, x.MinVacuumRating = true, r.HoseVacuumWorst
	}
	x.Code = c.fixCode(r)
}

// coolTo sets the highest vapour pressure that keeps a crest at pressure pc
// (absolute, Pa) at its working limit: the dissolved-gas allowance below
// it, or the bubble-point margin for a volatile liquid (crest.go).
func (c *siphonCase) coolTo(x *Fix, pc Pressure) {
	pvMax := float64(pc) - GasAllowanceFraction*c.patm
	if c.volatile {
		pvMax = float64(pc) / (1 + BubbleWorkMargin)
	}
	if pvMax > 0 {
		x.MaxVaporPressure, x.HasMaxVaporPressure = Pressure(pvMax), true
	}
}

// fixCode picks the change a verdict names first.
func (c *siphonCase) fixCode(r *Result) FixCode {
	x := &r.Fix
	lower := FixLowerCrest
	if x.NeedsPump {
		lower = FixPump
	}
	switch r.Verdict {
	case RunsChoked:
		return FixThrottle
	case RunsNearLimit:
		if x.HasCrestHeight {
			return FixLowerCrest
		}
		return FixThrottle
	case Runs:
		return FixNone
	case WillNotRun: // by its reason, below
	}
	switch r.Why {
	case WarnNoDrop:
		return FixPump
	case WarnBoiling:
		return FixCool
	case WarnCannotRun:
		return lower
	case WarnPrimeLost:
		return FixLowerIntake
	case WarnAirDrawn:
		// a board stops the vortex, not the opening drawing air: it helps
		// only while the surface stands above where the prime is lost
		if c.in.FilmRisk && !c.in.Covered && r.PrimeLostLevel < c.geo.Surface {
			return FixCoverIntake
		}
		return FixLowerIntake
	case WarnHoseCollapse:
		return FixSuctionHose
	default: // no other code decides a WillNotRun verdict
		return FixNone
	}
}
