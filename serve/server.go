package serve

import (
	"errors"
	"fmt"
	"io"
	"log"
	"net"
	"os"
	"path/filepath"
	"strconv"
	"sync"
	"sync/atomic"
	"time"

	tea "charm.land/bubbletea/v2"
	"charm.land/ssh"
	"charm.land/wish/v2"
	"charm.land/wish/v2/bubbletea"
	gossh "golang.org/x/crypto/ssh"

	"drawdown/model"
	"drawdown/presets"
	"drawdown/tui"
)

// DefaultListen is where the server listens unless told: loopback only, so
// that nothing is reachable from the network until the user says so
// (--listen 0.0.0.0:2222, or the site network's address). Port 2222 is the
// usual unprivileged stand-in for 22 (common practice).
const DefaultListen = "127.0.0.1:2222"

// The limits, unless a Config says otherwise.
const (
	DefaultIdle     = 30 * time.Minute // no traffic at all: the session ends
	DefaultMax      = 12 * time.Hour   // a shift: then a new login
	DefaultMaxConns = 32               // connections at once
	DefaultRate     = 20.0             // new connections a second from one address…
	DefaultBurst    = 40               // …with this many at once
	handshakeWait   = 15 * time.Second // to log in, from the connection
)

// Config is how the server runs.
type Config struct {
	Listen  string // host:port; "" is DefaultListen; port 0 picks one
	Keys    string // the allowed-keys file (keys.go)
	HostKey string // the host key file (made the first time)
	Job     string // the job file the crew works on
	Cat     *presets.Catalogue
	// Run runs a command line (`ssh HOST calc …`) and returns its exit
	// status; it decides which commands are allowed. Nil: none are.
	Run func(args []string, stdout, stderr io.Writer) int
	Log io.Writer // the login log; nil: discarded

	IdleTimeout, MaxTimeout time.Duration // 0: the defaults
	MaxConns                int
	Rate                    float64 // new connections a second from one address
	Burst                   int
}

// Server is a running crew server.
type Server struct {
	cfg   Config
	ln    net.Listener
	srv   *ssh.Server
	hub   *Hub
	log   *log.Logger
	conns atomic.Int32
	rate  *rateLimit
	wg    sync.WaitGroup // the screens running
	done  chan error

	local      net.Listener // the socket local screens join through (local.go)
	localConns sync.Map     // net.Conn → true, the local screens' connections
	closeOnce  sync.Once
	closeErr   error
}

// Start listens, opens the job for the crew (its lock names this server's
// address) and serves until Close.
func Start(cfg Config) (*Server, error) {
	if cfg.Listen == "" {
		cfg.Listen = DefaultListen
	}
	if cfg.IdleTimeout == 0 {
		cfg.IdleTimeout = DefaultIdle
	}
	if cfg.MaxTimeout == 0 {
		cfg.MaxTimeout = DefaultMax
	}
	if cfg.MaxConns == 0 {
		cfg.MaxConns = DefaultMaxConns
	}
	if cfg.Rate == 0 {
		cfg.Rate, cfg.Burst = DefaultRate, DefaultBurst
	}
	if cfg.Cat == nil {
		cfg.Cat = presets.Builtin()
	}
	if cfg.Log == nil {
		cfg.Log = io.Discard
	}
	members, skipped, err := ReadKeys(cfg.Keys)
	if err != nil {
		return nil, fmt.Errorf("the allowed-keys file: %w", err)
	}
	signer, err := HostKey(cfg.HostKey)
	if err != nil {
		return nil, err
	}
	s := &Server{cfg: cfg, log: log.New(cfg.Log, "", log.LstdFlags), rate: newRateLimit(cfg.Rate, cfg.Burst), done: make(chan error, 1)}
	for _, why := range skipped {
		s.log.Printf("the allowed-keys file %s, %s: left out", cfg.Keys, why)
	}
	if len(members) == 0 {
		s.log.Printf("the allowed-keys file %s holds no key with a name: nobody can log in until one is added (it is read at every login)", cfg.Keys)
	}
	s.ln, err = net.Listen("tcp", cfg.Listen)
	if err != nil {
		return nil, err
	}
	s.hub, _, err = OpenHub(cfg.Job, s.ln.Addr().String(), cfg.Cat, s.log.Printf)
	if err != nil {
		s.ln.Close()
		return nil, err
	}
	s.srv, err = wish.NewServer(
		wish.WithVersion("drawdown"),
		wish.WithPublicKeyAuth(s.allowKey),
		wish.WithIdleTimeout(cfg.IdleTimeout),
		wish.WithMaxTimeout(cfg.MaxTimeout),
		func(srv *ssh.Server) error {
			srv.HostSigners = []ssh.Signer{signer}
			srv.HandshakeTimeout = handshakeWait
			srv.ConnCallback = s.admit
			srv.Handler = s.handle
			// Sessions only: no direct-tcpip (port forwarding) channel, no
			// tcpip-forward request, and in a session no agent, X11 or
			// subsystem request (sessionOnly).
			srv.ChannelHandlers = map[string]ssh.ChannelHandler{"session": sessionOnly}
			srv.RequestHandlers = map[string]ssh.RequestHandler{}
			srv.SubsystemHandlers = map[string]ssh.SubsystemHandler{}
			return nil
		},
	)
	if err != nil {
		s.hub.Close()
		s.ln.Close()
		return nil, err
	}
	if err := s.listenLocal(); err != nil {
		s.log.Printf("no local socket (screens on this machine open the job read-only): %v", err)
	}
	go func() { s.done <- s.srv.Serve(s.ln) }()
	s.log.Printf("serving %s on %s (allowed keys: %s; host key %s, %s)", cfg.Job, s.ln.Addr(), cfg.Keys,
		gossh.FingerprintSHA256(signer.PublicKey()), cfg.HostKey)
	return s, nil
}

// Addr is the address the server listens on.
func (s *Server) Addr() net.Addr { return s.ln.Addr() }

// Hub is the job the server holds.
func (s *Server) Hub() *Hub { return s.hub }

// Close ends every session, then writes the job whole and gives its lock
// up. A second Close returns what the first did.
func (s *Server) Close() error {
	s.closeOnce.Do(func() { s.closeErr = s.close() })
	return s.closeErr
}

func (s *Server) close() error {
	if s.local != nil {
		s.local.Close()
		os.Remove(model.SocketPath(s.hub.Path()))
		s.localConns.Range(func(k, _ any) bool { k.(net.Conn).Close(); return true })
	}
	s.srv.Close()
	waited := make(chan struct{})
	go func() { s.wg.Wait(); close(waited) }()
	select {
	case <-waited:
	case <-time.After(3 * time.Second):
	}
	err := s.hub.Close()
	if serr := <-s.done; serr != nil && !errors.Is(serr, ssh.ErrServerClosed) && err == nil {
		err = serr
	}
	return err
}

// allowKey is the only login: a key in the allowed-keys file, read again
// each time.
func (s *Server) allowKey(ctx ssh.Context, key ssh.PublicKey) bool {
	_, err := lookup(s.cfg.Keys, key)
	switch {
	case errors.Is(err, errNoKey):
		// A client offers each of its keys in turn: one line for each
		// that is not allowed (the fingerprint to look for when adding a
		// crew member's key).
		s.log.Printf("refused key %s from %s: not in the allowed-keys file", gossh.FingerprintSHA256(key), ctx.RemoteAddr())
	case err != nil:
		s.log.Printf("refused %s from %s: the allowed-keys file does not read: %v", gossh.FingerprintSHA256(key), ctx.RemoteAddr(), err)
	}
	return err == nil
}

// handle is every session: a command, the screen, or one line on how to
// connect.
func (s *Server) handle(sess ssh.Session) {
	key := sess.PublicKey()
	if key == nil {
		wish.Fatalln(sess, "drawdown: no key")
		return
	}
	m, err := lookup(s.cfg.Keys, key)
	if err != nil {
		s.log.Printf("refused %s from %s: no longer in the allowed-keys file", gossh.FingerprintSHA256(key), sess.RemoteAddr())
		wish.Fatalln(sess, "drawdown: this key is no longer allowed on this server")
		return
	}
	cmd := sess.Command()
	_, _, pty := sess.Pty()
	what := "the screen"
	switch {
	case len(cmd) > 0:
		what = "the command " + strconv.Quote(cmd[0])
	case !pty:
		what = "no terminal"
	}
	ro := ""
	if m.ReadOnly {
		ro = " (read-only)"
	}
	s.log.Printf("login: %q%s, key %s, from %s: %s", m.Name, ro, m.Fingerprint, sess.RemoteAddr(), what)
	switch {
	case len(cmd) > 0:
		if s.cfg.Run == nil {
			wish.Fatalln(sess, "drawdown: this server runs no commands; connect with "+s.howTo(sess))
			return
		}
		_ = sess.Exit(s.cfg.Run(cmd, sess, sess.Stderr()))
	case !pty:
		fmt.Fprintln(sess.Stderr(), "drawdown: the planning screen needs a terminal: connect with "+s.howTo(sess)+
			" (or run a command, e.g. ssh -p "+s.port()+" HOST calc --help)")
		_ = sess.Exit(2)
	default:
		s.screen(sess, m)
	}
}

// howTo is the command that opens the screen.
func (s *Server) howTo(sess ssh.Session) string {
	host := "HOST"
	if a, ok := sess.LocalAddr().(*net.TCPAddr); ok && !a.IP.IsUnspecified() {
		host = a.IP.String()
	}
	return "ssh -t " + host + " -p " + s.port()
}

func (s *Server) port() string {
	_, p, _ := net.SplitHostPort(s.ln.Addr().String())
	return p
}

// screen runs the planning screen on the shared job for one session.
func (s *Server) screen(sess ssh.Session, m Member) {
	s.wg.Add(1)
	defer s.wg.Done()
	c := s.hub.join(m)
	defer s.hub.leave(c)
	j := c.Latest()
	mdl := tui.New(tui.Options{
		Start: tui.Start{Job: j, Path: s.hub.Path(), Dir: filepath.Dir(s.hub.Path())},
		Cat:   s.cfg.Cat, Share: c,
	})
	opts := append(bubbletea.MakeOptions(sess), tea.WithoutSignalHandler())
	p := tea.NewProgram(mdl, opts...)
	c.prog = p
	go c.deliver()
	bubbletea.MiddlewareWithProgramHandler(func(ssh.Session) *tea.Program { return p })(func(ssh.Session) {})(sess)
}

// admit is every connection, before the handshake: at most Rate new ones a
// second from one address, and MaxConns at once.
func (s *Server) admit(_ ssh.Context, conn net.Conn) net.Conn {
	host := conn.RemoteAddr().String()
	if h, _, err := net.SplitHostPort(host); err == nil {
		host = h
	}
	if !s.rate.allow(host, time.Now()) {
		s.log.Printf("refused a connection from %s: over %g new connections a second", host, s.cfg.Rate)
		return nil
	}
	if int(s.conns.Add(1)) > s.cfg.MaxConns {
		s.conns.Add(-1)
		s.log.Printf("refused a connection from %s: %d connections already", host, s.cfg.MaxConns)
		return nil
	}
	return &countedConn{Conn: conn, s: s}
}

// countedConn gives its place up when it closes.
type countedConn struct {
	net.Conn
	s    *Server
	once sync.Once
}

func (c *countedConn) Close() error {
	c.once.Do(func() { c.s.conns.Add(-1) })
	return c.Conn.Close()
}

// sessionOnly is the session channel with the requests this server never
// grants refused before the session sees them: agent forwarding, X11
// forwarding and subsystems (sftp).
func sessionOnly(srv *ssh.Server, conn *gossh.ServerConn, nc gossh.NewChannel, ctx ssh.Context) {
	ssh.DefaultSessionHandler(srv, conn, refusing{nc}, ctx)
}

type refusing struct{ gossh.NewChannel }

func (r refusing) Accept() (gossh.Channel, <-chan *gossh.Request, error) {
	ch, reqs, err := r.NewChannel.Accept()
	if err != nil {
		return ch, reqs, err
	}
	out := make(chan *gossh.Request)
	go func() {
		defer close(out)
		for req := range reqs {
			switch req.Type {
			case "auth-agent-req@openssh.com", "x11-req", "subsystem":
				if req.WantReply {
					_ = req.Reply(false, nil)
				}
				continue
			}
			out <- req
		}
	}()
	return ch, out, nil
}

// rateLimit is a token bucket for each address: rate tokens a second, at
// most burst kept.
type rateLimit struct {
	mu    sync.Mutex
	rate  float64
	burst float64
	by    map[string]*bucket
}

type bucket struct {
	tokens float64
	at     time.Time
}

func newRateLimit(rate float64, burst int) *rateLimit {
	return &rateLimit{rate: rate, burst: float64(max(burst, 1)), by: map[string]*bucket{}}
}

func (r *rateLimit) allow(host string, now time.Time) bool {
	r.mu.Lock()
	defer r.mu.Unlock()
	b := r.by[host]
	if b == nil {
		if len(r.by) > 4096 {
			for k, o := range r.by { // forget the addresses that are full again
				if now.Sub(o.at).Seconds()*r.rate >= r.burst {
					delete(r.by, k)
				}
			}
		}
		b = &bucket{tokens: r.burst, at: now}
		r.by[host] = b
	}
	b.tokens = min(r.burst, b.tokens+now.Sub(b.at).Seconds()*r.rate)
	b.at = now
	if b.tokens < 1 {
		return false
	}
	b.tokens--
	return true
}
