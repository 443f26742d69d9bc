package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"time"
	"unicode"
)

// The job file is drawdown's own JSON format, version 3 (JobVersion):
//
//	{
//	  "schema": "drawdown-job",
//	  "version": 3,
//	  "name": "...",
//	  "units": "SI",
//	  "inputs": {"hose.id": "38 mm", ...},
//	  "site_facts": {"confined_space": true, "discharge": "sewer", ...},
//	  "checklist": {...}, "readings": [...], "log": [...],
//	  "resume": {"pane": "...", "step": 0},
//	  "draft": {"kind": "note", "step": "...", "text": "..."},
//	  "journal": {"id": "5f0c9a1e7d2b4c63", "seq": 41},
//	  ...
//	}
//
// Encode writes it with two-space indents in the order of Job's fields, so
// that the same Job always gives the same bytes. Decode reads the current
// version, migrates older ones and refuses newer ones. "journal" is written
// by a Session (session.go): the edits after record "seq" of that session
// are in the journal beside the file (journal.go), and Load applies them.
// Beside the job file NAME live ".NAME.journal" and, while a process has
// the job open, ".NAME.lock" (lock.go).

// MaxJobFileSize bounds the bytes Decode reads (a job with thousands of
// readings is well under 1 MiB).
const MaxJobFileSize = 16 << 20

// Errors wrapped by *JobFileError; test with errors.Is.
var (
	// ErrDamaged: the file is not valid JSON or holds values of the wrong
	// kind (cut short, edited by hand, disk trouble).
	ErrDamaged = errors.New("damaged job file")
	// ErrNotJob: valid JSON but not a drawdown job (no "schema":
	// "drawdown-job").
	ErrNotJob = errors.New("not a drawdown job file")
	// ErrFutureVersion: written by a newer drawdown in a format version this
	// build does not know.
	ErrFutureVersion = errors.New("job file from a newer version")
	// ErrWouldOverwrite: SaveAtomic refused to replace a file it cannot read.
	ErrWouldOverwrite = errors.New("refused to overwrite an unreadable job file")
)

// JobFileError reports a job file that cannot be read or written. Path is
// empty when the data did not come from a file (Decode on a reader).
type JobFileError struct {
	Path    string
	Version int    // the file's format version, when known
	Detail  string // what is wrong, in plain words
	Err     error  // ErrDamaged, ErrNotJob, ErrFutureVersion, ErrWouldOverwrite or an I/O error
}

func (e *JobFileError) Error() string {
	s := "job file"
	if e.Path != "" {
		s += " " + e.Path
	}
	return s + ": " + e.Detail
}

// Unwrap returns the cause.
func (e *JobFileError) Unwrap() error { return e.Err }

// Encode writes j to w as a job file in the current format version. Schema
// and Version are written as JobSchema and JobVersion whatever j holds. It
// fails (writing nothing) if a value cannot be represented, e.g. a NaN
// reading level.
func Encode(w io.Writer, j Job) error {
	b, err := encodeBytes(j)
	if err != nil {
		return err
	}
	_, err = w.Write(b)
	return err
}

func encodeBytes(j Job) ([]byte, error) { return encodeFile(j, JournalMark{}) }

// encodeFile encodes j with its journal mark (left out when zero).
func encodeFile(j Job, mark JournalMark) ([]byte, error) {
	j.Schema = JobSchema
	j.Version = JobVersion
	if j.Inputs == nil {
		j.Inputs = map[FieldID]string{}
	}
	b, err := json.MarshalIndent(struct {
		Job
		Journal JournalMark `json:"journal,omitzero"`
	}{j, mark}, "", "  ")
	if err != nil {
		return nil, &JobFileError{Detail: "cannot write the job: " + err.Error(), Err: err}
	}
	return append(b, '\n'), nil
}

// Decode reads a job file from r. It reads the current format, migrates
// older versions to it, and refuses a newer version or damaged data with a
// *JobFileError that says what is wrong. Decode never panics on any input.
func Decode(r io.Reader) (Job, error) {
	data, err := io.ReadAll(io.LimitReader(r, MaxJobFileSize+1))
	if err != nil {
		return Job{}, &JobFileError{Detail: "cannot read: " + err.Error(), Err: err}
	}
	if len(data) > MaxJobFileSize {
		return Job{}, damaged(fmt.Sprintf("larger than %d MiB; not a job file this tool wrote", MaxJobFileSize>>20))
	}
	return decodeBytes(data)
}

func damaged(detail string) *JobFileError {
	return &JobFileError{Detail: detail + "; the file was left unchanged", Err: ErrDamaged}
}

func decodeBytes(data []byte) (Job, error) {
	j, _, err := decodeFile(data)
	return j, err
}

// decodeFile decodes a job file and its journal mark (zero when it has
// none).
func decodeFile(data []byte) (Job, JournalMark, error) {
	var mark JournalMark
	if len(bytes.TrimSpace(data)) == 0 {
		return Job{}, mark, damaged("empty (0 bytes of job data)")
	}
	if err := checkJSONBounds(data); err != nil {
		e := damaged(err.Error())
		e.Err = errors.Join(ErrDamaged, err)
		return Job{}, mark, e
	}
	var raw map[string]json.RawMessage
	if err := json.Unmarshal(data, &raw); err != nil {
		return Job{}, mark, damaged(jsonWords(err))
	}
	if m, ok := raw["journal"]; ok {
		if err := json.Unmarshal(m, &mark); err != nil {
			return Job{}, mark, damaged(`the "journal" entry does not read (` + jsonWords(err) + ")")
		}
	}
	j, err := decodeRaw(data, raw)
	return j, mark, err
}

func decodeRaw(data []byte, raw map[string]json.RawMessage) (Job, error) {
	var schema string
	if err := json.Unmarshal(raw["schema"], &schema); err != nil || schema != JobSchema {
		return Job{}, &JobFileError{Detail: `not a drawdown job (no "schema": "drawdown-job"); the file was left unchanged`, Err: ErrNotJob}
	}
	var version int
	if err := json.Unmarshal(raw["version"], &version); err != nil {
		return Job{}, damaged(`the "version" entry is missing or not a whole number`)
	}
	if version > JobVersion {
		return Job{}, &JobFileError{Version: version, Err: ErrFutureVersion, Detail: fmt.Sprintf(
			"written by a newer drawdown (format version %d; this build reads versions 0 to %d); "+
				"the file was left unchanged: open it with the newer drawdown", version, JobVersion)}
	}
	if version < 0 {
		return Job{}, damaged(fmt.Sprintf("format version %d does not exist", version))
	}
	if version < JobVersion {
		var err error
		if data, err = migrate(raw, version); err != nil {
			return Job{}, &JobFileError{Version: version, Detail: "cannot bring format version " +
				strconv.Itoa(version) + " up to date: " + err.Error() + "; the file was left unchanged", Err: ErrDamaged}
		}
	}
	var j Job
	if err := json.Unmarshal(data, &j); err != nil {
		return Job{}, damaged(jsonWords(err))
	}
	j.Schema, j.Version = JobSchema, JobVersion
	if j.Inputs == nil {
		j.Inputs = map[FieldID]string{}
	}
	if err := checkJob(&j); err != nil {
		return Job{}, damaged(err.Error())
	}
	return j, nil
}

// Load reads the job file at path, with the edits in its journal applied
// (a job open in a screen is read as it stands, keystrokes included).
// Errors are *JobFileError values carrying the path. Load writes nothing.
func Load(path string) (Job, error) {
	j, _, _, err := loadWithJournal(path)
	return j, err
}

// loadFile reads the job file at path alone, with its journal mark and the
// file's stamp as it was read.
func loadFile(path string) (Job, JournalMark, fileStamp, error) {
	f, err := os.Open(path)
	if err != nil {
		return Job{}, JournalMark{}, fileStamp{}, &JobFileError{Path: path, Detail: "cannot open: " + plainIOError(err), Err: err}
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return Job{}, JournalMark{}, fileStamp{}, &JobFileError{Path: path, Detail: "cannot read: " + plainIOError(err), Err: err}
	}
	if !fi.Mode().IsRegular() {
		return Job{}, JournalMark{}, fileStamp{}, &JobFileError{Path: path, Detail: "not a regular file (a folder, a device or a pipe); not read", Err: ErrNotJob}
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxJobFileSize+1))
	if err != nil {
		return Job{}, JournalMark{}, fileStamp{}, &JobFileError{Path: path, Detail: "cannot read: " + plainIOError(err), Err: err}
	}
	if len(data) > MaxJobFileSize {
		e := damaged(fmt.Sprintf("larger than %d MiB; not a job file this tool wrote", MaxJobFileSize>>20))
		e.Path = path
		return Job{}, JournalMark{}, fileStamp{}, e
	}
	j, mark, err := decodeFile(data)
	if err != nil {
		var fe *JobFileError
		if errors.As(err, &fe) {
			fe.Path = path
		}
		return Job{}, mark, fileStamp{}, err
	}
	return j, mark, stampOf(fi), nil
}

// loadWithJournal reads the job file and applies its journal. last is the
// number of the last journal record the job holds; note says why records
// were left out ("" when none were).
func loadWithJournal(path string) (j Job, mark JournalMark, note string, err error) {
	j, mark, _, err = loadFile(path)
	if err != nil {
		return Job{}, mark, "", err
	}
	jl, jerr := readJournal(JournalPath(path))
	if jerr != nil {
		return j, mark, jerr.Error() + "; its edits were not applied", nil
	}
	_, last, note, _ := jl.replay(&j, mark)
	if err := checkJob(&j); err != nil {
		// A journal that makes the job unreadable is not applied.
		j, mark, _, _ = loadFile(path)
		return j, mark, "the journal's edits leave the job unreadable (" + err.Error() + "); not applied", nil
	}
	mark.Seq = last
	return j, mark, note, nil
}

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
// newer-version file is never lost; see ReplaceDamaged.
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

// ReplaceDamaged keeps a copy of the unreadable file at path (as
// path.damaged, or path.damaged-2, … so that no earlier copy is replaced)
// and then saves j there. It returns the copy's path.
func ReplaceDamaged(path string, j Job) (string, error) {
	old, err := os.ReadFile(path)
	if err != nil && !errors.Is(err, fs.ErrNotExist) {
		return "", &JobFileError{Path: path, Detail: "cannot read the existing file: " + plainIOError(err), Err: err}
	}
	keep := ""
	if err == nil {
		for i := 1; ; i++ {
			keep = path + ".damaged"
			if i > 1 {
				keep += "-" + strconv.Itoa(i)
			}
			f, err := os.OpenFile(keep, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o600)
			if errors.Is(err, fs.ErrExist) {
				continue
			}
			if err != nil {
				return "", &JobFileError{Path: keep, Detail: "cannot keep a copy: " + plainIOError(err), Err: err}
			}
			_, werr := f.Write(old)
			if serr := f.Sync(); werr == nil {
				werr = serr
			}
			if cerr := f.Close(); werr == nil {
				werr = cerr
			}
			if werr != nil {
				return "", &JobFileError{Path: keep, Detail: "cannot keep a copy: " + plainIOError(werr), Err: werr}
			}
			break
		}
	}
	return keep, writeAtomic(path, j)
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

// Home returns drawdown's data folder: $DRAWDOWN_HOME when set (tests and
// portable installs), else $XDG_DATA_HOME/drawdown, else the platform's
// usual place (~/.local/share/drawdown on Linux and the BSDs, the user
// configuration folder elsewhere).
func Home() (string, error) {
	if h := os.Getenv("DRAWDOWN_HOME"); h != "" {
		return h, nil
	}
	if x := os.Getenv("XDG_DATA_HOME"); x != "" && filepath.IsAbs(x) {
		return filepath.Join(x, "drawdown"), nil
	}
	switch runtime.GOOS {
	case "darwin", "windows", "ios", "plan9":
		d, err := os.UserConfigDir()
		if err != nil {
			return "", err
		}
		return filepath.Join(d, "drawdown"), nil
	}
	h, err := os.UserHomeDir()
	if err != nil {
		return "", err
	}
	return filepath.Join(h, ".local", "share", "drawdown"), nil
}

// JobsDir returns the folder of job files, <Home>/jobs. It does not create
// it; SaveAtomic does on first save.
func JobsDir() (string, error) {
	h, err := Home()
	if err != nil {
		return "", err
	}
	return filepath.Join(h, "jobs"), nil
}

// JobFileName turns a job name into a file name: lower case, letters and
// digits kept, other runs of characters made a single "-", ".json" added.
func JobFileName(name string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(name) {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(r)
		} else {
			dash = true
		}
		if b.Len() >= 60 {
			break
		}
	}
	if b.Len() == 0 {
		return "job.json"
	}
	return b.String() + ".json"
}

// NewJobPath returns a path in dir for a new job named name that does not
// name an existing file (adding -2, -3, … as needed).
func NewJobPath(dir, name string) string {
	base := strings.TrimSuffix(JobFileName(name), ".json")
	for i := 1; ; i++ {
		p := filepath.Join(dir, base+".json")
		if i > 1 {
			p = filepath.Join(dir, base+"-"+strconv.Itoa(i)+".json")
		}
		if _, err := os.Lstat(p); errors.Is(err, fs.ErrNotExist) {
			return p
		}
	}
}

// lastJobFile holds the path of the job open when drawdown last ran.
const lastJobFile = "last-job"

// LastJobPath returns the path of the job open when drawdown last ran, or ""
// (and no error) when there is none.
func LastJobPath() (string, error) {
	h, err := Home()
	if err != nil {
		return "", err
	}
	b, err := os.ReadFile(filepath.Join(h, lastJobFile))
	if errors.Is(err, fs.ErrNotExist) {
		return "", nil
	}
	if err != nil {
		return "", err
	}
	return strings.TrimSpace(string(b)), nil
}

// SetLastJob records path as the job to resume at the next start. The
// record is written atomically with mode 0600.
func SetLastJob(path string) error {
	h, err := Home()
	if err != nil {
		return err
	}
	if abs, err := filepath.Abs(path); err == nil {
		path = abs
	}
	return writeFileAtomic(filepath.Join(h, lastJobFile), []byte(path+"\n"))
}

// JobSummary is one entry of ListJobs.
type JobSummary struct {
	Path    string
	Name    string
	Site    string
	Date    string   // the day of the work, YYYY-MM-DD, or ""
	State   JobState // planned, draining or closed
	Updated time.Time
	Err     error // set when the file cannot be read; the entry is still listed
}

// ListJobs lists the job files (*.json) in dir, newest first. Unreadable
// files are listed with Err set, so the UI can say so instead of hiding them.
func ListJobs(dir string) ([]JobSummary, error) {
	entries, err := os.ReadDir(dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, err
	}
	var out []JobSummary
	for _, e := range entries {
		if e.IsDir() || !strings.HasSuffix(e.Name(), ".json") || strings.HasPrefix(e.Name(), ".") {
			continue
		}
		p := filepath.Join(dir, e.Name())
		s := JobSummary{Path: p}
		if j, err := Load(p); err != nil {
			s.Err = err
			if fi, err := e.Info(); err == nil {
				s.Updated = fi.ModTime()
			}
		} else {
			s.Name, s.Site, s.Date, s.State, s.Updated = j.Name, j.Site, j.Date, j.State(), j.Updated
		}
		out = append(out, s)
	}
	sort.SliceStable(out, func(a, b int) bool { return out[a].Updated.After(out[b].Updated) })
	return out, nil
}
