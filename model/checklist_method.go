package model

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"drawdown/presets"
)

// PrimingMethod names a way of filling the hose before the siphon runs. Only
// the methods of field-practice §2 exist; mouth suction is never a method.
type PrimingMethod string

// Priming methods (field-practice §2.1–§2.7).
const (
	PrimeSubmerge   PrimingMethod = "submerge-and-cap" // fill in the source, cap one end
	PrimeSupplyFill PrimingMethod = "fill-from-supply" // fill from a clean supply, far end closed
	PrimeCrestPort  PrimingMethod = "crest-port"       // fill through a port at the crest
	PrimeHandPump   PrimingMethod = "hand-pump"        // hand pump or squeeze bulb
	PrimeShakeValve PrimingMethod = "shake-valve"      // shake-type check valve at the intake
	PrimeVacuum     PrimingMethod = "vacuum"           // vacuum pump at the crest
	PrimePumpStart  PrimingMethod = "pump-start"       // pump-assisted start
)

// PrimingMethods lists the methods in the order a picker shows them.
func PrimingMethods() []PrimingMethod {
	return []PrimingMethod{PrimeSubmerge, PrimeSupplyFill, PrimeCrestPort, PrimeHandPump,
		PrimeShakeValve, PrimeVacuum, PrimePumpStart}
}

// Label is the trade description of the method.
func (m PrimingMethod) Label() string {
	switch m {
	case PrimeSubmerge:
		return "submerge and cap"
	case PrimeSupplyFill:
		return "fill from a clean supply, far end closed"
	case PrimeCrestPort:
		return "fill through a crest port"
	case PrimeHandPump:
		return "hand pump or squeeze bulb"
	case PrimeShakeValve:
		return "shake-type check valve"
	case PrimeVacuum:
		return "vacuum at the crest"
	case PrimePumpStart:
		return "pump-assisted start"
	}
	return string(m)
}

// HandsInLiquid reports whether the method puts hands and arms into the
// source liquid (submerge-and-cap fills the hose in the source). Inside a
// confined space that is entry (field-practice §3.1: reaching in counts).
func (m PrimingMethod) HandsInLiquid() bool { return m == PrimeSubmerge }

// ErrUnknownMethod is returned by ParsePrimingMethod for a name it does not
// know.
var ErrUnknownMethod = errors.New("unknown priming method")

// ParsePrimingMethod accepts a method ID ("submerge-and-cap", "hand-pump",
// …; the IDs match the presets catalogue) or its label, ignoring case and
// surrounding space; "submerge" and "supply-fill" are accepted as aliases. An
// empty text gives "" and no error (no method chosen yet). Anything that
// names mouth suction is refused with a message saying it is never a method.
func ParsePrimingMethod(text string) (PrimingMethod, error) {
	t := strings.ToLower(strings.TrimSpace(text))
	if t == "" {
		return "", nil
	}
	for _, m := range PrimingMethods() {
		if t == string(m) || t == m.Label() {
			return m, nil
		}
	}
	switch t {
	case "submerge":
		return PrimeSubmerge, nil
	case "supply-fill":
		return PrimeSupplyFill, nil
	}
	if strings.Contains(t, "mouth") || strings.Contains(t, "suck") {
		return "", fmt.Errorf("priming method %q: starting a siphon by mouth is never a method; choose one of %s: %w",
			text, methodList(), ErrUnknownMethod)
	}
	return "", fmt.Errorf("priming method %q: choose one of %s: %w", text, methodList(), ErrUnknownMethod)
}

func methodList() string {
	var ids []string
	for _, m := range PrimingMethods() {
		ids = append(ids, string(m))
	}
	return strings.Join(ids, ", ")
}

// MethodSuits reports whether priming method m suits the job of ctx, and
// when it does not, why, in plain words for the method picker and the
// Result ("a vacuum pump draws the flammable vapour through itself"). No
// method chosen ("") suits. The checklist lists an unsuited method's steps
// never; it asks for another method instead.
//
// The liquid rules follow the catalogue's priming entries and field-practice
// §2 and §3.3 (our reading; common practice):
//   - submerge-and-cap puts hands and arms in the liquid and carries a full
//     hose over the rim: not for a fuel, a volatile or a hot liquid;
//   - filling from a clean supply adds water: not for a fuel or a chemical
//     (toxic liquid);
//   - a crest port is filled by pouring: water does not belong in a fuel,
//     and pouring the fuel splashes and charges it;
//   - a vacuum pump draws the liquid's vapour through itself, and a volatile
//     liquid boils under the vacuum: not for a flammable or volatile liquid;
//   - a hand pump, a shake valve and a pump-assisted start suit every liquid
//     (with a pump rated for it).
//
// The site rules: submerge-and-cap needs a source big enough to swallow the
// whole hose (the hose no longer than the longest line across the liquid
// surface), and inside a confined space it is entry, unsuited when the crew
// works from outside.
func MethodSuits(m PrimingMethod, ctx ChecklistContext) (ok bool, why string) {
	if why := methodLiquidRule(m, ctx); why != "" {
		return false, why
	}
	if m.HandsInLiquid() {
		f := ctx.Figures
		if f.HoseLength > 0 && f.SourceSpan > 0 && f.HoseLength > f.SourceSpan {
			return false, "the " + quote(DimLength, f.HoseLength, f.Units) + " hose is longer than the source is across (" +
				quote(DimLength, f.SourceSpan, f.Units) + "), so it cannot lie under the surface"
		}
		if ctx.ConfinedSpace && !ctx.Entry {
			return false, "it puts hands in the liquid inside the confined space, which is entry, and the crew works from outside"
		}
	}
	return true, ""
}

func methodLiquidRule(m PrimingMethod, ctx ChecklistContext) string {
	switch m {
	case PrimeSubmerge:
		switch {
		case ctx.Fuel() || ctx.has(presets.Volatile):
			return "hands and arms would go into the fuel, and a hose full of it is carried over the rim"
		case ctx.has(presets.Hot):
			return "hands and arms would go into hot liquid"
		}
	case PrimeSupplyFill:
		switch {
		case ctx.Fuel():
			return "it adds water to a fuel"
		case ctx.has(presets.Toxic):
			return "it adds water to a chemical"
		}
	case PrimeCrestPort:
		if ctx.Fuel() {
			return "the crest port is filled by pouring: water does not belong in a fuel, and pouring the fuel itself splashes it and builds static charge"
		}
	case PrimeVacuum:
		if ctx.has(presets.Flammable) || ctx.has(presets.Volatile) {
			return "a vacuum pump draws the flammable vapour through itself, and a volatile liquid boils under the vacuum"
		}
	case PrimeHandPump, PrimeShakeValve, PrimePumpStart, "":
	}
	return ""
}

// SuitedMethods lists the methods that suit ctx, in picker order.
func SuitedMethods(ctx ChecklistContext) []PrimingMethod {
	var out []PrimingMethod
	for _, m := range PrimingMethods() {
		if ok, _ := MethodSuits(m, ctx); ok {
			out = append(out, m)
		}
	}
	return out
}

// primeSteps adds the steps of the chosen method (field-practice §2.1–§2.7),
// or, when the method does not suit the job, one step saying why and which
// methods do.
func (b *builder) primeSteps(ctx ChecklistContext) {
	if ctx.Method == "" {
		b.add(SectionPrime, "prime.choose", "Choose a priming method",
			"Choose a priming method for this job.", "", rulePractice)
		b.must()
		return
	}
	if ok, why := MethodSuits(ctx.Method, ctx); !ok {
		var names []string
		for _, m := range SuitedMethods(ctx) {
			names = append(names, m.Label())
		}
		b.add(SectionPrime, "prime.method-unsuited", "Choose another priming method",
			"The chosen method ("+ctx.Method.Label()+") does not suit this job: "+why+". Choose another method before priming; these suit it: "+strings.Join(names, "; ")+".",
			"", "presets catalogue (priming methods); common practice")
		b.must()
		return
	}
	switch ctx.Method {
	case PrimeSubmerge:
		b.submergeSteps(ctx)
	case PrimeSupplyFill:
		b.supplySteps()
	case PrimeCrestPort:
		b.crestPortSteps()
	case PrimeHandPump:
		b.handPumpSteps(ctx)
	case PrimeShakeValve:
		b.shakeSteps(ctx)
	case PrimeVacuum:
		b.vacuumSteps(ctx)
	case PrimePumpStart:
		b.pumpStartSteps(ctx)
	}
}

// rated is the caution for a fuel's hose, fittings and containers.
func rated(ctx ChecklistContext) string {
	if ctx.Fuel() {
		return "Hose, fittings and containers must be rated for the liquid; keep the transfer bonded."
	}
	return ""
}

func (b *builder) submergeSteps(ctx ChecklistContext) {
	hands := ""
	if ctx.harmful() {
		hands = "Hands and arms go into the liquid: wear the protective equipment its hazards call for."
	}
	b.add(SectionPrime, "prime.submerge.fill", "Fill the hose in the source",
		"Lay the whole hose in the source and work the air out until it is full (a full hose is noticeably heavier).",
		hands, rulePractice)
	b.add(SectionPrime, "prime.submerge.close", "Close one end under water",
		"While it is still submerged, close one end with a cap, plug or valve.", "", rulePractice)
	b.add(SectionPrime, "prime.submerge.weight", "Weight the open end",
		"Keep the open end under the surface; weight it a short way back without pinching the hose.", "", rulePractice)
	b.add(SectionPrime, "prime.submerge.carry", "Carry the closed end to the outlet",
		"Carry the closed end over the rim, keeping it closed, and lay it at the outlet point below the source surface.", "", rulePractice)
	b.add(SectionPrime, "prime.submerge.open", "Open the closed end",
		"Open the closed end and stand clear; it may gurgle before the flow settles.", "", rulePractice)
}

func (b *builder) supplySteps() {
	b.add(SectionPrime, "prime.supply.cap", "Cap one end",
		"Fit a closable nozzle or cap on one end of the hose.", "", rulePractice)
	b.add(SectionPrime, "prime.supply.fill", "Fill from a clean supply",
		"Fill the hose from a clean tap or bucket, close the nozzle, then take the hose off the supply, keeping the open end up.",
		"Never leave the hose connected to the tap with its other end in the liquid: a pressure drop can draw the liquid back into the drinking-water supply. Keep an air gap or use a hose vacuum breaker.",
		ruleBackflow)
	b.add(SectionPrime, "prime.supply.place", "Place the hose ends",
		"Take the capped end to the discharge point and lower the open end into the source.", "", rulePractice)
	b.add(SectionPrime, "prime.supply.open", "Open the cap",
		"Open the cap and stand clear of the outlet.", "", rulePractice)
}

func (b *builder) crestPortSteps() {
	b.add(SectionPrime, "prime.crest.fit", "Fit the valves and crest port",
		"Fit a valve at the foot of the outlet leg, a closable fill port at the crest, and a valve or one-way valve at the intake.",
		"Without a one-way intake valve two people are needed.", rulePractice)
	b.add(SectionPrime, "prime.crest.close", "Close outlet and intake",
		"Close the outlet valve and the intake closure.", "", rulePractice)
	b.add(SectionPrime, "prime.crest.fill", "Fill through the crest port",
		"Pour or pump clean water into the crest port until both legs are full and no more air comes out.",
		"A potable supply needs an air gap or backflow preventer.", ruleBackflow)
	b.add(SectionPrime, "prime.crest.cap", "Cap the crest port",
		"Cap the crest port airtight.", "", rulePractice)
	b.add(SectionPrime, "prime.crest.open", "Open intake, then outlet",
		"Open the intake, then open the outlet valve; flow starts within seconds.", "", rulePractice)
}

func (b *builder) handPumpSteps(ctx ChecklistContext) {
	f := ctx.Figures
	pump := "Squeeze the bulb or work the pump until liquid passes the crest and the line is full; hold a bulb with its flow arrow pointing up."
	switch {
	case f.Strokes > 0 && f.PrimingVolume > 0:
		pump += " Expect about " + strconv.Itoa(f.Strokes) + " strokes: the hose holds about " + quote(DimVolume, f.PrimingVolume, f.Units) + "."
	case f.Strokes > 0:
		pump += " Expect about " + strconv.Itoa(f.Strokes) + " strokes to fill the hose."
	}
	b.add(SectionPrime, "prime.pump.place", "Place intake and outlet",
		"Put the intake end in the source and the outlet end "+ctx.outletPlace()+", lower than the source surface.",
		rated(ctx), rulePractice)
	b.add(SectionPrime, "prime.pump.close", "Close the outlet if needed",
		"Close or pinch the outlet end if the pump design needs it.", "", rulePractice)
	b.add(SectionPrime, "prime.pump.stroke", "Pump until the line is full", pump, "", rulePractice)
	b.add(SectionPrime, "prime.pump.release", "Release the outlet",
		"Release the outlet; the flow continues by itself.", "", rulePractice)
}

func (b *builder) shakeSteps(ctx ChecklistContext) {
	b.add(SectionPrime, "prime.shake.outlet", "Place the outlet",
		"Put the outlet end "+ctx.outletPlace()+", lower than the source surface.", rated(ctx), rulePractice)
	b.add(SectionPrime, "prime.shake.lower", "Lower the valve end",
		"Lower the valve end into the liquid, deep enough to stroke without drawing air.", "", rulePractice)
	b.add(SectionPrime, "prime.shake.stroke", "Shake until it flows",
		"Shake with short, vigorous strokes until the flow is established.", "", rulePractice)
	b.add(SectionPrime, "prime.shake.rest", "Rest the valve end",
		"Rest the valve end above the bottom sediment, kept submerged.", "", rulePractice)
}

func (b *builder) vacuumSteps(ctx ChecklistContext) {
	b.add(SectionPrime, "prime.vacuum.close", "Close the outlet valve",
		"Close the outlet valve and keep the intake submerged.", "", rulePractice)
	b.add(SectionPrime, "prime.vacuum.connect", "Connect the vacuum pump",
		"Connect the vacuum pump to the crest port with a liquid trap in front of the pump.", rated(ctx), rulePractice)
	b.add(SectionPrime, "prime.vacuum.draw", "Draw the liquid up",
		"Draw air out until liquid fills the intake leg, the crest and the outlet leg.", "", rulePractice)
	b.add(SectionPrime, "prime.vacuum.open", "Open the outlet slowly",
		"Close the crest port, then open the outlet valve slowly.", "", rulePractice)
}

func (b *builder) pumpStartSteps(ctx ChecklistContext) {
	caution := "Start the pump gradually: a hose under pump pressure can whip."
	if ctx.Fuel() {
		caution += " The pump must be rated for the liquid and its vapour."
	}
	if ctx.ConfinedSpace {
		caution += " An engine-driven pump stands downwind, away from the opening."
	}
	b.add(SectionPrime, "prime.pumpstart.connect", "Connect the starting pump",
		"Connect a pump so it pushes liquid from the source through the hose and out of the discharge end.",
		caution, rulePractice)
	b.add(SectionPrime, "prime.pumpstart.run", "Run the pump until it flows",
		"Run the pump until liquid flows steadily from the far end.", "", rulePractice)
	b.add(SectionPrime, "prime.pumpstart.stop", "Stop the pump without letting air in",
		"Keeping the intake submerged, stop the pump and close or disconnect its branch without letting air in.",
		"Air let in at this moment kills the start.", rulePractice)
	b.add(SectionPrime, "prime.pumpstart.confirm", "Confirm the flow",
		"Confirm flow at the discharge end before leaving the pump.", "", rulePractice)
}
