package tui

import (
	"errors"
	"strconv"
	"strings"
	"time"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"
	"github.com/charmbracelet/x/ansi"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/presets"
)

// PaneID names a pane of the screen. The zero value is a real pane (Hose).
type PaneID int

// The panes, in tab order; the digit keys 1–9 select them.
const (
	PaneHose PaneID = iota
	PaneLift
	PaneLiquid
	PaneTank
	PaneSide
	PaneCurve
	PaneWhatIf
	PaneChecklist
	PaneLog
	paneCount
)

// paneNames are the tab titles and the names stored in Job.Resume.Pane.
var paneNames = [paneCount]string{"Hose", "Lift & outlet", "Liquid & site", "Tank", "Side view",
	"Drain curve", "What-if", "Checklist", "Log"}

// paneShort are the tab titles on a narrow screen.
var paneShort = [paneCount]string{"Hose", "Lift", "Liquid", "Tank", "Side", "Curve", "What-if", "Checks", "Log"}

func (p PaneID) String() string {
	if p < 0 || p >= paneCount {
		return "Pane(" + strconv.Itoa(int(p)) + ")"
	}
	return paneNames[p]
}

// isForm reports whether the pane is one of the four input forms.
func (p PaneID) isForm() bool { return p >= PaneHose && p <= PaneTank }

func paneByName(name string) (PaneID, bool) {
	for i, n := range paneNames {
		if strings.EqualFold(n, name) {
			return PaneID(i), true
		}
	}
	return PaneHose, false
}

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
}

// Model is the root of the screen and the only tea.Model: it routes
// messages, owns the job and the last plan, and lays out the panes.
type Model struct {
	keys   KeyMap
	styles Styles
	cat    *presets.Catalogue
	now    func() time.Time

	job  model.Job
	path string
	dir  string

	// plan is the last valid plan; stale is set while the inputs have an
	// error (the plan stays on screen, marked).
	plan    model.Plan
	hasPlan bool
	stale   bool
	errs    map[model.FieldID]error
	// lastGood is the input text of the last valid plan (ctrl+r puts a
	// field back to it).
	lastGood map[model.FieldID]string
	// drawnDirty: the drawn views have not yet seen the last plan.
	drawnDirty bool

	focus     PaneID
	lower     PaneID // wide screens: the view shown in the lower strip
	form      PaneID // the form last focused (shown on wide screens meanwhile)
	forms     [4]FormPane
	result    ResultPane
	side      SideView
	curve     CurveView
	whatif    WhatIfView
	checklist ChecklistView
	// whatIfSeq tags the What-if grid computations; a reply for an older
	// plan is dropped.
	whatIfSeq   uint64
	whatIfDirty bool
	log         LogPane
	// fitSeq tags the fits of the readings against the plan; fit and
	// fitErr are the last one.
	fitSeq    uint64
	fit       *model.Fit
	fitErr    error
	showHelp  bool
	jobs      jobList
	flash     string // one-shot hint on the help line, cleared by the next key
	width     int
	height    int
	lay       layout
	startNote string
	firstSave bool // a fresh job waits for its first save

	// Saving: one save in flight at a time; a change during a save marks
	// the job dirty and another save follows.
	noSave    bool
	saveSeq   uint64
	saving    bool
	dirty     bool
	lastSaved time.Time
	saveErr   error
	markedAs  string // path last recorded with SetLastJob
	quitting  bool
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
		lower: PaneCurve,
	}
	if m.job.Inputs == nil {
		m.job.Inputs = map[model.FieldID]string{}
	}
	for i, p := range model.Panes() {
		m.forms[i] = NewFormPane(p, cat, st, km)
	}
	ds := NewDrawStyles(st)
	m.result = NewResultPane(st)
	m.side = NewSideView(ds, m.job.Units)
	m.curve = NewCurveView(ds, m.job.Units)
	m.whatif = NewWhatIfView(ds, m.job.Units)
	m.checklist = NewChecklistView(ds)
	m.checklist.SetChecklist(m.job.Checklist)
	m.checklist.SetCurrent(m.job.Resume.StepID)
	m.log = NewLogPane(st, km, o.Loc)
	m.jobs = newJobList(st, km)
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
	m.focusViews()
	return m
}

// focusViews gives the keyed views (What-if, Checklist) the focus when
// they are the focused pane.
func (m *Model) focusViews() {
	if m.focus.isForm() {
		m.form = m.focus
	}
	for i := range m.forms {
		m.forms[i].SetActive(PaneID(i) == m.focus)
	}
	m.redrawForm()
	if m.focus == PaneWhatIf {
		m.whatif.Focus()
	} else {
		m.whatif.Blur()
	}
	if m.focus == PaneChecklist {
		m.checklist.Focus()
	} else {
		m.checklist.Blur()
	}
}

// resume puts the focus where the job was left.
func (m *Model) resume() {
	r := m.job.Resume
	if p, ok := paneByName(r.Pane); ok {
		m.focus = p
	}
	if r.Field != "" {
		for i := range m.forms {
			if m.forms[i].SelectField(r.Field) {
				m.form = PaneID(i)
				if m.focus.isForm() {
					m.focus = m.form
				}
				break
			}
		}
	}
	if !m.focus.isForm() && m.focus != PaneSide {
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

// Update routes a message: global keys first, then sizes, then typed
// replies to their owner, then everything else to the focused pane.
func (m *Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case tea.KeyPressMsg:
		return m.key(msg)
	case tea.WindowSizeMsg:
		m.resize(msg.Width, msg.Height)
		var save tea.Cmd
		if m.firstSave {
			m.firstSave = false
			save = m.save()
		}
		return m, tea.Batch(m.whatIfCmd(), save)
	case tea.BackgroundColorMsg:
		m.setStyles(NewStyles(msg.IsDark()))
		return m, nil
	case jobSavedMsg:
		return m.saved(msg)
	case jobsListedMsg:
		m.jobs.setList(msg)
		return m, nil
	case jobLoadedMsg:
		return m.loaded(msg)
	case whatIfMsg:
		if msg.seq == m.whatIfSeq {
			if msg.err != nil || !msg.ok {
				m.whatif.ClearTable()
			} else {
				m.whatif.SetTable(msg.table)
			}
		}
		return m, nil
	case WhatIfAdoptMsg:
		return m.adopt(msg)
	case ChecklistMarkMsg:
		return m.mark(msg)
	case ChecklistNoteMsg:
		if err := m.job.Checklist.SetNote(msg.ID, msg.Note); err != nil {
			m.flash = err.Error()
			return m, nil
		}
		m.job.Updated = m.now()
		m.checklist.SetChecklist(m.job.Checklist)
		return m, m.save()
	case ChecklistStepMsg:
		m.job.Resume.StepID = msg.ID
		m.job.Resume.Step = m.job.Checklist.Index(msg.ID)
		return m, m.save()
	case ReadingAddMsg:
		return m.addReading(msg)
	case RecordWriteMsg:
		m.flash = "writing the job record…"
		return m, recordCmd(m.job.Clone(), m.plan, m.path, m.now())
	case recordWrittenMsg:
		if msg.err != nil {
			m.flash = "✗ record not written: " + msg.err.Error()
			return m, nil
		}
		m.flash = "record written: " + strings.Join(msg.paths, ", ")
		m.job.AddLog(m.now(), "job record written: "+strings.Join(msg.paths, ", "))
		m.log.SetEntries(m.job.Log)
		return m, m.save()
	case fitMsg:
		if msg.seq == m.fitSeq {
			m.fit, m.fitErr = nil, msg.err
			if msg.err == nil {
				f := msg.fit
				m.fit = &f
			}
			m.log.SetSummary(readingsSummary(&m.job, m.fit, m.fitErr, m.loc()))
		}
		return m, nil
	case StopMsg:
		m.job.AddLog(m.now(), "stopped ("+msg.Reason+"); job saved")
		m.quitting = true
		return m, tea.Quit
	}
	return m, nil
}

func (m *Model) setStyles(st Styles) {
	m.styles = st
	for i := range m.forms {
		m.forms[i].SetStyles(st)
	}
	ds := NewDrawStyles(st)
	m.result.SetStyles(st)
	m.side.SetStyles(ds)
	m.curve.SetStyles(ds)
	m.whatif.SetStyles(ds)
	m.checklist.SetStyles(ds)
	m.log.SetStyles(st)
	m.jobs.styles = st
}

// typing reports whether keys go into a text field (letters are text).
func (m *Model) typing() bool {
	if m.jobs.open || m.showHelp {
		return false
	}
	if m.focus.isForm() {
		f := m.forms[m.focus]
		return f.Editing() && !f.SelectedIsPicker()
	}
	return (m.focus == PaneChecklist && m.checklist.Typing()) || (m.focus == PaneLog && m.log.Typing())
}

func (m *Model) key(msg tea.KeyPressMsg) (tea.Model, tea.Cmd) {
	m.flash = ""
	k := m.keys
	// Keys that work everywhere, also while typing.
	switch {
	case key.Matches(msg, k.Quit):
		return m.quit()
	case key.Matches(msg, k.SaveNow):
		return m, m.save()
	case key.Matches(msg, k.UnitsAny):
		return m.toggleUnits()
	}
	// Overlays.
	if m.showHelp {
		if key.Matches(msg, k.Help, k.Leave, k.QuitNav) || msg.String() == "enter" {
			m.showHelp = false
		}
		return m, nil
	}
	if m.jobs.open {
		return m.jobKey(msg)
	}
	typing := m.typing()
	// The focused view's own keys come before the navigate letters (the
	// Checklist's s is "skip" there, not "save").
	switch m.focus {
	case PaneChecklist:
		if typing || key.Matches(msg, m.checklist.ShortHelp()...) {
			var cmd tea.Cmd
			m.checklist, cmd = m.checklist.Update(msg)
			return m, cmd
		}
	case PaneWhatIf:
		if key.Matches(msg, m.whatif.ShortHelp()...) {
			var cmd tea.Cmd
			m.whatif, cmd = m.whatif.Update(msg)
			return m, cmd
		}
	case PaneLog:
		if typing || key.Matches(msg, m.log.ShortHelp()...) {
			var cmd tea.Cmd
			m.log, cmd = m.log.Update(msg)
			return m, cmd
		}
	case PaneHose, PaneLift, PaneLiquid, PaneTank, PaneSide, PaneCurve, paneCount:
	}
	if !typing {
		switch {
		case key.Matches(msg, k.QuitNav):
			return m.quit()
		case key.Matches(msg, k.Help):
			m.showHelp = true
			return m, nil
		case key.Matches(msg, k.Units):
			return m.toggleUnits()
		case key.Matches(msg, k.Save):
			m.flash = "saving now (every change is saved anyway)"
			return m, m.save()
		case key.Matches(msg, k.Open):
			m.jobs.open = true
			m.jobs.loading = true
			return m, listJobsCmd(m.dir)
		case key.Matches(msg, k.NextPane):
			return m, m.setFocus((m.focus + 1) % paneCount)
		case key.Matches(msg, k.PrevPane):
			return m, m.setFocus((m.focus + paneCount - 1) % paneCount)
		}
		for i, b := range k.PaneKeys {
			if key.Matches(msg, b) {
				return m, m.setFocus(PaneID(i))
			}
		}
	}
	if m.focus.isForm() {
		return m.formKey(msg)
	}
	switch m.focus {
	case PaneLog:
		m.log, _ = m.log.Update(msg)
	case PaneHose, PaneLift, PaneLiquid, PaneTank, PaneSide, PaneCurve, PaneWhatIf, PaneChecklist, paneCount:
	}
	if !typing && msg.Text != "" && !key.Matches(msg, k.Up, k.Down) {
		m.flash = "“" + msg.Text + "” does nothing here. Keys: 1–4 forms, 5–9 views, ? all keys"
	}
	return m, nil
}

// formKey handles a key in a form pane.
func (m *Model) formKey(msg tea.KeyPressMsg) (tea.Model, tea.Cmd) {
	k := m.keys
	f := &m.forms[m.focus]
	switch {
	case key.Matches(msg, k.NextField):
		m.moveField(+1)
		return m, m.saveResume()
	case key.Matches(msg, k.PrevField):
		m.moveField(-1)
		return m, m.saveResume()
	case key.Matches(msg, k.Leave):
		if f.Editing() {
			f.StopEditing()
		} else {
			m.flash = "navigate mode: press enter to type in the marked field"
		}
		return m, nil
	}
	picker := f.SelectedIsPicker()
	if !picker && f.Editing() {
		switch {
		case msg.String() == "up" || msg.String() == "down":
			if msg.String() == "up" {
				m.moveInPane(-1)
			} else {
				m.moveInPane(+1)
			}
			return m, m.saveResume()
		case key.Matches(msg, k.Edit):
			f.StopEditing()
			return m, nil
		case key.Matches(msg, k.Restore):
			return m.restoreField()
		}
		var edit *FieldEdit
		var cmd tea.Cmd
		cmd, edit = f.Update(msg)
		if edit != nil {
			return m.applyEdit(*edit, cmd)
		}
		return m, cmd
	}
	// Navigate mode (or a picker, where letters are still commands).
	switch {
	case key.Matches(msg, k.Up):
		m.moveInPane(-1)
		return m, m.saveResume()
	case key.Matches(msg, k.Down):
		m.moveInPane(+1)
		return m, m.saveResume()
	case !picker && key.Matches(msg, k.Edit):
		f.StartEditing()
		return m, nil
	}
	if picker {
		var edit *FieldEdit
		_, edit = f.Update(msg)
		if edit != nil {
			return m.applyEdit(*edit, nil)
		}
		return m, nil
	}
	if msg.Text != "" {
		m.flash = "not typing: press enter first to type in “" + f.Selected().Label + "”"
	}
	return m, nil
}

// moveField moves the selection within the form, and on into the next or
// previous form at either end.
func (m *Model) moveField(d int) { m.move(d, true) }

// moveInPane moves the selection within the form only (↑/↓ stop at the
// ends; tab and shift-tab go on into the next form).
func (m *Model) moveInPane(d int) { m.move(d, false) }

func (m *Model) move(d int, cross bool) {
	f := &m.forms[m.focus]
	editing := f.Editing()
	if f.Move(d) || !cross {
		return
	}
	f.StopEditing()
	next := (int(m.focus) + d + 4) % 4
	m.focus = PaneID(next)
	m.focusViews()
	nf := &m.forms[next]
	if d > 0 {
		nf.First()
	} else {
		nf.Last()
	}
	if editing {
		nf.StartEditing()
	}
}

// setFocus selects a pane.
func (m *Model) setFocus(p PaneID) tea.Cmd {
	if m.focus.isForm() {
		m.forms[m.focus].StopEditing()
	}
	m.focus = p
	if !p.isForm() && p != PaneSide {
		m.lower = p
	}
	m.focusViews()
	m.syncDrawn()
	var fit tea.Cmd
	if p == PaneLog {
		fit = m.refit() // the plan may have changed since the last fit
	}
	return tea.Batch(m.saveResume(), m.whatIfCmd(), fit)
}

// applyEdit stores the new text, recomputes and saves.
func (m *Model) applyEdit(e FieldEdit, cmd tea.Cmd) (tea.Model, tea.Cmd) {
	_ = m.job.Set(e.ID, e.Text) // the error comes back with the plan's field errors
	m.job.Updated = m.now()
	if e.ID == model.FieldTankPreset {
		if t, ok := m.cat.Tank(e.Text); ok {
			if prev := m.job.TankSizesText(); prev != "" {
				// Keep what was typed before the catalogue replaced it.
				m.job.AddLog(m.now(), "tank before the catalogue choice: "+prev)
				m.log.SetEntries(m.job.Log)
			}
			m.job.ApplyTankPreset(t)
			m.flash = "tank set from the catalogue: " + t.Name + "; now set the liquid level"
		}
	}
	if e.ID == model.FieldLiquid || e.ID == model.FieldPriming {
		m.recompute()
		m.rebuildChecklist(e.ID)
	}
	m.recompute()
	return m, tea.Batch(cmd, m.save(), m.whatIfCmd())
}

// restoreField puts back the field's text from the last valid plan's job
// when the field is invalid (ctrl+r).
func (m *Model) restoreField() (tea.Model, tea.Cmd) {
	f := &m.forms[m.focus]
	id := f.Selected().ID
	if m.errs[id] == nil {
		m.flash = "nothing to undo: the field is valid"
		return m, nil
	}
	old, ok := m.lastGood[id]
	if !ok {
		m.flash = "no earlier valid text for this field"
		return m, nil
	}
	return m.applyEdit(FieldEdit{ID: id, Text: old}, nil)
}

// rebuildChecklist adapts the checklist to a new liquid or priming method,
// keeping every recorded mark (model.Checklist.Rebuild).
func (m *Model) rebuildChecklist(changed model.FieldID) {
	ctx := m.job.Checklist.Context
	switch changed {
	case model.FieldPriming:
		pm, err := model.ParsePrimingMethod(m.job.Choice(model.FieldPriming))
		if err != nil {
			return
		}
		ctx.Method = pm
	case model.FieldLiquid:
		if !m.plan.Liquid.Valid() || m.stale {
			return
		}
		h := model.HazardsFromPresets(m.plan.Hazards, m.plan.Liquid.Class)
		// Site-confirmed flags stay: the crew set them for this water.
		h.Environmental = h.Environmental || ctx.Hazards.Environmental
		h.Biohazard = h.Biohazard || ctx.Hazards.Biohazard
		ctx.Hazards = h
		ctx.Liquid = m.plan.Liquid.Name
	}
	ctx.Strokes = m.plan.PumpStrokes
	m.job.Checklist = m.job.Checklist.Rebuild(ctx)
}

// recompute runs model.Compute and hands the outcome to the panes. It is
// the only place the plan changes.
func (m *Model) recompute() {
	p := model.Compute(m.job, m.cat)
	m.errs = p.FieldErrors
	if p.OK() {
		m.plan, m.hasPlan, m.stale = p, true, false
		if m.lastGood == nil {
			m.lastGood = map[model.FieldID]string{}
		}
		for k := range m.lastGood {
			delete(m.lastGood, k)
		}
		for k, v := range m.job.Inputs {
			m.lastGood[k] = v
		}
	} else {
		m.stale = true
		if len(m.errs) == 0 && p.Err != nil {
			m.errs = map[model.FieldID]error{model.FieldHoseID: p.Err}
		}
	}
	m.refresh()
}

// refresh gives every pane what it shows from the job and the plan.
func (m *Model) refresh() {
	for i := range m.forms {
		m.forms[i].SetJob(&m.job, m.errs)
	}
	m.redrawForm()
	sys := m.job.Units
	rd := ResultData{}
	if m.hasPlan {
		rd = planToResult(m.plan)
		rd.Hazards = hazardWords(m.plan.Hazards, m.job.Checklist.Context.Hazards)
	}
	rd.Stale = m.stale
	if m.stale {
		rd.StaleField = m.firstError()
	}
	m.result.SetData(rd, sys)
	m.drawnDirty = true
	m.whatIfDirty = true
	m.syncDrawn()
	m.checklist.SetChecklist(m.job.Checklist)
	m.log.SetEntries(m.job.Log)
}

// redrawForm brings the rows of the form on screen up to date (the others
// are drawn when they are shown).
func (m *Model) redrawForm() {
	f := m.focus
	if !f.isForm() {
		if !m.lay.Wide {
			return
		}
		f = PaneID(m.lastForm())
	}
	m.forms[f].renderRows()
}

// syncDrawn hands the plan to the drawn views (Side view, Drain curve) when
// they are on screen; drawing them is the costly part of a keystroke, so a
// hidden view is brought up to date only when it is shown.
func (m *Model) syncDrawn() {
	if !m.drawnDirty {
		return
	}
	sideOn := m.lay.Wide || m.focus == PaneSide
	curveOn := m.focus == PaneCurve || (m.lay.Wide && (m.lower == PaneCurve || m.lower == PaneSide))
	if !sideOn && !curveOn {
		return
	}
	if m.hasPlan {
		m.side.SetGeometry(planToSide(m.plan, &m.job))
		if c, ok := planToCurve(m.plan); ok {
			m.curve.SetCurve(c)
		} else {
			m.curve.ClearCurve()
		}
	} else {
		m.side.ClearGeometry()
		m.curve.ClearCurve()
	}
	m.drawnDirty = false
}

// firstError is the message of the first invalid field in screen order.
func (m *Model) firstError() string {
	for _, f := range model.Fields() {
		if err := m.errs[f.ID]; err != nil {
			return f.Pane.String() + " › " + fieldMessage(f, err)
		}
	}
	return ""
}

func (m *Model) toggleUnits() (tea.Model, tea.Cmd) {
	sys := model.US
	if m.job.Units == model.US {
		sys = model.SI
	}
	m.job.SetUnits(sys)
	m.job.Updated = m.now()
	m.job.AddLog(m.job.Updated, "units switched to "+sys.String())
	m.side.SetUnits(sys)
	m.curve.SetUnits(sys)
	m.whatif.SetUnits(sys)
	m.recompute()
	m.flash = "units: " + sysName(sys) + "; what you typed keeps its unit"
	return m, tea.Batch(m.save(), m.whatIfCmd())
}

func sysName(s model.System) string {
	if s == model.US {
		return "US (ft, in, psi, °F, gal)"
	}
	return "SI (m, mm, kPa, °C, L)"
}

// quit saves (the last save happens in main after the program ends too)
// and quits.
func (m *Model) quit() (tea.Model, tea.Cmd) {
	m.quitting = true
	return m, tea.Quit
}

// save starts a save of a copy of the job, or marks the job dirty when a
// save is in flight.
func (m *Model) save() tea.Cmd {
	if m.noSave {
		return nil
	}
	if m.saving {
		m.dirty = true
		return nil
	}
	m.saving, m.dirty = true, false
	m.saveSeq++
	mark := m.markedAs != m.path
	return saveCmd(m.path, m.job.Clone(), m.saveSeq, mark)
}

// saveResume records where the technician is, then saves.
func (m *Model) saveResume() tea.Cmd {
	r := &m.job.Resume
	r.Pane = m.focus.String()
	if m.focus.isForm() {
		r.Field = m.forms[m.focus].Selected().ID
	}
	if id := m.checklist.CurrentID(); id != "" {
		r.StepID, r.Step = id, m.job.Checklist.Index(id)
	}
	return m.save()
}

func (m *Model) saved(msg jobSavedMsg) (tea.Model, tea.Cmd) {
	if msg.seq != m.saveSeq {
		return m, nil // stale reply
	}
	m.saving = false
	m.saveErr = msg.err
	if msg.err == nil {
		m.lastSaved = msg.at
		m.markedAs = msg.path
	}
	if m.dirty {
		return m, m.save()
	}
	return m, nil
}

func (m *Model) loaded(msg jobLoadedMsg) (tea.Model, tea.Cmd) {
	if msg.err != nil {
		m.jobs.err = msg.err
		return m, nil
	}
	m.jobs.open = false
	m.job = msg.job
	if m.job.Inputs == nil {
		m.job.Inputs = map[model.FieldID]string{}
	}
	m.path = msg.path
	m.markedAs = ""
	m.hasPlan = false
	m.side.SetUnits(m.job.Units)
	m.curve.SetUnits(m.job.Units)
	m.whatif.SetUnits(m.job.Units)
	m.checklist = NewChecklistView(NewDrawStyles(m.styles))
	m.checklist.SetChecklist(m.job.Checklist)
	m.checklist.SetCurrent(m.job.Resume.StepID)
	m.resume()
	m.recompute()
	m.resize(m.width, m.height)
	m.focusViews()
	return m, tea.Batch(m.save(), m.whatIfCmd())
}

// resize lays the panes out for a w×h terminal.
func (m *Model) resize(w, h int) {
	m.width, m.height = w, h
	m.lay = newLayout(w, h)
	l := m.lay
	if l.TooSmall {
		return
	}
	for i := range m.forms {
		m.forms[i].SetSize(l.Main.W, l.Main.H)
	}
	m.result.SetSize(l.Result.W, l.Result.H)
	if l.Wide {
		m.side.SetSize(l.Side.W, l.Side.H)
		m.curve.SetSize(l.Lower.W, l.Lower.H)
		m.log.SetSize(l.Lower.W, l.Lower.H)
		m.whatif.SetSize(l.Lower.W, l.Lower.H)
		m.checklist.SetSize(l.Lower.W, l.Lower.H)
	} else {
		m.side.SetSize(l.Main.W, l.Main.H)
		m.curve.SetSize(l.Main.W, l.Main.H)
		m.log.SetSize(l.Main.W, l.Main.H)
		m.whatif.SetSize(l.Main.W, l.Main.H)
		m.checklist.SetSize(l.Main.W, l.Main.H)
	}
	m.jobs.w, m.jobs.h = l.Main.W, l.Main.H
	m.redrawForm()
	m.syncDrawn()
}

// View draws the screen. It only formats what Update computed.
func (m *Model) View() tea.View {
	v := tea.NewView("")
	v.AltScreen = true
	v.WindowTitle = "drawdown"
	if m.quitting {
		return v
	}
	l := m.lay
	if l.TooSmall {
		v.SetContent(tooSmall(m.width, m.height))
		return v
	}
	rows := make([]string, 0, l.H)
	rows = append(rows, m.headerView(), m.tabsView())
	if m.showHelp {
		rows = append(rows, strings.Split(m.fullHelpView(l.W, l.H-3), "\n")...)
	} else {
		main := m.mainView(l.Main.W, l.Main.H)
		res := m.result.View()
		if l.Wide {
			rows = append(rows, joinColumns(main, res, m.side.View())...)
			rows = append(rows, strings.Split(m.lowerView(), "\n")...)
		} else {
			rows = append(rows, joinColumns(main, res)...)
		}
	}
	rows = append(rows, m.helpLine())
	v.SetContent(strings.Join(rows, "\n"))
	if c := m.cursor(); c != nil {
		v.Cursor = c
	}
	return v
}

// cursor is the real terminal cursor in the field being typed in.
func (m *Model) cursor() *tea.Cursor {
	if m.showHelp || m.jobs.open {
		return nil
	}
	if !m.focus.isForm() {
		var c *tea.Cursor
		switch m.focus {
		case PaneLog:
			c = m.log.CursorPos()
		case PaneChecklist:
			c = m.checklist.CursorPos()
		case PaneHose, PaneLift, PaneLiquid, PaneTank, PaneSide, PaneCurve, PaneWhatIf, paneCount:
		}
		if c == nil {
			return nil
		}
		at := m.lay.Main
		if m.lay.Wide {
			at = m.lay.Lower
		}
		c.X += at.X
		c.Y += at.Y
		c.Blink = false
		return c
	}
	c := m.forms[m.focus].CursorPos()
	if c == nil {
		return nil
	}
	c.X += m.lay.Main.X
	c.Y += m.lay.Main.Y
	c.Blink = false
	return c
}

func (m *Model) mainView(w, h int) string {
	if m.jobs.open {
		return m.jobs.View()
	}
	if m.lay.Wide {
		f := m.focus
		if !f.isForm() {
			f = PaneID(m.lastForm())
		}
		return m.forms[f].View()
	}
	switch m.focus {
	case PaneHose, PaneLift, PaneLiquid, PaneTank:
		return m.forms[m.focus].View()
	case PaneSide:
		return m.side.View()
	case PaneCurve:
		return m.curve.View()
	case PaneLog:
		return m.log.View()
	case PaneWhatIf:
		return m.whatif.View()
	case PaneChecklist:
		return m.checklist.View()
	case paneCount:
	}
	return fitBlock(nil, w, h)
}

// lastForm is the form shown on a wide screen while a view has the focus.
func (m *Model) lastForm() int { return int(m.form) }

func (m *Model) lowerView() string {
	l := m.lay.Lower
	switch m.lower {
	case PaneLog:
		return m.log.View()
	case PaneCurve, PaneSide:
		return m.curve.View()
	case PaneWhatIf:
		return m.whatif.View()
	case PaneChecklist:
		return m.checklist.View()
	case PaneHose, PaneLift, PaneLiquid, PaneTank, paneCount:
	}
	return fitBlock(nil, l.W, l.H)
}

// headerView is the top line: program, job, units, save state and mode.
func (m *Model) headerView() string {
	st := m.styles
	mode := st.fast.Mode.Render(" NAVIGATE ")
	if m.typing() {
		mode = st.fast.Mode.Render(" TYPING ")
	}
	var save string
	switch {
	case m.noSave:
		save = st.fast.Warning.Render("! not saving")
	case m.saveErr != nil:
		save = st.fast.Danger.Render("✗ NOT SAVED")
	case !m.lastSaved.IsZero():
		// Kept while the next save runs (a few milliseconds): a mark that
		// flickers on every keystroke costs bytes and says nothing.
		save = st.fast.OK.Render("✓ saved")
	default:
		save = st.fast.Muted.Render("· unchanged")
	}
	right := st.fast.Title.Render(m.job.Units.String()) + "  " + save + " " + mode
	left := st.fast.Title.Render("drawdown") + st.fast.Muted.Render(" · ")
	room := m.lay.W - ansi.StringWidth(left) - ansi.StringWidth(right) - 1
	name := m.job.Name
	if name == "" {
		name = "(unnamed job)"
	}
	left += st.fast.Value.Render(ansi.Truncate(name, max(room, 0), "…"))
	gap := max(m.lay.W-ansi.StringWidth(left)-ansi.StringWidth(right), 0)
	return fitBlock([]string{left + strings.Repeat(" ", gap) + right}, m.lay.W, 1)
}

// tabsView is the pane selector: digit and name, the selected one in
// inverse (reverse) display and brackets (legible without colour).
func (m *Model) tabsView() string {
	st := m.styles
	names := paneNames
	if m.lay.W < 110 {
		names = paneShort
	}
	var b strings.Builder
	for i := PaneID(0); i < paneCount; i++ {
		if i == PaneSide {
			b.WriteString(st.fast.Muted.Render("│"))
		}
		label := strconv.Itoa(int(i)+1) + " " + names[i]
		switch {
		case i == m.focus:
			b.WriteString(st.fast.TabActive.Render("[" + label + "]"))
		case m.lay.Wide && i == m.lower:
			b.WriteString(st.fast.Tab.Render("(" + label + ")"))
		default:
			b.WriteString(st.fast.Tab.Render(" " + label + " "))
		}
	}
	return fitBlock([]string{b.String()}, m.lay.W, 1)
}

// helpLine is the one-line help for the present state, or a one-shot hint.
func (m *Model) helpLine() string {
	if m.flash != "" {
		return fitBlock([]string{m.styles.fast.Warning.Render("! " + m.flash)}, m.lay.W, 1)
	}
	if m.saveErr != nil {
		return fitBlock([]string{m.styles.fast.Danger.Render("✗ not saved: " + m.saveErr.Error())}, m.lay.W, 1)
	}
	var b []key.Binding
	switch {
	case m.showHelp:
		b = []key.Binding{m.keys.CloseHelp}
	case m.jobs.open:
		b = m.jobs.ShortHelp()
	case m.focus.isForm():
		b = m.forms[m.focus].ShortHelp()
	case m.focus == PaneLog:
		b = m.log.ShortHelp()
		if !m.log.Typing() {
			b = append(b, m.keys.shortHelp(false, false, false)...)
		}
	case m.focus == PaneChecklist:
		b = m.checklist.ShortHelp()
		if !m.checklist.Typing() {
			b = append(b, m.keys.Panes, m.keys.QuitNav)
		}
	case m.focus == PaneWhatIf:
		b = append(m.whatif.ShortHelp(), m.keys.Panes, m.keys.QuitNav)
	default:
		b = m.keys.shortHelp(false, false, false)
	}
	return shortHelpLine(m.styles, b, m.lay.W)
}

// joinColumns puts blocks of equal height side by side, line by line.
func joinColumns(blocks ...string) []string {
	split := make([][]string, len(blocks))
	n := 0
	for i, b := range blocks {
		split[i] = strings.Split(b, "\n")
		n = max(n, len(split[i]))
	}
	out := make([]string, n)
	for r := 0; r < n; r++ {
		var sb strings.Builder
		for _, s := range split {
			if r < len(s) {
				sb.WriteString(s[r])
			}
		}
		out[r] = sb.String()
	}
	return out
}

// tooSmall is the whole screen when the terminal is below 80×24.
func tooSmall(w, h int) string {
	if w <= 0 || h <= 0 {
		return ""
	}
	msg := "Terminal too small: need at least " + strconv.Itoa(MinWidth) + "×" + strconv.Itoa(MinHeight) +
		", now " + strconv.Itoa(w) + "×" + strconv.Itoa(h) + ". Enlarge the window, or use drawdown calc. ctrl+c quits."
	return fitBlock(wrapText(msg, w, h), w, h)
}

// Conversions from the plan to what the panes show. These run in Update
// (through refresh), never in View.

// hazardWords names the liquid's hazards (catalogue at this temperature,
// plus those the crew recorded for the job) for the Result pane's caution
// line; the Checklist carries the steps and the cautions in full.
func hazardWords(p presets.Hazards, j model.Hazards) []string {
	var out []string
	add := func(on bool, w string) {
		if on {
			out = append(out, w)
		}
	}
	add(p.Has(presets.Flammable) || j.Flammable, "flammable")
	add(!p.Has(presets.Flammable) && !j.Flammable && (p.Has(presets.Combustible) || j.Combustible), "combustible")
	add(p.Has(presets.Toxic) || j.Toxic, "toxic")
	add(p.Has(presets.Biohazard) || j.Biohazard, "sewage/biohazard")
	add(p.Has(presets.Environmental) || j.Environmental, "inspect before release")
	add(p.Has(presets.Hot) || j.Hot, "hot")
	add(p.Has(presets.FreezingRisk) || j.FreezingRisk, "may freeze")
	return out
}

// planToResult picks the Result pane's figures from a valid plan.
func planToResult(p model.Plan) ResultData {
	r := p.Result
	d := ResultData{
		Valid:         true,
		Verdict:       r.Verdict,
		Flow:          float64(r.Flow),
		FlowLow:       float64(p.FlowLow),
		FlowHigh:      float64(p.FlowHigh),
		Hoses:         p.Siphon.Hoses,
		Velocity:      float64(r.Velocity),
		Regime:        r.Regime.String(),
		Reynolds:      r.Reynolds,
		Friction:      r.FrictionFactor,
		Head:          float64(r.Head),
		CrestPressure: float64(r.CrestPressure),
		Notes:         p.Notes,
		Lift:          float64(p.Siphon.Geometry.Lift()),
		MaxCrest:      float64(r.MaxCrestHeight),
		FlowingLimit:  float64(r.FlowingCrestLimit),
		WorkingLimit:  float64(r.WorkingCrestHeight),
		Margin:        float64(r.CrestMargin),
		PrimingVolume: float64(r.PrimingVolume),
		Strokes:       p.PumpStrokes,
	}
	d.HasBand = d.FlowHigh > d.FlowLow && d.FlowLow > 0
	d.Why = model.VerdictReason(r)
	if dp := p.Drain; dp != nil {
		d.HasDrain = true
		d.Time = float64(dp.Time)
		d.TimeLow, d.TimeHigh = float64(p.TimeLow), float64(p.TimeHigh)
		d.StopReason = string(dp.StopReason)
		d.StopLevel = float64(dp.StopLevel)
		d.Residual = float64(dp.Residual)
		d.Volume = float64(dp.Volume)
		d.CrestLimitLevel, d.HasCrestLimitLevel = float64(dp.CrestLimitLevel), dp.CrestLimitFound
	}
	d.Warnings = warnLines(r)
	if dp := p.Drain; dp != nil && dp.StopReason == calc.StopIntake && dp.Residual > dp.Volume {
		// More is left than moved: say what the trade does about it.
		d.Warnings = append(d.Warnings, WarnLine{StatusInfo,
			"most left: float a board over the intake (common practice)"})
	}
	return d
}

// warnLines words the warnings for the pane (the deciding one is already in
// the verdict line).
func warnLines(r calc.Result) []WarnLine {
	var out []WarnLine
	for _, c := range r.Warnings.Codes() {
		if r.Verdict == calc.WillNotRun && c == r.Why {
			continue
		}
		var w WarnLine
		switch c {
		case calc.WarnLaminar:
			w = WarnLine{StatusInfo, "laminar flow: thick liquid or small hose"}
		case calc.WarnTransitional:
			w = WarnLine{StatusWarn, "flow between laminar and turbulent: figures uncertain"}
		case calc.WarnCrestNearLimit:
			if r.Verdict == calc.RunsNearLimit {
				continue
			}
			w = WarnLine{StatusWarn, "crest above the working limit"}
		case calc.WarnCannotRun:
			w = WarnLine{StatusBad, "crest too high: the liquid boils there"}
		case calc.WarnNoDrop:
			w = WarnLine{StatusBad, "outlet not below the surface"}
		case calc.WarnAirCollects:
			w = WarnLine{StatusWarn, "air gathers at the crest (flow too slow to carry it down): it will slowly break"}
		case calc.WarnNearBoiling:
			w = WarnLine{StatusWarn, "liquid near boiling: little lift possible"}
		case calc.WarnHoseShort:
			w = WarnLine{StatusWarn, "hose shorter than the route: check length and heights"}
		case calc.WarnIntakeShallow:
			w = WarnLine{StatusWarn, "intake too shallow: a vortex will draw air"}
		default:
			w = WarnLine{StatusWarn, c.String()}
		}
		out = append(out, w)
	}
	return out
}

// planToSide gives the Side view its heights.
func planToSide(p model.Plan, j *model.Job) SideGeometry {
	g := p.Siphon.Geometry
	r := p.Result
	sg := SideGeometry{
		Level: float64(g.Surface), Intake: float64(g.Intake), Crest: float64(g.Crest), Outlet: float64(g.Outlet),
		OutletSubmerged:  g.OutletSubmerged,
		WorkingLimit:     float64(r.WorkingCrestHeight),
		TheoreticalLimit: float64(r.MaxCrestHeight),
	}
	if p.Tank != nil {
		sg.Tank = true
		sg.Shape = strings.ReplaceAll(p.Tank.Shape(), "-", " ")
		sg.TankHeight = float64(p.Tank.Height())
		for _, id := range []model.FieldID{model.FieldTankLength, model.FieldTankDiameter} {
			if v, err := j.Value(id); err == nil && fieldUsed(j, id) {
				sg.TankWidth = v
				break
			}
		}
		if t := float64(p.DrainIn.Target); t > 1e-6 {
			sg.HasTarget, sg.Target = true, t
		}
	}
	return sg
}

// planToCurve gives the Drain curve its points; false without a drain plan.
func planToCurve(p model.Plan) (DrainCurve, bool) {
	dp := p.Drain
	if dp == nil || len(dp.Curve) == 0 {
		return DrainCurve{}, false
	}
	c := DrainCurve{
		Points:     make([]CurvePoint, len(dp.Curve)),
		StopTime:   float64(dp.Time),
		StopLevel:  float64(dp.StopLevel),
		StopReason: string(dp.StopReason),
	}
	for i, pt := range dp.Curve {
		c.Points[i] = CurvePoint{T: float64(pt.Time), Level: float64(pt.Level), Flow: float64(pt.Flow)}
	}
	if t := float64(p.DrainIn.Target); t > 1e-6 {
		c.HasTarget, c.Target = true, t
	}
	return c, true
}

// whatIfMsg carries a What-if grid computed in the background.
type whatIfMsg struct {
	seq   uint64
	table WhatIfTable
	ok    bool
	err   error
}

// whatIfCmd computes the What-if grid for the present plan when the pane is
// on screen and the plan changed. The sweep is a few dozen drain plans
// (several milliseconds), so it runs as a command tagged with a counter.
func (m *Model) whatIfCmd() tea.Cmd {
	on := m.focus == PaneWhatIf || (m.lay.Wide && m.lower == PaneWhatIf)
	if !on || !m.whatIfDirty || !m.hasPlan {
		return nil
	}
	m.whatIfDirty = false
	m.whatIfSeq++
	seq := m.whatIfSeq
	in := m.plan.DrainIn
	if m.plan.Drain == nil {
		in = calc.DrainInput{Siphon: m.plan.Siphon}
	}
	hasTank := m.plan.Drain != nil
	h := m.plan.Siphon.Hose
	hoses := m.plan.Siphon.Hoses
	return func() tea.Msg {
		ls, ds := calc.AroundChoice(h.Length, h.Diameter)
		g, err := calc.WhatIf(in, ls, ds)
		if err != nil {
			return whatIfMsg{seq: seq, err: err}
		}
		return whatIfMsg{seq: seq, ok: true, table: WhatIfFromGrid(g, float64(h.Length), float64(h.Diameter), hoses, hasTank)}
	}
}

// adopt takes a What-if cell as the job's hose.
func (m *Model) adopt(a WhatIfAdoptMsg) (tea.Model, tea.Cmd) {
	sys := m.job.Units
	l := model.Format(model.DimLength, a.Length, sys)
	d := model.Format(model.DimDiameter, a.Diameter, sys)
	_ = m.job.Set(model.FieldHoseLength, l)
	_ = m.job.Set(model.FieldHoseID, d)
	_ = m.job.Set(model.FieldHoseCount, strconv.Itoa(max(a.Hoses, 1)))
	m.job.AddLog(m.now(), "what-if: hose changed to "+strconv.Itoa(max(a.Hoses, 1))+" × "+d+" bore, "+l+" long")
	m.job.Updated = m.now()
	m.recompute()
	m.flash = "now using " + strconv.Itoa(max(a.Hoses, 1)) + " × " + d + ", " + l + " (see the Hose pane)"
	return m, tea.Batch(m.save(), m.whatIfCmd())
}

// mark records a checklist step's state with the time, logs it and saves.
func (m *Model) mark(c ChecklistMarkMsg) (tea.Model, tea.Cmd) {
	now := m.now()
	if err := m.job.Checklist.Mark(c.ID, c.State, c.Reason, "", now); err != nil {
		m.flash = err.Error()
		return m, nil
	}
	text := "checklist: " + c.ID + " " + c.State.Label()
	if c.Reason != "" {
		text += " (" + c.Reason + ")"
	}
	m.job.AddLog(now, text)
	m.job.Updated = now
	if pr := m.job.Checklist.Progress(); pr.Total > 0 && pr.Pending == 0 && m.job.Closed.IsZero() {
		// Every step is done, skipped with a reason, or not applicable.
		m.job.Closed = now
		m.job.AddLog(now, "job closed out: every checklist step marked; press w in the Log pane for the record")
		m.flash = "job closed out: write the record with w in the Log pane (9)"
	} else if pr.Pending > 0 && !m.job.Closed.IsZero() {
		m.job.Closed = time.Time{} // a step was put back to do: the job is open again
		m.job.AddLog(now, "job reopened: a checklist step is to do again")
	}
	if c.Current != "" {
		m.job.Resume.StepID = c.Current
		m.job.Resume.Step = m.job.Checklist.Index(c.Current)
	}
	m.checklist.SetChecklist(m.job.Checklist)
	m.log.SetEntries(m.job.Log)
	return m, m.save()
}

// addReading records a level reading typed in the Log pane, stamped with the
// root's clock, and refits the readings against the plan.
func (m *Model) addReading(msg ReadingAddMsg) (tea.Model, tea.Cmd) {
	now := m.now()
	r, err := model.NewReading(msg.Text, m.job.Units, now, "")
	if err != nil {
		m.log.ReadingError("✗ " + err.Error())
		return m, nil
	}
	if top, ok := m.tankTop(); ok && r.Level > top {
		m.log.ReadingError("✗ level reading " + model.Format(model.DimLength, r.Level, m.job.Units) +
			" is above the tank (" + model.Format(model.DimLength, top, m.job.Units) + ")")
		return m, nil
	}
	m.job.Readings = append(m.job.Readings, r)
	m.job.AddLog(now, "level reading "+model.Format(model.DimLength, r.Level, m.job.Units))
	m.job.Updated = now
	m.log.ReadingTaken()
	m.log.SetEntries(m.job.Log)
	m.log.SetSummary(readingsSummary(&m.job, nil, nil, m.loc()))
	return m, tea.Batch(m.save(), m.refit())
}

// tankTop is the source tank's height when the plan has a tank.
func (m *Model) tankTop() (float64, bool) {
	if !m.hasPlan || m.plan.Tank == nil {
		return 0, false
	}
	return float64(m.plan.Tank.Height()), true
}

// refit fits the job's readings against the last valid plan, as a command.
func (m *Model) refit() tea.Cmd {
	m.fitSeq++
	if len(m.job.Readings) < 2 || !m.hasPlan || m.plan.Drain == nil {
		m.fit, m.fitErr = nil, nil
		if len(m.job.Readings) > 0 && (!m.hasPlan || m.plan.Drain == nil) {
			m.fitErr = errors.New("no drain plan to compare with: describe the tank in pane 4")
		}
		m.log.SetSummary(readingsSummary(&m.job, nil, m.fitErr, m.loc()))
		return nil
	}
	return fitCmd(m.job.Readings, m.plan.DrainIn, m.plan.Siphon.Hose.KMinor(), m.fitSeq)
}

// loc is the zone times are shown in.
func (m *Model) loc() *time.Location { return m.log.loc }
