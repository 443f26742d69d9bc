// Package sshtest is what the crew server's tests share: keys, an
// allowed-keys file, SSH clients (golang.org/x/crypto/ssh) and a screen
// read through a terminal emulator. Never imported by production code.
package sshtest

import (
	"bytes"
	"crypto/ed25519"
	"crypto/rand"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/charmbracelet/x/vt"
	gossh "golang.org/x/crypto/ssh"
)

// Key is a crew member's key pair.
type Key struct {
	Signer gossh.Signer
	Line   string // the allowed-keys line: the public key and the name
}

// NewKey makes an Ed25519 key for name; the line starts with options
// (e.g. "read-only") when given.
func NewKey(t testing.TB, name, options string) Key {
	t.Helper()
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	s, err := gossh.NewSignerFromKey(priv)
	if err != nil {
		t.Fatal(err)
	}
	line := strings.TrimSpace(string(gossh.MarshalAuthorizedKey(s.PublicKey()))) + " " + name
	if options != "" {
		line = options + " " + line
	}
	return Key{Signer: s, Line: line}
}

// KeysFile writes the allowed-keys file of keys in dir.
func KeysFile(t testing.TB, dir string, keys ...Key) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("# crew keys for the test\n")
	for _, k := range keys {
		b.WriteString(k.Line + "\n")
	}
	p := filepath.Join(dir, "crew_keys")
	if err := os.WriteFile(p, []byte(b.String()), 0o600); err != nil {
		t.Fatal(err)
	}
	return p
}

// Config is a client configuration with the given authentication.
func Config(auth ...gossh.AuthMethod) *gossh.ClientConfig {
	return &gossh.ClientConfig{User: "crew", Auth: auth, HostKeyCallback: gossh.InsecureIgnoreHostKey(), Timeout: 10 * time.Second}
}

// Dial logs in with k.
func Dial(t testing.TB, addr string, k Key) *gossh.Client {
	t.Helper()
	c, err := gossh.Dial("tcp", addr, Config(gossh.PublicKeys(k.Signer)))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { c.Close() })
	return c
}

// Screen is a session with a pty, its output fed to a terminal emulator.
type Screen struct {
	t    testing.TB
	Sess *gossh.Session
	in   io.WriteCloser

	mu    sync.Mutex
	emu   *vt.Emulator
	bytes int
	last  time.Time
	done  chan struct{}
}

// OpenScreen opens the planning screen on c at w×h.
func OpenScreen(t testing.TB, c *gossh.Client, w, h int) *Screen {
	t.Helper()
	sess, err := c.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	if err := sess.RequestPty("xterm-256color", h, w, gossh.TerminalModes{}); err != nil {
		t.Fatal(err)
	}
	in, err := sess.StdinPipe()
	if err != nil {
		t.Fatal(err)
	}
	out, err := sess.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	s := &Screen{t: t, Sess: sess, in: in, emu: vt.NewEmulator(w, h), done: make(chan struct{})}
	go func() { _, _ = io.Copy(io.Discard, s.emu) }() // the emulator's replies to queries
	go s.read(out)
	if err := sess.Shell(); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { sess.Close() })
	return s
}

func (s *Screen) read(out io.Reader) {
	defer close(s.done)
	b := make([]byte, 32<<10)
	for {
		n, err := out.Read(b)
		if n > 0 {
			s.mu.Lock()
			_, _ = s.emu.Write(b[:n])
			s.bytes += n
			s.last = time.Now()
			s.mu.Unlock()
		}
		if err != nil {
			return
		}
	}
}

// Text is what the screen shows.
func (s *Screen) Text() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.emu.String()
}

// Bytes is how many bytes the server has sent.
func (s *Screen) Bytes() int {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.bytes
}

// WaitFor waits (at most d) until the screen shows text.
func (s *Screen) WaitFor(text string, d time.Duration) bool {
	for end := time.Now().Add(d); time.Now().Before(end); time.Sleep(5 * time.Millisecond) {
		if strings.Contains(s.Text(), text) {
			return true
		}
	}
	return false
}

// Quiet waits until nothing has come for d (at most maxWait).
func (s *Screen) Quiet(d, maxWait time.Duration) {
	for end := time.Now().Add(maxWait); time.Now().Before(end); time.Sleep(d / 4) {
		s.mu.Lock()
		idle := time.Since(s.last)
		s.mu.Unlock()
		if idle >= d {
			return
		}
	}
}

// Type sends keys.
func (s *Screen) Type(keys string) {
	if _, err := io.WriteString(s.in, keys); err != nil {
		s.t.Fatal(err)
	}
}

// Closed reports whether the server ended the session (within d).
func (s *Screen) Closed(d time.Duration) bool {
	select {
	case <-s.done:
		return true
	case <-time.After(d):
		return false
	}
}

// Run runs a command without a pty and returns its output and exit status.
func Run(t testing.TB, c *gossh.Client, cmd string) (stdout, stderr string, status int) {
	t.Helper()
	sess, err := c.NewSession()
	if err != nil {
		t.Fatal(err)
	}
	defer sess.Close()
	var o, e bytes.Buffer
	sess.Stdout, sess.Stderr = &o, &e
	err = sess.Run(cmd)
	if x, ok := err.(*gossh.ExitError); ok {
		return o.String(), e.String(), x.ExitStatus()
	}
	if err != nil {
		t.Fatal(err)
	}
	return o.String(), e.String(), 0
}

// Terminal is a terminal emulator to write a screen's output to.
type Terminal struct {
	mu  sync.Mutex
	emu *vt.Emulator
}

// NewTerminal is a w×h terminal.
func NewTerminal(w, h int) *Terminal {
	t := &Terminal{emu: vt.NewEmulator(w, h)}
	go func() { _, _ = io.Copy(io.Discard, t.emu) }()
	return t
}

func (t *Terminal) Write(p []byte) (int, error) {
	t.mu.Lock()
	defer t.mu.Unlock()
	return t.emu.Write(p)
}

// Text is what the terminal shows.
func (t *Terminal) Text() string {
	t.mu.Lock()
	defer t.mu.Unlock()
	return t.emu.String()
}

// WaitFor waits (at most d) until the terminal shows text.
func (t *Terminal) WaitFor(text string, d time.Duration) bool {
	for end := time.Now().Add(d); time.Now().Before(end); time.Sleep(5 * time.Millisecond) {
		if strings.Contains(t.Text(), text) {
			return true
		}
	}
	return false
}
