package model

// hazardSection adds the hazard check (field-practice §1.2 question 1, §3).
func (b *builder) hazardSection(ctx ChecklistContext) {
	h := ctx.Hazards
	liquid := ctx.Liquid
	if liquid == "" {
		liquid = "not yet named"
	}
	b.add(SectionHazard, "hazard.liquid",
		"Identify the liquid ("+liquid+") and check its hazards on the safety data sheet where there is one; note what it looks and smells like.",
		"Treat an unknown liquid as hazardous until it is identified.", rulePractice)
	if ctx.ConfinedSpace {
		b.add(SectionHazard, "hazard.cs.permit",
			"Confirm the space's confined-space classification and that an entry permit is issued; record the permit number in the note.",
			"Leaning in or reaching in to place the hose counts as entry. Place the intake from outside (pole, rope, weighted hose) where you can. "+deferLocal,
			ruleConfined)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.oxygen",
			"Test the atmosphere from outside the space, oxygen first, with a calibrated direct-reading meter at the top, middle and bottom; record the reading, time and tester's initials.",
			"Oxygen comes first because combustible-gas sensors read low in oxygen-poor air. Hazardous: below 19.5 % or above 23.5 % oxygen.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.flammable-gas",
			"Then test for flammable gases and vapours, from outside, top, middle and bottom; record the reading, time and initials.",
			"Hazardous: above 10 % of the lower flammable limit. Fuel vapour is heavier than air and pools in pits.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.toxic",
			"Then test for toxic gases and vapours (such as hydrogen sulfide and carbon monoxide), from outside; record the reading, time and initials.",
			"Hazardous: above the permissible exposure limit. Idling engines nearby add carbon monoxide.",
			ruleAtmosphere)
		b.needNote()
		b.add(SectionHazard, "hazard.cs.attendant",
			"Post an attendant outside the space for the whole job, with a way to call for help.",
			deferLocal, ruleConfined)
		b.add(SectionHazard, "hazard.cs.rescue",
			"Confirm the rescue arrangements named on the permit are in place before anyone enters.",
			"Would-be rescuers are a large share of confined-space deaths: nobody goes in after a collapsed worker without the planned rescue arrangements.",
			ruleConfined)
	}
	b.add(SectionHazard, "hazard.electrical",
		"Check for energised equipment in or touching the liquid (outlets, cords, pumps, panels); have the supply isolated by an electrician or the utility before anyone goes near the water.",
		"Never step into water that may be live or work a breaker while standing in water; treat every flooded device as live. Work in pairs.",
		ruleElectrical)
	if ctx.OpenEdge {
		b.add(SectionHazard, "hazard.edge",
			"Guard or barricade the open edge; wear a personal flotation device where there is a drowning risk and keep a ring buoy with line at hand; keep vehicles back from soft edges.",
			"Never work alone near water. A large-bore intake can trap a person or animal: keep people out of the water near it.",
			ruleWater)
	}
	if h.Fuel() {
		cls := ""
		if h.FlammableClass != "" {
			cls = " (NFPA 30 class " + h.FlammableClass + ")"
		}
		caution := "Whether a hose siphon may be used for this liquid at a workplace is a question for the employer and the local fire code; some rules forbid gravity dispensing from drums."
		if !h.Flammable {
			caution += " A combustible liquid handled within about 9 °C of its flash point is treated as flammable."
		}
		b.add(SectionHazard, "hazard.fuel",
			"Note the liquid's flammability"+cls+" and confirm the transfer method is allowed for it.",
			caution, ruleFlammable)
	}
	if h.Toxic {
		caution := "Avoid breathing vapour; work upwind or with ventilation."
		if h.Volatile {
			caution += " The vapour is heavier than air and gathers in pits and low ground."
		}
		b.add(SectionHazard, "hazard.toxic",
			"Wear the protective equipment the safety data sheet calls for (gloves, eye protection; respiratory protection if it says so).",
			caution, "the liquid's safety data sheet")
	}
	if h.Biohazard {
		b.add(SectionHazard, "hazard.ppe.sewage",
			"Put on PPE for sewage: goggles, face mask or splash shield, fluid-resistant coveralls, waterproof gloves and rubber boots; cover any cuts.",
			"No eating, drinking or smoking at the work area.", ruleSewage)
	}
	if h.Hot {
		b.add(SectionHazard, "hazard.hot",
			"Hot liquid: wear insulated gloves and a face shield, and keep hands clear of the hose ends while starting.",
			"Hot liquid lowers the crest limit; expect air at the crest.", rulePractice)
	}
	switch ctx.Discharge {
	case DischargeContainer:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the receiving container or truck and who takes the liquid away; record the hauler or destination.",
			deferLocal, rulePractice)
		b.needNote()
	case DischargeSewer:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the sewer utility allows this discharge to the sanitary sewer; record the approval.",
			"Many sewer-use ordinances forbid stormwater, groundwater or oily water in the sanitary sewer without the utility's approval. "+deferLocal,
			ruleSewer)
		b.needNote()
	case DischargeStorm:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm the discharge to the storm drain or ground is allowed (permit, allowed category or site plan); record the authorisation.",
			"Anything that is not stormwater may be an illicit discharge; chlorinated water is dechlorinated first. "+deferLocal,
			ruleStormwater)
		b.needNote()
	case DischargeSameSite:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm where on site the liquid will go and that it cannot run onto neighbours, roads or back into the source.",
			deferLocal, rulePractice)
	default:
		b.add(SectionHazard, "hazard.discharge",
			"Confirm where the liquid is allowed to go and who authorised it; record the authorisation.",
			deferLocal, rulePractice)
	}

}

// setupSection adds the set-up (field-practice §3.3, §3.7, §3.8, §3.9, §4.2).
func (b *builder) setupSection(ctx ChecklistContext) {
	h := ctx.Hazards
	b.add(SectionSetup, "setup.route",
		"Lay the hose on a steady rise to the crest and a steady fall to the outlet, with no humps; check every joint is airtight and the hose is rated for suction.",
		"Lay-flat discharge hose flattens under suction.", rulePractice)
	b.add(SectionSetup, "setup.intake",
		"Place the intake below the surface with margin, screened, clear of sludge and floating oil; weight it so it stays submerged.",
		"", rulePractice)
	b.add(SectionSetup, "setup.outlet",
		"Secure the discharge end: tie it down or weight it so it cannot leave the receiver or drain; keep people clear of the outlet while starting.",
		"A free hose end can jump and thrash when trapped air is expelled.", rulePractice)
	if ctx.Discharge == DischargeStorm || ctx.Discharge == DischargeSameSite {
		b.add(SectionSetup, "setup.outlet-protection",
			"Land the discharge on a stable surface (splash pad, riprap, filter bag or vegetated ground), not bare soil or a bank.",
			"Turbid or sediment-laden water may need a filter bag or settling before discharge. "+deferLocal,
			ruleStormwater)
	}
	if h.Any() {
		b.add(SectionSetup, "setup.containment",
			"Set out containment and absorbents under the hose ends, joints and containers.",
			"", rulePractice)
	}
	if h.Biohazard {
		b.add(SectionSetup, "setup.hose.dedicated",
			"Use a hose kept for sewage work (or one to be disinfected afterwards); never use it later for drinking water.",
			"", ruleSewage)
	}
	if ctx.Receiver || ctx.Discharge == DischargeContainer {
		b.add(SectionSetup, "setup.receiver",
			"Check the receiver has room for the planned volume plus the hose contents, and stands lower than the source surface.",
			"", rulePractice)
	}
	if h.Fuel() {
		b.add(SectionSetup, "setup.containers",
			"Use containers listed for the liquid, standing on the ground (never on a truck-bed liner or carpet); keep the hose end in contact with the container and fill from the bottom.",
			"Plastic containers cannot be grounded; their size for flammable liquids is limited.",
			ruleContainers)
		b.add(SectionSetup, "setup.bonding",
			"Bond the source and receiving containers together and ground one of them, with clamps biting through paint to bare metal, before opening either container.",
			"Flowing and splashing liquid builds static charge. "+deferLocal,
			ruleBonding)
		b.add(SectionSetup, "setup.ignition",
			"Remove ignition sources: no smoking, flames, pilot lights or non-rated electrical equipment; work outdoors or ventilated; disconnect vehicle or boat batteries on fuel systems; keep a Class B extinguisher and absorbents at hand.",
			deferLocal, ruleFlammable)
	}
	if h.FreezingRisk {
		b.add(SectionSetup, "setup.freezing",
			"Freezing weather: check for ice on banks and in the hose, and plan to drain the hose fully at the stop so it cannot freeze solid.",
			"", rulePractice)
	}
	if h.Environmental {
		b.add(SectionSetup, "setup.inspect-before",
			"Before any release, inspect the liquid for sheen, odour of product or discoloration; record the result, time and initials in the note.",
			"If any sheen, odour or discoloration is seen, do not release: record it and collect the liquid for proper disposal. The facility's plan or permit governs.",
			ruleSheen)
		b.needNote()
	}

}
