package model

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// System is a unit system for display and for bare numbers typed without a
// unit. Parsing accepts a unit suffix from either system whatever the System.
type System int

const (
	// SI shows metres, millimetres, kilopascals, degrees Celsius, litres.
	SI System = iota
	// US shows feet, inches, pounds per square inch, degrees Fahrenheit and
	// US gallons (US customary units).
	US
)

// String returns "SI" or "US".
func (s System) String() string {
	if s == US {
		return "US"
	}
	return "SI"
}

// ParseSystem reads "SI"/"metric" or "US"/"imperial"/"customary", in any case.
func ParseSystem(text string) (System, error) {
	switch strings.ToLower(strings.TrimSpace(text)) {
	case "si", "metric":
		return SI, nil
	case "us", "usc", "customary", "imperial":
		return US, nil
	}
	return SI, errors.New("unit system " + strconv.Quote(text) + " not known; accepted SI or US")
}

// MarshalText writes the System as "SI" or "US" (used by the job file).
func (s System) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// UnmarshalText reads what MarshalText writes (and the ParseSystem aliases).
func (s *System) UnmarshalText(b []byte) error {
	v, err := ParseSystem(string(b))
	if err != nil {
		return err
	}
	*s = v
	return nil
}

// Dim is the physical dimension of a field: it decides which units Parse
// accepts and how Format prints a value.
type Dim int

const (
	// DimLength is a length or height: m (SI), ft (US). Parse returns metres.
	DimLength Dim = iota
	// DimDiameter is a hose bore: mm (SI), in (US). Parse returns metres.
	DimDiameter
	// DimRoughness is a wall roughness: mm (SI), in (US). Parse returns metres.
	DimRoughness
	// DimPressure is an absolute pressure: kPa (SI), psi (US); Pa, hPa, MPa,
	// mbar, bar, atm, inHg and mmHg are accepted too. Parse returns pascals.
	DimPressure
	// DimTemperature is a temperature: °C (SI), °F (US), K accepted. Parse
	// returns kelvin.
	DimTemperature
	// DimDensity is a mass density: kg/m³ (SI), lb/ft³ (US). Parse returns
	// kg/m³.
	DimDensity
	// DimViscosity is a dynamic viscosity: mPa·s (SI), cP (US). Parse returns
	// Pa·s.
	DimViscosity
	// DimFlow is a volume flow rate: L/min (SI), gal/min (US). Parse returns
	// m³/s.
	DimFlow
	// DimVolume is a volume: L (SI), gal (US). Parse returns m³.
	DimVolume
	// DimTime is a duration: s, min, h, d; bare numbers are minutes. Parse
	// returns seconds.
	DimTime
	// DimVelocity is a mean flow velocity: m/s (SI), ft/s (US). Parse
	// returns m/s.
	DimVelocity
	// DimNumber is a plain number without a unit (a loss coefficient K, a
	// count of hoses).
	DimNumber
	dimCount
)

var dimNames = [...]string{
	"length", "diameter", "roughness", "pressure", "temperature", "density",
	"viscosity", "flow rate", "volume", "time", "velocity", "number",
}

// String names the dimension in plain words ("length", "flow rate").
func (d Dim) String() string {
	if d < 0 || d >= dimCount {
		return "quantity"
	}
	return dimNames[d]
}

// Unit factors. Source: NIST Special Publication 811 (2008 edition), "Guide
// for the Use of the International System of Units (SI)", Appendix B.8
// (factors by unit name). The inch, foot, avoirdupois pound, US gallon
// (231 in³), standard atmosphere and bar are exact by definition (bold in
// B.8); the pound-force is exact as lb × g_n (g_n = 9.80665 m/s²), so psi
// is exact here and agrees with B.8's 6.894 757 E+03. The two mercury
// columns are B.8's conventional values (0 °C, standard gravity), not exact.
// The printed B.8 factors are quoted from memory of the table; the tests
// check them to the digits B.8 prints.
const (
	metrePerInch  = 0.0254                                               // in → m, exact
	metrePerFoot  = 0.3048                                               // ft → m, exact
	kgPerPound    = 0.45359237                                           // lb (avoirdupois) → kg, exact
	m3PerGallon   = 3.785411784e-3                                       // US liquid gallon → m³, exact (B.8 prints 3.785 412 E-03)
	pascalPerPSI  = kgPerPound * 9.80665 / (metrePerInch * metrePerInch) // lbf/in² → Pa, exact (B.8: 6.894 757 E+03)
	pascalPerInHg = 3386.389                                             // inch of mercury, conventional → Pa (B.8: 3.386 389 E+03)
	pascalPerMmHg = 133.3224                                             // mm of mercury, conventional → Pa (B.8: 1.333 224 E+02)
	pascalPerAtm  = 101325                                               // standard atmosphere → Pa, exact
	m3PerCubicFt  = metrePerFoot * metrePerFoot * metrePerFoot           // ft³ → m³, exact (B.8: 2.831 685 E-02)
	m3PerBarrel   = 42 * m3PerGallon                                     // petroleum barrel (42 US gal) → m³, exact (B.8: 1.589 873 E-01)
	fahrenheitOff = 459.67                                               // T/K = (t/°F + 459.67)/1.8, exact (B.9)
	celsiusOff    = 273.15                                               // T/K = t/°C + 273.15, exact (B.9)
)

// unit is one accepted unit: si = (v + off) × scale.
type unit struct {
	name  string   // display symbol, e.g. "mm", "°C", "kg/m³"
	scale float64  // SI per unit
	off   float64  // added before scaling (temperatures only)
	alias []string // other spellings, compared after lower-casing and removing spaces
}

var lengthUnits = []unit{
	{name: "m", scale: 1, alias: []string{"metre", "metres", "meter", "meters"}},
	{name: "cm", scale: 0.01},
	{name: "mm", scale: 0.001},
	{name: "µm", scale: 1e-6, alias: []string{"um", "μm", "micron", "microns"}},
	{name: "ft", scale: metrePerFoot, alias: []string{"'", "′", "foot", "feet"}},
	{name: "in", scale: metrePerInch, alias: []string{`"`, "″", "inch", "inches"}},
}

var unitTable = [dimCount][]unit{
	DimLength:    lengthUnits,
	DimDiameter:  lengthUnits,
	DimRoughness: lengthUnits,
	DimPressure: {
		{name: "Pa", scale: 1},
		{name: "hPa", scale: 100},
		{name: "kPa", scale: 1000},
		{name: "MPa", scale: 1e6},
		{name: "mbar", scale: 100, alias: []string{"mb"}},
		{name: "bar", scale: 1e5},
		{name: "atm", scale: pascalPerAtm},
		{name: "inHg", scale: pascalPerInHg, alias: []string{`"hg`, "inchhg", "inchesHg", "inmercury"}},
		{name: "mmHg", scale: pascalPerMmHg, alias: []string{"torr"}},
		{name: "psi", scale: pascalPerPSI, alias: []string{"psia", "lbf/in2", "lbf/in²", "lb/in2", "lb/in²"}},
	},
	DimTemperature: {
		{name: "°C", scale: 1, off: celsiusOff, alias: []string{"c", "degc", "celsius", "℃", "ºc"}},
		{name: "°F", scale: 1 / 1.8, off: fahrenheitOff, alias: []string{"f", "degf", "fahrenheit", "℉", "ºf"}},
		{name: "K", scale: 1, alias: []string{"kelvin"}},
	},
	DimDensity: {
		{name: "kg/m³", scale: 1, alias: []string{"kg/m3", "kg/m^3"}},
		{name: "g/cm³", scale: 1000, alias: []string{"g/cm3", "g/cc", "g/ml", "kg/l"}},
		{name: "lb/ft³", scale: kgPerPound / m3PerCubicFt, alias: []string{"lb/ft3", "lb/cuft", "pcf"}},
		{name: "lb/gal", scale: kgPerPound / m3PerGallon},
	},
	DimViscosity: {
		{name: "Pa·s", scale: 1, alias: []string{"pa.s", "pas", "pa*s", "pa-s"}},
		{name: "mPa·s", scale: 1e-3, alias: []string{"mpa.s", "mpas", "mpa*s", "mpa-s"}},
		{name: "cP", scale: 1e-3, alias: []string{"centipoise", "cps"}},
		{name: "P", scale: 0.1, alias: []string{"poise"}},
	},
	DimFlow: {
		{name: "L/min", scale: 1e-3 / 60, alias: []string{"lpm", "l/m", "litre/min", "liter/min"}},
		{name: "L/s", scale: 1e-3, alias: []string{"lps"}},
		{name: "L/h", scale: 1e-3 / 3600},
		{name: "m³/h", scale: 1.0 / 3600, alias: []string{"m3/h", "m3/hr", "m³/hr"}},
		{name: "m³/s", scale: 1, alias: []string{"m3/s"}},
		{name: "gal/min", scale: m3PerGallon / 60, alias: []string{"gpm"}},
		{name: "gal/h", scale: m3PerGallon / 3600, alias: []string{"gph"}},
		{name: "ft³/s", scale: m3PerCubicFt, alias: []string{"ft3/s", "cfs"}},
		{name: "ft³/min", scale: m3PerCubicFt / 60, alias: []string{"ft3/min", "cfm"}},
	},
	DimVolume: {
		{name: "L", scale: 1e-3, alias: []string{"litre", "litres", "liter", "liters"}},
		{name: "mL", scale: 1e-6},
		{name: "m³", scale: 1, alias: []string{"m3"}},
		{name: "gal", scale: m3PerGallon, alias: []string{"gallon", "gallons", "usgal"}},
		{name: "ft³", scale: m3PerCubicFt, alias: []string{"ft3", "cuft"}},
		{name: "bbl", scale: m3PerBarrel, alias: []string{"barrel", "barrels"}},
	},
	DimTime: {
		{name: "s", scale: 1, alias: []string{"sec", "secs", "second", "seconds"}},
		{name: "min", scale: 60, alias: []string{"mins", "minute", "minutes"}},
		{name: "h", scale: 3600, alias: []string{"hr", "hrs", "hour", "hours"}},
		{name: "d", scale: 86400, alias: []string{"day", "days"}},
	},
	DimVelocity: {
		{name: "m/s", scale: 1, alias: []string{"mps"}},
		{name: "ft/s", scale: metrePerFoot, alias: []string{"fps", "ft/sec"}},
	},
	DimNumber: nil,
}

// defaultUnits[d][sys] is the index into unitTable[d] used for bare numbers
// and for display.
var defaultUnits = [dimCount][2]string{
	DimLength:      {"m", "ft"},
	DimDiameter:    {"mm", "in"},
	DimRoughness:   {"mm", "in"},
	DimPressure:    {"kPa", "psi"},
	DimTemperature: {"°C", "°F"},
	DimDensity:     {"kg/m³", "lb/ft³"},
	DimViscosity:   {"mPa·s", "cP"},
	DimFlow:        {"L/min", "gal/min"},
	DimVolume:      {"L", "gal"},
	DimTime:        {"min", "min"},
	DimVelocity:    {"m/s", "ft/s"},
	DimNumber:      {"", ""},
}

// DefaultUnit is the unit symbol shown for d in sys and assumed for a bare
// number ("" for DimNumber).
func DefaultUnit(d Dim, sys System) string {
	if d < 0 || d >= dimCount {
		return ""
	}
	return defaultUnits[d][sysIndex(sys)]
}

// Units lists the unit symbols Parse accepts for d, in the order of the
// accepted-units line of error messages.
func Units(d Dim) []string {
	if d < 0 || d >= dimCount {
		return nil
	}
	out := make([]string, 0, len(unitTable[d]))
	for _, u := range unitTable[d] {
		out = append(out, u.name)
	}
	return out
}

func sysIndex(sys System) int {
	if sys == US {
		return 1
	}
	return 0
}

func unitByName(d Dim, name string) (unit, bool) {
	for _, u := range unitTable[d] {
		if u.name == name {
			return u, true
		}
	}
	return unit{}, false
}

// unitIndex maps every spelling, normalised by normUnit, to its unit, per
// Dim. It is built once and never changed.
var unitIndex = func() [dimCount]map[string]unit {
	var idx [dimCount]map[string]unit
	for d := range idx {
		idx[d] = map[string]unit{}
		for _, u := range unitTable[d] {
			idx[d][normUnit(u.name)] = u
			for _, a := range u.alias {
				idx[d][normUnit(a)] = u
			}
		}
	}
	return idx
}()

// lookupUnit finds a unit by any spelling. Matching ignores case and spaces:
// within one Dim no two accepted units differ only by case (MPa is accepted
// as a pressure and mPa·s as a viscosity, never both in one Dim).
func lookupUnit(d Dim, text string) (unit, bool) {
	u, ok := unitIndex[d][normUnit(text)]
	return u, ok
}

// normUnit lower-cases s and drops white space. Text that is already
// lower-case ASCII without spaces is returned as is, without allocating.
func normUnit(s string) string {
	plain := true
	for i := 0; i < len(s); i++ {
		if c := s[i]; c >= 0x80 || c == ' ' || c == '\t' || ('A' <= c && c <= 'Z') {
			plain = false
			break
		}
	}
	if plain {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if unicode.IsSpace(r) {
			continue
		}
		b.WriteRune(unicode.ToLower(r))
	}
	return b.String()
}

// Sentinel errors wrapped by *ParseError; test with errors.Is.
var (
	// ErrEmpty: nothing was typed.
	ErrEmpty = errors.New("empty")
	// ErrSyntax: the number is not written in an accepted form.
	ErrSyntax = errors.New("not a number")
	// ErrUnit: the unit is not one accepted for the quantity.
	ErrUnit = errors.New("unit not accepted")
	// ErrTooLarge: the number is too large to be a measurement.
	ErrTooLarge = errors.New("number too large")
)

// ParseError reports text that Parse cannot read. Pos is the byte offset in
// Text where reading stopped.
type ParseError struct {
	Dim    Dim
	Text   string
	Pos    int
	Reason string // what was wrong, in plain words
	Err    error  // ErrEmpty, ErrSyntax, ErrUnit or ErrTooLarge
}

func (e *ParseError) Error() string {
	s := e.Reason
	if e.Err != ErrEmpty {
		s = "cannot read " + strconv.Quote(e.Text) + " as a " + e.Dim.String() + ": " + e.Reason
	}
	if u := Units(e.Dim); len(u) > 0 {
		s += "; accepted units " + strings.Join(u, ", ")
	} else if e.Dim == DimNumber {
		s += "; enter a plain number, e.g. 1.5"
	}
	return s
}

// Unwrap returns the sentinel classifying the error.
func (e *ParseError) Unwrap() error { return e.Err }

// maxMagnitude bounds the number as typed and maxSI the value in SI units.
// No field of a siphon job comes near either; together they keep every
// product finite and let Format's output (at most 6e4 times the SI value, for
// m³/s shown as L/min) always parse again.
const (
	maxMagnitude = 1e15
	maxSI        = 1e10
)

// Parse reads text as a quantity of dimension d and returns it in SI units
// (m, Pa, K, kg/m³, Pa·s, m³/s, m³, s; DimNumber as is).
//
// Accepted numbers: an optional sign, decimal digits with an optional decimal
// point and an optional exponent ("1.5", "-0.3", ".75", "2e-3"); a fraction
// "3/4"; a mixed number "1-1/2" or "1 1/2". A unit suffix may follow, with or
// without a space ("25mm", "25 mm", "3/4 in", `3/4"`, "40'", "15C", "59°F",
// "29.6inHg", "2.5 L/min"); units of either system are accepted whatever sys
// is. Feet and inches may be combined ("6 ft 3 in", `5'6"`, "5'6"), and so
// may days, hours, minutes and seconds, one pair at a time ("1 h 30 min",
// "1h30", "2 min 15 s").
// Unit matching ignores case and spaces. A bare number takes the default unit
// of d in sys (see DefaultUnit). Temperatures below absolute zero are rejected.
//
// Special cases: empty or blank text, NaN, Inf, "infinity", hexadecimal
// ("0x10"), digit separators ("1_000", "1,000"), a decimal comma ("2,5"),
// division by zero ("1/0"), numbers beyond 1e15 as typed ("1e400") and values
// beyond 1e10 in SI units are errors (*ParseError). Parse never returns NaN or ±Inf.
func Parse(d Dim, text string, sys System) (float64, error) {
	if d < 0 || d >= dimCount {
		return 0, &ParseError{Dim: d, Text: text, Reason: "unknown quantity", Err: ErrUnit}
	}
	p := parser{d: d, text: text}
	v, err := p.quantity(sys)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		// Unreachable with the bounds above; kept so that no NaN escapes.
		return 0, p.fail(0, "not a finite number", ErrTooLarge)
	}
	return v, nil
}

type parser struct {
	d    Dim
	text string
	pos  int
}

func (p *parser) fail(pos int, reason string, err error) *ParseError {
	return &ParseError{Dim: p.d, Text: p.text, Pos: pos, Reason: reason, Err: err}
}

func (p *parser) skipSpace() {
	for p.pos < len(p.text) {
		r, n := utf8.DecodeRuneInString(p.text[p.pos:])
		if !unicode.IsSpace(r) {
			return
		}
		p.pos += n
	}
}

func (p *parser) quantity(sys System) (float64, error) {
	p.skipSpace()
	if p.pos == len(p.text) {
		return 0, p.fail(0, "nothing entered", ErrEmpty)
	}
	v, err := p.number()
	if err != nil {
		return 0, err
	}
	p.skipSpace()
	rest := strings.TrimSpace(p.text[p.pos:])
	if rest == "" {
		u, _ := unitByName(p.d, DefaultUnit(p.d, sys))
		if p.d == DimNumber {
			u = unit{scale: 1}
		}
		return p.toSI(v, u)
	}
	if p.d == DimNumber {
		return 0, p.fail(p.pos, "unexpected "+strconv.Quote(rest)+" after the number", ErrUnit)
	}
	if c, tail, ok := splitCompound(p.d, rest); ok {
		return p.compoundValue(v, c, p.pos+len(rest)-len(tail))
	}
	u, ok := lookupUnit(p.d, rest)
	if !ok {
		return 0, p.fail(p.pos, p.unknownUnit(rest), ErrUnit)
	}
	return p.toSI(v, u)
}

func (p *parser) unknownUnit(rest string) string {
	if strings.HasPrefix(rest, ",") || strings.HasPrefix(rest, "_") {
		return "use a decimal point, not a comma, and no digit separators"
	}
	if low := normUnit(rest); p.d == DimPressure && (strings.HasSuffix(low, "g") && low != "inhg" && low != "mmhg" && low != "\"hg" || strings.Contains(low, "gauge")) {
		return strconv.Quote(rest) + " is a gauge pressure; enter the absolute pressure (a barometer reading)"
	}
	if p.d == DimViscosity && strings.Contains(strings.ToLower(rest), "st") {
		return strconv.Quote(rest) + " is a kinematic viscosity; enter the dynamic viscosity (mPa·s = mm²/s × density in g/cm³)"
	}
	return "unit " + strconv.Quote(rest) + " is not accepted for a " + p.d.String()
}

// compound is a pair of units written together, as in "6 ft 3 in" or
// "1 h 30 min": a major unit (any of its spellings, longest first) followed
// by a number in the minor unit, whose symbol may be left off ("5'6",
// "1h30").
type compound struct {
	major []string
	minor string
	ratio float64 // minor units per major unit
}

var lengthCompound = []compound{{major: []string{"feet", "foot", "ft", "'", "′"}, minor: "in", ratio: 12}}

var compounds = [dimCount][]compound{
	DimLength:    lengthCompound,
	DimDiameter:  lengthCompound,
	DimRoughness: lengthCompound,
	DimTime: {
		{major: []string{"days", "day", "d"}, minor: "h", ratio: 24},
		{major: []string{"hours", "hour", "hrs", "hr", "h"}, minor: "min", ratio: 60},
		{major: []string{"minutes", "minute", "mins", "min"}, minor: "s", ratio: 60},
	},
}

// splitCompound reports whether rest starts with a major unit of d followed
// by more text that begins with a digit, and returns the pair and the tail.
func splitCompound(d Dim, rest string) (compound, string, bool) {
	for _, c := range compounds[d] {
		for _, m := range c.major {
			if len(rest) < len(m) || !strings.EqualFold(rest[:len(m)], m) {
				continue
			}
			t := strings.TrimLeftFunc(rest[len(m):], unicode.IsSpace)
			if t != "" && (isDigit(t[0]) || t[0] == '.') {
				return c, t, true
			}
		}
	}
	return compound{}, "", false
}

// compoundValue reads the minor part of a compound at start and returns
// major×ratio + minor in the minor unit, converted to SI.
func (p *parser) compoundValue(major float64, c compound, start int) (float64, error) {
	q := parser{d: p.d, text: p.text, pos: start}
	minor, err := q.number()
	if err != nil {
		return 0, err
	}
	u, _ := unitByName(p.d, c.minor)
	if rest := strings.TrimSpace(q.text[q.pos:]); rest != "" {
		v, ok := lookupUnit(p.d, rest)
		if !ok || v.name != c.minor {
			return 0, q.fail(q.pos, "after "+c.major[len(c.major)-1]+", give "+c.minor+
				" (e.g. 6 ft 3 in, 1 h 30 min)", ErrUnit)
		}
	}
	if minor < 0 {
		return 0, q.fail(start, "the second part of a compound cannot be negative", ErrSyntax)
	}
	if major < 0 || (major == 0 && math.Signbit(major)) {
		minor = -minor
	}
	return p.toSI(major*c.ratio+minor, u)
}

func (p *parser) toSI(v float64, u unit) (float64, error) {
	si := (v + u.off) * u.scale
	if p.d == DimTemperature && si < 0 {
		// Within display rounding of absolute zero ("-459.7 °F") reads as
		// 0 K; anything colder is an error.
		if si < -0.06 {
			return 0, p.fail(0, "below absolute zero", ErrSyntax)
		}
		si = 0
	}
	// The 0.1 % slack lets Format's rounded output of a value at the bound
	// parse again.
	if math.Abs(si) > maxSI*1.001 || math.IsNaN(si) {
		return 0, p.fail(0, "number too large", ErrTooLarge)
	}
	if si == 0 {
		si = 0 // no negative zero out of Parse
	}
	return si, nil
}

// number reads a signed decimal, fraction or mixed number at p.pos.
func (p *parser) number() (float64, error) {
	start := p.pos
	neg := false
	if p.pos < len(p.text) && (p.text[p.pos] == '+' || p.text[p.pos] == '-') {
		neg = p.text[p.pos] == '-'
		p.pos++
	} else if strings.HasPrefix(p.text[p.pos:], "−") { // U+2212 minus sign
		neg = true
		p.pos += len("−")
	}
	whole, err := p.decimal(true)
	if err != nil {
		return 0, err
	}
	v := whole
	// A fraction right after the first number: "3/4".
	if p.pos < len(p.text) && p.text[p.pos] == '/' {
		v, err = p.fraction(whole)
		if err != nil {
			return 0, err
		}
	} else if frac, ok, err := p.mixedTail(); err != nil {
		return 0, err
	} else if ok {
		if whole != math.Trunc(whole) {
			return 0, p.fail(start, "a mixed number needs a whole number before the fraction", ErrSyntax)
		}
		v = whole + frac
	}
	if neg {
		v = -v
	}
	if math.Abs(v) > maxMagnitude {
		return 0, p.fail(start, "number too large", ErrTooLarge)
	}
	return v, nil
}

// mixedTail looks for "-1/2" or " 1/2" after a whole number and reads it.
func (p *parser) mixedTail() (float64, bool, error) {
	save := p.pos
	i := p.pos
	if i < len(p.text) && p.text[i] == '-' {
		i++
	} else {
		j := i
		for j < len(p.text) && (p.text[j] == ' ' || p.text[j] == '\t') {
			j++
		}
		if j == i {
			return 0, false, nil
		}
		i = j
	}
	// Need digits then '/'.
	j := i
	for j < len(p.text) && isDigit(p.text[j]) {
		j++
	}
	if j == i || j >= len(p.text) || p.text[j] != '/' {
		return 0, false, nil
	}
	p.pos = i
	num, err := p.decimal(false)
	if err != nil {
		p.pos = save
		return 0, false, err
	}
	v, err := p.fraction(num)
	if err != nil {
		return 0, false, err
	}
	if v >= 1 {
		return 0, false, p.fail(save, "the fraction in a mixed number must be less than 1 (e.g. 1-1/2)", ErrSyntax)
	}
	return v, true, nil
}

func (p *parser) fraction(num float64) (float64, error) {
	p.pos++ // '/'
	den, err := p.decimal(false)
	if err != nil {
		return 0, err
	}
	if den == 0 {
		return 0, p.fail(p.pos, "division by zero", ErrSyntax)
	}
	return num / den, nil
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// decimal reads digits with an optional point and, when allowExp, an
// optional exponent. Only this grammar reaches strconv.ParseFloat, so the
// forms ParseFloat accepts beyond it (NaN, Inf, hex, underscores) never pass.
func (p *parser) decimal(allowExp bool) (float64, error) {
	start := p.pos
	digits := 0
	for p.pos < len(p.text) && isDigit(p.text[p.pos]) {
		p.pos++
		digits++
	}
	if allowExp && p.pos < len(p.text) && p.text[p.pos] == '.' {
		p.pos++
		for p.pos < len(p.text) && isDigit(p.text[p.pos]) {
			p.pos++
			digits++
		}
	}
	if digits == 0 {
		return 0, p.fail(start, p.notANumber(start), ErrSyntax)
	}
	// Reject "0x10" style and digit separators with a clear message.
	if p.pos < len(p.text) {
		switch c := p.text[p.pos]; {
		case c == 'x' || c == 'X':
			if p.text[start:p.pos] == "0" {
				return 0, p.fail(start, "hexadecimal numbers are not accepted", ErrSyntax)
			}
		case c == '_':
			return 0, p.fail(p.pos, "digit separators (_) are not accepted", ErrSyntax)
		case c == ',':
			return 0, p.fail(p.pos, "use a decimal point, not a comma (write 2.5, not 2,5), and no thousands separators", ErrSyntax)
		case c == '.' && !allowExp:
			return 0, p.fail(p.pos, "a fraction takes whole numbers (e.g. 3/4)", ErrSyntax)
		}
	}
	if allowExp && p.pos < len(p.text) && (p.text[p.pos] == 'e' || p.text[p.pos] == 'E') {
		i := p.pos + 1
		if i < len(p.text) && (p.text[i] == '+' || p.text[i] == '-') {
			i++
		}
		j := i
		for j < len(p.text) && isDigit(p.text[j]) {
			j++
		}
		if j > i {
			p.pos = j
		}
	}
	v, err := strconv.ParseFloat(p.text[start:p.pos], 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, p.fail(start, "number too large", ErrTooLarge)
	}
	if v > maxMagnitude {
		return 0, p.fail(start, "number too large", ErrTooLarge)
	}
	return v, nil
}

func (p *parser) notANumber(at int) string {
	rest := strings.ToLower(strings.TrimSpace(p.text[at:]))
	switch {
	case strings.HasPrefix(rest, "nan"):
		return "NaN is not a number you can measure"
	case strings.HasPrefix(rest, "inf"), strings.HasPrefix(rest, "∞"):
		return "infinity is not accepted"
	case rest == "":
		return "a number is missing"
	}
	return "expected a number such as 1.5, 3/4 or 1-1/2"
}

// displayUnit is the unit Format uses for d in sys.
func displayUnit(d Dim, si float64, sys System) unit {
	if d == DimTime {
		a := math.Abs(si)
		switch {
		case a < 120:
			u, _ := unitByName(d, "s")
			return u
		case a < 2*3600:
			u, _ := unitByName(d, "min")
			return u
		default:
			u, _ := unitByName(d, "h")
			return u
		}
	}
	if d == DimNumber {
		return unit{scale: 1}
	}
	u, _ := unitByName(d, DefaultUnit(d, sys))
	return u
}

// precision tells how to round a value shown in unit u: fixed decimals, or
// (sig > 0) significant figures.
func precision(d Dim, u unit) (decimals, sig int) {
	switch d {
	case DimLength:
		if u.name == "ft" {
			return 1, 0 // 0.1 ft ≈ 3 cm
		}
		return 2, 0 // to the centimetre
	case DimDiameter:
		return 0, 3
	case DimRoughness:
		return 0, 2
	case DimPressure:
		if u.name == "psi" {
			return 2, 0
		}
		return 1, 0
	case DimTemperature:
		return 1, 0
	case DimDensity:
		if u.name == "kg/m³" {
			return 1, 0
		}
		return 2, 0
	case DimViscosity, DimFlow, DimVolume:
		return 0, 3
	case DimTime:
		if u.name == "h" {
			return 1, 0
		}
		return 0, 0
	case DimVelocity:
		if u.name == "ft/s" {
			return 1, 0 // 0.1 ft/s ≈ 3 cm/s
		}
		return 2, 0
	default: // DimNumber
	}
	return 0, 4
}

// Format writes si (in SI units) as a value and unit in sys, rounded for the
// field: diameters, viscosities, flows and volumes to 3 significant figures,
// roughness to 2, lengths to the centimetre or 0.1 ft, temperatures to 0.1°,
// pressures to 0.1 kPa or 0.01 psi, durations in s, min or h. Plain numbers
// show up to 4 significant figures without trailing zeros. The result is
// accepted by Parse. Non-finite values print "—" (never "NaN").
func Format(d Dim, si float64, sys System) string {
	num, unit := FormatParts(d, si, sys)
	if unit == "" || num == "—" {
		return num
	}
	return num + " " + unit
}

// FormatParts is Format split into the number and the unit symbol, for
// aligned columns.
func FormatParts(d Dim, si float64, sys System) (number, unit string) {
	if math.IsNaN(si) || math.IsInf(si, 0) || d < 0 || d >= dimCount {
		return "—", ""
	}
	u := displayUnit(d, si, sys)
	v := si/u.scale - u.off
	dec, sig := precision(d, u)
	s := formatNumber(v, dec, sig)
	if d == DimNumber {
		s = trimZeros(s)
	}
	return s, u.name
}

func formatNumber(v float64, decimals, sig int) string {
	// Nudge by a part in 1e12 so that a unit conversion landing a hair
	// under a half (3/4 in = 19.049999… mm) rounds as the exact value would.
	v += v * 1e-12
	if sig > 0 {
		if v == 0 {
			decimals = sig - 1
		} else {
			e := math.Floor(math.Log10(math.Abs(v)))
			// 9.996 to 3 figures is 10.0, not 10.00: take the exponent
			// after rounding.
			if r := math.Abs(v) + 0.5*math.Pow(10, e+1-float64(sig)); math.Floor(math.Log10(r)) > e {
				e++
			}
			decimals = max(0, sig-1-int(e))
		}
	}
	if math.Abs(v) >= 1e9 {
		n := sig
		if n < 4 {
			n = 4
		}
		return strconv.FormatFloat(v, 'e', n-1, 64)
	}
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if strings.HasPrefix(s, "-") && strings.Trim(s[1:], "0.") == "" {
		s = s[1:] // no "-0.0"
	}
	return s
}

func trimZeros(s string) string {
	if strings.ContainsAny(s, "eE") || !strings.Contains(s, ".") {
		return s
	}
	s = strings.TrimRight(s, "0")
	return strings.TrimSuffix(s, ".")
}

// formatPlain is Format's number without trailing zeros, for range messages
// ("3 to 600 mm").
func formatPlain(d Dim, si float64, sys System) (string, string) {
	n, u := FormatParts(d, si, sys)
	return trimZeros(n), u
}
