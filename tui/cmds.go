package tui

import (
	"errors"
	"sync"
	"time"

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
