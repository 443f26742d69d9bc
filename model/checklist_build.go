package model

// Rule families named in cautions (as field-practice §3 and its sources name
// them).
const (
	ruleConfined   = "OSHA 29 CFR 1910.146; 29 CFR 1926 Subpart AA"
	ruleAtmosphere = "OSHA 29 CFR 1910.146 (atmospheric testing order)"
	ruleFlammable  = "NFPA 30; OSHA 29 CFR 1910.106"
	ruleBonding    = "NFPA 77; OSHA 29 CFR 1910.106(e)(6)(ii)"
	ruleContainers = "NFPA 77; NIOSH 98-111"
	ruleSewage     = "CDC guidance for workers handling human waste or sewage"
	ruleSPCC       = "EPA 40 CFR 112.8(c)(3)"
	ruleSheen      = "EPA 40 CFR 110 (sheen rule); 40 CFR 112.8(c)(3)"
	ruleElectrical = "electrical safety guidance for flooded spaces"
	ruleWater      = "MSHA water-hazard guidance; common practice"
	ruleBackflow   = "local cross-connection control program"
	ruleStormwater = "MS4 / NPDES permits; construction stormwater permit"
	ruleSewer      = "local sewer-use ordinance"
	rulePractice   = "common practice"
)

const deferLocal = "Local codes, permits and the site's written program govern."

// BuildChecklist generates the steps for ctx, all pending, in section order.
// It is pure: no clock, no I/O. Steps that do not apply to the liquid, the
// method or the site are left out. With no method chosen the prime section
// holds only the standing caution and a step asking for a method.
func BuildChecklist(ctx ChecklistContext) Checklist {
	b := &builder{}
	b.hazardSection(ctx)
	b.setupSection(ctx)
	if ctx.Held() {
		b.heldSteps(ctx)
		return Checklist{Context: ctx, Steps: b.steps}
	}
	b.primeSection(ctx)
	b.runSection(ctx)
	b.stopSection(ctx)
	b.closeOutSection(ctx)
	return Checklist{Context: ctx, Steps: b.steps}
}

// primeSection adds the standing cautions and the method's steps (field-practice §2).
func (b *builder) primeSection(ctx ChecklistContext) {
	h := ctx.Hazards
	b.add(SectionPrime, "prime.no-mouth",
		"Prime only by the method below. Never start a siphon by mouth suction.",
		"Fuel, sewage and chemicals drawn into the mouth can be inhaled into the lungs; this can be fatal hours later.",
		"poison-centre warnings; common practice")
	if h.Fuel() {
		b.add(SectionPrime, "prime.no-pressure",
			"Do not pressurise the source container to start the flow (no blowing into it, no air pressure on a drum).",
			"Workplace codes for flammable liquids forbid transfer by air pressure on the container.",
			ruleFlammable)
	}
	if why := methodUnsuited(ctx.Method, h); why != "" {
		b.add(SectionPrime, "prime.method-unsuited",
			"The chosen method ("+ctx.Method.Label()+") is not suited to "+why+": choose another method before priming.",
			"", "presets catalogue (priming methods); common practice")
	}
	b.primeSteps(ctx)
}

// heldSteps replaces the prime, run and release steps when a sheen was seen:
// do not release, stop a running siphon, record, collect, notify as the plan
// requires (field-practice §3.8; 40 CFR 110 and 112.8(c)(3)).
func (b *builder) heldSteps(ctx ChecklistContext) {
	b.add(SectionPrime, "hold.no-release",
		"Sheen, odour or discoloration recorded: do not release this liquid to the "+ctx.Discharge.Label()+". Do not prime; if a siphon is running, stop it now.",
		"Detergents or dispersants are not a fix: they hide oil and are themselves prohibited. The facility's plan or permit governs.",
		ruleSheen)
	b.add(SectionStop, "hold.record",
		"Record what was seen (sheen, odour, colour), where and when; take photos with time stamps.",
		"", ruleSPCC)
	b.needNote()
	b.add(SectionStop, "hold.notify",
		"Make the notifications the facility's plan or permit requires, and record who was told and when.",
		"A sheen reaching waters or shorelines is a reportable discharge of oil. "+deferLocal, ruleSheen)
	b.add(SectionCloseOut, "hold.collect",
		"Arrange collection for proper disposal (drums or a vacuum truck) and record the hauler and manifest.",
		deferLocal, ruleSPCC)
	b.needNote()
	b.add(SectionCloseOut, "closeout.reseal",
		"Close and reseal any containment drain valve; record the time.", "", ruleSPCC)
	b.add(SectionCloseOut, "closeout.signoff",
		"Sign off: name or initials of who did the work and of the supervisor.",
		"This record does not authorise a discharge.", rulePractice)
}

type builder struct{ steps []Step }

func (b *builder) add(sec Section, id, text, caution, rule string) {
	b.steps = append(b.steps, Step{ID: id, Section: sec, Text: text, Caution: caution, Rule: rule, State: StatePending})
}

// needNote marks the last added step as needing a note to be done.
func (b *builder) needNote() { b.steps[len(b.steps)-1].NoteRequired = true }
