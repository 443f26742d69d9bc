package presets

import (
	"errors"
	"math"
	"strconv"

	"drawdown/calc"
)

// Liquid is a catalogue liquid: its property correlations over a stated
// temperature range, its cold limit, flash point and hazard tags, and the
// source of each.
//
// The zero Liquid has no properties; Fluid returns an error for it.
type Liquid struct {
	ID    string // short lowercase code used on the command line, e.g. "eg30"
	Name  string // display name
	Basis string // composition the values are for, e.g. "35 g/kg salinity"

	// Min and Max bound the temperatures at which the correlations hold.
	Min, Max calc.Temperature
	// Cold is the freezing point, pour point or cold-filter plugging point
	// (see ColdKind); 0 when the liquid does not freeze in the tool's range.
	Cold     calc.Temperature
	ColdKind string
	// Flash is the closed-cup flash point; 0 when the liquid has none.
	Flash calc.Temperature
	// Boil is the boiling point used for the NFPA 30 class (the D86 10 %
	// point for a mixture); 0 when not relevant.
	Boil  calc.Temperature
	Class FlashClass // NFPA 30 class from Flash and Boil
	// Hazards are the tags that hold at any temperature; see HazardsAt.
	Hazards Hazards

	Sources Sources
	Note    string // a caution or a limitation, one or two sentences
	Origin  string // "built-in" or the name of the user preset file

	model propModel
}

// Sources names where each value of a Liquid comes from. A value from
// memory says so.
type Sources struct {
	Density       string
	Viscosity     string
	VaporPressure string
	Range         string // why the valid range is what it is
	Cold          string
	Flash         string // flash point and NFPA 30 class
}

// Valid reports whether the liquid has a property model (false for the zero
// Liquid).
func (l Liquid) Valid() bool { return l.model != nil }

// Fluid returns the liquid's density, viscosity and vapour pressure at
// temperature T under absolute pressure p (the site's barometric pressure;
// only water's density depends on it, slightly).
//
// Special cases:
//
//	T outside [Min, Max], NaN or ±Inf: *calc.RangeError wrapping
//	    calc.ErrOutOfRange (or ErrNotFinite), Quantity "<Name> temperature",
//	    Min and Max the liquid's valid range in K.
//	p ≤ 0, above 100 MPa, NaN or ±Inf: *calc.RangeError ("absolute pressure").
//	Vapour pressure at or above p: *calc.RangeError wrapping calc.ErrBoiling,
//	    Quantity "<Name> temperature", Max the temperature at which the
//	    liquid starts to boil under p.
//	Zero Liquid: an error saying the liquid has no properties.
//
// The returned Fluid passes calc.Fluid.Validate; nothing returned is NaN.
func (l Liquid) Fluid(T calc.Temperature, p calc.Pressure) (calc.Fluid, error) {
	if l.model == nil {
		return calc.Fluid{}, errors.New("presets: liquid " + strconv.Quote(l.ID) + " has no property data")
	}
	t := float64(T)
	if math.IsNaN(t) || math.IsInf(t, 0) {
		return calc.Fluid{}, &calc.RangeError{What: calc.QuantityTemperature, Quantity: l.quantity(), Value: t, Min: float64(l.Min), Max: float64(l.Max), Unit: "K", Err: calc.ErrNotFinite}
	}
	if T < l.Min || T > l.Max {
		return calc.Fluid{}, &calc.RangeError{What: calc.QuantityTemperature, Quantity: l.quantity(), Value: t, Min: float64(l.Min), Max: float64(l.Max), Unit: "K", Err: calc.ErrOutOfRange,
			Note: "range of the " + l.ID + " property data"}
	}
	pp := float64(p)
	if math.IsNaN(pp) || math.IsInf(pp, 0) {
		return calc.Fluid{}, &calc.RangeError{What: calc.QuantityAtmPressure, Quantity: "absolute pressure", Value: pp, Min: 0, Max: maxPressure, Unit: "Pa", Err: calc.ErrNotFinite}
	}
	if pp <= 0 || pp > maxPressure {
		return calc.Fluid{}, &calc.RangeError{What: calc.QuantityAtmPressure, Quantity: "absolute pressure", Value: pp, Min: 0, Max: maxPressure, Unit: "Pa", Err: calc.ErrOutOfRange,
			Note: "must be more than zero"}
	}
	f, err := l.model.eval(T, p)
	if err != nil {
		var re *calc.RangeError
		if errors.As(err, &re) && re.Unit == "K" {
			c := *re
			c.Quantity = l.quantity()
			if errors.Is(err, calc.ErrBoiling) {
				return f, &c // the saturated liquid goes with it: a boiling verdict, not a dead end
			}
			return calc.Fluid{}, &c
		}
		return calc.Fluid{}, err
	}
	if float64(f.VaporPressure) >= pp {
		tb := l.boilingAt(pp)
		// The liquid's properties go with the error, so that the caller can
		// give a verdict (it boils: it will not run) rather than refuse.
		return f, &calc.RangeError{What: calc.QuantityTemperature, Quantity: l.quantity(), Value: t, Min: float64(l.Min), Max: tb, Unit: "K", Err: calc.ErrBoiling,
			Note: l.ID + " vapour pressure " + num(float64(f.VaporPressure)) + " Pa reaches the pressure " + num(pp) + " Pa"}
	}
	if err := f.Validate(); err != nil {
		return calc.Fluid{}, err
	}
	return f, nil
}

// maxPressure is the highest absolute pressure Fluid accepts, 100 MPa (the
// upper limit of IAPWS-IF97 Region 1).
const maxPressure = 100e6

func (l Liquid) quantity() string {
	if l.Name != "" {
		return l.Name + " temperature"
	}
	return l.ID + " temperature"
}

// vaporPressure evaluates p_v alone at T (K), for the boiling search.
func (l Liquid) vaporPressure(T float64) float64 {
	if _, ok := l.model.(waterModel); ok {
		return waterVaporPressure(T)
	}
	if om, ok := l.model.(*overrideModel); ok {
		if !math.IsNaN(om.pv) {
			return om.pv
		}
		return Liquid{model: om.base}.vaporPressure(T)
	}
	f, err := l.model.eval(calc.Temperature(T), calc.Pressure(maxPressure))
	if err != nil {
		return math.Inf(1)
	}
	return float64(f.VaporPressure)
}

// VaporTemperature is the temperature at which the liquid's vapour pressure
// is pv, within its valid range (by bisection; vapour pressure rises with
// temperature): the temperature it must cool to for a vapour pressure of at
// most pv. ok is false when even its lowest temperature is above pv.
func (l Liquid) VaporTemperature(pv calc.Pressure) (calc.Temperature, bool) {
	if l.model == nil || l.vaporPressure(float64(l.Min)) > float64(pv) {
		return 0, false
	}
	return calc.Temperature(l.boilingAt(float64(pv))), true
}

// boilingAt returns the lowest temperature in [Min, Max] at which the vapour
// pressure reaches p, by bisection (vapour pressure rises with T).
func (l Liquid) boilingAt(p float64) float64 {
	lo, hi := float64(l.Min), float64(l.Max)
	if l.vaporPressure(lo) >= p {
		return lo
	}
	for range 60 {
		mid := (lo + hi) / 2
		if l.vaporPressure(mid) >= p {
			hi = mid
		} else {
			lo = mid
		}
	}
	return lo
}

// HazardsAt returns the liquid's hazard tags at temperature T: its fixed
// Hazards, plus Hot at or above HotThreshold, FreezingRisk within
// FreezeMargin of Cold (or below it), and Flammable for a combustible liquid
// within FlashMargin of its flash point.
func (l Liquid) HazardsAt(T calc.Temperature) Hazards {
	h := l.Hazards
	if math.IsNaN(float64(T)) {
		return h
	}
	if T >= HotThreshold {
		h = h.With(Hot)
	}
	if l.Cold > 0 && float64(T) <= float64(l.Cold)+FreezeMargin {
		h = h.With(FreezingRisk)
	}
	if l.Flash > 0 && float64(T) >= float64(l.Flash)-FlashMargin {
		h = h.With(Flammable)
	}
	return h
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', 5, 64) }

func celsius(c float64) calc.Temperature { return calc.Celsius(c) }
