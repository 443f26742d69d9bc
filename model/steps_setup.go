package model

import "drawdown/presets"

// setupSection adds the set-up (field-practice §3.3, §3.6–§3.9, §4.2): the
// route, the intake and the outlet; what protects the ground and drains;
// the receiver; the fuel's hose, containers, bonding and ignition sources;
// frost; the sheen inspection before a release.
func (b *builder) setupSection(ctx ChecklistContext) {
	b.add(SectionSetup, "setup.route", "Lay the hose route",
		"Lay the hose on a steady rise to the crest and a steady fall to the outlet, with no humps; check every joint is airtight and the hose is rated for suction.",
		"Lay-flat discharge hose flattens under suction.", rulePractice)
	intake := ""
	if ctx.OpenWater {
		intake = "A large-bore intake can trap a person or animal: keep people out of the water near it."
	}
	place := "Place the intake below the surface with margin, screened, clear of sludge and floating oil; weight it so it stays submerged."
	if ctx.Fuel() {
		place = "Place the intake below the surface with margin, clear of sludge and of any water settled under the fuel (unless that water is what is being removed)."
	}
	b.add(SectionSetup, "setup.intake", "Place the intake", place, intake, rulePractice)
	b.add(SectionSetup, "setup.outlet", "Secure the outlet end",
		"Secure the discharge end: tie it down or weight it so it cannot leave the receiver or drain; keep people clear of the outlet while starting.",
		"A free hose end can jump and thrash when trapped air is expelled.", rulePractice)
	if ctx.Discharge == DischargeStorm && !ctx.Held() {
		b.add(SectionSetup, "setup.outlet-protection", "Protect the ground at the outlet",
			"Land the discharge on a stable surface (splash pad, riprap, filter bag or vegetated ground), not bare soil or a bank.",
			"Turbid or sediment-laden water may need a filter bag or settling before discharge. "+deferLocal,
			ruleStormwater)
	}
	if ctx.harmful() {
		b.add(SectionSetup, "setup.containment", "Containment and absorbents",
			"Set out containment and absorbents under the hose ends, joints and containers.", "", rulePractice)
	}
	if ctx.Fuel() || ctx.harmful() && ctx.Transfer {
		b.add(SectionSetup, "setup.drain-cover", "Cover nearby drains",
			"Cover or block any storm drain or gully near the work so that a spill cannot reach it.", "", rulePractice)
	}
	if ctx.has(presets.Biohazard) {
		b.add(SectionSetup, "setup.hose.dedicated", "Hose kept for sewage",
			"Use a hose kept for sewage work (or one to be disinfected afterwards); never use it later for drinking water.",
			"", ruleSewage)
	}
	if ctx.Transfer {
		room := "Check the receiver has room for the planned volume plus the hose contents"
		if v := ctx.Figures.PrimingVolume; v > 0 {
			room += " (about " + quote(DimVolume, v, ctx.Figures.Units) + ")"
		}
		b.add(SectionSetup, "setup.receiver", "Receiver has room",
			room+", and stands lower than the source surface.", "", rulePractice)
	}
	if ctx.Fuel() {
		b.fuelSetupSteps(ctx)
	}
	if ctx.has(presets.FreezingRisk) {
		b.add(SectionSetup, "setup.freezing", "Frost",
			freezingText(ctx)+" Check for ice on banks and in the hose, and plan to drain the hose fully at the stop so it cannot freeze solid.",
			"", rulePractice)
	}
	if ctx.OilCheck && !ctx.Transfer {
		b.add(SectionSetup, "setup.inspect-before", "Inspect for a sheen before release",
			"Before any release, inspect the liquid for sheen, odour of product or discoloration; record the result, time and initials in the note.",
			"If any sheen, odour or discoloration is seen, do not release: record it and collect the liquid for proper disposal. The facility's plan or permit governs.",
			ruleSheen)
		b.needNote()
	}
}

// fuelSetupSteps: a hose that sheds charge, containers on the ground,
// bonding, ignition sources (field-practice §3.3; NFPA 77). Fuels are static
// accumulators: they hold the charge that flow gives them (NFPA 77, from
// memory), which is why diesel is bonded like gasoline.
func (b *builder) fuelSetupSteps(ctx ChecklistContext) {
	b.add(SectionSetup, "setup.hose-static", "Hose that sheds static",
		"Use a hose rated for the fuel that is conductive or static-dissipative, or whose wire helix is bonded to the metal fittings at both ends.",
		"A plain plastic hose cannot shed the charge the flow builds.", ruleStatic)
	b.add(SectionSetup, "setup.containers", "Approved containers on the ground",
		"Use containers listed for the liquid, standing on the ground (never on a truck-bed liner or carpet); keep the hose end in contact with the container and fill from the bottom.",
		"Plastic containers cannot be grounded; their size for flammable liquids is limited.",
		ruleContainers)
	bond := "Flowing and splashing fuel builds static charge, and fuels hold it (they are static accumulators). " + deferLocal
	if !ctx.has(presets.Flammable) {
		bond = ctx.Liquid + " is combustible rather than flammable, but it is a static accumulator: it holds the charge the flow gives it, so it is bonded all the same. " + deferLocal
	}
	b.add(SectionSetup, "setup.bonding", "Bond and ground",
		"Bond the source and receiving containers together and ground one of them, with clamps biting through paint to bare metal, before opening either container.",
		bond, ruleBonding)
	b.add(SectionSetup, "setup.ignition", "No ignition sources",
		"Remove ignition sources: no smoking, flames, pilot lights or non-rated electrical equipment; work outdoors or ventilated; disconnect vehicle or boat batteries on fuel systems; keep a Class B extinguisher and absorbents at hand.",
		deferLocal, ruleFlammable)
}

// freezingText says why frost is a risk, quoting the figures: the air or
// the liquid near the liquid's freezing (or pour) point.
func freezingText(ctx ChecklistContext) string {
	f := ctx.Figures
	s := "Frost risk"
	switch {
	case f.HasAirTemp && f.Cold > 0:
		s += ": air at " + quote(DimTemperature, f.AirTemp, f.Units) + ", and the liquid freezes or gels at " + quote(DimTemperature, f.Cold, f.Units) + "."
	case f.Temperature > 0 && f.Cold > 0:
		s += ": the liquid is at " + quote(DimTemperature, f.Temperature, f.Units) + " and freezes or gels at " + quote(DimTemperature, f.Cold, f.Units) + "."
	default:
		s += "."
	}
	return s
}
