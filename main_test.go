package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestDumbTerminal: with TERM=dumb the screen does not start; the message
// says a cursor-addressable terminal is needed and points to drawdown calc.
func TestDumbTerminal(t *testing.T) {
	t.Setenv("TERM", "dumb")
	var out, errb bytes.Buffer
	if code := run(nil, &out, &errb); code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	if !strings.Contains(errb.String(), "cannot move the cursor") || !strings.Contains(errb.String(), "drawdown calc") {
		t.Errorf("message: %q", errb.String())
	}
	if out.Len() != 0 {
		t.Errorf("wrote to stdout: %q", out.String())
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
