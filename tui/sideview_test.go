package tui

import (
	"math"
	"math/rand/v2"
	"path/filepath"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/calc"
	"drawdown/calc/testkit"
	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// paneGolden compares an ANSI-stripped frame with
// testdata/<TestName>/<case>.golden (the subtest name gives the path) through
// the house's one golden helper (go test ./tui -update rewrites it), and
// checks the frame's size.
func paneGolden(t *testing.T, frame string, w, h int) {
	t.Helper()
	plain := ansi.Strip(frame)
	paneCheckFrame(t, plain, w, h)
	testkit.Golden(t, filepath.Join("testdata", filepath.FromSlash(t.Name())+".golden"), []byte(plain))
}

// paneCheckFrame asserts a plain frame is h lines of w cells with no NaN or
// Inf anywhere.
func paneCheckFrame(t *testing.T, plain string, w, h int) {
	t.Helper()
	if w <= 0 || h <= 0 {
		if plain != "" {
			t.Errorf("size %d×%d: want an empty frame, got %q", w, h, plain)
		}
		return
	}
	lines := strings.Split(plain, "\n")
	if len(lines) != h {
		t.Errorf("size %d×%d: %d lines", w, h, len(lines))
	}
	for i, l := range lines {
		if got := ansi.StringWidth(l); got != w {
			t.Errorf("size %d×%d: line %d is %d cells wide: %q", w, h, i, got, l)
			break
		}
	}
	for _, bad := range []string{"NaN", "Inf", "inf", "nan"} {
		if strings.Contains(plain, bad) {
			t.Errorf("size %d×%d: frame contains %q:\n%s", w, h, bad, plain)
		}
	}
}

// paneSizes are the pane sizes the root gives at 80×24 (compact main pane)
// and 120×40 (wide side column and lower view), the sizes asked for in the
// brief, and tiny sizes.
var paneSizes = []struct {
	name string
	w, h int
}{
	{"78x10", 78, 10},
	{"118x22", 118, 22},
	{"44x21", 44, 21},   // compact layout: 80 − result column 36
	{"28x20", 28, 20},   // wide layout: side column beside the result
	{"120x17", 120, 17}, // wide layout: lower view
	{"20x5", 20, 5},
	{"1x1", 1, 1},
}

// svJob is an invented case: a 2.4 m tall rain-water tank 1.8 m across
// holding 2.0 m, drained by a 25 mm hose over a crest 0.7 m above the
// surface to a drain 0.6 m below the floor, stopping at 0.35 m. edit changes
// it for a case.
func svJob(edit func(j *model.Job)) model.Job {
	j := model.NewJob("side view test", model.SI, time.Time{})
	j.Inputs = map[model.FieldID]string{
		model.FieldHoseID: "25 mm", model.FieldHoseLength: "8 m", model.FieldLift: "0.7 m", model.FieldDrop: "2.6 m",
		model.FieldTemp: "10 °C", model.FieldTankShape: "vertical-cylinder", model.FieldTankDiameter: "1.8 m",
		model.FieldTankHeight: "2.4 m", model.FieldTankLevel: "2.0 m", model.FieldIntakeHeight: "0.1 m",
		model.FieldTankTarget: "0.35 m",
	}
	if edit != nil {
		edit(&j)
	}
	return j
}

// svTransfer is svJob as a transfer into a vertical cylinder 1.2 m across
// and 1.5 m tall whose floor stands 1.0 m below the source floor, holding
// 0.2 m; the hose end sits 0.4 m above its floor (invented).
func svTransfer(edit func(j *model.Job)) model.Job {
	return svJob(func(j *model.Job) {
		for id, v := range map[model.FieldID]string{model.FieldReceiverShape: "vertical-cylinder",
			model.FieldReceiverDiameter: "1.2 m", model.FieldReceiverHeight: "1.5 m",
			model.FieldReceiverFloor: "-1.0 m", model.FieldReceiverLevel: "0.2 m"} {
			j.Inputs[id] = v
		}
		delete(j.Inputs, model.FieldTankTarget)
		if edit != nil {
			edit(j)
		}
	})
}

// svGeometry is the side view's picture of a job, through the shipped path:
// model.Compute, present.Build, geometryOf.
func svGeometry(t testing.TB, j model.Job) sideGeometry {
	t.Helper()
	p := model.Compute(j, presets.Builtin())
	if !p.OK() {
		t.Fatalf("case does not compute: %v", p.Err)
	}
	return geometryOf(p, present.Build(p, j.Units, p.Hazards))
}

func TestSideView(t *testing.T) {
	set := func(id model.FieldID, v string) func(*model.Job) {
		return func(j *model.Job) { j.Inputs[id] = v }
	}
	cases := []struct {
		name string
		geo  sideGeometry
		sys  model.System
	}{
		{"tank", svGeometry(t, svJob(nil)), model.SI},
		{"tank_us", svGeometry(t, svJob(func(j *model.Job) { j.Units = model.US })), model.US},
		// 7.5 m of lift: above the working limit of cold water at sea level
		// (about 6.5 m here), below the limit at this flow.
		{"over_working", svGeometry(t, svJob(set(model.FieldLift, "7.5 m"))), model.SI},
		{"receiver", svGeometry(t, svJob(func(j *model.Job) {
			j.Inputs[model.FieldOutletSubmerged] = "yes"
			j.Inputs[model.FieldDrop] = "0.8 m"
		})), model.SI},
		// 10.5 m of lift: above (p_atm − p_v)/(ρg) ≈ 10.2 m for water at
		// 10 °C and 101.3 kPa: it will not run.
		{"over_flowing", svGeometry(t, svJob(func(j *model.Job) {
			j.Inputs[model.FieldLift] = "10.5 m"
			j.Units = model.US
		})), model.US},
		// A transfer into a 1.2 m cylinder standing 1 m below the source
		// floor, holding 0.2 m: its level rises as the source falls.
		{"transfer", svGeometry(t, svTransfer(nil)), model.SI},
		// Where air starts to be drawn in at the intake, when the plan
		// reports it (0.5 m, invented for the drawing).
		{"air_starts", func() sideGeometry {
			g := svGeometry(t, svJob(nil))
			g.HasAirStarts, g.AirStarts = true, 0.5
			return g
		}(), model.SI},
		// A pit without a tank whose outlet stands above the surface (as a
		// raised receiving surface leaves it): no drop.
		{"pit_no_drop", sideGeometry{Level: 0, Intake: -0.5, Crest: 1.2, Outlet: 0.3, WorkingLimit: 6, TheoreticalLimit: 9.5,
			CrestStatus: present.OK, CrestSays: []string{"lift 1.20 m within the working limit 6.00 m"}}, model.SI},
	}
	for _, c := range cases {
		for _, s := range paneSizes {
			t.Run(c.name+"/"+s.name, func(t *testing.T) {
				v := NewSideView(NewStyles(true), c.sys)
				v.SetSize(s.w, s.h)
				v.setGeometry(c.geo)
				paneGolden(t, v.View(), s.w, s.h)
				if testing.Verbose() && s.w > 20 {
					t.Logf("\n%s", ansi.Strip(v.View()))
				}
			})
		}
	}
}

// Over-limit crest must be said in words, not colour alone.
func TestSideViewOverLimitInWords(t *testing.T) {
	g := svGeometry(t, svJob(func(j *model.Job) { j.Inputs[model.FieldLift] = "11 m" })) // above the 10.2 m theoretical limit
	v := NewSideView(NewStyles(true), model.SI)
	v.SetSize(78, 10)
	v.setGeometry(g)
	if got := ansi.Strip(v.View()); !strings.Contains(got, "will not run") || !strings.Contains(got, "✗") {
		t.Errorf("over-limit crest not stated in words:\n%s", got)
	}
}

// Property: odd or random geometry at any size never panics and never shows
// NaN or Inf, and the frame is always exactly w×h.
func TestSideViewNeverBreaks(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	odd := []float64{0, -1, 1e-9, 1e9, -1e9, math.NaN(), math.Inf(1), math.Inf(-1), 3, 0.5}
	pick := func() float64 {
		if rng.IntN(3) == 0 {
			return odd[rng.IntN(len(odd))]
		}
		return rng.Float64()*20 - 8
	}
	for i := 0; i < 3000; i++ {
		g := sideGeometry{
			Tank: rng.IntN(2) == 0, TankHeight: pick(), TankWidth: pick(),
			Level: pick(), Intake: pick(), Crest: pick(), Outlet: pick(),
			OutletSubmerged: rng.IntN(2) == 0, HasTarget: rng.IntN(2) == 0, Target: pick(),
			HasStop: rng.IntN(2) == 0, Stop: pick(), StopReason: calc.StopIntake,
			HasAirStarts: rng.IntN(2) == 0, AirStarts: pick(),
			Receiver: rng.IntN(3) == 0, RecvFloor: pick(), RecvHeight: pick(), RecvWidth: pick(),
			RecvLevel: pick(), RecvStop: pick(), HoseEnd: pick(),
			WorkingLimit: pick(), TheoreticalLimit: pick(),
			CrestStatus: present.Status(rng.IntN(4)), CrestSays: []string{"crest status"},
		}
		w, h := rng.IntN(130)-2, rng.IntN(45)-2
		v := NewSideView(NewStyles(true), model.System(rng.IntN(2)))
		v.SetSize(w, h)
		v.setGeometry(g)
		paneCheckFrame(t, ansi.Strip(v.View()), max(w, 0), max(h, 0))
		if t.Failed() {
			t.Fatalf("geometry %+v at %d×%d", g, w, h)
		}
	}
}

// Styling must never change the text: the coloured frame, stripped, is the
// plain frame (status is carried by words and symbols, not by colour).
func TestDrawnPanesSameTextInColour(t *testing.T) {
	for _, dark := range []bool{true, false} {
		col := NewStyles(dark)
		plain := NewStyles(true)
		frames := func(st Styles) []string {
			sv := NewSideView(st, model.SI)
			sv.SetSize(78, 10)
			sv.setGeometry(svGeometry(t, svJob(nil)))
			cv := NewCurveView(st, model.SI)
			cv.SetSize(78, 10)
			c := cvTorricelli(2.0, -0.6, 0.35, 2.54, 0.00143, 60)
			c.StopReason = "intake"
			cv.setCurve(c)
			wv := NewWhatIfView(st, model.SI, DefaultKeyMap())
			wv.SetSize(78, 10)
			wv.SetTable(wiDemo())
			wv.Focus()
			ck := NewChecklistView(st, DefaultKeyMap(), nil)
			ck.SetSize(78, 10)
			ck.SetChecklist(ckFixed())
			ck.Focus()
			return []string{sv.View(), cv.View(), wv.View(), ck.View()}
		}
		a, b := frames(col), frames(plain)
		for i := range a {
			if ansi.Strip(a[i]) != ansi.Strip(b[i]) {
				t.Errorf("dark=%v pane %d: text differs with colour:\n%s\n---\n%s", dark, i, ansi.Strip(a[i]), ansi.Strip(b[i]))
			}
		}
	}
}

var paneSink string

// One keystroke's worth of work for the Side view: new heights, then the
// frame, at the compact (44×21) and wide (28×20) sizes.
func BenchmarkSideViewSetGeometryView(b *testing.B) {
	for _, s := range []struct {
		name string
		w, h int
	}{{"44x21", 44, 21}, {"28x20", 28, 20}, {"118x22", 118, 22}} {
		b.Run(s.name, func(b *testing.B) {
			v := NewSideView(NewStyles(true), model.SI)
			v.SetSize(s.w, s.h)
			g := svGeometry(b, svJob(nil))
			b.ReportAllocs()
			for i := 0; b.Loop(); i++ {
				g.Crest = 2.7 + float64(i%7)*0.01
				v.setGeometry(g)
				paneSink = v.View()
			}
		})
	}
}

// hoseBreak says where the hose line of a plain Side view frame is broken:
// the cells of the hose (┃ ━ ┏ ┓ ┗ ┛ ▲ ▼ ╂) must be one line, side by side or
// one above the other, from the intake ▲ to the open end ▼. "" when whole.
func hoseBreak(frame string) string {
	var grid [][]rune
	for _, l := range strings.Split(frame, "\n") {
		grid = append(grid, []rune(l))
	}
	isHose := func(r rune) bool { return strings.ContainsRune("┃━┏┓┗┛▲▼╂", r) }
	start, n := [2]int{-1, -1}, 0
	for y, row := range grid {
		for x, r := range row {
			if isHose(r) {
				n++
				if r == '▲' {
					start = [2]int{x, y}
				}
			}
		}
	}
	if start[0] < 0 {
		return "no intake drawn"
	}
	seen := map[[2]int]bool{start: true}
	queue := [][2]int{start}
	end := false
	for len(queue) > 0 {
		p := queue[0]
		queue = queue[1:]
		end = end || grid[p[1]][p[0]] == '▼'
		for _, d := range [][2]int{{1, 0}, {-1, 0}, {0, 1}, {0, -1}} {
			q := [2]int{p[0] + d[0], p[1] + d[1]}
			if q[1] < 0 || q[1] >= len(grid) || q[0] < 0 || q[0] >= len(grid[q[1]]) || seen[q] || !isHose(grid[q[1]][q[0]]) {
				continue
			}
			seen[q] = true
			queue = append(queue, q)
		}
	}
	switch {
	case !end:
		return "the line from the intake does not reach the open end"
	case len(seen) != n:
		return "hose cells apart from the line"
	}
	return ""
}

// TestSideViewHoseWhole (issue 14 item 4): the hose line has no gap at any
// screen size from 80×24 to 300×100, for a drain, a transfer, a submerged
// outlet, a pit without a tank and a crest over its limit, through the
// shipped screen (its layout gives the Side view its size).
func TestSideViewHoseWhole(t *testing.T) {
	jobs := map[string]model.Job{
		"demo":     model.DemoJob(),
		"tank":     svJob(nil),
		"transfer": svTransfer(nil),
		"submerged": svJob(func(j *model.Job) {
			j.Inputs[model.FieldOutletSubmerged] = "yes"
			j.Inputs[model.FieldDrop] = "0.8 m"
		}),
		"pit": svJob(func(j *model.Job) {
			j.Inputs[model.FieldTankShape] = "none"
			j.Inputs[model.FieldIntakeDepth] = "0.4 m"
		}),
		"over_working": svJob(func(j *model.Job) { j.Inputs[model.FieldLift] = "7.5 m" }),
	}
	for name, job := range jobs {
		for w := 80; w <= 300; w += 7 {
			for h := 24; h <= 100; h += 5 {
				m := New(Options{Start: Start{Job: job.Clone()}, NoSave: true, Now: func() time.Time { return testClock }, Loc: time.UTC})
				m = send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
				m = press(t, m, "5")
				if why := hoseBreak(ansi.Strip(m.side.View())); why != "" {
					t.Fatalf("%s at %d×%d: %s\n%s", name, w, h, why, ansi.Strip(m.side.View()))
				}
			}
		}
	}
}

// TestSideViewHoseWholeAnyGeometry: the same for random pictures at every
// pane size the drawing is made at (24×7 up).
func TestSideViewHoseWholeAnyGeometry(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 3000; i++ {
		f := func(lo, hi float64) float64 { return lo + rng.Float64()*(hi-lo) }
		level := f(0.1, 5)
		g := sideGeometry{Tank: rng.IntN(3) > 0, TankHeight: level + f(0, 3), TankWidth: f(0.3, 30),
			Level: level, Intake: f(0, level), Crest: level + f(0, 12), Outlet: level - f(-0.5, 8),
			OutletSubmerged: rng.IntN(3) == 0, HasStop: rng.IntN(2) == 0, Stop: f(0, level),
			HasAirStarts: rng.IntN(2) == 0, AirStarts: f(0, level),
			WorkingLimit: f(0, 8), TheoreticalLimit: f(8, 10.4), CrestStatus: present.Status(rng.IntN(4))}
		if rng.IntN(3) == 0 {
			g.Receiver = true
			g.RecvFloor, g.RecvHeight, g.RecvWidth = g.Outlet-f(0, 2), f(0.3, 4), f(0.3, 10)
			g.HoseEnd = g.RecvFloor + f(0, g.RecvHeight)
			g.RecvLevel = g.RecvFloor + f(0, g.RecvHeight)
			g.RecvStop = g.RecvLevel + f(0, g.RecvFloor+g.RecvHeight-g.RecvLevel)
		}
		w, h := 24+rng.IntN(280), 7+rng.IntN(95)
		v := NewSideView(NewStyles(true), model.System(rng.IntN(2)))
		v.SetSize(w, h)
		v.setGeometry(g)
		if why := hoseBreak(ansi.Strip(v.View())); why != "" {
			t.Fatalf("%+v at %d×%d: %s\n%s", g, w, h, why, ansi.Strip(v.View()))
		}
	}
}

// TestSideViewSteady (issue 15 item 3): a few centimetres more or less lift
// keep the drawing's scale (the caption is unchanged, one line moves); a
// lift twice as large rescales it.
func TestSideViewSteady(t *testing.T) {
	v := NewSideView(NewStyles(true), model.SI)
	v.SetSize(44, 21)
	g := svGeometry(t, svJob(nil))
	v.setGeometry(g)
	caption := strings.Split(ansi.Strip(v.View()), "\n")[0]
	for _, d := range []float64{0.03, -0.05, 0.1} {
		h := g
		h.Crest += d
		v.setGeometry(h)
		if got := strings.Split(ansi.Strip(v.View()), "\n")[0]; got != caption {
			t.Errorf("crest %+.2f m rescaled the drawing: %q, was %q", d, got, caption)
		}
	}
	h := g
	h.Crest += 3
	v.setGeometry(h)
	if got := strings.Split(ansi.Strip(v.View()), "\n")[0]; got == caption {
		t.Error("a crest 3 m higher kept the scale")
	}
}

// TestSideViewDatum (issue 14 item 3): the Side view gives its heights from
// the source surface and says so, the datum of the Result pane's crest
// heights: the crest's label is the lift, signed.
func TestSideViewDatum(t *testing.T) {
	j := svJob(nil)
	v := NewSideView(NewStyles(true), model.SI)
	v.SetSize(78, 22)
	v.setGeometry(svGeometry(t, j))
	got := ansi.Strip(v.View())
	for _, want := range []string{"heights from the surface", "crest +0.70 m", "intake −1.90 m", "outlet −2.60 m", "floor −2.00 m"} {
		if !strings.Contains(got, want) {
			t.Errorf("side view lacks %q:\n%s", want, got)
		}
	}
	// A transfer shows the receiving vessel, where its level starts and
	// what it rises to.
	v.setGeometry(svGeometry(t, svTransfer(nil)))
	got = ansi.Strip(v.View())
	for _, want := range []string{"receiver at the start −2.80 m", "receiver rises to", "stops at"} {
		if !strings.Contains(got, want) {
			t.Errorf("transfer lacks %q:\n%s", want, got)
		}
	}
}
