package presets

import (
	"errors"
	"fmt"
	"io"
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"drawdown/calc"
)

// ParseError is the error of a preset file: the file name, the line (when
// known) and the field at fault, in the manner of encoding/csv's ParseError.
type ParseError struct {
	File  string // the name given to LoadUser
	Line  int    // 1-based line; 0 when unknown
	Field string // e.g. `liquid "syrup" t_max_c` or `fitting 3 k`
	Err   error  // what is wrong
}

// Error formats the error as "file:line: field: what is wrong".
func (e *ParseError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		b.WriteString(":" + strconv.Itoa(e.Line))
	}
	b.WriteString(": ")
	if e.Field != "" {
		b.WriteString(e.Field + ": ")
	}
	if e.Err != nil {
		b.WriteString(e.Err.Error())
	}
	return b.String()
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

// ErrSyntax is wrapped by a ParseError for TOML that does not parse or a
// value of the wrong type.
var ErrSyntax = errors.New("preset file syntax")

// ErrUnknownField is wrapped by a ParseError for a key the format does not
// define (often a typo or a wrong unit suffix).
var ErrUnknownField = errors.New("unknown field")

// maxUserFile is the largest preset file LoadUser reads, 1 MiB.
const maxUserFile = 1 << 20

// LoadUser reads a preset file (the format is described in the package
// documentation) and returns a catalogue of its entries only; lay it over
// the built-in catalogue with Builtin().Merge. name is used in error
// messages. A liquid may be "based_on" a built-in liquid or one defined
// earlier in the same file.
//
// Any error is a *ParseError naming the line and the field, except a read
// error from r, which is returned as is.
func LoadUser(r io.Reader, name string) (*Catalogue, error) {
	data, err := io.ReadAll(io.LimitReader(r, maxUserFile+1))
	if err != nil {
		return nil, err
	}
	if len(data) > maxUserFile {
		return nil, &ParseError{File: name, Err: fmt.Errorf("file larger than %d bytes", maxUserFile)}
	}
	return parse(string(data), name, "user file "+name, Builtin())
}

// WithUser returns the built-in catalogue with the preset file read from r
// laid over it. On any error it returns the built-in catalogue alone and the
// error, so the caller can report the error and carry on.
func WithUser(r io.Reader, name string) (*Catalogue, error) {
	b := Builtin()
	u, err := LoadUser(r, name)
	if err != nil {
		return b, err
	}
	return b.Merge(u), nil
}

// ---------------------------------------------------------------------------
// File schema.

type fileDoc struct {
	Liquid     []liquidDoc   `toml:"liquid"`
	Material   []materialDoc `toml:"material"`
	Hose       []hoseDoc     `toml:"hose"`
	Fitting    []fittingDoc  `toml:"fitting"`
	Tank       []tankDoc     `toml:"tank"`
	Priming    []primingDoc  `toml:"priming"`
	PrimingAid []aidDoc      `toml:"priming_aid"`
}

type liquidDoc struct {
	ID       string   `toml:"id"`
	Name     string   `toml:"name"`
	Basis    string   `toml:"basis"`
	Source   string   `toml:"source"`
	Note     string   `toml:"note"`
	TMin     *float64 `toml:"t_min_c"`
	TMax     *float64 `toml:"t_max_c"`
	Cold     *float64 `toml:"cold_c"`
	ColdKind string   `toml:"cold_kind"`
	Flash    *float64 `toml:"flash_c"`
	Boil     *float64 `toml:"boil_c"`
	Hazards  []string `toml:"hazards"`
	BasedOn  string   `toml:"based_on"`
	Model    string   `toml:"model"`

	Density   *float64 `toml:"density_kg_m3"`
	Viscosity *float64 `toml:"viscosity_mpa_s"`
	Vapor     *float64 `toml:"vapor_pressure_pa"`

	Salinity *float64 `toml:"salinity_g_kg"`
	RVP      *float64 `toml:"rvp_kpa"`

	Density15 *float64 `toml:"density_15c_kg_m3"`
	Nu1       *float64 `toml:"nu1_mm2_s"`
	Nu1T      *float64 `toml:"nu1_t_c"`
	Nu2       *float64 `toml:"nu2_mm2_s"`
	Nu2T      *float64 `toml:"nu2_t_c"`

	Table *tableDoc `toml:"table"`

	DensitySource   string `toml:"density_source"`
	ViscositySource string `toml:"viscosity_source"`
	VaporSource     string `toml:"vapor_pressure_source"`
	RangeSource     string `toml:"range_source"`
	ColdSource      string `toml:"cold_source"`
	FlashSource     string `toml:"flash_source"`
}

type tableDoc struct {
	T         []float64 `toml:"t_c"`
	Density   []float64 `toml:"density_kg_m3"`
	Viscosity []float64 `toml:"viscosity_mpa_s"`
	Vapor     []float64 `toml:"vapor_pressure_pa"`
}

type materialDoc struct {
	ID        string   `toml:"id"`
	Name      string   `toml:"name"`
	Rough     *float64 `toml:"roughness_mm"`
	RoughLow  *float64 `toml:"roughness_low_mm"`
	RoughHigh *float64 `toml:"roughness_high_mm"`
	Collapses bool     `toml:"collapses"`
	Source    string   `toml:"source"`
	Note      string   `toml:"note"`
}

type hoseDoc struct {
	ID       string   `toml:"id"`
	Name     string   `toml:"name"`
	Diameter *float64 `toml:"inside_diameter_mm"`
	Series   string   `toml:"series"`
	Source   string   `toml:"source"`
}

type fittingDoc struct {
	ID         string   `toml:"id"`
	Name       string   `toml:"name"`
	Where      string   `toml:"where"`
	K          *float64 `toml:"k"`
	KLow       *float64 `toml:"k_low"`
	KHigh      *float64 `toml:"k_high"`
	KFT        *float64 `toml:"k_ft"`
	KFTLow     *float64 `toml:"k_ft_low"`
	KFTHigh    *float64 `toml:"k_ft_high"`
	FromMemory bool     `toml:"from_memory"`
	Source     string   `toml:"source"`
	Note       string   `toml:"note"`
}

type tankDoc struct {
	ID       string             `toml:"id"`
	Name     string             `toml:"name"`
	Shape    string             `toml:"shape"`
	Sizes    map[string]float64 `toml:"sizes"`
	Confined bool               `toml:"confined_space"`
	Source   string             `toml:"source"`
	Note     string             `toml:"note"`
}

type primingDoc struct {
	ID      string   `toml:"id"`
	Name    string   `toml:"name"`
	Summary string   `toml:"summary"`
	NotFor  []string `toml:"not_for"`
	Caution string   `toml:"caution"`
	Source  string   `toml:"source"`
}

type aidDoc struct {
	ID         string   `toml:"id"`
	Name       string   `toml:"name"`
	StrokeLow  *float64 `toml:"stroke_low_ml"`
	StrokeHigh *float64 `toml:"stroke_high_ml"`
	Source     string   `toml:"source"`
	Note       string   `toml:"note"`
}

// ---------------------------------------------------------------------------
// Parsing.

// parser carries the file text for locating keys and the catalogue that
// "based_on" looks liquids up in.
type parser struct {
	file   string
	origin string
	lines  []string
	base   *Catalogue
}

// errAt builds a ParseError for key in the idx-th (0-based) [[section]]
// entry. field is the name shown to the user.
func (p *parser) errAt(section string, idx int, id, key string, err error) *ParseError {
	field := section + " " + strconv.Itoa(idx+1)
	if id != "" {
		field = section + " " + strconv.Quote(id)
	}
	if key != "" {
		field += " " + key
	}
	return &ParseError{File: p.file, Line: p.locate(section, idx, key), Field: field, Err: err}
}

var headerRe = regexp.MustCompile(`^\s*\[\[?\s*([A-Za-z0-9_.\-"' ]+?)\s*\]\]?`)

// locate finds the line of key inside the idx-th [[section]] entry (its
// sub-tables included): the line of the key's last part, else of its first
// part (an inline table such as sizes = { … }), else the entry's header
// line; 0 when the entry is not found (for example when the file uses inline
// tables). idx < 0 searches every entry of the section.
func (p *parser) locate(section string, idx int, key string) int {
	parts := strings.Split(key, ".")
	cands := []string{parts[len(parts)-1]}
	if len(parts) > 1 {
		cands = append(cands, parts[0])
	}
	for _, c := range cands {
		if n, _ := p.scan(section, idx, c); n > 0 {
			return n
		}
	}
	_, header := p.scan(section, idx, "")
	return header
}

// locateTop finds a top-level key or a table header named name.
func (p *parser) locateTop(name string) int {
	top := true // top-level keys come before the first table header
	for n, text := range p.lines {
		t := strings.TrimSpace(text)
		if strings.HasPrefix(t, "[") {
			if m := headerRe.FindStringSubmatch(text); m != nil {
				if strings.ReplaceAll(m[1], " ", "") == name {
					return n + 1
				}
				top = false
				continue
			}
		}
		if k, _, ok := strings.Cut(t, "="); top && ok && strings.Trim(strings.TrimSpace(k), `"'`) == name {
			return n + 1
		}
	}
	return 0
}

// scan returns the line of "leaf = …" inside the idx-th [[section]] entry
// (0 if absent) and the entry's header line.
func (p *parser) scan(section string, idx int, leaf string) (line, header int) {
	count := -1
	inside := false
	for n, text := range p.lines {
		t := strings.TrimSpace(text)
		if strings.HasPrefix(t, "[") {
			if m := headerRe.FindStringSubmatch(text); m != nil {
				name := strings.ReplaceAll(m[1], " ", "")
				switch {
				case strings.HasPrefix(t, "[[") && name == section:
					count++
					inside = idx < 0 || count == idx
					if count == idx {
						header = n + 1
					}
				case strings.HasPrefix(name, section+"."):
					// a sub-table of the current entry: stay inside
				default:
					inside = false
				}
				continue
			}
		}
		if !inside || leaf == "" {
			continue
		}
		if k, _, ok := strings.Cut(t, "="); ok && strings.Trim(strings.TrimSpace(k), `"'`) == leaf {
			return n + 1, header
		}
	}
	return 0, header
}

var tomlLineRe = regexp.MustCompile(`^toml: line (\d+) \(last key "([^"]*)"\): (.*)$`)

var idRe = regexp.MustCompile(`^[a-z0-9][a-z0-9._/-]{0,39}$`)

func parse(src, file, origin string, base *Catalogue) (*Catalogue, error) {
	p := &parser{file: file, origin: origin, lines: strings.Split(src, "\n"), base: base}
	var doc fileDoc
	md, err := toml.Decode(src, &doc)
	if err != nil {
		var te toml.ParseError
		if errors.As(err, &te) {
			return nil, &ParseError{File: file, Line: te.Position.Line, Field: te.LastKey,
				Err: fmt.Errorf("%w: %s", ErrSyntax, tomlMessage(te))}
		}
		// Type mismatches come as plain errors: "toml: line N (last key
		// "k"): message".
		pe := &ParseError{File: file, Err: fmt.Errorf("%w: %v", ErrSyntax, err)}
		if m := tomlLineRe.FindStringSubmatch(err.Error()); m != nil {
			pe.Line, _ = strconv.Atoi(m[1])
			pe.Field = m[2]
			pe.Err = fmt.Errorf("%w: %s", ErrSyntax, friendlyType(m[3]))
		}
		return nil, pe
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		section, key := "", k.String()
		if len(k) > 1 {
			section, key = k[0], strings.Join(k[1:], ".")
		}
		line := 0
		if section != "" {
			line = p.locate(section, -1, key)
		} else {
			line = p.locateTop(key)
		}
		return nil, &ParseError{File: file, Line: line, Field: k.String(), Err: ErrUnknownField}
	}
	c := &Catalogue{}
	seen := map[string]map[string]bool{}
	dup := func(section, id string) bool {
		if seen[section] == nil {
			seen[section] = map[string]bool{}
		}
		if seen[section][id] {
			return true
		}
		seen[section][id] = true
		return false
	}
	checkID := func(section string, i int, id string) (string, error) {
		n := norm(id)
		if n == "" {
			return "", p.errAt(section, i, "", "id", errors.New("missing; give a short lowercase code"))
		}
		if !idRe.MatchString(n) || (section == "liquid" && strings.Contains(n, ":")) {
			return "", p.errAt(section, i, "", "id", fmt.Errorf("%q: use up to 40 letters, digits and . _ / - (no spaces)", id))
		}
		if dup(section, n) {
			return "", p.errAt(section, i, n, "id", errors.New("defined twice in this file"))
		}
		return n, nil
	}
	needSource := func(section string, i int, id, s string) error {
		if strings.TrimSpace(s) == "" {
			return p.errAt(section, i, id, "source", errors.New("missing; say where the values come from (e.g. the product data sheet)"))
		}
		return nil
	}

	for i, d := range doc.Material {
		id, err := checkID("material", i, d.ID)
		if err != nil {
			return nil, err
		}
		m, err := p.material(i, id, d)
		if err != nil {
			return nil, err
		}
		if err := needSource("material", i, id, d.Source); err != nil {
			return nil, err
		}
		c.materials = append(c.materials, m)
	}
	for i, d := range doc.Hose {
		id, err := checkID("hose", i, d.ID)
		if err != nil {
			return nil, err
		}
		if d.Diameter == nil {
			return nil, p.errAt("hose", i, id, "inside_diameter_mm", errors.New("missing"))
		}
		if err := rangeCheck(*d.Diameter, 1, 2000, "mm"); err != nil {
			return nil, p.errAt("hose", i, id, "inside_diameter_mm", err)
		}
		if d.Series != "" && d.Series != "metric" && d.Series != "inch" {
			return nil, p.errAt("hose", i, id, "series", fmt.Errorf("%q: use \"metric\" or \"inch\"", d.Series))
		}
		if err := needSource("hose", i, id, d.Source); err != nil {
			return nil, err
		}
		c.hoses = append(c.hoses, Hose{ID: id, Name: orDefault(d.Name, id), Diameter: calc.Length(*d.Diameter / 1000),
			Series: d.Series, Source: d.Source, Origin: origin})
	}
	for i, d := range doc.Fitting {
		id, err := checkID("fitting", i, d.ID)
		if err != nil {
			return nil, err
		}
		f, err := p.fitting(i, id, d)
		if err != nil {
			return nil, err
		}
		c.fittings = append(c.fittings, f)
	}
	for i, d := range doc.Tank {
		id, err := checkID("tank", i, d.ID)
		if err != nil {
			return nil, err
		}
		t, err := p.tank(i, id, d)
		if err != nil {
			return nil, err
		}
		c.tanks = append(c.tanks, t)
	}
	for i, d := range doc.Priming {
		id, err := checkID("priming", i, d.ID)
		if err != nil {
			return nil, err
		}
		hz, err := p.hazards("priming", i, id, "not_for", d.NotFor)
		if err != nil {
			return nil, err
		}
		if err := needSource("priming", i, id, d.Source); err != nil {
			return nil, err
		}
		c.priming = append(c.priming, PrimingMethod{ID: id, Name: orDefault(d.Name, id), Summary: d.Summary,
			NotFor: hz, Caution: d.Caution, Source: d.Source, Origin: origin})
	}
	for i, d := range doc.PrimingAid {
		id, err := checkID("priming_aid", i, d.ID)
		if err != nil {
			return nil, err
		}
		a := PrimingAid{ID: id, Name: orDefault(d.Name, id), Source: d.Source, Note: d.Note, Origin: origin}
		if d.StrokeLow == nil || d.StrokeHigh == nil {
			return nil, p.errAt("priming_aid", i, id, "stroke_low_ml", errors.New("stroke_low_ml and stroke_high_ml are both needed"))
		}
		if err := rangeCheck(*d.StrokeLow, 0.1, 1e5, "mL"); err != nil {
			return nil, p.errAt("priming_aid", i, id, "stroke_low_ml", err)
		}
		if err := rangeCheck(*d.StrokeHigh, *d.StrokeLow, 1e5, "mL"); err != nil {
			return nil, p.errAt("priming_aid", i, id, "stroke_high_ml", err)
		}
		if err := needSource("priming_aid", i, id, d.Source); err != nil {
			return nil, err
		}
		a.StrokeLow, a.StrokeHigh = calc.Volume(*d.StrokeLow*1e-6), calc.Volume(*d.StrokeHigh*1e-6)
		c.aids = append(c.aids, a)
	}
	for i, d := range doc.Liquid {
		id, err := checkID("liquid", i, d.ID)
		if err != nil {
			return nil, err
		}
		l, err := p.liquid(i, id, d, c)
		if err != nil {
			return nil, err
		}
		c.liquids = append(c.liquids, l)
	}
	return c, nil
}

var typeMsgRe = regexp.MustCompile(`TOML value has type (\w+); destination has type (\w+)`)

// friendlyType rewrites the decoder's type-mismatch message in the words of
// the file ("expected a number, found text").
func friendlyType(msg string) string {
	m := typeMsgRe.FindStringSubmatch(msg)
	if m == nil {
		return msg
	}
	word := func(t string) string {
		switch {
		case strings.HasPrefix(t, "float"), strings.HasPrefix(t, "int"), strings.HasPrefix(t, "uint"):
			return "a number"
		case t == "string":
			return "text in quotes"
		case t == "bool", t == "boolean":
			return "true or false"
		case strings.HasPrefix(t, "slice"), strings.HasPrefix(t, "array"), strings.HasPrefix(t, "[]"):
			return "a list [ … ]"
		case strings.HasPrefix(t, "map"), t == "struct", strings.HasPrefix(t, "table"):
			return "a table"
		}
		return t
	}
	return "expected " + word(m[2]) + ", found " + word(m[1])
}

// tomlMessage is the TOML library's message without its own "toml: line N"
// prefix (the ParseError adds the line).
func tomlMessage(te toml.ParseError) string {
	m := te.Message
	if m == "" {
		m = te.Error()
	}
	return m
}

func orDefault(s, d string) string {
	if strings.TrimSpace(s) == "" {
		return d
	}
	return s
}

// rangeCheck reports v outside [lo, hi] (or not finite) as an error that
// states the accepted range.
func rangeCheck(v, lo, hi float64, unit string) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("not a finite number; accepted %s to %s %s", num(lo), num(hi), unit)
	}
	if v < lo || v > hi {
		return fmt.Errorf("%s %s is out of range; accepted %s to %s %s", num(v), unit, num(lo), num(hi), unit)
	}
	return nil
}

func (p *parser) hazards(section string, i int, id, key string, names []string) (Hazards, error) {
	var hz Hazards
	for _, n := range names {
		h, ok := ParseHazard(n)
		if !ok {
			all := make([]string, 0, len(hazardNames))
			for _, h := range AllHazards() {
				all = append(all, h.String())
			}
			return 0, p.errAt(section, i, id, key, fmt.Errorf("unknown hazard %q; known: %s", n, strings.Join(all, ", ")))
		}
		hz = hz.With(h)
	}
	return hz, nil
}

func (p *parser) material(i int, id string, d materialDoc) (Material, error) {
	m := Material{ID: id, Name: orDefault(d.Name, id), Collapses: d.Collapses, Source: d.Source, Note: d.Note, Origin: p.origin}
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
	return m, nil
}

func (p *parser) fitting(i int, id string, d fittingDoc) (Fitting, error) {
	f := Fitting{ID: id, Name: orDefault(d.Name, id), FromMemory: d.FromMemory, Source: d.Source, Note: d.Note, Origin: p.origin}
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

func (p *parser) tank(i int, id string, d tankDoc) (TankTemplate, error) {
	t := TankTemplate{ID: id, Name: orDefault(d.Name, id), Shape: d.Shape, ConfinedSpace: d.Confined,
		Source: d.Source, Note: d.Note, Origin: p.origin}
	need, ok := tankShapeSizes[d.Shape]
	if !ok {
		return t, p.errAt("tank", i, id, "shape", fmt.Errorf("%q: use one of %s", d.Shape, strings.Join(TankShapes(), ", ")))
	}
	known := map[string]bool{}
	for _, s := range sizeOrder {
		known[s] = true
	}
	keys := make([]string, 0, len(d.Sizes))
	for k := range d.Sizes {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !known[k] {
			return t, p.errAt("tank", i, id, "sizes."+k, fmt.Errorf("unknown size; use %s", strings.Join(sizeOrder, ", ")))
		}
		v := d.Sizes[k]
		lo, hi, unit := 0.001, 1000.0, "m"
		if k == "side-slope" {
			lo, hi, unit = 0, 20, "(run per rise)"
		}
		if err := rangeCheck(v, lo, hi, unit); err != nil {
			return t, p.errAt("tank", i, id, "sizes."+k, err)
		}
	}
	for _, n := range need {
		if _, ok := d.Sizes[n]; !ok {
			return t, p.errAt("tank", i, id, "sizes", fmt.Errorf("shape %s needs %s", d.Shape, strings.Join(need, ", ")))
		}
	}
	if ch, ok := d.Sizes["cone-height"]; ok {
		if h, ok := d.Sizes["height"]; ok && ch > h {
			return t, p.errAt("tank", i, id, "sizes.cone-height", fmt.Errorf("%s m is more than the height %s m", num(ch), num(h)))
		}
	}
	for _, n := range sizeOrder {
		if v, ok := d.Sizes[n]; ok {
			t.Sizes = append(t.Sizes, Size{Name: n, Value: v})
		}
	}
	if strings.TrimSpace(d.Source) == "" {
		return t, p.errAt("tank", i, id, "source", errors.New("missing; say where the sizes come from"))
	}
	return t, nil
}

// Accepted ranges for user liquid entries.
const (
	userMinC = -60.0
	userMaxC = 200.0
)

func (p *parser) liquid(i int, id string, d liquidDoc, cur *Catalogue) (Liquid, error) {
	l := Liquid{ID: id, Name: orDefault(d.Name, id), Basis: d.Basis, Note: d.Note, ColdKind: d.ColdKind, Origin: p.origin}
	fail := func(key string, err error) (Liquid, error) { return Liquid{}, p.errAt("liquid", i, id, key, err) }
	temp := func(key string, v *float64) (calc.Temperature, error) {
		if v == nil {
			return 0, nil
		}
		if err := rangeCheck(*v, userMinC-100, userMaxC+400, "°C"); err != nil {
			return 0, p.errAt("liquid", i, id, key, err)
		}
		return celsius(*v), nil
	}
	var err error
	if l.Cold, err = temp("cold_c", d.Cold); err != nil {
		return Liquid{}, err
	}
	if l.Flash, err = temp("flash_c", d.Flash); err != nil {
		return Liquid{}, err
	}
	if l.Boil, err = temp("boil_c", d.Boil); err != nil {
		return Liquid{}, err
	}
	if l.Cold > 0 && l.ColdKind == "" {
		l.ColdKind = "freezing point"
	}
	if l.Hazards, err = p.hazards("liquid", i, id, "hazards", d.Hazards); err != nil {
		return Liquid{}, err
	}

	// The property model.
	model := d.Model
	if model == "" {
		switch {
		case d.BasedOn != "":
			model = "based_on"
		case d.Table != nil:
			model = "table"
		case d.Salinity != nil:
			model = "seawater"
		case d.RVP != nil:
			model = "gasoline"
		case d.Nu1 != nil || d.Density15 != nil:
			model = "oil"
		default:
			model = "constant"
		}
	}
	var tmin, tmax float64 = math.NaN(), math.NaN() // °C, defaults from the model
	var src Sources
	switch model {
	case "based_on":
		base, ok := cur.Liquid(d.BasedOn)
		if !ok && p.base != nil {
			base, ok = p.base.Liquid(d.BasedOn)
		}
		if !ok {
			return fail("based_on", fmt.Errorf("no liquid %q (built-in or earlier in this file)", d.BasedOn))
		}
		om := &overrideModel{base: base.model, rho: math.NaN(), mu: math.NaN(), pv: math.NaN()}
		src = base.Sources
		if d.Density != nil {
			if err := rangeCheck(*d.Density, calc.MinDensity, calc.MaxDensity, "kg/m³"); err != nil {
				return fail("density_kg_m3", err)
			}
			om.rho = *d.Density
			src.Density = ""
		}
		if d.Viscosity != nil {
			if err := rangeCheck(*d.Viscosity, calc.MinViscosity*1e3, calc.MaxViscosity*1e3, "mPa·s"); err != nil {
				return fail("viscosity_mpa_s", err)
			}
			om.mu = *d.Viscosity * 1e-3
			src.Viscosity = ""
		}
		if d.Vapor != nil {
			if err := rangeCheck(*d.Vapor, 0, calc.MaxVaporPressure, "Pa"); err != nil {
				return fail("vapor_pressure_pa", err)
			}
			om.pv = *d.Vapor
			src.VaporPressure = ""
		}
		l.model = om
		tmin, tmax = base.Min.Celsius(), base.Max.Celsius()
		if d.Cold == nil {
			l.Cold, l.ColdKind = base.Cold, base.ColdKind
			src.Cold = base.Sources.Cold
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
	case "constant":
		if d.Density == nil || d.Viscosity == nil {
			key := "density_kg_m3"
			if d.Density != nil {
				key = "viscosity_mpa_s"
			}
			return fail(key, errors.New("missing; a constant liquid needs density_kg_m3 and viscosity_mpa_s (vapor_pressure_pa defaults to 0), or a [liquid.table], model or based_on"))
		}
		if err := rangeCheck(*d.Density, calc.MinDensity, calc.MaxDensity, "kg/m³"); err != nil {
			return fail("density_kg_m3", err)
		}
		if err := rangeCheck(*d.Viscosity, calc.MinViscosity*1e3, calc.MaxViscosity*1e3, "mPa·s"); err != nil {
			return fail("viscosity_mpa_s", err)
		}
		pv := 0.0
		if d.Vapor != nil {
			if err := rangeCheck(*d.Vapor, 0, calc.MaxVaporPressure, "Pa"); err != nil {
				return fail("vapor_pressure_pa", err)
			}
			pv = *d.Vapor
		}
		rho, mu := *d.Density, *d.Viscosity*1e-3
		l.model = &funcModel{
			rho: func(float64) float64 { return rho },
			mu:  func(float64, float64) float64 { return mu },
			pv:  func(float64) float64 { return pv },
		}
	case "table":
		tm, err := p.table(i, id, d.Table)
		if err != nil {
			return Liquid{}, err
		}
		l.model = &tm
		tmin, tmax = tm.t[0]-273.15, tm.t[len(tm.t)-1]-273.15
	case "seawater":
		if d.Salinity == nil {
			return fail("salinity_g_kg", errors.New("missing for model seawater"))
		}
		sw, err := Seawater(*d.Salinity)
		if err != nil {
			return fail("salinity_g_kg", err)
		}
		l.model, src = sw.model, sw.Sources
		tmin, tmax = sw.Min.Celsius(), sw.Max.Celsius()
		if d.Cold == nil {
			l.Cold, l.ColdKind = sw.Cold, sw.ColdKind
		}
		if d.Hazards == nil {
			l.Hazards = sw.Hazards
		}
	case "gasoline":
		if d.RVP == nil {
			return fail("rvp_kpa", errors.New("missing for model gasoline"))
		}
		g, err := Gasoline(*d.RVP)
		if err != nil {
			return fail("rvp_kpa", err)
		}
		l.model, src = g.model, g.Sources
		tmin, tmax = g.Min.Celsius(), g.Max.Celsius()
		if d.Flash == nil {
			l.Flash, l.Boil, l.Class = g.Flash, g.Boil, g.Class
		}
		if d.Hazards == nil {
			l.Hazards = g.Hazards
		}
	case "oil":
		op, err := p.oil(i, id, d)
		if err != nil {
			return Liquid{}, err
		}
		l.model = oilModel(op)
	default:
		return fail("model", fmt.Errorf("%q: use constant, table, seawater, gasoline or oil (or based_on)", d.Model))
	}

	// Range.
	if d.TMin != nil {
		tmin = *d.TMin
	}
	if d.TMax != nil {
		tmax = *d.TMax
	}
	if math.IsNaN(tmin) {
		return fail("t_min_c", errors.New("missing; give the lowest temperature the values hold for"))
	}
	if math.IsNaN(tmax) {
		return fail("t_max_c", errors.New("missing; give the highest temperature the values hold for"))
	}
	if err := rangeCheck(tmin, userMinC, userMaxC, "°C"); err != nil {
		return fail("t_min_c", err)
	}
	if err := rangeCheck(tmax, tmin, userMaxC, "°C"); err != nil {
		return fail("t_max_c", err)
	}
	if tm, ok := l.model.(*tableModel); ok {
		if tmin < tm.t[0]-273.15-1e-9 || tmax > tm.t[len(tm.t)-1]-273.15+1e-9 {
			return fail("t_max_c", fmt.Errorf("range %s to %s °C reaches beyond the table (%s to %s °C)",
				num(tmin), num(tmax), num(tm.t[0]-273.15), num(tm.t[len(tm.t)-1]-273.15)))
		}
	}
	if model == "based_on" || model == "seawater" || model == "gasoline" {
		// The underlying correlation must hold over the whole range.
		var lo, hi float64
		switch model {
		case "based_on":
			b, ok := cur.Liquid(d.BasedOn)
			if !ok {
				b, _ = p.base.Liquid(d.BasedOn)
			}
			lo, hi = b.Min.Celsius(), b.Max.Celsius()
		case "seawater":
			lo, hi = 0, 90
		case "gasoline":
			lo, hi = -20, 40
		}
		if tmin < lo-1e-9 || tmax > hi+1e-9 {
			key := "t_min_c"
			if tmax > hi+1e-9 {
				key = "t_max_c"
			}
			return fail(key, fmt.Errorf("the %s properties hold only from %s to %s °C", model, num(lo), num(hi)))
		}
	}
	l.Min, l.Max = celsius(tmin), celsius(tmax)
	if l.Flash > 0 && l.Class == NoFlashClass {
		l.Class = ClassifyNFPA30(l.Flash, l.Boil)
	}
	if l.Class.Flammable() {
		l.Hazards = l.Hazards.With(Flammable)
	} else if l.Class != NoFlashClass {
		l.Hazards = l.Hazards.With(Combustible)
	}

	// Sources: per-property keys win, then the model's, then "source".
	pick := func(specific, fromModel string) string {
		switch {
		case specific != "":
			return specific
		case fromModel != "":
			return fromModel
		}
		return d.Source
	}
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
		return fail("source", errors.New("missing; say where the values come from (e.g. the product data sheet)"))
	}

	// Every property must be usable over the whole range.
	for k := 0; k <= 40; k++ {
		T := l.Min + (l.Max-l.Min)*calc.Temperature(k)/40
		f, err := l.model.eval(T, 101325)
		if err == nil {
			err = f.Validate()
		}
		if err != nil && !errors.Is(err, calc.ErrBoiling) {
			return fail("t_max_c", fmt.Errorf("at %s °C: %v", num(T.Celsius()), err))
		}
	}
	return l, nil
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
