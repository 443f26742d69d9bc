package presets

import (
	"strings"

	"drawdown/calc"
)

// Hazard is one hazard tag of a liquid. The model builds the job's checklist
// and cautions from these tags; each tag's String is a stable lowercase code
// used in the user preset file and in job records.
type Hazard uint16

// The hazard tags. Their values are bits so that a set fits in Hazards.
const (
	// Flammable: NFPA 30 Class I liquid (flash point below 37.8 °C / 100 °F),
	// or a combustible liquid handled within 9 K of its flash point. Calls for
	// bonding and grounding, no ignition sources and approved containers.
	Flammable Hazard = 1 << iota
	// Combustible: NFPA 30 Class II or III liquid (flash point at or above
	// 37.8 °C).
	Combustible
	// Volatile: high vapour pressure; the working lift is small and the
	// vapour is heavier than air.
	Volatile
	// Toxic: harmful if swallowed or breathed; for fuels an aspiration
	// hazard (the reason a siphon is never started by mouth).
	Toxic
	// Biohazard: sewage or wastewater; pathogens.
	Biohazard
	// Environmental: the discharge needs an inspection (sheen, colour, odour)
	// and a record, and may need a permit, before release.
	Environmental
	// Hot: the liquid is at or above HotThreshold; scalds and burns.
	Hot
	// FreezingRisk: the liquid is within FreezeMargin of its freezing or pour
	// point; a stopped hose can freeze or gel.
	FreezingRisk

	hazardEnd
)

// HotThreshold is the liquid temperature at and above which HazardsAt adds
// Hot: 50 °C. Common practice for scald warnings on hot water (a value from
// memory; ASTM C1055 uses 60 °C for hot surfaces, also from memory). Our
// choice errs on the side of warning.
const HotThreshold = calc.Temperature(323.15)

// FreezeMargin is the margin above a liquid's freezing or pour point within
// which HazardsAt adds FreezingRisk: 5 K (our choice).
const FreezeMargin = 5.0

// FlashMargin is the margin below a combustible liquid's flash point within
// which it is treated as flammable: 9 K (about 16 °F). Common practice,
// following the NFPA 30 advice to treat a combustible liquid heated near its
// flash point as flammable (value as quoted in the project's field-practice
// brief; the exact figure is from memory).
const FlashMargin = 9.0

var hazardNames = [...]string{
	"flammable", "combustible", "volatile", "toxic", "biohazard",
	"environmental", "hot", "freezing-risk",
}

var hazardText = [...]string{
	"flammable: bond and ground, no ignition sources, approved containers",
	"combustible: keep ignition sources away; treat as flammable near its flash point",
	"volatile: high vapour pressure, small working lift, heavy vapour",
	"toxic: harmful if swallowed or breathed; never start by mouth",
	"biohazard: sewage or wastewater; protective equipment and hygiene",
	"environmental: inspect the discharge and keep a record; a permit may be needed",
	"hot: scald and burn risk",
	"freezing risk: a stopped hose may freeze or gel",
}

// AllHazards lists every hazard tag in code order.
func AllHazards() []Hazard {
	out := make([]Hazard, 0, len(hazardNames))
	for h := Hazard(1); h < hazardEnd; h <<= 1 {
		out = append(out, h)
	}
	return out
}

func (h Hazard) index() int {
	for i := 0; i < len(hazardNames); i++ {
		if h == 1<<i {
			return i
		}
	}
	return -1
}

// String returns the stable code of the tag, e.g. "freezing-risk", or
// "unknown" for a value that is not a single tag.
func (h Hazard) String() string {
	if i := h.index(); i >= 0 {
		return hazardNames[i]
	}
	return "unknown"
}

// Description is a one-line reminder of what the tag means on site.
func (h Hazard) Description() string {
	if i := h.index(); i >= 0 {
		return hazardText[i]
	}
	return "unknown hazard"
}

// ParseHazard returns the tag with the given code (as String prints it).
func ParseHazard(s string) (Hazard, bool) {
	s = strings.ToLower(strings.TrimSpace(s))
	for i, n := range hazardNames {
		if s == n {
			return 1 << i, true
		}
	}
	return 0, false
}

// Hazards is a set of hazard tags.
type Hazards uint16

// Of returns the set holding the given tags.
func Of(hs ...Hazard) Hazards {
	var s Hazards
	for _, h := range hs {
		s |= Hazards(h)
	}
	return s
}

// Has reports whether h is in the set.
func (s Hazards) Has(h Hazard) bool { return h != 0 && s&Hazards(h) == Hazards(h) }

// With returns the set with h added.
func (s Hazards) With(h Hazard) Hazards { return s | Hazards(h) }

// Without returns the set with h removed.
func (s Hazards) Without(h Hazard) Hazards { return s &^ Hazards(h) }

// List returns the tags in the set in code order.
func (s Hazards) List() []Hazard {
	var out []Hazard
	for h := Hazard(1); h < hazardEnd; h <<= 1 {
		if s.Has(h) {
			out = append(out, h)
		}
	}
	return out
}

// String lists the codes joined by ", ", or "none".
func (s Hazards) String() string {
	l := s.List()
	if len(l) == 0 {
		return "none"
	}
	parts := make([]string, len(l))
	for i, h := range l {
		parts[i] = h.String()
	}
	return strings.Join(parts, ", ")
}

// FlashClass is the NFPA 30 class of a liquid by flash point (and, for
// Class I, boiling point).
type FlashClass uint8

// NFPA 30 (Flammable and Combustible Liquids Code) classes. Boundaries, as
// summarised by UW–Milwaukee EHSRM "NFPA definitions" and the project's
// field-practice brief: Class I below 37.8 °C (100 °F) — IA flash < 22.8 °C
// and boiling < 37.8 °C, IB flash < 22.8 °C and boiling ≥ 37.8 °C, IC flash
// 22.8–37.8 °C; Class II 37.8–60 °C (100–140 °F); Class IIIA 60–93 °C
// (140–200 °F); Class IIIB at or above 93 °C (200 °F).
const (
	// NoFlashClass: no flash point (water, brines, aqueous mixtures).
	NoFlashClass FlashClass = iota
	// ClassIA: flash point below 22.8 °C and boiling point below 37.8 °C.
	ClassIA
	// ClassIB: flash point below 22.8 °C, boiling point 37.8 °C or more
	// (gasoline).
	ClassIB
	// ClassIC: flash point 22.8 °C to below 37.8 °C.
	ClassIC
	// ClassII: flash point 37.8 °C to below 60 °C (diesel, kerosene).
	ClassII
	// ClassIIIA: flash point 60 °C to below 93 °C.
	ClassIIIA
	// ClassIIIB: flash point 93 °C or more (lubricating and hydraulic oils).
	ClassIIIB
)

var flashClassNames = [...]string{"none", "IA", "IB", "IC", "II", "IIIA", "IIIB"}

// String returns "IA", "IB", … or "none".
func (c FlashClass) String() string {
	if int(c) < len(flashClassNames) {
		return flashClassNames[c]
	}
	return "unknown"
}

// Flammable reports whether the class is a Class I (flammable) class.
func (c FlashClass) Flammable() bool { return c >= ClassIA && c <= ClassIC }

// NFPA 30 class boundaries in kelvin.
const (
	f73  = 273.15 + 22.8 // 73 °F
	f100 = 273.15 + 37.8 // 100 °F
	f140 = 273.15 + 60   // 140 °F
	f200 = 273.15 + 93   // 200 °F (93.3 °C; NFPA rounds to 93 °C)
)

// ClassifyNFPA30 returns the NFPA 30 class of a liquid from its closed-cup
// flash point and its boiling point (for a mixture such as gasoline, the
// NFPA 30 boiling point is the 10 % point of an ASTM D86 distillation). A
// zero flash point means "none" and gives NoFlashClass. A zero boiling point
// is taken as above 37.8 °C (Class IB rather than IA), so pass it for any
// liquid that can boil near room temperature.
func ClassifyNFPA30(flash, boil calc.Temperature) FlashClass {
	switch {
	case flash <= 0:
		return NoFlashClass
	case flash < f73:
		if boil > 0 && boil < f100 {
			return ClassIA
		}
		return ClassIB
	case flash < f100:
		return ClassIC
	case flash < f140:
		return ClassII
	case flash < f200:
		return ClassIIIA
	}
	return ClassIIIB
}
