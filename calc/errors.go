package calc

import (
	"errors"
	"math"
	"strconv"
)

// Error policy (see DEVELOPERS.md): invalid physical input is an error value,
// because in drawdown every input comes from a person. A *RangeError names the
// quantity, the value and the accepted range. Sentinels below classify it so
// callers can use errors.Is. NaN and Inf never leave calc. Programmer errors
// (mismatched slices, impossible states) panic with a "calc: " prefix.

// ErrOutOfRange is wrapped by every *RangeError: a value outside the range in
// which the quantity or the correlation is valid.
var ErrOutOfRange = errors.New("out of range")

// ErrNotFinite is wrapped by a *RangeError whose value was NaN or ±Inf.
var ErrNotFinite = errors.New("not a finite number")

// ErrBoiling reports a liquid whose vapour pressure reaches the site's
// barometric pressure: it boils in the open and no siphon can run.
var ErrBoiling = errors.New("liquid boils at site pressure")

// ErrGeometry reports heights or lengths that contradict each other (an up-leg
// longer than the whole hose, an intake above the surface, a roughness as big
// as the bore).
var ErrGeometry = errors.New("inconsistent geometry")

// RangeError is the error for one input quantity outside its accepted range.
// Min and Max are in SI units; an open end is ±Inf. Unit is the SI unit symbol
// used in the message.
type RangeError struct {
	Quantity string  // human name, e.g. "hose inside diameter"
	Value    float64 // offending value (SI)
	Min, Max float64 // accepted range (SI), inclusive
	Unit     string  // SI unit symbol, e.g. "m"
	Err      error   // ErrOutOfRange, ErrNotFinite, ErrBoiling or ErrGeometry
	Note     string  // optional extra reason, e.g. "vapour pressure above barometric"
}

func (e *RangeError) Error() string {
	s := e.Quantity + " "
	if math.IsNaN(e.Value) || math.IsInf(e.Value, 0) {
		s += "is not a finite number"
	} else {
		s += strconv.FormatFloat(e.Value, 'g', 5, 64) + " " + e.Unit + " is out of range"
	}
	s += "; accepted " + rangeText(e.Min, e.Max, e.Unit)
	if e.Note != "" {
		s += " (" + e.Note + ")"
	}
	return s
}

// Unwrap returns the sentinel classifying the error.
func (e *RangeError) Unwrap() error { return e.Err }

func rangeText(lo, hi float64, unit string) string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 5, 64) }
	switch {
	case math.IsInf(lo, -1) && math.IsInf(hi, 1):
		return "any finite value"
	case math.IsInf(hi, 1):
		if lo == 0 {
			return "more than 0 " + unit
		}
		return "at least " + f(lo) + " " + unit
	case math.IsInf(lo, -1):
		return "at most " + f(hi) + " " + unit
	}
	return f(lo) + " to " + f(hi) + " " + unit
}

// checkRange returns a *RangeError when v is not finite or lies outside
// [lo, hi]. Use lo = 0 with positive = true for "strictly more than zero".
func checkRange(quantity string, v, lo, hi float64, unit string) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &RangeError{Quantity: quantity, Value: v, Min: lo, Max: hi, Unit: unit, Err: ErrNotFinite}
	}
	if v < lo || v > hi {
		return &RangeError{Quantity: quantity, Value: v, Min: lo, Max: hi, Unit: unit, Err: ErrOutOfRange}
	}
	return nil
}

// checkPositive is checkRange for quantities that must be strictly positive
// and at most hi.
func checkPositive(quantity string, v, hi float64, unit string) error {
	if err := checkRange(quantity, v, 0, hi, unit); err != nil {
		return err
	}
	if v <= 0 {
		return &RangeError{Quantity: quantity, Value: v, Min: 0, Max: hi, Unit: unit, Err: ErrOutOfRange, Note: "must be more than zero"}
	}
	return nil
}
