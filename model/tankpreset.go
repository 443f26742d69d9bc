package model

import (
	"sort"
	"strconv"
	"strings"

	"drawdown/presets"
)

// tankSizeFields maps a catalogue tank's size names to the job's fields.
var tankSizeFields = map[string]FieldID{
	"diameter":    FieldTankDiameter,
	"length":      FieldTankLength,
	"width":       FieldTankWidth,
	"height":      FieldTankHeight,
	"cone-height": FieldTankCone,
	"side-slope":  FieldTankSlope,
}

// ApplyTankPreset fills the tank shape and sizes from a catalogue tank and
// records which one in FieldTankPreset. Sizes the template does not have
// are cleared; the liquid level and target are the technician's and are
// left alone. Sizes are written in metres with their unit, so they read
// the same in either unit system. A tank the catalogue flags as a confined
// space pre-sets the job's confined-space fact (the crew may clear it).
func (j *Job) ApplyTankPreset(t presets.TankTemplate) {
	j.Set(FieldTankPreset, t.ID)
	if t.ConfinedSpace {
		j.Facts.ConfinedSpace = true
	}
	j.Set(FieldTankShape, t.Shape)
	for name, id := range tankSizeFields {
		v, ok := t.Size(name)
		switch {
		case !ok:
			j.Set(id, "")
		case name == "side-slope":
			j.Set(id, strconv.FormatFloat(v, 'g', 6, 64))
		default:
			j.Set(id, strconv.FormatFloat(v, 'g', 6, 64)+" m")
		}
	}
}

// TankSizesText lists the tank shape and sizes as typed ("tank.shape=…,
// tank.length=…"), for the log before a catalogue tank replaces them; ""
// when none are set.
func (j Job) TankSizesText() string {
	var parts []string
	for _, id := range tankSizeFields {
		if t := strings.TrimSpace(j.Inputs[id]); t != "" {
			parts = append(parts, string(id)+"="+t)
		}
	}
	sort.Strings(parts)
	if t := strings.TrimSpace(j.Inputs[FieldTankShape]); t != "" {
		parts = append([]string{string(FieldTankShape) + "=" + t}, parts...)
	}
	return strings.Join(parts, ", ")
}
