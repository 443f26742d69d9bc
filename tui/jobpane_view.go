package tui

import (
	"strings"

	"drawdown/model/present"
)

// jobLabelW is the width of the Job pane's label column.
const jobLabelW = 28

// View renders the pane in exactly w×h cells: the rows, scrolled to keep
// the selection in sight, and at the foot the entry being typed or the
// choices being browsed. Before Show has built the rows (the first frame,
// drawn before any message) it draws the title alone.
func (p *JobPane) View() string {
	st := p.styles
	out := []string{st.fast.PaneTitle.Render("Job") + st.fast.Muted.Render("  the job, its crew, the site facts and the record")}
	foot := p.footLines()
	room := max(p.h-len(out)-len(foot), 1)
	p.top = clamp(p.top, max(p.cur-room+1, 0), p.cur)
	if p.cur > 0 && p.cur <= len(p.rows) && p.rows[p.cur-1].kind == rowHeading && p.top == p.cur {
		p.top-- // show a section's heading with its first row
	}
	lw := min(jobLabelW, max(p.w/2, 8))
	for i := p.top; i < len(p.rows) && i < p.top+room; i++ {
		out = append(out, p.rowLine(i, lw))
	}
	return fitBlock(append(padTo(out, p.h-len(foot)), foot...), p.w, p.h)
}

// rowLine draws row i: a heading, or a label and its value.
func (p *JobPane) rowLine(i, lw int) string {
	st := p.styles
	r := p.rows[i]
	if r.kind == rowHeading {
		return st.fast.PaneTitle.Render(clip(r.label, p.w))
	}
	value := present.Clean(r.value) // text from the job file is data
	switch {
	case r.kind == rowChoice && p.browsing && i == p.cur:
		value = "◀ " + r.choices[p.browse] + " ▶"
	case value == "" && r.kind == rowAction:
		value = "—"
	case value == "":
		value = "(none)"
	}
	mark := "  "
	label := st.fast.Label
	if i == p.cur && p.focused {
		mark, label = "▶ ", st.fast.LabelFocused
	}
	vw := max(p.w-lw-2-1, 1)
	return mark + label.Render(padRight(clip(r.label, lw), lw)) + " " + st.fast.Value.Render(clip(value, vw))
}

// footLines are the input being typed, its error, or the help for the
// selected row.
func (p *JobPane) footLines() []string {
	st := p.styles
	if p.cur >= len(p.rows) {
		return nil
	}
	r := p.rows[p.cur]
	switch {
	case p.typing:
		out := []string{st.fast.Label.Render(clip(r.label+":", p.w)), p.input.View()}
		if p.errText != "" {
			out = append(out, st.fast.Danger.Render(clip("✗ "+present.Clean(p.errText), p.w)))
		}
		return out
	case p.errText != "":
		return []string{st.fast.Danger.Render(clip("✗ "+present.Clean(p.errText), p.w))}
	case p.browsing:
		return []string{st.fast.Muted.Render(clip("←/→ choose · enter takes it · esc leaves it as it was", p.w))}
	}
	return []string{st.fast.Muted.Render(clip(rowHint(r), p.w))}
}

// rowHint says what enter does on a row.
func rowHint(r jobRow) string {
	switch r.kind {
	case rowText:
		return "enter: type " + strings.ToLower(r.label)
	case rowFlag:
		return "enter or space: yes ⇄ no (the checklist follows)"
	case rowChoice:
		return "enter: choose " + strings.ToLower(r.label)
	case rowAction:
		return "enter: " + strings.ToLower(r.label)
	case rowItem:
		if r.remove != nil {
			return "d: remove from the list"
		}
		return "recorded; the log keeps it"
	case rowHeading:
	}
	return ""
}
