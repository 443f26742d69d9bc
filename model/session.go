package model

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"time"
)

// A Session is a job file open for writing by this process: it holds the
// job's lock, appends each edit to the journal (Record, a plain write that
// survives a killed process), and writes the job file whole at checkpoints
// (Checkpoint, atomic, mode 0600), after which the journal's records are
// dropped (Compact). It never overwrites a job file changed on disk since
// the session last read or wrote it: the session's version goes to a copy
// beside it instead (CheckpointResult.Forked), and saves go there.
//
// Record and Compact are called from one goroutine (the screen's); one
// Checkpoint at a time may run in another.
type Session struct {
	mu    sync.Mutex // guards everything below
	path  string
	id    string
	lock  *Lock
	jr    *Journal
	stamp fileStamp // the job file as this session last wrote or read it
	owner LockOwner
	done  bool

	ck chan struct{} // one checkpoint at a time (a semaphore)
}

// SessionOptions are how a session is opened.
type SessionOptions struct {
	Owner LockOwner
	// TakeOver takes the lock from a process that holds it, instead of
	// failing with a *LockedError.
	TakeOver bool
}

// OpenReport says what OpenSession found and did, for the log.
type OpenReport struct {
	Replayed    int       // journal records applied
	JournalNote string    // records left out, and why ("" when none)
	StaleLock   *LockInfo // a lock left by a process that ended, cleared
	TookOver    *LockInfo // the holder the lock was taken from
}

// OpenSession opens the job file at path for writing: it takes the lock
// (see SessionOptions), reads the job and applies its journal. When the
// journal held edits, the job is written whole at once and a new journal
// begun. Errors: *LockedError, or the *JobFileError of a file that cannot
// be read (the lock is then released and the file left unchanged).
func OpenSession(path string, o SessionOptions) (*Session, Job, OpenReport, error) {
	var rep OpenReport
	take := AcquireLock
	if o.TakeOver {
		take = TakeOverLock
	}
	lock, err := take(path, o.Owner)
	if err != nil {
		return nil, Job{}, rep, err
	}
	rep.StaleLock, rep.TookOver = lock.Cleared, lock.TakenFrom
	for range 3 {
		j, mark, stamp, err := loadFile(path)
		if err != nil {
			lock.Release()
			return nil, Job{}, rep, err
		}
		jl, jerr := readJournal(JournalPath(path))
		applied, last, note := 0, mark.Seq, ""
		if jerr != nil {
			note = jerr.Error() + "; its edits were not applied, and it was kept as " + keepAside(JournalPath(path))
		} else {
			base := j.Clone()
			applied, last, note, _ = jl.replay(&j, mark)
			if cerr := checkJob(&j); cerr != nil {
				j, applied, last = base, 0, mark.Seq
				note = "the journal's edits leave the job unreadable (" + cerr.Error() + "); not applied, and it was kept as " +
					keepAside(JournalPath(path))
			}
		}
		rep.Replayed, rep.JournalNote = applied, note
		s := &Session{path: path, lock: lock, stamp: stamp, owner: o.Owner, ck: make(chan struct{}, 1)}
		if applied == 0 && mark.ID != "" && note == "" {
			// Nothing to bring in: go on with the file's session and its
			// numbering, without writing the job whole.
			s.id = mark.ID
			if s.jr, err = startJournal(JournalPath(path), path, s.id, &j); err != nil {
				lock.Release()
				return nil, Job{}, rep, err
			}
			s.jr.seq, s.jr.synced = last, last
			return s, j, rep, nil
		}
		// Write the job whole with the edits applied, under a new session.
		s.id = newSessionID()
		st, err := s.writeJob(j, 0, stamp)
		if errors.Is(err, ErrChangedOnDisk) {
			continue // changed while it was read: read it again
		}
		if err != nil {
			lock.Release()
			return nil, Job{}, rep, err
		}
		s.stamp = st
		if s.jr, err = startJournal(JournalPath(path), path, s.id, &j); err != nil {
			lock.Release()
			return nil, Job{}, rep, err
		}
		return s, j, rep, nil
	}
	lock.Release()
	return nil, Job{}, rep, &JobFileError{Path: path, Detail: "it keeps changing on disk while it is read (another program is writing it); not opened", Err: ErrChangedOnDisk}
}

// keepAside renames a file that cannot be used to NAME.unread-N beside it,
// so that nothing in it is lost, and returns the new name.
func keepAside(path string) string {
	for i := 1; i < 1000; i++ {
		p := fmt.Sprintf("%s.unread-%d", path, i)
		if _, err := os.Lstat(p); errors.Is(err, os.ErrNotExist) {
			if os.Rename(path, p) == nil {
				return filepath.Base(p)
			}
			break
		}
	}
	return filepath.Base(path) + " (could not be renamed)"
}

// CreateSession saves a job that is not on disk yet (the demo, a new job)
// at path and opens a session on it. It refuses a path where a file
// exists (fs.ErrExist in a *JobFileError).
func CreateSession(path string, j Job, o SessionOptions) (*Session, error) {
	lock, err := AcquireLock(path, o.Owner)
	if err != nil {
		return nil, err
	}
	if _, err := os.Lstat(path); err == nil {
		lock.Release()
		return nil, &JobFileError{Path: path, Detail: "a file is already there; not replaced", Err: os.ErrExist}
	}
	s := &Session{path: path, lock: lock, id: newSessionID(), owner: o.Owner, ck: make(chan struct{}, 1)}
	st, err := s.writeJob(j, 0, fileStamp{})
	if err != nil {
		lock.Release()
		return nil, err
	}
	s.stamp = st
	if s.jr, err = startJournal(JournalPath(path), path, s.id, &j); err != nil {
		lock.Release()
		return nil, err
	}
	return s, nil
}

// ErrChangedOnDisk: the job file was changed by someone else since this
// session read or wrote it.
var ErrChangedOnDisk = errors.New("job file changed on disk")

// writeJob writes j whole with the session's mark at seq, when the file is
// still as stamp says (else ErrChangedOnDisk); it returns the new stamp.
func (s *Session) writeJob(j Job, seq uint64, stamp fileStamp) (fileStamp, error) {
	cur, err := statStamp(s.path)
	if err != nil {
		return fileStamp{}, &JobFileError{Path: s.path, Detail: "cannot check the file: " + plainIOError(err), Err: err}
	}
	if !cur.same(stamp) {
		return fileStamp{}, &JobFileError{Path: s.path, Detail: "changed on disk by another program since it was opened; not overwritten", Err: ErrChangedOnDisk}
	}
	b, err := encodeFile(j, JournalMark{ID: s.id, Seq: seq})
	if err != nil {
		err.(*JobFileError).Path = s.path
		return fileStamp{}, err
	}
	return writeFileStamped(s.path, s.path, b, true)
}

// Path is the job file the session writes (it changes when a checkpoint
// forks the job to a copy).
func (s *Session) Path() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.path
}

// Record appends the edits of j since the last record to the journal (one
// plain write; nothing when nothing journalled changed). It fails once the
// lock is lost (a *LockLostError) or the journal cannot be written.
func (s *Session) Record(j *Job) (Change, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.done {
		return Change{}, errors.New("the job is closed")
	}
	r, changed, checkpoint, err := s.jr.snap.diff(j)
	if err != nil || r == nil {
		return Change{}, err
	}
	if err := s.lock.Held(); err != nil {
		return Change{}, err
	}
	if err := s.jr.write(r); err != nil {
		return Change{}, err
	}
	s.jr.snap.take(j, changed)
	return Change{Recorded: true, Checkpoint: checkpoint}, nil
}

// Seq is the number of the last journal record: a checkpoint of the job
// as it stands now holds the records up to it.
func (s *Session) Seq() uint64 {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.jr.Seq()
}

// CheckpointResult says what a checkpoint did beyond writing the file.
type CheckpointResult struct {
	// Forked is the old path when the job file had been changed on disk by
	// someone else: the session's job was saved as a copy (Session.Path)
	// instead, and the session goes on there.
	Forked string
}

// Checkpoint writes j, the job as it stood at journal record seq, to the
// job file whole. It may run in its own goroutine while Record goes on;
// Compact(seq) then drops the records it holds. A lost lock is a
// *LockLostError and nothing is written.
func (s *Session) Checkpoint(j Job, seq uint64) (CheckpointResult, error) {
	s.ck <- struct{}{}
	defer func() { <-s.ck }()
	return s.checkpoint(j, seq)
}

func (s *Session) checkpoint(j Job, seq uint64) (CheckpointResult, error) {
	s.mu.Lock()
	if s.done {
		s.mu.Unlock()
		return CheckpointResult{}, errors.New("the job is closed")
	}
	stamp, lock := s.stamp, s.lock
	s.mu.Unlock()
	if err := lock.Held(); err != nil {
		return CheckpointResult{}, err
	}
	st, err := s.writeJob(j, seq, stamp)
	if errors.Is(err, ErrChangedOnDisk) {
		return s.fork(j)
	}
	if err != nil {
		return CheckpointResult{}, err
	}
	s.mu.Lock()
	s.stamp = st
	s.mu.Unlock()
	return CheckpointResult{}, nil
}

// fork saves j as a copy beside the job file, which someone else changed,
// and moves the session there: a new lock, a new journal whose starting
// point is j (so the next Record carries every edit made since j), and the
// old journal and lock given up.
func (s *Session) fork(j Job) (CheckpointResult, error) {
	old := s.Path()
	dir := filepath.Dir(old)
	base := strings.TrimSuffix(filepath.Base(old), ".json")
	var ns *Session
	var err error
	for range 5 {
		ns, err = CreateSession(NewJobPath(dir, base+" conflict"), j, SessionOptions{Owner: s.owner})
		if !errors.Is(err, os.ErrExist) && !errors.Is(err, ErrLocked) {
			break
		}
	}
	if err != nil {
		return CheckpointResult{}, &JobFileError{Path: old, Err: ErrChangedOnDisk,
			Detail: "changed on disk by another program since it was opened, and a copy of this screen's version could not be saved: " + err.Error()}
	}
	s.mu.Lock()
	oldJr, oldLock := s.jr, s.lock
	s.path, s.id, s.lock, s.jr, s.stamp = ns.path, ns.id, ns.lock, ns.jr, ns.stamp
	s.mu.Unlock()
	oldJr.close(false)
	// The old journal's edits are all in the copy; left beside the other
	// version they would be applied to it at its next open.
	os.Remove(oldJr.path)
	oldLock.Release()
	return CheckpointResult{Forked: old}, nil
}

// Compact drops the journal records up to seq, which a checkpoint wrote.
func (s *Session) Compact(seq uint64) error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.done {
		return nil
	}
	return s.jr.compact(seq)
}

// ErrSavedInJournal: Close ran out of time before the job file was written
// whole; every edit is in the journal (written, and flushed to disk when
// time allowed), and the next open brings the file up to date.
var ErrSavedInJournal = errors.New("saved in the journal only")

// Close records j, writes the job file whole and gives the lock up, within
// wait: past it, Close returns ErrSavedInJournal and leaves the write to
// finish or to die with the process (the file is whole either way; the
// lock is then cleared as stale by the next open).
func (s *Session) Close(j Job, wait time.Duration) error {
	deadline := time.Now().Add(wait)
	if _, err := s.Record(&j); err != nil {
		return err
	}
	seq := s.Seq()
	done := make(chan error, 1)
	go func() {
		s.ck <- struct{}{}
		defer func() { <-s.ck }()
		_, err := s.checkpoint(j, seq)
		if err == nil {
			err = s.Compact(seq)
		}
		done <- err
	}()
	select {
	case err := <-done:
		if err != nil {
			if !errors.Is(err, ErrLockLost) {
				s.jr.Sync()
			}
			return err
		}
		s.finish(true)
		return nil
	case <-time.After(time.Until(deadline)):
		synced := make(chan struct{})
		go func() { s.jr.Sync(); close(synced) }()
		select {
		case <-synced:
		case <-time.After(10 * time.Millisecond):
		}
		return ErrSavedInJournal
	}
}

// finish closes the journal (flushed to disk first when sync is set) and
// releases the lock.
func (s *Session) finish(sync bool) {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.done {
		return
	}
	s.done = true
	s.jr.close(sync)
	s.lock.Release()
}

// Abandon gives the job up without writing it whole, and without waiting
// for the disk: the journal, which holds every edit (and survives the
// process), is closed, and the lock released when it is still this
// process's. The next open brings the file up to date.
func (s *Session) Abandon() { s.finish(false) }

// Held reports whether the session still holds its lock (nil) or lost it
// to a take-over (*LockLostError).
func (s *Session) Held() error {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.lock.Held()
}
