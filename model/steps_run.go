package model

// runSection adds run and watch (field-practice §2.9, §3.1, §3.8, §4.3).
func (b *builder) runSection(ctx ChecklistContext) {
	h := ctx.Hazards
	b.add(SectionRun, "run.start",
		"Record the time flow started and confirm steady flow at the outlet.",
		"", rulePractice)
	attend := ""
	if h.Fuel() {
		attend = "Never leave a fuel transfer: an overflowing container is a fire hazard."
	}
	b.add(SectionRun, "run.attend",
		"Stay with the siphon while it runs.", attend, rulePractice)
	b.add(SectionRun, "run.levels",
		"Read the source level at intervals and enter each reading with its time.",
		"", rulePractice)
	b.add(SectionRun, "run.air",
		"Watch for air at the crest and falling flow (gurgling, a spurting or sagging outlet stream); bleed the crest or re-prime if flow sags.",
		"", rulePractice)
	if ctx.ConfinedSpace {
		b.add(SectionRun, "run.atmosphere",
			"Keep monitoring the atmosphere from outside while the level falls.",
			"Lowering the liquid or stirring sludge can release hydrogen sulfide and other gases.",
			ruleConfined)
	}
	if h.Environmental {
		b.add(SectionRun, "run.sheen",
			"Watch the discharge for sheen, odour or discoloration; if any appears, stop at once, record it and collect the liquid.",
			"A sheen on the water is a reportable discharge of oil. The facility's plan or permit governs.",
			ruleSheen)
	}
	if ctx.Receiver || ctx.Discharge == DischargeContainer {
		b.add(SectionRun, "run.receiver",
			"Watch the receiver level and stop before it is full (leave room for the hose contents).",
			"", rulePractice)
	}
	b.add(SectionRun, "run.stop-before",
		"Stop before the intake uncovers or reaches sludge or a floating oil layer.",
		"", rulePractice)

}

// stopSection adds stop and drain the hose (field-practice §2.9).
func (b *builder) stopSection(ctx ChecklistContext) {
	h := ctx.Hazards
	switch ctx.Method {
	case PrimeCrestPort, PrimeVacuum:
		b.add(SectionStop, "stop.break",
			"Stop the flow: close the outlet valve slowly, or open the crest vent so the column splits and each leg drains back.",
			"A fast valve closure on a long rigid line causes a pressure surge (water hammer) that can split couplings.",
			rulePractice)
	default:
		b.add(SectionStop, "stop.break",
			"Stop the flow: lift the intake clear of the liquid so the hose runs out into the receiver, or raise the outlet above the source surface so the hose contents run back.",
			"Lift the intake only if the receiver has room for the hose contents.", rulePractice)
	}
	b.add(SectionStop, "stop.record",
		"Record the stop time and the source level.", "", rulePractice)
	drain := "Drain the hose into the receiver or back into the source."
	drainCaution := ""
	if h.Any() {
		drainCaution = "Never drain oily, sewage or chemical liquid onto the ground or into a drain."
	}
	if h.FreezingRisk {
		drain += " Drain it completely so it cannot freeze."
	}
	b.add(SectionStop, "stop.drain-hose", drain, drainCaution, rulePractice)
	capText := "Cap or plug both hose ends before moving the hose."
	switch {
	case h.Fuel():
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for fuel."
	case h.Biohazard:
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for sewage."
	}
	b.add(SectionStop, "stop.cap", capText, "", rulePractice)
	if h.Fuel() {
		b.add(SectionStop, "stop.unbond",
			"Keep the transfer bonded until the hose is drained and capped; then remove the bonding clamps.",
			"", ruleBonding)
	}

}

// closeOutSection adds the close-out (field-practice §2.9, §3.4, §3.8, §5).
func (b *builder) closeOutSection(ctx ChecklistContext) {
	h := ctx.Hazards
	if h.Environmental {
		b.add(SectionCloseOut, "closeout.inspect",
			"Inspect the discharge point for sheen, discoloration, turbidity and erosion; record what you saw, with times, for the discharge record.",
			"Keep the record as the facility's plan or permit requires (SPCC inspection records: three years).",
			ruleSPCC)
		b.needNote()
		b.add(SectionCloseOut, "closeout.reseal",
			"Close and reseal any containment drain valve that was used; record the time.",
			"", ruleSPCC)
	}
	if h.Biohazard {
		b.add(SectionCloseOut, "closeout.decon",
			"Clean and disinfect the hose, tools and boots; wash hands before eating, drinking or smoking; change out of work clothes before leaving.",
			"", ruleSewage)
	}
	if h.Fuel() {
		b.add(SectionCloseOut, "closeout.store",
			"Store the drained hose and containers in a ventilated, approved place.",
			deferLocal, ruleFlammable)
	}
	if h.Any() || ctx.Discharge == DischargeContainer {
		b.add(SectionCloseOut, "closeout.disposal",
			"Record how the collected liquid, absorbents and rinse water were handled (hauler, drums, manifest).",
			deferLocal, rulePractice)
	}
	if ctx.ConfinedSpace {
		b.add(SectionCloseOut, "closeout.permit",
			"Close the entry permit; note any problems on it and keep it as the site program requires.",
			"Cancelled permits are kept at least one year for program review.", ruleConfined)
	}
	b.add(SectionCloseOut, "closeout.volume",
		"Record the final level and the volume discharged.", "", rulePractice)
	b.add(SectionCloseOut, "closeout.signoff",
		"Sign off: name or initials of who did the work and of the supervisor.",
		"This record does not authorise a discharge.", rulePractice)

}
