package model

import (
	"math"
	"testing"
	"time"
)

// Bucket tests as typed on site; litre and US gallon factors from NIST SP 811
// (1 gal = 3.785412 L).
func TestParseFlowTest(t *testing.T) {
	at := time.Date(2026, 12, 2, 9, 0, 0, 0, time.UTC)
	for _, c := range []struct {
		text string
		sys  System
		flow float64 // m³/s; 0 for an error
	}{
		{"10L/12s", SI, 0.010 / 12},
		{"10 L / 12", SI, 0.010 / 12},
		{"20 L/1 min", SI, 0.020 / 60},
		{"5gal/30s", US, 5 * 3.785412e-3 / 30},
		{"10L", SI, 0},
		{"0L/12s", SI, 0},
		{"10L/0s", SI, 0},
		{"10L/abc", SI, 0},
		{"NaN L/3s", SI, 0},
	} {
		f, err := ParseFlowTest(c.text, c.sys, at)
		if c.flow == 0 {
			if err == nil {
				t.Errorf("%q: accepted as %g m³/s", c.text, f.Flow())
			}
			continue
		}
		if err != nil {
			t.Errorf("%q: %v", c.text, err)
			continue
		}
		if math.Abs(f.Flow()-c.flow) > 1e-6*c.flow {
			t.Errorf("%q: %g m³/s, want %g", c.text, f.Flow(), c.flow)
		}
	}
}
