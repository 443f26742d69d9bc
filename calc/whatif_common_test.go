package calc

import (
	"testing"

	"drawdown/calc/testkit"
)

// TestWhatIfCommonLevel: every cell's time is counted to one level, the
// highest stop level of the hoses that drain, so a larger bore or a shorter
// hose never reads as slower to the same level (Darcy–Weisbach with the
// same head: less L/D, less loss, more flow at every level; the property
// holds cell by cell over the grid), more hoses in parallel never read as
// slower, and a hose that does not drain at all says why (its stop
// reason). Cases: the demo bund with its intake (the stop where air starts
// moves up with the flow, which made a larger bore read as slower to its
// own stop), the same with a target, a tank drained over a high crest
// (the crest limit), and a bund with an inflow that small bores cannot
// outrun.
func TestWhatIfCommonLevel(t *testing.T) {
	bund := func() DrainInput { return DrainInput{Tank: bundTank(t), Siphon: bundSiphon(t)} }
	withTarget := bund()
	withTarget.Siphon.Geometry.Intake = 0
	withTarget.Siphon.Intake = strainerOnFloor
	withTarget.Target = 0.1
	highCrest := DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 8.5, -2)}
	rain := bund()
	rain.Inflow = 2e-4 // 12 L/min: more than the smallest bores' flow near the floor
	cases := []struct {
		name string
		in   DrainInput
	}{
		{"bund, stop where air starts", bund()},
		{"bund, target 0.1 m", withTarget},
		{"tank over a high crest", highCrest},
		{"bund in rain", rain},
		{"tank, low lift", DrainInput{Tank: mustTank(NewVerticalCylinder(1.2, 1.5)), Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			ls, ds := AroundChoice(tc.in.Siphon.Hose.Length, tc.in.Siphon.Hose.Diameter)
			g, err := WhatIf(tc.in, ls, ds)
			if err != nil {
				t.Fatal(err)
			}
			if !g.CommonFound {
				t.Fatal("no common level")
			}
			t.Logf("common level %.3f m", float64(g.CommonLevel))
			all := append([]WhatIfCell(nil), g.Parallel...)
			for _, row := range g.Cells {
				all = append(all, row...)
			}
			drains := 0
			for _, c := range all {
				switch {
				case c.Err != nil || c.Verdict == WillNotRun:
				case c.Drains:
					drains++
					if c.StopLevel > g.CommonLevel || !(c.TimeToCommon > 0) || c.TimeToCommon > c.Time*(1+1e-9) {
						t.Errorf("%v × %v mm: stop %.3f m, %v s to the common level, %v s to its stop", c.Length, c.Diameter*1000, float64(c.StopLevel), c.TimeToCommon, c.Time)
					}
				case c.StopReason == "":
					t.Errorf("%v × %v mm does not drain and says not why", c.Length, c.Diameter*1000)
				}
			}
			if drains == 0 {
				t.Fatal("no hose drains")
			}
			slower := func(a, b WhatIfCell) bool { // a reads as slower than b to the same level
				return a.Drains && b.Drains && float64(a.TimeToCommon) > float64(b.TimeToCommon)*(1+1e-9)
			}
			for i, row := range g.Cells {
				for j, c := range row {
					for k := j + 1; k < len(row); k++ {
						if slower(row[k], c) {
							t.Errorf("length %v: %v mm (%v s) slower than %v mm (%v s)", c.Length, row[k].Diameter*1000, row[k].TimeToCommon, c.Diameter*1000, c.TimeToCommon)
						}
					}
					for k := 0; k < i; k++ {
						if slower(g.Cells[k][j], c) {
							t.Errorf("bore %v mm: %v m (%v s) slower than %v m (%v s)", c.Diameter*1000, g.Cells[k][j].Length, g.Cells[k][j].TimeToCommon, c.Length, c.TimeToCommon)
						}
					}
				}
			}
			// The old reading (time to each hose's own stop): how often a
			// larger bore read as slower, for the log.
			old, nd := 0, 0
			for _, row := range g.Cells {
				for j := 1; j < len(row); j++ {
					if row[j].Drains && row[j-1].Drains && row[j].Time > row[j-1].Time {
						old++
					}
				}
			}
			for _, c := range all {
				if !c.Drains {
					nd++
				}
			}
			t.Logf("%d cells drain, %d do not; to each hose's own stop a larger bore read as slower in %d neighbouring pairs", drains, nd, old)
			for n := 1; n < len(g.Parallel); n++ {
				if slower(g.Parallel[n], g.Parallel[n-1]) {
					t.Errorf("%d hoses slower than %d", n+1, n)
				}
			}
			// Each time to the common level is where the cell's own drain
			// curve passes it (PlanDrain with its full curve; the curve's
			// linear interpolation bounds the agreement).
			for _, c := range []WhatIfCell{g.Cells[0][0], g.Cells[len(ls)/2][len(ds)/2], g.Cells[len(ls)-1][len(ds)-1]} {
				if !c.Drains {
					continue
				}
				alt := tc.in
				alt.Siphon.Hose.Length, alt.Siphon.Hose.Diameter = c.Length, c.Diameter
				alt.CurvePoints = MaxCurvePoints
				p, err := PlanDrain(alt)
				if err != nil {
					t.Fatal(err)
				}
				got := curveTimeAt(p.Curve, g.CommonLevel)
				if !testkit.Within(got, float64(c.TimeToCommon), 0.01) {
					t.Errorf("%v × %v mm: curve passes %.3f m at %.0f s, cell says %.0f s", c.Length, c.Diameter*1000, float64(g.CommonLevel), got, float64(c.TimeToCommon))
				}
			}
		})
	}
}

// curveTimeAt is the time a drain curve first falls to h (linear between
// points), or the last time.
func curveTimeAt(c []DrainPoint, h Length) float64 {
	for i := 1; i < len(c); i++ {
		if c[i].Level <= h {
			a, b := c[i-1], c[i]
			if a.Level == b.Level {
				return float64(b.Time)
			}
			return float64(a.Time) + float64(b.Time-a.Time)*float64(a.Level-h)/float64(a.Level-b.Level)
		}
	}
	return float64(c[len(c)-1].Time)
}
