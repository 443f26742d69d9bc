// Package tui is drawdown's terminal user interface: the live planning
// screen a technician uses on site, often over SSH on a weak link.
//
// It owns the screens (bubbletea v2, lipgloss v2, bubbles v2): the root
// model (the only tea.Model), the form panes Hose, Lift & outlet, Liquid &
// site and Tank built from model.FieldSpec, the Result pane, the Side view,
// Drain curve, What-if and Checklist views, the Log, the key map, the
// styles, the help screen, the layout and the commands that save and load
// jobs.
//
// Rules it keeps:
//   - Every keystroke stores the raw text in the job (model.Job.Set) and
//     recomputes the plan (model.Compute) in Update; View only formats.
//   - Saving and loading run as tea.Cmds that capture a copy of the job and
//     a sequence number; stale replies are dropped.
//   - Status is never shown by colour alone: a word or symbol goes with it.
//     Colours are the 16 basic ANSI colours, chosen for a dark or a light
//     background after tea.BackgroundColorMsg; NO_COLOR leaves a legible
//     screen.
//   - No blinking cursor: the real terminal cursor marks the typing point, so
//     nothing is written while the technician is idle.
//   - Below 80×24 it says how big the terminal must be instead of drawing.
//
// tui imports model (and calc, presets for their types). Nothing imports
// tui except main. It must not do physics itself: numbers come from
// model.Compute.
package tui
