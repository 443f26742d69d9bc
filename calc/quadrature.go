package calc

import "math"

// Gauss–Lobatto 4-point rule on [−1, 1]: nodes ±1, ±1/√5, weights 1/6, 5/6;
// exact for polynomials of degree ≤ 5 (Lobatto integration, Abramowitz &
// Stegun, Handbook of Mathematical Functions, 25.4.32).
const lobattoInner = 0.4472135954999579

// quadIntervals is the number of quadrature intervals over the drain.
const quadIntervals = 64

// lobatto integrates the two functions f returns over [0, 1] by the
// composite Gauss–Lobatto rule on len(ts)−1 equal steps. For each it fills
// ts (ts0) with the running integral at the step ends (ts[0] = 0) and fs
// (fs0) with the function there, for Hermite interpolation between them (see
// hermite).
func lobatto(f func(float64) (float64, float64), ts, fs, ts0, fs0 []float64) {
	n := len(ts) - 1
	ds := 1.0 / float64(n)
	ts[0], ts0[0] = 0, 0
	fs[0], fs0[0] = f(0)
	for k := 0; k < n; k++ {
		mid := (float64(k) + 0.5) * ds
		fb, fb0 := f(float64(k+1) * ds)
		f1, f10 := f(mid - lobattoInner*ds/2)
		f2, f20 := f(mid + lobattoInner*ds/2)
		ts[k+1] = ts[k] + ds/2*((fs[k]+fb)/6+(f1+f2)*5/6)
		ts0[k+1] = ts0[k] + ds/2*((fs0[k]+fb0)/6+(f10+f20)*5/6)
		fs[k+1], fs0[k+1] = fb, fb0
	}
}

// hermite interpolates the running integral of lobatto at σ ∈ [0, 1] by the
// cubic Hermite interpolant of the integral and its derivative at the step
// ends (error O(Δσ⁴)), kept inside the step's bracket.
func hermite(ts, fs []float64, sg float64) float64 {
	n := len(ts) - 1
	ds := 1.0 / float64(n)
	k := min(int(sg*float64(n)), n-1)
	r := sg*float64(n) - float64(k) // 0…1 within the step
	r2, r3 := r*r, r*r*r
	t := (2*r3-3*r2+1)*ts[k] + (r3-2*r2+r)*ds*fs[k] + (-2*r3+3*r2)*ts[k+1] + (r3-r2)*ds*fs[k+1]
	return max(ts[k], min(ts[k+1], t))
}

// smooth is the path parameter s = σ²(3 − 2σ) and ds/dσ: it crowds the
// quadrature nodes at both ends of the path, where a full horizontal
// cylinder starts with A ∝ √(D − h), an integrable kink that this smooths
// out.
func smooth(sg float64) (s, dsds float64) { return sg * sg * (3 - 2*sg), 6 * sg * (1 - sg) }

// unsmooth inverts smooth: σ = 1/2 − sin(arcsin(1 − 2s)/3), the root in
// [0, 1] of the cubic (trigonometric solution).
func unsmooth(s float64) float64 {
	return 0.5 - math.Sin(math.Asin(min(max(1-2*s, -1), 1))/3)
}

// integrate fills the time, volume, stop values and the curve for the path
// m from x = 0 to the stop, and the gulping time from xAir (if gulp) to the
// stop. t(σ) is integrated by the composite Gauss–Lobatto rule on
// quadIntervals equal steps in σ (see smooth), with the flow and with the
// flow the siphon would have without gulped air; curve points, evenly spaced
// in σ, and the time at xAir take t from the Hermite interpolant.
func (p *planner) integrate(plan *DrainPlan, m xmap, xAir float64, gulp bool) {
	rate := func(sg float64) (float64, float64) {
		s, dsds := smooth(sg)
		x, dxds := m.at(s)
		e := p.eval(x)
		if !(e.q > p.qin) {
			return 0, 0
		}
		w := dsds * dxds * p.dvdx(e.hs)
		return w / (e.q - p.qin), w / (e.q0 - p.qin)
	}
	var ts, fs, ts0, fs0 [quadIntervals + 1]float64
	lobatto(rate, ts[:], fs[:], ts0[:], fs0[:])
	if nc := p.points; nc > 0 {
		plan.Curve = make([]DrainPoint, nc)
		for i := range plan.Curve {
			sg := float64(i) / float64(nc-1)
			s, _ := smooth(sg)
			x, _ := m.at(s)
			e := p.eval(x)
			plan.Curve[i] = DrainPoint{Time: Seconds(hermite(ts[:], fs[:], sg)), Level: Length(e.hs), Flow: FlowRate(e.q),
				ReceiverLevel: Length(e.hr)}
		}
	}
	e := p.eval(m.xe)
	plan.Time = Seconds(ts[quadIntervals])
	plan.StopLevel = Length(e.hs)
	plan.ReceiverLevel = Length(e.hr)
	plan.Residual = p.src.Volume(Length(e.hs))
	if p.hasRcv {
		plan.Volume = Volume(m.xe)
	} else {
		plan.Volume = Volume(p.vs0 - float64(plan.Residual) + p.qin*float64(plan.Time))
	}
	plan.Time90 = Seconds(p.time90(float64(plan.Volume), func(sg float64) (float64, float64) {
		s, _ := smooth(sg)
		x, _ := m.at(s)
		return x, hermite(ts[:], fs[:], sg)
	}))
	plan.EndFlow = FlowRate(e.q)
	if n := len(plan.Curve); n > 0 {
		plan.Curve[n-1].Time = plan.Time
	}
	if gulp {
		sg := unsmooth(m.sOf(xAir))
		t := ts[quadIntervals] - hermite(ts[:], fs[:], sg)
		t0 := ts0[quadIntervals] - hermite(ts0[:], fs0[:], sg)
		plan.GulpTime, plan.GulpTimeLost = Seconds(max(t, 0)), Seconds(min(max(t-t0, 0), max(t, 0)))
	}
}
