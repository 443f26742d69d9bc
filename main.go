// Command drawdown plans, checks and records siphon drains of tanks, sumps,
// pits and ponds.
//
//	drawdown                 the terminal screen, on the last job or the demo job
//	drawdown calc [flags]    one case without the screen (--json for JSON)
//	drawdown presets         the built-in catalogue
//	drawdown report JOB      the job record
//
// The command line lives in this package, one file per command (cmd_*.go);
// each turns its flags into model inputs and lays out what model and its
// presentation layer say. The screen is package tui. Neither decides or words
// anything the other could word differently.
package main

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"
	"syscall"

	tea "charm.land/bubbletea/v2"

	"drawdown/presets"
	"drawdown/tui"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// Exit statuses of every command.
const (
	ExitOK    = 0
	ExitError = 1 // a file could not be read or written
	ExitUsage = 2 // bad input: a flag or its value
)

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		switch args[0] {
		case "calc":
			return runCalc(args[1:], stdout, stderr)
		case "presets":
			return runPresets(args[1:], stdout, stderr)
		case "report":
			return runReport(args[1:], stdout, stderr)
		case "-h", "--help", "help":
			fmt.Fprint(stdout, usage)
			return ExitOK
		}
		fmt.Fprintf(stderr, "drawdown: unknown command %q\n%s", args[0], usage)
		return ExitUsage
	}
	if t := os.Getenv("TERM"); t == "dumb" || t == "" && !isTerminal(os.Stdout) {
		fmt.Fprint(stderr, dumbMessage)
		return 1
	}
	return runScreen(stderr)
}

const usage = `drawdown — plan, run and record a siphon drain

usage:
  drawdown                 open the planning screen (last job, or the demo job)
  drawdown calc [flags]    compute one case without the screen; --json for JSON
  drawdown presets         list the built-in liquids, hoses, fittings and tanks with sources
  drawdown report JOB      write the job record (Markdown) and its readings CSV

drawdown plans and records; it does not authorise a discharge or an entry. Local codes,
permits and licensed practice govern.
`

const dumbMessage = `drawdown: this terminal cannot move the cursor (TERM=dumb), and the
planning screen needs one that can (xterm, tmux, screen, a Linux console, an
SSH client). Set TERM to your terminal's type, or work without the screen:
  drawdown calc --hose-id 25mm --hose-length 10m --lift 1m --drop 2m
  drawdown calc --help
`

func isTerminal(f *os.File) bool {
	fi, err := f.Stat()
	return err == nil && fi.Mode()&os.ModeCharDevice != 0
}

// runScreen runs the planning screen. Every change is saved while it runs;
// on SIGHUP (the SSH link dropped) or SIGTERM the screen is told to stop and
// the job is saved once more before exit.
func runScreen(stderr io.Writer) int {
	start := tui.OpenStart()
	// The same catalogue as the command line: built-in plus the user's file.
	cat, err := presets.Load("")
	if err != nil {
		start.Note = strings.TrimSpace(start.Note + " user presets not loaded (built-in catalogue in use): " + err.Error())
	}
	m := tui.New(tui.Options{Start: start, Cat: cat})
	p := tea.NewProgram(m)

	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, syscall.SIGHUP, syscall.SIGTERM)
	defer signal.Stop(sigs)
	go func() {
		if s, ok := <-sigs; ok {
			p.Send(tui.StopMsg{Reason: strings.ToUpper(signalName(s))})
		}
	}()

	final, err := p.Run()
	code := 0
	if err != nil {
		fmt.Fprintln(stderr, "drawdown:", err)
		code = 1
	}
	if fm, ok := final.(*tui.Model); ok {
		if serr := tui.SaveFinal(fm); serr != nil {
			fmt.Fprintln(stderr, "drawdown: the job was NOT saved at exit:", serr)
			return 1
		}
	}
	return code
}

func signalName(s os.Signal) string {
	switch s {
	case syscall.SIGHUP:
		return "sighup"
	case syscall.SIGTERM:
		return "sigterm"
	}
	return s.String()
}
