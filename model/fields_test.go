package model

import (
	"errors"
	"strings"
	"testing"

	"drawdown/calc"
	"drawdown/calc/testkit"
	"drawdown/presets"
)

// contractIDs are the field IDs agreed in the shared model contract; the UI
// and the command line refer to them by these strings.
var contractIDs = []FieldID{
	"hose.id", "hose.length", "hose.upleg", "hose.material", "hose.fittings", "hose.count",
	"hose.kminor", "hose.roughness", "lift", "drop", "intake.depth", "intake.height",
	"outlet.submerged", "liquid", "temp", "altitude", "baro", "density", "viscosity", "vapor",
	"tank.preset", "tank.shape", "tank.diameter", "tank.length", "tank.width", "tank.height", "tank.cone",
	"tank.slope", "tank.level", "tank.target", "priming.method", "pump.stroke", "tol.height",
	"receiver.shape", "receiver.diameter", "receiver.length", "receiver.width", "receiver.height",
	"receiver.cone-height", "receiver.side-slope", "receiver.floor", "receiver.level",
	"intake.kind", "max.flow", "outlet.k", // issue 11
	"tol.bore", "inflow.rain", "inflow.catchment", "inflow.rise", "inflow.seepage", "pump.rate", // issue 13
}

func TestFieldTable(t *testing.T) {
	seen := map[FieldID]bool{}
	for _, f := range Fields() {
		if seen[f.ID] {
			t.Errorf("%s listed twice", f.ID)
		}
		seen[f.ID] = true
		if f.Label == "" || f.Help == "" {
			t.Errorf("%s: label or help missing", f.ID)
		}
		if f.Pane < PaneHose || f.Pane > PaneTank {
			t.Errorf("%s: pane %v", f.ID, f.Pane)
		}
		if !f.IsPicker() && !(f.Min <= f.Max) {
			t.Errorf("%s: range %g..%g", f.ID, f.Min, f.Max)
		}
		if f.Default != "" && !f.IsPicker() {
			if _, err := f.Validate(f.Default, SI); err != nil {
				t.Errorf("%s: default %q does not validate: %v", f.ID, f.Default, err)
			}
		}
		if f.Default != "" && f.IsPicker() {
			if err := f.ValidateChoice(f.Default, presets.Builtin()); err != nil {
				t.Errorf("%s: default %q is not a choice: %v", f.ID, f.Default, err)
			}
		}
		if g, ok := FieldByID(f.ID); !ok || g.Label != f.Label {
			t.Errorf("FieldByID(%s) = %v, %v", f.ID, g.Label, ok)
		}
	}
	for _, id := range contractIDs {
		if !seen[id] {
			t.Errorf("contract field %s missing", id)
		}
	}
	if len(seen) != len(contractIDs) {
		t.Errorf("%d fields, contract has %d", len(seen), len(contractIDs))
	}
	if _, ok := FieldByID("nope"); ok {
		t.Error("FieldByID(nope) found")
	}
	if PaneHose.String() != "Hose" || PaneLift.String() != "Lift & outlet" || PaneLiquid.String() != "Liquid & site" || PaneTank.String() != "Tank" {
		t.Error("pane titles (design §5)")
	}
	n := 0
	for _, p := range Panes() {
		n += len(FieldsIn(p))
	}
	if n != len(Fields()) {
		t.Errorf("panes hold %d fields, table %d", n, len(Fields()))
	}
}

func TestFieldDefaultsFromDesign(t *testing.T) {
	// Defaults of the command line, design §4 (drawdown's own contract).
	cases := []struct {
		id   FieldID
		want float64
	}{
		{FieldTemp, 288.15},       // --temp [15C]
		{FieldAltitude, 0},        // --altitude [0m]
		{FieldIntakeDepth, 0.3},   // --intake-depth [0.3m]
		{FieldIntakeHeight, 0.05}, // --intake-height [0.05m]
		{FieldHoseCount, 1},       // --hoses [1]
		{FieldTolHeight, 0.03},    // height tolerance 3 cm (lead's brief)
	}
	for _, c := range cases {
		f, _ := FieldByID(c.id)
		v, err := f.Validate(f.Default, US)
		if err != nil || !testkit.Within(v, c.want, 1e-12) {
			t.Errorf("%s default %q → %g, %v; want %g", c.id, f.Default, v, err, c.want)
		}
	}
	if f, _ := FieldByID(FieldLiquid); f.Default != "water" {
		t.Errorf("liquid default %q, want water (design §4 --liquid [water])", f.Default)
	}
}

func TestFieldValidateMessages(t *testing.T) {
	cases := []struct {
		id   FieldID
		text string
		sys  System
		want string // the whole message
		err  error
	}{
		{FieldHoseID, "0", SI, "Hose inside diameter: 0 mm is out of range; accepted 3 to 600 mm", calc.ErrOutOfRange},
		{FieldHoseID, "0 in", US, "Hose inside diameter: 0 in is out of range; accepted 0.118 to 23.6 in", calc.ErrOutOfRange},
		{FieldHoseID, "25 in", US, "Hose inside diameter: 25 in is out of range; accepted 0.118 to 23.6 in", calc.ErrOutOfRange},
		{FieldHoseID, "", SI, "Hose inside diameter: nothing entered; accepted 3 to 600 mm", ErrNotSet},
		{FieldHoseID, "NaN", SI, "Hose inside diameter: cannot read \"NaN\": NaN is not a number you can measure; accepted 3 to 600 mm", ErrSyntax},
		{FieldHoseID, "25 kg", SI, "Hose inside diameter: cannot read \"25 kg\": unit \"kg\" is not accepted for a diameter (units m, cm, mm, µm, ft, in); accepted 3 to 600 mm", ErrUnit},
		{FieldLift, "16", SI, "Lift over crest: 16 m is out of range; accepted −5 to 15 m", calc.ErrOutOfRange},
		{FieldLift, "50 ft", US, "Lift over crest: 50 ft is out of range; accepted −16.4 to 49.2 ft", calc.ErrOutOfRange},
		{FieldDrop, "0", SI, "Drop to outlet: 0 m is out of range; accepted 0.01 to 100 m", calc.ErrOutOfRange},
		{FieldTemp, "200C", SI, "Liquid temperature: 200 °C is out of range; accepted −40 to 150 °C", calc.ErrOutOfRange},
		{FieldTemp, "350F", US, "Liquid temperature: 350 °F is out of range; accepted −40 to 302 °F", calc.ErrOutOfRange},
		{FieldBaro, "10 inHg", SI, "Barometer reading: 33.8639 kPa is out of range; accepted 50 to 110 kPa", calc.ErrOutOfRange},
		{FieldBaro, "120kPa", SI, "Barometer reading: 120 kPa is out of range; accepted 50 to 110 kPa", calc.ErrOutOfRange},
		{FieldHoseCount, "1.5", SI, "Hoses in parallel: \"1.5\" is not a whole number; accepted 1 to 20", ErrNotInteger},
		{FieldHoseCount, "21", SI, "Hoses in parallel: 21 is out of range; accepted 1 to 20", calc.ErrOutOfRange},
	}
	for _, c := range cases {
		f, ok := FieldByID(c.id)
		if !ok {
			t.Fatalf("no field %s", c.id)
		}
		_, err := f.Validate(c.text, c.sys)
		if err == nil {
			t.Errorf("%s %q: accepted", c.id, c.text)
			continue
		}
		if err.Error() != c.want {
			t.Errorf("%s %q:\n got %s\nwant %s", c.id, c.text, err, c.want)
		}
		if !errors.Is(err, c.err) {
			t.Errorf("%s %q: %v does not wrap %v", c.id, c.text, err, c.err)
		}
		var fe *FieldError
		if !errors.As(err, &fe) || fe.ID != c.id {
			t.Errorf("%s %q: not a *FieldError for the field", c.id, c.text)
		}
	}
}

func TestFieldValidateEdgesInclusive(t *testing.T) {
	f, _ := FieldByID(FieldHoseID)
	for _, s := range []string{"3mm", "600 mm", "1in", "3/4", "1-1/2 in"} {
		if _, err := f.Validate(s, SI); err != nil && s != "3/4" {
			t.Errorf("%q: %v", s, err)
		}
	}
	// A bare 3/4 in SI is 0.75 mm: below the range.
	if _, err := f.Validate("3/4", SI); !errors.Is(err, calc.ErrOutOfRange) {
		t.Errorf("3/4 (SI, mm): %v", err)
	}
	if v, err := f.Validate("3/4", US); err != nil || !testkit.Within(v, 0.01905, 1e-12) {
		t.Errorf("3/4 (US, in) = %g, %v", v, err)
	}
}

func TestFieldChoices(t *testing.T) {
	cat := presets.Builtin()
	liquid, _ := FieldByID(FieldLiquid)
	if err := liquid.ValidateChoice("water", cat); err != nil {
		t.Errorf("water: %v", err)
	}
	if err := liquid.ValidateChoice("WATER", cat); err != nil {
		t.Errorf("WATER: %v", err)
	}
	if err := liquid.ValidateChoice("unobtainium", cat); !errors.Is(err, ErrNotAChoice) || !strings.HasPrefix(err.Error(), "Liquid: \"unobtainium\" is not in the list; accepted ") {
		t.Errorf("unobtainium: %v", err)
	}
	prime, _ := FieldByID(FieldPriming)
	for _, c := range prime.Choices(cat) {
		// Common practice (field-practice §2): a siphon is never started by mouth.
		if strings.Contains(strings.ToLower(c.ID+c.Label), "mouth") {
			t.Errorf("priming choice %q mentions mouth", c.ID)
		}
	}
	shape, _ := FieldByID(FieldTankShape)
	ids := map[string]bool{}
	for _, c := range shape.Choices(cat) {
		ids[c.ID] = true
	}
	for _, s := range []string{"none", "vertical-cylinder", "rectangular", "horizontal-cylinder", "cone-bottom", "sloped-pit", "sphere"} {
		if !ids[s] {
			t.Errorf("tank shape %s missing (design §4 --tank)", s)
		}
	}
	fit, _ := FieldByID(FieldHoseFittings)
	if err := fit.ValidateChoice("", cat); err != nil {
		t.Errorf("empty fittings: %v", err)
	}
	fc := fit.Choices(cat)
	if len(fc) >= 2 {
		if err := fit.ValidateChoice(fc[0].ID+", "+fc[1].ID+",", cat); err != nil {
			t.Errorf("two fittings: %v", err)
		}
		if err := fit.ValidateChoice(fc[0].ID+",bogus", cat); !errors.Is(err, ErrNotAChoice) {
			t.Errorf("bogus fitting: %v", err)
		}
	}
	if id, ok := shape.ChoiceID(" Rectangular ", cat); !ok || id != "rectangular" {
		t.Errorf("ChoiceID(Rectangular) = %q, %v", id, ok)
	}
	if id, ok := liquid.ChoiceID("WATER", cat); !ok || id != "water" {
		t.Errorf("ChoiceID(WATER) = %q, %v", id, ok)
	}
	if id, ok := liquid.ChoiceID("Seawater:35", cat); !ok || id != "seawater:35" {
		t.Errorf("ChoiceID(Seawater:35) = %q, %v", id, ok)
	}
	if len(fc) >= 2 {
		want := fc[0].ID + ", " + fc[1].ID
		if id, ok := fit.ChoiceID(strings.ToUpper(fc[0].ID)+",,"+fc[1].ID, cat); !ok || id != want {
			t.Errorf("ChoiceID(fittings) = %q, %v; want %q", id, ok, want)
		}
	}
	if _, ok := liquid.ChoiceID("unobtainium", cat); ok {
		t.Error("ChoiceID(unobtainium) found")
	}
	hid, _ := FieldByID(FieldHoseID)
	if err := hid.ValidateChoice("x", cat); err == nil {
		t.Error("ValidateChoice on a typed field accepted")
	}
	if _, err := liquid.Validate("1", SI); err == nil {
		t.Error("Validate on a picker accepted")
	}
}

// TestAppliesOneRule: a field that does not apply to the job is never
// blamed by Compute, however wrong its text, and the same field applies and
// is blamed once the job needs it. The defect this guards against: the
// form hid a field ("not used here") while Compute reported its error.
func TestAppliesOneRule(t *testing.T) {
	cases := []struct {
		name   string
		field  FieldID
		edit   map[FieldID]string // makes the field apply
		bad    string
		applie bool
	}{
		{"stroke without a hand pump", FieldPumpStroke, map[FieldID]string{FieldPriming: string(PrimeSubmerge)}, "abc", false},
		{"stroke with a hand pump", FieldPumpStroke, map[FieldID]string{FieldPriming: string(PrimeHandPump)}, "abc", true},
		{"intake depth with a tank", FieldIntakeDepth, nil, "-3 m", false},
		{"tank width of a cylinder", FieldTankWidth, map[FieldID]string{FieldTankShape: "vertical-cylinder", FieldTankDiameter: "2 m"}, "0 m", false},
		{"tank depth of a horizontal cylinder", FieldTankHeight, map[FieldID]string{FieldTankShape: "horizontal-cylinder",
			FieldTankDiameter: "2 m", FieldTankLength: "3 m", FieldTankLevel: "1 m"}, "0.1 m", false},
		{"receiver size without a receiver", FieldReceiverDiameter, nil, "zzz", false},
		{"tank width of a box", FieldTankWidth, nil, "0 m", true},
	}
	cat := presets.Builtin()
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			j := DemoJob()
			for id, v := range c.edit {
				j.Inputs[id] = v
			}
			j.Inputs[c.field] = c.bad
			if got := Applies(j.Inputs, c.field); got != c.applie {
				t.Fatalf("Applies = %v, want %v", got, c.applie)
			}
			p := Compute(j, cat)
			_, blamed := p.FieldErrors[c.field]
			if blamed != c.applie {
				t.Errorf("blamed %v (errors %v), want %v", blamed, p.FieldErrors, c.applie)
			}
		})
	}
}

// TestChoiceListPerCatalogue: the picker lists are built once per catalogue
// and answer for the catalogue asked about, even when two catalogues take
// turns (the user's presets over the built-in ones, and the built-in ones).
func TestChoiceListPerCatalogue(t *testing.T) {
	base := presets.Builtin()
	u, err := presets.LoadUser(strings.NewReader("[[material]]\nid = \"test-wall\"\nname = \"Test wall\"\nroughness_mm = 0.05\nsource = \"invented for this test\"\n"), "p.toml")
	if err != nil {
		t.Fatal(err)
	}
	merged := base.Merge(u)
	mat, _ := FieldByID(FieldHoseMaterial)
	for i := 0; i < 3; i++ {
		if err := mat.ValidateChoice("test-wall", merged); err != nil {
			t.Errorf("round %d: the merged catalogue's own material refused: %v", i, err)
		}
		if err := mat.ValidateChoice("test-wall", base); !errors.Is(err, ErrNotAChoice) {
			t.Errorf("round %d: the built-in catalogue took a material it lacks: %v", i, err)
		}
	}
	if a, b := mat.choiceList(base), mat.choiceList(base); len(a) == 0 || &a[0] != &b[0] {
		t.Error("the list was built again for the same catalogue")
	}
	if got, want := mat.choiceList(base), mat.Choices(base); len(got) != len(want) {
		t.Errorf("cached list has %d entries, fresh one %d", len(got), len(want))
	}
}

// BenchmarkValidateChoice: a picker check as Compute runs it on every key.
func BenchmarkValidateChoice(b *testing.B) {
	cat := presets.Builtin()
	liquid, _ := FieldByID(FieldLiquid)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if err := liquid.ValidateChoice("water", cat); err != nil {
			b.Fatal(err)
		}
	}
}
