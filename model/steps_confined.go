package model

// confinedSteps adds the confined-space steps of the hazard check
// (field-practice §3.1; OSHA 29 CFR 1910.146): the permit, the
// work-from-outside path or the entry steps, isolation, engine exhaust,
// atmospheric testing in order (oxygen, flammable, toxic), the attendant and
// rescue. Continuous monitoring is a run step (runSection) and the permit's
// close a close-out step.
func (b *builder) confinedSteps(ctx ChecklistContext) {
	if ctx.Entering {
		b.add(SectionHazard, "hazard.cs.permit", "Entry permit",
			"Confirm the entry permit is issued for this entry (the space, purpose, hazards, isolation, acceptable conditions, entrants, attendant, entry supervisor, communications and rescue) and record the permit number.",
			deferLocal, ruleConfined)
	} else {
		b.add(SectionHazard, "hazard.cs.permit", "Confined-space classification and permit",
			"Confirm the space's classification with the site's confined-space program; record the permit number, or the program's written reason why work from outside needs none.",
			"Leaning in or reaching in to place the hose counts as entry; if anyone must, stop and get the entry permit. "+deferLocal,
			ruleConfined)
	}
	b.needNote()
	if !ctx.Entering {
		b.add(SectionHazard, "hazard.cs.outside", "Work from outside",
			"Place the intake from the rim with a pole, a rope or a weighted hose; no head, arm or hand goes past the plane of the opening at any time.",
			"If the work cannot be done from outside, stop: entry needs the entry permit, the rescue arrangements and an attendant.",
			ruleEntryPlane)
	}
	b.add(SectionHazard, "hazard.cs.isolate", "Isolate inflows, lock out pumps",
		"Close and lock, or blank, every pipe and valve that can let liquid or gas into the space, and lock out and tag the pumps, mixers and power that serve it.",
		"A pump that starts or a valve that opens while the hose is placed can flood the space or change its air.",
		ruleIsolation)
	b.add(SectionHazard, "hazard.cs.exhaust", "Engine exhaust away from the opening",
		"Keep vehicles, generators and engine-driven pumps downwind and well away from the opening so their exhaust cannot be drawn in; switch off idling engines nearby.",
		"Exhaust carries carbon monoxide, which gathers in pits and vaults.", ruleExhaust)
	b.add(SectionHazard, "hazard.cs.oxygen", "Test the air: oxygen",
		"Test the atmosphere from outside the space, oxygen first, with a calibrated direct-reading meter at the top, middle and bottom; record the reading, time and tester's initials.",
		"Oxygen comes first because combustible-gas sensors read low in oxygen-poor air. Hazardous: below 19.5 % or above 23.5 % oxygen.",
		ruleAtmosphere)
	b.needNote()
	b.add(SectionHazard, "hazard.cs.flammable-gas", "Test the air: flammable gas",
		"Then test for flammable gases and vapours, from outside, top, middle and bottom; record the reading, time and initials.",
		"Hazardous: above 10 % of the lower flammable limit. Fuel vapour is heavier than air and pools in pits.",
		ruleAtmosphere)
	b.needNote()
	b.add(SectionHazard, "hazard.cs.toxic", "Test the air: toxic gases",
		"Then test for toxic gases, hydrogen sulfide (H₂S) and carbon monoxide (CO) among them, from outside, top, middle and bottom; record the readings, time and initials.",
		"Hazardous: above the permissible exposure limit. Idling engines nearby add carbon monoxide.",
		ruleAtmosphere)
	b.needNote()
	if ctx.Entering {
		b.add(SectionHazard, "hazard.cs.ventilate", "Forced-air ventilation",
			"Ventilate the space with a blower drawing clean air from away from engines and exhaust, before entry and for as long as anyone is inside; test the air again after ventilating.",
			"Ventilation does not replace testing: keep monitoring.", ruleVentilation)
		b.add(SectionHazard, "hazard.cs.attendant", "Attendant at the opening",
			"Post an attendant outside the space for the whole entry who never enters, keeps count of the entrants, stays in touch with them and can summon rescue.",
			deferLocal, ruleConfined)
		b.add(SectionHazard, "hazard.cs.retrieval", "Harness and retrieval line",
			"For a vertical entry (down through a manhole or hatch), each entrant wears a full-body harness on a retrieval line to a mechanical device (a tripod and winch) set over the opening.",
			"The retrieval line lets the attendant lift a collapsed entrant out without going in.", ruleRetrieval)
		b.add(SectionHazard, "hazard.cs.rescue", "Rescue service ready",
			"Confirm the rescue service named on the permit is available and can reach the space in time, before anyone enters.",
			"Would-be rescuers are a large share of confined-space deaths: nobody goes in after a collapsed worker without the planned rescue arrangements.",
			ruleRescue)
		return
	}
	b.add(SectionHazard, "hazard.cs.attendant", "Second person at the opening",
		"Keep a second person at the opening for the whole job, with a way to call for help; nobody works at the opening alone.",
		deferLocal, ruleConfined)
	b.add(SectionHazard, "hazard.cs.rescue", "Who to call",
		"Know who to call: if anyone collapses at or in the opening, call the emergency number and the site's rescue service.",
		"Would-be rescuers are a large share of confined-space deaths: nobody goes in after a collapsed worker without the planned rescue arrangements.",
		ruleRescue)
}
