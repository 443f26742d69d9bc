package tui

import (
	"strconv"
	"strings"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// pane is what every tab of the screen is to the root model: it has a size
// and styles, draws itself, lists the keys that work in it now, takes the
// focus, and is brought up to date from the screen's state. The root keeps
// the panes in a table (paneTable) and treats them alike; only moving from
// one form into the next is form business.
type pane interface {
	SetSize(w, h int)
	SetStyles(Styles)
	View() string
	// ShortHelp lists the pane's own keys that work now.
	ShortHelp() []key.Binding
	Focus()
	Blur()
	// Claims reports whether the pane takes a key before the root's
	// single-letter commands: its own keys, or any key while typing.
	Claims(tea.KeyPressMsg) bool
	// Key handles a key; a non-nil edit is a field's new text, which the
	// root applies to the job at once.
	Key(tea.KeyPressMsg) (tea.Cmd, *FieldEdit)
	// Paste puts pasted text into the pane's text input, if it has one
	// (a form starts typing in its selected field).
	Paste(text string) (tea.Cmd, *FieldEdit)
	// Click acts on a mouse click at (x, y), relative to the pane: select
	// a field, a step or a cell.
	Click(x, y int) (tea.Cmd, *FieldEdit)
	// Typing reports whether keys go into a text input.
	Typing() bool
	// CursorPos is the real terminal cursor, relative to the pane, or nil.
	CursorPos() *tea.Cursor
	// Show brings the pane up to date with the job and its plan.
	Show(*screenState)
}

// screenState is what the panes show: the job as it stands, the last valid
// plan and its sheet, and the problems with the inputs. The root owns it and
// bumps gen on every change; a pane on screen is shown each new gen.
type screenState struct {
	job     *model.Job
	plan    model.Plan // the last valid plan
	sheet   present.Sheet
	hasPlan bool
	// stale: the inputs have an error; plan and sheet are the last valid
	// ones. errs holds each field's problem; problem is the first, worded.
	stale   bool
	errs    map[model.FieldID]error
	problem string
	gen     uint64
}

// PaneID names a pane of the screen. The zero value is a real pane (Hose).
type PaneID int

// The panes, in tab order.
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
	PaneJob
	paneCount
)

// paneSpec is one row of the pane table.
type paneSpec struct {
	name  string // tab title and the name kept in Job.Resume.Pane
	short string // tab title on a narrow screen
	// form: an input pane (one of model.Panes, in the same order).
	form bool
	// lower: on a wide screen the pane fills the lower strip when chosen.
	lower bool
}

// paneTable lists the panes in tab order. The tab keys come from it: 1–9,
// then 0, then letters a pane table grows into never clash with commands
// (see KeyMap.paneKeys).
var paneTable = [paneCount]paneSpec{
	PaneHose:      {name: "Hose", short: "Hose", form: true},
	PaneLift:      {name: "Lift & outlet", short: "Lift", form: true},
	PaneLiquid:    {name: "Liquid & site", short: "Liquid", form: true},
	PaneTank:      {name: "Tank", short: "Tank", form: true},
	PaneSide:      {name: "Side view", short: "Side"},
	PaneCurve:     {name: "Drain curve", short: "Curve", lower: true},
	PaneWhatIf:    {name: "What-if", short: "What-if", lower: true},
	PaneChecklist: {name: "Checklist", short: "Checks", lower: true},
	PaneLog:       {name: "Log", short: "Log", lower: true},
	PaneJob:       {name: "Job", short: "Job", lower: true},
}

func (p PaneID) String() string {
	if p < 0 || p >= paneCount {
		return "Pane(" + strconv.Itoa(int(p)) + ")"
	}
	return paneTable[p].name
}

// isForm reports whether the pane is one of the input forms.
func (p PaneID) isForm() bool { return p >= 0 && p < paneCount && paneTable[p].form }

func paneByName(name string) (PaneID, bool) {
	for i, s := range paneTable {
		if strings.EqualFold(s.name, name) {
			return PaneID(i), true
		}
	}
	return PaneHose, false
}

// formCount is the number of input forms; they come first in the table.
const formCount = int(PaneTank) + 1
