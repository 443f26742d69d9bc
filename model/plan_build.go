package model

// Building calc's inputs from the fields: the fittings' losses, the source
// tank and a receiving vessel, and the drain plan.

import (
	"errors"
	"math"
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

// fittings sums the chosen fittings' K by where they sit, or takes the ΣK
// override. Bends and couplings that may sit on either leg are counted on the
// up-leg: that lowers the computed crest pressure, the safe side.
func (c *computer) fittings(h *calc.Hose) {
	p := &c.p
	if k, ok := c.num(FieldHoseKMinor); ok {
		// The override's split is unknown: put it all before the crest (the
		// conservative side for the crest pressure).
		h.KEntrance = k
		p.KLow, p.KHigh = k, 1.5*k
		c.note("ΣK from the override, all counted before the crest (the cautious side)")
		return
	}
	ids := c.choice(FieldHoseFittings)
	for _, id := range strings.Split(ids, ",") {
		id = strings.TrimSpace(id)
		if id == "" {
			continue
		}
		f, ok := c.cat.Fitting(id)
		if !ok {
			continue
		}
		k := f.KAt(h.Diameter)
		switch f.Where {
		case presets.AtEntrance:
			h.KEntrance += k.Central
			c.entranceListed = true
		case presets.DownLeg:
			h.KDownLeg += k.Central
		default:
			h.KUpLeg += k.Central
		}
		p.KLow += k.Low
		p.KHigh += k.High
	}
	if v, ok := c.num(FieldOutletK); ok {
		h.OutletK = v
		p.KLow += v
		p.KHigh += v
	}
}

// intake reads the intake kind from the catalogue and sizes it for the
// hose: its face and the top of its opening, its open area, its entrance
// loss (unless ΣK is typed or the fittings list names an entrance), a floating intake's depth,
// a board over it, and whether the water may carry a floating film (the
// crew's "water may carry oil", or rain water from an oil bund).
func (c *computer) intake(bore calc.Length, kOverride bool) calc.Intake {
	p := &c.p
	id := c.choice(FieldIntakeKind)
	if id == "" {
		id = presets.DefaultIntake
	}
	in, ok := c.cat.Intake(id)
	if !ok {
		c.fail(FieldIntakeKind, &FieldError{ID: FieldIntakeKind, Label: "Intake", Text: id, Detail: `"` + id + `" is not in the catalogue`, Err: ErrNotAChoice})
		return calc.Intake{}
	}
	p.Intake = in
	out := calc.Intake{FaceDiameter: in.FaceDiameter(bore), K: in.K.Central,
		FilmRisk: c.in.FilmRisk || p.Liquid.ID == "bund-water"}
	switch in.Kind {
	case presets.BareHung:
		out.Kind, out.FaceDiameter = calc.IntakeBareHung, 0 // the mouth is the intake height
	case presets.BoardIntake:
		out.Kind, out.FaceDiameter, out.Covered = calc.IntakeBareHung, 0, true
	case presets.BareFloor:
		out.Kind, out.FaceDiameter = calc.IntakeBareFloor, 0
	case presets.StrainerIntake, presets.FootValveIntake:
		out.Kind = calc.IntakeStrainer
		if in.Kind == presets.FootValveIntake {
			out.Kind = calc.IntakeFootValve
		}
		out.Height = in.MouthHeight(bore)
		if in.OpenRatio > 0 {
			f := float64(out.FaceDiameter)
			out.OpenArea = calc.Area(in.OpenRatio * math.Pi * f * f / 4)
		}
	case presets.SuctionPlate:
		out.Kind, out.Height = calc.IntakeSuctionPlate, in.DrawDown
	case presets.FloatingIntake:
		out.Kind, out.FloatDepth = calc.IntakeFloating, in.Depth
	}
	switch {
	case kOverride:
		out.K = 0 // ΣK as typed already holds the entrance
	case c.entranceListed:
		out.K = 0
		c.note("entrance loss from the fittings list, in place of the intake's own")
	default:
		p.KLow += in.K.Low
		p.KHigh += in.K.High
	}
	return out
}

// vacuum sets the hose's vacuum rating from its wall (presets.Material).
func vacuum(h *calc.Hose, m presets.Material) {
	switch m.VacuumClass {
	case presets.VacuumRated:
		h.Vacuum, h.VacuumRating = calc.VacuumRated, m.Vacuum
	case presets.VacuumNone:
		h.Vacuum = calc.VacuumNone
	default:
		h.Vacuum = calc.VacuumNotRated
	}
}

// tank builds the source tank from the shape's sizes.
func (c *computer) tank(shape string, level float64) {
	p := &c.p
	size := func(id FieldID) float64 {
		v, _ := c.num(id)
		return v
	}
	height := level
	if v, ok := c.num(FieldTankHeight); ok {
		height = v
		if level > height {
			c.fail(FieldTankLevel, &FieldError{ID: FieldTankLevel, Label: "Liquid level", Text: c.text(FieldTankLevel),
				Detail: shown(DimLength, level, c.in.Units) + " is above the tank height",
				Accept: "0 to " + shown(DimLength, height, c.in.Units), Err: calc.ErrGeometry})
			return
		}
	}
	_, hasHeight := c.num(FieldTankHeight)
	if cone, ok := c.num(FieldTankCone); ok && shape == "cone-bottom" && hasHeight && cone > height {
		// The cone is part of the tank's height (floor to brim).
		c.fail(FieldTankCone, &FieldError{ID: FieldTankCone, Label: "Cone height", Text: c.text(FieldTankCone),
			Detail: shown(DimLength, cone, c.in.Units) + " is taller than the tank (" + shown(DimLength, height, c.in.Units) + " floor to brim)",
			Accept: shown(DimLength, 0.01, c.in.Units) + " to " + shown(DimLength, height, c.in.Units), Err: calc.ErrGeometry})
		return
	}
	sizes := func(name string) float64 {
		switch name {
		case "diameter":
			return size(FieldTankDiameter)
		case "length":
			return size(FieldTankLength)
		case "width":
			return size(FieldTankWidth)
		case "cone-height":
			return size(FieldTankCone)
		case "side-slope":
			return size(FieldTankSlope)
		}
		return height
	}
	t, err := buildTank(shape, sizes, c.in.TankTable)
	if errors.Is(err, errUnknownShape) {
		c.fail(FieldTankShape, &FieldError{ID: FieldTankShape, Label: "Tank shape", Text: shape, Detail: `"` + shape + `" is not a tank shape`, Err: ErrNotAChoice})
		return
	}
	if p.Err != nil {
		return
	}
	if err != nil {
		c.fail(c.fieldFor(err), c.calcFieldError(c.fieldFor(err), err))
		return
	}
	if float64(t.Height()) < level {
		c.fail(FieldTankLevel, &FieldError{ID: FieldTankLevel, Label: "Liquid level", Text: c.text(FieldTankLevel),
			Detail: shown(DimLength, level, c.in.Units) + " is above the top of the tank",
			Accept: "0 to " + shown(DimLength, float64(t.Height()), c.in.Units), Err: calc.ErrGeometry})
		return
	}
	p.Tank = t
}

var errUnknownShape = errors.New("not a tank shape")

// receiver builds the receiving vessel of a transfer from Inputs.Receiver.
func (c *computer) receiver() {
	rs := c.in.Receiver
	sys := c.in.Units
	ok := true
	read := func(name, text string, d Dim, lo, hi float64, def float64) float64 {
		id := ReceiverField(name)
		label := "Receiver " + strings.ReplaceAll(name, "-", " ")
		accept := shown(d, lo, sys) + " to " + shown(d, hi, sys)
		if f, ok := FieldByID(id); ok {
			label, accept, lo, hi = f.Label, f.RangeText(sys), f.Min, f.Max
		}
		if strings.TrimSpace(text) == "" {
			if !math.IsNaN(def) {
				return def
			}
			c.fail(id, &FieldError{ID: id, Label: label, Detail: "nothing entered", Accept: accept, Err: ErrNotSet})
			ok = false
			return 0
		}
		v, err := Parse(d, text, sys)
		if err == nil && (v < lo || v > hi) {
			err = calc.ErrOutOfRange
		}
		if err != nil {
			c.fail(id, &FieldError{ID: id, Label: label, Text: text, Detail: "cannot use " + strings.TrimSpace(text) + ": " + err.Error(),
				Accept: accept, Err: err})
			ok = false
		}
		return v
	}
	sizes := map[string]float64{}
	for _, name := range presets.ShapeSizes(rs.Shape) {
		d, lo, hi := DimLength, 0.05, calc.MaxTankSize
		if name == "side-slope" {
			d, lo, hi = DimNumber, 0, calc.MaxSideSlope
		}
		sizes[name] = read(name, rs.Sizes[name], d, lo, hi, math.NaN())
	}
	needHeight := rs.Shape != "horizontal-cylinder" && rs.Shape != "sphere"
	if needHeight {
		sizes["height"] = read("height", rs.Sizes["height"], DimLength, 0.05, calc.MaxTankSize, math.NaN())
	}
	floor := read("floor", rs.Floor, DimLength, -calc.MaxElevation, calc.MaxElevation, math.NaN())
	level := read("level", rs.Level, DimLength, 0, calc.MaxTankSize, 0)
	if !ok {
		return
	}
	t, err := buildTank(rs.Shape, func(n string) float64 { return sizes[n] }, nil)
	if err != nil {
		id := ReceiverField("shape")
		c.fail(id, &FieldError{ID: id, Label: "Receiver shape", Text: rs.Shape, Detail: err.Error(), Err: err})
		return
	}
	if level > float64(t.Height()) {
		id := ReceiverField("level")
		c.fail(id, &FieldError{ID: id, Label: "Receiver level", Text: rs.Level, Detail: shown(DimLength, level, sys) + " is above its brim",
			Accept: "0 to " + shown(DimLength, float64(t.Height()), sys), Err: calc.ErrGeometry})
		return
	}
	c.p.Receiver = &calc.Receiver{Tank: t, Floor: calc.Length(floor), Level: calc.Length(level)}
}

// buildTank makes a calc tank of the shape from its named sizes (m; the
// side slope is horizontal per vertical): "diameter", "length", "width",
// "height" (floor to brim), "cone-height", "side-slope"; table is the
// calibration table for the "table" shape.
func buildTank(shape string, size func(name string) float64, table []TablePoint) (calc.Tank, error) {
	L := func(name string) calc.Length { return calc.Length(size(name)) }
	switch shape {
	case "vertical-cylinder":
		return calc.NewVerticalCylinder(L("diameter"), L("height"))
	case "rectangular":
		return calc.NewRectangular(L("length"), L("width"), L("height"))
	case "horizontal-cylinder":
		return calc.NewHorizontalCylinder(L("diameter"), L("length"))
	case "cone-bottom":
		return calc.NewConeBottom(L("diameter"), L("cone-height"), calc.Length(math.Max(size("height"), size("cone-height"))))
	case "sloped-pit":
		return calc.NewSlopedPit(L("length"), L("width"), size("side-slope"), L("height"))
	case "sphere":
		return calc.NewSphere(L("diameter"))
	case "table":
		lv := make([]float64, len(table))
		vo := make([]float64, len(table))
		for i, r := range table {
			lv[i], vo[i] = r.Level, r.Volume
		}
		return calc.NewTable(lv, vo)
	}
	return nil, errUnknownShape
}

// drain plans the drain and its time band.
func (c *computer) drain() {
	p := &c.p
	in := calc.DrainInput{Siphon: p.Siphon, Tank: p.Tank, Receiver: p.Receiver}
	if p.Receiver != nil {
		// The planner follows the receiving surface itself from the hose end.
		drop, _ := c.num(FieldDrop)
		in.Siphon.Geometry.Outlet = p.Siphon.Geometry.Surface - calc.Length(drop)
		in.Siphon.Geometry.OutletSubmerged = false
	}
	if v, ok := c.num(FieldTankTarget); ok {
		if v >= float64(p.Siphon.Geometry.Surface) {
			c.fail(FieldTankTarget, &FieldError{ID: FieldTankTarget, Label: "Target level", Text: c.text(FieldTankTarget),
				Detail: shown(DimLength, v, c.in.Units) + " is not below the liquid level",
				Accept: "0 to " + shown(DimLength, float64(p.Siphon.Geometry.Surface), c.in.Units), Err: calc.ErrGeometry})
			return
		}
		in.Target = calc.Length(v)
		if in.Target == 0 {
			in.Target = 1e-9 // "empty" means the floor, not "no target"
		}
	}
	p.Inflow = c.inflow(p.Tank, float64(p.Siphon.Geometry.Surface))
	in.Inflow = p.Inflow.Total
	p.DrainIn = in
	d, err := calc.PlanDrain(in)
	if err != nil {
		c.fail(c.fieldFor(err), c.calcFieldError(c.fieldFor(err), err))
		return
	}
	p.Drain = &d
	c.drainBand()
	c.pumpFinish()
	if d.StopReason == calc.StopAir && in.Siphon.Intake.FilmRisk && !in.Siphon.Intake.Covered {
		// the trade's answer to a film: a board over the intake; plan it
		// too, so the hint can say what it gains
		in.Siphon.Intake.Covered = true
		if b, err := calc.PlanDrain(in); err == nil {
			p.BoardDrain = &b
		}
	}
}
