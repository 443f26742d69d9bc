//go:build unix

package model

import (
	"path/filepath"
	"syscall"
	"testing"
)

// makeFIFO makes a named pipe in dir (nothing ever writes to it: reading it
// would block for ever).
func makeFIFO(t *testing.T, dir string) (string, bool) {
	t.Helper()
	p := filepath.Join(dir, "table.fifo")
	if err := syscall.Mkfifo(p, 0o600); err != nil {
		t.Fatalf("mkfifo: %v", err)
	}
	return p, true
}
