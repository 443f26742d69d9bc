package model

import (
	"strings"

	"drawdown/presets"
)

// Discharge is where the liquid goes.
type Discharge string

// Discharge kinds.
const (
	DischargeContainer Discharge = "container" // drums, tanks, a truck or a hauler
	DischargeSewer     Discharge = "sewer"     // sanitary sewer
	DischargeStorm     Discharge = "storm"     // storm drain, ditch or ground
	DischargeSameSite  Discharge = "same-site" // elsewhere on the same site
)

// Discharges lists the discharge kinds in picker order.
func Discharges() []Discharge {
	return []Discharge{DischargeContainer, DischargeSewer, DischargeStorm, DischargeSameSite}
}

// Label is the description shown for the discharge kind.
func (d Discharge) Label() string {
	switch d {
	case DischargeContainer:
		return "container or truck"
	case DischargeSewer:
		return "sanitary sewer"
	case DischargeStorm:
		return "storm drain or ground"
	case DischargeSameSite:
		return "same site"
	}
	return string(d)
}

// Hazards are the liquid's hazard tags as the catalogue gives them (presets)
// or as the technician sets them for an unlisted liquid.
type Hazards struct {
	Flammable bool `json:"flammable,omitempty"`
	// FlammableClass is the NFPA 30 class, e.g. "IB" or "II"; empty if unknown.
	FlammableClass string `json:"flammable_class,omitempty"`
	Combustible    bool   `json:"combustible,omitempty"`
	Biohazard      bool   `json:"biohazard,omitempty"`
	// Environmental: oily or otherwise harmful to waters and ground; the
	// discharge needs an inspection and a record.
	Environmental bool `json:"environmental,omitempty"`
	Hot           bool `json:"hot,omitempty"`
	FreezingRisk  bool `json:"freezing_risk,omitempty"`
	// Toxic: harmful if swallowed or breathed (for fuels, an aspiration
	// hazard).
	Toxic bool `json:"toxic,omitempty"`
	// Volatile: high vapour pressure; vapour heavier than air.
	Volatile bool `json:"volatile,omitempty"`
}

// HazardsFromPresets converts the catalogue's hazard set and NFPA 30 class
// (presets.Hazards, presets.FlashClass) to the checklist's Hazards. Pass
// presets.NoFlashClass when the class is unknown.
func HazardsFromPresets(s presets.Hazards, class presets.FlashClass) Hazards {
	h := Hazards{
		Flammable:     s.Has(presets.Flammable),
		Combustible:   s.Has(presets.Combustible),
		Biohazard:     s.Has(presets.Biohazard),
		Environmental: s.Has(presets.Environmental),
		Hot:           s.Has(presets.Hot),
		FreezingRisk:  s.Has(presets.FreezingRisk),
		Toxic:         s.Has(presets.Toxic),
		Volatile:      s.Has(presets.Volatile),
	}
	if class != presets.NoFlashClass {
		h.FlammableClass = class.String()
	}
	return h
}

// Any reports whether the liquid has any hazard tag beyond heat and frost.
func (h Hazards) Any() bool {
	return h.Flammable || h.Combustible || h.Biohazard || h.Environmental || h.Toxic
}

// List returns the hazard codes set, in a fixed order, with the NFPA 30
// class after "flammable" when known (e.g. "flammable (class IB)").
func (h Hazards) List() []string {
	var out []string
	if h.Flammable {
		if h.FlammableClass != "" {
			out = append(out, "flammable (class "+h.FlammableClass+")")
		} else {
			out = append(out, "flammable")
		}
	}
	for _, t := range []struct {
		on   bool
		name string
	}{{h.Combustible, "combustible"}, {h.Volatile, "volatile"}, {h.Toxic, "toxic"}, {h.Biohazard, "biohazard"},
		{h.Environmental, "environmental"}, {h.Hot, "hot"}, {h.FreezingRisk, "freezing-risk"}} {
		if t.on {
			out = append(out, t.name)
		}
	}
	return out
}

// Fuel reports whether the fire and static steps apply: flammable, or
// combustible (handled near its flash point it behaves as flammable).
func (h Hazards) Fuel() bool { return h.Flammable || h.Combustible }

// HazardsFromTags maps catalogue tags ("flammable", "combustible",
// "biohazard", "environmental", "hot", "freezing-risk", "toxic", "volatile")
// to Hazards. A tag of
// the form "nfpa:IB" or "class:IB" sets FlammableClass. Unknown tags are
// ignored, so a newer catalogue does not break an older checklist.
func HazardsFromTags(tags []string) Hazards {
	var h Hazards
	for _, tag := range tags {
		t := strings.ToLower(strings.TrimSpace(tag))
		switch {
		case t == "flammable":
			h.Flammable = true
		case t == "combustible":
			h.Combustible = true
		case t == "biohazard":
			h.Biohazard = true
		case t == "environmental":
			h.Environmental = true
		case t == "hot":
			h.Hot = true
		case t == "freezing-risk" || t == "freezing_risk" || t == "freezing":
			h.FreezingRisk = true
		case t == "toxic":
			h.Toxic = true
		case t == "volatile":
			h.Volatile = true
		case strings.HasPrefix(t, "nfpa:") || strings.HasPrefix(t, "class:"):
			_, c, _ := strings.Cut(strings.TrimSpace(tag), ":")
			h.FlammableClass = strings.ToUpper(strings.TrimSpace(c))
		}
	}
	return h
}

// ChecklistContext holds the facts the checklist is built from. The crew
// confirms the site facts (confined space, open edge, discharge); the tool
// does not judge them.
type ChecklistContext struct {
	Liquid  string        `json:"liquid,omitempty"` // display name, e.g. "diesel"
	Hazards Hazards       `json:"hazards"`
	Method  PrimingMethod `json:"method,omitempty"`
	// ConfinedSpace: the source is in a space the site program classes as a
	// (permit-required) confined space.
	ConfinedSpace bool `json:"confined_space,omitempty"`
	// OpenEdge: an open pit, hatch, pond or lagoon edge with a fall or
	// drowning hazard.
	OpenEdge  bool      `json:"open_edge,omitempty"`
	Discharge Discharge `json:"discharge,omitempty"`
	// Receiver: the liquid goes into a receiving vessel whose level rises.
	Receiver bool `json:"receiver,omitempty"`
	// Strokes, when above zero, is the estimated hand-pump stroke count to
	// fill the hose; it is quoted in the hand-pump step.
	Strokes int `json:"strokes,omitempty"`
	// ExtraHazards are hazards the crew adds to the liquid's own (rain water
	// in an oil bund is environmental; an unidentified liquid may be
	// treated as a biohazard). ContextFor keeps them when the liquid
	// changes; Hazards is the liquid's tags plus these.
	ExtraHazards Hazards `json:"extra_hazards,omitzero"`
	// SheenSeen: the crew recorded a sheen, odour of product or
	// discoloration in the liquid before or during the release. Unless the
	// liquid goes to a container or truck, the checklist then holds the
	// release: no priming, running or release steps, only recording and
	// collection (field-practice §3.8, the sheen rule; a hard branch).
	SheenSeen bool `json:"sheen_seen,omitempty"`
}

// Held reports whether the checklist holds the release: a sheen was
// recorded and the liquid would leave the site's control (not into a
// container or truck).
func (ctx ChecklistContext) Held() bool {
	return ctx.SheenSeen && ctx.Discharge != DischargeContainer
}

// Union returns the hazards set in h or in o (the first known NFPA class).
func (h Hazards) Union(o Hazards) Hazards {
	u := Hazards{
		Flammable:     h.Flammable || o.Flammable,
		Combustible:   h.Combustible || o.Combustible,
		Biohazard:     h.Biohazard || o.Biohazard,
		Environmental: h.Environmental || o.Environmental,
		Hot:           h.Hot || o.Hot,
		FreezingRisk:  h.FreezingRisk || o.FreezingRisk,
		Toxic:         h.Toxic || o.Toxic,
		Volatile:      h.Volatile || o.Volatile,
	}
	u.FlammableClass = h.FlammableClass
	if u.FlammableClass == "" {
		u.FlammableClass = o.FlammableClass
	}
	return u
}

// ContextFor is the checklist context for job j with its computed plan p:
// the site facts the crew set (confined space, open edge, discharge,
// receiver, extra hazards) are kept from j.Checklist.Context; the liquid's
// name and hazard tags at the job's temperature come from the plan; the
// method from the priming field; the stroke count from the plan. Call it
// after each Compute and pass the result to j.Checklist.Rebuild when it
// differs from j.Checklist.Context.
func ContextFor(j Job, p Plan) ChecklistContext {
	ctx := j.Checklist.Context
	ctx.Liquid = p.Liquid.Name
	if ctx.Liquid == "" {
		ctx.Liquid = strings.TrimSpace(j.Text(FieldLiquid))
	}
	class := presets.NoFlashClass
	if p.Liquid.Valid() {
		class = p.Liquid.Class
	}
	ctx.Hazards = HazardsFromPresets(p.Hazards, class).Union(ctx.ExtraHazards)
	if !ctx.Hazards.Flammable && !ctx.Hazards.Combustible {
		ctx.Hazards.FlammableClass = ""
	}
	if m, err := ParsePrimingMethod(j.Choice(FieldPriming)); err == nil {
		ctx.Method = m
	} else {
		ctx.Method = ""
	}
	ctx.Strokes = p.PumpStrokes
	if p.DrainIn.Receiver != nil {
		ctx.Receiver = true
	}
	return ctx
}
