package calc

func validateSiphon(s *Siphon) error {
	if err := s.Fluid.Validate(); err != nil {
		return err
	}
	if err := checkRange(QuantityAtmPressure, "barometric pressure", float64(s.AtmPressure), MinAtmPressure, MaxAtmPressure, "Pa"); err != nil {
		return err
	}
	h := s.Hose
	if err := checkPositive(QuantityHoseDiameter, "hose inside diameter", float64(h.Diameter), MaxDiameter, "m"); err != nil {
		return err
	}
	if err := checkPositive(QuantityHoseLength, "hose length", float64(h.Length), MaxHoseLength, "m"); err != nil {
		return err
	}
	if err := checkRange(QuantityRoughness, "hose roughness", float64(h.Roughness), 0, MaxRelativeRoughness*float64(h.Diameter), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange && h.Roughness > 0 {
			re.Err = ErrGeometry
			re.Note = "roughness must be under a tenth of the inside diameter; the Moody chart ends at ε/D = 0.05"
		}
		return err
	}
	if err := checkRange(QuantityUpLegLength, "up-leg length", float64(h.UpLegLength), 0, float64(h.Length), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange {
			re.Err = ErrGeometry
			re.Note = "the up-leg is part of the hose"
		}
		return err
	}
	for _, k := range [...]struct {
		what Quantity
		name string
		v    float64
	}{{QuantityKEntrance, "entrance loss coefficient", h.KEntrance}, {QuantityKUpLeg, "up-leg fittings loss coefficient", h.KUpLeg},
		{QuantityKDownLeg, "down-leg fittings loss coefficient", h.KDownLeg}, {QuantityOutletK, "outlet valve loss coefficient", h.OutletK}} {
		if err := checkRange(k.what, k.name, k.v, 0, MaxK, ""); err != nil {
			return err
		}
	}
	if err := validateHoseVacuum(h); err != nil {
		return err
	}
	if err := checkRange(QuantityHoses, "number of hoses", float64(s.Hoses), 1, MaxHoses, ""); err != nil {
		return err
	}
	if err := checkRange(QuantityMaxFlow, "maximum discharge rate", float64(s.MaxFlow), 0, MaxFlowRate, "m³/s"); err != nil {
		return err
	}
	if err := validateIntake(s.Intake); err != nil {
		return err
	}
	if err := checkRange(QuantityDownLegSlope, "steepest down-leg slope (sine)", s.Geometry.DownLegSlope, 0, 1, ""); err != nil {
		return err
	}
	g := s.Geometry
	for _, z := range [...]struct {
		what Quantity
		name string
		v    Length
	}{{QuantitySurface, "source surface elevation", g.Surface}, {QuantityIntake, "intake elevation", g.Intake},
		{QuantityCrest, "crest elevation", g.Crest}, {QuantityOutlet, "outlet elevation", g.Outlet}} {
		if err := checkRange(z.what, z.name, float64(z.v), -MaxElevation, MaxElevation, "m"); err != nil {
			return err
		}
	}
	if g.Crest < g.Intake {
		return &RangeError{What: QuantityCrest, Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Intake), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the intake"}
	}
	if !g.OutletSubmerged && g.Crest < g.Outlet {
		return &RangeError{What: QuantityCrest, Quantity: "crest elevation", Value: float64(g.Crest), Min: float64(g.Outlet), Max: MaxElevation,
			Unit: "m", Err: ErrGeometry, Note: "the crest is the highest point of the hose, so not below the outlet"}
	}
	return nil
}
