package calc

import (
	"math"
	"sort"
)

// StandardHoseSizes are common inside diameters of suction and transfer hose,
// m: ½, ⅝, ¾, 1, 1¼, 1½, 2, 2½, 3, 4 and 6 inch bores as sold in metric
// catalogues (13, 16, 19, 25, 32, 38, 50, 63, 75, 100, 150 mm; common
// practice).
var StandardHoseSizes = [...]Length{0.013, 0.016, 0.019, 0.025, 0.032, 0.038, 0.050, 0.063, 0.075, 0.100, 0.150}

// lengthFactors are the hose lengths AroundChoice offers, as multiples of the
// current length.
var lengthFactors = [...]float64{0.5, 2.0 / 3, 0.8, 1, 1.25, 1.5, 2}

// Limits on a what-if grid.
const (
	MaxWhatIfLengths   = 16
	MaxWhatIfDiameters = 16
	// WhatIfHoseCounts is the number of parallel-hose cells (1 … 4 hoses).
	WhatIfHoseCounts = 4
)

// WhatIfCell is one alternative: a hose length, inside diameter and number
// of hoses, with the answer for it.
type WhatIfCell struct {
	Length   Length
	Diameter Length
	Hoses    int

	Verdict Verdict
	// Why is the code deciding a WillNotRun verdict (as Result.Why), or 0.
	Why  WarnCode
	Flow FlowRate // start flow, all hoses, m³/s
	// Time, StopReason and StopLevel are the drain to its stop; zero and
	// empty when there is no tank or the siphon will not run.
	Time       Seconds
	StopReason StopReason
	StopLevel  Length
	// Drains is true when this hose lowers the level at all (it runs and
	// its stop level is below the start level); a hose that stops at once
	// says why in StopReason.
	Drains bool
	// TimeToCommon is the time to the grid's common level
	// (WhatIfGrid.CommonLevel), s; zero when the hose does not drain or
	// there is no common level.
	TimeToCommon Seconds
	// Err is set when this alternative is not a valid input (a hose shorter
	// than the stated up-leg, a roughness larger than half the bore); the
	// answer fields are then zero.
	Err error
}

// WhatIfGrid is flow, the drain to its stop and the time to one common
// level over hose lengths × diameters, and over the number of parallel
// hoses at the current length and diameter.
type WhatIfGrid struct {
	Lengths   []Length
	Diameters []Length
	// Cells[i][j] is for Lengths[i] and Diameters[j], at the current
	// number of hoses.
	Cells [][]WhatIfCell
	// Parallel[n−1] is for n hoses (1 … WhatIfHoseCounts) of the current
	// length and diameter.
	Parallel []WhatIfCell
	// CommonLevel is the one level every cell's time is counted to: the
	// highest stop level of the hoses that drain (each of them reaches it;
	// none stops above it), so the cells rank on the same task.
	// CommonFound is false without a tank or when no hose drains.
	CommonLevel Length
	CommonFound bool
}

// AroundChoice returns hose lengths and inside diameters around the current
// choice for a what-if grid: seven lengths at ×½, ×⅔, ×0.8, ×1, ×1.25, ×1.5
// and ×2 (capped at MaxHoseLength), and five diameters: the current one with
// the two standard sizes below and above it (StandardHoseSizes), shifted
// inwards at the ends of the list. A current diameter within 0.5 mm of a
// standard size takes its place.
func AroundChoice(length, diameter Length) (lengths, diameters []Length) {
	for _, f := range lengthFactors {
		l := Length(math.Min(float64(length)*f, MaxHoseLength))
		if len(lengths) > 0 && l <= lengths[len(lengths)-1] {
			continue
		}
		lengths = append(lengths, l)
	}
	sizes := make([]Length, 0, len(StandardHoseSizes)+1)
	for _, d := range StandardHoseSizes {
		if math.Abs(float64(d-diameter)) > 0.0005 {
			sizes = append(sizes, d)
		}
	}
	sizes = append(sizes, diameter)
	sort.Slice(sizes, func(i, j int) bool { return sizes[i] < sizes[j] })
	at := 0
	for i, d := range sizes {
		if d == diameter {
			at = i
		}
	}
	lo := at - 2
	if lo < 0 {
		lo = 0
	}
	if lo+5 > len(sizes) {
		lo = len(sizes) - 5
	}
	return lengths, append([]Length(nil), sizes[lo:lo+5]...)
}

// WhatIf computes flow and the drain to its stop for each hose length in
// lengths and inside diameter in diameters (everything else as in in, and
// the same roughness and fittings), and for 1 … WhatIfHoseCounts parallel
// hoses of the current size. Without a tank (in.Tank nil) only the steady
// flow is computed. Each cell is one PlanDrain without its curve.
//
// Errors: the errors of PlanDrain (or Solve, without a tank) for in itself;
// a *RangeError for more than MaxWhatIfLengths lengths or
// MaxWhatIfDiameters diameters. A single alternative that is not valid gets
// its own Err and does not fail the grid.
func WhatIf(in DrainInput, lengths, diameters []Length) (WhatIfGrid, error) {
	var g WhatIfGrid
	if err := checkRange(QuantityWhatIf, "what-if hose lengths", float64(len(lengths)), 0, MaxWhatIfLengths, ""); err != nil {
		return g, err
	}
	if err := checkRange(QuantityWhatIf, "what-if hose diameters", float64(len(diameters)), 0, MaxWhatIfDiameters, ""); err != nil {
		return g, err
	}
	if _, err := whatIfCell(in); err != nil {
		return g, err
	}
	g.Lengths = append([]Length(nil), lengths...)
	g.Diameters = append([]Length(nil), diameters...)
	g.Cells = make([][]WhatIfCell, len(lengths))
	cells := make([]WhatIfCell, len(lengths)*len(diameters)+WhatIfHoseCounts)
	for i, l := range lengths {
		g.Cells[i] = cells[i*len(diameters) : (i+1)*len(diameters) : (i+1)*len(diameters)]
		for j, d := range diameters {
			c := in
			c.Siphon.Hose.Length = l
			c.Siphon.Hose.Diameter = d
			g.Cells[i][j], g.Cells[i][j].Err = whatIfCell(c)
		}
	}
	g.Parallel = cells[len(lengths)*len(diameters):]
	for n := 1; n <= WhatIfHoseCounts; n++ {
		c := in
		c.Siphon.Hoses = n
		g.Parallel[n-1], g.Parallel[n-1].Err = whatIfCell(c)
	}
	if in.Tank != nil {
		g.toCommon(in, cells)
	}
	return g, nil
}

// toCommon fills the common level and each draining cell's time to it: the
// cell whose stop sets it keeps its own time; every other one is planned
// again with the common level as its target (it passes it before its own
// stop, so the target is where it ends).
func (g *WhatIfGrid) toCommon(in DrainInput, cells []WhatIfCell) {
	for _, c := range cells {
		if c.Drains && (!g.CommonFound || c.StopLevel > g.CommonLevel) {
			g.CommonLevel, g.CommonFound = c.StopLevel, true
		}
	}
	if !g.CommonFound {
		return
	}
	for i := range cells {
		c := &cells[i]
		if !c.Drains {
			continue
		}
		if c.StopLevel >= g.CommonLevel {
			c.TimeToCommon = c.Time
			continue
		}
		alt := in
		alt.Siphon.Hose.Length, alt.Siphon.Hose.Diameter, alt.Siphon.Hoses = c.Length, c.Diameter, c.Hoses
		alt.Target = g.CommonLevel
		if p, err := planNoCurve(alt); err == nil {
			c.TimeToCommon = p.Time
		} else {
			c.Drains = false // not planned to the common level: shown without a time
		}
	}
}

// whatIfCell plans one alternative.
func whatIfCell(in DrainInput) (WhatIfCell, error) {
	h := in.Siphon.Hose
	c := WhatIfCell{Length: h.Length, Diameter: h.Diameter, Hoses: in.Siphon.Hoses}
	if in.Tank == nil {
		r, err := Solve(in.Siphon)
		if err != nil {
			return c, err
		}
		c.Verdict, c.Why, c.Flow = r.Verdict, r.Why, r.Flow
		return c, nil
	}
	p, err := planNoCurve(in)
	if err != nil {
		return c, err
	}
	c.Verdict, c.Why, c.Flow = p.Start.Verdict, p.Start.Why, p.StartFlow
	if p.Start.Verdict != WillNotRun {
		c.Time, c.StopReason, c.StopLevel = p.Time, p.StopReason, p.StopLevel
		c.Drains = p.Time > 0 && p.StopLevel < in.Siphon.Geometry.Surface
	}
	return c, nil
}
