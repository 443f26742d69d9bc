package model

import (
	"errors"
	"math"
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

// DefaultEntranceK is the entrance loss assumed when no entrance fitting is
// chosen: a plain hose end dropped into the liquid is a re-entrant
// (inward-projecting) inlet, K = 0.78 (Crane TP-410, 2009).
const DefaultEntranceK = 0.78

// DefaultMaterial is the hose wall assumed when none is chosen.
const DefaultMaterial = "rubber-smooth"

// TablePoint is one row of a tank calibration table: level above the floor
// (m) and the volume held up to it (m³).
type TablePoint struct {
	Level  float64 `json:"level_m"`
	Volume float64 `json:"volume_m3"`
}

// Inputs is what Compute reads: the raw field texts, the unit system they
// are typed in, and a calibration table for the "table" tank shape.
type Inputs struct {
	Values    map[FieldID]string
	Units     System
	TankTable []TablePoint
	// Receiver, when set, makes the drain a transfer into that vessel.
	Receiver *ReceiverSpec
}

// ReceiverSpec describes a receiving vessel for a transfer: its level rises
// as the source falls, so the head shrinks from both ends. The command line
// sets it (the screen has no receiver fields yet). Texts carry units like
// the fields; bare numbers are in the unit system's default units.
type ReceiverSpec struct {
	Shape string // one of the tank shapes
	// Sizes by name: "diameter", "length", "width", "height" (floor to
	// brim: the receiver is full there), "cone-height", "side-slope".
	Sizes map[string]string
	// Floor is the elevation of the receiver's floor above the source
	// tank's floor; negative when it stands lower.
	Floor string
	// Level is the receiver's level above its own floor at the start
	// (empty: empty).
	Level string
}

// receiverFromFields reads the receiver fields of a job; nil when the
// receiving vessel is "none" or not set.
func receiverFromFields(v map[FieldID]string) *ReceiverSpec {
	shape := strings.ToLower(strings.TrimSpace(v[FieldReceiverShape]))
	if shape == "" || shape == "none" {
		return nil
	}
	r := &ReceiverSpec{Shape: shape, Sizes: map[string]string{}, Floor: v[FieldReceiverFloor], Level: v[FieldReceiverLevel]}
	for _, name := range []string{"diameter", "length", "width", "height", "cone-height", "side-slope"} {
		if t := strings.TrimSpace(v[ReceiverField(name)]); t != "" {
			r.Sizes[name] = t
		}
	}
	return r
}

// ReceiverField is the FieldID under which Compute reports a problem with
// the receiver's size or position name ("receiver.diameter",
// "receiver.floor", …). These are not screen fields.
func ReceiverField(name string) FieldID { return FieldID("receiver." + name) }

// Plan is everything computed from a job's inputs. Compute fills as much as
// the inputs allow: Err is nil only when Result is a valid solution.
type Plan struct {
	// FieldErrors holds the problem with each field that cannot be used,
	// by field; Err is the first problem that blocks the result.
	FieldErrors map[FieldID]error
	Err         error

	Liquid      presets.Liquid
	Hazards     presets.Hazards // at the job's temperature
	Material    presets.Material
	Temperature calc.Temperature
	// AtmPressure is the barometer reading when one is given, else the
	// U.S. Standard Atmosphere 1976 pressure at the site altitude.
	AtmPressure calc.Pressure
	FromBaro    bool

	Siphon calc.Siphon
	Result calc.Result
	// KLow and KHigh bound ΣK (all fittings) over the fittings' published
	// spread; RoughLow and RoughHigh bound ε over the material's range.
	KLow, KHigh         float64
	RoughLow, RoughHigh calc.Length
	// FlowLow and FlowHigh bound the flow over the input uncertainties.
	FlowLow, FlowHigh calc.FlowRate

	// Tank is nil when the job has no tank; then Drain is nil too.
	Tank     calc.Tank
	Receiver *calc.Receiver // nil unless the job is a transfer
	Drain    *calc.DrainPlan
	DrainIn  calc.DrainInput
	TimeLow  calc.Seconds
	TimeHigh calc.Seconds
	// SlowMayNotStart is true when, at the slow end of the tolerances, the
	// siphon would not run at all: TimeHigh then has no upper bound.
	SlowMayNotStart bool

	// PumpStrokes is the number of hand-pump strokes to fill the hoses, 0
	// when no stroke volume is given.
	PumpStrokes int

	// Notes are the assumptions Compute made (defaults it filled in), in
	// plain words for the screen and the record.
	Notes []string
}

// OK reports whether the plan has a valid steady result.
func (p Plan) OK() bool { return p.Err == nil }

// Compute computes the plan of a job (see ComputeInputs).
func Compute(j Job, cat *presets.Catalogue) Plan {
	return ComputeInputs(Inputs{Values: j.Inputs, Units: j.Units}, cat)
}

// ComputeInputs turns a job's inputs into calc inputs and results. It is
// pure and fast (a steady solve, a drain plan and their band: well under a
// millisecond), so the screen calls it on every keystroke.
func ComputeInputs(in Inputs, cat *presets.Catalogue) Plan {
	if in.Receiver == nil {
		in.Receiver = receiverFromFields(in.Values)
	}
	c := computer{in: in, cat: cat, p: Plan{FieldErrors: map[FieldID]error{}}}
	c.run()
	return c.p
}

type computer struct {
	in  Inputs
	cat *presets.Catalogue
	p   Plan
}

func (c *computer) text(id FieldID) string {
	t := strings.TrimSpace(c.in.Values[id])
	if t == "" {
		if f, ok := FieldByID(id); ok {
			t = f.Default
		}
	}
	return t
}

func (c *computer) set(id FieldID) bool { return c.text(id) != "" }

func (c *computer) fail(id FieldID, err error) {
	if _, dup := c.p.FieldErrors[id]; !dup {
		c.p.FieldErrors[id] = err
	}
	if c.p.Err == nil {
		c.p.Err = err
	}
}

// num reads a numeric field; ok is false (and the error recorded) when it is
// missing or invalid. Optional fields that are empty, and fields that do not
// apply to the job (Applies), return ok false with no error.
func (c *computer) num(id FieldID) (float64, bool) {
	if !Applies(c.in.Values, id) {
		return 0, false
	}
	f, _ := FieldByID(id)
	t := c.text(id)
	if t == "" && f.Optional {
		return 0, false
	}
	v, err := f.Validate(t, c.in.Units)
	if err != nil {
		c.fail(id, err)
		return 0, false
	}
	return v, true
}

func (c *computer) choice(id FieldID) string {
	f, _ := FieldByID(id)
	t := c.text(id)
	if err := f.ValidateChoice(t, c.cat); err != nil {
		c.fail(id, err)
		return ""
	}
	canon, _ := f.ChoiceID(t, c.cat)
	return canon
}

func (c *computer) note(s string) { c.p.Notes = append(c.p.Notes, s) }

func (c *computer) run() {
	p := &c.p
	sys := c.in.Units

	// Site and liquid.
	if v, ok := c.num(FieldBaro); ok {
		p.AtmPressure, p.FromBaro = calc.Pressure(v), true
	} else if z, ok := c.num(FieldAltitude); ok {
		pa, err := calc.StandardAtmosphere(calc.Length(z))
		if err != nil {
			c.fail(FieldAltitude, err)
		}
		p.AtmPressure = pa
	}
	liqID := c.choice(FieldLiquid)
	if liqID != "" {
		l, ok := c.cat.Liquid(liqID)
		if !ok {
			c.fail(FieldLiquid, &FieldError{ID: FieldLiquid, Label: "Liquid", Text: liqID, Detail: `"` + liqID + `" is not in the catalogue`, Err: ErrNotAChoice})
		}
		p.Liquid = l
	}
	T, okT := c.num(FieldTemp)
	p.Temperature = calc.Temperature(T)
	var fluid calc.Fluid
	if p.Liquid.Valid() && okT && p.AtmPressure > 0 {
		fl, err := p.Liquid.Fluid(p.Temperature, p.AtmPressure)
		if err != nil {
			c.fail(FieldTemp, c.calcFieldError(FieldTemp, err))
		}
		fluid = fl
		p.Hazards = p.Liquid.HazardsAt(p.Temperature)
	}
	if v, ok := c.num(FieldDensity); ok {
		fluid.Density = calc.Density(v)
		c.note("density from the override, not the liquid's table")
	}
	if v, ok := c.num(FieldViscosity); ok {
		fluid.Viscosity = calc.Viscosity(v)
		c.note("viscosity from the override, not the liquid's table")
	}
	if v, ok := c.num(FieldVapor); ok {
		fluid.VaporPressure = calc.Pressure(v)
		c.note("vapour pressure from the override, not the liquid's table")
	}

	// Hose.
	var hose calc.Hose
	if v, ok := c.num(FieldHoseID); ok {
		hose.Diameter = calc.Length(v)
	}
	if v, ok := c.num(FieldHoseLength); ok {
		hose.Length = calc.Length(v)
	}
	if v, ok := c.num(FieldHoseUpLeg); ok {
		hose.UpLegLength = calc.Length(v)
	}
	matID := DefaultMaterial
	if c.set(FieldHoseMaterial) {
		matID = c.choice(FieldHoseMaterial)
	} else {
		c.note("hose wall taken as smooth rubber (no material chosen)")
	}
	if m, ok := c.cat.Material(matID); ok {
		p.Material = m
		hose.Roughness = m.Roughness
		p.RoughLow, p.RoughHigh = m.RoughnessLow, m.RoughnessHigh
	}
	if v, ok := c.num(FieldHoseRoughness); ok {
		hose.Roughness = calc.Length(v)
		p.RoughLow, p.RoughHigh = hose.Roughness, hose.Roughness
	}
	c.fittings(&hose)
	hoses := 1
	if v, ok := c.num(FieldHoseCount); ok {
		hoses = int(v)
	}

	// Geometry.
	lift, okL := c.num(FieldLift)
	drop, okD := c.num(FieldDrop)
	submerged := c.choice(FieldOutletSubmerged) == "yes"
	var geo calc.Geometry
	shape := c.choice(FieldTankShape)
	if shape == "" {
		shape = "none"
	}
	if shape == "none" {
		depth, _ := c.num(FieldIntakeDepth)
		geo = calc.Geometry{Surface: 0, Intake: calc.Length(-depth), Crest: calc.Length(lift), Outlet: calc.Length(-drop), OutletSubmerged: submerged}
		if c.in.Receiver != nil {
			c.fail(FieldTankShape, &FieldError{ID: FieldTankShape, Label: "Tank shape", Text: shape,
				Detail: "a transfer into a receiver needs the source tank described", Err: calc.ErrNoTank})
		}
	} else {
		level, okLv := c.num(FieldTankLevel)
		ih, _ := c.num(FieldIntakeHeight)
		geo = calc.Geometry{Surface: calc.Length(level), Intake: calc.Length(ih), Crest: calc.Length(level + lift),
			Outlet: calc.Length(level - drop), OutletSubmerged: submerged}
		if okLv {
			c.tank(shape, level)
		}
		if c.in.Receiver != nil && p.Tank != nil {
			c.receiver()
			if r := p.Receiver; r != nil && float64(r.Floor+r.Level) > float64(geo.Outlet) {
				// The hose end starts under the receiving surface: the head
				// is to that surface.
				geo.Outlet, geo.OutletSubmerged = r.Floor+r.Level, true
			}
		}
		if okLv && ih >= level {
			c.fail(FieldIntakeHeight, &FieldError{ID: FieldIntakeHeight, Label: "Intake height above floor",
				Text: c.text(FieldIntakeHeight), Detail: Format(DimLength, ih, sys) + " is not below the liquid level",
				Accept: "below the level of " + Format(DimLength, level, sys), Err: calc.ErrGeometry})
		}
	}
	_ = okL
	_ = okD

	p.Siphon = calc.Siphon{Fluid: fluid, AtmPressure: p.AtmPressure, Hose: hose, Hoses: hoses, Geometry: geo}
	if p.Err != nil {
		return
	}
	r, err := calc.Solve(p.Siphon)
	if err != nil {
		c.fail(c.fieldFor(err), c.calcFieldError(c.fieldFor(err), err))
		return
	}
	p.Result = r
	if v, ok := c.num(FieldPumpStroke); ok && v > 0 {
		p.PumpStrokes = int(math.Ceil(float64(r.PrimingVolume) / v))
	}
	c.band()
	if p.Tank != nil {
		c.drain()
	}
}

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
	entrance := false
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
			entrance = true
		case presets.DownLeg:
			h.KDownLeg += k.Central
		default:
			h.KUpLeg += k.Central
		}
		p.KLow += k.Low
		p.KHigh += k.High
	}
	if !entrance {
		h.KEntrance += DefaultEntranceK
		p.KLow += DefaultEntranceK
		p.KHigh += DefaultEntranceK
		c.note("entrance loss K 0.78 assumed: a plain hose end in the liquid (Crane TP-410)")
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
				Detail: Format(DimLength, level, c.in.Units) + " is above the tank depth",
				Accept: "0 to " + Format(DimLength, height, c.in.Units), Err: calc.ErrGeometry})
			return
		}
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
			Detail: Format(DimLength, level, c.in.Units) + " is above the top of the tank",
			Accept: "0 to " + Format(DimLength, float64(t.Height()), c.in.Units), Err: calc.ErrGeometry})
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
		accept := Format(d, lo, sys) + " to " + Format(d, hi, sys)
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
		c.fail(id, &FieldError{ID: id, Label: "Receiver level", Text: rs.Level, Detail: Format(DimLength, level, sys) + " is above its brim",
			Accept: "0 to " + Format(DimLength, float64(t.Height()), sys), Err: calc.ErrGeometry})
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
				Detail: Format(DimLength, v, c.in.Units) + " is not below the liquid level",
				Accept: "0 to " + Format(DimLength, float64(p.Siphon.Geometry.Surface), c.in.Units), Err: calc.ErrGeometry})
			return
		}
		in.Target = calc.Length(v)
		if in.Target == 0 {
			in.Target = 1e-9 // "empty" means the floor, not "no target"
		}
	}
	p.DrainIn = in
	d, err := calc.PlanDrain(in)
	if err != nil {
		c.fail(c.fieldFor(err), c.calcFieldError(c.fieldFor(err), err))
		return
	}
	p.Drain = &d
	c.drainBand()
}

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

// tolerance states the input uncertainties for the band: the height
// tolerance the technician set, roughness over the material's published
// range (or the override exactly), and ΣK from the fittings' low values to
// their high values, at least calc.KFactorHigh times the central sum
// (handbook K are lower bounds at siphon velocities).
func (c *computer) tolerance() calc.Tolerance {
	p := &c.p
	t := calc.Tolerance{RoughnessLow: p.RoughLow, RoughnessHigh: p.RoughHigh}
	if v, ok := c.num(FieldTolHeight); ok {
		t.Height = calc.Length(v)
		if v == 0 {
			t.Height = 1e-9 // "no tolerance" (zero means the default in calc)
		}
	}
	k := p.Siphon.Hose.KMinor()
	t.KLow = min(p.KLow, k)
	t.KHigh = max(p.KHigh, calc.KFactorHigh*k)
	return t
}

// band fills FlowLow and FlowHigh (calc.FlowBand). When the band cannot be
// computed, it collapses to the central flow and a note says so.
func (c *computer) band() {
	p := &c.p
	lo, hi, err := calc.FlowBand(p.Siphon, c.tolerance())
	if err != nil {
		lo, hi = p.Result.Flow, p.Result.Flow
		c.note("no flow range: " + err.Error())
	}
	// The central value always lies inside its own band.
	p.FlowLow = min(lo, p.Result.Flow)
	p.FlowHigh = max(hi, p.Result.Flow)
}

// drainBand fills TimeLow and TimeHigh (calc.PlanBand).
func (c *computer) drainBand() {
	p := &c.p
	p.TimeLow, p.TimeHigh = p.Drain.Time, p.Drain.Time
	b, err := calc.PlanBand(p.DrainIn, c.tolerance())
	if err != nil {
		c.note("no time range: " + err.Error())
		return
	}
	p.TimeLow = min(b.TimeLow, p.Drain.Time)
	p.TimeHigh = max(b.TimeHigh, p.Drain.Time)
	p.SlowMayNotStart = b.SlowWillNotRun
	if b.SlowWillNotRun {
		c.note("at the slow end of the height, roughness and fitting tolerances the siphon would not start: the longest time has no bound")
	}
}

// Cautions lists the cautions that go with this plan, for the screen, the
// text output and the record: one line per hazard of the liquid at its
// temperature, the liquid's own note, the hose wall's note when it cannot
// hold a vacuum, and always the rule against starting by mouth. They defer
// to local codes and permits; they never declare anything safe.
func (p Plan) Cautions() []string {
	out := []string{presets.NeverByMouth}
	for _, h := range p.Hazards.List() {
		out = append(out, capitalise(h.Description())+".")
	}
	if p.Hazards.Has(presets.Flammable) && !strings.Contains(p.Liquid.Note, "local-code") {
		out = append(out, "Whether a hose siphon may be used for this liquid at a workplace is a question for local fire code and the employer (OSHA 29 CFR 1910.106, NFPA 30, NFPA 77).")
	}
	if p.Liquid.Note != "" {
		out = append(out, p.Liquid.Note)
	}
	if p.Material.Collapses {
		out = append(out, p.Material.Name+" flattens under suction: a siphon's crest runs below atmospheric pressure. Use suction hose or solid-wall pipe.")
	}
	return out
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
