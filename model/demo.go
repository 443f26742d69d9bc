package model

import "time"

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
	j.Site = "Harrowfen Depot (demo, invented)"
	j.Location = "North yard, bund B2 around diesel day tank T4; outlet to the east ditch"
	j.Crew = "A. Marsh (lead), T. Okoro"
	j.Source = "Bund B2: open concrete bund, 8 m × 5 m floor, 0.95 m walls"
	j.Receiver = "East ditch (storm), 1.15 m below the bund floor"
	j.Notes = "Demo job with invented names and figures. Inspect the water for a sheen " +
		"before release; if a sheen is seen, do not discharge: call for a vacuum truck."
	j.Inputs = map[FieldID]string{
		FieldHoseID:          "38 mm",
		FieldHoseLength:      "12 m",
		FieldHoseMaterial:    "suction-corrugated",
		FieldHoseFittings:    "strainer-basket, bend-90-r2",
		FieldHoseCount:       "1",
		FieldPriming:         string(PrimeHandPump),
		FieldPumpStroke:      "0.3 L",
		FieldLift:            "0.6 m",
		FieldDrop:            "1.5 m",
		FieldIntakeHeight:    "5 cm",
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
	j.Checklist = BuildChecklist(ChecklistContext{
		Liquid: "rainwater from an oil bund",
		// The water may carry oil from the bund: inspect and record before
		// release (field-practice §3).
		Hazards:   Hazards{Environmental: true},
		Method:    PrimeHandPump,
		Discharge: DischargeStorm,
	})
	j.Resume = Resume{Pane: "Hose", Field: FieldHoseID}
	return j
}
