package tui

import (
	"math"
	"strings"

	"drawdown/model"
	"drawdown/model/present"
)

// The Drain curve's plot: the scales (kept steady from one plan to the
// next), then the parts drawn in order on one canvas: title, axes and their
// labels, the target and gas lines, the stop line, the level line in
// braille, the line names and the flow strip.

// cvAxes are the scales a curve was last plotted on. They are kept while a
// new plan still fits them with some room to spare (hysteresis), so that a
// digit typed moves the end of the curve instead of rescaling the plot:
//
//   - the level axis runs between round ticks; it is kept while the levels
//     lie inside it and span at least cvKeepSpan of it;
//   - the time axis ends on a round tick with at least cvHeadroom of room
//     past the stop; it is kept while the stop lies inside it, clear of its
//     end, and past cvKeepSpan of it;
//   - the flow strip's top is a round flow, kept while the peak lies
//     between cvKeepSpan of it and it;
//   - the label column never narrows while the size and units stay, and is
//     at least cvLabelW cells in a pane of 60 or more, so that a longer
//     label, or the other unit system's, does not shift the plot.
//
// A new size or unit system starts afresh.
type cvAxes struct {
	valid bool
	key   cvAxesKey

	ylo, yhi, ystep float64 // level axis, display length units

	tname       string  // time unit: s, min or h
	tper        float64 // seconds per time unit
	tend, tstep float64 // axis end and tick step in time units

	ftop float64 // flow at the top of the strip, display flow units
	yw   int     // label column and axis, cells
}

// cvAxesKey is what the axes were made for.
type cvAxesKey struct {
	w, h int
	sys  model.System
}

// Steadiness margins (our choice: a typed digit changes a drain time by a
// few per cent; these keep the axes through tens of per cent).
const (
	cvKeepSpan = 0.5  // keep a scale while the data fill at least half of it
	cvHeadroom = 0.12 // room past the stop when the time axis is made anew
	cvStopGap  = 0.03 // the stop must stay this far (of the axis) from its end
	cvLabelW   = 8    // the narrowest label column, cells (before " ┤")
)

// cvRows is where the plot's parts sit: title, level plot, flow strip,
// axis line, axis labels.
type cvRows struct {
	plotTop, plotH, flowTop, flowH, axisRow int
}

func cvRowsFor(h int) cvRows {
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
	return cvRows{plotTop: 1, plotH: plotH, flowTop: 1 + plotH, flowH: flowH, axisRow: 1 + plotH + flowH}
}

// cvPlot is one plot being drawn: the curve, its scales and the canvas.
type cvPlot struct {
	v    *CurveView
	c    drainCurve
	u    drawUnits
	cv   *drawCanvas
	rows cvRows
	ax   *cvAxes

	px, pw       int     // plot columns [px, px+pw)
	dotsH, dotsW int     // braille dots
	tspan        float64 // seconds across the plot
	peak         float64 // largest flow, m³/s
}

// plot draws title, level plot, flow strip and time axis on one canvas, on
// scales kept from the last plot while they fit (cvAxes).
func (v *CurveView) plot(w, h int) string {
	p := &cvPlot{v: v, c: v.curve, u: v.units, cv: newDrawCanvas(w, h), rows: cvRowsFor(h), ax: &v.axes}
	p.dotsH = 4 * p.rows.plotH
	key := cvAxesKey{w, h, v.units.sys}
	if !p.ax.valid || p.ax.key != key {
		*p.ax = cvAxes{key: key}
	}
	for _, q := range p.c.Points {
		p.peak = max(p.peak, q.Flow)
	}
	p.levelAxis()
	p.flowAxis()
	p.ax.valid = true
	p.labelColumn(w)
	if p.pw < 8 {
		return fitBlock([]string{clip(v.stopText(true), w)}, w, h)
	}
	p.timeAxis()
	p.title(w)
	p.axes(w)
	names := p.levelLines()
	// The stop: a mark on the curve and a line down from it to the time
	// axis (not up the whole plot: a new stop time then changes only the
	// cells below the curve's end).
	stopCol := p.px + p.colOf(p.c.StopTime)/2
	stopRow := p.rows.plotTop + p.dotRow(p.c.StopLevel)/4
	p.cv.vline(stopCol, stopRow+1, p.rows.axisRow-1, '┊', clsWarn)
	p.levelLine()
	p.cv.set(stopCol, stopRow, '■', clsWarn)
	p.lineNames(names)
	p.flowStrip()
	return p.cv.render(&v.styles)
}

// levelAxis sets the level scale (display units, round ticks).
func (p *cvPlot) levelAxis() {
	c, u := p.c, p.u
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, q := range c.Points {
		lo, hi = min(lo, q.Level), max(hi, q.Level)
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
	a := p.ax
	eps := 1e-9 * max(1, math.Abs(dhi))
	if a.valid && dlo >= a.ylo-eps && dhi <= a.yhi+eps && dhi-dlo >= cvKeepSpan*(a.yhi-a.ylo) {
		return
	}
	step := cvNiceStep(dhi-dlo, max(p.rows.plotH*2/3, 1))
	a.ystep = step
	a.ylo, a.yhi = math.Floor(dlo/step+1e-9)*step, math.Ceil(dhi/step-1e-9)*step
	if a.yhi-a.ylo < step {
		a.yhi = a.ylo + step
	}
}

// flowAxis sets the flow at the top of the strip: a round flow above the
// peak.
func (p *cvPlot) flowAxis() {
	a := p.ax
	peak := p.peak / p.u.flowPer
	if a.valid && peak <= a.ftop && peak >= cvKeepSpan*a.ftop {
		return
	}
	a.ftop = cvNiceCeil(peak * 1.1)
}

// cvNiceCeil is the least of 1, 2, 2.5, 5 × 10^k at or above v (v > 0).
func cvNiceCeil(v float64) float64 {
	if !(v > 0) || math.IsInf(v, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(v)))
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*p >= v*(1-1e-9) {
			return m * p
		}
	}
	return 10 * p
}

// cvTick is a label on the y axis.
type cvTick struct {
	row  int
	text string
}

// levelTicks are the level axis's labels, top down.
func (p *cvPlot) levelTicks() []cvTick {
	a := p.ax
	var out []cvTick
	for y := a.yhi; y >= a.ylo-a.ystep/2; y -= a.ystep {
		out = append(out, cvTick{p.rows.plotTop + p.dotRow(y*p.u.lenPer)/4, cvNumText(y, a.ystep) + " " + p.u.lenName})
	}
	return out
}

// flowTicks are the flow strip's labels: its top flow and the unit.
func (p *cvPlot) flowTicks() []cvTick {
	r := p.rows
	switch {
	case r.flowH >= 2:
		return []cvTick{{r.flowTop, cvNumText(p.ax.ftop, p.ax.ftop)}, {r.flowTop + r.flowH - 1, p.u.flowName}}
	case r.flowH == 1:
		return []cvTick{{r.flowTop, "flow"}}
	}
	return nil
}

// labelColumn sets the width of the labels and the plot's columns.
func (p *cvPlot) labelColumn(w int) {
	yw := 0
	if w >= 60 {
		yw = cvLabelW // room enough: one width for every label, in either unit system
	}
	for _, t := range append(p.levelTicks(), p.flowTicks()...) {
		yw = max(yw, cellWidth(t.text))
	}
	p.ax.yw = max(p.ax.yw, yw+2) // " ┤"
	p.px = p.ax.yw
	p.pw = w - p.px - 1
	p.dotsW = 2 * max(p.pw, 1)
}

// timeAxis sets the time scale: its unit, a round end past the stop and
// the tick step.
func (p *cvPlot) timeAxis() {
	c := p.c
	tmax := max(c.StopTime, c.Points[len(c.Points)-1].T)
	a := p.ax
	if a.tname != "" {
		t := tmax / a.tper
		if t <= a.tend*(1-cvStopGap) && t >= cvKeepSpan*a.tend {
			p.tspan = a.tend * a.tper
			return
		}
	}
	a.tname, a.tper = curveTimeUnit(tmax * (1 + cvHeadroom))
	want := tmax / a.tper * (1 + cvHeadroom)
	a.tstep = cvNiceStep(want, max(p.pw/10, 1))
	// The end is round on a finer step than the labels' when they are
	// few, so that the curve still fills most of the plot.
	end := cvNiceStep(want, max(p.pw/10, 4))
	a.tend = math.Ceil(want/end-1e-9) * end
	p.tspan = a.tend * a.tper
}

// colOf is the dot column of a time (s).
func (p *cvPlot) colOf(t float64) int {
	r := int(math.Round(t / p.tspan * float64(p.dotsW-1)))
	return min(max(r, 0), p.dotsW-1)
}

// dotRow is the dot row of a level (m).
func (p *cvPlot) dotRow(level float64) int {
	a := p.ax
	d := level / p.u.lenPer
	r := int(math.Round((a.yhi - d) / (a.yhi - a.ylo) * float64(p.dotsH-1)))
	return min(max(r, 0), p.dotsH-1)
}

// title is the first row: what is plotted and where it stops.
func (p *cvPlot) title(w int) {
	v, c := p.v, p.c
	title := "Level and flow against time · " + v.stopText(false)
	if cellWidth(title) > w {
		title = v.stopText(true)
	}
	if cellWidth(title) > w {
		title = "■ stop " + model.Format(model.DimTime, c.StopTime, p.u.sys) + ": " + present.StopShort(c.StopReason)
	}
	p.cv.text(0, 0, clip(title, w), clsTitle)
}

// axes draws the y labels (right-aligned in the fixed column), the axis
// lines and the time ticks with their labels.
func (p *cvPlot) axes(w int) {
	cv, r, px := p.cv, p.rows, p.px
	lw := p.ax.yw - 2
	for _, t := range p.levelTicks() {
		cv.text(0, t.row, strings.Repeat(" ", max(lw-cellWidth(t.text), 0))+t.text, clsMuted)
		cv.set(px-1, t.row, '┤', clsMuted)
	}
	for y := r.plotTop; y < r.axisRow; y++ {
		if cv.get(px-1, y) == ' ' {
			cv.set(px-1, y, '│', clsMuted)
		}
	}
	for _, t := range p.flowTicks() {
		cv.text(0, t.row, strings.Repeat(" ", max(lw-cellWidth(t.text), 0))+t.text, clsMuted)
	}
	if r.flowH > 0 {
		cv.set(px-1, r.flowTop, '┼', clsMuted)
	}
	cv.set(px-1, r.axisRow, '└', clsMuted)
	cv.hline(px, px+p.pw-1, r.axisRow, '─', clsMuted)
	a := p.ax
	lastEnd := -1
	for k := 0; ; k++ {
		tv := float64(k) * a.tstep
		if tv > a.tend*(1+1e-9) {
			break
		}
		col := px + p.colOf(tv*a.tper)/2
		cv.set(col, r.axisRow, '┴', clsMuted)
		lbl := cvNumText(tv, a.tstep)
		x := col - cellWidth(lbl)/2
		if k == 0 {
			lbl, x = lbl+" "+a.tname, col // the unit goes with the first label: "0 min"
		}
		if x > lastEnd+1 && x+cellWidth(lbl) <= w {
			lastEnd = cv.text(x, r.axisRow+1, lbl, clsMuted) - 1
		}
	}
}

// cvLineName is the name of a dashed line, longest wording first.
type cvLineName struct {
	row int
	say []string
}

// levelLines draws the gas and target levels as dashed lines under the
// curve; their names are written after the curve (lineNames).
func (p *cvPlot) levelLines() []cvLineName {
	c, u, a := p.c, p.u, p.ax
	var names []cvLineName
	if c.HasGasLevel && c.GasLevel >= a.ylo*u.lenPer && c.GasLevel <= a.yhi*u.lenPer {
		r := p.rows.plotTop + p.dotRow(c.GasLevel)/4
		p.cv.hline(p.px, p.px+p.pw-1, r, '┈', clsWarn)
		g := u.length(c.GasLevel)
		names = append(names, cvLineName{r, []string{" ! gas gathers at the crest below " + g + " ", " ! gas at crest below " + g + " ", " ! gas below " + g + " ", " ! gas "}})
	}
	if c.HasTarget {
		r := p.rows.plotTop + p.dotRow(c.Target)/4
		p.cv.hline(p.px, p.px+p.pw-1, r, '╌', clsLimit)
		names = append(names, cvLineName{r, []string{" target " + u.length(c.Target) + " ", " target "}})
	}
	return names
}

// cvBraille are the dot bits of a braille cell, by column and row.
var cvBraille = [2][4]uint8{{0x01, 0x02, 0x04, 0x40}, {0x08, 0x10, 0x20, 0x80}}

// levelLine draws the level in braille: for each dot column the level at
// that time, joined to the previous column so the line has no gaps.
func (p *cvPlot) levelLine() {
	pts, pw, plotH := p.c.Points, p.pw, p.rows.plotH
	dots := make([]uint8, pw*plotH)
	set := func(dx, dy int) {
		cx, cy := dx/2, dy/4
		if cx < 0 || cx >= pw || cy < 0 || cy >= plotH {
			return
		}
		dots[cy*pw+cx] |= cvBraille[dx%2][dy%4]
	}
	j, prev := 0, -1
	last := p.colOf(pts[len(pts)-1].T)
	for dx := 0; dx <= last; dx++ {
		t := float64(dx) / float64(p.dotsW-1) * p.tspan
		for j+1 < len(pts) && pts[j+1].T < t {
			j++
		}
		dy := p.dotRow(cvInterpLevel(pts, j, t))
		lo, hi := dy, dy
		if prev >= 0 {
			lo, hi = min(prev, dy), max(prev, dy)
		}
		for y := lo; y <= hi; y++ {
			set(dx, y)
		}
		prev = dy
	}
	for i, b := range dots {
		if b != 0 {
			p.cv.set(p.px+i%pw, p.rows.plotTop+i/pw, rune(0x2800+int(b)), clsLiquid)
		}
	}
}

// lineNames writes each dashed line's name where the line is still bare
// (at the left, where the level is usually high), shortened to fit.
func (p *cvPlot) lineNames(names []cvLineName) {
	cv := p.cv
	for _, nm := range names {
		x0 := p.px + 1
		x1 := x0
		for x1 < p.px+p.pw && (cv.get(x1, nm.row) == '╌' || cv.get(x1, nm.row) == '┈') {
			x1++
		}
		for _, t := range nm.say {
			if cellWidth(t) <= x1-x0 {
				cv.text(x0, nm.row, t, clsMuted)
				break
			}
		}
	}
}

// flowStrip draws the flow under the plot: one bar per cell column, in
// eighths of a cell, against the strip's round top flow.
func (p *cvPlot) flowStrip() {
	r := p.rows
	top := p.ax.ftop * p.u.flowPer
	if r.flowH == 0 || !(p.peak > 0) || !(top > 0) {
		return
	}
	bars := []rune(" ▁▂▃▄▅▆▇█")
	pts := p.c.Points
	tLast := pts[len(pts)-1].T
	for cx := 0; cx < p.pw; cx++ {
		t := (float64(2*cx) + 0.5) / float64(p.dotsW-1) * p.tspan
		if t > tLast {
			break
		}
		eighths := int(math.Round(cvInterpFlow(pts, t) / top * float64(8*r.flowH)))
		for k := 0; k < r.flowH; k++ {
			if n := min(max(eighths-8*k, 0), 8); n > 0 {
				p.cv.set(p.px+cx, r.flowTop+r.flowH-1-k, bars[n], clsLiquid)
			}
		}
	}
}
