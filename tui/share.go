package tui

import (
	"errors"
	"slices"
	"strings"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// A screen on a shared job (the crew server, package serve). The screen
// edits its own copy of the job as it always does; at the end of every
// Update it hands the copy to its Sharer instead of journalling it
// (persist), and the Sharer sends what changed to the job's one owner,
// which applies every screen's changes in order, saves them and tells every
// other screen (JobChangedMsg). The screen then takes the shared job
// (Latest) and keeps its own pane, cursor and draft. A screen without a
// Sharer saves the job itself (app_save.go), unchanged.

// A Sharer is the screen's link to a shared job.
type Sharer interface {
	// Submit takes the job as this screen has it after an Update and sends
	// what changed to the owner. ErrReadOnly: the screen may not change the
	// job, and nothing was sent.
	Submit(j *model.Job) error
	// Latest is the shared job as the owner last sent it, with this
	// screen's changes that are still on their way applied.
	Latest() model.Job
	// Crew is who else is on the job, and where.
	Crew() []Peer
	// Name is this screen's crew member; ReadOnly says the key may look
	// but not change.
	Name() string
	ReadOnly() bool
}

// ErrReadOnly is Submit's refusal of a change from a read-only screen.
var ErrReadOnly = errors.New("read-only: this key may look at the job but not change it")

// Peer is another crew member on the job: the name on their key, the pane
// they are in, and the field they are typing in ("" when none).
type Peer struct {
	Name     string
	Pane     string
	Typing   model.FieldID
	ReadOnly bool
}

// JobChangedMsg says the shared job changed (another screen's edit, or
// someone came or went): the screen takes Latest and Crew.
type JobChangedMsg struct{}

// sharePersist is persist for a shared screen.
func (m *Model) sharePersist() tea.Cmd {
	m.keepDraft()
	m.recordResume()
	err := m.share.Submit(&m.job)
	switch {
	case errors.Is(err, ErrReadOnly):
		cmd := m.takeShared()
		m.flash = "✗ " + ErrReadOnly.Error() + "; the change was not kept"
		m.sync() // persist runs after the panes were brought up to date
		return cmd
	case err != nil:
		m.saveErr = err
	default:
		m.saveErr, m.lastSaved = nil, m.now()
	}
	return nil
}

// takeShared puts the shared job on screen, keeping this screen's draft
// and place in it; readings someone else added or corrected are fitted
// again (the command it returns) when the Log pane is on screen.
func (m *Model) takeShared() tea.Cmd {
	readings, flows := m.job.Readings, m.job.FlowTests
	j := m.share.Latest()
	j.Draft, j.Resume = m.job.Draft, m.job.Resume
	if j.Inputs == nil {
		j.Inputs = map[model.FieldID]string{}
	}
	m.job = j
	m.crew = m.share.Crew()
	typing := map[model.FieldID]string{}
	for _, p := range m.crew {
		if p.Typing != "" {
			typing[p.Typing] = joinName(typing[p.Typing], p.Name)
		}
	}
	for _, f := range m.forms {
		f.others = typing
	}
	m.recompute()
	m.touch()
	if !slices.Equal(readings, m.job.Readings) || !slices.Equal(flows, m.job.FlowTests) {
		m.readRev++
		if slices.Contains(m.visible(), PaneLog) {
			return m.refit() // else the Log pane fits them when it comes on
		}
	}
	return nil
}

func joinName(a, b string) string {
	if a == "" {
		return b
	}
	return a + ", " + b
}

// crewText is the header's word on who else is on the job: "with Ana
// (Hose), Ben (Checklist)"; "" on a lone screen.
func (m *Model) crewText() string {
	if m.share == nil {
		return ""
	}
	if len(m.crew) == 0 {
		return "only you"
	}
	var parts []string
	for _, p := range m.crew {
		s := present.Clean(p.Name)
		if p.Pane != "" {
			s += " (" + p.Pane + ")"
		}
		parts = append(parts, s)
	}
	return "with " + strings.Join(parts, ", ")
}
