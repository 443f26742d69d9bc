// Command drawdown plans, checks and records siphon drains of tanks, sumps,
// pits and ponds.
//
//	drawdown                 the terminal screen, on the last job or the demo job
//	drawdown calc [flags]    one case without the screen (--json for JSON)
//	drawdown presets         the built-in catalogue
//	drawdown report JOB      the job record, beside the job file
//	drawdown help [COMMAND]  help; every command also answers -h and --help
//	drawdown version         the version and VCS revision (also --version)
//	drawdown completion SH   a completion script for bash, zsh or fish
//	drawdown serve           the job on an SSH server for a crew (package serve)
//
// The command line lives in this package, one file per command (cmd_*.go);
// each turns its flags into model inputs and lays out what model and its
// presentation layer say. The screen is package tui. Neither decides or words
// anything the other could word differently.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"
	"sync/atomic"
	"syscall"

	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/term"

	"drawdown/model"
	"drawdown/model/present"
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
	// Error lines quote what a person typed or a file held: they pass the
	// one sanitiser, so no byte of it acts on the terminal.
	stderr = cleanWriter{stderr}
	if len(args) > 0 {
		switch args[0] {
		case "calc":
			return runCalc(args[1:], stdout, stderr)
		case "presets":
			return runPresets(args[1:], stdout, stderr)
		case "report":
			return runReport(args[1:], stdout, stderr)
		case "checklist":
			return runChecklist(args[1:], stdout, stderr)
		case "new":
			return runNew(args[1:], stdout, stderr)
		case "jobs":
			return runJobs(args[1:], stdout, stderr)
		case "serve":
			return runServe(args[1:], stdout, stderr)
		case "version", "--version":
			return runVersion(args[1:], stdout, stderr)
		case "completion":
			return runCompletion(args[1:], stdout, stderr)
		case "__complete": // hidden: the completion scripts call it
			return runComplete(args[1:], stdout, stderr)
		case "help":
			return runHelp(args[1:], stdout, stderr)
		case "-h", "--help":
			fmt.Fprint(stdout, usage)
			return ExitOK
		}
		fmt.Fprintf(stderr, "drawdown: unknown command %q\n%s", args[0], usage)
		return ExitUsage
	}
	if msg := noScreen(isTerminal(os.Stdin), isTerminal(os.Stdout), os.Getenv("TERM")); msg != "" {
		fmt.Fprintln(stderr, msg)
		return ExitUsage
	}
	return runScreen(stderr)
}

// runHelp is `drawdown help [COMMAND]`: the top-level usage, or that
// command's own help (every command answers --help).
func runHelp(args []string, stdout, stderr io.Writer) int {
	switch {
	case len(args) == 0:
		fmt.Fprint(stdout, usage)
		return ExitOK
	case len(args) > 1:
		fmt.Fprintf(stderr, "drawdown help: one command at a time (got %q)\n", strings.Join(args, " "))
		return ExitUsage
	case args[0] == "help" || args[0] == "-h" || args[0] == "--help":
		fmt.Fprint(stdout, usage)
		return ExitOK
	}
	for _, c := range commands() {
		if c.value == args[0] {
			return run([]string{args[0], "--help"}, stdout, stderr)
		}
	}
	fmt.Fprintf(stderr, "drawdown help: %q is not a command; the commands are %s\n", args[0], commandList())
	return ExitUsage
}

func commandList() string {
	var names []string
	for _, c := range commands() {
		names = append(names, c.value)
	}
	return strings.Join(names, ", ")
}

// usage is the top-level help. Its "  drawdown NAME" lines are the list of
// commands that `help` and shell completion use.
const usage = `drawdown — plan, run and record a siphon drain

usage:
  drawdown                   open the planning screen (last job, or the demo job)
  drawdown calc [flags]      compute one case without the screen; --json for JSON
  drawdown presets           list the built-in liquids, hoses, fittings and tanks with sources
  drawdown report JOB        write the job record (Markdown) and its readings CSV beside the job
  drawdown checklist         print the checklist a job with these facts gets
  drawdown new NAME          create a job (blank, or from --template ID) and print its path
  drawdown jobs              list the jobs: name, site, date and state
  drawdown serve             put the job on an SSH server for a crew (ssh -t HOST -p 2222)
  drawdown help [COMMAND]    this help, or a command's own (also: drawdown COMMAND --help)
  drawdown version           the version and revision (also: drawdown --version)
  drawdown completion SHELL  print a completion script for bash, zsh or fish

environment:
  DRAWDOWN_HOME      the data folder (jobs, last job); overrides XDG_DATA_HOME
  XDG_DATA_HOME      the data folder is $XDG_DATA_HOME/drawdown [~/.local/share/drawdown]
  XDG_CONFIG_HOME    user presets are read from $XDG_CONFIG_HOME/drawdown/presets.toml
                     [~/.config/drawdown/presets.toml]
  NO_COLOR           set to anything: the screen draws without colour (every state
                     also has a word or a mark)
  TERM               the terminal type; the screen needs one that moves the cursor (not dumb)

exit status: 0 done, 1 a file could not be read or written, 2 bad input (one line naming
the flag) or no terminal for the screen.

drawdown plans and records; it does not authorise a discharge or an entry. Local codes,
permits and licensed practice govern.
`

// noScreen says why the planning screen cannot start, in one line that
// blames the right cause and says what to do instead; "" when it can.
// stdin and stdout tell whether each is a terminal; termType is $TERM.
func noScreen(stdin, stdout bool, termType string) string {
	const calc = "for results without the screen use drawdown calc (drawdown calc --help)"
	switch {
	case !stdin && !stdout:
		return "drawdown: the planning screen needs a terminal, and neither input nor output is one (over ssh, use ssh -t); " + calc
	case !stdin:
		return "drawdown: the planning screen needs a terminal, and standard input is not one (over ssh, use ssh -t; no input redirect); " + calc
	case !stdout:
		return "drawdown: standard output is not a terminal (piped or redirected to a file), so the planning screen is not started; " + calc
	case termType == "dumb":
		return "drawdown: this terminal cannot move the cursor (TERM=dumb); set TERM to your terminal's type (e.g. xterm-256color), or " + calc
	}
	return ""
}

// isTerminal reports whether f is a terminal (a character device such as
// /dev/null is not).
func isTerminal(f *os.File) bool { return term.IsTerminal(f.Fd()) }

// runScreen runs the planning screen. Every edit is journalled as it is
// made (tui.Finish at the end writes the job file whole). The screen stops
// the same way however it is stopped, and logs why: q or ctrl+c; SIGHUP
// (the SSH link dropped), SIGTERM or SIGINT, each caught here alone
// (bubbletea's own handler is off, so that it cannot end the program
// before the stop is logged); or the terminal closing under it (a read
// error such as EIO, or the end of input).
func runScreen(stderr io.Writer) int {
	start := tui.OpenStart()
	if pr := start.Prompt; pr != nil && pr.Kind == tui.PromptLocked && pr.Holder.Server != "" {
		// The crew server holds the job: join its screen of the job.
		if code, ok := joinCrew(pr.Path, pr.Holder, stderr); ok {
			return code
		}
	}
	// The same catalogue as the command line: built-in plus the user's file.
	cat, err := presets.Load("")
	if err != nil {
		start.Note = strings.TrimSpace(start.Note + " user presets not loaded (built-in catalogue in use): " + err.Error())
	}
	m := tui.New(tui.Options{Start: start, Cat: cat})
	var p *tea.Program
	var reason atomic.Pointer[string]
	stop := func(why string) {
		if reason.CompareAndSwap(nil, &why) {
			p.Send(tui.StopMsg{Reason: why})
		}
	}
	in := newWatchedInput(os.Stdin, func(err error) { stop(inputEnded(err)) })
	p = tea.NewProgram(m, tea.WithoutSignalHandler(), tea.WithInput(in))
	sigs := make(chan os.Signal, 4)
	signal.Notify(sigs, syscall.SIGHUP, syscall.SIGTERM, syscall.SIGINT)
	defer signal.Stop(sigs)
	go func() {
		for s := range sigs {
			stop(strings.ToUpper(signalName(s)))
		}
	}()

	final, err := p.Run()
	code := 0
	why := ""
	if r := reason.Load(); r != nil {
		why = *r
	}
	if err != nil && why == "" {
		why = "the terminal closed: " + err.Error()
	}
	if err != nil && !strings.HasPrefix(why, "the terminal closed") {
		fmt.Fprintln(stderr, "drawdown:", err)
		code = 1
	}
	if fm, ok := final.(*tui.Model); ok {
		if serr := tui.Finish(fm, why); serr != nil {
			if errors.Is(serr, model.ErrSavedInJournal) || errors.Is(serr, tui.ErrForkedAtExit) {
				fmt.Fprintln(stderr, "drawdown:", serr)
				return code
			}
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
	case syscall.SIGINT:
		return "sigint"
	}
	return s.String()
}

// cleanWriter passes text through present.CleanText: line breaks kept,
// every other control character shown as a visible escape.
type cleanWriter struct{ w io.Writer }

func (c cleanWriter) Write(p []byte) (int, error) {
	if _, err := io.WriteString(c.w, present.CleanText(string(p))); err != nil {
		return 0, err
	}
	return len(p), nil
}
