package tui

import (
	"math"
	"sort"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"
	"charm.land/lipgloss/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/model"
)

// This file holds the Side view pane and the small drawing kit shared by the
// drawn panes (Side view, Drain curve, What-if, Checklist): DrawStyles, the
// unit helper drawUnits, a rune canvas and line fitting. Names carry a
// "draw"/"sv" prefix so they cannot clash with the rest of package tui.

// DrawStyles are the styles the drawn panes use, named for meaning. Build
// them once (PlainDrawStyles, or NewDrawStyles from the screen's Styles) and
// pass them in with SetStyles; a View never builds a style. Every meaning
// also has a word or symbol, so the panes read the same with NO_COLOR.
type DrawStyles struct {
	Title    lipgloss.Style // first line of a pane
	Text     lipgloss.Style // ordinary text and outlines
	Muted    lipgloss.Style // scale notes, axes, n/a steps
	Liquid   lipgloss.Style // liquid surfaces and bodies
	Hose     lipgloss.Style // the hose route
	Limit    lipgloss.Style // crest-limit lines, target lines
	OK       lipgloss.Style // "✓" states
	Warn     lipgloss.Style // "!" states
	Danger   lipgloss.Style // "✗" states
	Selected lipgloss.Style // the cursor (reversed: legible without colour)
	Current  lipgloss.Style // the present choice (bold)
	Box      lipgloss.Style // the caution box frame

	paint *drawPaint // escape codes per class, made once by prepared()
}

// drawPaint holds, for each class, the escape codes its style puts before
// and after a run of text, so that drawing a frame costs string appends
// rather than a lipgloss render per run (measured: a render per run made a
// Side view frame take about 0.4 ms).
type drawPaint struct {
	pre, post [clsCount]string
	ok        [clsCount]bool // false: fall back to Style.Render
}

// prepared returns the styles with their escape codes worked out.
func (s DrawStyles) prepared() DrawStyles {
	if s.paint != nil {
		return s
	}
	p := &drawPaint{}
	for c := drawClass(0); c < clsCount; c++ {
		r := s.style(c).Render("X")
		i := strings.IndexByte(r, 'X')
		if i >= 0 && strings.Count(r, "X") == 1 && ansi.Strip(r) == "X" {
			p.pre[c], p.post[c], p.ok[c] = r[:i], r[i+1:], true
		}
	}
	s.paint = p
	return s
}

// paintRun styles one run of single-line text in class c.
func (s *DrawStyles) paintRun(c drawClass, text string) string {
	if text == "" {
		return ""
	}
	if s.paint != nil && s.paint.ok[c] {
		return s.paint.pre[c] + text + s.paint.post[c]
	}
	return s.style(c).Render(text)
}

// PlainDrawStyles uses no colour at all: bold, faint and reverse only. The
// golden tests use it, and it is what NO_COLOR looks like.
func PlainDrawStyles() DrawStyles {
	p := lipgloss.NewStyle()
	return DrawStyles{
		Title: p.Bold(true), Text: p, Muted: p.Faint(true), Liquid: p, Hose: p.Bold(true),
		Limit: p, OK: p.Bold(true), Warn: p.Bold(true), Danger: p.Bold(true),
		Selected: p.Reverse(true), Current: p.Bold(true), Box: p,
	}
}

// NewDrawStyles derives the drawn panes' styles from the screen's Styles.
func NewDrawStyles(s Styles) DrawStyles {
	return DrawStyles{
		Title: s.PaneTitle, Text: s.Value, Muted: s.Muted, Liquid: s.Unit, Hose: s.Big,
		Limit: s.Warning.Bold(false), OK: s.OK, Warn: s.Warning, Danger: s.Danger,
		Selected: s.LabelFocused, Current: s.Big, Box: s.Warning.Bold(false),
	}
}

// drawClass tags a canvas cell with the meaning its style comes from.
type drawClass uint8

const (
	clsText drawClass = iota
	clsMuted
	clsLiquid
	clsHose
	clsLimit
	clsOK
	clsWarn
	clsDanger
	clsTitle
	clsSelected
	clsBox
	clsCount // number of classes
)

func (s *DrawStyles) style(c drawClass) lipgloss.Style {
	switch c {
	case clsMuted:
		return s.Muted
	case clsLiquid:
		return s.Liquid
	case clsHose:
		return s.Hose
	case clsLimit:
		return s.Limit
	case clsOK:
		return s.OK
	case clsWarn:
		return s.Warn
	case clsDanger:
		return s.Danger
	case clsTitle:
		return s.Title
	case clsSelected:
		return s.Selected
	case clsBox:
		return s.Box
	case clsText, clsCount:
	}
	return s.Text
}

// drawUnits formats SI values in the job's unit system (model.Format) and
// knows the display unit of lengths and flows for axes and scales.
type drawUnits struct {
	sys      model.System
	lenName  string  // "m" or "ft"
	lenPer   float64 // metres per display length unit
	flowName string  // "L/min" or "gal/min"
	flowPer  float64 // m³/s per display flow unit
	diamName string  // "mm" or "in"
	diamPer  float64
}

func newDrawUnits(sys model.System) drawUnits {
	per := func(d model.Dim) (string, float64) {
		name := model.DefaultUnit(d, sys)
		v, err := model.Parse(d, "1 "+name, sys)
		if err != nil || !(v > 0) {
			return name, 1
		}
		return name, v
	}
	u := drawUnits{sys: sys}
	u.lenName, u.lenPer = per(model.DimLength)
	u.flowName, u.flowPer = per(model.DimFlow)
	u.diamName, u.diamPer = per(model.DimDiameter)
	return u
}

func (u drawUnits) length(si float64) string {
	return model.Format(model.DimLength, drawFinite(si), u.sys)
}
func (u drawUnits) flow(si float64) string {
	return model.Format(model.DimFlow, drawFinite(si), u.sys)
}

// drawFinite maps NaN and ±Inf to 0 so that nothing non-finite reaches a
// frame.
func drawFinite(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

// drawCell is one character cell of a canvas.
type drawCell struct {
	r   rune
	cls drawClass
}

// drawCanvas is a w×h grid of single-width runes, each tagged with a class.
// Writes outside the grid are dropped, so drawing code never needs bounds
// checks and never panics.
type drawCanvas struct {
	w, h  int
	cells []drawCell
}

func newDrawCanvas(w, h int) *drawCanvas {
	w, h = max(w, 0), max(h, 0)
	c := &drawCanvas{w: w, h: h, cells: make([]drawCell, w*h)}
	for i := range c.cells {
		c.cells[i].r = ' '
	}
	return c
}

func (c *drawCanvas) set(x, y int, r rune, cls drawClass) {
	if x < 0 || y < 0 || x >= c.w || y >= c.h {
		return
	}
	c.cells[y*c.w+x] = drawCell{r, cls}
}

func (c *drawCanvas) get(x, y int) rune {
	if x < 0 || y < 0 || x >= c.w || y >= c.h {
		return 0
	}
	return c.cells[y*c.w+x].r
}

// text writes s from (x, y), clipped at the right edge; it returns the
// column after the last rune written.
func (c *drawCanvas) text(x, y int, s string, cls drawClass) int {
	for _, r := range s {
		c.set(x, y, r, cls)
		x++
	}
	return x
}

func (c *drawCanvas) hline(x0, x1, y int, r rune, cls drawClass) {
	if x0 > x1 {
		x0, x1 = x1, x0
	}
	for x := x0; x <= x1; x++ {
		c.set(x, y, r, cls)
	}
}

func (c *drawCanvas) vline(x, y0, y1 int, r rune, cls drawClass) {
	if y0 > y1 {
		y0, y1 = y1, y0
	}
	for y := y0; y <= y1; y++ {
		c.set(x, y, r, cls)
	}
}

// render turns the canvas into h lines of exactly w cells, styling each run
// of equal class once. It writes straight into one builder: no string per
// run.
func (c *drawCanvas) render(st *DrawStyles) string {
	var b strings.Builder
	b.Grow(c.w*c.h*3 + c.h*16)
	for y := 0; y < c.h; y++ {
		if y > 0 {
			b.WriteByte('\n')
		}
		row := c.cells[y*c.w : (y+1)*c.w]
		for i := 0; i < len(row); {
			cls := row[i].cls
			j := i
			blank := true
			for j < len(row) && row[j].cls == cls {
				if row[j].r != ' ' {
					blank = false
				}
				j++
			}
			paint := cls != clsText && (cls == clsSelected || !blank)
			fast := st.paint != nil && st.paint.ok[cls]
			switch {
			case !paint:
				for _, cell := range row[i:j] {
					b.WriteRune(cell.r)
				}
			case fast:
				b.WriteString(st.paint.pre[cls])
				for _, cell := range row[i:j] {
					b.WriteRune(cell.r)
				}
				b.WriteString(st.paint.post[cls])
			default:
				rs := make([]rune, 0, j-i)
				for _, cell := range row[i:j] {
					rs = append(rs, cell.r)
				}
				b.WriteString(st.style(cls).Render(string(rs)))
			}
			i = j
		}
	}
	return b.String()
}

// drawWidth is the cell width of plain text. Text of narrow runes only
// (every glyph the drawn panes use: Latin, punctuation, arrows, box
// drawing, braille, geometric shapes) is counted rune by rune; anything
// else (escape codes, wide scripts) goes to lipgloss.Width. The fast path
// matters: grapheme segmentation made the Checklist frame cost 0.7 ms.
func drawWidth(s string) int {
	n := 0
	for _, r := range s {
		if r < 0x20 || r >= 0x1100 && (r < 0x2000 || r >= 0x2e80) {
			return lipgloss.Width(s)
		}
		n++
	}
	return n
}

// drawClip cuts plain text to w cells with an ellipsis.
func drawClip(s string, w int) string {
	if w <= 0 {
		return ""
	}
	n := drawWidth(s)
	if n <= w {
		return s
	}
	if n == len([]rune(s)) { // narrow runes only
		r := []rune(s)
		return string(r[:w-1]) + "…"
	}
	return ansi.Truncate(s, w, "…")
}

// drawFit pads or cuts styled lines to exactly w cells and h lines.
func drawFit(lines []string, w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	out := make([]string, h)
	for i := range out {
		s := ""
		if i < len(lines) {
			s = lines[i]
		}
		if lipgloss.Width(s) > w {
			s = ansi.Truncate(s, w, "…")
		}
		if pad := w - lipgloss.Width(s); pad > 0 {
			s += strings.Repeat(" ", pad)
		}
		out[i] = s
	}
	return strings.Join(out, "\n")
}

// drawSeg is a run of one-line text in one class. A raw segment is already
// styled (a text input's view) and carries its width.
type drawSeg struct {
	text  string
	cls   drawClass
	raw   bool
	width int
}

// drawLine is one line of segments.
type drawLine []drawSeg

func drawPlain(text string, cls drawClass) drawLine { return drawLine{{text: text, cls: cls}} }

// fit clips the line to w cells (an ellipsis marks the cut) and pads it
// with spaces to exactly w.
func (l drawLine) fit(w int) drawLine {
	out := make(drawLine, 0, len(l)+1)
	x := 0
	for _, sg := range l {
		if x >= w {
			break
		}
		sw := sg.width
		if !sg.raw {
			sw = drawWidth(sg.text)
		}
		if x+sw > w {
			if sg.raw {
				sg.text = ansi.Truncate(sg.text, w-x, "…")
			} else {
				sg.text = drawClip(sg.text, w-x)
			}
			sw = w - x
		}
		sg.width = sw
		out = append(out, sg)
		x += sw
	}
	if x < w {
		out = append(out, drawSeg{text: strings.Repeat(" ", w-x), width: w - x})
	}
	return out
}

// drawLines renders lines into exactly w×h cells.
func (s *DrawStyles) drawLines(lines []drawLine, w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	var b strings.Builder
	for i := 0; i < h; i++ {
		if i > 0 {
			b.WriteByte('\n')
		}
		var l drawLine
		if i < len(lines) {
			l = lines[i]
		}
		for _, sg := range l.fit(w) {
			switch {
			case sg.raw:
				b.WriteString(sg.text)
			case sg.cls == clsText || sg.cls != clsSelected && strings.TrimSpace(sg.text) == "":
				b.WriteString(sg.text)
			default:
				b.WriteString(s.paintRun(sg.cls, sg.text))
			}
		}
	}
	return b.String()
}

// SideGeometry is what the Side view draws: plain heights in metres on one
// vertical datum, computed elsewhere (model.Compute) and only formatted here.
// With a tank the datum is the tank floor (elevation 0). Without one the
// labels count from the source surface (Level), whatever datum is used.
type SideGeometry struct {
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

	// Crest limits as heights above the source surface (lifts), m; zero or
	// less when not known. Working keeps the gas-release allowance;
	// Theoretical is (p_atm − p_v)/(ρg) at zero flow.
	WorkingLimit, TheoreticalLimit float64
	// FlowingLimit is the crest limit at the present flow (lift), m; zero
	// when not known. A crest above it will not run; it is stated in words
	// (no line is drawn: it lies just under the theoretical limit).
	FlowingLimit float64
}

// sanitize replaces non-finite numbers with 0 and negative sizes with 0.
func (g SideGeometry) sanitize() SideGeometry {
	for _, p := range []*float64{&g.TankHeight, &g.TankWidth, &g.Level, &g.Intake, &g.Crest,
		&g.Outlet, &g.Target, &g.WorkingLimit, &g.TheoreticalLimit, &g.FlowingLimit} {
		*p = drawFinite(*p)
	}
	g.TankHeight = max(g.TankHeight, 0)
	g.TankWidth = max(g.TankWidth, 0)
	if g.TankHeight == 0 {
		g.Tank = false
	}
	return g
}

// crest status, decided when the geometry is set (not in View).
type svCrest int

const (
	svCrestUnknown     svCrest = iota // no limits given
	svCrestWithin                     // at or below the working limit
	svCrestOverWorking                // above working, below theoretical
	svCrestOverFlowing                // above the limit at the present flow
	svCrestOverTheory                 // above the zero-flow theoretical limit
)

// SideView draws the siphon to scale from its heights: tank (or source pit)
// with its level, the intake, the up-leg, the crest, the down-leg to a free
// outlet or into a receiver, and the working and theoretical crest-limit
// lines, each labelled with its height. Heights are to scale; widths follow
// from the same scale (a cell is taken as twice as tall as it is wide) and
// are squeezed when the pane is too narrow. It has no keys of its own.
type SideView struct {
	w, h    int
	geo     SideGeometry
	has     bool
	crest   svCrest
	noDrop  bool
	units   drawUnits
	styles  DrawStyles
	focused bool
	frame   string // rendered on every change; View returns it
}

// NewSideView returns an empty Side view in the given unit system.
func NewSideView(st DrawStyles, sys model.System) SideView {
	v := SideView{styles: st.prepared(), units: newDrawUnits(sys)}
	v.redraw()
	return v
}

// SetSize sets the pane's size in cells; View fills exactly w×h.
func (v *SideView) SetSize(w, h int) { v.w, v.h = max(w, 0), max(h, 0); v.redraw() }

// SetStyles replaces the styles (after a background-colour change).
func (v *SideView) SetStyles(st DrawStyles) { v.styles = st.prepared(); v.redraw() }

// SetUnits switches the labels to another unit system.
func (v *SideView) SetUnits(sys model.System) { v.units = newDrawUnits(sys); v.redraw() }

// SetGeometry gives the heights to draw.
func (v *SideView) SetGeometry(g SideGeometry) {
	v.geo = g.sanitize()
	v.has = true
	g = v.geo
	v.noDrop = g.Outlet >= g.Level
	lift := g.Crest - g.Level
	switch {
	case g.TheoreticalLimit > 0 && lift > g.TheoreticalLimit:
		v.crest = svCrestOverTheory
	case g.FlowingLimit > 0 && lift > g.FlowingLimit:
		v.crest = svCrestOverFlowing
	case g.WorkingLimit > 0 && lift > g.WorkingLimit:
		v.crest = svCrestOverWorking
	case g.WorkingLimit > 0:
		v.crest = svCrestWithin
	default:
		v.crest = svCrestUnknown
	}
	v.redraw()
}

// ClearGeometry shows the "nothing to draw" message.
func (v *SideView) ClearGeometry() { v.has = false; v.redraw() }

// Focus marks the pane focused; Blur unfocuses it.
func (v *SideView) Focus() { v.focused = true }

// Blur removes the focus.
func (v *SideView) Blur() { v.focused = false }

// Focused reports whether the pane has the focus.
func (v SideView) Focused() bool { return v.focused }

// Update does nothing: the Side view only follows the inputs.
func (v SideView) Update(tea.Msg) (SideView, tea.Cmd) { return v, nil }

// ShortHelp lists no keys: the Side view has none.
func (v SideView) ShortHelp() []key.Binding { return nil }

// FullHelp lists no keys.
func (v SideView) FullHelp() [][]key.Binding { return nil }

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
		v.frame = drawFit([]string{drawClip("Side view: nothing to draw yet — set the lift and drop in Lift & outlet.", w)}, w, h)
		return
	}
	if w < 24 || h < 7 {
		v.frame = drawFit(v.summaryLines(w), w, h)
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
	case v.crest == svCrestOverTheory:
		cls = clsDanger
		say = []string{"✗ crest " + u.length(lift-g.TheoreticalLimit) + " above the theoretical limit: will not run",
			"✗ crest above limit: will not run", "✗ crest above limit"}
	case v.crest == svCrestOverFlowing:
		cls = clsDanger
		say = []string{"✗ crest " + u.length(lift-g.FlowingLimit) + " above the limit at this flow: will not run",
			"✗ crest above limit: will not run", "✗ crest above limit"}
	case v.crest == svCrestOverWorking:
		cls = clsWarn
		say = []string{"! crest " + u.length(lift-g.WorkingLimit) + " over the working limit: gas will gather, may break",
			"! crest " + u.length(lift-g.WorkingLimit) + " over working limit", "! over working limit"}
	case v.crest == svCrestWithin:
		cls = clsOK
		say = []string{"✓ lift " + u.length(lift) + " within working limit " + u.length(g.WorkingLimit) + " · drop " + u.length(g.Level-g.Outlet),
			"✓ lift " + u.length(lift) + " of " + u.length(g.WorkingLimit) + " · drop " + u.length(g.Level-g.Outlet),
			"✓ lift " + u.length(lift) + " of " + u.length(g.WorkingLimit)}
	default:
		cls = clsText
		say = []string{"lift " + u.length(lift) + " · drop " + u.length(g.Level-g.Outlet)}
	}
	for _, t := range say {
		if drawWidth(t) <= w {
			return t, cls
		}
	}
	return say[len(say)-1], cls
}

// summaryLines is the text fallback for a pane too small to draw in.
func (v *SideView) summaryLines(w int) []string {
	g := v.geo
	st, cls := v.statusText(w)
	lines := []string{v.styles.paintRun(cls, drawClip(st, w))}
	add := func(s string) { lines = append(lines, drawClip(s, w)) }
	add("crest " + v.elev(g.Crest))
	add("level " + v.elev(g.Level))
	add("outlet " + v.elev(g.Outlet))
	add("intake " + v.elev(g.Intake))
	if g.WorkingLimit > 0 {
		add("working limit " + v.elev(g.Level+g.WorkingLimit))
	}
	return lines
}

// drawing lays out the full picture. Rows: caption, drawing, status.
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
		if drawWidth(cand) <= w {
			break
		}
	}
	c.text(0, 0, drawClip(caption, w), clsTitle)

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
	switch v.crest {
	case svCrestOverTheory, svCrestOverFlowing:
		crestCls, crestText = clsDanger, "✗ "+crestText+" OVER LIMIT"
	case svCrestOverWorking:
		crestCls, crestText = clsWarn, "! "+crestText+" over working"
	case svCrestUnknown, svCrestWithin:
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
		if x := drawWidth(caption); x+drawWidth(note) <= w {
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
			x = c.text(x, r, drawClip(l.text, room), l.cls)
		}
		// A dotted leader from the drawing to the label keeps the eye on
		// the row.
		for x := lx - 2; x > 0 && c.get(x, r) == ' '; x-- {
			c.set(x, r, '·', clsMuted)
		}
	}

	st, cls := v.statusText(w)
	c.text(0, h-1, drawClip(st, w), cls)
	return c.render(&v.styles)
}
