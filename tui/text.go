package tui

import (
	"math"
	"strings"
	"unicode/utf8"

	"github.com/charmbracelet/x/ansi"
)

// The text helpers of every pane: one way to measure, clip, wrap, pad and fit
// text, plain or styled with SGR escapes.

// cellWidth is the width of a line in cells, plain or styled. Lines on this
// screen are made of single-width characters and SGR escapes, for which
// counting runes outside the escapes is exact and much cheaper than
// grapheme segmentation; anything else (wide or combining characters, other
// escapes) goes to ansi.StringWidth.
func cellWidth(s string) int {
	n := 0
	for i := 0; i < len(s); {
		c := s[i]
		switch {
		case c == 0x1b:
			if i+1 >= len(s) || s[i+1] != '[' {
				return ansi.StringWidth(s)
			}
			j := i + 2
			for j < len(s) && (s[j] < 0x40 || s[j] > 0x7e) {
				j++
			}
			i = j + 1
		case c < 0x20 || c == 0x7f:
			return ansi.StringWidth(s)
		case c < 0x80:
			n++
			i++
		default:
			r, size := utf8.DecodeRuneInString(s[i:])
			if narrowRune(r) {
				n++
				i += size
				continue
			}
			return ansi.StringWidth(s)
		}
	}
	return n
}

// narrowRune reports runes that take one cell and no grapheme work: Latin,
// punctuation, arrows, box drawing, braille and geometric shapes.
func narrowRune(r rune) bool {
	return r < 0x300 || (r >= 0x2000 && r < 0x2e80 && !(r >= 0x200b && r <= 0x200f) && !(r >= 0x20d0 && r <= 0x20ff))
}

// clip cuts a line to w cells, marking the cut with an ellipsis.
func clip(s string, w int) string {
	if w <= 0 {
		return ""
	}
	if cellWidth(s) <= w {
		return s
	}
	plain := true
	for _, r := range s {
		if r < 0x20 || !narrowRune(r) {
			plain = false
			break
		}
	}
	if plain {
		r := []rune(s)
		return string(r[:w-1]) + "…"
	}
	return ansi.Truncate(s, w, "…")
}

// padRight pads s with spaces to w cells.
func padRight(s string, w int) string {
	if n := w - cellWidth(s); n > 0 {
		return s + strings.Repeat(" ", n)
	}
	return s
}

// wrapText wraps plain text to w cells, at most n lines (the last one cut
// with "…" when more would follow).
func wrapText(s string, w, n int) []string {
	if w <= 0 || n <= 0 {
		return nil
	}
	lines := strings.Split(ansi.Wordwrap(s, w, " "), "\n")
	var out []string
	for _, l := range lines {
		out = append(out, strings.Split(ansi.Hardwrap(l, w, true), "\n")...)
	}
	if len(out) > n {
		out = out[:n]
		out[n-1] = ansi.Truncate(out[n-1], w-1, "") + "…"
	}
	return out
}

// fitBlock pads or cuts lines (plain or styled) to exactly w cells and h
// lines.
func fitBlock(lines []string, w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	out := make([]string, h)
	for i := range out {
		s := ""
		if i < len(lines) {
			s = lines[i]
		}
		sw := cellWidth(s)
		if sw > w {
			s = ansi.Truncate(s, w, "…")
			sw = cellWidth(s)
		}
		if sw < w {
			s += strings.Repeat(" ", w-sw)
		}
		out[i] = s
	}
	return strings.Join(out, "\n")
}

// finite maps NaN and ±Inf to 0 so that nothing non-finite reaches a frame.
func finite(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

// oneLineText makes text pasted or loaded from outside fit one line of a
// field: line breaks, tabs and other control characters become spaces.
func oneLineText(s string) string {
	return strings.Map(func(r rune) rune {
		if r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) {
			return ' '
		}
		return r
	}, s)
}

// oneCellText shows text as typed in an input cell, where each rune keeps
// its cell (the cursor counts runes): a control or hidden character that
// came from a file is shown as U+FFFD instead of acting on the terminal.
func oneCellText(s string) string {
	return strings.Map(func(r rune) rune {
		if r < 0x20 || r == 0x7f || r >= 0x80 && r < 0xa0 || r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069 ||
			r == 0x2028 || r == 0x2029 || r == 0x200e || r == 0x200f || r == 0xfeff {
			return '\uFFFD'
		}
		return r
	}, s)
}
