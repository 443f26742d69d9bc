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

// Show plots the last valid plan's drain in the job's unit system.
func (v *CurveView) Show(st *screenState) {
	if v.units.sys != st.job.Units {
		v.units = newDrawUnits(st.job.Units)
	}
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

// plot draws title, level plot, flow strip and time axis. It is long
// (cyclomatic ~55) because the four share one canvas and one set of scales
// worked out together (the time axis serves both plots, the labels avoid the
// curve); each block below is one part, in drawing order.
func (v *CurveView) plot(w, h int) string {
	c := v.curve
	u := v.units
	pts := c.Points
	cv := newDrawCanvas(w, h)

	// Rows: title, level plot, flow strip, axis line, axis labels.
	flowH := 0
	switch {
	case h >= 16:
		flowH = 4
	case h >= 9:
		flowH = 2
	}
	plotH := h - 3 - flowH
	if plotH < 2 {
		flowH, plotH = 0, h-3
	}
	plotTop := 1
	flowTop := plotTop + plotH
	axisRow := flowTop + flowH

	// Level range in display units, tick-aligned.
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, p := range pts {
		lo, hi = min(lo, p.Level), max(hi, p.Level)
	}
	lo, hi = min(lo, c.StopLevel), max(hi, c.StopLevel)
	if c.HasTarget {
		lo, hi = min(lo, c.Target), max(hi, c.Target)
	}
	if lo > 0 && lo < 0.4*hi {
		lo = 0 // show the floor when the drain goes most of the way down
	}
	dlo, dhi := lo/u.lenPer, hi/u.lenPer
	if dhi-dlo < 1e-9 {
		dlo, dhi = dlo-0.5, dhi+0.5
	}
	step := cvNiceStep(dhi-dlo, max(plotH*2/3, 1))
	ylo, yhi := math.Floor(dlo/step+1e-9)*step, math.Ceil(dhi/step-1e-9)*step
	if yhi-ylo < step {
		yhi = ylo + step
	}
	dotsH := 4 * plotH
	dotRow := func(level float64) int { // level in metres
		d := level / u.lenPer
		r := int(math.Round((yhi - d) / (yhi - ylo) * float64(dotsH-1)))
		return min(max(r, 0), dotsH-1)
	}

	// Y labels for level ticks and the flow strip.
	type tick struct {
		row  int
		text string
	}
	var yt []tick
	for y := yhi; y >= ylo-step/2; y -= step {
		yt = append(yt, tick{plotTop + dotRow(y*u.lenPer)/4, cvNumText(y, step) + " " + u.lenName})
	}
	peak := 0.0
	for _, p := range pts {
		peak = max(peak, p.Flow)
	}
	var ft []tick
	if flowH >= 2 {
		ft = append(ft, tick{flowTop, strconv.FormatFloat(peak/u.flowPer, 'f', cvFlowDecimals(peak/u.flowPer), 64)},
			tick{flowTop + flowH - 1, u.flowName})
	} else if flowH == 1 {
		ft = append(ft, tick{flowTop, "flow"})
	}
	yw := 0
	for _, t := range append(yt, ft...) {
		yw = max(yw, cellWidth(t.text))
	}
	yw += 2 // " ┤"
	px := yw
	pw := w - px - 1
	if pw < 8 {
		return fitBlock([]string{clip(v.stopText(true), w)}, w, h)
	}

	// Time axis.
	tStop := c.StopTime
	tLast := pts[len(pts)-1].T
	tmax := max(tStop, tLast)
	tname, tper := curveTimeUnit(tmax)
	// The axis runs a little past the stop so the stop mark stands clear;
	// ticks fall on round values inside it.
	tend := tmax / tper * 1.04
	tstep := cvNiceStep(tend, max(pw/10, 1))
	tspan := tend * tper // seconds across the plot
	dotsW := 2 * pw
	colOf := func(t float64) int { // dot column
		r := int(math.Round(t / tspan * float64(dotsW-1)))
		return min(max(r, 0), dotsW-1)
	}

	// Title.
	title := "Level and flow against time · " + v.stopText(false)
	if cellWidth(title) > w {
		title = v.stopText(true)
	}
	if cellWidth(title) > w {
		title = "■ stop " + model.Format(model.DimTime, c.StopTime, u.sys) + ": " + present.StopShort(c.StopReason)
	}
	cv.text(0, 0, clip(title, w), clsTitle)

	// Axis lines and labels.
	for _, t := range yt {
		lbl := strings.Repeat(" ", yw-2-cellWidth(t.text)) + t.text
		cv.text(0, t.row, lbl, clsMuted)
		cv.set(px-1, t.row, '┤', clsMuted)
	}
	for r := plotTop; r < axisRow; r++ {
		if cv.get(px-1, r) == ' ' {
			cv.set(px-1, r, '│', clsMuted)
		}
	}
	for _, t := range ft {
		lbl := strings.Repeat(" ", yw-2-cellWidth(t.text)) + t.text
		cv.text(0, t.row, lbl, clsMuted)
	}
	if flowH > 0 {
		cv.set(px-1, flowTop, '┼', clsMuted)
	}
	cv.set(px-1, axisRow, '└', clsMuted)
	cv.hline(px, px+pw-1, axisRow, '─', clsMuted)
	lastEnd := -1
	for k := 0; ; k++ {
		tv := float64(k) * tstep
		if tv > tend*(1+1e-9) {
			break
		}
		col := px + colOf(tv*tper)/2
		cv.set(col, axisRow, '┴', clsMuted)
		lbl := cvNumText(tv, tstep)
		x := col - cellWidth(lbl)/2
		if k == 0 {
			lbl, x = lbl+" "+tname, col // the unit goes with the first label: "0 min"
		}
		if x > lastEnd+1 && x+cellWidth(lbl) <= w {
			lastEnd = cv.text(x, axisRow+1, lbl, clsMuted) - 1
		}
	}
	// Target level and gas level, dashed, under the curve; their names
	// are written on the lines after the curve is drawn.
	type lineLabel struct {
		row int
		say []string // longest first
	}
	var names []lineLabel
	if c.HasGasLevel && c.GasLevel >= ylo*u.lenPer && c.GasLevel <= yhi*u.lenPer {
		r := plotTop + dotRow(c.GasLevel)/4
		cv.hline(px, px+pw-1, r, '┈', clsWarn)
		g := u.length(c.GasLevel)
		names = append(names, lineLabel{r, []string{" ! gas gathers at the crest below " + g + " ", " ! gas at crest below " + g + " ", " ! gas below " + g + " ", " ! gas "}})
	}
	if c.HasTarget {
		r := plotTop + dotRow(c.Target)/4
		cv.hline(px, px+pw-1, r, '╌', clsLimit)
		names = append(names, lineLabel{r, []string{" target " + u.length(c.Target) + " ", " target "}})
	}
	// Stop line.
	stopCol := px + colOf(tStop)/2
	cv.vline(stopCol, plotTop, axisRow-1, '┊', clsWarn)

	// Level line in braille: for each dot column the level at that time,
	// joined to the previous column so the line has no gaps.
	dots := make([]uint8, pw*plotH) // braille bits per cell
	var braille = [2][4]uint8{{0x01, 0x02, 0x04, 0x40}, {0x08, 0x10, 0x20, 0x80}}
	setDot := func(dx, dy int) {
		cx, cy := dx/2, dy/4
		if cx < 0 || cx >= pw || cy < 0 || cy >= plotH {
			return
		}
		dots[cy*pw+cx] |= braille[dx%2][dy%4]
	}
	j := 0
	prev := -1
	lastCol := colOf(tLast)
	for dx := 0; dx <= lastCol; dx++ {
		t := float64(dx) / float64(dotsW-1) * tspan
		for j+1 < len(pts) && pts[j+1].T < t {
			j++
		}
		lvl := cvInterpLevel(pts, j, t)
		dy := dotRow(lvl)
		if prev >= 0 {
			for y := min(prev, dy); y <= max(prev, dy); y++ {
				setDot(dx, y)
			}
		} else {
			setDot(dx, dy)
		}
		prev = dy
	}
	for i, b := range dots {
		if b != 0 {
			cv.set(px+i%pw, plotTop+i/pw, rune(0x2800+int(b)), clsLiquid)
		}
	}
	// Stop point.
	cv.set(stopCol, plotTop+dotRow(c.StopLevel)/4, '■', clsWarn)

	// Line names go where the line is still bare (at the left, where the
	// level is usually high), shortened to fit.
	for _, nm := range names {
		x0 := px + 1
		x1 := x0
		for x1 < px+pw && (cv.get(x1, nm.row) == '╌' || cv.get(x1, nm.row) == '┈') {
			x1++
		}
		for _, t := range nm.say {
			if cellWidth(t) <= x1-x0 {
				cv.text(x0, nm.row, t, clsMuted)
				break
			}
		}
	}

	// Flow strip: one bar per cell column, eighths of a cell per step.
	if flowH > 0 && peak > 0 {
		bars := []rune(" ▁▂▃▄▅▆▇█")
		for cx := 0; cx < pw; cx++ {
			t := (float64(2*cx) + 0.5) / float64(dotsW-1) * tspan
			if t > tLast {
				break
			}
			f := cvInterpFlow(pts, t)
			eighths := int(math.Round(f / peak * float64(8*flowH)))
			for r := 0; r < flowH; r++ {
				n := min(max(eighths-8*r, 0), 8)
				if n > 0 {
					cv.set(px+cx, flowTop+flowH-1-r, bars[n], clsLiquid)
				}
			}
		}
	}
	return cv.render(&v.styles)
}

func cvFlowDecimals(v float64) int {
	switch {
	case v >= 100:
		return 0
	case v >= 10:
		return 1
	}
	return 2
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
