package presets

import (
	_ "embed"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync"
)

// Catalogue holds liquids, hose materials, hose sizes, size series,
// fittings, intakes, tank templates and priming methods and aids. A
// Catalogue is not changed after it is built: Merge returns a new one. Lookups are safe for concurrent use.
type Catalogue struct {
	liquids   []Liquid
	materials []Material
	hoses     []Hose
	fittings  []Fitting
	tanks     []TankTemplate
	priming   []PrimingMethod
	aids      []PrimingAid
	intakes   []Intake
	series    []SizeSeries // built in only
}

//go:embed catalogue.toml
var builtinTOML string

// embedded is the parsed catalogue.toml, built once and never changed;
// Builtin hands out copies.
var embedded = sync.OnceValue(func() *Catalogue {
	c, err := parse(builtinTOML, "catalogue.toml (built-in)", "built-in", nil)
	if err != nil {
		panic("presets: embedded catalogue: " + err.Error())
	}
	return c
})

// embeddedSeries is the size series, computed once and never changed.
var embeddedSeries = sync.OnceValue(builtinSeries)

func cloneSeries(in []SizeSeries) []SizeSeries {
	out := make([]SizeSeries, len(in))
	for i, s := range in {
		out[i] = s
		out[i].Sizes = cloneSizes(s.Sizes)
	}
	return out
}

// Builtin returns a new catalogue of the built-in entries: the liquids
// defined in Go (their correlations) and the hoses, materials, fittings,
// tanks and priming methods of the embedded catalogue.toml. Each call
// returns a fresh catalogue that shares nothing mutable with other calls.
//
// Builtin panics only if the embedded file is broken, which the package
// tests rule out.
func Builtin() *Catalogue {
	e := embedded()
	c := &Catalogue{
		liquids:   builtinLiquids(),
		materials: slices.Clone(e.materials),
		hoses:     slices.Clone(e.hoses),
		fittings:  slices.Clone(e.fittings),
		tanks:     slices.Clone(e.tanks),
		priming:   slices.Clone(e.priming),
		aids:      slices.Clone(e.aids),
		intakes:   slices.Clone(e.intakes),
		series:    cloneSeries(embeddedSeries()),
	}
	for i := range c.tanks {
		c.tanks[i].Sizes = slices.Clone(c.tanks[i].Sizes)
	}
	return c
}

// UserFile returns the usual path of the user preset file,
// <os.UserConfigDir()>/drawdown/presets.toml, or "" when the platform has no
// user configuration directory. Reading it is the caller's job.
func UserFile() string {
	dir, err := os.UserConfigDir()
	if err != nil || dir == "" {
		return ""
	}
	return filepath.Join(dir, "drawdown", "presets.toml")
}

func norm(id string) string { return strings.ToLower(strings.TrimSpace(id)) }

// Liquid returns the liquid with the given ID (case-insensitive). Besides
// the catalogue's IDs it accepts "seawater:S" and "brine:S" for salinity S
// in g/kg (see Seawater) and "gasoline:R" for Reid vapour pressure R in kPa
// (see Gasoline); such forms return false when the number is unusable.
func (c *Catalogue) Liquid(id string) (Liquid, bool) {
	id = norm(id)
	for _, l := range c.liquids {
		if l.ID == id {
			return l, true
		}
	}
	return parametricLiquid(id)
}

// parametricLiquid handles "seawater:S", "brine:S" and "gasoline:R".
func parametricLiquid(id string) (Liquid, bool) {
	kind, arg, ok := strings.Cut(id, ":")
	if !ok || len(arg) == 0 || len(arg) > 12 {
		return Liquid{}, false
	}
	v, err := strconv.ParseFloat(arg, 64)
	if err != nil || strings.ContainsAny(arg, "xXpPnN_") { // no hex, inf or nan
		return Liquid{}, false
	}
	var l Liquid
	switch kind {
	case "seawater", "brine":
		l, err = Seawater(v)
	case "gasoline":
		l, err = Gasoline(v)
	default:
		return Liquid{}, false
	}
	if err != nil {
		return Liquid{}, false
	}
	l.ID = id
	l.Origin = "built-in"
	return l, true
}

// Material returns the hose material with the given ID or alias
// (case-insensitive); the result carries its canonical ID. An old ID kept
// as an alias (suction-helix, layflat) still finds its material, so saved
// jobs load.
func (c *Catalogue) Material(id string) (Material, bool) {
	m, ok := findAliased(c.materials, norm(id), func(m Material) (string, []string) { return m.ID, m.Aliases })
	m.Aliases = slices.Clone(m.Aliases)
	return m, ok
}

// Hose returns the hose size with the given ID, e.g. "25mm" or "1-1/2in",
// or an alias, or the same size in another spelling: "1.5in", "1 1/2 in",
// `1-1/2"` and "38 mm" find the 1-1/2in and 38mm hoses.
func (c *Catalogue) Hose(id string) (Hose, bool) {
	id = norm(id)
	h, ok := findAliased(c.hoses, id, func(h Hose) (string, []string) { return h.ID, h.Aliases })
	if !ok {
		if v, u, parsed := parseSize(id); parsed && u != unitNone && u != unitDN {
			for _, x := range c.hoses {
				if xv, xu, ok2 := parseSize(x.ID); ok2 && xu == u && sameSize(v, u, xv, xu) {
					h, ok = x, true
					break
				}
			}
		}
	}
	h.Aliases = slices.Clone(h.Aliases)
	return h, ok
}

// Fitting returns the fitting with the given ID or alias.
func (c *Catalogue) Fitting(id string) (Fitting, bool) {
	f, ok := findAliased(c.fittings, norm(id), func(f Fitting) (string, []string) { return f.ID, f.Aliases })
	f.Aliases = slices.Clone(f.Aliases)
	return f, ok
}

// findAliased returns the item whose ID is id, else the first whose aliases
// hold it: an ID always wins over another entry's alias.
func findAliased[T any](items []T, id string, names func(T) (string, []string)) (T, bool) {
	for _, it := range items {
		if n, _ := names(it); n == id {
			return it, true
		}
	}
	for _, it := range items {
		if _, al := names(it); slices.Contains(al, id) {
			return it, true
		}
	}
	var zero T
	return zero, false
}

// Tank returns the tank template with the given ID.
func (c *Catalogue) Tank(id string) (TankTemplate, bool) {
	id = norm(id)
	for _, t := range c.tanks {
		if t.ID == id {
			t.Sizes = slices.Clone(t.Sizes)
			return t, true
		}
	}
	return TankTemplate{}, false
}

// PrimingMethod returns the priming method with the given ID.
func (c *Catalogue) PrimingMethod(id string) (PrimingMethod, bool) {
	id = norm(id)
	for _, m := range c.priming {
		if m.ID == id {
			return m, true
		}
	}
	return PrimingMethod{}, false
}

// PrimingAid returns the priming aid with the given ID.
func (c *Catalogue) PrimingAid(id string) (PrimingAid, bool) {
	id = norm(id)
	for _, a := range c.aids {
		if a.ID == id {
			return a, true
		}
	}
	return PrimingAid{}, false
}

// Liquids returns the liquids in catalogue order (a copy).
func (c *Catalogue) Liquids() []Liquid { return append([]Liquid(nil), c.liquids...) }

// Materials returns the hose materials in catalogue order (a copy).
func (c *Catalogue) Materials() []Material {
	return cloneAliased(c.materials, func(m *Material) *[]string { return &m.Aliases })
}

// Hoses returns the hose sizes in catalogue order (a copy).
func (c *Catalogue) Hoses() []Hose {
	return cloneAliased(c.hoses, func(h *Hose) *[]string { return &h.Aliases })
}

// Fittings returns the fittings in catalogue order (a copy).
func (c *Catalogue) Fittings() []Fitting {
	return cloneAliased(c.fittings, func(f *Fitting) *[]string { return &f.Aliases })
}

// cloneAliased copies items and each item's alias list.
func cloneAliased[T any](items []T, aliases func(*T) *[]string) []T {
	out := slices.Clone(items)
	for i := range out {
		a := aliases(&out[i])
		*a = slices.Clone(*a)
	}
	return out
}

// Tanks returns the tank templates in catalogue order (a copy).
func (c *Catalogue) Tanks() []TankTemplate {
	out := slices.Clone(c.tanks)
	for i := range out {
		out[i].Sizes = slices.Clone(out[i].Sizes)
	}
	return out
}

// PrimingMethods returns the priming methods in catalogue order (a copy).
func (c *Catalogue) PrimingMethods() []PrimingMethod {
	return append([]PrimingMethod(nil), c.priming...)
}

// PrimingMethodsFor returns the priming methods that suit the hazards h.
func (c *Catalogue) PrimingMethodsFor(h Hazards) []PrimingMethod {
	var out []PrimingMethod
	for _, m := range c.priming {
		if m.Suits(h) {
			out = append(out, m)
		}
	}
	return out
}

// PrimingAids returns the priming aids in catalogue order (a copy).
func (c *Catalogue) PrimingAids() []PrimingAid { return append([]PrimingAid(nil), c.aids...) }

// Merge returns a new catalogue holding c's entries with u's laid over them:
// an entry of u replaces the entry of c with the same ID in place, and new
// IDs are appended in u's order. Neither c nor u is changed.
func (c *Catalogue) Merge(u *Catalogue) *Catalogue {
	if u == nil {
		u = &Catalogue{}
	}
	return &Catalogue{
		liquids: mergeByID(c.liquids, u.liquids, func(l Liquid) string { return l.ID }),
		materials: keepAliases(mergeByID(c.materials, u.materials, func(m Material) string { return m.ID }), c.materials,
			func(m *Material) *[]string { return &m.Aliases }, func(m Material) string { return m.ID }),
		hoses: keepAliases(mergeByID(c.hoses, u.hoses, func(h Hose) string { return h.ID }), c.hoses,
			func(h *Hose) *[]string { return &h.Aliases }, func(h Hose) string { return h.ID }),
		fittings: keepAliases(mergeByID(c.fittings, u.fittings, func(f Fitting) string { return f.ID }), c.fittings,
			func(f *Fitting) *[]string { return &f.Aliases }, func(f Fitting) string { return f.ID }),
		tanks:   mergeByID(c.tanks, u.tanks, func(t TankTemplate) string { return t.ID }),
		priming: mergeByID(c.priming, u.priming, func(m PrimingMethod) string { return m.ID }),
		aids:    mergeByID(c.aids, u.aids, func(a PrimingAid) string { return a.ID }),
		intakes: keepAliases(mergeByID(c.intakes, u.intakes, func(in Intake) string { return in.ID }), c.intakes,
			func(in *Intake) *[]string { return &in.Aliases }, func(in Intake) string { return in.ID }),
		series: cloneSeries(c.series),
	}
}

// keepAliases gives a replaced entry the aliases of the entry it replaced
// as well as its own, so an old ID that saved jobs use survives a user
// override.
func keepAliases[T any](merged, base []T, aliases func(*T) *[]string, id func(T) string) []T {
	old := make(map[string][]string, len(base))
	for i := range base {
		old[id(base[i])] = *aliases(&base[i])
	}
	for i := range merged {
		a := aliases(&merged[i])
		for _, x := range old[id(merged[i])] {
			if !slices.Contains(*a, x) {
				*a = append(slices.Clone(*a), x)
			}
		}
	}
	return merged
}

func mergeByID[T any](base, over []T, id func(T) string) []T {
	out := append([]T(nil), base...)
	pos := make(map[string]int, len(out))
	for i, v := range out {
		pos[id(v)] = i
	}
	for _, v := range over {
		if i, ok := pos[id(v)]; ok {
			out[i] = v
			continue
		}
		pos[id(v)] = len(out)
		out = append(out, v)
	}
	return out
}
