package tui

// Minimum terminal size for the full layout (form and Result side by
// side). Below it, down to NarrowMinWidth×NarrowMinHeight (a phone's SSH
// client in portrait), the narrow layout shows one pane at a time under an
// always-visible verdict line.
const (
	MinWidth  = 80
	MinHeight = 24

	NarrowMinWidth  = 40
	NarrowMinHeight = 20
)

// Wide layout: from this size the side view sits beside the result and a
// lower view fills the bottom.
const (
	wideWidth  = 120
	wideHeight = 36
)

// resultWidth is the outer width (border included) of the Result pane.
const (
	resultWidth     = 36
	resultWidthWide = 40
	formWidthWide   = 52
)

// rect is a region of the screen, in cells.
type rect struct{ X, Y, W, H int }

// layout is the measured arrangement of the panes for one terminal size.
// Heights of the fixed rows come from what is drawn there (one line each);
// everything else is derived, never counted by hand elsewhere.
type layout struct {
	W, H     int
	TooSmall bool
	Wide     bool
	// Narrow: one column, one pane at a time (the Result is a pane of its
	// own), the verdict on its own line under the header.
	Narrow bool

	Header  rect // job, mode, save state
	Verdict rect // narrow only: the verdict, flow and time on one line
	Tabs    rect // pane selector
	Main    rect // compact: the active pane; wide: the active form
	Result  rect // always on screen, right of Main
	Side    rect // wide only: side view beside the result
	Lower   rect // wide only: the selected lower view
	Help    rect // one help line
}

// newLayout measures the panes for a w×h terminal.
func newLayout(w, h int) layout {
	l := layout{W: w, H: h}
	if w < NarrowMinWidth || h < NarrowMinHeight {
		l.TooSmall = true
		return l
	}
	if w < MinWidth || h < MinHeight {
		l.Narrow = true
		l.Header = rect{0, 0, w, 1}
		l.Verdict = rect{0, 1, w, 1}
		l.Tabs = rect{0, 2, w, 1}
		l.Help = rect{0, h - 1, w, 1}
		l.Main = rect{0, 3, w, h - 4}
		l.Result = l.Main
		return l
	}
	l.Header = rect{0, 0, w, 1}
	l.Tabs = rect{0, 1, w, 1}
	l.Help = rect{0, h - 1, w, 1}
	bodyY := 2
	bodyH := h - bodyY - l.Help.H
	if w >= wideWidth && h >= wideHeight {
		l.Wide = true
		topH := clamp(bodyH*55/100, 18, 24)
		l.Main = rect{0, bodyY, formWidthWide, topH}
		l.Result = rect{formWidthWide, bodyY, resultWidthWide, topH}
		sideX := formWidthWide + resultWidthWide
		l.Side = rect{sideX, bodyY, w - sideX, topH}
		l.Lower = rect{0, bodyY + topH, w, bodyH - topH}
		return l
	}
	l.Main = rect{0, bodyY, w - resultWidth, bodyH}
	l.Result = rect{w - resultWidth, bodyY, resultWidth, bodyH}
	return l
}

func clamp(v, lo, hi int) int {
	if v < lo {
		return lo
	}
	if v > hi {
		return hi
	}
	return v
}
