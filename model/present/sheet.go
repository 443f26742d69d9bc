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
	// Fix is what to change, with its figure ("" when it simply runs).
	Fix string
	// Runs is false for WILL NOT RUN: the flow rows are then left out.
	Runs bool

	Flow      string // all hoses, e.g. "82.2 L/min (2 hoses)"
	FlowRange string // "" when the band is empty
	// RangesPending: the plan left the ranges out while a field is typed
	// in (model.Plan.Quick); they come back when the typing ends.
	RangesPending bool
	Speed         string // "1.21 m/s, turbulent"

	// Drain is nil without a tank, or when the siphon will not run.
	Drain *Drain

	Crest Crest
	// Vacuum is the crest's gauge vacuum as hoses are rated, with the
	// hose's rating ("63 kPa (18.6 inHg); hose rated 75 kPa (22 inHg)").
	Vacuum string
	// Throttle is the outlet valve setting that holds the crest or meets
	// the permit's cap ("" when none is needed); ThrottleShort the same on
	// a narrow line.
	Throttle, ThrottleShort string
	// Intake words where air starts and where the prime is lost, above the
	// floor with a tank ("air starts 0.08 m, prime lost 0.03 m").
	Intake string
	Prime  string // "13.6 L, 46 strokes"

	// Hazards are short words for the hazards the checklist is built for;
	// HazardLine the caution line that goes with them ("" without hazards).
	Hazards    []string
	HazardLine string

	Warnings []Warning
	// FlowTest compares the flow tests with the plan (zero Line without
	// tests).
	FlowTest Line
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

// Fact returns the text of the fact labelled label ("" when there is none).
func (s Sheet) Fact(label string) string {
	for _, x := range s.Facts {
		if x.Label == label {
			return x.Text
		}
	}
	return ""
}

// Fact is one labelled line of the inputs as read.
type Fact struct{ Label, Text string }

// Drain is the drain plan in words.
type Drain struct {
	Shape  string // "rectangular"
	AtOnce bool   // it stops before anything moves
	// Overflows: the inflow outruns the siphon and the level rises to the
	// brim; Time is then the time until it spills.
	Overflows bool
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
	// AirStarts and PrimeLost are the levels above the floor where air
	// starts to be drawn in and the intake loses its prime; Gulping what
	// the gulping between them costs ("" when the plan stops before air
	// starts); TargetNote a word when the target lies below prime lost.
	AirStarts, PrimeLost, Gulping, TargetNote string
	// AirShort is the gulping on a narrow line ("" when it does not gulp).
	AirShort string
	// AirGathers, Chokes and Collapses are the levels below which air
	// gathers at the crest, the siphon runs choked and the hose may
	// flatten ("" when never).
	AirGathers, Chokes, Collapses string
	// Forecast is the inflow, the slow tail, the range's driver and a
	// pump to finish.
	Forecast Forecast
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
	s.Fix = FixOf(r, p.Liquid, f)
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
		s.RangesPending = p.Quick
	}
	s.Crest = CrestOf(r, g.Lift(), f)
	s.Vacuum = crestVacuumText(r, f)
	if r.HasOutletThrottle {
		k := strconv.FormatFloat(r.OutletThrottleK, 'f', 1, 64)
		s.Throttle = "outlet valve K " + k + " (part-closed at the outlet only)"
		s.ThrottleShort = "outlet valve K " + k
		if r.MaxFlowThrottleK > 0 {
			s.Throttle = "outlet valve K " + k + " meets the permit's maximum rate at the start (part-closed at the outlet only)"
		}
	}
	s.Intake = intakeLevels(p, f)
	s.FlowTest = TestLine(p, f)
	s.Prime = f.Of(model.DimVolume, float64(r.PrimingVolume))
	if p.PumpStrokes > 0 {
		s.Prime += ", " + strconv.Itoa(p.PumpStrokes) + " strokes"
	}
	s.Hazards = HazardWords(hz)
	s.HazardLine = HazardLine(hz)
	s.Warnings = WarningsOf(r, f)
	if s.Runs {
		s.Hints = hintsOf(p, f)
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
	out.AirStarts, out.PrimeLost = L(d.AirStartsLevel), L(d.PrimeLostLevel)
	if d.GulpTime > 0 {
		out.Gulping = "gulps air for the last " + Duration(float64(d.GulpTime)) + ", which costs " + Duration(float64(d.GulpTimeLost))
		out.AirShort = "gulps air below " + out.AirStarts + " (+" + Duration(float64(d.GulpTimeLost)) + ")"
	}
	if d.TargetBelowPrimeLost {
		out.TargetNote = "the target is below where the intake loses its prime: the drain stops above it"
	}
	if d.AirGatherFound {
		out.AirGathers = L(d.AirGatherLevel)
	}
	if d.ChokeFound {
		out.Chokes = L(d.ChokeLevel)
	}
	if d.CollapseFound {
		out.Collapses = L(d.CollapseLevel)
	}
	out.Forecast = forecastOf(p, f)
	if d.Overflows {
		out.Overflows = true
		out.StopShort = "inflow outruns it: spills over"
		out.StopLong = "the inflow outruns the siphon: the level rises to the brim and spills over"
	}
	return out
}

// crestVacuumText is the crest's gauge vacuum with the hose's rating.
func crestVacuumText(r calc.Result, f Figures) string {
	s := Vacuum(r.CrestVacuum, f.Sys) + " at the crest; worst " + Vacuum(r.HoseVacuumWorst, f.Sys)
	switch {
	case !r.HoseRated:
		return s + "; hose not rated"
	case r.HoseVacuumRating <= 0:
		return s + "; the hose holds none (it flattens)"
	}
	return s + "; hose rated " + Vacuum(r.HoseVacuumRating, f.Sys)
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
		"), " + lossesText(s)
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
		{"Intake", intakeName(p) + ": " + intakeLevels(p, f) + " (face velocity " + f.Of(model.DimVelocity, float64(r.FaceVelocity)) + ")"},
		{"Vacuum", crestVacuumText(r, f)},
		{"Priming", prime},
	}
}

// lossesText words the minor losses: ΣK before the crest (the intake's own
// included) and after it.
func lossesText(s calc.Siphon) string {
	k := func(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }
	h := s.Hose
	return "ΣK " + k(h.KEntrance+s.Intake.K+h.KUpLeg) + " before the crest, " + k(h.KDownLeg+h.OutletK) + " after"
}

// intakeLevels words where air starts to be drawn in and where the prime is
// lost: with a drain, the levels the falling surface meets them at (the flow
// has slowed by then, so they lie lower than at the start); else at the
// present flow, as the depth of liquid over the top of the intake's opening.
func intakeLevels(p model.Plan, f Figures) string {
	r := p.Result
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	if d := p.Drain; d != nil {
		return "air starts at " + L(d.AirStartsLevel) + ", prime lost at " + L(d.PrimeLostLevel) + " above the floor as the drain slows"
	}
	return "air starts with " + L(max(r.AirStartsLevel-r.IntakeTop, 0)) + " over the opening, prime lost with " +
		L(max(r.PrimeLostLevel-r.IntakeTop, 0)) + " over it"
}

// hintsOf is the trade's advice that follows from where the drain stops.
func hintsOf(p model.Plan, f Figures) []Line {
	d := p.Drain
	if d == nil {
		return nil
	}
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	if l, ok := inflowHint(p, f); ok {
		return []Line{l}
	}
	switch {
	case d.StopReason == calc.StopAir && p.BoardDrain != nil && p.BoardDrain.Volume > d.Volume+0.001:
		b := p.BoardDrain
		more := f.Of(model.DimVolume, float64(b.Volume-d.Volume))
		return []Line{{Code: "board_over_intake", Status: Info,
			Short: "a board over the intake: on to " + L(b.StopLevel) + ", " + more + " more",
			Long: "the water may carry a floating film, so the plan stops where air starts; a board or raft floated over the intake " +
				"stops the vortex and lets the drain go on to " + L(b.StopLevel) + ", moving " + more + " more in " +
				Duration(float64(b.Time-d.Time)) + " (common practice)"}}
	case d.StopReason == calc.StopIntake && d.Residual > d.Volume:
		return []Line{{Code: "most_left", Status: Info,
			Short: "most left: a lower intake drains further",
			Long:  "more is left than moved: an intake that draws lower (a flat strainer or a low-level suction plate on the floor) drains closer to the floor (common practice)"}}
	}
	return nil
}

// intakeName is the intake's catalogue name, cleaned (a user's presets may
// name it).
func intakeName(p model.Plan) string {
	if p.Intake.Name == "" {
		return "Intake"
	}
	return Clean(p.Intake.Name)
}

// AirLines are the drain's air and hose events, one sentence each, in the
// order the level meets them: where air starts and what gulping costs, a
// target below prime lost, air gathering at the crest, choked running and
// a flattening hose.
func (d *Drain) AirLines() []string {
	var out []string
	add := func(ok bool, s string) {
		if ok {
			out = append(out, s)
		}
	}
	gulp := ""
	if d.Gulping != "" {
		gulp = "; it " + d.Gulping
	}
	out = append(out, "air starts to be drawn in at "+d.AirStarts+", the prime is lost at "+d.PrimeLost+gulp)
	add(d.TargetNote != "", d.TargetNote)
	add(d.AirGathers != "", "air will gather at the crest below "+d.AirGathers)
	add(d.Chokes != "", "the flow runs choked below "+d.Chokes)
	add(d.Collapses != "", "the hose may flatten below "+d.Collapses)
	return out
}
