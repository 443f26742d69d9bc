package tui

import (
	"errors"
	"os"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// Keeping the job on disk (model.Session). At the end of every Update,
// persist appends what changed to the job's journal (one small record, one
// plain write, before the frame that shows it); nothing is written when
// nothing changed (a move changes only the resume position, which is kept
// for the next checkpoint). A checkpoint writes the job file whole, in a
// command, one at a time: after a checklist mark, a reading, a change of
// pane (once the pane has stayed paneSettle: a look through the views
// writes the file once), ctrl+s or s, and at exit (Finish). The journal is flushed to disk
// in the background at most once a second.

// persistState is the screen's side of the session.
type persistState struct {
	sess     *model.Session
	path     string // the path the session (or the read-only view) is for
	readOnly bool   // shown without saving: holder has the job
	holder   model.LockInfo

	// A job opened in the background (jobLoadedMsg) brings its session,
	// taken up when the job is shown.
	pending      *model.Session
	pendingRO    bool
	pendingHold  model.LockInfo
	pendingNote  string
	pendingReady bool

	focus    PaneID // the pane at the last checkpoint
	shown    PaneID // the pane at the last persist
	paneSeq  int    // counts changes of pane, for paneSettledMsg
	want     bool   // a checkpoint is asked for
	inFlight bool   // a checkpoint is running
	again    bool   // another is wanted when it is back

	stopLogged bool         // the stop line is in the log
	prompt     *StartPrompt // the lock or damage prompt, when up
}

// startPersist takes up the session of the start (New calls it last): the
// one OpenStart opened, or one opened here for a path without one (tests,
// a new job). It restores the job's draft.
func (m *Model) startPersist(st Start) {
	m.ps.path, m.ps.focus, m.ps.shown, m.ps.prompt = m.path, m.focus, m.focus, st.Prompt
	switch {
	case st.ReadOnly:
		m.ps.readOnly, m.noSave = true, true
		if st.Prompt != nil {
			m.ps.holder = st.Prompt.Holder
		}
	case m.noSave:
	case st.Session != nil:
		m.ps.sess = st.Session
		held.Store(m.path, st.Session)
	default:
		m.openSession()
	}
	m.restoreDraft()
}

// openSession opens or creates the session for m.path with the job as it
// is on screen.
func (m *Model) openSession() {
	var s *model.Session
	var err error
	if _, serr := os.Lstat(m.path); serr != nil {
		s, err = model.CreateSession(m.path, m.job, model.SessionOptions{Owner: lockOwner})
	} else {
		s, _, _, err = model.OpenSession(m.path, model.SessionOptions{Owner: lockOwner})
	}
	if err != nil {
		m.saveErr = err
		return
	}
	m.ps.sess = s
	held.Store(m.path, s)
	m.ps.want = true // records it as the last job
}

// before runs ahead of Update: a job opened in the background brings its
// session (or is to be shown read-only), for persist to take up once the
// job is on screen; a job held by another process brings up the lock
// prompt.
func (m *Model) before(msg tea.Msg) {
	if pm, ok := msg.(paneSettledMsg); ok {
		if pm.seq == m.ps.paneSeq && m.focus != m.ps.focus {
			m.ps.want = true
		}
		return
	}
	lm, ok := msg.(jobLoadedMsg)
	if !ok {
		return
	}
	var locked *model.LockedError
	if errors.As(lm.err, &locked) {
		m.ps.prompt = &StartPrompt{Kind: PromptLocked, Path: lm.path, Holder: locked.Holder, Err: lm.err, FromList: true}
		return
	}
	if lm.err != nil {
		return
	}
	m.ps.pending, m.ps.pendingRO, m.ps.pendingHold, m.ps.pendingReady = lm.sess, lm.readOnly, lm.holder, true
	m.ps.pendingNote = openNote(lm.report, m.loc())
	if lm.readOnly {
		m.ps.pendingNote = joinNotes("opened read-only: the job is held by "+lm.holder.Who(m.loc()), m.ps.pendingNote)
	}
}

// persist journals what the last Update changed and starts a checkpoint
// when one is due. It runs at the end of every Update.
func (m *Model) persist() tea.Cmd {
	if m.share != nil {
		return m.sharePersist()
	}
	if m.path != m.ps.path || m.ps.pendingReady {
		m.switchJob()
	}
	s := m.ps.sess
	if s == nil || m.noSave {
		return nil
	}
	m.keepDraft()
	c, err := s.Record(&m.job)
	if err != nil {
		m.saveFailed(err)
		return nil
	}
	if c.Recorded {
		m.saveErr, m.lastSaved = nil, m.now()
	}
	if c.Checkpoint || m.ps.want {
		m.ps.want = false
		return m.checkpoint()
	}
	if m.focus != m.ps.shown {
		m.ps.shown = m.focus
		m.ps.paneSeq++
		seq := m.ps.paneSeq
		return tea.Tick(paneSettle, func(time.Time) tea.Msg { return paneSettledMsg{seq} })
	}
	return nil
}

// paneSettle is how long a pane stays on screen before its change of pane
// is checkpointed: looking through the views one after another writes the
// job file once, not once a view (with 10,000 readings a checkpoint costs
// some 20 ms of CPU). Until then the journal holds every edit, and only the
// resume position waits. (A variable: the tests but the pty ones set it
// to 0, for a checkpoint at once.)
var paneSettle = paneSettleTime

const paneSettleTime = time.Second

// paneSettledMsg: the pane of change seq has stayed paneSettle.
type paneSettledMsg struct{ seq int }

// switchJob takes up the session of the job now on screen (opened from the
// list, or a new one) and gives the last one up: its journal holds every
// edit, and its lock is released.
func (m *Model) switchJob() {
	if old := m.ps.sess; old != nil && old != m.ps.pending {
		old.Abandon()
		held.Delete(m.ps.path)
	}
	next, ro, ready, note := m.ps.pending, m.ps.pendingRO, m.ps.pendingReady, m.ps.pendingNote
	m.ps.pending, m.ps.pendingRO, m.ps.pendingReady, m.ps.pendingNote = nil, false, false, ""
	m.ps.sess, m.ps.path, m.ps.readOnly, m.ps.holder = nil, m.path, false, model.LockInfo{}
	m.ps.inFlight, m.ps.again, m.saveErr = false, false, nil
	m.noSave = m.path == ""
	switch {
	case m.path == "":
	case ready && ro:
		m.ps.readOnly, m.ps.holder, m.noSave = true, m.ps.pendingHold, true
	case ready && next != nil:
		m.ps.sess = next
		held.Store(m.path, next)
		m.ps.want = true
	default:
		m.openSession() // a new job, not on disk yet
	}
	if note != "" {
		m.job.AddLog(m.now(), note)
		m.touch()
	}
	m.restoreDraft()
	m.sync()
}

// saveFailed shows why the journal could not be written; a lost lock
// makes the screen read-only.
func (m *Model) saveFailed(err error) {
	m.saveErr = err
	var lost *model.LockLostError
	if !errors.As(err, &lost) {
		return
	}
	m.ps.sess.Abandon()
	held.Delete(m.ps.path)
	m.ps.sess, m.ps.readOnly, m.ps.holder, m.noSave = nil, true, lost.By, true
	who := "another drawdown"
	if lost.By.Token != "" {
		who = lost.By.Who(m.loc())
	}
	m.flash = "read-only now: the job was taken over by " + who + "; changes here are not saved"
	m.job.AddLog(m.now(), m.flash)
	m.touch()
}

// checkpoint starts writing the job file whole, or asks for another when
// one is running.
func (m *Model) checkpoint() tea.Cmd {
	s := m.ps.sess
	if s == nil || m.noSave {
		return nil
	}
	if m.ps.inFlight {
		m.ps.again = true
		return nil
	}
	m.recordResume()
	m.ps.focus = m.focus
	m.ps.inFlight = true
	m.saveSeq++
	return checkpointCmd(s, m.job.Clone(), s.Seq(), m.saveSeq, m.markedAs != m.path)
}

// quit stops the program; main saves once more after it ends (Finish).
func (m *Model) quit() tea.Cmd {
	m.quitting = true
	return tea.Quit
}

// save is called after each change of the job. The change itself is
// journalled by persist at the end of Update, so save asks for nothing
// more; checkpoint is the whole save.
func (m *Model) save() tea.Cmd { return nil }

// saveNow is ctrl+s and s: a checkpoint now.
func (m *Model) saveNow() tea.Cmd {
	m.ps.want = true
	return nil
}

// recordResume notes where the technician is, for the next checkpoint.
func (m *Model) recordResume() {
	r := &m.job.Resume
	r.Pane = m.focus.String()
	if m.focus.isForm() {
		r.Field = m.forms[m.focus].Selected().ID
	}
	if id := m.checklist.CurrentID(); id != "" {
		r.StepID, r.Step = id, m.job.Checklist.Index(id)
	}
}

// saveResume records where the technician is; the move itself writes
// nothing (the position goes with the next checkpoint).
func (m *Model) saveResume() tea.Cmd {
	m.recordResume()
	return nil
}

// saved takes a checkpoint's reply; a stale one is dropped.
func (m *Model) saved(msg jobSavedMsg) tea.Cmd {
	if msg.seq != m.saveSeq {
		return nil
	}
	m.ps.inFlight = false
	s := m.ps.sess
	if msg.err != nil {
		m.saveFailed(msg.err)
		return nil
	}
	m.saveErr = nil
	m.lastSaved = msg.at
	m.markedAs = msg.path
	if s != nil {
		if err := s.Compact(msg.journal); err != nil {
			m.saveErr = err
		}
	}
	if msg.res.Forked != "" {
		// Someone else changed the job file: this version is a copy now.
		held.Delete(m.ps.path)
		m.path, m.ps.path = msg.path, msg.path
		held.Store(msg.path, s)
		text := "the job file " + fileBase(msg.res.Forked) + " was changed by another program after it was opened here; " +
			"this screen's version is saved as " + fileBase(msg.path) + ", and saves go there now (both are in the job list)"
		m.job.AddLog(m.now(), text)
		m.flash = text
		m.touch()
	}
	if m.ps.again {
		m.ps.again = false
		return m.checkpoint()
	}
	return nil
}
