package calc

import (
	"math"
	"strconv"
)

// Default uncertainties for Tolerance fields left at zero.
const (
	// DefaultHeightTolerance is the ± error of a tape-measured height
	// (lift, drop) when the user sets none: 3 cm (our choice; the issue asks
	// for "a few cm").
	DefaultHeightTolerance Length = 0.03
	// RoughnessFactorLow and RoughnessFactorHigh span the hose roughness
	// when no range is given: ε/2 … 2ε. Published roughness for one material
	// spans about this much or more (e.g. smooth rubber tubing 0.006–0.07 mm,
	// plastic 0.0015–0.007 mm; calc/testdata/reference/hydraulics.md §3).
	RoughnessFactorLow  = 0.5
	RoughnessFactorHigh = 2.0
	// SmoothRoughnessHigh is the high end for a hose entered as perfectly
	// smooth (ε = 0): 0.007 mm, the upper end of the plastic range above.
	SmoothRoughnessHigh Length = 0.007e-3
	// KFactorHigh scales the fittings' ΣK for the slow case when no K range
	// is given. Handbook K values are turbulent, high-Reynolds values and
	// the 2-K and 3-K methods add a K₁/Re term that grows at low velocity
	// (Hooper 1981; Silverberg & Darby 1999; see hydraulics.md §2.2); the
	// Hydraulic Institute Engineering Data Book (1979) gives ±50 % scatter
	// for couplings and foot valves and calls foot-valve and check-valve K
	// lower bounds below 15 ft/s (hydraulics.md §2.3). +50 % is our
	// allowance from those ranges.
	KFactorHigh = 1.5
	// DefaultBoreTolerance is the relative ± error of the hose's bore when
	// none is given: 3 %. EN ISO 1307:2008 Table 1 allows a 25 mm hose
	// 25.0–26.4 mm built on a mandrel and 24.2–26.6 mm without one (38 mm:
	// 37.7–39.3 and 36.5–39.7 mm), i.e. half-ranges of 3–5 % (as tabulated
	// by Semperflex, "Tolerances, inner diameter"); a bore measured with a
	// caliper does better. The flow goes as about D^2.5, so ±3 % of bore is
	// about ±7 % of flow.
	DefaultBoreTolerance = 0.03
	// MaxBoreTolerance bounds Tolerance.Bore: ±30 %.
	MaxBoreTolerance = 0.3
	// rangeFactor turns each input's effect at the end of its stated range
	// into its part of the likely range: the ends are read as the bounds of
	// a rectangular distribution, u = a/√3 (JCGM 100:2008, the GUM, 4.3.7),
	// the parts are combined in quadrature as uncorrelated inputs (GUM
	// 5.1.2) and expanded with k = 2 (GUM 6.3.3, about 95 %): 2/√3.
	rangeFactor = 1.1547005383792515
)

// Tolerance states how rough the field inputs are. Zero fields take the
// defaults above.
type Tolerance struct {
	// Height is the ± error of the measured heights (crest and outlet, and
	// a receiver's floor), m; 0 means DefaultHeightTolerance.
	Height Length
	// RoughnessLow and RoughnessHigh are the hose's absolute roughness range,
	// m (e.g. the published range for its material). Both 0 means
	// RoughnessFactorLow·ε … RoughnessFactorHigh·ε around the hose's ε.
	RoughnessLow, RoughnessHigh Length
	// KLow and KHigh are the range of the fittings' ΣK (entrance, intake
	// device, up-leg, down-leg and outlet together; each is scaled in
	// proportion). Both 0 means the entered ΣK … KFactorHigh·ΣK.
	KLow, KHigh float64
	// Bore is the relative ± error of the hose's inside diameter (0.03 for
	// ±3 %); 0 means DefaultBoreTolerance.
	Bore float64
	// Tests are measured flows (bucket and stopwatch) that constrain the
	// band: each case's losses are fitted to them (see FitToTests) before
	// it is planned, and TestUncertainty (relative, one standard
	// uncertainty of their mean) joins the inputs.
	Tests           []FlowCheck
	TestUncertainty float64
}

// BandInput names one uncertain input of the band.
type BandInput int

// The band's inputs.
const (
	InputRoughness BandInput = iota // the hose's inside roughness
	InputFittings                   // the fittings' ΣK
	InputBore                       // the hose's bore
	InputHeights                    // the measured heights (crest, outlet)
	InputFlowTest                   // the flow tests' own uncertainty
	BandInputs                      // number of inputs
)

// String is the input's stable code (JSON drain.range_driver's key).
func (i BandInput) String() string {
	switch i {
	case InputRoughness:
		return "roughness"
	case InputFittings:
		return "fittings"
	case InputBore:
		return "bore"
	case InputHeights:
		return "heights"
	case InputFlowTest:
		return "flow_test"
	case BandInputs:
	}
	return "input(" + strconv.Itoa(int(i)) + ")"
}

// Effect is one input's effect on the plan, each end of its range taken
// alone (the others nominal, the losses refitted to any flow tests).
type Effect struct {
	Used bool // the input is in this band
	// SlowTime and FastTime are the times to Band.Level at its slow and
	// fast ends, s; an end that stops above the level first counts its time
	// to that stop (SlowReached false for the slow end).
	SlowTime, FastTime   Seconds
	SlowReached          bool
	SlowFlow, FastFlow   FlowRate // the start flows at its ends
	SlowLevel, FastLevel Length   // where each end stops by its own rules
}

// spread is the effect's largest move of the time either way, s.
func (e Effect) spread(t0 float64) (down, up float64) {
	for _, t := range [2]float64{float64(e.SlowTime), float64(e.FastTime)} {
		down = math.Max(down, t0-t)
		up = math.Max(up, t-t0)
	}
	return down, up
}

// Band is the spread of a plan over the stated input uncertainties.
type Band struct {
	// FlowLow and FlowHigh are the likely range of the start flow (all
	// hoses), m³/s (JSON flow_low_m3_s, flow_high_m3_s): each input's
	// effect at the ends of its range, combined in quadrature and expanded
	// to about 95 % (see rangeFactor). FlowLow is 0 when the slow corner
	// will not run.
	FlowLow, FlowHigh FlowRate
	// Level is the fixed level the time range is for: the target when one
	// is given, else the nominal plan's stop level. LevelTime is the
	// nominal time to it; TimeLow and TimeHigh the likely range of that
	// time, s (JSON drain.time_low_s, drain.time_high_s), combined as the
	// flow range is. Each case is planned to Level, so a stop that moves
	// between cases does not widen it.
	Level             Length
	LevelTime         Seconds
	TimeLow, TimeHigh Seconds
	// A case that stops above Level (its intake loses its prime sooner at
	// a higher flow, the crest limit or a settle level lies higher) counts
	// its time to its own stop. Unreached is true when one stops more than
	// SettleMargin above Level: UnreachedLevel is the highest such stop.
	Unreached      bool
	UnreachedLevel Length
	// FinishLow and FinishHigh are the range of the level the drain ends
	// at, each case by its own stop rules, m: the lowest and highest of the
	// nominal plan and the all-slow and all-fast corners.
	FinishLow, FinishHigh Length
	// Effects are the inputs one by one; Driver is the one that moves the
	// time to Level most.
	Effects [BandInputs]Effect
	Driver  BandInput
	// Fit is the losses fitted to Tolerance.Tests at the nominal inputs
	// (zero without tests).
	Fit TestFit
	// SlowWillNotRun is true when the all-slow corner will not run at all:
	// the drain may not start.
	SlowWillNotRun bool
	// Nominal, Slow and Fast are the nominal plan and the all-slow and
	// all-fast corners (every input at its slow or fast end), without
	// curves.
	Nominal, Slow, Fast DrainPlan
}

// bandParams are a tolerance's ranges read and checked.
type bandParams struct {
	dz, eLo, eHi, kLo, kHi, k, bore float64
}

func readTolerance(s Siphon, tol Tolerance) (bp bandParams, err error) {
	bp.dz = float64(tol.Height)
	if bp.dz == 0 {
		bp.dz = float64(DefaultHeightTolerance)
	}
	if err = checkRange(QuantityHeightTolerance, "height tolerance", bp.dz, 0, 10, "m"); err != nil {
		return
	}
	bp.eLo, bp.eHi = float64(tol.RoughnessLow), float64(tol.RoughnessHigh)
	if bp.eLo == 0 && bp.eHi == 0 {
		e := float64(s.Hose.Roughness)
		bp.eLo, bp.eHi = RoughnessFactorLow*e, RoughnessFactorHigh*e
		if e == 0 {
			bp.eHi = float64(SmoothRoughnessHigh)
		}
	}
	maxE := MaxRelativeRoughness * float64(s.Hose.Diameter)
	if err = checkRange(QuantityRoughnessRange, "roughness, low end", bp.eLo, 0, maxE, "m"); err != nil {
		return
	}
	if err = checkRange(QuantityRoughnessRange, "roughness, high end", bp.eHi, bp.eLo, MaxDiameter, "m"); err != nil {
		return
	}
	bp.eHi = math.Min(bp.eHi, maxE*0.999)
	bp.k = s.Hose.KMinor() + s.Intake.K
	bp.kLo, bp.kHi = tol.KLow, tol.KHigh
	if bp.kLo == 0 && bp.kHi == 0 {
		bp.kLo, bp.kHi = bp.k, KFactorHigh*bp.k
	}
	if err = checkRange(QuantityKRange, "fittings ΣK, low end", bp.kLo, 0, MaxK, ""); err != nil {
		return
	}
	if err = checkRange(QuantityKRange, "fittings ΣK, high end", bp.kHi, bp.kLo, 3*MaxK, ""); err != nil {
		return
	}
	bp.bore = tol.Bore
	if bp.bore == 0 {
		bp.bore = DefaultBoreTolerance
	}
	if err = checkRange(QuantityBoreTolerance, "bore tolerance", bp.bore, 0, MaxBoreTolerance, ""); err != nil {
		return
	}
	if err = checkRange(QuantityBoreTolerance, "flow test uncertainty", tol.TestUncertainty, 0, 1, ""); err != nil {
		return
	}
	for _, c := range tol.Tests {
		if err = c.check(); err != nil {
			return
		}
	}
	return bp, nil
}

// move returns the drain input with one input (or, with all, every input)
// moved to its slow (low-flow) or fast end:
//
//	roughness: ε high / low;  fittings: ΣK high / low;
//	bore: D·(1 − b) / D·(1 + b);
//	heights: outlet and crest + δ / − δ (less drop, more lift / the
//	reverse; the crest not below the intake nor a free outlet), a
//	receiver's floor ± δ.
//
// The start level and the intake are kept: they set the volume to move and
// are read on the tank itself.
func (bp bandParams) move(in DrainInput, which BandInput, all, slow bool) DrainInput {
	s := in.Siphon
	on := func(i BandInput) bool { return all || which == i }
	if on(InputRoughness) {
		s.Hose.Roughness = Length(bp.eLo)
		if slow {
			s.Hose.Roughness = Length(bp.eHi)
		}
	}
	if on(InputFittings) {
		target := bp.kLo
		if slow {
			target = bp.kHi
		}
		scaleK(&s, bp.k, target)
	}
	if on(InputBore) {
		f := 1 + bp.bore
		if slow {
			f = 1 - bp.bore
		}
		s.Hose.Diameter = Length(math.Min(float64(s.Hose.Diameter)*f, MaxDiameter))
		s.Hose.Roughness = Length(math.Min(float64(s.Hose.Roughness), MaxRelativeRoughness*float64(s.Hose.Diameter)*0.999))
	}
	if on(InputHeights) {
		d := bp.dz
		if !slow {
			d = -d
		}
		base := in.Siphon
		g := &s.Geometry
		g.Outlet += Length(d)
		g.Crest += Length(d)
		if g.Crest < base.Geometry.Intake {
			g.Crest = base.Geometry.Intake
		}
		if !g.OutletSubmerged && g.Crest < g.Outlet {
			g.Crest = g.Outlet
		}
		// An explicit up-leg length follows the crest by the same amount.
		if base.Hose.UpLegLength > 0 {
			s.Hose.UpLegLength = Length(math.Min(math.Max(float64(base.Hose.UpLegLength)+d, 0), float64(s.Hose.Length)))
		}
		if in.Receiver != nil {
			r := *in.Receiver
			r.Floor += Length(d)
			in.Receiver = &r
		}
	}
	in.Siphon = s
	return in
}

// scaleK scales the fittings' losses so that their sum is target (k is the
// sum as entered; with none, target goes on the down-leg).
func scaleK(s *Siphon, k, target float64) {
	h := &s.Hose
	if k > 0 {
		f := target / k
		h.KEntrance *= f
		h.KUpLeg *= f
		h.KDownLeg *= f
		h.OutletK *= f
		s.Intake.K *= f
	} else {
		h.KDownLeg = target
	}
	h.KEntrance = math.Min(h.KEntrance, MaxK)
	h.KUpLeg = math.Min(h.KUpLeg, MaxK)
	h.KDownLeg = math.Min(h.KDownLeg, MaxK)
	h.OutletK = math.Min(h.OutletK, MaxK)
	s.Intake.K = math.Min(s.Intake.K, MaxK)
}

// inputsOf lists the inputs a band moves: the flow test's only with tests.
func inputsOf(tol Tolerance) []BandInput {
	in := []BandInput{InputRoughness, InputFittings, InputBore, InputHeights}
	if len(tol.Tests) > 0 {
		in = append(in, InputFlowTest)
	}
	return in
}

// caseInput is the input for one case: which moved (all for a corner), its
// losses fitted to the tests (scaled by the flow test's own end when that is
// the input moved).
func (bp bandParams) caseInput(in DrainInput, tol Tolerance, which BandInput, all, slow bool) DrainInput {
	if which != InputFlowTest || all {
		in = bp.move(in, which, all, slow)
	}
	if len(tol.Tests) == 0 {
		return in
	}
	scale := 1.0
	if which == InputFlowTest || all {
		u := 2 * tol.TestUncertainty // k = 2, as the range
		scale = 1 + u
		if slow {
			scale = 1 - u
		}
	}
	fit := FitToTests(in.Siphon, tol.Tests, scale)
	in.Siphon = fit.Siphon
	return in
}

// combine is the likely range around x0 from each input's largest move
// down and up: x0 − f·√Σdown², x0 + f·√Σup² (f = rangeFactor).
func combine(x0 float64, down, up []float64) (lo, hi float64) {
	var sd, su float64
	for i := range down {
		sd += down[i] * down[i]
		su += up[i] * up[i]
	}
	return x0 - rangeFactor*math.Sqrt(sd), x0 + rangeFactor*math.Sqrt(su)
}

// FlowBand returns the likely range of the steady flow of s over the stated
// input uncertainties (see Tolerance and Band.FlowLow). It is the flow band
// without a tank. With flow tests the losses are fitted to them first.
//
// Errors: Solve's errors for s; a *RangeError for a tolerance outside its
// range (height tolerance 0–10 m; roughness 0 … D/10 with low ≤ high; ΣK
// 0 … MaxK with low ≤ high; bore 0–30 %; a flow test's flow or level).
func FlowBand(s Siphon, tol Tolerance) (low, high FlowRate, err error) {
	if _, err = Solve(s); err != nil {
		return 0, 0, err
	}
	bp, err := readTolerance(s, tol)
	if err != nil {
		return 0, 0, err
	}
	in := DrainInput{Siphon: s}
	base := in
	if len(tol.Tests) > 0 {
		base.Siphon = FitToTests(s, tol.Tests, 1).Siphon
	}
	r0, err := Solve(base.Siphon)
	if err != nil {
		return 0, 0, err
	}
	q0 := float64(r0.Flow)
	var down, up []float64
	for _, which := range inputsOf(tol) {
		var d, u float64
		for _, slow := range [2]bool{true, false} {
			r, err := Solve(bp.caseInput(in, tol, which, false, slow).Siphon)
			if err != nil {
				return 0, 0, err
			}
			d = math.Max(d, q0-float64(r.Flow))
			u = math.Max(u, float64(r.Flow)-q0)
		}
		down, up = append(down, d), append(up, u)
	}
	lo, hi := combine(q0, down, up)
	return FlowRate(math.Max(lo, 0)), FlowRate(hi), nil
}

// PlanBandFrom plans the likely range of the start flow, of the time to a
// fixed level and of the finish level (see Band), given the nominal plan: nominal must
// be PlanDrain(in) (its curve is not used and not kept), so that a caller
// that has just planned the drain does not plan it again. With flow tests in
// tol, in should already hold the losses fitted to them (FitToTests at
// scale 1), as the nominal plan does.
//
// Method. Each input is moved alone to each end of its range (with tests,
// the losses are then refitted to them, so that only what the test cannot
// see is left), and the drain is planned to the fixed level Level; the
// time's move either way is combined over the inputs in quadrature
// (see rangeFactor). The corners (every input at once) give the finish
// level's range and whether the drain may not start.
//
// Its cyclomatic complexity (~30) is one error return per input moved and
// per corner; splitting it would scatter the one method above.
//
// Errors: as FlowBand.
func PlanBandFrom(in DrainInput, nominal DrainPlan, tol Tolerance) (Band, error) {
	var b Band
	nominal.Curve = nil
	bp, err := readTolerance(in.Siphon, tol)
	if err != nil {
		return b, err
	}
	if len(tol.Tests) > 0 {
		b.Fit = FitToTests(in.Siphon, tol.Tests, 1)
	}
	b.Nominal = nominal
	slow, err := planNoCurve(bp.caseInput(in, tol, 0, true, true))
	if err != nil {
		return b, err
	}
	fast, err := planNoCurve(bp.caseInput(in, tol, 0, true, false))
	if err != nil {
		return b, err
	}
	b.Slow, b.Fast = slow, fast
	b.SlowWillNotRun = slow.Start.Verdict == WillNotRun
	b.FinishLow, b.FinishHigh = nominal.StopLevel, nominal.StopLevel
	for _, p := range [...]DrainPlan{slow, fast} {
		if p.Start.Verdict != WillNotRun {
			b.FinishLow = min(b.FinishLow, p.StopLevel)
			b.FinishHigh = max(b.FinishHigh, p.StopLevel)
		}
	}
	b.Level = nominal.StopLevel
	if in.Target > 0 && nominal.StopReason == StopTarget {
		b.Level = in.Target
	}
	b.LevelTime = nominal.Time
	q0, t0 := float64(nominal.StartFlow), float64(nominal.Time)
	var qDown, qUp, tDown, tUp []float64
	moved := nominal.Time > 0 && float64(b.Level) < float64(in.Siphon.Geometry.Surface) && !nominal.Rises
	for _, which := range inputsOf(tol) {
		e := Effect{Used: true}
		for _, sl := range [2]bool{true, false} {
			ci := bp.caseInput(in, tol, which, false, sl)
			own, err := planNoCurve(ci)
			if err != nil {
				return b, err
			}
			tt, reached := own.Time, true
			if moved && !own.Rises {
				ci.Target = b.Level
				to, err := planNoCurve(ci)
				if err != nil {
					return b, err
				}
				tt, reached = to.Time, to.StopReason == StopTarget || to.StopLevel <= b.Level
			} else if moved {
				reached = false
			}
			if own.Start.Verdict == WillNotRun {
				tt, reached = own.Time, false
			}
			if sl {
				e.SlowTime, e.SlowReached, e.SlowFlow, e.SlowLevel = tt, reached, own.StartFlow, own.StopLevel
			} else {
				e.FastTime, e.FastFlow, e.FastLevel = tt, own.StartFlow, own.StopLevel
			}
			if !reached && own.Start.Verdict != WillNotRun && moved && own.StopLevel > b.Level+SettleMargin {
				if !b.Unreached || own.StopLevel > b.UnreachedLevel {
					b.UnreachedLevel = own.StopLevel
				}
				b.Unreached = true
			}
		}
		b.Effects[which] = e
		d, u := e.spread(t0)
		tDown, tUp = append(tDown, d), append(tUp, u)
		qs, qf := float64(e.SlowFlow), float64(e.FastFlow)
		qDown = append(qDown, math.Max(math.Max(q0-qs, q0-qf), 0))
		qUp = append(qUp, math.Max(math.Max(qs-q0, qf-q0), 0))
	}
	lo, hi := combine(t0, tDown, tUp)
	b.TimeLow, b.TimeHigh = Seconds(math.Max(lo, 0)), Seconds(hi)
	qlo, qhi := combine(q0, qDown, qUp)
	b.FlowLow, b.FlowHigh = FlowRate(math.Max(qlo, 0)), FlowRate(qhi)
	if b.SlowWillNotRun {
		b.FlowLow = 0
	}
	best := -1.0
	for _, which := range inputsOf(tol) {
		d, u := b.Effects[which].spread(t0)
		if m := math.Max(d, u); m > best {
			best, b.Driver = m, which
		}
	}
	return b, nil
}

// planNoCurve is PlanDrain without the curve.
func planNoCurve(in DrainInput) (DrainPlan, error) {
	var p planner
	if err := p.init(&in, -1); err != nil {
		return DrainPlan{}, err
	}
	return p.run()
}
