package calc

import "math"

// Barometric pressure of the standard atmosphere.
//
// Reference:
//
//	[USSA76] U.S. Standard Atmosphere, 1976. NOAA, NASA and USAF,
//	         Washington DC, October 1976. NOAA-S/T 76-1562, NASA-TM-X-74335.
//	         https://ntrs.nasa.gov/citations/19770009539 (NTRS 19770009539).
//
// Below 32 km it is identical to the ICAO standard atmosphere (ICAO Doc
// 7488/3) and to ISO 2533:1975. The constants and equation numbers below were
// taken from the collected reference note
// (calc/testdata/reference/water-and-atmosphere.md, section 4), which read them from
// secondary copies of [USSA76] that agree with each other.

// StandardSeaLevelPressure is the standard atmosphere's sea-level pressure
// P0 = 101325 Pa ([USSA76] Table 2; one standard atmosphere).
const StandardSeaLevelPressure Pressure = 101325

// USSA76 constants for the lowest layer (troposphere, 0 to 11 km′).
const (
	ussa76T0    = 288.15    // sea-level temperature T0, K
	ussa76L0    = -0.0065   // lapse rate L0, K per geopotential metre (Table 4)
	ussa76M0    = 28.9644   // mean molar mass of sea-level air M0, kg/kmol
	ussa76RStar = 8314.32   // gas constant R*, J kmol⁻¹ K⁻¹ (the 1962 value, as adopted)
	ussa76R0    = 6356766.0 // effective Earth radius r0 for geopotential, m
	// The pressure exponent g0′·M0/(R*·L0) = −5.2558761…
	ussa76Exponent = StandardGravity * ussa76M0 / (ussa76RStar * ussa76L0)
)

// Altitude range accepted by StandardAtmosphere (geometric, m).
const (
	MinSiteAltitude Length = -1000
	MaxSiteAltitude Length = 11000
)

// StandardAtmosphere returns the barometric pressure of the U.S. Standard
// Atmosphere 1976 at geometric altitude z above mean sea level. The
// geometric altitude is converted to geopotential altitude ([USSA76]
// Eq. (18)), then the lapse-rate (non-isothermal layer) barometric formula
// ([USSA76] Eq. (33a)) gives the pressure:
//
//	H = r0·z / (r0 + z),                     r0 = 6 356 766 m
//	p = P0 · [ T0 / (T0 + L0·H) ]^( g0′·M0 / (R*·L0) )
//
// with P0 = 101325 Pa, T0 = 288.15 K, L0 = −0.0065 K/m′,
// g0′ = 9.80665 m² s⁻² m′⁻¹, M0 = 28.9644 kg/kmol and
// R* = 8314.32 J kmol⁻¹ K⁻¹; numerically p ≈ 101325 Pa·(1 − 2.25577×10⁻⁵·H)^5.25588.
// z in m, p in Pa (absolute).
//
// Accepted: −1000 m ≤ z ≤ 11000 m (the first layer ends at H = 11 km′,
// z ≈ 11019 m). The standard atmosphere is a yearly, mid-latitude mean;
// the actual barometric pressure at a site varies with the weather by a few
// percent, so a barometer reading, where one is available, should be used
// instead.
//
// Special cases:
//
//	z = 0: exactly StandardSeaLevelPressure.
//	z outside [−1000 m, 11000 m], NaN or ±Inf: *RangeError ("altitude").
//
// Reference: U.S. Standard Atmosphere, 1976, NOAA-S/T 76-1562 /
// NASA-TM-X-74335, https://ntrs.nasa.gov/citations/19770009539; equation
// numbers as given by a secondary reading of the document.
func StandardAtmosphere(z Length) (Pressure, error) {
	if err := checkRange(QuantityAltitude, "altitude", float64(z), float64(MinSiteAltitude), float64(MaxSiteAltitude), "m"); err != nil {
		return 0, err
	}
	zz := float64(z)
	h := ussa76R0 * zz / (ussa76R0 + zz)
	return StandardSeaLevelPressure * Pressure(math.Pow(ussa76T0/(ussa76T0+ussa76L0*h), ussa76Exponent)), nil
}
