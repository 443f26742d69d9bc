package presets

import (
	"errors"
	"fmt"
	"strings"

	"drawdown/calc"
)

// Decoders of the [[material]], [[hose]] and [[fitting]] entries.

func (p *parser) material(i int, id string, d materialDoc) (Material, error) {
	m := Material{ID: id, Name: orDefault(d.Name, id), Collapses: d.Collapses, Source: d.Source, Note: d.Note, Origin: p.origin}
	var err error
	if m.Aliases, err = p.aliases("material", i, id, d.Aliases); err != nil {
		return m, err
	}
	if d.Rough == nil {
		return m, p.errAt("material", i, id, "roughness_mm", errors.New("missing"))
	}
	if err := rangeCheck(*d.Rough, 0, 50, "mm"); err != nil {
		return m, p.errAt("material", i, id, "roughness_mm", err)
	}
	lo, hi := *d.Rough, *d.Rough
	if d.RoughLow != nil {
		lo = *d.RoughLow
		if err := rangeCheck(lo, 0, *d.Rough, "mm"); err != nil {
			return m, p.errAt("material", i, id, "roughness_low_mm", err)
		}
	}
	if d.RoughHigh != nil {
		hi = *d.RoughHigh
		if err := rangeCheck(hi, *d.Rough, 50, "mm"); err != nil {
			return m, p.errAt("material", i, id, "roughness_high_mm", err)
		}
	}
	m.Roughness, m.RoughnessLow, m.RoughnessHigh = calc.Length(*d.Rough/1000), calc.Length(lo/1000), calc.Length(hi/1000)
	if err := p.vacuum(i, id, d, &m); err != nil {
		return m, err
	}
	if err := p.needSource("material", i, id, d.Source); err != nil {
		return m, err
	}
	return m, nil
}

// vacuum reads a material's vacuum rating: vacuum = "rated" with
// vacuum_kpa (gauge, positive for vacuum), "not rated" (the default) or
// "none" (the wall collapses, as collapses = true says).
func (p *parser) vacuum(i int, id string, d materialDoc, m *Material) error {
	fail := func(key string, err error) error { return p.errAt("material", i, id, key, err) }
	class := VacuumNotRated
	switch {
	case d.Vacuum != "":
		c, ok := ParseVacuumClass(d.Vacuum)
		if !ok {
			return fail("vacuum", fmt.Errorf("%q: use \"rated\" (with vacuum_kpa), \"not rated\" or \"none\"", d.Vacuum))
		}
		class = c
	case d.VacuumKPa != nil:
		class = VacuumRated
	case d.Collapses:
		class = VacuumNone
	}
	switch {
	case d.Collapses && class != VacuumNone:
		return fail("collapses", fmt.Errorf("true, but vacuum is %q: a wall that collapses holds no vacuum (\"none\")", class))
	case class == VacuumRated && d.VacuumKPa == nil:
		return fail("vacuum_kpa", errors.New("missing; give the rated vacuum in kPa, gauge (positive for vacuum)"))
	case class != VacuumRated && d.VacuumKPa != nil:
		return fail("vacuum_kpa", fmt.Errorf("only with vacuum = \"rated\", not %q", class))
	}
	if class == VacuumRated {
		if err := rangeCheck(*d.VacuumKPa, 1, float64(FullVacuum)/1000, "kPa"); err != nil {
			return fail("vacuum_kpa", err)
		}
		m.Vacuum = calc.Pressure(*d.VacuumKPa * 1000)
	}
	m.VacuumClass = class
	m.Collapses = class == VacuumNone
	m.VacuumSource = d.VacuumSrc
	if m.VacuumSource == "" && class != VacuumNotRated {
		m.VacuumSource = d.Source
	}
	return nil
}

func (p *parser) hose(i int, id string, d hoseDoc) (Hose, error) {
	aliases, err := p.aliases("hose", i, id, d.Aliases)
	if err != nil {
		return Hose{}, err
	}
	if d.Diameter == nil {
		return Hose{}, p.errAt("hose", i, id, "inside_diameter_mm", errors.New("missing"))
	}
	if err := rangeCheck(*d.Diameter, 1, 2000, "mm"); err != nil {
		return Hose{}, p.errAt("hose", i, id, "inside_diameter_mm", err)
	}
	if d.Series != "" && d.Series != "metric" && d.Series != "inch" {
		return Hose{}, p.errAt("hose", i, id, "series", fmt.Errorf("%q: use \"metric\" or \"inch\"", d.Series))
	}
	if err := p.needSource("hose", i, id, d.Source); err != nil {
		return Hose{}, err
	}
	return Hose{ID: id, Aliases: aliases, Name: orDefault(d.Name, id), Diameter: calc.Length(*d.Diameter / 1000),
		Series: d.Series, Source: d.Source, Origin: p.origin}, nil
}

func (p *parser) fitting(i int, id string, d fittingDoc) (Fitting, error) {
	f := Fitting{ID: id, Name: orDefault(d.Name, id), FromMemory: d.FromMemory, Source: d.Source, Note: d.Note, Origin: p.origin}
	var err error
	if f.Aliases, err = p.aliases("fitting", i, id, d.Aliases); err != nil {
		return f, err
	}
	where := d.Where
	if where == "" {
		where = "either"
	}
	loc, ok := ParseLocation(where)
	if !ok {
		return f, p.errAt("fitting", i, id, "where", fmt.Errorf("%q: use entrance, up-leg, down-leg or either", d.Where))
	}
	f.Where = loc
	c, lo, hi := d.K, d.KLow, d.KHigh
	ck, lk, hk := "k", "k_low", "k_high"
	if d.KFT != nil {
		if d.K != nil {
			return f, p.errAt("fitting", i, id, "k_ft", errors.New("give k or k_ft, not both"))
		}
		f.PerFT = true
		c, lo, hi = d.KFT, d.KFTLow, d.KFTHigh
		ck, lk, hk = "k_ft", "k_ft_low", "k_ft_high"
	}
	if d.BoreRatio != nil {
		if c != nil {
			return f, p.errAt("fitting", i, id, "bore_ratio", fmt.Errorf("give %s or bore_ratio, not both", ck))
		}
		k, err := p.boreRatioK(i, id, *d.BoreRatio)
		if err != nil {
			return f, err
		}
		c = &k
	}
	if c == nil {
		return f, p.errAt("fitting", i, id, "k", errors.New("missing; give k (or k_ft, a multiple of Crane's f_T)"))
	}
	max := 1000.0
	if f.PerFT {
		max = 20000
	}
	if err := rangeCheck(*c, 0, max, ""); err != nil {
		return f, p.errAt("fitting", i, id, ck, err)
	}
	f.K = KRange{Central: *c, Low: *c, High: *c}
	if lo != nil {
		if err := rangeCheck(*lo, 0, *c, ""); err != nil {
			return f, p.errAt("fitting", i, id, lk, err)
		}
		f.K.Low = *lo
	}
	if hi != nil {
		if err := rangeCheck(*hi, *c, max, ""); err != nil {
			return f, p.errAt("fitting", i, id, hk, err)
		}
		f.K.High = *hi
	}
	if strings.TrimSpace(d.Source) == "" {
		return f, p.errAt("fitting", i, id, "source", errors.New("missing; say where the values come from"))
	}
	return f, nil
}

// boreRatioK is the K of a barb or reducer of bore ratio beta (insert bore
// over hose bore), from BarbK.
func (p *parser) boreRatioK(i int, id string, beta float64) (float64, error) {
	if err := rangeCheck(beta, minBoreRatio, 1, ""); err != nil {
		return 0, p.errAt("fitting", i, id, "bore_ratio", fmt.Errorf("%w (insert bore over hose bore)", err))
	}
	k, err := BarbK(beta)
	if err != nil {
		return 0, p.errAt("fitting", i, id, "bore_ratio", err)
	}
	return k, nil
}

// minBoreRatio is the smallest bore ratio a fitting entry takes: at 0.3 the
// barb's K is already about 160.
const minBoreRatio = 0.3
