package present

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// Text from a file or a person is data. These functions are the one
// sanitiser every reader uses before it prints such text: the screen, the
// command line's output and error lines, the catalogue listing, the record
// and the CSV. None of them lets a byte of the input act on a terminal, a
// Markdown viewer or a spreadsheet.

// Clean makes outside text safe for one line of a terminal or a text file:
// line breaks and tabs become spaces; every other control character (C0,
// DEL, C1 — ESC among them, so no escape sequence survives), an invalid
// UTF-8 byte, and the characters that reorder or hide text (the Unicode
// bidirectional controls, the line and paragraph separators) are shown as
// visible escapes such as \x1b or \u202e.
func Clean(s string) string {
	if clean(s, false) {
		return s
	}
	return escape(s, false)
}

// CleanText is Clean for text of several lines: line breaks are kept (a CR LF or
// a lone CR becomes a line break), tabs become spaces.
func CleanText(s string) string {
	s = strings.ReplaceAll(s, "\r\n", "\n")
	s = strings.ReplaceAll(s, "\r", "\n")
	if clean(s, true) {
		return s
	}
	return escape(s, true)
}

// clean reports whether s needs no change.
func clean(s string, lines bool) bool {
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '\n' && lines:
		case c < 0x20 || c == 0x7f:
			return false
		case c >= 0x80:
			r, n := utf8.DecodeRuneInString(s[i:])
			if r == utf8.RuneError && n == 1 || hidden(r) {
				return false
			}
			i += n - 1
		}
	}
	return true
}

func escape(s string, lines bool) string {
	var b strings.Builder
	b.Grow(len(s) + 8)
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			b.WriteString(`\x` + strconv.FormatUint(uint64(s[i]), 16))
		case r == '\n' && lines:
			b.WriteByte('\n')
		case r == '\n' || r == '\r' || r == '\t':
			b.WriteByte(' ')
		case r < 0x20 || r == 0x7f:
			b.WriteString(`\x` + hex2(uint64(r)))
		case hidden(r):
			b.WriteString(`\u` + hex4(uint64(r)))
		default:
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}

// hidden reports the characters a terminal or viewer would act on rather
// than show: C1 controls, the bidirectional embeddings, overrides and
// isolates, the line and paragraph separators, and the byte-order mark
// inside text.
func hidden(r rune) bool {
	return r >= 0x80 && r < 0xa0 || r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069 ||
		r == 0x2028 || r == 0x2029 || r == 0x200e || r == 0x200f || r == 0xfeff
}

func hex2(v uint64) string {
	s := strconv.FormatUint(v, 16)
	if len(s) < 2 {
		s = "0" + s
	}
	return s
}

func hex4(v uint64) string {
	s := strconv.FormatUint(v, 16)
	for len(s) < 4 {
		s = "0" + s
	}
	return s
}

// Markdown makes outside text safe as a paragraph or list item of a
// Markdown document (the job record): Clean, then what would start markup —
// HTML tags and entities, links and images, emphasis and code, and at the
// start of the text a heading, list, quote or rule marker — escaped, so a
// viewer shows it as typed: "<script>", "![x](http://…)" and
// "[x](javascript:…)" read as text.
func Markdown(s string) string {
	out := MarkdownCell(s)
	if out == "" {
		return out
	}
	switch out[0] {
	case '#', '-', '+', '=', '>', '~':
		return `\` + out
	}
	// A line that starts with a number and a point reads as a list item.
	if j := strings.IndexFunc(out, func(r rune) bool { return r < '0' || r > '9' }); j > 0 && (out[j] == '.' || out[j] == ')') {
		return out[:j] + `\` + out[j:]
	}
	return out
}

// MarkdownCell is Markdown for a table cell, where a leading "-" or "+" is
// only text (a figure, a date) but a "|" would end the cell.
func MarkdownCell(s string) string {
	s = Clean(s)
	var b strings.Builder
	b.Grow(len(s) + 8)
	for i, r := range s {
		switch r {
		case '<':
			b.WriteString("&lt;")
			continue
		case '>':
			b.WriteString("&gt;")
			continue
		case '&':
			b.WriteString("&amp;")
			continue
		case '\\', '`', '*', '_', '[', ']', '|':
			b.WriteByte('\\')
		case '!':
			if i+1 < len(s) && s[i+1] == '[' {
				b.WriteByte('\\')
			}
		}
		b.WriteRune(r)
	}
	return b.String()
}

// CSVCell makes outside text safe as a spreadsheet cell: Clean, and a cell
// that starts with = + - @ or a tab (which a spreadsheet would take for a
// formula) gets a leading apostrophe, the neutraliser spreadsheets
// themselves use (OWASP, "CSV Injection").
func CSVCell(s string) string {
	s = Clean(s)
	if t := strings.TrimLeft(s, " "); t != "" && strings.ContainsRune("=+-@", rune(t[0])) || strings.HasPrefix(s, " ") && t != s && t == "" {
		return "'" + s
	}
	return s
}
