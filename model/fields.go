package model

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"sync"

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
	FieldOutletK       FieldID = "outlet.k"
	FieldPriming       FieldID = "priming.method"
	FieldPumpStroke    FieldID = "pump.stroke"

	FieldLift            FieldID = "lift"
	FieldDrop            FieldID = "drop"
	FieldIntakeDepth     FieldID = "intake.depth"
	FieldIntakeHeight    FieldID = "intake.height"
	FieldIntakeKind      FieldID = "intake.kind"
	FieldMaxFlow         FieldID = "max.flow"
	FieldOutletSubmerged FieldID = "outlet.submerged"
	FieldTolHeight       FieldID = "tol.height"
	FieldTolBore         FieldID = "tol.bore"

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

	// Liquid coming in while the siphon runs, and a pump to finish.
	FieldRain      FieldID = "inflow.rain"
	FieldCatchment FieldID = "inflow.catchment"
	FieldRiseRate  FieldID = "inflow.rise"
	FieldSeepage   FieldID = "inflow.seepage"
	FieldPumpRate  FieldID = "pump.rate"
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
	// when empty. Blank is what an empty optional field means, in a word
	// or two ("none", "no cap"); "" means "auto" (worked out).
	Optional bool
	Blank    string
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

// choiceCache holds the picker lists of the catalogue last asked about, by
// field. A catalogue never changes once built (presets.Catalogue has no
// setters; Merge returns a new one), so each list is built once per
// catalogue rather than in every validation of every keystroke. Holding the
// pointer keeps that catalogue alive, so the cache never answers for another
// catalogue at the same address; asking about another catalogue starts it
// afresh.
var choiceCache struct {
	sync.Mutex
	cat   *presets.Catalogue
	lists map[FieldID][]Choice
}

// choiceList is f.Choices(cat), built once per catalogue and field (see
// choiceCache). The slice is shared: read it, never change it.
func (f FieldSpec) choiceList(cat *presets.Catalogue) []Choice {
	if f.Choices == nil {
		return nil
	}
	c := &choiceCache
	c.Lock()
	defer c.Unlock()
	if c.cat != cat || c.lists == nil {
		c.cat, c.lists = cat, map[FieldID][]Choice{}
	}
	l, ok := c.lists[f.ID]
	if !ok {
		l = f.Choices(cat)
		c.lists[f.ID] = l
	}
	return l
}

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
	if u != u2 {
		// Format may pick different units at the two ends (seconds and
		// hours; inches and feet).
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
	s = typographicMinus(s)
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
	choices := f.choiceList(cat)
	if len(choices) == 0 {
		return nil
	}
	for _, id := range ids {
		if !hasChoice(choices, id) && !(cat != nil && (f.ID == FieldLiquid && liquidKnown(cat, id) ||
			f.ID == FieldHoseMaterial && materialKnown(cat, id))) && !tableShape(f, id) {
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
	choices := f.choiceList(cat)
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

// materialKnown accepts a material's old ID or other spelling (an alias in
// the catalogue), so saved jobs keep loading.
func materialKnown(cat *presets.Catalogue, id string) bool {
	_, ok := cat.Material(id)
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
	cs := f.choiceList(cat)
	ids := make([]string, 0, len(cs))
	for _, c := range cs {
		ids = append(ids, c.ID)
	}
	if len(ids) > 12 {
		ids = append(ids[:12], "…")
	}
	return strings.Join(ids, ", ")
}
