package calc

import (
	"errors"
	"math"
)

// This file is test-only: an adaptive reference integrator for the drain, to
// compare the planner with at equal accuracy.
//
// Dormand–Prince 5(4): J.R. Dormand and P.J. Prince, "A family of embedded
// Runge–Kutta formulae", J. Comput. Appl. Math. 6(1):19–26 (1980); the
// coefficients as tabulated in Hairer, Nørsett & Wanner, Solving Ordinary
// Differential Equations I (2nd ed., 1993), Table II.5.2 ("DOPRI5"), with
// the continuous extension of order 4 of §II.6 (Shampine's, as in the
// authors' code DOPRI5) and the step-size control and starting step of
// §II.4.
const (
	dpC2, dpC3, dpC4, dpC5 = 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9

	dpA21 = 1.0 / 5

	dpA31, dpA32 = 3.0 / 40, 9.0 / 40

	dpA41, dpA42, dpA43 = 44.0 / 45, -56.0 / 15, 32.0 / 9

	dpA51, dpA52, dpA53, dpA54 = 19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729

	dpA61, dpA62, dpA63, dpA64, dpA65 = 9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656

	// the fifth-order weights (also the seventh stage: first same as last)
	dpB1, dpB3, dpB4, dpB5, dpB6 = 35.0 / 384, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84

	// b − b̂: the fifth- less the fourth-order weights, for the error estimate
	dpE1, dpE3, dpE4, dpE5, dpE6, dpE7 = 71.0 / 57600, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525, -1.0 / 40

	// dense output (Hairer, Nørsett & Wanner I, §II.6; DOPRI5's CONTD5)
	dpD1, dpD3, dpD4 = -12715105075.0 / 11282082432, 87487479700.0 / 32700410799, -10690763975.0 / 1880347072
	dpD5, dpD6, dpD7 = 701980252875.0 / 199316789632, -1453857185.0 / 822651844, 69997945.0 / 29380423
)

// dopriStats counts the work of one integration.
type dopriStats struct {
	Evals              int // right-hand-side evaluations (Solve calls in a drain)
	Accepted, Rejected int // steps
}

// dopriDense is the continuous extension over one accepted step from t0 of
// size dt: y(t0 + θ·dt) for θ ∈ [0, 1].
type dopriDense struct{ t0, dt, r1, r2, r3, r4, r5 float64 }

func (d *dopriDense) at(th float64) float64 {
	return d.r1 + th*(d.r2+(1-th)*(d.r3+th*(d.r4+(1-th)*d.r5)))
}

// dopriRHS is a scalar right-hand side y' = f(t, y); ok false marks a value
// outside the model's validity (here: the siphon does not run), which makes
// the step that used it unusable.
type dopriRHS func(t, y float64) (f float64, ok bool)

// dopriStep is one Dormand–Prince step from (t, y) with f0 = f(t, y) (first
// same as last): the fifth-order value, its derivative, the error estimate,
// the dense output, and whether every stage was valid.
func dopriStep(f dopriRHS, t, y, f0, dt float64, st *dopriStats) (y1, f1, errEst float64, d dopriDense, ok bool) {
	ok = true
	ev := func(tt, yy float64) float64 {
		st.Evals++
		v, good := f(tt, yy)
		ok = ok && good
		return v
	}
	k1 := f0
	k2 := ev(t+dpC2*dt, y+dt*dpA21*k1)
	k3 := ev(t+dpC3*dt, y+dt*(dpA31*k1+dpA32*k2))
	k4 := ev(t+dpC4*dt, y+dt*(dpA41*k1+dpA42*k2+dpA43*k3))
	k5 := ev(t+dpC5*dt, y+dt*(dpA51*k1+dpA52*k2+dpA53*k3+dpA54*k4))
	k6 := ev(t+dt, y+dt*(dpA61*k1+dpA62*k2+dpA63*k3+dpA64*k4+dpA65*k5))
	y1 = y + dt*(dpB1*k1+dpB3*k3+dpB4*k4+dpB5*k5+dpB6*k6)
	k7 := ev(t+dt, y1)
	errEst = dt * (dpE1*k1 + dpE3*k3 + dpE4*k4 + dpE5*k5 + dpE6*k6 + dpE7*k7)
	diff := y1 - y
	bspl := dt*k1 - diff
	d = dopriDense{t0: t, dt: dt, r1: y, r2: diff, r3: bspl, r4: diff - dt*k7 - bspl,
		r5: dt * (dpD1*k1 + dpD3*k3 + dpD4*k4 + dpD5*k5 + dpD6*k6 + dpD7*k7)}
	return y1, k7, errEst, d, ok
}

// dopriStart is the starting step of Hairer, Nørsett & Wanner I, §II.4
// ("Starting step size"), for order 5; it costs one evaluation.
func dopriStart(f dopriRHS, t, y, f0, rtol, atol float64, st *dopriStats) float64 {
	sc := atol + rtol*math.Abs(y)
	d0, d1 := math.Abs(y)/sc, math.Abs(f0)/sc
	h0 := 1e-6
	if d0 >= 1e-5 && d1 >= 1e-5 {
		h0 = 0.01 * d0 / d1
	}
	st.Evals++
	f1, _ := f(t+h0, y+h0*f0)
	d2 := math.Abs(f1-f0) / sc / h0
	h1 := max(1e-6, h0*1e-3)
	if m := max(d1, d2); m > 1e-15 {
		h1 = math.Pow(0.01/m, 1.0/5)
	}
	return min(100*h0, h1)
}

// Step-size control (Hairer, Nørsett & Wanner I, §II.4, eq. 4.13): the new
// step is dt·min(facMax, max(facMin, fac·(1/err)^(1/5))), with no growth
// right after a rejected step.
const (
	dpFac, dpFacMin, dpFacMax = 0.9, 0.2, 10.0
	dpMaxSteps                = 200_000
)

func dopriNewStep(dt, errNorm float64, afterReject bool) float64 {
	fm := dpFacMax
	if afterReject {
		fm = 1
	}
	if errNorm == 0 {
		return dt * fm
	}
	return dt * min(fm, max(dpFacMin, dpFac*math.Pow(errNorm, -0.2)))
}

var errDopri = errors.New("dopri: too many steps")

// dopriSw holds the switching functions of a right-hand side (unused ones
// stay positive).
type dopriSw [3]float64

// passes reports whether a switching function turns from positive to
// non-positive between a and b.
func passes(a, b dopriSw) bool {
	for i := range a {
		if a[i] > 0 && b[i] <= 0 {
			return true
		}
	}
	return false
}

// dopriTo integrates the scalar y' = f(t, y) from (t0, y0) to t1 with the
// error per step held to rtol·|y| + atol; it returns y(t1). It is the plain
// integrator, for checks against closed forms.
func dopriTo(f dopriRHS, t0, y0, t1, rtol, atol float64) (float64, dopriStats, error) {
	var st dopriStats
	st.Evals++
	f0, _ := f(t0, y0)
	dt := dopriStart(f, t0, y0, f0, rtol, atol, &st)
	t, y := t0, y0
	rejected := false
	for st.Accepted+st.Rejected < dpMaxSteps {
		last := t+dt >= t1
		if last {
			dt = t1 - t
		}
		y1, f1, e, _, _ := dopriStep(f, t, y, f0, dt, &st)
		en := math.Abs(e) / (atol + rtol*max(math.Abs(y), math.Abs(y1)))
		if en > 1 {
			st.Rejected++
			dt = dopriNewStep(dt, en, true)
			rejected = true
			continue
		}
		st.Accepted++
		t, y, f0 = t+dt, y1, f1
		if last {
			return y, st, nil
		}
		dt = dopriNewStep(dt, en, rejected)
		rejected = false
	}
	return y, st, errDopri
}

// dopriLevel integrates a falling level, y' = f(y) < 0 from y(0) = y0, to the
// first of a list of events, each a level the solution falls to: the fixed
// levels (any order) and, if flow is not nil, the level where flow turns
// non-positive (flow > 0 above it; f is invalid, ok false, at and below
// it). f also returns switching functions sw (kink is sw without f): where
// one turns from positive to non-positive the right-hand side has a kink (its
// derivative jumps), which the error estimate of a step across it does not
// see, so the integration is stopped there and restarted (Hairer, Nørsett &
// Wanner I, §II.6 on discontinuities; section from memory). It returns the time and
// level of the stop and the index of the event (len(levels) for the flow
// event).
//
// Event location. A fixed level crossed within an accepted step is found on
// the step's continuous extension by Brent's method in θ (no evaluations of
// f). The flow event is found the first time a stage comes out invalid, the
// kink the first time an accepted step's end has a switching function ≤ 0
// (the highest such kink if several): by Brent's method in y, on flow or the
// switching function, to atol; that step is rejected. From then on the
// steps are cut to land short of that level (a linear aim, which falls short
// while |f| shrinks as the level falls) until the gap left is a hundredth of
// the last step; the time across the gap is the quadrature of 1/f (secant of
// 1/f through the last step's ends; error of the order of the gap cubed).
// Every evaluation of f, flow and kink is counted in Evals.
func dopriLevel(f func(y float64) (v float64, sw dopriSw, ok bool), flow func(y float64) float64, kink func(y float64) dopriSw,
	y0 float64, levels []float64,
	rtol, atol float64) (tStop, yStop float64, which int, st dopriStats, err error) {
	hF, haveF := math.Inf(-1), false          // the flow event, once found
	hK, haveK := math.Inf(-1), false          // a kink ahead, once found
	kIdx := 0                                 // its switching function
	first := func(y float64) (float64, int) { // highest fixed event level below y
		best, k := math.Inf(-1), -1
		for i, l := range levels {
			if l < y && l > best {
				best, k = l, i
			}
		}
		return best, k
	}
	aim := func(y float64) (float64, bool) { // the level the steps are cut for
		l, ok := math.Inf(-1), false
		if haveF && hF < y {
			l, ok = hF, true
		}
		if haveK && hK < y && hK > l {
			l, ok = hK, true
		}
		return l, ok
	}
	var sw1 dopriSw
	bad := math.Inf(-1)
	fr := func(_, yy float64) (float64, bool) {
		st.Evals++
		v, s, good := f(yy)
		sw1 = s
		if !good && yy > bad {
			bad = yy
		}
		return v, good
	}
	root := func(g func(float64) float64, hi, lo float64) float64 {
		cnt := func(x float64) float64 { st.Evals++; return g(x) }
		return brent(cnt, hi, lo, cnt(hi), cnt(lo), atol, true)
	}
	f0, ok0 := fr(0, y0)
	sw0 := sw1
	if !ok0 {
		return 0, y0, len(levels), st, nil
	}
	t, y := 0.0, y0
	dt := dopriStart(func(_, yy float64) (float64, bool) { v, _, ok := f(yy); return v, ok }, t, y, f0, rtol, atol, &st)
	rejected := false
	for st.Accepted+st.Rejected < dpMaxSteps {
		if l, ok := aim(y); ok {
			dt = min(dt, (l-y)/f0)
		}
		bad = math.Inf(-1)
		y1, f1, e, d, ok := dopriStep(fr, t, y, f0, dt, &st)
		if !ok {
			st.Rejected++
			if !haveF && flow != nil && bad < y {
				hF, haveF = root(flow, y, bad), true
			}
			if !haveF {
				return t, y, -1, st, errors.New("dopri: invalid stage with no flow event")
			}
			dt /= 2
			rejected = true
			continue
		}
		if crossed := kink != nil && !haveK && passes(sw0, sw1); crossed {
			// across a kink, whatever the error estimate says
			st.Rejected++
			for i := range sw0 {
				if sw0[i] > 0 && sw1[i] <= 0 {
					if r := root(func(x float64) float64 { return kink(x)[i] }, y, y1); !haveK || r > hK {
						hK, haveK, kIdx = r, true, i
					}
				}
			}
			if y-hK <= atol { // already at it: restart here
				haveK, sw0[kIdx] = false, 0
			}
			continue
		}
		en := math.Abs(e) / (atol + rtol*max(math.Abs(y), math.Abs(y1)))
		if en > 1 {
			st.Rejected++
			dt = dopriNewStep(dt, en, true)
			rejected = true
			continue
		}
		if haveK && y1 < hK { // past the kink: too long a step
			st.Rejected++
			dt /= 2
			continue
		}
		st.Accepted++
		if l, k := first(y); k >= 0 && y1 <= l {
			g := func(th float64) float64 { return d.at(th) - l }
			th := brent(g, 0, 1, y-l, y1-l, 1e-15, false)
			return t + th*dt, l, k, st, nil
		}
		if l, ok := aim(y1); ok && y1-l <= 0.01*(y-y1) {
			// ∫ dy/f over [y1, l] with 1/f linear in y through (y, f0), (y1, f1)
			gap := l - y1
			s := (1/f1 - 1/f0) / (y1 - y)
			tl := t + dt + gap*(1/f1+gap*s/2)
			if haveF && l == hF {
				return tl, l, len(levels), st, nil
			}
			// restart at the kink
			haveK = false
			t, y = tl, l
			f0, _ = fr(t, y)
			sw0 = sw1
			sw0[kIdx] = 0 // at the kink: it counts as passed
			dt = dopriNewStep(dt, en, rejected)
			rejected = false
			continue
		}
		t, y, f0, sw0 = t+dt, y1, f1, sw1
		dt = dopriNewStep(dt, en, rejected)
		rejected = false
	}
	return t, y, -1, st, errDopri
}

// dopriDrain is the adaptive reference for a drain without a receiver or an
// inflow: the source level obeys A(h)·dh/dt = −Q(h) (PlanDrain's doc), with
// Q from Solve in the real geometry at every stage, integrated by
// Dormand–Prince 5(4) (dopriLevel) to the first stop: the target, levels
// equal (H = EqualHead), the crest limit (lift = RunningCrestHeight −
// EqualHead) or, where Solve says the siphon no longer runs, the intake
// losing its prime or air drawn in. st.Evals counts the calls of Solve.
func dopriDrain(in DrainInput, rtol, atol float64) (tStop, hStop float64, why StopReason, st dopriStats, err error) {
	if in.Receiver != nil || in.Inflow != 0 {
		return 0, 0, "", st, errors.New("dopriDrain: no receiver or inflow")
	}
	solves := 0
	base := in.Siphon
	solve := func(h float64) (Result, error) {
		solves++
		s := base
		s.Geometry.Surface = Length(h)
		return Solve(s)
	}
	if base.MaxFlow > 0 {
		r0, err := solve(float64(base.Geometry.Surface))
		if err != nil {
			return 0, 0, "", st, err
		}
		base.Hose.OutletK += r0.MaxFlowThrottleK
		base.MaxFlow = 0
	}
	g := base.Geometry
	h0, intake := float64(g.Surface), float64(g.Intake)
	r0, err := solve(h0)
	if err != nil {
		return 0, 0, "", st, err
	}
	eps := float64(EqualHead)
	levels := []float64{float64(g.Outlet) + eps, float64(g.Crest) - float64(r0.RunningCrestHeight) + eps}
	reasons := []StopReason{StopEqual, StopCrest}
	if in.Target > 0 {
		levels, reasons = append(levels, float64(in.Target)), append(reasons, StopTarget)
	}
	var lastWhy WarnCode
	// the switching functions, where the flow's slope jumps: the level less
	// the air-starts level (gulping starts there) and the Reynolds number
	// less the ends of the transitional band (Solve's friction factor
	// changes its formula there)
	none := dopriSw{-1, -1, -1}
	f := func(h float64) (float64, dopriSw, bool) {
		if h <= intake {
			return 0, none, false
		}
		r, err := solve(h)
		if err != nil || r.Verdict == WillNotRun {
			return 0, none, false
		}
		re := float64(r.Reynolds)
		return -float64(r.Flow) / float64(in.Tank.Area(Length(h))),
			dopriSw{h - float64(r.AirStartsLevel), re - ReTurbulentMin, re - ReLaminarMax}, true
	}
	kink := func(h float64) dopriSw {
		_, s, _ := f(h)
		return s
	}
	flow := func(h float64) float64 {
		if h <= intake {
			return -1
		}
		r, err := solve(h)
		switch {
		case err != nil:
			return -1
		case r.Verdict != WillNotRun:
			return h - float64(r.PrimeLostLevel)
		case r.Why == WarnPrimeLost:
			lastWhy = r.Why
			return min(h-float64(r.PrimeLostLevel), -1e-300)
		default:
			lastWhy = r.Why
			return -1e-3
		}
	}
	t, h, k, st, err := dopriLevel(f, flow, kink, h0, levels, rtol, atol)
	st.Evals = solves
	if err != nil {
		return t, h, "", st, err
	}
	switch {
	case k < len(levels):
		why = reasons[k]
	case lastWhy == WarnAirDrawn:
		why = StopAir
	case lastWhy == WarnCannotRun:
		why = StopCrest
	default:
		why = StopIntake
	}
	return t, h, why, st, nil
}
