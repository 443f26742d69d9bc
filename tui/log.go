package tui

import (
	"strconv"
	"strings"
	"time"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/model"
	"drawdown/model/present"
)

// LogPane lists the job's log, newest at the bottom, with the time of each
// line, under a summary of the level readings against the plan and the
// latest readings and flow tests. Up and down scroll by an entry; r types a
// level reading (with its time when not now), f a flow test, e chooses a
// reading to correct; w writes the job record.
type LogPane struct {
	entries []model.LogEntry
	entered tea.Msg      // an entry enter made, for the root (takeEntered)
	summary []string     // readings against the plan, worded by the root
	rows    []readingRow // readings and flow tests, oldest first, worded by the root
	scroll  int          // entries scrolled up from the bottom (the newest hidden)
	w, h    int
	styles  Styles
	keys    KeyMap
	loc     *time.Location

	typing  bool
	kind    inputKind
	edit    int // the reading being corrected (its index in the job)
	input   textinput.Model
	errText string
	draft   bool // the input holds a draft put back from the last session

	choosing bool // e: up/down choose the reading to correct
	sel      int  // the chosen row (an index into rows)

	// wrapped holds each entry's lines as last drawn, for the width they
	// were wrapped to; only entries that came on screen are wrapped
	// (visibleLines), so a log of 10,000 lines costs what a screenful does.
	// A pointer, so that the copies View works on share it.
	wrapped *logWraps
}

// logWraps caches the wrapped lines of log entries by index, with the text,
// time and width they were made for.
type logWraps struct {
	w     int
	loc   *time.Location
	lines map[int]logWrap
}

type logWrap struct {
	at    time.Time
	text  string
	lines []string
}

// inputKind is what the Log pane's input is typing.
type inputKind int

const (
	inputReading inputKind = iota // a new level reading
	inputFlow                     // a flow test
	inputEdit                     // a correction of a reading
)

// NewLogPane returns an empty Log pane. loc is the zone times are shown in.
func NewLogPane(st Styles, km KeyMap, loc *time.Location) LogPane {
	if loc == nil {
		loc = time.Local
	}
	ti := textinput.New()
	ti.Prompt = "› "
	ti.CharLimit = 40
	ts := ti.Styles()
	ts.Cursor.Blink = false // a blinking cursor streams bytes over SSH
	ti.SetStyles(ts)
	ti.SetVirtualCursor(false) // the root places the terminal's own cursor
	return LogPane{styles: st, keys: km, loc: loc, input: ti, wrapped: &logWraps{}}
}

// SetSize sets the pane's size in cells.
func (l *LogPane) SetSize(w, h int) {
	l.w, l.h = max(w, 0), max(h, 0)
	l.input.SetWidth(max(l.w-4, 1))
}

// SetStyles replaces the styles (the wrapped lines carry them).
func (l *LogPane) SetStyles(st Styles) { l.styles = st; l.wrapped = &logWraps{} }

// SetEntries gives the pane the job's log.
func (l *LogPane) SetEntries(e []model.LogEntry) {
	if len(e) != len(l.entries) {
		l.scroll = 0
	}
	l.entries = e
}

// SetSummary gives the pane the readings summary lines.
func (l *LogPane) SetSummary(s []string) { l.summary = s }

// SetReadings gives the pane the readings and flow tests to list.
func (l *LogPane) SetReadings(rows []readingRow) {
	l.rows = rows
	if l.sel >= len(rows) {
		l.sel = len(rows) - 1
	}
}

// ReadingError shows why a typed reading was refused and keeps the input
// open so it can be corrected.
func (l *LogPane) ReadingError(msg string) { l.errText = msg }

// takeEntered is the entry enter made in the last key, for the root to
// apply at once; nil when none.
func (l *LogPane) takeEntered() tea.Msg {
	e := l.entered
	l.entered = nil
	return e
}

// ReadingTaken closes the input after the root accepted a reading.
func (l *LogPane) ReadingTaken() {
	l.typing, l.draft, l.choosing, l.kind = false, false, false, inputReading
	l.errText = ""
	l.input.Blur()
	l.input.Reset()
}

// Draft is the reading being typed, when there is one (drafts.go keeps it
// with the job).
func (l *LogPane) Draft() (string, bool) {
	return l.input.Value(), l.typing && l.kind == inputReading && l.input.Value() != ""
}

// RestoreDraft opens the reading input again with text, marked as a draft.
func (l *LogPane) RestoreDraft(text string) bool {
	l.typing, l.errText, l.draft, l.kind = true, "", true, inputReading
	l.input.Reset()
	l.input.SetValue(text)
	l.input.CursorEnd()
	l.input.Focus()
	return true
}

// Typing reports whether keys go into the reading input.
func (l *LogPane) Typing() bool { return l.typing }

// Focus and Blur: the pane's keys work only while it has the focus, which
// the root decides; nothing changes in the pane itself.
func (l *LogPane) Focus() {}

// Blur is Focus's pair.
func (l *LogPane) Blur() {}

// Claims takes the pane's own keys, and every key while typing a reading
// or choosing one to correct.
func (l *LogPane) Claims(msg tea.KeyPressMsg) bool {
	return l.typing || l.choosing || key.Matches(msg, l.ShortHelp()...)
}

// Key handles a key with the pane focused.
func (l *LogPane) Key(msg tea.KeyPressMsg) (tea.Cmd, *FieldEdit) {
	var cmd tea.Cmd
	*l, cmd = l.Update(msg)
	return cmd, nil
}

// Paste puts pasted text into the reading being typed.
func (l *LogPane) Paste(text string) (tea.Cmd, *FieldEdit) {
	if !l.typing {
		return nil, nil
	}
	var cmd tea.Cmd
	l.input, cmd = l.input.Update(tea.PasteMsg{Content: oneLineText(text)})
	return cmd, nil
}

// Click does nothing: the log is read, not chosen from.
func (l *LogPane) Click(int, int) (tea.Cmd, *FieldEdit) { return nil, nil }

// Show gives the pane the job's log.
func (l *LogPane) Show(st *screenState) { l.SetEntries(st.job.Log) }

// Update scrolls with up/down, opens the reading input with r, the flow
// test input with f, the choice of a reading to correct with e, and asks
// for the record with w.
func (l LogPane) Update(msg tea.Msg) (LogPane, tea.Cmd) {
	km, ok := msg.(tea.KeyPressMsg)
	if !ok {
		return l, nil
	}
	if l.typing {
		return l.typingKey(km)
	}
	if l.choosing {
		return l.chooseKey(km), nil
	}
	switch {
	case key.Matches(km, l.keys.AddReading):
		return l, l.open(inputReading, "")
	case key.Matches(km, l.keys.AddFlowTest):
		return l, l.open(inputFlow, "")
	case key.Matches(km, l.keys.CorrectReading):
		if i := l.prevReading(len(l.rows)); i >= 0 {
			l.choosing, l.sel, l.errText = true, i, ""
		} else {
			l.errText = "✗ no reading to correct yet: press r to add one"
		}
	case key.Matches(km, l.keys.WriteRecord):
		return l, func() tea.Msg { return RecordWriteMsg{} }
	case key.Matches(km, l.keys.ScrollUp):
		if l.scroll < len(l.entries)-1 {
			l.scroll++
		}
	case key.Matches(km, l.keys.ScrollDown):
		if l.scroll > 0 {
			l.scroll--
		}
	}
	return l, nil
}

// open starts typing an entry of kind, the input holding text.
func (l *LogPane) open(kind inputKind, text string) tea.Cmd {
	l.typing, l.kind, l.errText, l.draft = true, kind, "", false
	l.input.Reset()
	l.input.Placeholder = map[inputKind]string{
		inputReading: "level, e.g. 0.42 m; @ 14:05 or @ -10 min if not now",
		inputFlow:    "volume/time, e.g. 10L/12s; @ level; ; note",
		inputEdit:    "level @ time, e.g. 0.328 @ 14:05",
	}[kind]
	l.input.SetValue(text)
	l.input.CursorEnd()
	return l.input.Focus()
}

func (l LogPane) typingKey(km tea.KeyPressMsg) (LogPane, tea.Cmd) {
	switch km.String() {
	case "esc":
		l.ReadingTaken()
		return l, nil
	case "enter":
		text := strings.TrimSpace(l.input.Value())
		if text == "" {
			l.errText = map[inputKind]string{
				inputReading: "✗ type the level read on the tank, e.g. 0.42 m or 1 ft 5 in",
				inputFlow:    "✗ type the volume caught over the time, e.g. 10L/12s",
				inputEdit:    "✗ type the level and time, e.g. 0.328 @ 14:05",
			}[l.kind]
			return l, nil
		}
		// The entry goes to the root in the same Update (takeEntered), not
		// in a command: a key typed right after enter (a crew server under
		// load, a fast typist) then finds the input already closed or
		// refused, never closed under it by a late reply.
		switch l.kind {
		case inputFlow:
			l.entered = FlowTestAddMsg{Text: text}
		case inputEdit:
			l.entered = ReadingEditMsg{Index: l.edit, Text: text}
		default:
			l.entered = ReadingAddMsg{Text: text}
		}
		return l, nil
	}
	var cmd tea.Cmd
	l.input, cmd = l.input.Update(km)
	l.errText = ""
	return l, cmd
}

// chooseKey moves the choice of the reading to correct, or opens it.
func (l LogPane) chooseKey(km tea.KeyPressMsg) LogPane {
	switch {
	case km.String() == "esc":
		l.choosing = false
	case key.Matches(km, l.keys.Done):
		if l.sel >= 0 && l.sel < len(l.rows) && l.rows[l.sel].index >= 0 {
			l.choosing, l.edit = false, l.rows[l.sel].index
			l.open(inputEdit, l.rows[l.sel].entry)
		}
	case key.Matches(km, l.keys.ScrollUp):
		if i := l.prevReading(l.sel); i >= 0 {
			l.sel = i
		}
	case key.Matches(km, l.keys.ScrollDown):
		if i := l.nextReading(l.sel); i >= 0 {
			l.sel = i
		}
	}
	return l
}

// prevReading is the last reading row before row i, or −1.
func (l LogPane) prevReading(i int) int {
	for k := min(i, len(l.rows)) - 1; k >= 0; k-- {
		if l.rows[k].index >= 0 {
			return k
		}
	}
	return -1
}

// nextReading is the first reading row after row i, or −1.
func (l LogPane) nextReading(i int) int {
	for k := i + 1; k < len(l.rows); k++ {
		if l.rows[k].index >= 0 {
			return k
		}
	}
	return -1
}

// footLines is the input at the foot of the pane, when open.
func (l LogPane) footLines() []string {
	if !l.typing {
		if l.choosing {
			return []string{l.styles.fast.Label.Render("Correct which reading? ↑/↓ choose, enter correct, esc cancel")}
		}
		var out []string
		for _, w := range wrapText(l.errText, max(l.w, 10), 2) {
			out = append(out, l.styles.fast.Danger.Render(w))
		}
		return out
	}
	st := l.styles
	label := map[inputKind]string{
		inputReading: "Level reading (above the tank floor); @ TIME if not now:",
		inputFlow:    "Flow test: VOLUME/TIME caught at the outlet; @ LEVEL if read; ; NOTE:",
		inputEdit:    "Correct the reading: LEVEL @ TIME (14:05, -10 min, 2026-05-14 14:05):",
	}[l.kind]
	if l.draft {
		label = "(draft) " + label // put back from the last session
	}
	out := []string{st.fast.Label.Render(ansi.Truncate(label, max(l.w, 1), "…")), l.input.View()}
	if l.errText != "" {
		for _, w := range wrapText(l.errText, max(l.w, 10), 3) {
			out = append(out, st.fast.Danger.Render(w))
		}
	}
	return out
}

// readingLines is the list of the latest readings and flow tests, the
// chosen one marked, in at most room lines.
func (l LogPane) readingLines(room int) []string {
	if len(l.rows) == 0 || room < 2 {
		return nil
	}
	st := l.styles
	n := min(len(l.rows), room-1)
	from := len(l.rows) - n
	if l.choosing && l.sel < from {
		from = max(l.sel, 0)
	}
	head := "Readings and flow tests (" + strconv.Itoa(len(l.rows)) + "; e: correct a reading)"
	out := []string{st.fast.Label.Render(head)}
	for i := from; i < min(from+n, len(l.rows)); i++ {
		mark := "  "
		if l.choosing && i == l.sel {
			mark = "› "
		}
		text := ansi.Truncate(mark+l.rows[i].text, max(l.w, 1), "…")
		if l.choosing && i == l.sel {
			out = append(out, st.fast.InputFocused.Render(text))
		} else {
			out = append(out, st.fast.Value.Render(text))
		}
	}
	return out
}

// CursorPos is the terminal cursor in the reading input, relative to the
// pane's top-left corner, or nil when not typing.
func (l *LogPane) CursorPos() *tea.Cursor {
	if !l.typing || l.w <= 0 || l.h <= 0 {
		return nil
	}
	c := l.input.Cursor()
	if c == nil {
		return nil
	}
	foot := len(l.footLines())
	c.Y = l.h - foot + 1
	return c
}

// View renders exactly w×h cells.
func (l LogPane) View() string {
	st := l.styles
	out := []string{st.fast.PaneTitle.Render("Log") + st.fast.Muted.Render("  readings and the job's record, newest last")}
	for _, s := range l.summary {
		n := 3
		if strings.HasPrefix(s, "!") {
			n = 5 // a warning is read whole
		}
		for _, w := range wrapText(s, max(l.w-2, 10), n) {
			if strings.HasPrefix(s, "!") {
				out = append(out, st.fast.Warning.Render(w))
			} else {
				out = append(out, st.fast.Value.Render(w))
			}
		}
	}
	foot := l.footLines()
	listRoom := 4
	if l.choosing {
		listRoom = 8
	}
	if l.h < 16 {
		listRoom = 3
	}
	out = append(out, l.readingLines(min(listRoom, max(l.h-len(out)-len(foot)-2, 0)))...)
	if len(l.entries) == 0 {
		out = append(out, st.fast.Muted.Render("Nothing logged yet."))
		return fitBlock(append(padTo(out, l.h-len(foot)), foot...), l.w, l.h)
	}
	room := max(l.h-len(out)-len(foot), 0)
	out = append(out, l.visibleLines(room)...)
	return fitBlock(append(padTo(out, l.h-len(foot)), foot...), l.w, l.h)
}

// visibleLines is the room lines of the log that are on screen: the newest
// entry not scrolled away at the bottom (l.scroll entries are hidden below
// it). It wraps only the entries it shows, newest first, and keeps their
// lines for the next frame, so its cost is a screenful's whatever the log's
// length.
func (l LogPane) visibleLines(room int) []string {
	c := l.wrapped
	if c == nil {
		c = &logWraps{}
	}
	if c.w != l.w || c.loc != l.loc || c.lines == nil {
		c.w, c.loc, c.lines = l.w, l.loc, map[int]logWrap{}
	}
	var rev [][]string // the entries' lines, newest first
	n := 0
	for i := len(l.entries) - 1 - l.scroll; i >= 0 && n < room; i-- {
		ls := l.entryLines(c, i)
		rev = append(rev, ls)
		n += len(ls)
	}
	lines := make([]string, 0, n)
	for i := len(rev) - 1; i >= 0; i-- {
		lines = append(lines, rev[i]...)
	}
	return lines[max(len(lines)-room, 0):]
}

// entryLines is entry i wrapped to the pane's width, from the cache when it
// was wrapped for the same text and time.
func (l LogPane) entryLines(c *logWraps, i int) []string {
	e := l.entries[i]
	if w, ok := c.lines[i]; ok && w.text == e.Text && w.at.Equal(e.At) {
		return w.lines
	}
	st := l.styles
	stamp := e.At.In(l.loc).Format("01-02 15:04")
	text := present.Clean(strings.ReplaceAll(e.Text, "\n", " ")) // text from the job file is data
	wrapped := wrapText(text, max(l.w-len(stamp)-2, 10), 4)
	out := make([]string, len(wrapped))
	for j, w := range wrapped {
		if j == 0 {
			out[j] = st.fast.Muted.Render(stamp) + "  " + st.fast.Value.Render(w)
		} else {
			out[j] = strings.Repeat(" ", len(stamp)+2) + st.fast.Value.Render(w)
		}
	}
	c.lines[i] = logWrap{at: e.At, text: e.Text, lines: out}
	return out
}

// padTo pads lines with empty lines up to n (or cuts to n).
func padTo(lines []string, n int) []string {
	n = max(n, 0)
	if len(lines) >= n {
		return lines[:n]
	}
	for len(lines) < n {
		lines = append(lines, "")
	}
	return lines
}

// ShortHelp lists the Log pane's keys.
func (l LogPane) ShortHelp() []key.Binding {
	if l.typing {
		return []key.Binding{l.keys.Done, l.keys.Leave}
	}
	if l.choosing {
		return []key.Binding{l.keys.UpDown, l.keys.Done, l.keys.Leave}
	}
	return []key.Binding{l.keys.AddReading, l.keys.AddFlowTest, l.keys.CorrectReading, l.keys.WriteRecord, l.keys.ScrollUp, l.keys.ScrollDown}
}
