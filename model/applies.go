package model

import (
	"strings"

	"drawdown/presets"
)

// Applies reports whether field id bears on a job whose inputs are values:
// the intake is a depth without a tank and a height above the floor with
// one; a tank's sizes depend on its shape (a horizontal cylinder's, a
// sphere's and a calibration table's depth is their own); the hand-pump
// stroke volume matters only for hand-pump priming; a receiving vessel needs
// the source tank described, and its sizes depend on its shape.
//
// It is the one rule for which fields apply: the form shows a field that
// does not as "not used here", and Compute neither reads it nor blames it.
func Applies(values map[FieldID]string, id FieldID) bool {
	shape := normChoice(values[FieldTankShape])
	tank := shape != "" && shape != "none"
	switch id {
	case FieldIntakeDepth:
		return !tank
	case FieldIntakeHeight:
		// An end lying on the floor, a suction plate and a floating
		// intake sit on (or ground at) the floor.
		switch normChoice(values[FieldIntakeKind]) {
		case "bare-floor", "suction-plate", "floating":
			return false
		}
		return tank
	case FieldTankLevel, FieldTankTarget, FieldRain, FieldRiseRate, FieldSeepage, FieldPumpRate:
		return tank
	case FieldCatchment:
		return tank && strings.TrimSpace(values[FieldRain]) != ""
	case FieldTankHeight:
		return tank && shape != "horizontal-cylinder" && shape != "sphere" && shape != "table"
	case FieldTankDiameter, FieldTankLength, FieldTankWidth, FieldTankCone, FieldTankSlope:
		return tank && shapeHas(shape, tankSizeName[id])
	case FieldPumpStroke:
		return normChoice(values[FieldPriming]) == string(PrimeHandPump)
	case FieldReceiverShape:
		return tank // a transfer needs the source tank described
	case FieldReceiverDiameter, FieldReceiverLength, FieldReceiverWidth, FieldReceiverHeight,
		FieldReceiverCone, FieldReceiverSlope, FieldReceiverFloor, FieldReceiverLevel:
		rshape := normChoice(values[FieldReceiverShape])
		if !tank || rshape == "" || rshape == "none" {
			return false
		}
		switch id {
		case FieldReceiverFloor, FieldReceiverLevel:
			return true
		case FieldReceiverHeight:
			return rshape != "horizontal-cylinder" && rshape != "sphere"
		default:
			return shapeHas(rshape, strings.TrimPrefix(string(id), "receiver."))
		}
	default: // every other field applies to every job
	}
	return true
}

// tankSizeName is the catalogue size name of each tank size field.
var tankSizeName = map[FieldID]string{
	FieldTankDiameter: "diameter", FieldTankLength: "length", FieldTankWidth: "width",
	FieldTankCone: "cone-height", FieldTankSlope: "side-slope",
}

func shapeHas(shape, size string) bool {
	for _, s := range presets.ShapeSizes(shape) {
		if s == size {
			return true
		}
	}
	return false
}

func normChoice(s string) string { return strings.ToLower(strings.TrimSpace(s)) }
