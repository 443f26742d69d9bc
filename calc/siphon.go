package calc

// Geometry places the siphon's four heights on one vertical datum (the tank
// floor is elevation 0 when there is a tank; any datum works for a single
// case). All in metres, up positive.
//
//	Surface  source liquid surface
//	Intake   the intake: a bare hose end's mouth, or the base of the intake
//	         device (see Intake for where its opening is)
//	Crest    highest point of the hose route
//	Outlet   hose end (free outlet), or the receiving surface when submerged
//
// A technician speaks of lift = Crest − Surface and drop = Surface − Outlet;
// model converts.
type Geometry struct {
	Surface, Intake, Crest, Outlet Length
	// OutletSubmerged is true when the hose end sits below a receiving
	// surface; Outlet is then that surface. The exit loss (K = 1) replaces the
	// outlet velocity head, so the head balance is the same number.
	OutletSubmerged bool
	// DownLegSlope is the sine of the angle below horizontal of the
	// steepest down-leg section just after the crest, 0 … 1, for the
	// air-clearing check; 0 means the mean slope of the down-leg,
	// (Crest − Outlet)/(down-leg length).
	DownLegSlope float64
}

// Lift is the crest height above the source surface, Crest − Surface.
func (g Geometry) Lift() Length { return g.Crest - g.Surface }

// Drop is the outlet below the source surface, Surface − Outlet: the driving
// head H of the siphon.
func (g Geometry) Drop() Length { return g.Surface - g.Outlet }

// IntakeDepth is the intake's depth below the surface, Surface − Intake.
func (g Geometry) IntakeDepth() Length { return g.Surface - g.Intake }

// Hose is one hose (or pipe) run. N identical hoses can run in parallel.
type Hose struct {
	Diameter  Length // inside diameter D, m
	Length    Length // total length L from intake to outlet, m
	Roughness Length // absolute roughness ε, m
	// UpLegLength is the length from intake to crest. Zero means "as laid
	// straight": intake depth + lift.
	UpLegLength Length
	// KEntrance is the entrance loss coefficient (re-entrant hose end 0.78,
	// Crane TP-410; strainer or foot valve much more).
	KEntrance float64
	// KUpLeg sums fittings between intake and crest (bends, couplings).
	KUpLeg float64
	// KDownLeg sums fittings between crest and outlet (bends, couplings).
	// The exit loss is not included: the solver adds it.
	KDownLeg float64
	// OutletK is a valve or fitting at the outlet end, after the crest: a
	// part-closed valve there throttles the flow and raises the crest
	// pressure. (A throttle before the crest lowers it: never throttle at
	// the intake or on the up-leg.)
	OutletK float64
	// Vacuum is how the hose stands up to vacuum; VacuumRating the gauge
	// vacuum a VacuumRated hose is rated for, Pa (positive); Wall the tube
	// wall of a VacuumFromWall hose.
	Vacuum       VacuumClass
	VacuumRating Pressure
	Wall         Wall
}

// KMinor is the sum of the hose's fitting coefficients, ΣK, without the
// exit: entrance, up-leg, down-leg and outlet (an intake device's
// Intake.K is added by Solve).
func (h Hose) KMinor() float64 { return h.KEntrance + h.KUpLeg + h.KDownLeg + h.OutletK }

// Siphon is one steady case: a liquid, a site, a hose run and its geometry.
type Siphon struct {
	Fluid       Fluid
	AtmPressure Pressure // barometric pressure at the site, Pa absolute
	Hose        Hose
	Hoses       int // identical hoses in parallel, sharing the head; ≥ 1
	Geometry    Geometry
	// Intake is the suction end (the zero value: a bare end hung at
	// Geometry.Intake).
	Intake Intake
	// MaxFlow is a cap on the discharge (all hoses, m³/s), e.g. a permit's;
	// 0 means none. Solve meets it with an outlet valve (see
	// Result.MaxFlowThrottleK); PlanDrain sets that valve at the start,
	// where the head is highest, and keeps it for the drain.
	MaxFlow FlowRate
}

// Regime is the flow regime in the hose.
type Regime int

const (
	// NoFlow: the siphon does not run (no drop, or it cannot hold the crest).
	NoFlow Regime = iota
	// Laminar: Re ≤ 2000, f = 64/Re.
	Laminar
	// Transitional: 2000 < Re < 4000, blended (see friction).
	Transitional
	// Turbulent: Re ≥ 4000, Colebrook–White.
	Turbulent
)

var regimeNames = [...]string{"none", "laminar", "transitional", "turbulent"}

func (r Regime) String() string {
	if r < 0 || int(r) >= len(regimeNames) {
		return "unknown"
	}
	return regimeNames[r]
}
