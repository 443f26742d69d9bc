package presets

import (
	"errors"
	"fmt"
)

// Bounding a preset file before the TOML decoder sees it. The decoder's
// time and memory grow with the square of the nesting depth (measured on
// BurntSushi/toml v1.6.0, 2 cores: inline tables 1,000 deep take 0.2 s and
// 117 MB, 4,000 deep 2.9 s and 1.9 GB, 16,000 deep 51 s and 28 GB
// allocated, 9.6 GB resident; dotted keys 16,000 deep 7 s and 9.7 GB), so
// the depth and the key-path length are measured here first, in one pass
// over the text, and a file past either limit is refused without decoding.

// Limits of a preset file's structure; a real file needs a depth of 3 or 4
// and key paths of a few dozen characters.
const (
	maxNesting = 64   // tables, arrays and dotted-key parts, counted along a path
	maxKeyPath = 1024 // characters of a full key path
)

// ErrTooDeep is wrapped by a ParseError for a preset file nested deeper
// than 64 levels (tables, arrays and the parts of dotted keys).
var ErrTooDeep = errors.New("nested too deep")

// ErrKeyPathTooLong is wrapped by a ParseError for a preset file with a key
// path (table names and keys joined with dots) over 1,024 characters.
var ErrKeyPathTooLong = errors.New("key path too long")

// checkBounds measures the nesting depth and key-path length of src in
// linear time. It returns the 1-based line where a limit is first passed
// and the error, or 0 and nil. It does not validate TOML: what it cannot
// read it skips, and the decoder reports; it only has to count at least
// as deep as the decoder would nest.
func checkBounds(src string) (int, error) {
	s := &bounds{src: src, line: 1}
	s.run()
	return s.errLine, s.err
}

type boundsFrame struct {
	kind        byte // '{' inline table, '[' array
	depth, path int  // depth and key-path length of the frame's contents
}

type bounds struct {
	src     string
	i, line int
	base    boundsFrame // of the last [table] header
	stack   []boundsFrame
	err     error
	errLine int
	steps   int // scanner steps taken, for the linear-time test
}

func (s *bounds) run() {
	for s.i < len(s.src) && s.err == nil {
		s.steps++
		if len(s.stack) == 0 {
			s.topLevel()
		} else {
			s.inFrame()
		}
	}
}

// check records the first limit passed.
func (s *bounds) check(depth, path int) {
	if s.err != nil {
		return
	}
	switch {
	case depth > maxNesting:
		s.err = fmt.Errorf("%w: more than %d levels of tables, arrays and dotted keys; not read", ErrTooDeep, maxNesting)
	case path > maxKeyPath:
		s.err = fmt.Errorf("%w: a key path longer than %d characters; not read", ErrKeyPathTooLong, maxKeyPath)
	default:
		return
	}
	s.errLine = s.line
}

// topLevel reads a [table] header or a key = value line.
func (s *bounds) topLevel() {
	s.skipSpace(true)
	if s.i >= len(s.src) {
		return
	}
	if s.src[s.i] == '[' {
		s.i++
		depth := 0
		if s.i < len(s.src) && s.src[s.i] == '[' {
			s.i++
			depth = 1 // an array of tables adds a level
		}
		segs, plen, _ := s.key(']')
		s.base = boundsFrame{depth: depth + segs, path: plen}
		s.check(s.base.depth, s.base.path)
		s.skipLine()
		return
	}
	segs, plen, ok := s.key('=')
	if !ok {
		s.skipLine()
		return
	}
	s.i++ // '='
	depth, path := s.base.depth+segs, s.base.path+plen
	if s.base.path > 0 {
		path++ // the dot joining the table's name and the key
	}
	s.check(depth, path)
	s.value(depth, path)
}

// inFrame reads the next item inside an inline table or an array.
func (s *bounds) inFrame() {
	s.skipSpace(true)
	if s.i >= len(s.src) {
		return
	}
	top := s.stack[len(s.stack)-1]
	c := s.src[s.i]
	switch {
	case c == ',':
		s.i++
	case top.kind == '{' && c == '}', top.kind == '[' && c == ']':
		s.stack = s.stack[:len(s.stack)-1]
		s.i++
	case top.kind == '{':
		segs, plen, ok := s.key('=')
		if !ok {
			s.value(top.depth+1, top.path) // not a key: count what it holds
			return
		}
		s.i++
		depth, path := top.depth+segs, top.path+1+plen
		s.check(depth, path)
		s.value(depth, path)
	default:
		s.value(top.depth, top.path)
	}
}

// value reads one value at the given depth: an inline table or array opens
// a frame, a string or scalar is skipped. It always moves on at least one
// byte.
func (s *bounds) value(depth, path int) {
	s.skipSpace(false)
	if s.i >= len(s.src) {
		return
	}
	switch c := s.src[s.i]; c {
	case '{':
		s.stack = append(s.stack, boundsFrame{'{', depth, path})
		s.check(depth+1, path)
		s.i++
	case '[':
		s.stack = append(s.stack, boundsFrame{'[', depth + 1, path})
		s.check(depth+1, path)
		s.i++
	case '"', '\'':
		s.skipString()
	default:
		start := s.i
		for s.i < len(s.src) && !isValueEnd(s.src[s.i]) {
			s.i++
		}
		if s.i == start {
			if s.src[s.i] == '\n' {
				s.line++
			}
			s.i++
		}
	}
}

func isValueEnd(c byte) bool {
	switch c {
	case ',', ']', '}', '[', '{', '\n', '#', ' ', '\t', '\r', '"', '\'':
		return true
	}
	return false
}

// key reads a key up to term (not consumed): bare parts, quoted parts and
// dots. It returns the number of parts and the key's length without
// spaces; ok is false when a newline, the end of the text or a character
// no key holds comes first.
func (s *bounds) key(term byte) (segs, plen int, ok bool) {
	segs = 1
	for s.i < len(s.src) {
		c := s.src[s.i]
		switch c {
		case term:
			return segs, plen, true
		case ' ', '\t', '\r':
			s.i++
		case '.':
			segs++
			plen++
			s.i++
			if segs > maxNesting+1 {
				// Depth is already past the limit; count no further.
				s.check(segs+s.base.depth, plen)
			}
		case '"', '\'':
			start := s.i
			s.skipString()
			plen += s.i - start
		case '\n', '=', '[', ']', '{', '}', ',', '#':
			return segs, plen, false
		default:
			s.i++
			plen++
		}
		if s.err != nil {
			return segs, plen, false
		}
	}
	return segs, plen, false
}

// skipSpace skips blanks and comments, and newlines when nl is true.
func (s *bounds) skipSpace(nl bool) {
	for s.i < len(s.src) {
		switch s.src[s.i] {
		case ' ', '\t', '\r':
			s.i++
		case '\n':
			if !nl {
				return
			}
			s.line++
			s.i++
		case '#':
			for s.i < len(s.src) && s.src[s.i] != '\n' {
				s.i++
			}
		default:
			return
		}
	}
}

// skipLine moves to the start of the next line.
func (s *bounds) skipLine() {
	for s.i < len(s.src) {
		c := s.src[s.i]
		if c == '"' || c == '\'' {
			s.skipString()
			continue
		}
		s.i++
		if c == '\n' {
			s.line++
			return
		}
	}
}

// skipString moves past a basic or literal string, single-line or
// multi-line (triple quotes). A single-line string ends at a newline too.
func (s *bounds) skipString() {
	q := s.src[s.i]
	if s.i+2 < len(s.src) && s.src[s.i+1] == q && s.src[s.i+2] == q {
		s.i += 3
		for s.i < len(s.src) {
			c := s.src[s.i]
			switch {
			case c == '\\' && q == '"':
				s.i++
				if s.i < len(s.src) && s.src[s.i] == '\n' {
					s.line++
				}
			case c == '\n':
				s.line++
			case c == q && s.i+2 < len(s.src) && s.src[s.i+1] == q && s.src[s.i+2] == q:
				s.i += 3
				for s.i < len(s.src) && s.src[s.i] == q { // up to two quotes may close it
					s.i++
				}
				return
			}
			s.i++
		}
		return
	}
	s.i++
	for s.i < len(s.src) {
		c := s.src[s.i]
		switch {
		case c == '\\' && q == '"':
			s.i++
			if s.i < len(s.src) && s.src[s.i] == '\n' {
				return // an escaped newline ends a single-line string too
			}
		case c == q:
			s.i++
			return
		case c == '\n':
			return
		}
		s.i++
	}
}
