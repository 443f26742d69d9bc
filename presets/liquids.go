package presets

import (
	"fmt"
	"math"

	"drawdown/calc"
)

// Source strings shared by several liquids.
const (
	srcIAPWSDensity   = "IAPWS-IF97 Region 1 (calc.Water)"
	srcIAPWSViscosity = "IAPWS 2008 viscosity, R12-08 (calc.Water)"
	srcIAPWSVapor     = "IAPWS-IF97 Region 4 saturation pressure (calc.Water)"
	srcSharqawy       = "Sharqawy, Lienhard & Zubair (2010)"
	srcMelinder       = "Melinder (2010), Properties of Secondary Working Fluids for Indirect Systems, IIR (CoolProp SecCool tables), interpolated to this strength"
	srcAPI111         = "API MPMS Ch. 11.1 (1980) volume correction (constants from memory)"
	srcDecane         = "n-decane proxy, DIPPR 101 (Perry's Table 2-8), an upper bound for this heavier mixture"
	srcNFPA30         = "NFPA 30 classes (UW-Milwaukee EHSRM summary)"
)

// waterLiquid returns pure water with the given identity; wastewater,
// grey water and bund water share its properties.
func waterLiquid(id, name, basis string, hz Hazards, tmax float64, densityNote, note string) Liquid {
	rangeText := "IAPWS formulations for liquid water at 1 atm: 0-100 °C"
	if tmax < 100 {
		rangeText += fmt.Sprintf("; the tool stops at %g °C for this liquid (our choice)", tmax)
	}
	return Liquid{
		ID: id, Name: name, Basis: basis,
		Min: celsius(0), Max: celsius(tmax),
		Cold: celsius(0), ColdKind: "freezing point",
		Hazards: hz,
		Sources: Sources{
			Density:       srcIAPWSDensity + densityNote,
			Viscosity:     srcIAPWSViscosity + densityNote,
			VaporPressure: srcIAPWSVapor,
			Range:         rangeText,
			Cold:          "0 °C at 1 atm (definition of the Celsius scale, near enough)",
		},
		Note:  note,
		model: waterModel{},
	}
}

// MaxSalinity is the highest salinity Seawater accepts, 150 g/kg: the upper
// limit of the Sharqawy et al. (2010) viscosity correlation.
const MaxSalinity = 150.0

// Seawater returns seawater or brine of reference-composition salinity S in
// g/kg (0 < S ≤ MaxSalinity) with the Sharqawy, Lienhard & Zubair (2010)
// correlations for density (Eq. 8), viscosity (Eqs. 22–23) and vapour
// pressure (Raoult-type relation), valid here from 0 to 90 °C. The ID is
// "seawater:S" unless the caller renames it.
//
// Special cases:
//
//	S ≤ 0, S > MaxSalinity, NaN or ±Inf: *calc.RangeError ("salinity").
func Seawater(sGkg float64) (Liquid, error) {
	if math.IsNaN(sGkg) || math.IsInf(sGkg, 0) || sGkg <= 0 || sGkg > MaxSalinity {
		e := calc.ErrOutOfRange
		if math.IsNaN(sGkg) || math.IsInf(sGkg, 0) {
			e = calc.ErrNotFinite
		}
		return Liquid{}, &calc.RangeError{What: calc.QuantitySalinity, Quantity: "salinity", Value: sGkg, Min: 0, Max: MaxSalinity, Unit: "g/kg", Err: e,
			Note: "Sharqawy et al. (2010) viscosity limit"}
	}
	s := num(sGkg)
	name := "Seawater"
	hz := Of(Environmental)
	if sGkg > 40 {
		name = "Brine"
	}
	return Liquid{
		ID: "seawater:" + s, Name: name + " " + s + " g/kg", Basis: s + " g/kg reference-composition salinity",
		Min: celsius(0), Max: celsius(90),
		Cold: calc.Temperature(seawaterFreezing(sGkg)), ColdKind: "freezing point",
		Hazards: hz,
		Sources: Sources{
			Density:       srcSharqawy + ", Eq. (8), paper coefficients, ±0.1 %",
			Viscosity:     srcSharqawy + ", Eqs. (22)-(23), ±1.5 %",
			VaporPressure: srcSharqawy + ", Raoult-type relation with ASHRAE (2005) pure-water pressure, ±0.5 %",
			Range:         "Sharqawy, Lienhard & Zubair, Desalination and Water Treatment 16 (2010) 354-380, doi:10.5004/dwt.2010.1079: fitted 0-180 °C; the tool stops at 90 °C",
			Cold:          "UNESCO (1983) Millero formula up to 40 g/kg, NaCl solution table above (CRC Handbook); both from memory",
		},
		Note:  "Salt harms land, plants and fresh water: the discharge point needs approval.",
		model: seawaterModel(sGkg),
	}, nil
}

func mustSeawater(id, name string, s float64) Liquid {
	l, err := Seawater(s)
	if err != nil {
		panic("presets: " + err.Error())
	}
	l.ID, l.Name = id, name
	return l
}

// oilParams describe a petroleum liquid from data-sheet values: density at
// 15 °C and kinematic viscosity at two temperatures.
type oilParams struct {
	Density15 calc.Density     // kg/m³ at 15 °C
	T1, T2    calc.Temperature // viscosity reference temperatures (usually 40 and 100 °C)
	Nu1, Nu2  float64          // kinematic viscosity at T1 and T2, mm²/s
	// K0, K1 are the API MPMS 11.1 thermal-expansion constants; zero both
	// for lubricating oils' (0, 0.6278).
	K0, K1 float64
	// VaporPressure is a fixed vapour pressure in Pa; when negative, the
	// n-decane DIPPR 101 curve (an upper bound for kerosene and heavier).
	VaporPressure float64
}

// oilModel builds density (API 11.1), viscosity (ASTM D341 Walther through
// the two points) and vapour pressure from oilParams.
func oilModel(p oilParams) propModel {
	k0, k1 := p.K0, p.K1
	if k0 == 0 && k1 == 0 {
		k1 = 0.6278
	}
	rho := apiDensity(float64(p.Density15), apiAlpha15(k0, k1, float64(p.Density15)))
	w := fitWalther(float64(p.T1), p.Nu1, float64(p.T2), p.Nu2)
	pv := func(float64) float64 { return p.VaporPressure }
	if p.VaporPressure < 0 {
		pv = decaneDIPPR.p
	}
	return &funcModel{
		rho: rho,
		mu:  func(T, rho float64) float64 { return w.nu(T) * 1e-6 * rho },
		pv:  pv,
	}
}

// Reid vapour pressures for the gasoline presets, kPa.
const (
	// GasolineWinterRVP is 103 kPa (15.0 psi), ASTM D4814 class E (from
	// memory) and just above EN 228 class F's 100 kPa maximum (confirmed):
	// the most volatile blend sold, the conservative default.
	GasolineWinterRVP = 103.0
	// GasolineSummerRVP is 62 kPa (9.0 psi), ASTM D4814 class A / the US
	// summer limit (from memory).
	GasolineSummerRVP = 62.0
)

// Gasoline returns motor gasoline of Reid vapour pressure rvp (kPa, 20 to
// 110): density 740 kg/m³ at 15 °C (EN 228: 720–775), viscosity of the
// n-heptane proxy, and the EPA AP-42 true vapour pressure. Valid −20 to
// 40 °C.
//
// Special cases:
//
//	rvp outside [20, 110] kPa, NaN or ±Inf: *calc.RangeError ("Reid vapour pressure").
func Gasoline(rvpKPa float64) (Liquid, error) {
	if math.IsNaN(rvpKPa) || math.IsInf(rvpKPa, 0) || rvpKPa < 20 || rvpKPa > 110 {
		e := calc.ErrOutOfRange
		if math.IsNaN(rvpKPa) || math.IsInf(rvpKPa, 0) {
			e = calc.ErrNotFinite
		}
		return Liquid{}, &calc.RangeError{What: calc.QuantityReidVaporPressure, Quantity: "Reid vapour pressure", Value: rvpKPa, Min: 20, Max: 110, Unit: "kPa", Err: e}
	}
	const rho15 = 740.0
	rho := apiDensity(rho15, apiAlpha15(346.4228, 0.4388, rho15))
	// n-heptane μ at 15 and 40 °C, hydraulics note §8.2 (Perry DIPPR 101,
	// computed): 0.434 and 0.333 mPa·s; Andrade form between and beyond.
	visc := fitAndrade(288.15, 0.434e-3, 313.15, 0.333e-3)
	s := num(rvpKPa)
	return Liquid{
		ID: "gasoline:" + s, Name: "Gasoline, RVP " + s + " kPa", Basis: "Reid vapour pressure " + s + " kPa at 37.8 °C",
		Min: celsius(-20), Max: celsius(40),
		Flash: celsius(-43), Boil: celsius(50),
		Class:   ClassIB,
		Hazards: Of(Flammable, Volatile, Toxic, Environmental),
		Sources: Sources{
			Density:       "740 kg/m³ at 15 °C, inside EN 228's 720-775 kg/m³; " + srcAPI111,
			Viscosity:     "n-heptane proxy: Perry's DIPPR 101 values 0.434 and 0.333 mPa·s at 15 and 40 °C, Andrade fit",
			VaporPressure: "US EPA AP-42 Ch. 7.1, TVP from RVP with D86 slope S = 3 (constants from memory)",
			Range:         "AP-42 and the heptane proxy used for outdoor temperatures -20 to 40 °C (our choice)",
			Flash:         "flash point about -43 °C, D86 10 % point about 50 °C (from memory); Class IB, " + srcNFPA30,
		},
		Note: "Most dangerous liquid to siphon. Bond and ground, no ignition sources, approved containers; " +
			"whether a hose siphon is allowed at all is a local-code and employer question. Very small working lift.",
		model: &funcModel{
			rho: rho,
			mu:  func(T, _ float64) float64 { return visc.mu(T) },
			pv:  ap42Gasoline(rvpKPa, 3),
		},
	}, nil
}

func mustGasoline(id, name string, rvp float64) Liquid {
	l, err := Gasoline(rvp)
	if err != nil {
		panic("presets: " + err.Error())
	}
	l.ID, l.Name = id, name
	return l
}

// glycol builds a glycol–water mixture from a five-point table (15–40 °C).
func glycol(id, name, basis string, freeze float64, hz Hazards, rho, muMPa [5]float64, note string) Liquid {
	ts := []float64{288.15, 293.15, 298.15, 303.15, 313.15}
	mu := make([]float64, 5)
	for i, m := range muMPa {
		mu[i] = m * 1e-3
	}
	return Liquid{
		ID: id, Name: name, Basis: basis,
		Min: celsius(15), Max: celsius(40),
		Cold: celsius(freeze), ColdKind: "freezing point",
		Hazards: hz,
		Sources: Sources{
			Density:       srcMelinder,
			Viscosity:     srcMelinder + ", log-linear between 5 °C steps",
			VaporPressure: "taken as pure water's (IAPWS-IF97): an upper bound, since glycol lowers it (our choice)",
			Range:         "table rows 15-40 °C; for colder liquid add a tabulated preset from the product data sheet",
			Cold:          "Melinder (2010) freezing points, interpolated by mass fraction",
			Flash:         "aqueous mixture: no flash point expected at this strength (from memory; check the data sheet)",
		},
		Note: note,
		model: &tableModel{
			t: ts, rho: rho[:], mu: mu,
			pvFunc: waterVaporPressure,
		},
	}
}

// builtinLiquids returns a fresh slice of the built-in liquids.
func builtinLiquids() []Liquid {
	ls := []Liquid{
		waterLiquid("water", "Fresh water", "pure, air-free water", 0, 100, "", ""),
		waterLiquid("wastewater", "Wastewater (sewage)", "taken as water", Of(Biohazard, Environmental), 60,
			"; dilute wastewater taken as water (common practice)",
			"Pathogens: gloves, eye and face protection, hygiene; dedicated hoses. Vaults and wet wells are confined spaces."),
		waterLiquid("greywater", "Grey water", "taken as water", Of(Biohazard, Environmental), 60,
			"; grey water taken as water (common practice)",
			"Treat as sewage for hygiene; discharge to sewer or as the local authority allows."),
		waterLiquid("bund-water", "Rain water in containment", "taken as water", Of(Environmental), 60,
			"; rain water taken as water",
			"Inspect for an oil sheen before release and record it; stop before a floating layer reaches the intake."),
		mustSeawater("seawater", "Seawater", 35),
		mustSeawater("brackish", "Brackish water", 10),
		mustSeawater("brine", "Brine (twice seawater)", 70),
		glycol("eg30", "Ethylene glycol 30 % vol", "30 % by volume = 32.35 % by mass", -16.6, Of(Toxic, Environmental),
			[5]float64{1044.0, 1041.9, 1039.7, 1037.4, 1032.3}, [5]float64{2.687, 2.303, 1.998, 1.755, 1.403},
			"Poisonous and sweet-tasting: keep from people and animals; never to a storm drain."),
		glycol("eg50", "Ethylene glycol 50 % vol", "50 % by volume = 52.73 % by mass", -40.0, Of(Toxic, Environmental),
			[5]float64{1071.8, 1069.1, 1066.2, 1063.3, 1057.0}, [5]float64{4.890, 4.127, 3.524, 3.040, 2.321},
			"Poisonous and sweet-tasting: keep from people and animals; never to a storm drain."),
		glycol("pg30", "Propylene glycol 30 % vol", "30 % by volume = 30.79 % by mass", -13.6, Of(Environmental),
			[5]float64{1027.2, 1024.9, 1022.5, 1019.9, 1014.3}, [5]float64{3.734, 3.104, 2.612, 2.218, 1.617},
			"High oxygen demand: to sewer only with the operator's consent."),
		glycol("pg50", "Propylene glycol 50 % vol", "50 % by volume = 50.94 % by mass", -34.7, Of(Environmental),
			[5]float64{1042.4, 1039.3, 1036.0, 1032.7, 1025.8}, [5]float64{8.417, 6.663, 5.376, 4.411, 3.090},
			"High oxygen demand: to sewer only with the operator's consent."),
		{
			ID: "diesel", Name: "Diesel fuel", Basis: "EN 590 / ASTM D975 No. 2-D, typical values",
			Min: celsius(-5), Max: celsius(60),
			Cold: celsius(-10), ColdKind: "cold filter plugging point",
			Flash: celsius(52), Class: ClassII,
			Hazards: Of(Combustible, Toxic, Environmental),
			Sources: Sources{
				Density:       "835 kg/m³ at 15 °C, inside EN 590's 820-845 kg/m³; " + srcAPI111,
				Viscosity:     "ASTM D341 (Walther) through 3.0 mm²/s at 40 °C (inside EN 590 2.0-4.5 and D975 1.9-4.1) and 1.2 mm²/s at 100 °C (typical, from memory)",
				VaporPressure: srcDecane,
				Range:         "Walther form used from just above the cold limit to 60 °C (our choice)",
				Cold:          "CFPP -10 °C of an EN 590 temperate grade (from memory); summer grades gel sooner",
				Flash:         "ASTM D975 No. 2-D minimum 52 °C (EN 590: above 55 °C); Class II, " + srcNFPA30,
			},
			Note: "Treat as flammable when warm (within 9 K of its flash point). Discharge of any oil needs a sheen check and a record.",
			model: oilModel(oilParams{Density15: 835, T1: celsius(40), Nu1: 3.0, T2: celsius(100), Nu2: 1.2,
				K0: 186.9696, K1: 0.4862, VaporPressure: -1}),
		},
		{
			ID: "kerosene", Name: "Kerosene / jet fuel", Basis: "ASTM D3699 1-K / Jet A, typical values",
			Min: celsius(-20), Max: celsius(60),
			Cold: celsius(-40), ColdKind: "freezing point",
			Flash: celsius(38), Class: ClassII,
			Hazards: Of(Combustible, Toxic, Environmental),
			Sources: Sources{
				Density:       "800 kg/m³ at 15 °C (Jet A range 775-840, from memory); " + srcAPI111,
				Viscosity:     "ASTM D341 (Walther) through 1.5 mm²/s at 40 °C (D3699 1.0-1.9) and 4.0 mm²/s at -20 °C (typical; both from memory)",
				VaporPressure: srcDecane,
				Range:         "between the two viscosity points and up to 60 °C (our choice)",
				Cold:          "Jet A freezing point maximum -40 °C (from memory)",
				Flash:         "minimum 38 °C, ASTM D3699 / Jet A (from memory); Class II by 0.2 K, " + srcNFPA30,
			},
			Note: "Flash point barely above 37.8 °C: treat as flammable above about 29 °C.",
			model: oilModel(oilParams{Density15: 800, T1: celsius(40), Nu1: 1.5, T2: celsius(-20), Nu2: 4.0,
				K0: 594.5418, K1: 0, VaporPressure: -1}),
		},
		mustGasoline("gasoline", "Gasoline (winter blend, conservative)", GasolineWinterRVP),
		mustGasoline("gasoline-summer", "Gasoline (summer blend)", GasolineSummerRVP),
		hydraulicOil(32, 5.36, 200, -30),
		hydraulicOil(46, 6.76, 210, -27),
		hydraulicOil(68, 8.73, 220, -24),
	}
	for i := range ls {
		ls[i].Origin = "built-in"
		if ls[i].Class == NoFlashClass && ls[i].Flash > 0 {
			ls[i].Class = ClassifyNFPA30(ls[i].Flash, ls[i].Boil)
		}
	}
	return ls
}

// hydraulicOil builds an ISO VG mineral hydraulic oil of viscosity index
// about 100: ν40 is the grade midpoint (ISO 3448), ν100 the ASTM D2270 value
// for VI 100 (hydraulics note §8.4, computed).
func hydraulicOil(vg int, nu100, flash, pour float64) Liquid {
	return Liquid{
		ID: fmt.Sprintf("hydraulic-%d", vg), Name: fmt.Sprintf("Hydraulic oil ISO VG %d", vg),
		Basis: fmt.Sprintf("mineral oil, VI about 100, %d mm²/s at 40 °C", vg),
		Min:   celsius(-10), Max: celsius(100),
		Cold: celsius(pour), ColdKind: "pour point",
		Flash: celsius(flash), Class: ClassIIIB,
		Hazards: Of(Combustible, Environmental),
		Sources: Sources{
			Density:       "870 kg/m³ at 15 °C (typical data-sheet value, from memory); " + srcAPI111 + ", lubricating-oil constants",
			Viscosity:     fmt.Sprintf("ASTM D341 (Walther) through the ISO 3448 midpoint %d mm²/s at 40 °C and %.2f mm²/s at 100 °C (VI 100 by the ASTM D2270 table, computed)", vg, nu100),
			VaporPressure: "negligible for mineral oils (from memory); taken as 0 Pa",
			Range:         "D341 used from -10 °C (well above the pour point) to 100 °C (our choice)",
			Cold:          fmt.Sprintf("pour point about %.0f °C (typical data sheet, from memory)", pour),
			Flash:         fmt.Sprintf("flash point about %.0f °C (typical data sheet, from memory); Class IIIB, ", flash) + srcNFPA30,
		},
		Note: "Very viscous when cold: expect laminar flow and long drains. Oil discharge needs a sheen check and a record.",
		model: oilModel(oilParams{Density15: 870, T1: celsius(40), Nu1: float64(vg), T2: celsius(100), Nu2: nu100,
			K0: 0, K1: 0.6278, VaporPressure: 0}),
	}
}
