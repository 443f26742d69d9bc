package calc

import (
	"errors"
	"math"
	"strconv"
)

// Error policy (see DEVELOPERS.md): invalid physical input is an error value,
// because in drawdown every input comes from a person. A *RangeError names the
// quantity, the value and the accepted range. Sentinels below classify it so
// callers can use errors.Is. NaN and Inf never leave calc. Programmer errors
// (mismatched slices, impossible states) panic with a "calc: " prefix.

// ErrOutOfRange is wrapped by every *RangeError: a value outside the range in
// which the quantity or the correlation is valid.
var ErrOutOfRange = errors.New("out of range")

// ErrNotFinite is wrapped by a *RangeError whose value was NaN or ±Inf.
var ErrNotFinite = errors.New("not a finite number")

// ErrBoiling reports a liquid whose vapour pressure reaches the site's
// barometric pressure: it boils in the open and no siphon can run.
var ErrBoiling = errors.New("liquid boils at site pressure")

// ErrGeometry reports heights or lengths that contradict each other (an up-leg
// longer than the whole hose, an intake above the surface, a roughness as big
// as the bore).
var ErrGeometry = errors.New("inconsistent geometry")

// Quantity names the input a *RangeError is about, so that a caller can
// point at the field to change without reading the message: errors are
// matched by this typed field (errors.As, then re.What), never by a
// substring of the human Quantity string. The zero value QuantityUnknown is
// never set by calc or presets; every RangeError they build names one of
// the constants below. String gives a stable lowercase code for records and
// JSON; codes never change meaning.
type Quantity uint8

// Quantities validated by calc and presets.
const (
	// QuantityUnknown: no quantity named (the zero value; never set by calc or presets).
	QuantityUnknown Quantity = iota
	// QuantityDensity: liquid density ρ.
	QuantityDensity
	// QuantityViscosity: liquid dynamic viscosity μ.
	QuantityViscosity
	// QuantityVaporPressure: liquid vapour pressure p_v.
	QuantityVaporPressure
	// QuantityTemperature: liquid temperature (water's, or a catalogue liquid's).
	QuantityTemperature
	// QuantityAtmPressure: barometric (absolute) pressure at the site.
	QuantityAtmPressure
	// QuantityAltitude: site altitude.
	QuantityAltitude
	// QuantityHoseDiameter: hose inside diameter.
	QuantityHoseDiameter
	// QuantityHoseLength: hose length.
	QuantityHoseLength
	// QuantityUpLegLength: hose length from intake to crest.
	QuantityUpLegLength
	// QuantityRoughness: hose absolute roughness ε.
	QuantityRoughness
	// QuantityKEntrance: entrance loss coefficient.
	QuantityKEntrance
	// QuantityKUpLeg: fittings before the crest (up-leg) loss coefficient.
	QuantityKUpLeg
	// QuantityKDownLeg: fittings after the crest (down-leg) loss coefficient.
	QuantityKDownLeg
	// QuantityHoses: number of hoses in parallel.
	QuantityHoses
	// QuantitySurface: source surface elevation.
	QuantitySurface
	// QuantityIntake: intake elevation or height above the floor.
	QuantityIntake
	// QuantityCrest: crest elevation.
	QuantityCrest
	// QuantityOutlet: outlet elevation.
	QuantityOutlet
	// QuantityTankDiameter: tank diameter.
	QuantityTankDiameter
	// QuantityTankLength: tank length (or a pit's bottom length).
	QuantityTankLength
	// QuantityTankWidth: tank width (or a pit's bottom width).
	QuantityTankWidth
	// QuantityTankHeight: tank height (or a pit's depth).
	QuantityTankHeight
	// QuantityConeHeight: height of a cone bottom.
	QuantityConeHeight
	// QuantitySideSlope: side slope of a pit.
	QuantitySideSlope
	// QuantityTankTable: a calibration table (its rows, levels or volumes).
	QuantityTankTable
	// QuantitySourceTank: the source tank itself (missing).
	QuantitySourceTank
	// QuantityStartLevel: the source level at the start of a drain.
	QuantityStartLevel
	// QuantityTarget: the target level of a drain.
	QuantityTarget
	// QuantityReceiverTank: the receiving tank itself (missing).
	QuantityReceiverTank
	// QuantityReceiverFloor: the receiving tank's floor elevation.
	QuantityReceiverFloor
	// QuantityReceiverLevel: the receiving tank's starting level.
	QuantityReceiverLevel
	// QuantityHeightTolerance: the ± tolerance of measured heights.
	QuantityHeightTolerance
	// QuantityRoughnessRange: an end of the stated roughness range.
	QuantityRoughnessRange
	// QuantityKRange: an end of the stated fittings ΣK range.
	QuantityKRange
	// QuantityCurvePoints: the number of drain-curve points.
	QuantityCurvePoints
	// QuantityWhatIf: the size of a what-if grid.
	QuantityWhatIf
	// QuantityReynolds: a Reynolds number (reserved: no calc entry point takes one today).
	QuantityReynolds
	// QuantityRelativeRoughness: a relative roughness ε/D (reserved, as QuantityReynolds).
	QuantityRelativeRoughness
	// QuantitySalinity: salinity of seawater or brine (presets).
	QuantitySalinity
	// QuantityReidVaporPressure: Reid vapour pressure of gasoline (presets).
	QuantityReidVaporPressure
	// QuantityBarbRatio: bore ratio of a hose barb (presets).
	QuantityBarbRatio
	// QuantityOutletK: outlet valve or fitting loss coefficient.
	QuantityOutletK
	// QuantityMaxFlow: maximum discharge rate (a permit's cap).
	QuantityMaxFlow
	// QuantityIntakeKind: intake kind.
	QuantityIntakeKind
	// QuantityIntakeSize: intake face diameter.
	QuantityIntakeSize
	// QuantityIntakeHeight: height of the intake's opening.
	QuantityIntakeHeight
	// QuantityIntakeOpenArea: intake open area.
	QuantityIntakeOpenArea
	// QuantityIntakeK: intake device loss coefficient.
	QuantityIntakeK
	// QuantityFloatDepth: floating intake depth.
	QuantityFloatDepth
	// QuantityVacuumRating: hose vacuum rating or class.
	QuantityVacuumRating
	// QuantityHoseWall: hose wall (thickness, modulus, Poisson's ratio).
	QuantityHoseWall
	// QuantityDownLegSlope: steepest down-leg slope after the crest.
	QuantityDownLegSlope
	// QuantityInflow: liquid coming into the source while it drains.
	QuantityInflow
	// QuantityBoreTolerance: the ± tolerance of the hose's bore.
	QuantityBoreTolerance
	// QuantityPumpRate: a pump's rate for finishing the residual.
	QuantityPumpRate
	quantityCount
)

var quantityCodes = [...]string{
	"unknown",
	"density",
	"viscosity",
	"vapor_pressure",
	"temperature",
	"atm_pressure",
	"altitude",
	"hose_diameter",
	"hose_length",
	"up_leg_length",
	"roughness",
	"k_entrance",
	"k_up_leg",
	"k_down_leg",
	"hoses",
	"surface",
	"intake",
	"crest",
	"outlet",
	"tank_diameter",
	"tank_length",
	"tank_width",
	"tank_height",
	"cone_height",
	"side_slope",
	"tank_table",
	"source_tank",
	"start_level",
	"target",
	"receiver_tank",
	"receiver_floor",
	"receiver_level",
	"height_tolerance",
	"roughness_range",
	"k_range",
	"curve_points",
	"what_if",
	"reynolds",
	"relative_roughness",
	"salinity",
	"reid_vapor_pressure",
	"barb_ratio",
	"outlet_k",
	"max_flow",
	"intake_kind",
	"intake_size",
	"intake_height",
	"intake_open_area",
	"intake_k",
	"float_depth",
	"vacuum_rating",
	"hose_wall",
	"down_leg_slope",
	"inflow",
	"bore_tolerance",
	"pump_rate",
}

// String returns the stable lowercase code of q, e.g. "hose_diameter".
func (q Quantity) String() string {
	if int(q) >= len(quantityCodes) {
		return "quantity(" + strconv.Itoa(int(q)) + ")"
	}
	return quantityCodes[q]
}

// RangeError is the error for one input quantity outside its accepted range.
// Min and Max are in SI units; an open end is ±Inf. Unit is the SI unit symbol
// used in the message.
type RangeError struct {
	What     Quantity // which input, for callers (never QuantityUnknown)
	Quantity string   // human name for messages, e.g. "hose inside diameter"
	Value    float64  // offending value (SI)
	Min, Max float64  // accepted range (SI), inclusive
	Unit     string   // SI unit symbol, e.g. "m"
	Err      error    // ErrOutOfRange, ErrNotFinite, ErrBoiling or ErrGeometry
	Note     string   // optional extra reason, e.g. "vapour pressure above barometric"
}

func (e *RangeError) Error() string {
	s := e.Quantity + " "
	if math.IsNaN(e.Value) || math.IsInf(e.Value, 0) {
		s += "is not a finite number"
	} else {
		s += strconv.FormatFloat(e.Value, 'g', 5, 64) + " " + e.Unit + " is out of range"
	}
	s += "; accepted " + rangeText(e.Min, e.Max, e.Unit)
	if e.Note != "" {
		s += " (" + e.Note + ")"
	}
	return s
}

// Unwrap returns the sentinel classifying the error.
func (e *RangeError) Unwrap() error { return e.Err }

func rangeText(lo, hi float64, unit string) string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 5, 64) }
	switch {
	case math.IsInf(lo, -1) && math.IsInf(hi, 1):
		return "any finite value"
	case math.IsInf(hi, 1):
		if lo == 0 {
			return "more than 0 " + unit
		}
		return "at least " + f(lo) + " " + unit
	case math.IsInf(lo, -1):
		return "at most " + f(hi) + " " + unit
	}
	return f(lo) + " to " + f(hi) + " " + unit
}

// checkRange returns a *RangeError when v is not finite or lies outside
// [lo, hi]; lo and hi must be finite (so that the test below also refuses
// ±Inf; NaN fails every comparison). The in-range test comes first and is
// small enough to inline: every solve checks some twenty inputs.
func checkRange(what Quantity, quantity string, v, lo, hi float64, unit string) error {
	if v >= lo && v <= hi {
		return nil
	}
	return rangeError(what, quantity, v, lo, hi, unit)
}

// rangeError builds checkRange's error for v outside [lo, hi] or not finite.
func rangeError(what Quantity, quantity string, v, lo, hi float64, unit string) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &RangeError{What: what, Quantity: quantity, Value: v, Min: lo, Max: hi, Unit: unit, Err: ErrNotFinite}
	}
	return &RangeError{What: what, Quantity: quantity, Value: v, Min: lo, Max: hi, Unit: unit, Err: ErrOutOfRange}
}

// checkPositive is checkRange for quantities that must be strictly positive
// and at most hi.
func checkPositive(what Quantity, quantity string, v, hi float64, unit string) error {
	if err := checkRange(what, quantity, v, 0, hi, unit); err != nil {
		return err
	}
	if v <= 0 {
		return &RangeError{What: what, Quantity: quantity, Value: v, Min: 0, Max: hi, Unit: unit, Err: ErrOutOfRange, Note: "must be more than zero"}
	}
	return nil
}
