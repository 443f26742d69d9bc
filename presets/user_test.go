package presets

import (
	"errors"
	"math"
	"os"
	"strings"
	"testing"

	"drawdown/calc"
	"drawdown/calc/testkit"
)

// loadExample loads testdata/user.toml the way the tool does (Load, as
// the command line's loadCatalogue calls it); a missing fixture fails.
func loadExample(t *testing.T) *Catalogue {
	t.Helper()
	if _, err := os.Stat("testdata/user.toml"); err != nil {
		t.Fatalf("fixture: %v", err)
	}
	c, err := Load("testdata/user.toml")
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// The example file's liquids against their definitions: a table's nodes
// exactly, ρ linear and μ, p_v log-linear between nodes (analytic); a
// constant liquid; based_on keeping what it does not replace; the seawater
// model against Sharqawy et al. (2010) via sharqawyDensity; the oil model's
// ν at 40 °C against its data-sheet value (ASTM D341 passes through its
// two points).
func TestLoadUserExampleLiquids(t *testing.T) {
	c := loadExample(t)
	b := Builtin()
	if len(c.Liquids()) != len(b.Liquids())+5 { // diesel replaced, five added
		t.Errorf("%d liquids, built-in %d", len(c.Liquids()), len(b.Liquids()))
	}
	bd, _ := b.Liquid("diesel")
	bf, _ := bd.Fluid(calc.Celsius(20), 101325)
	cases := []struct {
		id   string
		tC   float64
		ok   func(calc.Fluid) bool
		note string
	}{
		{"tank-wash", 20, func(f calc.Fluid) bool {
			return float64(f.Density) == 1010 && testkit.Within(float64(f.Viscosity), 1.3e-3, 1e-12)
		}, "table node"},
		{"tank-wash", 30, func(f calc.Fluid) bool {
			return testkit.Within(float64(f.Density), 1007, 1e-12) && testkit.Within(float64(f.Viscosity), math.Sqrt(1.3*0.9)*1e-3, 1e-12) &&
				testkit.Within(float64(f.VaporPressure), math.Sqrt(2300*7400), 1e-12)
		}, "between nodes: linear ρ, log-linear μ and p_v (analytic)"},
		{"molasses-rinse", 25, func(f calc.Fluid) bool {
			return float64(f.Density) == 1080 && testkit.Within(float64(f.Viscosity), 4.5e-3, 1e-12)
		}, "constant"},
		{"diesel", 20, func(f calc.Fluid) bool {
			return float64(f.Density) == 838 && f.Viscosity == bf.Viscosity && f.VaporPressure == bf.VaporPressure
		}, "based_on: density replaced, the rest kept"},
		{"saltpan-brine", 25, func(f calc.Fluid) bool {
			return testkit.Within(float64(f.Density), sharqawyDensity(25, 0.120), (1e-9)/math.Abs(sharqawyDensity(25, 0.120)))
		}, "Sharqawy et al. (2010) density at 120 g/kg"},
		{"gear-oil-150", 40, func(f calc.Fluid) bool {
			return testkit.Within(float64(f.Viscosity)/float64(f.Density)*1e6, 150, 1e-9)
		}, "ASTM D341 through ν40 = 150 mm²/s"},
	}
	for _, k := range cases {
		l, ok := c.Liquid(k.id)
		if !ok {
			t.Errorf("no %s", k.id)
			continue
		}
		f, err := l.Fluid(calc.Celsius(k.tC), 101325)
		if err != nil || !k.ok(f) {
			t.Errorf("%s at %g °C (%s): %+v, %v", k.id, k.tC, k.note, f, err)
		}
	}
	for _, l := range c.Liquids() {
		walkFluid(t, l)
	}
}

// What the example file's liquids carry besides properties: range,
// origin, hazards, NFPA 30 class (NFPA 30 §4.3: diesel and a 230 °C flash
// oil are combustible, gasoline class IB).
func TestLoadUserExampleLiquidFacts(t *testing.T) {
	c := loadExample(t)
	cases := []struct {
		id    string
		class FlashClass
		has   Hazard
		check func(Liquid) bool
	}{
		{"tank-wash", NoFlashClass, Environmental, func(l Liquid) bool {
			return l.Min == calc.Celsius(5) && l.Max == calc.Celsius(40) && l.Origin == "user file testdata/user.toml"
		}},
		{"diesel", ClassII, Combustible, func(l Liquid) bool { return strings.Contains(l.Sources.Density, "delivery note") }},
		{"saltpan-brine", NoFlashClass, Environmental, nil},
		{"gasoline-70", ClassIB, Flammable, nil},
		{"gear-oil-150", ClassIIIB, Combustible, nil},
	}
	for _, k := range cases {
		l, _ := c.Liquid(k.id)
		if l.Class != k.class || !l.Hazards.Has(k.has) || (k.check != nil && !k.check(l)) {
			t.Errorf("%s: class %v, hazards %v: %+v", k.id, l.Class, l.Hazards, l)
		}
	}
}

// The example file's other sections, and the override of a built-in entry.
func TestLoadUserExampleEntries(t *testing.T) {
	c := loadExample(t)
	cases := []struct {
		name string
		ok   func() bool
	}{
		{"hose 30mm", func() bool {
			h, ok := c.Hose("30mm")
			return ok && testkit.Within(float64(h.Diameter), 0.030, (1e-12)/math.Abs(0.030))
		}},
		{"material blue-suction", func() bool {
			m, ok := c.Material("blue-suction")
			return ok && testkit.Within(float64(m.Roughness), 5e-6, (1e-15)/math.Abs(5e-6))
		}},
		{"foot-valve replaced", func() bool { f, _ := c.Fitting("foot-valve"); return f.K.Central == 18 && f.Where == AtEntrance }},
		{"fitting camlock added", func() bool { f, ok := c.Fitting("camlock"); return ok && f.K == KRange{0.3, 0.2, 0.5} }},
		{"tank north-sump", func() bool {
			tk, ok := c.Tank("north-sump")
			return ok && tk.ConfinedSpace && tk.Sizes[0] == (Size{"diameter", 1.2})
		}},
	}
	for _, k := range cases {
		if !k.ok() {
			t.Errorf("%s: wrong or missing", k.name)
		}
	}
}

// A bad file gives a *ParseError with the line and field; the built-in
// catalogue still loads through Load.
func TestLoadUserErrors(t *testing.T) {
	const liq = "[[liquid]]\nid = \"a\"\nsource = \"s\"\n"
	cases := []struct {
		name  string
		src   string
		line  int
		field string
		is    error
	}{
		{"syntax", "[[liquid]]\nid = \"a\"\nt_min_c = \n", 3, "", ErrSyntax},
		{"wrong type", "[[liquid]]\nid = \"a\"\nt_min_c = \"cold\"\n", 3, "t_min_c", ErrSyntax},
		{"text for a flag", "[[material]]\nid = \"m\"\ncollapses = 1\n", 3, "collapses", ErrSyntax},
		{"unknown key", "[[hose]]\nid = \"x\"\ninside_diameter_mm = 20\nsource = \"s\"\ndiameter_in = 1\n", 5, "hose.diameter_in", ErrUnknownField},
		{"unknown top key", "version = 2\n[[hose]]\nid = \"x\"\ninside_diameter_mm = 20\nsource = \"s\"\n", 1, "version", ErrUnknownField},
		{"unknown table", "# my presets\n[[hose]]\nid = \"x\"\ninside_diameter_mm = 20\nsource = \"s\"\n[[liquids]]\nid = \"x\"\n", 6, "liquids", ErrUnknownField},
		{"t_max out of range", liq + "t_min_c = 5\nt_max_c = 300\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 1\n", 5, `liquid "a" t_max_c`, nil},
		{"t_max below t_min", liq + "t_min_c = 30\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 1\nt_max_c = 10\n", 7, `liquid "a" t_max_c`, nil},
		{"density", liq + "t_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = 100\nviscosity_mpa_s = 1\n", 6, "density_kg_m3", nil},
		{"no viscosity", liq + "t_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = 1000\n", 1, "viscosity_mpa_s", nil},
		{"bad hazard", liq + "hazards = [\"explosive\"]\nt_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 1\n", 4, "hazards", nil},
		{"table lengths", liq + "[liquid.table]\nt_c = [5, 20]\ndensity_kg_m3 = [1000]\nviscosity_mpa_s = [1, 2]\n", 6, "table.density_kg_m3", nil},
		{"table order", liq + "[liquid.table]\nt_c = [20, 5]\ndensity_kg_m3 = [1000, 1000]\nviscosity_mpa_s = [1, 2]\n", 5, "table.t_c", nil},
		{"range beyond table", liq + "t_max_c = 50\n[liquid.table]\nt_c = [5, 20]\ndensity_kg_m3 = [1000, 999]\nviscosity_mpa_s = [1.5, 1]\n", 4, "t_max_c", nil},
		{"based_on unknown", "[[liquid]]\nid = \"b\"\nbased_on = \"milk\"\n", 3, "based_on", nil},
		{"salinity", "[[liquid]]\nid = \"b\"\nmodel = \"seawater\"\nsalinity_g_kg = 200\n", 4, "salinity_g_kg", calc.ErrOutOfRange},
		{"gasoline too hot", "[[liquid]]\nid = \"g\"\nrvp_kpa = 60\nt_max_c = 60\n", 4, "t_max_c", nil},
		{"oil viscosity rises", "[[liquid]]\nid = \"o\"\nsource = \"s\"\nmodel = \"oil\"\ndensity_15c_kg_m3 = 880\nnu1_mm2_s = 10\nnu2_mm2_s = 20\nt_min_c = 0\nt_max_c = 50\n", 7, "nu2_mm2_s", nil},
		{"unknown model", liq + "model = \"magic\"\n", 4, "model", nil},
		{"second entry", liq + "t_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 1\n\n[[liquid]]\nid = \"b\"\nsource = \"s\"\nt_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 0\n", 15, `liquid "b" viscosity_mpa_s`, nil},
		{"duplicate id", "[[hose]]\nid = \"h\"\ninside_diameter_mm = 20\nsource = \"s\"\n[[hose]]\nid = \"h\"\ninside_diameter_mm = 25\nsource = \"s\"\n", 6, "id", nil},
		{"id with space", "[[hose]]\nid = \"my hose\"\ninside_diameter_mm = 20\nsource = \"s\"\n", 2, "hose 1 id", nil},
		{"hose too big", "[[hose]]\nid = \"h\"\ninside_diameter_mm = 5000\nsource = \"s\"\n", 3, "inside_diameter_mm", nil},
		{"hose no source", "[[hose]]\nid = \"h\"\ninside_diameter_mm = 20\n", 1, "source", nil},
		{"fitting k_low above k", "[[fitting]]\nid = \"f\"\nk = 1\nk_low = 2\nsource = \"s\"\n", 4, "k_low", nil},
		{"fitting where", "[[fitting]]\nid = \"f\"\nk = 1\nwhere = \"outlet\"\nsource = \"s\"\n", 4, "where", nil},
		{"fitting no source", "[[fitting]]\nid = \"f\"\nk = 1\n", 1, "source", nil},
		{"fitting bore ratio and k", "[[fitting]]\nid = \"f\"\nk = 1\nbore_ratio = 0.8\nsource = \"s\"\n", 4, "bore_ratio", nil},
		{"fitting bore ratio over 1", "[[fitting]]\nid = \"f\"\nbore_ratio = 1.2\nsource = \"s\"\n", 3, "bore_ratio", nil},
		{"fitting both k", "[[fitting]]\nid = \"f\"\nk = 1\nk_ft = 20\nsource = \"s\"\n", 4, "k_ft", nil},
		{"material negative", "[[material]]\nid = \"m\"\nroughness_mm = -1\nsource = \"s\"\n", 3, "roughness_mm", nil},
		{"tank shape", "[[tank]]\nid = \"t\"\nshape = \"cube\"\nsizes = { length = 1 }\nsource = \"s\"\n", 3, "shape", nil},
		{"tank missing size", "[[tank]]\nid = \"t\"\nshape = \"rectangular\"\nsizes = { length = 1 }\nsource = \"s\"\n", 4, "sizes", nil},
		{"tank unknown size", "[[tank]]\nid = \"t\"\nshape = \"sphere\"\nsizes = { diameter = 1, depth = 2 }\nsource = \"s\"\n", 4, "sizes.depth", nil},
		{"tank size zero", "[[tank]]\nid = \"t\"\nshape = \"sphere\"\nsizes = { diameter = 0 }\nsource = \"s\"\n", 4, "sizes.diameter", nil},
		{"cone above height", "[[tank]]\nid = \"t\"\nshape = \"cone-bottom\"\nsizes = { diameter = 1, cone-height = 2, height = 1 }\nsource = \"s\"\n", 4, "sizes.cone-height", nil},
		{"pit needs height", "[[tank]]\nid = \"t\"\nshape = \"sloped-pit\"\nsizes = { length = 5, width = 3, side-slope = 2 }\nsource = \"s\"\n", 4, "sizes", nil},
		{"priming hazard", "[[priming]]\nid = \"p\"\nnot_for = [\"wet\"]\nsource = \"s\"\n", 3, "not_for", nil},
		{"aid stroke", "[[priming_aid]]\nid = \"a\"\nstroke_low_ml = 50\nstroke_high_ml = 10\nsource = \"s\"\n", 4, "stroke_high_ml", nil},
		{"nan", liq + "t_min_c = nan\nt_max_c = 30\ndensity_kg_m3 = 1000\nviscosity_mpa_s = 1\n", 4, "t_min_c", nil},
		{"inf", liq + "t_min_c = 5\nt_max_c = 30\ndensity_kg_m3 = inf\nviscosity_mpa_s = 1\n", 6, "density_kg_m3", nil},
	}
	for _, k := range cases {
		t.Run(k.name, func(t *testing.T) {
			_, err := LoadUser(strings.NewReader(k.src), "presets.toml")
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("err = %v, want *ParseError", err)
			}
			if pe.File != "presets.toml" || pe.Line != k.line || !strings.Contains(pe.Field, k.field) {
				t.Errorf("got %q (line %d, field %q); want line %d, field containing %q", err, pe.Line, pe.Field, k.line, k.field)
			}
			if k.is != nil && !errors.Is(err, k.is) {
				t.Errorf("%v does not wrap %v", err, k.is)
			}
			if strings.Contains(err.Error(), "destination has type") {
				t.Errorf("message %q speaks Go, not the file's words", err)
			}
			if m := err.Error(); strings.Contains(m, "  ") || strings.HasSuffix(m, " ") {
				t.Errorf("message %q has a double or trailing space", m)
			}
			if !strings.HasPrefix(err.Error(), "presets.toml:") {
				t.Errorf("message %q lacks the file name", err)
			}
			b, err2 := Load(writeFile(t, "presets.toml", k.src))
			if err2 == nil || b == nil || len(b.Liquids()) != len(Builtin().Liquids()) {
				t.Error("Load did not fall back to the built-in catalogue")
			}
		})
	}
}

func TestLoadUserEdges(t *testing.T) {
	c, err := LoadUser(strings.NewReader(""), "empty.toml")
	if err != nil || len(c.Liquids()) != 0 {
		t.Errorf("empty file: %v", err)
	}
	big := strings.Repeat("# padding\n", maxUserFile/10+1)
	if _, err := LoadUser(strings.NewReader(big), "big.toml"); err == nil {
		t.Error("oversized file accepted")
	}
	if _, err := LoadUser(errReader{}, "x"); err == nil || errors.As(err, new(*ParseError)) {
		t.Errorf("read error: %v", err)
	}
	pe := &ParseError{File: "f", Err: ErrSyntax}
	if pe.Error() != "f: preset file syntax" || pe.Unwrap() != ErrSyntax {
		t.Errorf("ParseError without line: %q", pe.Error())
	}
}

type errReader struct{}

func (errReader) Read([]byte) (int, error) { return 0, errors.New("disconnected") }

// FuzzLoadUser: any input gives a catalogue or a *ParseError, never a panic;
// a catalogue's liquids give no NaN anywhere in their ranges.
func FuzzLoadUser(f *testing.F) {
	if b, err := os.ReadFile("testdata/user.toml"); err == nil {
		f.Add(string(b))
	}
	f.Add("[[fitting]]\nid = \"b\"\nbore_ratio = 0.31\nk_high = 200\nsource = \"s\"\n")
	f.Add("[[fitting]]\nid = \"f\"\nk_ft = 20\nk_ft_high = 30\nwhere = \"up-leg\"\nsource = \"s\"\n[[priming]]\nid = \"p\"\nnot_for = [\"toxic\"]\nsource = \"s\"\n")
	f.Add("[[liquid]]\nid = \"a\"\nsource = \"s\"\n[liquid.table]\nt_c = [5]\ndensity_kg_m3 = [1000]\nviscosity_mpa_s = [1]\n")
	f.Add("[[liquid]]\nid = \"o\"\nsource = \"s\"\nmodel = \"oil\"\ndensity_15c_kg_m3 = 880\nnu1_mm2_s = 10000\nnu2_mm2_s = 0.3\nt_min_c = -60\nt_max_c = 200\n")
	f.Add("[[liquid]]\nid = \"w\"\nbased_on = \"water\"\nvapor_pressure_pa = 200000\n")
	f.Add("[[intake]]\nid = \"i\"\nkind = \"floating\"\nk = 1.5\nk_high = 3\ndepth_mm = 150\nface_diameter_bores = 2\nsource = \"s\"\n")
	f.Add("[[tank]]\nid = \"t\"\nshape = \"sphere\"\nsizes = { diameter = 1e308 }\nsource = \"s\"\n")
	f.Fuzz(func(t *testing.T, src string) {
		c, err := LoadUser(strings.NewReader(src), "fuzz.toml")
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) || pe.File != "fuzz.toml" || pe.Error() == "" {
				t.Fatalf("error %v is not a *ParseError", err)
			}
			return
		}
		for _, l := range c.Liquids() {
			for k := 0; k <= 10; k++ {
				T := l.Min + (l.Max-l.Min)*calc.Temperature(k)/10
				fl, err := l.Fluid(T, 101325)
				if err != nil {
					continue
				}
				if math.IsNaN(float64(fl.Density + calc.Density(fl.Viscosity) + calc.Density(fl.VaporPressure))) {
					t.Fatalf("%s at %v: NaN", l.ID, T)
				}
			}
		}
	})
}

// FuzzLiquidID: the command-line liquid code never panics, and whatever it
// accepts gives finite properties in range.
func FuzzLiquidID(f *testing.F) {
	for _, s := range []string{"water", "seawater:35", "brine:1e2", "gasoline:62", "seawater:-0", "brine:0x1p4", ":", "seawater:1e400"} {
		f.Add(s)
	}
	c := Builtin()
	f.Fuzz(func(t *testing.T, id string) {
		l, ok := c.Liquid(id)
		if !ok {
			return
		}
		mid := (l.Min + l.Max) / 2
		fl, err := l.Fluid(mid, 101325)
		if err == nil && fl.Validate() != nil {
			t.Fatalf("%q: %+v", id, fl)
		}
	})
}
