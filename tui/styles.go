package tui

import (
	"image/color"

	"charm.land/bubbles/v2/help"
	"charm.land/lipgloss/v2"
)

// Styles holds every style the screens use, named for meaning. Colours come
// only from the 16 basic ANSI colours, so a 16-colour terminal shows exactly
// what was meant and each colour follows the terminal's own palette. Every
// status also carries a word or symbol, and focus is shown by reverse video
// and a marker, so the screen still reads under NO_COLOR.
//
// Build it with NewStyles; rebuild it when a tea.BackgroundColorMsg tells
// whether the background is dark. Views never call lipgloss.NewStyle.
type Styles struct {
	IsDark bool

	Title     lipgloss.Style // the top bar: program and job name
	Mode      lipgloss.Style // the editing / navigate indicator
	Tab       lipgloss.Style // a pane name in the tab line
	TabActive lipgloss.Style // the selected pane name
	PaneTitle lipgloss.Style // heading inside a pane
	Border    lipgloss.Style // the frame around the Result pane

	Label        lipgloss.Style // field label, blurred
	LabelFocused lipgloss.Style // field label with the focus
	Input        lipgloss.Style // raw text as typed
	InputFocused lipgloss.Style // raw text in the focused field
	Value        lipgloss.Style // a computed value
	Big          lipgloss.Style // the leading number (flow)
	Unit         lipgloss.Style // a converted value beside an input
	Muted        lipgloss.Style // secondary text

	OK      lipgloss.Style // runs
	Warning lipgloss.Style // near a limit; stale result
	Danger  lipgloss.Style // will not run; invalid field

	HelpKey  lipgloss.Style
	HelpDesc lipgloss.Style
	HelpSep  lipgloss.Style
}

// NewStyles builds the styles for a dark or a light background.
func NewStyles(isDark bool) Styles {
	ld := lipgloss.LightDark(isDark)
	var (
		text   = ld(lipgloss.Black, lipgloss.BrightWhite)
		muted  = ld(lipgloss.BrightBlack, lipgloss.White)
		accent = ld(lipgloss.Blue, lipgloss.BrightCyan)
		ok     = ld(lipgloss.Green, lipgloss.BrightGreen)
		warn   = ld(lipgloss.Magenta, lipgloss.BrightYellow)
		danger = ld(lipgloss.Red, lipgloss.BrightRed)
		unit   = ld(lipgloss.Cyan, lipgloss.Cyan)
	)
	base := lipgloss.NewStyle().Foreground(text)
	s := Styles{IsDark: isDark}
	s.Title = base.Bold(true)
	s.Mode = base.Bold(true).Reverse(true)
	s.Tab = lipgloss.NewStyle().Foreground(muted)
	s.TabActive = base.Bold(true).Reverse(true)
	s.PaneTitle = lipgloss.NewStyle().Foreground(accent).Bold(true)
	s.Border = lipgloss.NewStyle().Border(lipgloss.NormalBorder()).BorderForeground(muted)

	s.Label = base
	s.LabelFocused = base.Bold(true).Reverse(true)
	s.Input = base
	s.InputFocused = base.Bold(true).Underline(true)
	s.Value = base
	s.Big = base.Bold(true)
	s.Unit = lipgloss.NewStyle().Foreground(unit)
	s.Muted = lipgloss.NewStyle().Foreground(muted)

	s.OK = lipgloss.NewStyle().Foreground(ok).Bold(true)
	s.Warning = lipgloss.NewStyle().Foreground(warn).Bold(true)
	s.Danger = lipgloss.NewStyle().Foreground(danger).Bold(true)

	s.HelpKey = lipgloss.NewStyle().Foreground(accent).Bold(true)
	s.HelpDesc = lipgloss.NewStyle().Foreground(text)
	s.HelpSep = lipgloss.NewStyle().Foreground(muted)
	return s
}

// HelpStyles gives the bubbles help widget our explicit colours (its own
// default grey maps to black on a 16-colour terminal).
func (s Styles) HelpStyles() help.Styles {
	return help.Styles{
		Ellipsis:       s.HelpSep,
		ShortKey:       s.HelpKey,
		ShortDesc:      s.HelpDesc,
		ShortSeparator: s.HelpSep,
		FullKey:        s.HelpKey,
		FullDesc:       s.HelpDesc,
		FullSeparator:  s.HelpSep,
	}
}

// Status is a traffic state that is always shown as a word or symbol plus a
// colour, never by colour alone.
type Status int

const (
	// StatusOK: runs, done, fine.
	StatusOK Status = iota
	// StatusWarn: near a limit, stale, needs attention.
	StatusWarn
	// StatusBad: will not run, invalid.
	StatusBad
	// StatusInfo: neutral.
	StatusInfo
)

// Symbol is the character that carries the status without colour.
func (st Status) Symbol() string {
	switch st {
	case StatusOK:
		return "✓"
	case StatusWarn:
		return "!"
	case StatusBad:
		return "✗"
	case StatusInfo:
		return "·"
	}
	return "?"
}

// Style picks the style for a status.
func (s Styles) Style(st Status) lipgloss.Style {
	switch st {
	case StatusOK:
		return s.OK
	case StatusWarn:
		return s.Warning
	case StatusBad:
		return s.Danger
	case StatusInfo:
		return s.Muted
	}
	return s.Value
}

// cursorColor is the colour of the real terminal cursor in a text field.
func (s Styles) cursorColor() color.Color {
	return lipgloss.LightDark(s.IsDark)(lipgloss.Blue, lipgloss.BrightCyan)
}
