//go:build unix

package presets

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// A named pipe with no writer would block a plain open forever: Load
// refuses it by its type at once (issue 16: --tank-table on a FIFO hung).
func TestLoadFIFO(t *testing.T) {
	p := filepath.Join(t.TempDir(), "presets.toml")
	if err := syscall.Mkfifo(p, 0o600); err != nil {
		t.Fatalf("mkfifo: %v", err)
	}
	start := time.Now()
	c, err := loadWithin(t, p, 5*time.Second)
	if !errors.Is(err, ErrNotRegularFile) || !strings.Contains(err.Error(), "named pipe") || c == nil {
		t.Errorf("FIFO: %v", err)
	}
	if d := time.Since(start); d > time.Second {
		t.Errorf("FIFO refused after %v", d)
	}
	// What was opened is checked too (the path may change between Stat
	// and Open): checkFileInfo refuses the FIFO's own FileInfo.
	fi, err := os.Lstat(p)
	if err != nil {
		t.Fatal(err)
	}
	if err := checkFileInfo(p, fi); !errors.Is(err, ErrNotRegularFile) {
		t.Errorf("checkFileInfo(FIFO) = %v", err)
	}
}
