package presets

import (
	"math"
	"sort"

	"drawdown/calc"
)

// Material is a hose or pipe wall with its absolute roughness ε.
type Material struct {
	ID string
	// Aliases are other IDs the material is found by: old IDs kept so
	// that saved jobs still load, and spellings a user would guess.
	Aliases []string
	Name    string
	// Roughness is the central absolute roughness ε; RoughnessLow and
	// RoughnessHigh bound the published range.
	Roughness, RoughnessLow, RoughnessHigh calc.Length
	// Collapses is true for a wall that flattens under suction (lay-flat
	// hose): it cannot hold the vacuum of a siphon's crest. It goes with
	// VacuumClass VacuumNone.
	Collapses bool
	// VacuumClass says whether the wall has a vacuum rating; Vacuum is the
	// rating when it has one, a gauge pressure, positive for vacuum: the
	// wall holds an inside pressure Vacuum below the atmosphere outside
	// (80 kPa is an absolute 21 kPa at sea level; 101.325 kPa is full
	// vacuum). VacuumSource says where the rating comes from.
	VacuumClass  VacuumClass
	Vacuum       calc.Pressure
	VacuumSource string
	Source       string
	Note         string
	Origin       string
}

// VacuumClass says whether a hose wall has a vacuum rating.
type VacuumClass uint8

// Vacuum classes.
const (
	// VacuumNotRated: no rating known (garden hose, plain hose or
	// tubing); the hose's own marking decides.
	VacuumNotRated VacuumClass = iota
	// VacuumRated: Material.Vacuum holds the rating.
	VacuumRated
	// VacuumNone: the wall holds no vacuum; it collapses (lay-flat).
	VacuumNone
)

var vacuumClassNames = [...]string{"not rated", "rated", "none"}

// String returns "not rated", "rated" or "none", as the preset file writes
// it.
func (v VacuumClass) String() string {
	if int(v) < len(vacuumClassNames) {
		return vacuumClassNames[v]
	}
	return "unknown"
}

// ParseVacuumClass is the inverse of String.
func ParseVacuumClass(s string) (VacuumClass, bool) {
	for i, n := range vacuumClassNames {
		if s == n {
			return VacuumClass(i), true
		}
	}
	return 0, false
}

// FullVacuum is the largest vacuum rating, gauge: the standard atmosphere
// (ISO 2533), an absolute zero inside at sea level.
const FullVacuum calc.Pressure = 101325

// Hose is a common hose or pipe inside diameter, metric or inch series.
type Hose struct {
	ID       string      // e.g. "25mm", "1-1/2in"
	Aliases  []string    // other IDs it is found by
	Name     string      // e.g. "1½ in (38.1 mm)"
	Diameter calc.Length // inside diameter, m
	Series   string      // "metric" or "inch"
	Source   string
	Origin   string
}

// Location is where a fitting sits on the hose run; it decides which sum of
// calc.Hose it adds to (KEntrance, KUpLeg or KDownLeg).
type Location uint8

// Fitting locations.
const (
	// AtEntrance: the intake end (entrance shapes, strainers, foot valves).
	AtEntrance Location = iota
	// UpLeg: between the intake and the crest.
	UpLeg
	// DownLeg: between the crest and the outlet (outlet valves).
	DownLeg
	// EitherLeg: bends and couplings; the user says which leg.
	EitherLeg
)

var locationNames = [...]string{"entrance", "up-leg", "down-leg", "either"}

// String returns "entrance", "up-leg", "down-leg" or "either".
func (l Location) String() string {
	if int(l) < len(locationNames) {
		return locationNames[l]
	}
	return "unknown"
}

// ParseLocation is the inverse of String.
func ParseLocation(s string) (Location, bool) {
	for i, n := range locationNames {
		if s == n {
			return Location(i), true
		}
	}
	return 0, false
}

// KRange is a loss coefficient K (h = K V²/2g, V the mean velocity in the
// hose) with the low and high ends of its published spread.
type KRange struct{ Central, Low, High float64 }

// Fitting is a fitting or hose feature with its loss coefficient.
type Fitting struct {
	ID      string
	Aliases []string // other IDs it is found by
	Name    string
	Where   Location
	// K is the loss coefficient. When PerFT is true its three values are
	// multiples n of Crane's friction factor f_T, and KAt gives K = n·f_T(D)
	// (Crane TP-410 method).
	K     KRange
	PerFT bool
	// FromMemory marks a value not confirmed in its cited source.
	FromMemory bool
	Source     string
	Note       string
	Origin     string
}

// KAt returns the fitting's K for a hose of inside diameter d. For a PerFT
// fitting it multiplies by CraneFT(d); otherwise it returns K unchanged.
func (f Fitting) KAt(d calc.Length) KRange {
	if !f.PerFT {
		return f.K
	}
	ft := CraneFT(d)
	return KRange{Central: f.K.Central * ft, Low: f.K.Low * ft, High: f.K.High * ft}
}

// craneFTmm and craneFTval are the Crane TP-410 (2009) f_T table, nominal size (mm) against
// the fully turbulent Darcy factor of clean commercial steel; confirmed via
// the `fluids` library (hydraulics note §2.2).
var craneFTmm = []float64{15, 20, 25, 32, 40, 50, 65, 80, 100, 125, 150, 200, 250, 350, 400, 550, 600, 900}
var craneFTval = []float64{.026, .024, .022, .021, .020, .019, .018, .017, .016, .015, .015, .014, .013, .013, .012, .012, .011, .011}

// CraneFT returns Crane's f_T for inside diameter d, interpolated in the
// Crane TP-410 (2009) table between nominal sizes (linear in ln d) and held
// at the end values below 15 mm and above 900 mm. Crane uses f_T for fitting
// coefficients even when the pipe itself is smooth.
//
// Special cases: d ≤ 0, NaN or ±Inf gives the 15 mm value.
func CraneFT(d calc.Length) float64 {
	mm := float64(d) * 1000
	if math.IsNaN(mm) || mm <= craneFTmm[0] {
		return craneFTval[0]
	}
	n := len(craneFTmm)
	if mm >= craneFTmm[n-1] {
		return craneFTval[n-1]
	}
	i := sort.SearchFloat64s(craneFTmm, mm)
	f := math.Log(mm/craneFTmm[i-1]) / math.Log(craneFTmm[i]/craneFTmm[i-1])
	return craneFTval[i-1] + f*(craneFTval[i]-craneFTval[i-1])
}

// BarbK returns the loss coefficient of a hose barb or reducing coupling
// whose bore is β times the hose bore, referred to the hose velocity: a
// sudden contraction followed by a sudden enlargement,
//
//	K = [0.5 (1 − β²) + (1 − β²)²] / β⁴
//
// Crane's 180° contraction term and the Borda–Carnot enlargement (forms
// confirmed via the `fluids` library; applying them to barbs is the
// hydraulics note's derivation, §2.4: β = 0.8 gives 0.756).
//
// Special cases: β outside (0, 1], NaN or ±Inf gives a *calc.RangeError
// ("barb bore ratio").
func BarbK(beta float64) (float64, error) {
	if math.IsNaN(beta) || math.IsInf(beta, 0) || beta <= 0 || beta > 1 {
		e := calc.ErrOutOfRange
		if math.IsNaN(beta) || math.IsInf(beta, 0) {
			e = calc.ErrNotFinite
		}
		return 0, &calc.RangeError{What: calc.QuantityBarbRatio, Quantity: "barb bore ratio", Value: beta, Min: 0, Max: 1, Unit: "", Err: e,
			Note: "insert bore over hose bore, more than zero"}
	}
	a := 1 - beta*beta
	return (0.5*a + a*a) / (beta * beta * beta * beta), nil
}

// TankTemplate is a typical vessel of one of the shapes calc supports, with
// named sizes. The shapes and size names follow the command line's --tank
// flags.
type TankTemplate struct {
	ID    string
	Name  string
	Shape string // one of TankShapes
	// Sizes in metres, except "side-slope" (horizontal run per unit rise).
	Sizes []Size
	// ConfinedSpace marks vessels a person could enter: entry needs a
	// permit, atmospheric testing and an attendant.
	ConfinedSpace bool
	Source        string
	Note          string
	Origin        string
}

// Size is one named dimension of a tank template.
type Size struct {
	Name  string
	Value float64
}

// Size returns the named size and whether the template has it.
func (t TankTemplate) Size(name string) (float64, bool) {
	for _, s := range t.Sizes {
		if s.Name == name {
			return s.Value, true
		}
	}
	return 0, false
}

// tankShapeSizes lists the shape IDs and, for each, the sizes it needs, in
// the order of calc's tank constructors (NewVerticalCylinder(diameter,
// height), NewRectangular(length, width, height), NewHorizontalCylinder(
// diameter, length), NewConeBottom(diameter, cone-height, height),
// NewSlopedPit(length, width, side-slope, height), NewSphere(diameter)).
// "height" is the depth from the floor to the brim; a sloped pit's length
// and width are at its flat bottom; a cone-bottom tank's height includes the
// cone.
var tankShapeSizes = map[string][]string{
	"vertical-cylinder":   {"diameter", "height"},
	"rectangular":         {"length", "width", "height"},
	"horizontal-cylinder": {"diameter", "length"},
	"cone-bottom":         {"diameter", "cone-height", "height"},
	"sloped-pit":          {"length", "width", "side-slope", "height"},
	"sphere":              {"diameter"},
}

// sizeOrder is the order in which sizes are stored and listed.
var sizeOrder = []string{"diameter", "length", "width", "height", "cone-height", "side-slope"}

// TankShapes returns the shape IDs in a fixed order.
func TankShapes() []string {
	return []string{"vertical-cylinder", "rectangular", "horizontal-cylinder", "cone-bottom", "sloped-pit", "sphere"}
}

// ShapeSizes returns the sizes a shape needs, in the order calc's
// constructor for the shape takes them (nil for an unknown shape).
func ShapeSizes(shape string) []string {
	s := tankShapeSizes[shape]
	return append([]string(nil), s...)
}

// PrimingMethod is a way to fill the hose before the siphon runs. Starting a
// siphon by mouth is never a method (see NeverByMouth).
type PrimingMethod struct {
	ID      string
	Name    string
	Summary string
	// NotFor holds hazards for which the method is unsuitable.
	NotFor  Hazards
	Caution string
	Source  string
	Origin  string
}

// Suits reports whether the method suits a liquid with the hazards h.
func (m PrimingMethod) Suits(h Hazards) bool { return m.NotFor&h == 0 }

// NeverByMouth is the caution every priming step list must carry.
const NeverByMouth = "Never start a siphon by mouth: fuels, sewage and chemicals " +
	"can be swallowed or breathed into the lungs."

// PrimingAid is a tool that fills the hose. Its stroke volume is a user
// entry; the typical range only guides it.
type PrimingAid struct {
	ID   string
	Name string
	// StrokeLow and StrokeHigh bound typical volumes per stroke or squeeze.
	StrokeLow, StrokeHigh calc.Volume
	Source                string
	Note                  string
	Origin                string
}
