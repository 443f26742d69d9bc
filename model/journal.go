package model

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"maps"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"sync"
	"time"
)

// The journal is a file beside the job file, ".NAME.journal" for the job
// file NAME, that holds the edits made since the job file was last written
// whole. It is JSON Lines, one record a line, in format version 1:
//
//	{"schema":"drawdown-journal","version":1,"job":"5f0c9a1e7d2b4c63"}
//	{"n":1,"inputs":{"hose.length":"12."},"set":{"updated":"2026-03-14T09:02:11Z"}}
//	{"n":2,"set":{"draft":{"kind":"note","step":"prime-3","text":"gas 0 %","at":"…"}}}
//	{"n":3,"steps":{"4":{…the whole step…}},"log":{"from":17,"add":[{…}]},"set":{…}}
//
// The first line is the header. Its "job" is the session ID that the job
// file names in its own "journal" entry ({"id": …, "seq": N}); a journal
// whose ID is not the job file's belongs to another state of the file and
// is never applied. Each record has its number "n" (1, 2, 3, … with no gap)
// and the changes since the record before:
//
//   - "set": top-level job entries replaced whole, by their job-file key
//     ("name", "units", "site_facts", "draft", "updated", …);
//   - "inputs", "last_good": field entries set, or null for cleared;
//   - "steps": checklist steps replaced whole, by their index (the whole
//     checklist goes in "set" when steps are added, removed or rebuilt);
//   - "log", "readings": the list cut to "from" entries, then "add"
//     appended (an append has "from" at the old length).
//
// A record is written with one plain write, so a killed process leaves
// every record it wrote; a record cut short (a power loss) has no newline
// or does not read, and it and anything after it are left out. The journal
// is flushed to disk (fsync) at most about once a second and at each
// checkpoint, when the job file is written whole with the number of the
// last record it holds; records up to that number are then dropped.
//
// The resume position (Job.Resume) is not journalled: it is written at
// checkpoints only, so a move that changes nothing writes nothing.

// JournalVersion is the journal format version this build writes and reads.
const JournalVersion = 1

const journalSchema = "drawdown-journal"

// JournalPath is the journal beside the job file at jobPath.
func JournalPath(jobPath string) string { return sidePath(jobPath, ".journal") }

// sidePath is a hidden file beside the job file: ".NAME" + suffix.
func sidePath(jobPath, suffix string) string {
	dir, base := filepath.Split(jobPath)
	return filepath.Join(dir, "."+base+suffix)
}

type journalHeader struct {
	Schema  string `json:"schema"`
	Version int    `json:"version"`
	Job     string `json:"job"`
}

// JournalMark is the job file's "journal" entry: the session that wrote the
// file and the number of the last journal record it holds.
type JournalMark struct {
	ID  string `json:"id"`
	Seq uint64 `json:"seq"`
}

// listEdit is a "log" or "readings" change: cut the list to From entries,
// then append Add.
type listEdit[T any] struct {
	From int `json:"from"`
	Add  []T `json:"add"`
}

// journalRecord is one line after the header.
type journalRecord struct {
	N        uint64                     `json:"n"`
	Set      map[string]json.RawMessage `json:"set,omitempty"`
	Inputs   map[FieldID]*string        `json:"inputs,omitempty"`
	LastGood map[FieldID]*string        `json:"last_good,omitempty"`
	Steps    map[string]Step            `json:"steps,omitempty"`
	Log      *listEdit[LogEntry]        `json:"log,omitempty"`
	Readings *listEdit[Reading]         `json:"readings,omitempty"`
}

// How each top-level entry of a Job is journalled.
type entryKind int

const (
	entryReplace   entryKind = iota // written whole when it changes
	entrySkip                       // never: constant, or written at checkpoints only
	entryStamp                      // written with another change only (updated)
	entryMap                        // inputs, last_good: by field
	entryList                       // log, readings: appended
	entrySteps                      // checklist: by step where it can be
	entryKindCount                  // number of kinds
)

type jobEntry struct {
	key   string // the job-file key
	index int    // the Job struct field
	kind  entryKind
}

// jobEntries lists every field of Job with its job-file key and how it is
// journalled. A field added to Job is journalled whole (entryReplace) with
// no change here; TestJournalEveryEntry checks that the table covers Job.
var jobEntries, jobEntryByKey = func() ([]jobEntry, map[string]jobEntry) {
	special := map[string]entryKind{
		"schema": entrySkip, "version": entrySkip, "resume": entrySkip, "updated": entryStamp,
		"inputs": entryMap, "last_good": entryMap, "log": entryList, "readings": entryList, "checklist": entrySteps,
	}
	t := reflect.TypeFor[Job]()
	var list []jobEntry
	byKey := map[string]jobEntry{}
	for i := range t.NumField() {
		key, _, _ := strings.Cut(t.Field(i).Tag.Get("json"), ",")
		e := jobEntry{key: key, index: i, kind: special[key]}
		list = append(list, e)
		byKey[key] = e
	}
	return list, byKey
}()

// journalSnap is the job as the job file and the journal together hold it:
// a deep copy of each entry, except the two long lists, of which only the
// length and the last entry are kept (they are only appended to).
type journalSnap struct {
	job      Job
	logN     int
	logLast  LogEntry
	readN    int
	readLast Reading
}

func newSnap(j *Job) journalSnap {
	s := journalSnap{}
	v, sv := reflect.ValueOf(j).Elem(), reflect.ValueOf(&s.job).Elem()
	for _, e := range jobEntries {
		if e.kind != entryList {
			sv.Field(e.index).Set(deepCopy(v.Field(e.index)))
		}
	}
	s.takeLists(j)
	return s
}

// take copies the entries that changed (by field index) into the
// snapshot, and the ends of the lists.
func (s *journalSnap) take(j *Job, changed []int) {
	v, sv := reflect.ValueOf(j).Elem(), reflect.ValueOf(&s.job).Elem()
	for _, i := range changed {
		sv.Field(i).Set(deepCopy(v.Field(i)))
	}
	s.job.Updated = j.Updated
	s.takeLists(j)
}

func (s *journalSnap) takeLists(j *Job) {
	s.logN, s.readN = len(j.Log), len(j.Readings)
	s.logLast, s.readLast = LogEntry{}, Reading{}
	if s.logN > 0 {
		s.logLast = j.Log[s.logN-1]
	}
	if s.readN > 0 {
		s.readLast = j.Readings[s.readN-1]
	}
}

// Change says what a Journal.Record call found.
type Change struct {
	// Recorded: the job differed from what the journal holds, and one
	// record was written.
	Recorded bool
	// Checkpoint: the change is one that calls for the whole file to be
	// written soon (a checklist step marked, a reading added).
	Checkpoint bool
}

// diff builds the record that turns the snapshot into j, and reports
// whether it calls for a checkpoint. It returns nil when nothing that is
// journalled changed. The cost is that of comparing the short entries and
// the ends of the two lists, whatever their lengths.
func (s *journalSnap) diff(j *Job) (r *journalRecord, changed []int, checkpoint bool, err error) {
	r = &journalRecord{}
	live, old := reflect.ValueOf(j).Elem(), reflect.ValueOf(&s.job).Elem()
	lists := false
	for _, e := range jobEntries {
		switch e.kind {
		case entrySkip, entryStamp:
		case entryReplace:
			if !reflect.DeepEqual(live.Field(e.index).Interface(), old.Field(e.index).Interface()) {
				if err := r.set(e.key, live.Field(e.index).Interface()); err != nil {
					return nil, nil, false, err
				}
				changed = append(changed, e.index)
			}
		case entryMap:
			d := mapDiff(live.Field(e.index).Interface().(map[FieldID]string), old.Field(e.index).Interface().(map[FieldID]string))
			if d == nil {
				continue
			}
			changed = append(changed, e.index)
			if e.key == "inputs" {
				r.Inputs = d
			} else {
				r.LastGood = d
			}
		case entryList:
			if e.key == "log" {
				r.Log = listDiff(j.Log, s.logN, s.logLast)
				lists = lists || r.Log != nil
			} else {
				r.Readings = listDiff(j.Readings, s.readN, s.readLast)
				lists = lists || r.Readings != nil
				checkpoint = checkpoint || r.Readings != nil
			}
		case entrySteps:
			c, mark, err := r.steps(&j.Checklist, &s.job.Checklist)
			if err != nil {
				return nil, nil, false, err
			}
			if c {
				changed = append(changed, e.index)
			}
			checkpoint = checkpoint || mark
		case entryKindCount:
		}
	}
	if len(changed) == 0 && !lists {
		return nil, nil, false, nil
	}
	if !j.Updated.Equal(s.job.Updated) {
		if err := r.set("updated", j.Updated); err != nil {
			return nil, nil, false, err
		}
	}
	return r, changed, checkpoint, nil
}

func (r *journalRecord) set(key string, v any) error {
	b, err := json.Marshal(v)
	if err != nil {
		return fmt.Errorf("the entry %q cannot be written: %w", key, err)
	}
	if r.Set == nil {
		r.Set = map[string]json.RawMessage{}
	}
	r.Set[key] = b
	return nil
}

// steps records a checklist change: the changed steps by index when only
// steps changed in place, else the whole checklist. mark is true when a
// step's state changed.
func (r *journalRecord) steps(live, old *Checklist) (changed, mark bool, err error) {
	sameShape := live.Context == old.Context && len(live.Steps) == len(old.Steps) && reflect.DeepEqual(live.Dropped, old.Dropped)
	if !sameShape {
		return true, true, r.set("checklist", *live)
	}
	for i := range live.Steps {
		if live.Steps[i] == old.Steps[i] {
			continue
		}
		if r.Steps == nil {
			r.Steps = map[string]Step{}
		}
		r.Steps[strconv.Itoa(i)] = live.Steps[i]
		mark = mark || live.Steps[i].State != old.Steps[i].State
	}
	return r.Steps != nil, mark, nil
}

func mapDiff(live, old map[FieldID]string) map[FieldID]*string {
	if maps.Equal(live, old) {
		return nil
	}
	d := map[FieldID]*string{}
	for k, v := range live {
		if o, ok := old[k]; !ok || o != v {
			d[k] = &v
		}
	}
	for k := range old {
		if _, ok := live[k]; !ok {
			d[k] = nil
		}
	}
	return d
}

// listDiff is the edit that turns a list of n entries ending in last into
// live: an append when live starts with those n (checked by its n-th entry),
// else the whole list.
func listDiff[T comparable](live []T, n int, last T) *listEdit[T] {
	if len(live) == n && (n == 0 || live[n-1] == last) {
		return nil
	}
	if len(live) >= n && (n == 0 || live[n-1] == last) {
		return &listEdit[T]{From: n, Add: live[n:]}
	}
	return &listEdit[T]{From: 0, Add: live}
}

// apply applies the record to j (replay). An entry that does not fit the
// job (a step index past the list, a list cut past its end, an unknown
// key, a value that does not read) is an error, and j is left unchanged:
// the journal is then not of this job, or damaged from that record on.
func (r *journalRecord) apply(j *Job) error {
	v := reflect.ValueOf(j).Elem()
	type setting struct {
		index int
		value reflect.Value
	}
	var sets []setting
	for key, raw := range r.Set {
		e, ok := jobEntryByKey[key]
		if !ok || e.kind == entrySkip || e.kind == entryMap || e.kind == entryList {
			return fmt.Errorf("record %d sets the entry %q, which a journal does not hold", r.N, key)
		}
		p := reflect.New(v.Field(e.index).Type())
		if err := json.Unmarshal(raw, p.Interface()); err != nil {
			return fmt.Errorf("record %d: the entry %q does not read (%s)", r.N, key, jsonWords(err))
		}
		sets = append(sets, setting{e.index, p.Elem()})
	}
	steps := len(j.Checklist.Steps)
	if raw, ok := r.Set["checklist"]; ok {
		var c Checklist
		json.Unmarshal(raw, &c) // read above without error
		steps = len(c.Steps)
	}
	for k := range r.Steps {
		if i, err := strconv.Atoi(k); err != nil || i < 0 || i >= steps {
			return fmt.Errorf("record %d changes step %q of a checklist of %d steps", r.N, k, steps)
		}
	}
	if e := r.Log; e != nil && (e.From < 0 || e.From > len(j.Log)) {
		return fmt.Errorf("record %d cuts the log of %d entries at %d", r.N, len(j.Log), e.From)
	}
	if e := r.Readings; e != nil && (e.From < 0 || e.From > len(j.Readings)) {
		return fmt.Errorf("record %d cuts the readings of %d entries at %d", r.N, len(j.Readings), e.From)
	}
	for _, s := range sets {
		v.Field(s.index).Set(s.value)
	}
	applyMap(&j.Inputs, r.Inputs)
	applyMap(&j.LastGood, r.LastGood)
	for k, s := range r.Steps {
		i, _ := strconv.Atoi(k)
		j.Checklist.Steps[i] = s
	}
	j.Log = applyList(j.Log, r.Log)
	j.Readings = applyList(j.Readings, r.Readings)
	return nil
}

func applyMap(m *map[FieldID]string, d map[FieldID]*string) {
	if len(d) == 0 {
		return
	}
	if *m == nil {
		*m = map[FieldID]string{}
	}
	for k, v := range d {
		if v == nil {
			delete(*m, k)
		} else {
			(*m)[k] = *v
		}
	}
}

func applyList[T any](list []T, e *listEdit[T]) []T {
	if e == nil {
		return list
	}
	out := append(list[:e.From], e.Add...)
	if len(out) == 0 {
		return nil
	}
	return out
}

// deepCopy copies v, with its own copies of every slice and map in it
// (exported fields; time.Time and other values without them are copied as
// they are).
func deepCopy(v reflect.Value) reflect.Value {
	if !hasRefs(v.Type()) {
		return v
	}
	switch v.Kind() {
	case reflect.Slice:
		if v.IsNil() {
			return reflect.Zero(v.Type())
		}
		c := reflect.MakeSlice(v.Type(), v.Len(), v.Len())
		for i := range v.Len() {
			c.Index(i).Set(deepCopy(v.Index(i)))
		}
		return c
	case reflect.Map:
		if v.IsNil() {
			return reflect.Zero(v.Type())
		}
		c := reflect.MakeMapWithSize(v.Type(), v.Len())
		for it := v.MapRange(); it.Next(); {
			c.SetMapIndex(it.Key(), deepCopy(it.Value()))
		}
		return c
	case reflect.Struct:
		c := reflect.New(v.Type()).Elem()
		c.Set(v)
		for i := range v.NumField() {
			if f := v.Type().Field(i); f.IsExported() {
				if k := f.Type.Kind(); k == reflect.Slice || k == reflect.Map || k == reflect.Struct {
					c.Field(i).Set(deepCopy(v.Field(i)))
				}
			}
		}
		return c
	default:
		return v
	}
}

// refTypes caches hasRefs.
var refTypes sync.Map // reflect.Type → bool

// hasRefs reports whether values of t hold a slice or a map in an exported
// field, at any depth (time.Time, a Step, a Reading do not).
func hasRefs(t reflect.Type) bool {
	if b, ok := refTypes.Load(t); ok {
		return b.(bool)
	}
	b := false
	switch t.Kind() {
	case reflect.Slice, reflect.Map:
		b = true
	case reflect.Struct:
		for i := range t.NumField() {
			if f := t.Field(i); f.IsExported() && hasRefs(f.Type) {
				b = true
			}
		}
	default:
	}
	refTypes.Store(t, b)
	return b
}

// Journal appends a job's edits to its journal file. Record is called from
// one goroutine (the screen's); a background goroutine flushes the file to
// disk at most once every FlushEvery, and Sync flushes it at once.
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

// Record compares j with what the journal holds and, when something
// journalled changed, appends one record. It never waits for the disk.
func (jr *Journal) Record(j *Job) (Change, error) {
	r, changed, checkpoint, err := jr.snap.diff(j)
	if err != nil || r == nil {
		return Change{}, err
	}
	if err := jr.write(r); err != nil {
		return Change{}, err
	}
	jr.snap.take(j, changed)
	return Change{Recorded: true, Checkpoint: checkpoint}, nil
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
	br := bufio.NewReader(io.LimitReader(f, maxJournalSize))
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
		return out, &JobFileError{Path: path, Version: h.Version, Err: ErrJournal, Detail: fmt.Sprintf(
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
