package calc

import "math"

// xmap maps s ∈ [0, 1] to the path position x ∈ [xa, xe] (source level
// fallen, or volume moved), either linearly or, when the flow vanishes at a
// point x0 at or beyond xe, through w with x = x0 − w², in which the
// integrand A/Q of a flow Q ∝ √(x0 − x) is smooth.
//
// With a settle point xs beyond xe (inflow: the flow falls to the inflow
// there and the integrand A/(Q − Q_in) grows as 1/(xs − x)) the map is
// geometric instead, x = xs − (xs − xa)·rˢ with r = (xs − xe)/(xs − xa), in
// which that integrand is smooth (it is u = −ln(xs − x), scaled).
type xmap struct {
	sq         bool
	x0, wa, wb float64
	xa, xe     float64
	lg         bool
	xs, lnr    float64
}

// newSettleXmap is the geometric map from xa to xe < xs, xs the settle point.
func newSettleXmap(xs, xa, xe float64) xmap {
	return xmap{lg: true, xs: xs, lnr: math.Log((xs - xe) / (xs - xa)), xa: xa, xe: xe}
}

func newXmap(x0 float64, haveX0 bool, xa, xe float64) xmap {
	if haveX0 && x0 >= xe && x0 > xa {
		return xmap{sq: true, x0: x0, wa: math.Sqrt(x0 - xa), wb: math.Sqrt(max(x0-xe, 0)), xa: xa, xe: xe}
	}
	return xmap{xa: xa, xe: xe}
}

// sOf inverts at: the s at which x(s) = x.
func (m xmap) sOf(x float64) float64 {
	if m.lg {
		if m.lnr == 0 {
			return 0
		}
		return min(max(math.Log((m.xs-x)/(m.xs-m.xa))/m.lnr, 0), 1)
	}
	if !m.sq {
		if m.xe == m.xa {
			return 0
		}
		return (x - m.xa) / (m.xe - m.xa)
	}
	if m.wb == m.wa {
		return 0
	}
	return (m.wa - math.Sqrt(max(m.x0-x, 0))) / (m.wa - m.wb)
}

// at returns x(s) and dx/ds.
func (m xmap) at(s float64) (x, dxds float64) {
	if m.lg {
		d := (m.xs - m.xa) * math.Exp(s*m.lnr)
		x = m.xs - d
		if s >= 1 {
			x = m.xe
		}
		return x, -d * m.lnr
	}
	if !m.sq {
		return m.xa + s*(m.xe-m.xa), m.xe - m.xa
	}
	w := m.wa + s*(m.wb-m.wa)
	x = m.x0 - w*w
	if s >= 1 {
		x = m.xe
	}
	return x, 2 * w * (m.wa - m.wb)
}
