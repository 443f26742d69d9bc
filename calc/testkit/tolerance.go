package testkit

import (
	"math"
	"strconv"
	"testing"
)

// NearZero is the size below which an expected value counts as zero, so
// that Within compares absolutely.
const NearZero = 1e-12

// Within reports whether got is within tol of want:
//
//	|got − want| ≤ tol·|want|   when |want| > NearZero (relative)
//	|got − want| ≤ tol          when |want| ≤ NearZero (absolute)
//
// A got that is NaN or ±Inf is never within. To state an absolute tolerance
// δ for a non-zero want, pass δ/|want| (e.g. half a unit of the last printed
// digit over the printed value), so that every case reads by one rule.
func Within(got, want, tol float64) bool {
	if math.IsNaN(got) || math.IsInf(got, 0) {
		return false
	}
	d := math.Abs(got - want)
	if math.Abs(want) <= NearZero {
		return d <= tol
	}
	return d <= tol*math.Abs(want)
}

// Close checks got against want by the rule of Within. On failure it reports
// through t.Errorf the case (what), both values, the tolerance and the source
// of the expected value, and returns false.
func Close(t testing.TB, what string, got, want, tol float64, source string) bool {
	t.Helper()
	if Within(got, want, tol) {
		return true
	}
	kind := "relative"
	if math.Abs(want) <= NearZero {
		kind = "absolute"
	}
	t.Errorf("%s: got %s, want %s ±%s %s (%s)", what, g(got), g(want), g(tol), kind, source)
	return false
}

func g(v float64) string { return strconv.FormatFloat(v, 'g', 12, 64) }
