package model

import (
	"math"
	"strings"
	"testing"
	"time"
)

var rtLoc = time.FixedZone("CEST", 2*3600)

// The time forms the reading input documents (readings_time.go).
func TestParseReadingTime(t *testing.T) {
	now := time.Date(2026, 5, 14, 10, 30, 0, 0, rtLoc)
	cases := []struct {
		in   string
		want time.Time
	}{
		{"", now},
		{"now", now},
		{"14:05", time.Date(2026, 5, 13, 14, 5, 0, 0, rtLoc)}, // still to come today: yesterday
		{"10:05", time.Date(2026, 5, 14, 10, 5, 0, 0, rtLoc)},
		{"10:05:30", time.Date(2026, 5, 14, 10, 5, 30, 0, rtLoc)},
		{"10.05", time.Date(2026, 5, 14, 10, 5, 0, 0, rtLoc)},
		{"10:31", time.Date(2026, 5, 14, 10, 31, 0, 0, rtLoc)}, // a minute of clock difference
		{"-10 min", now.Add(-10 * time.Minute)},
		{"-10min", now.Add(-10 * time.Minute)},
		{"10 min ago", now.Add(-10 * time.Minute)},
		{"90 s ago", now.Add(-90 * time.Second)},
		{"-1 h 30 min", now.Add(-90 * time.Minute)},
		{"-1.5h", now.Add(-90 * time.Minute)},
		{"2026-05-14 09:00", time.Date(2026, 5, 14, 9, 0, 0, 0, rtLoc)},
		{"2026-05-13 23:59:59", time.Date(2026, 5, 13, 23, 59, 59, 0, rtLoc)},
	}
	for _, tc := range cases {
		got, err := ParseReadingTime(tc.in, now, rtLoc)
		if err != nil || !got.Equal(tc.want) {
			t.Errorf("ParseReadingTime(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
	}
	for _, bad := range []string{"later", "25:00", "-", "-10 parsecs", "2026-05-15 09:00", "2025-01-01 09:00", "10 min from now", "-1e400 s", "-0x10 s", "ago"} {
		if got, err := ParseReadingTime(bad, now, rtLoc); err == nil {
			t.Errorf("ParseReadingTime(%q) = %v, accepted", bad, got)
		} else if !strings.Contains(err.Error(), "accepted") {
			t.Errorf("ParseReadingTime(%q): %v does not say what is accepted", bad, err)
		}
	}
}

// A reading typed with its time keeps the digits typed; the entry text
// of a reading reads back to the same reading (what a correction starts
// from).
func TestParseReadingEntry(t *testing.T) {
	now := time.Date(2026, 5, 14, 10, 30, 0, 0, rtLoc)
	r, err := ParseReadingEntry("0.333 @ 10:00", SI, now, rtLoc)
	if err != nil || r.Level != 0.333 || r.Resolution != 0.001 || !r.At.Equal(time.Date(2026, 5, 14, 10, 0, 0, 0, rtLoc)) {
		t.Fatalf("entry = %+v, %v", r, err)
	}
	for _, sys := range []System{SI, US} {
		for _, rd := range []Reading{r, {At: now, Level: 0.42}, {At: now, Level: 0.3302, Resolution: 0.0001}, {At: now, Level: 0.3048 * 1.093, Resolution: 0.001 * 0.3048}} {
			text := ReadingEntryText(rd, sys, rtLoc)
			back, err := ParseReadingEntry(text, sys, now, rtLoc)
			tol := math.Max(rd.Resolution, 0.0032) / 2
			if sys == SI && rd.Resolution == 0 {
				tol = 0.005
			}
			if err != nil || math.Abs(back.Level-rd.Level) > tol+1e-12 || !back.At.Equal(rd.At) {
				t.Errorf("%v: %q read back as %+v, %v; want %+v", sys, text, back, err, rd)
			}
		}
	}
	if _, err := ParseReadingEntry("0.4 @ soon", SI, now, rtLoc); err == nil || !strings.Contains(err.Error(), "reading time") {
		t.Errorf("bad time: %v", err)
	}
	if _, err := ParseReadingEntry("-0.4", SI, now, rtLoc); err == nil || !strings.Contains(err.Error(), "below the tank floor") {
		t.Errorf("bad level: %v", err)
	}
}

// The step of the last digit typed, in SI. Units: NIST SP 811 (1 ft =
// 0.3048 m, 1 in = 0.0254 m, exact).
func TestTypedResolution(t *testing.T) {
	cases := []struct {
		text string
		sys  System
		want float64
	}{
		{"0.333", SI, 0.001},
		{"0.33", SI, 0.01},
		{"0.339", SI, 0.001},
		{"33.3 cm", SI, 0.001},
		{"42 cm", SI, 0.01},
		{"330 mm", SI, 0.001},
		{"1 ft 5 in", SI, 0.0254},
		{"0.42", US, 0.003048},
		{"2", SI, 1},
		{"abc", SI, 0},
		{"", SI, 0},
	}
	for _, tc := range cases {
		if got := TypedResolution(DimLength, tc.text, tc.sys); math.Abs(got-tc.want) > 1e-12 {
			t.Errorf("TypedResolution(%q) = %g, want %g", tc.text, got, tc.want)
		}
	}
}

func TestParseFlowTestEntry(t *testing.T) {
	now := time.Date(2026, 5, 14, 10, 30, 0, 0, rtLoc)
	f, err := ParseFlowTestEntry("10L/12s @ 0.31 m; bucket at the outfall", SI, now)
	if err != nil || f.Volume != 0.01 || f.Seconds != 12 || f.Level != 0.31 || f.Note != "bucket at the outfall" || !f.At.Equal(now) {
		t.Fatalf("entry = %+v, %v", f, err)
	}
	// 10 L in 12 s = 50 L/min (arithmetic).
	if q := f.Flow() * 60000; math.Abs(q-50) > 1e-9 {
		t.Errorf("flow %g L/min", q)
	}
	g, err := ParseFlowTestEntry("2.5 gal/9", US, now)
	if err != nil || g.Level != 0 || math.Abs(g.Volume-2.5*0.003785411784) > 1e-12 { // 1 US gal = 3.785411784 L (NIST SP 811)
		t.Errorf("US entry = %+v, %v", g, err)
	}
	for _, bad := range []string{"10L", "10L/12s @ -1 m", "10L/12s @ x", "0L/12s", "10L/0s", "10L/12s; " + strings.Repeat("n", 300)} {
		if _, err := ParseFlowTestEntry(bad, SI, now); err == nil {
			t.Errorf("ParseFlowTestEntry(%q) accepted", bad)
		}
	}
}

func FuzzParseReadingEntry(f *testing.F) {
	for _, s := range []string{"0.42", "0.333 @ 10:00", "1 ft 5 in @ -10 min", "0.4 @ 10 min ago", "0.4@2026-05-14 09:00", "@", "0.4 @ -1e400 h"} {
		f.Add(s)
	}
	now := time.Date(2026, 5, 14, 10, 30, 0, 0, rtLoc)
	f.Fuzz(func(t *testing.T, s string) {
		for _, sys := range []System{SI, US} {
			r, err := ParseReadingEntry(s, sys, now, rtLoc)
			if err != nil {
				continue
			}
			if r.Validate() != nil || r.At.After(now.Add(readingClockSlack)) || r.At.Before(now.Add(-MaxReadingAge)) {
				t.Fatalf("%q gave %+v", s, r)
			}
			back, err := ParseReadingEntry(ReadingEntryText(r, sys, rtLoc), sys, now, rtLoc)
			if err != nil || !back.At.Equal(r.At.Truncate(time.Second)) && !back.At.Equal(r.At) {
				t.Fatalf("%q: entry text did not read back: %+v, %v", s, back, err)
			}
		}
		if ft, err := ParseFlowTestEntry(s, SI, now); err == nil && ft.Validate() != nil {
			t.Fatalf("flow test %q gave %+v", s, ft)
		}
	})
}
