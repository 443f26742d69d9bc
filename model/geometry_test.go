package model

import (
	"errors"
	"strings"
	"testing"

	"drawdown/calc"
	"drawdown/presets"
)

// TestGeometryConsistent: sizes that contradict each other are refused on
// the field to blame, with the accepted range in the job's units: a cone
// taller than its tank (the cone is part of the height, floor to brim), a
// target level not below the liquid level, a liquid level above the tank.
func TestGeometryConsistent(t *testing.T) {
	cone := func(sys System, h, c, level string) Job {
		j := DemoJob()
		j.Units = sys
		j.Inputs[FieldTankShape] = "cone-bottom"
		j.Inputs[FieldTankDiameter] = "2 m"
		j.Inputs[FieldTankHeight] = h
		j.Inputs[FieldTankCone] = c
		j.Inputs[FieldTankLevel] = level
		return j
	}
	cases := []struct {
		name string
		job  Job
		id   FieldID
		says string
	}{
		{"cone taller than the tank", cone(SI, "2 m", "3 m", "1 m"), FieldTankCone, "is taller than the tank (2.00 m floor to brim)"},
		{"cone taller, US", cone(US, "6 ft", "7 ft", "3 ft"), FieldTankCone, "is taller than the tank (6 ft floor to brim)"},
		{"target not below the level", func() Job { j := DemoJob(); j.Inputs[FieldTankTarget] = "0.5 m"; return j }(), FieldTankTarget, "is not below the liquid level"},
		{"level above the tank", func() Job { j := DemoJob(); j.Inputs[FieldTankLevel] = "1.2 m"; return j }(), FieldTankLevel, "is above the tank height"},
	}
	for _, c := range cases {
		p := Compute(c.job, presets.Builtin())
		err := p.FieldErrors[c.id]
		if err == nil {
			t.Errorf("%s: no error on %s (errors %v)", c.name, c.id, p.FieldErrors)
			continue
		}
		if !strings.Contains(err.Error(), c.says) || !errors.Is(err, calc.ErrGeometry) {
			t.Errorf("%s: %v", c.name, err)
		}
		t.Logf("%-28s → %v", c.name, err)
	}
	// A cone as tall as its tank is a whole cone: accepted.
	if p := Compute(cone(SI, "2 m", "2 m", "1 m"), presets.Builtin()); p.FieldErrors[FieldTankCone] != nil {
		t.Errorf("a cone as tall as the tank: %v", p.FieldErrors[FieldTankCone])
	}
}
