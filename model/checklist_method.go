package model

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

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

// ErrUnknownMethod is returned by ParsePrimingMethod for a name it does not
// know.
var ErrUnknownMethod = errors.New("unknown priming method")

// ParsePrimingMethod accepts a method ID ("submerge-and-cap", "hand-pump",
// …; the IDs match the presets catalogue) or its label, ignoring case and
// surrounding space; "submerge" and "supply-fill" are accepted as aliases. An empty text gives "" and no
// error (no method chosen yet). Anything that names mouth suction is refused
// with a message saying it is never a method.
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

// primeSteps adds the steps of the chosen method (field-practice §2.1–§2.7).
func (b *builder) primeSteps(ctx ChecklistContext) {
	h := ctx.Hazards
	rated := ""
	if h.Fuel() {
		rated = "Hose, fittings and containers must be rated for the liquid; keep the transfer bonded."
	}
	switch ctx.Method {
	case PrimeSubmerge:
		hands := ""
		if h.Any() {
			hands = "Hands and arms go into the liquid: wear the PPE its hazards call for."
		}
		b.add(SectionPrime, "prime.submerge.fill",
			"Lay the whole hose in the source and work the air out until it is full (a full hose is noticeably heavier).",
			hands, rulePractice)
		b.add(SectionPrime, "prime.submerge.close",
			"While it is still submerged, close one end with a cap, plug or valve.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.weight",
			"Keep the open end under the surface; weight it a short way back without pinching the hose.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.carry",
			"Carry the closed end over the rim, keeping it closed, and lay it at the outlet point below the source surface.", "", rulePractice)
		b.add(SectionPrime, "prime.submerge.open",
			"Open the closed end and stand clear; it may gurgle before the flow settles.", "", rulePractice)
	case PrimeSupplyFill:
		caution := "Never leave the hose connected to the tap with its other end in the liquid: a pressure drop can draw the liquid back into the drinking-water supply. Keep an air gap or use a hose vacuum breaker."
		if h.Any() {
			caution += " Only water primes this way; adding water to a fuel or chemical job is usually wrong — choose another method."
		}
		b.add(SectionPrime, "prime.supply.cap",
			"Fit a closable nozzle or cap on one end of the hose.", "", rulePractice)
		b.add(SectionPrime, "prime.supply.fill",
			"Fill the hose from a clean tap or bucket, close the nozzle, then take the hose off the supply, keeping the open end up.",
			caution, ruleBackflow)
		b.add(SectionPrime, "prime.supply.place",
			"Take the capped end to the discharge point and lower the open end into the source.", "", rulePractice)
		b.add(SectionPrime, "prime.supply.open",
			"Open the cap and stand clear of the outlet.", "", rulePractice)
	case PrimeCrestPort:
		b.add(SectionPrime, "prime.crest.fit",
			"Fit a valve at the foot of the outlet leg, a closable fill port at the crest, and a valve or one-way valve at the intake.",
			"Without a one-way intake valve two people are needed.", rulePractice)
		b.add(SectionPrime, "prime.crest.close",
			"Close the outlet valve and the intake closure.", "", rulePractice)
		b.add(SectionPrime, "prime.crest.fill",
			"Pour or pump water into the crest port until both legs are full and no more air comes out.",
			"Use clean water; a potable supply needs an air gap or backflow preventer.", ruleBackflow)
		b.add(SectionPrime, "prime.crest.cap",
			"Cap the crest port airtight.", "", rulePractice)
		b.add(SectionPrime, "prime.crest.open",
			"Open the intake, then open the outlet valve; flow starts within seconds.", "", rulePractice)
	case PrimeHandPump:
		pump := "Squeeze the bulb or work the pump until liquid passes the crest and the line is full; hold a bulb with its flow arrow pointing up."
		if ctx.Strokes > 0 {
			pump += " Expect about " + strconv.Itoa(ctx.Strokes) + " strokes to fill the hose."
		}
		b.add(SectionPrime, "prime.pump.place",
			"Put the intake in the source clear of sludge (and of settled water under fuel, unless that water is what is being removed) and the outlet in the receiver, lower than the source surface.",
			rated, rulePractice)
		b.add(SectionPrime, "prime.pump.close",
			"Close or pinch the outlet end if the pump design needs it.", "", rulePractice)
		b.add(SectionPrime, "prime.pump.stroke", pump, "", rulePractice)
		b.add(SectionPrime, "prime.pump.release",
			"Release the outlet; the flow continues by itself.", "", rulePractice)
	case PrimeShakeValve:
		b.add(SectionPrime, "prime.shake.outlet",
			"Put the outlet end in the receiver, lower than the source surface.", rated, rulePractice)
		b.add(SectionPrime, "prime.shake.lower",
			"Lower the valve end into the liquid, deep enough to stroke without drawing air.", "", rulePractice)
		b.add(SectionPrime, "prime.shake.stroke",
			"Shake with short, vigorous strokes until the flow is established.", "", rulePractice)
		b.add(SectionPrime, "prime.shake.rest",
			"Rest the valve end above the bottom sediment, kept submerged.", "", rulePractice)
	case PrimeVacuum:
		b.add(SectionPrime, "prime.vacuum.close",
			"Close the outlet valve and keep the intake submerged.", "", rulePractice)
		b.add(SectionPrime, "prime.vacuum.connect",
			"Connect the vacuum pump to the crest port with a liquid trap in front of the pump.", rated, rulePractice)
		b.add(SectionPrime, "prime.vacuum.draw",
			"Draw air out until liquid fills the intake leg, the crest and the outlet leg.", "", rulePractice)
		b.add(SectionPrime, "prime.vacuum.open",
			"Close the crest port, then open the outlet valve slowly.", "", rulePractice)
	case PrimePumpStart:
		caution := "Start the pump gradually: a hose under pump pressure can whip."
		if h.Fuel() {
			caution += " The pump must be rated for the liquid and its vapour."
		}
		b.add(SectionPrime, "prime.pumpstart.connect",
			"Connect a pump so it pushes liquid from the source through the hose and out of the discharge end.",
			caution, rulePractice)
		b.add(SectionPrime, "prime.pumpstart.run",
			"Run the pump until liquid flows steadily from the far end.", "", rulePractice)
		b.add(SectionPrime, "prime.pumpstart.stop",
			"Keeping the intake submerged, stop the pump and close or disconnect its branch without letting air in.",
			"Air let in at this moment kills the start.", rulePractice)
		b.add(SectionPrime, "prime.pumpstart.confirm",
			"Confirm flow at the discharge end before leaving the pump.", "", rulePractice)
	default:
		b.add(SectionPrime, "prime.choose",
			"Choose a priming method for this job.", "", rulePractice)
	}
}

// methodUnsuited names the hazard that rules the method out, or "": the
// same rules as the presets catalogue's priming entries (submerge-and-cap is
// not for flammable or volatile liquids — hands in the liquid, vapour at the
// face; filling from a supply adds water to a fuel job).
func methodUnsuited(m PrimingMethod, h Hazards) string {
	switch m {
	case PrimeSubmerge:
		if h.Flammable {
			return "a flammable liquid"
		}
		if h.Volatile {
			return "a volatile liquid"
		}
	case PrimeSupplyFill:
		if h.Flammable || h.Combustible {
			return "a fuel (it adds water to the job)"
		}
	default: // the other methods suit every liquid
	}
	return ""
}
