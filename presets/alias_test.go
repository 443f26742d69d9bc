package presets

import (
	"errors"
	"strings"
	"testing"

	"drawdown/calc"
)

// Old IDs and other spellings find their entry, with its canonical ID.
// suction-helix (the one suction material before issue 13) maps to
// suction-corrugated, whose roughness is the old entry's 1.0 mm (0.3 to
// 4 mm), so saved jobs keep their results.
func TestAliases(t *testing.T) {
	c := Builtin()
	cases := []struct {
		kind, typed, want string
	}{
		{"material", "suction-helix", "suction-corrugated"},
		{"material", "layflat", "lay-flat"},
		{"material", "Lay-Flat", "lay-flat"},
		{"material", "galvanized", "galvanised"},
		{"material", "suction-smooth", "suction-smooth"},
		{"hose", "1.5in", "1-1/2in"},
		{"hose", "1 1/2 in", "1-1/2in"},
		{"hose", `1-1/2"`, "1-1/2in"},
		{"hose", "0.75 inch", "3/4in"},
		{"hose", "38 mm", "38mm"},
		{"hose", "2.0in", "2in"},
		{"hose", "38", ""}, // a bare number names no unit
		{"hose", "1.6in", ""},
		{"hose", "dn50", ""},
		{"fitting", "footvalve", "foot-valve"},
		{"fitting", "Bell-Mouth", "entrance-bellmouth"},
		{"fitting", "check-valve", "swing-check"},
	}
	for _, k := range cases {
		var got string
		var ok bool
		switch k.kind {
		case "material":
			var m Material
			m, ok = c.Material(k.typed)
			got = m.ID
		case "hose":
			var h Hose
			h, ok = c.Hose(k.typed)
			got = h.ID
		case "fitting":
			var f Fitting
			f, ok = c.Fitting(k.typed)
			got = f.ID
		}
		if ok != (k.want != "") || got != k.want {
			t.Errorf("%s %q → %q, %v; want %q", k.kind, k.typed, got, ok, k.want)
		}
	}
	old, _ := c.Material("suction-helix")
	if old.Roughness != 0.001 || old.RoughnessLow != 0.0003 || old.RoughnessHigh != 0.004 {
		t.Errorf("suction-helix now reads %v (%v to %v)", old.Roughness, old.RoughnessLow, old.RoughnessHigh)
	}
}

// Issue 13: the lumped suction material put smooth and corrugated bores
// together. Through the solver the program runs (calc.Solve, Colebrook–
// White), a 100 m run of 38 mm hose on a 2 m head, friction-dominated, gives
// flows that differ by about 40 % between the two walls (Q ∝ f^(-1/2)).
func TestSuctionSplit(t *testing.T) {
	c := Builtin()
	sm, _ := c.Material("suction-smooth")
	co, _ := c.Material("suction-corrugated")
	water, err := c.Liquids()[0].Fluid(calc.Celsius(15), 101325)
	if err != nil {
		t.Fatal(err)
	}
	flow := func(m Material) float64 {
		s := calc.Siphon{Fluid: water, AtmPressure: 101325, Hoses: 1,
			Hose:     calc.Hose{Diameter: 0.038, Length: 100, Roughness: m.Roughness, KEntrance: 0.5},
			Geometry: calc.Geometry{Surface: 0, Intake: -0.3, Crest: 0.5, Outlet: -2}}
		r, err := calc.Solve(s)
		if err != nil {
			t.Fatal(err)
		}
		return float64(r.Flow)
	}
	ratio := flow(co) / flow(sm)
	if !(ratio > 0.5 && ratio < 0.75) {
		t.Errorf("corrugated over smooth flow ratio %.2f", ratio)
	}
	if sm.RoughnessHigh >= co.RoughnessLow {
		t.Errorf("smooth band reaches into the corrugated band: %v, %v", sm.RoughnessHigh, co.RoughnessLow)
	}
}

// An ID wins over another entry's alias; a user entry replacing a built-in
// one keeps the built-in aliases (saved jobs still find it).
func TestAliasPrecedence(t *testing.T) {
	u, err := LoadUser(strings.NewReader(`[[material]]
id = "layflat"
roughness_mm = 0.05
source = "mine"

[[material]]
id = "suction-corrugated"
roughness_mm = 2
source = "measured"
`), "p.toml")
	if err != nil {
		t.Fatal(err)
	}
	c := Builtin().Merge(u)
	if m, _ := c.Material("layflat"); m.ID != "layflat" || m.Source != "mine" {
		t.Errorf("layflat → %+v", m)
	}
	if m, _ := c.Material("suction-helix"); m.ID != "suction-corrugated" || m.Source != "measured" {
		t.Errorf("suction-helix after override → %+v", m)
	}
	// A returned alias list is a copy.
	m, _ := c.Material("suction-helix")
	m.Aliases[0] = "changed"
	if m2, _ := Builtin().Material("suction-helix"); m2.ID != "suction-corrugated" {
		t.Error("alias list shared")
	}
}

// Bad aliases in a user file.
func TestAliasErrors(t *testing.T) {
	const base = "roughness_mm = 1\nsource = \"s\"\n"
	cases := []struct {
		name, src, want string
	}{
		{"spaces", "[[material]]\nid = \"a\"\naliases = [\"my hose\"]\n" + base, `material "a" aliases: "my hose": use up to 40`},
		{"own id", "[[material]]\nid = \"a\"\naliases = [\"A\"]\n" + base, `"A" is the entry's own id`},
		{"twice", "[[material]]\nid = \"a\"\naliases = [\"x\"]\n" + base + "[[material]]\nid = \"b\"\naliases = [\"x\"]\n" + base, `material "b" aliases: "x" is an alias of another material`},
		{"other id", "[[material]]\nid = \"a\"\naliases = [\"b\"]\n" + base + "[[material]]\nid = \"b\"\n" + base, `material "a" aliases: "b" is the id of another material`},
		{"hose", "[[hose]]\nid = \"h\"\naliases = [\"\"]\ninside_diameter_mm = 20\nsource = \"s\"\n", `hose "h" aliases`},
		{"fitting", "[[fitting]]\nid = \"f\"\naliases = [\"f\"]\nk = 1\nsource = \"s\"\n", `fitting "f" aliases`},
	}
	for _, k := range cases {
		_, err := LoadUser(strings.NewReader(k.src), "p.toml")
		var pe *ParseError
		if !errors.As(err, &pe) || !strings.Contains(err.Error(), k.want) {
			t.Errorf("%s: %v; want %q", k.name, err, k.want)
		}
	}
}
