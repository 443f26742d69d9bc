package model

import (
	"encoding/json"
	"fmt"
	"maps"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"sync"
)

// The journal is a file beside the job file, ".NAME.journal" for the job
// file NAME, that holds the edits made since the job file was last written
// whole. It is JSON Lines, one record a line, in format version 2:
//
//	{"schema":"drawdown-journal","version":2,"job":"5f0c9a1e7d2b4c63"}
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
//     checklist goes in "set" when steps are added or removed);
//   - "checklist_context": the checklist's context replaced whole (the
//     plan's figures and the facts the steps are built from), when the
//     steps stay (version 2; a version 1 journal has none);
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
// Version 2 added "checklist_context"; version 1 journals read as they
// are (they hold the whole checklist where version 2 holds the context).
const JournalVersion = 2

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

// listEdit is a "log", "readings" or "flow_tests" change: cut the list to From entries,
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
	Flows    *listEdit[FlowTest]        `json:"flow_tests,omitempty"`
	Context  *ChecklistContext          `json:"checklist_context,omitempty"`
}

// How each top-level entry of a Job is journalled.
type entryKind int

const (
	entryReplace   entryKind = iota // written whole when it changes
	entrySkip                       // never: constant, or written at checkpoints only
	entryStamp                      // written with another change only (updated)
	entryMap                        // inputs, last_good: by field
	entryList                       // log, readings, flow_tests: appended
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
		"flow_tests": entryList,
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
// a deep copy of each entry, except the long lists, of which only the
// length and the last entry are kept (they are only appended to).
type journalSnap struct {
	job      Job
	logN     int
	logLast  LogEntry
	readN    int
	readLast Reading
	flowN    int
	flowLast FlowTest
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
	s.logN, s.readN, s.flowN = len(j.Log), len(j.Readings), len(j.FlowTests)
	s.logLast, s.readLast, s.flowLast = LogEntry{}, Reading{}, FlowTest{}
	if s.flowN > 0 {
		s.flowLast = j.FlowTests[s.flowN-1]
	}
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
// the ends of the two lists, whatever their lengths. Its cyclomatic
// complexity (~26) is one case per kind of journal entry (and per list).
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
			switch e.key {
			case "log":
				r.Log = listDiff(j.Log, s.logN, s.logLast)
				lists = lists || r.Log != nil
			case "flow_tests":
				r.Flows = listDiff(j.FlowTests, s.flowN, s.flowLast)
				lists = lists || r.Flows != nil
				checkpoint = checkpoint || r.Flows != nil
			default:
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

// steps records a checklist change: the context alone when it changed
// (the plan's figures the steps quote move with every input), the changed
// steps by index when only steps changed in place, else the whole
// checklist. mark is true when a step's state changed, or steps were added
// or removed.
func (r *journalRecord) steps(live, old *Checklist) (changed, mark bool, err error) {
	sameShape := len(live.Steps) == len(old.Steps) && reflect.DeepEqual(live.Dropped, old.Dropped)
	if !sameShape {
		return true, true, r.set("checklist", *live)
	}
	if live.Context != old.Context {
		ctx := live.Context
		r.Context = &ctx
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
	return r.Steps != nil || r.Context != nil, mark, nil
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
	if e := r.Flows; e != nil && (e.From < 0 || e.From > len(j.FlowTests)) {
		return fmt.Errorf("record %d cuts the flow tests of %d entries at %d", r.N, len(j.FlowTests), e.From)
	}
	for _, s := range sets {
		v.Field(s.index).Set(s.value)
	}
	applyMap(&j.Inputs, r.Inputs)
	applyMap(&j.LastGood, r.LastGood)
	if r.Context != nil {
		j.Checklist.Context = *r.Context
	}
	for k, s := range r.Steps {
		i, _ := strconv.Atoi(k)
		j.Checklist.Steps[i] = s
	}
	j.Log = applyList(j.Log, r.Log)
	j.Readings = applyList(j.Readings, r.Readings)
	j.FlowTests = applyList(j.FlowTests, r.Flows)
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
