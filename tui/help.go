package tui

import (
	"strings"

	"charm.land/bubbles/v2/key"
	"github.com/charmbracelet/x/ansi"
)

// The full help screen: every key from the key map (so it cannot drift from
// behaviour), how the two modes work, and the standing cautions.

var helpIntro = []string{
	"Units as typed: 25mm 1in 3/4 in 40ft 15C 59F 98.2kPa 29.6inHg. Saved at once.",
}

var helpCautions = []string{
	"Never start a siphon by mouth. Confined spaces: permit, air testing, attendant.",
	"Flammable liquids: bond, ground, no ignition sources. Secure the discharge end.",
	"drawdown plans and records; local codes, permits and licensed practice govern.",
}

// fullHelpView renders the help screen in exactly w×h cells.
func (m *Model) fullHelpView(w, h int) string {
	st := m.styles
	lines := []string{st.fast.PaneTitle.Render("All keys") + st.fast.Muted.Render("  (esc or ? to close)")}
	cols := m.keys.fullHelp()
	titles := fullHelpTitles
	// Columns side by side when they fit, else one under another.
	var blocks [][]string
	var widths []int
	total := 0
	for i, col := range cols {
		b := helpColumn(st, titles[i], col)
		cw := 0
		for _, l := range b {
			cw = max(cw, cellWidth(l))
		}
		blocks = append(blocks, b)
		widths = append(widths, cw+2)
		total += cw + 2
	}
	if total <= w {
		n := 0
		for _, b := range blocks {
			n = max(n, len(b))
		}
		for r := 0; r < n; r++ {
			var sb strings.Builder
			for i, b := range blocks {
				cell := ""
				if r < len(b) {
					cell = b[r]
				}
				sb.WriteString(cell + strings.Repeat(" ", max(widths[i]-cellWidth(cell), 0)))
			}
			lines = append(lines, sb.String())
		}
	} else {
		for _, b := range blocks {
			lines = append(lines, b...)
		}
	}
	for _, v := range m.keys.viewHelp() {
		lines = append(lines, viewHelpLine(st, v.name, v.keys, w))
	}
	for _, l := range helpIntro {
		lines = append(lines, st.fast.Value.Render(l))
	}
	for _, l := range helpCautions {
		lines = append(lines, st.fast.Warning.Render(l))
	}
	return fitBlock(lines, w, h)
}

func helpColumn(st Styles, title string, bs []key.Binding) []string {
	out := []string{st.fast.Title.Render(title)}
	kw := 0
	for _, b := range bs {
		kw = max(kw, cellWidth(b.Help().Key))
	}
	for _, b := range bs {
		if !b.Enabled() {
			continue
		}
		h := b.Help()
		out = append(out, st.fast.HelpKey.Render(padRight(h.Key, kw))+"  "+st.fast.HelpDesc.Render(h.Desc))
	}
	return out
}

// shortHelpLine is the one-line help: "key desc • key desc …", cut at the
// last whole entry that fits, exactly w cells. It is drawn on every frame,
// so it uses the fixed escape sequences of Styles.fast.
func shortHelpLine(st Styles, bs []key.Binding, w int) string {
	var b strings.Builder
	used := 0
	sep := " • "
	for _, k := range bs {
		if !k.Enabled() {
			continue
		}
		h := k.Help()
		if h.Key == "" && h.Desc == "" {
			continue
		}
		n := ansi.StringWidth(h.Key) + 1 + ansi.StringWidth(h.Desc)
		extra := 0
		if used > 0 {
			extra = 3 // " • "
		}
		if used+extra+n > w-2 {
			if used+2 <= w {
				b.WriteString(st.fast.HelpSep.Render(" …"))
				used += 2
			}
			break
		}
		if used > 0 {
			b.WriteString(st.fast.HelpSep.Render(sep))
		}
		b.WriteString(st.fast.HelpKey.Render(h.Key) + " " + st.fast.HelpDesc.Render(h.Desc))
		used += extra + n
	}
	if used < w {
		b.WriteString(strings.Repeat(" ", w-used))
	}
	return b.String()
}

// viewHelpLine is one view's own keys on one line: "Checklist: d/enter done ·
// s skip (reason) · …", cut to w cells.
func viewHelpLine(st Styles, name string, bs []key.Binding, w int) string {
	var parts []string
	for _, b := range bs {
		h := b.Help()
		parts = append(parts, st.fast.HelpKey.Render(h.Key)+" "+st.fast.HelpDesc.Render(h.Desc))
	}
	return clip(st.fast.Title.Render(name+": ")+strings.Join(parts, st.fast.HelpSep.Render(" · ")), w)
}
