package model

import (
	"crypto/rand"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"os/user"
	"path/filepath"
	"strconv"
	"time"
)

// The job lock: one process owns a job file while it is open for writing.
// The lock is a file beside the job file, ".NAME.lock", holding one JSON
// object in format version 1:
//
//	{"schema":"drawdown-lock","version":1,"pid":4121,"host":"van-2","user":"amarsh",
//	 "since":"2026-03-14T09:00:05Z","token":"9c1f…","server":""}
//
// and the owner holds an exclusive advisory lock (flock) on it for as long
// as the process lives, so that a crashed owner's lock is known to be stale
// the moment the process is gone, whatever the record says. "server" is
// the address (host:port) of a drawdown server that holds the job for a
// crew, empty for a screen on a terminal.
//
// Taking a lock over removes the holder's file and makes a new one; the
// holder finds at its next write that the file at the lock's path is no
// longer the one it locked (Lock.Held), stops writing and says who took it.

// LockVersion is the lock-file format version this build writes.
const LockVersion = 1

const lockSchema = "drawdown-lock"

// LockPath is the lock file beside the job file at jobPath.
func LockPath(jobPath string) string { return sidePath(jobPath, ".lock") }

// SocketPath is the crew server's local socket beside the job file at
// jobPath, ".NAME.sock": a screen on the same machine that finds the job
// held by a server (LockInfo.Server) joins the crew's job through it.
func SocketPath(jobPath string) string { return sidePath(jobPath, ".sock") }

// LockInfo is who holds a job file.
type LockInfo struct {
	Schema  string    `json:"schema"`
	Version int       `json:"version"`
	PID     int       `json:"pid"`
	Host    string    `json:"host"`
	User    string    `json:"user,omitempty"`
	Since   time.Time `json:"since"`
	// Server is the address (host:port) of the drawdown server holding the
	// job for a crew; "" for a screen on a terminal.
	Server string `json:"server,omitempty"`
	// Token tells one holding from another (a PID is reused).
	Token string `json:"token"`
}

// Who words the holder for a person: "process 4121 on van-2 (user amarsh)
// since 14 Mar 09:00", or "the drawdown server at ADDR on HOST since …".
func (i LockInfo) Who(loc *time.Location) string {
	if loc == nil {
		loc = time.Local
	}
	since := i.Since.In(loc).Format("2 Jan 15:04")
	if i.Server != "" {
		return "the drawdown server at " + i.Server + " on " + i.Host + " since " + since
	}
	s := "process " + strconv.Itoa(i.PID) + " on " + i.Host
	if i.User != "" {
		s += " (user " + i.User + ")"
	}
	return s + " since " + since
}

// LockOwner is what a caller says about itself when it takes a lock; the
// process, host, user and time are filled in.
type LockOwner struct {
	// Server is the server's address when a server takes the lock.
	Server string
}

// Errors of the lock; test with errors.Is.
var (
	// ErrLocked: another process holds the job (*LockedError says who).
	ErrLocked = errors.New("job open elsewhere")
	// ErrLockLost: this process held the job, and another took it over
	// (*LockLostError says who).
	ErrLockLost = errors.New("job taken over")
)

// LockedError reports a job file held by another process.
type LockedError struct {
	Path   string
	Holder LockInfo // zero when the lock file does not say (Unknown)
	// Unknown: the lock is held but its record cannot be read (being
	// written at this moment, or not written by this tool).
	Unknown bool
}

func (e *LockedError) Error() string {
	if e.Unknown {
		return "job file " + e.Path + " is open in another drawdown (which one, its lock does not say)"
	}
	return "job file " + e.Path + " is open in another drawdown: " + e.Holder.Who(nil)
}

// Unwrap returns ErrLocked.
func (e *LockedError) Unwrap() error { return ErrLocked }

// LockLostError reports a lock taken over by another process.
type LockLostError struct {
	Path string
	By   LockInfo // zero when the new lock cannot be read
}

func (e *LockLostError) Error() string {
	if e.By.Token == "" {
		return "job file " + e.Path + ": its lock was removed or taken by another drawdown; this screen no longer saves it"
	}
	return "job file " + e.Path + " was taken over by " + e.By.Who(nil) + "; this screen no longer saves it"
}

// Unwrap returns ErrLockLost.
func (e *LockLostError) Unwrap() error { return ErrLockLost }

// Lock is a job file held by this process.
type Lock struct {
	path string // the lock file
	job  string
	f    *os.File
	fi   os.FileInfo
	Info LockInfo
	// Cleared is the record of a stale lock that was cleared (its process
	// had ended), nil when there was none.
	Cleared *LockInfo
	// TakenFrom is the holder the lock was taken over from (TakeOverLock),
	// nil when it was free.
	TakenFrom *LockInfo
}

// AcquireLock takes the lock of the job file at jobPath for this process.
// A lock left by a process that has ended is cleared (Lock.Cleared). A
// lock held by a live process is a *LockedError naming it.
func AcquireLock(jobPath string, o LockOwner) (*Lock, error) {
	lp := LockPath(jobPath)
	if err := os.MkdirAll(filepath.Dir(lp), 0o700); err != nil {
		return nil, &JobFileError{Path: jobPath, Detail: "cannot make the folder: " + plainIOError(err), Err: err}
	}
	for range 5 {
		f, err := os.OpenFile(lp, os.O_RDWR|os.O_CREATE, 0o600)
		if err != nil {
			return nil, &JobFileError{Path: jobPath, Detail: "cannot make its lock file " + lp + ": " + plainIOError(err), Err: err}
		}
		got, err := tryLockFile(f)
		if err != nil {
			f.Close()
			return nil, &JobFileError{Path: jobPath, Detail: "cannot lock it: " + plainIOError(err), Err: err}
		}
		prev, perr := readLockInfo(f)
		if !got || (!flockWorks && perr == nil && prev.Token != "") {
			f.Close()
			return nil, &LockedError{Path: jobPath, Holder: prev, Unknown: perr != nil}
		}
		// The file locked must still be the one at the path: a holder may
		// have released it (removing it) between the open and the lock.
		fi, err := f.Stat()
		if err != nil || !sameFileAt(fi, lp) {
			f.Close()
			continue
		}
		if owner, err := ownerOf(jobPath); err == nil {
			owner.give(f) // root opening another user's job: the lock stays theirs to clear
		}
		l := &Lock{path: lp, job: jobPath, f: f, fi: fi}
		if perr == nil && prev.Token != "" {
			l.Cleared = &prev
		}
		if err := l.write(o); err != nil {
			f.Close()
			return nil, err
		}
		return l, nil
	}
	return nil, &JobFileError{Path: jobPath, Detail: "cannot lock it: its lock file keeps changing; another drawdown is opening it", Err: ErrLocked}
}

// TakeOverLock takes the lock of the job file at jobPath from its holder,
// who stops writing at its next save (Lock.Held). Lock.TakenFrom names
// the holder. The caller should have read the job after this returns, not
// before, so that every edit the holder journalled is in it.
func TakeOverLock(jobPath string, o LockOwner) (*Lock, error) {
	lp := LockPath(jobPath)
	var prev *LockInfo
	if f, err := os.Open(lp); err == nil {
		if info, err := readLockInfo(f); err == nil && info.Token != "" {
			prev = &info
		}
		f.Close()
	}
	if err := os.Remove(lp); err != nil && !errors.Is(err, os.ErrNotExist) {
		return nil, &JobFileError{Path: jobPath, Detail: "cannot take its lock over: " + plainIOError(err), Err: err}
	}
	l, err := AcquireLock(jobPath, o)
	if err != nil {
		return nil, err
	}
	if prev != nil && l.Cleared == nil {
		l.TakenFrom = prev
	}
	return l, nil
}

// ReadLock says who holds the job file at jobPath: held is false when no
// live process does (no lock file, or a stale one).
func ReadLock(jobPath string) (info LockInfo, held bool, err error) {
	f, err := os.OpenFile(LockPath(jobPath), os.O_RDWR, 0)
	if errors.Is(err, os.ErrNotExist) {
		return LockInfo{}, false, nil
	}
	if err != nil {
		return LockInfo{}, false, err
	}
	defer f.Close()
	info, _ = readLockInfo(f)
	free, err := probeLockFile(f)
	if err != nil {
		return info, false, err
	}
	if !flockWorks {
		return info, info.Token != "", nil
	}
	return info, !free, nil
}

func (l *Lock) write(o LockOwner) error {
	host, _ := os.Hostname()
	who := ""
	if u, err := user.Current(); err == nil {
		who = u.Username
	}
	var tok [12]byte
	rand.Read(tok[:])
	l.Info = LockInfo{Schema: lockSchema, Version: LockVersion, PID: os.Getpid(), Host: host, User: who,
		Since: time.Now().UTC().Truncate(time.Second), Server: o.Server, Token: hex.EncodeToString(tok[:])}
	b, err := json.Marshal(l.Info)
	if err != nil {
		return err
	}
	b = append(b, '\n')
	fail := func(err error) error {
		return &JobFileError{Path: l.job, Detail: "cannot write its lock file " + l.path + ": " + plainIOError(err), Err: err}
	}
	if err := l.f.Truncate(0); err != nil {
		return fail(err)
	}
	if _, err := l.f.WriteAt(b, 0); err != nil {
		return fail(err)
	}
	if err := l.f.Sync(); err != nil {
		return fail(err)
	}
	if fi, err := l.f.Stat(); err == nil {
		l.fi = fi
	}
	return nil
}

// Held reports whether this process still holds the lock: nil, or a
// *LockLostError naming who took it over (or saying that the lock file
// was removed).
func (l *Lock) Held() error {
	if l == nil || l.f == nil {
		return &LockLostError{Path: l.job}
	}
	if sameFileAt(l.fi, l.path) {
		return nil
	}
	e := &LockLostError{Path: l.job}
	// A take-over removes the old file and then writes its own record: for
	// a moment the path holds nothing or an empty file. Wait for the record
	// (at most lostWait) so the loss names who took the job.
	for deadline := time.Now().Add(lostWait); ; time.Sleep(5 * time.Millisecond) {
		if f, err := os.Open(l.path); err == nil {
			info, rerr := readLockInfo(f)
			f.Close()
			if rerr == nil && info.Token != "" {
				e.By = info
				break
			}
		}
		if time.Now().After(deadline) {
			break
		}
	}
	return e
}

// lostWait bounds how long Held waits for a taker's lock record.
const lostWait = 250 * time.Millisecond

// Release gives the lock up: the lock file is removed (when it is still
// this process's) and the advisory lock dropped.
func (l *Lock) Release() error {
	if l == nil || l.f == nil {
		return nil
	}
	var err error
	if sameFileAt(l.fi, l.path) {
		if rerr := os.Remove(l.path); rerr != nil && !errors.Is(rerr, os.ErrNotExist) {
			err = rerr
		}
	}
	if cerr := l.f.Close(); err == nil {
		err = cerr
	}
	l.f = nil
	return err
}

func sameFileAt(fi os.FileInfo, path string) bool {
	cur, err := os.Stat(path)
	return err == nil && fi != nil && os.SameFile(fi, cur)
}

// maxLockSize bounds the bytes of a lock file read.
const maxLockSize = 4 << 10

func readLockInfo(f *os.File) (LockInfo, error) {
	b, err := io.ReadAll(io.NewSectionReader(f, 0, maxLockSize))
	if err != nil {
		return LockInfo{}, err
	}
	if len(b) == 0 {
		return LockInfo{}, nil
	}
	var info LockInfo
	if err := json.Unmarshal(b, &info); err != nil || info.Schema != lockSchema {
		return LockInfo{}, fmt.Errorf("not a drawdown lock")
	}
	return info, nil
}

// newSessionID is a random ID for a journal session.
func newSessionID() string {
	var b [8]byte
	rand.Read(b[:])
	return hex.EncodeToString(b[:])
}
