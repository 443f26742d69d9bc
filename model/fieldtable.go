package model

import (
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

const (
	mm = 1e-3
	cm = 1e-2
)

var fieldTable = []FieldSpec{
	// Hose.
	{ID: FieldHoseID, Pane: PaneHose, Label: "Hose inside diameter", Dim: DimDiameter, Min: 3 * mm, Max: 600 * mm,
		Help: "Bore of the hose, not its outside size: 25mm, 1in, 3/4 in, 1-1/2in."},
	{ID: FieldHoseLength, Pane: PaneHose, Label: "Hose length", Dim: DimLength, Min: 0.1, Max: 1000,
		Help: "Whole run from intake to outlet, couplings included."},
	{ID: FieldHoseUpLeg, Pane: PaneHose, Label: "Up-leg length", Dim: DimLength, Min: 0.05, Max: 1000, Optional: true,
		Help: "Hose from the intake up to the crest. Leave empty to take intake depth plus lift."},
	{ID: FieldHoseMaterial, Pane: PaneHose, Label: "Hose material", Dim: DimNumber, Optional: true,
		Choices: materialChoices,
		Help:    "Sets the wall roughness (empty: smooth rubber). Lay-flat hose collapses under suction and cannot siphon."},
	{ID: FieldHoseFittings, Pane: PaneHose, Label: "Fittings", Dim: DimNumber, Optional: true, Multi: true,
		Choices: fittingChoices,
		Help:    "Intake screen, couplings, valves and bends on the run; comma-separated."},
	{ID: FieldHoseCount, Pane: PaneHose, Label: "Hoses in parallel", Dim: DimNumber, Min: 1, Max: 20, Default: "1", Integer: true,
		Help: "Identical hoses over the same crest, each primed on its own."},
	{ID: FieldOutletK, Pane: PaneHose, Label: "Outlet valve K", Dim: DimNumber, Min: 0, Max: 1000, Optional: true, Blank: "none",
		Help: "A valve or fitting at the outlet end, after the crest: a part-closed valve here raises the crest pressure."},
	{ID: FieldHoseKMinor, Pane: PaneHose, Label: "Minor-loss sum ΣK", Dim: DimNumber, Min: 0, Max: 200, Optional: true,
		Help: "Overrides the fittings list: entrance, bends, couplings and valves added up."},
	{ID: FieldHoseRoughness, Pane: PaneHose, Label: "Wall roughness", Dim: DimRoughness, Min: 0, Max: 10 * mm, Optional: true,
		Help: "Overrides the material's roughness, e.g. 0.0015mm for smooth plastic."},
	{ID: FieldPriming, Pane: PaneHose, Label: "Priming method", Dim: DimNumber, Optional: true,
		Choices: primingChoices,
		Help:    "How the hose is filled before it runs. Never by mouth."},
	{ID: FieldPumpStroke, Pane: PaneHose, Label: "Hand-pump stroke volume", Dim: DimVolume, Min: 1e-6, Max: 0.02, Optional: true,
		Help: "Liquid moved per stroke or squeeze, for the stroke count to prime."},

	// Lift & outlet.
	{ID: FieldLift, Pane: PaneLift, Label: "Lift over crest", Dim: DimLength, Min: -5, Max: 15,
		Help: "Height of the highest point of the hose above the source surface (negative if below)."},
	{ID: FieldDrop, Pane: PaneLift, Label: "Drop to outlet", Dim: DimLength, Min: 0.01, Max: 100,
		Help: "Source surface down to the hose end, or to the receiving surface if the end is submerged."},
	{ID: FieldIntakeDepth, Pane: PaneLift, Label: "Intake depth", Dim: DimLength, Min: 0, Max: 100, Default: "0.3 m",
		Help: "Hose opening below the source surface (used when no tank is given)."},
	{ID: FieldIntakeKind, Pane: PaneLift, Label: "Intake", Dim: DimNumber, Default: presets.DefaultIntake,
		Choices: intakeChoices,
		Help:    "What is on the hose end in the liquid: it sets where air starts to be drawn in and where the prime is lost."},
	{ID: FieldIntakeHeight, Pane: PaneLift, Label: "Intake height above floor", Dim: DimLength, Min: 0, Max: 1000, Default: "0.05 m",
		Help: "The mouth of a hung hose end, or the base of a strainer or foot valve, above the tank floor."},
	{ID: FieldOutletSubmerged, Pane: PaneLift, Label: "Outlet end", Dim: DimNumber, Default: "no",
		Choices: outletChoices,
		Help:    "Free: the end discharges into air. Submerged: it sits below the receiving surface."},
	{ID: FieldMaxFlow, Pane: PaneLift, Label: "Permit's max rate", Dim: DimFlow, Min: 1e-6, Max: 1, Optional: true, Blank: "no cap",
		Help: "The most the discharge may run at: the outlet valve setting that meets it is worked out."},
	{ID: FieldTolHeight, Pane: PaneLift, Label: "Height tolerance", Dim: DimLength, Min: 0, Max: 1, Default: "3 cm",
		Help: "How far each measured height may be off (±); sets the low and high band."},
	{ID: FieldTolBore, Pane: PaneLift, Label: "Bore tolerance", Dim: DimPercent, Min: 0, Max: calc.MaxBoreTolerance, Default: "3 %",
		Help: "How far the hose's real bore may differ from the one entered (±); joins the band. A bore measured with a caliper: 1 %."},
	{ID: FieldReceiverShape, Pane: PaneLift, Label: "Receiving vessel", Dim: DimNumber, Default: "none",
		Choices: receiverShapeChoices,
		Help:    "A tank the hose discharges into: its level rises and the head shrinks from both ends. None: a free outlet or an open drain."},
	{ID: FieldReceiverDiameter, Pane: PaneLift, Label: "Receiver diameter", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside diameter of the receiving vessel."},
	{ID: FieldReceiverLength, Pane: PaneLift, Label: "Receiver length", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside length of the receiving vessel (a pit: its bottom length)."},
	{ID: FieldReceiverWidth, Pane: PaneLift, Label: "Receiver width", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside width of the receiving vessel (a pit: its bottom width)."},
	{ID: FieldReceiverHeight, Pane: PaneLift, Label: "Receiver height", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Floor to brim of the receiving vessel: the transfer stops when it is full."},
	{ID: FieldReceiverCone, Pane: PaneLift, Label: "Receiver cone height", Dim: DimLength, Min: 0.01, Max: calc.MaxTankSize,
		Help: "Height of the receiver's conical bottom."},
	{ID: FieldReceiverSlope, Pane: PaneLift, Label: "Receiver side slope H:V", Dim: DimNumber, Min: 0, Max: calc.MaxSideSlope,
		Help: "Receiving pit: horizontal run per unit rise of its sides."},
	{ID: FieldReceiverFloor, Pane: PaneLift, Label: "Receiver floor", Dim: DimLength, Min: -100, Max: 100,
		Help: "Receiver's floor above the source tank's floor; negative when it stands lower."},
	{ID: FieldReceiverLevel, Pane: PaneLift, Label: "Receiver level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize, Default: "0 m",
		Help: "Liquid already in the receiver, above its own floor, at the start."},

	// Liquid & site.
	{ID: FieldLiquid, Pane: PaneLiquid, Label: "Liquid", Dim: DimNumber, Default: "water",
		Choices: liquidChoices,
		Help:    "Sets density, viscosity, vapour pressure and the checklist's hazards."},
	{ID: FieldTemp, Pane: PaneLiquid, Label: "Liquid temperature", Dim: DimTemperature, Min: float64(calc.Celsius(-40)), Max: float64(calc.Celsius(150)), Default: "15 °C",
		Help: "Temperature of the liquid itself; its own valid range is checked with the liquid."},
	{ID: FieldAltitude, Pane: PaneLiquid, Label: "Site altitude", Dim: DimLength, Min: -500, Max: 5000, Default: "0 m",
		Help: "Height above sea level; gives the standard barometric pressure."},
	{ID: FieldBaro, Pane: PaneLiquid, Label: "Barometer reading", Dim: DimPressure, Min: 50e3, Max: 110e3, Optional: true,
		Help: "Absolute station pressure; overrides the altitude. Not the sea-level figure from a forecast."},
	{ID: FieldDensity, Pane: PaneLiquid, Label: "Density override", Dim: DimDensity, Min: calc.MinDensity, Max: calc.MaxDensity, Optional: true,
		Help: "From the safety data sheet, at the liquid's temperature."},
	{ID: FieldViscosity, Pane: PaneLiquid, Label: "Viscosity override", Dim: DimViscosity, Min: calc.MinViscosity, Max: calc.MaxViscosity, Optional: true,
		Help: "Dynamic viscosity at the liquid's temperature (mPa·s = cP)."},
	{ID: FieldVapor, Pane: PaneLiquid, Label: "Vapour pressure override", Dim: DimPressure, Min: 0, Max: calc.MaxVaporPressure, Optional: true,
		Help: "Absolute vapour pressure at the liquid's temperature."},

	// Tank.
	{ID: FieldTankPreset, Pane: PaneTank, Label: "Tank from catalogue", Dim: DimNumber, Optional: true,
		Choices: tankPresetChoices,
		Help:    "A typical vessel from the catalogue fills the shape and sizes; then measure and set the level."},
	{ID: FieldTankShape, Pane: PaneTank, Label: "Tank shape", Dim: DimNumber, Default: "none",
		Choices: tankShapeChoices,
		Help:    "Shape of the source vessel; none for a steady flow figure only."},
	{ID: FieldTankDiameter, Pane: PaneTank, Label: "Tank diameter", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside diameter (cylinders, cone-bottom tanks, spheres)."},
	{ID: FieldTankLength, Pane: PaneTank, Label: "Tank length", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside length (rectangular tanks, horizontal cylinders; floor of a sloped pit)."},
	{ID: FieldTankWidth, Pane: PaneTank, Label: "Tank width", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize,
		Help: "Inside width (rectangular tanks; floor of a sloped pit)."},
	{ID: FieldTankHeight, Pane: PaneTank, Label: "Tank height", Dim: DimLength, Min: 0.05, Max: calc.MaxTankSize, Optional: true,
		Help: "Floor to rim or overflow; bounds the level."},
	{ID: FieldTankCone, Pane: PaneTank, Label: "Cone height", Dim: DimLength, Min: 0.01, Max: calc.MaxTankSize,
		Help: "Height of the conical bottom of a cone-bottom tank."},
	{ID: FieldTankSlope, Pane: PaneTank, Label: "Side slope H:V", Dim: DimNumber, Min: 0, Max: calc.MaxSideSlope,
		Help: "Sloped pit or pond: horizontal run per unit rise of the sides, e.g. 2 for 2:1."},
	{ID: FieldTankLevel, Pane: PaneTank, Label: "Liquid level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize,
		Help: "Source surface above the tank floor at the start."},
	{ID: FieldTankTarget, Pane: PaneTank, Label: "Target level", Dim: DimLength, Min: 0, Max: calc.MaxTankSize, Optional: true,
		Help: "Stop the drain at this level above the floor. Empty: as low as the intake allows."},
	{ID: FieldRain, Pane: PaneTank, Label: "Rain while draining", Dim: DimRate, Min: 0, Max: MaxRain, Optional: true, Blank: "none",
		Help: "Rain intensity expected during the drain (a forecast or a gauge), e.g. 10 mm/h. It falls on the catchment below."},
	{ID: FieldCatchment, Pane: PaneTank, Label: "Catchment area", Dim: DimArea, Min: 0.01, Max: MaxCatchment, Optional: true, Blank: "tank's own",
		Help: "Plan area that sheds rain into the tank: the bund itself plus any roof or yard that drains into it."},
	{ID: FieldRiseRate, Pane: PaneTank, Label: "Rise, siphon off", Dim: DimRate, Min: 0, Max: MaxRiseRate, Optional: true, Blank: "none",
		Help: "How fast the level rose with the siphon stopped (a mark on a staff, timed), e.g. 12 mm/h. In rain it already holds the rain: give one or the other."},
	{ID: FieldSeepage, Pane: PaneTank, Label: "Seepage or leak", Dim: DimFlow, Min: 0, Max: 1, Optional: true, Blank: "none",
		Help: "A steady flow coming in: groundwater into a pit, a leaking valve into a vault, a pump that cannot be stopped."},
	{ID: FieldPumpRate, Pane: PaneTank, Label: "Pump to finish", Dim: DimFlow, Min: 1e-5, Max: 1, Optional: true, Blank: "no pump",
		Help: "A pump's rate, to finish what the siphon leaves: the time it takes is worked out."},
}

// Bounds on the inflow fields, SI.
const (
	MaxRain      = 0.5 / 3600 // m/s: 500 mm/h, beyond the heaviest short bursts recorded
	MaxCatchment = 1e6        // m²: 100 ha
	MaxRiseRate  = 5.0 / 3600 // m/s: 5 m/h
)

// Choices for the picker fields.

func materialChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, m := range c.Materials() {
		out = append(out, Choice{ID: m.ID, Label: m.Name, Note: m.Note})
	}
	return out
}

func fittingChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, f := range c.Fittings() {
		out = append(out, Choice{ID: f.ID, Label: f.Name})
	}
	return out
}

func liquidChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, l := range c.Liquids() {
		out = append(out, Choice{ID: l.ID, Label: l.Name, Note: l.Note})
	}
	return out
}

// primingChoices lists the checklist's priming methods, so that the picker
// and the checklist can never disagree. Mouth suction is not among them.
func primingChoices(*presets.Catalogue) []Choice {
	var out []Choice
	for _, m := range PrimingMethods() {
		out = append(out, Choice{ID: string(m), Label: m.Label()})
	}
	return out
}

func outletChoices(*presets.Catalogue) []Choice {
	return []Choice{
		{ID: "no", Label: "Free (discharges into air)"},
		{ID: "yes", Label: "Submerged (below the receiving surface)"},
	}
}

func intakeChoices(c *presets.Catalogue) []Choice {
	if c == nil {
		return []Choice{}
	}
	var out []Choice
	for _, in := range c.Intakes() {
		out = append(out, Choice{ID: in.ID, Label: in.Name, Note: in.Note})
	}
	return out
}

func tankPresetChoices(c *presets.Catalogue) []Choice {
	out := []Choice{{ID: "custom", Label: "custom (type the shape and sizes)"}}
	if c == nil {
		return out
	}
	for _, t := range c.Tanks() {
		out = append(out, Choice{ID: t.ID, Label: t.Name, Note: t.Note})
	}
	return out
}

func receiverShapeChoices(*presets.Catalogue) []Choice {
	out := []Choice{{ID: "none", Label: "none (free outlet or open drain)"}}
	for _, s := range presets.TankShapes() {
		out = append(out, Choice{ID: s, Label: strings.ReplaceAll(s, "-", " ")})
	}
	return out
}

func tankShapeChoices(*presets.Catalogue) []Choice {
	out := []Choice{{ID: "none", Label: "No tank (steady flow only)"}}
	for _, s := range presets.TankShapes() {
		out = append(out, Choice{ID: s, Label: strings.ReplaceAll(s, "-", " ")})
	}
	return out
}
