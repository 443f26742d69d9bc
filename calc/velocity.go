package calc

import "math"

// solveVelocity solves the energy equation
//
//	φ(V) = V²·(A + f(cV)·B) − 2gH = 0,  A = 1 + ΣK, B = L/D, c = ρD/μ
//
// for the hose velocity V. φ increases with V in every regime (f·V² grows
// with V), so the root is unique and is found branch by branch:
//
//   - laminar: with f = 64/Re, φ is the quadratic A·V² + (64B/c)·V − 2gH,
//     solved in closed form; accepted when its Re ≤ 2000;
//   - turbulent: substituting V(x) = √(2gH/(A + B/x²)) with x = 1/√f into
//     Colebrook–White leaves one equation in x,
//     R(x) = x + 2 log10( ε/(3.7D) + 2.51·√(A x² + B)/(c √(2gH)) ) = 0,
//     with R′ > 1, solved by Newton's method; accepted when its Re ≥ 4000;
//   - otherwise the root lies in 2000 < Re < 4000 and is bracketed there;
//     the Illinois variant of regula falsi finds it.
//
// It returns V, the Darcy f and Re; f is friction at that Re, the same
// function the friction checks test.
func solveVelocity(H, k, lOverD, reOverV, rr float64) (V, f, re float64) {
	twoGH := 2 * StandardGravity * H
	A := 1 + k
	B := lOverD
	c := reOverV

	// Laminar branch, closed form (the cancellation-free root of the quadratic).
	bl := 64 * B / c
	V = 2 * twoGH / (bl + math.Sqrt(bl*bl+4*A*twoGH))
	if re = c * V; re <= ReLaminarMax {
		return V, friction(re, rr, 0), re
	}
	// Above Re 2000 the transitional f exceeds 64/Re, so the laminar root
	// is an upper bound for the transitional one.
	vLam := V

	// Turbulent branch, Newton on x = 1/√f.
	a := rr / 3.7
	beta := 2.51 / (c * math.Sqrt(twoGH))
	const k10 = 2 / math.Ln10
	x := 7.0 // f ≈ 0.02
	for i := 0; i < 60; i++ {
		q := math.Sqrt(A*x*x + B)
		s := a + beta*q
		r := x + k10*math.Log(s)
		d := r / (1 + k10*beta*A*x/(q*s))
		x -= d
		if x <= 0 {
			x = 1e-3
		}
		// Newton converges quadratically: after a step of 1e-7·x the
		// error left is of order 1e-14·x, and friction() below confirms
		// x against Colebrook–White itself.
		if math.Abs(d) <= 1e-7*x {
			break
		}
	}
	V = math.Sqrt(twoGH / (A + B/(x*x)))
	if re = c * V; re >= ReTurbulentMin {
		return V, friction(re, rr, x), re
	}

	// Transitional band: Illinois regula falsi on V. Colebrook–White lies
	// above the shifted Churchill curve in the band (they meet at 4000), so
	// the turbulent root is a lower bound, as the laminar root is an upper
	// one; each bound is checked and replaced by the band's end if it fails.
	vTurb := V
	lo, hi := transitionShift(rr)
	phi := func(v float64) float64 {
		return v*v*(A+transitionFriction(c*v, rr, lo, hi)*B) - twoGH
	}
	v0, v1 := max(ReLaminarMax/c, vTurb), min(ReTurbulentMin/c, vLam)
	p0, p1 := phi(v0), phi(v1)
	if p0 > 0 {
		v0 = ReLaminarMax / c
		p0 = phi(v0)
	}
	if p1 < 0 {
		v1 = ReTurbulentMin / c
		p1 = phi(v1)
	}
	side := 0
	V = v0
	for i := 0; i < 200 && p0 != p1; i++ {
		V = (v0*p1 - v1*p0) / (p1 - p0)
		p := phi(V)
		if p == 0 || math.Abs(v1-v0) <= 1e-11*V || math.Abs(p) <= 1e-12*twoGH {
			break
		}
		if (p > 0) == (p1 > 0) {
			v1, p1 = V, p
			if side == -1 {
				p0 /= 2
			}
			side = -1
		} else {
			v0, p0 = V, p
			if side == 1 {
				p1 /= 2
			}
			side = 1
		}
	}
	re = c * V
	// friction(re, rr, 0) in this band, with the shift already computed
	return V, transitionFriction(re, rr, lo, hi), re
}

// crestPressure is the absolute crest pressure while flowing (Bernoulli with
// losses, source surface → crest): p_atm − ρg·lift − kCrest·ρV²/2, where
// kCrest = 1 + K_entrance + K_up-leg + f·L_up/D.
func crestPressure(patm, rho, lift, v, kCrest float64) float64 {
	return patm - rho*StandardGravity*lift - kCrest*rho*v*v/2
}

// airClearing is the Wisner et al. (1975) air-clearing velocity for inside
// diameter D (m) on a down-leg whose steepest slope has sine slope, or, with
// slope 0, whose fall from crest to outlet dz (m) spreads over its length l
// (m).
func airClearing(D, dz, l, slope float64) float64 {
	sin := slope
	if sin == 0 {
		sin = 1
		if l > 0 {
			sin = min(max(dz/l, 0), 1)
		}
	}
	return math.Sqrt(StandardGravity*D) * (0.825 + 0.25*math.Sqrt(sin))
}
