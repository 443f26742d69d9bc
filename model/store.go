package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
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

// encodeBytes encodes j as a job file in the current format version
// (Schema and Version are written as JobSchema and JobVersion whatever j
// holds). It fails if a value cannot be represented, e.g. a NaN reading level.
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

func damaged(detail string) *JobFileError {
	return &JobFileError{Detail: detail + "; the file was left unchanged", Err: ErrDamaged}
}

// decodeBytes reads a job file's bytes. It reads the current format, migrates
// older versions to it, and refuses a newer version or damaged data with a
// *JobFileError that says what is wrong. It never panics on any input
// (FuzzDecode).
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
		if b := bytes.TrimSpace(m); len(b) == 0 || b[0] != '{' {
			return Job{}, mark, damaged(`the "journal" entry is not an object (it holds the session and the record number)`)
		}
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
