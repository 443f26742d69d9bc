package model

import (
	"errors"
	"math"
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

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
	// FilmRisk: the water may carry a floating film (the crew's "water may
	// carry oil"): without a board over the intake the drain stops where
	// air starts to be drawn in.
	FilmRisk bool
	// FlowTests are bucket tests of the flow: the plan's losses are fitted
	// to them and its band narrows to what they support.
	FlowTests []FlowTest
	// Quick leaves out the flow and time ranges (each plans the drain a
	// dozen times): for a field still being typed in, whose plan stands
	// for a moment only. Plan.Quick says so.
	Quick bool
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
	Intake      presets.Intake
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
	// BoardDrain is the same drain with a board floated over the intake,
	// when the drain stops where air starts for fear of a floating film
	// (nil otherwise).
	BoardDrain *calc.DrainPlan
	TimeLow    calc.Seconds
	TimeHigh   calc.Seconds
	// Band is the drain's likely range (calc.PlanBandFrom): the time to a
	// fixed level, the finish level's range and the input that drives it;
	// nil when it could not be computed.
	Band *calc.Band

	// Inflow is the liquid coming in while the siphon runs (zero without).
	Inflow Inflow
	// Tests are the flow tests as calc reads them; TestFit the losses
	// fitted to them (nil without tests), and PlannedFlow the flow as
	// planned from the fittings before the fit.
	Tests       []calc.FlowCheck
	TestFit     *calc.TestFit
	PlannedFlow calc.FlowRate
	// Unfitted is the siphon as planned from the fittings, before the fit
	// to the flow tests (the readings fit starts from it: FitJob).
	Unfitted calc.Siphon
	// PumpRate is the finishing pump's rate (0 without); PumpFinish the
	// time it takes to lift what the siphon leaves against the inflow, and
	// PumpFallsBehind true when the inflow matches or outruns it.
	PumpRate        calc.FlowRate
	PumpFinish      calc.Seconds
	PumpFallsBehind bool
	// Quick: the ranges were left out (Inputs.Quick); FlowLow, FlowHigh,
	// TimeLow and TimeHigh are the central values and Band is nil.
	Quick bool
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
	return ComputeInputs(Inputs{Values: j.Inputs, Units: j.Units, FilmRisk: j.Facts.MayCarryOil, FlowTests: j.FlowTests}, cat)
}

// ComputeQuick is Compute without the flow and time ranges (Inputs.Quick),
// for the plan shown while a field is being typed in.
func ComputeQuick(j Job, cat *presets.Catalogue) Plan {
	return ComputeInputs(Inputs{Values: j.Inputs, Units: j.Units, FilmRisk: j.Facts.MayCarryOil, FlowTests: j.FlowTests, Quick: true}, cat)
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
	// entranceListed: the fittings list names an entrance shape, strainer
	// or foot valve; its K stands in for the intake's own.
	entranceListed bool
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

// run computes the plan: the site and the liquid, the hose, the heights,
// then the steady solve, the flow band and (with a tank) the drain.
func (c *computer) run() {
	p := &c.p
	fluid := c.fluid()
	hose, hoses := c.hose()
	geo := c.geometry()
	_, kOverride := c.num(FieldHoseKMinor)
	p.Siphon = calc.Siphon{Fluid: fluid, AtmPressure: p.AtmPressure, Hose: hose, Hoses: hoses, Geometry: geo,
		Intake: c.intake(hose.Diameter, kOverride)}
	if v, ok := c.num(FieldMaxFlow); ok {
		p.Siphon.MaxFlow = calc.FlowRate(v)
	}
	if p.Err != nil {
		return
	}
	r, err := calc.Solve(p.Siphon)
	if err != nil {
		c.fail(c.fieldFor(err), c.calcFieldError(c.fieldFor(err), err))
		return
	}
	p.Result = r
	c.fitTests()
	if v, ok := c.num(FieldPumpStroke); ok && v > 0 {
		p.PumpStrokes = int(math.Ceil(float64(r.PrimingVolume) / v))
	}
	c.band()
	if p.Tank != nil {
		c.drain()
	}
}

// fluid reads the site's pressure and the liquid at its temperature, with
// any property overrides.
func (c *computer) fluid() calc.Fluid {
	p := &c.p
	if v, ok := c.num(FieldBaro); ok {
		p.AtmPressure, p.FromBaro = calc.Pressure(v), true
	} else if z, ok := c.num(FieldAltitude); ok {
		pa, err := calc.StandardAtmosphere(calc.Length(z))
		if err != nil {
			c.fail(FieldAltitude, err)
		}
		p.AtmPressure = pa
	}
	if liqID := c.choice(FieldLiquid); liqID != "" {
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
		// A liquid that boils at the site's pressure is a verdict (it will
		// not run), not an input error: its properties come with the error.
		if err != nil && !errors.Is(err, calc.ErrBoiling) {
			c.fail(FieldTemp, c.calcFieldError(FieldTemp, err))
		}
		fluid = fl
		p.Hazards = p.Liquid.HazardsAt(p.Temperature)
		fluid.Volatile = p.Hazards.Has(presets.Volatile)
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
	return fluid
}

// hose reads the hose run: bore, length, up-leg, wall, fittings and the
// number of hoses in parallel.
func (c *computer) hose() (calc.Hose, int) {
	p := &c.p
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
		vacuum(&hose, m)
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
	return hose, hoses
}

// geometry places the heights on one datum: the surface at 0 without a
// tank; the tank floor at 0 with one (and then builds the tank and any
// receiving vessel).
func (c *computer) geometry() calc.Geometry {
	p := &c.p
	lift, _ := c.num(FieldLift)
	drop, _ := c.num(FieldDrop)
	submerged := c.choice(FieldOutletSubmerged) == "yes"
	shape := c.choice(FieldTankShape)
	if shape == "" || shape == "none" {
		depth, _ := c.num(FieldIntakeDepth)
		if c.in.Receiver != nil {
			c.fail(FieldTankShape, &FieldError{ID: FieldTankShape, Label: "Tank shape", Text: "none",
				Detail: "a transfer into a receiver needs the source tank described", Err: calc.ErrNoTank})
		}
		return calc.Geometry{Surface: 0, Intake: calc.Length(-depth), Crest: calc.Length(lift), Outlet: calc.Length(-drop), OutletSubmerged: submerged}
	}
	level, okLv := c.num(FieldTankLevel)
	ih, _ := c.num(FieldIntakeHeight)
	geo := calc.Geometry{Surface: calc.Length(level), Intake: calc.Length(ih), Crest: calc.Length(level + lift),
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
		sys := c.in.Units
		c.fail(FieldIntakeHeight, &FieldError{ID: FieldIntakeHeight, Label: "Intake height above floor",
			Text: c.text(FieldIntakeHeight), Detail: shown(DimLength, ih, sys) + " is not below the liquid level",
			Accept: "below the level of " + shown(DimLength, level, sys), Err: calc.ErrGeometry})
	}
	return geo
}
