package tui

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/charmbracelet/x/ansi"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// cvTorricelli samples an invented drain of a constant-area tank through a
// siphon whose flow goes as the square root of the head (fixed friction
// factor): dh/dt = −k√(h−ho)/A, so h(t) = ho + (√(h0−ho) − k·t/(2A))²
// (analytic solution, the Torricelli form). It stops at hStop.
func cvTorricelli(h0, ho, hStop, area, k float64, n int) drainCurve {
	tStop := 2 * area / k * (math.Sqrt(h0-ho) - math.Sqrt(hStop-ho))
	pts := make([]curvePoint, n)
	for i := range pts {
		t := tStop * float64(i) / float64(n-1)
		r := math.Sqrt(h0-ho) - k*t/(2*area)
		pts[i] = curvePoint{T: t, Level: ho + r*r, Flow: k * r}
	}
	return drainCurve{Points: pts, StopTime: tStop, StopLevel: pts[n-1].Level}
}

func TestCurveView(t *testing.T) {
	// 1.8 m across (2.54 m²), 2.0 m → intake stop at 0.35 m, outlet −0.6 m,
	// about 2.3 L/s at the start: about 25 minutes.
	intake := cvTorricelli(2.0, -0.6, 0.35, 2.54, 0.00143, 60)
	intake.StopReason = "intake"
	target := intake
	target.HasTarget, target.Target = true, 0.35
	target.StopReason = "target"
	// A warm liquid over a high wall: gas gathers once the level is below
	// 1.2 m (invented).
	gas := intake
	gas.HasGasLevel, gas.GasLevel = true, 1.2
	// Into a receiver: the levels close in and the flow tapers off over
	// several hours (head 1.2 m → 2 cm).
	equal := cvTorricelli(2.0, 0.8, 0.82, 20, 0.0008, 80)
	equal.StopReason = "equal"
	// A bucket-sized sump: seconds.
	short := cvTorricelli(0.5, 0, 0.05, 0.1, 0.004, 20)
	short.StopReason = "crest"
	cases := []struct {
		name string
		c    drainCurve
		set  bool
		sys  model.System
	}{
		{"intake", intake, true, model.SI},
		{"target_us", target, true, model.US},
		{"gas_level", gas, true, model.SI},
		{"equal_hours", equal, true, model.SI},
		{"short_seconds", short, true, model.SI},
		{"empty", drainCurve{}, false, model.SI},
		{"one_point", drainCurve{Points: []curvePoint{{0, 1.2, 0}}, StopLevel: 1.2, StopReason: "intake"}, true, model.SI},
	}
	for _, c := range cases {
		for _, s := range paneSizes {
			t.Run(c.name+"/"+s.name, func(t *testing.T) {
				v := NewCurveView(NewStyles(true), c.sys)
				v.SetSize(s.w, s.h)
				if c.set {
					v.setCurve(c.c)
				}
				paneGolden(t, v.View(), s.w, s.h)
				if testing.Verbose() && s.w > 20 {
					t.Logf("\n%s", ansi.Strip(v.View()))
				}
			})
		}
	}
}

func TestCurveViewMessages(t *testing.T) {
	v := NewCurveView(NewStyles(true), model.SI)
	v.SetSize(78, 10)
	if got := ansi.Strip(v.View()); !strings.Contains(got, "No drain plan: set a tank in the Tank pane") {
		t.Errorf("empty curve: %q", got)
	}
	c := cvTorricelli(2.0, -0.6, 0.35, 2.54, 0.00143, 60)
	c.StopReason = "intake"
	v.setCurve(c)
	got := ansi.Strip(v.View())
	for _, want := range []string{"intake loses its prime", "■", "min", "m ┤"} {
		if !strings.Contains(got, want) {
			t.Errorf("frame lacks %q:\n%s", want, got)
		}
	}
}

// Property: random and degenerate curves at any size never panic, never
// show NaN or Inf and always fill the pane exactly.
func TestCurveViewNeverBreaks(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	odd := []float64{0, -1, 1e-12, 1e12, -1e12, math.NaN(), math.Inf(1), math.Inf(-1)}
	pick := func(scale float64) float64 {
		if rng.IntN(4) == 0 {
			return odd[rng.IntN(len(odd))]
		}
		return rng.Float64() * scale
	}
	for i := 0; i < 2000; i++ {
		n := rng.IntN(12)
		c := drainCurve{StopTime: pick(1e5), StopLevel: pick(5), StopReason: []calc.StopReason{"", "target", "intake", "crest", "equal", "odd"}[rng.IntN(6)],
			HasTarget: rng.IntN(2) == 0, Target: pick(5), HasGasLevel: rng.IntN(2) == 0, GasLevel: pick(5)}
		tt := 0.0
		for j := 0; j < n; j++ {
			tt += pick(1e4)
			c.Points = append(c.Points, curvePoint{T: tt, Level: pick(5), Flow: pick(0.05) - 0.01})
		}
		w, h := rng.IntN(130)-2, rng.IntN(45)-2
		v := NewCurveView(NewStyles(true), model.System(rng.IntN(2)))
		v.SetSize(w, h)
		v.setCurve(c)
		paneCheckFrame(t, ansi.Strip(v.View()), max(w, 0), max(h, 0))
		if t.Failed() {
			t.Fatalf("curve %+v at %d×%d", c, w, h)
		}
	}
}

// One keystroke's worth of work for the Drain curve: a new 200-point plan,
// then the frame, at the compact (44×21) and wide lower (120×17) sizes.
func BenchmarkCurveViewSetCurveView(b *testing.B) {
	for _, s := range []struct {
		name string
		w, h int
	}{{"44x21", 44, 21}, {"120x17", 120, 17}} {
		b.Run(s.name, func(b *testing.B) {
			v := NewCurveView(NewStyles(true), model.SI)
			v.SetSize(s.w, s.h)
			c := cvTorricelli(2.0, -0.6, 0.35, 2.54, 0.00143, 200)
			c.StopReason = "intake"
			b.ReportAllocs()
			for b.Loop() {
				v.setCurve(c)
				paneSink = v.View()
			}
		})
	}
}

// The demo job's drain plan through the shipped path (curveOf, as Show
// calls it): the title states the plan's own stop time and reason
// (formatting only; the drain itself is checked in calc against its
// analytic cases). A plan without a drain gives no curve.
func TestCurveOfDemo(t *testing.T) {
	p := model.Compute(model.DemoJob(), presets.Builtin())
	if p.Drain == nil {
		t.Fatal("the demo job has no drain plan")
	}
	c, ok := curveOf(p)
	if !ok || len(c.Points) != len(p.Drain.Curve) || c.StopReason != p.Drain.StopReason {
		t.Fatalf("curve %d points, reason %q", len(c.Points), c.StopReason)
	}
	v := NewCurveView(NewStyles(true), model.SI)
	v.SetSize(118, 22)
	v.setCurve(c)
	got := ansi.Strip(v.View())
	paneCheckFrame(t, got, 118, 22)
	want := "stops after " + model.Format(model.DimTime, float64(p.Drain.Time), model.SI)
	if !strings.Contains(got, want) || !strings.Contains(got, present.StopShort(c.StopReason)) {
		t.Errorf("title lacks %q / reason:\n%s", want, got)
	}
	if _, ok := curveOf(model.Plan{}); ok {
		t.Error("a plan without a drain gave a curve")
	}
}

// TestCurveSteady (issue 15 item 3): a new plan that moves the stop by a few
// per cent moves the end of the curve, not the axes: the time labels and the
// level labels stay as they were, and so does the plot's left edge after a
// units toggle.
func TestCurveSteady(t *testing.T) {
	const w, h = 118, 17
	v := NewCurveView(NewStyles(true), model.SI)
	v.SetSize(w, h)
	draw := func(k float64) []string {
		c := cvTorricelli(2.0, -0.6, 0.35, 2.54, k, 60)
		c.StopReason = "intake"
		v.setCurve(c)
		return strings.Split(ansi.Strip(v.View()), "\n")
	}
	base := draw(0.00143)
	labels := func(f []string) string { // the y labels and the time axis
		var b strings.Builder
		for _, l := range f[1 : h-2] {
			b.WriteString(string([]rune(l)[:10]) + "\n")
		}
		return b.String() + f[h-1]
	}
	for _, k := range []float64{0.00143 * 1.04, 0.00143 * 0.97, 0.00143 * 1.1} {
		f := draw(k)
		if labels(f) != labels(base) {
			t.Errorf("flow ×%.2f rescaled the axes:\n%s\nwas\n%s", k/0.00143, labels(f), labels(base))
		}
	}
	// A much faster drain is drawn on a new scale.
	if f := draw(0.00143 * 3); f[h-1] == base[h-1] {
		t.Error("a drain three times as fast kept the time axis")
	}
	left := func(f []string) int { return strings.IndexRune(f[1], '┤') }
	draw(0.00143)
	si := left(strings.Split(ansi.Strip(v.View()), "\n"))
	v.SetUnits(model.US)
	if us := left(strings.Split(ansi.Strip(v.View()), "\n")); us != si {
		t.Errorf("the plot moved from column %d to %d with the units", si, us)
	}
}
