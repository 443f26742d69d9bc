//go:build linux

package tui

import (
	"bytes"
	"os"
	"slices"
	"strconv"
	"sync"
	"syscall"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"
	"golang.org/x/sys/unix"

	"drawdown/model"
)

// openPTY opens a pseudo-terminal pair of the given size (Linux /dev/ptmx).
func openPTY(t testing.TB, cols, rows int) (master, slave *os.File) {
	t.Helper()
	m, err := os.OpenFile("/dev/ptmx", os.O_RDWR|syscall.O_NOCTTY, 0)
	if err != nil {
		t.Fatal("no pseudo-terminal here:", err)
	}
	if err := unix.IoctlSetPointerInt(int(m.Fd()), unix.TIOCSPTLCK, 0); err != nil {
		m.Close()
		t.Fatal("cannot unlock the pseudo-terminal:", err)
	}
	n, err := unix.IoctlGetInt(int(m.Fd()), unix.TIOCGPTN)
	if err != nil {
		m.Close()
		t.Fatal("cannot name the pseudo-terminal:", err)
	}
	s, err := os.OpenFile("/dev/pts/"+strconv.Itoa(n), os.O_RDWR|syscall.O_NOCTTY, 0)
	if err != nil {
		m.Close()
		t.Fatal("cannot open the pseudo-terminal's other end:", err)
	}
	ws := &unix.Winsize{Row: uint16(rows), Col: uint16(cols)}
	if err := unix.IoctlSetWinsize(int(s.Fd()), unix.TIOCSWINSZ, ws); err != nil {
		t.Fatal(err)
	}
	return m, s
}

// processCPU is the CPU time this process has used (user and system).
func processCPU() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// ptyRecorder collects what the program writes to the terminal.
type ptyRecorder struct {
	mu   sync.Mutex
	buf  bytes.Buffer
	last time.Time
}

func (r *ptyRecorder) read(f *os.File) {
	b := make([]byte, 64<<10)
	for {
		n, err := f.Read(b)
		if n > 0 {
			r.mu.Lock()
			r.buf.Write(b[:n])
			r.last = time.Now()
			r.mu.Unlock()
		}
		if err != nil {
			return
		}
	}
}

func (r *ptyRecorder) size() int {
	r.mu.Lock()
	defer r.mu.Unlock()
	return r.buf.Len()
}

func (r *ptyRecorder) contains(s string) bool {
	r.mu.Lock()
	defer r.mu.Unlock()
	return bytes.Contains(r.buf.Bytes(), []byte(s))
}

// quiet waits until nothing has been written for d (at most max).
func (r *ptyRecorder) quiet(d, maxWait time.Duration) {
	end := time.Now().Add(maxWait)
	for time.Now().Before(end) {
		time.Sleep(d / 4)
		r.mu.Lock()
		idle := time.Since(r.last)
		r.mu.Unlock()
		if idle >= d {
			return
		}
	}
}

// TestPTYBytes runs the screen on a real pseudo-terminal at 80×24 whose
// other end never answers the terminal's capability queries, as over a slow
// SSH link, and measures what a technician's link carries: the time to the
// first frame, the bytes written per keystroke while typing in a field, and
// the bytes written while idle. Targets (issue 5): first frame within
// 100 ms, a median of at most 300 bytes per keystroke, nothing while idle.
// It ends as an end-to-end run: a real resize below the minimum and back,
// ctrl+c, and the exit save of what was typed.
func TestPTYBytes(t *testing.T) {
	if testing.Short() {
		t.Skip("pty measurement: skipped with -short")
	}
	master, slave := openPTY(t, MinWidth, MinHeight)
	defer master.Close()
	defer slave.Close()

	// Saving is on (into a temporary folder), as in the field: the top
	// bar's save mark changes with each keystroke too.
	t.Setenv("DRAWDOWN_HOME", t.TempDir())
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	m := New(Options{Start: Start{Job: model.DemoJob(), Dir: dir, Path: model.NewJobPath(dir, "pty")}})
	rec := &ptyRecorder{}
	go rec.read(master)
	p := tea.NewProgram(m, tea.WithInput(slave), tea.WithOutput(slave),
		tea.WithEnvironment([]string{"TERM=xterm-256color", "COLORTERM="}), tea.WithoutSignalHandler())
	start := time.Now()
	type result struct {
		m   tea.Model
		err error
	}
	done := make(chan result, 1)
	go func() { fm, err := p.Run(); done <- result{fm, err} }()
	finished := false
	defer func() {
		if !finished {
			p.Kill()
			<-done
		}
	}()

	var first time.Duration
	for time.Since(start) < 3*time.Second {
		if rec.contains("Bund B2") {
			first = time.Since(start)
			break
		}
		time.Sleep(time.Millisecond)
	}
	if first == 0 {
		t.Fatal("no first frame within 3 s")
	}
	rec.quiet(200*time.Millisecond, 2*time.Second)

	// send types one key and counts what the screen writes for it: it waits
	// for the first byte (each of these keys changes the screen), then for
	// 100 ms of quiet, so that a slow machine does not split or merge frames.
	send := func(s string) int {
		before := rec.size()
		if _, err := master.WriteString(s); err != nil {
			t.Fatal(err)
		}
		for end := time.Now().Add(2 * time.Second); rec.size() == before && time.Now().Before(end); {
			time.Sleep(time.Millisecond)
		}
		rec.quiet(100*time.Millisecond, 2*time.Second)
		return rec.size() - before
	}
	send("j")      // Hose length
	send("\r")     // start typing: the whole text is selected
	send("\x1b[C") // → keeps it for editing
	// Turn "12 m" into "12.", then type a digit and erase it, again and
	// again: each keystroke gives a new hose length (12.5 m, 12 m, 12.8 m,
	// 12 m …), so the Result pane's figures change every time, as when a
	// technician tries lengths. Then a few keys that make the field invalid
	// and valid again.
	send("\x7f")
	send("\x7f")
	send(".")
	var counts []int
	cpu0 := processCPU()
	for i := 0; i < 10; i++ {
		for _, d := range []string{"5", "\x7f", "8", "\x7f", "0", "\x7f", "4", "\x7f"} {
			counts = append(counts, send(d))
		}
	}
	typing := append([]int(nil), counts...)
	cpuPerKey := (processCPU() - cpu0) / time.Duration(len(counts))
	for i := 0; i < 5; i++ {
		counts = append(counts, send("x"), send("\x7f")) // "12.x" is invalid
	}
	t.Logf("bytes per keystroke in order: %v", counts)
	slices.Sort(counts)
	median := counts[len(counts)/2]
	slices.Sort(typing)

	rec.quiet(500*time.Millisecond, 3*time.Second)
	before := rec.size()
	time.Sleep(2 * time.Second)
	idle := rec.size() - before

	t.Logf("first frame %v; bytes per keystroke at 80×24: median %d, min %d, max %d over %d keys "+
		"(valid digits only: median %d, max %d); idle 2 s: %d bytes; CPU per typed key %v (this process: the screen, its saves and this test's reader)",
		first.Round(time.Millisecond), median, counts[0], counts[len(counts)-1], len(counts),
		typing[len(typing)/2], typing[len(typing)-1], idle, cpuPerKey.Round(10*time.Microsecond))
	if median > 300 {
		t.Errorf("median %d bytes per keystroke; target ≤ 300", median)
	}
	if idle != 0 {
		t.Errorf("%d bytes written while idle; target 0", idle)
	}
	// The first frame's time (target 100 ms) is a figure, logged above, not
	// a timed assertion: on a loaded machine it is seconds, and a test that
	// fails by chance stops good work landing. It must come within 3 s.

	// The terminal shrinks below 80×24 and grows back (a real resize: the
	// pseudo-terminal's size and SIGWINCH), then the technician quits with
	// ctrl+c; the job returned by the program is saved at exit.
	resize := func(cols, rows int) {
		ws := &unix.Winsize{Row: uint16(rows), Col: uint16(cols)}
		if err := unix.IoctlSetWinsize(int(slave.Fd()), unix.TIOCSWINSZ, ws); err != nil {
			t.Fatal(err)
		}
		_ = syscall.Kill(os.Getpid(), syscall.SIGWINCH)
	}
	waitFor := func(s string) {
		t.Helper()
		for end := time.Now().Add(3 * time.Second); time.Now().Before(end); time.Sleep(5 * time.Millisecond) {
			if rec.contains(s) {
				return
			}
		}
		t.Errorf("screen never showed %q", s)
	}
	resize(30, 12)
	waitFor("now 30×12")
	resize(MinWidth, MinHeight)
	rec.quiet(200*time.Millisecond, 2*time.Second)
	if _, err := master.WriteString("\x03"); err != nil {
		t.Fatal(err)
	}
	var res result
	select {
	case res = <-done:
		finished = true
	case <-time.After(5 * time.Second):
		t.Fatal("ctrl+c did not end the program")
	}
	fm, ok := res.m.(*Model)
	if !ok {
		t.Fatalf("program returned %T (%v)", res.m, res.err)
	}
	if err := Finish(fm, ""); err != nil {
		t.Fatal(err)
	}
	saved, err := model.Load(fm.Path())
	if err != nil {
		t.Fatal(err)
	}
	if got := saved.Inputs[model.FieldHoseLength]; got != "12." {
		t.Errorf("saved hose length %q, typed \"12.\"", got)
	}
}
