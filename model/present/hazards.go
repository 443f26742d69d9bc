package present

import (
	"strings"

	"drawdown/model"
	"drawdown/presets"
)

// HazardWords names hazards in a word or two each, for a screen line
// ("flammable", "inspect before release"). Combustible is left out when
// flammable is there.
func HazardWords(h presets.Hazards) []string {
	var out []string
	add := func(on bool, w string) {
		if on {
			out = append(out, w)
		}
	}
	add(h.Has(presets.Flammable), "flammable")
	add(!h.Has(presets.Flammable) && h.Has(presets.Combustible), "combustible")
	add(h.Has(presets.Toxic), "toxic")
	add(h.Has(presets.Biohazard), "sewage/biohazard")
	// Environmental: water that may carry oil is inspected before it is
	// let go; a product harmful to water (a fuel, glycol) is never let go.
	product := h.Has(presets.Flammable) || h.Has(presets.Combustible) || h.Has(presets.Toxic)
	add(h.Has(presets.Environmental) && !product, "inspect before release")
	add(h.Has(presets.Environmental) && product, "keep out of drains and water")
	add(h.Has(presets.Hot), "hot")
	add(h.Has(presets.FreezingRisk), "may freeze")
	return out
}

// HazardLine is the one caution line a screen shows beside the answer, or
// "" when there are no hazards: the words, a pointer to the checklist, and
// the deferral to local rules.
func HazardLine(h presets.Hazards) string {
	w := HazardWords(h)
	if len(w) == 0 {
		return ""
	}
	return strings.Join(w, ", ") + ": see the checklist. " + presets.DeferLocalShort
}

// Cautions lists the cautions that go with a plan, for every reader: always
// the rule against starting by mouth, one line per hazard of the liquid at
// its temperature, the local-code question for a flammable liquid, the
// liquid's own note, and the hose wall's note when it cannot hold a vacuum.
// They defer to local codes and permits; they never declare anything safe.
func Cautions(p model.Plan) []string {
	out := []string{presets.NeverByMouth}
	for _, h := range p.Hazards.List() {
		out = append(out, capitalise(h.Description())+".")
	}
	if p.Hazards.Has(presets.Flammable) && !strings.Contains(p.Liquid.Note, "local-code") {
		out = append(out, presets.FlammableLocalCode)
	}
	if p.Liquid.Note != "" {
		out = append(out, Clean(p.Liquid.Note)) // a user's preset may carry it
	}
	if p.Material.Collapses {
		out = append(out, Clean(p.Material.Name)+" flattens under suction: a siphon's crest runs below atmospheric pressure. Use suction hose or solid-wall pipe.")
	}
	return out
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
