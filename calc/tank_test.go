package calc

import (
	"errors"
	"math"
	"strings"
	"testing"

	"drawdown/calc/testkit"
)

// mustTank unwraps a constructor known to be valid.
func mustTank(tk Tank, err error) Tank {
	if err != nil {
		panic("test tank: " + err.Error())
	}
	return tk
}

// TestTankVolumesClosedForm checks each shape's V(h) against the closed-form
// volumes of elementary solids.
func TestTankVolumesClosedForm(t *testing.T) {
	R := 0.6
	cases := []struct {
		name   string
		tank   func() (Tank, error)
		h      float64
		want   float64
		tol    float64
		source string
	}{
		{"vertical cylinder full", func() (Tank, error) { return NewVerticalCylinder(1, 2) }, 2, math.Pi / 4 * 2, 1e-14,
			"analytic: V = πD²h/4"},
		{"vertical cylinder clamps above brim", func() (Tank, error) { return NewVerticalCylinder(1, 2) }, 5, math.Pi / 4 * 2, 1e-14,
			"analytic: tank holds no more than full"},
		{"rectangular part full", func() (Tank, error) { return NewRectangular(3, 2, 1.5) }, 0.7, 3 * 2 * 0.7, 1e-14,
			"analytic: V = l·w·h"},
		{"horizontal cylinder half full", func() (Tank, error) { return NewHorizontalCylinder(Length(2*R), 2) }, R, math.Pi * R * R * 2 / 2, 1e-13,
			"analytic: half of πR²L"},
		{"horizontal cylinder full", func() (Tank, error) { return NewHorizontalCylinder(Length(2*R), 2) }, 2 * R, math.Pi * R * R * 2, 1e-13,
			"analytic: πR²L"},
		{"horizontal cylinder quarter depth", func() (Tank, error) { return NewHorizontalCylinder(Length(2*R), 2) }, R / 2,
			(2*math.Pi/3 - math.Sin(2*math.Pi/3)) / 2 * R * R * 2, 1e-13,
			"analytic: segment area R²(θ − sin θ)/2 with central angle θ = 2 arccos(1/2) = 120° (fill fraction 0.19550, as in tank charts)"},
		{"horizontal cylinder three-quarter depth", func() (Tank, error) { return NewHorizontalCylinder(Length(2*R), 2) }, 1.5 * R,
			math.Pi*R*R*2 - (2*math.Pi/3-math.Sin(2*math.Pi/3))/2*R*R*2, 1e-13,
			"analytic: full minus the 120° segment (symmetry)"},
		{"sphere full", func() (Tank, error) { return NewSphere(Length(2 * R)) }, 2 * R, 4.0 / 3 * math.Pi * R * R * R, 1e-13,
			"analytic: 4πR³/3"},
		{"sphere half", func() (Tank, error) { return NewSphere(Length(2 * R)) }, R, 2.0 / 3 * math.Pi * R * R * R, 1e-13,
			"analytic: hemisphere 2πR³/3"},
		{"sphere cap 0.3 m", func() (Tank, error) { return NewSphere(Length(2 * R)) }, 0.3, math.Pi * 0.09 * (3*R - 0.3) / 3, 1e-13,
			"analytic: spherical cap πh²(3R − h)/3"},
		{"cone bottom at cone top", func() (Tank, error) { return NewConeBottom(2, 0.9, 3) }, 0.9, math.Pi * 0.9 / 3, 1e-13,
			"analytic: cone πR²h_c/3"},
		{"cone bottom full", func() (Tank, error) { return NewConeBottom(2, 0.9, 3) }, 3, math.Pi * (0.9/3 + 2.1), 1e-13,
			"analytic: cone + cylinder"},
		{"cone bottom inside cone", func() (Tank, error) { return NewConeBottom(2, 0.9, 3) }, 0.45, math.Pi * 0.9 / 3 / 8, 1e-13,
			"analytic: similar cone at half height holds 1/8"},
		{"sloped pit 2:1 banks", func() (Tank, error) { return NewSlopedPit(10, 4, 2, 1.5) }, 1.5,
			1.5 / 6 * (10*4 + 4*(10+2*2*0.75)*(4+2*2*0.75) + (10+2*2*1.5)*(4+2*2*1.5)), 1e-13,
			"prismoidal formula V = h/6 (A₀ + 4A_m + A₁) (any surveying text; exact for this solid)"},
		{"sloped pit as a box", func() (Tank, error) { return NewSlopedPit(10, 4, 0, 1.5) }, 1.2, 10 * 4 * 1.2, 1e-14,
			"analytic: slope 0 is a box"},
	}
	for _, c := range cases {
		tk := mustTank(c.tank())
		got := float64(tk.Volume(Length(c.h)))
		if !testkit.Within(got, c.want, c.tol) {
			t.Errorf("%s: V(%g) = %.12g, want %.12g (%s)", c.name, c.h, got, c.want, c.source)
		}
	}
}

// TestTankAreaIsVolumeDerivative checks A = dV/dh for every shape by a
// central difference, and V = ∫A dh by Simpson's rule (analytic identity).
func TestTankAreaIsVolumeDerivative(t *testing.T) {
	tab := mustTank(NewTable([]float64{0, 0.2, 0.5, 1.0, 1.4, 2}, []float64{0, 0.05, 0.4, 1.6, 2.0, 2.9}))
	tanks := []Tank{
		mustTank(NewVerticalCylinder(1.2, 2)),
		mustTank(NewRectangular(3, 2, 1.5)),
		mustTank(NewHorizontalCylinder(1.2, 2)),
		mustTank(NewConeBottom(2, 0.9, 3)),
		mustTank(NewSlopedPit(10, 4, 2, 1.5)),
		mustTank(NewSphere(1.2)),
		tab,
	}
	for _, tk := range tanks {
		H := float64(tk.Height())
		for i := 1; i < 40; i++ {
			h := H * float64(i) / 40
			d := 1e-6 * H
			num := (float64(tk.Volume(Length(h+d))) - float64(tk.Volume(Length(h-d)))) / (2 * d)
			a := float64(tk.Area(Length(h)))
			if math.Abs(num-a) > 1e-5*math.Max(a, 1) {
				t.Errorf("%s: A(%g) = %g, dV/dh = %g", tk.Shape(), h, a, num)
			}
		}
		// Simpson over [0, H] with 2000 panels
		n := 2000
		s := float64(tk.Area(0)) + float64(tk.Area(Length(H)))
		for i := 1; i < n; i++ {
			w := 2.0
			if i%2 == 1 {
				w = 4
			}
			s += w * float64(tk.Area(Length(H*float64(i)/float64(n))))
		}
		s *= H / float64(n) / 3
		full := float64(tk.Volume(Length(H)))
		if !testkit.Within(s, full, 2e-5) {
			t.Errorf("%s: ∫A dh = %g, V(H) = %g", tk.Shape(), s, full)
		}
		if tk.Volume(0) != 0 || tk.Volume(-1) != 0 {
			t.Errorf("%s: V(0) = %g", tk.Shape(), tk.Volume(0))
		}
	}
}

// TestLevelForVolumeRoundTrip: LevelForVolume inverts Volume (analytic identity).
func TestLevelForVolumeRoundTrip(t *testing.T) {
	tanks := []Tank{
		mustTank(NewVerticalCylinder(1.2, 2)),
		mustTank(NewRectangular(3, 2, 1.5)),
		mustTank(NewHorizontalCylinder(1.2, 2)),
		mustTank(NewConeBottom(2, 0.9, 3)),
		mustTank(NewSlopedPit(10, 4, 2, 1.5)),
		mustTank(NewSphere(1.2)),
		mustTank(NewTable([]float64{0.1, 0.2, 0.5, 1.0}, []float64{0.01, 0.05, 0.4, 1.6})),
	}
	for _, tk := range tanks {
		H := float64(tk.Height())
		for i := 0; i <= 100; i++ {
			h := H * float64(i) / 100
			v := tk.Volume(Length(h))
			got := float64(LevelForVolume(tk, v))
			if math.Abs(got-h) > 1e-9*H {
				t.Errorf("%s: level for V(%g) = %g", tk.Shape(), h, got)
			}
		}
		if LevelForVolume(tk, -1) != 0 || LevelForVolume(tk, Volume(math.NaN())) != 0 {
			t.Errorf("%s: negative or NaN volume should give level 0", tk.Shape())
		}
		if LevelForVolume(tk, tk.Volume(Length(H))*2) != Length(H) {
			t.Errorf("%s: overfull should give the height", tk.Shape())
		}
	}
}

// TestTableReproducesLinearAndSmooth: a table of a vertical cylinder is exact
// (linear data stay linear under Fritsch–Carlson), and a 21-row table of a
// sphere follows the sphere within 0.5 % of its volume (analytic sphere).
func TestTableReproducesLinearAndSmooth(t *testing.T) {
	cyl := mustTank(NewVerticalCylinder(1.5, 2))
	sph := mustTank(NewSphere(1.2))
	var lc, vc, ls, vs []float64
	for i := 0; i <= 20; i++ {
		h := 2 * float64(i) / 20
		lc = append(lc, h)
		vc = append(vc, float64(cyl.Volume(Length(h))))
		hs := 1.2 * float64(i) / 20
		ls = append(ls, hs)
		vs = append(vs, float64(sph.Volume(Length(hs))))
	}
	tc := mustTank(NewTable(lc, vc))
	ts := mustTank(NewTable(ls, vs))
	full := float64(sph.Volume(1.2))
	for i := 0; i <= 97; i++ {
		h := 2 * float64(i) / 97
		if !testkit.Within(float64(tc.Volume(Length(h))), float64(cyl.Volume(Length(h))), 1e-12) {
			t.Errorf("cylinder table at %g: %g vs %g", h, tc.Volume(Length(h)), cyl.Volume(Length(h)))
		}
		if !testkit.Within(float64(tc.Area(Length(h))), float64(cyl.Area(Length(h))), 1e-12) {
			t.Errorf("cylinder table area at %g: %g", h, tc.Area(Length(h)))
		}
		hs := 1.2 * float64(i) / 97
		if d := math.Abs(float64(ts.Volume(Length(hs)) - sph.Volume(Length(hs)))); d > 0.005*full {
			t.Errorf("sphere table at %g off by %g m³", hs, d)
		}
	}
}

// TestTableMonotone: volumes never fall and areas are never negative, even for
// data with flat steps and sharp changes (Fritsch & Carlson 1980, Theorem 2).
func TestTableMonotone(t *testing.T) {
	lv := []float64{0, 0.1, 0.2, 0.3, 0.6, 0.61, 1, 2}
	vv := []float64{0, 0, 1, 1, 1.01, 5, 5, 9}
	tk := mustTank(NewTable(lv, vv))
	prev := -1.0
	for i := 0; i <= 4000; i++ {
		h := 2 * float64(i) / 4000
		v := float64(tk.Volume(Length(h)))
		if v < prev-1e-15 {
			t.Fatalf("volume falls at %g: %g < %g", h, v, prev)
		}
		if a := tk.Area(Length(h)); a < 0 || math.IsNaN(float64(a)) {
			t.Fatalf("area %g at %g", a, h)
		}
		prev = v
	}
	for i, l := range lv {
		if !testkit.Within(float64(tk.Volume(Length(l))), vv[i], 1e-12) {
			t.Errorf("row %d not reproduced: %g", i+1, tk.Volume(Length(l)))
		}
	}
}

// TestTableMonotoneRPN14: the "RPN 14" data set Fritsch & Carlson (1980) use
// to show that ordinary cubic splines overshoot where monotone data turn
// sharply (x from 7.99 to 20, y from 0 to 0.999994; values from memory of the
// paper's table, used only as hard monotone data, not as expected results).
// The interpolant must stay monotone and within the data's range.
func TestTableMonotoneRPN14(t *testing.T) {
	x := []float64{7.99, 8.09, 8.19, 8.7, 9.2, 10, 12, 15, 20}
	y := []float64{0, 2.76429e-5, 4.37498e-2, 0.169183, 0.469428, 0.943740, 0.998636, 0.999919, 0.999994}
	tk := mustTank(NewTable(x, y))
	prev := 0.0
	for i := 0; i <= 20000; i++ {
		h := 20 * float64(i) / 20000
		v := float64(tk.Volume(Length(h)))
		if v < prev || v > 0.999994 {
			t.Fatalf("V(%g) = %.9g after %.9g", h, v, prev)
		}
		prev = v
	}
}

// TestTankWidth: outline widths for the side view (analytic chord and
// section widths).
func TestTankWidth(t *testing.T) {
	cases := []struct {
		tank Tank
		h    Length
		want float64
	}{
		{mustTank(NewVerticalCylinder(1.2, 2)), 0.7, 1.2},
		{mustTank(NewRectangular(3, 2, 1.5)), 0.7, 3},
		{mustTank(NewHorizontalCylinder(1.2, 2)), 0.6, 1.2},
		{mustTank(NewHorizontalCylinder(1.2, 2)), 0.3, 2 * math.Sqrt(0.3*0.9)},
		{mustTank(NewSphere(1.2)), 1.2, 0},
		{mustTank(NewConeBottom(2, 0.8, 3)), 0.4, 1},
		{mustTank(NewConeBottom(2, 0.8, 3)), 2, 2},
		{mustTank(NewSlopedPit(10, 4, 2, 1.5)), 1, 14},
		{mustTank(NewTable([]float64{0, 1}, []float64{0, math.Pi})), 0.5, 2},
	}
	for _, c := range cases {
		if got := float64(TankWidth(c.tank, c.h)); !testkit.Within(got, c.want, 1e-12) {
			t.Errorf("%s at %g: width %g, want %g", c.tank.Shape(), c.h, got, c.want)
		}
	}
}

func TestTankBadInput(t *testing.T) {
	cases := []struct {
		name  string
		make  func() (Tank, error)
		names string // quantity named in the message
	}{
		{"zero diameter", func() (Tank, error) { return NewVerticalCylinder(0, 1) }, "tank diameter"},
		{"NaN height", func() (Tank, error) { return NewVerticalCylinder(1, Length(math.NaN())) }, "tank height"},
		{"negative width", func() (Tank, error) { return NewRectangular(1, -2, 1) }, "tank width"},
		{"huge length", func() (Tank, error) { return NewHorizontalCylinder(1, 1e6) }, "tank length"},
		{"cone taller than tank", func() (Tank, error) { return NewConeBottom(1, 3, 2) }, "cone height"},
		{"steep negative slope", func() (Tank, error) { return NewSlopedPit(1, 1, -1, 1) }, "side slope"},
		{"pit depth inf", func() (Tank, error) { return NewSlopedPit(1, 1, 1, Length(math.Inf(1))) }, "pit depth"},
		{"sphere negative", func() (Tank, error) { return NewSphere(-1) }, "tank diameter"},
		{"table one row", func() (Tank, error) { return NewTable([]float64{0}, []float64{0}) }, "tank table"},
		{"table mismatched", func() (Tank, error) { return NewTable([]float64{0, 1}, []float64{0}) }, "tank table volumes"},
		{"table level repeats row 3", func() (Tank, error) {
			return NewTable([]float64{0, 1, 1, 2}, []float64{0, 1, 2, 3})
		}, "tank table level, row 3"},
		{"table level falls row 4", func() (Tank, error) {
			return NewTable([]float64{0, 1, 2, 1.5}, []float64{0, 1, 2, 3})
		}, "tank table level, row 4"},
		{"table volume falls row 2", func() (Tank, error) {
			return NewTable([]float64{0, 1, 2}, []float64{1, 0.5, 3})
		}, "tank table volume, row 2"},
		{"table all zero", func() (Tank, error) { return NewTable([]float64{0, 1}, []float64{0, 0}) }, "tank table volume, row 2"},
		{"table negative level", func() (Tank, error) { return NewTable([]float64{-1, 1}, []float64{0, 1}) }, "tank table level, row 1"},
	}
	for _, c := range cases {
		tk, err := c.make()
		var re *RangeError
		if err == nil || !errors.As(err, &re) {
			t.Errorf("%s: want *RangeError, got %v (%v)", c.name, err, tk)
			continue
		}
		if !strings.HasPrefix(err.Error(), c.names) {
			t.Errorf("%s: message %q should start with %q", c.name, err, c.names)
		}
	}
}

func FuzzNewTable(f *testing.F) {
	f.Add(0.0, 1.0, 2.0, 0.0, 1.0, 3.0, 0.5)
	f.Add(0.1, 0.1, 0.3, 0.0, 0.0, 0.0, 0.2)
	f.Add(0.0, 1e-9, 1000.0, 0.0, 1e9, 1e9, 999.0)
	f.Fuzz(func(t *testing.T, l0, l1, l2, v0, v1, v2, h float64) {
		tk, err := NewTable([]float64{l0, l1, l2}, []float64{v0, v1, v2})
		if err != nil {
			if tk != nil {
				t.Fatal("tank with error")
			}
			return
		}
		a, v := float64(tk.Area(Length(h))), float64(tk.Volume(Length(h)))
		if math.IsNaN(a) || math.IsInf(a, 0) || a < 0 || math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
			t.Fatalf("A=%g V=%g at %g", a, v, h)
		}
		lv := LevelForVolume(tk, Volume(v))
		if math.IsNaN(float64(lv)) || lv < 0 || lv > tk.Height() {
			t.Fatalf("level %g", lv)
		}
	})
}

var sinkLevel Length

// BenchmarkLevelForVolume: one inverse by Newton–bisection (horizontal cylinder).
func BenchmarkLevelForVolume(b *testing.B) {
	hc := mustTank(NewHorizontalCylinder(1.2, 3))
	b.ReportAllocs()
	for b.Loop() {
		sinkLevel = LevelForVolume(hc, 0.8)
	}
}
