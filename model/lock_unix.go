//go:build unix

package model

import (
	"errors"
	"os"
	"syscall"
)

// flockWorks: the system has advisory file locks that end with the process
// (flock), so a stale lock is known for certain.
const flockWorks = true

// tryLockFile takes an exclusive advisory lock on f without waiting; got is
// false when another open file holds it.
func tryLockFile(f *os.File) (got bool, err error) {
	for {
		err = syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB)
		if !errors.Is(err, syscall.EINTR) {
			break
		}
	}
	if errors.Is(err, syscall.EWOULDBLOCK) {
		return false, nil
	}
	return err == nil, err
}

// probeLockFile reports whether no one holds f's advisory lock (it takes
// the lock and gives it back at once).
func probeLockFile(f *os.File) (free bool, err error) {
	got, err := tryLockFile(f)
	if got {
		syscall.Flock(int(f.Fd()), syscall.LOCK_UN)
	}
	return got, err
}
