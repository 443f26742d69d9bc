package model

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"time"
)

// Writing files: whole or not at all (a temporary file, fsync, rename),
// mode 0600, the owner kept; the stamps that tell a file changed by someone
// else; the temporary copies killed writers leave; damaged files kept aside.

func plainIOError(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// SaveAtomic writes j to path so that the file always holds either the
// previous save or this one, whole, even if the process is killed or the
// power fails part way: it writes a temporary file in the same directory,
// flushes it to disk (fsync), renames it over path and flushes the
// directory. The file gets mode 0600 (a job may name people and places);
// missing directories are made with mode 0700.
//
// SaveAtomic refuses (ErrWouldOverwrite) to replace an existing file that
// does not decode as a job of this or an older version, so a damaged or
// newer-version file is never lost; see SetAsideDamaged.
func SaveAtomic(path string, j Job) error {
	if old, err := os.ReadFile(path); err == nil {
		if _, derr := decodeBytes(old); derr != nil {
			detail := "cannot be read, so it was not overwritten"
			var fe *JobFileError
			if errors.As(derr, &fe) {
				detail = fe.Detail + "; not overwritten"
				detail = strings.Replace(detail, "; the file was left unchanged", "", 1)
			}
			return &JobFileError{Path: path, Detail: detail + " (save under a new name, or keep a copy and replace it)",
				Err: errors.Join(ErrWouldOverwrite, derr)}
		}
	} else if !errors.Is(err, fs.ErrNotExist) {
		return &JobFileError{Path: path, Detail: "cannot check the existing file: " + plainIOError(err), Err: err}
	}
	return writeAtomic(path, j)
}

func writeAtomic(path string, j Job) error {
	b, err := encodeBytes(j)
	if err != nil {
		if fe, ok := err.(*JobFileError); ok {
			fe.Path = path
		}
		return err
	}
	_, err = writeFileStamped(path, path, b, true)
	return err
}

// tempPrefix marks temporary files; a killed writer may leave one behind,
// and a later save removes those older than staleTemp (CleanTemps, at the
// start, removes those of jobs no process holds).
const staleTemp = time.Minute

func writeFileAtomic(path string, b []byte) error {
	_, err := writeFileStamped(path, path, b, true)
	return err
}

// writeFileQuick is writeFileAtomic without the flushes to disk: the file
// is whole or absent after a killed process, and after a power loss the
// old or the new one or, rarely, an empty one (the journal, which is
// flushed within a second anyway).
func writeFileQuick(path, like string, b []byte) error {
	_, err := writeFileStamped(path, like, b, false)
	return err
}

// writeFileStamped writes b to path through a temporary file and a rename,
// flushing both to disk when durable is set, and returns the new file's
// stamp. The new file gets the owner of the file at like (path itself, or
// the job file for the files beside it), or the write is refused
// (ErrNotOwner) when this process cannot give it that owner.
func writeFileStamped(path, like string, b []byte, durable bool) (fileStamp, error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	fail := func(what string, err error) error {
		return &JobFileError{Path: path, Detail: what + ": " + plainIOError(err), Err: err}
	}
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return fileStamp{}, fail("cannot make the folder", err)
	}
	owner, err := ownerOf(like)
	if err != nil {
		return fileStamp{}, &JobFileError{Path: path, Detail: err.Error(), Err: errors.Join(ErrNotOwner, err)}
	}
	tmp, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return fileStamp{}, fail("cannot write", err)
	}
	tmpName := tmp.Name()
	ok := false
	defer func() {
		if !ok {
			tmp.Close()
			os.Remove(tmpName)
		}
	}()
	if err := tmp.Chmod(0o600); err != nil && runtime.GOOS != "windows" {
		return fileStamp{}, fail("cannot set the file mode", err)
	}
	if err := owner.give(tmp); err != nil {
		return fileStamp{}, &JobFileError{Path: path, Detail: err.Error(), Err: errors.Join(ErrNotOwner, err)}
	}
	if _, err := tmp.Write(b); err != nil {
		return fileStamp{}, fail("cannot write", err)
	}
	if durable {
		if err := tmp.Sync(); err != nil {
			return fileStamp{}, fail("cannot flush to disk", err)
		}
	}
	fi, err := tmp.Stat()
	if err != nil {
		return fileStamp{}, fail("cannot write", err)
	}
	if err := tmp.Close(); err != nil {
		return fileStamp{}, fail("cannot write", err)
	}
	if err := os.Rename(tmpName, path); err != nil {
		return fileStamp{}, fail("cannot replace the file", err)
	}
	ok = true
	if durable {
		syncDir(dir)
	}
	removeStaleTemps(dir, base)
	return stampOf(fi), nil
}

// ErrNotOwner is wrapped by the error of a save refused because the file
// belongs to another user and this process cannot keep that owner.
var ErrNotOwner = errors.New("file belongs to another user")

// fileStamp identifies one state of a file: the same file (inode), size
// and modification time. A job file whose stamp differs from the one a
// session last wrote or read was changed by someone else.
type fileStamp struct {
	fi os.FileInfo
}

func stampOf(fi os.FileInfo) fileStamp { return fileStamp{fi} }

// same reports whether two stamps are of the same state of a file.
func (a fileStamp) same(b fileStamp) bool {
	if a.fi == nil || b.fi == nil {
		return a.fi == nil && b.fi == nil
	}
	return os.SameFile(a.fi, b.fi) && a.fi.Size() == b.fi.Size() && a.fi.ModTime().Equal(b.fi.ModTime())
}

// statStamp is the stamp of the file at path now (zero when it is missing).
func statStamp(path string) (fileStamp, error) {
	fi, err := os.Stat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return fileStamp{}, nil
	}
	if err != nil {
		return fileStamp{}, err
	}
	return stampOf(fi), nil
}

// syncDir flushes a directory entry change (the rename) to disk. Some
// systems (Windows) cannot open a directory for this; the rename is then as
// durable as the system makes it.
func syncDir(dir string) {
	d, err := os.Open(dir)
	if err != nil {
		return
	}
	d.Sync()
	d.Close()
}

func removeStaleTemps(dir, base string) {
	matches, _ := filepath.Glob(filepath.Join(dir, "."+globEscape(base)+".tmp-*"))
	for _, m := range matches {
		if fi, err := os.Stat(m); err == nil && time.Since(fi.ModTime()) > staleTemp {
			os.Remove(m)
		}
	}
}

// CleanTemps removes the temporary copies that killed writers left in dir:
// those of a job file (or of its journal) that no live process holds, at
// any age, and any other older than a minute. It returns how many it
// removed. A job file, a journal or a lock is never touched.
func CleanTemps(dir string) int {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return 0
	}
	n := 0
	for _, e := range entries {
		name := e.Name()
		i := strings.LastIndex(name, ".tmp-")
		if e.IsDir() || !strings.HasPrefix(name, ".") || i < 0 {
			continue
		}
		target := name[1:i] // the file the temporary copy was for
		if j, ok := strings.CutSuffix(target, ".journal"); ok && strings.HasPrefix(j, ".") {
			target = j[1:] // a journal's: .NAME.journal → NAME
		}
		path := filepath.Join(dir, name)
		old := false
		if fi, err := e.Info(); err == nil {
			old = time.Since(fi.ModTime()) > staleTemp
		}
		if strings.HasSuffix(target, ".json") {
			if _, held, _ := ReadLock(filepath.Join(dir, target)); held {
				continue // its job is open: the copy may be a save in flight
			}
		} else if !old {
			continue
		}
		if os.Remove(path) == nil {
			n++
		}
	}
	return n
}

// SetAsideDamaged moves a job file that cannot be read out of the way, to
// NAME.damaged (or NAME.damaged-2, … so that no earlier copy is replaced),
// every byte kept, and returns the new path. The job's journal goes with
// it as NAME.damaged.journal when there is one.
func SetAsideDamaged(path string) (string, error) {
	for i := 1; i < 1000; i++ {
		keep := path + ".damaged"
		if i > 1 {
			keep += "-" + strconv.Itoa(i)
		}
		if _, err := os.Lstat(keep); !errors.Is(err, fs.ErrNotExist) {
			continue
		}
		if err := os.Rename(path, keep); err != nil {
			return "", &JobFileError{Path: path, Detail: "cannot keep it as " + filepath.Base(keep) + ": " + plainIOError(err), Err: err}
		}
		if _, err := os.Lstat(JournalPath(path)); err == nil {
			os.Rename(JournalPath(path), keep+".journal")
		}
		syncDir(filepath.Dir(path))
		return keep, nil
	}
	return "", &JobFileError{Path: path, Detail: "too many damaged copies kept beside it", Err: fs.ErrExist}
}

func globEscape(s string) string {
	r := strings.NewReplacer(`\`, `\\`, "*", `\*`, "?", `\?`, "[", `\[`)
	return r.Replace(s)
}
