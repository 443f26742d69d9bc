package model

import (
	"errors"
	"math"

	"drawdown/calc"
)

// quantityField is the field a technician changes when calc or presets
// refuses a quantity (calc.RangeError.What). Quantities with a choice of
// field (an override or the value it overrides) are decided in fieldFor.
var quantityField = map[calc.Quantity]FieldID{
	calc.QuantityTemperature:       FieldTemp,
	calc.QuantityAltitude:          FieldAltitude,
	calc.QuantityHoseDiameter:      FieldHoseID,
	calc.QuantityHoseLength:        FieldHoseLength,
	calc.QuantityUpLegLength:       FieldHoseUpLeg,
	calc.QuantityHoses:             FieldHoseCount,
	calc.QuantityCrest:             FieldLift,
	calc.QuantityOutlet:            FieldDrop,
	calc.QuantitySurface:           FieldTankLevel,
	calc.QuantityStartLevel:        FieldTankLevel,
	calc.QuantityTarget:            FieldTankTarget,
	calc.QuantityTankDiameter:      FieldTankDiameter,
	calc.QuantityTankLength:        FieldTankLength,
	calc.QuantityTankWidth:         FieldTankWidth,
	calc.QuantityTankHeight:        FieldTankHeight,
	calc.QuantityConeHeight:        FieldTankCone,
	calc.QuantitySideSlope:         FieldTankSlope,
	calc.QuantityTankTable:         FieldTankShape,
	calc.QuantitySourceTank:        FieldTankShape,
	calc.QuantityHeightTolerance:   FieldTolHeight,
	calc.QuantityReceiverTank:      FieldReceiverShape,
	calc.QuantityReceiverFloor:     FieldReceiverFloor,
	calc.QuantityReceiverLevel:     FieldReceiverLevel,
	calc.QuantitySalinity:          FieldLiquid,
	calc.QuantityReidVaporPressure: FieldLiquid,
}

// fieldFor maps a calc or presets error to the field a technician must
// change, by the quantity the error names (never by its words); "" when no
// field is to blame (the plan's error is then shown on its own).
func (c *computer) fieldFor(err error) FieldID {
	var re *calc.RangeError
	if !errors.As(err, &re) {
		return ""
	}
	either := func(override, base FieldID) FieldID {
		if c.set(override) {
			return override
		}
		return base
	}
	switch re.What {
	case calc.QuantityVaporPressure:
		return either(FieldVapor, FieldTemp)
	case calc.QuantityDensity:
		return either(FieldDensity, FieldTemp)
	case calc.QuantityViscosity:
		return either(FieldViscosity, FieldTemp)
	case calc.QuantityAtmPressure:
		return either(FieldBaro, FieldAltitude)
	case calc.QuantityRoughness, calc.QuantityRoughnessRange, calc.QuantityRelativeRoughness:
		return either(FieldHoseRoughness, FieldHoseMaterial)
	case calc.QuantityKEntrance, calc.QuantityKUpLeg, calc.QuantityKDownLeg, calc.QuantityKRange:
		return either(FieldHoseKMinor, FieldHoseFittings)
	case calc.QuantityIntake:
		if c.p.Tank != nil || Applies(c.in.Values, FieldIntakeHeight) {
			return FieldIntakeHeight
		}
		return FieldIntakeDepth
	default:
	}
	return quantityField[re.What]
}

// calcFieldError wraps a calc or presets error as a *FieldError for field id
// so that the screen can show it beside the field. When the quantity is of
// the field's dimension, the value and the accepted range are given in the
// job's unit system ("−40 °C … accepted 0 to 100 °C", not kelvin).
func (c *computer) calcFieldError(id FieldID, err error) error {
	f, _ := FieldByID(id)
	fe := &FieldError{ID: id, Label: f.Label, Text: c.text(id), Detail: err.Error(), Err: err}
	var re *calc.RangeError
	if errors.As(err, &re) && re.Unit == siUnit(f.Dim) && f.Dim != DimNumber {
		sys := c.in.Units
		fe.Detail = re.Quantity + " " + shown(f.Dim, re.Value, sys) + " is out of range"
		if errors.Is(err, calc.ErrBoiling) {
			fe.Detail = re.Quantity + " " + shown(f.Dim, re.Value, sys) + ": the liquid boils at this site's pressure"
		}
		if math.IsNaN(re.Value) || math.IsInf(re.Value, 0) {
			fe.Detail = re.Quantity + " is not a finite number"
		}
		fe.Accept = rangeIn(f.Dim, re.Min, re.Max, sys)
	}
	return fe
}

// siUnit is the SI unit symbol calc uses for a dimension's values.
func siUnit(d Dim) string {
	switch d {
	case DimLength, DimDiameter, DimRoughness:
		return "m"
	case DimPressure:
		return "Pa"
	case DimTemperature:
		return "K"
	case DimDensity:
		return "kg/m³"
	case DimViscosity:
		return "Pa·s"
	case DimFlow:
		return "m³/s"
	case DimVolume:
		return "m³"
	case DimTime:
		return "s"
	case DimVelocity, DimRate:
		return "m/s"
	case DimArea:
		return "m²"
	default: // DimNumber and DimPercent are plain numbers
	}
	return ""
}

// rangeIn words an accepted range [lo, hi] (SI, an open end ±Inf) in sys.
func rangeIn(d Dim, lo, hi float64, sys System) string {
	f := func(v float64) string { n, _ := formatPlain(d, v, sys); return n }
	unit := DefaultUnit(d, sys)
	switch {
	case math.IsInf(lo, -1) && math.IsInf(hi, 1):
		return "any finite value"
	case math.IsInf(hi, 1):
		return "at least " + f(lo) + " " + unit
	case math.IsInf(lo, -1):
		return "at most " + f(hi) + " " + unit
	}
	return f(lo) + " to " + f(hi) + " " + unit
}
