package tui

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

// curvePoint is one sample of a drain plan: time from the start (s), source
// level (m, on the tank datum) and flow of all hoses together (m³/s).
type curvePoint struct {
	T, Level, Flow float64
}

// drainCurve is what the Drain curve pane plots, computed elsewhere (the
// drain plan of model.Compute) and only formatted here.
type drainCurve struct {
	Points     []curvePoint // in time order
	StopTime   float64      // s
	StopLevel  float64      // m
	StopReason calc.StopReason
	HasTarget  bool
	Target     float64 // planned stop level, m
	// HasGasLevel: below GasLevel (m) the lift exceeds the working crest
	// height and gas gathers at the crest (calc.DrainPlan.WorkingLimitLevel).
	HasGasLevel bool
	GasLevel    float64
}

// CurveView plots the source level against time with braille dots, a flow
// strip under it in block characters on the same time axis, the target
// level as a dashed line and the stop marked with its time and reason. It
// has no keys of its own.
type CurveView struct {
	w, h    int
	curve   drainCurve
	has     bool
	from    *calc.DrainPlan // the plan the curve was read from (Show)
	axes    cvAxes          // the scales of the last plot, kept while they fit
	units   drawUnits
	styles  Styles
	focused bool
	frame   string
}

// NewCurveView returns an empty Drain curve pane in the given unit system.
func NewCurveView(st Styles, sys model.System) CurveView {
	v := CurveView{styles: st, units: newDrawUnits(sys)}
	v.redraw()
	return v
}

// SetSize sets the pane's size in cells; View fills exactly w×h.
func (v *CurveView) SetSize(w, h int) { v.w, v.h = max(w, 0), max(h, 0); v.redraw() }

// SetStyles replaces the styles.
func (v *CurveView) SetStyles(st Styles) { v.styles = st; v.redraw() }

// SetUnits switches the axes to another unit system.
func (v *CurveView) SetUnits(sys model.System) { v.units = newDrawUnits(sys); v.redraw() }

// setCurve gives the drain plan to plot. Points that are not finite or go
// back in time are dropped; negative flows are shown as zero.
func (v *CurveView) setCurve(c drainCurve) {
	pts := make([]curvePoint, 0, len(c.Points))
	last := math.Inf(-1)
	for _, p := range c.Points {
		if !cvFinite3(p.T, p.Level, p.Flow) || p.T < last || p.T < 0 {
			continue
		}
		p.Flow = max(p.Flow, 0)
		pts = append(pts, p)
		last = p.T
	}
	c.Points = pts
	c.StopTime, c.StopLevel, c.Target = finite(c.StopTime), finite(c.StopLevel), finite(c.Target)
	c.GasLevel = finite(c.GasLevel)
	if n := len(pts); n > 0 && c.StopTime <= 0 {
		c.StopTime, c.StopLevel = pts[n-1].T, pts[n-1].Level
	}
	v.curve, v.has = c, true
	v.redraw()
}

// clearCurve shows the "no drain plan" message.
func (v *CurveView) clearCurve() { v.has = false; v.curve = drainCurve{}; v.redraw() }

func cvFinite3(a, b, c float64) bool {
	return !math.IsNaN(a+b+c) && !math.IsInf(a+b+c, 0)
}

// Focus gives the pane the focus.
func (v *CurveView) Focus() { v.focused = true }

// Blur removes the focus.
func (v *CurveView) Blur() { v.focused = false }

// ShortHelp lists no keys.
func (v *CurveView) ShortHelp() []key.Binding { return nil }

// Claims takes no keys.
func (v *CurveView) Claims(tea.KeyPressMsg) bool { return false }

// Key does nothing: the curve only follows the plan.
func (v *CurveView) Key(tea.KeyPressMsg) (tea.Cmd, *FieldEdit) { return nil, nil }

// Typing is false: the pane has no text input.
func (v *CurveView) Typing() bool { return false }

// Paste does nothing: the pane has no text input.
func (v *CurveView) Paste(string) (tea.Cmd, *FieldEdit) { return nil, nil }

// Click does nothing: the drawing has nothing to choose.
func (v *CurveView) Click(int, int) (tea.Cmd, *FieldEdit) { return nil, nil }

// CursorPos is nil: the pane has no text input.
func (v *CurveView) CursorPos() *tea.Cursor { return nil }

// Show plots the last valid plan's drain in the job's unit system. The same
// plan in the same units is not drawn again (a plan never changes once
// made: a new one is a new DrainPlan).
func (v *CurveView) Show(st *screenState) {
	var from *calc.DrainPlan
	if st.hasPlan {
		from = st.plan.Drain
	}
	if v.units.sys == st.job.Units && from == v.from && (from != nil) == v.has {
		return
	}
	if v.units.sys != st.job.Units {
		v.units = newDrawUnits(st.job.Units)
	}
	v.from = from
	if c, ok := curveOf(st.plan); st.hasPlan && ok {
		v.setCurve(c)
		return
	}
	v.clearCurve()
}

// View returns the frame drawn at the last change: exactly w×h cells.
func (v CurveView) View() string { return v.frame }

// curveTimeUnit picks seconds, minutes or hours for an axis running to tmax
// seconds.
func curveTimeUnit(tmax float64) (name string, per float64) {
	switch {
	case tmax <= 180:
		return "s", 1
	case tmax <= 3*3600:
		return "min", 60
	}
	return "h", 3600
}

// niceStep returns a step of 1, 2, 2.5 or 5 × 10^k so that span/step is
// about n.
func cvNiceStep(span float64, n int) float64 {
	if !(span > 0) || math.IsInf(span, 0) || n < 1 {
		return 1
	}
	raw := span / float64(n)
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*p >= raw*(1-1e-9) {
			return m * p
		}
	}
	return 10 * p
}

// numText prints a tick value with as many decimals as the step needs.
func cvNumText(v, step float64) string {
	dec := 0
	for s := step; dec < 4 && math.Abs(s-math.Round(s)) > 1e-9*max(1, math.Abs(s)); s *= 10 {
		dec++
	}
	t := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(t, "-0.") == "" {
		t = strconv.FormatFloat(0, 'f', dec, 64)
	}
	return t
}

func (v *CurveView) stopText(short bool) string {
	c := v.curve
	t := model.Format(model.DimTime, c.StopTime, v.units.sys)
	if short {
		return "■ stop " + t + ": " + present.StopShort(c.StopReason)
	}
	return "■ stops after " + t + " at " + v.units.length(c.StopLevel) + ": " + present.StopShort(c.StopReason)
}

func (v *CurveView) redraw() {
	w, h := v.w, v.h
	if w <= 0 || h <= 0 {
		v.frame = ""
		return
	}
	c := v.curve
	if !v.has || len(c.Points) == 0 {
		v.frame = fitBlock([]string{clip("No drain plan: set a tank in the Tank pane.", w)}, w, h)
		return
	}
	if len(c.Points) < 2 || c.StopTime <= 0 || c.Points[len(c.Points)-1].T <= 0 {
		msg := "No drain: it stops at once at " + v.units.length(c.StopLevel) + " (" + present.StopShort(c.StopReason) + ")."
		v.frame = fitBlock([]string{v.styles.class[clsWarn].Render(clip("! "+msg, w))}, w, h)
		return
	}
	if w < 24 || h < 6 {
		lines := []string{
			clip(v.stopText(true), w),
			clip("level "+v.units.length(c.Points[0].Level)+" → "+v.units.length(c.StopLevel), w),
			clip("flow "+v.units.flow(c.Points[0].Flow)+" → "+v.units.flow(c.Points[len(c.Points)-1].Flow), w),
		}
		v.frame = fitBlock(lines, w, h)
		return
	}
	v.frame = v.plot(w, h)
}

// interpLevel is the level at time t by straight lines between samples,
// starting the search at index j.
func cvInterpLevel(pts []curvePoint, j int, t float64) float64 {
	if t <= pts[0].T {
		return pts[0].Level
	}
	if j+1 >= len(pts) {
		return pts[len(pts)-1].Level
	}
	a, b := pts[j], pts[j+1]
	if b.T <= a.T {
		return b.Level
	}
	f := min(max((t-a.T)/(b.T-a.T), 0), 1)
	return a.Level + f*(b.Level-a.Level)
}

// interpFlow is the flow at time t by straight lines between samples.
func cvInterpFlow(pts []curvePoint, t float64) float64 {
	i := sort.Search(len(pts), func(i int) bool { return pts[i].T >= t })
	switch {
	case i == 0:
		return pts[0].Flow
	case i >= len(pts):
		return pts[len(pts)-1].Flow
	}
	a, b := pts[i-1], pts[i]
	if b.T <= a.T {
		return b.Flow
	}
	f := (t - a.T) / (b.T - a.T)
	return a.Flow + f*(b.Flow-a.Flow)
}

// curveOf reads the plot from a plan's drain: the curve, the stop, the
// target and the level below which gas gathers at the crest; false without
// a drain plan.
func curveOf(pl model.Plan) (drainCurve, bool) {
	p := pl.Drain
	if p == nil || len(p.Curve) == 0 {
		return drainCurve{}, false
	}
	c := drainCurve{
		Points:     make([]curvePoint, len(p.Curve)),
		StopTime:   float64(p.Time),
		StopLevel:  float64(p.StopLevel),
		StopReason: p.StopReason,
		// Below this level the lift exceeds the working crest height.
		HasGasLevel: p.WorkingLimitFound,
		GasLevel:    float64(p.WorkingLimitLevel),
	}
	if t := float64(pl.DrainIn.Target); t > 1e-6 {
		c.HasTarget, c.Target = true, t
	}
	for i, q := range p.Curve {
		c.Points[i] = curvePoint{T: float64(q.Time), Level: float64(q.Level), Flow: float64(q.Flow)}
	}
	return c, true
}
