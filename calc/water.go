package calc

import (
	"math"
	"strconv"
)

// Liquid water properties from the IAPWS formulations.
//
// References (numbers of equations and tables as printed in the releases):
//
//	[IF97]  IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial
//	        Formulation 1997 for the Thermodynamic Properties of Water and
//	        Steam", International Association for the Properties of Water and
//	        Steam, 2007 revision, 2012 edition. http://www.iapws.org/relguide/IF97-Rev.html
//	        (URL from memory). Also W. Wagner et al., J. Eng. Gas Turbines
//	        Power 122 (2000) 150–182, doi:10.1115/1.483186 (details from memory).
//	[R12]   IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the
//	        Viscosity of Ordinary Water Substance", Berlin, September 2008.
//	        http://www.iapws.org/relguide/viscosity.htm
//	        M. L. Huber et al., J. Phys. Chem. Ref. Data 38(2) (2009) 101–125,
//	        doi:10.1063/1.3088050.
//
// Coefficients were checked against the collected reference note
// (calc/testdata/reference/water-and-atmosphere.md, sections 1–3), which compared
// them digit by digit with independent copies.

// Limits of the formulations used here, SI units.
const (
	// waterMinTemperature is the lower temperature bound of IF97 Regions
	// 1 and 4 (273.15 K; the triple point proper is 273.16 K).
	waterMinTemperature = 273.15 // K
	// waterCriticalTemperature T_c = 647.096 K, upper bound of Region 4.
	waterCriticalTemperature = 647.096 // K
	// waterMinSaturationPressure is the lower pressure bound of Eq. 31,
	// p_s(273.15 K) = 611.213 Pa (IF97, Region 4 range of validity).
	waterMinSaturationPressure = 611.213 // Pa
	// Region 1 pressure bound: p ≤ 100 MPa.
	waterRegion1MaxPressure = 100e6 // Pa
	// Water() accepts liquid water from 0 °C to 100 °C.
	waterToolMaxTemperature = 373.15 // K
)

// waterGasConstant is the specific gas constant of water used by IF97,
// R = 0.461526 kJ kg⁻¹ K⁻¹ (IF97 Eq. 1), here in J kg⁻¹ K⁻¹.
const waterGasConstant = 461.526

// region4N holds n1…n10 of IF97 Table 34 (index 0 is n1).
var region4N = [10]float64{
	0.11670521452767e+04,
	-0.72421316703206e+06,
	-0.17073846940092e+02,
	0.12020824702470e+05,
	-0.32325550322333e+07,
	0.14915108613530e+02,
	-0.48232657361591e+04,
	0.40511340542057e+06,
	-0.23855557567849e+00,
	0.65017534844798e+03,
}

// WaterSaturationPressure returns the saturation (vapour) pressure of pure
// water at temperature T, from the IAPWS-IF97 Region 4 saturation-pressure
// equation, [IF97] Eq. (30) with the coefficients of Table 34:
//
//	ϑ = T/T* + n9/(T/T* − n10),          T* = 1 K
//	A = ϑ² + n1·ϑ + n2
//	B = n3·ϑ² + n4·ϑ + n5
//	C = n6·ϑ² + n7·ϑ + n8
//	p_s/p* = [ 2C / (−B + √(B² − 4AC)) ]⁴,  p* = 1 MPa
//
// T in K, p_s in Pa. Valid 273.15 K ≤ T ≤ 647.096 K (the critical point).
// Checked against [IF97] Table 35.
//
// Special cases:
//
//	T outside [273.15 K, 647.096 K], NaN or ±Inf: *RangeError ("water temperature").
//
// Reference: IAPWS R7-97(2012), Revised Release on the IAPWS Industrial
// Formulation 1997 for the Thermodynamic Properties of Water and Steam,
// http://www.iapws.org/relguide/IF97-Rev.html (URL from memory).
func WaterSaturationPressure(T Temperature) (Pressure, error) {
	if err := checkRange(QuantityTemperature, "water temperature", float64(T), waterMinTemperature, waterCriticalTemperature, "K"); err != nil {
		return 0, err
	}
	return Pressure(waterSatPressure(float64(T))), nil
}

// waterSatPressure is Eq. (30) without validation; T in K, result in Pa.
func waterSatPressure(T float64) float64 {
	n := &region4N
	th := T + n[8]/(T-n[9])
	th2 := th * th
	a := th2 + n[0]*th + n[1]
	b := n[2]*th2 + n[3]*th + n[4]
	c := n[5]*th2 + n[6]*th + n[7]
	x := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	x *= x
	return x * x * 1e6
}

// waterSatTemperature is the saturation (boiling) temperature of pure water
// at pressure p, from the IAPWS-IF97 Region 4 backward equation, [IF97]
// Eq. (31) with the coefficients of Table 34:
//
//	β = (p/p*)^(1/4),                     p* = 1 MPa
//	E = β² + n3·β + n6
//	F = n1·β² + n4·β + n7
//	G = n2·β² + n5·β + n8
//	D = 2G / (−F − √(F² − 4EG))
//	T_s/T* = [ n10 + D − √((n10 + D)² − 4(n9 + n10·D)) ] / 2,  T* = 1 K
//
// p in Pa, T_s in K, without validation; valid 611.213 Pa ≤ p ≤ 22.064 MPa.
// Eq. (31) is the exact inverse of Eq. (30): both solve the same quadratic,
// [IF97] Eq. (29). Checked against [IF97] Table 36. Water uses it to say up to
// what temperature water stays liquid at a pressure (its ErrBoiling error).
func waterSatTemperature(p float64) float64 {
	n := &region4N
	beta := math.Sqrt(math.Sqrt(p / 1e6))
	b2 := beta * beta
	e := b2 + n[2]*beta + n[5]
	f := n[0]*b2 + n[3]*beta + n[6]
	g := n[1]*b2 + n[4]*beta + n[7]
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	s := n[9] + d
	return (s - math.Sqrt(s*s-4*(n[8]+n[9]*d))) / 2
}

// region1Term is one row of IF97 Table 2: n·(7.1 − π)^I·(τ − 1.222)^J.
type region1Term struct {
	I, J int
	N    float64
}

// region1Terms is IF97 Table 2 (Region 1, 34 terms), in the printed order.
var region1Terms = [34]region1Term{
	{0, -2, 0.14632971213167e+00},
	{0, -1, -0.84548187169114e+00},
	{0, 0, -0.37563603672040e+01},
	{0, 1, 0.33855169168385e+01},
	{0, 2, -0.95791963387872e+00},
	{0, 3, 0.15772038513228e+00},
	{0, 4, -0.16616417199501e-01},
	{0, 5, 0.81214629983568e-03},
	{1, -9, 0.28319080123804e-03},
	{1, -7, -0.60706301565874e-03},
	{1, -1, -0.18990068218419e-01},
	{1, 0, -0.32529748770505e-01},
	{1, 1, -0.21841717175414e-01},
	{1, 3, -0.52838357969930e-04},
	{2, -3, -0.47184321073267e-03},
	{2, 0, -0.30001780793026e-03},
	{2, 1, 0.47661393906987e-04},
	{2, 3, -0.44141845330846e-05},
	{2, 17, -0.72694996297594e-15},
	{3, -4, -0.31679644845054e-04},
	{3, 0, -0.28270797985312e-05},
	{3, 6, -0.85205128120103e-09},
	{4, -5, -0.22425281908000e-05},
	{4, -2, -0.65171222895601e-06},
	{4, 10, -0.14341729937924e-12},
	{5, -8, -0.40516996860117e-06},
	{8, -11, -0.12734301741641e-08},
	{8, -6, -0.17424871230634e-09},
	{21, -29, -0.68762131295531e-18},
	{23, -31, 0.14478307828521e-19},
	{29, -38, 0.26335781662795e-22},
	{30, -39, -0.11947622640071e-22},
	{31, -40, 0.18228094581404e-23},
	{32, -41, -0.93537087292458e-25},
}

// Reducing values of IF97 Region 1: p* = 16.53 MPa, T* = 1386 K.
const (
	region1PStar = 16.53e6 // Pa
	region1TStar = 1386.0  // K
)

// waterRegion1Density returns the density of liquid water at temperature T
// (K) and pressure p (Pa, absolute) from IAPWS-IF97 Region 1 (compressed
// liquid), without validation. The basic equation, [IF97] Eq. (7) with the
// coefficients of Table 2, is the dimensionless Gibbs free energy
//
//	γ(π, τ) = g/(RT) = Σ nᵢ (7.1 − π)^Iᵢ (τ − 1.222)^Jᵢ,   i = 1…34
//	π = p/p*, p* = 16.53 MPa;   τ = T*/T, T* = 1386 K
//
// and the specific volume follows from its pressure derivative (Table 3):
//
//	γ_π = Σ −nᵢ Iᵢ (7.1 − π)^(Iᵢ−1) (τ − 1.222)^Jᵢ
//	v = (R·T/p)·π·γ_π,   ρ = 1/v
//
// with R = 461.526 J kg⁻¹ K⁻¹ (IF97 Eq. 1). Valid 273.15 K ≤ T ≤ 623.15 K and
// p_s(T) ≤ p ≤ 100 MPa. Checked against [IF97] Table 5.
//
// The integer powers that Table 2 needs are built by short multiplication
// ladders (no math.Pow, no data-dependent branches, at most eight
// multiplications deep) and stored where the term loop looks them up.
func waterRegion1Density(T, p float64) float64 {
	pi := p / region1PStar
	a := 7.1 - pi
	b := region1TStar/T - 1.222
	c := 1 / b

	// ap[k] = a^k for the k = I − 1 in Table 2: 0…4, 7, 20, 22, 28…31.
	var ap [32]float64
	a2 := a * a
	a4 := a2 * a2
	a8 := a4 * a4
	a20 := a8 * a8 * a4
	a28 := a20 * a8
	ap[0], ap[1], ap[2], ap[3], ap[4] = 1, a, a2, a2*a, a4
	ap[7] = a4 * a2 * a
	ap[20], ap[22] = a20, a20*a2
	ap[28], ap[29], ap[30], ap[31] = a28, a28*a, a28*a2, a28*a2*a

	// bt[J+41] = b^J for the J in Table 2: −41…−38, −31, −29, −11, −9…0, 1,
	// 3, 6, 10, 17.
	var bt [59]float64
	c2 := c * c
	c4 := c2 * c2
	c8 := c4 * c4
	c16 := c8 * c8
	c32 := c16 * c16
	c29 := c16 * c8 * c4 * c
	bt[0], bt[41-40], bt[41-39], bt[41-38] = c32*c8*c, c32*c8, c32*c4*c2*c, c32*c4*c2
	bt[41-31], bt[41-29] = c29*c2, c29
	bt[41-11], bt[41-9], bt[41-8], bt[41-7] = c8*c2*c, c8*c, c8, c4*c2*c
	bt[41-6], bt[41-5], bt[41-4], bt[41-3] = c4*c2, c4*c, c4, c2*c
	bt[41-2], bt[41-1], bt[41] = c2, c, 1
	b2 := b * b
	b4 := b2 * b2
	b16 := b4 * b4 * b4 * b4
	bt[41+1], bt[41+3], bt[41+6], bt[41+10], bt[41+17] = b, b2*b, b4*b2, b4*b4*b2, b16*b

	// Terms with I = 0 (the first eight) do not depend on π and drop out
	// of γ_π. Two partial sums shorten the dependency chain.
	var g0, g1 float64
	for k := 8; k+1 < len(region1Terms); k += 2 {
		t0, t1 := &region1Terms[k], &region1Terms[k+1]
		g0 -= t0.N * float64(t0.I) * ap[t0.I-1] * bt[t0.J+41]
		g1 -= t1.N * float64(t1.I) * ap[t1.I-1] * bt[t1.J+41]
	}
	gpi := g0 + g1
	v := waterGasConstant * T / p * pi * gpi
	return 1 / v
}

// waterMuH0 holds H_i, i = 0…3, of the dilute-gas term of [R12] Eq. (11)
// (Huber et al. 2009, Table 2).
var waterMuH0 = [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}

// waterMuH1 holds H_ij, i = 0…5 (rows), j = 0…6 (columns), of the residual
// term of [R12] Eq. (12) (Huber et al. 2009, Table 3). Entries not listed
// there are zero.
var waterMuH1 = [6][7]float64{
	{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
	{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
	{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
	{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
	{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
	{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
}

// Reducing values of [R12]: T* = 647.096 K, ρ* = 322.0 kg/m³, μ* = 1 µPa·s.
const (
	waterMuTStar   = 647.096
	waterMuRhoStar = 322.0
	waterMuStar    = 1e-6
)

// waterMu returns the dynamic viscosity of water at temperature T (K) and
// density ρ (kg/m³), without validation, from the IAPWS Formulation 2008 for
// the viscosity of ordinary water substance, [R12] Eq. (10)–(12):
//
//	μ/μ* = μ̄0(T̄) · μ̄1(T̄, ρ̄) · μ̄2(T̄, ρ̄)
//	μ̄0 = 100·√T̄ / Σ_{i=0..3} Hᵢ/T̄ⁱ
//	μ̄1 = exp[ ρ̄ Σ_{i=0..5} (1/T̄ − 1)ⁱ Σ_{j=0..6} Hᵢⱼ (ρ̄ − 1)ʲ ]
//	T̄ = T/647.096 K,  ρ̄ = ρ/(322 kg/m³),  μ* = 1×10⁻⁶ Pa·s
//
// The critical enhancement μ̄2 (Eq. 14 ff., which needs IAPWS-95
// derivatives) is taken as 1. IAPWS's page for the release says the term is
// negligible except very close to the critical point (647.096 K,
// 322 kg/m³), should be omitted for industrial use and may be omitted
// outside the critical region (as quoted in the reference note, §3). Liquid
// water at 0–100 °C lies far outside that region. R12-08 Table 4 gives its
// check values with μ̄2 = 1, and this function reproduces them.
//
// Result in Pa·s. [R12] is defined with IAPWS-95 density; with IF97 density
// (as Water passes it) μ changes by less than 0.003 % at 0–100 °C and 1 atm.
// The release covers the fluid to 1173.15 K and, for the liquid, up to about
// 1 GPa; the caller must pass a density that belongs to a fluid state at T.
//
// Reference: IAPWS R12-08 (2008), Release on the IAPWS Formulation 2008 for
// the Viscosity of Ordinary Water Substance, http://www.iapws.org/relguide/viscosity.htm;
// Huber et al., J. Phys. Chem. Ref. Data 38 (2009) 101, doi:10.1063/1.3088050.
func waterMu(T, rho float64) float64 {
	tr := T / waterMuTStar
	dr := rho / waterMuRhoStar
	it := 1 / tr

	// μ̄0, Eq. (11): Σ Hᵢ/T̄ⁱ by Horner's scheme in 1/T̄.
	h0 := &waterMuH0
	den := h0[0] + it*(h0[1]+it*(h0[2]+it*h0[3]))
	mu0 := 100 * math.Sqrt(tr) / den

	// μ̄1, Eq. (12): both sums by Horner's scheme.
	x := it - 1
	y := dr - 1
	var sum float64
	for i := len(waterMuH1) - 1; i >= 0; i-- {
		row := &waterMuH1[i]
		var inner float64
		for j := len(row) - 1; j >= 0; j-- {
			inner = inner*y + row[j]
		}
		sum = sum*x + inner
	}
	mu1 := math.Exp(dr * sum)
	return mu0 * mu1 * waterMuStar
}

// Water returns the properties of liquid water at temperature T under the
// absolute pressure p (the tool passes the site's barometric pressure):
//
//	Density        ρ   IAPWS-IF97 Region 1, Eq. (7) (waterRegion1Density)
//	Viscosity      μ   IAPWS 2008 with μ̄2 = 1 (waterMu)
//	VaporPressure  p_v IAPWS-IF97 Region 4, Eq. (30) (WaterSaturationPressure)
//
// Accepted: water temperature 273.15 K to 373.15 K (0 to 100 °C) and
// 0 < p ≤ 100 MPa, with the water not boiling: p ≥ p_v(T). Pure, air-free
// water; dissolved salts or gases change these values slightly.
//
// Special cases:
//
//	T outside [273.15 K, 373.15 K], NaN or ±Inf: *RangeError ("water temperature").
//	p ≤ 0, p > 100 MPa, NaN or ±Inf: *RangeError ("absolute pressure").
//	p < p_v(T), the water boils: *RangeError wrapping ErrBoiling. When
//	    p ≥ 611.213 Pa its quantity is "water temperature" with Max the
//	    boiling temperature T_s(p) (Eq. 31), so the message says up to what
//	    temperature water stays liquid at that pressure; below 611.213 Pa
//	    water boils at any temperature and the quantity is "absolute
//	    pressure" with Min = p_v(T).
//
// With the ErrBoiling error Water also returns the saturated liquid's
// properties at T (density and viscosity at p_v(T), and p_v), so that a
// caller can still ask Solve for the verdict: boiling at the site is a
// verdict (WillNotRun, WarnBoiling), not an input error. With any other
// error the Fluid is zero.
//
// Water does not allocate unless it returns an error.
func Water(T Temperature, p Pressure) (Fluid, error) {
	if err := checkRange(QuantityTemperature, "water temperature", float64(T), waterMinTemperature, waterToolMaxTemperature, "K"); err != nil {
		return Fluid{}, err
	}
	if err := checkPositive(QuantityAtmPressure, "absolute pressure", float64(p), waterRegion1MaxPressure, "Pa"); err != nil {
		return Fluid{}, err
	}
	t, pp := float64(T), float64(p)
	pv := waterSatPressure(t)
	if pp < pv {
		// the saturated liquid at T, for a boiling verdict (see the doc)
		rho := waterRegion1Density(t, pv)
		return Fluid{Density: Density(rho), Viscosity: Viscosity(waterMu(t, rho)), VaporPressure: Pressure(pv)},
			waterBoilingError(t, pp, pv)
	}
	rho := waterRegion1Density(t, pp)
	return Fluid{
		Density:       Density(rho),
		Viscosity:     Viscosity(waterMu(t, rho)),
		VaporPressure: Pressure(pv),
	}, nil
}

// waterBoilingError builds the ErrBoiling error of Water for water at T (K) that
// boils under p (Pa) because its vapour pressure pv (Pa) exceeds p.
func waterBoilingError(T, p, pv float64) error {
	if p < waterMinSaturationPressure {
		return &RangeError{
			What: QuantityAtmPressure, Quantity: "absolute pressure", Value: p, Min: pv, Max: waterRegion1MaxPressure, Unit: "Pa",
			Err:  ErrBoiling,
			Note: "water at " + waterNum(T) + " K boils below its vapour pressure " + waterNum(pv) + " Pa",
		}
	}
	ts := math.Min(waterSatTemperature(p), T)
	return &RangeError{
		What: QuantityTemperature, Quantity: "water temperature", Value: T, Min: waterMinTemperature, Max: ts, Unit: "K",
		Err:  ErrBoiling,
		Note: "water boils at " + waterNum(ts) + " K under " + waterNum(p) + " Pa",
	}
}

// waterNum formats v with six significant digits for error notes.
func waterNum(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
