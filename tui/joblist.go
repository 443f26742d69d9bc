package tui

import (
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// jobList is the open-job overlay: the job folder, newest first.
type jobList struct {
	open    bool
	loading bool
	dir     string
	jobs    []model.JobSummary
	cursor  int
	err     error
	w, h    int
	styles  Styles
	keys    KeyMap
}

func newJobList(st Styles, km KeyMap) jobList { return jobList{styles: st, keys: km} }

func (l *jobList) setList(msg jobsListedMsg) {
	l.loading = false
	l.dir, l.jobs, l.err = msg.dir, msg.jobs, msg.err
	l.cursor = clamp(l.cursor, 0, max(len(l.jobs)-1, 0))
}

// ShortHelp lists the overlay's keys.
func (l jobList) ShortHelp() []key.Binding {
	return []key.Binding{l.keys.Up, l.keys.Down, l.keys.Jobs.Open, l.keys.Jobs.Demo, l.keys.Jobs.Back}
}

// View renders the overlay in exactly w×h cells.
func (l jobList) View() string {
	st := l.styles
	out := []string{st.fast.PaneTitle.Render("Open a job") + st.fast.Muted.Render("  enter open · d demo · esc back")}
	switch {
	case l.loading:
		out = append(out, st.fast.Muted.Render("reading the job folder…"))
	case l.err != nil:
		for _, s := range wrapText("✗ "+l.err.Error(), max(l.w-2, 10), 3) {
			out = append(out, st.fast.Danger.Render(s))
		}
	case len(l.jobs) == 0:
		out = append(out, st.fast.Muted.Render("No saved jobs in "+l.dir))
	}
	room := max(l.h-len(out)-1, 1)
	top := max(l.cursor-room+1, 0)
	for i := top; i < len(l.jobs) && i < top+room; i++ {
		j := l.jobs[i]
		name := present.Clean(j.Name)
		status := ""
		if j.Err != nil {
			name, status = fileBase(j.Path), "  ✗ cannot be read"
		}
		line := j.Updated.Format("2006-01-02 15:04") + "  " + name + status
		if i == l.cursor {
			out = append(out, st.fast.LabelFocused.Render("▶ "+line))
		} else {
			out = append(out, "  "+st.fast.Value.Render(line))
		}
	}
	return fitBlock(out, l.w, l.h)
}

func fileBase(p string) string {
	if i := strings.LastIndexAny(p, `/\`); i >= 0 {
		return p[i+1:]
	}
	return p
}

// jobKey handles a key while the job list is open.
func (m *Model) jobKey(msg tea.KeyPressMsg) tea.Cmd {
	l := &m.jobs
	switch {
	case key.Matches(msg, m.keys.Jobs.Back), key.Matches(msg, m.keys.Open):
		l.open, l.err = false, nil
	case key.Matches(msg, m.keys.Up):
		l.cursor = max(l.cursor-1, 0)
	case key.Matches(msg, m.keys.Down):
		l.cursor = min(l.cursor+1, max(len(l.jobs)-1, 0))
	case key.Matches(msg, m.keys.Jobs.Open):
		if l.cursor < len(l.jobs) && l.jobs[l.cursor].Err == nil {
			return loadJobCmd(l.jobs[l.cursor].Path)
		}
		if l.cursor < len(l.jobs) {
			l.err = l.jobs[l.cursor].Err
		}
	case key.Matches(msg, m.keys.Jobs.Demo):
		demo := model.DemoJob()
		demo.Created, demo.Updated = m.now(), m.now()
		demo.AddLog(m.now(), "new job from the demo")
		path := ""
		if m.dir != "" {
			path = model.NewJobPath(m.dir, demo.Name)
		}
		return m.loaded(jobLoadedMsg{path: path, job: demo})
	}
	return nil
}
