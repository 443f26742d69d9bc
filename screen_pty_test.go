//go:build linux

package main

import (
	"bytes"
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"golang.org/x/sys/unix"

	"drawdown/model"
)

// The real program on a real pseudo-terminal: this test binary run as
// drawdown (TestMain), with the pty's other end as its controlling
// terminal, so that keys, signals, a closed terminal and a kill reach it as
// they would in the field.

// ptyPair opens a pseudo-terminal of the given size (Linux /dev/ptmx).
func ptyPair(t testing.TB, cols, rows int) (master, slave *os.File) {
	t.Helper()
	// Non-blocking, so that the runtime poller takes it and a read can be
	// stopped (hangUp): a blocked read would keep the pty open.
	fd, err := syscall.Open("/dev/ptmx", os.O_RDWR|syscall.O_NOCTTY|syscall.O_NONBLOCK|syscall.O_CLOEXEC, 0)
	if err != nil {
		t.Fatal("no pseudo-terminal here:", err)
	}
	m := os.NewFile(uintptr(fd), "/dev/ptmx")
	if err := unix.IoctlSetPointerInt(fd, unix.TIOCSPTLCK, 0); err != nil {
		m.Close()
		t.Fatal("cannot unlock the pseudo-terminal:", err)
	}
	n, err := unix.IoctlGetInt(fd, unix.TIOCGPTN)
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

// screen is one run of the program on a pty.
type screen struct {
	t      testing.TB
	cmd    *exec.Cmd
	master *os.File
	home   string
	done   chan struct{}
	// readDone is closed when the reader stops.
	readDone chan struct{}

	mu   sync.Mutex
	out  bytes.Buffer
	last time.Time
}

// startScreen runs drawdown with no arguments on a new pty of cols×rows,
// with DRAWDOWN_HOME=home (made by the caller) and env added; the pty is
// its controlling terminal (closing it sends SIGHUP).
func startScreen(t testing.TB, home string, cols, rows int, env ...string) *screen {
	t.Helper()
	return startScreenOn(t, home, cols, rows, true, env...)
}

// startScreenOn is startScreen; with ctty false the pty is not the
// program's controlling terminal, so that closing it sends no signal and
// the program learns of it only from its input (EIO).
func startScreenOn(t testing.TB, home string, cols, rows int, ctty bool, env ...string) *screen {
	t.Helper()
	master, slave := ptyPair(t, cols, rows)
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	cmd := exec.CommandContext(ctx, os.Args[0])
	cmd.Env = append(os.Environ(), "DRAWDOWN_TEST_MAIN=1", "GORACE=atexit_sleep_ms=0", "DRAWDOWN_HOME="+home,
		"XDG_CONFIG_HOME="+filepath.Join(home, "config"), "TERM=xterm-256color", "COLORTERM=")
	cmd.Env = append(cmd.Env, env...)
	cmd.Stdin, cmd.Stdout, cmd.Stderr = slave, slave, slave
	if f := os.Getenv("DRAWDOWN_TEST_STDERR"); f != "" {
		cmd.Stderr, _ = os.Create(f)
	}
	cmd.SysProcAttr = &syscall.SysProcAttr{Setsid: true, Setctty: ctty, Ctty: 0}
	if err := cmd.Start(); err != nil {
		cancel()
		t.Fatal(err)
	}
	slave.Close()
	s := &screen{t: t, cmd: cmd, master: master, home: home, done: make(chan struct{}), readDone: make(chan struct{})}
	go s.read()
	go func() { cmd.Wait(); cancel(); close(s.done) }()
	t.Cleanup(func() {
		if !s.exited() {
			cmd.Process.Kill()
			<-s.done
		}
		master.Close()
	})
	return s
}

// hangUp closes the terminal's side the test holds, as a terminal
// window or an SSH server does: the reader stops first (a read in flight
// would keep the pty open).
func (s *screen) hangUp() {
	s.master.SetReadDeadline(time.Now())
	<-s.readDone
	s.master.Close()
}

func (s *screen) read() {
	defer close(s.readDone)
	b := make([]byte, 64<<10)
	for {
		n, err := s.master.Read(b)
		if n > 0 {
			s.mu.Lock()
			s.out.Write(b[:n])
			s.last = time.Now()
			s.mu.Unlock()
		}
		if err != nil {
			return
		}
	}
}

func (s *screen) exited() bool {
	select {
	case <-s.done:
		return true
	default:
		return false
	}
}

func (s *screen) size() int {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.out.Len()
}

func (s *screen) contains(text string) bool {
	s.mu.Lock()
	defer s.mu.Unlock()
	return bytes.Contains(s.out.Bytes(), []byte(text))
}

// waitFor waits until the screen has shown text (at most d).
func (s *screen) waitFor(text string, d time.Duration) bool {
	for end := time.Now().Add(d); time.Now().Before(end); time.Sleep(2 * time.Millisecond) {
		if s.contains(text) {
			return true
		}
	}
	return false
}

// quiet waits until nothing has been written for d (at most maxWait).
func (s *screen) quiet(d, maxWait time.Duration) {
	for end := time.Now().Add(maxWait); time.Now().Before(end); {
		time.Sleep(d / 4)
		s.mu.Lock()
		idle := time.Since(s.last)
		s.mu.Unlock()
		if idle >= d {
			return
		}
	}
}

// key types k and waits for the frame it causes (the first byte, then
// quiet for settle); it returns the bytes written.
func (s *screen) key(k string, settle time.Duration) int {
	before := s.size()
	if _, err := s.master.WriteString(k); err != nil {
		s.t.Fatal(err)
	}
	for end := time.Now().Add(2 * time.Second); s.size() == before && time.Now().Before(end); {
		time.Sleep(200 * time.Microsecond)
	}
	s.quiet(settle, 2*time.Second)
	return s.size() - before
}

// send types k without waiting for a frame (a key that changes nothing on
// screen), then waits a little for it to be read.
func (s *screen) send(k string) {
	if _, err := s.master.WriteString(k); err != nil {
		s.t.Fatal(err)
	}
	time.Sleep(20 * time.Millisecond)
}

// quit ends the program as a technician does: Esc (out of any input),
// then ctrl+c; it reports whether the program ended within d.
func (s *screen) quit(d time.Duration) bool {
	s.send("\x1b")
	time.Sleep(100 * time.Millisecond) // past the wait that tells Esc from an escape sequence
	s.master.WriteString("\x03")
	return s.wait(d)
}

// wait waits for the process to end (at most d) and reports whether it did.
func (s *screen) wait(d time.Duration) bool {
	select {
	case <-s.done:
		return true
	case <-time.After(d):
		return false
	}
}

// cpu is the process's CPU time so far (user + system, all threads), from
// /proc/PID/stat in clock ticks.
func (s *screen) cpu() time.Duration {
	b, err := os.ReadFile("/proc/" + strconv.Itoa(s.cmd.Process.Pid) + "/stat")
	if err != nil {
		s.t.Fatal(err)
	}
	// Fields after the command name in parentheses: utime is field 14 and
	// stime 15 (proc(5)).
	rest := string(b[bytes.LastIndexByte(b, ')')+2:])
	f := strings.Fields(rest)
	ut, _ := strconv.ParseInt(f[11], 10, 64)
	st, _ := strconv.ParseInt(f[12], 10, 64)
	const hz = 100 // USER_HZ on Linux
	return time.Duration(ut+st) * time.Second / hz
}

// jobHome makes a data folder whose last job is the demo job with n level
// readings (one a minute, falling within the tank), and returns the folder
// and the job's path.
func jobHome(t testing.TB, n int) (home, path string) {
	t.Helper()
	home = t.TempDir()
	t.Setenv("DRAWDOWN_HOME", home)
	j := model.DemoJob()
	t0 := time.Date(2025, 3, 14, 9, 0, 0, 0, time.UTC)
	for i := range n {
		lvl := 0.35 - 0.30*float64(i)/float64(max(n, 1))
		j.Readings = append(j.Readings, model.Reading{At: t0.Add(time.Duration(i) * time.Minute), Level: lvl})
		j.AddLog(t0.Add(time.Duration(i)*time.Minute), fmt.Sprintf("level reading %.3f m", lvl))
	}
	dir, err := model.JobsDir()
	if err != nil {
		t.Fatal(err)
	}
	path = filepath.Join(dir, "bench.json")
	if err := model.SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	if err := model.SetLastJob(path); err != nil {
		t.Fatal(err)
	}
	return home, path
}

// BenchmarkScreenKey measures what one keystroke costs the real program on
// a pty: CPU time per key (user + system, all threads, from /proc) and
// bytes written per key, typing digits in the hose length (each one a new
// plan) and moving between fields, on the demo job and on jobs with 1,000
// and 10,000 readings, at 80×24. Each b.N is one key; the program starts
// before the timer. The time per op is the wait for each frame and means
// nothing; read cpu-ms/key and B/key. Quit is the time from ctrl+c to the
// process's end.
//
//	go test -run '^$' -bench ScreenKey -benchtime 200x -count 3 .
func BenchmarkScreenKey(b *testing.B) {
	for _, n := range []int{0, 1000, 10000} {
		for _, what := range []string{"type", "move"} {
			b.Run(fmt.Sprintf("readings=%d/%s", n, what), func(b *testing.B) {
				home, _ := jobHome(b, n)
				s := startScreen(b, home, 80, 24)
				if !s.waitFor("Bund B2", 10*time.Second) {
					b.Fatal("no first frame")
				}
				s.quiet(300*time.Millisecond, 5*time.Second)
				keys := []string{"5", "\x7f", "8", "\x7f"}
				if what == "type" {
					// As TestPTYBytes: the hose length "12 m" becomes "12.",
					// and each digit typed and erased is a new plan.
					for _, k := range []string{"j", "\r"} {
						s.key(k, 50*time.Millisecond)
					}
					s.send("\x1b[C") // → keeps the text (nothing changes on screen)
					for _, k := range []string{"\x7f", "\x7f", "."} {
						s.key(k, 50*time.Millisecond)
					}
				} else {
					keys = []string{"j", "k"}
				}
				settle := 30 * time.Millisecond
				cpu0 := s.cpu()
				bytesOut := 0
				b.ResetTimer()
				for i := range b.N {
					bytesOut += s.key(keys[i%len(keys)], settle)
				}
				b.StopTimer()
				cpu := s.cpu() - cpu0
				b.ReportMetric(float64(cpu)/float64(time.Millisecond)/float64(b.N), "cpu-ms/key")
				b.ReportMetric(float64(bytesOut)/float64(b.N), "B/key")
				if what == "type" {
					s.key("\x1b", 50*time.Millisecond)
				}
				t0 := time.Now()
				s.master.WriteString("\x03")
				if !s.wait(10 * time.Second) {
					b.Fatal("ctrl+c did not end the program")
				}
				b.ReportMetric(float64(time.Since(t0))/float64(time.Millisecond), "quit-ms")
			})
		}
	}
}
