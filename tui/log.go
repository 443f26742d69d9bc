package tui

import (
	"strings"
	"time"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// LogPane lists the job's log, newest at the bottom, with the time of each
// line. Up and down scroll it.
type LogPane struct {
	entries []model.LogEntry
	scroll  int // lines scrolled up from the bottom
	w, h    int
	styles  Styles
	keys    KeyMap
	loc     *time.Location
}

// NewLogPane returns an empty Log pane. loc is the zone times are shown in.
func NewLogPane(st Styles, km KeyMap, loc *time.Location) LogPane {
	if loc == nil {
		loc = time.Local
	}
	return LogPane{styles: st, keys: km, loc: loc}
}

// SetSize sets the pane's size in cells.
func (l *LogPane) SetSize(w, h int) { l.w, l.h = max(w, 0), max(h, 0) }

// SetStyles replaces the styles.
func (l *LogPane) SetStyles(st Styles) { l.styles = st }

// SetEntries gives the pane the job's log.
func (l *LogPane) SetEntries(e []model.LogEntry) {
	if len(e) != len(l.entries) {
		l.scroll = 0
	}
	l.entries = e
}

// Update scrolls with up/down.
func (l LogPane) Update(msg tea.Msg) (LogPane, tea.Cmd) {
	if km, ok := msg.(tea.KeyPressMsg); ok {
		switch {
		case key.Matches(km, l.keys.Up):
			if l.scroll < len(l.entries)-1 {
				l.scroll++
			}
		case key.Matches(km, l.keys.Down):
			if l.scroll > 0 {
				l.scroll--
			}
		}
	}
	return l, nil
}

// View renders exactly w×h cells.
func (l LogPane) View() string {
	st := l.styles
	out := []string{st.fast.PaneTitle.Render("Log") + st.fast.Muted.Render("  the job's record, newest last; ↑/↓ scroll")}
	if len(l.entries) == 0 {
		out = append(out, st.fast.Muted.Render("Nothing logged yet."))
		return fitBlock(out, l.w, l.h)
	}
	var lines []string
	for _, e := range l.entries {
		stamp := e.At.In(l.loc).Format("01-02 15:04")
		text := strings.ReplaceAll(e.Text, "\n", " ")
		wrapped := wrapText(text, max(l.w-len(stamp)-2, 10), 4)
		for i, w := range wrapped {
			if i == 0 {
				lines = append(lines, st.fast.Muted.Render(stamp)+"  "+st.fast.Value.Render(w))
			} else {
				lines = append(lines, strings.Repeat(" ", len(stamp)+2)+st.fast.Value.Render(w))
			}
		}
	}
	room := max(l.h-1, 0)
	end := max(len(lines)-l.scroll, 0)
	start := max(end-room, 0)
	out = append(out, lines[start:end]...)
	return fitBlock(out, l.w, l.h)
}

// ShortHelp lists the Log pane's keys.
func (l LogPane) ShortHelp() []key.Binding { return []key.Binding{l.keys.Up, l.keys.Down} }
