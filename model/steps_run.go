package model

import "drawdown/presets"

// primeSection adds the standing cautions and the method's steps
// (field-practice §2, §3.2).
func (b *builder) primeSection(ctx ChecklistContext) {
	b.add(SectionPrime, "prime.no-mouth", "Never by mouth",
		"Prime only by the method below. Never start a siphon by mouth suction.",
		"Fuel, sewage and chemicals drawn into the mouth can be inhaled into the lungs; this can be fatal hours later.",
		ruleMouth)
	if ctx.Fuel() {
		b.add(SectionPrime, "prime.no-pressure", "No air pressure on the container",
			"Do not pressurise the source container to start the flow (no blowing into it, no air pressure on a drum).",
			"Workplace codes for flammable liquids forbid transfer by air pressure on the container.",
			ruleFlammable)
	}
	b.primeSteps(ctx)
}

// runSection adds run and watch (field-practice §2.9, §3.1, §3.3, §3.8,
// §4.3).
func (b *builder) runSection(ctx ChecklistContext) {
	b.add(SectionRun, "run.start", "Record the start",
		"Record the time flow started and confirm steady flow at the outlet.", "", rulePractice)
	if ctx.Fuel() {
		b.add(SectionRun, "run.slow-fill", "Slow until the fill end is submerged",
			"Keep the flow slow (throttle the outlet valve or a hose clamp) until the hose end in the receiving container is under the liquid, then let it run with the end kept low.",
			"Splash filling charges the fuel and makes mist; the start of a fill is when static ignitions happen.",
			ruleStatic)
	}
	attend := ""
	if ctx.Fuel() {
		attend = "Never leave a fuel transfer: an overflowing container is a fire hazard."
	}
	b.add(SectionRun, "run.attend", "Stay with the siphon", "Stay with the siphon while it runs.", attend, rulePractice)
	b.must()
	if ctx.Overnight {
		b.overnightSteps(ctx)
	}
	b.add(SectionRun, "run.levels", "Read the level",
		"Read the source level at intervals and enter each reading with its time.", "", rulePractice)
	b.add(SectionRun, "run.air", "Watch for air at the crest",
		"Watch for air at the crest and falling flow (gurgling, a spurting or sagging outlet stream); bleed the crest or re-prime if flow sags.",
		"", rulePractice)
	if ctx.ConfinedSpace {
		text := "Keep a meter running at the opening for the whole job, and re-test before anyone leans over it; leave the opening at the first alarm."
		if ctx.Entering {
			text = "Keep a meter running at the opening for the whole job and a personal monitor on each entrant; everyone leaves at the first alarm."
		}
		b.add(SectionRun, "run.atmosphere", "Monitor the air continuously", text,
			"Lowering the liquid or stirring sludge can release hydrogen sulfide and other gases.", ruleConfined)
	}
	if ctx.OilCheck && !ctx.Transfer {
		b.add(SectionRun, "run.sheen", "Watch for a sheen",
			"Watch the discharge for sheen, odour or discoloration; if any appears, stop at once, record it and collect the liquid.",
			"A sheen on the water is a reportable discharge of oil. The facility's plan or permit governs.",
			ruleSheen)
	}
	if ctx.Transfer {
		b.add(SectionRun, "run.receiver", "Watch the receiver",
			"Watch the receiver level and stop before it is full (leave room for the hose contents).", "", rulePractice)
	}
	stop := "Stop before the intake uncovers or reaches sludge or a floating oil layer."
	if ctx.Fuel() {
		stop = "Stop before the intake uncovers or reaches sludge or the water settled under the fuel."
	}
	b.add(SectionRun, "run.stop-before", "Stop before the intake uncovers", stop, "", rulePractice)
}

// overnightSteps: whether the siphon may stand overnight, and frost on a
// standing hose (field-practice §2.9, §3.3, §3.8; common practice).
func (b *builder) overnightSteps(ctx ChecklistContext) {
	switch {
	case ctx.Fuel():
		b.add(SectionRun, "run.overnight", "Not overnight: fuel",
			"A fuel transfer is never left to run unattended: stop the siphon and close the containers before the crew leaves; it does not stand overnight.",
			"", ruleFlammable)
	case ctx.OilCheck && !ctx.Transfer:
		b.add(SectionRun, "run.overnight", "Not overnight: supervised release",
			"A containment release runs under responsible supervision: stop it and reseal the valve before the crew leaves, unless the facility's plan allows an attended night release.",
			"Some facility plans allow releases in daylight hours only.", ruleSPCC)
	default:
		morning := "check that the outlet cannot scour or flood anything by morning"
		if ctx.Transfer {
			morning = "check that the receiver cannot overflow by morning"
		}
		text := "Before leaving the siphon to stand overnight: fence or mark the hose and the outlet, weight both ends, " + morning + ", and check the siphon first thing."
		if ctx.ConfinedSpace {
			text += " Close or guard the opening, and test the air again before anyone works at it in the morning."
		}
		b.add(SectionRun, "run.overnight", "Standing overnight", text, "", rulePractice)
		b.must()
	}
	switch {
	case ctx.has(presets.FreezingRisk):
		b.add(SectionRun, "run.overnight-frost", "Frost overnight",
			freezingText(ctx)+" A slow or stopped hose can freeze solid and split: drain it before leaving, or keep it running, lay it to drain and insulate exposed runs; check it first thing.",
			"", rulePractice)
		b.must()
	case !ctx.Figures.HasAirTemp:
		b.add(SectionRun, "run.overnight-frost", "Overnight low",
			"Check the overnight low in the forecast; if it may freeze, drain the hose before leaving.", "", rulePractice)
	}
}

// stopSection adds stop and drain the hose (field-practice §2.9).
func (b *builder) stopSection(ctx ChecklistContext) {
	switch ctx.Method {
	case PrimeCrestPort, PrimeVacuum:
		b.add(SectionStop, "stop.break", "Stop the flow",
			"Stop the flow: close the outlet valve slowly, or open the crest vent so the column splits and each leg drains back.",
			"A fast valve closure on a long rigid line causes a pressure surge (water hammer) that can split couplings.",
			rulePractice)
	default:
		room := ""
		if ctx.Transfer {
			room = "Lift the intake only if the receiver has room for the hose contents."
		}
		b.add(SectionStop, "stop.break", "Stop the flow",
			"Stop the flow: lift the intake clear of the liquid so the hose runs out "+ctx.outletPlace()+", or raise the outlet above the source surface so the hose contents run back.",
			room, rulePractice)
	}
	b.add(SectionStop, "stop.record", "Record the stop",
		"Record the stop time and the source level.", "", rulePractice)
	drain := "Drain the hose " + ctx.outletPlace() + " or back into the source."
	if ctx.has(presets.FreezingRisk) {
		drain += " Drain it completely so it cannot freeze."
	}
	drainCaution := ""
	if ctx.harmful() {
		drainCaution = "Never drain oily, sewage or chemical liquid onto the ground or into a drain."
	}
	b.add(SectionStop, "stop.drain-hose", "Drain the hose", drain, drainCaution, rulePractice)
	capText := "Cap or plug both hose ends before moving the hose."
	switch {
	case ctx.Fuel():
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for fuel."
	case ctx.has(presets.Biohazard):
		capText = "Cap or plug both hose ends before moving the hose; bag or tag it as used for sewage."
	}
	b.add(SectionStop, "stop.cap", "Cap the hose ends", capText, "", rulePractice)
	if ctx.Fuel() {
		b.add(SectionStop, "stop.unbond", "Unbond last",
			"Keep the transfer bonded until the hose is drained and capped; then remove the bonding clamps.",
			"", ruleBonding)
	}
}

// closeOutSection adds the close-out (field-practice §2.9, §3.4, §3.8, §5).
func (b *builder) closeOutSection(ctx ChecklistContext) {
	release := ctx.OilCheck && !ctx.Transfer
	if release {
		b.add(SectionCloseOut, "closeout.inspect", "Inspect the discharge point",
			"Inspect the discharge point for sheen, discoloration, turbidity and erosion; record what you saw, with times, for the discharge record.",
			"Keep the record as the facility's plan or permit requires (SPCC inspection records: three years).",
			ruleSPCC)
		b.needNote()
		b.add(SectionCloseOut, "closeout.reseal", "Reseal the drain valve",
			"Close and reseal any containment drain valve that was used; record the time and the new seal number.",
			"", ruleSPCC)
		b.add(SectionCloseOut, "closeout.release-record", "Release record complete",
			"Complete the release record: valve ID, seal numbers, who opened and resealed the valve, the responsible supervisor, the weather and rain since the last inspection, photo references, any sample results the permit asks for, and how the volume released was estimated.",
			"", ruleSPCC)
	}
	if ctx.has(presets.Biohazard) {
		b.add(SectionCloseOut, "closeout.decon", "Clean and disinfect",
			"Clean and disinfect the hose, tools and boots; wash hands before eating, drinking or smoking; change out of work clothes before leaving.",
			"", ruleSewage)
	}
	if ctx.Fuel() {
		b.add(SectionCloseOut, "closeout.store", "Store hose and containers",
			"Store the drained hose and containers in a ventilated, approved place.", deferLocal, ruleFlammable)
	}
	if ctx.harmful() || ctx.Transfer {
		b.add(SectionCloseOut, "closeout.disposal", "Record the disposal",
			"Record how the collected liquid, absorbents and rinse water were handled (hauler, drums, manifest).",
			deferLocal, rulePractice)
	}
	if ctx.ConfinedSpace {
		text := "Record that the work was done from outside, with any problems, as the site's confined-space program asks."
		if ctx.Entering {
			text = "When everyone is out, close the entry permit; note any problems on it and keep it as the site program requires."
		}
		b.add(SectionCloseOut, "closeout.permit", "Close the confined-space record", text,
			"Cancelled permits are kept at least one year for program review.", ruleConfined)
	}
	b.add(SectionCloseOut, "closeout.volume", "Record the volume",
		"Record the final level and the volume discharged, and how the volume was estimated (level change and tank size, the plan, or a meter).",
		"", rulePractice)
	b.must()
	b.signOff()
}

func (b *builder) signOff() {
	b.add(SectionCloseOut, "closeout.signoff", "Sign off",
		"Sign off: name or initials of who did the work and of the responsible supervisor.",
		presets.NotAuthorised, rulePractice)
	b.must()
}

// heldSteps replace the prime, run and release steps when the release is
// held (ChecklistContext.HoldReason): do not release, stop a running siphon,
// record, notify as the plan requires, collect (field-practice §3.8; 40 CFR
// 110 and 112.8(c)(3)).
func (b *builder) heldSteps(ctx ChecklistContext) {
	k := ctx.hold()
	caution, rule := deferLocal, ruleFlammable
	switch k {
	case holdSheen:
		caution = "Detergents or dispersants are not a fix: they hide oil and are themselves prohibited. The facility's plan or permit governs."
		rule = ruleSheen
	case holdSewage:
		rule = ruleStormwater
	case holdFuel, holdNone:
	}
	b.add(SectionPrime, "hold.no-release", "Do not release",
		"Do not release: "+ctx.HoldReason()+". Do not prime; if a siphon is running, stop it now.", caution, rule)
	if k == holdSheen {
		b.add(SectionStop, "hold.record", "Record what was seen",
			"Record what was seen (sheen, odour, colour), where and when; take photos with time stamps.", "", ruleSPCC)
		b.needNote()
		b.add(SectionStop, "hold.notify", "Notify as the plan requires",
			"Make the notifications the facility's plan or permit requires, and record who was told and when.",
			"A sheen reaching waters or shorelines is a reportable discharge of oil. "+deferLocal, ruleSheen)
	}
	collect := rulePractice
	if k == holdSheen {
		collect = ruleSPCC
	}
	b.add(SectionCloseOut, "hold.collect", "Collect for disposal",
		"Arrange collection for proper disposal (drums, a tote or a vacuum truck) and record the hauler and manifest.",
		deferLocal, collect)
	b.needNote()
	if k == holdSheen || ctx.OilCheck {
		b.add(SectionCloseOut, "closeout.reseal", "Reseal the drain valve",
			"Close and reseal any containment drain valve; record the time and the seal number.", "", ruleSPCC)
	}
	b.signOff()
}
