package calc

import "math"

// fixedLoss replaces Solve with a constant-coefficient orifice law,
// Q = C·a·√(2gH), for checks against the closed forms (tests only).
type fixedLoss struct {
	c, area, g float64
}

// tableMax is the most heads at which Solve is sampled.
const tableMax = 24

// flowTable holds Solve's results at heads H_j spaced evenly in ln H:
// u_j = √H_j, φ_j = Q_j/u_j, S_j and the flowing crest limit C_j.
type flowTable struct {
	n     int
	u     [tableMax]float64
	phi   [tableMax]float64
	sub   [tableMax]float64
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

// at returns Q, S and the flowing crest limit at head H. With u = √H it
// interpolates φ = Q/u, S and C by the cubic through the four nearest samples
// in u (Lagrange form); φ is nearly constant for fixed losses and linear in u
// for laminar flow, so Q = u·φ(u) keeps the √H behaviour near equal levels
// exactly. Outside the sampled heads the end cubic is extended (the plan never
// asks far outside).
func (t *flowTable) at(H float64) (q, s, c float64) {
	u := math.Sqrt(max(H, 0))
	n := t.n
	if n == 1 {
		return u * t.phi[0], t.sub[0], t.crest[0]
	}
	if n < 4 {
		// linear between the two nearest samples
		j := 0
		if n == 3 && u > t.u[1] {
			j = 1
		}
		w := (u - t.u[j]) / (t.u[j+1] - t.u[j])
		return u * (t.phi[j] + w*(t.phi[j+1]-t.phi[j])), t.sub[j] + w*(t.sub[j+1]-t.sub[j]),
			t.crest[j] + w*(t.crest[j+1]-t.crest[j])
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
	j := lo - 1
	if j < 0 {
		j = 0
	}
	if j > n-4 {
		j = n - 4
	}
	d0, d1, d2, d3 := u-t.u[j], u-t.u[j+1], u-t.u[j+2], u-t.u[j+3]
	inv := &t.inv[j]
	d01, d23 := d0*d1, d2*d3
	l0 := d1 * d23 * inv[0]
	l1 := d0 * d23 * inv[1]
	l2 := d01 * d3 * inv[2]
	l3 := d01 * d2 * inv[3]
	q = u * (l0*t.phi[j] + l1*t.phi[j+1] + l2*t.phi[j+2] + l3*t.phi[j+3])
	s = l0*t.sub[j] + l1*t.sub[j+1] + l2*t.sub[j+2] + l3*t.sub[j+3]
	c = l0*t.crest[j] + l1*t.crest[j+1] + l2*t.crest[j+2] + l3*t.crest[j+3]
	return max(q, 0), s, c
}

// sample runs Solve for head H in a stand-in geometry with the smallest lift
// of the plan and the real up-leg, and returns Q, S and the flowing crest
// limit. ok is false if even that geometry will not run.
func (p *planner) sample(H float64) (q, sub, crest float64, ok bool, err error) {
	if p.fixed != nil {
		return p.fixed.c * p.fixed.area * math.Sqrt(2*p.fixed.g*H), 0, 1e6, true, nil
	}
	s := p.s
	lift := math.Max(math.Min(p.crest-p.h0, 0), -500)
	s.Geometry.Surface = Length(H / 2)
	s.Geometry.Outlet = Length(-H / 2)
	s.Geometry.Crest = Length(H/2 + lift)
	s.Geometry.Intake = s.Geometry.Crest
	s.Geometry.OutletSubmerged = true
	s.Hose.UpLegLength = Length(p.lUp)
	r, err := Solve(s)
	if err != nil {
		return 0, 0, 0, false, err
	}
	if r.Verdict == WillNotRun {
		return 0, float64(r.RequiredSubmergence), float64(r.FlowingCrestLimit), false, nil
	}
	return float64(r.Flow), float64(r.RequiredSubmergence), float64(r.FlowingCrestLimit), true, nil
}

// build fills the flow table for heads in [hLo, hHi].
func (p *planner) build(hLo, hHi float64) error {
	t := &p.tab
	zr := math.Log(hHi / hLo)
	n := int(math.Ceil(zr/0.3)) + 5
	if zr < 1e-9 {
		n = 1
	} else if n > tableMax {
		n = tableMax
	} else if n < 6 {
		n = 6
	}
	if p.fixed != nil && n > 4 {
		n = 4
	}
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
		q, s, c, ok, err := p.sample(H)
		if err != nil {
			return err
		}
		if !ok || !(q > 0) {
			// Only reachable when the crest fails at zero lift: stand in a
			// tiny flow and a crest limit below any lift so that the crest
			// event fires here.
			q = 1e-300
			c = math.Min(c, -1e3)
		}
		t.u[j] = math.Sqrt(H)
		t.phi[j] = q / t.u[j]
		t.sub[j] = s
		t.crest[j] = c
	}
	t.prepare()
	return nil
}
