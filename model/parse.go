package model

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

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
	// maxRateSI bounds a rate of rise (m/s): shown in mm/h it is 3.6e6
	// times the SI value, so maxSI would print past maxMagnitude.
	maxRateSI = 100
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
	if math.Abs(si) > maxSI*1.001 || math.IsNaN(si) || p.d == DimRate && math.Abs(si) > maxRateSI*1.001 {
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
// It is one hand-written scanner (cyclomatic ~31) so that every refusal
// names the position and the reason.
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
