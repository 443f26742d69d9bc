package model

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"
	"time"

	"drawdown/calc"
)

// Field readings: the technician reads the source level off a rod, tape or
// gauge as the drain runs and enters it with the time. FitReadings compares
// the observed drawdown with the planned one, fits an effective extra loss
// coefficient ΔK (what the hose run really loses beyond the fittings typed
// in: a partly blocked screen, a kink, a longer route, air at the crest),
// re-predicts the finish time and stop level from the last reading, and flags
// a siphon that is slowing down faster than planned.
//
// The fit is decoupled from calc through a Simulator, so it can be tested on
// an analytic drain and used with whatever drain integrator the plan uses.

// Reading is one observed source level.
type Reading struct {
	At    time.Time `json:"at"`
	Level float64   `json:"level_m"` // source surface above the tank floor (the plan's datum), m
	Note  string    `json:"note,omitempty"`
}

// MaxReadingLevel bounds a reading's level magnitude, m (as calc.MaxTankSize).
const MaxReadingLevel = 1000.0

// Validate checks the reading has a time and a finite level from 0 (the
// tank floor, the datum of every level) to MaxReadingLevel: a level below
// the floor is a misreading (a sign slip, a reading from the brim down).
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
	return nil
}

// NewReading parses a level typed by the technician (a length in the job's
// unit system, any accepted suffix: "0.42", "42 cm", "1 ft 5 in") and
// returns the reading at time at. Errors name the level and the accepted
// range.
func NewReading(levelText string, sys System, at time.Time, note string) (Reading, error) {
	v, err := Parse(DimLength, levelText, sys)
	if err != nil {
		return Reading{}, fmt.Errorf("level reading: %w", err)
	}
	r := Reading{At: at, Level: v, Note: strings.TrimSpace(note)}
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

// DrainCurve is a simulated drain: levels (m) at times (s) counted from the
// start level, times increasing, the last point at the stop. Stop is the stop
// reason code (target, intake, crest, equal) when the simulator knows it.
type DrainCurve struct {
	Times  []float64
	Levels []float64
	Stop   string
}

// LevelAt interpolates the curve linearly at t seconds; before the start it
// gives the first level and after the stop the stop level. An empty curve
// gives NaN (callers check Len first).
func (c DrainCurve) LevelAt(t float64) float64 {
	n := min(len(c.Times), len(c.Levels))
	if n == 0 {
		return math.NaN()
	}
	if t <= c.Times[0] {
		return c.Levels[0]
	}
	if t >= c.Times[n-1] {
		return c.Levels[n-1]
	}
	i, _ := slices.BinarySearch(c.Times[:n], t)
	// c.Times[i-1] < t ≤ c.Times[i]
	t0, t1 := c.Times[i-1], c.Times[i]
	if t1 <= t0 {
		return c.Levels[i]
	}
	return c.Levels[i-1] + (c.Levels[i]-c.Levels[i-1])*(t-t0)/(t1-t0)
}

// TimeAt is the first time (s) at which the curve falls to level h, and
// false when it never does.
func (c DrainCurve) TimeAt(h float64) (float64, bool) {
	n := min(len(c.Times), len(c.Levels))
	if n == 0 || c.Levels[0] < h {
		return 0, false
	}
	for i := 1; i < n; i++ {
		if c.Levels[i] <= h {
			l0, l1 := c.Levels[i-1], c.Levels[i]
			if l0 == l1 {
				return c.Times[i], true
			}
			return c.Times[i-1] + (c.Times[i]-c.Times[i-1])*(l0-h)/(l0-l1), true
		}
	}
	return 0, false
}

// End is the time of the last point (the stop), s.
func (c DrainCurve) End() float64 {
	if len(c.Times) == 0 {
		return 0
	}
	return c.Times[len(c.Times)-1]
}

// Simulator runs the planned drain from startLevel (m) with extraK added to
// the run's loss coefficients ΣK, and returns the curve with times counted
// from that start. extraK = 0 is the plan.
type Simulator func(extraK, startLevel float64) (DrainCurve, error)

// FitOptions tunes FitReadings. Zero values take the defaults.
type FitOptions struct {
	// KMin, KMax bound the search for ΔK. Default KMin = −0.5·ΣK of the plan
	// when SumK is set, else −0.5; default KMax = 200.
	KMin, KMax float64
	// SumK is the plan's ΣK (entrance, fittings and exit), used for the
	// default KMin.
	SumK float64
	// SlowFraction: the recent rate of fall below (1 − SlowFraction) of what
	// the earlier readings predict raises Slowing. Default 0.2.
	SlowFraction float64
	// MinFall: a recent window whose observed fall is below this (m) is too
	// short to judge slowing (reading resolution). Default 0.01 m.
	MinFall float64
}

func (o FitOptions) withDefaults() FitOptions {
	if o.KMax == 0 {
		o.KMax = 200
	}
	if o.KMin == 0 {
		o.KMin = -0.5
		if o.SumK > 0 {
			o.KMin = -0.5 * o.SumK
		}
	}
	if o.SlowFraction <= 0 || o.SlowFraction >= 1 {
		o.SlowFraction = 0.2
	}
	if o.MinFall <= 0 {
		o.MinFall = 0.01
	}
	return o
}

// Fit is the result of comparing readings with the plan.
type Fit struct {
	N int // readings used
	// ExtraK is the fitted effective extra loss coefficient ΔK; positive
	// means the run loses more than planned.
	ExtraK float64
	// AtBound: the fit stopped at the edge of the search range (KMin or
	// KMax); the plan and the readings disagree by more than a loss
	// coefficient explains.
	AtBound bool
	// RMS is the root-mean-square level residual of the fit, m.
	RMS float64
	// PlanRMS is the residual with ΔK = 0 (the plan as typed), m.
	PlanRMS float64
	// FallRatio is the observed fall divided by the plan's fall over the
	// same time from the same first level (1 = on plan), up to the last
	// reading taken before the plan's stop; 0 when not judged.
	FallRatio float64

	// Finish is the re-predicted stop time and StopLevel the stop level (m),
	// from the last reading with the fitted ΔK; Stop the stop reason code.
	// Stopped is true when the simulation from the last reading gives no
	// further fall (the siphon has reached its stop).
	Finish    time.Time
	StopLevel float64
	Stop      string
	Stopped   bool

	// Slowing flags a siphon slowing faster than planned: the recent rate of
	// fall is below (1 − SlowFraction) of what the earlier readings' fit
	// predicts. EarlyK and LateK are the fits on the earlier and the latest
	// readings; RecentRatio is the recent observed fall over the fall the
	// early fit predicts for the same window (NaN-free; 0 when not judged).
	Slowing       bool
	SlowingJudged bool // enough readings to judge
	EarlyK, LateK float64
	RecentRatio   float64

	// Message is a one-line summary for the screen and the record.
	Message string
}

// ErrFewReadings is returned when fewer than two readings at different
// times are available.
var ErrFewReadings = errors.New("need at least two level readings at different times to compare with the plan")

// FitReadings fits ΔK to the readings by least squares on observed versus
// simulated levels:
//
//	S(ΔK) = Σᵢ (hᵢ − ĥ(tᵢ − t₁; ΔK))²
//
// where ĥ is the Simulator's curve started from the first reading's level h₁
// at its time t₁ (so the start time and the starting level typed into the
// plan need not be known exactly), plus a constant level offset c fitted in
// closed form (the mean residual) so that an error in the first reading does
// not anchor the whole fit. S is minimised over [KMin, KMax] by a
// coarse scan on a grid that is fine near KMin and coarse near KMax, then a
// golden-section search in the best bracket (Kiefer 1953; Press et al.,
// Numerical Recipes, 3rd ed., §10.2).
//
// Slowing: with at least four readings, the latest third (at least two) is
// fitted on its own (LateK) and the rest (EarlyK). The recent window's
// observed fall is compared with the fall the early fit predicts over the
// same window from the same level; a ratio below 1 − SlowFraction, with
// LateK above EarlyK and a fall of at least MinFall, raises Slowing — the
// usual causes are air gathering at the crest and a clogging intake screen
// (field-practice §2.6, §4.2; common practice).
//
// The readings need not be sorted; they are not modified. Readings that fail
// Validate are an error.
func FitReadings(readings []Reading, sim Simulator, opt FitOptions) (Fit, error) {
	opt = opt.withDefaults()
	if sim == nil {
		return Fit{}, errors.New("fit readings: no drain plan to compare with")
	}
	if !(opt.KMin < opt.KMax) || math.IsNaN(opt.KMin) || math.IsInf(opt.KMax, 0) {
		return Fit{}, fmt.Errorf("fit readings: search range %g to %g is empty", opt.KMin, opt.KMax)
	}
	rs := make([]Reading, 0, len(readings))
	for i, r := range readings {
		if err := r.Validate(); err != nil {
			return Fit{}, fmt.Errorf("reading %d: %w", i+1, err)
		}
		rs = append(rs, r)
	}
	slices.SortStableFunc(rs, func(a, b Reading) int { return a.At.Compare(b.At) })
	if len(rs) < 2 || !rs[len(rs)-1].At.After(rs[0].At) {
		return Fit{}, ErrFewReadings
	}

	f := Fit{N: len(rs)}
	k, sse, atBound, err := fitK(rs, sim, opt)
	if err != nil {
		return Fit{}, err
	}
	f.ExtraK, f.AtBound = k, atBound
	f.RMS = math.Sqrt(sse / float64(len(rs)))
	if planSSE, err := sseFor(rs, sim, 0); err == nil {
		f.PlanRMS = math.Sqrt(planSSE / float64(len(rs)))
	}

	// Observed against planned fall, up to the last reading taken while the
	// plan is still running (after the plan's stop its level stands still
	// and the ratio would mean nothing).
	if plan, err := sim(0, rs[0].Level); err == nil && len(plan.Times) > 0 {
		last := 0
		for i := range rs {
			if rs[i].At.Sub(rs[0].At).Seconds() <= plan.End() {
				last = i
			}
		}
		if last > 0 {
			planFall := rs[0].Level - plan.LevelAt(rs[last].At.Sub(rs[0].At).Seconds())
			obsFall := rs[0].Level - rs[last].Level
			if planFall > 0 {
				f.FallRatio = obsFall / planFall
			}
		}
	}

	// Re-predict from the last reading with the fitted ΔK.
	// When the last reading is already at the stop, the stop came when the
	// fitted curve from the first reading reached it (not after the last
	// reading).
	last := rs[len(rs)-1]
	if c, err := sim(f.ExtraK, last.Level); err == nil && len(c.Times) > 0 {
		f.Finish = last.At.Add(DurationOf(c.End()))
		f.StopLevel = c.Levels[len(c.Levels)-1]
		f.Stop = c.Stop
		f.Stopped = c.End() <= 0 || last.Level-f.StopLevel <= stoppedFall
	} else {
		f.Finish, f.StopLevel, f.Stopped = last.At, last.Level, true
	}
	if f.Stopped {
		if c, err := sim(f.ExtraK, rs[0].Level); err == nil && len(c.Times) > 0 {
			if end := rs[0].At.Add(DurationOf(c.End())); end.Before(f.Finish) {
				f.Finish = end
			}
			if c.Stop != "" {
				f.Stop = c.Stop
			}
			f.StopLevel = c.Levels[len(c.Levels)-1]
		}
	}

	// Slowing: early fit against the recent window.
	if len(rs) >= 4 {
		nLate := max(2, len(rs)/3)
		early, late := rs[:len(rs)-nLate+1], rs[len(rs)-nLate:] // they share one reading
		if len(early) >= 2 && early[len(early)-1].At.After(early[0].At) && late[len(late)-1].At.After(late[0].At) {
			ek, _, _, err1 := fitK(early, sim, opt)
			lk, _, _, err2 := fitK(late, sim, opt)
			if err1 == nil && err2 == nil {
				f.EarlyK, f.LateK = ek, lk
				span := late[len(late)-1].At.Sub(late[0].At).Seconds()
				obsFall := late[0].Level - late[len(late)-1].Level
				if c, err := sim(ek, late[0].Level); err == nil && len(c.Times) > 0 {
					predFall := late[0].Level - c.LevelAt(span)
					if predFall >= opt.MinFall {
						f.SlowingJudged = true
						f.RecentRatio = obsFall / predFall
						f.Slowing = f.RecentRatio < 1-opt.SlowFraction && lk > ek
					}
				}
			}
		}
	}
	f.Message = f.summary(opt)
	return f, nil
}

func (f Fit) summary(opt FitOptions) string {
	var parts []string
	switch {
	case f.AtBound && f.ExtraK >= opt.KMax-1e-9:
		parts = append(parts, "draining far slower than planned: check for air at the crest, a blocked intake or a stopped siphon")
	case f.AtBound:
		parts = append(parts, "draining faster than the plan allows: check the typed drop, hose and levels")
	case f.FallRatio > 0:
		parts = append(parts, fmt.Sprintf("level falling at %.0f %% of plan (fitted extra K %.2f)", 100*f.FallRatio, f.ExtraK))
	default:
		parts = append(parts, fmt.Sprintf("fitted extra K %.2f", f.ExtraK))
	}
	if f.Slowing {
		parts = append(parts, fmt.Sprintf("SLOWING faster than planned (recent fall %.0f %% of expected): check for air at the crest or a clogging intake", 100*f.RecentRatio))
	}
	return strings.Join(parts, "; ")
}

// fitK minimises S(ΔK) over [opt.KMin, opt.KMax] for readings rs (sorted).
func fitK(rs []Reading, sim Simulator, opt FitOptions) (k, sse float64, atBound bool, err error) {
	const nGrid = 48
	lo, hi := opt.KMin, opt.KMax
	span := math.Log1p(hi - lo)
	grid := make([]float64, nGrid+1)
	vals := make([]float64, nGrid+1)
	best := -1
	var firstErr error
	for i := range grid {
		grid[i] = lo + math.Expm1(span*float64(i)/nGrid)
		if i == nGrid {
			grid[i] = hi
		}
		v, e := sseFor(rs, sim, grid[i])
		if e != nil {
			if firstErr == nil {
				firstErr = e
			}
			v = math.Inf(1)
		}
		vals[i] = v
		if best < 0 || v < vals[best] {
			best = i
		}
	}
	if math.IsInf(vals[best], 1) {
		if firstErr == nil {
			firstErr = errors.New("no simulation succeeded")
		}
		return 0, 0, false, fmt.Errorf("fit readings: %w", firstErr)
	}
	a, b := grid[max(best-1, 0)], grid[min(best+1, nGrid)]
	obj := func(x float64) float64 {
		v, e := sseFor(rs, sim, x)
		if e != nil {
			return math.Inf(1)
		}
		return v
	}
	k, sse = goldenMin(obj, a, b, 1e-6*(1+math.Abs(grid[best])))
	if vals[best] < sse {
		k, sse = grid[best], vals[best]
	}
	tol := 1e-3 * (1 + math.Abs(k))
	atBound = k-lo < tol || hi-k < tol
	return k, sse, atBound, nil
}

// sseFor is S(ΔK) with the simulation started at the first reading.
func sseFor(rs []Reading, sim Simulator, k float64) (float64, error) {
	c, err := sim(k, rs[0].Level)
	if err != nil {
		return 0, err
	}
	if len(c.Times) == 0 || len(c.Times) != len(c.Levels) {
		return 0, errors.New("simulation returned an empty curve")
	}
	// Residuals less their mean: the free level offset absorbs the error of
	// the first reading, which anchors the simulation.
	var sum, sum2 float64
	for _, r := range rs {
		d := r.Level - c.LevelAt(r.At.Sub(rs[0].At).Seconds())
		sum += d
		sum2 += d * d
	}
	s := sum2 - sum*sum/float64(len(rs))
	if s < 0 {
		s = 0
	}
	if math.IsNaN(s) || math.IsInf(s, 0) {
		return 0, errors.New("simulation returned a non-finite level")
	}
	return s, nil
}

// goldenMin finds a minimum of f on [a, b] by golden-section search to an
// interval of width tol (Kiefer 1953; Press et al., Numerical Recipes, 3rd
// ed., §10.2). Returns the abscissa and value.
func goldenMin(f func(float64) float64, a, b, tol float64) (float64, float64) {
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	c := b - invPhi*(b-a)
	d := a + invPhi*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 200 && b-a > tol; i++ {
		if fc <= fd {
			b, d, fd = d, c, fc
			c = b - invPhi*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + invPhi*(b-a)
			fd = f(d)
		}
	}
	if fc <= fd {
		return c, fc
	}
	return d, fd
}

// stoppedFall: a last reading within this of the predicted stop level (m) is
// taken as "stopped" (below what a tape or rod resolves; our choice).
const stoppedFall = 0.002

// DurationOf converts seconds to a Duration, saturating instead of
// overflowing (a drain of centuries is still a finite answer).
func DurationOf(s float64) time.Duration {
	const maxS = float64(math.MaxInt64/int64(time.Second)) - 1
	switch {
	case math.IsNaN(s) || s <= 0:
		return 0
	case s >= maxS:
		return time.Duration(maxS) * time.Second
	}
	return time.Duration(s * float64(time.Second))
}

// PlannedAt returns the plan's level at time t, given the planned curve
// (started at start, the time flow started). With a zero start the curve is
// aligned on the first reading instead: its time is placed where the plan
// passes its level. ok is false when neither alignment is possible.
func PlannedAt(plan DrainCurve, start time.Time, first Reading, t time.Time) (level float64, ok bool) {
	if len(plan.Times) == 0 || len(plan.Times) != len(plan.Levels) {
		return 0, false
	}
	if !start.IsZero() {
		return plan.LevelAt(t.Sub(start).Seconds()), true
	}
	if first.At.IsZero() {
		return 0, false
	}
	t0, found := plan.TimeAt(first.Level)
	if !found {
		if first.Level > plan.Levels[0] {
			t0 = 0
		} else {
			return 0, false
		}
	}
	return plan.LevelAt(t0 + t.Sub(first.At).Seconds()), true
}

// DrainSimulator wraps calc.PlanDrain as a Simulator for the planned drain
// in: each call re-plans from startLevel with extraK added to the hose's
// fitting losses.
//
//   - extraK ≥ 0 is added to the down-leg fittings (KDownLeg): it lowers the
//     flow but leaves the crest-pressure check as planned. A loss at a
//     clogging intake would also lower the crest pressure; the fit cannot
//     tell where the loss sits, so the re-predicted crest stop is the plan's.
//   - extraK < 0 scales the entrance, up-leg and down-leg coefficients by
//     (ΣK + ΔK)/ΣK (each must stay ≥ 0); below −ΣK it is an error.
//
// With a receiver, the receiver's starting level is moved up by the volume
// the source has already lost between the planned start level and
// startLevel (a volume balance on the two tanks). A startLevel at or below
// the target gives a one-point curve (nothing left to drain).
func DrainSimulator(in calc.DrainInput) Simulator {
	base := in
	return func(extraK, startLevel float64) (DrainCurve, error) {
		if math.IsNaN(extraK) || math.IsInf(extraK, 0) || math.IsNaN(startLevel) || math.IsInf(startLevel, 0) {
			return DrainCurve{}, errors.New("simulate drain: extra loss coefficient or start level not finite")
		}
		d := base
		h := d.Siphon.Hose
		sum := h.KMinor()
		switch {
		case extraK >= 0:
			h.KDownLeg += extraK
		case sum+extraK < 0 || sum == 0:
			return DrainCurve{}, fmt.Errorf("simulate drain: extra loss coefficient %g would make the fittings' ΣK = %g negative", extraK, sum+extraK)
		default:
			s := (sum + extraK) / sum
			h.KEntrance *= s
			h.KUpLeg *= s
			h.KDownLeg *= s
		}
		d.Siphon.Hose = h
		if d.Tank != nil && startLevel > float64(d.Tank.Height()) {
			startLevel = float64(d.Tank.Height())
		}
		switch {
		case startLevel <= float64(d.Target):
			return DrainCurve{Times: []float64{0}, Levels: []float64{startLevel}, Stop: string(calc.StopTarget)}, nil
		case startLevel <= float64(d.Siphon.Geometry.Intake):
			return DrainCurve{Times: []float64{0}, Levels: []float64{startLevel}, Stop: string(calc.StopIntake)}, nil
		}
		if d.Receiver != nil && d.Tank != nil {
			r := *d.Receiver
			moved := d.Tank.Volume(d.Siphon.Geometry.Surface) - d.Tank.Volume(calc.Length(startLevel))
			if moved > 0 && r.Tank != nil {
				r.Level = calc.LevelForVolume(r.Tank, r.Tank.Volume(r.Level)+moved)
			}
			d.Receiver = &r
		}
		d.Siphon.Geometry.Surface = calc.Length(startLevel)
		p, err := calc.PlanDrain(d)
		if err != nil {
			return DrainCurve{}, err
		}
		c := PlanCurve(p)
		if len(c.Times) == 0 {
			c.Times, c.Levels = []float64{0}, []float64{startLevel}
		}
		return c, nil
	}
}

// PlanCurve converts a calc drain plan's curve to a DrainCurve (for the
// record and the planned-versus-observed comparison).
func PlanCurve(p calc.DrainPlan) DrainCurve {
	c := DrainCurve{Stop: string(p.StopReason)}
	c.Times = make([]float64, 0, len(p.Curve))
	c.Levels = make([]float64, 0, len(p.Curve))
	for _, pt := range p.Curve {
		c.Times = append(c.Times, float64(pt.Time))
		c.Levels = append(c.Levels, float64(pt.Level))
	}
	return c
}
