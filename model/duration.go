package model

import (
	"math"
	"strconv"
)

// FormatDuration writes a duration in seconds the way a technician reads a
// clock: "45 s", "12 min", "2 h 10 min", "3 d 4 h". Non-finite or negative
// values print "—"; beyond about 30 years, "more than 30 years". The screen,
// the record and the text output all use it.
func FormatDuration(s float64) string {
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
