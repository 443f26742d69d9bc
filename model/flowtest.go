package model

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// FlowTest is one bucket-and-stopwatch test of the siphon's flow at the
// outlet: a container of known volume timed as it fills (common practice: a
// container that takes at least a few seconds to fill, several repeats).
type FlowTest struct {
	At      time.Time `json:"at"`
	Volume  float64   `json:"volume_m3"` // volume caught, m³
	Seconds float64   `json:"seconds"`   // time to catch it, s
	// Level is the source level at the test, m above the floor (0 when not
	// given: the plan's level at that time is used).
	Level float64 `json:"level_m,omitempty"`
	By    string  `json:"by,omitempty"` // who took it
	Note  string  `json:"note,omitempty"`
}

// Flow is the measured flow, m³/s.
func (f FlowTest) Flow() float64 { return f.Volume / f.Seconds }

// Bounds on a flow test, and on the flow tests of one job.
const (
	MaxFlowTestVolume  = 10.0   // m³
	MaxFlowTestSeconds = 3600.0 // s
	MaxFlowTests       = 500    // tests in one job
	MaxFlowTestText    = 2000   // bytes of its name or note
)

// Validate checks the test has a time, a volume and a duration in range.
func (f FlowTest) Validate() error {
	switch {
	case f.At.IsZero():
		return errors.New("flow test: a time is required")
	case !(f.Volume > 0) || f.Volume > MaxFlowTestVolume || math.IsInf(f.Volume, 0):
		return fmt.Errorf("flow test: volume out of range; accepted more than 0 to %g m³", MaxFlowTestVolume)
	case !(f.Seconds > 0) || f.Seconds > MaxFlowTestSeconds || math.IsInf(f.Seconds, 0):
		return fmt.Errorf("flow test: time out of range; accepted more than 0 to %g s", MaxFlowTestSeconds)
	case math.IsNaN(f.Level) || math.IsInf(f.Level, 0) || f.Level < 0 || f.Level > MaxReadingLevel:
		return fmt.Errorf("flow test: level out of range; accepted 0 to %g m", MaxReadingLevel)
	}
	return nil
}

// ParseFlowTest reads a flow test typed as VOLUME/TIME, e.g. "10L/12s",
// "2.5 gal / 9 s", "20 L/1 min"; bare numbers are litres (SI) or US gallons
// (US) over seconds (a stopwatch reads seconds); a time without a number
// is one of that unit ("20 L/min", a rate). Errors name the part and its accepted range.
func ParseFlowTest(text string, sys System, at time.Time) (FlowTest, error) {
	vol, dur, ok := strings.Cut(text, "/")
	if !ok {
		return FlowTest{}, fmt.Errorf("flow test %q: type the volume caught over the time, e.g. 10L/12s", strings.TrimSpace(text))
	}
	v, err := Parse(DimVolume, vol, sys)
	if err != nil {
		return FlowTest{}, fmt.Errorf("flow test volume: %w", err)
	}
	dur = strings.TrimSpace(dur)
	if _, err := strconv.ParseFloat(dur, 64); err == nil {
		dur += " s" // a stopwatch reads seconds
	}
	if dur != "" && !(dur[0] >= '0' && dur[0] <= '9' || dur[0] == '.') {
		dur = "1 " + dur // a rate as read off a meter: 20 L/min is 20 L in 1 min
	}
	s, err := Parse(DimTime, dur, sys)
	if err != nil {
		return FlowTest{}, fmt.Errorf("flow test time: %w", err)
	}
	f := FlowTest{At: at, Volume: v, Seconds: s}
	switch {
	case !(v > 0):
		return FlowTest{}, fmt.Errorf("flow test volume: nothing caught; accepted more than 0 to %s", shown(DimVolume, MaxFlowTestVolume, sys))
	case !(s > 0):
		return FlowTest{}, fmt.Errorf("flow test time: no time; accepted more than 0 to %s", shown(DimTime, MaxFlowTestSeconds, sys))
	case v > MaxFlowTestVolume:
		return FlowTest{}, fmt.Errorf("flow test volume %s is out of range; accepted more than 0 to %s",
			shown(DimVolume, v, sys), shown(DimVolume, MaxFlowTestVolume, sys))
	case s > MaxFlowTestSeconds:
		return FlowTest{}, fmt.Errorf("flow test time %s is out of range; accepted more than 0 to %s",
			shown(DimTime, s, sys), shown(DimTime, MaxFlowTestSeconds, sys))
	}
	if err := f.Validate(); err != nil {
		return FlowTest{}, err
	}
	return f, nil
}

// AddFlowTest checks f and appends it to the job's flow tests (journalled as
// an appended list entry; a checkpoint follows). The next Compute narrows
// the plan's band to what the tests support (see NarrowByFlowTests). The
// caller logs it (present.FlowTestLine words it).
func (j *Job) AddFlowTest(f FlowTest) error {
	if err := f.Validate(); err != nil {
		return err
	}
	if len(j.FlowTests) >= MaxFlowTests {
		return fmt.Errorf("flow test: the job holds %d already; accepted at most %d", len(j.FlowTests), MaxFlowTests)
	}
	if len(f.By) > MaxFlowTestText || len(f.Note) > MaxFlowTestText {
		return fmt.Errorf("flow test: name or note over %d bytes", MaxFlowTestText)
	}
	j.FlowTests = append(j.FlowTests, f)
	return nil
}
