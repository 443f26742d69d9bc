package calc

import (
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// TestAroundChoice: neighbouring standard hose bores (13 … 150 mm, common
// practice) and lengths ×½ … ×2.
func TestAroundChoice(t *testing.T) {
	cases := []struct {
		l, d      Length
		wantD     []Length
		wantLen   int
		wantFirst Length
	}{
		{10, 0.025, []Length{0.016, 0.019, 0.025, 0.032, 0.038}, 7, 5},
		{10, 0.0254, []Length{0.016, 0.019, 0.0254, 0.032, 0.038}, 7, 5},
		{10, 0.028, []Length{0.019, 0.025, 0.028, 0.032, 0.038}, 7, 5},
		{10, 0.013, []Length{0.013, 0.016, 0.019, 0.025, 0.032}, 7, 5},
		{10, 0.150, []Length{0.063, 0.075, 0.100, 0.150}, 7, 5},
		{8000, 0.2, []Length{0.075, 0.100, 0.150, 0.2}, 5, 4000},
	}
	for _, c := range cases {
		ls, ds := AroundChoice(c.l, c.d)
		if len(ls) != c.wantLen || ls[0] != c.wantFirst {
			t.Errorf("lengths around %g: %v", c.l, ls)
		}
		want := c.wantD
		if len(want) < 5 {
			// near the top of the list: the last five
			want = append([]Length{ds[0]}, want...)
		}
		for i := range want {
			if i >= len(ds) || math.Abs(float64(ds[i]-want[i])) > 1e-12 {
				t.Errorf("diameters around %g: %v, want %v", c.d, ds, want)
				break
			}
		}
	}
}

// TestWhatIfProperties: in the grid the drain time grows with hose length and
// falls with diameter, and flow grows with the number of hoses (Darcy–Weisbach
// with a fixed head: friction grows with L/D). Each cell matches PlanDrain.
func TestWhatIfProperties(t *testing.T) {
	in := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}
	ls, ds := AroundChoice(in.Siphon.Hose.Length, in.Siphon.Hose.Diameter)
	g, err := WhatIf(in, ls, ds)
	if err != nil {
		t.Fatal(err)
	}
	if len(g.Cells) != 7 || len(g.Cells[0]) != 5 || len(g.Parallel) != WhatIfHoseCounts {
		t.Fatalf("grid %dx%d + %d", len(g.Cells), len(g.Cells[0]), len(g.Parallel))
	}
	for i := range g.Cells {
		for j, c := range g.Cells[i] {
			if c.Err != nil || c.Verdict == WillNotRun || !(c.Time > 0) {
				t.Fatalf("cell %d,%d: %+v", i, j, c)
			}
			if i > 0 && !(c.Time > g.Cells[i-1][j].Time) {
				t.Errorf("time does not grow with length at %d,%d", i, j)
			}
			if j > 0 && !(c.Time < g.Cells[i][j-1].Time) {
				t.Errorf("time does not fall with diameter at %d,%d", i, j)
			}
		}
	}
	for n := 1; n < WhatIfHoseCounts; n++ {
		if !(g.Parallel[n].Flow > g.Parallel[n-1].Flow) || !(g.Parallel[n].Time < g.Parallel[n-1].Time) {
			t.Errorf("%d hoses not faster than %d", n+1, n)
		}
	}
	// the centre cell is the plan itself
	p, _ := PlanDrain(in)
	if c := g.Cells[3][2]; !testkit.Within(float64(c.Time), float64(p.Time), 1e-7) || c.StopReason != p.StopReason {
		t.Errorf("centre cell %+v, plan %g s %s", c, p.Time, p.StopReason)
	}
}

// TestWhatIfFlowOnlyAndBadCells: without a tank the grid holds flows only;
// an invalid alternative is marked on its cell, not fatal to the grid.
func TestWhatIfFlowOnlyAndBadCells(t *testing.T) {
	in := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}
	ls, ds := AroundChoice(in.Siphon.Hose.Length, in.Siphon.Hose.Diameter)
	p, _ := PlanDrain(in)
	in.Tank = nil
	g2, err := WhatIf(in, ls, ds)
	if err != nil {
		t.Fatal(err)
	}
	if c := g2.Cells[3][2]; c.Time != 0 || !testkit.Within(float64(c.Flow), float64(p.StartFlow), 1e-12) {
		t.Errorf("flow-only centre cell %+v", c)
	}
	// an invalid alternative is marked, not fatal: an up-leg longer than the hose
	in.Siphon.Hose.UpLegLength = 8
	g3, err := WhatIf(in, []Length{5, 10}, []Length{0.025})
	if err != nil {
		t.Fatal(err)
	}
	if g3.Cells[0][0].Err == nil || g3.Cells[1][0].Err != nil {
		t.Errorf("up-leg longer than a 5 m hose should mark that cell only: %v / %v", g3.Cells[0][0].Err, g3.Cells[1][0].Err)
	}
	if _, err := WhatIf(in, make([]Length, MaxWhatIfLengths+1), ds); err == nil {
		t.Error("too many lengths accepted")
	}
}

var sinkGrid WhatIfGrid

// BenchmarkWhatIf7x5: a 7 × 5 grid plus 1–4 parallel hoses (39 plans).
func BenchmarkWhatIf7x5(b *testing.B) {
	in := benchDrainInput()
	ls, ds := AroundChoice(in.Siphon.Hose.Length, in.Siphon.Hose.Diameter)
	b.ReportAllocs()
	for b.Loop() {
		sinkGrid, _ = WhatIf(in, ls, ds)
	}
}

// TestWhatIfRanksBoresOnTheBund: on the demo bund (issue 11) a larger bore is
// never slower to the same target, in every row of the grid, and moves more
// at the start; no cell stops at once.
func TestWhatIfRanksBoresOnTheBund(t *testing.T) {
	s := bundSiphon(t)
	s.Geometry.Intake = 0
	s.Intake = strainerOnFloor
	in := DrainInput{Tank: bundTank(t), Siphon: s, Target: 0.1}
	ls, ds := AroundChoice(s.Hose.Length, s.Hose.Diameter)
	g, err := WhatIf(in, ls, ds)
	if err != nil {
		t.Fatal(err)
	}
	for i, row := range g.Cells {
		for j, c := range row {
			if c.Err != nil || c.Verdict == WillNotRun || !(c.Time > 0) || c.StopReason != StopTarget {
				t.Fatalf("cell %d,%d: %+v", i, j, c)
			}
			if j > 0 && (c.Time > row[j-1].Time || !(c.Flow > row[j-1].Flow)) {
				t.Errorf("length %v: %v mm takes %v, %v mm %v", c.Length, c.Diameter*1000, c.Time, row[j-1].Diameter*1000, row[j-1].Time)
			}
		}
	}
}
