package tui

import (
	"drawdown/calc"
	"math"
)

// WhatIfFromGrid converts a calc what-if grid for SetTable. length,
// diameter and hoses are the present choice (SI); the nearest row and
// column are marked as the present cell. hasTank says whether times to the
// stop exist.
func WhatIfFromGrid(g calc.WhatIfGrid, length, diameter float64, hoses int, hasTank bool) WhatIfTable {
	cell := func(c calc.WhatIfCell) WhatIfCell {
		return WhatIfCell{
			Invalid:    c.Err != nil,
			Runs:       c.Err == nil && c.Verdict != calc.WillNotRun,
			NearLimit:  c.Verdict == calc.RunsNearLimit,
			Flow:       float64(c.Flow),
			Time:       float64(c.TimeToCommon),
			Level:      float64(c.StopLevel),
			Drains:     c.Drains && g.CommonFound,
			StopReason: string(c.StopReason),
		}
	}
	nearest := func(xs []calc.Length, x float64) int {
		best := 0
		for i, v := range xs {
			if math.Abs(float64(v)-x) < math.Abs(float64(xs[best])-x) {
				best = i
			}
		}
		return best
	}
	t := WhatIfTable{Hoses: max(hoses, 1), HasTime: hasTank, Common: float64(g.CommonLevel)}
	for _, l := range g.Lengths {
		t.Lengths = append(t.Lengths, float64(l))
	}
	for _, d := range g.Diameters {
		t.Diameters = append(t.Diameters, float64(d))
	}
	for _, row := range g.Cells {
		r := make([]WhatIfCell, len(row))
		for j, c := range row {
			r[j] = cell(c)
		}
		t.Cells = append(t.Cells, r)
	}
	for i, c := range g.Parallel {
		n := c.Hoses
		if n <= 0 {
			n = i + 1
		}
		t.Parallel = append(t.Parallel, WhatIfParallel{Hoses: n, Cell: cell(c)})
	}
	t.Row, t.Col = nearest(g.Lengths, length), nearest(g.Diameters, diameter)
	return t
}
