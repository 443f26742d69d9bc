package calc

import "math"

// Gauss–Lobatto 4-point rule on [−1, 1]: nodes ±1, ±1/√5, weights 1/6, 5/6;
// exact for polynomials of degree ≤ 5 (Lobatto integration, Abramowitz &
// Stegun, Handbook of Mathematical Functions, 25.4.32).
const lobattoInner = 0.4472135954999579

// quadIntervals is the number of quadrature intervals over the drain.
const quadIntervals = 64

// integrate fills the time, volume, stop values and the curve over [0, xe].
//
// The path parameter s ∈ [0, 1] is itself written as s = σ²(3 − 2σ), which
// crowds the quadrature nodes at both ends: a full horizontal cylinder starts
// with A ∝ √(D − h), an integrable kink that this smooths out. t(σ) is
// integrated by the composite Gauss–Lobatto rule on quadIntervals equal steps
// in σ; curve points, evenly spaced in σ, take t from the cubic Hermite
// interpolant of t and dt/dσ at the step ends (error O(Δσ⁴)).
func (p *planner) integrate(plan *DrainPlan, m xmap) {
	// dt/dσ at σ
	rate := func(sg float64) float64 {
		x, dxds := m.at(sg * sg * (3 - 2*sg))
		hs, _, _, H := p.state(x)
		if H <= 0 {
			return 0
		}
		q, _, _ := p.tab.at(H)
		if !(q > 0) {
			return 0
		}
		return 6 * sg * (1 - sg) * dxds * p.dvdx(hs) / q
	}
	var ts, fs [quadIntervals + 1]float64
	ds := 1.0 / quadIntervals
	fs[0] = rate(0)
	for k := 0; k < quadIntervals; k++ {
		mid := (float64(k) + 0.5) * ds
		fb := rate(float64(k+1) * ds)
		fi := rate(mid-lobattoInner*ds/2) + rate(mid+lobattoInner*ds/2)
		ts[k+1] = ts[k] + ds/2*((fs[k]+fb)/6+fi*5/6)
		fs[k+1] = fb
	}
	if nc := p.points; nc > 0 {
		plan.Curve = make([]DrainPoint, nc)
		for i := range plan.Curve {
			sg := float64(i) / float64(nc-1)
			k := int(sg * quadIntervals)
			if k >= quadIntervals {
				k = quadIntervals - 1
			}
			r := sg*quadIntervals - float64(k) // 0…1 within the step
			r2, r3 := r*r, r*r*r
			t := (2*r3-3*r2+1)*ts[k] + (r3-2*r2+r)*ds*fs[k] + (-2*r3+3*r2)*ts[k+1] + (r3-r2)*ds*fs[k+1]
			t = max(ts[k], min(ts[k+1], t))
			x, _ := m.at(sg * sg * (3 - 2*sg))
			hs, hr, _, H := p.state(x)
			q, _, _ := p.tab.at(max(H, 0))
			plan.Curve[i] = DrainPoint{Time: Seconds(t), Level: Length(hs), Flow: FlowRate(q), ReceiverLevel: Length(hr)}
		}
	}
	hs, hr, _, H := p.state(m.xe)
	q, _, _ := p.tab.at(math.Max(H, 0))
	plan.Time = Seconds(ts[quadIntervals])
	plan.StopLevel = Length(hs)
	plan.ReceiverLevel = Length(hr)
	plan.Residual = p.src.Volume(Length(hs))
	if p.hasRcv {
		plan.Volume = Volume(m.xe)
	} else {
		plan.Volume = Volume(p.vs0 - float64(plan.Residual))
	}
	plan.EndFlow = FlowRate(q)
	if n := len(plan.Curve); n > 0 {
		plan.Curve[n-1].Time = plan.Time
	}
}
