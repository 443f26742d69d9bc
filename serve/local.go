package serve

import (
	"bufio"
	"encoding/binary"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net"
	"os"
	"strings"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/tui"
)

// Local screens join the crew's job. A server holding a job also listens
// on a unix socket beside it (model.SocketPath, mode 0600 in the job
// folder, so only the user the server runs as can connect). A second
// drawdown on that machine that finds the job held by the server (its lock
// names the server's address) connects there instead of opening the job
// read-only: it passes its terminal through, and the server runs its
// screen on the shared job as it runs an SSH session's, named after the
// local user.
//
// The protocol, version 1: the client sends one JSON line,
//
//	{"schema":"drawdown-join","version":1,"user":"amarsh","term":"xterm-256color","cols":100,"rows":30}
//
// then frames of [kind byte][length uint32, big-endian][data]: kind 'i' is
// input from the terminal, kind 'w' a new size (cols, rows as two uint16).
// The server sends the screen's output, raw, and closes the connection
// when the screen ends.

const joinSchema = "drawdown-join"

type joinHello struct {
	Schema  string `json:"schema"`
	Version int    `json:"version"`
	User    string `json:"user"`
	Term    string `json:"term"`
	Cols    int    `json:"cols"`
	Rows    int    `json:"rows"`
}

// maxFrame bounds one frame from a local client, bytes.
const maxFrame = 1 << 16

// listenLocal opens the job's socket (one left by a killed server is
// removed first: this server holds the job's lock).
func (s *Server) listenLocal() error {
	p := model.SocketPath(s.hub.Path())
	os.Remove(p)
	ln, err := net.Listen("unix", p)
	if err != nil {
		return err
	}
	if err := os.Chmod(p, 0o600); err != nil {
		ln.Close()
		return err
	}
	s.local = ln
	go func() {
		for {
			c, err := ln.Accept()
			if err != nil {
				return
			}
			s.localConns.Store(c, true)
			go func() {
				defer s.localConns.Delete(c)
				s.localScreen(c)
			}()
		}
	}()
	return nil
}

// localScreen runs the screen of a local client.
func (s *Server) localScreen(conn net.Conn) {
	defer conn.Close()
	br := bufio.NewReader(conn)
	conn.SetReadDeadline(time.Now().Add(5 * time.Second))
	line, err := br.ReadString('\n')
	conn.SetReadDeadline(time.Time{})
	var h joinHello
	if err != nil || json.Unmarshal([]byte(line), &h) != nil || h.Schema != joinSchema || h.Version != 1 {
		return
	}
	name := strings.TrimSpace(h.User)
	if name == "" || len(name) > MaxName || strings.ContainsFunc(name, isControl) {
		name = "local user"
	}
	m := Member{Name: name + " (here)"}
	s.log.Printf("login: %q on this machine, through %s", m.Name, model.SocketPath(s.hub.Path()))
	s.wg.Add(1)
	defer s.wg.Done()
	c := s.hub.join(m)
	defer s.hub.leave(c)
	j := c.Latest()
	mdl := tui.New(tui.Options{Start: tui.Start{Job: j, Path: s.hub.Path()}, Cat: s.cfg.Cat, Share: c})
	in, inw := io.Pipe()
	term := h.Term
	if term == "" || strings.ContainsFunc(term, isControl) {
		term = "xterm-256color"
	}
	p := tea.NewProgram(mdl, tea.WithInput(in), tea.WithOutput(conn), tea.WithoutSignalHandler(),
		tea.WithEnvironment([]string{"TERM=" + term}), tea.WithWindowSize(max(h.Cols, 1), max(h.Rows, 1)))
	c.prog = p
	go c.deliver()
	go func() {
		defer inw.Close()
		defer p.Quit()
		hdr := make([]byte, 5)
		buf := make([]byte, maxFrame)
		for {
			if _, err := io.ReadFull(br, hdr); err != nil {
				return
			}
			n := binary.BigEndian.Uint32(hdr[1:])
			if n > maxFrame {
				return
			}
			if _, err := io.ReadFull(br, buf[:n]); err != nil {
				return
			}
			switch hdr[0] {
			case 'i':
				if _, err := inw.Write(buf[:n]); err != nil {
					return
				}
			case 'w':
				if n == 4 {
					p.Send(tea.WindowSizeMsg{Width: int(binary.BigEndian.Uint16(buf)), Height: int(binary.BigEndian.Uint16(buf[2:]))})
				}
			}
		}
	}()
	if _, err := p.Run(); err != nil && !errors.Is(err, tea.ErrProgramKilled) {
		s.log.Printf("the screen of %q ended: %v", m.Name, err)
	}
}

func isControl(r rune) bool { return r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) }

// ErrNoServer: no crew server answers at the job's socket.
var ErrNoServer = errors.New("no crew server answers on this machine")

// DialLocal connects to the socket of the server holding the job at
// jobPath (ErrNoServer, wrapped, when none answers).
func DialLocal(jobPath string) (net.Conn, error) {
	conn, err := net.DialTimeout("unix", model.SocketPath(jobPath), 2*time.Second)
	if err != nil {
		return nil, fmt.Errorf("%w: %v", ErrNoServer, err)
	}
	return conn, nil
}

// Pass is the client side of a local screen: it passes the terminal
// through conn (from DialLocal), in and out, and each new size from
// resize, until the server's screen ends; then it closes conn.
func Pass(conn net.Conn, user, term string, cols, rows int, in io.Reader, out io.Writer, resize <-chan [2]int) error {
	defer conn.Close()
	b, _ := json.Marshal(joinHello{Schema: joinSchema, Version: 1, User: user, Term: term, Cols: cols, Rows: rows})
	if _, err := conn.Write(append(b, '\n')); err != nil {
		return err
	}
	frames := make(chan []byte, 16)
	go func() {
		buf := make([]byte, 4096)
		for {
			n, err := in.Read(buf)
			if n > 0 {
				f := make([]byte, 5+n)
				f[0] = 'i'
				binary.BigEndian.PutUint32(f[1:], uint32(n))
				copy(f[5:], buf[:n])
				frames <- f
			}
			if err != nil {
				close(frames)
				return
			}
		}
	}()
	go func() {
		for {
			var f []byte
			select {
			case d, ok := <-frames:
				if !ok {
					return
				}
				f = d
			case sz := <-resize:
				f = []byte{'w', 0, 0, 0, 4, 0, 0, 0, 0}
				binary.BigEndian.PutUint16(f[5:], uint16(sz[0]))
				binary.BigEndian.PutUint16(f[7:], uint16(sz[1]))
			}
			if _, err := conn.Write(f); err != nil {
				return
			}
		}
	}()
	if _, err := io.Copy(out, conn); err != nil && !errors.Is(err, net.ErrClosed) {
		return fmt.Errorf("the crew server's screen ended: %w", err)
	}
	return nil
}
