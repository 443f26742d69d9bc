package model

import (
	"errors"
	"strings"
	"testing"
	"time"

	"drawdown/calc"
	"drawdown/calc/testkit"
	"drawdown/presets"
)

var t0 = time.Date(2026, 5, 1, 8, 0, 0, 0, time.UTC)

func TestJobSetKeepsText(t *testing.T) {
	j := NewJob("test", SI, t0)
	// Wrong text is stored anyway: nothing typed is lost (design §2).
	err := j.Set(FieldHoseID, "0")
	if err == nil || err.Error() != "Hose inside diameter: 0 mm is out of range; accepted 3 to 600 mm" {
		t.Errorf("Set(hose.id, 0) = %v", err)
	}
	if j.Text(FieldHoseID) != "0" {
		t.Errorf("text lost: %q", j.Text(FieldHoseID))
	}
	if err := j.Set(FieldHoseID, "3/4 in"); err != nil {
		t.Errorf("Set 3/4 in: %v", err)
	}
	// 3/4 in = 19.05 mm, exact inch (NIST SP 811 App. B.8).
	if v, err := j.Value(FieldHoseID); err != nil || !testkit.Within(v, 0.01905, 1e-12) {
		t.Errorf("Value = %g, %v", v, err)
	}
	if err := j.Set(FieldHoseID, "abc"); err == nil || !strings.HasPrefix(err.Error(), "Hose inside diameter: cannot read \"abc\"") {
		t.Errorf("Set abc: %v", err)
	}
	if j.Text(FieldHoseID) != "abc" {
		t.Errorf("text lost: %q", j.Text(FieldHoseID))
	}
	if _, err := j.Value(FieldHoseID); err == nil {
		t.Error("Value(abc) accepted")
	}
	// Clearing a required field: removed, reported as not set.
	if err := j.Set(FieldHoseID, "  "); !errors.Is(err, ErrNotSet) {
		t.Errorf("clear: %v", err)
	}
	if j.Has(FieldHoseID) {
		t.Error("cleared field still set")
	}
	// Optional empty: fine; Value says not set.
	if err := j.Set(FieldBaro, ""); err != nil {
		t.Errorf("clear baro: %v", err)
	}
	if _, err := j.Value(FieldBaro); !errors.Is(err, ErrNotSet) {
		t.Errorf("Value(baro) empty: %v", err)
	}
	// Default used when empty (design §4: --intake-depth [0.3m]).
	if v, err := j.Value(FieldIntakeDepth); err != nil || v != 0.3 {
		t.Errorf("intake depth default = %g, %v", v, err)
	}
	if j.Choice(FieldLiquid) != "water" {
		t.Errorf("liquid default %q", j.Choice(FieldLiquid))
	}
	if err := j.Set("hose.colour", "red"); !errors.Is(err, ErrUnknownField) && (err == nil || !strings.Contains(err.Error(), "unknown field")) {
		t.Errorf("unknown field: %v", err)
	}
	if err := j.Set(FieldOutletSubmerged, "maybe"); !errors.Is(err, ErrNotAChoice) {
		t.Errorf("outlet maybe: %v", err)
	}
	// Catalogue pickers are checked with the catalogue, in the plan.
	if err := j.Set(FieldLiquid, "diesel"); err != nil {
		t.Errorf("liquid diesel: %v", err)
	}
	if err := j.Set(FieldHoseMaterial, ""); err != nil {
		t.Errorf("material cleared: %v", err)
	}
	if err := j.Set(FieldTankShape, "Rectangular"); err != nil {
		t.Errorf("tank shape: %v", err)
	}
}

func TestJobErrorsInJobUnits(t *testing.T) {
	j := NewJob("us", US, t0)
	err := j.Set(FieldLift, "50")
	// 15 m = 49.2 ft (exact foot, NIST SP 811 App. B.8).
	if err == nil || err.Error() != "Lift over crest: 50 ft is out of range; accepted −16.4 to 49.2 ft" {
		t.Errorf("US lift: %v", err)
	}
	errs := j.InputErrors()
	if len(errs) != 1 || errs[FieldLift] == nil {
		t.Errorf("InputErrors = %v", errs)
	}
}

func TestJobSetUnitsKeepsMeaning(t *testing.T) {
	j := NewJob("u", SI, t0)
	j.Set(FieldHoseID, "25")       // 25 mm
	j.Set(FieldLift, "1.5 m")      // has a unit: unchanged
	j.Set(FieldTemp, "15")         // 15 °C
	j.Set(FieldHoseCount, "2")     // plain number: unchanged
	j.Set(FieldHoseLength, "oops") // does not parse: unchanged
	before := map[FieldID]float64{}
	for _, id := range []FieldID{FieldHoseID, FieldLift, FieldTemp, FieldHoseCount} {
		before[id], _ = j.Value(id)
	}
	j.SetUnits(US)
	if j.Units != US {
		t.Fatal("units not switched")
	}
	for id, v := range before {
		got, err := j.Value(id)
		if err != nil || !testkit.Within(got, v, 1e-12) {
			t.Errorf("%s: %g before, %g (%v) after; text %q", id, v, got, err, j.Text(id))
		}
	}
	if j.Text(FieldHoseID) != "25 mm" || j.Text(FieldTemp) != "15 °C" || j.Text(FieldLift) != "1.5 m" ||
		j.Text(FieldHoseCount) != "2" || j.Text(FieldHoseLength) != "oops" {
		t.Errorf("texts after switch: %v", j.Inputs)
	}
}

func TestJobClone(t *testing.T) {
	j := DemoJob()
	c := j.Clone()
	c.Inputs[FieldLift] = "9 m"
	c.AddLog(t0, "x")
	if len(c.Checklist.Steps) > 0 {
		c.Checklist.Steps[0].Note = "changed"
		if j.Checklist.Steps[0].Note == "changed" {
			t.Error("clone shares checklist steps")
		}
	}
	if j.Inputs[FieldLift] == "9 m" || len(j.Log) != 0 {
		t.Error("clone shares inputs or log")
	}
}

func TestDemoJob(t *testing.T) {
	j := DemoJob()
	if errs := j.InputErrors(); errs != nil {
		t.Fatalf("demo input errors: %v", errs)
	}
	cat := presets.Builtin()
	for id := range j.Inputs {
		f, _ := FieldByID(id)
		if f.IsPicker() {
			if err := f.ValidateChoice(j.Inputs[id], cat); err != nil {
				t.Errorf("demo %s: %v", id, err)
			}
		}
	}
	// The demo must give a siphon that runs: lift well under the zero-flow
	// limit (p_atm − p_v)/(ρg) ≈ 10 m for cold water at sea level (common
	// practice; design §3), and a positive drop.
	lift, _ := j.Value(FieldLift)
	drop, _ := j.Value(FieldDrop)
	if !(lift < 5 && drop > 0) {
		t.Errorf("demo lift %g m, drop %g m", lift, drop)
	}
	level, _ := j.Value(FieldTankLevel)
	intake, _ := j.Value(FieldIntakeHeight)
	height, _ := j.Value(FieldTankHeight)
	if !(intake < level && level < height) {
		t.Errorf("demo intake %g, level %g, tank depth %g", intake, level, height)
	}
	if len(j.Checklist.Steps) == 0 {
		t.Error("demo has no checklist")
	}
	// The environmental discharge needs an inspection step (issue 6 §7).
	found := false
	for _, s := range j.Checklist.Steps {
		if strings.Contains(strings.ToLower(s.Text), "sheen") || strings.Contains(strings.ToLower(s.Text), "inspect") {
			found = true
		}
	}
	if !found {
		t.Error("demo checklist lacks a discharge inspection step")
	}
	if DemoJob().Created != j.Created {
		t.Error("demo not deterministic")
	}
}

func TestDemoRunsWithCalcLimit(t *testing.T) {
	// Zero-flow crest limit for the demo's water at 8 °C near sea level:
	// (p_atm − p_v)/(ρg) with p_atm = 101.325 kPa (USSA76 at 0 m; the demo's
	// 45 m lowers it by about 0.5 %), p_v ≈ 1.07 kPa and ρ ≈ 999.85 kg/m³
	// at 8 °C (IAPWS-IF97; values from memory) gives ≈ 10.2 m. The demo's
	// lift is a small fraction of it.
	limit := (101325.0 - 1073) / (999.85 * calc.StandardGravity)
	j := DemoJob()
	lift, _ := j.Value(FieldLift)
	if lift > 0.5*limit {
		t.Errorf("demo lift %g m too near the limit %g m", lift, limit)
	}
}
