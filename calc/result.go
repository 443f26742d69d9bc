package calc

// Verdict is the one-word answer a technician needs first.
type Verdict int

const (
	// Runs: the siphon runs with the crest inside the working limit.
	Runs Verdict = iota
	// RunsNearLimit: it runs, but the crest is above the working limit
	// (dissolved gas will gather; expect to re-prime).
	RunsNearLimit
	// WillNotRun: no drop, crest above the limit, or the liquid boils.
	WillNotRun
)

var verdictNames = [...]string{"runs", "runs near limit", "will not run"}

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
	// (WarnNoDrop, WarnCannotRun, WarnIntakeShallow when the intake is out of
	// the liquid), or 0.
	Why WarnCode

	Flow           FlowRate // all hoses together, m³/s
	FlowPerHose    FlowRate // one hose, m³/s
	Velocity       Velocity // mean velocity in a hose, m/s
	Reynolds       float64
	FrictionFactor float64 // Darcy f
	Regime         Regime

	Head Length // driving head H = Surface − Outlet, m

	// CrestPressure is the absolute pressure at the crest while flowing, Pa.
	CrestPressure Pressure
	// MaxCrestHeight is the zero-flow theoretical maximum crest height above
	// the surface, (p_atm − p_v)/(ρg), m.
	MaxCrestHeight Length
	// FlowingCrestLimit is the maximum crest height above the surface at the
	// present flow: MaxCrestHeight less the up-leg velocity and loss head, m.
	FlowingCrestLimit Length
	// WorkingCrestHeight is FlowingCrestLimit less the gas-release allowance
	// (see GasAllowanceFraction), m.
	WorkingCrestHeight Length
	// CrestMargin is WorkingCrestHeight − lift: negative means over the
	// working limit, m.
	CrestMargin Length

	// AirClearingVelocity is the down-leg velocity needed to carry air
	// bubbles down and out (Wisner et al. 1975), m/s.
	AirClearingVelocity Velocity
	// RequiredSubmergence is the intake depth needed against air-drawing
	// vortices (ANSI/HI 9.8), m.
	RequiredSubmergence Length
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
	// WarnIntakeShallow: the intake is shallower than the required submergence.
	WarnIntakeShallow
	warnCount
)

var warnNames = [...]string{
	"", "laminar", "transitional", "crest_near_limit", "cannot_run", "no_drop",
	"air_collects", "near_boiling", "hose_too_short", "intake_too_shallow",
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
