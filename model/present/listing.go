package present

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strings"
	"unicode/utf8"

	"drawdown/calc"
	"drawdown/presets"
)

// listingWidth is the width WriteListing wraps to, for an 80-column terminal.
const listingWidth = 79

// WriteListing writes the human listing of the catalogue for
// `drawdown presets`: every entry with its values, valid range and sources,
// wrapped to 80 columns, in SI units with the inch sizes alongside.
func WriteListing(w io.Writer, c *presets.Catalogue) error {
	bw := bufio.NewWriter(w)
	lw := &listWriter{w: bw}
	for _, section := range []func(*listWriter, *presets.Catalogue){listLiquids, listMaterials, listHoses, listSeries, listFittings,
		listIntakes, listTanks, listPriming, listAids} {
		section(lw, c)
	}
	lw.heading("CAUTION", "These values plan a job; they do not make it safe. Follow the site's "+
		"written procedures, local codes and permits, and the product's safety data sheet.")
	if lw.err != nil {
		return lw.err
	}
	return bw.Flush()
}

func listLiquids(lw *listWriter, c *presets.Catalogue) {
	lw.heading("LIQUIDS", "Properties shown at 20 °C and 1 atm, or at the nearest valid temperature. "+
		"Also accepted: seawater:S or brine:S (salinity S g/kg, up to 150) and gasoline:R "+
		"(Reid vapour pressure R kPa, 20 to 110).")
	for _, l := range c.Liquids() {
		lw.entry(l.ID, l.Name)
		if l.Basis != "" {
			lw.field("basis", l.Basis)
		}
		lw.field("valid", fmt.Sprintf("%s to %s °C (%s to %s °F)", cnum(l.Min), cnum(l.Max), fnum(l.Min), fnum(l.Max)))
		T := calc.Celsius(20)
		if T < l.Min {
			T = l.Min
		} else if T > l.Max {
			T = l.Max
		}
		if f, err := l.Fluid(T, 101325); err == nil {
			lw.field("at "+cnum(T)+" °C", fmt.Sprintf("density %.1f kg/m³, viscosity %.3g mPa·s, vapour pressure %s",
				float64(f.Density), float64(f.Viscosity)*1e3, pressureText(float64(f.VaporPressure))))
		} else {
			lw.field("at "+cnum(T)+" °C", err.Error())
		}
		if l.Cold > 0 {
			lw.field("cold limit", fmt.Sprintf("%s %s °C (%s °F)", l.ColdKind, cnum(l.Cold), fnum(l.Cold)))
		}
		if l.Flash > 0 {
			lw.field("flash point", fmt.Sprintf("%s °C (%s °F), NFPA 30 class %s", cnum(l.Flash), fnum(l.Flash), l.Class))
		}
		lw.field("hazards", l.Hazards.String())
		lw.field("density", l.Sources.Density)
		lw.field("viscosity", l.Sources.Viscosity)
		lw.field("vapour", l.Sources.VaporPressure)
		lw.field("range", l.Sources.Range)
		if l.Sources.Cold != "" {
			lw.field("cold src", l.Sources.Cold)
		}
		if l.Sources.Flash != "" {
			lw.field("flash src", l.Sources.Flash)
		}
		if l.Note != "" {
			lw.field("note", l.Note)
		}
		lw.origin(l.Origin)
	}
}

func listMaterials(lw *listWriter, c *presets.Catalogue) {
	lw.heading("HOSE MATERIALS", "Absolute roughness ε, central value and published range.")
	for _, m := range c.Materials() {
		lw.entry(m.ID, m.Name)
		lw.aliases(m.Aliases)
		lw.field("roughness", fmt.Sprintf("%s mm (%s to %s mm)", mmText(m.Roughness), mmText(m.RoughnessLow), mmText(m.RoughnessHigh)))
		if m.Collapses {
			lw.field("WARNING", "collapses under suction: not for siphons")
		}
		lw.field("vacuum", vacuumText(m))
		if m.VacuumSource != "" {
			lw.field("vac source", m.VacuumSource)
		}
		lw.field("source", m.Source)
		if m.Note != "" {
			lw.field("note", m.Note)
		}
		lw.origin(m.Origin)
	}
}

func listHoses(lw *listWriter, c *presets.Catalogue) {
	lw.heading("HOSE SIZES", "Inside diameters; check the actual bore of your hose. Other spellings "+
		"of a size are accepted: 1.5in, 1 1/2 in or 1-1/2\" for 1-1/2in, 38 mm for 38mm.")
	for _, h := range c.Hoses() {
		also := ""
		if len(h.Aliases) > 0 {
			also = "; also " + strings.Join(h.Aliases, ", ")
		}
		lw.line(fmt.Sprintf("  %-9s %s, %.2f in%s", h.ID, h.Name+mmSuffix(h), float64(h.Diameter)/0.0254, also))
	}
	srcs := map[string]bool{}
	for _, h := range c.Hoses() {
		if !srcs[h.Source] {
			srcs[h.Source] = true
			lw.field("source", h.Source)
		}
	}
}

func listSeries(lw *listWriter, c *presets.Catalogue) {
	lw.heading("SIZE SERIES", presets.BoreHelp()+" Below, pipe and hose by nominal size with the bore to enter "+
		"and, in brackets, the bores the standard's tolerances allow.")
	for _, sr := range c.Series() {
		lw.entry(sr.ID, sr.Name)
		lw.field("standard", sr.Standard)
		lw.field("bore", sr.Method)
		for _, n := range sr.Sizes {
			t := fmt.Sprintf("bore %.1f mm (%.1f to %.1f)", float64(n.Bore)*1e3, float64(n.BoreLow)*1e3, float64(n.BoreHigh)*1e3)
			if n.OD > 0 {
				t += fmt.Sprintf("; OD %.1f mm, wall %s mm", float64(n.OD)*1e3, mm2(n.Wall))
			}
			if len(n.Aliases) > 0 {
				t += "; also " + strings.Join(n.Aliases, ", ")
			}
			lw.field(n.Nominal, t)
		}
		lw.field("source", sr.Source)
		if sr.Note != "" {
			lw.field("note", sr.Note)
		}
	}
}

// mm2 is a length in millimetres to 0.01 mm, trailing zeros dropped.
func mm2(l calc.Length) string { return gnum(math.Round(float64(l)*1e5) / 100) }

func listFittings(lw *listWriter, c *presets.Catalogue) {
	lw.heading("FITTINGS", "Loss coefficient K, central (low to high). n·f_T values follow Crane "+
		"TP-410 and are shown for a 25 mm and a 50 mm hose. [memory] marks a value from memory.")
	for _, f := range c.Fittings() {
		lw.entry(f.ID, f.Name)
		lw.aliases(f.Aliases)
		var k string
		if f.PerFT {
			a, b := f.KAt(0.025), f.KAt(0.050)
			k = fmt.Sprintf("%s f_T (%s to %s): %s at 25 mm, %s at 50 mm", gnum(f.K.Central), gnum(f.K.Low), gnum(f.K.High),
				kText(a), kText(b))
		} else {
			k = kText(f.K)
		}
		if f.FromMemory {
			k += " [memory]"
		}
		lw.field("K", k)
		lw.field("where", f.Where.String())
		lw.field("source", f.Source)
		if f.Note != "" {
			lw.field("note", f.Note)
		}
		lw.origin(f.Origin)
	}
	lw.line("  The exit loss (K = 1) is added by the calculation; do not list it.")
}

func listIntakes(lw *listWriter, c *presets.Catalogue) {
	lw.heading("INTAKES", "How the hose end draws. K: entrance loss coefficient at the hose velocity, "+
		"central (low to high). Sizes in bores scale with the hose's inside diameter. "+
		"Default when none is chosen: "+presets.DefaultIntake+". [memory] marks a value from memory.")
	for _, in := range c.Intakes() {
		lw.entry(in.ID, in.Name)
		lw.aliases(in.Aliases)
		k := kText(in.K)
		if in.FromMemory {
			k += " [memory]"
		}
		lw.field("K", k)
		lw.field("face", sizeText(in.Face, in.FaceBores, "across"))
		if in.Kind == presets.FloatingIntake {
			lw.field("depth", fmt.Sprintf("%s mm below the surface", mmText(in.Depth)))
		} else {
			lw.field("mouth", sizeText(in.Mouth, in.MouthBores, "above the floor (top of the opening)"))
		}
		if in.OpenRatio > 0 {
			lw.field("open area", fmt.Sprintf("%s %% of the screen", gnum(in.OpenRatio*100)))
		}
		if in.Kind == presets.SuctionPlate {
			lw.field("draws to", fmt.Sprintf("%s mm above the floor (rated)", mmText(in.DrawDown)))
		}
		lw.field("K source", in.KSource)
		lw.field("source", in.Source)
		if in.Note != "" {
			lw.field("note", in.Note)
		}
		lw.origin(in.Origin)
	}
}

// inHg is one inch of mercury at 0 °C, Pa (NIST SP 811).
const inHg = 3386.389

// vacuumText words a material's vacuum rating, gauge, in kPa and inHg as
// hoses are rated.
func vacuumText(m presets.Material) string {
	switch m.VacuumClass {
	case presets.VacuumRated:
		t := fmt.Sprintf("%s kPa (%.1f inHg), gauge", gnum(float64(m.Vacuum)/1000), float64(m.Vacuum)/inHg)
		if m.Vacuum >= presets.FullVacuum {
			return "rated to full vacuum, " + t
		}
		return "rated " + t
	case presets.VacuumNone:
		return "none: the wall collapses"
	case presets.VacuumNotRated:
	}
	return "not rated: check the hose's marking"
}

// sizeText words a size given as millimetres plus hose bores.
func sizeText(l calc.Length, bores float64, what string) string {
	var parts []string
	if l > 0 {
		parts = append(parts, mmText(l)+" mm")
	}
	if bores > 0 {
		unit := "bores"
		if bores == 1 {
			unit = "bore"
		}
		parts = append(parts, gnum(bores)+" "+unit)
	}
	if len(parts) == 0 {
		parts = append(parts, "0 mm")
	}
	return strings.Join(parts, " + ") + " " + what
}

func listTanks(lw *listWriter, c *presets.Catalogue) {
	lw.heading("TANK TEMPLATES", "Sizes in metres (side-slope: run per unit rise).")
	for _, t := range c.Tanks() {
		lw.entry(t.ID, t.Name)
		parts := make([]string, 0, len(t.Sizes))
		for _, s := range t.Sizes {
			parts = append(parts, s.Name+" "+gnum(s.Value))
		}
		lw.field("shape", t.Shape+": "+strings.Join(parts, ", "))
		if t.ConfinedSpace {
			lw.field("CAUTION", "confined space if entered: permit, atmospheric testing, attendant")
		}
		lw.field("source", t.Source)
		if t.Note != "" {
			lw.field("note", t.Note)
		}
		lw.origin(t.Origin)
	}
}

func listPriming(lw *listWriter, c *presets.Catalogue) {
	lw.heading("PRIMING METHODS", presets.NeverByMouth)
	for _, m := range c.PrimingMethods() {
		lw.entry(m.ID, m.Name)
		lw.field("how", m.Summary)
		if m.NotFor != 0 {
			lw.field("not for", m.NotFor.String())
		}
		if m.Caution != "" {
			lw.field("caution", m.Caution)
		}
		lw.field("source", m.Source)
		lw.origin(m.Origin)
	}
}

func listAids(lw *listWriter, c *presets.Catalogue) {
	lw.heading("PRIMING AIDS", "Enter your own stroke volume; the ranges only guide it.")
	for _, a := range c.PrimingAids() {
		lw.entry(a.ID, a.Name)
		lw.field("stroke", fmt.Sprintf("%s to %s mL", gnum(float64(a.StrokeLow)*1e6), gnum(float64(a.StrokeHigh)*1e6)))
		lw.field("source", a.Source)
		if a.Note != "" {
			lw.field("note", a.Note)
		}
		lw.origin(a.Origin)
	}
}

type listWriter struct {
	w   *bufio.Writer
	err error
}

// line writes one line; every line passes the sanitiser, since names,
// notes and sources may come from a user's presets file.
func (lw *listWriter) line(s string) {
	if lw.err != nil {
		return
	}
	_, lw.err = lw.w.WriteString(strings.TrimRight(Clean(s), " ") + "\n")
}

func (lw *listWriter) heading(title, intro string) {
	lw.line("")
	lw.line(title)
	for _, l := range wrap(intro, listingWidth-2) {
		lw.line("  " + l)
	}
}

func (lw *listWriter) entry(id, name string) {
	lw.line("")
	lw.line(fmt.Sprintf("  %s  %s", id, name))
}

// field writes "label: text" with the text wrapped and indented under
// itself: label column 4–15, text from column 17.
func (lw *listWriter) field(label, text string) {
	const indent = 17
	lines := wrap(text, listingWidth-indent)
	for i, l := range lines {
		if i == 0 {
			lw.line(fmt.Sprintf("    %-12s %s", label, l))
		} else {
			lw.line(strings.Repeat(" ", indent) + l)
		}
	}
	if len(lines) == 0 {
		lw.line(fmt.Sprintf("    %-12s", label))
	}
}

// aliases lists the other IDs an entry is found by.
func (lw *listWriter) aliases(a []string) {
	if len(a) > 0 {
		lw.field("also", strings.Join(a, ", "))
	}
}

func (lw *listWriter) origin(o string) {
	if o != "" && o != "built-in" {
		lw.field("from", o)
	}
}

// units that wrap keeps on the same line as the number before them.
var glueUnits = map[string]bool{
	"Pa": true, "kPa": true, "°C": true, "°F": true, "K": true, "mm": true, "m": true, "mL": true,
	"mm²/s": true, "mPa·s": true, "kg/m³": true, "%": true, "in": true, "psi": true,
}

// wrap splits s into lines of at most width runes at spaces, keeping a unit
// with its number; a word longer than width is cut.
func wrap(s string, width int) []string {
	var words []string
	for _, w := range strings.Fields(s) {
		if n := len(words); n > 0 && glueUnits[strings.TrimRight(w, ",.;:)")] {
			prev := words[n-1]
			if prev != "" && prev[len(prev)-1] >= '0' && prev[len(prev)-1] <= '9' {
				words[n-1] = prev + "\x00" + w
				continue
			}
		}
		words = append(words, w)
	}
	var out []string
	var cur strings.Builder
	n := 0
	flush := func() {
		out = append(out, strings.ReplaceAll(cur.String(), "\x00", " "))
		cur.Reset()
		n = 0
	}
	for _, word := range words {
		for utf8.RuneCountInString(word) > width {
			if n > 0 {
				flush()
			}
			r := []rune(word)
			out = append(out, strings.ReplaceAll(string(r[:width]), "\x00", " "))
			word = string(r[width:])
		}
		wl := utf8.RuneCountInString(word)
		if n > 0 && n+1+wl > width {
			flush()
		}
		if n > 0 {
			cur.WriteByte(' ')
			n++
		}
		cur.WriteString(word)
		n += wl
	}
	if n > 0 {
		flush()
	}
	return out
}

func cnum(t calc.Temperature) string { return gnum(math.Round(t.Celsius()*100) / 100) }

// fnum is the temperature in °F, rounded to 0.1.
func fnum(t calc.Temperature) string { return gnum(math.Round((t.Celsius()*1.8+32)*10) / 10) }

func gnum(v float64) string { return fmt.Sprintf("%.4g", v) }

func mmText(l calc.Length) string { return gnum(float64(l) * 1000) }

func kText(k presets.KRange) string {
	return fmt.Sprintf("%s (%s to %s)", gnum(k.Central), gnum(k.Low), gnum(k.High))
}

func mmSuffix(h presets.Hose) string {
	if strings.Contains(h.Name, "mm") {
		return ""
	}
	return fmt.Sprintf(" (%s mm)", mmText(h.Diameter))
}

func pressureText(pa float64) string {
	if pa >= 1000 {
		return fmt.Sprintf("%.3g kPa", pa/1000)
	}
	return fmt.Sprintf("%.3g Pa", pa)
}
