package model

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// Readings typed with their time. The Log pane's reading input takes the
// level, then, when the reading was not taken now, "@" and its time:
//
//	0.42              now
//	0.42 @ 14:05      today at 14:05 (yesterday when 14:05 is still to come)
//	0.42 @ 14:05:30   to the second
//	0.42 @ -10 min    ten minutes ago (also "10 min ago", "-90 s", "-1 h")
//	0.42 @ 2026-05-14 14:05
//
// A flow test is typed as VOLUME/TIME (ParseFlowTest), then "@" and the
// level when it is read at the test, then ";" and a note:
//
//	10L/12s @ 0.31 m; bucket at the outfall

// MaxReadingAge bounds how far back a typed reading time may be.
const MaxReadingAge = 31 * 24 * time.Hour

// readingClockSlack is how far ahead of the clock a typed time may be
// (the technician's watch and the device's clock differ a little).
const readingClockSlack = 2 * time.Minute

// ParseReadingTime reads the time of a reading as typed (see above); empty
// or "now" is now. Times are in loc. A time later than now (beyond a
// couple of minutes of clock difference) or more than MaxReadingAge ago is
// refused, naming the accepted forms.
func ParseReadingTime(text string, now time.Time, loc *time.Location) (time.Time, error) {
	if loc == nil {
		loc = time.Local
	}
	s := strings.ToLower(strings.TrimSpace(text))
	if s == "" || s == "now" {
		return now, nil
	}
	t, err := readingTime(s, now, loc)
	if err != nil {
		return time.Time{}, err
	}
	switch {
	case t.After(now.Add(readingClockSlack)):
		return time.Time{}, fmt.Errorf("reading time %q is later than now (%s); accepted: now, 14:05, -10 min, 10 min ago, 2026-05-14 14:05",
			strings.TrimSpace(text), now.In(loc).Format("15:04"))
	case t.Before(now.Add(-MaxReadingAge)):
		return time.Time{}, fmt.Errorf("reading time %q is more than %d days ago; accepted: up to %d days back", strings.TrimSpace(text),
			int(MaxReadingAge.Hours()/24), int(MaxReadingAge.Hours()/24))
	}
	return t, nil
}

var errTimeForm = errors.New("accepted: now, 14:05, 14:05:30, -10 min, 10 min ago, 2026-05-14 14:05")

func readingTime(s string, now time.Time, loc *time.Location) (time.Time, error) {
	bad := func() (time.Time, error) {
		return time.Time{}, fmt.Errorf("reading time %q: %w", s, errTimeForm)
	}
	// Ago forms: "-10 min", "10 min ago", "-1h", "90 s ago".
	if ago, ok := strings.CutSuffix(s, "ago"); ok || strings.HasPrefix(s, "-") {
		body := strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(ago), "-"))
		d, err := agoDuration(body)
		if err != nil {
			return bad()
		}
		return now.Add(-d), nil
	}
	for _, layout := range []string{"2006-01-02 15:04:05", "2006-01-02 15:04", "2006-01-02T15:04:05", "2006-01-02T15:04"} {
		if t, err := time.ParseInLocation(layout, s, loc); err == nil {
			return t, nil
		}
	}
	for _, layout := range []string{"15:04:05", "15:04", "15.04"} {
		c, err := time.ParseInLocation(layout, s, loc)
		if err != nil {
			continue
		}
		n := now.In(loc)
		t := time.Date(n.Year(), n.Month(), n.Day(), c.Hour(), c.Minute(), c.Second(), 0, loc)
		if t.After(now.Add(readingClockSlack)) {
			t = t.AddDate(0, 0, -1) // 23:55 typed just after midnight
		}
		return t, nil
	}
	return bad()
}

// agoDuration reads "10 min", "10min", "90 s", "1.5 h", "1 h 30 min".
func agoDuration(s string) (time.Duration, error) {
	units := map[string]time.Duration{
		"s": time.Second, "sec": time.Second, "secs": time.Second, "second": time.Second, "seconds": time.Second,
		"m": time.Minute, "min": time.Minute, "mins": time.Minute, "minute": time.Minute, "minutes": time.Minute,
		"h": time.Hour, "hr": time.Hour, "hrs": time.Hour, "hour": time.Hour, "hours": time.Hour,
	}
	var total time.Duration
	rest := strings.TrimSpace(s)
	if rest == "" {
		return 0, errTimeForm
	}
	for rest != "" {
		i := 0
		for i < len(rest) && (rest[i] >= '0' && rest[i] <= '9' || rest[i] == '.') {
			i++
		}
		if i == 0 {
			return 0, errTimeForm
		}
		v, err := strconv.ParseFloat(rest[:i], 64)
		if err != nil || math.IsInf(v, 0) {
			return 0, errTimeForm
		}
		rest = strings.TrimSpace(rest[i:])
		j := 0
		for j < len(rest) && rest[j] >= 'a' && rest[j] <= 'z' {
			j++
		}
		u, ok := units[rest[:j]]
		if !ok {
			return 0, errTimeForm
		}
		rest = strings.TrimSpace(rest[j:])
		if v*float64(u) > float64(MaxReadingAge)*2 {
			return 0, errTimeForm
		}
		total += time.Duration(v * float64(u))
	}
	return total, nil
}

// ParseReadingEntry reads a reading typed in the Log pane: the level, and
// "@ TIME" when it was not taken now (ParseReadingTime). Errors name the
// part at fault.
func ParseReadingEntry(text string, sys System, now time.Time, loc *time.Location) (Reading, error) {
	level, when, _ := strings.Cut(text, "@")
	at, err := ParseReadingTime(when, now, loc)
	if err != nil {
		return Reading{}, err
	}
	return NewReading(level, sys, at, "")
}

// ReadingEntryText is the text that ParseReadingEntry reads back as r
// (level as typed, to its resolution, and its time to the second): what a
// correction starts from.
func ReadingEntryText(r Reading, sys System, loc *time.Location) string {
	if loc == nil {
		loc = time.Local
	}
	lv := Format(DimLength, r.Level, sys)
	if r.Resolution > 0 && sys == SI {
		dec := max(int(math.Ceil(-math.Log10(r.Resolution)-1e-9)), 0)
		lv = strconv.FormatFloat(r.Level, 'f', min(dec, 6), 64) + " m"
	} else if sys == US && r.Resolution > 0 && r.Resolution < 0.00635 {
		dec := max(int(math.Ceil(-math.Log10(r.Resolution/0.3048)-1e-9)), 0)
		lv = strconv.FormatFloat(r.Level/0.3048, 'f', min(dec, 6), 64) + " ft"
	}
	return lv + " @ " + r.At.In(loc).Format("2006-01-02 15:04:05")
}

// ParseFlowTestEntry reads a flow test typed in the Log pane: VOLUME/TIME
// (ParseFlowTest), then "@ LEVEL" when the level was read at the test, then
// "; NOTE". Without a level, Level is 0 (FlowTestLevel fills it).
func ParseFlowTestEntry(text string, sys System, at time.Time) (FlowTest, error) {
	body, note, _ := strings.Cut(text, ";")
	flow, level, hasLevel := strings.Cut(body, "@")
	f, err := ParseFlowTest(flow, sys, at)
	if err != nil {
		return FlowTest{}, err
	}
	if hasLevel {
		h, err := Parse(DimLength, level, sys)
		if err != nil {
			return FlowTest{}, fmt.Errorf("flow test level: %w", err)
		}
		if !(h > 0) || h > MaxReadingLevel {
			return FlowTest{}, fmt.Errorf("flow test level %q is out of range; accepted above 0 to %s, measured up from the tank floor",
				strings.TrimSpace(level), Format(DimLength, MaxReadingLevel, sys))
		}
		f.Level = h
	}
	if f.Note, err = cleanLine("Flow test note", note, maxLine); err != nil {
		return FlowTest{}, err
	}
	if err := f.Validate(); err != nil {
		return FlowTest{}, err
	}
	return f, nil
}
