package tui

import (
	"strconv"
	"strings"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// logEntries makes n log lines a minute apart, every seventh one long
// enough to wrap.
func logEntries(n int) []model.LogEntry {
	t0 := time.Date(2026, 5, 4, 8, 0, 0, 0, time.UTC)
	out := make([]model.LogEntry, n)
	for i := range out {
		text := "level reading 0." + strconv.Itoa(100+i%800) + " m"
		if i%7 == 0 {
			text = "checklist: step " + strconv.Itoa(i) + " done (" + strings.Repeat("a reason that runs on ", 1+i%5) + ")"
		}
		out[i] = model.LogEntry{At: t0.Add(time.Duration(i) * time.Minute), Text: text}
	}
	return out
}

// allLogLines is the log wrapped up to its entry end (exclusive), oldest
// first: what the pane drew before it wrapped only what it shows.
func allLogLines(l LogPane, end int) []string {
	var lines []string
	for i := range l.entries[:end] {
		lines = append(lines, l.entryLines(&logWraps{lines: map[int]logWrap{}}, i)...)
	}
	return lines
}

// TestLogVisibleLines: the lines on screen are the last ones of the log
// wrapped whole up to the newest entry not scrolled away, at every scroll
// position and after a width change.
func TestLogVisibleLines(t *testing.T) {
	l := NewLogPane(NewStyles(true), DefaultKeyMap(), time.UTC)
	l.SetEntries(logEntries(60))
	for _, w := range []int{80, 45} {
		l.SetSize(w, 20)
		for scroll := 0; scroll < len(l.entries); scroll += 3 {
			l.scroll = scroll
			got := l.visibleLines(12)
			all := allLogLines(l, len(l.entries)-scroll)
			want := all[max(len(all)-12, 0):]
			if strings.Join(got, "\n") != strings.Join(want, "\n") {
				t.Fatalf("width %d, scroll %d:\n%s\nwant\n%s", w, scroll, strings.Join(got, "\n"), strings.Join(want, "\n"))
			}
		}
	}
	// A new entry shows at the bottom; a replaced log is wrapped afresh.
	l.scroll = 0
	l.SetEntries(append(l.entries, model.LogEntry{At: l.entries[0].At.Add(time.Hour * 24), Text: "job closed out"}))
	if got := l.visibleLines(3); !strings.Contains(got[len(got)-1], "job closed out") {
		t.Errorf("newest entry not at the bottom: %q", got)
	}
	other := logEntries(60)
	other[len(other)-1].Text = "another job"
	l.SetEntries(other)
	if got := l.visibleLines(3); !strings.Contains(got[len(got)-1], "another job") {
		t.Errorf("a replaced log shows the old lines: %q", got)
	}
}

// BenchmarkLogView is the Log pane drawn with a log of 10,000 lines, as
// each frame draws it: the cost is a screenful's, not the log's.
func BenchmarkLogView(b *testing.B) {
	for _, n := range []int{100, 10000} {
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			l := NewLogPane(NewStyles(true), DefaultKeyMap(), time.UTC)
			l.SetSize(120, 18)
			l.SetEntries(logEntries(n))
			var sink int
			keys := []tea.KeyPressMsg{{Code: tea.KeyUp}, {Code: tea.KeyDown}}
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				l, _ = l.Update(keys[i%2])
				sink += len(l.View())
				i++
			}
			if sink == 0 {
				b.Fatal("empty view")
			}
		})
	}
}
