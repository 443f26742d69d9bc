package model

import (
	"errors"
	"strings"

	"drawdown/calc"
)

// fieldFor maps a calc error to the field a technician must change.
func (c *computer) fieldFor(err error) FieldID {
	var re *calc.RangeError
	if !errors.As(err, &re) {
		return FieldHoseID
	}
	q := strings.ToLower(re.Quantity)
	switch {
	case strings.Contains(q, "vapour"):
		if c.set(FieldVapor) {
			return FieldVapor
		}
		return FieldTemp
	case strings.Contains(q, "density"):
		if c.set(FieldDensity) {
			return FieldDensity
		}
		return FieldTemp
	case strings.Contains(q, "viscosity"):
		if c.set(FieldViscosity) {
			return FieldViscosity
		}
		return FieldTemp
	case strings.Contains(q, "temperature"):
		return FieldTemp
	case strings.Contains(q, "barometric") || strings.Contains(q, "altitude"):
		if c.set(FieldBaro) {
			return FieldBaro
		}
		return FieldAltitude
	case strings.Contains(q, "diameter") && strings.Contains(q, "tank"):
		return FieldTankDiameter
	case strings.Contains(q, "inside diameter"):
		return FieldHoseID
	case strings.Contains(q, "roughness"):
		if c.set(FieldHoseRoughness) {
			return FieldHoseRoughness
		}
		return FieldHoseMaterial
	case strings.Contains(q, "up-leg"):
		return FieldHoseUpLeg
	case strings.Contains(q, "hose length"):
		return FieldHoseLength
	case strings.Contains(q, "loss coefficient"):
		if c.set(FieldHoseKMinor) {
			return FieldHoseKMinor
		}
		return FieldHoseFittings
	case strings.Contains(q, "number of hoses"):
		return FieldHoseCount
	case strings.Contains(q, "crest"):
		return FieldLift
	case strings.Contains(q, "outlet"):
		return FieldDrop
	case strings.Contains(q, "intake"):
		if c.p.Tank != nil || c.text(FieldTankShape) != "none" {
			return FieldIntakeHeight
		}
		return FieldIntakeDepth
	case strings.Contains(q, "target"):
		return FieldTankTarget
	case strings.Contains(q, "start level") || strings.Contains(q, "level"):
		return FieldTankLevel
	case strings.Contains(q, "cone"):
		return FieldTankCone
	case strings.Contains(q, "slope"):
		return FieldTankSlope
	case strings.Contains(q, "width"):
		return FieldTankWidth
	case strings.Contains(q, "tank length"):
		return FieldTankLength
	case strings.Contains(q, "height") || strings.Contains(q, "depth"):
		return FieldTankHeight
	}
	return FieldHoseID
}

// calcFieldError wraps a calc error as a *FieldError for field id so that
// the screen can show it beside the field. The calc message is in SI; it
// names the quantity and the accepted range.
func (c *computer) calcFieldError(id FieldID, err error) error {
	f, _ := FieldByID(id)
	return &FieldError{ID: id, Label: f.Label, Text: c.text(id), Detail: err.Error(), Err: err}
}
