package model

import (
	"errors"
	"math"
	"math/rand/v2"
	"strconv"
	"time"
)

// torricelli is an analytic quasi-steady drain of a vertical-sided tank of
// plan area A through a hose of flow area a with a constant total
// resistance R = R0 + ΔK (velocity head at the outlet, entrance, fittings
// and friction, friction factor held constant), with a constant inflow
// Qᵢₙ:
//
//	Q(h) = k·√(h − z),  k = a·√(2g/R)
//	A·dh/dt = Qᵢₙ − Q(h)
//
// With u = √(h − z) (dh = 2u du) the time from u₀ to u is
//
//	t(u) = 2A·[(u₀ − u)/k + (Qᵢₙ/k²)·ln((k·u₀ − Qᵢₙ)/(k·u − Qᵢₙ))]
//
// (the elementary integral ∫ s/(Qᵢₙ − k·s) ds, checkable by
// differentiation); with Qᵢₙ = 0 it is Torricelli's draining tank,
// t = 2A(u₀ − u)/k (Wolfram Demonstrations Project, "Time to Drain a Tank
// Using Torricelli's Law"; Wolfson, Essential University Physics, 3rd ed.,
// ch. 15, problem 69). The level settles where k·u = Qᵢₙ; the curve then
// stops within 1 cm of it (the plan's "settles" stop), else at hs ≥ z.
type torricelli struct {
	A, a, z, hs, R0 float64
}

func (d torricelli) k(extraK float64) float64 {
	return d.a * math.Sqrt(2*9.80665/(d.R0+extraK))
}

// flow at level h with ΔK, m³/s.
func (d torricelli) flow(extraK, h float64) float64 {
	return d.k(extraK) * math.Sqrt(max(h-d.z, 0))
}

// endLevel is where the drain from h0 stops, and why.
func (d torricelli) endLevel(p FitParams, h0 float64) (float64, string) {
	k := d.k(p.ExtraK)
	us := p.Inflow / k
	hSet := d.z + us*us
	if hSet+0.01 > d.hs {
		return min(hSet+0.01, h0), "settles"
	}
	return min(d.hs, h0), "intake"
}

// timeTo is t(u) from h0 to h (h between the end and h0).
func (d torricelli) timeTo(p FitParams, h0, h float64) float64 {
	k := d.k(p.ExtraK)
	u0, u := math.Sqrt(h0-d.z), math.Sqrt(h-d.z)
	t := (u0 - u) / k
	if p.Inflow > 0 {
		t += p.Inflow / (k * k) * math.Log((k*u0-p.Inflow)/(k*u-p.Inflow))
	}
	return 2 * d.A * t
}

// level at t seconds from h0 (bisection on t(u), which falls monotonically).
func (d torricelli) level(p FitParams, h0, t float64) float64 {
	end, _ := d.endLevel(p, h0)
	if t >= d.timeTo(p, h0, end) {
		return end
	}
	lo, hi := end, h0
	for range 200 {
		mid := (lo + hi) / 2
		if d.timeTo(p, h0, mid) > t {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

func (d torricelli) stopTime(p FitParams, h0 float64) float64 {
	end, _ := d.endLevel(p, h0)
	if h0 <= end {
		return 0
	}
	return d.timeTo(p, h0, end)
}

// sim is the Simulator of the analytic drain: 400 points uniform in u.
func (d torricelli) sim(p FitParams, h0 float64) (DrainCurve, error) {
	if d.R0+p.ExtraK <= 0 || p.ExtraK < 0 || p.Inflow < 0 {
		return DrainCurve{}, errors.New("resistance must be positive, inflow not negative")
	}
	end, stop := d.endLevel(p, h0)
	c := DrainCurve{Stop: stop}
	if h0 <= end {
		return DrainCurve{Times: []float64{0}, Levels: []float64{h0}, Flows: []float64{d.flow(p.ExtraK, h0)}, Stop: stop}, nil
	}
	const n = 400
	u0, u1 := math.Sqrt(h0-d.z), math.Sqrt(end-d.z)
	for i := 0; i <= n; i++ {
		u := u0 + (u1-u0)*float64(i)/n
		h := d.z + u*u
		if i == n {
			h = end
		}
		c.Times = append(c.Times, d.timeTo(p, h0, h))
		c.Levels = append(c.Levels, h)
		c.Flows = append(c.Flows, d.flow(p.ExtraK, h))
	}
	return c, nil
}

// rdPond: 12 m × 12 m sump (A = 144 m²) drained through a 50 mm hose to an
// outlet 1.5 m below the floor, stopping at 0.2 m; R0 = 12 (invented case).
var rdPond = torricelli{A: 144, a: math.Pi * 0.05 * 0.05 / 4, z: -1.5, hs: 0.2, R0: 12}

var rdT0 = time.Date(2026, 5, 14, 8, 0, 0, 0, time.FixedZone("CEST", 2*3600))

// gen makes readings off the analytic drain from h0, one every `every`,
// with ΔK(t) piecewise constant over each interval (exact per piece) and
// inflow q; each level gets uniform noise of ±noise m and, with res > 0,
// is rounded to res as a technician types it (Resolution res).
type gen struct {
	d      torricelli
	extraK func(t float64) float64
	q      float64
	h0     float64
	every  time.Duration
	n      int
	noise  float64
	res    float64
	seed   uint64
}

func (g gen) readings() []Reading {
	rng := rand.New(rand.NewPCG(g.seed, 1))
	var rs []Reading
	h, tPrev := g.h0, 0.0
	for i := 0; i < g.n; i++ {
		t := float64(i) * g.every.Seconds()
		if i > 0 {
			// sub-steps of a minute, so a rising ΔK is followed closely
			for s := tPrev; s < t; s += 60 {
				dt := math.Min(60, t-s)
				h = g.d.level(FitParams{ExtraK: g.extraK(s), Inflow: g.q}, h, dt)
			}
		}
		tPrev = t
		lv := h
		if g.noise > 0 {
			lv += g.noise * (2*rng.Float64() - 1)
		}
		r := Reading{At: rdT0.Add(time.Duration(t) * time.Second), Level: lv}
		if g.res > 0 {
			r.Level = math.Round(lv/g.res) * g.res
			r.Resolution = g.res
		}
		rs = append(rs, r)
	}
	return rs
}

func constK(k float64) func(float64) float64 { return func(float64) float64 { return k } }

// flowTests makes n bucket tests at the given times (s from rdT0) on the
// analytic drain with ΔK k and inflow q, each flow off by a relative
// Gaussian error of rel (a 10 L bucket timed by hand).
func flowTests(d torricelli, k, q, h0 float64, at []float64, rel float64, seed uint64) []FlowTest {
	rng := rand.New(rand.NewPCG(seed, 2))
	var out []FlowTest
	for _, s := range at {
		h := d.level(FitParams{ExtraK: k, Inflow: q}, h0, s)
		qm := d.flow(k, h) * (1 + rel*rng.NormFloat64())
		out = append(out, FlowTest{At: rdT0.Add(time.Duration(s) * time.Second), Volume: 0.010, Seconds: 0.010 / qm, Level: h,
			Note: "test at " + strconv.FormatFloat(s/60, 'f', 0, 64) + " min"})
	}
	return out
}
