package main

import (
	"errors"
	"io"
	"os"
	"sync"
)

// watchedInput is the terminal the screen reads, watched for its end: a
// terminal that closes under the program (the window closed, the link
// dropped with no SIGHUP) gives a read error (EIO) or the end of input,
// which bubbletea would take as "no more keys" and go on running on a dead
// terminal. onEnd is told once, and the screen stops as for a signal. It
// is still the terminal itself to bubbletea (Fd, Name): raw mode and the
// cancellable reader work as on os.Stdin.
type watchedInput struct {
	f     *os.File
	once  sync.Once
	onEnd func(error)
}

func newWatchedInput(f *os.File, onEnd func(error)) *watchedInput {
	return &watchedInput{f: f, onEnd: onEnd}
}

func (w *watchedInput) Read(b []byte) (int, error) {
	n, err := w.f.Read(b)
	if err != nil && !errors.Is(err, os.ErrDeadlineExceeded) {
		w.once.Do(func() { w.onEnd(err) })
	}
	return n, err
}

func (w *watchedInput) Write(b []byte) (int, error) { return w.f.Write(b) }
func (w *watchedInput) Close() error                { return w.f.Close() }
func (w *watchedInput) Fd() uintptr                 { return w.f.Fd() }
func (w *watchedInput) Name() string                { return w.f.Name() }

// inputEnded words why the terminal's input ended, for the stop line.
func inputEnded(err error) string {
	if errors.Is(err, io.EOF) {
		return "the terminal closed: end of input"
	}
	return "the terminal closed: " + err.Error()
}
