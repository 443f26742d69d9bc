package model

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

const lockEnv = "DRAWDOWN_LOCK_TEST_JOB"

// TestLockHolderProcess is the other process of the two-process tests; it
// runs only when started by them. It opens the job, says "held PID", then
// adds a log line every 5 ms, journalled, saying "edit N" after each, until
// it finds the lock taken over ("lost BY-PID") or is killed.
func TestLockHolderProcess(t *testing.T) {
	path := os.Getenv(lockEnv)
	if path == "" {
		t.Skip("the other process of the two-process lock tests")
	}
	s, j, _, err := OpenSession(path, SessionOptions{})
	if err != nil {
		fmt.Println("error", err)
		os.Exit(3)
	}
	fmt.Println("held", os.Getpid())
	for n := 1; ; n++ {
		j.AddLog(t0, "edit "+strconv.Itoa(n))
		if _, err := s.Record(&j); err != nil {
			var lost *LockLostError
			if errors.As(err, &lost) {
				fmt.Println("lost", lost.By.PID)
				os.Exit(0)
			}
			fmt.Println("error", err)
			os.Exit(3)
		}
		fmt.Println("edit", n)
		time.Sleep(5 * time.Millisecond)
	}
}

// holder starts TestLockHolderProcess on path and waits for it to hold
// the job; lines carries what it says afterwards.
func holder(t *testing.T, path string) (*exec.Cmd, <-chan string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], "-test.run=^TestLockHolderProcess$", "-test.count=1")
	cmd.Env = append(os.Environ(), lockEnv+"="+path)
	out, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { cmd.Process.Kill(); cmd.Wait() })
	sc := bufio.NewScanner(out)
	if !sc.Scan() || !strings.HasPrefix(sc.Text(), "held ") {
		t.Fatalf("the other process did not open the job: %q", sc.Text())
	}
	lines := make(chan string, 4096)
	go func() {
		for sc.Scan() {
			lines <- sc.Text()
		}
		close(lines)
	}()
	return cmd, lines
}

// lastEdit drains lines and returns the last "edit N" seen.
func lastEdit(lines <-chan string, until func(string) bool) (int, string) {
	n := 0
	for line := range lines {
		if v, ok := strings.CutPrefix(line, "edit "); ok {
			n, _ = strconv.Atoi(v)
			continue
		}
		if until(line) {
			return n, line
		}
	}
	return n, ""
}

// TestLockTwoProcesses: another process holds the job. This one is told
// who (process, host, since) and cannot take the lock; it may take it over:
// the job it then reads holds every edit the other had journalled, and the
// other finds at its next edit that it lost the lock, and to whom.
func TestLockTwoProcesses(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	cmd, lines := holder(t, path)
	time.Sleep(50 * time.Millisecond) // a few edits
	_, err := AcquireLock(path, LockOwner{})
	var le *LockedError
	if !errors.As(err, &le) || !errors.Is(err, ErrLocked) {
		t.Fatalf("AcquireLock with another holder: %v", err)
	}
	host, _ := os.Hostname()
	if le.Holder.PID != cmd.Process.Pid || le.Holder.Host != host || time.Since(le.Holder.Since) > time.Minute {
		t.Errorf("holder %+v; want process %d on %s, since just now", le.Holder, cmd.Process.Pid, host)
	}
	if msg := le.Error(); !strings.Contains(msg, "process "+strconv.Itoa(cmd.Process.Pid)) || !strings.Contains(msg, host) {
		t.Errorf("message %q does not name the process and host", msg)
	}
	if info, held, err := ReadLock(path); err != nil || !held || info.PID != cmd.Process.Pid {
		t.Errorf("ReadLock = %+v, %v, %v", info, held, err)
	}
	// Read-only needs no lock: the job as the other has it, keystrokes and all.
	if ro, err := Load(path); err != nil || len(ro.Log) == 0 {
		t.Errorf("read-only open: %d log lines, %v", len(ro.Log), err)
	}

	s, j, rep, err := OpenSession(path, SessionOptions{TakeOver: true})
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close(j, time.Second)
	if rep.TookOver == nil || rep.TookOver.PID != cmd.Process.Pid {
		t.Errorf("took over from %+v", rep.TookOver)
	}
	n, line := lastEdit(lines, func(l string) bool { return strings.HasPrefix(l, "lost") || strings.HasPrefix(l, "error") })
	if line != "lost "+strconv.Itoa(os.Getpid()) {
		t.Fatalf("the other process said %q, want it lost to %d", line, os.Getpid())
	}
	// Every edit the other reported before it lost the lock is in the job.
	got := 0
	for _, e := range j.Log {
		if v, ok := strings.CutPrefix(e.Text, "edit "); ok {
			got, _ = strconv.Atoi(v)
		}
	}
	if got != n {
		t.Errorf("the job read at the take-over holds edits to %d; the other reported %d", got, n)
	}
	t.Logf("the other process made %d edits; all in the job taken over", n)
	if err := cmd.Wait(); err != nil {
		t.Errorf("the other process: %v", err)
	}
}

// TestLockStale: the holder is killed (SIGKILL: no chance to clean up).
// The next open finds the lock stale, clears it and says whose it was; the
// journal's edits are applied.
func TestLockStale(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	cmd, lines := holder(t, path)
	time.Sleep(40 * time.Millisecond)
	cmd.Process.Signal(syscall.SIGKILL)
	n, _ := lastEdit(lines, func(string) bool { return false })
	cmd.Wait()
	if _, err := os.Stat(LockPath(path)); err != nil {
		t.Fatalf("the killed holder left no lock file to clear: %v", err)
	}
	if _, held, _ := ReadLock(path); held {
		t.Error("a dead process's lock reads as held")
	}
	s, j, rep, err := OpenSession(path, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close(j, time.Second)
	if rep.StaleLock == nil || rep.StaleLock.PID != cmd.Process.Pid {
		t.Errorf("stale lock cleared: %+v", rep.StaleLock)
	}
	if rep.Replayed < n || len(j.Log) < n {
		t.Errorf("%d records replayed, %d log lines; the holder reported %d edits", rep.Replayed, len(j.Log), n)
	}
	// Written whole at once: the journal is empty but for its header.
	if b, _ := os.ReadFile(JournalPath(path)); strings.Count(string(b), "\n") != 1 {
		t.Errorf("journal after the open:\n%s", b)
	}
}

// TestSessionConflict: the job file is changed on disk by another program
// while a session has it open. The next checkpoint does not overwrite it:
// this session's version goes to a copy, the session goes on there, and
// neither version is lost.
func TestSessionConflict(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "pit.json")
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	s, j, _, err := OpenSession(path, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	j.Set(FieldHoseLength, "20 m")
	s.Record(&j)
	theirs := DemoJob()
	theirs.Notes = "edited elsewhere"
	time.Sleep(10 * time.Millisecond) // a different modification time on coarse clocks
	if err := SaveAtomic(path, theirs); err != nil {
		t.Fatal(err)
	}
	j.Set(FieldHoseLength, "21 m")
	s.Record(&j)
	res, err := s.Checkpoint(j.Clone(), s.Seq())
	if err != nil {
		t.Fatal(err)
	}
	if res.Forked != path || s.Path() == path || !strings.HasPrefix(filepath.Base(s.Path()), "pit-conflict") {
		t.Fatalf("checkpoint result %+v, session now on %s", res, s.Path())
	}
	// An edit after the fork goes to the copy's journal.
	j.Set(FieldHoseLength, "22 m")
	if _, err := s.Record(&j); err != nil {
		t.Fatal(err)
	}
	if err := s.Close(j, time.Second); err != nil {
		t.Fatal(err)
	}
	onDisk, _ := Load(path)
	copyJob, _ := Load(s.Path())
	if onDisk.Notes != "edited elsewhere" || onDisk.Inputs[FieldHoseLength] != "12 m" {
		t.Errorf("the other program's version was changed: %q, %q", onDisk.Notes, onDisk.Inputs[FieldHoseLength])
	}
	if copyJob.Inputs[FieldHoseLength] != "22 m" {
		t.Errorf("the copy holds %q", copyJob.Inputs[FieldHoseLength])
	}
	if _, err := os.Stat(LockPath(path)); !errors.Is(err, os.ErrNotExist) {
		t.Error("the old lock was kept")
	}
}

// TestSessionRefusals: a session is not opened on a damaged file (the lock
// is given back and the file left as it was), nor created over a file.
func TestSessionRefusals(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.json")
	os.WriteFile(bad, []byte(`{"schema": "drawdown-job", "version": 3, "readings": [{"at": "2026-03-14T09:00:00Z", "level_m": 1e300}]}`), 0o600)
	_, _, _, err := OpenSession(bad, SessionOptions{})
	if !errors.Is(err, ErrDamaged) || !strings.Contains(err.Error(), "reading 1 of 1: level 1e+300 m is out of range; accepted 0 to 1000 m") {
		t.Errorf("damaged: %v", err)
	}
	if _, err := os.Stat(LockPath(bad)); !errors.Is(err, os.ErrNotExist) {
		t.Error("lock kept after a refused open")
	}
	if _, err := CreateSession(bad, DemoJob(), SessionOptions{}); !errors.Is(err, os.ErrExist) {
		t.Errorf("CreateSession over a file: %v", err)
	}
}

// TestCloseBounded: closing waits at most the time given, even when the
// checkpoint cannot finish (here: another checkpoint holds the disk), and
// the job is then whole in the journal.
func TestCloseBounded(t *testing.T) {
	path := filepath.Join(t.TempDir(), "job.json")
	j := DemoJob()
	s, err := CreateSession(path, j, SessionOptions{})
	if err != nil {
		t.Fatal(err)
	}
	j.Set(FieldHoseLength, "30 m")
	s.ck <- struct{}{} // a checkpoint that never ends
	start := time.Now()
	err = s.Close(j, 50*time.Millisecond)
	took := time.Since(start)
	if !errors.Is(err, ErrSavedInJournal) {
		t.Errorf("Close: %v", err)
	}
	if took > 150*time.Millisecond {
		t.Errorf("Close took %v, allowed 50 ms (and some slack)", took)
	}
	got, err := Load(path)
	if err != nil || got.Inputs[FieldHoseLength] != "30 m" {
		t.Errorf("after a bounded close: %q, %v", got.Inputs[FieldHoseLength], err)
	}
}

// TestOwnerKept: a job file of another user saved by root keeps its owner
// (and so stays readable to its owner); saved by another ordinary user it
// is refused, and left as it was. Run as root (CI is); skipped otherwise.
func TestOwnerKept(t *testing.T) {
	if os.Geteuid() != 0 {
		t.Skip("needs root to make files of another user")
	}
	const nobody = 65534
	dir := t.TempDir()
	os.Chmod(dir, 0o777)
	path := filepath.Join(dir, "job.json")
	if err := SaveAtomic(path, DemoJob()); err != nil {
		t.Fatal(err)
	}
	os.Chown(path, nobody, nobody)
	j := DemoJob()
	j.Notes = "saved by root"
	if err := SaveAtomic(path, j); err != nil {
		t.Fatal(err)
	}
	fi, _ := os.Stat(path)
	if st := fi.Sys().(*syscall.Stat_t); st.Uid != nobody || fi.Mode().Perm() != 0o600 {
		t.Errorf("after root's save: owner %d, mode %v; want %d, 0600", st.Uid, fi.Mode().Perm(), nobody)
	}
	// The other way: a root-owned job saved by nobody, who can read it
	// and write the folder.
	mine := filepath.Join(dir, "root.json")
	SaveAtomic(mine, DemoJob())
	os.Chmod(mine, 0o644) // readable to nobody, as a shared job folder may be
	before, _ := os.ReadFile(mine)
	// The test binary, where another user can run it.
	bin, err := os.MkdirTemp("", "owner-test-")
	if err != nil {
		t.Fatal(err)
	}
	defer os.RemoveAll(bin)
	exe, _ := os.ReadFile(os.Args[0])
	os.WriteFile(filepath.Join(bin, "test"), exe, 0o755)
	os.Chmod(bin, 0o755)
	for d := dir; d != filepath.Dir(d) && strings.HasPrefix(d, os.TempDir()+"/"); d = filepath.Dir(d) {
		os.Chmod(d, 0o777|os.ModeSticky) // reachable by nobody (the test's own folders)
	}
	cmd := exec.Command(filepath.Join(bin, "test"), "-test.run=^TestOwnerSaveProcess$", "-test.count=1")
	cmd.Env = append(os.Environ(), lockEnv+"="+mine)
	cmd.SysProcAttr = &syscall.SysProcAttr{Credential: &syscall.Credential{Uid: nobody, Gid: nobody}}
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Logf("the process as nobody: %v", err)
	}
	if !strings.Contains(string(out), "belongs to the user root") || !strings.Contains(string(out), "not saved") {
		t.Errorf("nobody saving root's job said:\n%s", out)
	}
	if after, _ := os.ReadFile(mine); string(after) != string(before) {
		t.Error("the refused save changed the file")
	}
}

// TestOwnerSaveProcess saves the job named by lockEnv; run by TestOwnerKept
// as another user.
func TestOwnerSaveProcess(t *testing.T) {
	path := os.Getenv(lockEnv)
	if path == "" {
		t.Skip("run by TestOwnerKept")
	}
	err := SaveAtomic(path, DemoJob())
	fmt.Fprintln(io.Writer(os.Stdout), "result:", err, errors.Is(err, ErrNotOwner))
}
