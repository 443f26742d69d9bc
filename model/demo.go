package model

import (
	"strings"
	"time"

	"drawdown/presets"
)

// Template is a starting point for a new job. The demo is one template; the
// others set up a kind of job (the catalogue tank, the liquid, the priming
// method and the site facts that go with it) and leave every measurement to
// the crew: no name, site, crew or figure of any scenario comes with them.
type Template struct {
	ID      string
	Name    string
	Summary string
}

// Template IDs.
const (
	TemplateDemo    = "demo"
	TemplateSumpPit = "sump-pit"
	TemplatePond    = "pond"
)

// Templates lists the templates in the order a picker shows them.
func Templates() []Template {
	return []Template{
		{TemplateDemo, "Demo: bund rainwater release",
			"the built-in demo, an invented scenario with invented names and figures"},
		{TemplateSumpPit, "Sump pit, worked from outside",
			"a flooded pump-house sump pit (a confined space) drained from the rim into the sanitary sewer with a hand pump"},
		{TemplatePond, "Pond lowering",
			"a farm pond lowered over the bank through a rigid pipe primed at a crest port, onto the ground, over days"},
	}
}

// FromTemplate returns a new job named name from template id, created at
// now, with its checklist built from the built-in catalogue. The empty ID
// gives a blank job (NewJob: no text of any template). The demo keeps its
// own scenario (site, crew, figures; see DemoJob) under the new name. A
// blank name or an unknown ID is an *InputError (the latter listing the
// IDs).
func FromTemplate(id, name string, now time.Time) (Job, error) {
	name, err := cleanLine("Job name", name, maxLine)
	if err != nil {
		return Job{}, err
	}
	if name == "" {
		return Job{}, &InputError{Field: "Job name", Detail: "give the job a name"}
	}
	cat := presets.Builtin()
	var j Job
	switch strings.ToLower(strings.TrimSpace(id)) {
	case "":
		j = NewJob(name, SI, now)
	case TemplateDemo:
		j = DemoJob()
		j.Name, j.Created, j.Updated = name, now, now
	case TemplateSumpPit:
		j = NewJob(name, SI, now)
		j.Template = TemplateSumpPit
		if t, ok := cat.Tank("sump-pit"); ok {
			j.ApplyTankPreset(t)
		}
		j.Inputs[FieldLiquid] = "water"
		j.Inputs[FieldPriming] = string(PrimeHandPump)
		j.Facts.ConfinedSpace = true
		j.Facts.Discharge = DischargeSewer
		j.Notes = "From the sump-pit template: measure the hose, the lift over the rim, the drop to the sewer inlet and the liquid level before the plan can run."
	case TemplatePond:
		j = NewJob(name, SI, now)
		j.Template = TemplatePond
		if t, ok := cat.Tank("farm-pond"); ok {
			j.ApplyTankPreset(t)
		}
		j.Inputs[FieldLiquid] = "water"
		j.Inputs[FieldPriming] = string(PrimeCrestPort)
		j.Facts.OpenWater = true
		j.Facts.Discharge = DischargeStorm
		j.Facts.Overnight = true
		j.Notes = "From the pond template: set the pond's own sizes, the pipe, the lift over the bank and the drop to the outlet before the plan can run."
	default:
		var ids []string
		for _, t := range Templates() {
			ids = append(ids, t.ID)
		}
		return Job{}, &InputError{Field: "Template", Detail: "“" + id + "” is not a template; accepted " + strings.Join(ids, ", ")}
	}
	if !now.IsZero() {
		j.Date = now.Local().Format(dateLayout) // the day of the work, until the crew says otherwise
	}
	j.Checklist = Checklist{}
	j.RebuildChecklist(Compute(j, cat))
	return j, nil
}

// DemoJob returns the built-in demo: an invented scenario with invented
// names. After a week of rain, water stands 35 cm deep in the concrete bund
// (secondary containment) around a diesel day tank at a made-up depot. A crew
// plans to siphon it over the 0.95 m bund wall into the drainage ditch 1.15 m
// below the bund floor, after checking it for an oil sheen. The siphon runs:
// a 0.6 m lift and a 1.5 m drop with a 38 mm suction hose.
//
// The clock is fixed so that the demo is the same on every run.
func DemoJob() Job {
	created := time.Date(2026, time.March, 14, 7, 30, 0, 0, time.UTC)
	j := NewJob("Bund B2 rainwater release", SI, created)
	j.Template = TemplateDemo
	j.Site = "Harrowfen Depot (demo, invented)"
	j.Location = "North yard, bund B2 around diesel day tank T4; outlet to the east ditch"
	j.Date = "2026-03-14"
	j.Crew = []CrewMember{{Name: "A. Marsh", Role: "lead"}, {Name: "T. Okoro"}}
	j.Supervisor = "J. Pell (yard supervisor, invented)"
	j.Source = "Bund B2: open concrete bund, 8 m × 5 m floor, 0.95 m walls"
	j.Receiver = "East ditch (storm), 1.15 m below the bund floor"
	j.Notes = "Demo job with invented names and figures. Inspect the water for a sheen " +
		"before release; if a sheen is seen, do not discharge: call for a vacuum truck."
	j.Inputs = map[FieldID]string{
		FieldHoseID:          "38 mm",
		FieldHoseLength:      "12 m",
		FieldHoseMaterial:    "suction-corrugated",
		FieldHoseFittings:    "bend-90-r2",
		FieldIntakeKind:      "strainer-flat",
		FieldHoseCount:       "1",
		FieldPriming:         string(PrimeHandPump),
		FieldPumpStroke:      "0.3 L",
		FieldLift:            "0.6 m",
		FieldDrop:            "1.5 m",
		FieldIntakeHeight:    "0 m",
		FieldOutletSubmerged: "no",
		FieldTolHeight:       "3 cm",
		FieldLiquid:          "water",
		FieldTemp:            "8 °C",
		FieldAltitude:        "45 m",
		FieldTankShape:       "rectangular",
		FieldTankLength:      "8 m",
		FieldTankWidth:       "5 m",
		FieldTankHeight:      "0.95 m",
		FieldTankLevel:       "0.35 m",
	}
	// Rain in an oil bund may carry oil: inspect and record before release
	// (field-practice §3.8); the ditch is a storm discharge.
	j.Facts = SiteFacts{Discharge: DischargeStorm, MayCarryOil: true}
	j.RebuildChecklist(Compute(j, presets.Builtin()))
	j.Resume = Resume{Pane: "Hose", Field: FieldHoseID}
	return j
}
