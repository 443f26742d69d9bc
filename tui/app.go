package tui

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
	"drawdown/presets"
)

// Options configure the root model.
type Options struct {
	Start Start              // the job to open (see OpenStart)
	Cat   *presets.Catalogue // nil: presets.Builtin()
	// NoSave turns saving off (tests, and when there is no job folder).
	NoSave bool
	// Now is the clock for log lines (nil: time.Now).
	Now func() time.Time
	// Loc is the zone times are shown in (nil: time.Local).
	Loc *time.Location
	// NoMouse starts with the mouse off (the m key turns it on and off).
	NoMouse bool
	// Share puts the screen on a shared job (share.go): changes go to the
	// Sharer, which saves them, instead of to a session of this screen's
	// own. Start.Job is then the shared job; nothing else is opened.
	Share Sharer
}

// Model is the root of the screen and the only tea.Model. It routes
// messages (app_keys.go), applies changes to the job (app_job.go), keeps it
// saved (app_save.go) and composes the panes (app_view.go). The panes sit in
// a table in tab order (pane.go); each is its own model.
type Model struct {
	keys   KeyMap
	styles Styles
	cat    *presets.Catalogue
	now    func() time.Time

	job  model.Job
	path string
	dir  string

	// st is what the panes show; shown[i] is the gen pane i last saw.
	st    screenState
	shown [paneCount]uint64

	focus PaneID
	lower PaneID // wide screens: the view shown in the lower strip
	form  PaneID // the form last focused (shown on wide screens meanwhile)

	panes     [paneCount]pane
	forms     [formCount]*FormPane
	side      *SideView
	curve     *CurveView
	whatif    *WhatIfView
	checklist *ChecklistView
	log       *LogPane
	jobp      *JobPane
	result    ResultPane

	// whatIfSeq tags the What-if grid computations (a reply for an older
	// plan is dropped); whatIfGen is the plan gen the grid was asked for.
	whatIfSeq uint64
	whatIfGen uint64
	planGen   uint64
	// fitSeq tags the fits of the readings against the plan; fit and
	// fitErr are the last one.
	fitSeq uint64
	// fitFor is what the last fit was asked for (fitCurrent).
	fitFor fitKey
	fit    *model.Fit
	fitErr error
	// readRev counts the corrections of readings (a fit is of the readings
	// as they stand; their number alone does not say a reading changed).
	readRev uint64

	// inputs is what the plan on screen was made from (inputsKey), when the
	// job's own inputs gave a valid plan; "" otherwise. A recompute with the
	// same key changes nothing physical and is skipped (sameInputs).
	// nextInputs is the key of the inputs being computed; inputsUnits the
	// unit system the sheet is worded in.
	inputs, nextInputs string
	inputsUnits        model.System
	// sheetGen counts the sheets made; resultGen is the one the Result
	// pane shows (it is drawn again only for a new one).
	sheetGen, resultGen uint64

	showHelp bool
	// showResult: the narrow layout shows the Result in place of the
	// focused pane (= toggles it; a pane key ends it).
	showResult bool
	mouse      bool // mouse clicks select panes, fields, steps and cells
	jobs       jobList
	flash      string // one-shot hint on the help line, cleared by the next key
	width      int
	height     int
	lay        layout
	startNote  string
	firstSave  bool // a fresh job waits for its first save

	// Saving (app_save.go): each change journalled as it is made; one
	// checkpoint (the file written whole) in flight at a time, tagged by
	// saveSeq.
	noSave    bool
	saveSeq   uint64
	lastSaved time.Time
	saveErr   error
	markedAs  string // path last recorded with SetLastJob
	quitting  bool
	ps        persistState // the job's session: journal, checkpoints, lock (app_save.go)

	share Sharer // the shared job's link, or nil (share.go)
	crew  []Peer // who else is on a shared job
}

// New builds the root model for a job. It computes the first plan at once,
// so the first frame shows the answer.
func New(o Options) *Model {
	cat := o.Cat
	if cat == nil {
		cat = presets.Builtin()
	}
	now := o.Now
	if now == nil {
		now = time.Now
	}
	km := DefaultKeyMap()
	st := NewStyles(true)
	m := &Model{
		keys: km, styles: st, cat: cat, now: now,
		job: o.Start.Job, path: o.Start.Path, dir: o.Start.Dir,
		noSave: o.NoSave || o.Start.Path == "", startNote: o.Start.Note, firstSave: o.Start.Fresh,
		lower: PaneCurve, mouse: !o.NoMouse, share: o.Share,
	}
	if m.share != nil {
		m.noSave = true
	}
	if m.job.Inputs == nil {
		m.job.Inputs = map[model.FieldID]string{}
	}
	m.st.job = &m.job
	if m.job.LastGood == nil {
		m.job.CommitAll(cat) // a job from an older file: what reads as valid now is its last valid text
	}
	m.buildPanes(o.Loc)
	if m.startNote != "" {
		m.job.AddLog(now(), m.startNote)
	}
	if !m.noSave && !o.Start.Fresh {
		// Opened from its file: what is on screen is what is on disk.
		m.lastSaved, m.markedAs = now(), m.path
	}
	m.resume()
	m.recompute()
	m.resize(MinWidth, MinHeight)
	m.focusPanes()
	if m.share != nil {
		m.ps.path = m.path
		m.ps.readOnly = m.share.ReadOnly()
		m.crew = m.share.Crew()
		return m
	}
	m.startPersist(o.Start)
	return m
}

// buildPanes makes one model per pane, in the table's order.
func (m *Model) buildPanes(loc *time.Location) {
	st, km := m.styles, m.keys
	for i, p := range model.Panes() {
		f := NewFormPane(p, m.cat, st, km)
		m.forms[i] = &f
		m.panes[i] = m.forms[i]
	}
	side := NewSideView(st, m.job.Units)
	curve := NewCurveView(st, m.job.Units)
	whatif := NewWhatIfView(st, m.job.Units, km)
	checklist := NewChecklistView(st, km, nil)
	logp := NewLogPane(st, km, loc)
	jobp := NewJobPane(st, km, loc)
	m.side, m.curve, m.whatif, m.checklist, m.log, m.jobp = &side, &curve, &whatif, &checklist, &logp, &jobp
	m.panes[PaneSide], m.panes[PaneCurve], m.panes[PaneWhatIf] = m.side, m.curve, m.whatif
	m.panes[PaneChecklist], m.panes[PaneLog], m.panes[PaneJob] = m.checklist, m.log, m.jobp
	m.checklist.SetChecklist(m.job.Checklist)
	m.checklist.SetCurrent(m.job.Resume.StepID)
	m.result = NewResultPane(st)
	m.jobs = newJobList(st, km)
}

// resume puts the focus where the job was left.
func (m *Model) resume() {
	r := m.job.Resume
	if p, ok := paneByName(r.Pane); ok {
		m.focus = p
	}
	if r.Field != "" {
		for i, f := range m.forms {
			if f.SelectField(r.Field) {
				m.form = PaneID(i)
				if m.focus.isForm() {
					m.focus = m.form
				}
				break
			}
		}
	}
	if paneTable[m.focus].lower {
		m.lower = m.focus
	}
}

// Job returns a copy of the job as it stands (main saves it at exit).
func (m *Model) Job() model.Job { return m.job.Clone() }

// Path is where the job is saved ("" when saving is off).
func (m *Model) Path() string { return m.path }

// Init asks the terminal for its background colour; the first frame does
// not wait for the answer (dark is assumed until it comes).
func (m *Model) Init() tea.Cmd { return tea.Batch(tea.RequestBackgroundColor, m.refit()) }

// Update routes a message: keys first (global keys, then the focused pane,
// then the root's commands), then sizes, then typed replies to their owner.
// Every path ends by bringing the panes on screen up to date (sync).
func (m *Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	m.before(msg)
	cmd := m.update(msg)
	if m.st.hasPlan && m.st.plan.Quick && !m.typingField() {
		m.recompute() // typing ended: the ranges again
	}
	m.sync()
	return m, tea.Batch(cmd, m.whatIfCmd(), m.persist())
}

// update routes one message to its handler: one case per message type
// (cyclomatic ~27 from the switch alone; each case is a call).
func (m *Model) update(msg tea.Msg) tea.Cmd {
	switch msg := msg.(type) {
	case tea.KeyPressMsg:
		return m.key(msg)
	case tea.PasteMsg:
		return m.paste(msg.Content)
	case tea.MouseClickMsg:
		return m.click(msg.Mouse())
	case tea.WindowSizeMsg:
		m.resize(msg.Width, msg.Height)
		if m.firstSave {
			m.firstSave = false
			return m.save()
		}
		return nil
	case tea.BackgroundColorMsg:
		m.setStyles(NewStyles(msg.IsDark()))
		return nil
	case jobSavedMsg:
		return m.saved(msg)
	case jobsListedMsg:
		m.jobs.setList(msg)
		return nil
	case jobLoadedMsg:
		return m.loaded(msg)
	case whatIfMsg:
		m.whatIfReady(msg)
		return nil
	case WhatIfAdoptMsg:
		return m.adopt(msg)
	case ChecklistMarkMsg:
		return m.mark(msg)
	case ChecklistNoteMsg:
		return m.note(msg)
	case JobEditMsg:
		return m.jobEdit(msg)
	case JobChangedMsg:
		if m.share != nil {
			return m.takeShared()
		}
		return nil
	case ChecklistStepMsg:
		m.job.Resume.StepID = msg.ID
		m.job.Resume.Step = m.job.Checklist.Index(msg.ID)
		return m.save()
	case ReadingAddMsg:
		return m.addReading(msg)
	case ReadingEditMsg:
		return m.correctReading(msg)
	case FlowTestAddMsg:
		return m.addFlowTest(msg)
	case RecordWriteMsg:
		if m.share != nil && m.share.ReadOnly() {
			m.flash = "✗ " + ErrReadOnly.Error() + "; the record is written by a crew member who may change it"
			return nil
		}
		m.flash = "writing the job record…"
		return recordCmd(m.job.Clone(), m.st.plan, m.path, m.now())
	case recordWrittenMsg:
		return m.recordWritten(msg)
	case fitMsg:
		m.fitted(msg)
		return nil
	case StopMsg:
		m.job.AddLog(m.now(), stopLine(msg.Reason))
		m.ps.stopLogged = true
		m.quitting = true
		return tea.Quit
	}
	return nil
}

// sync shows the latest state to each pane on screen that has not seen it.
// Panes off screen catch up when they come on (drawing is the costly part of
// a keystroke, so a hidden pane is not drawn).
func (m *Model) sync() {
	if m.lay.TooSmall {
		return
	}
	for _, p := range m.visible() {
		if m.shown[p] != m.st.gen {
			m.panes[p].Show(&m.st)
			m.shown[p] = m.st.gen
		}
	}
	if m.resultGen != m.sheetGen {
		m.result.SetSheet(m.st.sheet, m.st.stale, m.st.problem)
		m.resultGen = m.sheetGen
	}
}

// keyFields is the field table, read once.
var keyFields = model.Fields()

// inputsKey is what model.Compute reads from the job, as it reads it: for
// each field whether it applies (model.Applies), and for each that does its
// value in SI units (a number) or the catalogue's ID (a picker), or that it
// is empty; any input that is not in the field table, as typed. Two jobs
// with the same key get the same plan in any unit system: a trailing space,
// "12" against "12 m", "Water" against "water", or a units toggle change
// nothing. ok is false when a field does not read: then the plan's errors,
// which quote the text and give ranges in the user's units, must be made
// again.
func inputsKey(j *model.Job, cat *presets.Catalogue) (key string, ok bool) {
	var b strings.Builder
	b.Grow(24 * len(keyFields))
	for _, f := range keyFields {
		b.WriteString(string(f.ID))
		if !model.Applies(j.Inputs, f.ID) {
			b.WriteString("=-;")
			continue
		}
		text := strings.TrimSpace(j.Inputs[f.ID])
		if text == "" {
			text = f.Default
		}
		switch {
		case text == "":
			b.WriteString("=;")
			continue
		case f.IsPicker():
			id, found := f.ChoiceID(text, cat)
			if !found {
				return "", false
			}
			b.WriteString("=" + id)
		default:
			v, err := f.Validate(text, j.Units)
			if err != nil {
				return "", false
			}
			b.WriteString("=" + strconv.FormatUint(math.Float64bits(v), 16))
		}
		b.WriteByte(';')
	}
	var other []string
	for id, text := range j.Inputs {
		if _, known := model.FieldByID(id); !known {
			other = append(other, string(id)+"="+text)
		}
	}
	slices.Sort(other)
	for _, o := range other {
		b.WriteString(o + ";")
	}
	// The site facts reach the plan (water that may carry oil stops the
	// drain where air starts) and the checklist built with it.
	fmt.Fprintf(&b, "facts=%+v;", j.Facts)
	// The flow tests fit the plan's losses and narrow its band.
	for _, t := range j.FlowTests {
		fmt.Fprintf(&b, "test=%x/%x@%x;", math.Float64bits(t.Volume), math.Float64bits(t.Seconds), math.Float64bits(t.Level))
	}
	return b.String(), true
}

// sameInputs reports whether the job's inputs read as those the valid plan
// on screen was made from, so that recompute has nothing to do; in another
// unit system only the sheet's words are made again. Otherwise it keeps the
// key for keepInputs.
func (m *Model) sameInputs() bool {
	key, ok := inputsKey(&m.job, m.cat)
	m.nextInputs = ""
	if ok && m.typingField() {
		key += "|quick" // the ranges are left out while a field is typed in
	}
	if ok {
		m.nextInputs = key
	}
	if !ok || key != m.inputs || !m.st.hasPlan || m.st.stale {
		return false
	}
	if m.job.Units != m.inputsUnits {
		m.st.sheet = present.ForJob(m.job, m.st.plan, m.job.Units)
		m.inputsUnits = m.job.Units
		m.sheetGen++
	}
	m.touch()
	return true
}

// typingField reports whether a field is being typed in: the plan then
// leaves out the flow and time ranges (model.ComputeQuick), which are
// worked out when the typing ends.
func (m *Model) typingField() bool {
	return m.focus.isForm() && m.forms[m.focus].Editing()
}

// keepInputs records what the plan just made was made from: the key when
// the job's own inputs gave it (valid), else nothing, so the next recompute
// runs.
func (m *Model) keepInputs(valid bool) {
	m.inputs, m.inputsUnits = "", m.job.Units
	if valid {
		m.inputs = m.nextInputs
	}
	m.sheetGen++
}

// fitKey is what a fit of the readings is made from: the plan, the number
// of readings and flow tests (they are added), and the corrections made.
type fitKey struct {
	plan     uint64
	readings int
	tests    int
	rev      uint64
}

// fitCurrent reports whether the last fit asked for was of this plan and
// these readings, so that no new fit is needed (a fit of 10,000 readings
// takes tens of milliseconds, and focusing the Log asks for one); the
// summary is worded again, in case the units changed.
func (m *Model) fitCurrent() bool {
	k := fitKey{m.planGen, len(m.job.Readings), len(m.job.FlowTests), m.readRev}
	if m.fitSeq == 0 || m.fitFor != k {
		m.fitFor = k
		return false
	}
	m.showReadings()
	return true
}

// visible lists the panes on screen for the present layout and focus.
func (m *Model) visible() []PaneID {
	if !m.lay.Wide {
		return []PaneID{m.focus}
	}
	form := m.focus
	if !form.isForm() {
		form = m.form
	}
	return []PaneID{form, PaneSide, m.lowerPane()}
}

// lowerPane is the pane in the lower strip of a wide screen.
func (m *Model) lowerPane() PaneID {
	if m.lower == PaneSide || !paneTable[m.lower].lower {
		return PaneCurve
	}
	return m.lower
}

// touch records a change of the job that the panes must show.
func (m *Model) touch() {
	m.job.Updated = m.now()
	m.st.gen++
}

// focusPanes gives the focused pane the focus and takes it from the rest.
func (m *Model) focusPanes() {
	if m.focus.isForm() {
		m.form = m.focus
	}
	for i, p := range m.panes {
		if PaneID(i) == m.focus {
			p.Focus()
		} else {
			p.Blur()
		}
	}
}

func (m *Model) setStyles(st Styles) {
	m.styles = st
	for _, p := range m.panes {
		p.SetStyles(st)
	}
	m.result.SetStyles(st)
	m.jobs.styles = st
	m.st.gen++
}

// loc is the zone times are shown in.
func (m *Model) loc() *time.Location { return m.log.loc }
