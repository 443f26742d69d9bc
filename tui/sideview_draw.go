package tui

import (
	"math"
	"sort"
	"strings"

	"drawdown/model"
	"drawdown/model/present"
)

// Drawing the Side view, in steps that each depend on the ones before: the
// vertical scale (kept steady from one plan to the next), the columns, the
// limit lines, the source tank, the receiver, the hose (drawn after all of
// them, so nothing can break it), the labels and the status line.

// svScale is the vertical scale of a drawing: metres per row and the height
// at the top row. It is kept while a new picture fits it and fills at least
// svKeepSpan of it, so that a typed digit moves a line rather than
// rescaling the drawing; a new size starts afresh.
type svScale struct {
	valid bool
	w, h  int
	dz    float64 // metres per row: 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6 or 8 × 10^k
	top   float64 // height at the top row, m
}

// svKeepSpan: keep the scale while the picture spans at least this share of
// the rows (our choice).
const svKeepSpan = 0.55

// svNiceCeil is the least scale step at or above v (see svScale).
func svNiceCeil(v float64) float64 {
	if !(v > 0) || math.IsInf(v, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(v)))
	for _, m := range []float64{1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10} {
		if m*p >= v*(1-1e-9) {
			return m * p
		}
	}
	return 10 * p
}

// svLabel is a label placed beside a drawing row, in wordings from the
// longest to the shortest (the longest that fits is used).
type svLabel struct {
	row int
	say []string
	cls drawClass
	pri int // lower comes first when labels share a row
}

// svDraw is one drawing being made: the picture, the canvas and the rows
// and columns the steps have taken.
type svDraw struct {
	v   *SideView
	g   sideGeometry
	u   drawUnits
	c   *drawCanvas
	w   int
	top int // first drawing row; the drawing has rows rows
	// rows of the drawing area [top, top+rows)
	rows int

	showW, showT bool // limit lines within the drawing

	dw          int // drawing columns [0, dw)
	left, right int // source walls
	ux, ox      int // up-leg and down-leg columns
	rl, rr      int // receiving vessel's walls (a transfer)
	rw          int // half-width of an open receiving surface
	lx          int // labels start here
	narrow      bool

	labels []svLabel
}

// elev is a height as the labels give it: from the source surface at the
// start, signed (the datum the Result pane gives crest heights on).
func (v *SideView) elev(z float64) string {
	return present.Figures{Sys: v.units.sys}.Signed(model.DimLength, z-v.geo.Level)
}

func (v *SideView) redraw() {
	w, h := v.w, v.h
	if w <= 0 || h <= 0 {
		v.frame = ""
		return
	}
	if !v.has {
		v.frame = fitBlock([]string{clip("Side view: nothing to draw yet — set the lift and drop in Lift & outlet.", w)}, w, h)
		return
	}
	if w < 24 || h < 7 {
		v.frame = fitBlock(v.summaryLines(w), w, h)
		return
	}
	v.frame = v.drawing(w, h)
}

// statusText is the one-line verdict on the crest and the drop, in words:
// the longest wording that fits w cells.
func (v *SideView) statusText(w int) (string, drawClass) {
	g := v.geo
	lift := g.Crest - g.Level
	u := v.units
	var cls drawClass
	var say []string // longest first
	switch {
	case v.noDrop:
		cls = clsDanger
		say = []string{"✗ outlet not below the level: no drop, no flow", "✗ outlet not below level: no flow", "✗ no drop"}
	case len(g.CrestSays) > 0:
		cls = statusClass(g.CrestStatus)
		sym := g.CrestStatus.Symbol() + " "
		for _, t := range g.CrestSays {
			say = append(say, sym+t)
		}
		if g.CrestStatus == present.OK {
			// The drop goes with a lift within its limit, where it fits.
			var withDrop []string
			for _, t := range say[:len(say)-1] {
				withDrop = append(withDrop, t+" · drop "+u.length(g.Level-g.Outlet))
			}
			say = append(withDrop, say...)
		}
	default:
		cls = clsText
		say = []string{"lift " + u.length(lift) + " · drop " + u.length(g.Level-g.Outlet)}
	}
	for _, t := range say {
		if cellWidth(t) <= w {
			return t, cls
		}
	}
	return say[len(say)-1], cls
}

// summaryLines is the text fallback for a pane too small to draw in.
func (v *SideView) summaryLines(w int) []string {
	g := v.geo
	st, cls := v.statusText(w)
	lines := []string{v.styles.class[cls].Render(clip(st, w))}
	add := func(s string) { lines = append(lines, clip(s, w)) }
	add("heights from the surface")
	add("crest " + v.elev(g.Crest))
	add("outlet " + v.elev(g.Outlet))
	add("intake " + v.elev(g.Intake))
	if g.HasStop {
		add("stop " + v.elev(g.Stop))
	}
	if g.WorkingLimit > 0 {
		add("working limit " + v.elev(g.Level+g.WorkingLimit))
	}
	return lines
}

// drawing lays out the full picture: caption, drawing, status line. Each
// step takes rows and columns the later ones keep clear of.
func (v *SideView) drawing(w, h int) string {
	d := &svDraw{v: v, g: v.geo, u: v.units, c: newDrawCanvas(w, h), w: w, top: 1, rows: h - 2}
	d.vscale(h)
	d.columns()
	d.limits()
	d.source()
	d.receiver()
	d.hose()
	d.caption()
	d.placeLabels()
	st, cls := v.statusText(w)
	d.c.text(0, h-1, clip(st, w), cls)
	return d.c.render(&v.styles)
}

// vscale sets the vertical scale: what must show (the heights, the tank,
// the receiver, the levels, and the limit lines when they lie within 60 %
// of that span above it), a round number of metres per row, and the
// height at the top row, kept from the last drawing while the picture fits.
func (d *svDraw) vscale(h int) {
	g := d.g
	zlo := min(g.Intake, g.Outlet, g.Level)
	zhi := max(g.Crest, g.Level)
	if g.Tank {
		zlo, zhi = min(zlo, 0), max(zhi, g.TankHeight)
	}
	for _, z := range d.levels() {
		zlo, zhi = min(zlo, z), max(zhi, z)
	}
	if g.Receiver {
		zlo = min(zlo, g.RecvFloor, g.HoseEnd)
		zhi = max(zhi, g.RecvFloor+g.RecvHeight)
	}
	span := zhi - zlo
	if span < 1e-6 {
		span = 1
		zlo, zhi = zlo-0.5, zhi+0.5
	}
	wl, tl := g.Level+g.WorkingLimit, g.Level+g.TheoreticalLimit
	d.showW = g.WorkingLimit > 0 && wl <= zhi+0.6*span
	d.showT = g.TheoreticalLimit > 0 && tl <= zhi+0.6*span
	if d.showT {
		zhi = max(zhi, tl)
	}
	if d.showW {
		zhi = max(zhi, wl)
	}
	// One spare row at the bottom for the hose end under a receiving
	// surface, and half a row of headroom at the top.
	n := float64(max(d.rows-2, 1))
	s := &d.v.scale
	if s.valid && s.w == d.w && s.h == h {
		eps := 1e-9 * max(1, math.Abs(zhi))
		if zhi <= s.top-s.dz/2+eps && zlo >= s.top-s.dz*(n+0.5)-eps && zhi-zlo >= svKeepSpan*n*s.dz {
			return
		}
	}
	dz := svNiceCeil((zhi - zlo) / n)
	// Centre the picture in the rows the round scale leaves.
	*s = svScale{valid: true, w: d.w, h: h, dz: dz, top: zhi + dz/2 + (n*dz-(zhi-zlo))/2}
}

// levels are the source levels drawn besides the surface: the target, the
// stop and where air starts.
func (d *svDraw) levels() []float64 {
	g := d.g
	var out []float64
	if g.HasTarget {
		out = append(out, g.Target)
	}
	if g.HasStop {
		out = append(out, g.Stop)
	}
	if g.HasAirStarts {
		out = append(out, g.AirStarts)
	}
	if g.Receiver {
		out = append(out, g.RecvLevel, g.RecvStop)
	}
	return out
}

// row is the drawing row of a height.
func (d *svDraw) row(z float64) int {
	s := d.v.scale
	r := int(math.Round((s.top - z) / s.dz))
	return d.top + min(max(r, 0), d.rows-1)
}

// columns lays out the drawing across: the label column on the right, the
// source's walls, the up-leg inside the source near its wall, and the
// down-leg, with a receiving vessel around it for a transfer. A column is
// half a row's height (cells are about twice as tall as wide).
func (d *svDraw) columns() {
	g, w := d.g, d.w
	labelW := 30
	if w < 64 {
		labelW = max(12, w*45/100)
	}
	d.dw = w - labelW - 1
	d.narrow = w < 40
	dx := d.v.scale.dz / 2
	d.left = 1
	if g.Tank {
		tw := int(math.Round(g.TankWidth / dx))
		tw = min(max(tw, 3), max(d.dw*5/10, 3))
		if g.Receiver {
			tw = min(tw, max(d.dw*35/100, 3))
		}
		d.right = d.left + tw + 1
	} else {
		d.right = d.left + max(d.dw*35/100, 4)
	}
	d.ux = d.right - 2
	d.rw = 3
	switch {
	case g.Receiver:
		d.receiverColumns(dx)
	case d.narrow:
		d.rw = 2
		d.ox = d.right + 2
		if g.OutletSubmerged {
			d.ox = d.right + d.rw + 2
		}
		d.ox = min(d.ox, w-13)
	default:
		d.ox = min(d.right+max(3, min((d.dw-d.right)/2, 2+d.dw/6)), d.dw-3)
	}
	d.ox = max(d.ox, d.right+1)
	contentRight := d.ox + 1
	switch {
	case g.Receiver:
		contentRight = max(contentRight, d.rr+1)
	case g.OutletSubmerged:
		contentRight = d.ox + d.rw + 1
	}
	// Labels start just right of the drawing, so the eye travels little on
	// a wide pane; never on it.
	d.lx = min(d.dw+1, contentRight+4)
	if d.narrow {
		d.lx = min(w-11, contentRight+2)
	}
	d.lx = max(d.lx, contentRight+1)
}

// receiverColumns places a receiving vessel right of the source, to scale
// where there is room, with the down-leg entering it near its near wall.
func (d *svDraw) receiverColumns(dx float64) {
	room := max(d.dw-d.right-1, 6)
	gap := max(3, min(room/4, 8))
	rw := int(math.Round(d.g.RecvWidth / dx))
	rw = min(max(rw, 4), max(room-gap-1, 4))
	d.rl = d.right + gap
	d.rr = d.rl + rw + 1
	d.ox = d.rl + 2
}

// label adds a label on the row of height z, in wordings longest first.
func (d *svDraw) label(z float64, cls drawClass, pri int, say ...string) {
	d.labels = append(d.labels, svLabel{d.row(z), say, cls, pri})
}

// limits draws the crest-limit lines first (everything else overwrites
// them).
func (d *svDraw) limits() {
	g := d.g
	if d.showT {
		z := g.Level + g.TheoreticalLimit
		d.c.hline(0, d.lx-2, d.row(z), '┈', clsLimit)
		d.label(z, clsLimit, 9, "theoretical limit "+d.v.elev(z), "theory "+d.v.elev(z))
	}
	if d.showW {
		z := g.Level + g.WorkingLimit
		d.c.hline(0, d.lx-2, d.row(z), '╌', clsLimit)
		d.label(z, clsLimit, 8, "working limit "+d.v.elev(z), "working "+d.v.elev(z))
	}
}

// source draws the tank (or a pit with dashed sides: its real shape is not
// known), its liquid, and the levels where air starts, the drain stops and
// the target is.
func (d *svDraw) source() {
	g, c := d.g, d.c
	levelRow := d.row(g.Level)
	// Lines inside the source keep off its floor (and a pit's bottom).
	inside := d.top + d.rows - 1
	in := func(r int, ch rune, cls drawClass) {
		if r < inside {
			c.hline(d.left+1, d.right-1, r, ch, cls)
		}
	}
	if g.Tank {
		floorRow, topRow := d.row(0), d.row(g.TankHeight)
		inside = floorRow
		c.vline(d.left, topRow, floorRow, '│', clsText)
		c.vline(d.right, topRow, floorRow, '│', clsText)
		c.hline(d.left, d.right, floorRow, '─', clsText)
		c.set(d.left, floorRow, '└', clsText)
		c.set(d.right, floorRow, '┘', clsText)
		if g.Level > 0 {
			lr := min(levelRow, floorRow-1)
			for y := lr + 1; y < floorRow; y++ {
				in(y, '░', clsLiquid)
			}
			in(lr, '≈', clsLiquid)
		}
		top := d.v.elev(g.TankHeight)
		d.label(g.TankHeight, clsMuted, 10, "tank top "+top, "top "+top)
		d.label(0, clsMuted, 11, "floor "+d.v.elev(0))
	} else {
		bottom := min(max(d.row(g.Intake)+1, levelRow+1), d.top+d.rows-1)
		inside = bottom
		c.vline(d.left, levelRow-1, bottom, '╎', clsMuted)
		c.vline(d.right, levelRow-1, bottom, '╎', clsMuted)
		c.hline(d.left, d.right, bottom, '╌', clsMuted)
		for y := levelRow + 1; y < bottom; y++ {
			in(y, '░', clsLiquid)
		}
		in(levelRow, '≈', clsLiquid)
	}
	d.label(g.Level, clsLiquid, 1, "surface at the start", "surface")
	if g.HasAirStarts {
		if r := d.row(g.AirStarts); r != levelRow {
			in(r, '┈', clsWarn)
		}
		air := d.v.elev(g.AirStarts)
		d.label(g.AirStarts, clsWarn, 5, "! air starts at "+air, "! air "+air)
	}
	stopIsTarget := g.HasStop && g.HasTarget && d.row(g.Stop) == d.row(g.Target)
	if g.HasTarget && !stopIsTarget {
		if r := d.row(g.Target); r != levelRow {
			in(r, '╌', clsLimit)
		}
		d.label(g.Target, clsLimit, 6, "target "+d.v.elev(g.Target))
	}
	if g.HasStop {
		if r := d.row(g.Stop); r != levelRow {
			in(r, '╌', clsLimit)
		}
		stop := d.v.elev(g.Stop)
		d.label(g.Stop, clsLimit, 4, "stops at "+stop+": "+present.StopShort(g.StopReason), "stops at "+stop, "stop "+stop)
	}
}

// receiver draws a transfer's receiving vessel: walls to its brim, its
// liquid at the start and the level it rises to by the stop.
func (d *svDraw) receiver() {
	g, c := d.g, d.c
	if !g.Receiver {
		return
	}
	floorRow, brimRow := d.row(g.RecvFloor), d.row(g.RecvFloor+g.RecvHeight)
	c.vline(d.rl, brimRow, floorRow, '│', clsText)
	c.vline(d.rr, brimRow, floorRow, '│', clsText)
	c.hline(d.rl, d.rr, floorRow, '─', clsText)
	c.set(d.rl, floorRow, '└', clsText)
	c.set(d.rr, floorRow, '┘', clsText)
	startRow := d.row(g.RecvLevel)
	in := func(r int, ch rune, cls drawClass) {
		if r < floorRow {
			c.hline(d.rl+1, d.rr-1, r, ch, cls)
		}
	}
	if g.RecvLevel > g.RecvFloor {
		startRow = min(startRow, floorRow-1)
		for y := startRow + 1; y < floorRow; y++ {
			in(y, '░', clsLiquid)
		}
		in(startRow, '≈', clsLiquid)
	}
	rl := d.v.elev(g.RecvLevel)
	d.label(g.RecvLevel, clsLiquid, 2, "receiver at the start "+rl, "receiver "+rl, "recv "+rl)
	if r := d.row(g.RecvStop); r != startRow {
		in(r, '╌', clsLimit)
		rs := d.v.elev(g.RecvStop)
		d.label(g.RecvStop, clsLimit, 7, "receiver rises to "+rs, "rises to "+rs, "→ "+rs)
	}
}

// hose draws intake → up-leg → crest → down-leg → outlet after everything
// else, so no line of the drawing breaks it; the labels keep to their
// column (placeLabels), right of it.
func (d *svDraw) hose() {
	g, c := d.g, d.c
	intakeRow, crestRow := d.row(g.Intake), d.row(g.Crest)
	outletRow := d.row(g.Outlet)
	endRow := outletRow // the open end
	switch {
	case g.Receiver:
		endRow = d.row(g.HoseEnd)
	case g.OutletSubmerged:
		endRow = min(outletRow+1, d.top+d.rows-1) // under the receiving surface
	}
	c.vline(d.ux, intakeRow, crestRow, '┃', clsHose)
	c.vline(d.ox, crestRow, endRow, '┃', clsHose)
	c.hline(d.ux, d.ox, crestRow, '━', clsHose)
	switch {
	case intakeRow > crestRow:
		c.set(d.ux, crestRow, '┏', clsHose)
	case intakeRow < crestRow:
		c.set(d.ux, crestRow, '┗', clsHose)
	}
	switch {
	case endRow > crestRow:
		c.set(d.ox, crestRow, '┓', clsHose)
	case endRow < crestRow:
		c.set(d.ox, crestRow, '┛', clsHose)
	}
	c.set(d.ux, intakeRow, '▲', clsHose) // the open end: liquid goes in
	crestCls := clsText
	crestText := "crest " + d.v.elev(g.Crest)
	switch g.CrestStatus {
	case present.Bad:
		crestCls, crestText = clsDanger, "✗ "+crestText+" OVER LIMIT"
	case present.Warn:
		crestCls, crestText = clsWarn, "! "+crestText+" over working"
	case present.OK, present.Info:
	}
	d.label(g.Crest, crestCls, 0, crestText)
	d.label(g.Intake, clsText, 3, "intake "+d.v.elev(g.Intake))
	outCls := clsText
	if d.v.noDrop {
		outCls = clsDanger
	}
	switch {
	case g.Receiver:
		c.set(d.ox, endRow, '▼', clsHose)
		if endRow != d.row(g.RecvLevel) {
			he := d.v.elev(g.HoseEnd)
			d.label(g.HoseEnd, outCls, 3, "hose end "+he, "end "+he)
		}
	case g.OutletSubmerged:
		// An open receiving surface at Outlet, the hose end one row under it.
		c.hline(d.ox-d.rw+1, d.ox+d.rw, outletRow, '≈', clsLiquid)
		c.set(d.ox, outletRow, '╂', clsHose)
		c.vline(d.ox-d.rw, outletRow-1, endRow, '│', clsText)
		c.vline(d.ox+d.rw+1, outletRow-1, endRow, '│', clsText)
		c.set(d.ox, endRow, '▼', clsHose)
		rs := d.v.elev(g.Outlet)
		d.label(g.Outlet, outCls, 2, "receiving surface "+rs, "receiving "+rs, "recv "+rs)
	default:
		c.set(d.ox, outletRow, '▼', clsHose)
		out := d.v.elev(g.Outlet)
		d.label(g.Outlet, outCls, 2, "outlet "+out+" free", "outlet "+out, "out "+out)
	}
}

// caption is the first row: what is drawn, the datum of the heights and
// the scale, shortened to fit; off-scale limits are noted when there is
// room (the status line always states the working limit).
func (d *svDraw) caption() {
	g, w := d.g, d.w
	scale := "1 row ≈ " + d.u.length(d.v.scale.dz)
	shape := ""
	if g.Tank && g.Shape != "" {
		shape = " · " + g.Shape
	}
	var caption string
	for _, cand := range []string{
		"Side view" + shape + " · heights from the surface · " + scale,
		"Side view · heights from the surface · " + scale,
		"Side view · heights from surface · " + scale,
		"Side · heights from surface · " + scale,
		"heights from surface · " + scale,
		"from surface · " + scale,
		"from surface · row " + strings.TrimPrefix(scale, "1 row "),
		"row " + strings.TrimPrefix(scale, "1 row "),
	} {
		caption = cand
		if cellWidth(cand) <= w {
			break
		}
	}
	d.c.text(0, 0, clip(caption, w), clsTitle)
	if (g.WorkingLimit > 0 && !d.showW) || (g.TheoreticalLimit > 0 && !d.showT) {
		note := " · crest limits above, off scale ↑"
		if x := cellWidth(caption); x+cellWidth(note) <= w {
			d.c.text(x, 0, note, clsMuted)
		}
	}
}

// placeLabels writes one label line per row in the label column: labels
// sharing a row are merged, the most important first (crest, surface,
// outlet, intake, stop, air, target, receiver's rise, limits, tank), and
// a dotted leader over empty cells keeps the eye on the row.
func (d *svDraw) placeLabels() {
	c := d.c
	sort.SliceStable(d.labels, func(i, j int) bool { return d.labels[i].pri < d.labels[j].pri })
	placed := map[int][]svLabel{}
	var rowsUsed []int
	for _, l := range d.labels {
		if len(placed[l.row]) == 0 {
			rowsUsed = append(rowsUsed, l.row)
		}
		placed[l.row] = append(placed[l.row], l)
	}
	for _, r := range rowsUsed {
		x := d.lx
		for i, l := range placed[r] {
			if i > 0 {
				x = c.text(x, r, " / ", clsMuted)
			}
			room := d.w - x
			if room <= 1 {
				break
			}
			text := l.say[len(l.say)-1]
			for _, t := range l.say {
				if cellWidth(t) <= room {
					text = t
					break
				}
			}
			x = c.text(x, r, clip(text, room), l.cls)
		}
		for x := d.lx - 2; x > 0 && c.get(x, r) == ' '; x-- {
			c.set(x, r, '·', clsMuted)
		}
	}
}
