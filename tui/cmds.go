package tui

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"sync"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// All file work runs in tea.Cmds that capture a copy of what they need (a
// cloned job, a path, a sequence number), never the live model. Replies come
// back as the messages below; the root drops a reply whose sequence number is
// stale. The one exception is the journal (app_save.go): an edit is appended
// to it in Update with one plain write, before the frame that shows it, so
// that a killed process loses at most the keystroke in flight.

// jobSavedMsg reports a finished checkpoint (the job file written whole).
type jobSavedMsg struct {
	seq     uint64 // the checkpoint's tag
	journal uint64 // the last journal record the file holds
	path    string
	at      time.Time
	res     model.CheckpointResult
	err     error
}

// jobsListedMsg carries the job list for the open-job overlay.
type jobsListedMsg struct {
	dir  string
	jobs []model.JobSummary
	err  error
}

// jobLoadedMsg carries a job opened from the list: with its session, or
// read-only (held by another process: holder says who).
type jobLoadedMsg struct {
	path     string
	job      model.Job
	err      error
	sess     *model.Session
	report   model.OpenReport
	readOnly bool
	holder   model.LockInfo
}

// StopMsg asks the program to save and quit (main sends it on SIGHUP,
// SIGTERM and SIGINT).
type StopMsg struct{ Reason string }

// held are the sessions this process has open, by path, so that opening
// the job already open reuses its session instead of meeting its own lock.
var held sync.Map // string → *model.Session

// lockOwner is what this program says of itself in a job's lock.
var lockOwner = model.LockOwner{}

// checkpointCmd writes the job whole (model.Session.Checkpoint) and, when
// markLast is set, records it as the job to resume.
func checkpointCmd(s *model.Session, j model.Job, journal, seq uint64, markLast bool) tea.Cmd {
	return func() tea.Msg {
		res, err := s.Checkpoint(j, journal)
		path := s.Path()
		if err == nil && (markLast || res.Forked != "") {
			if lerr := model.SetLastJob(path); lerr != nil {
				err = errors.New("saved, but could not record it as the last job: " + lerr.Error())
			}
		}
		return jobSavedMsg{seq: seq, journal: journal, path: path, at: time.Now(), res: res, err: err}
	}
}

// listJobsCmd lists the job folder.
func listJobsCmd(dir string) tea.Cmd {
	return func() tea.Msg {
		jobs, err := model.ListJobs(dir)
		return jobsListedMsg{dir: dir, jobs: jobs, err: err}
	}
}

// loadJobCmd opens a job file for writing (model.OpenSession); a job held
// by another process comes back as a *model.LockedError, for the lock
// prompt.
func loadJobCmd(path string) tea.Cmd { return openJobCmd(path, false) }

func openJobCmd(path string, takeOver bool) tea.Cmd {
	return func() tea.Msg {
		if s, ok := held.Load(path); ok {
			// The job open now: read as it stands, on the same session.
			j, err := model.Load(path)
			return jobLoadedMsg{path: path, job: j, err: err, sess: s.(*model.Session)}
		}
		s, j, rep, err := model.OpenSession(path, model.SessionOptions{Owner: lockOwner, TakeOver: takeOver})
		return jobLoadedMsg{path: path, job: j, err: err, sess: s, report: rep}
	}
}

// readOnlyCmd reads a job held by another process, to show without saving.
func readOnlyCmd(path string, holder model.LockInfo) tea.Cmd {
	return func() tea.Msg {
		j, err := model.Load(path)
		return jobLoadedMsg{path: path, job: j, err: err, readOnly: true, holder: holder}
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
	// Fresh: the job is not on disk yet (the demo, or a new job); New
	// saves it at once (model.CreateSession), so a dropped link resumes it.
	Fresh bool
	// Session is the job file opened for writing (OpenStart opens it); nil
	// with a Path: New opens or creates it.
	Session *model.Session
	// ReadOnly: the job is shown without saving (another process holds it).
	ReadOnly bool
	// Prompt is a choice the technician makes on the first screen: the
	// last job is held by another process, or cannot be read.
	Prompt *StartPrompt
}

// OpenStart finds the job to start with and opens it for writing: the
// last job, or the demo job in a new file. When the last job is held by
// another process, or damaged, the first screen asks what to do (Prompt).
// It is called by main before the program starts, so the first frame shows
// the job at once; on the way it removes the temporary copies that killed
// writers left behind.
func OpenStart() Start {
	dir, err := model.JobsDir()
	if err != nil {
		return Start{Job: model.DemoJob(), Note: "no folder for job files (" + err.Error() + "): changes are not saved"}
	}
	removed := model.CleanTemps(dir)
	if h, err := model.Home(); err == nil {
		removed += model.CleanTemps(h)
	}
	note := ""
	if removed > 0 {
		note = fmt.Sprintf("removed %d temporary copies left by an earlier run that was stopped part way", removed)
	}
	last, err := model.LastJobPath()
	if err == nil && last != "" {
		s, j, rep, oerr := model.OpenSession(last, model.SessionOptions{Owner: lockOwner})
		var locked *model.LockedError
		switch {
		case oerr == nil:
			held.Store(last, s)
			return Start{Job: j, Path: last, Dir: dir, Session: s, Note: joinNotes(note, openNote(rep, time.Local))}
		case errors.As(oerr, &locked):
			j, lerr := model.Load(last)
			if lerr == nil {
				return Start{Job: j, Path: last, Dir: dir, ReadOnly: true, Note: note,
					Prompt: &StartPrompt{Kind: PromptLocked, Path: last, Holder: locked.Holder, Err: oerr}}
			}
			oerr = lerr
		}
		if errors.Is(oerr, model.ErrDamaged) || errors.Is(oerr, model.ErrNotJob) || errors.Is(oerr, model.ErrFutureVersion) {
			return Start{Job: model.DemoJob(), Dir: dir, Note: note,
				Prompt: &StartPrompt{Kind: PromptDamaged, Path: last, Err: oerr}}
		}
		if !errors.Is(oerr, os.ErrNotExist) {
			note = joinNotes(note, "could not open the last job, left it untouched: "+oerr.Error()+" (opened the demo job)")
		}
	}
	return demoStart(dir, note)
}

// demoStart opens the demo job in a new file of dir.
func demoStart(dir, note string) Start {
	demo := model.DemoJob()
	path := model.NewJobPath(dir, demo.Name)
	s, err := model.CreateSession(path, demo, model.SessionOptions{Owner: lockOwner})
	if err != nil {
		return Start{Job: demo, Dir: dir, Note: joinNotes(note, "cannot save the job ("+err.Error()+"): changes are not saved")}
	}
	held.Store(path, s)
	return Start{Job: demo, Path: path, Dir: dir, Fresh: true, Session: s, Note: note}
}

func joinNotes(a, b string) string {
	switch {
	case a == "":
		return b
	case b == "":
		return a
	}
	return a + "; " + b
}

// openNote says what opening the job brought in: journal records applied
// after a stop, a stale lock cleared, a lock taken over. These sentences
// sit beside the decision (the presentation layer may take them over).
func openNote(rep model.OpenReport, loc *time.Location) string {
	note := ""
	if rep.Replayed > 0 {
		note = fmt.Sprintf("brought in %d edits kept in the journal since the last whole save", rep.Replayed)
	}
	if rep.JournalNote != "" {
		note = joinNotes(note, "journal: "+rep.JournalNote)
	}
	if rep.StaleLock != nil {
		note = joinNotes(note, "cleared the lock left by "+rep.StaleLock.Who(loc)+", which has ended")
	}
	if rep.TookOver != nil {
		note = joinNotes(note, "took the job over from "+rep.TookOver.Who(loc))
	}
	return note
}

// finishWait bounds the wait at exit for the job file to be written whole;
// past it, the journal (already written) holds every edit and the next
// open writes the file.
const finishWait = 80 * time.Millisecond

// Finish is main's last step after the program ends, however it ends: it
// logs the stop line when reason is given (SIGHUP, SIGTERM, a closed
// terminal) and the screen has not logged it, records where the
// technician was, and saves the job (journal, then the file whole within
// finishWait), releasing its lock. An error wrapping model.ErrSavedInJournal
// means the disk was slow: nothing is lost, the next open finishes the
// write.
func Finish(m *Model, reason string) error {
	if reason != "" && !m.ps.stopLogged {
		m.job.AddLog(m.now(), stopLine(reason))
		m.ps.stopLogged = true
	}
	s := m.ps.sess
	if s == nil || m.noSave {
		return nil
	}
	m.keepDraft()
	m.recordResume()
	before := s.Path()
	err := s.Close(m.job.Clone(), finishWait)
	held.Delete(m.ps.path)
	if err == nil && m.markedAs != s.Path() {
		err = model.SetLastJob(s.Path())
	}
	if err == nil && s.Path() != before {
		return fmt.Errorf("%w: %s was changed by another program while it was open here; this screen's version is saved as %s",
			ErrForkedAtExit, filepath.Base(before), filepath.Base(s.Path()))
	}
	if errors.Is(err, model.ErrSavedInJournal) {
		return fmt.Errorf("%w: the disk is slow; every change is in the journal beside %s and goes into the job file at the next start",
			err, filepath.Base(s.Path()))
	}
	return err
}

// ErrForkedAtExit is wrapped by Finish's report that the job file had
// been changed by another program, so that this screen's version was saved
// as a copy beside it: nothing is lost, and main says where it went.
var ErrForkedAtExit = errors.New("saved as a copy")

// stopLine is the log line of a stop by a signal or a closed terminal.
func stopLine(reason string) string { return "stopped (" + reason + "); job saved" }
