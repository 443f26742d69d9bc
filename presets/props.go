package presets

import (
	"math"
	"sort"

	"drawdown/calc"
)

// Property models. Each model evaluates density ρ (kg/m³), dynamic viscosity
// μ (Pa·s) and vapour pressure p_v (Pa) at a temperature already checked to
// lie inside the liquid's valid range. Models are immutable values.

type propModel interface {
	eval(T calc.Temperature, p calc.Pressure) (calc.Fluid, error)
}

// waterModel is liquid water from calc.Water (IAPWS-IF97 Region 1 density,
// IAPWS 2008 viscosity, IF97 Region 4 saturation pressure).
type waterModel struct{}

func (waterModel) eval(T calc.Temperature, p calc.Pressure) (calc.Fluid, error) {
	return calc.Water(T, p)
}

// funcModel combines three property functions. T is in kelvin; mu receives
// the density so that a kinematic-viscosity correlation can return μ = ν·ρ.
type funcModel struct {
	rho func(T float64) float64
	mu  func(T, rho float64) float64
	pv  func(T float64) float64
}

func (m *funcModel) eval(T calc.Temperature, _ calc.Pressure) (calc.Fluid, error) {
	t := float64(T)
	rho := m.rho(t)
	return calc.Fluid{
		Density:       calc.Density(rho),
		Viscosity:     calc.Viscosity(m.mu(t, rho)),
		VaporPressure: calc.Pressure(m.pv(t)),
	}, nil
}

// overrideModel replaces some properties of a base model with constants
// (a user preset "based_on" a built-in liquid, e.g. with a density from the
// product's safety data sheet). NaN means "keep the base value".
type overrideModel struct {
	base        propModel
	rho, mu, pv float64
}

func (m *overrideModel) eval(T calc.Temperature, p calc.Pressure) (calc.Fluid, error) {
	f, err := m.base.eval(T, p)
	if err != nil {
		return f, err
	}
	if !math.IsNaN(m.rho) {
		f.Density = calc.Density(m.rho)
	}
	if !math.IsNaN(m.mu) {
		f.Viscosity = calc.Viscosity(m.mu)
	}
	if !math.IsNaN(m.pv) {
		f.VaporPressure = calc.Pressure(m.pv)
	}
	return f, nil
}

// waterVaporPressure is p_v of pure water from calc (IAPWS-IF97 Eq. 30).
// Every caller passes T inside 0–100 °C, where calc cannot fail; the
// fallback keeps NaN out if that ever changes.
func waterVaporPressure(T float64) float64 {
	p, err := calc.WaterSaturationPressure(calc.Temperature(T))
	if err != nil {
		return calc.MaxVaporPressure
	}
	return float64(p)
}

// ---------------------------------------------------------------------------
// Seawater and brine: Sharqawy, Lienhard & Zubair (2010).

// sharqawyDensity is Eq. (8) of M. H. Sharqawy, J. H. Lienhard V and
// S. M. Zubair, "Thermophysical properties of seawater: a review of existing
// correlations and data", Desalination and Water Treatment 16 (2010)
// 354–380, doi:10.5004/dwt.2010.1079, at 0.1 MPa, with the coefficients as
// printed in the paper (4 significant figures):
//
//	ρ = a1 + a2 t + a3 t² + a4 t³ + a5 t⁴ + b1 S + b2 S t + b3 S t² + b4 S t³ + b5 S² t²
//
// t in °C, S in kg/kg, ρ in kg/m³. Valid 0–180 °C, 0–0.16 kg/kg, ±0.1 %.
func sharqawyDensity(t, s float64) float64 {
	const (
		a1, a2, a3, a4, a5 = 9.999e2, 2.034e-2, -6.162e-3, 2.261e-5, -4.657e-8
		b1, b2, b3, b4, b5 = 8.020e2, -2.001, 1.677e-2, -3.060e-5, -1.613e-5
	)
	return a1 + t*(a2+t*(a3+t*(a4+t*a5))) +
		b1*s + b2*s*t + b3*s*t*t + b4*s*t*t*t + b5*s*s*t*t
}

// sharqawyViscosity is Eqs. (22)–(23) of Sharqawy et al. (2010) at 0.1 MPa:
//
//	μ_w  = 4.2844×10⁻⁵ + [0.157 (t + 64.993)² − 91.296]⁻¹
//	μ_sw = μ_w (1 + A S + B S²)
//	A = 1.541 + 1.998×10⁻² t − 9.52×10⁻⁵ t²
//	B = 7.974 − 7.561×10⁻² t + 4.724×10⁻⁴ t²
//
// t in °C, S in kg/kg, μ in Pa·s. Valid 0–180 °C, 0–0.15 kg/kg, ±1.5 %.
func sharqawyViscosity(t, s float64) float64 {
	muW := 4.2844e-5 + 1/(0.157*(t+64.993)*(t+64.993)-91.296)
	a := 1.541 + 1.998e-2*t - 9.52e-5*t*t
	b := 7.974 - 7.561e-2*t + 4.724e-4*t*t
	return muW * (1 + a*s + b*s*s)
}

// ashraeWaterVaporPressure is the pure-water saturation pressure used by
// Sharqawy et al. (2010): ASHRAE Handbook Fundamentals (2005), the
// Hyland–Wexler form,
//
//	ln p = a1/T + a2 + a3 T + a4 T² + a5 T³ + a6 ln T
//
// T in K, p in Pa.
func ashraeWaterVaporPressure(T float64) float64 {
	const (
		a1, a2, a3 = -5.8002206e3, 1.3914993, -4.8640239e-2
		a4, a5, a6 = 4.1764768e-5, -1.4452093e-8, 6.5459673
	)
	return math.Exp(a1/T + a2 + T*(a3+T*(a4+T*a5)) + a6*math.Log(T))
}

// sharqawyVaporPressure is the Raoult-type relation of Sharqawy et al.
// (2010), p_sw = p_w / (1 + 0.57357 S/(1000 − S)), S in g/kg, valid
// 273–473 K and 0–240 g/kg, ±0.5 %.
func sharqawyVaporPressure(T, sGkg float64) float64 {
	return ashraeWaterVaporPressure(T) / (1 + 0.57357*sGkg/(1000-sGkg))
}

// seawaterModel returns the Sharqawy (2010) model at salinity sGkg (g/kg).
func seawaterModel(sGkg float64) propModel {
	s := sGkg / 1000
	return &funcModel{
		rho: func(T float64) float64 { return sharqawyDensity(T-273.15, s) },
		mu:  func(T, _ float64) float64 { return sharqawyViscosity(T-273.15, s) },
		pv:  func(T float64) float64 { return sharqawyVaporPressure(T, sGkg) },
	}
}

// seawaterFreezing returns the freezing point (K) of seawater or brine of
// salinity S g/kg at 1 atm. Up to 40 g/kg: the UNESCO (1983) formula of
// Millero, t_f = −0.0575 S + 1.710523×10⁻³ S^1.5 − 2.154996×10⁻⁴ S² (°C,
// practical salinity; coefficients from memory; gives −1.92 °C at 35).
// Above: sodium chloride solution by mass fraction, 5 % −3.0 °C, 10 % −6.6 °C,
// 15 % −10.9 °C (CRC Handbook of Chemistry and Physics, "Concentrative
// properties of aqueous solutions", values from memory), joined linearly
// from the 40 g/kg value.
func seawaterFreezing(s float64) float64 {
	tf := func(s float64) float64 {
		return -0.0575*s + 1.710523e-3*math.Pow(s, 1.5) - 2.154996e-4*s*s
	}
	if s <= 40 {
		return 273.15 + tf(s)
	}
	xs := []float64{40, 50, 100, 150}
	ys := []float64{tf(40), -3.0, -6.6, -10.9}
	return 273.15 + interpLinear(xs, ys, s)
}

// ---------------------------------------------------------------------------
// Petroleum liquids.

// apiAlpha15 is the thermal expansion coefficient at 15 °C of the API
// Manual of Petroleum Measurement Standards Ch. 11.1 (1980; ASTM D1250,
// IP 200) volume correction, α15 = K0/ρ15² + K1/ρ15 (1/K, ρ15 in kg/m³).
// Constants (K0, K1) from memory: gasolines (346.4228, 0.4388), fuel oils
// and diesel (186.9696, 0.4862), jet fuels and kerosene (594.5418, 0),
// lubricating oils (0, 0.6278). Checked in the tests against the density
// slope of the n-heptane and n-decane proxies in the hydraulics note §8.2.
func apiAlpha15(k0, k1, rho15 float64) float64 { return k0/(rho15*rho15) + k1/rho15 }

// apiDensity is ρ(T) = ρ15 · exp(−α15 Δt (1 + 0.8 α15 Δt)), Δt = t − 15 °C,
// the API MPMS 11.1 (1980) form (from memory).
func apiDensity(rho15, alpha float64) func(T float64) float64 {
	return func(T float64) float64 {
		dt := T - 288.15
		return rho15 * math.Exp(-alpha*dt*(1+0.8*alpha*dt))
	}
}

// walther holds the constants of the ASTM D341 viscosity–temperature
// relation (Walther form),
//
//	log10 log10 Z = A − B log10 T,   Z = ν + 0.7 + exp(−1.47 − 1.84 ν − 0.51 ν²)
//
// T in K, ν in mm²/s. The exponential term is the D341-09 low-viscosity
// extension (constants from memory); it is negligible above about 2 mm²/s.
type walther struct{ A, B float64 }

func waltherZ(nu float64) float64 { return nu + 0.7 + math.Exp(-1.47-1.84*nu-0.51*nu*nu) }

// waltherNu inverts waltherZ by Newton's method; Z is strictly increasing in
// ν ≥ 0, so the iteration from ν = Z − 0.7 converges in a few steps.
func waltherNu(z float64) float64 {
	nu := math.Max(z-0.7, 0.05)
	for range 50 {
		e := math.Exp(-1.47 - 1.84*nu - 0.51*nu*nu)
		f := nu + 0.7 + e - z
		d := 1 - (1.84+1.02*nu)*e
		step := f / d
		nu -= step
		if nu < 1e-6 {
			nu = 1e-6
		}
		if math.Abs(step) < 1e-13*math.Max(1, nu) {
			break
		}
	}
	return nu
}

// fitWalther fits A and B through (T1, ν1) and (T2, ν2), T in K, ν in mm²/s.
func fitWalther(t1, nu1, t2, nu2 float64) walther {
	y1 := math.Log10(math.Log10(waltherZ(nu1)))
	y2 := math.Log10(math.Log10(waltherZ(nu2)))
	b := (y1 - y2) / (math.Log10(t2) - math.Log10(t1))
	return walther{A: y1 + b*math.Log10(t1), B: b}
}

// nu returns ν (mm²/s) at T (K).
func (w walther) nu(T float64) float64 {
	z := math.Pow(10, math.Pow(10, w.A-w.B*math.Log10(T)))
	return waltherNu(z)
}

// andrade is μ = μ0 · exp(B (1/T − 1/T0)), fitted through two points.
type andrade struct{ mu0, t0, b float64 }

func fitAndrade(t1, mu1, t2, mu2 float64) andrade {
	return andrade{mu0: mu1, t0: t1, b: math.Log(mu1/mu2) / (1/t1 - 1/t2)}
}

func (a andrade) mu(T float64) float64 { return a.mu0 * math.Exp(a.b*(1/T-1/a.t0)) }

// dippr101 is the DIPPR equation 101 vapour pressure,
// ln p = C1 + C2/T + C3 ln T + C4 T^C5 (p in Pa, T in K).
type dippr101 struct{ c1, c2, c3, c4, c5 float64 }

func (d dippr101) p(T float64) float64 {
	return math.Exp(d.c1 + d.c2/T + d.c3*math.Log(T) + d.c4*math.Pow(T, d.c5))
}

// decaneDIPPR is n-decane from Perry's Chemical Engineers' Handbook Table
// 2-8 (DIPPR 101), as tabulated in the `chemicals` library; the coefficients
// are confirmed in the hydraulics note §8.5. It gives about 127 Pa at 20 °C.
// Kerosene and diesel are heavier mixtures, so n-decane is an upper bound
// (conservative for the crest check).
var decaneDIPPR = dippr101{112.73, -9749.6, -13.245, 7.1266e-6, 2}

// ap42Gasoline is the true vapour pressure of gasoline from its Reid vapour
// pressure, US EPA AP-42 (5th ed.) Ch. 7.1 "Organic Liquid Storage Tanks":
//
//	P [psia] = exp(A − B/(T_F + 459.6))
//	A = 15.64 − 1.854 S^0.5 − (0.8742 − 0.3280 S^0.5) ln RVP
//	B = 8742 − 1042 S^0.5 − (1049 − 179.4 S^0.5) ln RVP
//
// RVP in psi, S the ASTM D86 slope at 10 % evaporated (°F/vol %; 3 for motor
// gasoline). Constants from memory; the hydraulics note §8.2 computes
// 10.6 psia at 100 °F and 6.0 psia at 68 °F for RVP 10 psi, S = 3.
func ap42Gasoline(rvpKPa, slope float64) func(T float64) float64 {
	rvp := rvpKPa / 6.894757293168361 // psi
	sq := math.Sqrt(slope)
	a := 15.64 - 1.854*sq - (0.8742-0.3280*sq)*math.Log(rvp)
	b := 8742 - 1042*sq - (1049-179.4*sq)*math.Log(rvp)
	return func(T float64) float64 {
		tR := (T-273.15)*1.8 + 32 + 459.6
		return math.Exp(a-b/tR) * 6894.757293168361
	}
}

// ---------------------------------------------------------------------------
// Tables.

// tableModel interpolates tabulated properties: ρ linearly in T, μ and p_v
// linearly in ln(value) (log-linear, the usual way to interpolate viscosity
// and vapour pressure tables). Temperatures are strictly increasing (K).
// A nil pv uses pvFunc instead.
type tableModel struct {
	t, rho, mu, pv []float64
	pvFunc         func(T float64) float64
}

func (m *tableModel) eval(T calc.Temperature, _ calc.Pressure) (calc.Fluid, error) {
	t := float64(T)
	f := calc.Fluid{
		Density:   calc.Density(interpLinear(m.t, m.rho, t)),
		Viscosity: calc.Viscosity(interpLog(m.t, m.mu, t)),
	}
	if m.pvFunc != nil {
		f.VaporPressure = calc.Pressure(m.pvFunc(t))
	} else {
		f.VaporPressure = calc.Pressure(interpLog(m.t, m.pv, t))
	}
	return f, nil
}

// interpLinear interpolates ys over increasing xs at x, holding the end
// values outside.
func interpLinear(xs, ys []float64, x float64) float64 {
	n := len(xs)
	if n == 1 || x <= xs[0] {
		return ys[0]
	}
	if x >= xs[n-1] {
		return ys[n-1]
	}
	i := sort.SearchFloat64s(xs, x) // xs[i-1] < x ≤ xs[i]
	f := (x - xs[i-1]) / (xs[i] - xs[i-1])
	return ys[i-1] + f*(ys[i]-ys[i-1])
}

// interpLog interpolates ln(ys) linearly; a zero or negative neighbour falls
// back to linear interpolation.
func interpLog(xs, ys []float64, x float64) float64 {
	n := len(xs)
	if n == 1 || x <= xs[0] {
		return ys[0]
	}
	if x >= xs[n-1] {
		return ys[n-1]
	}
	i := sort.SearchFloat64s(xs, x)
	a, b := ys[i-1], ys[i]
	f := (x - xs[i-1]) / (xs[i] - xs[i-1])
	if a <= 0 || b <= 0 {
		return a + f*(b-a)
	}
	return math.Exp(math.Log(a) + f*(math.Log(b)-math.Log(a)))
}
