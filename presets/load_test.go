package presets

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// writeFile writes src to name in a fresh temporary directory.
func writeFile(t *testing.T, name, src string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(src), 0o600); err != nil {
		t.Fatal(err)
	}
	return p
}

const goodUser = "[[hose]]\nid = \"30mm\"\ninside_diameter_mm = 30\nsource = \"measured\"\n"

// Load is what the command line (loadCatalogue) and the screen call: every
// outcome gives a usable catalogue; the error says when the user file was
// not used.
func TestLoad(t *testing.T) {
	builtinHoses := len(Builtin().Hoses())
	big := strings.Repeat("# padding line\n", maxUserFile/15+1)
	exact := strings.Repeat("#", maxUserFile-1) + "\n"
	cases := []struct {
		name   string
		path   func(t *testing.T) string
		merged bool  // the user file's hose is in the catalogue
		is     error // nil: no error
		line   int   // ParseError line, when > 0
	}{
		{"no file", func(t *testing.T) string { return filepath.Join(t.TempDir(), "presets.toml") }, false, nil, 0},
		{"good file", func(t *testing.T) string { return writeFile(t, "p.toml", goodUser) }, true, nil, 0},
		{"empty file", func(t *testing.T) string { return writeFile(t, "p.toml", "") }, false, nil, 0},
		{"exactly 1 MiB", func(t *testing.T) string { return writeFile(t, "p.toml", exact) }, false, nil, 0},
		{"bad value", func(t *testing.T) string {
			return writeFile(t, "p.toml", "[[hose]]\nid = \"h\"\ninside_diameter_mm = 5000\nsource = \"s\"\n")
		}, false, new(ParseError), 3},
		{"too large", func(t *testing.T) string { return writeFile(t, "p.toml", big) }, false, ErrTooLarge, 0},
		{"directory", func(t *testing.T) string { return t.TempDir() }, false, ErrNotRegularFile, 0},
		{"symlink to a good file", func(t *testing.T) string {
			p := writeFile(t, "p.toml", goodUser)
			l := filepath.Join(t.TempDir(), "link.toml")
			if err := os.Symlink(p, l); err != nil {
				t.Fatal(err)
			}
			return l
		}, true, nil, 0},
	}
	for _, k := range cases {
		t.Run(k.name, func(t *testing.T) {
			path := k.path(t)
			c, err := Load(path)
			if c == nil {
				t.Fatal("no catalogue")
			}
			switch {
			case k.is == nil && err != nil:
				t.Fatalf("error %v", err)
			case k.is != nil && err == nil:
				t.Fatal("no error")
			case k.is != nil:
				var pe *ParseError
				if !errors.As(err, &pe) || pe.File != path {
					t.Errorf("%v: not a *ParseError naming the file", err)
				}
				if _, ok := k.is.(*ParseError); !ok && !errors.Is(err, k.is) {
					t.Errorf("%v does not wrap %v", err, k.is)
				}
				if k.line > 0 && pe.Line != k.line {
					t.Errorf("line %d, want %d", pe.Line, k.line)
				}
				if strings.Count(err.Error(), "\n") > 0 {
					t.Errorf("error is not one line: %q", err)
				}
			}
			_, has := c.Hose("30mm")
			if has != k.merged {
				t.Errorf("user hose present: %v, want %v", has, k.merged)
			}
			if n := len(c.Hoses()); n != builtinHoses+btoi(k.merged) {
				t.Errorf("%d hoses, built-in %d", n, builtinHoses)
			}
		})
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// An empty path reads UserFile(): <config dir>/drawdown/presets.toml.
func TestLoadDefaultPath(t *testing.T) {
	dir := t.TempDir()
	t.Setenv("XDG_CONFIG_HOME", dir)
	t.Setenv("HOME", dir)
	if !strings.HasPrefix(UserFile(), dir) {
		t.Fatalf("UserFile() = %q is not under the test's config directory %s", UserFile(), dir)
	}
	if c, err := Load(""); err != nil || len(c.Hoses()) != len(Builtin().Hoses()) {
		t.Fatalf("no user file: %v", err)
	}
	if err := os.MkdirAll(filepath.Dir(UserFile()), 0o700); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(UserFile(), []byte(goodUser), 0o600); err != nil {
		t.Fatal(err)
	}
	c, err := Load("")
	if _, ok := c.Hose("30mm"); err != nil || !ok {
		t.Errorf("user file not merged: %v", err)
	}
}

// loadWithin runs Load in a goroutine and fails if it takes longer than d:
// a refused special file must never block.
func loadWithin(t *testing.T, path string, d time.Duration) (*Catalogue, error) {
	t.Helper()
	type res struct {
		c   *Catalogue
		err error
	}
	ch := make(chan res, 1)
	go func() { c, err := Load(path); ch <- res{c, err} }()
	select {
	case r := <-ch:
		return r.c, r.err
	case <-time.After(d):
		t.Fatalf("Load(%q) still running after %v", path, d)
	}
	return nil, nil
}

// A character device (/dev/zero: endless; /dev/null: empty) is refused by
// its type, not read.
func TestLoadDevice(t *testing.T) {
	for _, dev := range []string{"/dev/zero", "/dev/null"} {
		fi, err := os.Stat(dev)
		if err != nil || fi.Mode()&fs.ModeCharDevice == 0 {
			continue // not on this platform
		}
		c, err := loadWithin(t, dev, 5*time.Second)
		if !errors.Is(err, ErrNotRegularFile) || c == nil || !strings.Contains(err.Error(), "character device") {
			t.Errorf("%s: %v", dev, err)
		}
	}
}
