package model

import (
	"encoding/json"
	"math"
	"strings"

	"drawdown/presets"
)

// ChecklistContext holds the facts the checklist is built from. ContextFor
// derives it from the job and its plan, after every compute; nothing in it
// is sticky. The liquid's hazards are the catalogue's (presets.Hazards) at
// the job's temperature, plus the freezing risk of the air; the site facts
// are the crew's answers (the tool does not judge them), with the discharge
// made a transfer where the plan has a receiving vessel.
type ChecklistContext struct {
	SiteFacts
	// Liquid is the liquid's display name, e.g. "Diesel fuel".
	Liquid string
	// Hazards are the liquid's hazard tags at the job's temperature, plus
	// FreezingRisk when the air is within presets.FreezeMargin of the
	// liquid's freezing or pour point, plus Environmental when OilCheck.
	Hazards presets.Hazards
	// Class is the liquid's NFPA 30 class; presets.NoFlashClass when it has
	// none or it is not a fuel.
	Class  presets.FlashClass
	Method PrimingMethod
	// Entering: someone enters the confined space — the crew said so, or
	// the chosen method puts hands in the liquid inside it (which is entry).
	Entering bool
	// Transfer: the liquid goes into a vessel (a receiving vessel in the
	// plan, a container or a tanker), not released.
	Transfer bool
	// OilCheck: the sheen rule applies — the water may carry oil (the
	// crew's answer, or the catalogue's containment rain water), and the
	// liquid is neither a fuel itself nor sewage.
	OilCheck bool
	// Figures are the live plan figures the steps quote.
	Figures StepFigures
}

// StepFigures are the plan's figures that step texts quote, in SI units
// (zero when unknown); Units is the system they are shown in.
type StepFigures struct {
	Units System `json:"units"`
	// Strokes is the hand-pump stroke count to fill the hoses (0: no stroke
	// volume given, or no plan).
	Strokes int `json:"strokes,omitempty"`
	// PrimingVolume is the liquid that fills the hoses, m³.
	PrimingVolume float64 `json:"priming_volume_m3,omitempty"`
	// HoseLength is the length of one hose, m.
	HoseLength float64 `json:"hose_length_m,omitempty"`
	// SourceSpan is the longest straight line across the source's liquid
	// surface, m (0 without a tank of known plan).
	SourceSpan float64 `json:"source_span_m,omitempty"`
	// Temperature is the liquid's, K; FlashPoint its closed-cup flash
	// point, K (0: none); Cold its freezing or pour point, K (0: none).
	Temperature float64 `json:"temperature_k,omitempty"`
	FlashPoint  float64 `json:"flash_point_k,omitempty"`
	Cold        float64 `json:"cold_k,omitempty"`
	// AirTemp is the air temperature, K, when HasAirTemp.
	AirTemp    float64 `json:"air_temp_k,omitempty"`
	HasAirTemp bool    `json:"has_air_temp,omitempty"`
}

// containmentWaterID is the catalogue liquid "Rain water in containment":
// water that may carry oil by definition, so its sheen check does not wait
// for the crew's answer.
const containmentWaterID = "bund-water"

// ContextFor is THE derivation of the checklist context: a pure function of
// the job as it is now (liquid, temperature, site facts, priming method,
// receiver) and the plan computed from it. Call it after every compute and
// pass the result to Checklist.Rebuild (Job.RebuildChecklist does both);
// nothing carries over from an earlier context.
//
// With a plan whose liquid is not in the catalogue, the context names the
// liquid as typed and carries no liquid hazards (the first step asks the
// crew to identify it). The liquid's fixed tags hold even when the
// temperature does not read; the temperature-dependent ones (hot, near the
// flash point, freezing) need a temperature.
func ContextFor(j Job, p Plan) ChecklistContext {
	ctx := ChecklistContext{SiteFacts: j.Facts}
	ctx.Liquid = p.Liquid.Name
	if ctx.Liquid == "" {
		ctx.Liquid = strings.TrimSpace(j.Text(FieldLiquid))
	}
	f := StepFigures{Units: j.Units, Strokes: p.PumpStrokes}
	hz := p.Hazards
	if p.Liquid.Valid() {
		hz |= p.Liquid.Hazards
		f.FlashPoint, f.Cold = float64(p.Liquid.Flash), float64(p.Liquid.Cold)
		if hz.Has(presets.Flammable) || hz.Has(presets.Combustible) {
			ctx.Class = p.Liquid.Class
		}
	}
	if p.Temperature > 0 {
		f.Temperature = float64(p.Temperature)
	}
	if t, ok := j.Facts.airTemp(j.Units); ok {
		f.AirTemp, f.HasAirTemp = t, true
		if f.Cold > 0 && t <= f.Cold+presets.FreezeMargin {
			hz = hz.With(presets.FreezingRisk)
		}
	}
	ctx.Hazards = hz
	if m, err := ParsePrimingMethod(j.Choice(FieldPriming)); err == nil {
		ctx.Method = m
	}
	if p.OK() {
		f.PrimingVolume = float64(p.Result.PrimingVolume)
	}
	f.HoseLength = float64(p.Siphon.Hose.Length)
	f.SourceSpan = sourceSpan(j)
	ctx.Figures = f

	fuel := ctx.Fuel()
	if p.Receiver != nil && ctx.Discharge != DischargeTanker {
		ctx.Discharge = DischargeContainer // a receiving vessel makes the job a transfer
	}
	if fuel && ctx.Discharge == "" {
		ctx.Discharge = DischargeContainer // a fuel goes nowhere but into a vessel
	}
	ctx.Transfer = ctx.Discharge.Transfer()
	ctx.Entering = ctx.ConfinedSpace && (ctx.Entry || ctx.Method.HandsInLiquid())
	ctx.OilCheck = (ctx.MayCarryOil || p.Liquid.ID == containmentWaterID) && !fuel && !hz.Has(presets.Biohazard)
	if ctx.OilCheck {
		ctx.Hazards = ctx.Hazards.With(presets.Environmental) // inspect before release
	}
	return ctx
}

// sourceSpan is the longest straight line across the liquid surface of the
// job's tank, in metres, or 0 when the shape or a size is not known. For a
// sloped pit the surface is the floor widened by the side slope at the
// level.
func sourceSpan(j Job) float64 {
	val := func(id FieldID) float64 {
		if !j.Has(id) {
			return 0
		}
		v, err := j.Value(id)
		if err != nil || v <= 0 {
			return 0
		}
		return v
	}
	switch strings.ToLower(strings.TrimSpace(j.Text(FieldTankShape))) {
	case "vertical-cylinder", "cone-bottom", "sphere":
		return val(FieldTankDiameter)
	case "rectangular":
		if l, w := val(FieldTankLength), val(FieldTankWidth); l > 0 && w > 0 {
			return math.Hypot(l, w)
		}
	case "horizontal-cylinder":
		if l, d := val(FieldTankLength), val(FieldTankDiameter); l > 0 && d > 0 {
			return math.Hypot(l, d)
		}
	case "sloped-pit":
		l, w := val(FieldTankLength), val(FieldTankWidth)
		if l > 0 && w > 0 {
			grow := 2 * val(FieldTankSlope) * val(FieldTankLevel)
			return math.Hypot(l+grow, w+grow)
		}
	}
	return 0
}

// Fuel reports whether the fire and static steps apply: a flammable or a
// combustible liquid (a combustible liquid near its flash point is treated
// as flammable).
func (ctx ChecklistContext) Fuel() bool {
	return ctx.Hazards.Has(presets.Flammable) || ctx.Hazards.Has(presets.Combustible)
}

// outletPlace words where the hose end goes: into the receiver for a
// transfer, else at the discharge point.
func (ctx ChecklistContext) outletPlace() string {
	if ctx.Transfer {
		return "in the receiver"
	}
	return "at the discharge point"
}

// has reports whether the context's hazards hold h.
func (ctx ChecklistContext) has(h presets.Hazard) bool { return ctx.Hazards.Has(h) }

// harmful reports whether the liquid may not simply run onto the ground:
// any hazard tag beyond heat and frost (water that may carry oil has the
// environmental tag).
func (ctx ChecklistContext) harmful() bool {
	return ctx.Hazards.Without(presets.Hot).Without(presets.FreezingRisk) != 0 || ctx.OilCheck
}

// hold is why a release is held.
type hold int

const (
	holdNone   hold = iota
	holdSheen       // a sheen, odour or colour was recorded
	holdFuel        // a fuel meant for a storm drain, the ground or a sewer
	holdSewage      // sewage meant for a storm drain or the ground
)

func (ctx ChecklistContext) hold() hold {
	switch {
	case ctx.Fuel() && (ctx.Discharge == DischargeStorm || ctx.Discharge == DischargeSewer):
		return holdFuel
	case ctx.has(presets.Biohazard) && ctx.Discharge == DischargeStorm:
		return holdSewage
	case ctx.SheenSeen && !ctx.Transfer:
		return holdSheen
	}
	return holdNone
}

// HoldReason says, in plain words, why the checklist holds the release (no
// priming, running or release steps; only recording and collection), or ""
// when it does not:
//
//   - a sheen, odour of product or colour was recorded and the liquid would
//     leave the site's control (40 CFR 110, the sheen rule; 40 CFR
//     112.8(c)(3); field-practice §3.8);
//   - a fuel is meant for a storm drain, the ground or a sewer (NFPA 30;
//     local sewer-use ordinances): it goes only into approved containers or
//     a tanker;
//   - sewage is meant for a storm drain or the ground (MS4 permits: an
//     illicit discharge).
func (ctx ChecklistContext) HoldReason() string {
	switch ctx.hold() {
	case holdSheen:
		return "a sheen, odour or colour was recorded: do not release this liquid to the " + ctx.Discharge.Label()
	case holdFuel:
		return "a fuel never goes to the " + ctx.Discharge.Label() + ": collect it in approved containers or a tanker"
	case holdSewage:
		return "sewage never goes to a storm drain or the ground: send it to the sanitary sewer with the utility's approval, or to a tanker"
	case holdNone:
	}
	return ""
}

// Held reports whether the checklist holds the release (HoldReason is not
// empty).
func (ctx ChecklistContext) Held() bool { return ctx.hold() != holdNone }

// contextJSON is the job-file form of a ChecklistContext: the hazards as
// their catalogue codes and the class as its NFPA 30 name, so that the file
// reads as words. The context in a job file is a record of what the steps
// were last built from; ContextFor never reads it back.
type contextJSON struct {
	SiteFacts
	Liquid   string        `json:"liquid,omitempty"`
	Hazards  []string      `json:"hazards,omitempty"`
	Class    string        `json:"class,omitempty"`
	Method   PrimingMethod `json:"method,omitempty"`
	Entering bool          `json:"entering,omitempty"`
	Transfer bool          `json:"transfer,omitempty"`
	OilCheck bool          `json:"oil_check,omitempty"`
	Figures  StepFigures   `json:"figures,omitzero"`
}

// MarshalJSON writes the context in its job-file form.
func (ctx ChecklistContext) MarshalJSON() ([]byte, error) {
	c := contextJSON{SiteFacts: ctx.SiteFacts, Liquid: ctx.Liquid, Method: ctx.Method,
		Entering: ctx.Entering, Transfer: ctx.Transfer, OilCheck: ctx.OilCheck, Figures: ctx.Figures}
	for _, h := range ctx.Hazards.List() {
		c.Hazards = append(c.Hazards, h.String())
	}
	if ctx.Class != presets.NoFlashClass {
		c.Class = ctx.Class.String()
	}
	return json.Marshal(c)
}

// UnmarshalJSON reads the job-file form. Hazard codes and classes this
// build does not know are left out (the context is rebuilt at the next
// compute in any case).
func (ctx *ChecklistContext) UnmarshalJSON(b []byte) error {
	var c contextJSON
	if err := json.Unmarshal(b, &c); err != nil {
		return err
	}
	*ctx = ChecklistContext{SiteFacts: c.SiteFacts, Liquid: c.Liquid, Method: c.Method,
		Entering: c.Entering, Transfer: c.Transfer, OilCheck: c.OilCheck, Figures: c.Figures}
	for _, code := range c.Hazards {
		if h, ok := presets.ParseHazard(code); ok {
			ctx.Hazards = ctx.Hazards.With(h)
		}
	}
	for k := presets.ClassIA; k <= presets.ClassIIIB; k++ {
		if c.Class == k.String() {
			ctx.Class = k
		}
	}
	return nil
}
