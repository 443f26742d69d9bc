package main

import (
	"bytes"
	encsv "encoding/csv"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/model/record"
	"drawdown/presets"
	"drawdown/tui"
)

// sgrOnly matches the escape sequences the screen's own styles write (SGR,
// "ESC [ … m"); any other escape in a frame would have come from input.
var sgrOnly = regexp.MustCompile(`\x1b\[[0-9;:]*m`)

// liveLink is a Markdown link or image whose brackets are not escaped.
var liveLink = regexp.MustCompile(`(^|[^\\])\]\(`)

// checkInert fails when out holds a control character other than a line
// break (and, for a frame, the screen's own SGR sequences).
func checkInert(t *testing.T, what, out string, frame bool) {
	t.Helper()
	if frame {
		out = sgrOnly.ReplaceAllString(out, "")
	}
	for i, r := range out {
		if r == '\n' {
			continue
		}
		if r < 0x20 || r == 0x7f || r >= 0x80 && r < 0xa0 || r >= 0x202a && r <= 0x202e || r >= 0x2066 && r <= 0x2069 {
			t.Fatalf("%s: control character %U at byte %d: %q", what, r, i, out[max(i-20, 0):min(i+20, len(out))])
		}
	}
}

// injectedJob puts text from outside into every free-text place of a job.
func injectedJob(text string) model.Job {
	j := model.DemoJob()
	j.Name, j.Site, j.Location, j.Notes = text, text, text, text
	j.Source, j.Receiver = text, text
	at := time.Date(2026, time.March, 14, 8, 0, 0, 0, time.UTC)
	if len(j.Checklist.Steps) > 1 {
		_ = j.Checklist.Mark(j.Checklist.Steps[0].ID, model.StateSkipped, "x"+text, text, at)
		_ = j.Checklist.SetNote(j.Checklist.Steps[1].ID, text)
	}
	j.Readings = append(j.Readings, model.Reading{At: at, Level: 0.3, Note: text},
		model.Reading{At: at.Add(10 * time.Minute), Level: 0.29, Note: "=" + text})
	j.AddLog(at, text)
	return j
}

// FuzzInjection: no output path emits a control character that came from
// input — the record, the readings CSV (which also keeps formulas inert),
// the screen's frames and the error lines of the command line. Seeds are
// the attacks seen: colour, conceal, window title and clipboard (OSC 52)
// sequences, C1 controls, bidirectional overrides, markup and formulas.
//
// It builds a screen for every input (about 500 inputs a second):
// ci-fuzz-execs: 5000
func FuzzInjection(f *testing.F) {
	for _, s := range []string{
		"\x1b[31mred\x1b[0m", "note\x1b[8m", "\x1b]0;title\x07", "\x1b]52;c;Y2xpcGJvYXJk\x07",
		"\x9b31m", "a\u202eevil", "<script>alert(1)</script>", "![x](http://example.invalid/i.png)",
		"[x](javascript:alert(1))", "=HYPERLINK(\"http://example.invalid\")", "+1", "@SUM(A1)", "\t=1",
		"line\nbreak\r\nand\rcr", "\x00\x01\x7f", string([]byte{0xff, 0xfe}), "\"-", "-1+1",
	} {
		f.Add(s)
	}
	cat := presets.Builtin()
	f.Fuzz(func(t *testing.T, text string) {
		j := injectedJob(text)
		p := model.Compute(j, cat)
		in := record.Input{Job: j, Plan: p, Now: time.Date(2026, time.March, 14, 9, 0, 0, 0, time.UTC)}
		var md, csv bytes.Buffer
		if err := record.Write(&md, in); err != nil {
			t.Fatal(err)
		}
		checkInert(t, "record", md.String(), false)
		if strings.Contains(md.String(), "<script") || liveLink.MatchString(md.String()) {
			t.Fatalf("record carries live markup:\n%s", md.String())
		}
		if err := record.WriteCSV(&csv, in); err != nil {
			t.Fatal(err)
		}
		checkInert(t, "csv", csv.String(), false)
		// Each cell as a spreadsheet reads it (quotes undone, so a note
		// `"-` is the text "-, not a formula), checked for a formula start.
		cr := encsv.NewReader(strings.NewReader(csv.String()))
		cr.FieldsPerRecord = -1
		rows, err := cr.ReadAll()
		if err != nil {
			t.Fatalf("CSV does not read back: %v", err)
		}
		for _, row := range rows {
			for _, cell := range row {
				if cell != "" && strings.ContainsRune("=+@", rune(cell[0])) || strings.HasPrefix(cell, "-") && !isNumber(cell) {
					t.Fatalf("CSV cell would run as a formula: %q in %q", cell, row)
				}
			}
		}
		m := tui.New(tui.Options{Start: tui.Start{Job: j}, NoSave: true, Cat: cat})
		for _, msg := range []tea.Msg{tea.WindowSizeMsg{Width: 120, Height: 40}, tea.KeyPressMsg{Code: '9', Text: "9"},
			tea.KeyPressMsg{Code: '8', Text: "8"}, tea.PasteMsg{Content: text}} {
			next, _ := m.Update(msg)
			m = next.(*tui.Model)
			v := m.View()
			checkInert(t, "frame", v.Content, true)
			checkInert(t, "window title", v.WindowTitle, false)
		}
		var out, errb bytes.Buffer
		run([]string{"calc", "--liquid", text, "--hose-id", text}, &out, &errb)
		checkInert(t, "calc error line", errb.String(), false)
		checkInert(t, "calc output", present.CleanText(out.String()), false)
	})
}

// isNumber reports whether a CSV cell is a plain number (a negative figure
// the tool wrote, not text from outside).
func isNumber(cell string) bool {
	_, err := strconv.ParseFloat(cell, 64)
	return err == nil
}
