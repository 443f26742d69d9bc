package calc

import "math"

// brent finds a root of f in [a, b] with f(a) > 0 ≥ f(b) (Brent 1973, ch. 4,
// "zero"), to |b − a| ≤ tol. It returns the end that is still positive when
// keepPos is set, else the best estimate.
func brent(f func(float64) float64, a, b, fa, fb, tol float64, keepPos bool) float64 {
	c, fc := a, fa
	d := b - a
	e := d
	pos := a
	for i := 0; i < 200; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		if fb >= 0 {
			pos = b
		} else if fc >= 0 {
			pos = c
		}
		tol1 := 2*1e-16*math.Abs(b) + tol/2
		m := (c - b) / 2
		if math.Abs(m) <= tol1 || fb == 0 {
			break
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var pp, q float64
			if a == c {
				pp = 2 * m * s
				q = 1 - s
			} else {
				qq := fa / fc
				r := fb / fc
				pp = s * (2*m*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if pp > 0 {
				q = -q
			} else {
				pp = -pp
			}
			if 2*pp < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = pp / q
			} else {
				d = m
				e = d
			}
		} else {
			d = m
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = f(b)
	}
	if keepPos {
		if fb >= 0 {
			return b
		}
		return pos
	}
	return b
}
