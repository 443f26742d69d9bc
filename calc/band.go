package calc

import "math"

// Default uncertainties for Tolerance fields left at zero.
const (
	// DefaultHeightTolerance is the ± error of a tape-measured height
	// (lift, drop) when the user sets none: 3 cm (our choice; the issue asks
	// for "a few cm").
	DefaultHeightTolerance Length = 0.03
	// RoughnessFactorLow and RoughnessFactorHigh span the hose roughness
	// when no range is given: ε/2 … 2ε. Published roughness for one material
	// spans about this much or more (e.g. smooth rubber tubing 0.006–0.07 mm,
	// plastic 0.0015–0.007 mm; shared/reference/hydraulics.md §3).
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
}

// Band is the spread of a plan over the stated input uncertainties.
type Band struct {
	// FlowLow and FlowHigh are the start flows (all hoses) of the slow and
	// fast cases, m³/s (JSON flow_low_m3_s, flow_high_m3_s). FlowLow is 0
	// when the slow case will not run.
	FlowLow, FlowHigh FlowRate
	// TimeLow and TimeHigh are the shortest and longest drain times among
	// the nominal, slow and fast plans, s (JSON drain.time_low_s,
	// drain.time_high_s). A case that stops earlier for a different reason
	// (e.g. the crest limit, reached sooner with more lift) can be the short
	// one: compare the plans' StopReason.
	TimeLow, TimeHigh Seconds
	// SlowWillNotRun is true when the slow case will not run at all: the
	// drain may not start, and TimeHigh then comes from the other cases.
	SlowWillNotRun bool
	// Nominal, Slow and Fast are the three plans, without curves.
	Nominal, Slow, Fast DrainPlan
}

// bandCases returns the slow (low-flow) and fast (high-flow) variants of s:
//
//	slow: outlet + δ (less drop), crest + δ (more lift), ε high, ΣK high
//	fast: outlet − δ, crest − δ (not below the intake nor a free outlet),
//	      ε low, ΣK low
//
// with δ the height tolerance. The start level and the intake are kept: they
// set the volume to move and are read on the tank itself.
func bandCases(s Siphon, tol Tolerance) (slow, fast Siphon, dz float64, err error) {
	dz = float64(tol.Height)
	if dz == 0 {
		dz = float64(DefaultHeightTolerance)
	}
	if err = checkRange(QuantityHeightTolerance, "height tolerance", dz, 0, 10, "m"); err != nil {
		return
	}
	eLo, eHi := float64(tol.RoughnessLow), float64(tol.RoughnessHigh)
	if eLo == 0 && eHi == 0 {
		e := float64(s.Hose.Roughness)
		eLo, eHi = RoughnessFactorLow*e, RoughnessFactorHigh*e
		if e == 0 {
			eHi = float64(SmoothRoughnessHigh)
		}
	}
	maxE := MaxRelativeRoughness * float64(s.Hose.Diameter)
	if err = checkRange(QuantityRoughnessRange, "roughness, low end", eLo, 0, maxE, "m"); err != nil {
		return
	}
	if err = checkRange(QuantityRoughnessRange, "roughness, high end", eHi, eLo, MaxDiameter, "m"); err != nil {
		return
	}
	eHi = math.Min(eHi, maxE*0.999)
	k := s.Hose.KMinor() + s.Intake.K
	kLo, kHi := tol.KLow, tol.KHigh
	if kLo == 0 && kHi == 0 {
		kLo, kHi = k, KFactorHigh*k
	}
	if err = checkRange(QuantityKRange, "fittings ΣK, low end", kLo, 0, MaxK, ""); err != nil {
		return
	}
	if err = checkRange(QuantityKRange, "fittings ΣK, high end", kHi, kLo, 3*MaxK, ""); err != nil {
		return
	}
	scaleK := func(s *Siphon, target float64) {
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
	slow, fast = s, s
	slow.Hose.Roughness, fast.Hose.Roughness = Length(eHi), Length(eLo)
	scaleK(&slow, kHi)
	scaleK(&fast, kLo)
	d := Length(dz)
	slow.Geometry.Outlet += d
	slow.Geometry.Crest += d
	fast.Geometry.Outlet -= d
	fast.Geometry.Crest -= d
	if fast.Geometry.Crest < s.Geometry.Intake {
		fast.Geometry.Crest = s.Geometry.Intake
	}
	if !fast.Geometry.OutletSubmerged && fast.Geometry.Crest < fast.Geometry.Outlet {
		fast.Geometry.Crest = fast.Geometry.Outlet
	}
	if !slow.Geometry.OutletSubmerged && slow.Geometry.Crest < slow.Geometry.Outlet {
		slow.Geometry.Crest = slow.Geometry.Outlet
	}
	// An explicit up-leg length follows the crest by the same amount.
	if s.Hose.UpLegLength > 0 {
		slow.Hose.UpLegLength = Length(math.Min(float64(s.Hose.UpLegLength)+dz, float64(s.Hose.Length)))
		fast.Hose.UpLegLength = Length(math.Max(float64(s.Hose.UpLegLength)-dz, 0))
	}
	return slow, fast, dz, nil
}

// FlowBand returns the steady flow of s at the low and high ends of the
// stated input uncertainties (see Tolerance and PlanBand for which way each
// input is moved). It is the flow band without a tank.
//
// Errors: Solve's errors for s; a *RangeError for a tolerance outside its
// range (height tolerance 0–10 m; roughness 0 … D/10 with low ≤ high; ΣK
// 0 … MaxK with low ≤ high).
func FlowBand(s Siphon, tol Tolerance) (low, high FlowRate, err error) {
	if _, err = Solve(s); err != nil {
		return 0, 0, err
	}
	slow, fast, _, err := bandCases(s, tol)
	if err != nil {
		return 0, 0, err
	}
	rs, err := Solve(slow)
	if err != nil {
		return 0, 0, err
	}
	rf, err := Solve(fast)
	if err != nil {
		return 0, 0, err
	}
	return rs.Flow, rf.Flow, nil
}

// PlanBand plans the drain at the nominal inputs and at the slow and fast
// ends of the stated uncertainties, and reports the spread of the start flow
// and of the time to the stop. The slow case takes the crest and outlet
// (and a receiver's floor) δ higher, the high roughness and the high ΣK; the
// fast case δ lower, the low roughness and ΣK. This is a corner (worst and
// best case) estimate, not a statistical interval.
//
// Errors: as PlanDrain and FlowBand.
func PlanBand(in DrainInput, tol Tolerance) (Band, error) {
	nominal, err := planNoCurve(in)
	if err != nil {
		return Band{}, err
	}
	return PlanBandFrom(in, nominal, tol)
}

// PlanBandFrom is PlanBand with the nominal plan already made: nominal must
// be PlanDrain(in) (its curve is not used and not kept), so that a caller
// that has just planned the drain does not plan it again.
//
// Errors: as PlanBand, less the nominal plan's.
func PlanBandFrom(in DrainInput, nominal DrainPlan, tol Tolerance) (Band, error) {
	var b Band
	nominal.Curve = nil
	slowS, fastS, dz, err := bandCases(in.Siphon, tol)
	if err != nil {
		return b, err
	}
	slowIn, fastIn := in, in
	slowIn.Siphon, fastIn.Siphon = slowS, fastS
	if in.Receiver != nil {
		rs, rf := *in.Receiver, *in.Receiver
		rs.Floor += Length(dz)
		rf.Floor -= Length(dz)
		slowIn.Receiver, fastIn.Receiver = &rs, &rf
	}
	slow, err := planNoCurve(slowIn)
	if err != nil {
		return b, err
	}
	fast, err := planNoCurve(fastIn)
	if err != nil {
		return b, err
	}
	b.Nominal, b.Slow, b.Fast = nominal, slow, fast
	b.FlowLow, b.FlowHigh = slow.StartFlow, fast.StartFlow
	b.SlowWillNotRun = slow.Start.Verdict == WillNotRun
	b.TimeLow = Seconds(math.Min(float64(nominal.Time), float64(fast.Time)))
	b.TimeHigh = Seconds(math.Max(float64(nominal.Time), float64(fast.Time)))
	if !b.SlowWillNotRun {
		b.TimeLow = Seconds(math.Min(float64(b.TimeLow), float64(slow.Time)))
		b.TimeHigh = Seconds(math.Max(float64(b.TimeHigh), float64(slow.Time)))
	}
	if fast.Start.Verdict == WillNotRun || nominal.Start.Verdict == WillNotRun {
		// a case that moves nothing does not set the short end
		lo := math.Inf(1)
		for _, p := range [...]DrainPlan{nominal, slow, fast} {
			if p.Start.Verdict != WillNotRun {
				lo = math.Min(lo, float64(p.Time))
			}
		}
		if math.IsInf(lo, 1) {
			lo = 0
		}
		b.TimeLow = Seconds(lo)
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
