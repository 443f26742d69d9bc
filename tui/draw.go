package tui

import (
	"strings"

	"github.com/charmbracelet/x/ansi"

	"drawdown/model"
	"drawdown/model/present"
)

// The drawing kit shared by the drawn panes (Side view, Drain curve,
// What-if, Checklist): drawing classes (a cell's meaning, painted from the
// one style sheet), the unit helper drawUnits, a rune canvas and lines of
// styled segments. Every meaning also has a word or symbol, so the panes
// read the same with NO_COLOR.

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
	return present.Figures{Sys: u.sys}.Of(model.DimLength, finite(si))
}
func (u drawUnits) flow(si float64) string {
	return present.Figures{Sys: u.sys}.Of(model.DimFlow, finite(si))
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
func (c *drawCanvas) render(st *Styles) string {
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
			painted := cls != clsText && (cls == clsSelected || !blank)
			if painted {
				b.WriteString(st.class[cls].pre)
			}
			for _, cell := range row[i:j] {
				b.WriteRune(cell.r)
			}
			if painted {
				b.WriteString(st.class[cls].post)
			}
			i = j
		}
	}
	return b.String()
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
			sw = cellWidth(sg.text)
		}
		if x+sw > w {
			if sg.raw {
				sg.text = ansi.Truncate(sg.text, w-x, "…")
			} else {
				sg.text = clip(sg.text, w-x)
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
func (s *Styles) drawLines(lines []drawLine, w, h int) string {
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
				b.WriteString(s.class[sg.cls].Render(sg.text))
			}
		}
	}
	return b.String()
}
