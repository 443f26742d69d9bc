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

func TestLoadUserExample(t *testing.T) {
	f, err := os.Open("testdata/user.toml")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	c, err := WithUser(f, "user.toml")
	if err != nil {
		t.Fatal(err)
	}
	b := Builtin()
	if len(c.Liquids()) != len(b.Liquids())+5 { // diesel replaced, five added
		t.Errorf("%d liquids, built-in %d", len(c.Liquids()), len(b.Liquids()))
	}
	at := func(id string, tC float64) calc.Fluid {
		t.Helper()
		l, ok := c.Liquid(id)
		if !ok {
			t.Fatalf("no %s", id)
		}
		fl, err := l.Fluid(calc.Celsius(tC), 101325)
		if err != nil {
			t.Fatalf("%s: %v", id, err)
		}
		return fl
	}
	// Tabulated: nodes exact, between them ρ linear and μ log-linear (analytic).
	if fl := at("tank-wash", 20); float64(fl.Density) != 1010 || !testkit.Within(float64(fl.Viscosity), 1.3e-3, 1e-12) {
		t.Errorf("tank-wash at 20 °C: %+v", fl)
	}
	if fl := at("tank-wash", 30); !testkit.Within(float64(fl.Density), 1007, 1e-12) ||
		!testkit.Within(float64(fl.Viscosity), math.Sqrt(1.3*0.9)*1e-3, 1e-12) ||
		!testkit.Within(float64(fl.VaporPressure), math.Sqrt(2300*7400), 1e-12) {
		t.Errorf("tank-wash at 30 °C: %+v", fl)
	}
	tw, _ := c.Liquid("tank-wash")
	if tw.Min != calc.Celsius(5) || tw.Max != calc.Celsius(40) || tw.Origin != "user file user.toml" || !tw.Hazards.Has(Environmental) {
		t.Errorf("tank-wash: %+v", tw)
	}
	// Constant.
	if fl := at("molasses-rinse", 25); float64(fl.Density) != 1080 || !testkit.Within(float64(fl.Viscosity), 4.5e-3, 1e-12) {
		t.Errorf("molasses-rinse: %+v", fl)
	}
	// based_on: density replaced, viscosity and vapour pressure kept.
	d, bd := at("diesel", 20), Liquid{}
	bd, _ = b.Liquid("diesel")
	bf, _ := bd.Fluid(calc.Celsius(20), 101325)
	if float64(d.Density) != 838 || d.Viscosity != bf.Viscosity || d.VaporPressure != bf.VaporPressure {
		t.Errorf("diesel override: %+v vs built-in %+v", d, bf)
	}
	dl, _ := c.Liquid("diesel")
	if dl.Class != ClassII || !dl.Hazards.Has(Combustible) || !strings.Contains(dl.Sources.Density, "delivery note") {
		t.Errorf("diesel override lost class, hazards or source: %+v", dl)
	}
	// Models.
	if fl := at("saltpan-brine", 25); !testkit.Within(float64(fl.Density), sharqawyDensity(25, 0.120), 1e-9) {
		t.Errorf("saltpan-brine: %+v", fl)
	}
	sb, _ := c.Liquid("saltpan-brine")
	if !sb.Hazards.Has(Environmental) {
		t.Error("saltpan-brine lost the seawater model's hazards")
	}
	g70, _ := c.Liquid("gasoline-70")
	if !g70.Hazards.Has(Flammable) || g70.Class != ClassIB {
		t.Errorf("gasoline-70: %v %v", g70.Hazards, g70.Class)
	}
	if fl := at("gear-oil-150", 40); !testkit.Within(float64(fl.Viscosity)/float64(fl.Density)*1e6, 150, 1e-9) {
		t.Errorf("gear oil ν40: %+v", fl)
	}
	gear, _ := c.Liquid("gear-oil-150")
	if gear.Class != ClassIIIB || !gear.Hazards.Has(Combustible) {
		t.Errorf("gear oil class %v hazards %v", gear.Class, gear.Hazards)
	}
	// Other sections.
	if h, ok := c.Hose("30mm"); !ok || !testkit.Within(float64(h.Diameter), 0.030, 1e-12) {
		t.Errorf("hose 30mm: %+v", h)
	}
	if m, ok := c.Material("blue-suction"); !ok || !testkit.Within(float64(m.Roughness), 5e-6, 1e-15) {
		t.Errorf("material: %+v", m)
	}
	if fv, _ := c.Fitting("foot-valve"); fv.K.Central != 18 || fv.Where != AtEntrance {
		t.Errorf("foot-valve override: %+v", fv)
	}
	if tk, ok := c.Tank("north-sump"); !ok || !tk.ConfinedSpace || tk.Sizes[0] != (Size{"diameter", 1.2}) {
		t.Errorf("tank: %+v", tk)
	}
	for _, l := range c.Liquids() {
		walkFluid(t, l)
	}
}

// A bad file gives a *ParseError with the line and field; the built-in
// catalogue still loads through WithUser.
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
			if !strings.HasPrefix(err.Error(), "presets.toml:") {
				t.Errorf("message %q lacks the file name", err)
			}
			b, err2 := WithUser(strings.NewReader(k.src), "presets.toml")
			if err2 == nil || b == nil || len(b.Liquids()) != len(Builtin().Liquids()) {
				t.Error("WithUser did not fall back to the built-in catalogue")
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
	b, err := os.ReadFile("testdata/user.toml")
	if err != nil {
		f.Fatal(err) // a missing seed fixture fails, never silently shrinks the corpus
	}
	f.Add(string(b))
	f.Add("[[fitting]]\nid = \"f\"\nk_ft = 20\nk_ft_high = 30\nwhere = \"up-leg\"\nsource = \"s\"\n[[priming]]\nid = \"p\"\nnot_for = [\"toxic\"]\nsource = \"s\"\n")
	f.Add("[[liquid]]\nid = \"a\"\nsource = \"s\"\n[liquid.table]\nt_c = [5]\ndensity_kg_m3 = [1000]\nviscosity_mpa_s = [1]\n")
	f.Add("[[liquid]]\nid = \"o\"\nsource = \"s\"\nmodel = \"oil\"\ndensity_15c_kg_m3 = 880\nnu1_mm2_s = 10000\nnu2_mm2_s = 0.3\nt_min_c = -60\nt_max_c = 200\n")
	f.Add("[[liquid]]\nid = \"w\"\nbased_on = \"water\"\nvapor_pressure_pa = 200000\n")
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
