//go:build linux

package tui

import (
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime/pprof"
	"slices"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"
	uv "github.com/charmbracelet/ultraviolet"
	"github.com/charmbracelet/x/vt"

	"drawdown/model"
)

// The pty benchmark runs the real program (tea.NewProgram with its own
// renderer) on a real pseudo-terminal and measures what a keystroke costs
// the machine and the link: CPU per key and bytes per key, against the
// floor — the bytes a renderer needs at least to turn the screen before the
// key into the screen after it (see floorBytes). The screens are those of a
// virtual terminal (github.com/charmbracelet/x/vt) fed the program's own
// output, so the floor is computed from what a terminal really shows.
//
// Run it with (each sub-benchmark types 60 keys; ns/op is wall time per
// key, mostly the wait for the screen to settle, and means nothing):
//
//	go test ./tui -run '^$' -bench PTY -benchtime 60x -count 3
//
// The program runs in a process of its own, started as main starts it
// (tea.NewProgram with its defaults) on the pseudo-terminal as its
// controlling terminal. Metrics: cpu-µs/key is the program's CPU per key
// (the time its threads spent on a CPU, from /proc) less what the idle
// program uses over the same wall time (measured just before: the
// renderer's frame ticker); B/key and floor-B/key are medians over the
// keys; ×floor is their ratio. "save" runs with saving on, as in the field;
// "nosave" with saving off (Options.NoSave). quit-ms is the time from
// ctrl+c to the end of the process, which saves the job as main does
// (Finish).

// ptyRun is the program running on a pseudo-terminal, in a process of its
// own (this test binary started again as the program: see TestMain), so
// that its CPU is its own and not this harness's.
type ptyRun struct {
	tb     testing.TB
	master *os.File
	cmd    *exec.Cmd
	done   chan struct{}

	mu     sync.Mutex
	buf    []byte
	notify chan struct{} // a token after each read
}

// ptySettle is how long the screen must stay quiet for a key's frame to be
// complete: longer than two frames of the renderer (60 per second).
const ptySettle = 35 * time.Millisecond

// ptyChildEnv names the environment variables that make this test binary
// the program: the job ("demo" or "10k-readings"), and the job folder
// (empty: saving off).
const (
	ptyChildJob = "DRAWDOWN_PTY_CHILD_JOB"
	ptyChildDir = "DRAWDOWN_PTY_CHILD_DIR"
)

// TestMain runs the program instead of the tests when started as the pty
// benchmark's child.
func TestMain(m *testing.M) {
	if name := os.Getenv(ptyChildJob); name != "" {
		os.Exit(ptyChild(name, os.Getenv(ptyChildDir)))
	}
	os.Exit(m.Run())
}

// ptyChild runs the screen on this process's terminal as main does
// (tea.NewProgram with its defaults), on a benchmark job.
func ptyChild(name, dir string) int {
	paneSettle = paneSettleTime // as in the field (the other tests set 0)
	if name == ptyNullJob {
		if _, err := tea.NewProgram(nullModel{}).Run(); err != nil {
			return 1
		}
		return 0
	}
	var job model.Job
	for _, j := range benchJobs() {
		if j.name == name {
			job = j.job
		}
	}
	start := Start{Job: job}
	if dir != "" {
		start.Dir, start.Path = dir, model.NewJobPath(dir, "bench")
	}
	m := New(Options{Start: start, NoSave: dir == "", Loc: time.UTC})
	// DRAWDOWN_PTY_CHILD_PROF=FILE writes the program's CPU profile (at
	// pprof's 100 Hz), of the last program started: select one run, e.g.
	// -bench 'PTY/80x24/10k-readings/^save$/typing$' -benchtime 600x.
	if p := os.Getenv("DRAWDOWN_PTY_CHILD_PROF"); p != "" {
		if f, err := os.Create(p); err == nil {
			_ = pprof.StartCPUProfile(f)
			defer pprof.StopCPUProfile()
		}
	}
	final, err := tea.NewProgram(m).Run()
	if err != nil {
		return 1
	}
	// As main ends: the job written whole within the bounded wait.
	if fm, ok := final.(*Model); ok {
		_ = Finish(fm, "")
	}
	return 0
}

// ptyNullJob names the null program: the floor of the framework itself.
const ptyNullJob = "null"

// nullModel is a program that does nothing but count keys: a full screen
// of text whose one changing cell is the count. Its CPU per key is what the
// terminal, the renderer and the Go runtime cost on this machine before any
// work of drawdown's.
type nullModel struct{ n, w, h int }

func (m nullModel) Init() tea.Cmd { return nil }

func (m nullModel) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case tea.KeyPressMsg:
		if msg.String() == "ctrl+c" {
			return m, tea.Quit
		}
		m.n++
	case tea.WindowSizeMsg:
		m.w, m.h = msg.Width, msg.Height
	}
	return m, nil
}

func (m nullModel) View() tea.View {
	line := strings.Repeat("x", max(m.w-1, 0))
	rows := make([]string, max(m.h, 1))
	for i := range rows {
		rows[i] = line
	}
	rows[0] = strconv.Itoa(m.n%10) + line[min(1, len(line)):]
	v := tea.NewView(strings.Join(rows, "\n"))
	v.AltScreen = true
	return v
}

func startPTY(tb testing.TB, cols, rows int, job string, save bool) *ptyRun {
	tb.Helper()
	master, slave := openPTY(tb, cols, rows)
	defer slave.Close()
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), "TERM=xterm-256color", "COLORTERM=", ptyChildJob+"="+job)
	if save {
		cmd.Env = append(cmd.Env, ptyChildDir+"="+tb.TempDir())
	}
	cmd.Stdin, cmd.Stdout, cmd.Stderr = slave, slave, slave
	cmd.SysProcAttr = &syscall.SysProcAttr{Setsid: true, Setctty: true, Ctty: 0}
	if err := cmd.Start(); err != nil {
		master.Close()
		tb.Fatal(err)
	}
	r := &ptyRun{tb: tb, master: master, cmd: cmd, done: make(chan struct{}), notify: make(chan struct{}, 1)}
	go func() { _ = cmd.Wait(); close(r.done) }()
	go r.read()
	// The first frame, then quiet.
	if !r.waitBytes(0, 5*time.Second) {
		r.stop()
		tb.Fatal("no first frame within 5 s")
	}
	r.settle(300 * time.Millisecond)
	return r
}

func (r *ptyRun) read() {
	b := make([]byte, 64<<10)
	for {
		n, err := r.master.Read(b)
		if n > 0 {
			r.mu.Lock()
			r.buf = append(r.buf, b[:n]...)
			r.mu.Unlock()
			select {
			case r.notify <- struct{}{}:
			default:
			}
		}
		if err != nil {
			return
		}
	}
}

func (r *ptyRun) size() int {
	r.mu.Lock()
	defer r.mu.Unlock()
	return len(r.buf)
}

// output is everything written so far.
func (r *ptyRun) output() []byte {
	r.mu.Lock()
	defer r.mu.Unlock()
	return slices.Clone(r.buf)
}

// waitBytes waits until more than n bytes have come, at most d.
func (r *ptyRun) waitBytes(n int, d time.Duration) bool {
	t := time.NewTimer(d)
	defer t.Stop()
	for r.size() <= n {
		select {
		case <-r.notify:
		case <-t.C:
			return false
		}
	}
	return true
}

// settle waits until nothing has been written for quiet.
func (r *ptyRun) settle(quiet time.Duration) {
	t := time.NewTimer(quiet)
	defer t.Stop()
	for {
		select {
		case <-r.notify:
			t.Reset(quiet)
		case <-t.C:
			return
		}
	}
}

// key types s and waits for its frame: the first byte (at most 1 s; a key
// that changes nothing writes nothing) and then ptySettle of quiet. It
// returns where the key's bytes start and end in the output.
func (r *ptyRun) key(s string) (from, to int) {
	from = r.size()
	if _, err := r.master.WriteString(s); err != nil {
		r.tb.Fatal(err)
	}
	if r.waitBytes(from, time.Second) {
		r.settle(ptySettle)
	}
	return from, r.size()
}

// cpu is the program's CPU time so far: the sum over its threads of the
// time on a CPU (/proc/PID/task/TID/schedstat, in nanoseconds).
func (r *ptyRun) cpu() time.Duration {
	tasks, _ := filepath.Glob("/proc/" + strconv.Itoa(r.cmd.Process.Pid) + "/task/*/schedstat")
	var sum int64
	for _, t := range tasks {
		b, err := os.ReadFile(t)
		if err != nil {
			continue
		}
		if f := strings.Fields(string(b)); len(f) > 0 {
			n, _ := strconv.ParseInt(f[0], 10, 64)
			sum += n
		}
	}
	return time.Duration(sum)
}

// switches is the program's context switches so far, over its threads.
func (r *ptyRun) switches() int {
	tasks, _ := filepath.Glob("/proc/" + strconv.Itoa(r.cmd.Process.Pid) + "/task/*/status")
	n := 0
	for _, t := range tasks {
		b, err := os.ReadFile(t)
		if err != nil {
			continue
		}
		for _, l := range strings.Split(string(b), "\n") {
			if strings.HasPrefix(l, "voluntary_ctxt_switches:") || strings.HasPrefix(l, "nonvoluntary_ctxt_switches:") {
				v, _ := strconv.Atoi(strings.TrimSpace(l[strings.Index(l, ":")+1:]))
				n += v
			}
		}
	}
	return n
}

// stop quits the program (ctrl+c) and returns how long it took to end.
func (r *ptyRun) stop() time.Duration {
	t0 := time.Now()
	_, _ = r.master.WriteString("\x03")
	select {
	case <-r.done:
	case <-time.After(5 * time.Second):
		_ = r.cmd.Process.Kill()
		<-r.done
	}
	d := time.Since(t0)
	r.master.Close()
	return d
}

// ptyScenario is one thing a technician does, as keys: setup keys (not
// measured) and then a cycle of keys repeated for the measurement.
type ptyScenario struct {
	name  string
	setup []string
	cycle []string
}

// The keys, as the terminal sends them.
const (
	ptyEnter = "\r"
	ptyBS    = "\x7f"
	ptyRight = "\x1b[C"
)

var ptyScenarios = []ptyScenario{
	// Hose length "12 m" made "12.", then a digit typed and erased, again
	// and again: each key gives a new length (12.5 m, 12 m, 12.8 m …).
	{"typing", []string{"j", ptyEnter, ptyRight, ptyBS, ptyBS, "."},
		[]string{"5", ptyBS, "8", ptyBS, "3", ptyBS, "4", ptyBS}},
	// The same typing with the Log in the lower strip (on a wide screen:
	// at 80×24 only the form shows).
	{"typing-log", []string{"9", "1", "j", ptyEnter, ptyRight, ptyBS, ptyBS, "."},
		[]string{"5", ptyBS, "8", ptyBS, "3", ptyBS, "4", ptyBS}},
	// Navigate mode: down three fields and up again.
	{"moving", nil, []string{"j", "j", "j", "k", "k", "k"}},
	// Through the views and back to the first form.
	{"panes", nil, []string{"5", "6", "7", "8", "9", "1"}},
	// SI ⇄ US in navigate mode.
	{"units", nil, []string{"u"}},
	// Up and down the checklist, over the step with the long note.
	{"checklist", []string{"8"}, []string{"j", "k"}},
}

// benchJobs are the demo job and the demo job with 10,000 level readings
// (and their log lines) and a 100 KB note on the first checklist step.
func benchJobs() []struct {
	name string
	job  model.Job
} {
	big := model.DemoJob()
	t0 := time.Date(2026, 5, 4, 8, 0, 0, 0, time.UTC)
	for i := 0; i < 10000; i++ {
		at := t0.Add(time.Duration(i) * 10 * time.Second)
		lv := 0.9 - 0.00005*float64(i)
		big.Readings = append(big.Readings, model.Reading{At: at, Level: lv})
		big.AddLog(at, "level reading "+strconv.FormatFloat(lv, 'f', 3, 64)+" m")
	}
	if len(big.Checklist.Steps) > 0 {
		note := strings.Repeat("gas reading 0 % LEL at the rim, permit 4411 seen, crew briefed; ", 100<<10/64)
		_ = big.Checklist.SetNote(big.Checklist.Steps[0].ID, note)
	}
	return []struct {
		name string
		job  model.Job
	}{{"demo", model.DemoJob()}, {"10k-readings", big}}
}

// BenchmarkPTY: CPU and bytes per key of the real program, per size, job,
// saving on or off (NoSave), and scenario; and of the null program (the
// framework's own floor on this machine). See the top of this file.
func BenchmarkPTY(b *testing.B) {
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		name := strconv.Itoa(size[0]) + "x" + strconv.Itoa(size[1]) + "/null"
		b.Run(name, func(b *testing.B) {
			benchPTY(b, size[0], size[1], ptyNullJob, false, ptyScenario{name: "null", cycle: []string{"j"}})
		})
		for _, j := range benchJobs() {
			for _, save := range []bool{false, true} {
				for _, sc := range ptyScenarios {
					name := strconv.Itoa(size[0]) + "x" + strconv.Itoa(size[1]) + "/" + j.name + "/"
					if save {
						name += "save/"
					} else {
						name += "nosave/"
					}
					b.Run(name+sc.name, func(b *testing.B) { benchPTY(b, size[0], size[1], j.name, save, sc) })
				}
			}
		}
	}
}

func benchPTY(b *testing.B, cols, rows int, job string, save bool, sc ptyScenario) {
	r := startPTY(b, cols, rows, job, save)
	stopped := false
	defer func() {
		if !stopped {
			r.stop()
		}
	}()
	for _, k := range sc.setup {
		r.key(k)
	}
	// The program's CPU while idle, over a quiet stretch.
	c0, w0, s0 := r.cpu(), time.Now(), r.switches()
	time.Sleep(300 * time.Millisecond)
	idleRate := float64(r.cpu()-c0) / float64(time.Since(w0))
	idleSw := float64(r.switches()-s0) / float64(time.Since(w0))

	type span struct{ from, to int }
	spans := make([]span, 0, b.N)
	b.ResetTimer()
	c0, w0, s0 = r.cpu(), time.Now(), r.switches()
	for i := 0; i < b.N; i++ {
		f, t := r.key(sc.cycle[i%len(sc.cycle)])
		spans = append(spans, span{f, t})
	}
	cpu := float64(r.cpu() - c0)
	sw := float64(r.switches() - s0)
	wall := float64(time.Since(w0))
	b.StopTimer()
	net := max(cpu-idleRate*wall, 0)
	b.ReportMetric(net/float64(b.N)/1e3, "cpu-µs/key")
	b.ReportMetric(max(sw-idleSw*wall, 0)/float64(b.N), "switches/key")
	// Quit: ctrl+c until the process has ended (with saving on, the job
	// written whole within Finish's bounded wait).
	stopped = true
	b.ReportMetric(float64(r.stop())/1e6, "quit-ms")

	// Bytes against the floor: replay the output into a virtual terminal,
	// snapshotting the screen at each key's start and end.
	out := r.output()
	emu := newScreen(cols, rows)
	pos := 0
	var sent, floor []int
	for _, s := range spans {
		_, _ = emu.Write(out[pos:s.from])
		before := snapScreen(emu)
		_, _ = emu.Write(out[s.from:s.to])
		after := snapScreen(emu)
		pos = s.to
		sent = append(sent, s.to-s.from)
		floor = append(floor, floorBytes(before, after))
	}
	ms, mf := median(sent), median(floor)
	b.ReportMetric(float64(ms), "B/key")
	b.ReportMetric(float64(mf), "floor-B/key")
	if mf > 0 {
		b.ReportMetric(float64(ms)/float64(mf), "×floor")
	}
}

// newScreen is a virtual terminal whose answers to the program's queries
// are read and dropped. It is never closed: vt v0.1.0's Close races with a
// Read in progress, and the reading goroutine blocks harmlessly until the
// test binary ends.
func newScreen(w, h int) *vt.Emulator {
	emu := vt.NewEmulator(w, h)
	go func() { _, _ = io.Copy(io.Discard, emu) }()
	return emu
}

func median(v []int) int {
	if len(v) == 0 {
		return 0
	}
	s := slices.Clone(v)
	slices.Sort(s)
	return s[len(s)/2]
}

// screenSnap is what a terminal shows: cells and the cursor.
type screenSnap struct {
	w, h      int
	cells     []uv.Cell
	cx, cy    int
	cursorOff bool
}

func snapScreen(e *vt.Emulator) screenSnap {
	w, h := e.Width(), e.Height()
	s := screenSnap{w: w, h: h, cells: make([]uv.Cell, w*h)}
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			if c := e.CellAt(x, y); c != nil {
				s.cells[y*w+x] = *c
			}
		}
	}
	p := e.CursorPosition()
	s.cx, s.cy, s.cursorOff = p.X, p.Y, e.CursorHidden()
	return s
}

// cellEqual compares what two cells show.
func cellEqual(a, b *uv.Cell) bool {
	if a.Width != b.Width || a.Content != b.Content || !a.Link.Equal(&b.Link) {
		return false
	}
	return a.Style.Equal(&b.Style)
}

func cellContent(c *uv.Cell) string {
	if c.Content == "" {
		return " "
	}
	return c.Content
}

// sgrCost is the bytes to change the pen from one style to another: the
// cheaper of the difference and a reset followed by the new style.
func sgrCost(from, to *uv.Style) int {
	if from.Equal(to) {
		return 0
	}
	d := len(uv.StyleDiff(from, to))
	if to.IsZero() {
		return min(d, 3)
	}
	return min(d, 3+len(to.String()))
}

// moveCost is the bytes of the cheapest cursor move from (x0, y0) to (x1, y1)
// with CUP, CHA, CUF, CUB, CUU, CUD, CR and LF.
func moveCost(x0, y0, x1, y1 int) int {
	if x0 == x1 && y0 == y1 {
		return 0
	}
	num := func(n int) int { // parameter digits; 1 is left out
		if n == 1 {
			return 0
		}
		return len(strconv.Itoa(n))
	}
	best := 3 + num(y1+1) + 1 + num(x1+1) // ESC [ row ; col H
	if x1 == 0 && y1 == 0 {
		best = 3
	}
	dy := y1 - y0
	horiz := func(from int) int { // on the right row, from column from
		switch {
		case x1 == from:
			return 0
		case x1 == 0:
			return 1 // CR
		}
		c := 3 + num(abs(x1-from)) // CUF/CUB
		return min(c, 3+num(x1+1)) // CHA
	}
	switch {
	case dy == 0:
		best = min(best, horiz(x0))
	case dy > 0 && dy <= 3:
		best = min(best, dy+horiz(x0)) // LF keeps the column
	}
	if dy != 0 {
		best = min(best, 3+num(abs(dy))+horiz(x0)) // CUU/CUD
	}
	return best
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// floorBytes is the fewest bytes a renderer needs to turn screen a into
// screen b: for each row, the cells that change, written with the least
// pen change (SGR) before each, equal ASCII cells in a row as one cell and
// a repeat (REP) and blanks as an erase (ECH) where that is shorter; between
// two changed runs on a row, the
// cheaper of a cursor move and writing the unchanged cells again; a cursor
// move (the cheapest of the usual sequences) to each run; a run of blank
// cells reaching the end of the row may be erased (EL) instead; at the end
// the pen is reset, and the cursor moved and shown or hidden as b has it.
// Hyperlinks are not counted (the screen uses none).
func floorBytes(a, b screenSnap) int {
	if a.w != b.w || a.h != b.h {
		return 0
	}
	w := a.w
	total := 0
	var pen uv.Style
	cx, cy := a.cx, a.cy
	blank := func(c *uv.Cell) bool { return cellContent(c) == " " && c.Style.IsZero() && c.Width <= 1 }
	for y := 0; y < b.h; y++ {
		row := b.cells[y*w : (y+1)*w]
		old := a.cells[y*w : (y+1)*w]
		x := 0
		for x < w {
			if cellEqual(&row[x], &old[x]) || row[x].Width == 0 && row[x].Content == "" {
				x++
				continue
			}
			// A changed run starts at x; is the rest of the row blank?
			rest := true
			for k := x; k < w; k++ {
				if !blank(&row[k]) {
					rest = false
					break
				}
			}
			// Get there: a move, or rewriting the cells in between on this row.
			mv := moveCost(cx, cy, x, y)
			if cy == y && cx < x {
				gap, p := 0, pen
				for k := cx; k < x; k++ {
					gap += sgrCost(&p, &row[k].Style) + len(cellContent(&row[k]))
					p = row[k].Style
				}
				if gap < mv {
					mv, pen = gap, p
				}
			}
			total += mv
			cx, cy = x, y
			if rest {
				total += sgrCost(&pen, &uv.Style{}) + 3 // reset if needed, EL
				pen = uv.Style{}
				break
			}
			// Write the run of changed cells; k equal cells in a row may
			// be one cell and a repeat (REP), blanks an erase (ECH).
			for x < w && !cellEqual(&row[x], &old[x]) {
				c := &row[x]
				if c.Width == 0 && c.Content == "" { // the second half of a wide cell
					x++
					continue
				}
				k := 1
				for x+k < w && !cellEqual(&row[x+k], &old[x+k]) && cellEqual(&row[x+k], c) {
					k++
				}
				cost := sgrCost(&pen, &c.Style) + len(cellContent(c))
				if k > 1 && c.Width == 1 {
					// REP repeats only plain ASCII reliably (some terminals
					// repeat other characters wrongly), so only ASCII counts.
					rep := (k - 1) * len(cellContent(c))
					if ch := cellContent(c); len(ch) == 1 && ch[0] >= 0x20 && ch[0] < 0x7f {
						rep = min(rep, 3+len(strconv.Itoa(k-1)))
					}
					cost += rep
					if blank(c) {
						ech := sgrCost(&pen, &uv.Style{}) + 3 + len(strconv.Itoa(k))
						if x+k < w && !cellEqual(&row[x+k], &old[x+k]) {
							ech += 3 + len(strconv.Itoa(k)) // and step over them
						}
						cost = min(cost, ech)
					}
				} else {
					k = 1
				}
				total += cost
				pen = c.Style
				x += k * max(c.Width, 1)
				cx = x
			}
		}
	}
	total += sgrCost(&pen, &uv.Style{})
	if !b.cursorOff {
		total += moveCost(cx, cy, b.cx, b.cy)
	}
	if a.cursorOff != b.cursorOff {
		total += 6 // ESC [ ? 2 5 h / l
	}
	return total
}

// TestPTYScreenIsFrame: what a terminal shows after a run of keys through
// the real program and its renderer is the frame the model drew, cell for
// cell, at 80×24, 120×40, 200×60 and 300×100: the renderer's shortcuts
// (repeats, erases, inserted and deleted cells, scrolling) leave no gap and
// no stale cell in the drawings. The terminal is the virtual one the
// benchmark uses; the expected frame is the same job and keys run here.
func TestPTYScreenIsFrame(t *testing.T) {
	if testing.Short() {
		t.Skip("pty run: skipped with -short")
	}
	keys := []string{"5", "6", "7", "8", "9", "1", "j", "j", "k", "u", "5", "u"}
	for _, size := range [][2]int{{80, 24}, {120, 40}, {200, 60}, {300, 100}} {
		w, h := size[0], size[1]
		r := startPTY(t, w, h, "demo", false)
		m := New(Options{Start: Start{Job: model.DemoJob()}, NoSave: true, Loc: time.UTC})
		m = send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
		for _, k := range keys {
			r.key(k)
			m = press(t, m, k)
		}
		r.settle(200 * time.Millisecond)
		emu := newScreen(w, h)
		_, _ = emu.Write(r.output())
		r.stop()
		got, want := strings.Split(emu.String(), "\n"), strings.Split(frame(m), "\n")
		for y := 0; y < h; y++ {
			var g, x string
			if y < len(got) {
				g = strings.TrimRight(got[y], " ")
			}
			if y < len(want) {
				x = strings.TrimRight(want[y], " ")
			}
			if g != x {
				t.Errorf("%d×%d row %d on the terminal:\n%q\nthe frame drawn:\n%q", w, h, y, g, x)
			}
		}
	}
}
