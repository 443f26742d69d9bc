package model

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"time"

	"drawdown/presets"
)

// The prime-and-drain checklist. BuildChecklist turns the facts of a job (the
// liquid's hazards, the priming method, the site) into an ordered list of
// steps in six sections; steps that do not apply are left out. The technician
// marks each step done, skipped (with a reason) or not applicable, with the
// time it happened and an optional note. The checklist is a plain value that
// the Job embeds and that serialises to JSON.
//
// The steps paraphrase the field-practice brief (/work/shared/field-practice.md
// §2 priming methods, §3 safety, §5 the record), which in turn paraphrases
// public guidance; each caution names the family of rule it comes from and
// defers to the site's written program, local codes and permits. The
// checklist records what the crew confirms. It never decides that a space, a
// liquid or a discharge is safe, and it never authorises a discharge.

// Section is one part of the checklist, in working order.
type Section string

// The sections in the order they are worked.
const (
	SectionHazard   Section = "hazard"
	SectionSetup    Section = "setup"
	SectionPrime    Section = "prime"
	SectionRun      Section = "run"
	SectionStop     Section = "stop"
	SectionCloseOut Section = "closeout"
)

// Sections lists the sections in working order.
func Sections() []Section {
	return []Section{SectionHazard, SectionSetup, SectionPrime, SectionRun, SectionStop, SectionCloseOut}
}

// Title is the heading shown for the section.
func (s Section) Title() string {
	switch s {
	case SectionHazard:
		return "Hazard check"
	case SectionSetup:
		return "Set-up"
	case SectionPrime:
		return "Prime"
	case SectionRun:
		return "Run and watch"
	case SectionStop:
		return "Stop and drain the hose"
	case SectionCloseOut:
		return "Close out"
	}
	return string(s)
}

// StepState is where a step stands. The zero value is not a valid state;
// BuildChecklist sets every step to StatePending.
type StepState string

// Step states.
const (
	StatePending       StepState = "pending"
	StateDone          StepState = "done"
	StateSkipped       StepState = "skipped" // needs a reason
	StateNotApplicable StepState = "n/a"
)

// Valid reports whether s is one of the four states.
func (s StepState) Valid() bool {
	switch s {
	case StatePending, StateDone, StateSkipped, StateNotApplicable:
		return true
	}
	return false
}

// Label is the word shown beside a step (never colour alone).
func (s StepState) Label() string {
	switch s {
	case StatePending:
		return "to do"
	case StateDone:
		return "done"
	case StateSkipped:
		return "skipped"
	case StateNotApplicable:
		return "not applicable"
	}
	return string(s)
}

// PrimingMethod names a way of filling the hose before the siphon runs. Only
// the methods of field-practice §2 exist; mouth suction is never a method.
type PrimingMethod string

// Priming methods (field-practice §2.1–§2.7).
const (
	PrimeSubmerge   PrimingMethod = "submerge-and-cap" // fill in the source, cap one end
	PrimeSupplyFill PrimingMethod = "fill-from-supply" // fill from a clean supply, far end closed
	PrimeCrestPort  PrimingMethod = "crest-port"       // fill through a port at the crest
	PrimeHandPump   PrimingMethod = "hand-pump"        // hand pump or squeeze bulb
	PrimeShakeValve PrimingMethod = "shake-valve"      // shake-type check valve at the intake
	PrimeVacuum     PrimingMethod = "vacuum"           // vacuum pump at the crest
	PrimePumpStart  PrimingMethod = "pump-start"       // pump-assisted start
)

// PrimingMethods lists the methods in the order a picker shows them.
func PrimingMethods() []PrimingMethod {
	return []PrimingMethod{PrimeSubmerge, PrimeSupplyFill, PrimeCrestPort, PrimeHandPump,
		PrimeShakeValve, PrimeVacuum, PrimePumpStart}
}

// Label is the trade description of the method.
func (m PrimingMethod) Label() string {
	switch m {
	case PrimeSubmerge:
		return "submerge and cap"
	case PrimeSupplyFill:
		return "fill from a clean supply, far end closed"
	case PrimeCrestPort:
		return "fill through a crest port"
	case PrimeHandPump:
		return "hand pump or squeeze bulb"
	case PrimeShakeValve:
		return "shake-type check valve"
	case PrimeVacuum:
		return "vacuum at the crest"
	case PrimePumpStart:
		return "pump-assisted start"
	}
	return string(m)
}

// ErrUnknownMethod is returned by ParsePrimingMethod for a name it does not
// know.
var ErrUnknownMethod = errors.New("unknown priming method")

// ParsePrimingMethod accepts a method ID ("submerge-and-cap", "hand-pump",
// …; the IDs match the presets catalogue) or its label, ignoring case and
// surrounding space; "submerge" and "supply-fill" are accepted as aliases. An empty text gives "" and no
// error (no method chosen yet). Anything that names mouth suction is refused
// with a message saying it is never a method.
func ParsePrimingMethod(text string) (PrimingMethod, error) {
	t := strings.ToLower(strings.TrimSpace(text))
	if t == "" {
		return "", nil
	}
	for _, m := range PrimingMethods() {
		if t == string(m) || t == m.Label() {
			return m, nil
		}
	}
	switch t {
	case "submerge":
		return PrimeSubmerge, nil
	case "supply-fill":
		return PrimeSupplyFill, nil
	}
	if strings.Contains(t, "mouth") || strings.Contains(t, "suck") {
		return "", fmt.Errorf("priming method %q: starting a siphon by mouth is never a method; choose one of %s: %w",
			text, methodList(), ErrUnknownMethod)
	}
	return "", fmt.Errorf("priming method %q: choose one of %s: %w", text, methodList(), ErrUnknownMethod)
}

func methodList() string {
	var ids []string
	for _, m := range PrimingMethods() {
		ids = append(ids, string(m))
	}
	return strings.Join(ids, ", ")
}

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

// Step is one checklist item with its state.
type Step struct {
	ID      string  `json:"id"`
	Section Section `json:"section"`
	Text    string  `json:"text"`
	// Caution is a short warning shown with the step, deferring to local
	// codes and permits; empty where none is needed.
	Caution string `json:"caution,omitempty"`
	// Rule names the family of rule or guidance behind the step, e.g.
	// "OSHA 29 CFR 1910.146"; "common practice" for a trade habit.
	Rule string `json:"rule,omitempty"`
	// NoteRequired: marking the step done needs a note with the fact it
	// asks for (a permit number, a gas reading with time and initials, the
	// result of a sheen check, an authorisation). The checklist is gated on
	// facts the crew records, never on the tool's judgement.
	NoteRequired bool      `json:"note_required,omitempty"`
	State        StepState `json:"state"`
	At           time.Time `json:"at,omitzero"`
	Reason       string    `json:"reason,omitempty"` // why it was skipped or not applicable
	Note         string    `json:"note,omitempty"`
}

// Checklist is the ordered list of steps built for a job, plus the context it
// was built from. Dropped keeps steps that were marked but no longer apply
// after a change of liquid or method, so that nothing recorded is lost; a
// later Rebuild restores them if they apply again.
type Checklist struct {
	Context ChecklistContext `json:"context"`
	Steps   []Step           `json:"steps"`
	Dropped []Step           `json:"dropped,omitempty"`
}

// Rule families named in cautions (as field-practice §3 and its sources name
// them).
const (
	ruleConfined   = "OSHA 29 CFR 1910.146; 29 CFR 1926 Subpart AA"
	ruleAtmosphere = "OSHA 29 CFR 1910.146 (atmospheric testing order)"
	ruleFlammable  = "NFPA 30; OSHA 29 CFR 1910.106"
	ruleBonding    = "NFPA 77; OSHA 29 CFR 1910.106(e)(6)(ii)"
	ruleContainers = "NFPA 77; NIOSH 98-111"
	ruleSewage     = "CDC guidance for workers handling human waste or sewage"
	ruleSPCC       = "EPA 40 CFR 112.8(c)(3)"
	ruleSheen      = "EPA 40 CFR 110 (sheen rule); 40 CFR 112.8(c)(3)"
	ruleElectrical = "electrical safety guidance for flooded spaces"
	ruleWater      = "MSHA water-hazard guidance; common practice"
	ruleBackflow   = "local cross-connection control program"
	ruleStormwater = "MS4 / NPDES permits; construction stormwater permit"
	ruleSewer      = "local sewer-use ordinance"
	rulePractice   = "common practice"
)

const deferLocal = "Local codes, permits and the site's written program govern."

// BuildChecklist generates the steps for ctx, all pending, in section order.
// It is pure: no clock, no I/O. Steps that do not apply to the liquid, the
// method or the site are left out. With no method chosen the prime section
// holds only the standing caution and a step asking for a method.
func BuildChecklist(ctx ChecklistContext) Checklist {
	b := &builder{}
	h := ctx.Hazards
	liquid := ctx.Liquid
	if liquid == "" {
		liquid = "not yet named"
	}

	// ---- Hazard check (field-practice §1.2 question 1, §3).
	b.add(SectionHazard, "hazard.liquid",
		"Identify the liquid ("+liquid+") and check its hazards on the safety data sheet where there is one; note what it looks and smells like.",
		"Treat an unknown liquid as hazardous until it is identified.", rulePractice)
	if ctx.ConfinedSpace {
		b.add(SectionHazard, "hazard.cs.permit",
			"Confirm the space's confined-space classification and that an entry permit is issued; record the permit number in the note.",
			"Leaning in or reaching in to place the hose counts as entry. Place the intake from outside (pole, rope, weighted hose) where you can. "+deferLocal,
			ruleConfined)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.oxygen",
			"Test the atmosphere from outside the space, oxygen first, with a calibrated direct-reading meter at the top, middle and bottom; record the reading, time and tester's initials.",
			"Oxygen comes first because combustible-gas sensors read low in oxygen-poor air. Hazardous: below 19.5 % or above 23.5 % oxygen.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.flammable-gas",
			"Then test for flammable gases and vapours, from outside, top, middle and bottom; record the reading, time and initials.",
			"Hazardous: above 10 % of the lower flammable limit. Fuel vapour is heavier than air and pools in pits.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.toxic",
			"Then test for toxic gases and vapours (such as hydrogen sulfide and carbon monoxide), from outside; record the reading, time and initials.",
			"Hazardous: above the permissible exposure limit. Idling engines nearby add carbon monoxide.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.attendant",
			"Post an attendant outside the space for the whole job, with a way to call for help.",
			deferLocal, ruleConfined)
		b.add(SectionHazard, "hazard.cs.rescue",
			"Confirm the rescue arrangements named on the permit are in place before anyone enters.",
			"Would-be rescuers are a large share of confined-space deaths: nobody goes in after a collapsed worker without the planned rescue arrangements.",
			ruleConfined)
	}
	b.add(SectionHazard, "hazard.electrical",
		"Check for energised equipment in or touching the liquid (outlets, cords, pumps, panels); have the supply isolated by an electrician or the utility before anyone goes near the water.",
		"Never step into water that may be live or work a breaker while standing in water; treat every flooded device as live. Work in pairs.",
		ruleElectrical)
	if ctx.OpenEdge {
		b.add(SectionHazard, "hazard.edge",
			"Guard or barricade the open edge; wear a personal flotation device where there is a drowning risk and keep a ring buoy with line at hand; keep vehicles back from soft edges.",
			"Never work alone near water. A large-bore intake can trap a person or animal: keep people out of the water near it.",
			ruleWater)
	}
	if h.Fuel() {
		cls := ""
		if h.FlammableClass != "" {
			cls = " (NFPA 30 class " + h.FlammableClass + ")"
		}
		caution := "Whether a hose siphon may be used for this liquid at a workplace is a question for the employer and the local fire code; some rules forbid gravity dispensing from drums."
		if !h.Flammable {
			caution += " A combustible liquid handled within about 9 °C of its flash point is treated as flammable."
		}
		b.add(SectionHazard, "hazard.fuel",
			"Note the liquid's flammability"+cls+" and confirm the transfer method is allowed for it.",
			caution, ruleFlammable)
	}
	if h.Toxic {
		caution := "Avoid breathing vapour; work upwind or with ventilation."
		if h.Volatile {
			caution += " The vapour is heavier than air and gathers in pits and low ground."
		}
		b.add(SectionHazard, "hazard.toxic",
			"Wear the protective equipment the safety data sheet calls for (gloves, eye protection; respiratory protection if it says so).",
			caution, "the liquid's safety data sheet")
	}
	if h.Biohazard {
		b.add(SectionHazard, "hazard.ppe.sewage",
			"Put on PPE for sewage: goggles, face mask or splash shield, fluid-resistant coveralls, waterproof gloves and rubber boots; cover any cuts.",
			"No eating, drinking or smoking at the work area.", ruleSewage)
	}
	if h.Hot {
		b.add(SectionHazard, "hazard.hot",
			"Hot liquid: wear insulated gloves and a face shield, and keep hands clear of the hose ends while starting.",
			"Hot liquid lowers the crest limit; expect air at the crest.", rulePractice)
	}
	switch ctx.Discharge {
	case DischargeContainer:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the receiving container or truck and who takes the liquid away; record the hauler or destination.",
			deferLocal, rulePractice)
		b.needNote()
	case DischargeSewer:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the sewer utility allows this discharge to the sanitary sewer; record the approval.",
			"Many sewer-use ordinances forbid stormwater, groundwater or oily water in the sanitary sewer without the utility's approval. "+deferLocal,
			ruleSewer)
		b.needNote()
	case DischargeStorm:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the discharge to the storm drain or ground is allowed (permit, allowed category or site plan); record the authorisation.",
			"Anything that is not stormwater may be an illicit discharge; chlorinated water is dechlorinated first. "+deferLocal,
			ruleStormwater)
		b.needNote()
	case DischargeSameSite:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm where on site the liquid will go and that it cannot run onto neighbours, roads or back into the source.",
			deferLocal, rulePractice)
	default:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm where the liquid is allowed to go and who authorised it; record the authorisation.",
			deferLocal, rulePractice)
	}

	// ---- Set-up (field-practice §3.3, §3.7, §3.8, §3.9, §4.2).
	b.add(SectionSetup, "setup.route",
		"Lay the hose on a steady rise to the crest and a steady fall to the outlet, with no humps; check every joint is airtight and the hose is rated for suction.",
		"Lay-flat discharge hose flattens under suction.", rulePractice)
	b.add(SectionSetup, "setup.intake",
		"Place the intake below the surface with margin, screened, clear of sludge and floating oil; weight it so it stays submerged.",
		"", rulePractice)
	b.add(SectionSetup, "setup.outlet",
		"Secure the discharge end: tie it down or weight it so it cannot leave the receiver or drain; keep people clear of the outlet while starting.",
		"A free hose end can jump and thrash when trapped air is expelled.", rulePractice)
	if ctx.Discharge == DischargeStorm || ctx.Discharge == DischargeSameSite {
		b.add(SectionSetup, "setup.outlet-protection",
			"Land the discharge on a stable surface (splash pad, riprap, filter bag or vegetated ground), not bare soil or a bank.",
			"Turbid or sediment-laden water may need a filter bag or settling before discharge. "+deferLocal,
			ruleStormwater)
	}
	if h.Any() {
		b.add(SectionSetup, "setup.containment",
			"Set out containment and absorbents under the hose ends, joints and containers.",
			"", rulePractice)
	}
	if h.Biohazard {
		b.add(SectionSetup, "setup.hose.dedicated",
			"Use a hose kept for sewage work (or one to be disinfected afterwards); never use it later for drinking water.",
			"", ruleSewage)
	}
	if ctx.Receiver || ctx.Discharge == DischargeContainer {
		b.add(SectionSetup, "setup.receiver",
			"Check the receiver has room for the planned volume plus the hose contents, and stands lower than the source surface.",
			"", rulePractice)
	}
	if h.Fuel() {
		b.add(SectionSetup, "setup.containers",
			"Use containers listed for the liquid, standing on the ground (never on a truck-bed liner or carpet); keep the hose end in contact with the container and fill from the bottom.",
			"Plastic containers cannot be grounded; their size for flammable liquids is limited.",
			ruleContainers)
		b.add(SectionSetup, "setup.bonding",
			"Bond the source and receiving containers together and ground one of them, with clamps biting through paint to bare metal, before opening either container.",
			"Flowing and splashing liquid builds static charge. "+deferLocal,
			ruleBonding)
		b.add(SectionSetup, "setup.ignition",
			"Remove ignition sources: no smoking, flames, pilot lights or non-rated electrical equipment; work outdoors or ventilated; disconnect vehicle or boat batteries on fuel systems; keep a Class B extinguisher and absorbents at hand.",
			deferLocal, ruleFlammable)
	}
	if h.FreezingRisk {
		b.add(SectionSetup, "setup.freezing",
			"Freezing weather: check for ice on banks and in the hose, and plan to drain the hose fully at the stop so it cannot freeze solid.",
			"", rulePractice)
	}
	if h.Environmental {
		b.add(SectionSetup, "setup.inspect-before",
			"Before any release, inspect the liquid for sheen, odour of product or discoloration; record the result, time and initials in the note.",
			"If any sheen, odour or discoloration is seen, do not release: record it and collect the liquid for proper disposal. The facility's plan or permit governs.",
			ruleSheen)
		b.needNote()
	}

	if ctx.Held() {
		b.heldSteps(ctx)
		return Checklist{Context: ctx, Steps: b.steps}
	}

	// ---- Prime (field-practice §2).
	b.add(SectionPrime, "prime.no-mouth",
		"Prime only by the method below. Never start a siphon by mouth suction.",
		"Fuel, sewage and chemicals drawn into the mouth can be inhaled into the lungs; this can be fatal hours later.",
		"poison-centre warnings; common practice")
	if h.Fuel() {
		b.add(SectionPrime, "prime.no-pressure",
			"Do not pressurise the source container to start the flow (no blowing into it, no air pressure on a drum).",
			"Workplace codes for flammable liquids forbid transfer by air pressure on the container.",
			ruleFlammable)
	}
	if why := methodUnsuited(ctx.Method, h); why != "" {
		b.add(SectionPrime, "prime.method-unsuited",
			"The chosen method ("+ctx.Method.Label()+") is not suited to "+why+": choose another method before priming.",
			"", "presets catalogue (priming methods); common practice")
	}
	b.primeSteps(ctx)

	// ---- Run and watch (field-practice §2.9, §3.1, §3.8, §4.3).
	b.add(SectionRun, "run.start",
		"Record the time flow started and confirm steady flow at the outlet.",
		"", rulePractice)
	attend := ""
	if h.Fuel() {
		attend = "Never leave a fuel transfer: an overflowing container is a fire hazard."
	}
	b.add(SectionRun, "run.attend",
		"Stay with the siphon while it runs.", attend, rulePractice)
	b.add(SectionRun, "run.levels",
		"Read the source level at intervals and enter each reading with its time.",
		"", rulePractice)
	b.add(SectionRun, "run.air",
		"Watch for air at the crest and falling flow (gurgling, a spurting or sagging outlet stream); bleed the crest or re-prime if flow sags.",
		"", rulePractice)
	if ctx.ConfinedSpace {
		b.add(SectionRun, "run.atmosphere",
			"Keep monitoring the atmosphere from outside while the level falls.",
			"Lowering the liquid or stirring sludge can release hydrogen sulfide and other gases.",
			ruleConfined)
	}
	if h.Environmental {
		b.add(SectionRun, "run.sheen",
			"Watch the discharge for sheen, odour or discoloration; if any appears, stop at once, record it and collect the liquid.",
			"A sheen on the water is a reportable discharge of oil. The facility's plan or permit governs.",
			ruleSheen)
	}
	if ctx.Receiver || ctx.Discharge == DischargeContainer {
		b.add(SectionRun, "run.receiver",
			"Watch the receiver level and stop before it is full (leave room for the hose contents).",
			"", rulePractice)
	}
	b.add(SectionRun, "run.stop-before",
		"Stop before the intake uncovers or reaches sludge or a floating oil layer.",
		"", rulePractice)

	// ---- Stop and drain the hose (field-practice §2.9).
	switch ctx.Method {
	case PrimeCrestPort, PrimeVacuum:
		b.add(SectionStop, "stop.break",
			"Stop the flow: close the outlet valve slowly, or open the crest vent so the column splits and each leg drains back.",
			"A fast valve closure on a long rigid line causes a pressure surge (water hammer) that can split couplings.",
			rulePractice)
	default:
		b.add(SectionStop, "stop.break",
			"Stop the flow: lift the intake clear of the liquid so the hose runs out into the receiver, or raise the outlet above the source surface so the hose contents run back.",
			"Lift the intake only if the receiver has room for the hose contents.", rulePractice)
	}
	b.add(SectionStop, "stop.record",
		"Record the stop time and the source level.", "", rulePractice)
	drain := "Drain the hose into the receiver or back into the source."
	drainCaution := ""
	if h.Any() {
		drainCaution = "Never drain oily, sewage or chemical liquid onto the ground or into a drain."
	}
	if h.FreezingRisk {
		drain += " Drain it completely so it cannot freeze."
	}
	b.add(SectionStop, "stop.drain-hose", drain, drainCaution, rulePractice)
	capText := "Cap or plug both hose ends before moving the hose."
	switch {
	case h.Fuel():
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for fuel."
	case h.Biohazard:
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for sewage."
	}
	b.add(SectionStop, "stop.cap", capText, "", rulePractice)
	if h.Fuel() {
		b.add(SectionStop, "stop.unbond",
			"Keep the transfer bonded until the hose is drained and capped; then remove the bonding clamps.",
			"", ruleBonding)
	}

	// ---- Close out (field-practice §2.9, §3.4, §3.8, §5).
	if h.Environmental {
		b.add(SectionCloseOut, "closeout.inspect",
			"Inspect the discharge point for sheen, discoloration, turbidity and erosion; record what you saw, with times, for the discharge record.",
			"Keep the record as the facility's plan or permit requires (SPCC inspection records: three years).",
			ruleSPCC)
		b.needNote()
		b.add(SectionCloseOut, "closeout.reseal",
			"Close and reseal any containment drain valve that was used; record the time.",
			"", ruleSPCC)
	}
	if h.Biohazard {
		b.add(SectionCloseOut, "closeout.decon",
			"Clean and disinfect the hose, tools and boots; wash hands before eating, drinking or smoking; change out of work clothes before leaving.",
			"", ruleSewage)
	}
	if h.Fuel() {
		b.add(SectionCloseOut, "closeout.store",
			"Store the drained hose and containers in a ventilated, approved place.",
			deferLocal, ruleFlammable)
	}
	if h.Any() || ctx.Discharge == DischargeContainer {
		b.add(SectionCloseOut, "closeout.disposal",
			"Record how the collected liquid, absorbents and rinse water were handled (hauler, drums, manifest).",
			deferLocal, rulePractice)
	}
	if ctx.ConfinedSpace {
		b.add(SectionCloseOut, "closeout.permit",
			"Close the entry permit; note any problems on it and keep it as the site program requires.",
			"Cancelled permits are kept at least one year for program review.", ruleConfined)
	}
	b.add(SectionCloseOut, "closeout.volume",
		"Record the final level and the volume discharged.", "", rulePractice)
	b.add(SectionCloseOut, "closeout.signoff",
		"Sign off: name or initials of who did the work and of the supervisor.",
		"This record does not authorise a discharge.", rulePractice)

	return Checklist{Context: ctx, Steps: b.steps}
}

// heldSteps replaces the prime, run and release steps when a sheen was seen:
// do not release, stop a running siphon, record, collect, notify as the plan
// requires (field-practice §3.8; 40 CFR 110 and 112.8(c)(3)).
func (b *builder) heldSteps(ctx ChecklistContext) {
	b.add(SectionPrime, "hold.no-release",
		"Sheen, odour or discoloration recorded: do not release this liquid to the "+ctx.Discharge.Label()+". Do not prime; if a siphon is running, stop it now.",
		"Detergents or dispersants are not a fix: they hide oil and are themselves prohibited. The facility's plan or permit governs.",
		ruleSheen)
	b.add(SectionStop, "hold.record",
		"Record what was seen (sheen, odour, colour), where and when; take photos with time stamps.",
		"", ruleSPCC)
	b.needNote()
	b.add(SectionStop, "hold.notify",
		"Make the notifications the facility's plan or permit requires, and record who was told and when.",
		"A sheen reaching waters or shorelines is a reportable discharge of oil. "+deferLocal, ruleSheen)
	b.add(SectionCloseOut, "hold.collect",
		"Arrange collection for proper disposal (drums or a vacuum truck) and record the hauler and manifest.",
		deferLocal, ruleSPCC)
	b.needNote()
	b.add(SectionCloseOut, "closeout.reseal",
		"Close and reseal any containment drain valve; record the time.", "", ruleSPCC)
	b.add(SectionCloseOut, "closeout.signoff",
		"Sign off: name or initials of who did the work and of the supervisor.",
		"This record does not authorise a discharge.", rulePractice)
}

// primeSteps adds the steps of the chosen method (field-practice §2.1–§2.7).
func (b *builder) primeSteps(ctx ChecklistContext) {
	h := ctx.Hazards
	rated := ""
	if h.Fuel() {
		rated = "Hose, fittings and containers must be rated for the liquid; keep the transfer bonded."
	}
	switch ctx.Method {
	case PrimeSubmerge:
		hands := ""
		if h.Any() {
			hands = "Hands and arms go into the liquid: wear the PPE its hazards call for."
		}
		b.add(SectionPrime, "prime.submerge.fill",
			"Lay the whole hose in the source and work the air out until it is full (a full hose is noticeably heavier).",
			hands, rulePractice)
		b.add(SectionPrime, "prime.submerge.close",
			"While it is still submerged, close one end with a cap, plug or valve.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.weight",
			"Keep the open end under the surface; weight it a short way back without pinching the hose.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.carry",
			"Carry the closed end over the rim, keeping it closed, and lay it at the outlet point below the source surface.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.open",
			"Open the closed end and stand clear; it may gurgle before the flow settles.", "", rulePractice)
	case PrimeSupplyFill:
		caution := "Never leave the hose connected to the tap with its other end in the liquid: a pressure drop can draw the liquid back into the drinking-water supply. Keep an air gap or use a hose vacuum breaker."
		if h.Any() {
			caution += " Only water primes this way; adding water to a fuel or chemical job is usually wrong — choose another method."
		}
		b.add(SectionPrime, "prime.supply.cap",
			"Fit a closable nozzle or cap on one end of the hose.", "", rulePractice)
		b.add(SectionPrime, "prime.supply.fill",
			"Fill the hose from a clean tap or bucket, close the nozzle, then take the hose off the supply, keeping the open end up.",
			caution, ruleBackflow)
		b.add(SectionPrime, "prime.supply.place",
			"Take the capped end to the discharge point and lower the open end into the source.", "", rulePractice)
		b.add(SectionPrime, "prime.supply.open",
			"Open the cap and stand clear of the outlet.", "", rulePractice)
	case PrimeCrestPort:
		b.add(SectionPrime, "prime.crest.fit",
			"Fit a valve at the foot of the outlet leg, a closable fill port at the crest, and a valve or one-way valve at the intake.",
			"Without a one-way intake valve two people are needed.", rulePractice)
		b.add(SectionPrime, "prime.crest.close",
			"Close the outlet valve and the intake closure.", "", rulePractice)
		b.add(SectionPrime, "prime.crest.fill",
			"Pour or pump water into the crest port until both legs are full and no more air comes out.",
			"Use clean water; a potable supply needs an air gap or backflow preventer.", ruleBackflow)
		b.add(SectionPrime, "prime.crest.cap",
			"Cap the crest port airtight.", "", rulePractice)
		b.add(SectionPrime, "prime.crest.open",
			"Open the intake, then open the outlet valve; flow starts within seconds.", "", rulePractice)
	case PrimeHandPump:
		pump := "Squeeze the bulb or work the pump until liquid passes the crest and the line is full; hold a bulb with its flow arrow pointing up."
		if ctx.Strokes > 0 {
			pump += " Expect about " + strconv.Itoa(ctx.Strokes) + " strokes to fill the hose."
		}
		b.add(SectionPrime, "prime.pump.place",
			"Put the intake in the source clear of sludge (and of settled water under fuel, unless that water is what is being removed) and the outlet in the receiver, lower than the source surface.",
			rated, rulePractice)
		b.add(SectionPrime, "prime.pump.close",
			"Close or pinch the outlet end if the pump design needs it.", "", rulePractice)
		b.add(SectionPrime, "prime.pump.stroke", pump, "", rulePractice)
		b.add(SectionPrime, "prime.pump.release",
			"Release the outlet; the flow continues by itself.", "", rulePractice)
	case PrimeShakeValve:
		b.add(SectionPrime, "prime.shake.outlet",
			"Put the outlet end in the receiver, lower than the source surface.", rated, rulePractice)
		b.add(SectionPrime, "prime.shake.lower",
			"Lower the valve end into the liquid, deep enough to stroke without drawing air.", "", rulePractice)
		b.add(SectionPrime, "prime.shake.stroke",
			"Shake with short, vigorous strokes until the flow is established.", "", rulePractice)
		b.add(SectionPrime, "prime.shake.rest",
			"Rest the valve end above the bottom sediment, kept submerged.", "", rulePractice)
	case PrimeVacuum:
		b.add(SectionPrime, "prime.vacuum.close",
			"Close the outlet valve and keep the intake submerged.", "", rulePractice)
		b.add(SectionPrime, "prime.vacuum.connect",
			"Connect the vacuum pump to the crest port with a liquid trap in front of the pump.", rated, rulePractice)
		b.add(SectionPrime, "prime.vacuum.draw",
			"Draw air out until liquid fills the intake leg, the crest and the outlet leg.", "", rulePractice)
		b.add(SectionPrime, "prime.vacuum.open",
			"Close the crest port, then open the outlet valve slowly.", "", rulePractice)
	case PrimePumpStart:
		caution := "Start the pump gradually: a hose under pump pressure can whip."
		if h.Fuel() {
			caution += " The pump must be rated for the liquid and its vapour."
		}
		b.add(SectionPrime, "prime.pumpstart.connect",
			"Connect a pump so it pushes liquid from the source through the hose and out of the discharge end.",
			caution, rulePractice)
		b.add(SectionPrime, "prime.pumpstart.run",
			"Run the pump until liquid flows steadily from the far end.", "", rulePractice)
		b.add(SectionPrime, "prime.pumpstart.stop",
			"Keeping the intake submerged, stop the pump and close or disconnect its branch without letting air in.",
			"Air let in at this moment kills the start.", rulePractice)
		b.add(SectionPrime, "prime.pumpstart.confirm",
			"Confirm flow at the discharge end before leaving the pump.", "", rulePractice)
	default:
		b.add(SectionPrime, "prime.choose",
			"Choose a priming method for this job.", "", rulePractice)
	}
}

// methodUnsuited names the hazard that rules the method out, or "": the
// same rules as the presets catalogue's priming entries (submerge-and-cap is
// not for flammable or volatile liquids — hands in the liquid, vapour at the
// face; filling from a supply adds water to a fuel job).
func methodUnsuited(m PrimingMethod, h Hazards) string {
	switch m {
	case PrimeSubmerge:
		if h.Flammable {
			return "a flammable liquid"
		}
		if h.Volatile {
			return "a volatile liquid"
		}
	case PrimeSupplyFill:
		if h.Flammable || h.Combustible {
			return "a fuel (it adds water to the job)"
		}
	default: // the other methods suit every liquid
	}
	return ""
}

type builder struct{ steps []Step }

func (b *builder) add(sec Section, id, text, caution, rule string) {
	b.steps = append(b.steps, Step{ID: id, Section: sec, Text: text, Caution: caution, Rule: rule, State: StatePending})
}

// needNote marks the last added step as needing a note to be done.
func (b *builder) needNote() { b.steps[len(b.steps)-1].NoteRequired = true }

// ErrUnknownStep is returned by Mark for an ID not in the checklist.
var ErrUnknownStep = errors.New("no such checklist step")

// ErrReasonRequired is returned by Mark when a step is skipped without a
// reason.
var ErrReasonRequired = errors.New("a reason is required to skip a step")

// ErrNoteRequired is returned by Mark when a step that asks for a recorded
// fact is marked done without a note.
var ErrNoteRequired = errors.New("this step is done only with its reading or reference in the note")

// WithSheen rebuilds the checklist with the sheen flag set or cleared (see
// ChecklistContext.SheenSeen), keeping every mark.
func (c Checklist) WithSheen(seen bool) Checklist {
	ctx := c.Context
	ctx.SheenSeen = seen
	return c.Rebuild(ctx)
}

// Index returns the position of the step with this ID, or -1.
func (c *Checklist) Index(id string) int {
	for i := range c.Steps {
		if c.Steps[i].ID == id {
			return i
		}
	}
	return -1
}

// Mark sets the state of step id at time at (from the caller's clock).
//
//   - StateSkipped needs a non-blank reason.
//   - StateDone on a step with NoteRequired needs a note (given now or
//     already on the step).
//   - StateDone, StateSkipped and StateNotApplicable need a non-zero time.
//   - StatePending undoes a mark: the time and reason are cleared.
//
// A non-empty note replaces the step's note; an empty note keeps it. On error
// the checklist is unchanged.
func (c *Checklist) Mark(id string, state StepState, reason, note string, at time.Time) error {
	i := c.Index(id)
	if i < 0 {
		return fmt.Errorf("checklist step %q: %w", id, ErrUnknownStep)
	}
	if !state.Valid() {
		return fmt.Errorf("checklist step %q: state %q is not one of pending, done, skipped, n/a", id, state)
	}
	reason = strings.TrimSpace(reason)
	if state == StateSkipped && reason == "" {
		return fmt.Errorf("checklist step %q: %w", id, ErrReasonRequired)
	}
	if state == StateDone && c.Steps[i].NoteRequired && strings.TrimSpace(note) == "" && strings.TrimSpace(c.Steps[i].Note) == "" {
		return fmt.Errorf("checklist step %q: %w", id, ErrNoteRequired)
	}
	if state != StatePending && at.IsZero() {
		return fmt.Errorf("checklist step %q: a time is required to mark it %s", id, state.Label())
	}
	s := &c.Steps[i]
	s.State = state
	if state == StatePending {
		s.At = time.Time{}
		s.Reason = ""
	} else {
		s.At = at
		s.Reason = reason
	}
	if strings.TrimSpace(note) != "" {
		s.Note = note
	}
	return nil
}

// SetNote replaces the note of step id without changing its state.
func (c *Checklist) SetNote(id, note string) error {
	i := c.Index(id)
	if i < 0 {
		return fmt.Errorf("checklist step %q: %w", id, ErrUnknownStep)
	}
	c.Steps[i].Note = note
	return nil
}

// CurrentIndex is the index of the first pending step, or -1 when none is
// left.
func (c *Checklist) CurrentIndex() int {
	for i := range c.Steps {
		if c.Steps[i].State == StatePending || c.Steps[i].State == "" {
			return i
		}
	}
	return -1
}

// Current returns the first pending step and true, or false when every step
// is marked.
func (c *Checklist) Current() (Step, bool) {
	i := c.CurrentIndex()
	if i < 0 {
		return Step{}, false
	}
	return c.Steps[i], true
}

// Progress counts steps by state.
type Progress struct {
	Total, Pending, Done, Skipped, NotApplicable int
}

// Marked is the number of steps no longer pending.
func (p Progress) Marked() int { return p.Total - p.Pending }

// Progress counts the checklist's steps by state.
func (c *Checklist) Progress() Progress {
	p := Progress{Total: len(c.Steps)}
	for _, s := range c.Steps {
		switch s.State {
		case StateDone:
			p.Done++
		case StateSkipped:
			p.Skipped++
		case StateNotApplicable:
			p.NotApplicable++
		default:
			p.Pending++
		}
	}
	return p
}

// Rebuild builds the checklist for a changed context (another liquid or
// method) and carries over the state, time, reason and note of every step
// whose ID survives. Marked steps that no longer apply move to Dropped, and
// come back if a later context needs them again, so nothing recorded is lost.
// The text and caution always come from the new build.
func (c Checklist) Rebuild(ctx ChecklistContext) Checklist {
	next := BuildChecklist(ctx)
	old := make(map[string]Step, len(c.Steps)+len(c.Dropped))
	for _, s := range c.Dropped {
		old[s.ID] = s
	}
	for _, s := range c.Steps {
		old[s.ID] = s
	}
	kept := make(map[string]bool, len(next.Steps))
	for i := range next.Steps {
		s := &next.Steps[i]
		if o, ok := old[s.ID]; ok {
			s.State, s.At, s.Reason, s.Note = o.State, o.At, o.Reason, o.Note
			if !s.State.Valid() {
				s.State = StatePending
			}
			kept[s.ID] = true
		}
	}
	for _, list := range [][]Step{c.Steps, c.Dropped} {
		for _, s := range list {
			if kept[s.ID] || (s.State == StatePending && s.Note == "") {
				continue
			}
			kept[s.ID] = true
			next.Dropped = append(next.Dropped, s)
		}
	}
	return next
}
