package calc

// Verdict is the one-word answer a technician needs first.
type Verdict int

const (
	// Runs: the siphon runs with the crest inside the working limit.
	Runs Verdict = iota
	// RunsNearLimit: it runs, but the crest is above the working limit
	// (dissolved gas will gather; expect to re-prime).
	RunsNearLimit
	// RunsChoked: the full-gravity flow would take the crest below its
	// running limit; the flow is limited by the up-leg with the crest at
	// that limit, and an outlet throttle (Result.OutletThrottleK) holds it
	// there steadily.
	RunsChoked
	// WillNotRun: no drop, crest above the limit, the liquid boils, the
	// intake draws air it cannot clear, or the hose would collapse;
	// Result.Why says which.
	WillNotRun
)

var verdictNames = [...]string{"runs", "runs near limit", "runs choked", "will not run"}

func (v Verdict) String() string {
	if v < 0 || int(v) >= len(verdictNames) {
		return "unknown"
	}
	return verdictNames[v]
}

// Result is the steady solution of a Siphon. All values SI and finite.
// Flow and Velocity are zero when Verdict is WillNotRun.
type Result struct {
	Verdict Verdict
	// Why holds the code of the warning that decides a WillNotRun verdict
	// (WarnNoDrop, WarnBoiling, WarnCannotRun, WarnPrimeLost, WarnAirDrawn,
	// WarnHoseCollapse), or 0.
	Why WarnCode
	// Fix is what to change, with the figures for each change.
	Fix Fix

	Flow           FlowRate // all hoses together, m³/s
	FlowPerHose    FlowRate // one hose, m³/s
	Velocity       Velocity // mean velocity in a hose, m/s
	Reynolds       float64
	FrictionFactor float64 // Darcy f
	Regime         Regime

	Head Length // driving head H = Surface − Outlet, m

	// CrestPressure is the absolute pressure at the crest while flowing, Pa.
	CrestPressure Pressure
	// CrestVacuum is the crest's gauge vacuum, p_atm − CrestPressure, Pa
	// (positive below atmospheric).
	CrestVacuum Pressure
	// RunningCrestPressure and WorkingCrestPressure are the crest's
	// running and working limits p_run and p_work, Pa absolute (see
	// crest.go).
	RunningCrestPressure, WorkingCrestPressure Pressure
	// MaxCrestHeight is the zero-flow theoretical maximum crest height above
	// the surface, (p_atm − p_v)/(ρg), m.
	MaxCrestHeight Length
	// RunningCrestHeight is the highest crest above the surface that holds a
	// running column at vanishing flow, (p_atm − p_run)/(ρg), m: a drain
	// stops for the crest when its lift grows to this.
	RunningCrestHeight Length
	// FlowingCrestLimit is the maximum crest height above the surface at the
	// present flow: MaxCrestHeight less the up-leg velocity and loss head, m.
	// When the siphon will not run with a drop, it is taken at the flow the
	// siphon would have (its full-gravity flow), not at zero flow.
	FlowingCrestLimit Length
	// WorkingCrestHeight is FlowingCrestLimit less the working allowance
	// (p_work − p_v)/(ρg) (see GasAllowanceFraction, BubbleWorkMargin), m.
	WorkingCrestHeight Length
	// CrestMargin is WorkingCrestHeight − lift: negative means over the
	// working limit, m.
	CrestMargin Length

	// GravityFlow is the flow (all hoses) the siphon would have with no
	// throttle and the crest held: the full-gravity flow, m³/s.
	GravityFlow FlowRate
	// OutletThrottleK is the outlet K, added to the hose as entered, that
	// makes the hose carry Flow: the valve that holds the crest at its
	// running limit when choked, or meets MaxFlow; HasOutletThrottle is
	// false when none is needed (JSON null).
	OutletThrottleK   float64
	HasOutletThrottle bool
	// MaxFlowThrottleK is the part of it that meets Siphon.MaxFlow at this
	// head (0 without a cap, or when the cap is not reached).
	MaxFlowThrottleK float64

	// AirClearingVelocity is the down-leg velocity needed to carry air
	// bubbles down and out (Wisner et al. 1975) with the steepest down-leg
	// slope, m/s.
	AirClearingVelocity Velocity
	// FaceVelocity is the velocity of the approach to the intake face, one
	// hose's flow over the face area, m/s.
	FaceVelocity Velocity
	// RequiredSubmergence is the depth of liquid over the top of the
	// intake's opening at which air starts (AirStartsLevel − top of the
	// opening; Gordon 1970 at the intake face, see AirStartsSubmergence), m.
	RequiredSubmergence Length
	// SubmergenceHI is the ANSI/HI 9.8 submergence at the intake face, for
	// reference only (a pump-bell rule, never a stop), m.
	SubmergenceHI Length
	// IntakeTop is the elevation of the top of the intake's opening (the
	// mouth of a hung end, the top row of a strainer's holes), m.
	IntakeTop Length
	// AirStartsLevel and PrimeLostLevel are the elevations (on the
	// geometry's datum) at which air starts to be drawn in and at which the
	// intake loses its prime, at this flow, m.
	AirStartsLevel, PrimeLostLevel Length
	// GulpVoid is the void fraction of the gulped air when the surface lies
	// between AirStartsLevel and PrimeLostLevel (see GulpVoidMax), else 0;
	// GulpHead is the head it costs, m (see GulpHeadLoss).
	GulpVoid float64
	GulpHead Length

	// HoseVacuumWorst is the worst gauge vacuum the hose sees, Pa: the
	// largest of the crest vacuum while flowing, with the intake blocked
	// (HoseVacuumBlocked: the down-leg hangs from the crest,
	// ρg(z_crest − z_outlet)) and while vacuum priming (HoseVacuumPriming,
	// ρg·lift), each at most p_atm − p_v.
	HoseVacuumWorst, HoseVacuumBlocked, HoseVacuumPriming Pressure
	// HoseVacuumRating is the vacuum the hose is rated for, Pa gauge;
	// HoseRated is false for a hose with no known rating (JSON null).
	// Lay-flat hose is rated 0.
	HoseVacuumRating Pressure
	HoseRated        bool

	// PrimingVolume is the liquid needed to fill all hoses, m³.
	PrimingVolume Volume

	Warnings WarnSet
}

// WarnCode is a stable warning identifier. Codes never change meaning; the
// JSON output carries their String form.
type WarnCode uint8

const (
	_ WarnCode = iota
	// WarnLaminar: the flow is laminar (viscous liquid or tiny hose).
	WarnLaminar
	// WarnTransitional: 2000 < Re < 4000; friction is uncertain.
	WarnTransitional
	// WarnCrestNearLimit: the crest is above the working limit.
	WarnCrestNearLimit
	// WarnCannotRun: the crest is above the flowing limit; the liquid would
	// boil at the crest.
	WarnCannotRun
	// WarnNoDrop: the outlet is not below the source surface.
	WarnNoDrop
	// WarnAirCollects: down-leg velocity below the air-clearing velocity.
	WarnAirCollects
	// WarnNearBoiling: vapour pressure above half the barometric pressure.
	WarnNearBoiling
	// WarnHoseShort: the hose is shorter than the straight route the heights
	// need.
	WarnHoseShort
	// WarnIntakeShallow: the surface is below the air-starts level: a
	// vortex draws air in and the siphon gulps and slows.
	WarnIntakeShallow
	// WarnBoiling: the liquid boils at the site's barometric pressure.
	WarnBoiling
	// WarnPrimeLost: the surface is down to the prime-lost level: the
	// intake's opening draws air and the siphon breaks.
	WarnPrimeLost
	// WarnAirDrawn: air is drawn in at the intake and not carried over the
	// crest (the down-leg is too slow to clear it), or a vortex would draw a
	// floating film in with no board over the intake.
	WarnAirDrawn
	// WarnChoked: the siphon runs choked (see RunsChoked).
	WarnChoked
	// WarnHoseCollapse: the crest vacuum while flowing is more than the
	// hose is rated for (lay-flat: any vacuum): it would collapse.
	WarnHoseCollapse
	// WarnHoseVacuum: the worst vacuum (blocked intake, vacuum priming) is
	// more than the hose is rated for.
	WarnHoseVacuum
	// WarnHoseNotRated: the hose sees vacuum and has no known rating.
	WarnHoseNotRated
	// WarnThrottleOutlet: a throttle is part of the answer: it goes at the
	// outlet, never at the intake or on the up-leg (that lowers the crest
	// pressure).
	WarnThrottleOutlet
	warnCount
)

var warnNames = [...]string{
	"", "laminar", "transitional", "crest_near_limit", "cannot_run", "no_drop",
	"air_collects", "near_boiling", "hose_too_short", "intake_too_shallow",
	"boiling", "prime_lost", "air_drawn_in", "choked", "hose_collapse", "hose_vacuum_risk",
	"hose_not_rated", "throttle_at_outlet_only",
}

// String is the stable code used in JSON and records.
func (c WarnCode) String() string {
	if int(c) >= len(warnNames) {
		return "unknown"
	}
	return warnNames[c]
}

// WarnSet is a set of warning codes; a bit set so that a solve allocates
// nothing.
type WarnSet uint32

// Add puts c in the set.
func (s *WarnSet) Add(c WarnCode) { *s |= 1 << c }

// Remove takes c out of the set.
func (s *WarnSet) Remove(c WarnCode) { *s &^= 1 << c }

// Has reports whether c is in the set.
func (s WarnSet) Has(c WarnCode) bool { return s&(1<<c) != 0 }

// Codes lists the codes in the set in code order.
func (s WarnSet) Codes() []WarnCode {
	var out []WarnCode
	for c := WarnCode(1); c < warnCount; c++ {
		if s.Has(c) {
			out = append(out, c)
		}
	}
	return out
}
