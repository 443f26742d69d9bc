package main

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"runtime/debug"
	"strings"
	"testing"
	"time"
)

// TestMain lets a test run this test binary as drawdown itself (with
// DRAWDOWN_TEST_MAIN=1), so that the no-terminal checks see real pipes and
// files, not a pseudo-terminal and not in-process buffers.
func TestMain(m *testing.M) {
	if os.Getenv("DRAWDOWN_TEST_MAIN") == "1" {
		main()
	}
	os.Exit(m.Run())
}

// drawdownCmd runs this test binary as drawdown with args, in a clean data
// and config folder, with env added; it is stopped after 20 s (the screen
// must never start and wait).
func drawdownCmd(t *testing.T, env []string, args ...string) *exec.Cmd {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	t.Cleanup(cancel)
	cmd := exec.CommandContext(ctx, os.Args[0], args...)
	// GORACE: a race-enabled binary otherwise sleeps 1 s at exit.
	cmd.Env = append(os.Environ(), "DRAWDOWN_TEST_MAIN=1", "GORACE=atexit_sleep_ms=0", "DRAWDOWN_HOME="+t.TempDir(), "XDG_CONFIG_HOME="+t.TempDir())
	cmd.Env = append(cmd.Env, env...)
	return cmd
}

// TestNoTerminal starts drawdown with no arguments where no screen can be
// drawn, through pipes and files as a shell would set them up: the screen is
// not started (no escape codes written, no wait), one line on stderr names
// the real cause and points to drawdown calc (and ssh -t when the input is
// not a terminal), exit status 2.
func TestNoTerminal(t *testing.T) {
	cases := []struct {
		name        string
		env         []string
		stdin       string // "pipe", "null" or "file"
		stdout      string // "pipe" or "file"
		want, never []string
	}{
		// ssh host drawdown: ssh without -t gives the program pipes.
		{"ssh without -t", []string{"TERM=xterm-256color"}, "pipe", "pipe", []string{"neither input nor output", "ssh -t", "drawdown calc"}, []string{"TERM=dumb"}},
		// drawdown > file, run from a script with input from /dev/null.
		{"output to a file", []string{"TERM=xterm-256color"}, "null", "file", []string{"ssh -t", "drawdown calc"}, []string{"TERM=dumb"}},
		// TERM unset with output piped: not TERM's fault.
		{"TERM unset, piped", []string{"TERM="}, "pipe", "pipe", []string{"neither", "drawdown calc"}, []string{"TERM=dumb", "cannot move the cursor"}},
		// TERM=dumb with input from a file and output piped: the missing
		// terminal is the cause, not TERM.
		{"TERM=dumb, piped", []string{"TERM=dumb"}, "file", "pipe", []string{"neither", "ssh -t", "drawdown calc"}, []string{"TERM=dumb"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			cmd := drawdownCmd(t, c.env)
			dir := t.TempDir()
			switch c.stdin {
			case "pipe":
				cmd.Stdin = strings.NewReader("") // os/exec makes a pipe
			case "file":
				f, err := os.Create(filepath.Join(dir, "in"))
				if err != nil {
					t.Fatal(err)
				}
				defer f.Close()
				cmd.Stdin = f
			default: // nil: /dev/null, a character device that is not a terminal
			}
			var stdout, stderr bytes.Buffer
			outPath := filepath.Join(dir, "out")
			if c.stdout == "file" {
				f, err := os.Create(outPath)
				if err != nil {
					t.Fatal(err)
				}
				defer f.Close()
				cmd.Stdout = f
			} else {
				cmd.Stdout = &stdout
			}
			cmd.Stderr = &stderr
			err := cmd.Run()
			code := cmd.ProcessState.ExitCode()
			if err != nil && code != 2 {
				t.Fatalf("%v (exit %d), stderr %q", err, code, stderr.String())
			}
			if code != 2 {
				t.Errorf("exit %d, want 2", code)
			}
			msg := stderr.String()
			if strings.Count(msg, "\n") != 1 {
				t.Errorf("want one line, got %q", msg)
			}
			for _, w := range c.want {
				if !strings.Contains(msg, w) {
					t.Errorf("message lacks %q: %q", w, msg)
				}
			}
			for _, n := range c.never {
				if strings.Contains(msg, n) {
					t.Errorf("message blames the wrong cause (%q): %q", n, msg)
				}
			}
			written := stdout.Bytes()
			if c.stdout == "file" {
				written, _ = os.ReadFile(outPath)
			}
			if len(written) != 0 {
				t.Errorf("wrote %q to standard output", written)
			}
		})
	}
}

// TestNoScreenCauses: the decision behind the message, for the cases a pipe
// cannot set up (a terminal on one side only).
func TestNoScreenCauses(t *testing.T) {
	cases := []struct {
		stdin, stdout bool
		term          string
		want          string // "" for: the screen starts
	}{
		{true, true, "xterm-256color", ""},
		{true, true, "", ""}, // TERM unset on a terminal: the screen library copes
		{true, true, "dumb", "TERM=dumb"},
		{true, false, "xterm", "standard output is not a terminal"}, // drawdown | cat
		{true, false, "dumb", "standard output is not a terminal"},  // the pipe, not TERM
		{true, false, "", "standard output is not a terminal"},
		{false, true, "xterm", "ssh -t"}, // drawdown < file
		{false, false, "", "ssh -t"},     // ssh host drawdown
	}
	for _, c := range cases {
		got := noScreen(c.stdin, c.stdout, c.term)
		if c.want == "" && got != "" || !strings.Contains(got, c.want) {
			t.Errorf("stdin %v stdout %v TERM %q: %q, want %q", c.stdin, c.stdout, c.term, got, c.want)
		}
		if got != "" && (!strings.Contains(got, "drawdown calc") || strings.Contains(got, "\n")) {
			t.Errorf("stdin %v stdout %v TERM %q: %q is not one line pointing to drawdown calc", c.stdin, c.stdout, c.term, got)
		}
	}
}

// TestDispatch: the command names go to their commands; an unknown one is a
// usage error (exit 2, as design §4 has for bad input).
func TestDispatch(t *testing.T) {
	var out, errb bytes.Buffer
	if code := run([]string{"bogus"}, &out, &errb); code != 2 || !strings.Contains(errb.String(), "usage") {
		t.Errorf("bogus: exit %d, stderr %q", code, errb.String())
	}
	out.Reset()
	errb.Reset()
	code := run([]string{"calc", "--hose-id", "25mm", "--hose-length", "10m", "--lift", "1m", "--drop", "2m", "--json"}, &out, &errb)
	if code != 0 || !strings.Contains(out.String(), "flow_m3_s") {
		t.Errorf("calc: exit %d, stdout %q, stderr %q", code, out.String(), errb.String())
	}
}

// TestEveryCommandHelps: every command in the top-level usage answers -h and
// --help with its own help on stdout and exit 0, and `help COMMAND` prints
// the same.
func TestEveryCommandHelps(t *testing.T) {
	cmds := commands()
	if len(cmds) < 6 {
		t.Fatalf("the usage lists %d commands: %v", len(cmds), cmds)
	}
	for _, c := range cmds {
		var want string
		for _, flag := range []string{"--help", "-h"} {
			out, stderr, code := runCmd(t, c.value, flag)
			if code != 0 || out == "" || stderr != "" {
				t.Errorf("%s %s: exit %d, stdout %d bytes, stderr %q", c.value, flag, code, len(out), stderr)
			}
			want = out
		}
		out, _, code := runCmd(t, "help", c.value)
		if code != 0 || out != want {
			t.Errorf("help %s: exit %d; not the command's own help:\n%s", c.value, code, out)
		}
		if c.value != "help" && c.value != "completion" && out == usage {
			t.Errorf("help %s prints the top-level usage", c.value)
		}
	}
	if _, stderr, code := runCmd(t, "help", "nope"); code != 2 || !strings.Contains(stderr, "calc") {
		t.Errorf("help nope: exit %d %q", code, stderr)
	}
}

// TestUsageNamesEnvironment: every environment variable drawdown reads is
// in --help.
func TestUsageNamesEnvironment(t *testing.T) {
	out, _, _ := runCmd(t, "--help")
	for _, v := range []string{"DRAWDOWN_HOME", "XDG_DATA_HOME", "XDG_CONFIG_HOME", "NO_COLOR", "TERM"} {
		if !strings.Contains(out, "  "+v+" ") {
			t.Errorf("--help does not list %s", v)
		}
	}
}

func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"--version"}, {"version"}} {
		out, stderr, code := runCmd(t, args...)
		if code != 0 || !strings.HasPrefix(out, "drawdown ") || strings.Count(out, "\n") != 1 || stderr != "" {
			t.Errorf("%v: exit %d %q %q", args, code, out, stderr)
		}
	}
	bi := &debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Path: "drawdown", Version: "(devel)"},
		Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: "c177113aa"}, {Key: "vcs.time", Value: "2026-01-02T03:04:05Z"}, {Key: "vcs.modified", Value: "true"}}}
	cases := []struct {
		bi   *debug.BuildInfo
		ok   bool
		want string
	}{
		{bi, true, "drawdown devel, revision c177113aa (2026-01-02T03:04:05Z, uncommitted changes), go1.26.8"},
		{&debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Version: "v1.2.0"}, Settings: bi.Settings[:2]}, true,
			"drawdown v1.2.0, revision c177113aa (2026-01-02T03:04:05Z), go1.26.8"},
		{&debug.BuildInfo{GoVersion: "go1.26.8"}, true, "drawdown devel, no revision recorded (built without version control information), go1.26.8"},
		{nil, false, "drawdown devel, no build information recorded"},
	}
	for _, c := range cases {
		if got := versionLine(c.bi, c.ok); got != c.want {
			t.Errorf("got  %q\nwant %q", got, c.want)
		}
	}
}
