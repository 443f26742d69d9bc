//go:build unix

package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"os/user"
	"syscall"

	"github.com/charmbracelet/x/term"

	"drawdown/model"
	"drawdown/serve"
)

// joinCrew puts this terminal on the crew server's screen of the job at
// path, when the job's lock names a server and that server answers on the
// job's local socket (serve.DialLocal): the server runs the screen on the
// shared job, this process passes the terminal through. ok is false when
// no server answers, and the screen opens as for any held job.
func joinCrew(path string, holder model.LockInfo, stderr io.Writer) (code int, ok bool) {
	if holder.Server == "" {
		return 0, false
	}
	conn, err := serve.DialLocal(path)
	if err != nil {
		return 0, false
	}
	in, out := os.Stdin.Fd(), os.Stdout.Fd()
	cols, rows, err := term.GetSize(out)
	if err != nil {
		cols, rows = 80, 24
	}
	st, err := term.MakeRaw(in)
	if err != nil {
		conn.Close()
		return 0, false
	}
	resize := make(chan [2]int, 1)
	sigs := make(chan os.Signal, 4)
	signal.Notify(sigs, syscall.SIGWINCH, syscall.SIGHUP, syscall.SIGTERM, syscall.SIGINT)
	go func() {
		for s := range sigs {
			if s != syscall.SIGWINCH {
				conn.Close() // the server's screen ends; the job stays with the crew
				return
			}
			if w, h, err := term.GetSize(out); err == nil {
				select {
				case resize <- [2]int{w, h}:
				default:
				}
			}
		}
	}()
	name := os.Getenv("USER")
	if u, err := user.Current(); err == nil && u.Username != "" {
		name = u.Username
	}
	err = serve.Pass(conn, name, os.Getenv("TERM"), cols, rows, os.Stdin, os.Stdout, resize)
	signal.Stop(sigs)
	term.Restore(in, st)
	fmt.Fprintln(stderr, "drawdown: left the crew's job; it stays open on "+holder.Who(nil))
	if err != nil && !errors.Is(err, os.ErrClosed) {
		fmt.Fprintln(stderr, "drawdown:", err)
		return ExitError, true
	}
	return ExitOK, true
}
