package calc

// Fluid is a liquid's state at the job's temperature: what the solver needs.
// presets builds it from a liquid's correlations; a technician can override
// each value from a safety data sheet.
type Fluid struct {
	Density       Density   // ρ, kg/m³
	Viscosity     Viscosity // μ, Pa·s
	VaporPressure Pressure  // p_v, Pa absolute
	// Volatile is true for a fuel or other mixture of light components
	// whose VaporPressure is its true vapour pressure (bubble point): the
	// crest is then kept a margin above the bubble point instead of the
	// dissolved-gas allowance (see the crest limits in crest.go).
	Volatile bool
}

// Accepted ranges for a Fluid, wide enough for any liquid a siphon can move.
const (
	MinDensity       = 500.0  // kg/m³ (light hydrocarbons)
	MaxDensity       = 2500.0 // kg/m³ (dense brines and slurries)
	MinViscosity     = 1e-4   // Pa·s
	MaxViscosity     = 10.0   // Pa·s (heavy oil; a siphon is hopeless beyond)
	MaxVaporPressure = 2e5    // Pa (a liquid above the site pressure boils: a verdict, see Solve)
)

// Validate reports the first property outside its accepted range.
func (f Fluid) Validate() error {
	if err := checkRange(QuantityDensity, "liquid density", float64(f.Density), MinDensity, MaxDensity, "kg/m³"); err != nil {
		return err
	}
	if err := checkRange(QuantityViscosity, "liquid viscosity", float64(f.Viscosity), MinViscosity, MaxViscosity, "Pa·s"); err != nil {
		return err
	}
	return checkRange(QuantityVaporPressure, "liquid vapour pressure", float64(f.VaporPressure), 0, MaxVaporPressure, "Pa")
}
