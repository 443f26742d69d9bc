package calc

import "strconv"

// Named quantities in SI base units. They document intent in signatures; the
// arithmetic inside calc converts to float64 freely. Conversions to mm, ft,
// L/min, °F or inHg belong to model (parsing) and tui (display), never here.
type (
	// Length in metres.
	Length float64
	// Area in square metres.
	Area float64
	// Volume in cubic metres.
	Volume float64
	// Pressure in pascals, absolute unless a name says otherwise.
	Pressure float64
	// Temperature in kelvin.
	Temperature float64
	// Density in kilograms per cubic metre.
	Density float64
	// Viscosity is dynamic viscosity in pascal seconds.
	Viscosity float64
	// Velocity in metres per second.
	Velocity float64
	// FlowRate is a volumetric flow rate in cubic metres per second.
	FlowRate float64
	// Seconds is a duration in seconds (float, unlike time.Duration, so that a
	// drain of several days keeps sub-second resolution in the integrator).
	Seconds float64
)

// StandardGravity is the standard acceleration of gravity g_n = 9.80665 m/s²,
// exact by definition (3rd CGPM, 1901; adopted as g0 by the U.S. Standard
// Atmosphere 1976).
const StandardGravity = 9.80665

// ZeroCelsius is 0 °C in kelvin.
const ZeroCelsius Temperature = 273.15

// Celsius converts a Celsius reading to a Temperature.
func Celsius(c float64) Temperature { return Temperature(c) + ZeroCelsius }

// Celsius returns the temperature in degrees Celsius.
func (t Temperature) Celsius() float64 { return float64(t - ZeroCelsius) }

func (l Length) String() string      { return fmtSI(float64(l), "m") }
func (a Area) String() string        { return fmtSI(float64(a), "m²") }
func (v Volume) String() string      { return fmtSI(float64(v), "m³") }
func (p Pressure) String() string    { return fmtSI(float64(p), "Pa") }
func (t Temperature) String() string { return fmtSI(float64(t), "K") }
func (d Density) String() string     { return fmtSI(float64(d), "kg/m³") }
func (v Viscosity) String() string   { return fmtSI(float64(v), "Pa·s") }
func (v Velocity) String() string    { return fmtSI(float64(v), "m/s") }
func (q FlowRate) String() string    { return fmtSI(float64(q), "m³/s") }
func (s Seconds) String() string     { return fmtSI(float64(s), "s") }

func fmtSI(v float64, unit string) string {
	return strconv.FormatFloat(v, 'g', 6, 64) + " " + unit
}
