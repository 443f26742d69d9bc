package presets

import (
	"math"
	"strconv"
	"strings"
)

// Parsing the nominal sizes people type: "2in", `2"`, "1-1/2in",
// "1 1/2 in", "1.5in", "63mm", "63", "DN50". Used for bore look-ups
// (Catalogue.Bore) and for the other spellings of hose size IDs
// (Catalogue.Hose).

// Size units a nominal size is given in.
const (
	unitNone = ""   // a bare number: the series' own unit
	unitIn   = "in" // inches
	unitMM   = "mm" // millimetres
	unitDN   = "dn" // DN (diamètre nominal), ISO 6708: a number without unit
)

// maxSizeText bounds what parseSize looks at.
const maxSizeText = 24

// parseSize reads a nominal size. It accepts a whole or decimal number, a
// fraction a/b, or a whole number and a fraction (w-a/b or w a/b),
// followed by in, inch, inches, " or mm, or preceded by DN; case and spaces
// do not matter. It returns the number and its unit (unitNone for a bare
// number), or ok = false. The number is 0.01 to 10,000; hex, exponents,
// Inf, NaN and signs are refused.
func parseSize(s string) (v float64, unit string, ok bool) {
	s = strings.ToLower(strings.TrimSpace(s))
	if s == "" || len(s) > maxSizeText {
		return 0, "", false
	}
	switch {
	case strings.HasPrefix(s, "dn"):
		unit, s = unitDN, s[2:]
	case strings.HasSuffix(s, "mm"):
		unit, s = unitMM, s[:len(s)-2]
	default:
		for _, suf := range []string{"inches", "inch", "in", `"`} {
			if strings.HasSuffix(s, suf) {
				unit, s = unitIn, s[:len(s)-len(suf)]
				break
			}
		}
	}
	v, ok = parseSizeNumber(strings.TrimSpace(s))
	if !ok || unit == unitDN && v != math.Trunc(v) {
		return 0, "", false
	}
	return v, unit, true
}

// parseSizeNumber reads "2", "2.5", "1/2", "1-1/2" or "1 1/2".
func parseSizeNumber(s string) (float64, bool) {
	whole, frac := s, ""
	if i := strings.IndexAny(s, "- "); i >= 0 {
		whole, frac = strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+1:])
		if !strings.Contains(frac, "/") {
			return 0, false
		}
	} else if strings.Contains(s, "/") {
		whole, frac = "0", s
	}
	w, ok := plainNumber(whole)
	if !ok {
		return 0, false
	}
	if frac != "" {
		a, b, found := strings.Cut(frac, "/")
		n, ok1 := plainNumber(a)
		d, ok2 := plainNumber(b)
		if !found || !ok1 || !ok2 || d == 0 || n >= d || strings.Contains(a+b, ".") {
			return 0, false
		}
		w += n / d
	}
	if !(w >= 0.01) || w > 10000 { // 0.01 to 10,000: no size is smaller or larger
		return 0, false
	}
	return w, true
}

// plainNumber parses digits with at most one decimal point, nothing else.
func plainNumber(s string) (float64, bool) {
	if s == "" || strings.Count(s, ".") > 1 || strings.Trim(s, "0123456789.") != "" || s == "." {
		return 0, false
	}
	v, err := strconv.ParseFloat(s, 64)
	return v, err == nil
}

// sameSize reports whether two parsed sizes are the same size: the same
// unit (a bare number counts as the other's unit) and the same number.
func sameSize(v1 float64, u1 string, v2 float64, u2 string) bool {
	if u1 != u2 && u1 != unitNone && u2 != unitNone {
		return false
	}
	return math.Abs(v1-v2) <= 1e-9*math.Max(v1, v2)
}
