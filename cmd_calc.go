package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"slices"
	"sort"
	"strconv"
	"strings"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// flagField ties a command-line flag to the job field it sets.
type flagField struct {
	name  string
	field model.FieldID
	help  string
}

// calcFlags are the value flags of `drawdown calc`, in help order. The names
// are the contract of design §4; keep them.
var calcFlags = []flagField{
	{"liquid", model.FieldLiquid, "liquid ID from `drawdown presets` [water]"},
	{"temp", model.FieldTemp, "liquid temperature [15C]"},
	{"density", model.FieldDensity, "density override, e.g. from a safety data sheet"},
	{"viscosity", model.FieldViscosity, "dynamic viscosity override (mPa.s, cP)"},
	{"vapor-pressure", model.FieldVapor, "vapour pressure override (kPa, psi)"},
	{"altitude", model.FieldAltitude, "site altitude [0m]"},
	{"baro", model.FieldBaro, "barometer reading; overrides --altitude"},
	{"hose-id", model.FieldHoseID, "hose inside diameter (25mm, 1in, 3/4 in)"},
	{"hose-length", model.FieldHoseLength, "hose length"},
	{"upleg-length", model.FieldHoseUpLeg, "hose length from intake to crest [intake depth + lift]"},
	{"intake-depth", model.FieldIntakeDepth, "intake below the surface, without a tank [0.3m]"},
	{"roughness", model.FieldHoseRoughness, "wall roughness [from --material]"},
	{"k-minor", model.FieldHoseKMinor, "sum of entrance, bend and coupling K; overrides --fitting"},
	{"hoses", model.FieldHoseCount, "identical hoses in parallel [1]"},
	{"lift", model.FieldLift, "crest height above the liquid surface"},
	{"drop", model.FieldDrop, "outlet (or receiving surface) below the liquid surface"},
	{"material", model.FieldHoseMaterial, "hose material ID [rubber-smooth]"},
	{"fitting", model.FieldHoseFittings, "fitting ID; repeat or comma-separate"},
	{"priming", model.FieldPriming, "priming method ID"},
	{"pump-stroke", model.FieldPumpStroke, "hand-pump stroke volume, for the stroke count"},
	{"height-tolerance", model.FieldTolHeight, "tolerance on measured heights for the band [3cm]"},
	{"tank", model.FieldTankShape, "tank shape: vertical-cylinder, rectangular, horizontal-cylinder, cone-bottom, sloped-pit, sphere, table"},
	{"tank-diameter", model.FieldTankDiameter, "tank diameter"},
	{"tank-length", model.FieldTankLength, "tank length (pit bottom length)"},
	{"tank-width", model.FieldTankWidth, "tank width (pit bottom width)"},
	{"tank-height", model.FieldTankHeight, "tank depth, floor to brim [the level]"},
	{"cone-height", model.FieldTankCone, "height of a cone bottom"},
	{"side-slope", model.FieldTankSlope, "pit side slope, horizontal per vertical"},
	{"level", model.FieldTankLevel, "liquid level above the tank floor"},
	{"target-level", model.FieldTankTarget, "level to stop at [intake + submergence]"},
	{"intake-height", model.FieldIntakeHeight, "intake above the tank floor [0.05m]"},
}

// calcOptions are the flags that are not job fields.
type calcOptions struct {
	json, curve, submerged, help bool
	units                        model.System
	hose, tankTable, tankPreset  string
	receiver                     *model.ReceiverSpec
}

// receiverFlags are the --receiver-* flags of a transfer, by the size or
// position name model.ReceiverSpec uses.
var receiverFlags = []string{"diameter", "length", "width", "height", "cone-height", "side-slope", "floor", "level"}

func flagByName(name string) (flagField, bool) {
	for _, f := range calcFlags {
		if f.name == name {
			return f, true
		}
	}
	return flagField{}, false
}

func flagForField(id model.FieldID) string {
	if rest, ok := strings.CutPrefix(string(id), "receiver."); ok {
		if rest == "shape" {
			return "--receiver"
		}
		return "--receiver-" + rest
	}
	for _, f := range calcFlags {
		if f.field == id {
			return "--" + f.name
		}
	}
	return string(id)
}

// usageError is a bad flag or value: one line, exit status 2.
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, a ...any) error { return &usageError{fmt.Sprintf(format, a...)} }

// parseCalcArgs reads --name value, --name=value and the boolean flags.
func parseCalcArgs(args []string) (map[model.FieldID]string, calcOptions, error) {
	vals := map[model.FieldID]string{}
	var o calcOptions
	for i := 0; i < len(args); i++ {
		a := args[i]
		if !strings.HasPrefix(a, "-") || a == "-" {
			return nil, o, usagef("unexpected argument %q; flags start with --", a)
		}
		name := strings.TrimLeft(a, "-")
		value, hasValue := "", false
		if k, v, ok := strings.Cut(name, "="); ok {
			name, value, hasValue = k, v, true
		}
		switch name {
		case "json", "curve", "outlet-submerged", "help", "h":
			if hasValue {
				return nil, o, usagef("--%s takes no value", name)
			}
			switch name {
			case "json":
				o.json = true
			case "curve":
				o.curve = true
			case "outlet-submerged":
				o.submerged = true
			default:
				o.help = true
			}
			continue
		}
		if !hasValue {
			if i+1 >= len(args) {
				return nil, o, usagef("--%s needs a value", name)
			}
			i++
			value = args[i]
		}
		switch name {
		case "units":
			sys, err := model.ParseSystem(value)
			if err != nil {
				return nil, o, usagef("--units: %q is not a unit system; accepted si or us", value)
			}
			o.units = sys
			continue
		case "hose":
			o.hose = value
			continue
		case "tank-table":
			o.tankTable = value
			continue
		case "tank-preset":
			o.tankPreset = value
			continue
		}
		if name == "receiver" || strings.HasPrefix(name, "receiver-") {
			if o.receiver == nil {
				o.receiver = &model.ReceiverSpec{Sizes: map[string]string{}}
			}
			switch part := strings.TrimPrefix(name, "receiver-"); {
			case name == "receiver":
				o.receiver.Shape = value
			case part == "floor":
				o.receiver.Floor = value
			case part == "level":
				o.receiver.Level = value
			case slices.Contains(receiverFlags, part):
				o.receiver.Sizes[part] = value
			default:
				return nil, o, usagef("unknown flag --%s; see drawdown calc --help", name)
			}
			continue
		}
		f, ok := flagByName(name)
		if !ok {
			return nil, o, usagef("unknown flag --%s; see drawdown calc --help", name)
		}
		if f.field == model.FieldHoseFittings && vals[f.field] != "" {
			value = vals[f.field] + "," + value
		}
		vals[f.field] = value
	}
	return vals, o, nil
}

func calcUsage(w io.Writer) {
	fmt.Fprintln(w, "usage: drawdown calc [flags]   (every value accepts a unit suffix: 25mm, 1in, 3/4 in, 40ft, 15C, 59F, 98.2kPa, 29.6inHg)")
	fmt.Fprintln(w, "  --json                 print one JSON object (SI units, unit in each key)")
	fmt.Fprintln(w, "  --units si|us          units for text output and for bare numbers [si]")
	fmt.Fprintln(w, "  --curve                with a tank, print the drain curve as a table")
	fmt.Fprintln(w, "  --outlet-submerged     the hose end sits below a receiving surface (--drop is to that surface)")
	fmt.Fprintln(w, "  --hose ID              a hose size from `drawdown presets` (sets --hose-id)")
	fmt.Fprintln(w, "  --tank-table FILE      CSV of level, volume for --tank table")
	fmt.Fprintln(w, "  --tank-preset ID       a tank from `drawdown presets` (shape and sizes; flags given win)")
	fmt.Fprintln(w, "  --receiver SHAPE       transfer into a receiving vessel (needs --tank); its sizes as")
	fmt.Fprintln(w, "                         --receiver-diameter, -length, -width, -height (brim), -cone-height,")
	fmt.Fprintln(w, "                         -side-slope; --receiver-floor (its floor above the source floor,")
	fmt.Fprintln(w, "                         negative when lower) and --receiver-level (its level at the start)")
	for _, f := range calcFlags {
		fmt.Fprintf(w, "  --%-20s %s\n", f.name+" X", f.help)
	}
}

// buildInputs validates each given flag against its field (so that the
// message names the flag) and returns the job inputs.
func buildInputs(vals map[model.FieldID]string, o calcOptions, cat *presets.Catalogue) (model.Inputs, error) {
	in := model.Inputs{Values: vals, Units: o.units, Receiver: o.receiver}
	if r := o.receiver; r != nil {
		if r.Shape == "" {
			return in, usagef("--receiver SHAPE is needed with the --receiver-* sizes")
		}
		if !slices.Contains(presets.TankShapes(), r.Shape) {
			return in, usagef("--receiver: %q is not a tank shape; accepted %s", r.Shape, strings.Join(presets.TankShapes(), ", "))
		}
		if shape := vals[model.FieldTankShape]; shape == "" || shape == "none" {
			return in, usagef("--receiver needs --tank SHAPE for the source vessel")
		}
	}
	if o.hose != "" {
		h, ok := cat.Hose(o.hose)
		if !ok {
			return in, usagef("--hose: %q is not a hose size in the catalogue; see drawdown presets", o.hose)
		}
		if _, dup := vals[model.FieldHoseID]; dup {
			return in, usagef("--hose and --hose-id both given; use one")
		}
		vals[model.FieldHoseID] = strconv.FormatFloat(float64(h.Diameter)*1000, 'g', 10, 64) + "mm"
	}
	if o.tankPreset != "" {
		t, ok := cat.Tank(o.tankPreset)
		if !ok {
			return in, usagef("--tank-preset: %q is not a tank in the catalogue; see drawdown presets", o.tankPreset)
		}
		// The template fills what the flags did not give.
		j := model.Job{Inputs: map[model.FieldID]string{}}
		j.ApplyTankPreset(t)
		for id, v := range j.Inputs {
			if _, given := vals[id]; !given && v != "" {
				vals[id] = v
			}
		}
	}
	if o.submerged {
		vals[model.FieldOutletSubmerged] = "yes"
	}
	if o.tankTable != "" {
		if vals[model.FieldTankShape] != "table" {
			return in, usagef("--tank-table needs --tank table")
		}
		f, err := os.Open(o.tankTable)
		if err != nil {
			return in, usagef("--tank-table: %v", err)
		}
		defer f.Close()
		rows, err := model.ParseTankTable(f, o.units)
		if err != nil {
			return in, usagef("--tank-table %s: %v", o.tankTable, err)
		}
		in.TankTable = rows
	} else if vals[model.FieldTankShape] == "table" {
		return in, usagef("--tank table needs --tank-table FILE (CSV of level, volume)")
	}
	if _, ok := vals[model.FieldLiquid]; !ok {
		vals[model.FieldLiquid] = "water"
	}
	names := make([]string, 0, len(vals))
	for id := range vals {
		names = append(names, string(id))
	}
	sort.Strings(names)
	for _, n := range names {
		id := model.FieldID(n)
		spec, _ := model.FieldByID(id)
		var err error
		if spec.IsPicker() {
			err = spec.ValidateChoice(vals[id], cat)
		} else {
			_, err = spec.Validate(vals[id], o.units)
		}
		if err != nil {
			return in, usagef("%s: %v", flagForField(id), err)
		}
	}
	for _, id := range []model.FieldID{model.FieldHoseID, model.FieldHoseLength, model.FieldLift, model.FieldDrop} {
		if strings.TrimSpace(vals[id]) == "" {
			spec, _ := model.FieldByID(id)
			return in, usagef("%s is required (%s, accepted %s)", flagForField(id), strings.ToLower(spec.Label), spec.RangeText(o.units))
		}
	}
	shape := vals[model.FieldTankShape]
	if shape != "" && shape != "none" && strings.TrimSpace(vals[model.FieldTankLevel]) == "" {
		return in, usagef("--level is required with --tank (liquid level above the tank floor)")
	}
	if (shape == "" || shape == "none") && vals[model.FieldTankLevel] != "" {
		return in, usagef("--level needs --tank SHAPE")
	}
	return in, nil
}

func runCalc(args []string, stdout, stderr io.Writer) int {
	vals, o, err := parseCalcArgs(args)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown calc: "+err.Error())
		return ExitUsage
	}
	if o.help {
		calcUsage(stdout)
		return ExitOK
	}
	cat := loadCatalogue(stderr)
	in, err := buildInputs(vals, o, cat)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown calc: "+err.Error())
		return ExitUsage
	}
	p := model.ComputeInputs(in, cat)
	if p.Err != nil {
		fmt.Fprintln(stderr, "drawdown calc: "+planError(p))
		return ExitUsage
	}
	if o.json {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(jsonOf(p)); err != nil {
			fmt.Fprintln(stderr, "drawdown calc: "+err.Error())
			return ExitError
		}
		return ExitOK
	}
	writeText(stdout, p, o)
	return ExitOK
}

// planError words the plan's first blocking error with the flag that set the
// field, on one line.
func planError(p model.Plan) string {
	for id, err := range p.FieldErrors {
		if errors.Is(p.Err, err) || err == p.Err {
			return flagForField(id) + ": " + oneLine(err.Error())
		}
	}
	return oneLine(p.Err.Error())
}

func oneLine(s string) string { return strings.Join(strings.Fields(s), " ") }

// jsonNum rounds away float noise below 1e-12 relative and guarantees a
// finite number (calc never returns NaN or Inf; this is the last guard).
func jsonNum(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

type jsonWarning struct {
	Code    string `json:"code"`
	Message string `json:"message"`
}

type jsonDrain struct {
	TimeS            float64  `json:"time_s"`
	TimeLowS         float64  `json:"time_low_s"`
	TimeHighS        float64  `json:"time_high_s"`
	VolumeM3         float64  `json:"volume_m3"`
	StopLevelM       float64  `json:"stop_level_m"`
	StopReason       string   `json:"stop_reason"`
	ResidualM3       float64  `json:"residual_m3"`
	CrestLimitLevelM *float64 `json:"crest_limit_level_m"`
	StartFlowM3S     float64  `json:"start_flow_m3_s"`
	ReceiverLevelM   *float64 `json:"receiver_level_m,omitempty"`
	TargetLevelM     float64  `json:"target_level_m"`
	Curve            []struct {
		TimeS  float64 `json:"time_s"`
		LevelM float64 `json:"level_m"`
		FlowM3 float64 `json:"flow_m3_s"`
	} `json:"curve,omitempty"`
}

type jsonResult struct {
	Verdict              string        `json:"verdict"`
	Liquid               string        `json:"liquid"`
	TemperatureK         float64       `json:"temperature_k"`
	AtmPressurePa        float64       `json:"atm_pressure_pa"`
	VaporPressurePa      float64       `json:"vapor_pressure_pa"`
	DensityKgM3          float64       `json:"density_kg_m3"`
	ViscosityPaS         float64       `json:"viscosity_pa_s"`
	LiftM                float64       `json:"lift_m"`
	DropM                float64       `json:"drop_m"`
	MaxCrestHeightM      float64       `json:"max_crest_height_m"`
	FlowingCrestLimitM   float64       `json:"flowing_crest_limit_m"`
	WorkingCrestHeightM  float64       `json:"working_crest_height_m"`
	CrestMarginM         float64       `json:"crest_margin_m"`
	CrestPressurePa      float64       `json:"crest_pressure_pa"`
	FlowM3S              float64       `json:"flow_m3_s"`
	FlowLowM3S           float64       `json:"flow_low_m3_s"`
	FlowHighM3S          float64       `json:"flow_high_m3_s"`
	VelocityMS           float64       `json:"velocity_m_s"`
	Reynolds             float64       `json:"reynolds"`
	FrictionFactor       float64       `json:"friction_factor"`
	Regime               string        `json:"regime"`
	RequiredSubmergenceM float64       `json:"required_submergence_m"`
	AirClearingVelocity  float64       `json:"air_clearing_velocity_m_s"`
	PrimingVolumeM3      float64       `json:"priming_volume_m3"`
	PumpStrokes          int           `json:"pump_strokes,omitempty"`
	Warnings             []jsonWarning `json:"warnings"`
	Notes                []string      `json:"notes"`
	Cautions             []string      `json:"cautions"`
	Drain                *jsonDrain    `json:"drain,omitempty"`
}

func jsonOf(p model.Plan) jsonResult {
	r := p.Result
	s := p.Siphon
	j := jsonResult{
		Verdict:              r.Verdict.String(),
		Liquid:               p.Liquid.ID,
		TemperatureK:         jsonNum(float64(p.Temperature)),
		AtmPressurePa:        jsonNum(float64(s.AtmPressure)),
		VaporPressurePa:      jsonNum(float64(s.Fluid.VaporPressure)),
		DensityKgM3:          jsonNum(float64(s.Fluid.Density)),
		ViscosityPaS:         jsonNum(float64(s.Fluid.Viscosity)),
		LiftM:                jsonNum(float64(s.Geometry.Lift())),
		DropM:                jsonNum(float64(s.Geometry.Drop())),
		MaxCrestHeightM:      jsonNum(float64(r.MaxCrestHeight)),
		FlowingCrestLimitM:   jsonNum(float64(r.FlowingCrestLimit)),
		WorkingCrestHeightM:  jsonNum(float64(r.WorkingCrestHeight)),
		CrestMarginM:         jsonNum(float64(r.CrestMargin)),
		CrestPressurePa:      jsonNum(float64(r.CrestPressure)),
		FlowM3S:              jsonNum(float64(r.Flow)),
		FlowLowM3S:           jsonNum(float64(p.FlowLow)),
		FlowHighM3S:          jsonNum(float64(p.FlowHigh)),
		VelocityMS:           jsonNum(float64(r.Velocity)),
		Reynolds:             jsonNum(r.Reynolds),
		FrictionFactor:       jsonNum(r.FrictionFactor),
		Regime:               r.Regime.String(),
		RequiredSubmergenceM: jsonNum(float64(r.RequiredSubmergence)),
		AirClearingVelocity:  jsonNum(float64(r.AirClearingVelocity)),
		PrimingVolumeM3:      jsonNum(float64(r.PrimingVolume)),
		PumpStrokes:          p.PumpStrokes,
		Warnings:             []jsonWarning{},
		Notes:                append([]string{}, p.Notes...),
		Cautions:             present.Cautions(p),
	}
	for _, w := range present.WarningsOf(r, present.Figures{Sys: model.SI}) {
		j.Warnings = append(j.Warnings, jsonWarning{Code: w.Code, Message: w.Long})
	}
	if d := p.Drain; d != nil {
		jd := &jsonDrain{
			TimeS:        jsonNum(float64(d.Time)),
			TimeLowS:     jsonNum(float64(p.TimeLow)),
			TimeHighS:    jsonNum(float64(p.TimeHigh)),
			VolumeM3:     jsonNum(float64(d.Volume)),
			StopLevelM:   jsonNum(float64(d.StopLevel)),
			StopReason:   string(d.StopReason),
			ResidualM3:   jsonNum(float64(d.Residual)),
			StartFlowM3S: jsonNum(float64(d.StartFlow)),
			TargetLevelM: jsonNum(float64(p.DrainIn.Target)),
		}
		if d.CrestLimitFound {
			v := jsonNum(float64(d.CrestLimitLevel))
			jd.CrestLimitLevelM = &v
		}
		if p.Receiver != nil {
			v := jsonNum(float64(d.ReceiverLevel))
			jd.ReceiverLevelM = &v
		}
		j.Drain = jd
	}
	return j
}
