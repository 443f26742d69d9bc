package testkit

import (
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestWithin(t *testing.T) {
	cases := []struct {
		got, want, tol float64
		ok             bool
	}{
		{1.0001, 1, 1e-4, true},
		{1.0002, 1, 1e-4, false},
		{-2.0002, -2, 1e-4, true},   // relative to |want|
		{1e-13, 0, 1e-12, true},     // absolute at zero
		{2e-12, 0, 1e-12, false},    // absolute at zero
		{5e-13, 1e-13, 1e-12, true}, // want below NearZero: absolute
		{math.NaN(), 0, 1, false},
		{math.Inf(1), 1, 1e9, false},
		{611.2127 + 0.00004, 611.2127, 0.00005 / 611.2127, true}, // an absolute δ as δ/|want|
		{611.2127 + 0.00006, 611.2127, 0.00005 / 611.2127, false},
	}
	for _, c := range cases {
		if got := Within(c.got, c.want, c.tol); got != c.ok {
			t.Errorf("Within(%g, %g, %g) = %v, want %v (definition in Within's doc)", c.got, c.want, c.tol, got, c.ok)
		}
	}
}

// recorder is a testing.TB that records failures instead of stopping.
type recorder struct {
	testing.TB
	failed bool
	msg    string
}

func (r *recorder) Helper() {}
func (r *recorder) Errorf(f string, a ...any) {
	r.failed = true
	r.msg += fmt.Sprintf(f, a...) + "\n"
}
func (r *recorder) Fatalf(f string, a ...any) { r.Errorf(f, a...) }
func (r *recorder) Logf(string, ...any)       {}

func TestCloseNamesTheSource(t *testing.T) {
	r := &recorder{TB: t}
	if Close(r, "case", 2, 1, 1e-3, "Handbook, Table 9") || !r.failed {
		t.Fatal("Close passed a wrong value")
	}
	if want := "case: got 2, want 1 ±0.001 relative (Handbook, Table 9)\n"; r.msg != want {
		t.Errorf("message %q, want %q", r.msg, want)
	}
	r = &recorder{TB: t}
	if !Close(r, "case", 1, 1, 0, "exact") || r.failed {
		t.Error("Close failed an exact value")
	}
}

func TestGolden(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "sub", "x.golden")

	r := &recorder{TB: t}
	Golden(r, path, []byte("a\n"))
	if !r.failed {
		t.Fatal("a missing golden file did not fail")
	}

	if err := flag.Set("update", "true"); err != nil {
		t.Fatal(err)
	}
	r = &recorder{TB: t}
	Golden(r, path, []byte("a\nb\n"))
	if err := flag.Set("update", "false"); err != nil {
		t.Fatal(err)
	}
	if b, err := os.ReadFile(path); r.failed || err != nil || string(b) != "a\nb\n" {
		t.Fatalf("-update did not write the file: %q %v %s", b, err, r.msg)
	}

	r = &recorder{TB: t}
	Golden(r, path, []byte("a\nb\n"))
	if r.failed {
		t.Fatalf("equal output failed: %s", r.msg)
	}
	r = &recorder{TB: t}
	Golden(r, path, []byte("a\nc\n"))
	if !r.failed || !strings.Contains(r.msg, "line 2") {
		t.Fatalf("a difference was not reported at line 2: %q", r.msg)
	}
}
