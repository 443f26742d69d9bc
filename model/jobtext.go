package model

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// InputError is a person's entry the job refuses: Field is the label a form
// shows ("Air temperature", "Valve ID"), Detail says what is wrong and what
// is accepted, in the job's units. Its text is one line, never an internal
// ID.
type InputError struct {
	Field  string
	Detail string
}

func (e *InputError) Error() string { return e.Field + ": " + e.Detail }

// Length limits of free text, in characters: a one-line entry (a name, a
// valve ID, a weather note) and the job's notes.
const (
	maxLine  = 200
	maxNotes = 8000
)

// cleanLine checks one line of free text for field label: surrounding space
// is trimmed; control characters (a terminal escape, a tab, a line break)
// and more than max characters are refused, so that text from a person can
// never act on a terminal or break a record's layout.
func cleanLine(label, s string, max int) (string, error) {
	return cleanText(label, s, max, false)
}

// cleanText is cleanLine that, with lines true, also accepts line breaks
// (normalised to "\n").
func cleanText(label, s string, max int, lines bool) (string, error) {
	if !utf8.ValidString(s) {
		return "", &InputError{Field: label, Detail: "the text is not valid UTF-8"}
	}
	if lines {
		s = strings.ReplaceAll(strings.ReplaceAll(s, "\r\n", "\n"), "\r", "\n")
	}
	s = strings.TrimSpace(s)
	for _, r := range s {
		if r == '\n' && lines {
			continue
		}
		if unicode.IsControl(r) || r == '\u2028' || r == '\u2029' || (r >= 0x202a && r <= 0x202e) || (r >= 0x2066 && r <= 0x2069) {
			return "", &InputError{Field: label, Detail: "control characters (" + strconv.QuoteRune(r) + ") are not accepted"}
		}
	}
	if n := utf8.RuneCountInString(s); n > max {
		return "", &InputError{Field: label, Detail: "too long (" + strconv.Itoa(n) + " characters; at most " + strconv.Itoa(max) + ")"}
	}
	return s, nil
}

// quote formats a plan figure for a step's text: Format's number and unit,
// with trailing zeros of the decimals dropped ("12 m", "9.43 m", "48 °C",
// "13.6 L"), since a step quotes a figure in passing rather than in a
// column.
func quote(d Dim, si float64, sys System) string {
	num, unit := FormatParts(d, si, sys)
	if strings.Contains(num, ".") {
		num = strings.TrimRight(strings.TrimRight(num, "0"), ".")
	}
	if unit == "" {
		return num
	}
	return num + " " + unit
}
