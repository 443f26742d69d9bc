package model

import "math"

// goldenMin finds a minimum of f on [a, b] by golden-section search to an
// interval of width tol (Kiefer 1953; Press et al., Numerical Recipes, 3rd
// ed., §10.2). Returns the abscissa and value.
func goldenMin(f func(float64) float64, a, b, tol float64) (float64, float64) {
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	c := b - invPhi*(b-a)
	d := a + invPhi*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 200 && b-a > tol; i++ {
		if fc <= fd {
			b, d, fd = d, c, fc
			c = b - invPhi*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + invPhi*(b-a)
			fd = f(d)
		}
	}
	if fc <= fd {
		return c, fc
	}
	return d, fd
}

// stoppedFall: a last reading within this of the predicted stop level (m) is
// taken as "stopped" (below what a tape or rod resolves; our choice).
const stoppedFall = 0.002

// nelderMead minimises f over two parameters by the downhill simplex method
// (Nelder and Mead 1965; Press et al., Numerical Recipes, 3rd ed., §10.5),
// from x0 with initial steps step, until the simplex spans less than tol in
// each parameter (or 400 evaluations). f returns +Inf outside the box.
func nelderMead(f func([2]float64) float64, x0, step, tol [2]float64) ([2]float64, float64) {
	pts := [3][2]float64{x0, {x0[0] + step[0], x0[1]}, {x0[0], x0[1] + step[1]}}
	// Keep the first simplex inside the box: step inwards where outward is out.
	for i := 1; i < 3; i++ {
		if math.IsInf(f(pts[i]), 1) {
			pts[i][i-1] = x0[i-1] - step[i-1]
		}
	}
	var vals [3]float64
	for i := range pts {
		vals[i] = f(pts[i])
	}
	for evals := 3; evals < 400; {
		// order: best 0, worst 2
		for i := 0; i < 2; i++ {
			for k := i + 1; k < 3; k++ {
				if vals[k] < vals[i] {
					vals[i], vals[k] = vals[k], vals[i]
					pts[i], pts[k] = pts[k], pts[i]
				}
			}
		}
		done := true
		for c := range 2 {
			lo, hi := math.Min(pts[0][c], math.Min(pts[1][c], pts[2][c])), math.Max(pts[0][c], math.Max(pts[1][c], pts[2][c]))
			done = done && hi-lo < tol[c]
		}
		if done {
			break
		}
		cen := [2]float64{(pts[0][0] + pts[1][0]) / 2, (pts[0][1] + pts[1][1]) / 2}
		along := func(t float64) [2]float64 {
			return [2]float64{cen[0] + t*(pts[2][0]-cen[0]), cen[1] + t*(pts[2][1]-cen[1])}
		}
		xr := along(-1)
		fr := f(xr)
		evals++
		switch {
		case fr < vals[0]:
			xe := along(-2)
			fe := f(xe)
			evals++
			if fe < fr {
				pts[2], vals[2] = xe, fe
			} else {
				pts[2], vals[2] = xr, fr
			}
		case fr < vals[1]:
			pts[2], vals[2] = xr, fr
		default:
			xc := along(0.5)
			if fr < vals[2] {
				xc = along(-0.5)
			}
			fc := f(xc)
			evals++
			if fc < math.Min(fr, vals[2]) {
				pts[2], vals[2] = xc, fc
				continue
			}
			for i := 1; i < 3; i++ { // shrink towards the best
				pts[i] = [2]float64{(pts[0][0] + pts[i][0]) / 2, (pts[0][1] + pts[i][1]) / 2}
				vals[i] = f(pts[i])
				evals++
			}
		}
	}
	best := 0
	for i := 1; i < 3; i++ {
		if vals[i] < vals[best] {
			best = i
		}
	}
	return pts[best], vals[best]
}
