package tui

import (
	"math"

	"charm.land/lipgloss/v2"
	"strconv"
	"strings"

	"drawdown/calc"
	"drawdown/model"
)

// ResultData is what the Result pane shows, taken from the last good plan
// of model.Compute (see planToResult in app.go). All values are SI and
// finite; the pane only formats them.
type ResultData struct {
	Valid bool // a plan exists at all

	// Stale: the inputs have an error; the figures are from the last valid
	// inputs. StaleField names the first invalid field.
	Stale      bool
	StaleField string

	Verdict calc.Verdict
	Why     string // short reason for WILL NOT RUN / NEAR LIMIT

	Flow, FlowLow, FlowHigh float64 // m³/s, all hoses
	HasBand                 bool
	Hoses                   int
	Velocity                float64 // m/s
	Regime                  string
	Reynolds                float64
	Friction                float64 // Darcy f
	Head                    float64 // driving head, m
	CrestPressure           float64 // absolute, while flowing, Pa
	// Notes are the assumptions the plan made (model.Plan.Notes), shown
	// when the pane has room.
	Notes []string

	HasDrain           bool
	Time               float64 // s to the stop
	TimeLow, TimeHigh  float64 // s
	StopReason         string  // target, intake, crest, equal
	StopLevel          float64 // m above the floor
	Residual           float64 // m³ left in the tank
	Volume             float64 // m³ moved
	CrestLimitLevel    float64 // m; level at which the crest limit is reached
	HasCrestLimitLevel bool

	Lift                                 float64 // m, crest above the surface
	MaxCrest, FlowingLimit, WorkingLimit float64 // m above the surface
	Margin                               float64 // working limit − lift, m

	PrimingVolume float64 // m³
	Strokes       int     // hand-pump strokes, 0 when no stroke volume
	Warnings      []WarnLine
	// Hazards are short words for the liquid's hazards ("flammable",
	// "inspect before release"); the caution line points to the Checklist.
	Hazards []string
}

// WarnLine is one warning as the Result pane shows it.
type WarnLine struct {
	Status Status
	Text   string
}

// ResultPane shows the answer first: the verdict as a word and a symbol,
// then flow, velocity and regime, time to the stop and why, the crest
// against its three limits with the margin, warnings and priming.
type ResultPane struct {
	data   ResultData
	sys    model.System
	w, h   int
	styles Styles
	lines  []string // rendered on every change
	frame  string   // the framed pane, rendered on every change; View returns it
}

// NewResultPane returns an empty Result pane.
func NewResultPane(st Styles) ResultPane { return ResultPane{styles: st} }

// SetSize sets the outer size (border included).
func (r *ResultPane) SetSize(w, h int) { r.w, r.h = max(w, 0), max(h, 0); r.render() }

// SetStyles replaces the styles.
func (r *ResultPane) SetStyles(st Styles) { r.styles = st; r.render() }

// SetData gives the pane a new result in the unit system sys.
func (r *ResultPane) SetData(d ResultData, sys model.System) {
	r.data, r.sys = d, sys
	r.render()
}

// Data returns what the pane shows (for tests).
func (r ResultPane) Data() ResultData { return r.data }

// verdictText is the verdict as a word with its symbol and status.
func verdictText(v calc.Verdict) (string, Status) {
	switch v {
	case calc.Runs:
		return "RUNS", StatusOK
	case calc.RunsNearLimit:
		return "RUNS — NEAR LIMIT", StatusWarn
	case calc.RunsChoked:
		return "RUNS — CHOKED", StatusWarn
	case calc.WillNotRun:
		return "WILL NOT RUN", StatusBad
	}
	return "UNKNOWN", StatusWarn
}

func (r *ResultPane) render() {
	r.lines = r.content()
	r.frame = r.framed()
}

func (r *ResultPane) content() []string {
	st := r.styles
	d := r.data
	iw := max(r.w-4, 8) // inside the border and one space each side
	f := func(dim model.Dim, v float64) string { return model.Format(dim, finite(v), r.sys) }
	var ls []string
	add := func(s string) { ls = append(ls, s) }
	row := func(label, value string) {
		add(st.fast.Muted.Render(padRight(label, 9)) + st.fast.Value.Render(value))
	}
	if !d.Valid {
		add(st.fast.Warning.Render("? NO RESULT YET"))
		for _, l := range wrapText("Fix the field marked ✗ on the left: "+d.StaleField, iw, 3) {
			add(st.fast.Warning.Render(l))
		}
		return ls
	}
	word, status := verdictText(d.Verdict)
	if d.Stale {
		word += " (last valid)"
	}
	add(st.fastStyle(status).Render(status.Symbol() + " " + word))
	if d.Why != "" && d.Verdict != calc.Runs {
		for _, l := range wrapText(d.Why, iw-2, 2) {
			add(st.fastStyle(status).Render("  " + l))
		}
	}
	if d.Verdict != calc.WillNotRun {
		flow := f(model.DimFlow, d.Flow)
		if d.Hoses > 1 {
			flow += " (" + strconv.Itoa(d.Hoses) + " hoses)"
		}
		add(st.fast.Muted.Render(padRight("Flow", 9)) + st.fast.Big.Render(flow))
		if d.HasBand {
			row("  range", rangeText(f(model.DimFlow, d.FlowLow), f(model.DimFlow, d.FlowHigh)))
		}
		row("Speed", speedText(r.sys, d.Velocity)+", "+d.Regime)
	}
	if d.HasDrain && d.Verdict != calc.WillNotRun {
		if d.Time < 0.5 {
			row("Stops", "at once: nothing to drain")
		} else {
			row("Stops in", model.FormatDuration(d.Time))
		}
		if d.TimeHigh > 0 && d.TimeLow > 0 && math.Abs(d.TimeHigh-d.TimeLow) > 1 {
			row("  range", rangeText(model.FormatDuration(d.TimeLow), model.FormatDuration(d.TimeHigh)))
		}
		row("", stopReasonText(d.StopReason))
		row("", "at "+f(model.DimLength, d.StopLevel)+", "+f(model.DimVolume, d.Residual)+" left")
	}
	row("Crest", "lift "+f(model.DimLength, d.Lift))
	lim := func(label string, v float64) {
		add(st.fast.Muted.Render("  "+padRight(label, 17)) + st.fast.Value.Render(f(model.DimLength, v)))
	}
	lim("limit, no flow", d.MaxCrest)
	if d.Verdict != calc.WillNotRun || d.FlowingLimit > 0 {
		lim("limit, this flow", d.FlowingLimit)
	}
	lim("working limit", d.WorkingLimit)
	mst := StatusOK
	if d.Margin < 0 {
		mst = StatusBad
		if d.Lift <= d.FlowingLimit {
			mst = StatusWarn
		}
	}
	sign := "+"
	if d.Margin < 0 {
		sign = "−"
	}
	add(st.fast.Muted.Render("  "+padRight("margin", 17)) +
		st.fastStyle(mst).Render(sign+f(model.DimLength, math.Abs(d.Margin))+" "+mst.Symbol()))
	prime := f(model.DimVolume, d.PrimingVolume)
	if d.Strokes > 0 {
		prime += ", " + strconv.Itoa(d.Strokes) + " strokes"
	}
	row("Prime", prime)
	if len(d.Hazards) > 0 {
		text := "! " + strings.Join(d.Hazards, ", ") + ": see the Checklist (8). Local codes and permits govern."
		for i, l := range wrapText(text, iw-2, 3) {
			if i > 0 {
				l = "  " + l
			}
			add(st.fast.Warning.Render(l))
		}
	}
	for _, w := range d.Warnings {
		for i, l := range wrapText(w.Status.Symbol()+" "+w.Text, iw, 2) {
			if i > 0 {
				l = "  " + l
			}
			add(st.fastStyle(w.Status).Render(l))
		}
	}
	// On a taller pane: the working figures and the assumptions.
	if room := r.h - 2 - len(ls); room >= 4 && d.Verdict != calc.WillNotRun {
		extra := []string{"",
			st.fast.Muted.Render(padRight("Details", 9)) + st.fast.Value.Render("head "+f(model.DimLength, d.Head)),
			st.fast.Muted.Render(padRight("", 9)) + st.fast.Value.Render("Re "+strconv.FormatFloat(finite(d.Reynolds), 'f', 0, 64)+
				", f "+strconv.FormatFloat(finite(d.Friction), 'f', 4, 64)),
			st.fast.Muted.Render(padRight("", 9)) + st.fast.Value.Render("crest "+f(model.DimPressure, d.CrestPressure)+" abs"),
		}
		for _, n := range d.Notes {
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
	if r.data.Stale && r.data.Valid && r.h-2 >= 4 {
		// The stale notice sits at the foot of the pane, so that the
		// figures above it do not move when a field turns invalid.
		foot := []string{" " + r.styles.fast.Stale.Render(" ! STALE: fix the ✗ field "),
			" " + r.styles.fast.Warning.Render(ansiCut("✗ "+r.data.StaleField, r.w-4))}
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

func finite(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

func rangeText(lo, hi string) string {
	if lo == hi {
		return lo
	}
	// Share the unit when both ends are one number and the same unit
	// ("60.4–100 L/min", but "22 min – 1 h 36 min").
	li, hi2 := strings.IndexByte(lo, ' '), strings.IndexByte(hi, ' ')
	if li > 0 && hi2 > 0 && lo[li:] == hi[hi2:] && strings.Count(lo, " ") == 1 {
		return lo[:li] + "–" + hi
	}
	return lo + " – " + hi
}

func trimNum(v float64, dec int) string {
	return strconv.FormatFloat(finite(v), 'f', dec, 64)
}

// speedText shows a velocity in m/s or ft/s (velocity is not a model Dim;
// 1 ft = 0.3048 m exactly, NIST SP 811 B.8).
func speedText(sys model.System, v float64) string {
	if sys == model.US {
		return trimNum(v/0.3048, 1) + " ft/s"
	}
	return trimNum(v, 2) + " m/s"
}

// stopReasonText says why the drain stops.
func stopReasonText(r string) string {
	switch r {
	case "target":
		return "target level reached"
	case "intake":
		return "intake draws air"
	case "crest":
		return "crest limit reached"
	case "equal":
		return "levels equal, flow tapers off"
	case "receiver_full":
		return "receiver full"
	case "":
		return "end of plan"
	}
	return r
}

func ansiCut(s string, w int) string {
	if len([]rune(s)) <= w {
		return s
	}
	return string([]rune(s)[:max(w-1, 0)]) + "…"
}
