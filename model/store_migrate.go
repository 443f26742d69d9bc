package model

import (
	"encoding/json"
	"fmt"
	"strconv"
	"strings"

	"drawdown/presets"
)

// migrations[v] turns a version-v file into a version-(v+1) one, working on
// the top-level JSON entries. When the format changes, bump JobVersion, add
// the step here and keep a fixture of the old version in testdata so that
// the step stays tested (job-v0.json, job-v1.json, job-v2.json).
var migrations = map[int]func(map[string]json.RawMessage) error{
	0: func(map[string]json.RawMessage) error { return nil },
	1: migrateV1,
	// Version 3 only added entries (the draft, the journal mark): a
	// version-2 file reads as it is.
	2: func(map[string]json.RawMessage) error { return nil },
}

// migrate applies the steps from version v up to JobVersion and returns the
// updated JSON.
func migrate(raw map[string]json.RawMessage, v int) ([]byte, error) {
	for ; v < JobVersion; v++ {
		step, ok := migrations[v]
		if !ok {
			return nil, fmt.Errorf("no conversion from version %d", v)
		}
		if err := step(raw); err != nil {
			return nil, err
		}
	}
	raw["version"] = json.RawMessage(strconv.Itoa(JobVersion))
	return json.Marshal(raw)
}

// Version 0 never had a shape of its own: a file that says 0 was written in
// the version-1 shape (testdata/job-v0.json is one), so its step changes
// nothing.

// v1Hazards is the version-1 hazard object: a struct of booleans and the
// NFPA 30 class as text.
type v1Hazards struct {
	Flammable      bool   `json:"flammable"`
	FlammableClass string `json:"flammable_class"`
	Combustible    bool   `json:"combustible"`
	Biohazard      bool   `json:"biohazard"`
	Environmental  bool   `json:"environmental"`
	Hot            bool   `json:"hot"`
	FreezingRisk   bool   `json:"freezing_risk"`
	Toxic          bool   `json:"toxic"`
	Volatile       bool   `json:"volatile"`
}

func (h v1Hazards) or(o v1Hazards) v1Hazards {
	h.Flammable, h.Combustible, h.Biohazard = h.Flammable || o.Flammable, h.Combustible || o.Combustible, h.Biohazard || o.Biohazard
	h.Environmental, h.Hot, h.FreezingRisk = h.Environmental || o.Environmental, h.Hot || o.Hot, h.FreezingRisk || o.FreezingRisk
	h.Toxic, h.Volatile = h.Toxic || o.Toxic, h.Volatile || o.Volatile
	if h.FlammableClass == "" {
		h.FlammableClass = o.FlammableClass
	}
	return h
}

func (h v1Hazards) set() presets.Hazards {
	var s presets.Hazards
	for _, t := range []struct {
		on  bool
		tag presets.Hazard
	}{{h.Flammable, presets.Flammable}, {h.Combustible, presets.Combustible}, {h.Volatile, presets.Volatile},
		{h.Toxic, presets.Toxic}, {h.Biohazard, presets.Biohazard}, {h.Environmental, presets.Environmental},
		{h.Hot, presets.Hot}, {h.FreezingRisk, presets.FreezingRisk}} {
		if t.on {
			s = s.With(t.tag)
		}
	}
	return s
}

// v1Context is the version-1 checklist context, where the crew's site facts
// and two hazard objects (the liquid's and the crew's extra ones) lived.
type v1Context struct {
	Liquid        string    `json:"liquid"`
	Hazards       v1Hazards `json:"hazards"`
	Method        string    `json:"method"`
	ConfinedSpace bool      `json:"confined_space"`
	OpenEdge      bool      `json:"open_edge"`
	Discharge     string    `json:"discharge"`
	Receiver      bool      `json:"receiver"`
	Strokes       int       `json:"strokes"`
	ExtraHazards  v1Hazards `json:"extra_hazards"`
	SheenSeen     bool      `json:"sheen_seen"`
}

// migrateV1 brings a version-1 file to version 2:
//
//   - the crew's site facts move out of checklist.context into site_facts
//     (confined_space; open_edge becomes open_water; discharge, where
//     "same-site" becomes "storm", storm drain or ground; sheen_seen);
//   - the two hazard objects become one set of catalogue codes; an
//     environmental tag on a liquid that is neither a fuel nor sewage
//     becomes the site fact may_carry_oil (the only way version 1 could say
//     that water may carry oil);
//   - the crew text ("A. Marsh (lead), T. Okoro") becomes a list of names
//     with roles.
//
// The context left in the file is only a record; the next compute derives
// it again (ContextFor).
func migrateV1(raw map[string]json.RawMessage) error {
	if c, ok := raw["crew"]; ok {
		var text string
		if err := json.Unmarshal(c, &text); err != nil {
			return fmt.Errorf(`the "crew" entry is not text`)
		}
		b, err := json.Marshal(parseCrewText(text))
		if err != nil {
			return err
		}
		raw["crew"] = b
	}
	cl, ok := raw["checklist"]
	if !ok || string(cl) == "null" {
		return nil
	}
	var checklist map[string]json.RawMessage
	if err := json.Unmarshal(cl, &checklist); err != nil {
		return fmt.Errorf(`the "checklist" entry is not an object`)
	}
	var old v1Context
	if c, ok := checklist["context"]; ok {
		if err := json.Unmarshal(c, &old); err != nil {
			return fmt.Errorf(`the checklist's "context" entry does not read: %v`, err)
		}
	}
	hz := old.Hazards.or(old.ExtraHazards)
	facts := SiteFacts{ConfinedSpace: old.ConfinedSpace, OpenWater: old.OpenEdge, SheenSeen: old.SheenSeen,
		MayCarryOil: hz.Environmental && !hz.Flammable && !hz.Combustible && !hz.Biohazard}
	switch old.Discharge {
	case "storm", "same-site":
		facts.Discharge = DischargeStorm
	case "sewer":
		facts.Discharge = DischargeSewer
	case "container":
		facts.Discharge = DischargeContainer
	}
	ctx := ChecklistContext{SiteFacts: facts, Liquid: old.Liquid, Hazards: hz.set(), Method: PrimingMethod(old.Method),
		Transfer: old.Receiver || facts.Discharge == DischargeContainer, Figures: StepFigures{Strokes: old.Strokes}}
	for k := presets.ClassIA; k <= presets.ClassIIIB; k++ {
		if strings.EqualFold(hz.FlammableClass, k.String()) {
			ctx.Class = k
		}
	}
	b, err := json.Marshal(ctx)
	if err != nil {
		return err
	}
	checklist["context"] = b
	if raw["checklist"], err = json.Marshal(checklist); err != nil {
		return err
	}
	if raw["site_facts"], err = json.Marshal(facts); err != nil {
		return err
	}
	return nil
}

// parseCrewText splits version-1 crew text into people: entries separated
// by commas or semicolons, each "Name (role)" or just "Name".
func parseCrewText(text string) []CrewMember {
	var out []CrewMember
	for _, part := range strings.FieldsFunc(text, func(r rune) bool { return r == ',' || r == ';' }) {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		c := CrewMember{Name: part}
		if i := strings.LastIndex(part, "("); i > 0 && strings.HasSuffix(part, ")") {
			c.Name, c.Role = strings.TrimSpace(part[:i]), strings.TrimSpace(part[i+1:len(part)-1])
		}
		out = append(out, c)
	}
	return out
}
