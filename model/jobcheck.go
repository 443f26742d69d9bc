package model

import (
	"encoding/json"
	"errors"
	"fmt"
	"reflect"
	"strings"
	"time"
)

// Bounding and checking a job file before and after it is decoded. The
// decoder (encoding/json) is linear in the size of its input, but a file
// nested thousands deep or with kilobyte keys is not one this tool wrote,
// and the job file and journal are read at every start: they are measured
// first, in one pass, and refused past either limit, as preset files are
// (presets/user_bounds.go).

// Limits of a job file's structure; a real one nests 5 deep with key paths
// of a few dozen characters.
const (
	maxJSONNesting = 64   // objects and lists, counted along a path
	maxJSONKeyPath = 1024 // characters of a key path, keys joined with dots
)

// Errors wrapped (with ErrDamaged) by the *JobFileError of a job file past
// a limit.
var (
	ErrTooDeep        = errors.New("nested too deep")
	ErrKeyPathTooLong = errors.New("key path too long")
)

// checkJSONBounds measures the nesting depth and key-path length of data in
// one pass (jsonBounds.steps counts it, for the linear-time test). It does
// not validate JSON: the decoder does that next.
func checkJSONBounds(data []byte) error {
	b := jsonBounds{data: data}
	return b.run()
}

type jsonBounds struct {
	data  []byte
	steps int
}

func (b *jsonBounds) run() error {
	// path[k] is the key-path length of what is inside the k-th open
	// object or list; inObj[k] tells objects from lists.
	var path []int
	var inObj []bool
	key := false // the next string in an object is a key
	pending := 0 // length of the last key read, for the value after it
	for i := 0; i < len(b.data); i++ {
		b.steps++
		switch c := b.data[i]; c {
		case '{', '[':
			base := 0
			if n := len(path); n > 0 {
				base = path[n-1]
				if inObj[n-1] {
					base += pending
					if base > 0 && pending > 0 && path[n-1] > 0 {
						base++ // the dot joining the parent's path and the key
					}
				}
			}
			if len(path)+1 > maxJSONNesting {
				return fmt.Errorf("%w: more than %d levels of objects and lists (at byte %d); not read", ErrTooDeep, maxJSONNesting, i)
			}
			path, inObj = append(path, base), append(inObj, c == '{')
			key, pending = c == '{', 0
		case '}', ']':
			if n := len(path); n > 0 {
				path, inObj = path[:n-1], inObj[:n-1]
			}
			key = false
		case ',':
			if n := len(inObj); n > 0 && inObj[n-1] {
				key = true
			}
		case ':':
			key = false
		case '"':
			start := i + 1
			for i++; i < len(b.data) && b.data[i] != '"'; i++ {
				b.steps++
				if b.data[i] == '\\' {
					i++
				}
			}
			if key {
				pending = i - start
				n := len(path)
				total := path[n-1] + pending
				if path[n-1] > 0 {
					total++
				}
				if total > maxJSONKeyPath {
					return fmt.Errorf("%w: a key path longer than %d characters (at byte %d); not read", ErrKeyPathTooLong, maxJSONKeyPath, start)
				}
			}
		}
	}
	return nil
}

// jsonWords says what is wrong with JSON in plain words: the JSON kinds and
// the kinds of job entry, never Go type names.
func jsonWords(err error) string {
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	var pe *time.ParseError
	switch {
	case errors.As(err, &se):
		return fmt.Sprintf("not valid JSON at byte %d (%s); it may have been cut short", se.Offset, strings.TrimPrefix(se.Error(), "json: "))
	case errors.As(err, &te):
		got := jsonKindWords(te.Value)
		if te.Field == "" {
			return "the file holds " + got + ", not a job object"
		}
		want := typeWords(te.Type)
		if strings.HasPrefix(got, "a number") && strings.Contains(want, "number") {
			// The right kind, but past what the entry can hold (1e400).
			return fmt.Sprintf("the entry %q holds %s, too large to be read (byte %d)", te.Field, got, te.Offset)
		}
		return fmt.Sprintf("the entry %q holds %s where %s belongs (byte %d)", te.Field, got, want, te.Offset)
	case errors.As(err, &pe):
		return fmt.Sprintf("the time %q does not read; times are written like 2026-03-14T09:05:00Z", pe.Value)
	}
	return strings.TrimPrefix(err.Error(), "json: ")
}

// jsonKindWords words encoding/json's name for a JSON value ("string",
// "number 1e400", "object", …).
func jsonKindWords(v string) string {
	kind, rest, _ := strings.Cut(v, " ")
	w := map[string]string{"string": "text", "number": "a number", "bool": "true or false",
		"object": "an object", "array": "a list", "null": "null"}[kind]
	if w == "" {
		w = "a JSON " + kind
	}
	if rest != "" {
		w += " (" + rest + ")"
	}
	return w
}

// typeWords words the kind of value a job entry takes.
func typeWords(t reflect.Type) string {
	if t == nil {
		return "another kind of value"
	}
	if t == reflect.TypeFor[time.Time]() {
		return "a time (like 2026-03-14T09:05:00Z)"
	}
	switch t.Kind() {
	case reflect.String:
		return "text"
	case reflect.Bool:
		return "true or false"
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return "a whole number"
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		return "a whole number, 0 or more"
	case reflect.Float32, reflect.Float64:
		return "a number"
	case reflect.Slice, reflect.Array:
		return "a list"
	case reflect.Map, reflect.Struct:
		return "an object"
	case reflect.Pointer:
		return typeWords(t.Elem())
	default:
		return "another kind of value"
	}
}

// checkJob checks the values of a decoded job that the decoder cannot:
// readings and flow tests in range (a level of 1e300 m would print as 300
// digits), the draft. The first problem is returned, naming the entry.
func checkJob(j *Job) error {
	for i, r := range j.Readings {
		if err := r.Validate(); err != nil {
			return fmt.Errorf("reading %d of %d: %s", i+1, len(j.Readings), strings.TrimPrefix(err.Error(), "level reading: "))
		}
	}
	if len(j.FlowTests) > MaxFlowTests {
		return fmt.Errorf("flow tests: %d of them; accepted at most %d", len(j.FlowTests), MaxFlowTests)
	}
	for i, f := range j.FlowTests {
		if err := f.Validate(); err != nil {
			return fmt.Errorf("flow test %d of %d: %s", i+1, len(j.FlowTests), strings.TrimPrefix(err.Error(), "flow test: "))
		}
		if len(f.By) > MaxFlowTestText || len(f.Note) > MaxFlowTestText {
			return fmt.Errorf("flow test %d of %d: its name or note is over %d bytes", i+1, len(j.FlowTests), MaxFlowTestText)
		}
	}
	if err := checkBy(j); err != nil {
		return err
	}
	if err := j.Draft.Validate(); err != nil {
		return err
	}
	return nil
}

// MaxByText bounds the name of who made a mark, a reading or a log entry,
// in bytes (a key's comment is short; a longer one is not from this tool).
const MaxByText = 200

// checkBy checks the names of who made each mark, reading and log entry.
func checkBy(j *Job) error {
	for i, s := range j.Checklist.Steps {
		if len(s.By) > MaxByText {
			return fmt.Errorf("checklist step %d: its name is over %d bytes", i+1, MaxByText)
		}
	}
	for i, r := range j.Readings {
		if len(r.By) > MaxByText {
			return fmt.Errorf("reading %d of %d: its name is over %d bytes", i+1, len(j.Readings), MaxByText)
		}
	}
	for i, e := range j.Log {
		if len(e.By) > MaxByText {
			return fmt.Errorf("log entry %d of %d: its name is over %d bytes", i+1, len(j.Log), MaxByText)
		}
	}
	return nil
}
