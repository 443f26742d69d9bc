//go:build linux

package main

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"drawdown/model"
	"drawdown/serve/sshtest"
)

// crewServer is `drawdown serve` run as its own process (this test binary
// as drawdown, as the screen tests run it), on 127.0.0.1 and a free port.
type crewServer struct {
	cmd  *exec.Cmd
	addr string
	done chan struct{}
}

// startCrewServer serves the job at path to keys, with home as the data
// folder; it returns once the server listens.
func startCrewServer(t testing.TB, home, path string, keys ...sshtest.Key) *crewServer {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	cmd := exec.CommandContext(ctx, os.Args[0], "serve", "--listen", "127.0.0.1:0",
		"--keys", sshtest.KeysFile(t, home, keys...), "--job", path)
	cmd.Env = append(os.Environ(), "DRAWDOWN_TEST_MAIN=1", "GORACE=atexit_sleep_ms=0", "DRAWDOWN_HOME="+home,
		"XDG_CONFIG_HOME="+filepath.Join(home, "config"))
	errOut, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		cancel()
		t.Fatal(err)
	}
	s := &crewServer{cmd: cmd, done: make(chan struct{})}
	addr := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(errOut)
		for sc.Scan() {
			if a, ok := strings.CutPrefix(sc.Text(), "drawdown serve: listening on "); ok {
				a, _, _ = strings.Cut(a, ";")
				addr <- a
			}
		}
	}()
	go func() { cmd.Wait(); cancel(); close(s.done) }()
	t.Cleanup(func() {
		cmd.Process.Kill()
		<-s.done
	})
	select {
	case s.addr = <-addr:
	case <-s.done:
		t.Fatal("the server ended before it listened")
	case <-time.After(20 * time.Second):
		t.Fatal("the server did not listen within 20 s")
	}
	return s
}

// cpu is the server's CPU time so far (user + system, all threads), from
// /proc/PID/stat in clock ticks (proc(5): utime and stime are fields 14
// and 15).
func (s *crewServer) cpu(t testing.TB) time.Duration {
	b, err := os.ReadFile("/proc/" + strconv.Itoa(s.cmd.Process.Pid) + "/stat")
	if err != nil {
		t.Fatal(err)
	}
	f := strings.Fields(string(b[bytes.LastIndexByte(b, ')')+2:]))
	ut, _ := strconv.ParseInt(f[11], 10, 64)
	st, _ := strconv.ParseInt(f[12], 10, 64)
	const hz = 100 // USER_HZ on Linux
	return time.Duration(ut+st) * time.Second / hz
}

// stop ends the server as ctrl+c does and waits for it.
func (s *crewServer) stop(t testing.TB) {
	s.cmd.Process.Signal(syscall.SIGTERM)
	select {
	case <-s.done:
	case <-time.After(10 * time.Second):
		t.Fatal("the server did not stop within 10 s of SIGTERM")
	}
}

// crewJob saves the demo job in home with the hose length selected.
func crewJob(t testing.TB, home string) string {
	t.Helper()
	j := model.DemoJob()
	j.Resume = model.Resume{Pane: "Hose", Field: model.FieldHoseLength}
	path := filepath.Join(home, "jobs", "crew.json")
	if err := model.SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	return path
}

// BenchmarkCrewKeys is 20 crew members typing 100 keys each at once on one
// job over SSH on loopback, each adding 17 level readings in the Log pane
// (9, then r 0.3N enter fourteen times and r 0.3 enter three times). No
// reading may be lost, and each must name who took it. Reported: the bytes
// the server sent a screen per key that screen typed (with the other 19
// typing at once, so each screen also draws their readings), and the
// server's CPU per key typed (its process, all 20 screens, from /proc). Each b.N is the whole round; run it with -benchtime 1x.
func BenchmarkCrewKeys(b *testing.B) {
	const clients, perReading = 20, 17
	keysOf := func() []string {
		k := []string{"9"}
		for i := range 14 {
			k = append(k, "r", "0", ".", "3", strconv.Itoa(i%10), "\r")
		}
		for range 3 {
			k = append(k, "r", "0", ".", "3", "\r")
		}
		return k
	}
	perClient := len(keysOf())
	var bytesPer, cpuPer float64
	for range b.N {
		b.StopTimer()
		home := b.TempDir()
		path := crewJob(b, home)
		var keys []sshtest.Key
		for i := range clients {
			keys = append(keys, sshtest.NewKey(b, fmt.Sprintf("Crew %02d", i+1), ""))
		}
		srv := startCrewServer(b, home, path, keys...)
		screens := make([]*sshtest.Screen, clients)
		for i, k := range keys {
			screens[i] = sshtest.OpenScreen(b, sshtest.Dial(b, srv.addr, k), 80, 24)
		}
		for _, s := range screens {
			if !s.WaitFor("Hose length", 20*time.Second) {
				b.Fatalf("no screen:\n%s", s.Text())
			}
		}
		for _, s := range screens {
			s.Quiet(200*time.Millisecond, 10*time.Second)
		}
		bytes0 := 0
		for _, s := range screens {
			bytes0 += s.Bytes()
		}
		cpu0 := srv.cpu(b)
		b.StartTimer()
		var wg sync.WaitGroup
		for _, s := range screens {
			wg.Go(func() {
				for _, k := range keysOf() {
					s.Type(k)
					time.Sleep(5 * time.Millisecond)
				}
			})
		}
		wg.Wait()
		for _, s := range screens {
			s.Quiet(300*time.Millisecond, 30*time.Second)
		}
		b.StopTimer()
		cpu := srv.cpu(b) - cpu0
		sent := -bytes0
		for _, s := range screens {
			sent += s.Bytes()
		}
		srv.stop(b)
		j, err := model.Load(path)
		if err != nil {
			b.Fatal(err)
		}
		by := map[string]int{}
		if os.Getenv("CREW_DEBUG") != "" {
			for _, e := range j.Log {
				b.Logf("log %s %q", e.By, e.Text)
			}
		}
		for _, r := range j.Readings {
			by[r.By]++
		}
		for _, k := range keys {
			name := strings.TrimSpace(k.Line[strings.LastIndex(k.Line, "Crew"):])
			if by[name] != perReading {
				b.Errorf("%s: %d readings kept, want %d", name, by[name], perReading)
			}
		}
		total := float64(clients * perClient)
		bytesPer = float64(sent) / total
		cpuPer = float64(cpu.Microseconds()) / total
	}
	b.ReportMetric(bytesPer, "B/key/client")
	b.ReportMetric(cpuPer, "server-µs-CPU/key")
}

// TestCrewServerKill kills the server with SIGKILL while a crew member types
// in the hose length: after every kill the job loads with every key the
// job had taken (seen by reading it back, as the next open will), and at
// most the one in flight besides.
func TestCrewServerKill(t *testing.T) {
	rounds := 12
	if testing.Short() {
		rounds = 4
	}
	rng := rand.New(rand.NewPCG(17, 5))
	home := t.TempDir()
	path := crewJob(t, home)
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	kept, lost := 0, 0
	for r := range rounds {
		srv := startCrewServer(t, home, path, ana)
		s := sshtest.OpenScreen(t, sshtest.Dial(t, srv.addr, ana), 80, 24)
		if !s.WaitFor("Hose length", 20*time.Second) {
			t.Fatalf("round %d: no screen:\n%s", r, s.Text())
		}
		s.Quiet(50*time.Millisecond, 2*time.Second)
		j0, err := model.Load(path)
		if err != nil {
			t.Fatal(err)
		}
		base := j0.Inputs[model.FieldHoseLength]
		s.Type("\r")
		time.Sleep(30 * time.Millisecond)
		s.Type("\x1b[C") // keep the text, type after it
		time.Sleep(30 * time.Millisecond)
		typed := base
		for range 1 + rng.IntN(4) {
			d := strconv.Itoa(rng.IntN(10))
			s.Type(d)
			typed += d
			if !waitLoaded(path, typed, 5*time.Second) {
				t.Fatalf("round %d: the job never held %q", r, typed)
			}
		}
		d := strconv.Itoa(rng.IntN(10))
		s.Type(d)
		for end := time.Now().Add(time.Duration(rng.Int64N(int64(8 * time.Millisecond)))); time.Now().Before(end); {
		}
		srv.cmd.Process.Signal(syscall.SIGKILL)
		<-srv.done
		j, err := model.Load(path)
		if err != nil {
			t.Fatalf("round %d: the job does not load after the kill: %v", r, err)
		}
		switch got := j.Inputs[model.FieldHoseLength]; got {
		case typed + d:
			kept++
		case typed:
			lost++
		default:
			t.Fatalf("round %d: the job holds %q; want %q, or %q with the key in flight", r, got, typed, typed+d)
		}
		// The next round starts from what the job holds (a stale lock is
		// cleared at the next open); keep the field short.
		j.Inputs[model.FieldHoseLength] = "12"
		os.Remove(model.JournalPath(path))
		if err := model.SaveAtomic(path, j); err != nil {
			t.Fatal(err)
		}
	}
	t.Logf("%d rounds: the key in flight kept %d times, lost %d times", rounds, kept, lost)
}

// waitLoaded waits until the job at path, read as the next open reads it,
// holds text as its hose length.
func waitLoaded(path, text string, d time.Duration) bool {
	for end := time.Now().Add(d); time.Now().Before(end); time.Sleep(2 * time.Millisecond) {
		if j, err := model.Load(path); err == nil && j.Inputs[model.FieldHoseLength] == text {
			return true
		}
	}
	return false
}

// TestScreenJoinsCrew: a second drawdown on the laptop, on the job the
// crew server holds, joins the crew's job instead of opening it read-only:
// its edit reaches an SSH screen, and the job file holds it.
func TestScreenJoinsCrew(t *testing.T) {
	home, path := jobHome(t, 0)
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	srv := startCrewServer(t, home, path, ana)
	a := sshtest.OpenScreen(t, sshtest.Dial(t, srv.addr, ana), 100, 30)
	if !a.WaitFor("Hose length", 20*time.Second) {
		t.Fatalf("no SSH screen:\n%s", a.Text())
	}
	s := startScreen(t, home, 100, 30)
	if !s.waitFor("shared", 10*time.Second) {
		t.Fatalf("the local screen did not join the crew's job")
	}
	if !a.WaitFor("(here)", 5*time.Second) {
		t.Fatalf("the SSH screen does not name the local one:\n%s", a.Text())
	}
	s.key("1", 20*time.Millisecond) // the Hose pane; the bore is the first field
	s.key("\r", 20*time.Millisecond)
	s.key("44", 20*time.Millisecond)
	s.key("\r", 20*time.Millisecond)
	if !a.WaitFor("= 44.0 mm", 5*time.Second) {
		t.Fatalf("the SSH screen does not show the local edit:\n%s", a.Text())
	}
	s.key("q", 20*time.Millisecond)
	if !s.wait(5 * time.Second) {
		t.Fatal("the local screen did not end on q")
	}
	srv.stop(t)
	j, err := model.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if got := j.Inputs[model.FieldHoseID]; got != "44" {
		t.Errorf("the job file holds the bore %q, want 44", got)
	}
}
