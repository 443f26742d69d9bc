package presets

import (
	"regexp"
	"strconv"
	"strings"
)

// errAt builds a ParseError for key in the idx-th (0-based) [[section]]
// entry. field is the name shown to the user.
func (p *parser) errAt(section string, idx int, id, key string, err error) *ParseError {
	field := section + " " + strconv.Itoa(idx+1)
	if id != "" {
		field = section + " " + strconv.Quote(id)
	}
	if key != "" {
		field += " " + key
	}
	return &ParseError{File: p.file, Line: p.locate(section, idx, key), Field: field, Err: err}
}

var headerRe = regexp.MustCompile(`^\s*\[\[?\s*([A-Za-z0-9_.\-"' ]+?)\s*\]\]?`)

// locate finds the line of key inside the idx-th [[section]] entry (its
// sub-tables included): the line of the key's last part, else of its first
// part (an inline table such as sizes = { … }), else the entry's header
// line; 0 when the entry is not found (for example when the file uses inline
// tables). idx < 0 searches every entry of the section.
func (p *parser) locate(section string, idx int, key string) int {
	parts := strings.Split(key, ".")
	cands := []string{parts[len(parts)-1]}
	if len(parts) > 1 {
		cands = append(cands, parts[0])
	}
	for _, c := range cands {
		if n, _ := p.scan(section, idx, c); n > 0 {
			return n
		}
	}
	_, header := p.scan(section, idx, "")
	return header
}

// locateTop finds a top-level key or a table header named name.
func (p *parser) locateTop(name string) int {
	top := true // top-level keys come before the first table header
	for n, text := range p.lines {
		t := strings.TrimSpace(text)
		if strings.HasPrefix(t, "[") {
			if m := headerRe.FindStringSubmatch(text); m != nil {
				if strings.ReplaceAll(m[1], " ", "") == name {
					return n + 1
				}
				top = false
				continue
			}
		}
		if k, _, ok := strings.Cut(t, "="); top && ok && strings.Trim(strings.TrimSpace(k), `"'`) == name {
			return n + 1
		}
	}
	return 0
}

// scan returns the line of "leaf = …" inside the idx-th [[section]] entry
// (0 if absent) and the entry's header line.
func (p *parser) scan(section string, idx int, leaf string) (line, header int) {
	count := -1
	inside := false
	for n, text := range p.lines {
		t := strings.TrimSpace(text)
		if strings.HasPrefix(t, "[") {
			if m := headerRe.FindStringSubmatch(text); m != nil {
				name := strings.ReplaceAll(m[1], " ", "")
				switch {
				case strings.HasPrefix(t, "[[") && name == section:
					count++
					inside = idx < 0 || count == idx
					if count == idx {
						header = n + 1
					}
				case strings.HasPrefix(name, section+"."):
					// a sub-table of the current entry: stay inside
				default:
					inside = false
				}
				continue
			}
		}
		if !inside || leaf == "" {
			continue
		}
		if k, _, ok := strings.Cut(t, "="); ok && strings.Trim(strings.TrimSpace(k), `"'`) == leaf {
			return n + 1, header
		}
	}
	return 0, header
}
