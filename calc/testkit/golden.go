package testkit

import (
	"bytes"
	"errors"
	"flag"
	"io/fs"
	"os"
	"path/filepath"
	"testing"
)

// update is the one -update flag of the house: go test ./... -update
// rewrites every golden file a test compares with.
var update = flag.Bool("update", false, "rewrite golden files with the output of this run")

// Updating reports whether the run was asked to rewrite golden files.
func Updating() bool { return *update }

// Golden compares got with the golden file at path (relative to the test's
// package directory, usually under testdata/).
//
// With -update it writes got to path instead (creating its directory) and
// logs that it did. Without -update a missing golden file fails the test: a
// fixture that is not there is an error, never a skip. A difference fails
// the test with the first differing line of each side.
func Golden(t testing.TB, path string, got []byte) {
	t.Helper()
	if *update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatalf("golden %s: %v", path, err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatalf("golden %s: %v", path, err)
		}
		t.Logf("golden %s rewritten (%d bytes)", path, len(got))
		return
	}
	want, err := os.ReadFile(path)
	if errors.Is(err, fs.ErrNotExist) {
		t.Fatalf("golden file %s is missing; create it with go test -update after checking the output", path)
	}
	if err != nil {
		t.Fatalf("golden %s: %v", path, err)
	}
	if bytes.Equal(got, want) {
		return
	}
	line, g, w := firstDiff(got, want)
	t.Errorf("output differs from golden file %s at line %d:\n got: %q\nwant: %q\n(rerun with -update after checking the change)", path, line, g, w)
}

// firstDiff returns the 1-based number of the first line where a and b
// differ, and that line of each ("" past the end).
func firstDiff(a, b []byte) (int, string, string) {
	la, lb := bytes.Split(a, []byte("\n")), bytes.Split(b, []byte("\n"))
	for i := 0; ; i++ {
		var x, y []byte
		okA, okB := i < len(la), i < len(lb)
		if okA {
			x = la[i]
		}
		if okB {
			y = lb[i]
		}
		if !okA && !okB {
			return i, "", "" // unreachable for a ≠ b
		}
		if okA != okB || !bytes.Equal(x, y) {
			return i + 1, string(x), string(y)
		}
	}
}
