package serve

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	gossh "golang.org/x/crypto/ssh"

	"drawdown/model"
	"drawdown/serve/sshtest"
)

// crew is a server on 127.0.0.1:0 for the keys given, on a copy of the
// demo job whose resume position is the hose length.
type crew struct {
	srv  *Server
	addr string
	job  string
	log  *syncBuf
}

type syncBuf struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuf) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuf) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

func startCrew(t *testing.T, keys ...sshtest.Key) *crew {
	t.Helper()
	return startCrewWith(t, func(*Config) {}, keys...)
}

// startCrewWith is startCrew with the config changed by set.
func startCrewWith(t *testing.T, set func(*Config), keys ...sshtest.Key) *crew {
	t.Helper()
	dir := t.TempDir()
	j := model.DemoJob()
	j.Resume = model.Resume{Pane: "Hose", Field: model.FieldHoseLength}
	job := filepath.Join(dir, "jobs", "bund.json")
	if err := model.SaveAtomic(job, j); err != nil {
		t.Fatal(err)
	}
	lg := &syncBuf{}
	cfg := Config{
		Listen: "127.0.0.1:0", Keys: sshtest.KeysFile(t, dir, keys...), HostKey: filepath.Join(dir, HostKeyName), Job: job,
		Log: lg,
		Run: func(args []string, stdout, _ io.Writer) int {
			fmt.Fprintln(stdout, "ran", strings.Join(args, " "))
			return 0
		},
	}
	set(&cfg)
	srv, err := Start(cfg)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { srv.Close() })
	return &crew{srv: srv, addr: srv.Addr().String(), job: job, log: lg}
}

// waitJob waits (at most 5 s) until the shared job passes ok.
func (c *crew) waitJob(t *testing.T, what string, ok func(model.Job) bool) model.Job {
	t.Helper()
	for end := time.Now().Add(5 * time.Second); time.Now().Before(end); time.Sleep(5 * time.Millisecond) {
		if j := c.srv.Hub().Job(); ok(j) {
			return j
		}
	}
	t.Fatalf("the shared job never had %s", what)
	return model.Job{}
}

// TestTwoScreens: two crew members on one job, each typing in a field of
// the Hose pane; each screen shows the other's change, who else is on the
// job, and the field the other is typing in; the job file holds both.
func TestTwoScreens(t *testing.T) {
	ana, ben := sshtest.NewKey(t, "Ana Lopes", ""), sshtest.NewKey(t, "Ben Okafor", "")
	c := startCrew(t, ana, ben)
	a := sshtest.OpenScreen(t, sshtest.Dial(t, c.addr, ana), 100, 30)
	b := sshtest.OpenScreen(t, sshtest.Dial(t, c.addr, ben), 100, 30)
	for _, s := range []*sshtest.Screen{a, b} {
		if !s.WaitFor("Hose length", 10*time.Second) {
			t.Fatalf("no screen:\n%s", s.Text())
		}
	}
	if !a.WaitFor("with Ben Okafor", 5*time.Second) || !b.WaitFor("with Ana Lopes", 5*time.Second) {
		t.Fatalf("the header does not name the other:\n%s\n---\n%s", a.Text(), b.Text())
	}
	// Ana types in the hose length (the text is selected: typing replaces it).
	a.Type("\r")
	time.Sleep(50 * time.Millisecond)
	a.Type("27")
	if !b.WaitFor("Ana Lopes typing", 5*time.Second) {
		t.Fatalf("Ben's screen does not mark the field Ana is typing in:\n%s", b.Text())
	}
	a.Type("\r")
	c.waitJob(t, "Ana's hose length", func(j model.Job) bool { return j.Inputs[model.FieldHoseLength] == "27" })
	if !b.WaitFor("27", 5*time.Second) {
		t.Fatalf("Ben's screen does not show Ana's 27:\n%s", b.Text())
	}
	// Ben types in the bore (the field above).
	b.Type("\x1b[A")
	time.Sleep(50 * time.Millisecond)
	b.Type("\r")
	time.Sleep(50 * time.Millisecond)
	b.Type("41\r")
	j := c.waitJob(t, "Ben's bore", func(j model.Job) bool { return j.Inputs[model.FieldHoseID] == "41" })
	if j.Inputs[model.FieldHoseLength] != "27" {
		t.Errorf("Ana's hose length was lost: %q", j.Inputs[model.FieldHoseLength])
	}
	if !a.WaitFor("41", 5*time.Second) {
		t.Fatalf("Ana's screen does not show Ben's 41:\n%s", a.Text())
	}
	if !strings.Contains(c.log.String(), `login: "Ana Lopes", key SHA256:`) {
		t.Errorf("the login is not logged:\n%s", c.log.String())
	}
	// Both leave; the server writes the job whole at Close.
	a.Sess.Close()
	b.Sess.Close()
	if err := c.srv.Close(); err != nil {
		t.Fatal(err)
	}
	got, err := model.Load(c.job)
	if err != nil {
		t.Fatal(err)
	}
	if got.Inputs[model.FieldHoseLength] != "27" || got.Inputs[model.FieldHoseID] != "41" {
		t.Errorf("the job file holds length %q, bore %q; want 27 and 41", got.Inputs[model.FieldHoseLength], got.Inputs[model.FieldHoseID])
	}
}

// TestRefused: every way in but an allowed key's session is refused: an
// unknown key, a password, keyboard-interactive, a shell or a session with
// neither pty nor command (one line on how to connect), a subsystem, agent
// and X11 forwarding, port forwarding, a command the server does not run.
func TestRefused(t *testing.T) {
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	c := startCrew(t, ana)
	stranger := sshtest.NewKey(t, "Stranger", "")
	if _, err := gossh.Dial("tcp", c.addr, sshtest.Config(gossh.PublicKeys(stranger.Signer))); err == nil {
		t.Error("an unknown key logged in")
	}
	if _, err := gossh.Dial("tcp", c.addr, sshtest.Config(gossh.Password("hunter2"))); err == nil {
		t.Error("a password logged in")
	}
	ki := gossh.KeyboardInteractive(func(string, string, []string, []bool) ([]string, error) { return nil, nil })
	if _, err := gossh.Dial("tcp", c.addr, sshtest.Config(ki)); err == nil {
		t.Error("keyboard-interactive logged in")
	}
	cl := sshtest.Dial(t, c.addr, ana)

	// A shell without a pty: one line saying how to connect, status 2.
	sess, err := cl.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	var out, errOut bytes.Buffer
	sess.Stdout, sess.Stderr = &out, &errOut
	if err := sess.Shell(); err != nil {
		t.Fatal(err)
	}
	err = sess.Wait()
	x, ok := err.(*gossh.ExitError)
	if !ok || x.ExitStatus() != 2 {
		t.Errorf("a shell without a pty ended with %v; want exit status 2", err)
	}
	if lines := strings.Split(strings.TrimSpace(errOut.String()), "\n"); len(lines) != 1 || !strings.Contains(lines[0], "ssh -t 127.0.0.1 -p ") {
		t.Errorf("a shell without a pty got %q; want one line with ssh -t HOST -p PORT", errOut.String())
	}

	// A subsystem (sftp), agent and X11 forwarding are refused.
	sess, err = cl.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	for _, req := range []string{"auth-agent-req@openssh.com", "x11-req"} {
		if ok, _ := sess.SendRequest(req, true, nil); ok {
			t.Errorf("%s was granted", req)
		}
	}
	if err := sess.RequestSubsystem("sftp"); err == nil {
		t.Error("the sftp subsystem was granted")
	}
	sess.Close()

	// Port forwarding, either way.
	if conn, err := cl.Dial("tcp", c.addr); err == nil {
		conn.Close()
		t.Error("local port forwarding was granted")
	}
	if ln, err := cl.Listen("tcp", "127.0.0.1:0"); err == nil {
		ln.Close()
		t.Error("remote port forwarding was granted")
	}

	// A command goes to Run (which decides which run).
	if o, _, st := sshtest.Run(t, cl, "calc --hose-length 12"); st != 0 || o != "ran calc --hose-length 12\n" {
		t.Errorf("the command got %q, status %d", o, st)
	}
	if !strings.Contains(c.log.String(), "no terminal") {
		t.Errorf("the session without a terminal is not logged:\n%s", c.log.String())
	}
}

// TestReadOnly: a read-only key sees the job and the crew but changes
// nothing: typing in a field is refused with one line, and the shared job
// and its file are as they were.
func TestReadOnly(t *testing.T) {
	ana, insp := sshtest.NewKey(t, "Ana Lopes", ""), sshtest.NewKey(t, "Inspector K", ReadOnlyOption)
	c := startCrew(t, ana, insp)
	before := c.srv.Hub().Job()
	s := sshtest.OpenScreen(t, sshtest.Dial(t, c.addr, insp), 100, 30)
	if !s.WaitFor("Hose length", 10*time.Second) {
		t.Fatalf("no screen:\n%s", s.Text())
	}
	if !s.WaitFor("read-only", 2*time.Second) {
		t.Errorf("the header does not say read-only:\n%s", s.Text())
	}
	s.Type("\r")
	time.Sleep(50 * time.Millisecond)
	s.Type("99")
	if !s.WaitFor("may look at the job but not change it", 5*time.Second) {
		t.Errorf("the refusal is not on screen:\n%s", s.Text())
	}
	s.Type("\r9r0.2\r") // and a reading in the Log pane
	time.Sleep(300 * time.Millisecond)
	after := c.srv.Hub().Job()
	if after.Inputs[model.FieldHoseLength] != before.Inputs[model.FieldHoseLength] || len(after.Readings) != len(before.Readings) ||
		len(after.Log) != len(before.Log) {
		t.Errorf("a read-only key changed the job: length %q → %q, readings %d → %d, log %d → %d",
			before.Inputs[model.FieldHoseLength], after.Inputs[model.FieldHoseLength],
			len(before.Readings), len(after.Readings), len(before.Log), len(after.Log))
	}
}

// TestConnectionRate: ten new connections a second from loopback are all
// let in (DefaultRate is 20 a second, with 40 at once).
func TestConnectionRate(t *testing.T) {
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	c := startCrew(t, ana)
	for i := range 15 {
		cl, err := gossh.Dial("tcp", c.addr, sshtest.Config(gossh.PublicKeys(ana.Signer)))
		if err != nil {
			t.Fatalf("connection %d of 15 in a second refused: %v", i+1, err)
		}
		cl.Close()
		time.Sleep(time.Second / 15)
	}
}

// TestRateLimit: the bucket lets Burst in at once, then Rate a second.
func TestRateLimit(t *testing.T) {
	r := newRateLimit(20, 40)
	t0 := time.Unix(0, 0)
	n := 0
	for range 100 {
		if r.allow("a", t0) {
			n++
		}
	}
	if n != 40 {
		t.Errorf("at once: %d let in, want the burst, 40", n)
	}
	if !r.allow("a", t0.Add(50*time.Millisecond)) {
		t.Error("one more after 1/20 s was refused")
	}
	if !r.allow("b", t0) {
		t.Error("another address was refused")
	}
}

// TestKeysFile: names from the comment, the read-only option, lines
// without a name left out.
func TestKeysFile(t *testing.T) {
	a, b := sshtest.NewKey(t, "Ana Lopes", ""), sshtest.NewKey(t, "Insp K", "read-only")
	noName := sshtest.NewKey(t, "", "")
	dir := t.TempDir()
	p := sshtest.KeysFile(t, dir, a, b, noName, sshtest.Key{Line: "not a key"})
	ms, skipped, err := ReadKeys(p)
	if err != nil {
		t.Fatal(err)
	}
	if len(ms) != 2 || ms[0].Name != "Ana Lopes" || ms[0].ReadOnly || ms[1].Name != "Insp K" || !ms[1].ReadOnly {
		t.Errorf("members %+v", ms)
	}
	if len(skipped) != 2 {
		t.Errorf("skipped %q, want 2 lines", skipped)
	}
}

// TestHostKey: made once with mode 0600, the same key after.
func TestHostKey(t *testing.T) {
	p := filepath.Join(t.TempDir(), HostKeyName)
	k1, err := HostKey(p)
	if err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(p)
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != 0o600 {
		t.Errorf("mode %04o, want 0600", fi.Mode().Perm())
	}
	k2, err := HostKey(p)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(k1.PublicKey().Marshal(), k2.PublicKey().Marshal()) {
		t.Error("a second start made a new host key")
	}
	os.Chmod(p, 0o644)
	if _, err := HostKey(p); err == nil {
		t.Error("a host key others can read was used")
	}
}

// TestLocalJoin: a screen on the server's own machine joins the crew's job
// through the job's socket (as a second drawdown does when the job's lock
// names the server): the crew sees it by name, and its edit is the crew's.
func TestLocalJoin(t *testing.T) {
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	c := startCrew(t, ana)
	if fi, err := os.Stat(model.SocketPath(c.job)); err != nil || fi.Mode().Perm() != 0o600 {
		t.Fatalf("the job's socket: %v, %v (want mode 0600)", fi, err)
	}
	a := sshtest.OpenScreen(t, sshtest.Dial(t, c.addr, ana), 100, 30)
	conn, err := DialLocal(c.job)
	if err != nil {
		t.Fatal(err)
	}
	in, keys := io.Pipe()
	out := sshtest.NewTerminal(100, 30)
	done := make(chan error, 1)
	go func() { done <- Pass(conn, "amarsh", "xterm-256color", 100, 30, in, out, nil) }()
	if !out.WaitFor("Hose length", 10*time.Second) {
		t.Fatalf("no local screen:\n%s", out.Text())
	}
	if !a.WaitFor("with amarsh (here)", 5*time.Second) {
		t.Errorf("the SSH screen does not name the local one:\n%s", a.Text())
	}
	keys.Write([]byte("\r"))
	time.Sleep(50 * time.Millisecond)
	keys.Write([]byte("31\r"))
	c.waitJob(t, "the local screen's hose length", func(j model.Job) bool { return j.Inputs[model.FieldHoseLength] == "31" })
	if !a.WaitFor("31", 5*time.Second) {
		t.Errorf("the SSH screen does not show the local edit:\n%s", a.Text())
	}
	time.Sleep(50 * time.Millisecond)
	keys.Write([]byte("q"))
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("the local screen ended with %v", err)
		}
	case <-time.After(5 * time.Second):
		t.Error("the local screen did not end on q")
	}
	if _, err := DialLocal(filepath.Join(t.TempDir(), "none.json")); !errors.Is(err, ErrNoServer) {
		t.Errorf("a job without a server: %v, want ErrNoServer", err)
	}
}

// TestLimits: connections past MaxConns are closed before the handshake; a
// session with no traffic ends after IdleTimeout, and any session after
// MaxTimeout.
func TestLimits(t *testing.T) {
	ana := sshtest.NewKey(t, "Ana Lopes", "")
	c := startCrewWith(t, func(cfg *Config) { cfg.MaxConns = 2 }, ana)
	sshtest.Dial(t, c.addr, ana)
	sshtest.Dial(t, c.addr, ana)
	if cl, err := gossh.Dial("tcp", c.addr, sshtest.Config(gossh.PublicKeys(ana.Signer))); err == nil {
		cl.Close()
		t.Error("a third connection was let in with MaxConns 2")
	}
	if !strings.Contains(c.log.String(), "2 connections already") {
		t.Errorf("the refusal is not logged:\n%s", c.log.String())
	}

	for _, tc := range []struct {
		name string
		set  func(*Config)
	}{
		{"idle", func(cfg *Config) { cfg.IdleTimeout = 300 * time.Millisecond }},
		{"max", func(cfg *Config) { cfg.MaxTimeout = 500 * time.Millisecond }},
	} {
		c := startCrewWith(t, tc.set, ana)
		s := sshtest.OpenScreen(t, sshtest.Dial(t, c.addr, ana), 80, 24)
		if !s.Closed(5 * time.Second) {
			t.Errorf("%s: the session did not end", tc.name)
		}
	}
}
