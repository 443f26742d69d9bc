package tui

import (
	"strconv"
	"strings"

	"drawdown/model/present"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"
)

// Composing the screen: the layout for the terminal size, and View, which
// only assembles what the panes drew in Update.

// resize lays the panes out for a w×h terminal.
func (m *Model) resize(w, h int) {
	m.width, m.height = w, h
	m.lay = newLayout(w, h)
	l := m.lay
	if l.TooSmall {
		return
	}
	for _, f := range m.forms {
		f.SetSize(l.Main.W, l.Main.H)
	}
	m.result.SetSize(l.Result.W, l.Result.H)
	for i, p := range m.panes {
		switch {
		case PaneID(i).isForm():
		case l.Wide && PaneID(i) == PaneSide:
			p.SetSize(l.Side.W, l.Side.H)
		case l.Wide:
			p.SetSize(l.Lower.W, l.Lower.H)
		default:
			p.SetSize(l.Main.W, l.Main.H)
		}
	}
	m.jobs.w, m.jobs.h = l.Main.W, l.Main.H
	m.st.gen++ // every pane on screen draws again at its new size
}

// View draws the screen. It only formats what Update computed.
func (m *Model) View() tea.View {
	v := tea.NewView("")
	v.AltScreen = true
	v.WindowTitle = "drawdown · " + jobName(m.job.Name)
	if m.mouse {
		v.MouseMode = tea.MouseModeCellMotion
	}
	if m.quitting {
		return v
	}
	l := m.lay
	if l.TooSmall {
		v.SetContent(tooSmall(m.width, m.height))
		return v
	}
	rows := make([]string, 0, l.H)
	if l.Narrow {
		rows = append(rows, m.headerView(), m.verdictLine(), m.tabsView())
		if m.showHelp {
			rows = append(rows, strings.Split(m.fullHelpView(l.W, l.Main.H), "\n")...)
		} else {
			rows = append(rows, strings.Split(m.mainView(), "\n")...)
		}
		rows = append(rows, m.helpLine())
		v.SetContent(strings.Join(rows, "\n"))
		if c := m.cursor(); c != nil {
			v.Cursor = c
		}
		return v
	}
	rows = append(rows, m.headerView(), m.tabsView())
	if m.showHelp {
		rows = append(rows, strings.Split(m.fullHelpView(l.W, l.H-3), "\n")...)
	} else {
		main := m.mainView()
		res := m.result.View()
		if l.Wide {
			rows = append(rows, joinColumns(main, res, m.side.View())...)
			rows = append(rows, strings.Split(m.panes[m.lowerPane()].View(), "\n")...)
		} else {
			rows = append(rows, joinColumns(main, res)...)
		}
	}
	rows = append(rows, m.helpLine())
	v.SetContent(strings.Join(rows, "\n"))
	if c := m.cursor(); c != nil {
		v.Cursor = c
	}
	return v
}

// mainView is the left block: the job list overlay, the focused pane, or on
// a wide screen the last form.
func (m *Model) mainView() string {
	if m.ps.prompt != nil {
		return m.promptView()
	}
	if m.jobs.open {
		return m.jobs.View()
	}
	if m.lay.Narrow && m.showResult {
		return m.result.View()
	}
	if m.lay.Wide && !m.focus.isForm() {
		return m.forms[m.form].View()
	}
	return m.panes[m.focus].View()
}

// cursor is the real terminal cursor in the input being typed in.
func (m *Model) cursor() *tea.Cursor {
	if m.showHelp || m.jobs.open || m.ps.prompt != nil {
		return nil
	}
	if m.lay.Narrow && m.showResult {
		return nil
	}
	c := m.panes[m.focus].CursorPos()
	if c == nil {
		return nil
	}
	at := m.lay.Main
	if m.lay.Wide && !m.focus.isForm() {
		at = m.lay.Lower
	}
	c.X += at.X
	c.Y += at.Y
	c.Blink = false
	return c
}

// typing reports whether keys go into a text input (letters are text).
func (m *Model) typing() bool {
	if m.jobs.open {
		return m.jobs.mode == listName || m.jobs.mode == listCopyName
	}
	if m.showHelp {
		return false
	}
	return m.panes[m.focus].Typing()
}

// headerView is the top line: program, job, units, save state and mode.
func (m *Model) headerView() string {
	st := m.styles
	mode := st.fast.Mode.Render(" NAVIGATE ")
	if m.typing() {
		mode = st.fast.Mode.Render(" TYPING ")
	}
	var save string
	switch {
	case m.ps.readOnly:
		save = st.fast.Warning.Render("! read-only")
	case m.share != nil && m.saveErr != nil:
		save = st.fast.Danger.Render("✗ NOT SHARED")
	case m.share != nil:
		save = st.fast.OK.Render("✓ shared")
	case m.noSave:
		save = st.fast.Warning.Render("! not saving")
	case m.saveErr != nil:
		save = st.fast.Danger.Render("✗ NOT SAVED")
	case !m.lastSaved.IsZero():
		// Kept while the next save runs (a few milliseconds): a mark that
		// flickers on every keystroke costs bytes and says nothing.
		save = st.fast.OK.Render("✓ saved")
	default:
		save = st.fast.Muted.Render("· unchanged")
	}
	right := st.fast.Title.Render(m.job.Units.String()) + "  " + save + " " + mode
	if m.lay.Narrow {
		right = st.fast.Title.Render(m.job.Units.String()) + " " + save
		if m.typing() {
			right += " " + mode // only the mode that changes what letters do
		}
	}
	left := st.fast.Title.Render("drawdown") + st.fast.Muted.Render(" · ")
	room := m.lay.W - cellWidth(left) - cellWidth(right) - 1
	title := jobName(m.job.Name)
	if crew := m.crewText(); crew != "" {
		title += " · " + crew // on a shared job, who else is on it comes before the site
	}
	if site := strings.TrimSpace(present.Clean(m.job.Site)); site != "" {
		title += " · " + site
	}
	left += st.fast.Value.Render(clip(title, max(room, 0)))
	gap := max(m.lay.W-cellWidth(left)-cellWidth(right), 0)
	return fitBlock([]string{left + strings.Repeat(" ", gap) + right}, m.lay.W, 1)
}

// jobName is a job's name for one line of the screen: control characters
// shown as spaces, and a name for an unnamed job.
func jobName(name string) string {
	name = strings.TrimSpace(present.Clean(name))
	if name == "" {
		return "(unnamed job)"
	}
	return name
}

// tabLabel is pane p's tab: its key and its name (short on a narrow screen).
func (m *Model) tabLabel(p PaneID) string {
	name := paneTable[p].name
	if m.lay.W < 110 {
		name = paneTable[p].short
	}
	if int(p) < len(m.keys.PaneKeys) {
		return m.keys.PaneKeys[p].Help().Key + " " + name
	}
	return name
}

// tabSpan is where a tab is drawn on the tab line, [x0, x1).
type tabSpan struct{ x0, x1 int }

// tabsCompact reports whether the tabs share their separators: each tab
// is its label with one cell either side, and on a screen too narrow for
// that, neighbours share the cell between them. Either way a tab stays
// where it is when another is chosen (nothing shifts on a pane key).
func (m *Model) tabsCompact() bool {
	w := 1 // the bar before the views
	for i := PaneID(0); i < paneCount; i++ {
		w += cellWidth(m.tabLabel(i)) + 2
	}
	return w > m.lay.W
}

// tabSpans places the tabs as tabsView draws them, each with the cells
// around its label.
func (m *Model) tabSpans() []tabSpan {
	out := make([]tabSpan, paneCount)
	compact := m.tabsCompact()
	x := 0
	for i := PaneID(0); i < paneCount; i++ {
		if i == PaneSide {
			x++ // the bar
		}
		w := cellWidth(m.tabLabel(i)) + 2
		out[i] = tabSpan{x, x + w}
		x += w
		if compact && i+1 != PaneSide {
			x-- // the next tab starts on this one's closing cell
		}
	}
	return out
}

// tabsView is the pane selector: key and name, the selected one in inverse
// (reverse) display and brackets (legible without colour).
func (m *Model) tabsView() string {
	st := m.styles
	if m.lay.Narrow {
		return m.narrowTabsView()
	}
	if m.tabsCompact() {
		return m.compactTabsView()
	}
	var b strings.Builder
	for i := PaneID(0); i < paneCount; i++ {
		if i == PaneSide {
			b.WriteString(st.fast.Muted.Render("│"))
		}
		label := m.tabLabel(i)
		switch {
		case i == m.focus:
			b.WriteString(st.fast.TabActive.Render("[" + label + "]"))
		case m.lay.Wide && i == m.lower:
			b.WriteString(st.fast.Tab.Render("(" + label + ")"))
		default:
			b.WriteString(st.fast.Tab.Render(" " + label + " "))
		}
	}
	return fitBlock([]string{b.String()}, m.lay.W, 1)
}

// narrowTabsView is the pane selector of the narrow layout: the pane on
// screen, and how to reach the others.
func (m *Model) narrowTabsView() string {
	st := m.styles
	cur := "[" + m.tabLabel(m.focus) + "]"
	if m.showResult {
		cur = "[= Result]"
	}
	rest := "  0-9 · [ ] panes · = result"
	return fitBlock([]string{st.fast.TabActive.Render(cur) + st.fast.Muted.Render(rest)}, m.lay.W, 1)
}

// verdictLine is the narrow layout's answer, always on screen: the verdict
// with its symbol, the flow and the time to the stop (from the Sheet).
func (m *Model) verdictLine() string {
	st := m.styles
	s := m.st.sheet
	if !s.Valid {
		return fitBlock([]string{st.fast.Warning.Render("? NO RESULT YET: fix the ✗ field")}, m.lay.W, 1)
	}
	v := s.Verdict
	text := v.Status.Symbol() + " " + v.Word
	if m.st.stale {
		text += " (last valid)"
	}
	if s.Runs {
		text += " · " + s.Flow
	}
	if d := s.Drain; d != nil && d.Overflows {
		text += " · spills in " + d.Time
	} else if d != nil && !d.AtOnce {
		text += " · " + d.Time
	}
	return fitBlock([]string{st.fastStyle(v.Status).Render(clip(text, m.lay.W))}, m.lay.W, 1)
}

// compactTabsView draws the tabs with one shared cell between neighbours:
// the chosen tab's brackets stand in those cells.
func (m *Model) compactTabsView() string {
	st := m.styles
	var b strings.Builder
	sep := func(i PaneID) string { // the cell before tab i
		switch {
		case i == m.focus:
			return "["
		case i > 0 && i-1 == m.focus && i != PaneSide:
			return "]"
		}
		return " "
	}
	for i := PaneID(0); i < paneCount; i++ {
		if i == PaneSide {
			if i-1 == m.focus {
				b.WriteString(st.fast.TabActive.Render("]"))
			} else {
				b.WriteString(" ")
			}
			b.WriteString(st.fast.Muted.Render("│"))
		}
		c := sep(i)
		if c == " " {
			b.WriteString(c)
		} else {
			b.WriteString(st.fast.TabActive.Render(c))
		}
		if i == m.focus {
			b.WriteString(st.fast.TabActive.Render(m.tabLabel(i)))
		} else {
			b.WriteString(st.fast.Tab.Render(m.tabLabel(i)))
		}
	}
	if paneCount-1 == m.focus {
		b.WriteString(st.fast.TabActive.Render("]"))
	}
	return fitBlock([]string{b.String()}, m.lay.W, 1)
}

// helpLine is the one-line help for the present state, or a one-shot hint.
func (m *Model) helpLine() string {
	if m.flash != "" {
		return fitBlock([]string{m.styles.fast.Warning.Render("! " + present.Clean(m.flash))}, m.lay.W, 1)
	}
	if m.saveErr != nil {
		return fitBlock([]string{m.styles.fast.Danger.Render("✗ not saved: " + present.Clean(m.saveErr.Error()))}, m.lay.W, 1)
	}
	var b []key.Binding
	switch {
	case m.showHelp:
		b = []key.Binding{m.keys.CloseHelp}
	case m.ps.prompt != nil:
		b = promptHelp(m.ps.prompt)
	case m.jobs.open:
		b = m.jobs.ShortHelp()
	case m.lay.Narrow && m.showResult:
		back := key.NewBinding(key.WithKeys("="), key.WithHelp("=/esc", "back to the pane"))
		b = []key.Binding{back, m.keys.Panes, m.keys.Help, m.keys.QuitNav}
	default:
		p := m.panes[m.focus]
		b = p.ShortHelp()
		if !p.Typing() && !m.focus.isForm() {
			b = append(b, m.keys.navHelp(b)...)
		}
	}
	return shortHelpLine(m.styles, b, m.lay.W)
}

// joinColumns puts blocks of equal height side by side, line by line.
func joinColumns(blocks ...string) []string {
	split := make([][]string, len(blocks))
	n := 0
	for i, b := range blocks {
		split[i] = strings.Split(b, "\n")
		n = max(n, len(split[i]))
	}
	out := make([]string, n)
	for r := 0; r < n; r++ {
		var sb strings.Builder
		for _, s := range split {
			if r < len(s) {
				sb.WriteString(s[r])
			}
		}
		out[r] = sb.String()
	}
	return out
}

// tooSmall is the whole screen when the terminal is below 80×24.
func tooSmall(w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	msg := "Terminal too small: need at least " + strconv.Itoa(NarrowMinWidth) + "×" + strconv.Itoa(NarrowMinHeight) +
		", now " + strconv.Itoa(w) + "×" + strconv.Itoa(h) + ". Enlarge the window, or use drawdown calc. ctrl+c quits."
	return fitBlock(wrapText(msg, w, h), w, h)
}
