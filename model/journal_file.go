package model

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"sync"
	"time"
)

// The journal file: appending records, the flush to disk, compaction, and
// reading it back (the format is in journal.go).

// Journal appends a job's edits to its journal file (Session.Record writes
// through it); a background goroutine flushes the file to disk at most once
// every FlushEvery, and Sync flushes it at once.
type Journal struct {
	path string
	id   string

	mu     sync.Mutex // guards everything below against the flusher and Sync
	f      *os.File
	hdr    int64 // the header's length
	size   int64
	seq    uint64      // the last record written
	ends   []seqOffset // where each record since the last compaction ends
	err    error       // the first write error; Record fails from then on
	synced uint64      // the last record flushed to disk
	snap   journalSnap

	kick, stop, done chan struct{}
}

type seqOffset struct {
	seq uint64
	end int64
}

// FlushEvery is how often at most the journal is flushed to disk: a power
// loss loses at most about this much typing.
const FlushEvery = time.Second

// compactAt is the journal size past which a checkpoint that does not hold
// every record rewrites the journal without those it holds (else the
// records it holds are left for the next checkpoint to drop).
const compactAt = 256 << 10

// startJournal makes a new, empty journal for session id at path (any old
// one is replaced), for a job as j, and starts its flusher.
func startJournal(path, jobPath, id string, j *Job) (*Journal, error) {
	hdr, err := json.Marshal(journalHeader{Schema: journalSchema, Version: JournalVersion, Job: id})
	if err != nil {
		return nil, err
	}
	hdr = append(hdr, '\n')
	if _, err := writeFileStamped(path, jobPath, hdr, true); err != nil {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_APPEND, 0o600)
	if err != nil {
		return nil, &JobFileError{Path: path, Detail: "cannot open the journal: " + plainIOError(err), Err: err}
	}
	jr := &Journal{path: path, id: id, f: f, hdr: int64(len(hdr)), size: int64(len(hdr)), snap: newSnap(j),
		kick: make(chan struct{}, 1), stop: make(chan struct{}), done: make(chan struct{})}
	go jr.flusher()
	return jr, nil
}

// write appends r, numbered after the last record, with one write.
func (jr *Journal) write(r *journalRecord) error {
	jr.mu.Lock()
	defer jr.mu.Unlock()
	if jr.err != nil {
		return jr.err
	}
	r.N = jr.seq + 1
	b, err := json.Marshal(r)
	if err != nil {
		return fmt.Errorf("cannot write the journal: %w", err)
	}
	b = append(b, '\n')
	if n, err := jr.f.Write(b); err != nil {
		if n > 0 {
			// Cut off what was written of the record, so that the next
			// open does not stop at a torn line before later ones; the
			// snapshot is unchanged, so the next record carries this edit.
			jr.f.Truncate(jr.size)
		}
		return &JobFileError{Path: jr.path, Detail: "cannot write the journal: " + plainIOError(err), Err: err}
	}
	jr.seq, jr.size = r.N, jr.size+int64(len(b))
	jr.ends = append(jr.ends, seqOffset{r.N, jr.size})
	select {
	case jr.kick <- struct{}{}:
	default:
	}
	return nil
}

// Seq is the number of the last record written.
func (jr *Journal) Seq() uint64 {
	jr.mu.Lock()
	defer jr.mu.Unlock()
	return jr.seq
}

// flusher flushes the journal at most once every FlushEvery after a record.
func (jr *Journal) flusher() {
	defer close(jr.done)
	last := time.Time{}
	for {
		select {
		case <-jr.kick:
		case <-jr.stop:
			return
		}
		if wait := time.Until(last.Add(FlushEvery)); wait > 0 {
			select {
			case <-time.After(wait):
			case <-jr.stop:
				return
			}
		}
		jr.Sync()
		last = time.Now()
	}
}

// Sync flushes every record written so far to disk. It does not hold up
// Record while the disk works.
func (jr *Journal) Sync() error {
	jr.mu.Lock()
	f, seq := jr.f, jr.seq
	if jr.synced >= seq {
		jr.mu.Unlock()
		return nil
	}
	jr.mu.Unlock()
	if err := f.Sync(); err != nil {
		return &JobFileError{Path: jr.path, Detail: "cannot flush the journal to disk: " + plainIOError(err), Err: err}
	}
	jr.mu.Lock()
	jr.synced = max(jr.synced, seq)
	jr.mu.Unlock()
	return nil
}

// compact drops the records up to seq, which the job file now holds: the
// journal is cut back to its header when it holds nothing more; else, when
// it has grown past compactAt, it is rewritten with the later records only.
func (jr *Journal) compact(seq uint64) error {
	jr.mu.Lock()
	defer jr.mu.Unlock()
	if jr.err != nil {
		return jr.err
	}
	if seq >= jr.seq {
		if err := jr.f.Truncate(jr.hdr); err != nil {
			return &JobFileError{Path: jr.path, Detail: "cannot cut the journal short: " + plainIOError(err), Err: err}
		}
		jr.size, jr.ends, jr.synced = jr.hdr, jr.ends[:0], jr.seq
		return nil
	}
	if jr.size < compactAt {
		return nil
	}
	from := jr.hdr
	k := 0
	for k < len(jr.ends) && jr.ends[k].seq <= seq {
		from = jr.ends[k].end
		k++
	}
	tail := make([]byte, jr.size-from)
	rf, err := os.Open(jr.path)
	if err != nil {
		return nil // left as it is: the next checkpoint tries again
	}
	_, err = rf.ReadAt(tail, from)
	rf.Close()
	if err != nil {
		return nil
	}
	hdr, _ := json.Marshal(journalHeader{Schema: journalSchema, Version: JournalVersion, Job: jr.id})
	b := append(append(hdr, '\n'), tail...)
	if err := writeFileQuick(jr.path, jr.path, b); err != nil {
		return nil
	}
	f, err := os.OpenFile(jr.path, os.O_WRONLY|os.O_APPEND, 0o600)
	if err != nil {
		jr.err = &JobFileError{Path: jr.path, Detail: "cannot open the journal: " + plainIOError(err), Err: err}
		return jr.err
	}
	jr.f.Close()
	jr.f = f
	shift := from - jr.hdr
	jr.ends = append(jr.ends[:0], jr.ends[k:]...)
	for i := range jr.ends {
		jr.ends[i].end -= shift
	}
	jr.size -= shift
	jr.synced = seq // the rewritten file is flushed by the next Sync
	return nil
}

// close stops the flusher and closes the file, flushing it to disk first
// when sync is set.
func (jr *Journal) close(sync bool) error {
	close(jr.stop)
	<-jr.done
	var err error
	if sync {
		err = jr.Sync()
	}
	jr.mu.Lock()
	defer jr.mu.Unlock()
	if cerr := jr.f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	return err
}

// ErrJournal is wrapped by the errors of a journal that cannot be read
// (not a journal, a newer format).
var ErrJournal = errors.New("journal not readable")

// maxJournalSize bounds the bytes a journal is read to: a journal is
// dropped at every checkpoint, so a large one is not one this tool wrote.
const maxJournalSize = 64 << 20

// journalReplay is what readJournal found.
type journalReplay struct {
	id      string
	records []journalRecord
	// torn: reading stopped at a line that was cut short or does not read
	// (the record in flight at a power loss), with this many bytes left.
	torn     bool
	tornNote string
}

// readJournal reads the journal at path. A missing or empty journal is no
// error (nothing to apply). Records are checked to be numbered without a
// gap; reading stops at the first that is not.
func readJournal(path string) (journalReplay, error) {
	var out journalReplay
	f, err := os.Open(path)
	if errors.Is(err, os.ErrNotExist) {
		return out, nil
	}
	if err != nil {
		return out, &JobFileError{Path: path, Detail: "cannot open the journal: " + plainIOError(err), Err: err}
	}
	defer f.Close()
	jl, err := parseJournal(f)
	if fe, ok := err.(*JobFileError); ok {
		fe.Path = path
	}
	return jl, err
}

// parseJournal reads a journal from r (readJournal's work, on any reader).
func parseJournal(r io.Reader) (journalReplay, error) {
	var out journalReplay
	br := bufio.NewReader(io.LimitReader(r, maxJournalSize))
	line, err := br.ReadBytes('\n')
	if len(line) == 0 {
		return out, nil
	}
	var h journalHeader
	if err != nil || json.Unmarshal(line, &h) != nil || h.Schema != journalSchema {
		// A header cut short: the journal was being made when the
		// process died, so it holds no record.
		return journalReplay{torn: true, tornNote: "the journal's first line is not a journal header"}, nil
	}
	if h.Version > JournalVersion || h.Version < 1 {
		return out, &JobFileError{Version: h.Version, Err: ErrJournal, Detail: fmt.Sprintf(
			"the journal is in format version %d; this build reads version %d", h.Version, JournalVersion)}
	}
	out.id = h.Job
	for {
		line, err := br.ReadBytes('\n')
		if len(line) == 0 && err != nil {
			return out, nil
		}
		if err != nil { // no newline: the last write was cut short
			out.torn, out.tornNote = true, "the last record was cut short"
			return out, nil
		}
		if bline := bytes.TrimSpace(line); len(bline) == 0 {
			continue
		}
		if berr := checkJSONBounds(line); berr != nil {
			out.torn, out.tornNote = true, "a record "+berr.Error()
			return out, nil
		}
		var r journalRecord
		if err := json.Unmarshal(line, &r); err != nil {
			out.torn, out.tornNote = true, "a record does not read ("+jsonWords(err)+")"
			return out, nil
		}
		if n := len(out.records); n > 0 && r.N != out.records[n-1].N+1 {
			out.torn, out.tornNote = true, fmt.Sprintf("record %d follows record %d", r.N, out.records[n-1].N)
			return out, nil
		}
		out.records = append(out.records, r)
	}
}

// replay applies the records after mark.Seq to j when the journal is the
// job file's (same session ID). It returns the number applied and the
// number of the last record the job now holds.
func (jl journalReplay) replay(j *Job, mark JournalMark) (applied int, last uint64, note string, err error) {
	last = mark.Seq
	if jl.id == "" || jl.id != mark.ID {
		return 0, last, "", nil
	}
	for _, r := range jl.records {
		if r.N <= mark.Seq {
			continue
		}
		if r.N != last+1 {
			return applied, last, fmt.Sprintf("the journal's record %d does not follow the job file's %d; later records left out", r.N, last), nil
		}
		if err := r.apply(j); err != nil {
			return applied, last, err.Error() + "; it and later records left out", nil
		}
		applied++
		last = r.N
	}
	if jl.torn {
		note = jl.tornNote + "; left out"
	}
	return applied, last, note, nil
}
