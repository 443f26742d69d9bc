package model

import (
	"math"
	"strconv"

	"drawdown/presets"
)

// hazardSection adds the hazard check (field-practice §1.2 question 1, §3):
// the liquid, the confined space, live equipment, open water, the liquid's
// own hazards, and where the liquid goes.
func (b *builder) hazardSection(ctx ChecklistContext) {
	liquid := ctx.Liquid
	if liquid == "" {
		liquid = "not yet named"
	}
	b.add(SectionHazard, "hazard.liquid", "Identify the liquid",
		"Identify the liquid: "+liquid+". Check its hazards on the safety data sheet where there is one; note what it looks and smells like.",
		"Treat an unknown liquid as hazardous until it is identified.", rulePractice)
	b.must()
	if ctx.ConfinedSpace {
		b.confinedSteps(ctx)
	}
	if !ctx.Fuel() { // a fuel's electrical equipment is an ignition source: setup.ignition
		b.add(SectionHazard, "hazard.electrical", "Live equipment isolated",
			"Check for energised equipment in or touching the liquid (outlets, cords, pumps, panels); have the supply isolated by an electrician or the utility before anyone goes near the water.",
			"Never step into water that may be live or work a breaker while standing in water; treat every flooded device as live. Work in pairs.",
			ruleElectrical)
	}
	if ctx.OpenWater {
		b.openWaterSteps()
	}
	if ctx.Fuel() {
		b.fuelHazardStep(ctx)
	}
	if ctx.has(presets.Toxic) {
		caution := "Avoid breathing vapour; work upwind or with ventilation."
		if ctx.has(presets.Volatile) {
			caution += " The vapour is heavier than air and gathers in pits and low ground."
		}
		b.add(SectionHazard, "hazard.toxic", "Protective equipment for the liquid",
			"Wear the protective equipment the safety data sheet calls for (gloves, eye protection; respiratory protection if it says so).",
			caution, "the liquid's safety data sheet")
	}
	if ctx.has(presets.Biohazard) {
		b.sewageSteps()
	}
	if ctx.has(presets.Hot) {
		hot := "Hot liquid"
		if t := ctx.Figures.Temperature; t > 0 {
			hot += " (" + quote(DimTemperature, t, ctx.Figures.Units) + ")"
		}
		b.add(SectionHazard, "hazard.hot", "Hot liquid",
			hot+": wear insulated gloves and a face shield, and keep hands clear of the hose ends while starting.",
			"Hot liquid lowers the crest limit; expect air at the crest.", rulePractice)
		b.must()
	}
	b.dischargeStep(ctx)
}

// openWaterSteps: guard the edge, flotation, ring buoy, never alone
// (field-practice §3.6).
func (b *builder) openWaterSteps() {
	b.add(SectionHazard, "hazard.edge", "Guard the edge",
		"Guard or barricade the open edge; keep vehicles and equipment back from soft or undercut banks.",
		"Banks and dams are slippery and can be undercut.", ruleWater)
	b.add(SectionHazard, "hazard.water.flotation", "Flotation",
		"Everyone working within reach of the water wears a personal flotation device.", "", ruleWater)
	b.add(SectionHazard, "hazard.water.buoy", "Ring buoy",
		"Keep a ring buoy with a line at hand at the work point.", "", ruleWater)
	b.add(SectionHazard, "hazard.water.alone", "Never alone near water",
		"Never work alone near the water: a second person stays within sight and reach for the whole job.", "", ruleWater)
}

// fuelHazardStep: the liquid's NFPA 30 class, and whether a hose siphon is
// allowed for it (field-practice §3.3).
func (b *builder) fuelHazardStep(ctx ChecklistContext) {
	cls := ""
	if ctx.Class != presets.NoFlashClass {
		cls = " (NFPA 30 class " + ctx.Class.String() + ")"
	}
	f := ctx.Figures
	caution := "Whether a hose siphon may be used for this liquid at a workplace is a question for the employer and the local fire code; some rules forbid gravity dispensing from drums."
	switch {
	case ctx.has(presets.Combustible) && ctx.has(presets.Flammable) && f.Temperature > 0 && f.FlashPoint > 0:
		caution = ctx.Liquid + " at " + quote(DimTemperature, f.Temperature, f.Units) + " is within " +
			tempDiff(presets.FlashMargin, f.Units) + " of its flash point (" +
			quote(DimTemperature, f.FlashPoint, f.Units) + "): treat it as flammable. " + caution
	case !ctx.has(presets.Flammable):
		caution += " A combustible liquid handled within about 9 °C of its flash point is treated as flammable."
	}
	b.add(SectionHazard, "hazard.fuel", "Flammability and transfer method",
		"Note the liquid's flammability"+cls+" and confirm the employer and the local fire code allow this transfer method for it.",
		caution, ruleFlammable)
}

// sewageSteps: protective equipment, vaccinations and hydrogen sulfide
// (field-practice §3.1, §3.4).
func (b *builder) sewageSteps() {
	b.add(SectionHazard, "hazard.ppe.sewage", "Sewage protective equipment",
		"Put on protective equipment for sewage: goggles, face mask or splash shield, fluid-resistant coveralls, waterproof gloves and rubber boots; cover any cuts.",
		"No eating, drinking or smoking at the work area.", ruleSewage)
	b.add(SectionHazard, "hazard.sewage.vaccination", "Vaccinations for sewage work",
		"Confirm everyone handling the sewage has the vaccinations the employer's program offers for it (hepatitis A, tetanus and diphtheria).",
		"", ruleVaccination)
	b.add(SectionHazard, "hazard.sewage.h2s", "Hydrogen sulfide monitor",
		"Carry a gas monitor with a hydrogen sulfide (H₂S) sensor at the work point: sewage gives off H₂S, which is heavier than air, and stirring or lowering it releases more.",
		"H₂S deadens the sense of smell: a fading rotten-egg smell is no sign of safety. Leave at the first alarm.",
		ruleH2S)
}

// dischargeStep: where the liquid goes and who allowed it (field-practice
// §3.8). A fuel or a transfer is never directed to a storm drain or the
// ground.
func (b *builder) dischargeStep(ctx ChecklistContext) {
	switch ctx.hold() {
	case holdFuel:
		b.add(SectionHazard, "hazard.discharge", "Change where the liquid goes",
			"Do not send this liquid where it is meant to go: "+ctx.HoldReason()+". Change where it goes before anything else.",
			deferLocal, ruleFlammable+"; "+ruleSewer)
		b.must()
		return
	case holdSewage:
		b.add(SectionHazard, "hazard.discharge", "Change where the liquid goes",
			"Do not send this liquid where it is meant to go: "+ctx.HoldReason()+". Change where it goes before anything else.",
			deferLocal, ruleStormwater)
		b.must()
		return
	case holdSheen:
		b.add(SectionHazard, "hazard.discharge", "Release held",
			"Do not release: "+ctx.HoldReason()+". The liquid is collected instead (see the steps below).",
			deferLocal, ruleSheen)
		b.must()
		return
	case holdNone:
	}
	switch ctx.Discharge {
	case DischargeContainer:
		b.add(SectionHazard, "hazard.discharge", "Receiving vessel and destination",
			"Confirm the receiving vessel or container is suited to the liquid, who takes it away and where it goes; record the hauler or destination.",
			deferLocal, rulePractice)
	case DischargeTanker:
		b.add(SectionHazard, "hazard.discharge", "Tanker and destination",
			"Confirm the tanker or vacuum truck, the hauler and where the load goes; record the hauler and the manifest number.",
			deferLocal, rulePractice)
	case DischargeSewer:
		b.add(SectionHazard, "hazard.discharge", "Sewer discharge approved",
			"Confirm the sewer utility allows this discharge to the sanitary sewer; record the approval.",
			"Many sewer-use ordinances forbid stormwater, groundwater or oily water in the sanitary sewer without the utility's approval. "+deferLocal,
			ruleSewer)
	case DischargeStorm:
		b.add(SectionHazard, "hazard.discharge", "Discharge authorised",
			"Confirm the discharge to the storm drain or ground is allowed (permit, allowed category or site plan); record the authorisation.",
			"Anything that is not stormwater may be an illicit discharge; chlorinated water is dechlorinated first. "+deferLocal,
			ruleStormwater)
	default:
		b.add(SectionHazard, "hazard.discharge", "Where the liquid goes",
			"Confirm where the liquid is allowed to go and who authorised it; record the authorisation.",
			deferLocal, rulePractice)
	}
	b.needNote()
}

// tempDiff words a temperature difference of k kelvin ("9 °C", "16 °F").
func tempDiff(k float64, sys System) string {
	if sys == US {
		return strconv.Itoa(int(math.Round(k*1.8))) + " °F"
	}
	return strconv.Itoa(int(math.Round(k))) + " °C"
}
