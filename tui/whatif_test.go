package tui

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/calc"
	"drawdown/calc/testkit"
	"drawdown/model"
)

// wiDemo builds an invented 7×5 table around 12 m of 25 mm hose. Flows use
// Darcy–Weisbach with a fixed friction factor f = 0.02, ΣK = 1.5 and a
// 2.6 m head, Q = (πD²/4)·√(2gH/(1 + ΣK + fL/D)); times divide an invented
// 4 m³ by the flow. They only need to look like a real table here: the
// numbers themselves are checked in calc, not in this pane.
func wiDemo() WhatIfTable {
	lengths := []float64{6, 8, 10, 12, 15, 20, 25}
	diams := []float64{0.016, 0.019, 0.025, 0.032, 0.038}
	q := func(l, d float64, n int) WhatIfCell {
		a := math.Pi * d * d / 4
		v := math.Sqrt(2 * 9.80665 * 2.6 / (1 + 1.5 + 0.02*l/d))
		flow := float64(n) * a * v
		return WhatIfCell{Runs: true, Flow: flow, Time: 4 / flow, Level: 0.05 + 20*flow, Drains: true, StopReason: "intake"}
	}
	t := WhatIfTable{Lengths: lengths, Diameters: diams, Row: 3, Col: 2, Hoses: 1, HasTime: true, Common: 0.14}
	for _, l := range lengths {
		row := make([]WhatIfCell, len(diams))
		for j, d := range diams {
			row[j] = q(l, d, 1)
		}
		t.Cells = append(t.Cells, row)
	}
	// The longest, thinnest hoses are marked as not running (as if a hump
	// or the crest limit stopped them) so the "✗ no run" cell shows.
	t.Cells[6][0] = WhatIfCell{}
	t.Cells[5][0].NearLimit = true
	for n := 1; n <= 4; n++ {
		t.Parallel = append(t.Parallel, WhatIfParallel{Hoses: n, Cell: q(12, 0.025, n)})
	}
	return t
}

func TestWhatIfView(t *testing.T) {
	noTank := wiDemo()
	noTank.HasTime = false
	cases := []struct {
		name  string
		tab   WhatIfTable
		set   bool
		sys   model.System
		keys  []string
		focus bool
	}{
		{"present", wiDemo(), true, model.SI, nil, true},
		{"moved_us", wiDemo(), true, model.US, []string{"down", "down", "right"}, true},
		{"parallel_row", wiDemo(), true, model.SI, []string{"down", "down", "down", "down", "right"}, true},
		{"no_tank_blurred", noTank, true, model.SI, nil, false},
		{"empty", WhatIfTable{}, false, model.SI, nil, true},
	}
	for _, c := range cases {
		for _, s := range paneSizes {
			t.Run(c.name+"/"+s.name, func(t *testing.T) {
				v := NewWhatIfView(NewStyles(true), c.sys, DefaultKeyMap())
				v.SetSize(s.w, s.h)
				if c.set {
					v.SetTable(c.tab)
				}
				if c.focus {
					v.Focus()
				}
				for _, k := range c.keys {
					v, _ = v.Update(keyMsg(k))
				}
				paneGolden(t, v.View(), s.w, s.h)
				if testing.Verbose() && s.w > 20 {
					t.Logf("\n%s", ansi.Strip(v.View()))
				}
			})
		}
	}
}

// Keys move the selection; Enter asks the root to adopt the selected cell
// and carries its length, diameter and hose count.
func TestWhatIfAdopt(t *testing.T) {
	tab := wiDemo()
	v := NewWhatIfView(NewStyles(true), model.SI, DefaultKeyMap())
	v.SetSize(78, 10)
	v.SetTable(tab)

	// Not focused: keys do nothing.
	if _, cmd := v.Update(keyMsg("enter")); cmd != nil {
		t.Fatal("blurred pane answered Enter")
	}
	v.Focus()
	steps := []struct {
		keys      []string
		len, diam float64
		hoses     int
	}{
		{nil, 12, 0.025, 1},
		{[]string{"down", "right"}, 15, 0.032, 1},
		{[]string{"up", "up", "left", "left", "left", "left"}, 10, 0.016, 1},
		{[]string{"k", "h", "k", "k", "k", "k"}, 6, 0.016, 1},                      // clamps at the edges
		{[]string{"j", "j", "j", "j", "j", "j", "j", "j", "l", "l"}, 12, 0.025, 3}, // parallel row: ×3
	}
	for i, s := range steps {
		for _, k := range s.keys {
			v, _ = v.Update(keyMsg(k))
		}
		_, cmd := v.Update(keyMsg("enter"))
		if cmd == nil {
			t.Fatalf("step %d: Enter gave no command", i)
		}
		msg, ok := cmd().(WhatIfAdoptMsg)
		if !ok {
			t.Fatalf("step %d: Enter gave %T", i, cmd())
		}
		want := WhatIfAdoptMsg{Length: s.len, Diameter: s.diam, Hoses: s.hoses}
		if msg != want {
			t.Errorf("step %d: adopt %+v, want %+v", i, msg, want)
		}
	}

	// A new table with another present choice brings the selection back
	// to it.
	tab.Row, tab.Col = 1, 1
	v.SetTable(tab)
	if m, _ := v.Selected(); m.Length != 8 || m.Diameter != 0.019 {
		t.Errorf("selection after a new present choice: %+v", m)
	}
}

func TestWhatIfMarks(t *testing.T) {
	v := NewWhatIfView(NewStyles(true), model.SI, DefaultKeyMap())
	v.SetSize(118, 12) // all five bores across (at 78 columns the table scrolls to them)
	v.SetTable(wiDemo())
	v.Focus()
	got := ansi.Strip(v.View())
	for _, want := range []string{"●", "✗ no", "!", "×2", "L/min", "h:mm"} {
		if !strings.Contains(got, want) {
			t.Errorf("frame lacks %q:\n%s", want, got)
		}
	}
}

// Property: ragged, empty and non-finite tables at any size never panic or
// show NaN/Inf, and keys never move the selection off the table.
func TestWhatIfNeverBreaks(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	odd := []float64{0, -1, 1e-12, 1e12, math.NaN(), math.Inf(1), math.Inf(-1)}
	pick := func(scale float64) float64 {
		if rng.IntN(4) == 0 {
			return odd[rng.IntN(len(odd))]
		}
		return rng.Float64() * scale
	}
	keys := []string{"up", "down", "left", "right", "enter", "j", "k", "h", "l"}
	for i := 0; i < 1500; i++ {
		var tab WhatIfTable
		nr, nc := rng.IntN(9), rng.IntN(7)
		for r := 0; r < nr; r++ {
			tab.Lengths = append(tab.Lengths, pick(100))
			row := make([]WhatIfCell, nc-rng.IntN(2)*min(nc, 1))
			for c := range row {
				row[c] = WhatIfCell{Runs: rng.IntN(4) > 0, NearLimit: rng.IntN(5) == 0, Flow: pick(0.05), Time: pick(1e6)}
			}
			tab.Cells = append(tab.Cells, row)
		}
		for c := 0; c < nc; c++ {
			tab.Diameters = append(tab.Diameters, pick(0.1))
		}
		for n := 0; n < rng.IntN(5); n++ {
			tab.Parallel = append(tab.Parallel, WhatIfParallel{Hoses: n + 1, Cell: WhatIfCell{Runs: true, Flow: pick(0.1), Time: pick(1e5)}})
		}
		tab.Row, tab.Col, tab.Hoses, tab.HasTime = rng.IntN(10)-1, rng.IntN(8)-1, rng.IntN(4), rng.IntN(2) == 0
		w, h := rng.IntN(130)-2, rng.IntN(45)-2
		v := NewWhatIfView(NewStyles(true), model.System(rng.IntN(2)), DefaultKeyMap())
		v.SetSize(w, h)
		v.SetTable(tab)
		v.Focus()
		for k := 0; k < 12; k++ {
			var cmd tea.Cmd
			v, cmd = v.Update(keyMsg(keys[rng.IntN(len(keys))]))
			if cmd != nil {
				cmd()
			}
		}
		paneCheckFrame(t, ansi.Strip(v.View()), max(w, 0), max(h, 0))
		if t.Failed() {
			t.Fatalf("table %+v at %d×%d", tab, w, h)
		}
	}
}

// WhatIfFromGrid marks the nearest row and column as the present choice and
// maps calc's verdicts and per-cell errors to the pane's words.
func TestWhatIfFromGrid(t *testing.T) {
	g := calc.WhatIfGrid{
		Lengths:   []calc.Length{6, 9.6, 12, 15},
		Diameters: []calc.Length{0.019, 0.025, 0.032},
		Cells: [][]calc.WhatIfCell{
			{{Verdict: calc.Runs, Flow: 0.001, Time: 600}, {Verdict: calc.Runs, Flow: 0.002, Time: 300}, {Verdict: calc.Runs, Flow: 0.003, Time: 200}},
			{{Verdict: calc.RunsNearLimit, Flow: 0.001, Time: 700}, {Verdict: calc.Runs, Flow: 0.002, Time: 350}, {Verdict: calc.Runs, Flow: 0.003, Time: 250}},
			{{Verdict: calc.WillNotRun}, {Verdict: calc.Runs, Flow: 0.002, Time: 400}, {Verdict: calc.Runs, Flow: 0.003, Time: 300}},
			{{Err: errors.New("hose shorter than the up-leg")}, {Verdict: calc.Runs, Flow: 0.002, Time: 450}, {Verdict: calc.Runs, Flow: 0.003, Time: 350}},
		},
		Parallel: []calc.WhatIfCell{{Hoses: 1, Verdict: calc.Runs, Flow: 0.002}, {Hoses: 2, Verdict: calc.Runs, Flow: 0.004}},
	}
	tab := WhatIfFromGrid(g, 9.5, 0.0254, 1, true)
	if tab.Row != 1 || tab.Col != 1 {
		t.Errorf("present cell (%d,%d), want (1,1)", tab.Row, tab.Col)
	}
	if !tab.Cells[1][0].NearLimit || tab.Cells[2][0].Runs || !tab.Cells[3][0].Invalid || !tab.Cells[0][0].Runs {
		t.Errorf("verdicts not carried over: %+v", tab.Cells)
	}
	if len(tab.Parallel) != 2 || tab.Parallel[1].Hoses != 2 {
		t.Errorf("parallel row: %+v", tab.Parallel)
	}
	v := NewWhatIfView(NewStyles(true), model.SI, DefaultKeyMap())
	v.SetSize(78, 12)
	v.SetTable(tab)
	got := ansi.Strip(v.View())
	for _, want := range []string{"– n/a", "✗ no run", "!", "●"} {
		if !strings.Contains(got, want) {
			t.Errorf("frame lacks %q:\n%s", want, got)
		}
	}
}

// A new 7×5 table and its frame.
func BenchmarkWhatIfSetTableView(b *testing.B) {
	v := NewWhatIfView(NewStyles(true), model.SI, DefaultKeyMap())
	v.SetSize(120, 17)
	v.Focus()
	tab := wiDemo()
	b.ReportAllocs()
	for b.Loop() {
		v.SetTable(tab)
		paneSink = v.View()
	}
}

// The demo job's what-if grid, computed the way the screen does it (the
// root's command when the pane comes on screen): 7 lengths × 5 bores around
// its hose, the present cell in the middle, and the present cell's flow
// equal to the plan's own flow (the same calc solve on the same inputs; a
// consistency check, the physics is checked in calc against its sources).
func TestWhatIfCmdDemo(t *testing.T) {
	m := newTestModel(t, 80, 24)
	p := m.st.plan
	m = press(t, m, "7")
	tab := m.whatif.t
	if !m.whatif.has {
		t.Fatal("no grid after the pane came on screen")
	}
	if len(tab.Lengths) != 7 || len(tab.Diameters) != 5 || len(tab.Parallel) != calc.WhatIfHoseCounts {
		t.Fatalf("grid %d×%d, %d parallel", len(tab.Lengths), len(tab.Diameters), len(tab.Parallel))
	}
	if tab.Row != 3 {
		t.Errorf("present length on row %d, want 3 (×1 of ×½ … ×2)", tab.Row)
	}
	got, want := tab.Cells[tab.Row][tab.Col].Flow, float64(p.Result.Flow)
	if !testkit.Within(got, want, 1e-9) {
		t.Errorf("present cell flow %g m³/s, plan flow %g m³/s", got, want)
	}
	if tab.HasTime != (p.Tank != nil) {
		t.Errorf("HasTime %v with tank %v", tab.HasTime, p.Tank != nil)
	}
	paneCheckFrame(t, ansi.Strip(m.whatif.View()), 44, 21)
	// The grid is asked for once per plan, not once per key.
	if m.whatIfCmd() != nil {
		t.Error("a second grid for the same plan")
	}
}

// The grid is a command because it costs one drain plan per cell.
func BenchmarkWhatIfCmdDemo(b *testing.B) {
	m := newTestModel(b, 80, 24)
	m.focus = PaneWhatIf
	b.ReportAllocs()
	for b.Loop() {
		m.whatIfGen = 0
		paneSink2 = m.whatIfCmd()()
	}
}

var paneSink2 any

// A hose that does not lower the level says why in its cell and the
// footer, never a bare "at once"; on the demo, as the screen computes it,
// every row ranks bores the right way to the one common level.
func TestWhatIfSaysWhy(t *testing.T) {
	tab := wiDemo()
	tab.Cells[0][4] = WhatIfCell{Runs: true, Flow: 0.003, StopReason: "air"} // air at the intake from the start
	v := NewWhatIfView(NewStyles(true), model.SI, DefaultKeyMap())
	v.SetSize(118, 22)
	v.SetTable(tab)
	v.Focus()
	for _, k := range []string{"up", "up", "up", "right", "right"} {
		v, _ = v.Update(keyMsg(k))
	}
	got := ansi.Strip(v.View())
	if strings.Contains(got, "at once") || !strings.Contains(got, "air now") || !strings.Contains(got, "does not lower the level: air") {
		t.Errorf("no reason for a hose that does not drain:\n%s", got)
	}

	m := newTestModel(t, 80, 24)
	m = press(t, m, "7")
	dt := m.whatif.t
	if !(dt.Common > 0) {
		t.Fatalf("no common level: %+v", dt.Common)
	}
	for i, row := range dt.Cells {
		for j := 1; j < len(row); j++ {
			if row[j].Drains && row[j-1].Drains && row[j].Time > row[j-1].Time {
				t.Errorf("row %d: %g m bore %d takes %.0f s to %.3f m, the smaller %.0f s", i, dt.Lengths[i], j, row[j].Time, dt.Common, row[j-1].Time)
			}
		}
	}
	if f := ansi.Strip(m.whatif.View()); strings.Contains(f, "at once") {
		t.Errorf("demo What-if says at once:\n%s", f)
	}
}
