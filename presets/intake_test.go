package presets

import (
	"errors"
	"math"
	"strings"
	"testing"

	"drawdown/calc"
	"drawdown/calc/testkit"
)

// At least one built-in intake of each kind issue 11 names, the default
// among them (a strainer comes round and flat).
func TestIntakeKinds(t *testing.T) {
	c := Builtin()
	byKind := map[IntakeKind]string{}
	for _, in := range c.Intakes() {
		byKind[in.Kind] = in.ID
	}
	for _, k := range IntakeKinds() {
		if _, ok := byKind[k]; !ok {
			t.Errorf("no intake of kind %v", k)
		}
		if got, ok := ParseIntakeKind(k.String()); !ok || got != k {
			t.Errorf("kind %v does not round-trip", k)
		}
	}
	if _, ok := ParseIntakeKind("sieve"); ok || IntakeKind(99).String() != "unknown" {
		t.Error("unknown kind accepted")
	}
	d, ok := c.Intake(DefaultIntake)
	if !ok || d.Kind != BareHung {
		t.Errorf("default intake %q: %+v", DefaultIntake, d)
	}
}

// Entrance K against the sources named (hydraulics note §2): a bare end is
// the re-entrant entrance, Crane TP-410 0.78 to Rennels & Hudson's 1.015
// for a thin wall; the strainer and foot valve carry the same values as the
// strainer-basket and foot-valve fittings.
func TestIntakeK(t *testing.T) {
	c := Builtin()
	re, _ := c.Fitting("entrance-reentrant")
	sb, _ := c.Fitting("strainer-basket")
	fv, _ := c.Fitting("foot-valve")
	cases := []struct {
		id     string
		want   KRange
		source string
	}{
		{"bare-hung", re.K, "Crane TP-410 re-entrant 0.78; Rennels & Hudson 1.0"},
		{"board", re.K, "as bare-hung"},
		{"bare-floor", KRange{0.78, 0.78, 1.5}, "re-entrant, high end our choice"},
		{"strainer", sb.K, "HI chart, from memory"},
		{"foot-valve", fv.K, "Perry's-style table; HI note 2"},
	}
	for _, k := range cases {
		in, _ := c.Intake(k.id)
		if in.K != k.want {
			t.Errorf("%s: K %+v, want %+v (%s)", k.id, in.K, k.want, k.source)
		}
	}
	if re.K.Central != 0.78 || !testkit.Within(re.K.High, 1.015, (0.02)/math.Abs(1.015)) {
		t.Errorf("re-entrant %+v", re.K)
	}
}

// Geometry for a 38 mm hose, and the rules it follows: a bare end's face
// is its bore; a hose lying on the floor has the top of its mouth one bore
// up; the default hung end's 50 mm gap is at least a quarter bore for every
// hose size in the catalogue, so the ring of entry π·D·c is no smaller than
// the bore's area π·D²/4 (geometry).
func TestIntakeGeometry(t *testing.T) {
	c := Builtin()
	const d = calc.Length(0.038)
	cases := []struct {
		id          string
		face, mouth float64 // m
	}{
		{"bare-hung", 0.038, 0.050}, {"bare-floor", 0.038, 0.038}, {"board", 0.038, 0.050},
		{"strainer", 0.114, 0.114}, {"strainer-flat", 0.095, 0.025}, {"foot-valve", 0.095, 0.095}, {"suction-plate", 0.152, 0.010},
		{"floating", 0.095, 0},
	}
	for _, k := range cases {
		in, ok := c.Intake(k.id)
		if !ok {
			t.Fatalf("no %s", k.id)
		}
		if !testkit.Within(float64(in.FaceDiameter(d)), k.face, (1e-12)/math.Abs(k.face)) || !testkit.Within(float64(in.MouthHeight(d)), k.mouth, (1e-12)/math.Abs(k.mouth)) {
			t.Errorf("%s: face %v, mouth %v; want %v, %v", k.id, in.FaceDiameter(d), in.MouthHeight(d), k.face, k.mouth)
		}
	}
	hung, _ := c.Intake("bare-hung")
	for _, h := range c.Hoses() {
		if curtain, bore := math.Pi*float64(h.Diameter*hung.MouthHeight(h.Diameter)), math.Pi*float64(h.Diameter*h.Diameter)/4; curtain < bore {
			t.Errorf("%s: entry ring %.5f m² smaller than the bore %.5f m²", h.ID, curtain, bore)
		}
	}
	plate, _ := c.Intake("suction-plate")
	fl, _ := c.Intake("floating")
	if !(plate.DrawDown > 0 && plate.DrawDown < 0.1) || !(fl.Depth > 0) || fl.Mouth != 0 || fl.MouthBores != 0 {
		t.Errorf("plate %+v, floating %+v", plate, fl)
	}
}

// Intakes in a user file, and their errors.
func TestUserIntakes(t *testing.T) {
	const head = "[[intake]]\nid = \"my-strainer\"\nsource = \"measured\"\n"
	c, err := LoadUser(strings.NewReader(head+"kind = \"strainer\"\nk = 2\nface_diameter_mm = 120\nmouth_height_mm = 90\nopen_area_ratio = 0.35\n"), "p.toml")
	if err != nil {
		t.Fatal(err)
	}
	in, ok := c.Intake("my-strainer")
	if !ok || in.FaceDiameter(0.05) != 0.12 || in.MouthHeight(0.05) != 0.09 || in.K != (KRange{2, 2, 2}) || in.KSource != "measured" {
		t.Errorf("%+v", in)
	}
	cases := []struct {
		name, body, field, want string
	}{
		{"kind", "kind = \"sieve\"\nk = 1\nmouth_height_mm = 10\n", "kind", "use one of bare-hung"},
		{"no k", "kind = \"strainer\"\nmouth_height_mm = 10\n", "k", "missing"},
		{"no mouth", "kind = \"strainer\"\nk = 1\n", "mouth_height_mm", "missing"},
		{"open area", "kind = \"strainer\"\nk = 1\nmouth_height_mm = 10\nopen_area_ratio = 1.5\n", "open_area_ratio", "out of range"},
		{"draw-down on a strainer", "kind = \"strainer\"\nk = 1\nmouth_height_mm = 10\ndraw_down_mm = 5\n", "draw_down_mm", "only for kind suction-plate"},
		{"plate without draw-down", "kind = \"suction-plate\"\nk = 1\nmouth_height_mm = 10\n", "draw_down_mm", "missing for kind suction-plate"},
		{"floating without depth", "kind = \"floating\"\nk = 1\n", "depth_mm", "missing for kind floating"},
		{"k band", "kind = \"board\"\nk = 1\nk_high = 0.5\nmouth_height_mm = 50\n", "k_high", "out of range"},
	}
	for _, k := range cases {
		_, err := LoadUser(strings.NewReader(head+k.body), "p.toml")
		var pe *ParseError
		if !errors.As(err, &pe) || !strings.Contains(pe.Field, k.field) || !strings.Contains(err.Error(), k.want) || pe.Line == 0 {
			t.Errorf("%s: %v (field %q); want %s: %s", k.name, err, fieldOf(pe), k.field, k.want)
		}
	}
	// An override keeps the built-in aliases.
	u, err := LoadUser(strings.NewReader("[[intake]]\nid = \"board\"\nkind = \"board\"\nk = 1\nmouth_height_mm = 80\nsource = \"site\"\n"), "p.toml")
	if err != nil {
		t.Fatal(err)
	}
	if b, _ := Builtin().Merge(u).Intake("raft"); b.ID != "board" || b.Source != "site" {
		t.Errorf("raft after override: %+v", b)
	}
}

func fieldOf(pe *ParseError) string {
	if pe == nil {
		return ""
	}
	return pe.Field
}
