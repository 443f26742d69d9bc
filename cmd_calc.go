package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"slices"
	"sort"
	"strconv"
	"strings"
	"time"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/presets"
)

// calcFlagDefs are the flags of `drawdown calc`, in help order: first the
// ones that are not job fields, then one per job field. The names are the
// contract of design §4; keep them. A command that takes the calc flags and
// some of its own parses append(calcFlagTable(), its own...) and reads the
// calc part with calcValues.
var calcFlagDefs = []flagDef{
	{name: "json", help: "print one JSON object (SI units, unit in each key; schema " + calcSchema + ")"},
	{name: "units", arg: "si|us", help: "units for text output and for bare numbers [si]", complete: completeUnits},
	{name: "curve", help: "with a tank, the drain curve too (a table, or drain.curve in JSON)"},
	{name: "outlet-submerged", help: "the hose end sits below a receiving surface (--drop is to that surface)"},
	{name: "hose", arg: "ID", help: "a hose size from `drawdown presets` (sets --hose-id)", complete: completeHoses},
	{name: "tank-table", arg: "FILE", help: "CSV of level, volume for --tank table; a header may name the units, e.g. level (ft),volume (gal); at most 1 MiB, 10000 rows", path: "file"},
	{name: "tank-preset", arg: "ID", help: "a tank from `drawdown presets` (shape and sizes; flags given win)", complete: completeTankPresets},
	{name: "receiver", arg: "SHAPE", help: "transfer into a receiving vessel of this shape (needs --tank)", complete: completeShapes},
	{name: "receiver-diameter", arg: "X", help: "receiving vessel: inside diameter"},
	{name: "receiver-length", arg: "X", help: "receiving vessel: inside length (a pit: its bottom length)"},
	{name: "receiver-width", arg: "X", help: "receiving vessel: inside width (a pit: its bottom width)"},
	{name: "receiver-height", arg: "X", help: "receiving vessel: floor to brim; the transfer stops when it is full"},
	{name: "receiver-cone-height", arg: "X", help: "receiving vessel: height of its cone bottom"},
	{name: "receiver-side-slope", arg: "X", help: "receiving pit: side slope, horizontal per vertical"},
	{name: "receiver-floor", arg: "X", help: "receiving vessel: its floor above the source floor (negative when lower)"},
	{name: "receiver-level", arg: "X", help: "receiving vessel: its level above its floor at the start [0m]"},
	fieldFlag("liquid", model.FieldLiquid, "ID", "liquid ID from `drawdown presets` [water]"),
	fieldFlag("temp", model.FieldTemp, "X", "liquid temperature [15C]"),
	fieldFlag("density", model.FieldDensity, "X", "density override, e.g. from a safety data sheet"),
	fieldFlag("viscosity", model.FieldViscosity, "X", "dynamic viscosity override (mPa.s, cP)"),
	fieldFlag("vapor-pressure", model.FieldVapor, "X", "vapour pressure override (kPa, psi)"),
	fieldFlag("altitude", model.FieldAltitude, "X", "site altitude [0m]"),
	fieldFlag("baro", model.FieldBaro, "X", "barometer reading; overrides --altitude"),
	fieldFlag("hose-id", model.FieldHoseID, "X", "hose inside diameter (25mm, 1in, 3/4 in)"),
	fieldFlag("hose-length", model.FieldHoseLength, "X", "hose length"),
	fieldFlag("upleg-length", model.FieldHoseUpLeg, "X", "hose length from intake to crest [intake depth + lift]"),
	fieldFlag("intake-depth", model.FieldIntakeDepth, "X", "intake below the surface, without a tank [0.3m]"),
	fieldFlag("roughness", model.FieldHoseRoughness, "X", "wall roughness [from --material]"),
	fieldFlag("k-minor", model.FieldHoseKMinor, "X", "sum of the losses before the crest, entrance included; overrides --fitting and the intake's own K"),
	fieldFlag("outlet-k", model.FieldOutletK, "K", "a valve or fitting at the outlet end, after the crest"),
	fieldFlag("hoses", model.FieldHoseCount, "N", "identical hoses in parallel [1]"),
	fieldFlag("lift", model.FieldLift, "X", "crest height above the liquid surface"),
	fieldFlag("drop", model.FieldDrop, "X", "outlet (or receiving surface) below the liquid surface"),
	fieldFlag("material", model.FieldHoseMaterial, "ID", "hose material ID [rubber-smooth]"),
	{name: "fitting", arg: "ID", field: model.FieldHoseFittings, repeat: true, help: "fitting ID; repeat or comma-separate", complete: completeField(model.FieldHoseFittings)},
	fieldFlag("priming", model.FieldPriming, "ID", "priming method ID"),
	fieldFlag("pump-stroke", model.FieldPumpStroke, "X", "hand-pump stroke volume, for the stroke count"),
	fieldFlag("height-tolerance", model.FieldTolHeight, "X", "tolerance on measured heights for the band [3cm]"),
	fieldFlag("bore-tolerance", model.FieldTolBore, "P", "how far the real bore may differ from --hose-id, for the band (3%, or 1% for a caliper-measured bore) [3%]"),
	{name: "tank", arg: "SHAPE", field: model.FieldTankShape, complete: completeTankShapes,
		help: "tank shape: " + strings.Join(append(presets.TankShapes(), "table"), ", ")},
	fieldFlag("tank-diameter", model.FieldTankDiameter, "X", "tank diameter"),
	fieldFlag("tank-length", model.FieldTankLength, "X", "tank length (pit bottom length)"),
	fieldFlag("tank-width", model.FieldTankWidth, "X", "tank width (pit bottom width)"),
	fieldFlag("tank-height", model.FieldTankHeight, "X", "tank height, floor to brim [the level]"),
	fieldFlag("cone-height", model.FieldTankCone, "X", "height of a cone bottom"),
	fieldFlag("side-slope", model.FieldTankSlope, "X", "pit side slope, horizontal per vertical"),
	fieldFlag("level", model.FieldTankLevel, "X", "liquid level above the tank floor"),
	fieldFlag("target-level", model.FieldTankTarget, "X", "level to stop at [where the intake stops]"),
	fieldFlag("intake-height", model.FieldIntakeHeight, "X", "hung end's mouth, or a strainer's base, above the tank floor [0.05m]"),
	fieldFlag("intake", model.FieldIntakeKind, "KIND", "what is on the hose end, from `drawdown presets` ["+presets.DefaultIntake+"]"),
	fieldFlag("max-flow", model.FieldMaxFlow, "RATE", "a permit's maximum discharge rate (L/s, gpm): the outlet valve setting is worked out"),
	fieldFlag("inflow", model.FieldSeepage, "RATE", "a steady inflow while the siphon runs: seepage, a leak (L/s, L/min, m3/h, gpm)"),
	fieldFlag("rain", model.FieldRain, "RATE", "rain while draining (mm/h, in/h), falling on --catchment"),
	fieldFlag("catchment", model.FieldCatchment, "AREA", "area that sheds rain into the tank (m2, ft2) [the tank's plan area at its brim]"),
	fieldFlag("rise-rate", model.FieldRiseRate, "RATE", "how fast the level rose with the siphon stopped (mm/h, in/h)"),
	{name: "measured-flow", arg: "V/T", repeat: true, help: "a bucket test at the outlet, volume over time, e.g. 10L/12s; repeat for each test; the plan is fitted to them"},
	fieldFlag("pump-rate", model.FieldPumpRate, "RATE", "a pump to finish what the siphon leaves (L/s, L/min, m3/h, gpm): the time it takes"),
	{name: "may-carry-oil", help: "the water may carry a floating film of oil: without a board the drain stops where air starts"},
}

// fieldFlag is a flag that sets one job field; a picker field completes
// from its own list of choices.
func fieldFlag(name string, id model.FieldID, arg, help string) flagDef {
	d := flagDef{name: name, arg: arg, field: id, help: help}
	if spec, ok := model.FieldByID(id); ok && spec.IsPicker() {
		d.complete = completeField(id)
	}
	return d
}

// calcFlagTable returns a copy of the calc flags, for a command that adds its
// own to them.
func calcFlagTable() []flagDef { return append([]flagDef(nil), calcFlagDefs...) }

// calcOptions are the flags that are not job fields.
type calcOptions struct {
	json, curve, submerged, help bool
	mayCarryOil                  bool
	units                        model.System
	hose, tankTable, tankPreset  string
	receiver                     *model.ReceiverSpec
	flowTests                    []string // --measured-flow, as typed
}

func flagForField(id model.FieldID) string {
	if rest, ok := strings.CutPrefix(string(id), "receiver."); ok {
		if rest == "shape" {
			return "--receiver"
		}
		return "--receiver-" + rest
	}
	for _, f := range calcFlagDefs {
		if f.field != "" && f.field == id {
			return "--" + f.name
		}
	}
	return string(id)
}

// parseCalcArgs reads the calc flags: --name value, --name=value and the
// switches.
func parseCalcArgs(args []string) (map[model.FieldID]string, calcOptions, error) {
	pf, err := parseFlags("calc", args, calcFlagDefs, 0)
	if err != nil {
		return nil, calcOptions{}, err
	}
	return calcValues(pf)
}

// calcValues reads the calc part of parsed flags: the job field texts and
// the options. Flags that are not calc's are left for the caller.
func calcValues(pf *parsedFlags) (map[model.FieldID]string, calcOptions, error) {
	vals := map[model.FieldID]string{}
	o := calcOptions{help: pf.help}
	for _, d := range calcFlagDefs {
		if !pf.has(d.name) {
			continue
		}
		value := strings.Join(pf.all(d.name), ",") // only --fitting repeats
		if d.field != "" {
			vals[d.field] = value
			continue
		}
		switch part, isRecv := strings.CutPrefix(d.name, "receiver-"); {
		case d.name == "json":
			o.json = true
		case d.name == "curve":
			o.curve = true
		case d.name == "outlet-submerged":
			o.submerged = true
		case d.name == "may-carry-oil":
			o.mayCarryOil = true
		case d.name == "measured-flow":
			o.flowTests = pf.all(d.name)
		case d.name == "units":
			sys, err := model.ParseSystem(value)
			if err != nil {
				return nil, o, usagef("--units: %q is not a unit system; accepted si or us", value)
			}
			o.units = sys
		case d.name == "hose":
			o.hose = value
		case d.name == "tank-table":
			o.tankTable = value
		case d.name == "tank-preset":
			o.tankPreset = value
		case d.name == "receiver" || isRecv:
			if o.receiver == nil {
				o.receiver = &model.ReceiverSpec{Sizes: map[string]string{}}
			}
			switch {
			case d.name == "receiver":
				o.receiver.Shape = value
			case part == "floor":
				o.receiver.Floor = value
			case part == "level":
				o.receiver.Level = value
			default:
				o.receiver.Sizes[part] = value
			}
		}
	}
	return vals, o, nil
}

func calcUsage(w io.Writer) {
	fmt.Fprintln(w, "usage: drawdown calc [flags]")
	fmt.Fprintln(w, "Computes one case without the screen. Every value accepts a unit suffix: 25mm, 1in,")
	fmt.Fprintln(w, "3/4 in, 40ft, 15C, 59F, 98.2kPa, 29.6inHg; bare numbers are in the --units system.")
	fmt.Fprintln(w, "A flag is given once (--fitting may repeat). Exit status 0, 2 for bad input (one line")
	fmt.Fprintln(w, "naming the flag), 1 when a file cannot be read.")
	fmt.Fprintln(w, "With --json: one object with \"schema\": \""+calcSchema+"\" (the number changes only")
	fmt.Fprintln(w, "when a key is removed or changes meaning), SI units named in each key, numbers to", jsonDigits)
	fmt.Fprintln(w, "significant figures; with a tank a \"drain\" object, with --curve its \"curve\" list.")
	fmt.Fprintln(w)
	writeFlagHelp(w, calcFlagDefs)
}

// buildInputs validates each given flag against its field (so that the
// message names the flag) and returns the job inputs.
func buildInputs(vals map[model.FieldID]string, o calcOptions, cat *presets.Catalogue) (model.Inputs, error) {
	in := model.Inputs{Values: vals, Units: o.units, Receiver: o.receiver, FilmRisk: o.mayCarryOil}
	for _, step := range []func() error{
		func() error { return checkReceiver(vals, o.receiver) },
		func() error { return applyHose(vals, o.hose, cat) },
		func() error { return applyTankPreset(vals, o.tankPreset, cat) },
		func() (err error) { in.TankTable, err = readTankTable(vals, o); return err },
		func() (err error) { in.FlowTests, err = readFlowTests(o); return err },
		func() error { return validateFields(vals, o.units, cat) },
		func() error { return checkRequired(vals, o.units) },
	} {
		if err := step(); err != nil {
			return in, err
		}
	}
	return in, nil
}

func checkReceiver(vals map[model.FieldID]string, r *model.ReceiverSpec) error {
	if r == nil {
		return nil
	}
	if r.Shape == "" {
		return usagef("--receiver SHAPE is needed with the --receiver-* sizes")
	}
	if !slices.Contains(presets.TankShapes(), r.Shape) {
		return usagef("--receiver: %q is not a tank shape; accepted %s", r.Shape, strings.Join(presets.TankShapes(), ", "))
	}
	if noTank(vals) {
		return usagef("--receiver needs --tank SHAPE for the source vessel")
	}
	return nil
}

func noTank(vals map[model.FieldID]string) bool {
	shape := strings.TrimSpace(vals[model.FieldTankShape])
	return shape == "" || strings.EqualFold(shape, "none")
}

func isTableShape(vals map[model.FieldID]string) bool {
	return strings.EqualFold(strings.TrimSpace(vals[model.FieldTankShape]), calc.ShapeTable)
}

// applyHose sets the bore from a catalogue hose size.
func applyHose(vals map[model.FieldID]string, hose string, cat *presets.Catalogue) error {
	if hose == "" {
		return nil
	}
	h, ok := cat.Hose(hose)
	if !ok {
		return usagef("--hose: %q is not a hose size in the catalogue; see drawdown presets", hose)
	}
	if _, dup := vals[model.FieldHoseID]; dup {
		return usagef("--hose and --hose-id both given; use one")
	}
	vals[model.FieldHoseID] = strconv.FormatFloat(float64(h.Diameter)*1000, 'g', 10, 64) + "mm"
	return nil
}

// applyTankPreset fills the shape and sizes of a catalogue tank that the
// flags did not give.
func applyTankPreset(vals map[model.FieldID]string, id string, cat *presets.Catalogue) error {
	if id == "" {
		return nil
	}
	t, ok := cat.Tank(id)
	if !ok {
		return usagef("--tank-preset: %q is not a tank in the catalogue; see drawdown presets", id)
	}
	j := model.Job{Inputs: map[model.FieldID]string{}}
	j.ApplyTankPreset(t)
	for id, v := range j.Inputs {
		if _, given := vals[id]; !given && v != "" {
			vals[id] = v
		}
	}
	return nil
}

// readTankTable reads --tank-table for --tank table (and --outlet-submerged
// is set here too, being the other option that becomes a field).
func readTankTable(vals map[model.FieldID]string, o calcOptions) ([]model.TablePoint, error) {
	if o.submerged {
		vals[model.FieldOutletSubmerged] = "yes"
	}
	if o.tankTable == "" {
		if isTableShape(vals) {
			return nil, usagef("--tank table needs --tank-table FILE (CSV of level, volume)")
		}
		return nil, nil
	}
	if !isTableShape(vals) {
		return nil, usagef("--tank-table needs --tank table")
	}
	rows, err := model.ReadTankTableFile(o.tankTable, o.units)
	if err != nil {
		return nil, usagef("--tank-table %s: %s", o.tankTable, oneLine(err.Error()))
	}
	return rows, nil
}

// readFlowTests reads each --measured-flow (a bucket test at the start
// level). They need a steady siphon to fit, so no tank is needed.
func readFlowTests(o calcOptions) ([]model.FlowTest, error) {
	var out []model.FlowTest
	for i, text := range o.flowTests {
		f, err := model.ParseFlowTest(text, o.units, time.Now())
		if err != nil {
			n := ""
			if len(o.flowTests) > 1 {
				n = fmt.Sprintf(" (test %d of %d)", i+1, len(o.flowTests))
			}
			return nil, usagef("--measured-flow %s%s: %s", strconv.Quote(text), n, oneLine(err.Error()))
		}
		out = append(out, f)
	}
	if len(out) > model.MaxFlowTests {
		return nil, usagef("--measured-flow given %d times; accepted at most %d", len(out), model.MaxFlowTests)
	}
	return out, nil
}

// validateFields checks every given field, in a fixed order, so that the
// first bad one is named by its flag.
func validateFields(vals map[model.FieldID]string, sys model.System, cat *presets.Catalogue) error {
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
			_, err = spec.Validate(vals[id], sys)
		}
		if err != nil {
			return usagef("%s: %v", flagForField(id), err)
		}
	}
	return nil
}

func checkRequired(vals map[model.FieldID]string, sys model.System) error {
	for _, id := range []model.FieldID{model.FieldHoseID, model.FieldHoseLength, model.FieldLift, model.FieldDrop} {
		if strings.TrimSpace(vals[id]) == "" {
			spec, _ := model.FieldByID(id)
			return usagef("%s is required (%s, accepted %s)", flagForField(id), strings.ToLower(spec.Label), spec.RangeText(sys))
		}
	}
	if !noTank(vals) && strings.TrimSpace(vals[model.FieldTankLevel]) == "" {
		return usagef("--level is required with --tank (liquid level above the tank floor)")
	}
	if noTank(vals) && vals[model.FieldTankLevel] != "" {
		return usagef("--level needs --tank SHAPE")
	}
	return nil
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
		if err := enc.Encode(jsonOf(p, o.curve)); err != nil {
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
