package tui

import (
	"strconv"
	"strings"
	"unicode"

	"drawdown/model"
	"drawdown/model/present"
)

// The Checklist pane's text: the selected step in full, and the wrapping of
// its parts, each only as far as the room it has.

// detailLines is the selected step in full, in at most maxH lines: section,
// text, state, note and the caution in a box with the rule it comes from.
// When room is short the caution and the state are kept first, then the
// text, the note and the heading.
func (v *ChecklistView) detailLines(s model.Step, w, maxH int) []drawLine {
	if w < 8 || maxH <= 0 {
		return nil
	}
	plain := func(ls []string, cls drawClass) []drawLine {
		out := make([]drawLine, len(ls))
		for i, l := range ls {
			out[i] = drawPlain(l, cls)
		}
		return out
	}
	// No part takes more than maxH lines: each is wrapped only that far
	// (ckWrapN), whatever the length of a note or a reason.
	head := plain([]string{s.Section.Title() + " · step " + strconv.Itoa(v.cur+1) + " of " + strconv.Itoa(len(v.cl.Steps))}, clsMuted)
	text := plain(ckWrapN(present.Clean(s.Text), w, maxH), clsText)
	sl, cls := ckStateLine(s)
	state := plain(ckWrapN(sl, w, maxH), cls)
	var note []drawLine
	if s.Note != "" {
		note = plain(ckWrapN("note: "+wrapHead(present.Clean(s.Note), w, maxH), w, maxH), clsText)
	}
	var box []drawLine
	if s.Caution != "" {
		inner := w - 4
		body := ckWrapN(s.Caution, inner, maxH)
		if s.Rule != "" {
			body = append(body, ckWrapN("("+s.Rule+")", inner, maxH)...)
		}
		// Keep the box whole: cut its body, never its frame.
		body = body[:min(len(body), max(maxH-2, 1))]
		t := "┌─ ! Caution "
		t += strings.Repeat("─", max(w-1-cellWidth(t), 0)) + "┐"
		box = append(box, drawPlain(t, clsBox))
		for _, l := range body {
			pad := strings.Repeat(" ", max(inner-cellWidth(l), 0))
			box = append(box, drawLine{{text: "│ ", cls: clsBox}, {text: l + pad}, {text: " │", cls: clsBox}})
		}
		box = append(box, drawPlain("└"+strings.Repeat("─", max(w-2, 0))+"┘", clsBox))
	}
	room := maxH - len(box)
	state = state[:min(len(state), max(room, 0))]
	room -= len(state)
	text = text[:min(len(text), max(room, 0))]
	room -= len(text)
	note = note[:min(len(note), max(room, 0))]
	room -= len(note)
	head = head[:min(len(head), max(room, 0))]
	out := append(head, text...)
	out = append(out, state...)
	out = append(out, note...)
	out = append(out, box...)
	if len(out) > maxH {
		out = out[:maxH]
	}
	return out
}

// ckWrap breaks plain text into lines of at most w cells at spaces.
func ckWrap(s string, w int) []string {
	if w <= 0 {
		return nil
	}
	var out []string
	for _, para := range strings.Split(s, "\n") {
		line := ""
		for _, word := range strings.Fields(para) {
			for cellWidth(word) > w { // a word longer than the line
				if line != "" {
					out = append(out, line)
					line = ""
				}
				r := []rune(word)
				cut := min(w, len(r))
				out = append(out, string(r[:cut]))
				word = string(r[cut:])
			}
			switch {
			case word == "":
			case line == "":
				line = word
			case cellWidth(line)+1+cellWidth(word) <= w:
				line += " " + word
			default:
				out = append(out, line)
				line = word
			}
		}
		out = append(out, line)
	}
	return out
}

// ckWrapN is the first n lines of ckWrap(s, w), made from no more of s than
// they need (wrapHead), so a 100 KB note costs what its first lines cost.
func ckWrapN(s string, w, n int) []string {
	if w <= 0 || n <= 0 {
		return nil
	}
	out := ckWrap(wrapHead(s, w, n), w)
	return out[:min(len(out), n)]
}

// wrapHead is the start of s that ckWrap needs for its first n lines of w
// cells: up to the end of the word holding the (n·w+1)-th rune that is not
// a space. Those lines hold at most n·w such runes, and the word that starts
// the line after them is then whole, so every break in them falls as it
// would in all of s.
func wrapHead(s string, w, n int) string {
	budget := n*w + 1
	for i, r := range s {
		if unicode.IsSpace(r) {
			continue
		}
		if budget--; budget == 0 {
			if j := strings.IndexFunc(s[i:], unicode.IsSpace); j >= 0 {
				return s[:i+j]
			}
			return s
		}
	}
	return s
}
