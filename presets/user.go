package presets

import (
	"errors"
	"fmt"
	"io"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"
)

// This file holds the preset file's front door: the error type, LoadUser,
// and the file-level decode that hands each [[section]] entry to its decoder
// (user_liquid.go, user_hose.go, user_tank.go, user_priming.go). The shared
// value checks are in user_checks.go, the schema in user_schema.go and the
// line finder in user_locate.go.

// ParseError is the error of a preset file: the file name, the line (when
// known) and the field at fault, in the manner of encoding/csv's ParseError.
type ParseError struct {
	File  string // the name given to LoadUser
	Line  int    // 1-based line; 0 when unknown
	Field string // e.g. `liquid "syrup" t_max_c` or `fitting 3 k`
	Err   error  // what is wrong
}

// Error formats the error as "file:line: field: what is wrong". A field
// over 60 characters (a long key path) and a message over 200 are cut in
// the middle with an ellipsis, so the line never repeats a whole key path.
func (e *ParseError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		b.WriteString(":" + strconv.Itoa(e.Line))
	}
	b.WriteString(": ")
	if e.Field != "" {
		b.WriteString(elide(e.Field, maxFieldText) + ": ")
	}
	if e.Err != nil {
		b.WriteString(elide(e.Err.Error(), maxMessageText))
	}
	return b.String()
}

// Lengths, in characters, past which ParseError.Error cuts a field and a
// message.
const (
	maxFieldText   = 60
	maxMessageText = 200
)

// elide shortens s to max characters by cutting its middle with "…".
func elide(s string, max int) string {
	if utf8.RuneCountInString(s) <= max {
		return s
	}
	r := []rune(s)
	head := (max - 1) / 2
	tail := max - 1 - head
	return string(r[:head]) + "…" + string(r[len(r)-tail:])
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

// ErrSyntax is wrapped by a ParseError for TOML that does not parse or a
// value of the wrong type.
var ErrSyntax = errors.New("preset file syntax")

// ErrUnknownField is wrapped by a ParseError for a key the format does not
// define (often a typo or a wrong unit suffix).
var ErrUnknownField = errors.New("unknown field")

// maxUserFile is the largest preset file LoadUser reads, 1 MiB.
const maxUserFile = 1 << 20

// LoadUser reads a preset file (the format is described in the package
// documentation) and returns a catalogue of its entries only; lay it over
// the built-in catalogue with Builtin().Merge, or use Load, which opens the
// file and does both. name is used in error messages. A liquid may be
// "based_on" a built-in liquid or one defined earlier in the same file.
//
// Any error is a *ParseError naming the line and the field, except a read
// error from r, which is returned as is.
func LoadUser(r io.Reader, name string) (*Catalogue, error) {
	data, err := io.ReadAll(io.LimitReader(r, maxUserFile+1))
	if err != nil {
		return nil, err
	}
	if len(data) > maxUserFile {
		return nil, &ParseError{File: name, Err: tooLarge(-1)}
	}
	return parse(string(data), name, "user file "+name, Builtin())
}

// parser carries the file text for locating keys, the catalogue that
// "based_on" looks liquids up in, and the IDs seen so far.
type parser struct {
	file   string
	origin string
	lines  []string
	base   *Catalogue
	seen   map[string]map[string]bool // section → IDs already defined
}

var tomlLineRe = regexp.MustCompile(`^toml: line (\d+) \(last key "([^"]*)"\): (.*)$`)

// parse decodes src (named file in errors) into a catalogue whose entries
// carry origin; base is the catalogue "based_on" may name besides the
// file's own liquids (nil for the built-in file itself).
func parse(src, file, origin string, base *Catalogue) (*Catalogue, error) {
	p := &parser{file: file, origin: origin, lines: strings.Split(src, "\n"), base: base,
		seen: map[string]map[string]bool{}}
	// The decoder is quadratic in the nesting depth: bound it first.
	if line, err := checkBounds(src); err != nil {
		return nil, &ParseError{File: file, Line: line, Err: err}
	}
	var doc fileDoc
	md, err := toml.Decode(src, &doc)
	if err != nil {
		return nil, p.decodeError(err)
	}
	if err := p.undecoded(md); err != nil {
		return nil, err
	}
	return p.build(&doc)
}

// decodeError turns the TOML library's error into a *ParseError in the
// file's words.
func (p *parser) decodeError(err error) *ParseError {
	var te toml.ParseError
	if errors.As(err, &te) {
		return &ParseError{File: p.file, Line: te.Position.Line, Field: te.LastKey,
			Err: fmt.Errorf("%w: %s", ErrSyntax, tomlMessage(te))}
	}
	// Type mismatches come as plain errors: "toml: line N (last key
	// "k"): message".
	pe := &ParseError{File: p.file, Err: fmt.Errorf("%w: %v", ErrSyntax, err)}
	if m := tomlLineRe.FindStringSubmatch(err.Error()); m != nil {
		pe.Line, _ = strconv.Atoi(m[1])
		pe.Field = m[2]
		pe.Err = fmt.Errorf("%w: %s", ErrSyntax, friendlyType(m[3]))
	}
	return pe
}

// undecoded reports the first key the schema does not define.
func (p *parser) undecoded(md toml.MetaData) error {
	und := md.Undecoded()
	if len(und) == 0 {
		return nil
	}
	k := und[0]
	section, key := "", k.String()
	if len(k) > 1 {
		section, key = k[0], strings.Join(k[1:], ".")
	}
	line := 0
	if section != "" {
		line = p.locate(section, -1, key)
	} else {
		line = p.locateTop(key)
	}
	return &ParseError{File: p.file, Line: line, Field: k.String(), Err: ErrUnknownField}
}

// build decodes every entry, section by section in a fixed order (so the
// first error reported does not depend on the file's order of sections).
func (p *parser) build(doc *fileDoc) (*Catalogue, error) {
	c := &Catalogue{}
	var err error
	if c.materials, err = decodeAll(p, "material", doc.Material, func(d materialDoc) string { return d.ID }, p.material); err != nil {
		return nil, err
	}
	if c.hoses, err = decodeAll(p, "hose", doc.Hose, func(d hoseDoc) string { return d.ID }, p.hose); err != nil {
		return nil, err
	}
	if c.fittings, err = decodeAll(p, "fitting", doc.Fitting, func(d fittingDoc) string { return d.ID }, p.fitting); err != nil {
		return nil, err
	}
	if c.intakes, err = decodeAll(p, "intake", doc.Intake, func(d intakeDoc) string { return d.ID }, p.intake); err != nil {
		return nil, err
	}
	for _, err := range []error{
		aliasClash(p, "intake", c.intakes, func(in Intake) string { return in.ID }, func(in Intake) []string { return in.Aliases }),
		aliasClash(p, "material", c.materials, func(m Material) string { return m.ID }, func(m Material) []string { return m.Aliases }),
		aliasClash(p, "hose", c.hoses, func(h Hose) string { return h.ID }, func(h Hose) []string { return h.Aliases }),
		aliasClash(p, "fitting", c.fittings, func(f Fitting) string { return f.ID }, func(f Fitting) []string { return f.Aliases }),
	} {
		if err != nil {
			return nil, err
		}
	}
	if c.tanks, err = decodeAll(p, "tank", doc.Tank, func(d tankDoc) string { return d.ID }, p.tank); err != nil {
		return nil, err
	}
	if c.priming, err = decodeAll(p, "priming", doc.Priming, func(d primingDoc) string { return d.ID }, p.priming); err != nil {
		return nil, err
	}
	if c.aids, err = decodeAll(p, "priming_aid", doc.PrimingAid, func(d aidDoc) string { return d.ID }, p.aid); err != nil {
		return nil, err
	}
	// Liquids last: "based_on" may name a liquid defined earlier in the
	// file, so each decoded liquid joins c before the next is read.
	for i, d := range doc.Liquid {
		id, err := p.checkID("liquid", i, d.ID)
		if err != nil {
			return nil, err
		}
		l, err := p.liquid(i, id, d, c)
		if err != nil {
			return nil, err
		}
		c.liquids = append(c.liquids, l)
	}
	return c, nil
}

// decodeAll checks each entry's ID and decodes it with dec, stopping at the
// first error.
func decodeAll[D, T any](p *parser, section string, docs []D, idOf func(D) string, dec func(int, string, D) (T, error)) ([]T, error) {
	var out []T
	for i, d := range docs {
		id, err := p.checkID(section, i, idOf(d))
		if err != nil {
			return nil, err
		}
		v, err := dec(i, id, d)
		if err != nil {
			return nil, err
		}
		out = append(out, v)
	}
	return out, nil
}
