package tui

import (
	"reflect"
	"slices"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

// sideGeometry is the Side view's picture in metres on the plan's datum
// (the tank floor with a tank, the source surface without one), read from
// the plan's typed heights when the pane is shown (geometryOf), with the
// plan's one crest status. The labels give every height from the source
// surface at the start, as the Result pane gives the crest's (elev).
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

	// HasStop: a drain plan; Stop is the source level where it stops, for
	// StopReason.
	HasStop    bool
	Stop       float64
	StopReason calc.StopReason
	// HasAirStarts: the plan reports the level at which air starts to be
	// drawn in at the intake (AirStarts, m).
	HasAirStarts bool
	AirStarts    float64

	// Receiver: a transfer into a receiving vessel whose floor stands at
	// RecvFloor, RecvHeight tall (floor to brim) and RecvWidth across; its
	// level rises from RecvLevel at the start to RecvStop at the stop
	// (elevations, m). HoseEnd is the hose's open end inside it.
	Receiver                         bool
	RecvFloor, RecvHeight, RecvWidth float64
	RecvLevel, RecvStop, HoseEnd     float64

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
	if d := p.Drain; d != nil {
		sg.HasStop, sg.Stop, sg.StopReason = true, float64(d.StopLevel), d.StopReason
		if v := float64(d.AirStartsLevel); v > 0 {
			sg.HasAirStarts, sg.AirStarts = true, v
		}
		if rc := p.Receiver; rc != nil && rc.Tank != nil {
			h := rc.Tank.Height()
			sg.Receiver = true
			sg.RecvFloor, sg.RecvHeight = float64(rc.Floor), float64(h)
			sg.RecvWidth = float64(calc.TankWidth(rc.Tank, h))
			sg.RecvLevel = float64(rc.Floor + rc.Level)
			sg.RecvStop = float64(rc.Floor + d.ReceiverLevel)
			sg.HoseEnd = float64(p.DrainIn.Siphon.Geometry.Outlet)
		}
	}
	return sg.sanitize()
}

// same reports whether two pictures are the same.
func (g sideGeometry) same(o sideGeometry) bool {
	if !slices.Equal(g.CrestSays, o.CrestSays) {
		return false
	}
	g.CrestSays, o.CrestSays = nil, nil
	return reflect.DeepEqual(g, o)
}

// sanitize replaces non-finite numbers with 0 and negative sizes with 0.
func (g sideGeometry) sanitize() sideGeometry {
	for _, p := range []*float64{&g.TankHeight, &g.TankWidth, &g.Level, &g.Intake, &g.Crest,
		&g.Outlet, &g.Target, &g.Stop, &g.AirStarts, &g.RecvFloor, &g.RecvHeight, &g.RecvWidth,
		&g.RecvLevel, &g.RecvStop, &g.HoseEnd, &g.WorkingLimit, &g.TheoreticalLimit} {
		*p = finite(*p)
	}
	g.TankHeight = max(g.TankHeight, 0)
	g.TankWidth = max(g.TankWidth, 0)
	g.RecvHeight = max(g.RecvHeight, 0)
	g.RecvWidth = max(g.RecvWidth, 0)
	if g.TankHeight == 0 {
		g.Tank = false
	}
	if g.RecvHeight == 0 {
		g.Receiver = false
	}
	return g
}

// SideView draws the siphon to scale from its heights: tank (or source pit)
// with its level, where the drain stops and where air starts, the intake,
// the up-leg, the crest, the down-leg to a free outlet, under a receiving
// surface or into a receiving vessel whose level rises, and the working and
// theoretical crest-limit lines, each labelled with its height from the
// source surface. Heights are to scale; widths follow
// from the same scale (a cell is taken as twice as tall as it is wide) and
// are squeezed when the pane is too narrow. It has no keys of its own.
type SideView struct {
	w, h    int
	geo     sideGeometry
	scale   svScale // the vertical scale of the last drawing, kept while it fits
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

// Show draws the last valid plan in the job's unit system; the same
// picture in the same units is not drawn again.
func (v *SideView) Show(st *screenState) {
	units := v.units.sys != st.job.Units
	if units {
		v.units = newDrawUnits(st.job.Units)
	}
	if !st.hasPlan {
		if v.has || units {
			v.has = false
			v.redraw()
		}
		return
	}
	g := geometryOf(st.plan, st.sheet)
	if v.has && !units && g.same(v.geo) {
		return
	}
	v.setGeometry(g)
}

// View returns the frame drawn at the last change: exactly w×h cells.
func (v SideView) View() string { return v.frame }
