package tui

import (
	"errors"
	"strings"
	"sync"
	"time"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// All file work runs in tea.Cmds that capture a copy of what they need (a
// cloned job, a path, a sequence number), never the live model. Replies come
// back as the messages below; the root drops a reply whose sequence number is
// stale.

// jobSavedMsg reports a finished save.
type jobSavedMsg struct {
	seq  uint64
	path string
	at   time.Time
	err  error
}

// jobsListedMsg carries the job list for the open-job overlay.
type jobsListedMsg struct {
	dir  string
	jobs []model.JobSummary
	err  error
}

// jobLoadedMsg carries a job opened from the list.
type jobLoadedMsg struct {
	path string
	job  model.Job
	err  error
}

// StopMsg asks the program to save and quit (main sends it on SIGHUP and
// SIGTERM).
type StopMsg struct{ Reason string }

// fileMu orders every write of a job file in this process: the root keeps
// one save in flight, and SaveFinal (at exit) waits for it, so an older copy
// can never land after the final one.
var fileMu sync.Mutex

func saveLocked(path string, j model.Job) error {
	fileMu.Lock()
	defer fileMu.Unlock()
	return model.SaveAtomic(path, j)
}

// SaveFinal saves the job once more when the program ends (main calls it
// with the model Run returns, also after SIGHUP or SIGTERM), after any save
// still in flight, and records it as the job to resume.
func SaveFinal(m *Model) error {
	if m.noSave || m.path == "" {
		return nil
	}
	if err := saveLocked(m.path, m.Job()); err != nil {
		return err
	}
	return model.SetLastJob(m.path)
}

// saveCmd writes the job atomically and, when markLast is set, records it as
// the job to resume.
func saveCmd(path string, j model.Job, seq uint64, markLast bool) tea.Cmd {
	return func() tea.Msg {
		err := saveLocked(path, j)
		if err == nil && markLast {
			if lerr := model.SetLastJob(path); lerr != nil {
				err = errors.New("saved, but could not record it as the last job: " + lerr.Error())
			}
		}
		return jobSavedMsg{seq: seq, path: path, at: time.Now(), err: err}
	}
}

// listJobsCmd lists the job folder.
func listJobsCmd(dir string) tea.Cmd {
	return func() tea.Msg {
		jobs, err := model.ListJobs(dir)
		return jobsListedMsg{dir: dir, jobs: jobs, err: err}
	}
}

// loadJobCmd opens a job file.
func loadJobCmd(path string) tea.Cmd {
	return func() tea.Msg {
		j, err := model.Load(path)
		return jobLoadedMsg{path: path, job: j, err: err}
	}
}

// Start is what the program opens with: the last job if it can be read,
// else the demo job under a new file name. Note says what happened when the
// last job could not be opened; the damaged file is left alone.
type Start struct {
	Job  model.Job
	Path string // where saves go
	Dir  string // the jobs folder
	Note string // shown in the log and the top bar, "" when all is well
	// Fresh: the job is not on disk yet (the demo, or a new job); it is
	// saved as soon as the screen starts, so a dropped link resumes it.
	Fresh bool
}

// OpenStart finds the job to start with. It reads at most two small files
// and is called by main before the program starts, so the first frame shows
// the job at once.
func OpenStart() Start {
	dir, err := model.JobsDir()
	if err != nil {
		return Start{Job: model.DemoJob(), Note: "no folder for job files (" + err.Error() + "): changes are not saved"}
	}
	last, err := model.LastJobPath()
	if err == nil && last != "" {
		j, lerr := model.Load(last)
		if lerr == nil {
			return Start{Job: j, Path: last, Dir: dir}
		}
		demo := model.DemoJob()
		return Start{Job: demo, Path: model.NewJobPath(dir, demo.Name), Dir: dir, Fresh: true,
			Note: "could not open the last job, left it untouched: " + lerr.Error() + " (opened the demo job)"}
	}
	demo := model.DemoJob()
	return Start{Job: demo, Path: model.NewJobPath(dir, demo.Name), Dir: dir, Fresh: true}
}

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
	return []key.Binding{l.keys.Up, l.keys.Down,
		key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "open")),
		key.NewBinding(key.WithKeys("d"), key.WithHelp("d", "new demo job")),
		key.NewBinding(key.WithKeys("esc"), key.WithHelp("esc", "back"))}
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
		name := j.Name
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
func (m *Model) jobKey(msg tea.KeyPressMsg) (tea.Model, tea.Cmd) {
	l := &m.jobs
	switch {
	case key.Matches(msg, m.keys.Leave), key.Matches(msg, m.keys.Open):
		l.open, l.err = false, nil
	case key.Matches(msg, m.keys.Up):
		l.cursor = max(l.cursor-1, 0)
	case key.Matches(msg, m.keys.Down):
		l.cursor = min(l.cursor+1, max(len(l.jobs)-1, 0))
	case msg.String() == "enter":
		if l.cursor < len(l.jobs) && l.jobs[l.cursor].Err == nil {
			return m, loadJobCmd(l.jobs[l.cursor].Path)
		}
		if l.cursor < len(l.jobs) {
			l.err = l.jobs[l.cursor].Err
		}
	case msg.String() == "d":
		demo := model.DemoJob()
		demo.Created, demo.Updated = m.now(), m.now()
		demo.AddLog(m.now(), "new job from the demo")
		path := ""
		if m.dir != "" {
			path = model.NewJobPath(m.dir, demo.Name)
		}
		return m.loaded(jobLoadedMsg{path: path, job: demo})
	}
	return m, nil
}
