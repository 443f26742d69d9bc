package calc

import (
	"math"
	"strconv"
)

// Tank is the shape of a vessel, pit or pond: its liquid-surface (plan) area
// and the volume it holds, both as functions of the level h measured up from
// its floor (the lowest point inside).
//
//	Area(h)   = A(h), plan area of the liquid surface at level h, m²
//	Volume(h) = V(h) = ∫₀ʰ A(y) dy, volume held below level h, m³
//
// Both clamp h to [0, Height()]: below the floor the tank holds nothing and
// above the brim it holds no more. V is continuous and non-decreasing; A is
// finite and non-negative. Shape returns the shape name used on the command
// line (vertical-cylinder, rectangular, horizontal-cylinder, cone-bottom,
// sloped-pit, sphere, table).
//
// Build a Tank with the New… constructors; they validate the sizes.
type Tank interface {
	Area(h Length) Area
	Volume(h Length) Volume
	Height() Length
	Shape() string
}

// Shape names, as accepted by the command line's --tank flag.
const (
	ShapeVerticalCylinder   = "vertical-cylinder"
	ShapeRectangular        = "rectangular"
	ShapeHorizontalCylinder = "horizontal-cylinder"
	ShapeConeBottom         = "cone-bottom"
	ShapeSlopedPit          = "sloped-pit"
	ShapeSphere             = "sphere"
	ShapeTable              = "table"
)

// Accepted tank sizes. MaxTankSize covers a large pond; MaxSideSlope is a
// very flat bank (20 horizontal per 1 vertical); MaxTableRows bounds a
// calibration table.
const (
	MaxTankSize   = 1000.0 // m, any dimension
	MaxSideSlope  = 20.0   // horizontal per vertical
	MaxTableRows  = 10000
	MaxTankVolume = 1e9 // m³, a calibration table's largest volume
)

// clampLevel returns h clamped to [0, top]; NaN becomes 0.
func clampLevel(h, top float64) float64 {
	if !(h > 0) {
		return 0
	}
	if h > top {
		return top
	}
	return h
}

// TankWidth is the width of the tank's outline at level h as a side view
// draws it, m: the diameter of a vertical cylinder, the length of a box or of
// a pit's section (l + 2sh), the chord 2√(h(D − h)) of a sphere or of a
// horizontal cylinder seen end-on, the cone's D·h/h_c. A calibration table
// has no drawing, so it gets the diameter of the circle of the same plan
// area, √(4A/π). For drawing only.
//
// Kept although nothing on the shipped path calls it yet: the side view
// (tui) is being rewritten to draw the tank's outline from it instead of
// working out widths of its own, and its checks in tank_test.go hold it to
// the shapes' geometry meanwhile.
func TankWidth(t Tank, h Length) Length {
	if w, ok := t.(widther); ok {
		return Length(w.width(clampLevel(float64(h), float64(t.Height()))))
	}
	return Length(math.Sqrt(4 * float64(t.Area(h)) / math.Pi))
}

type widther interface{ width(h float64) float64 }

func (c verticalCylinder) width(float64) float64 { return math.Sqrt(4 * c.area / math.Pi) }
func (r rectangular) width(float64) float64      { return r.length }
func (c horizontalCylinder) width(h float64) float64 {
	return 2 * math.Sqrt(math.Max(h*(2*c.r-h), 0))
}
func (c coneBottom) width(h float64) float64 { return 2 * c.r * math.Min(h/c.cone, 1) }
func (p slopedPit) width(h float64) float64  { return p.l + 2*p.s*h }
func (s sphere) width(h float64) float64     { return 2 * math.Sqrt(math.Max(h*(2*s.r-h), 0)) }

// levelFinder is implemented by shapes with a closed-form inverse of V(h).
type levelFinder interface {
	levelFor(v float64) float64
}

// ----------------------------------------------------------------------------
// Vertical cylinder

type verticalCylinder struct{ area, height float64 }

// NewVerticalCylinder returns an upright round tank of inside diameter D and
// height H (floor to brim, or to the highest level of interest).
//
//	A(h) = π D²/4,  V(h) = A·h
//
// Special cases: D or H not in (0, MaxTankSize] gives a *RangeError.
func NewVerticalCylinder(diameter, height Length) (Tank, error) {
	if err := checkPositive(QuantityTankDiameter, "tank diameter", float64(diameter), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankHeight, "tank height", float64(height), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	d := float64(diameter)
	return verticalCylinder{area: math.Pi * d * d / 4, height: float64(height)}, nil
}

func (c verticalCylinder) Area(h Length) Area { return Area(c.area) }
func (c verticalCylinder) Volume(h Length) Volume {
	return Volume(c.area * clampLevel(float64(h), c.height))
}
func (c verticalCylinder) Height() Length             { return Length(c.height) }
func (c verticalCylinder) Shape() string              { return ShapeVerticalCylinder }
func (c verticalCylinder) levelFor(v float64) float64 { return clampLevel(v/c.area, c.height) }

// ----------------------------------------------------------------------------
// Rectangular

// NewRectangular returns a box-shaped tank, sump or vault with inside plan
// length × width and height H.
//
//	A(h) = length·width,  V(h) = A·h
//
// Special cases: any size not in (0, MaxTankSize] gives a *RangeError.
func NewRectangular(length, width, height Length) (Tank, error) {
	if err := checkPositive(QuantityTankLength, "tank length", float64(length), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankWidth, "tank width", float64(width), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankHeight, "tank height", float64(height), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	return rectangular{verticalCylinder{area: float64(length) * float64(width), height: float64(height)}, float64(length)}, nil
}

type rectangular struct {
	verticalCylinder
	length float64
}

func (rectangular) Shape() string { return ShapeRectangular }

// ----------------------------------------------------------------------------
// Horizontal cylinder

type horizontalCylinder struct{ r, length float64 }

// NewHorizontalCylinder returns a round tank lying on its side (a road or
// skid tank) of inside diameter D = 2R and length L. Its height is D.
// The liquid occupies a circular segment (CRC Standard Mathematical Tables,
// "circular segment"; any mensuration handbook):
//
//	A(h) = 2L √(h(2R − h))
//	V(h) = L [ R² arccos((R − h)/R) − (R − h) √(2Rh − h²) ]
//
// The ends are taken as flat; dished heads add a little volume that this
// shape ignores (use a calibration table for them).
//
// Special cases: D or L not in (0, MaxTankSize] gives a *RangeError.
// A(0) = A(D) = 0: the surface is a line at the bottom and at the top.
func NewHorizontalCylinder(diameter, length Length) (Tank, error) {
	if err := checkPositive(QuantityTankDiameter, "tank diameter", float64(diameter), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankLength, "tank length", float64(length), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	return horizontalCylinder{r: float64(diameter) / 2, length: float64(length)}, nil
}

func (c horizontalCylinder) Area(h Length) Area {
	y := clampLevel(float64(h), 2*c.r)
	return Area(2 * c.length * math.Sqrt(math.Max(y*(2*c.r-y), 0)))
}

func (c horizontalCylinder) Volume(h Length) Volume {
	y := clampLevel(float64(h), 2*c.r)
	r := c.r
	cos := math.Max(-1, math.Min(1, (r-y)/r))
	return Volume(c.length * (r*r*math.Acos(cos) - (r-y)*math.Sqrt(math.Max(y*(2*r-y), 0))))
}

func (c horizontalCylinder) Height() Length { return Length(2 * c.r) }
func (c horizontalCylinder) Shape() string  { return ShapeHorizontalCylinder }

// ----------------------------------------------------------------------------
// Cone bottom

type coneBottom struct{ r, cone, height float64 }

// NewConeBottom returns an upright round tank of diameter D whose bottom is a
// cone (hopper sump) with its point at the floor, rising to full diameter at
// coneHeight, then a cylinder up to totalHeight. With R = D/2, h_c the cone
// height:
//
//	h ≤ h_c:  A(h) = π R² (h/h_c)²,  V(h) = π R² h³ / (3 h_c²)
//	h > h_c:  A(h) = π R²,           V(h) = π R² (h_c/3 + h − h_c)
//
// (volume of a cone, π R² h_c / 3, any mensuration handbook).
//
// Special cases: D, coneHeight, totalHeight not in (0, MaxTankSize], or
// coneHeight > totalHeight, give a *RangeError. A(0) = 0.
func NewConeBottom(diameter, coneHeight, totalHeight Length) (Tank, error) {
	if err := checkPositive(QuantityTankDiameter, "tank diameter", float64(diameter), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankHeight, "tank height", float64(totalHeight), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityConeHeight, "cone height", float64(coneHeight), float64(totalHeight), "m"); err != nil {
		if re, ok := err.(*RangeError); ok && re.Err == ErrOutOfRange && coneHeight > totalHeight {
			re.Err = ErrGeometry
			re.Note = "the cone is part of the tank height"
		}
		return nil, err
	}
	return coneBottom{r: float64(diameter) / 2, cone: float64(coneHeight), height: float64(totalHeight)}, nil
}

func (c coneBottom) Area(h Length) Area {
	y := clampLevel(float64(h), c.height)
	a := math.Pi * c.r * c.r
	if y < c.cone {
		s := y / c.cone
		return Area(a * s * s)
	}
	return Area(a)
}

func (c coneBottom) Volume(h Length) Volume {
	y := clampLevel(float64(h), c.height)
	a := math.Pi * c.r * c.r
	if y < c.cone {
		return Volume(a * y * y * y / (3 * c.cone * c.cone))
	}
	return Volume(a * (c.cone/3 + y - c.cone))
}

func (c coneBottom) levelFor(v float64) float64 {
	a := math.Pi * c.r * c.r
	vc := a * c.cone / 3
	if v <= 0 {
		return 0
	}
	if v < vc {
		return math.Cbrt(3 * c.cone * c.cone * v / a)
	}
	return clampLevel(c.cone+(v-vc)/a, c.height)
}

func (c coneBottom) Height() Length { return Length(c.height) }
func (c coneBottom) Shape() string  { return ShapeConeBottom }

// ----------------------------------------------------------------------------
// Sloped pit

type slopedPit struct{ l, w, s, depth float64 }

// NewSlopedPit returns a pit, pond or bund with a flat rectangular bottom
// bottomLength × bottomWidth and all four sides sloping out at sideSlope
// horizontal per vertical (e.g. 2 for a 2H:1V bank), depth deep.
//
//	A(h) = (l + 2sh)(w + 2sh)
//	V(h) = l·w·h + s(l + w)h² + (4/3)s²h³
//
// V is the prismoidal formula V = (h/6)(A₀ + 4A_mid + A_h), exact for a
// solid whose section area is a polynomial of degree ≤ 3 in h (e.g. Urquhart,
// Civil Engineering Handbook, earthwork volumes; any surveying text).
//
// Special cases: bottom sizes or depth not in (0, MaxTankSize], or sideSlope
// not in [0, MaxSideSlope], give a *RangeError. sideSlope 0 is a box.
func NewSlopedPit(bottomLength, bottomWidth Length, sideSlope float64, depth Length) (Tank, error) {
	if err := checkPositive(QuantityTankLength, "pit bottom length", float64(bottomLength), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankWidth, "pit bottom width", float64(bottomWidth), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	if err := checkRange(QuantitySideSlope, "side slope", sideSlope, 0, MaxSideSlope, "horizontal per vertical"); err != nil {
		return nil, err
	}
	if err := checkPositive(QuantityTankHeight, "pit depth", float64(depth), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	return slopedPit{l: float64(bottomLength), w: float64(bottomWidth), s: sideSlope, depth: float64(depth)}, nil
}

func (p slopedPit) Area(h Length) Area {
	y := clampLevel(float64(h), p.depth)
	return Area((p.l + 2*p.s*y) * (p.w + 2*p.s*y))
}

func (p slopedPit) Volume(h Length) Volume {
	y := clampLevel(float64(h), p.depth)
	return Volume(y * (p.l*p.w + y*(p.s*(p.l+p.w)+y*4*p.s*p.s/3)))
}

func (p slopedPit) Height() Length { return Length(p.depth) }
func (p slopedPit) Shape() string  { return ShapeSlopedPit }

// ----------------------------------------------------------------------------
// Sphere

type sphere struct{ r float64 }

// NewSphere returns a spherical tank of inside diameter D = 2R. Spherical cap
// (any mensuration handbook):
//
//	A(h) = π h (2R − h)
//	V(h) = π h² (3R − h) / 3
//
// Special cases: D not in (0, MaxTankSize] gives a *RangeError.
// A(0) = A(D) = 0.
func NewSphere(diameter Length) (Tank, error) {
	if err := checkPositive(QuantityTankDiameter, "tank diameter", float64(diameter), MaxTankSize, "m"); err != nil {
		return nil, err
	}
	return sphere{r: float64(diameter) / 2}, nil
}

func (s sphere) Area(h Length) Area {
	y := clampLevel(float64(h), 2*s.r)
	return Area(math.Pi * y * (2*s.r - y))
}

func (s sphere) Volume(h Length) Volume {
	y := clampLevel(float64(h), 2*s.r)
	return Volume(math.Pi * y * y * (3*s.r - y) / 3)
}

func (s sphere) Height() Length { return Length(2 * s.r) }
func (s sphere) Shape() string  { return ShapeSphere }

// ----------------------------------------------------------------------------
// Calibration table

type tableTank struct {
	h, v, m []float64 // levels, volumes, slopes dV/dh at the levels
}

// NewTable returns a tank described by a calibration (strapping) table: pairs
// of level above the floor (m) and volume held at that level (m³), as read
// from a tank chart or measured by filling.
//
// Levels must be finite, at least 0, at most MaxTankSize, and strictly
// increasing; volumes finite, at least 0, at most MaxTankVolume, and
// non-decreasing, with the last volume above the first. If the first level is
// above 0 a row (0 m, 0 m³) is assumed below it. The tank's height is the last
// level. At least 2 and at most MaxTableRows rows.
//
// Between rows V(h) is the monotone piecewise-cubic Hermite interpolant of
// Fritsch & Carlson (1980), "Monotone piecewise cubic interpolation", SIAM J.
// Numer. Anal. 17(2):238–246, doi:10.1137/0717021: slopes start as the mean of
// the neighbouring secants, are set to zero where a secant is zero, and are
// scaled back into the region α² + β² ≤ 9 (α, β the end slopes over the
// secant), which keeps V non-decreasing between rows. A(h) = dV/dh, the
// derivative of the same cubic, is continuous and non-negative. With two rows
// the table is linear.
//
// Errors: a *RangeError whose Quantity names the 1-based row as given
// ("tank table level, row 4"), e.g. for a level not above the row before or
// a volume below it; ErrGeometry for a table with fewer than 2 rows or with
// different numbers of levels and volumes.
func NewTable(levels, volumes []float64) (Tank, error) {
	if len(levels) != len(volumes) {
		return nil, &RangeError{What: QuantityTankTable, Quantity: "tank table volumes", Value: float64(len(volumes)),
			Min: float64(len(levels)), Max: float64(len(levels)), Unit: "rows", Err: ErrGeometry,
			Note: "each level needs one volume"}
	}
	if len(levels) < 2 || len(levels) > MaxTableRows {
		return nil, &RangeError{What: QuantityTankTable, Quantity: "tank table", Value: float64(len(levels)), Min: 2, Max: MaxTableRows,
			Unit: "rows", Err: ErrGeometry, Note: "a table needs at least two level–volume rows"}
	}
	n := len(levels)
	off := 0
	if levels[0] > 0 {
		off = 1
	}
	t := tableTank{h: make([]float64, n+off), v: make([]float64, n+off), m: make([]float64, n+off)}
	for i := 0; i < n; i++ {
		row := "row " + strconv.Itoa(i+1)
		lo := 0.0
		if i > 0 {
			lo = levels[i-1]
		}
		if err := checkRange(QuantityTankTable, "tank table level, "+row, levels[i], lo, MaxTankSize, "m"); err != nil {
			if i > 0 {
				if re := err.(*RangeError); re.Err == ErrOutOfRange && levels[i] < lo {
					re.Note = "levels must increase from row to row"
				}
			}
			return nil, err
		}
		if i > 0 && levels[i] <= levels[i-1] {
			return nil, &RangeError{What: QuantityTankTable, Quantity: "tank table level, " + row, Value: levels[i], Min: levels[i-1],
				Max: MaxTankSize, Unit: "m", Err: ErrOutOfRange,
				Note: "levels must increase from row to row; row " + strconv.Itoa(i) + " has the same level"}
		}
		vlo := 0.0
		if i > 0 {
			vlo = volumes[i-1]
		}
		if err := checkRange(QuantityTankTable, "tank table volume, "+row, volumes[i], vlo, MaxTankVolume, "m³"); err != nil {
			if re := err.(*RangeError); re.Err == ErrOutOfRange && volumes[i] < vlo {
				re.Note = "volumes must not fall as the level rises"
			}
			return nil, err
		}
		t.h[i+off] = levels[i]
		t.v[i+off] = volumes[i]
	}
	if !(t.v[n+off-1] > t.v[0]) {
		return nil, &RangeError{What: QuantityTankTable, Quantity: "tank table volume, row " + strconv.Itoa(n), Value: volumes[n-1],
			Min: t.v[0], Max: MaxTankVolume, Unit: "m³", Err: ErrOutOfRange,
			Note: "the table holds no volume: the last volume must be above the first"}
	}
	t.slopes()
	return t, nil
}

// slopes sets the Fritsch–Carlson tangents m_k.
func (t tableTank) slopes() {
	n := len(t.h)
	d := func(k int) float64 { return (t.v[k+1] - t.v[k]) / (t.h[k+1] - t.h[k]) }
	t.m[0] = d(0)
	t.m[n-1] = d(n - 2)
	for k := 1; k < n-1; k++ {
		a, b := d(k-1), d(k)
		if a == 0 || b == 0 {
			t.m[k] = 0
		} else {
			t.m[k] = (a + b) / 2
		}
	}
	for k := 0; k < n-1; k++ {
		dk := d(k)
		if dk == 0 {
			t.m[k], t.m[k+1] = 0, 0
			continue
		}
		al, be := t.m[k]/dk, t.m[k+1]/dk
		if s := al*al + be*be; s > 9 {
			tau := 3 / math.Sqrt(s)
			t.m[k] = tau * al * dk
			t.m[k+1] = tau * be * dk
		}
	}
}

// seg returns the row index k with h[k] ≤ y ≤ h[k+1] and the local
// coordinate s ∈ [0, 1].
func (t tableTank) seg(y float64) (k int, s, dh float64) {
	lo, hi := 0, len(t.h)-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if t.h[mid] <= y {
			lo = mid
		} else {
			hi = mid
		}
	}
	dh = t.h[lo+1] - t.h[lo]
	return lo, (y - t.h[lo]) / dh, dh
}

func (t tableTank) Area(h Length) Area {
	k, s, dh := t.seg(clampLevel(float64(h), t.h[len(t.h)-1]))
	// derivatives of the cubic Hermite basis
	d00 := 6*s*s - 6*s
	d10 := 3*s*s - 4*s + 1
	d01 := -d00
	d11 := 3*s*s - 2*s
	a := (d00*t.v[k]+d01*t.v[k+1])/dh + d10*t.m[k] + d11*t.m[k+1]
	return Area(math.Max(a, 0))
}

func (t tableTank) Volume(h Length) Volume {
	k, s, dh := t.seg(clampLevel(float64(h), t.h[len(t.h)-1]))
	s2, s3 := s*s, s*s*s
	h00 := 2*s3 - 3*s2 + 1
	h10 := s3 - 2*s2 + s
	h01 := -2*s3 + 3*s2
	h11 := s3 - s2
	v := h00*t.v[k] + h10*dh*t.m[k] + h01*t.v[k+1] + h11*dh*t.m[k+1]
	// rounding can push a monotone cubic a hair outside its end values
	return Volume(math.Max(t.v[k], math.Min(t.v[k+1], v)))
}

func (t tableTank) Height() Length { return Length(t.h[len(t.h)-1]) }
func (t tableTank) Shape() string  { return ShapeTable }

// ----------------------------------------------------------------------------
// Inverse

// LevelForVolume returns the level h at which tank t holds volume v: the
// inverse of t.Volume.
//
// Closed forms where they exist (vertical cylinder, rectangular, cone
// bottom); otherwise Newton's method h ← h − (V(h) − v)/A(h) safeguarded by
// bisection on the bracket [0, Height], to |V(h) − v| ≤ 1e-13·V(Height) or a
// bracket narrower than 1e-14·Height.
//
// Special cases: v ≤ 0 (or NaN) gives 0; v ≥ V(Height) gives Height. Where
// A = 0 over a range of levels (a flat step in a table) V does not identify
// one level and a level inside that range is returned.
func LevelForVolume(t Tank, v Volume) Length {
	top := float64(t.Height())
	return Length(levelFrom(t, float64(v), top, float64(t.Volume(Length(top))), -1))
}

// levelFrom is LevelForVolume for a tank of height top holding full when
// brim-full, starting Newton's method from guess (a negative guess means
// none).
func levelFrom(t Tank, vv, top, full, guess float64) float64 {
	if !(vv > 0) {
		return 0
	}
	if vv >= full {
		return top
	}
	if lf, ok := t.(levelFinder); ok {
		return lf.levelFor(vv)
	}
	lo, hi := 0.0, top
	h := guess
	if !(h > 0 && h < top) {
		// the level a prism of the same mean area would have
		h = top * vv / full
	}
	tol := 1e-13 * full
	for i := 0; i < 200; i++ {
		r := float64(t.Volume(Length(h))) - vv
		if math.Abs(r) <= tol {
			break
		}
		if r > 0 {
			hi = h
		} else {
			lo = h
		}
		if hi-lo <= 1e-14*top {
			break
		}
		a := float64(t.Area(Length(h)))
		next := h - r/a
		if !(a > 0) || !(next > lo && next < hi) {
			next = (lo + hi) / 2
		}
		h = next
	}
	return h
}
