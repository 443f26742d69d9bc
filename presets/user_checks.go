package presets

import (
	"errors"
	"fmt"
	"math"
	"regexp"
	"strings"

	"github.com/BurntSushi/toml"
)

// Value checks shared by every entry decoder of the preset file.

var idRe = regexp.MustCompile(`^[a-z0-9][a-z0-9._/-]{0,39}$`)

// checkID normalises the id of the i-th entry of section and checks that it
// is a usable command-line code not already defined in this file.
func (p *parser) checkID(section string, i int, id string) (string, error) {
	n := norm(id)
	if n == "" {
		return "", p.errAt(section, i, "", "id", errors.New("missing; give a short lowercase code"))
	}
	if !idRe.MatchString(n) || (section == "liquid" && strings.Contains(n, ":")) {
		return "", p.errAt(section, i, "", "id", fmt.Errorf("%q: use up to 40 letters, digits and . _ / - (no spaces)", id))
	}
	if p.seen[section] == nil {
		p.seen[section] = map[string]bool{}
	}
	if p.seen[section][n] {
		return "", p.errAt(section, i, n, "id", errors.New("defined twice in this file"))
	}
	p.seen[section][n] = true
	return n, nil
}

// maxAliases bounds the aliases of one entry.
const maxAliases = 8

// aliases checks the other IDs an entry may be found by: each a usable
// code, not the entry's own ID and not given twice in this file. Whether an
// alias is another entry's ID is checked once the section is read
// (aliasClash).
func (p *parser) aliases(section string, i int, id string, list []string) ([]string, error) {
	if len(list) > maxAliases {
		return nil, p.errAt(section, i, id, "aliases", fmt.Errorf("%d aliases; give at most %d", len(list), maxAliases))
	}
	var out []string
	for _, a := range list {
		n := norm(a)
		switch {
		case !idRe.MatchString(n):
			return nil, p.errAt(section, i, id, "aliases", fmt.Errorf("%q: use up to 40 letters, digits and . _ / - (no spaces)", a))
		case n == id:
			return nil, p.errAt(section, i, id, "aliases", fmt.Errorf("%q is the entry's own id", a))
		case p.seen["alias:"+section][n]:
			return nil, p.errAt(section, i, id, "aliases", fmt.Errorf("%q is an alias of another %s in this file", a, section))
		}
		if p.seen["alias:"+section] == nil {
			p.seen["alias:"+section] = map[string]bool{}
		}
		p.seen["alias:"+section][n] = true
		out = append(out, n)
	}
	return out, nil
}

// aliasClash reports an alias of one entry that is the ID of another entry
// of the same section in this file.
func aliasClash[T any](p *parser, section string, items []T, id func(T) string, aliases func(T) []string) error {
	for i, it := range items {
		for _, a := range aliases(it) {
			if p.seen[section][a] {
				return p.errAt(section, i, id(it), "aliases", fmt.Errorf("%q is the id of another %s in this file", a, section))
			}
		}
	}
	return nil
}

// needSource reports an entry without a source.
func (p *parser) needSource(section string, i int, id, s string) error {
	if strings.TrimSpace(s) == "" {
		return p.errAt(section, i, id, "source", errors.New("missing; say where the values come from (e.g. the product data sheet)"))
	}
	return nil
}

var typeMsgRe = regexp.MustCompile(`TOML value has type (\w+); destination has type (\w+)`)

// friendlyType rewrites the decoder's type-mismatch message in the words of
// the file ("expected a number, found text").
func friendlyType(msg string) string {
	m := typeMsgRe.FindStringSubmatch(msg)
	if m == nil {
		return msg
	}
	word := func(t string) string {
		switch {
		case strings.HasPrefix(t, "float"), strings.HasPrefix(t, "int"), strings.HasPrefix(t, "uint"):
			return "a number"
		case t == "string":
			return "text in quotes"
		case t == "bool", t == "boolean":
			return "true or false"
		case strings.HasPrefix(t, "slice"), strings.HasPrefix(t, "array"), strings.HasPrefix(t, "[]"):
			return "a list [ … ]"
		case strings.HasPrefix(t, "map"), t == "struct", strings.HasPrefix(t, "table"):
			return "a table"
		}
		return t
	}
	return "expected " + word(m[2]) + ", found " + word(m[1])
}

// tomlMessage is the TOML library's message without its own "toml: line N"
// prefix (the ParseError adds the line).
func tomlMessage(te toml.ParseError) string {
	m := te.Message
	if m == "" {
		m = te.Error()
	}
	return m
}

func orDefault(s, d string) string {
	if strings.TrimSpace(s) == "" {
		return d
	}
	return s
}

// rangeCheck reports v outside [lo, hi] (or not finite) as an error that
// states the accepted range.
func rangeCheck(v, lo, hi float64, unit string) error {
	u := ""
	if unit != "" {
		u = " " + unit
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("not a finite number; accepted %s to %s%s", num(lo), num(hi), u)
	}
	if v < lo || v > hi {
		return fmt.Errorf("%s%s is out of range; accepted %s to %s%s", num(v), u, num(lo), num(hi), u)
	}
	return nil
}

// hazards parses a list of hazard names (the key key of an entry).
func (p *parser) hazards(section string, i int, id, key string, names []string) (Hazards, error) {
	var hz Hazards
	for _, n := range names {
		h, ok := ParseHazard(n)
		if !ok {
			all := make([]string, 0, len(hazardNames))
			for _, h := range AllHazards() {
				all = append(all, h.String())
			}
			return 0, p.errAt(section, i, id, key, fmt.Errorf("unknown hazard %q; known: %s", n, strings.Join(all, ", ")))
		}
		hz = hz.With(h)
	}
	return hz, nil
}
