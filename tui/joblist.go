package tui

import (
	"strings"

	"charm.land/bubbles/v2/key"
	"charm.land/bubbles/v2/textinput"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// jobList is the open-job overlay: the job folder, newest first, with the
// keys to start a job (blank or from a template) or copy one.
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

	// Starting a job: choosing its template (tmpl into newChoices), then
	// typing its name; copying the selected job types the copy's name.
	mode  listMode
	tmpl  int
	input textinput.Model
}

// listMode is what the job list is doing.
type listMode int

const (
	listBrowse   listMode = iota
	listTemplate          // ←/→ over blank and the templates
	listName              // typing the new job's name
	listCopyName          // typing the copy's name
)

// newChoices are what a new job can start from: blank, then the templates.
func newChoices() []model.Template {
	return append([]model.Template{{ID: "", Name: "Blank job", Summary: "nothing filled in: measure and enter everything"}}, model.Templates()...)
}

func newJobList(st Styles, km KeyMap) jobList {
	ti := textinput.New()
	ti.Prompt = "› "
	ti.CharLimit = 200
	ts := ti.Styles()
	ts.Cursor.Blink = false
	ti.SetStyles(ts)
	return jobList{styles: st, keys: km, input: ti}
}

func (l *jobList) setList(msg jobsListedMsg) {
	l.loading = false
	l.dir, l.jobs, l.err = msg.dir, msg.jobs, msg.err
	l.cursor = clamp(l.cursor, 0, max(len(l.jobs)-1, 0))
}

// ShortHelp lists the overlay's keys.
func (l jobList) ShortHelp() []key.Binding {
	k := l.keys.Jobs
	switch l.mode {
	case listTemplate:
		return []key.Binding{k.Next, k.Prev, k.Pick, k.Back}
	case listName, listCopyName:
		return []key.Binding{k.Create, k.Back}
	case listBrowse:
	}
	return []key.Binding{k.Open, k.New, k.Copy, k.Demo, k.Up, k.Down, k.Back}
}

// View renders the overlay in exactly w×h cells.
func (l jobList) View() string {
	st := l.styles
	title := st.fast.PaneTitle.Render("Jobs")
	out := []string{title + st.fast.Muted.Render("  enter open · n new · c copy · esc back")}
	switch l.mode {
	case listTemplate:
		out[0] = title + st.fast.Muted.Render("  a new job")
		c := newChoices()[l.tmpl]
		out = append(out, st.fast.Label.Render("Start the new job from:"),
			st.fast.LabelFocused.Render("◀ "+c.Name+" ▶"))
		for _, s := range wrapText(c.Summary, max(l.w-2, 10), 3) {
			out = append(out, st.fast.Muted.Render(s))
		}
		return fitBlock(out, l.w, l.h)
	case listName, listCopyName:
		out[0] = title + st.fast.Muted.Render("  enter create · esc back")
		what := "Name of the new job (" + newChoices()[l.tmpl].Name + "):"
		if l.mode == listCopyName {
			what = "Name of the copy (same site and set-up; no marks, readings or log):"
		}
		out = append(out, st.fast.Label.Render(clip(what, l.w)), l.input.View())
		if l.err != nil {
			out = append(out, st.fast.Danger.Render(clip("✗ "+present.Clean(l.err.Error()), l.w)))
		}
		return fitBlock(out, l.w, l.h)
	case listBrowse:
	}
	switch {
	case l.loading:
		out = append(out, st.fast.Muted.Render("reading the job folder…"))
	case l.err != nil:
		for _, s := range wrapText("✗ "+present.Clean(l.err.Error()), max(l.w-2, 10), 3) {
			out = append(out, st.fast.Danger.Render(s))
		}
	case len(l.jobs) == 0:
		out = append(out, st.fast.Muted.Render("No saved jobs in "+l.dir))
	}
	room := max(l.h-len(out)-1, 1)
	top := max(l.cursor-room+1, 0)
	for i := top; i < len(l.jobs) && i < top+room; i++ {
		line := summaryLine(l.jobs[i])
		if i == l.cursor {
			out = append(out, st.fast.LabelFocused.Render(clip("▶ "+line, l.w)))
		} else {
			out = append(out, "  "+st.fast.Value.Render(clip(line, max(l.w-2, 0))))
		}
	}
	return fitBlock(out, l.w, l.h)
}

// summaryLine is one job of the list: the day, its state, name and site.
func summaryLine(j model.JobSummary) string {
	if j.Err != nil {
		return j.Updated.Format("2006-01-02") + "  " + fileBase(j.Path) + "  ✗ cannot be read"
	}
	day := j.Date
	if day == "" {
		day = j.Updated.Format("2006-01-02")
	}
	line := day + "  " + padRight(string(j.State), 8) + " " + present.Clean(j.Name)
	if site := strings.TrimSpace(present.Clean(j.Site)); site != "" {
		line += " · " + site
	}
	return line
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
	k := m.keys.Jobs
	switch l.mode {
	case listTemplate:
		n := len(newChoices())
		switch {
		case key.Matches(msg, k.Back):
			l.mode = listBrowse
		case key.Matches(msg, k.Next):
			l.tmpl = (l.tmpl + 1) % n
		case key.Matches(msg, k.Prev):
			l.tmpl = (l.tmpl + n - 1) % n
		case key.Matches(msg, k.Pick):
			l.mode, l.err = listName, nil
			l.input.Reset()
			return l.input.Focus()
		}
		return nil
	case listName, listCopyName:
		switch {
		case key.Matches(msg, k.Back):
			l.mode, l.err = listBrowse, nil
			l.input.Blur()
			return nil
		case key.Matches(msg, k.Create):
			return m.startJob()
		}
		var cmd tea.Cmd
		l.input, cmd = l.input.Update(msg)
		l.err = nil
		return cmd
	case listBrowse:
	}
	switch {
	case key.Matches(msg, k.Back), key.Matches(msg, m.keys.Open):
		l.open, l.err = false, nil
	case key.Matches(msg, k.Up):
		l.cursor = max(l.cursor-1, 0)
	case key.Matches(msg, k.Down):
		l.cursor = min(l.cursor+1, max(len(l.jobs)-1, 0))
	case key.Matches(msg, k.Open):
		if l.cursor < len(l.jobs) && l.jobs[l.cursor].Err == nil {
			return loadJobCmd(l.jobs[l.cursor].Path)
		}
		if l.cursor < len(l.jobs) {
			l.err = l.jobs[l.cursor].Err
		}
	case key.Matches(msg, k.New):
		l.mode, l.tmpl, l.err = listTemplate, 0, nil
	case key.Matches(msg, k.Copy):
		l.mode, l.err = listCopyName, nil
		l.input.Reset()
		l.input.SetValue("Copy of " + m.job.Name)
		l.input.CursorEnd()
		return l.input.Focus()
	case key.Matches(msg, k.Demo):
		demo := model.DemoJob()
		demo.Created, demo.Updated = m.now(), m.now()
		demo.AddLog(m.now(), "new job from the demo")
		return m.loaded(jobLoadedMsg{path: m.newPath(demo.Name), job: demo})
	}
	return nil
}

// startJob makes the new job (from the chosen template) or the copy of the
// job on screen, named as typed, and opens it. A bad name keeps the input
// open with the reason.
func (m *Model) startJob() tea.Cmd {
	l := &m.jobs
	name := l.input.Value()
	var j model.Job
	var err error
	if l.mode == listCopyName {
		j, err = m.job.Duplicate(name, m.now())
	} else {
		j, err = model.FromTemplate(newChoices()[l.tmpl].ID, name, m.now())
	}
	if err != nil {
		l.err = err
		return nil
	}
	l.mode = listBrowse
	l.input.Blur()
	return m.loaded(jobLoadedMsg{path: m.newPath(j.Name), job: j})
}

// newPath is a fresh file for a new job in the jobs folder ("" when saving
// is off).
func (m *Model) newPath(name string) string {
	if m.dir == "" {
		return ""
	}
	return model.NewJobPath(m.dir, name)
}
