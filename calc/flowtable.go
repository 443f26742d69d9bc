package calc

import "math"

// fixedLoss replaces Solve with a constant-coefficient orifice law,
// Q = C·a·√(2gH), for checks against the closed forms (tests only).
type fixedLoss struct {
	c, area, g float64
}

// tableMax is the most heads at which the energy equation is sampled.
const tableMax = 24

// flowTable holds a flow sampled at heads H_j spaced evenly in ln H:
// u_j = √H_j, φ_j = Q_j/u_j, and a second quantity C_j (the flowing crest
// limit, for the full-gravity table).
type flowTable struct {
	n     int
	u     [tableMax]float64
	phi   [tableMax]float64
	crest [tableMax]float64
	// inv[j][i] is 1/∏(u_{j+i} − u_{j+k}), k ≠ i: Lagrange denominators of
	// the stencil starting at j.
	inv [tableMax][4]float64
}

// prepare computes the Lagrange denominators once the samples are in.
func (t *flowTable) prepare() {
	for j := 0; j+3 < t.n; j++ {
		for i := 0; i < 4; i++ {
			d := 1.0
			for k := 0; k < 4; k++ {
				if k != i {
					d *= t.u[j+i] - t.u[j+k]
				}
			}
			t.inv[j][i] = 1 / d
		}
	}
}

// at returns Q and C at head H. With u = √H it interpolates φ = Q/u and C by
// the cubic through the four nearest samples in u (Lagrange form); φ is
// nearly constant for fixed losses and linear in u for laminar flow, so
// Q = u·φ(u) keeps the √H behaviour near a vanishing head exactly. Outside
// the sampled heads the end cubic is extended (the plan never asks far
// outside).
func (t *flowTable) at(H float64) (q, c float64) {
	u := math.Sqrt(max(H, 0))
	n := t.n
	if n == 1 {
		return u * t.phi[0], t.crest[0]
	}
	if n < 4 {
		// linear between the two nearest samples
		j := 0
		if n == 3 && u > t.u[1] {
			j = 1
		}
		w := (u - t.u[j]) / (t.u[j+1] - t.u[j])
		return max(u*(t.phi[j]+w*(t.phi[j+1]-t.phi[j])), 0), t.crest[j] + w*(t.crest[j+1]-t.crest[j])
	}
	// k: last sample with u_k ≤ u (binary search), stencil k−1 … k+2
	lo, hi := 0, n-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if t.u[mid] <= u {
			lo = mid
		} else {
			hi = mid
		}
	}
	j := min(max(lo-1, 0), n-4)
	d0, d1, d2, d3 := u-t.u[j], u-t.u[j+1], u-t.u[j+2], u-t.u[j+3]
	inv := &t.inv[j]
	d01, d23 := d0*d1, d2*d3
	l0 := d1 * d23 * inv[0]
	l1 := d0 * d23 * inv[1]
	l2 := d01 * d3 * inv[2]
	l3 := d01 * d2 * inv[3]
	q = u * (l0*t.phi[j] + l1*t.phi[j+1] + l2*t.phi[j+2] + l3*t.phi[j+3])
	c = l0*t.crest[j] + l1*t.crest[j+1] + l2*t.crest[j+2] + l3*t.crest[j+3]
	return max(q, 0), c
}

// fill samples f at heads in [hLo, hHi], spaced evenly in ln H; the number
// of samples grows with the ratio of the ends (6 to tableMax; limit caps it).
func (t *flowTable) fill(hLo, hHi float64, limit int, f func(H float64) (q, c float64)) {
	zr := math.Log(hHi / hLo)
	n := int(math.Ceil(zr/0.3)) + 5
	switch {
	case zr < 1e-9:
		n = 1
	case n > tableMax:
		n = tableMax
	case n < 6:
		n = 6
	}
	n = min(n, limit)
	t.n = n
	dz := 0.0
	if n > 1 {
		dz = zr / float64(n-1)
	}
	for j := 0; j < n; j++ {
		H := hLo * math.Exp(float64(j)*dz)
		if j == n-1 {
			H = hHi
		}
		q, c := f(H)
		t.u[j] = math.Sqrt(H)
		t.phi[j] = max(q, 1e-300) / t.u[j]
		t.crest[j] = c
	}
	t.prepare()
}

// build fills the full-gravity table for heads in [hLo, hHi]: the energy
// equation of Solve (the hose as the plan keeps it) gives Q (all hoses) and
// the flowing crest limit C above the surface.
func (p *planner) build(hLo, hHi float64) {
	if p.fixed != nil {
		p.tab.fill(hLo, hHi, 4, func(H float64) (float64, float64) {
			return p.fixed.c * p.fixed.area * math.Sqrt(2*p.fixed.g*H), 1e6
		})
		return
	}
	c := &p.c
	maxCrest := (c.patm - c.pv) / (c.rho * StandardGravity)
	p.tab.fill(hLo, hHi, tableMax, func(H float64) (float64, float64) {
		V, f, _ := c.velocity(H, c.kSum)
		kCrest := 1 + c.kUp + f*c.lUp/c.D
		return c.n * V * c.area, maxCrest - kCrest*V*V/(2*StandardGravity)
	})
}

// buildChoke fills the choked-flow table for crest headroom Δ in [dLo, dHi]:
// the up-leg's energy equation with the crest at its running limit,
// Δ = (V²/2g)(1 + K_ent + K_intake + K_up + f·L_up/D) (see Solve).
func (p *planner) buildChoke(dLo, dHi float64) {
	c := &p.c
	p.chk.fill(dLo, dHi, tableMax, func(d float64) (float64, float64) {
		V, _, _ := solveVelocity(d, c.kUp, c.lUp/c.D, c.reOverV, c.rr)
		return c.n * V * c.area, 0
	})
	p.hasChoke = true
}
