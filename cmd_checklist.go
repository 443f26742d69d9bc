package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// runChecklist prints the checklist a job with the given liquid, plan and
// site facts gets, so that a supervisor can print it before the crew
// leaves:
//
//	drawdown checklist [calc flags] [--confined] [--entry] [--open-water]
//	    [--discharge storm|sewer|container|tanker] [--may-carry-oil]
//	    [--air-temp T] [--overnight] [--json]
//
// The calc flags are those of `drawdown calc` (calcFlagTable, calcValues,
// buildInputs), parsed with the checklist's own in one table.
// Without any hose or height flag (--hose-id, --hose, --hose-length, --lift,
// --drop) there is no plan to quote: the checklist is built from the liquid,
// its temperature, the tank and the site facts alone. Text output is one
// step a line with its section, caution and source; --json prints a
// top-level list of {id, section, text, caution, source}.
func runChecklist(args []string, stdout, stderr io.Writer) int {
	fail := func(err error) int {
		fmt.Fprintln(stderr, "drawdown checklist: "+oneLine(err.Error()))
		return ExitUsage
	}
	table := checklistFlagTable()
	pf, err := parseFlags("checklist", args, table, 0)
	if err != nil {
		return fail(err)
	}
	if pf.help {
		checklistUsage(stdout, table)
		return ExitOK
	}
	vals, o, err := calcValues(pf)
	if err != nil {
		return fail(err)
	}
	facts, err := checklistFacts(pf)
	if err != nil {
		return fail(err)
	}
	if o.curve {
		return fail(usagef("--curve is for drawdown calc; the checklist has no drain curve"))
	}
	if o.submerged && !hasGeometry(vals, o) {
		return fail(usagef("--outlet-submerged needs the hose and heights (--hose-id, --hose-length, --lift, --drop)"))
	}
	cat := loadCatalogue(stderr)
	in, err := checklistInputs(vals, o, cat)
	if err != nil {
		return fail(err)
	}
	j := model.NewJob("checklist", o.units, time.Time{}) // never saved: no clock needed
	j.Inputs, j.Facts = in.Values, facts
	if t, ok := cat.Tank(o.tankPreset); ok && t.ConfinedSpace {
		j.Facts.ConfinedSpace = true // the catalogue's flag pre-sets the fact
	}
	if err := j.SetAirTemp(pf.get("air-temp"), j.Created); err != nil {
		var ie *model.InputError
		if errors.As(err, &ie) {
			return fail(usagef("--air-temp: %s", ie.Detail))
		}
		return fail(err)
	}
	if j.Facts.Entry && !j.Facts.ConfinedSpace {
		return fail(usagef("--entry is entry into a confined space: give --confined too (or a --tank-preset the catalogue flags as one)"))
	}
	p := model.ComputeInputs(in, cat)
	if hasGeometry(vals, o) && p.Err != nil {
		return fail(errors.New(planError(p)))
	}
	j.RebuildChecklist(p)
	if o.json {
		return writeChecklistJSON(stdout, stderr, j.Checklist)
	}
	writeChecklistText(stdout, j.Checklist)
	return ExitOK
}

// checklistFlagTable is the calc flags and the checklist's own: one switch
// per yes/no site fact (model.Flags, by the same names), --discharge and
// --air-temp.
func checklistFlagTable() []flagDef {
	defs := calcFlagTable()
	have := map[string]bool{}
	for _, d := range defs {
		have[d.name] = true
	}
	for _, f := range model.Flags() {
		if have[string(f)] {
			continue // --may-carry-oil is a calc flag too: the same fact
		}
		defs = append(defs, flagDef{name: string(f), help: "site fact: " + strings.ToLower(f.Label()[:1]) + f.Label()[1:]})
	}
	var kinds []string
	for _, d := range model.Discharges() {
		kinds = append(kinds, string(d))
	}
	return append(defs,
		flagDef{name: "discharge", arg: "KIND", help: "where the liquid goes: " + strings.Join(kinds, ", "), complete: completeDischarges},
		flagDef{name: "air-temp", arg: "T", help: "air temperature, for frost (-60 to 60 °C)"})
}

func completeDischarges(*presets.Catalogue) []completion {
	var out []completion
	for _, d := range model.Discharges() {
		out = append(out, completion{string(d), d.Label()})
	}
	return out
}

// checklistFacts reads the site facts from the parsed flags.
func checklistFacts(pf *parsedFlags) (model.SiteFacts, error) {
	j := model.Job{}
	for _, f := range model.Flags() {
		if pf.has(string(f)) {
			_ = j.SetFlag(f, true, time.Time{}) // f is one of model.Flags
		}
	}
	if pf.has("discharge") {
		d, err := model.ParseDischarge(pf.get("discharge"))
		if err != nil || d == "" {
			return j.Facts, usagef("--discharge: %q is not one of storm, sewer, container, tanker", pf.get("discharge"))
		}
		j.Facts.Discharge = d
	}
	return j.Facts, nil
}

// hasGeometry reports whether any hose or height flag was given: then the
// plan is computed as `drawdown calc` computes it, and its figures quoted.
func hasGeometry(vals map[model.FieldID]string, o calcOptions) bool {
	if o.hose != "" {
		return true
	}
	for _, id := range []model.FieldID{model.FieldHoseID, model.FieldHoseLength, model.FieldLift, model.FieldDrop} {
		if strings.TrimSpace(vals[id]) != "" {
			return true
		}
	}
	return false
}

// checklistInputs is buildInputs when a hose or height is given. Without
// one it checks each given flag against its field, as buildInputs does,
// and fills the tank from --tank-preset; the hose and heights stay unset.
func checklistInputs(vals map[model.FieldID]string, o calcOptions, cat *presets.Catalogue) (model.Inputs, error) {
	if hasGeometry(vals, o) {
		return buildInputs(vals, o, cat)
	}
	if o.tankTable != "" || o.receiver != nil {
		return model.Inputs{}, usagef("--tank-table and --receiver need the hose and heights (--hose-id, --hose-length, --lift, --drop)")
	}
	if o.tankPreset != "" {
		t, ok := cat.Tank(o.tankPreset)
		if !ok {
			return model.Inputs{}, usagef("--tank-preset: %q is not a tank in the catalogue; see drawdown presets", o.tankPreset)
		}
		j := model.Job{Inputs: map[model.FieldID]string{}}
		j.ApplyTankPreset(t)
		for id, v := range j.Inputs {
			if _, given := vals[id]; !given && v != "" {
				vals[id] = v
			}
		}
	}
	if _, ok := vals[model.FieldLiquid]; !ok {
		vals[model.FieldLiquid] = "water"
	}
	for id, text := range vals {
		spec, _ := model.FieldByID(id)
		var err error
		if spec.IsPicker() {
			err = spec.ValidateChoice(text, cat)
		} else {
			_, err = spec.Validate(text, o.units)
		}
		if err != nil {
			return model.Inputs{}, usagef("%s: %v", flagForField(id), err)
		}
	}
	return model.Inputs{Values: vals, Units: o.units}, nil
}

// jsonStep is one step of `drawdown checklist --json` (the contract of
// issue 12).
type jsonStep struct {
	ID      string `json:"id"`
	Section string `json:"section"`
	Text    string `json:"text"`
	Caution string `json:"caution"`
	Source  string `json:"source"`
}

func writeChecklistJSON(stdout, stderr io.Writer, c model.Checklist) int {
	out := make([]jsonStep, 0, len(c.Steps))
	for _, s := range c.Steps {
		out = append(out, jsonStep{ID: s.ID, Section: string(s.Section), Text: s.Text, Caution: s.Caution, Source: s.Rule})
	}
	enc := json.NewEncoder(stdout)
	enc.SetIndent("", "  ")
	if err := enc.Encode(out); err != nil {
		fmt.Fprintln(stderr, "drawdown checklist: "+err.Error())
		return ExitError
	}
	return ExitOK
}

// writeChecklistText prints a heading that says what the checklist is for,
// then one step a line: number, section, text, caution and source, each
// after a " | ", and the standing line that the tool does not authorise.
func writeChecklistText(w io.Writer, c model.Checklist) {
	ctx := c.Context
	about := []string{plain(ctx.Liquid), "to the " + ctx.Discharge.Label()}
	switch {
	case ctx.ConfinedSpace && ctx.Entering:
		about = append(about, "confined space with entry")
	case ctx.ConfinedSpace:
		about = append(about, "confined space, worked from outside")
	}
	if ctx.OpenWater {
		about = append(about, "open edge or deep water")
	}
	if ctx.Overnight {
		about = append(about, "may stand overnight")
	}
	if why := ctx.HoldReason(); why != "" {
		about = append(about, "RELEASE HELD: "+why)
	}
	fmt.Fprintf(w, "Checklist: %s (%d steps)\n", strings.Join(about, "; "), len(c.Steps))
	for i, s := range c.Steps {
		line := fmt.Sprintf("%d | %s | %s", i+1, s.Section.Title(), plain(s.Text))
		if s.Caution != "" {
			line += " | caution: " + plain(s.Caution)
		}
		line += " | source: " + plain(s.Rule)
		fmt.Fprintln(w, line)
	}
	fmt.Fprintln(w, presets.PlanNotPermit)
}

// plain is text from outside on one line of output: the one sanitiser.
func plain(s string) string { return present.Clean(s) }

func checklistUsage(w io.Writer, table []flagDef) {
	fmt.Fprintln(w, "usage: drawdown checklist [calc flags] [site facts] [--json]")
	fmt.Fprintln(w, "Prints the checklist a job with these facts gets, one step a line with its section,")
	fmt.Fprintln(w, "caution and source; --json prints a list of {id, section, text, caution, source}.")
	fmt.Fprintln(w, "The site facts are the crew's answers; the tool does not judge them. A --tank-preset")
	fmt.Fprintln(w, "the catalogue flags as a confined space sets --confined; without --entry all work is")
	fmt.Fprintln(w, "from outside. The calc flags are those of drawdown calc; without --hose-id, --hose,")
	fmt.Fprintln(w, "--hose-length, --lift or --drop the checklist quotes no plan figures. Exit status 0,")
	fmt.Fprintln(w, "2 for bad input (one line naming the flag).")
	fmt.Fprintln(w)
	writeFlagHelp(w, table)
	fmt.Fprintln(w, presets.PlanNotPermit)
}
