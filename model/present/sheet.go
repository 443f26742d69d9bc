package present

import (
	"strconv"
	"strings"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/presets"
)

// Sheet is what one computed plan means, worded and formatted for people in
// one unit system. Build makes it once per recompute; the screen, the
// command line's text output and the record lay it out.
type Sheet struct {
	Units model.System
	// Valid is false when the plan has no steady result (an input blocks
	// it); then only Problem is set.
	Valid   bool
	Problem string

	Verdict Verdict
	// Runs is false for WILL NOT RUN: the flow rows are then left out.
	Runs bool

	Flow      string // all hoses, e.g. "82.2 L/min (2 hoses)"
	FlowRange string // "" when the band is empty
	Speed     string // "1.21 m/s, turbulent"

	// Drain is nil without a tank, or when the siphon will not run.
	Drain *Drain

	Crest Crest
	Prime string // "13.6 L, 46 strokes"

	// Hazards are short words for the hazards the checklist is built for;
	// HazardLine the caution line that goes with them ("" without hazards).
	Hazards    []string
	HazardLine string

	Warnings []Warning
	// Hints are the trade's advice that follows from the plan (not
	// warnings): e.g. what to do when most of the tank is left.
	Hints []Line
	Notes []string // the assumptions the plan made
	// Cautions are the standing and liquid cautions (Cautions).
	Cautions []string

	// Details, for readers with room: the working figures.
	Head, Reynolds, Friction, CrestPressure string

	// Facts are the inputs as read, one labelled line each, for the
	// command line and the record.
	Facts []Fact
}

// Fact is one labelled line of the inputs as read.
type Fact struct{ Label, Text string }

// Drain is the drain plan in words.
type Drain struct {
	Shape     string // "rectangular"
	AtOnce    bool   // it stops before anything moves
	Time      string // "47 min"
	TimeRange string // "" when the band is empty
	StopShort string // StopShort of the reason
	StopLong  string // StopLong of the reason
	StopLevel string // above the floor
	Residual  string
	Volume    string
	// Receiver is the receiving vessel's level at the stop and its brim,
	// "" without a receiver.
	Receiver string
	// CrestBoils says at which level the crest would boil, "" when never.
	CrestBoils string
}

// Build words plan p in unit system sys. hz are the hazards the checklist is
// built for (the liquid's at its temperature and what the site adds).
func Build(p model.Plan, sys model.System, hz presets.Hazards) Sheet {
	f := Figures{Sys: sys}
	s := Sheet{Units: sys, Valid: p.Err == nil}
	if !s.Valid {
		s.Problem = p.Err.Error()
		return s
	}
	r := p.Result
	g := p.Siphon.Geometry
	s.Verdict = VerdictOf(r)
	s.Runs = r.Verdict != calc.WillNotRun
	if s.Runs {
		s.Flow = f.Of(model.DimFlow, float64(r.Flow))
		if n := p.Siphon.Hoses; n > 1 {
			s.Flow += " (" + strconv.Itoa(n) + " hoses)"
		}
		if p.FlowHigh > p.FlowLow && p.FlowLow > 0 {
			s.FlowRange = Range(f.Of(model.DimFlow, float64(p.FlowLow)), f.Of(model.DimFlow, float64(p.FlowHigh)))
		}
		s.Speed = f.Of(model.DimVelocity, float64(r.Velocity)) + ", " + r.Regime.String()
	}
	s.Crest = CrestOf(r, g.Lift(), f)
	s.Prime = f.Of(model.DimVolume, float64(r.PrimingVolume))
	if p.PumpStrokes > 0 {
		s.Prime += ", " + strconv.Itoa(p.PumpStrokes) + " strokes"
	}
	s.Hazards = HazardWords(hz)
	s.HazardLine = HazardLine(hz)
	s.Warnings = WarningsOf(r, f)
	if d := p.Drain; d != nil && d.StopReason == calc.StopIntake && d.Residual > d.Volume {
		s.Hints = append(s.Hints, Line{Code: "most_left", Status: Info,
			Short: "most left: float a board over the intake (common practice)",
			Long:  "more is left than moved: a board or raft floated over the intake lets the level go lower (common practice)"})
	}
	s.Notes = append([]string(nil), p.Notes...)
	s.Cautions = Cautions(p)
	s.Head = f.Of(model.DimLength, float64(r.Head))
	s.Reynolds = strconv.FormatFloat(r.Reynolds, 'f', 0, 64)
	s.Friction = strconv.FormatFloat(r.FrictionFactor, 'f', 4, 64)
	s.CrestPressure = f.Of(model.DimPressure, float64(r.CrestPressure)) + " absolute"
	if s.Runs && p.Drain != nil {
		s.Drain = drainOf(p, f)
	}
	s.Facts = factsOf(p, f)
	return s
}

func drainOf(p model.Plan, f Figures) *Drain {
	d := p.Drain
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	out := &Drain{
		Shape:     strings.ReplaceAll(p.Tank.Shape(), "-", " "),
		AtOnce:    d.Time < 0.5,
		Time:      Duration(float64(d.Time)),
		StopShort: StopShort(d.StopReason),
		StopLong:  StopLong(d.StopReason),
		StopLevel: L(d.StopLevel),
		Residual:  f.Of(model.DimVolume, float64(d.Residual)),
		Volume:    f.Of(model.DimVolume, float64(d.Volume)),
	}
	if lo, hi := float64(p.TimeLow), float64(p.TimeHigh); lo > 0 && hi > 0 && hi-lo > 1 {
		out.TimeRange = Range(Duration(lo), Duration(hi))
	}
	if p.Receiver != nil {
		out.Receiver = L(d.ReceiverLevel) + " above its floor at the stop (brim " + L(p.Receiver.Tank.Height()) + ")"
	}
	if d.CrestLimitFound {
		out.CrestBoils = L(d.CrestLimitLevel)
	}
	return out
}

// factsOf lists the inputs as read: liquid, site, hose, heights, intake and
// priming.
func factsOf(p model.Plan, f Figures) []Fact {
	s := p.Siphon
	g := s.Geometry
	r := p.Result
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	site := "standard atmosphere at the site altitude"
	if p.FromBaro {
		site = "barometer reading"
	}
	hose := strconv.Itoa(s.Hoses) + " × " + f.Of(model.DimDiameter, float64(s.Hose.Diameter)) + " bore, " +
		L(s.Hose.Length) + " long, " + Clean(p.Material.Name) + " (roughness " + f.Of(model.DimRoughness, float64(s.Hose.Roughness)) +
		"), ΣK " + strconv.FormatFloat(s.Hose.KMinor(), 'f', 2, 64)
	prime := f.Of(model.DimVolume, float64(r.PrimingVolume)) + " to fill the hose"
	if s.Hoses > 1 {
		prime += "s"
	}
	if p.PumpStrokes > 0 {
		prime += ", about " + strconv.Itoa(p.PumpStrokes) + " hand-pump strokes"
	}
	return []Fact{
		{"Liquid", Clean(p.Liquid.Name) + " at " + f.Of(model.DimTemperature, float64(p.Temperature)) + ": " +
			f.Of(model.DimDensity, float64(s.Fluid.Density)) + ", " + f.Of(model.DimViscosity, float64(s.Fluid.Viscosity)) +
			", vapour pressure " + f.Of(model.DimPressure, float64(s.Fluid.VaporPressure))},
		{"Site", f.Of(model.DimPressure, float64(s.AtmPressure)) + " (" + site + ")"},
		{"Hose", hose},
		{"Heights", "lift " + L(g.Lift()) + " over the crest, drop " + L(g.Drop()) + " to the outlet, intake " +
			L(g.IntakeDepth()) + " below the surface"},
		{"Intake", "needs " + L(r.RequiredSubmergence) + " of liquid over it against vortices; it is " + L(g.IntakeDepth()) + " deep"},
		{"Priming", prime},
	}
}
