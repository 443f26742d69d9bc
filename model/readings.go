package model

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"time"
)

// Field readings: the technician reads the source level off a rod, tape or
// gauge as the drain runs and enters it with its time. FitReadings
// (readings_fit.go) compares the observed drawdown and any flow tests with
// the planned drain, fits an effective extra loss coefficient ΔK (what the
// hose run really loses beyond the fittings typed in: a partly blocked
// screen, a kink, a longer route, air at the crest) and, where readings and
// flow tests are both given, the inflow; re-predicts the finish from the
// last reading, and flags a siphon that slows down faster than planned
// (readings_slow.go).

// Reading is one observed source level.
type Reading struct {
	At    time.Time `json:"at"`
	Level float64   `json:"level_m"` // source surface above the tank floor (the plan's datum), m
	// Resolution is the step of the last digit typed, m ("0.333" gives
	// 0.001 m, "33 cm" 0.01 m, "1 ft 5 in" 1 in): the level is shown to
	// it, and the fit takes the reading's uncertainty from it. Zero when
	// not known (a reading from an older file).
	Resolution float64 `json:"resolution_m,omitempty"`
	Note       string  `json:"note,omitempty"`
	// By is the crew member who took the reading (the name on their key,
	// on the crew server); "" on a lone screen.
	By string `json:"by,omitempty"`
}

// MaxReadingLevel bounds a reading's level magnitude, m (as calc.MaxTankSize).
const MaxReadingLevel = 1000.0

// Validate checks the reading has a time and a finite level from 0 (the
// tank floor, the datum of every level) to MaxReadingLevel: a level below
// the floor is a misreading (a sign slip, a reading from the brim down).
// A resolution is finite, from 0 to MaxReadingLevel.
func (r Reading) Validate() error {
	if r.At.IsZero() {
		return errors.New("level reading: a time is required")
	}
	if math.IsNaN(r.Level) || math.IsInf(r.Level, 0) {
		return errors.New("level reading: level is not a finite number")
	}
	if r.Level < 0 {
		return fmt.Errorf("level reading: level %.4g m is below the tank floor; accepted 0 to %g m, measured up from the floor", r.Level, MaxReadingLevel)
	}
	if r.Level > MaxReadingLevel {
		return fmt.Errorf("level reading: level %.4g m is out of range; accepted 0 to %g m", r.Level, MaxReadingLevel)
	}
	if !(r.Resolution >= 0 && r.Resolution <= MaxReadingLevel) {
		return fmt.Errorf("level reading: resolution %.4g m is out of range; accepted 0 to %g m", r.Resolution, MaxReadingLevel)
	}
	return nil
}

// NewReading parses a level typed by the technician (a length in the job's
// unit system, any accepted suffix: "0.42", "42 cm", "1 ft 5 in") and
// returns the reading at time at, with the resolution typed (see
// TypedResolution). Errors name the level and the accepted range.
func NewReading(levelText string, sys System, at time.Time, note string) (Reading, error) {
	v, err := Parse(DimLength, levelText, sys)
	if err != nil {
		return Reading{}, fmt.Errorf("level reading: %w", err)
	}
	r := Reading{At: at, Level: v, Note: strings.TrimSpace(note), Resolution: TypedResolution(DimLength, levelText, sys)}
	if v < 0 || v > MaxReadingLevel {
		// In the user's units (Validate words a level read from a file in m).
		what := "is out of range"
		if v < 0 {
			what = "is below the tank floor"
		}
		return Reading{}, fmt.Errorf("level reading %q %s; accepted 0 to %s, measured up from the tank floor",
			strings.TrimSpace(levelText), what, Format(DimLength, MaxReadingLevel, sys))
	}
	if err := r.Validate(); err != nil {
		return Reading{}, err
	}
	return r, nil
}

// TypedResolution is the step of the last digit of text as typed, in SI:
// the difference Parse makes when that digit changes by one ("0.333" →
// 0.001 m, "42 cm" → 0.01 m, "1 ft 5 in" → 0.0254 m, "0.42" in US units →
// 0.01 ft). It is 0 when text has no digit, does not parse, or the step is
// not smaller than the value's own size (an exponent, a fraction's
// denominator: not a resolution).
func TypedResolution(d Dim, text string, sys System) float64 {
	v, err := Parse(d, text, sys)
	if err != nil {
		return 0
	}
	i := strings.LastIndexAny(text, "0123456789")
	if i < 0 {
		return 0
	}
	c := text[i]
	alt := c + 1
	if c == '9' {
		alt = c - 1
	}
	w, err := Parse(d, text[:i]+string(alt)+text[i+1:], sys)
	if err != nil {
		return 0
	}
	step := math.Abs(w - v)
	if !(step > 0) || math.IsInf(step, 0) || (v != 0 && step > math.Abs(v)) || step > MaxReadingLevel {
		return 0
	}
	// Round away the float noise of the two parses (0.334 − 0.333).
	e := math.Pow(10, math.Floor(math.Log10(step))-3)
	return math.Round(step/e) * e
}
