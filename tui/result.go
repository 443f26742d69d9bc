package tui

import (
	"strings"

	"charm.land/lipgloss/v2"

	"drawdown/model/present"
)

// ResultPane shows the answer first: the verdict as a word and a symbol,
// then flow, velocity and regime, time to the stop and why, the crest
// against its three limits with the margin, warnings and priming. Every
// word and figure comes from the plan's present.Sheet; the pane only lays
// them out.
type ResultPane struct {
	sheet present.Sheet
	// stale: the inputs have an error; the sheet is the last valid one.
	// problem names the first invalid field.
	stale   bool
	problem string
	w, h    int
	styles  Styles
	lines   []string // rendered on every change
	frame   string   // the framed pane, rendered on every change; View returns it
}

// NewResultPane returns an empty Result pane.
func NewResultPane(st Styles) ResultPane { return ResultPane{styles: st} }

// SetSize sets the outer size (border included).
func (r *ResultPane) SetSize(w, h int) { r.w, r.h = max(w, 0), max(h, 0); r.render() }

// SetStyles replaces the styles.
func (r *ResultPane) SetStyles(st Styles) { r.styles = st; r.render() }

// SetSheet gives the pane the sheet of the last valid plan; stale marks it
// as kept while problem (the first invalid field) blocks a new one.
func (r *ResultPane) SetSheet(s present.Sheet, stale bool, problem string) {
	r.sheet, r.stale, r.problem = s, stale, problem
	r.render()
}

// Sheet returns what the pane shows (for tests).
func (r ResultPane) Sheet() present.Sheet { return r.sheet }

// Stale reports whether the pane shows the last valid plan while an input
// is invalid.
func (r ResultPane) Stale() bool { return r.stale }

func (r *ResultPane) render() {
	// On a short pane the rows that only refine an answer go first (the
	// ranges, then the crest's zero-flow and this-flow limits), so that
	// every warning and caution stays on screen.
	for tight := 0; tight <= 2; tight++ {
		r.lines = r.content(tight)
		if len(r.lines) <= r.h-2 {
			break
		}
	}
	r.frame = r.framed()
}

// labelW is the width of the label column.
const labelW = 9

// content is the pane's lines; tight 1 leaves out the flow and time
// ranges, tight 2 also the crest's zero-flow and this-flow limits. Its
// cyclomatic complexity (~27) is one condition per optional row, in the
// order the rows are drawn.
func (r *ResultPane) content(tight int) []string {
	st := r.styles
	s := r.sheet
	iw := max(r.w-4, 8) // inside the border and one space each side
	var ls []string
	add := func(line string) { ls = append(ls, line) }
	row := func(label, value string) {
		add(st.fast.Muted.Render(padRight(label, labelW)) + st.fast.Value.Render(value))
	}
	if !s.Valid {
		add(st.fast.Warning.Render("? NO RESULT YET"))
		// the field may be on another pane: name it with its pane, and
		// leave room for the accepted range
		for _, l := range wrapText("Fix "+r.problem+" (marked ✗ in its pane)", iw, 6) {
			add(st.fast.Warning.Render(l))
		}
		return ls
	}
	v := s.Verdict
	word := v.Word
	if r.stale {
		word += " (last valid)"
	}
	vp := st.fastStyle(v.Status)
	add(vp.Render(v.Status.Symbol() + " " + word))
	if v.Reason != "" {
		for _, l := range wrapText(v.Reason, iw-2, 2) {
			add(vp.Render("  " + l))
		}
	}
	if s.Fix != "" {
		for i, l := range wrapText("→ "+s.Fix, iw, 3) {
			if i > 0 {
				l = "  " + l
			}
			add(vp.Render(l))
		}
	}
	if s.Runs {
		add(st.fast.Muted.Render(padRight("Flow", labelW)) + st.fast.Big.Render(s.Flow))
		switch {
		case tight >= 1:
		case s.RangesPending:
			row("  range", rangePending)
		case s.FlowRange != "":
			row("  range", s.FlowRange)
		}
		row("Speed", s.Speed)
		if s.FlowTest.Short != "" {
			r.line(&ls, s.FlowTest, iw, 2)
		}
	}
	if d := s.Drain; d != nil {
		drainRows(d, tight, iw, s.RangesPending, row)
	}
	if s.Throttle != "" {
		row("Throttle", s.ThrottleShort)
	}
	c := s.Crest
	row("Crest", "lift "+c.Lift)
	lim := func(label, value string) {
		add(st.fast.Muted.Render("  "+padRight(label, 17)) + st.fast.Value.Render(value))
	}
	if tight < 2 {
		lim("limit, no flow", c.NoFlow)
		if c.ShowThisFlow {
			lim("limit, this flow", c.ThisFlow)
		}
	}
	lim("working limit", c.Working)
	add(st.fast.Muted.Render("  "+padRight("margin", 17)) + st.fastStyle(c.Status).Render(c.Margin+" "+c.Status.Symbol()))
	row("Prime", s.Prime)
	if s.HazardLine != "" {
		r.line(&ls, present.Line{Status: present.Warn, Short: s.HazardLine}, iw, 3)
	}
	for _, w := range s.Warnings {
		if w.Decides {
			continue
		}
		r.line(&ls, w.Line, iw, 2)
	}
	for _, h := range s.Hints {
		r.line(&ls, h, iw, 2)
	}
	// On a taller pane: the working figures and the assumptions.
	if room := r.h - 2 - len(ls); room >= 4 && s.Runs {
		extra := []string{"",
			st.fast.Muted.Render(padRight("Details", labelW)) + st.fast.Value.Render("head "+s.Head),
			st.fast.Muted.Render(padRight("", labelW)) + st.fast.Value.Render("Re "+s.Reynolds+", f "+s.Friction),
			st.fast.Muted.Render(padRight("", labelW)) + st.fast.Value.Render("crest "+s.CrestPressure),
		}
		for _, n := range s.Notes {
			for i, l := range wrapText(n, iw-2, 2) {
				p := "· "
				if i > 0 {
					p = "  "
				}
				extra = append(extra, st.fast.Muted.Render(p+l))
			}
		}
		ls = append(ls, extra[:min(len(extra), room)]...)
	}
	return ls
}

// line adds one worded finding, its symbol first, wrapped to n lines.
func (r *ResultPane) line(ls *[]string, l present.Line, iw, n int) {
	p := r.styles.fastStyle(l.Status)
	for i, t := range wrapText(l.Status.Symbol()+" "+l.Short, iw, n) {
		if i > 0 {
			t = "  " + t
		}
		*ls = append(*ls, p.Render(t))
	}
}

// View returns the framed pane, exactly w×h cells.
func (r ResultPane) View() string { return r.frame }

func (r ResultPane) framed() string {
	if r.w < 3 || r.h < 3 {
		return fitBlock(nil, r.w, r.h)
	}
	// The frame is drawn by hand (one styled string per side) rather than
	// with a lipgloss border: this runs on every keystroke.
	b := r.styles.Border.GetBorderStyle()
	mute := r.styles.fast.Muted
	title := r.styles.fast.PaneTitle.Render(" Result ")
	rest := max(r.w-3-lipgloss.Width(title), 0)
	out := make([]string, 0, r.h)
	out = append(out, mute.Render(b.TopLeft+b.Top)+title+mute.Render(strings.Repeat(b.Top, rest)+b.TopRight))
	left, right := mute.Render(b.Left), mute.Render(b.Right)
	body := prefixAll(r.lines, " ")
	if r.stale && r.sheet.Valid && r.h-2 >= 4 {
		// The stale notice sits at the foot of the pane, so that the
		// figures above it do not move when a field turns invalid.
		foot := []string{" " + r.styles.fast.Stale.Render(" ! STALE: fix the ✗ field "),
			" " + r.styles.fast.Warning.Render(clip("✗ "+r.problem, r.w-4))}
		n := r.h - 2 - len(foot)
		if len(body) > n {
			body = body[:n]
		}
		for len(body) < n {
			body = append(body, "")
		}
		body = append(body, foot...)
	}
	inner := strings.Split(fitBlock(body, r.w-2, r.h-2), "\n")
	for _, l := range inner {
		out = append(out, left+l+right)
	}
	out = append(out, mute.Render(b.BottomLeft+strings.Repeat(b.Bottom, r.w-2)+b.BottomRight))
	return strings.Join(out, "\n")
}

func prefixAll(ls []string, p string) []string {
	out := make([]string, len(ls))
	for i, l := range ls {
		out[i] = p + l
	}
	return out
}

// drainRows are the Result's drain lines: when it stops (or spills), the
// time's range, why and where it stops, the inflow, what is left and what a
// pump takes to finish it, and the air at the intake.
func drainRows(d *present.Drain, tight, iw int, pending bool, row func(label, value string)) {
	switch {
	case d.Overflows:
		row("Spills", "in "+d.Time)
	case d.AtOnce:
		row("Stops", "at once: nothing to drain")
	default:
		row("Stops in", d.Time)
	}
	switch {
	case tight >= 1:
	case pending:
		row("  range", rangePending)
	case d.TimeRange != "":
		row("  range", d.TimeRange)
	}
	fc := d.Forecast
	row("", d.StopShort)
	row("", "at "+d.StopLevel+" off the floor")
	if fc.InflowShort != "" {
		row("Inflow", fc.InflowShort)
		if fc.Settles != "" {
			row("", fc.Settles)
		} else {
			row("", "siphon keeps up")
		}
	}
	row("", d.Residual+" left in it")
	if fc.Pump != "" && tight < 1 {
		for _, l := range wrapText(fc.Pump, iw-labelW, 2) {
			row("", l)
		}
	}
	if d.AirShort != "" {
		row("", d.AirShort)
	}
}

// rangePending stands in a range row while a field is typed in: the ranges
// plan the drain a dozen times, so they wait for the typing to end.
const rangePending = "worked out on enter"
