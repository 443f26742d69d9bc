package calc

// VacuumClass says how a hose stands up to vacuum (its collapse rating).
type VacuumClass uint8

// Vacuum classes. The zero value is a hose with no known rating.
const (
	// VacuumNotRated: no rating is known (garden or transfer hose): the
	// worst vacuum is reported and warned about, not checked.
	VacuumNotRated VacuumClass = iota
	// VacuumRated: a suction hose rated for Hose.VacuumRating (gauge).
	VacuumRated
	// VacuumNone: lay-flat hose; it flattens under any vacuum, so it never
	// runs where the crest is below atmospheric pressure.
	VacuumNone
	// VacuumFromWall: a plain tube whose rating follows from its wall by
	// ring buckling (Hose.Wall, see RingBucklingPressure).
	VacuumFromWall
	vacuumClassCount
)

var vacuumClassNames = [...]string{"not_rated", "rated", "none", "from_wall"}

// String returns the class's stable code.
func (c VacuumClass) String() string {
	if int(c) >= len(vacuumClassNames) {
		return "unknown"
	}
	return vacuumClassNames[c]
}

// Wall is a tube wall for VacuumFromWall.
type Wall struct {
	Thickness Length   // t, m
	Modulus   Pressure // Young's modulus E of the wall material, Pa
	Poisson   float64  // Poisson's ratio ν, 0 … 0.5
}

// CollapseSafetyFactor divides the ring-buckling pressure to rate a plain
// tube: real tubes are out of round and soften when warm, and collapse well
// below the elastic figure. 3 is our allowance, the usual order of the
// factors that external-pressure design rules put on elastic buckling (from
// memory).
const CollapseSafetyFactor = 3.0

// RingBucklingPressure returns the external pressure at which a long, thin,
// perfectly round elastic tube of inside diameter d buckles (Timoshenko &
// Gere, Theory of Elastic Stability, 2nd ed., McGraw-Hill 1961, the chapter
// on rings and tubes: a long tube under uniform external pressure, the ring
// formula with E/(1 − ν²) for plane strain; section number not checked):
//
//	p_cr = E/(4(1 − ν²)) · (t/r)³ = 2E/(1 − ν²) · (t/D)³
//
// with r and D = d + t the mean radius and diameter. Pa; Solve validates the
// wall before it calls this.
func RingBucklingPressure(w Wall, d Length) Pressure {
	t := float64(w.Thickness)
	D := float64(d) + t
	r := t / D
	return Pressure(2 * float64(w.Modulus) / (1 - w.Poisson*w.Poisson) * r * r * r)
}

// hoseRating returns the gauge vacuum the hose is rated for and whether it
// has one (lay-flat is rated for none: 0, true).
func hoseRating(h Hose) (float64, bool) {
	switch h.Vacuum {
	case VacuumRated:
		return float64(h.VacuumRating), true
	case VacuumNone:
		return 0, true
	case VacuumFromWall:
		return float64(RingBucklingPressure(h.Wall, h.Diameter)) / CollapseSafetyFactor, true
	default: // VacuumNotRated
		return 0, false
	}
}

// staticVacuums returns the gauge vacuum at the crest of a hose full of
// liquid with the intake blocked (the down-leg hangs from the crest:
// ρg(z_crest − z_outlet)) and while vacuum priming (the pump holds the
// up-leg: ρg·lift), each at most p_atm − p_v (the column parts there).
func staticVacuums(rho, patm, pv float64, g Geometry) (blocked, priming float64) {
	lim := max(patm-pv, 0)
	blocked = min(max(rho*StandardGravity*float64(g.Crest-g.Outlet), 0), lim)
	priming = min(max(rho*StandardGravity*float64(g.Lift()), 0), lim)
	return blocked, priming
}

func validateHoseVacuum(h Hose) error {
	if h.Vacuum >= vacuumClassCount {
		return &RangeError{What: QuantityVacuumRating, Quantity: "hose vacuum class", Value: float64(h.Vacuum),
			Min: 0, Max: float64(vacuumClassCount - 1), Err: ErrOutOfRange}
	}
	switch h.Vacuum {
	case VacuumRated:
		return checkPositive(QuantityVacuumRating, "hose vacuum rating", float64(h.VacuumRating), MaxAtmPressure, "Pa")
	case VacuumFromWall:
		if err := checkPositive(QuantityHoseWall, "hose wall thickness", float64(h.Wall.Thickness), float64(h.Diameter), "m"); err != nil {
			return err
		}
		if err := checkPositive(QuantityHoseWall, "hose wall modulus", float64(h.Wall.Modulus), 1e12, "Pa"); err != nil {
			return err
		}
		return checkRange(QuantityHoseWall, "hose wall Poisson's ratio", h.Wall.Poisson, 0, 0.5, "")
	default: // VacuumNotRated, VacuumNone: nothing more to check
		return nil
	}
}
