package calc

// Crest pressure limits. Three absolute pressures bound the crest, from the
// lowest:
//
//	p_v     the liquid boils: no column stands
//	p_run   the running limit: below it the column cannot be held, the
//	        flow is limited by the up-leg (choked running, see Solve)
//	p_work  the working limit: below it gas gathers at the crest and the
//	        siphon must be re-primed from time to time (RunsNearLimit)
//
// For a liquid that dissolves gas (water and most liquids, Fluid.Volatile
// false) the margins are shares of the barometric pressure:
//
//	p_run  = p_v + RunningAllowanceFraction·p_atm
//	p_work = p_v + GasAllowanceFraction·p_atm
//
// For a volatile liquid (a fuel, Fluid.Volatile true), p_v is its true vapour
// pressure, the bubble point of a mixture: below it the light ends flash, and
// the dissolved-gas allowance gives way to a margin on the bubble point:
//
//	p_run  = p_v·(1 + BubbleRunMargin)
//	p_work = p_v·(1 + BubbleWorkMargin)
const (
	// RunningAllowanceFraction keeps the running crest about 1 m of water
	// over the vapour pressure at sea level. Our allowance, in the spirit of
	// pump practice, which keeps the net positive suction head available
	// some 0.6–1.5 m above that required (ANSI/HI 9.6.1 margins, from
	// memory): a choked crest is a suction point of the same kind.
	RunningAllowanceFraction = 0.1
	// BubbleRunMargin and BubbleWorkMargin: the crest of a fuel siphon is
	// run at least 10 % and worked at least 35 % above the bubble point.
	// Our rule; the same NPSH margin ratios (1.1 and up for most services,
	// ANSI/HI 9.6.1, from memory) applied to the bubble-point pressure.
	BubbleRunMargin  = 0.10
	BubbleWorkMargin = 0.35
)

// crestPressures returns p_run and p_work for fluid f at barometric pressure
// patm (see the limits above).
func crestPressures(f Fluid, patm float64) (pRun, pWork float64) {
	pv := float64(f.VaporPressure)
	if f.Volatile {
		return pv * (1 + BubbleRunMargin), pv * (1 + BubbleWorkMargin)
	}
	return pv + RunningAllowanceFraction*patm, pv + GasAllowanceFraction*patm
}

// throttleK returns the outlet loss coefficient that brings a hose of
// relative length lOverD and fittings kSum (all of them, without the exit)
// down to velocity v under head H, from the energy equation
//
//	H = (v²/2g)(1 + kSum + f·L/D + K)  ⇒  K = 2gH/v² − (1 + kSum + f·L/D)
//
// with f = friction at v. It is not negative.
func throttleK(v, H, kSum, lOverD, reOverV, rr float64) float64 {
	f := friction(reOverV*v, rr, 0)
	return max(2*StandardGravity*H/(v*v)-(1+kSum+f*lOverD), 0)
}

// FixCode names the one change a verdict points to first. The figures for it
// (and for the other changes) are in Fix.
type FixCode uint8

// Fixes.
const (
	// FixNone: the siphon runs with the crest in hand.
	FixNone FixCode = iota
	// FixLowerCrest: lower the crest to Fix.CrestHeight above the surface
	// (or, throttled, Fix.CrestHeightThrottled).
	FixLowerCrest
	// FixCool: the liquid's vapour pressure is too high: let it cool until
	// its vapour pressure is at most Fix.MaxVaporPressure (the caller turns
	// that into a temperature with the liquid's own data).
	FixCool
	// FixThrottle: part-close a valve at the outlet to Fix.ThrottleK (flow
	// Fix.ThrottleFlow), never at the intake or on the up-leg.
	FixThrottle
	// FixSuctionHose: use a hose rated for at least Fix.MinVacuumRating.
	FixSuctionHose
	// FixPump: no siphon can do this job: use a pump.
	FixPump
	// FixLowerIntake: the intake is too shallow: lower it or use a
	// low-level intake.
	FixLowerIntake
	// FixCoverIntake: float a board or raft over the intake so that no
	// vortex draws the floating film in.
	FixCoverIntake
	fixCount
)

var fixNames = [...]string{"none", "lower_crest", "cool", "throttle", "suction_hose", "pump", "lower_intake", "cover_intake"}

// String returns the fix's stable code.
func (c FixCode) String() string {
	if int(c) >= len(fixNames) {
		return "unknown"
	}
	return fixNames[c]
}

// Fix holds what a verdict says to change and the figures for each change.
// All SI; a figure that does not apply is zero with its Has… flag false.
type Fix struct {
	// Code is the change named first.
	Code FixCode
	// CrestHeight is the highest crest above the source surface at which
	// the siphon runs with the crest at its working limit at full-gravity
	// flow (no throttle), m; HasCrestHeight is false when even a crest at
	// the surface would not (then only a throttle, or a pump, helps).
	CrestHeight    Length
	HasCrestHeight bool
	// CrestHeightThrottled is the highest crest that can be held at the
	// working limit with an outlet throttle: (p_atm − p_work)/(ρg), the
	// working height at vanishing flow, m.
	CrestHeightThrottled Length
	// MaxVaporPressure is the highest vapour pressure at which the crest
	// stays at its working limit at full-gravity flow, Pa absolute;
	// HasMaxVaporPressure is false when no cooling would do.
	MaxVaporPressure    Pressure
	HasMaxVaporPressure bool
	// ThrottleFlow and ThrottleK are the flow (all hoses, m³/s) at which
	// the crest sits at its working limit and the outlet K that gives it
	// (added to the hose as entered); when the siphon runs choked, the
	// choked flow and the outlet K that holds it steadily (Result.Flow,
	// Result.OutletThrottleK). HasThrottle is false when no throttle is
	// needed or none can hold the crest.
	ThrottleFlow FlowRate
	ThrottleK    float64
	HasThrottle  bool
	// NeedsSuctionHose is true when the hose would collapse; a hose rated
	// for at least MinVacuumRating (gauge, Pa) is needed.
	NeedsSuctionHose bool
	MinVacuumRating  Pressure
	// NeedsPump is true when no siphon can do this job: no drop, or a crest
	// that even a throttle cannot hold.
	NeedsPump bool
}
