package presets

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"drawdown/calc"
)

// Size series: pipe and hose sold by a nominal size, with the inside
// diameter (the bore) each size really has. A siphon's flow goes with the
// bore to about the 2.5th power, so "63 mm" PE pipe typed as 63 mm, when its
// bore is about 51 mm, overstates the flow by two thirds.

// BoreHelp is the one-line help of a hose or pipe inside-diameter field:
// the bore, not the nominal size, with a worked example from the series
// tables (63 mm PE SDR 11).
func BoreHelp() string {
	ex := "a pipe's nominal size is not its bore"
	if s, ok := Builtin().Bore("pe-sdr11", "63mm"); ok {
		ex = fmt.Sprintf("63 mm PE pipe SDR 11 has a bore of %s mm", strconv.FormatFloat(math.Round(float64(s.Bore)*1e4)/10, 'g', 4, 64))
	}
	return "Enter the bore (inside diameter), not the nominal size: " + ex + "; drawdown presets lists the bores."
}

// SizeSeries is a family of pipe or hose sizes chosen by nominal size, with
// the published inside diameter of each.
type SizeSeries struct {
	ID       string // e.g. "sch40", "pe-sdr11", "suction-hose"
	Name     string
	Kind     string // "pipe" or "hose"
	Standard string // the dimension standard
	// How the bore is worked out and what its band is.
	Method string
	Sizes  []NominalSize
	Source string // where the figures come from
	Note   string
}

// NominalSize is one size of a series.
type NominalSize struct {
	Nominal string   // the canonical nominal size, e.g. "2in", "63mm"
	Aliases []string // other accepted spellings, e.g. "dn50"
	// OD and Wall are the standard's outside diameter and wall (the
	// nominal wall of a steel schedule, the minimum wall of a plastics
	// pipe); both 0 for hose, which is sold by its bore.
	OD, Wall calc.Length
	// Bore is the inside diameter to plan with; BoreLow and BoreHigh bound
	// the bores the standard's tolerances allow.
	Bore, BoreLow, BoreHigh calc.Length
	Source                  string
}

// Tolerance is the larger distance from Bore to either end of its band,
// as a fraction of Bore (0.02 for ±2 %).
func (n NominalSize) Tolerance() float64 {
	if n.Bore <= 0 {
		return 0
	}
	return math.Max(float64(n.Bore-n.BoreLow), float64(n.BoreHigh-n.Bore)) / float64(n.Bore)
}

// Series returns the size series in a fixed order (a copy).
func (c *Catalogue) Series() []SizeSeries {
	return cloneSeries(c.series)
}

func cloneSizes(in []NominalSize) []NominalSize {
	out := make([]NominalSize, len(in))
	for i, n := range in {
		out[i] = n
		out[i].Aliases = append([]string(nil), n.Aliases...)
	}
	return out
}

// Bore returns the size of the series with the given nominal size. The
// nominal size may be written as listed ("2in", "63mm") or in another
// spelling: `2"`, "2", "2.5in", "2 1/2 in", "DN50"; a bare number is taken
// in the series' own unit (inches for a pipe schedule, millimetres for PE
// pipe and hose). A hose series also takes the inch size of a hose whose
// bore band holds it ("1-1/2in" is the 38 mm hose).
func (c *Catalogue) Bore(series, nominal string) (NominalSize, bool) {
	series = norm(series)
	for _, s := range c.series {
		if s.ID != series {
			continue
		}
		if n, ok := s.lookup(nominal); ok {
			n.Aliases = append([]string(nil), n.Aliases...)
			return n, true
		}
		return NominalSize{}, false
	}
	return NominalSize{}, false
}

func (s SizeSeries) lookup(nominal string) (NominalSize, bool) {
	q := norm(nominal)
	for _, n := range s.Sizes {
		if n.Nominal == q || containsString(n.Aliases, q) {
			return n, true
		}
	}
	v, u, ok := parseSize(q)
	if !ok {
		return NominalSize{}, false
	}
	for _, n := range s.Sizes {
		nv, nu, _ := parseSize(n.Nominal)
		if sameSize(v, u, nv, nu) {
			return n, true
		}
		for _, a := range n.Aliases {
			if av, au, ok := parseSize(a); ok && au != unitNone && sameSize(v, u, av, au) {
				return n, true
			}
		}
	}
	return NominalSize{}, false
}

func containsString(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// ---------------------------------------------------------------------------
// Steel pipe schedules (ASME B36.10M, B36.19M).

// npsRow is one nominal pipe size: OD and the Schedule 40 and 80 walls in
// inches, as ASME B36.10M tabulates them, and the DN of the same size.
type npsRow struct {
	nps                string
	dn                 int
	od, wall40, wall80 float64    // in
	pvcOD              [2]float64 // ASTM D1785 min and max OD, mm
	pvc40, pvc80       [2]float64 // ASTM D1785 min and max walls, mm
	hasPVC             bool
}

// npsTable: ASME B36.10M-2018 Table 1 (OD, Sch 40 and Sch 80 walls, in);
// B36.19M's 40S and 80S walls are the same for NPS ½ to 6. Confirmed: OD and
// walls against the Grinnell IH-1000M handbook table (B36.10/B36.19, mm to
// 0.1) and a steel pipe chart (studylib "Pipe size B36.10/19": NPS 4 Sch 40
// 0.237 in, Sch 80 0.337 in); Sch 80 for NPS ½, 1, 2, 4, 6 against
// united-steel.com. ASTM D1785 PVC columns: min and max OD and walls of a
// maker's sheet to ASTM D1785-88 (pdfcoffee.com "ASTM D1785, ASTM D2665").
var npsTable = []npsRow{
	{"1/2in", 15, 0.840, 0.109, 0.147, [2]float64{21.24, 21.44}, [2]float64{2.77, 3.28}, [2]float64{3.73, 4.24}, true},
	{"3/4in", 20, 1.050, 0.113, 0.154, [2]float64{26.57, 26.77}, [2]float64{2.87, 3.38}, [2]float64{3.91, 4.42}, true},
	{"1in", 25, 1.315, 0.133, 0.179, [2]float64{33.27, 33.53}, [2]float64{3.38, 3.89}, [2]float64{4.55, 5.08}, true},
	{"1-1/4in", 32, 1.660, 0.140, 0.191, [2]float64{42.03, 42.29}, [2]float64{3.56, 4.07}, [2]float64{4.85, 5.43}, true},
	{"1-1/2in", 40, 1.900, 0.145, 0.200, [2]float64{48.11, 48.41}, [2]float64{3.68, 4.19}, [2]float64{5.08, 5.69}, true},
	{"2in", 50, 2.375, 0.154, 0.218, [2]float64{60.17, 60.47}, [2]float64{3.91, 4.42}, [2]float64{5.54, 6.20}, true},
	{"2-1/2in", 65, 2.875, 0.203, 0.276, [2]float64{72.84, 73.20}, [2]float64{5.16, 5.77}, [2]float64{7.01, 7.85}, true},
	{"3in", 80, 3.500, 0.216, 0.300, [2]float64{88.70, 89.10}, [2]float64{5.49, 6.15}, [2]float64{7.62, 8.53}, true},
	{"3-1/2in", 90, 4.000, 0.226, 0.318, [2]float64{}, [2]float64{}, [2]float64{}, false},
	{"4in", 100, 4.500, 0.237, 0.337, [2]float64{114.07, 114.53}, [2]float64{6.02, 6.73}, [2]float64{8.56, 9.58}, true},
	{"5in", 125, 5.563, 0.258, 0.375, [2]float64{141.05, 141.55}, [2]float64{6.55, 7.34}, [2]float64{9.52, 10.66}, true},
	{"6in", 150, 6.625, 0.280, 0.432, [2]float64{168.00, 168.56}, [2]float64{7.11, 7.97}, [2]float64{10.97, 12.29}, true},
}

// millTolerance is the wall tolerance of steel pipe, ±12.5 % of the
// nominal wall ("mill tolerances as high as ±12½ % are permitted", note to
// the ANSI B36.10 and B36.19 table, civilengineeringhandbook.tk; ASTM A53
// and A106 set the minimum wall at 87.5 % of nominal, from memory). The OD
// tolerance (under 1 %) is left out.
const millTolerance = 0.125

const inch = 0.0254

func steelSchedule(id, name string, wall func(npsRow) float64) SizeSeries {
	s := SizeSeries{ID: id, Name: name, Kind: "pipe",
		Standard: "ASME B36.10M (carbon steel); B36.19M 40S and 80S (stainless) have the same walls for NPS 1/2 to 6",
		Method:   "bore = OD - 2 x nominal wall; band from a wall within ±12.5 % of nominal (mill tolerance)",
		Source:   "ASME B36.10M-2018 Table 1 values, confirmed against the Grinnell IH-1000M table and published pipe charts; mill tolerance ±12.5 % (note to the ANSI B36.10 table)",
		Note:     "Galvanised pipe has the same bore when new; scale and rust narrow an old pipe."}
	for _, r := range npsTable {
		od, t := r.od*inch, wall(r)*inch
		s.Sizes = append(s.Sizes, NominalSize{Nominal: r.nps, Aliases: npsAliases(r),
			OD: calc.Length(od), Wall: calc.Length(t),
			Bore:    calc.Length(od - 2*t),
			BoreLow: calc.Length(od - 2*t*(1+millTolerance)), BoreHigh: calc.Length(od - 2*t*(1-millTolerance)),
			Source: s.Source})
	}
	return s
}

// npsAliases: the DN of the size and its decimal-inch spelling.
func npsAliases(r npsRow) []string {
	out := []string{fmt.Sprintf("dn%d", r.dn)}
	if v, _, ok := parseSize(r.nps); ok && strings.Contains(r.nps, "/") {
		out = append(out, strconvG(v)+"in")
	}
	return out
}

func strconvG(v float64) string { return fmt.Sprintf("%g", v) }

func pvcSchedule(id, name string, wall func(npsRow) [2]float64) SizeSeries {
	s := SizeSeries{ID: id, Name: name, Kind: "pipe",
		Standard: "ASTM D1785 (PVC pipe, Schedules 40, 80 and 120): the steel pipe OD with the schedule wall as a minimum",
		Method:   "bore = nominal OD - 2 x minimum wall; band from the standard's least OD with the greatest wall to its greatest OD with the least wall",
		Source:   "ASTM D1785-88 minimum and maximum OD and walls as printed in a maker's data sheet (pdfcoffee.com, 'ASTM D1785, ASTM D2665'); nominal OD from ASME B36.10M",
		Note:     "Thin-walled plastic pipe can collapse under a siphon's vacuum: check its rating."}
	for _, r := range npsTable {
		if !r.hasPVC {
			continue
		}
		od, w := r.od*inch, wall(r)
		s.Sizes = append(s.Sizes, NominalSize{Nominal: r.nps, Aliases: npsAliases(r),
			OD: calc.Length(od), Wall: calc.Length(w[0] / 1000),
			Bore:    calc.Length(od - 2*w[0]/1000),
			BoreLow: calc.Length((r.pvcOD[0] - 2*w[1]) / 1000), BoreHigh: calc.Length((r.pvcOD[1] - 2*w[0]) / 1000),
			Source: s.Source})
	}
	return s
}

// ---------------------------------------------------------------------------
// PE pipe (ISO 4427-2, AS/NZS 4130).

// peRow is one PE pipe size: the nominal outside diameter d_n and the
// minimum walls e_min of SDR 11 and SDR 17 (0: not made), mm.
type peRow struct {
	dn           float64
	sdr11, sdr17 float64
}

// peTable: ISO 4427-2:2007 wall thicknesses (e_min, mm) for SDR 11 and
// SDR 17, as reprinted in a PE pipe maker's table (rotorwandatanks.com,
// "PE pipes according to ISO 4427 and DIN 8074") and a PE100 brochure
// (vesbo.com HDPE brochure p. 3, which also prints the maximum OD and
// walls). AS/NZS 4130 uses the same outside diameters and SDR series (from
// memory).
var peTable = []peRow{
	{20, 2.0, 0}, {25, 2.3, 0}, {32, 3.0, 2.0}, {40, 3.7, 2.4}, {50, 4.6, 3.0}, {63, 5.8, 3.8},
	{75, 6.8, 4.5}, {90, 8.2, 5.4}, {110, 10.0, 6.6}, {125, 11.4, 7.4}, {140, 12.7, 8.3},
	{160, 14.6, 9.5}, {180, 16.4, 10.7}, {200, 18.2, 11.9}, {225, 20.5, 13.4}, {250, 22.7, 14.8},
}

// roundUp01 rounds x up to the next 0.1 (mm), ignoring float noise.
func roundUp01(x float64) float64 { return math.Ceil(x*10-1e-9) / 10 }

// peMaxOD is the greatest mean outside diameter, ISO 4427-2 grade B: d_n
// plus 0.009 d_n rounded up to 0.1 mm, at least 0.3 mm (ISO 11922-1, from
// memory; it reproduces the brochure's maximum ODs, see the tests).
func peMaxOD(dn float64) float64 { return dn + math.Max(0.3, roundUp01(0.009*dn)) }

// peMaxWall is the greatest wall, ISO 11922-1 grade V: e_min plus
// 0.1 e_min + 0.1 mm rounded up to 0.1 mm (from memory; it reproduces the
// brochure's and MS 1058-2's maximum walls, see the tests).
func peMaxWall(emin float64) float64 { return emin + roundUp01(0.1*emin+0.1) }

func peSeries(sdr int) SizeSeries {
	s := SizeSeries{ID: fmt.Sprintf("pe-sdr%d", sdr), Name: fmt.Sprintf("PE pipe SDR %d (metric OD)", sdr), Kind: "pipe",
		Standard: "ISO 4427-2 (also AS/NZS 4130 and EN 12201-2): sold by outside diameter",
		Method:   "bore = nominal OD - 2 x minimum wall; band from the nominal OD with the greatest wall (grade V) to the greatest mean OD (grade B) with the least wall",
		Source:   "ISO 4427-2:2007 minimum walls via rotorwandatanks.com and vesbo.com tables; OD and wall tolerances of ISO 11922-1 grades B and V (formulas from memory, checked against the vesbo.com maximum values)",
		Note:     "The nominal size of PE pipe is its outside diameter: 63 mm pipe has a bore near 51 mm at SDR 11."}
	for _, r := range peTable {
		e := r.sdr11
		if sdr == 17 {
			e = r.sdr17
		}
		if e == 0 {
			continue
		}
		nom := strconvG(r.dn) + "mm"
		s.Sizes = append(s.Sizes, NominalSize{Nominal: nom, Aliases: []string{fmt.Sprintf("dn%g", r.dn)},
			OD: calc.Length(r.dn / 1000), Wall: calc.Length(e / 1000),
			Bore:    calc.Length((r.dn - 2*e) / 1000),
			BoreLow: calc.Length((r.dn - 2*peMaxWall(e)) / 1000), BoreHigh: calc.Length((peMaxOD(r.dn) - 2*e) / 1000),
			Source: s.Source})
	}
	return s
}

// ---------------------------------------------------------------------------
// Hose (EN ISO 1307).

// hoseRow is one hose size of EN ISO 1307 Table 1 with its least and
// greatest inside diameter, mm, for hose built on a rigid mandrel (type A)
// and built without a mandrel (type C); 0: the size is not listed.
type hoseRow struct {
	nominal float64
	a, c    [2]float64
}

// hoseTable: EN ISO 1307:2008 Table 1 as printed by a hose maker
// (semperflex.com, "Tolerances, inner diameter": types A, with fixed
// mandrel, and C, without mandrel).
var hoseTable = []hoseRow{
	{12.5, [2]float64{12.3, 13.5}, [2]float64{11.9, 13.5}},
	{16, [2]float64{15.5, 16.7}, [2]float64{15.1, 16.7}},
	{19, [2]float64{18.6, 19.8}, [2]float64{18.3, 19.9}},
	{20, [2]float64{19.6, 20.8}, [2]float64{19.3, 20.9}},
	{25, [2]float64{25.0, 26.4}, [2]float64{24.2, 26.6}},
	{31.5, [2]float64{31.4, 33.0}, [2]float64{30.2, 33.4}},
	{38, [2]float64{37.7, 39.3}, [2]float64{36.5, 39.7}},
	{40, [2]float64{39.7, 41.3}, [2]float64{38.5, 41.7}},
	{50, [2]float64{49.4, 51.0}, [2]float64{48.1, 51.6}},
	{51, [2]float64{50.4, 52.0}, [2]float64{49.1, 52.6}},
	{63, [2]float64{63.1, 65.1}, [2]float64{61.5, 65.5}},
	{76, [2]float64{74.6, 77.8}, [2]float64{74.2, 78.2}},
	{80, [2]float64{78.6, 81.8}, [2]float64{78.2, 82.2}},
	{100, [2]float64{100.0, 103.2}, [2]float64{99.4, 103.9}},
	{125, [2]float64{125.4, 128.6}, [2]float64{124.8, 129.3}},
	{150, [2]float64{150.4, 154.4}, [2]float64{150.2, 154.7}},
	{200, [2]float64{200.7, 205.7}, [2]float64{200.2, 206.2}},
}

// hoseInchSizes are the inch sizes hose is also sold by; each becomes an
// alias of the metric size whose band holds it (nearest nominal first).
var hoseInchSizes = []string{"1/2in", "5/8in", "3/4in", "1in", "1-1/4in", "1-1/2in", "2in", "2-1/2in", "3in", "4in", "5in", "6in", "8in"}

func hoseSeries(id, name, kind string, band func(hoseRow) [2]float64) SizeSeries {
	s := SizeSeries{ID: id, Name: name, Kind: "hose",
		Standard: "EN ISO 1307 (hose sizes and inside-diameter limits), " + kind,
		Method:   "hose is sold by its bore: bore = midpoint of the standard's least and greatest inside diameter; band = those limits",
		Source:   "EN ISO 1307:2008 Table 1 as printed by Semperit (semperflex.com, 'Tolerances, inner diameter'); type C covers spiral-reinforced plastics suction and discharge hose (ISO 1307:2006 scope, jiayuanfitting.com)",
		Note:     "Measure the bore if the hose is old or its marking is gone."}
	for _, r := range hoseTable {
		b := band(r)
		if b[1] == 0 {
			continue
		}
		s.Sizes = append(s.Sizes, NominalSize{Nominal: strconvG(r.nominal) + "mm",
			Bore: calc.Length((b[0] + b[1]) / 2000), BoreLow: calc.Length(b[0] / 1000), BoreHigh: calc.Length(b[1] / 1000),
			Source: s.Source})
	}
	for _, in := range hoseInchSizes {
		v, _, _ := parseSize(in)
		mm := v * 25.4
		best := -1
		for i, n := range s.Sizes {
			lo, hi := float64(n.BoreLow)*1000, float64(n.BoreHigh)*1000
			if mm < lo || mm > hi {
				continue
			}
			if best < 0 || math.Abs(float64(n.Bore)*1000-mm) < math.Abs(float64(s.Sizes[best].Bore)*1000-mm) {
				best = i
			}
		}
		if best >= 0 {
			s.Sizes[best].Aliases = append(s.Sizes[best].Aliases, in)
		}
	}
	return s
}

// builtinSeries builds the size series (their bores are computed from the
// tables above each time).
func builtinSeries() []SizeSeries {
	return []SizeSeries{
		steelSchedule("sch40", "Steel pipe, Schedule 40 (Sch 40S)", func(r npsRow) float64 { return r.wall40 }),
		steelSchedule("sch80", "Steel pipe, Schedule 80 (Sch 80S)", func(r npsRow) float64 { return r.wall80 }),
		pvcSchedule("pvc-sch40", "PVC pipe, Schedule 40", func(r npsRow) [2]float64 { return r.pvc40 }),
		pvcSchedule("pvc-sch80", "PVC pipe, Schedule 80", func(r npsRow) [2]float64 { return r.pvc80 }),
		peSeries(11),
		peSeries(17),
		hoseSeries("suction-hose", "Spiral-reinforced plastics suction hose (PVC helix)",
			"type C (built without a mandrel)", func(r hoseRow) [2]float64 { return r.c }),
		hoseSeries("rubber-hose", "Rubber hose built on a rigid mandrel (rubber suction hose)",
			"type A (rigid mandrel)", func(r hoseRow) [2]float64 { return r.a }),
	}
}
