package tui

import (
	"math"
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

// WhatIfCell is one alternative's outcome, computed elsewhere.
type WhatIfCell struct {
	Invalid   bool    // this hose does not fit the route (e.g. shorter than the up-leg)
	Runs      bool    // false: the siphon will not run with this hose
	NearLimit bool    // runs, but the crest is over the working limit
	Flow      float64 // all hoses, m³/s
	// Time is the time to the table's common level (WhatIfTable.Common), s;
	// Level is where this hose's drain stops, m. Both ignored without a
	// tank or when the hose does not drain.
	Time  float64
	Level float64
	// Drains: the hose lowers the level at all; one that does not shows
	// why (StopReason), never a bare "at once".
	Drains bool
	// StopReason is why the drain stops ("target", "intake", "crest",
	// "equal"; empty without a tank), shown for the selected cell.
	StopReason string
}

// WhatIfParallel is the current hose run with a given number of hoses.
type WhatIfParallel struct {
	Hoses int
	Cell  WhatIfCell
}

// WhatIfTable is the grid the What-if pane shows: flow, the time to one
// common level and each hose's stop level
// for hose lengths (rows) against inside diameters (columns) around the
// present choice, plus the present length and diameter with 1…N hoses in
// parallel. All values SI; the pane only formats them.
type WhatIfTable struct {
	Lengths   []float64      // hose lengths, m (rows)
	Diameters []float64      // inside diameters, m (columns)
	Cells     [][]WhatIfCell // [row][column]
	Row, Col  int            // the present choice
	Hoses     int            // hoses in the present choice (≥ 1)
	Parallel  []WhatIfParallel
	HasTime   bool    // a tank is set, so times exist
	Common    float64 // the one level every cell's time is counted to, m
}

// WhatIfAdoptMsg asks the root to adopt a cell of the What-if table as the
// job's hose length, inside diameter and number of hoses (SI).
type WhatIfAdoptMsg struct {
	Length, Diameter float64 // m
	Hoses            int
}

// WhatIfView is the What-if pane: a table of flow, time to one common level
// and the level each hose stops at, against hose length and inside
// diameter around the present choice, with
// the present cell marked "●", cells that will not run marked "✗ no run",
// and a row for more hoses in parallel. Arrows move the selection; Enter
// asks the root (WhatIfAdoptMsg) to adopt the selected cell.
type WhatIfView struct {
	w, h     int
	t        WhatIfTable
	has      bool
	r, c     int // selection; r == len(Lengths) is the parallel row
	units    drawUnits
	styles   Styles
	keys     WhatIfKeys
	focused  bool
	frame    string
	selValid bool
	hit      wiHit // where the cells were drawn (for a click)
}

// wiHit is the drawn table's geometry, kept by the drawing so that a click
// finds its cell: the label column, cell widths, lines per cell and the
// scroll windows of rows, columns and the parallel row.
type wiHit struct {
	ok                     bool
	labelW, cellW, parW    int
	lines                  int
	r0, c0, p0             int
	visR, visC, visP, nPar int
}

// Click selects the cell at (x, y), relative to the pane.
func (v *WhatIfView) Click(x, y int) (tea.Cmd, *FieldEdit) {
	h := v.hit
	if !v.has || !h.ok || x < h.labelW || y < 2 {
		return nil, nil
	}
	row := (y - 2) / h.lines
	switch {
	case row < h.visR:
		if c := (x - h.labelW) / h.cellW; c < h.visC {
			v.r, v.c = h.r0+row, h.c0+c
		}
	case row == h.visR && h.nPar > 0:
		if c := (x - h.labelW) / h.parW; c < h.visP {
			v.r, v.c = len(v.t.Lengths), h.p0+c
		}
	default:
		return nil, nil
	}
	v.redraw()
	return nil, nil
}

// NewWhatIfView returns an empty What-if pane in the given unit system.
func NewWhatIfView(st Styles, sys model.System, km KeyMap) WhatIfView {
	v := WhatIfView{styles: st, units: newDrawUnits(sys), keys: km.WhatIf}
	v.redraw()
	return v
}

// SetSize sets the pane's size in cells; View fills exactly w×h.
func (v *WhatIfView) SetSize(w, h int) { v.w, v.h = max(w, 0), max(h, 0); v.redraw() }

// SetStyles replaces the styles.
func (v *WhatIfView) SetStyles(st Styles) { v.styles = st; v.redraw() }

// SetUnits switches the table to another unit system.
func (v *WhatIfView) SetUnits(sys model.System) { v.units = newDrawUnits(sys); v.redraw() }

// SetTable gives the grid to show. A ragged or empty grid is cut to the
// cells present. The selection returns to the present choice when the
// present choice or the grid's shape changes.
func (v *WhatIfView) SetTable(t WhatIfTable) {
	old := v.t
	nr := len(t.Lengths)
	if len(t.Cells) < nr {
		nr = len(t.Cells)
	}
	t.Lengths = t.Lengths[:nr]
	t.Cells = t.Cells[:nr]
	nc := len(t.Diameters)
	for _, row := range t.Cells {
		nc = min(nc, len(row))
	}
	t.Diameters = t.Diameters[:nc]
	t.Hoses = max(t.Hoses, 1)
	t.Row = min(max(t.Row, 0), max(nr-1, 0))
	t.Col = min(max(t.Col, 0), max(nc-1, 0))
	v.t, v.has = t, nr > 0 && nc > 0
	if !v.has || !v.selValid || old.Row != t.Row || old.Col != t.Col || old.Hoses != t.Hoses ||
		len(old.Lengths) != nr || len(old.Diameters) != nc || len(old.Parallel) != len(t.Parallel) {
		v.r, v.c = t.Row, t.Col
		v.selValid = v.has
	}
	v.redraw()
}

// ClearTable shows the "nothing to compare" message.
func (v *WhatIfView) ClearTable() { v.has, v.selValid = false, false; v.t = WhatIfTable{}; v.redraw() }

// Focus gives the pane the focus.
func (v *WhatIfView) Focus() { v.focused = true; v.redraw() }

// Blur removes the focus.
func (v *WhatIfView) Blur() { v.focused = false; v.redraw() }

// Focused reports whether the pane has the focus.
func (v WhatIfView) Focused() bool { return v.focused }

// Selected returns the selected alternative as the adopt message would
// carry it, and false when the table is empty.
func (v WhatIfView) Selected() (WhatIfAdoptMsg, bool) {
	if !v.has {
		return WhatIfAdoptMsg{}, false
	}
	t := v.t
	if v.r >= len(t.Lengths) {
		p := t.Parallel[min(v.c, len(t.Parallel)-1)]
		return WhatIfAdoptMsg{Length: t.Lengths[t.Row], Diameter: t.Diameters[t.Col], Hoses: p.Hoses}, true
	}
	return WhatIfAdoptMsg{Length: t.Lengths[v.r], Diameter: t.Diameters[v.c], Hoses: t.Hoses}, true
}

// Update moves the selection and, on Enter, returns a command producing a
// WhatIfAdoptMsg. It does nothing unless the pane has the focus.
func (v WhatIfView) Update(msg tea.Msg) (WhatIfView, tea.Cmd) {
	k, ok := msg.(tea.KeyPressMsg)
	if !ok || !v.focused || !v.has {
		return v, nil
	}
	rows := len(v.t.Lengths)
	if len(v.t.Parallel) > 0 {
		rows++
	}
	cols := func(r int) int {
		if r >= len(v.t.Lengths) {
			return len(v.t.Parallel)
		}
		return len(v.t.Diameters)
	}
	switch {
	case key.Matches(k, v.keys.Up):
		v.r = max(v.r-1, 0)
	case key.Matches(k, v.keys.Down):
		v.r = min(v.r+1, rows-1)
	case key.Matches(k, v.keys.Left):
		v.c = max(v.c-1, 0)
	case key.Matches(k, v.keys.Right):
		v.c = min(v.c+1, cols(v.r)-1)
	case key.Matches(k, v.keys.Adopt):
		m, ok := v.Selected()
		if !ok {
			return v, nil
		}
		return v, func() tea.Msg { return m }
	default:
		return v, nil
	}
	v.c = min(v.c, cols(v.r)-1)
	v.redraw()
	return v, nil
}

// ShortHelp lists the pane's keys for the help line.
func (v WhatIfView) ShortHelp() []key.Binding {
	return []key.Binding{v.keys.Up, v.keys.Down, v.keys.Left, v.keys.Right, v.keys.Adopt}
}

// FullHelp lists the pane's keys for the help screen.
// Claims takes the pane's own keys (arrows and enter).
func (v *WhatIfView) Claims(msg tea.KeyPressMsg) bool { return key.Matches(msg, v.ShortHelp()...) }

// Key handles a key with the pane focused.
func (v *WhatIfView) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) {
	var cmd tea.Cmd
	*v, cmd = v.Update(msg)
	return cmd, nil
}

// Typing is false: the pane has no text input.
func (v *WhatIfView) Typing() bool { return false }

// Paste does nothing: the pane has no text input.
func (v *WhatIfView) Paste(string) (tea.Cmd, *FieldEdit) { return nil, nil }

// CursorPos is nil: the pane has no text input.
func (v *WhatIfView) CursorPos() *tea.Cursor { return nil }

// Show follows the job's unit system; the grid itself comes from the root's
// background computation (SetTable).
func (v *WhatIfView) Show(st *screenState) {
	if v.units.sys != st.job.Units {
		v.SetUnits(st.job.Units)
	}
}

// View returns the frame drawn at the last change: exactly w×h cells.
func (v WhatIfView) View() string { return v.frame }

// hmm formats a duration in seconds as h:mm.
func wiHMM(s float64) string {
	s = finite(s)
	if s <= 0 {
		return "0:00"
	}
	if s < 60 {
		return "<0:01"
	}
	m := int64(math.Round(s / 60))
	if m >= 100*60 {
		return ">99h"
	}
	mm := strconv.FormatInt(m%60, 10)
	if len(mm) < 2 {
		mm = "0" + mm
	}
	return strconv.FormatInt(m/60, 10) + ":" + mm
}

// wiCellText is a cell's two parts (flow, time) and its class.
func (v *WhatIfView) cellText(c WhatIfCell, withLevel bool) (flow, tm string, cls drawClass) {
	if c.Invalid {
		return "– n/a", "", clsMuted
	}
	if !c.Runs {
		return "✗ no", "run", clsDanger
	}
	flow, _ = model.FormatParts(model.DimFlow, finite(c.Flow), v.units.sys)
	if v.t.HasTime {
		if c.Drains {
			tm = wiHMM(c.Time)
			if withLevel {
				tm += " " + v.levelNum(c.Level)
			}
		} else {
			tm = present.WhatIfTag(calc.StopReason(c.StopReason)) // why it does not drain (the footer in full)
		}
	}
	cls = clsText
	if c.NearLimit {
		flow = "!" + flow
		cls = clsWarn
	}
	return flow, tm, cls
}

func (v *WhatIfView) redraw() {
	w, h := v.w, v.h
	if w <= 0 || h <= 0 {
		v.frame = ""
		return
	}
	if !v.has {
		v.frame = fitBlock([]string{clip("What-if: nothing to compare yet — set the hose and the lift.", w)}, w, h)
		return
	}
	v.frame = v.table(w, h)
}

// wiCell is a formatted cell: flow and time texts and the class.
type wiCell struct {
	flow, tm string
	cls      drawClass
	runs     bool
}

// table lays out title, header, rows, the parallel row and a footer that
// says what Enter will adopt. It is long (cyclomatic ~50) because the column
// widths, the one- or two-line cells and the scroll window are fitted to
// the pane together before anything is drawn.
func (v *WhatIfView) table(w, h int) string {
	t := v.t
	u := v.units
	nr, nc := len(t.Lengths), len(t.Diameters)

	// Texts and widths.
	lenLbl := make([]string, nr)
	labelW := max(cellWidth("length"), cellWidth("hoses"))
	for i, l := range t.Lengths {
		lenLbl[i] = u.length(l)
		labelW = max(labelW, cellWidth(lenLbl[i]))
	}
	labelW += 3 // row marker "▸ " before, one space after
	// Each hose's stop level goes in its cell when four columns (or all)
	// still fit across with it (two-line cells: "h:mm 0.06" under the
	// flow); else the footer gives the selected hose's.
	withLevel := t.HasTime && labelW+min(nc, 4)*(2+len("0:00 0.00")+1) <= w
	format := func(c WhatIfCell) wiCell {
		f, tm, cls := v.cellText(c, withLevel)
		return wiCell{f, tm, cls, c.Runs && !c.Invalid}
	}
	cells := make([][]wiCell, nr)
	flowW, timeW := 0, 0
	for r := range cells {
		cells[r] = make([]wiCell, nc)
		for c := range cells[r] {
			cells[r][c] = format(t.Cells[r][c])
			flowW = max(flowW, cellWidth(cells[r][c].flow))
			timeW = max(timeW, cellWidth(cells[r][c].tm))
		}
	}
	par := make([]wiCell, len(t.Parallel))
	parFlowW := 0
	for i, p := range t.Parallel {
		par[i] = format(p.Cell)
		par[i].flow = "×" + strconv.Itoa(p.Hoses) + " " + par[i].flow
		parFlowW = max(parFlowW, cellWidth(par[i].flow))
		timeW = max(timeW, cellWidth(par[i].tm))
	}
	diaLbl := make([]string, nc)
	diaW := 0
	for i, d := range t.Diameters {
		diaLbl[i] = v.diaText(d)
		diaW = max(diaW, cellWidth(diaLbl[i]))
	}

	// A cell is a two-character marker ("▸" selected, "●" present), its
	// text and a one-cell gap. One line per row ("●60.5  1:06") when the
	// columns fit, else two lines (flow over time) when the height
	// allows.
	cellSize := func(fw, lines int) int {
		if lines == 2 || !t.HasTime {
			return 2 + max(fw, timeW, diaW) + 1
		}
		return 2 + max(fw+1+timeW, diaW) + 1
	}
	lines := 1
	if labelW+nc*cellSize(flowW, 1) > w && t.HasTime && 2*nr+5 <= h {
		lines = 2
	}
	cellW, parW := cellSize(flowW, lines), cellSize(parFlowW, lines)
	visC := max(min(nc, (w-labelW)/cellW), 1)
	visP := max(min(len(par), (w-labelW)/parW), 1)
	rowsRoom := h - 3 // title, header, footer
	if len(par) > 0 {
		rowsRoom -= lines
	}
	visR := max(min(nr, rowsRoom/lines), 1)

	// Windows keep the selection (or, from the parallel row, the present
	// choice) in view.
	onPar := v.r >= nr
	selR, selC := v.r, v.c
	if onPar {
		selR, selC = t.Row, t.Col
	}
	r0 := min(max(selR-visR/2, 0), max(nr-visR, 0))
	c0 := min(max(selC-visC/2, 0), max(nc-visC, 0))
	p0 := 0
	if onPar {
		p0 = min(max(v.c-visP/2, 0), max(len(par)-visP, 0))
	}

	v.hit = wiHit{ok: true, labelW: labelW, cellW: cellW, parW: parW, lines: lines, r0: r0, c0: c0, p0: p0,
		visR: visR, visC: visC, visP: visP, nPar: len(par)}

	cv := newDrawCanvas(w, h)
	title := "What-if · flow " + u.flowName
	to := v.levelNum(t.Common) + " " + u.lenName
	if t.HasTime {
		title += " · h:mm to " + to
		if withLevel {
			title += " · stop level (" + u.lenName + ")"
		}
	}
	title += " · ● now"
	if cellWidth(title) > w {
		title = "What-if · " + u.flowName
		if t.HasTime {
			title += " · h:mm to " + to
			if withLevel {
				title += " · stop (" + u.lenName + ")"
			}
		}
	}
	cv.text(0, 0, clip(title, w), clsTitle)

	// Header: diameters across, the selected column marked "▾".
	cv.text(0, 1, "length", clsMuted)
	for j := 0; j < visC; j++ {
		c := c0 + j
		mark := "  "
		if c == v.c && !onPar {
			mark = "▾ "
		}
		cls := clsMuted
		if c == t.Col {
			cls = clsText
		}
		cv.text(labelW+j*cellW, 1, mark+diaLbl[c], cls)
	}

	put := func(x, y, cw int, ct wiCell, now, sel bool) {
		mark := []rune("  ")
		if sel {
			mark[0] = '▸'
		}
		if now {
			mark[1] = '●'
		}
		first, second := string(mark)+ct.flow, "  "+ct.tm
		if lines == 1 && t.HasTime {
			if ct.runs || ct.tm == "" {
				first += strings.Repeat(" ", max(cw-3-cellWidth(first)-cellWidth(ct.tm)+1, 1)) + ct.tm
			} else {
				first = string(mark) + "✗ no run"
			}
		}
		cls := ct.cls
		if sel && v.focused {
			// Reversed colours over the whole cell, with the ▸ marker:
			// legible without colour.
			pad := func(s string) string { return s + strings.Repeat(" ", max(cw-1-cellWidth(s), 0)) }
			first, second, cls = pad(first), pad(second), clsSelected
		}
		cv.text(x, y, clip(first, cw-1), cls)
		if lines == 2 {
			cv.text(x, y+1, clip(second, cw-1), cls)
		}
	}
	y := 2
	for i := 0; i < visR; i++ {
		r := r0 + i
		mark := "  "
		if r == v.r {
			mark = "▸ "
		}
		cls := clsMuted
		if r == t.Row {
			cls = clsText
		}
		cv.text(0, y, mark+lenLbl[r], cls)
		for j := 0; j < visC; j++ {
			c := c0 + j
			put(labelW+j*cellW, y, cellW, cells[r][c], r == t.Row && c == t.Col, r == v.r && c == v.c)
		}
		y += lines
	}
	if len(par) > 0 {
		mark := "  "
		if onPar {
			mark = "▸ "
		}
		cv.text(0, y, mark+"hoses", clsMuted)
		for j := 0; j < min(len(par), visP); j++ {
			pc := p0 + j
			put(labelW+j*parW, y, parW, par[pc], t.Parallel[pc].Hoses == t.Hoses, onPar && pc == v.c)
		}
	}

	// Footer: what Enter adopts.
	if m, ok := v.Selected(); ok {
		f := "enter: use " + u.length(m.Length) + " × " + v.diaText(m.Diameter)
		if m.Hoses > 1 {
			f += " × " + strconv.Itoa(m.Hoses) + " hoses"
		}
		c := v.selectedCell()
		switch {
		case c.Invalid:
			f += " (does not fit the route)"
		case !c.Runs:
			f += " (✗ will not run)"
		case t.HasTime && !c.Drains:
			f += " (does not lower the level: " + present.StopShort(calc.StopReason(c.StopReason)) + ")"
		case t.HasTime && c.StopReason != "":
			f += " (stops at " + u.length(c.Level) + ": " + present.StopShort(calc.StopReason(c.StopReason)) + ")"
		}
		if !v.focused {
			f = "select this pane to pick a hose"
		}
		cv.text(0, h-1, clip(f, w), clsMuted)
	}
	return cv.render(&v.styles)
}

// selectedCell is the selected alternative's outcome.
func (v *WhatIfView) selectedCell() WhatIfCell {
	t := v.t
	if v.r >= len(t.Lengths) {
		if len(t.Parallel) == 0 {
			return WhatIfCell{}
		}
		return t.Parallel[min(v.c, len(t.Parallel)-1)].Cell
	}
	return t.Cells[v.r][v.c]
}

// levelNum is a stop level as a cell shows it: the number in the table's
// length unit (named in the title).
func (v *WhatIfView) levelNum(si float64) string {
	return strconv.FormatFloat(finite(si)/v.units.lenPer, 'f', 2, 64)
}

// diaText is a bore as the table shows it: "25 mm" (nominal bores without
// a trailing ".0"), "1.50 in".
func (v *WhatIfView) diaText(d float64) string {
	num, unit := model.FormatParts(model.DimDiameter, finite(d), v.units.sys)
	return strings.TrimSuffix(num, ".0") + " " + unit
}
