package presets

import (
	"errors"
	"fmt"
	"math"

	"drawdown/calc"
)

// Decoder of the [[liquid]] entries. A liquid is read in stages, each its
// own function: its temperatures and hazards, its property model (one
// function per model), its valid range, its sources, and a last check that
// every property is usable over the whole range. The first error found is
// reported; the order of the stages fixes which one that is.

// Accepted ranges for user liquid entries.
const (
	userMinC = -60.0
	userMaxC = 200.0
)

// liquidDec is one liquid entry being decoded.
type liquidDec struct {
	p   *parser
	i   int
	id  string
	d   *liquidDoc
	cur *Catalogue // the liquids decoded so far from this file
	l   Liquid

	model      string  // the property model's name
	tmin, tmax float64 // °C, the model's default range (NaN: none)
	src        Sources // the model's own sources
	// corrLo, corrHi bound the underlying correlation (°C); NaN when the
	// model has no range of its own beyond tmin, tmax.
	corrLo, corrHi float64
}

func (q *liquidDec) fail(key string, err error) error {
	return q.p.errAt("liquid", q.i, q.id, key, err)
}

func (p *parser) liquid(i int, id string, d liquidDoc, cur *Catalogue) (Liquid, error) {
	q := &liquidDec{p: p, i: i, id: id, d: &d, cur: cur,
		l:    Liquid{ID: id, Name: orDefault(d.Name, id), Basis: d.Basis, Note: d.Note, ColdKind: d.ColdKind, Origin: p.origin},
		tmin: math.NaN(), tmax: math.NaN(), corrLo: math.NaN(), corrHi: math.NaN()}
	for _, stage := range []func() error{q.temperatures, q.properties, q.validRange, q.classify, q.sources, q.usable} {
		if err := stage(); err != nil {
			return Liquid{}, err
		}
	}
	return q.l, nil
}

// temperatures reads the cold limit, flash point, boiling point and
// hazards.
func (q *liquidDec) temperatures() error {
	temp := func(key string, v *float64) (calc.Temperature, error) {
		if v == nil {
			return 0, nil
		}
		if err := rangeCheck(*v, userMinC-100, userMaxC+400, "°C"); err != nil {
			return 0, q.fail(key, err)
		}
		return celsius(*v), nil
	}
	var err error
	if q.l.Cold, err = temp("cold_c", q.d.Cold); err != nil {
		return err
	}
	if q.l.Flash, err = temp("flash_c", q.d.Flash); err != nil {
		return err
	}
	if q.l.Boil, err = temp("boil_c", q.d.Boil); err != nil {
		return err
	}
	if q.l.Cold > 0 && q.l.ColdKind == "" {
		q.l.ColdKind = "freezing point"
	}
	q.l.Hazards, err = q.p.hazards("liquid", q.i, q.id, "hazards", q.d.Hazards)
	return err
}

// modelName is the entry's property model: the model key, else the one its
// other keys imply.
func modelName(d *liquidDoc) string {
	switch {
	case d.Model != "":
		return d.Model
	case d.BasedOn != "":
		return "based_on"
	case d.Table != nil:
		return "table"
	case d.Salinity != nil:
		return "seawater"
	case d.RVP != nil:
		return "gasoline"
	case d.Nu1 != nil || d.Density15 != nil:
		return "oil"
	}
	return "constant"
}

// properties builds the property model.
func (q *liquidDec) properties() error {
	q.model = modelName(q.d)
	switch q.model {
	case "based_on":
		return q.basedOn()
	case "constant":
		return q.constant()
	case "table":
		tm, err := q.p.table(q.i, q.id, q.d.Table)
		if err != nil {
			return err
		}
		q.l.model = &tm
		q.tmin, q.tmax = tm.t[0]-273.15, tm.t[len(tm.t)-1]-273.15
		return nil
	case "seawater":
		return q.seawater()
	case "gasoline":
		return q.gasoline()
	case "oil":
		op, err := q.p.oil(q.i, q.id, *q.d)
		if err != nil {
			return err
		}
		q.l.model = oilModel(op)
		return nil
	}
	return q.fail("model", fmt.Errorf("%q: use constant, table, seawater, gasoline or oil (or based_on)", q.d.Model))
}

// basedOn lays the entry's constants over a built-in or earlier liquid.
func (q *liquidDec) basedOn() error {
	d := q.d
	base, ok := q.cur.Liquid(d.BasedOn)
	if !ok && q.p.base != nil {
		base, ok = q.p.base.Liquid(d.BasedOn)
	}
	if !ok {
		return q.fail("based_on", fmt.Errorf("no liquid %q (built-in or earlier in this file)", d.BasedOn))
	}
	om := &overrideModel{base: base.model, rho: math.NaN(), mu: math.NaN(), pv: math.NaN()}
	q.src = base.Sources
	if d.Density != nil {
		if err := rangeCheck(*d.Density, calc.MinDensity, calc.MaxDensity, "kg/m³"); err != nil {
			return q.fail("density_kg_m3", err)
		}
		om.rho = *d.Density
		q.src.Density = ""
	}
	if d.Viscosity != nil {
		if err := rangeCheck(*d.Viscosity, calc.MinViscosity*1e3, calc.MaxViscosity*1e3, "mPa·s"); err != nil {
			return q.fail("viscosity_mpa_s", err)
		}
		om.mu = *d.Viscosity * 1e-3
		q.src.Viscosity = ""
	}
	if d.Vapor != nil {
		if err := rangeCheck(*d.Vapor, 0, calc.MaxVaporPressure, "Pa"); err != nil {
			return q.fail("vapor_pressure_pa", err)
		}
		om.pv = *d.Vapor
		q.src.VaporPressure = ""
	}
	l := &q.l
	l.model = om
	q.tmin, q.tmax = base.Min.Celsius(), base.Max.Celsius()
	q.corrLo, q.corrHi = q.tmin, q.tmax
	if d.Cold == nil {
		l.Cold, l.ColdKind = base.Cold, base.ColdKind
		q.src.Cold = base.Sources.Cold
	}
	if d.Flash == nil {
		l.Flash, l.Boil, l.Class = base.Flash, base.Boil, base.Class
	}
	if d.Hazards == nil {
		l.Hazards = base.Hazards
	}
	if d.Basis == "" {
		l.Basis = "based on " + base.ID
	}
	return nil
}

// constant reads a liquid of constant properties.
func (q *liquidDec) constant() error {
	d := q.d
	if d.Density == nil || d.Viscosity == nil {
		key := "density_kg_m3"
		if d.Density != nil {
			key = "viscosity_mpa_s"
		}
		return q.fail(key, errors.New("missing; a constant liquid needs density_kg_m3 and viscosity_mpa_s (vapor_pressure_pa defaults to 0), or a [liquid.table], model or based_on"))
	}
	if err := rangeCheck(*d.Density, calc.MinDensity, calc.MaxDensity, "kg/m³"); err != nil {
		return q.fail("density_kg_m3", err)
	}
	if err := rangeCheck(*d.Viscosity, calc.MinViscosity*1e3, calc.MaxViscosity*1e3, "mPa·s"); err != nil {
		return q.fail("viscosity_mpa_s", err)
	}
	pv := 0.0
	if d.Vapor != nil {
		if err := rangeCheck(*d.Vapor, 0, calc.MaxVaporPressure, "Pa"); err != nil {
			return q.fail("vapor_pressure_pa", err)
		}
		pv = *d.Vapor
	}
	rho, mu := *d.Density, *d.Viscosity*1e-3
	q.l.model = &funcModel{
		rho: func(float64) float64 { return rho },
		mu:  func(float64, float64) float64 { return mu },
		pv:  func(float64) float64 { return pv },
	}
	return nil
}

// seawater reads a liquid on the seawater correlations at a salinity.
func (q *liquidDec) seawater() error {
	d := q.d
	if d.Salinity == nil {
		return q.fail("salinity_g_kg", errors.New("missing for model seawater"))
	}
	sw, err := Seawater(*d.Salinity)
	if err != nil {
		return q.fail("salinity_g_kg", err)
	}
	q.l.model, q.src = sw.model, sw.Sources
	q.tmin, q.tmax = sw.Min.Celsius(), sw.Max.Celsius()
	q.corrLo, q.corrHi = 0, 90
	if d.Cold == nil {
		q.l.Cold, q.l.ColdKind = sw.Cold, sw.ColdKind
	}
	if d.Hazards == nil {
		q.l.Hazards = sw.Hazards
	}
	return nil
}

// gasoline reads a gasoline of a given Reid vapour pressure.
func (q *liquidDec) gasoline() error {
	d := q.d
	if d.RVP == nil {
		return q.fail("rvp_kpa", errors.New("missing for model gasoline"))
	}
	g, err := Gasoline(*d.RVP)
	if err != nil {
		return q.fail("rvp_kpa", err)
	}
	q.l.model, q.src = g.model, g.Sources
	q.tmin, q.tmax = g.Min.Celsius(), g.Max.Celsius()
	q.corrLo, q.corrHi = -20, 40
	if d.Flash == nil {
		q.l.Flash, q.l.Boil, q.l.Class = g.Flash, g.Boil, g.Class
	}
	if d.Hazards == nil {
		q.l.Hazards = g.Hazards
	}
	return nil
}

// validRange reads t_min_c and t_max_c (defaults from the model) and checks
// them against the accepted range, a table's span and the correlation's
// own range.
func (q *liquidDec) validRange() error {
	tmin, tmax := q.tmin, q.tmax
	if q.d.TMin != nil {
		tmin = *q.d.TMin
	}
	if q.d.TMax != nil {
		tmax = *q.d.TMax
	}
	if math.IsNaN(tmin) {
		return q.fail("t_min_c", errors.New("missing; give the lowest temperature the values hold for"))
	}
	if math.IsNaN(tmax) {
		return q.fail("t_max_c", errors.New("missing; give the highest temperature the values hold for"))
	}
	if err := rangeCheck(tmin, userMinC, userMaxC, "°C"); err != nil {
		return q.fail("t_min_c", err)
	}
	if err := rangeCheck(tmax, tmin, userMaxC, "°C"); err != nil {
		return q.fail("t_max_c", err)
	}
	if tm, ok := q.l.model.(*tableModel); ok {
		if tmin < tm.t[0]-273.15-1e-9 || tmax > tm.t[len(tm.t)-1]-273.15+1e-9 {
			return q.fail("t_max_c", fmt.Errorf("range %s to %s °C reaches beyond the table (%s to %s °C)",
				num(tmin), num(tmax), num(tm.t[0]-273.15), num(tm.t[len(tm.t)-1]-273.15)))
		}
	}
	// The underlying correlation must hold over the whole range.
	if lo, hi := q.corrLo, q.corrHi; !math.IsNaN(lo) && (tmin < lo-1e-9 || tmax > hi+1e-9) {
		key := "t_min_c"
		if tmax > hi+1e-9 {
			key = "t_max_c"
		}
		return q.fail(key, fmt.Errorf("the %s properties hold only from %s to %s °C", q.model, num(lo), num(hi)))
	}
	q.l.Min, q.l.Max = celsius(tmin), celsius(tmax)
	return nil
}

// classify sets the NFPA 30 class from the flash point and the flammable
// or combustible hazard from the class.
func (q *liquidDec) classify() error {
	l := &q.l
	if l.Flash > 0 && l.Class == NoFlashClass {
		l.Class = ClassifyNFPA30(l.Flash, l.Boil)
	}
	if l.Class.Flammable() {
		l.Hazards = l.Hazards.With(Flammable)
	} else if l.Class != NoFlashClass {
		l.Hazards = l.Hazards.With(Combustible)
	}
	return nil
}

// sources picks each property's source: the per-property key, then the
// model's, then "source".
func (q *liquidDec) sources() error {
	d, src := q.d, q.src
	pick := func(specific, fromModel string) string {
		switch {
		case specific != "":
			return specific
		case fromModel != "":
			return fromModel
		}
		return d.Source
	}
	l := &q.l
	l.Sources = Sources{
		Density:       pick(d.DensitySource, src.Density),
		Viscosity:     pick(d.ViscositySource, src.Viscosity),
		VaporPressure: pick(d.VaporSource, src.VaporPressure),
		Range:         pick(d.RangeSource, src.Range),
		Cold:          pick(d.ColdSource, src.Cold),
		Flash:         pick(d.FlashSource, src.Flash),
	}
	if l.Cold == 0 {
		l.Sources.Cold = ""
	}
	if l.Flash == 0 {
		l.Sources.Flash = ""
	}
	if l.Sources.Density == "" || l.Sources.Viscosity == "" || l.Sources.VaporPressure == "" || l.Sources.Range == "" {
		return q.fail("source", errors.New("missing; say where the values come from (e.g. the product data sheet)"))
	}
	return nil
}

// usable checks every property over the whole range (41 points).
func (q *liquidDec) usable() error {
	l := &q.l
	for k := 0; k <= 40; k++ {
		T := l.Min + (l.Max-l.Min)*calc.Temperature(k)/40
		f, err := l.model.eval(T, 101325)
		if err == nil {
			err = f.Validate()
		}
		if err != nil && !errors.Is(err, calc.ErrBoiling) {
			return q.fail("t_max_c", fmt.Errorf("at %s °C: %v", num(T.Celsius()), err))
		}
	}
	return nil
}

func (p *parser) table(i int, id string, t *tableDoc) (tableModel, error) {
	fail := func(key string, err error) (tableModel, error) {
		return tableModel{}, p.errAt("liquid", i, id, "table."+key, err)
	}
	if t == nil || len(t.T) == 0 {
		return fail("t_c", errors.New("missing"))
	}
	n := len(t.T)
	if n > 200 {
		return fail("t_c", errors.New("more than 200 rows"))
	}
	check := func(key string, v []float64, lo, hi float64, unit string, required bool) error {
		if v == nil && !required {
			return nil
		}
		if len(v) != n {
			return p.errAt("liquid", i, id, "table."+key, fmt.Errorf("has %d values; t_c has %d", len(v), n))
		}
		for _, x := range v {
			if err := rangeCheck(x, lo, hi, unit); err != nil {
				return p.errAt("liquid", i, id, "table."+key, err)
			}
		}
		return nil
	}
	if err := check("t_c", t.T, userMinC, userMaxC, "°C", true); err != nil {
		return tableModel{}, err
	}
	for k := 1; k < n; k++ {
		if !(t.T[k] > t.T[k-1]) {
			return fail("t_c", errors.New("temperatures must increase down the table"))
		}
	}
	if err := check("density_kg_m3", t.Density, calc.MinDensity, calc.MaxDensity, "kg/m³", true); err != nil {
		return tableModel{}, err
	}
	if err := check("viscosity_mpa_s", t.Viscosity, calc.MinViscosity*1e3, calc.MaxViscosity*1e3, "mPa·s", true); err != nil {
		return tableModel{}, err
	}
	if err := check("vapor_pressure_pa", t.Vapor, 0, calc.MaxVaporPressure, "Pa", false); err != nil {
		return tableModel{}, err
	}
	m := tableModel{t: make([]float64, n), rho: append([]float64(nil), t.Density...), mu: make([]float64, n)}
	for k := range t.T {
		m.t[k] = t.T[k] + 273.15
		m.mu[k] = t.Viscosity[k] * 1e-3
	}
	if t.Vapor != nil {
		m.pv = append([]float64(nil), t.Vapor...)
	} else {
		m.pv = make([]float64, n)
	}
	return m, nil
}

func (p *parser) oil(i int, id string, d liquidDoc) (oilParams, error) {
	fail := func(key string, err error) (oilParams, error) { return oilParams{}, p.errAt("liquid", i, id, key, err) }
	if d.Density15 == nil {
		return fail("density_15c_kg_m3", errors.New("missing for model oil"))
	}
	if err := rangeCheck(*d.Density15, 600, 1100, "kg/m³"); err != nil {
		return fail("density_15c_kg_m3", err)
	}
	if d.Nu1 == nil || d.Nu2 == nil {
		key := "nu1_mm2_s"
		if d.Nu1 != nil {
			key = "nu2_mm2_s"
		}
		return fail(key, errors.New("missing; model oil needs the kinematic viscosity at two temperatures (nu1_mm2_s at nu1_t_c, default 40, and nu2_mm2_s at nu2_t_c, default 100)"))
	}
	t1, t2 := 40.0, 100.0
	if d.Nu1T != nil {
		t1 = *d.Nu1T
	}
	if d.Nu2T != nil {
		t2 = *d.Nu2T
	}
	if err := rangeCheck(t1, userMinC, userMaxC, "°C"); err != nil {
		return fail("nu1_t_c", err)
	}
	if err := rangeCheck(t2, userMinC, userMaxC, "°C"); err != nil {
		return fail("nu2_t_c", err)
	}
	if math.Abs(t1-t2) < 5 {
		return fail("nu2_t_c", errors.New("the two viscosity temperatures must be at least 5 K apart"))
	}
	if err := rangeCheck(*d.Nu1, 0.3, 10000, "mm²/s"); err != nil {
		return fail("nu1_mm2_s", err)
	}
	if err := rangeCheck(*d.Nu2, 0.3, 10000, "mm²/s"); err != nil {
		return fail("nu2_mm2_s", err)
	}
	// Viscosity falls as temperature rises.
	if (t1 < t2) != (*d.Nu1 > *d.Nu2) {
		return fail("nu2_mm2_s", errors.New("viscosity must fall as temperature rises"))
	}
	pv := 0.0
	if d.Vapor != nil {
		if err := rangeCheck(*d.Vapor, 0, calc.MaxVaporPressure, "Pa"); err != nil {
			return fail("vapor_pressure_pa", err)
		}
		pv = *d.Vapor
	}
	return oilParams{Density15: calc.Density(*d.Density15), T1: celsius(t1), Nu1: *d.Nu1, T2: celsius(t2), Nu2: *d.Nu2,
		K0: 0, K1: 0.6278, VaporPressure: pv}, nil
}
