package present

import (
	"math"
	"strconv"
	"strings"

	"drawdown/model"
)

// Minus is the minus sign every reader shows (U+2212). Machine formats (CSV,
// JSON) keep the ASCII hyphen-minus; model.Format, whose text is typed back
// into fields, keeps it too.
const Minus = "−"

// Figures formats values in one unit system. Every figure a person reads
// goes through it, so a value reads the same on the screen, on the command
// line and in the record.
type Figures struct{ Sys model.System }

// Of formats an SI value of dimension d, with its unit, rounded for the
// dimension (model.Format), with the typographic minus, and a volume of five
// digits or more grouped by thousands ("10 214 L", "2,698 gal").
func (f Figures) Of(d model.Dim, si float64) string {
	if d != model.DimVolume {
		return typographic(model.Format(d, si, f.Sys))
	}
	n, u := model.FormatParts(d, si, f.Sys)
	n = group(n, f.Sys)
	if u == "" || n == "—" {
		return typographic(n)
	}
	return typographic(n + " " + u)
}

// GroupSep separates groups of three digits: a space in SI (ISO 80000-1,
// 7.3.1, and the SI Brochure, 5.4.4, ask for a small space; a plain space is
// the one every terminal and font draws), a comma in US customary (common
// practice).
func GroupSep(sys model.System) string {
	if sys == model.US {
		return ","
	}
	return " "
}

// group puts the separator between groups of three digits of a number's
// whole part when it has five digits or more (four stay as they are:
// "2698 gal" reads at a glance, as SI usage has it).
func group(n string, sys model.System) string {
	sign := ""
	if strings.HasPrefix(n, "-") {
		sign, n = "-", n[1:]
	}
	whole, frac, hasFrac := strings.Cut(n, ".")
	if len(whole) < 5 || strings.ContainsAny(whole, "eE") {
		return sign + n
	}
	sep := GroupSep(sys)
	var b strings.Builder
	for i, c := range whole {
		if i > 0 && (len(whole)-i)%3 == 0 {
			b.WriteString(sep)
		}
		b.WriteRune(c)
	}
	if hasFrac {
		b.WriteString("." + frac)
	}
	return sign + b.String()
}

// Signed is Of with an explicit sign: "+0.30 m", "−0.30 m" (zero has none).
func (f Figures) Signed(d model.Dim, si float64) string {
	s := f.Of(d, si)
	if strings.HasPrefix(s, Minus) || s == "—" || isZero(s) {
		return s
	}
	return "+" + s
}

// Range joins the two ends of a range, sharing the unit when both ends are
// one number in the same unit ("60.4–100 L/min", but "22 min – 1 h 36 min").
func Range(lo, hi string) string {
	if lo == hi {
		return lo
	}
	li, hi2 := strings.IndexByte(lo, ' '), strings.IndexByte(hi, ' ')
	if li > 0 && hi2 > 0 && lo[li:] == hi[hi2:] && strings.Count(lo, " ") == 1 {
		return lo[:li] + "–" + hi
	}
	return lo + " – " + hi
}

// Duration writes a duration in seconds the way a technician reads a clock:
// "45 s", "12 min", "2 h 10 min", "3 d 4 h". Non-finite or negative values
// print "—"; beyond about 30 years, "more than 30 years".
func Duration(s float64) string {
	if math.IsNaN(s) || math.IsInf(s, 0) || s < 0 {
		return "—"
	}
	switch {
	case s < 90:
		return strconv.Itoa(int(math.Round(s))) + " s"
	case s < 3600:
		return strconv.Itoa(int(math.Round(s/60))) + " min"
	case s < 48*3600:
		m := int(math.Round(s / 60))
		if m%60 == 0 {
			return strconv.Itoa(m/60) + " h"
		}
		return strconv.Itoa(m/60) + " h " + strconv.Itoa(m%60) + " min"
	case s >= 1e9:
		return "more than 30 years"
	}
	h := int(math.Round(s / 3600))
	if h%24 == 0 {
		return strconv.Itoa(h/24) + " d"
	}
	return strconv.Itoa(h/24) + " d " + strconv.Itoa(h%24) + " h"
}

// typographic swaps a leading ASCII minus for the typographic one.
func typographic(s string) string {
	if strings.HasPrefix(s, "-") {
		return Minus + s[1:]
	}
	return s
}

func isZero(s string) bool {
	n, _, _ := strings.Cut(s, " ")
	return strings.Trim(n, "0.") == "" && n != ""
}
