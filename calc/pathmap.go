package calc

import "math"

// xmap maps s ∈ [0, 1] to the path variable x (source level fallen, or volume
// moved) either linearly or through w with x = x0 − w².
type xmap struct {
	sq         bool
	x0, wa, wb float64
	xe         float64
}

func newXmap(x0 float64, haveX0 bool, xe float64) xmap {
	if haveX0 && x0 >= xe && x0 > 0 {
		return xmap{sq: true, x0: x0, wa: math.Sqrt(x0), wb: math.Sqrt(math.Max(x0-xe, 0)), xe: xe}
	}
	return xmap{xe: xe}
}

// at returns x(s) and dx/ds.
func (m xmap) at(s float64) (x, dxds float64) {
	if !m.sq {
		return s * m.xe, m.xe
	}
	w := m.wa + s*(m.wb-m.wa)
	x = m.x0 - w*w
	if s >= 1 {
		x = m.xe
	}
	return x, 2 * w * (m.wa - m.wb)
}
