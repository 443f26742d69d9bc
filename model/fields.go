package model

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

// FieldID names one input of a job. IDs are stable: they are the keys of
// Job.Inputs in the job file.
type FieldID string

// The input fields, grouped by pane.
const (
	FieldHoseID        FieldID = "hose.id"
	FieldHoseLength    FieldID = "hose.length"
	FieldHoseUpLeg     FieldID = "hose.upleg"
	FieldHoseMaterial  FieldID = "hose.material"
	FieldHoseFittings  FieldID = "hose.fittings"
	FieldHoseCount     FieldID = "hose.count"
	FieldHoseKMinor    FieldID = "hose.kminor"
	FieldHoseRoughness FieldID = "hose.roughness"
	FieldPriming       FieldID = "priming.method"
	FieldPumpStroke    FieldID = "pump.stroke"

	FieldLift            FieldID = "lift"
	FieldDrop            FieldID = "drop"
	FieldIntakeDepth     FieldID = "intake.depth"
	FieldIntakeHeight    FieldID = "intake.height"
	FieldOutletSubmerged FieldID = "outlet.submerged"
	FieldTolHeight       FieldID = "tol.height"

	// A receiving vessel for a transfer (its level rises as the source
	// falls). The IDs match ReceiverField(name).
	FieldReceiverShape    FieldID = "receiver.shape"
	FieldReceiverDiameter FieldID = "receiver.diameter"
	FieldReceiverLength   FieldID = "receiver.length"
	FieldReceiverWidth    FieldID = "receiver.width"
	FieldReceiverHeight   FieldID = "receiver.height"
	FieldReceiverCone     FieldID = "receiver.cone-height"
	FieldReceiverSlope    FieldID = "receiver.side-slope"
	FieldReceiverFloor    FieldID = "receiver.floor"
	FieldReceiverLevel    FieldID = "receiver.level"

	FieldLiquid    FieldID = "liquid"
	FieldTemp      FieldID = "temp"
	FieldAltitude  FieldID = "altitude"
	FieldBaro      FieldID = "baro"
	FieldDensity   FieldID = "density"
	FieldViscosity FieldID = "viscosity"
	FieldVapor     FieldID = "vapor"

	FieldTankPreset   FieldID = "tank.preset"
	FieldTankShape    FieldID = "tank.shape"
	FieldTankDiameter FieldID = "tank.diameter"
	FieldTankLength   FieldID = "tank.length"
	FieldTankWidth    FieldID = "tank.width"
	FieldTankHeight   FieldID = "tank.height"
	FieldTankCone     FieldID = "tank.cone"
	FieldTankSlope    FieldID = "tank.slope"
	FieldTankLevel    FieldID = "tank.level"
	FieldTankTarget   FieldID = "tank.target"
)

// Pane is the input pane a field belongs to.
type Pane int

// The input panes, in screen order.
const (
	PaneHose Pane = iota
	PaneLift
	PaneLiquid
	PaneTank
)

// String is the pane title as the screens show it.
func (p Pane) String() string {
	switch p {
	case PaneHose:
		return "Hose"
	case PaneLift:
		return "Lift & outlet"
	case PaneLiquid:
		return "Liquid & site"
	case PaneTank:
		return "Tank"
	}
	return "Pane(" + strconv.Itoa(int(p)) + ")"
}

// Panes lists the input panes in screen order.
func Panes() []Pane { return []Pane{PaneHose, PaneLift, PaneLiquid, PaneTank} }

// Choice is one entry of a picker field. ID is what the job stores.
type Choice struct {
	ID    string
	Label string
	Note  string // a short caution or description; may be empty
}

// FieldSpec describes one input field: where it sits, what it is called in
// the trade's words, its dimension and accepted range (SI), and its help.
type FieldSpec struct {
	ID    FieldID
	Pane  Pane
	Label string // e.g. "Hose inside diameter"
	Dim   Dim
	// Min and Max bound the accepted value in SI units, inclusive. They are
	// the plausible range of the quantity on a siphon job; calc and the
	// liquid presets check tighter limits (a liquid's own temperature range,
	// roughness below the bore) when the plan is computed.
	Min, Max float64
	// Optional fields may be left empty; a field with a Default takes it
	// when empty.
	Optional bool
	// Default is the text assumed when the field is empty ("" for none). It
	// carries its unit so it reads the same in either unit system.
	Default string
	// Integer fields accept whole numbers only (a count of hoses).
	Integer bool
	// Choices, for a picker, lists the accepted entries from the catalogue
	// (a nil catalogue gives the fixed entries only, if any). Nil for a
	// typed field.
	Choices func(*presets.Catalogue) []Choice
	// Multi pickers take a comma-separated list of choice IDs.
	Multi bool
	Help  string
}

// IsPicker reports whether the field is chosen from a list.
func (f FieldSpec) IsPicker() bool { return f.Choices != nil }

// Fields returns every input field in pane order, then screen order within
// the pane. The slice is new on every call.
func Fields() []FieldSpec {
	return append([]FieldSpec(nil), fieldTable...)
}

// FieldsIn returns the fields of one pane in screen order.
func FieldsIn(p Pane) []FieldSpec {
	var out []FieldSpec
	for _, f := range fieldTable {
		if f.Pane == p {
			out = append(out, f)
		}
	}
	return out
}

// FieldByID returns the spec of a field.
func FieldByID(id FieldID) (FieldSpec, bool) {
	for _, f := range fieldTable {
		if f.ID == id {
			return f, true
		}
	}
	return FieldSpec{}, false
}

const (
	mm = 1e-3
	cm = 1e-2
)

var fieldTable = []FieldSpec{
	// Hose.
	{ID: FieldHoseID, Pane: PaneHose, Label: "Hose inside diameter", Dim: DimDiameter, Min: 3 * mm, Max: 600 * mm,
		Help: "Bore of the hose, not its outside size: 25mm, 1in, 3/4 in, 1-1/2in."},
	{ID: FieldHoseLength, Pane: PaneHose, Label: "Hose length", Dim: DimLength, Min: 0.1, Max: 1000,
		Help: "Whole run from intake to outlet, couplings included."},
	{ID: FieldHoseUpLeg, Pane: PaneHose, Label: "Up-leg length", Dim: DimLength, Min: 0.05, Max: 1000, Optional: true,
		Help: "Hose from the intake up to the crest. Leave empty to take intake depth plus lift."},
	{ID: FieldHoseMaterial, Pane: PaneHose, Label: "Hose material", Dim: DimNumber, Optional: true,
		Choices: materialChoices,
		Help:    "Sets the wall roughness (empty: smooth rubber). Lay-flat hose collapses under suction and cannot siphon."},
	{ID: FieldHoseFittings, Pane: PaneHose, Label: "Fittings", Dim: DimNumber, Optional: true, Multi: true,
		Choices: fittingChoices,
		Help:    "Intake screen, couplings, valves and bends on the run; comma-separated."},
	{ID: FieldHoseCount, Pane: PaneHose, Label: "Hoses in parallel", Dim: DimNumber, Min: 1, Max: 20, Default: "1", Integer: true,
		Help: "Identical hoses over the same crest, each primed on its own."},
	{ID: FieldHoseKMinor, Pane: PaneHose, Label: "Minor-loss sum ΣK", Dim: DimNumber, Min: 0, Max: 200, Optional: true,
		Help: "Overrides the fittings list: entrance, bends, couplings and valves added up."},
	{ID: FieldHoseRoughness, Pane: PaneHose, Label: "Wall roughness", Dim: DimRoughness, Min: 0, Max: 10 * mm, Optional: true,
		Help: "Overrides the material's roughness, e.g. 0.0015mm for smooth plastic."},
	{ID: FieldPriming, Pane: PaneHose, Label: "Priming method", Dim: DimNumber, Optional: true,
		Choices: primingChoices,
		Help:    "How the hose is filled before it runs. Never by mouth."},
	{ID: FieldPumpStroke, Pane: PaneHose, Label: "Hand-pump stroke volume", Dim: DimVolume, Min: 1e-6, Max: 0.02, Optional: true,
		Help: "Liquid moved per stroke or squeeze, for the stroke count to prime."},

	// Lift & outlet.
	{ID: FieldLift, Pane: PaneLift, Label: "Lift over crest", Dim: DimLength, Min: -5, Max: 15,
		Help: "Height of the highest point of the hose above the source surface (negative if below)."},
	{ID: FieldDrop, Pane: PaneLift, Label: "Drop to outlet", Dim: DimLength, Min: 0.01, Max: 100,
		Help: "Source surface down to the hose end, or to the receiving surface if the end is submerged."},
	{ID: FieldIntakeDepth, Pane: PaneLift, Label: "Intake depth", Dim: DimLength, Min: 0, Max: 100, Default: "0.3 m",
		Help: "Hose opening below the source surface (used when no tank is given)."},
	{ID: FieldIntakeHeight, Pane: PaneLift, Label: "Intake height above floor", Dim: DimLength, Min: 0, Max: 1000, Default: "0.05 m",
		Help: "Hose opening above the tank floor (used with a tank)."},
	{ID: FieldOutletSubmerged, Pane: PaneLift, Label: "Outlet end", Dim: DimNumber, Default: "no",
		Choices: outletChoices,
		Help:    "Free: the end discharges into air. Submerged: it sits below the receiving surface."},
	{ID: FieldTolHeight, Pane: PaneLift, Label: "Height tolerance", Dim: DimLength, Min: 0, Max: 1, Default: "3 cm",
		Help: "How far each measured height may be off (±); sets the low and high band."},
	{ID: FieldReceiverShape, Pane: PaneLift, Label: "Receiving vessel", Dim: DimNumber, Default: "none",
		Choices: receiverShapeChoices,
		Help:    "A tank the hose discharges into: its level rises and the head shrinks from both ends. None: a free outlet or an open drain."},
	{ID: FieldReceiverDiameter, Pane: PaneLift, Label: "Receiver diameter", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside diameter of the receiving vessel."},
	{ID: FieldReceiverLength, Pane: PaneLift, Label: "Receiver length", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside length of the receiving vessel (a pit: its bottom length)."},
	{ID: FieldReceiverWidth, Pane: PaneLift, Label: "Receiver width", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside width of the receiving vessel (a pit: its bottom width)."},
	{ID: FieldReceiverHeight, Pane: PaneLift, Label: "Receiver depth", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Floor to brim of the receiving vessel: the transfer stops when it is full."},
	{ID: FieldReceiverCone, Pane: PaneLift, Label: "Receiver cone height", Dim: DimLength, Min: 0.01, Max: calc.MaxTankSize,
		Help: "Height of the receiver's conical bottom."},
	{ID: FieldReceiverSlope, Pane: PaneLift, Label: "Receiver side slope", Dim: DimNumber, Min: 0, Max: calc.MaxSideSlope,
		Help: "Receiving pit: horizontal run per unit rise of its sides."},
	{ID: FieldReceiverFloor, Pane: PaneLift, Label: "Receiver floor", Dim: DimLength, Min: -100, Max: 100,
		Help: "Receiver's floor above the source tank's floor; negative when it stands lower."},
	{ID: FieldReceiverLevel, Pane: PaneLift, Label: "Receiver level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize, Default: "0 m",
		Help: "Liquid already in the receiver, above its own floor, at the start."},

	// Liquid & site.
	{ID: FieldLiquid, Pane: PaneLiquid, Label: "Liquid", Dim: DimNumber, Default: "water",
		Choices: liquidChoices,
		Help:    "Sets density, viscosity, vapour pressure and the checklist's hazards."},
	{ID: FieldTemp, Pane: PaneLiquid, Label: "Liquid temperature", Dim: DimTemperature, Min: float64(calc.Celsius(-40)), Max: float64(calc.Celsius(150)), Default: "15 °C",
		Help: "Temperature of the liquid itself; its own valid range is checked with the liquid."},
	{ID: FieldAltitude, Pane: PaneLiquid, Label: "Site altitude", Dim: DimLength, Min: -500, Max: 5000, Default: "0 m",
		Help: "Height above sea level; gives the standard barometric pressure."},
	{ID: FieldBaro, Pane: PaneLiquid, Label: "Barometer reading", Dim: DimPressure, Min: 50e3, Max: 110e3, Optional: true,
		Help: "Absolute station pressure; overrides the altitude. Not the sea-level figure from a forecast."},
	{ID: FieldDensity, Pane: PaneLiquid, Label: "Density override", Dim: DimDensity, Min: calc.MinDensity, Max: calc.MaxDensity, Optional: true,
		Help: "From the safety data sheet, at the liquid's temperature."},
	{ID: FieldViscosity, Pane: PaneLiquid, Label: "Viscosity override", Dim: DimViscosity, Min: calc.MinViscosity, Max: calc.MaxViscosity, Optional: true,
		Help: "Dynamic viscosity at the liquid's temperature (mPa·s = cP)."},
	{ID: FieldVapor, Pane: PaneLiquid, Label: "Vapour pressure override", Dim: DimPressure, Min: 0, Max: calc.MaxVaporPressure, Optional: true,
		Help: "Absolute vapour pressure at the liquid's temperature."},

	// Tank.
	{ID: FieldTankPreset, Pane: PaneTank, Label: "Tank from catalogue", Dim: DimNumber, Optional: true,
		Choices: tankPresetChoices,
		Help:    "A typical vessel from the catalogue fills the shape and sizes; then measure and set the level."},
	{ID: FieldTankShape, Pane: PaneTank, Label: "Tank shape", Dim: DimNumber, Default: "none",
		Choices: tankShapeChoices,
		Help:    "Shape of the source vessel; none for a steady flow figure only."},
	{ID: FieldTankDiameter, Pane: PaneTank, Label: "Tank diameter", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside diameter (cylinders, cone-bottom tanks, spheres)."},
	{ID: FieldTankLength, Pane: PaneTank, Label: "Tank length", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside length (rectangular tanks, horizontal cylinders; floor of a sloped pit)."},
	{ID: FieldTankWidth, Pane: PaneTank, Label: "Tank width", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside width (rectangular tanks; floor of a sloped pit)."},
	{ID: FieldTankHeight, Pane: PaneTank, Label: "Tank depth", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize, Optional: true,
		Help: "Floor to rim or overflow; bounds the level."},
	{ID: FieldTankCone, Pane: PaneTank, Label: "Cone height", Dim: DimLength, Min: 0.01, Max: calc.MaxTankSize,
		Help: "Height of the conical bottom of a cone-bottom tank."},
	{ID: FieldTankSlope, Pane: PaneTank, Label: "Side slope", Dim: DimNumber, Min: 0, Max: calc.MaxSideSlope,
		Help: "Sloped pit or pond: horizontal run per unit rise of the sides, e.g. 2 for 2:1."},
	{ID: FieldTankLevel, Pane: PaneTank, Label: "Liquid level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize,
		Help: "Source surface above the tank floor at the start."},
	{ID: FieldTankTarget, Pane: PaneTank, Label: "Target level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize, Optional: true,
		Help: "Stop the drain at this level above the floor. Empty: as low as the intake allows."},
}

// Choices for the picker fields.

func materialChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, m := range c.Materials() {
		out = append(out, Choice{ID: m.ID, Label: m.Name, Note: m.Note})
	}
	return out
}

func fittingChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, f := range c.Fittings() {
		out = append(out, Choice{ID: f.ID, Label: f.Name})
	}
	return out
}

func liquidChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, l := range c.Liquids() {
		out = append(out, Choice{ID: l.ID, Label: l.Name, Note: l.Note})
	}
	return out
}

// primingChoices lists the checklist's priming methods, so that the picker
// and the checklist can never disagree. Mouth suction is not among them.
func primingChoices(*presets.Catalogue) []Choice {
	var out []Choice
	for _, m := range PrimingMethods() {
		out = append(out, Choice{ID: string(m), Label: m.Label()})
	}
	return out
}

func outletChoices(*presets.Catalogue) []Choice {
	return []Choice{
		{ID: "no", Label: "Free (discharges into air)"},
		{ID: "yes", Label: "Submerged (below the receiving surface)"},
	}
}

func tankPresetChoices(c *presets.Catalogue) []Choice {
	out := []Choice{{ID: "custom", Label: "custom (type the shape and sizes)"}}
	if c == nil {
		return out
	}
	for _, t := range c.Tanks() {
		out = append(out, Choice{ID: t.ID, Label: t.Name, Note: t.Note})
	}
	return out
}

func receiverShapeChoices(*presets.Catalogue) []Choice {
	out := []Choice{{ID: "none", Label: "none (free outlet or open drain)"}}
	for _, s := range presets.TankShapes() {
		out = append(out, Choice{ID: s, Label: strings.ReplaceAll(s, "-", " ")})
	}
	return out
}

func tankShapeChoices(*presets.Catalogue) []Choice {
	out := []Choice{{ID: "none", Label: "No tank (steady flow only)"}}
	for _, s := range presets.TankShapes() {
		out = append(out, Choice{ID: s, Label: strings.ReplaceAll(s, "-", " ")})
	}
	return out
}

// ErrNotSet is wrapped by the *FieldError for an empty required field.
var ErrNotSet = errors.New("not set")

// ErrNotInteger is wrapped by the *FieldError for a count that is not whole.
var ErrNotInteger = errors.New("not a whole number")

// ErrNotAChoice is wrapped by the *FieldError for a picker entry that is not
// in the list.
var ErrNotAChoice = errors.New("not in the list")

// FieldError is an input that cannot be used: it names the field by its
// label and gives the accepted range in the unit system in use. Err is a
// *ParseError, calc.ErrOutOfRange, ErrNotSet, ErrNotInteger or ErrNotAChoice
// (test with errors.Is / errors.As).
type FieldError struct {
	ID     FieldID
	Label  string
	Text   string // the text as typed
	Detail string // what is wrong, e.g. `0 mm is out of range`
	Accept string // what is accepted, e.g. `3 to 600 mm`
	Err    error
}

func (e *FieldError) Error() string {
	s := e.Label + ": " + e.Detail
	if e.Accept != "" {
		s += "; accepted " + e.Accept
	}
	return s
}

// Unwrap returns the cause.
func (e *FieldError) Unwrap() error { return e.Err }

// RangeText gives the accepted range in sys, e.g. "3 to 600 mm" or
// "0.118 to 23.6 in".
func (f FieldSpec) RangeText(sys System) string {
	if f.IsPicker() {
		return ""
	}
	lo, u := formatPlain(f.Dim, f.Min, sys)
	hi, u2 := formatPlain(f.Dim, f.Max, sys)
	if f.Dim == DimTime {
		// Format may pick different units at the two ends.
		lo += " " + u
		u = u2
	}
	s := lo + " to " + hi
	if u != "" {
		s += " " + u
	}
	return s
}

func (f FieldSpec) fail(text, detail string, err error, sys System) *FieldError {
	return &FieldError{ID: f.ID, Label: f.Label, Text: text, Detail: detail, Accept: f.RangeText(sys), Err: err}
}

// Validate parses text for this field in sys and checks the accepted range.
// It returns the value in SI units, or a *FieldError whose message names the
// field's label and the range in sys, e.g.
//
//	Hose inside diameter: 0 mm is out of range; accepted 3 to 600 mm
//
// Empty text is an error wrapping ErrNotSet (the caller decides whether the
// field is optional or has a Default; see Job.Value). Picker fields are not
// numbers: use ValidateChoice for them.
func (f FieldSpec) Validate(text string, sys System) (float64, error) {
	if f.IsPicker() {
		return 0, &FieldError{ID: f.ID, Label: f.Label, Text: text, Detail: "is chosen from a list, not typed as a number", Err: ErrNotAChoice}
	}
	if strings.TrimSpace(text) == "" {
		return 0, f.fail(text, "nothing entered", ErrNotSet, sys)
	}
	v, err := Parse(f.Dim, text, sys)
	if err != nil {
		var pe *ParseError
		detail := err.Error()
		if errors.As(err, &pe) && pe.Err != ErrEmpty {
			detail = "cannot read " + strconv.Quote(strings.TrimSpace(text)) + ": " + pe.Reason
			if pe.Err == ErrUnit {
				detail += " (units " + strings.Join(Units(f.Dim), ", ") + ")"
			}
		}
		return 0, f.fail(text, detail, err, sys)
	}
	if f.Integer && v != math.Trunc(v) {
		return 0, f.fail(text, strconv.Quote(strings.TrimSpace(text))+" is not a whole number", ErrNotInteger, sys)
	}
	if v < f.Min || v > f.Max {
		return 0, f.fail(text, f.valueText(v, sys)+" is out of range", calc.ErrOutOfRange, sys)
	}
	return v, nil
}

// valueText shows an offending value in sys with enough digits that it never
// reads as equal to a range end it lies outside.
func (f FieldSpec) valueText(v float64, sys System) string {
	u := displayUnit(f.Dim, v, sys)
	x := v/u.scale - u.off
	s := strconv.FormatFloat(x, 'g', 6, 64)
	if math.Abs(x) < 1e6 && !strings.ContainsAny(s, "e") {
		s = trimZeros(strconv.FormatFloat(x, 'f', 4, 64))
	}
	if u.name != "" {
		s += " " + u.name
	}
	return s
}

// ValidateChoice checks a picker entry against the catalogue's choices
// (case-insensitive). Multi pickers take comma-separated IDs; empty entries
// between commas are ignored. Empty text is accepted for Optional fields and
// fields with a Default; otherwise it is an error wrapping ErrNotSet. A nil
// catalogue accepts any entry for catalogue-backed pickers (they are checked
// again when the plan is computed).
func (f FieldSpec) ValidateChoice(text string, cat *presets.Catalogue) error {
	if !f.IsPicker() {
		return &FieldError{ID: f.ID, Label: f.Label, Text: text, Detail: "is typed, not chosen from a list", Err: ErrNotAChoice}
	}
	ids := []string{strings.TrimSpace(text)}
	if f.Multi {
		ids = ids[:0]
		for _, p := range strings.Split(text, ",") {
			if p = strings.TrimSpace(p); p != "" {
				ids = append(ids, p)
			}
		}
	}
	if len(ids) == 0 || (len(ids) == 1 && ids[0] == "") {
		if f.Optional || f.Default != "" {
			return nil
		}
		return &FieldError{ID: f.ID, Label: f.Label, Text: text, Detail: "nothing chosen", Accept: f.choiceText(cat), Err: ErrNotSet}
	}
	choices := f.Choices(cat)
	if len(choices) == 0 {
		return nil
	}
	for _, id := range ids {
		if !hasChoice(choices, id) && !(f.ID == FieldLiquid && cat != nil && liquidKnown(cat, id)) && !tableShape(f, id) {
			return &FieldError{ID: f.ID, Label: f.Label, Text: text, Detail: strconv.Quote(id) + " is not in the list", Accept: f.choiceText(cat), Err: ErrNotAChoice}
		}
	}
	return nil
}

// ChoiceID returns the catalogue's own spelling of a picker entry typed in
// any case ("Rectangular" → "rectangular"), and whether it is in the list.
// For a Multi picker it normalises each comma-separated entry and joins them
// with ", ". Entries not in the list are returned as typed (trimmed).
func (f FieldSpec) ChoiceID(text string, cat *presets.Catalogue) (string, bool) {
	if !f.IsPicker() {
		return strings.TrimSpace(text), false
	}
	parts := []string{text}
	if f.Multi {
		parts = strings.Split(text, ",")
	}
	choices := f.Choices(cat)
	all := true
	var out []string
	for _, p := range parts {
		p = strings.TrimSpace(p)
		if p == "" {
			continue
		}
		found := false
		for _, c := range choices {
			if strings.EqualFold(c.ID, p) {
				p, found = c.ID, true
				break
			}
		}
		if !found && f.ID == FieldLiquid && cat != nil && liquidKnown(cat, p) {
			p, found = strings.ToLower(p), true
		}
		if !found && tableShape(f, p) {
			p, found = calc.ShapeTable, true
		}
		all = all && found
		out = append(out, p)
	}
	return strings.Join(out, ", "), all && len(out) > 0
}

// liquidKnown admits the catalogue's parametric liquids ("seawater:35").
func liquidKnown(cat *presets.Catalogue, id string) bool {
	_, ok := cat.Liquid(id)
	return ok
}

// tableShape admits the calibration-table tank shape, which comes with a
// table file (drawdown calc --tank table --tank-table FILE). The picker does
// not offer it: the screen cannot load a table yet.
func tableShape(f FieldSpec, id string) bool {
	return f.ID == FieldTankShape && strings.EqualFold(strings.TrimSpace(id), calc.ShapeTable)
}

func hasChoice(cs []Choice, id string) bool {
	for _, c := range cs {
		if strings.EqualFold(c.ID, id) {
			return true
		}
	}
	return false
}

func (f FieldSpec) choiceText(cat *presets.Catalogue) string {
	cs := f.Choices(cat)
	ids := make([]string, 0, len(cs))
	for _, c := range cs {
		ids = append(ids, c.ID)
	}
	if len(ids) > 12 {
		ids = append(ids[:12], "…")
	}
	return strings.Join(ids, ", ")
}
