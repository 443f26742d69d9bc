package model

import (
	"math"
	"strconv"
	"strings"
)

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
	if d == DimVolume {
		// A pond's volume in litres is a row of zeros: cubic metres from
		// a thousand of them; million gallons from ten.
		switch a := math.Abs(si); {
		case sys != US && a >= 1000:
			u, _ := unitByName(d, "m³")
			return u
		case sys == US && a >= 1e7*m3PerGallon:
			u, _ := unitByName(d, "Mgal")
			return u
		}
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
			return 1, 4 // 0.1 ft ≈ 3 cm; feet and inches below 10 ft (FormatParts)
		}
		return 2, 4 // to the centimetre, at most 4 figures: 2000 m, not 2000.00 m
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
	case DimViscosity, DimFlow, DimVolume, DimRate, DimArea:
		return 0, 3
	case DimPercent:
		return 1, 0
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
// roughness to 2, lengths to the centimetre (at most 4 figures) or, in US
// units, in feet and inches to the quarter inch below 10 ft (as a tape is
// read: "1 ft 11-1/2 in", "2 in") and in feet to 0.1 ft above, temperatures to 0.1°,
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
	if d == DimLength && u.name == "ft" && math.Abs(v) < 10 {
		return feetInches(si)
	}
	dec, sig := precision(d, u)
	var s string
	if d == DimLength {
		s = formatCapped(v, dec, sig)
	} else {
		s = formatNumber(v, dec, sig)
	}
	if d == DimNumber || d == DimPercent {
		s = trimZeros(s)
	}
	return s, u.name
}

// formatCapped rounds to sig significant figures but to no more than
// decimals decimal places.
func formatCapped(v float64, decimals, sig int) string {
	if v != 0 && !math.IsNaN(v) {
		e := int(math.Floor(math.Log10(math.Abs(v)))) + 1 // digits before the point
		decimals = min(decimals, max(0, sig-e))
	}
	return formatNumber(v, decimals, 0)
}

// feetInches writes a length under 10 ft as feet and inches to the
// quarter inch, the way a tape is read and as Parse reads it back:
// "1 ft 11-1/2", unit "in"; "4", unit "ft" for whole feet; "2", unit "in"
// under a foot.
func feetInches(si float64) (number, unit string) {
	q := int(math.Round(math.Abs(si) / metrePerInch * 4)) // quarter inches
	sign := ""
	if si < 0 && q > 0 {
		sign = "-"
	}
	ft, qi := q/48, q%48
	in, frac := qi/4, qi%4
	inches := strconv.Itoa(in)
	if frac > 0 {
		f := [...]string{"", "1/4", "1/2", "3/4"}[frac]
		if in == 0 {
			inches = f
		} else {
			inches += "-" + f
		}
	}
	switch {
	case ft == 0:
		return sign + inches, "in"
	case qi == 0:
		return sign + strconv.Itoa(ft), "ft"
	}
	return sign + strconv.Itoa(ft) + " ft " + inches, "in"
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
	return typographicMinus(trimZeros(n)), u
}

// minusSign is the minus every message shows a person (U+2212); Format keeps
// the ASCII hyphen-minus, since its text is typed back into fields.
const minusSign = "−"

// shown is Format for a message: the typographic minus.
func shown(d Dim, si float64, sys System) string { return typographicMinus(Format(d, si, sys)) }

// typographicMinus swaps a leading ASCII minus for the typographic one.
func typographicMinus(s string) string {
	if strings.HasPrefix(s, "-") {
		return minusSign + s[1:]
	}
	return s
}
