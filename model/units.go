package model

import (
	"errors"
	"strconv"
	"strings"
	"unicode"
)

// System is a unit system for display and for bare numbers typed without a
// unit. Parsing accepts a unit suffix from either system whatever the System.
type System int

const (
	// SI shows metres, millimetres, kilopascals, degrees Celsius, litres.
	SI System = iota
	// US shows feet, inches, pounds per square inch, degrees Fahrenheit and
	// US gallons (US customary units).
	US
)

// String returns "SI" or "US".
func (s System) String() string {
	if s == US {
		return "US"
	}
	return "SI"
}

// ParseSystem reads "SI"/"metric" or "US"/"imperial"/"customary", in any case.
func ParseSystem(text string) (System, error) {
	switch strings.ToLower(strings.TrimSpace(text)) {
	case "si", "metric":
		return SI, nil
	case "us", "usc", "customary", "imperial":
		return US, nil
	}
	return SI, errors.New("unit system " + strconv.Quote(text) + " not known; accepted SI or US")
}

// MarshalText writes the System as "SI" or "US" (used by the job file).
func (s System) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// UnmarshalText reads what MarshalText writes (and the ParseSystem aliases).
func (s *System) UnmarshalText(b []byte) error {
	v, err := ParseSystem(string(b))
	if err != nil {
		return err
	}
	*s = v
	return nil
}

// Dim is the physical dimension of a field: it decides which units Parse
// accepts and how Format prints a value.
type Dim int

const (
	// DimLength is a length or height: m (SI), ft (US). Parse returns metres.
	DimLength Dim = iota
	// DimDiameter is a hose bore: mm (SI), in (US). Parse returns metres.
	DimDiameter
	// DimRoughness is a wall roughness: mm (SI), in (US). Parse returns metres.
	DimRoughness
	// DimPressure is an absolute pressure: kPa (SI), psi (US); Pa, hPa, MPa,
	// mbar, bar, atm, inHg and mmHg are accepted too. Parse returns pascals.
	DimPressure
	// DimTemperature is a temperature: °C (SI), °F (US), K accepted. Parse
	// returns kelvin.
	DimTemperature
	// DimDensity is a mass density: kg/m³ (SI), lb/ft³ (US). Parse returns
	// kg/m³.
	DimDensity
	// DimViscosity is a dynamic viscosity: mPa·s (SI), cP (US). Parse returns
	// Pa·s.
	DimViscosity
	// DimFlow is a volume flow rate: L/min (SI), gal/min (US). Parse returns
	// m³/s.
	DimFlow
	// DimVolume is a volume: L (SI), gal (US). Parse returns m³.
	DimVolume
	// DimTime is a duration: s, min, h, d; bare numbers are minutes. Parse
	// returns seconds.
	DimTime
	// DimVelocity is a mean flow velocity: m/s (SI), ft/s (US). Parse
	// returns m/s.
	DimVelocity
	// DimNumber is a plain number without a unit (a loss coefficient K, a
	// count of hoses).
	DimNumber
	// DimRate is a rate of rise of a level, or a rain intensity (depth per
	// time): mm/h (SI), in/h (US). Parse returns m/s.
	DimRate
	// DimArea is a plan area (a catchment that sheds into the tank): m²
	// (SI), ft² (US); ha and acre accepted. Parse returns m².
	DimArea
	// DimPercent is a relative tolerance: %, bare numbers are per cent.
	// Parse returns the fraction (3 % → 0.03).
	DimPercent
	dimCount
)

var dimNames = [...]string{
	"length", "diameter", "roughness", "pressure", "temperature", "density",
	"viscosity", "flow rate", "volume", "time", "velocity", "number",
	"rate of rise", "area", "percentage",
}

// String names the dimension in plain words ("length", "flow rate").
func (d Dim) String() string {
	if d < 0 || d >= dimCount {
		return "quantity"
	}
	return dimNames[d]
}

// Unit factors. Source: NIST Special Publication 811 (2008 edition), "Guide
// for the Use of the International System of Units (SI)", Appendix B.8
// (factors by unit name). The inch, foot, avoirdupois pound, US gallon
// (231 in³), standard atmosphere and bar are exact by definition (bold in
// B.8); the pound-force is exact as lb × g_n (g_n = 9.80665 m/s²), so psi
// is exact here and agrees with B.8's 6.894 757 E+03. The two mercury
// columns are B.8's conventional values (0 °C, standard gravity), not exact.
// The printed B.8 factors are quoted from memory of the table; the tests
// check them to the digits B.8 prints.
const (
	metrePerInch  = 0.0254                                               // in → m, exact
	metrePerFoot  = 0.3048                                               // ft → m, exact
	kgPerPound    = 0.45359237                                           // lb (avoirdupois) → kg, exact
	m3PerGallon   = 3.785411784e-3                                       // US liquid gallon → m³, exact (B.8 prints 3.785 412 E-03)
	pascalPerPSI  = kgPerPound * 9.80665 / (metrePerInch * metrePerInch) // lbf/in² → Pa, exact (B.8: 6.894 757 E+03)
	pascalPerInHg = 3386.389                                             // inch of mercury, conventional → Pa (B.8: 3.386 389 E+03)
	pascalPerMmHg = 133.3224                                             // mm of mercury, conventional → Pa (B.8: 1.333 224 E+02)
	pascalPerAtm  = 101325                                               // standard atmosphere → Pa, exact
	m3PerCubicFt  = metrePerFoot * metrePerFoot * metrePerFoot           // ft³ → m³, exact (B.8: 2.831 685 E-02)
	m3PerBarrel   = 42 * m3PerGallon                                     // petroleum barrel (42 US gal) → m³, exact (B.8: 1.589 873 E-01)
	m2PerSquareFt = metrePerFoot * metrePerFoot                          // ft² → m², exact (B.8: 9.290 304 E-02)
	m2PerAcre     = 43560 * m2PerSquareFt                                // acre (43 560 ft², survey foot ignored) → m² (B.8: 4.046 873 E+03 for the survey acre)
	fahrenheitOff = 459.67                                               // T/K = (t/°F + 459.67)/1.8, exact (B.9)
	celsiusOff    = 273.15                                               // T/K = t/°C + 273.15, exact (B.9)
)

// unit is one accepted unit: si = (v + off) × scale.
type unit struct {
	name  string   // display symbol, e.g. "mm", "°C", "kg/m³"
	scale float64  // SI per unit
	off   float64  // added before scaling (temperatures only)
	alias []string // other spellings, compared after lower-casing and removing spaces
}

var lengthUnits = []unit{
	{name: "m", scale: 1, alias: []string{"metre", "metres", "meter", "meters"}},
	{name: "cm", scale: 0.01},
	{name: "mm", scale: 0.001},
	{name: "µm", scale: 1e-6, alias: []string{"um", "μm", "micron", "microns"}},
	{name: "ft", scale: metrePerFoot, alias: []string{"'", "′", "foot", "feet"}},
	{name: "in", scale: metrePerInch, alias: []string{`"`, "″", "inch", "inches"}},
}

var unitTable = [dimCount][]unit{
	DimLength:    lengthUnits,
	DimDiameter:  lengthUnits,
	DimRoughness: lengthUnits,
	DimPressure: {
		{name: "Pa", scale: 1},
		{name: "hPa", scale: 100},
		{name: "kPa", scale: 1000},
		{name: "MPa", scale: 1e6},
		{name: "mbar", scale: 100, alias: []string{"mb"}},
		{name: "bar", scale: 1e5},
		{name: "atm", scale: pascalPerAtm},
		{name: "inHg", scale: pascalPerInHg, alias: []string{`"hg`, "inchhg", "inchesHg", "inmercury"}},
		{name: "mmHg", scale: pascalPerMmHg, alias: []string{"torr"}},
		{name: "psi", scale: pascalPerPSI, alias: []string{"psia", "lbf/in2", "lbf/in²", "lb/in2", "lb/in²"}},
	},
	DimTemperature: {
		{name: "°C", scale: 1, off: celsiusOff, alias: []string{"c", "degc", "celsius", "℃", "ºc"}},
		{name: "°F", scale: 1 / 1.8, off: fahrenheitOff, alias: []string{"f", "degf", "fahrenheit", "℉", "ºf"}},
		{name: "K", scale: 1, alias: []string{"kelvin"}},
	},
	DimDensity: {
		{name: "kg/m³", scale: 1, alias: []string{"kg/m3", "kg/m^3"}},
		{name: "g/cm³", scale: 1000, alias: []string{"g/cm3", "g/cc", "g/ml", "kg/l"}},
		{name: "lb/ft³", scale: kgPerPound / m3PerCubicFt, alias: []string{"lb/ft3", "lb/cuft", "pcf"}},
		{name: "lb/gal", scale: kgPerPound / m3PerGallon},
	},
	DimViscosity: {
		{name: "Pa·s", scale: 1, alias: []string{"pa.s", "pas", "pa*s", "pa-s"}},
		{name: "mPa·s", scale: 1e-3, alias: []string{"mpa.s", "mpas", "mpa*s", "mpa-s"}},
		{name: "cP", scale: 1e-3, alias: []string{"centipoise", "cps"}},
		{name: "P", scale: 0.1, alias: []string{"poise"}},
	},
	DimFlow: {
		{name: "L/min", scale: 1e-3 / 60, alias: []string{"lpm", "l/m", "litre/min", "liter/min"}},
		{name: "L/s", scale: 1e-3, alias: []string{"lps"}},
		{name: "L/h", scale: 1e-3 / 3600},
		{name: "m³/h", scale: 1.0 / 3600, alias: []string{"m3/h", "m3/hr", "m³/hr"}},
		{name: "m³/s", scale: 1, alias: []string{"m3/s"}},
		{name: "gal/min", scale: m3PerGallon / 60, alias: []string{"gpm"}},
		{name: "gal/h", scale: m3PerGallon / 3600, alias: []string{"gph"}},
		{name: "ft³/s", scale: m3PerCubicFt, alias: []string{"ft3/s", "cfs"}},
		{name: "ft³/min", scale: m3PerCubicFt / 60, alias: []string{"ft3/min", "cfm"}},
	},
	DimVolume: {
		{name: "L", scale: 1e-3, alias: []string{"litre", "litres", "liter", "liters"}},
		{name: "mL", scale: 1e-6},
		{name: "m³", scale: 1, alias: []string{"m3"}},
		{name: "gal", scale: m3PerGallon, alias: []string{"gallon", "gallons", "usgal"}},
		{name: "ft³", scale: m3PerCubicFt, alias: []string{"ft3", "cuft"}},
		{name: "bbl", scale: m3PerBarrel, alias: []string{"barrel", "barrels"}},
		{name: "Mgal", scale: 1e6 * m3PerGallon, alias: []string{"milliongallons", "mg"}},
	},
	DimTime: {
		{name: "s", scale: 1, alias: []string{"sec", "secs", "second", "seconds"}},
		{name: "min", scale: 60, alias: []string{"mins", "minute", "minutes"}},
		{name: "h", scale: 3600, alias: []string{"hr", "hrs", "hour", "hours"}},
		{name: "d", scale: 86400, alias: []string{"day", "days"}},
	},
	DimVelocity: {
		{name: "m/s", scale: 1, alias: []string{"mps"}},
		{name: "ft/s", scale: metrePerFoot, alias: []string{"fps", "ft/sec"}},
	},
	DimNumber: nil,
	DimRate: {
		{name: "mm/h", scale: 1e-3 / 3600, alias: []string{"mm/hr", "mmph"}},
		{name: "cm/h", scale: 1e-2 / 3600, alias: []string{"cm/hr"}},
		{name: "m/h", scale: 1.0 / 3600, alias: []string{"m/hr"}},
		{name: "mm/min", scale: 1e-3 / 60},
		{name: "in/h", scale: metrePerInch / 3600, alias: []string{"in/hr", "inph", "iph"}},
		{name: "in/min", scale: metrePerInch / 60},
		{name: "ft/h", scale: metrePerFoot / 3600, alias: []string{"ft/hr"}},
	},
	DimArea: {
		{name: "m²", scale: 1, alias: []string{"m2", "m^2", "sqm", "sq m"}},
		{name: "ha", scale: 1e4, alias: []string{"hectare", "hectares"}},
		{name: "ft²", scale: m2PerSquareFt, alias: []string{"ft2", "ft^2", "sqft", "sq ft"}},
		{name: "acre", scale: m2PerAcre, alias: []string{"acres", "ac"}},
	},
	DimPercent: {
		{name: "%", scale: 0.01, alias: []string{"percent", "pct"}},
	},
}

// defaultUnits[d][sys] is the index into unitTable[d] used for bare numbers
// and for display.
var defaultUnits = [dimCount][2]string{
	DimLength:      {"m", "ft"},
	DimDiameter:    {"mm", "in"},
	DimRoughness:   {"mm", "in"},
	DimPressure:    {"kPa", "psi"},
	DimTemperature: {"°C", "°F"},
	DimDensity:     {"kg/m³", "lb/ft³"},
	DimViscosity:   {"mPa·s", "cP"},
	DimFlow:        {"L/min", "gal/min"},
	DimVolume:      {"L", "gal"},
	DimTime:        {"min", "min"},
	DimVelocity:    {"m/s", "ft/s"},
	DimNumber:      {"", ""},
	DimRate:        {"mm/h", "in/h"},
	DimArea:        {"m²", "ft²"},
	DimPercent:     {"%", "%"},
}

// DefaultUnit is the unit symbol shown for d in sys and assumed for a bare
// number ("" for DimNumber).
func DefaultUnit(d Dim, sys System) string {
	if d < 0 || d >= dimCount {
		return ""
	}
	return defaultUnits[d][sysIndex(sys)]
}

// Units lists the unit symbols Parse accepts for d, in the order of the
// accepted-units line of error messages.
func Units(d Dim) []string {
	if d < 0 || d >= dimCount {
		return nil
	}
	out := make([]string, 0, len(unitTable[d]))
	for _, u := range unitTable[d] {
		out = append(out, u.name)
	}
	return out
}

func sysIndex(sys System) int {
	if sys == US {
		return 1
	}
	return 0
}

func unitByName(d Dim, name string) (unit, bool) {
	for _, u := range unitTable[d] {
		if u.name == name {
			return u, true
		}
	}
	return unit{}, false
}

// unitIndex maps every spelling, normalised by normUnit, to its unit, per
// Dim. It is built once and never changed.
var unitIndex = func() [dimCount]map[string]unit {
	var idx [dimCount]map[string]unit
	for d := range idx {
		idx[d] = map[string]unit{}
		for _, u := range unitTable[d] {
			idx[d][normUnit(u.name)] = u
			for _, a := range u.alias {
				idx[d][normUnit(a)] = u
			}
		}
	}
	return idx
}()

// lookupUnit finds a unit by any spelling. Matching ignores case and spaces:
// within one Dim no two accepted units differ only by case (MPa is accepted
// as a pressure and mPa·s as a viscosity, never both in one Dim).
func lookupUnit(d Dim, text string) (unit, bool) {
	u, ok := unitIndex[d][normUnit(text)]
	return u, ok
}

// normUnit lower-cases s and drops white space. Text that is already
// lower-case ASCII without spaces is returned as is, without allocating.
func normUnit(s string) string {
	plain := true
	for i := 0; i < len(s); i++ {
		if c := s[i]; c >= 0x80 || c == ' ' || c == '\t' || ('A' <= c && c <= 'Z') {
			plain = false
			break
		}
	}
	if plain {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if unicode.IsSpace(r) {
			continue
		}
		b.WriteRune(unicode.ToLower(r))
	}
	return b.String()
}
