package tui

import (
	"math"
	"sort"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

// sideGeometry is the Side view's picture in metres on one vertical datum,
// read from the plan's typed heights when the pane is shown (geometryOf),
// with the plan's one crest status. With a tank the datum is the tank floor
// (elevation 0); without one the labels count from the source surface.
type sideGeometry struct {
	Tank       bool    // a tank with known sizes; false for a pit, pond or sump
	Shape      string  // tank shape in words for the caption, e.g. "vertical cylinder"
	TankHeight float64 // wall height, m
	TankWidth  float64 // width drawn across the page (diameter or length), m

	Level  float64 // source liquid surface, m
	Intake float64 // hose opening, m
	Crest  float64 // highest point of the hose, m
	Outlet float64 // hose end, or the receiving surface when OutletSubmerged, m

	// OutletSubmerged: the hose end sits under a receiving surface at Outlet.
	OutletSubmerged bool

	HasTarget bool
	Target    float64 // level at which the drain is planned to stop, m

	// Crest limits as heights above the source surface (lifts), m. Working
	// keeps the gas-release allowance; Theoretical is (p_atm − p_v)/(ρg) at
	// zero flow.
	WorkingLimit, TheoreticalLimit float64

	// CrestSays and CrestStatus are the plan's crest status (present.Crest),
	// the same every view shows.
	CrestStatus present.Status
	CrestSays   []string
}

// geometryOf reads the side view's picture from a valid plan and its sheet.
func geometryOf(p model.Plan, s present.Sheet) sideGeometry {
	g := p.Siphon.Geometry
	r := p.Result
	sg := sideGeometry{
		Level: float64(g.Surface), Intake: float64(g.Intake), Crest: float64(g.Crest), Outlet: float64(g.Outlet),
		OutletSubmerged:  g.OutletSubmerged,
		WorkingLimit:     float64(r.WorkingCrestHeight),
		TheoreticalLimit: float64(r.MaxCrestHeight),
		CrestStatus:      s.Crest.Status,
		CrestSays:        s.Crest.Says,
	}
	if t := p.Tank; t != nil {
		sg.Tank = true
		sg.Shape = strings.ReplaceAll(t.Shape(), "-", " ")
		sg.TankHeight = float64(t.Height())
		sg.TankWidth = float64(calc.TankWidth(t, t.Height()))
		if tg := float64(p.DrainIn.Target); tg > 1e-6 {
			sg.HasTarget, sg.Target = true, tg
		}
	}
	return sg.sanitize()
}

// sanitize replaces non-finite numbers with 0 and negative sizes with 0.
func (g sideGeometry) sanitize() sideGeometry {
	for _, p := range []*float64{&g.TankHeight, &g.TankWidth, &g.Level, &g.Intake, &g.Crest,
		&g.Outlet, &g.Target, &g.WorkingLimit, &g.TheoreticalLimit} {
		*p = finite(*p)
	}
	g.TankHeight = max(g.TankHeight, 0)
	g.TankWidth = max(g.TankWidth, 0)
	if g.TankHeight == 0 {
		g.Tank = false
	}
	return g
}

// SideView draws the siphon to scale from its heights: tank (or source pit)
// with its level, the intake, the up-leg, the crest, the down-leg to a free
// outlet or into a receiver, and the working and theoretical crest-limit
// lines, each labelled with its height. Heights are to scale; widths follow
// from the same scale (a cell is taken as twice as tall as it is wide) and
// are squeezed when the pane is too narrow. It has no keys of its own.
type SideView struct {
	w, h    int
	geo     sideGeometry
	has     bool
	noDrop  bool
	units   drawUnits
	styles  Styles
	focused bool
	frame   string // rendered on every change; View returns it
}

// NewSideView returns an empty Side view in the given unit system.
func NewSideView(st Styles, sys model.System) SideView {
	v := SideView{styles: st, units: newDrawUnits(sys)}
	v.redraw()
	return v
}

// SetSize sets the pane's size in cells; View fills exactly w×h.
func (v *SideView) SetSize(w, h int) { v.w, v.h = max(w, 0), max(h, 0); v.redraw() }

// SetStyles replaces the styles (after a background-colour change).
func (v *SideView) SetStyles(st Styles) { v.styles = st; v.redraw() }

// SetUnits switches the labels to another unit system.
func (v *SideView) SetUnits(sys model.System) { v.units = newDrawUnits(sys); v.redraw() }

// setGeometry gives the picture to draw.
func (v *SideView) setGeometry(g sideGeometry) {
	v.geo = g.sanitize()
	v.has = true
	v.noDrop = v.geo.Outlet >= v.geo.Level
	v.redraw()
}

// Focus marks the pane focused; Blur unfocuses it.
func (v *SideView) Focus() { v.focused = true }

// Blur removes the focus.
func (v *SideView) Blur() { v.focused = false }

// ShortHelp lists no keys: the Side view has none.
func (v *SideView) ShortHelp() []key.Binding { return nil }

// Claims takes no keys.
func (v *SideView) Claims(tea.KeyPressMsg) bool { return false }

// Key does nothing: the Side view only follows the inputs.
func (v *SideView) Key(tea.KeyPressMsg) (tea.Cmd, *FieldEdit) { return nil, nil }

// Typing is false: the pane has no text input.
func (v *SideView) Typing() bool { return false }

// Paste does nothing: the pane has no text input.
func (v *SideView) Paste(string) (tea.Cmd, *FieldEdit) { return nil, nil }

// Click does nothing: the drawing has nothing to choose.
func (v *SideView) Click(int, int) (tea.Cmd, *FieldEdit) { return nil, nil }

// CursorPos is nil: the pane has no text input.
func (v *SideView) CursorPos() *tea.Cursor { return nil }

// Show draws the last valid plan in the job's unit system.
func (v *SideView) Show(st *screenState) {
	if v.units.sys != st.job.Units {
		v.units = newDrawUnits(st.job.Units)
	}
	if !st.hasPlan {
		v.has = false
		v.redraw()
		return
	}
	v.setGeometry(geometryOf(st.plan, st.sheet))
}

// View returns the frame drawn at the last change: exactly w×h cells.
func (v SideView) View() string { return v.frame }

// svLabel is a label placed beside a drawing row.
type svLabel struct {
	row  int
	text string
	cls  drawClass
	pri  int // lower comes first when labels share a row
}

// elevation text: above the floor with a tank, from the surface without.
func (v *SideView) elev(z float64) string {
	if v.geo.Tank {
		return v.units.length(z)
	}
	d := z - v.geo.Level
	s := v.units.length(d)
	if d > 0 && !strings.HasPrefix(s, "0.0") {
		s = "+" + s
	}
	return s
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
	add("crest " + v.elev(g.Crest))
	add("level " + v.elev(g.Level))
	add("outlet " + v.elev(g.Outlet))
	add("intake " + v.elev(g.Intake))
	if g.WorkingLimit > 0 {
		add("working limit " + v.elev(g.Level+g.WorkingLimit))
	}
	return lines
}

// drawing lays out the full picture. Rows: caption, drawing, status. It is
// long (cyclomatic ~53): one vertical scale and one column plan place the
// tank, hose, limits and labels so that they never overlap, and each step
// below depends on the rows and columns the earlier ones took.
func (v *SideView) drawing(w, h int) string {
	g := v.geo
	u := v.units
	c := newDrawCanvas(w, h)

	labelW := 30
	if w < 64 {
		labelW = max(12, w*45/100)
	}
	dw := w - labelW - 1 // drawing columns [0, dw)
	top, rows := 1, h-2  // drawing rows [top, top+rows)

	// Vertical extent of the things that must show.
	zlo := min(g.Intake, g.Outlet, g.Level)
	zhi := max(g.Crest, g.Level)
	if g.Tank {
		zlo = min(zlo, 0)
		zhi = max(zhi, g.TankHeight)
	}
	if g.HasTarget {
		zlo, zhi = min(zlo, g.Target), max(zhi, g.Target)
	}
	span := zhi - zlo
	if span < 1e-6 {
		span = 1
		zlo -= 0.5
		zhi += 0.5
	}
	// A limit line is drawn when it lies within 60 % of the geometry's span
	// above the top (or the crest reaches it); otherwise it is noted as off
	// scale in the labels.
	wl, tl := g.Level+g.WorkingLimit, g.Level+g.TheoreticalLimit
	showW := g.WorkingLimit > 0 && wl <= zhi+0.6*span
	showT := g.TheoreticalLimit > 0 && tl <= zhi+0.6*span
	if showT {
		zhi = max(zhi, tl)
	}
	if showW {
		zhi = max(zhi, wl)
	}
	// One spare row at the bottom for the hose end under the outlet and
	// half a row of headroom at the top.
	dz := (zhi - zlo) / float64(max(rows-2, 1))
	row := func(z float64) int {
		r := int(math.Round((zhi - z) / dz))
		return top + min(max(r, 0), rows-1)
	}

	// Caption.
	datum := "heights from the surface"
	if g.Tank {
		datum = "heights above tank floor"
	}
	scale := "1 row ≈ " + u.length(dz)
	var caption string
	shape := ""
	if g.Tank && g.Shape != "" {
		shape = " · " + g.Shape
	}
	for _, cand := range []string{
		"Side view" + shape + " · " + datum + " · " + scale,
		"Side view · " + datum + " · " + scale,
		"Side view · " + strings.TrimPrefix(datum, "heights ") + " · " + scale,
		"Side view · " + scale,
	} {
		caption = cand
		if cellWidth(cand) <= w {
			break
		}
	}
	c.text(0, 0, clip(caption, w), clsTitle)

	// Horizontal layout: cell aspect 2:1, so a column is dz/2 metres.
	dx := dz / 2
	var left, right int // tank or pit walls
	if g.Tank {
		tw := int(math.Round(g.TankWidth / dx))
		tw = min(max(tw, 3), max(dw*5/10, 3))
		left, right = 1, 1+tw+1
	} else {
		left, right = 1, 1+max(dw*35/100, 4)
	}
	narrow := w < 40
	ux := right - 2                                 // up-leg column, inside near the wall
	ox := right + max(3, min((dw-right)/2, 2+dw/6)) // down-leg column
	rw := 3                                         // receiver half-width
	if narrow {
		rw = 2
		ox = right + 2
		if g.OutletSubmerged {
			ox = right + rw + 2
		}
	}
	if narrow {
		ox = min(ox, w-13)
	} else {
		ox = min(ox, dw-3)
	}
	if ox <= right {
		ox = right + 1
	}

	// Labels start just right of the drawing, so the eye travels little on
	// a wide pane.
	contentRight := ox + 1
	if g.OutletSubmerged {
		contentRight = ox + rw + 1
	}
	lx := min(dw+1, contentRight+4)
	if narrow {
		lx = min(w-11, contentRight+2)
	}
	name := func(long, short string) string {
		if narrow {
			return short
		}
		return long
	}

	// Limit lines (drawn first; everything else overwrites them).
	var labels []svLabel
	if showT {
		r := row(tl)
		c.hline(0, lx-2, r, '┈', clsLimit)
		labels = append(labels, svLabel{r, name("theoretical limit ", "theory ") + v.elev(tl), clsLimit, 6})
	}
	if showW {
		r := row(wl)
		c.hline(0, lx-2, r, '╌', clsLimit)
		labels = append(labels, svLabel{r, name("working limit ", "working ") + v.elev(wl), clsLimit, 5})
	}

	// Tank or pit.
	levelRow := row(g.Level)
	if g.Tank {
		floorRow, topRow := row(0), row(g.TankHeight)
		c.vline(left, topRow, floorRow, '│', clsText)
		c.vline(right, topRow, floorRow, '│', clsText)
		c.hline(left, right, floorRow, '─', clsText)
		c.set(left, floorRow, '└', clsText)
		c.set(right, floorRow, '┘', clsText)
		if g.Level > 0 {
			lr := min(levelRow, floorRow-1)
			for y := lr + 1; y < floorRow; y++ {
				c.hline(left+1, right-1, y, '░', clsLiquid)
			}
			if lr > top-1 {
				c.hline(left+1, right-1, lr, '≈', clsLiquid)
			}
		}
		labels = append(labels, svLabel{topRow, name("tank top ", "top ") + v.elev(g.TankHeight), clsMuted, 7})
		labels = append(labels, svLabel{floorRow, "floor " + v.elev(0), clsMuted, 8})
	} else {
		// A pit with dashed sides from just above the surface to below the
		// intake: its real shape is not known.
		bottom := min(max(row(g.Intake)+1, levelRow+1), top+rows-1)
		c.vline(left, levelRow-1, bottom, '╎', clsMuted)
		c.vline(right, levelRow-1, bottom, '╎', clsMuted)
		c.hline(left, right, bottom, '╌', clsMuted)
		for y := levelRow + 1; y < bottom; y++ {
			c.hline(left+1, right-1, y, '░', clsLiquid)
		}
		c.hline(left+1, right-1, levelRow, '≈', clsLiquid)
	}
	if g.HasTarget {
		r := row(g.Target)
		if r != levelRow {
			c.hline(left+1, right-1, r, '╌', clsLimit)
		}
		labels = append(labels, svLabel{r, "target " + v.elev(g.Target), clsLimit, 4})
	}
	labels = append(labels, svLabel{levelRow, "level " + v.elev(g.Level), clsLiquid, 1})

	// Hose: intake → up-leg → crest → down-leg → outlet.
	intakeRow, crestRow, outletRow := row(g.Intake), row(g.Crest), row(g.Outlet)
	c.vline(ux, intakeRow, crestRow, '┃', clsHose)
	c.vline(ox, crestRow, outletRow, '┃', clsHose)
	c.hline(ux, ox, crestRow, '━', clsHose)
	switch {
	case intakeRow > crestRow:
		c.set(ux, crestRow, '┏', clsHose)
	case intakeRow < crestRow:
		c.set(ux, crestRow, '┗', clsHose)
	}
	switch {
	case outletRow > crestRow:
		c.set(ox, crestRow, '┓', clsHose)
	case outletRow < crestRow:
		c.set(ox, crestRow, '┛', clsHose)
	}
	c.set(ux, intakeRow, '▲', clsHose) // the open end: liquid goes in
	crestCls := clsText
	crestText := "crest " + v.elev(g.Crest)
	switch g.CrestStatus {
	case present.Bad:
		crestCls, crestText = clsDanger, "✗ "+crestText+" OVER LIMIT"
	case present.Warn:
		crestCls, crestText = clsWarn, "! "+crestText+" over working"
	case present.OK, present.Info:
	}
	labels = append(labels, svLabel{crestRow, crestText, crestCls, 0})
	labels = append(labels, svLabel{intakeRow, "intake " + v.elev(g.Intake), clsText, 3})

	outCls := clsText
	if v.noDrop {
		outCls = clsDanger
	}
	if g.OutletSubmerged {
		// Receiver: its surface at Outlet, the hose end one row under it.
		endRow := min(outletRow+1, top+rows-1)
		c.vline(ox, outletRow, endRow, '┃', clsHose)
		c.hline(ox-rw+1, ox+rw, outletRow, '≈', clsLiquid)
		c.set(ox, outletRow, '╂', clsHose)
		c.vline(ox-rw, outletRow-1, endRow, '│', clsText)
		c.vline(ox+rw+1, outletRow-1, endRow, '│', clsText)
		c.set(ox, endRow, '▼', clsHose)
		labels = append(labels, svLabel{outletRow, name("receiver ", "recv ") + v.elev(g.Outlet), outCls, 2})
	} else {
		c.set(ox, outletRow, '▼', clsHose)
		labels = append(labels, svLabel{outletRow, name("outlet ", "out ") + v.elev(g.Outlet) + name(" free", ""), outCls, 2})
	}

	// Off-scale limits are noted in the caption when it has room (the
	// status line always states the working limit).
	if (g.WorkingLimit > 0 && !showW) || (g.TheoreticalLimit > 0 && !showT) {
		note := " · crest limits above, off scale ↑"
		if x := cellWidth(caption); x+cellWidth(note) <= w {
			c.text(x, 0, note, clsMuted)
		}
	}

	// Labels: one per row; labels sharing a row are merged, the most
	// important first (crest, level, outlet, intake, target, limits, tank).
	sort.SliceStable(labels, func(i, j int) bool { return labels[i].pri < labels[j].pri })
	placed := map[int][]svLabel{}
	var rowsUsed []int
	for _, l := range labels {
		if len(placed[l.row]) == 0 {
			rowsUsed = append(rowsUsed, l.row)
		}
		placed[l.row] = append(placed[l.row], l)
	}
	for _, r := range rowsUsed {
		x := lx
		for i, l := range placed[r] {
			if i > 0 {
				x = c.text(x, r, " / ", clsMuted)
			}
			room := w - x
			if room <= 1 {
				break
			}
			x = c.text(x, r, clip(l.text, room), l.cls)
		}
		// A dotted leader from the drawing to the label keeps the eye on
		// the row.
		for x := lx - 2; x > 0 && c.get(x, r) == ' '; x-- {
			c.set(x, r, '·', clsMuted)
		}
	}

	st, cls := v.statusText(w)
	c.text(0, h-1, clip(st, w), cls)
	return c.render(&v.styles)
}
