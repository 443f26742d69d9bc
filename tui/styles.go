package tui

import (
	"image/color"
	"strings"

	"charm.land/lipgloss/v2"

	"drawdown/model/present"
)

// Styles is the one style sheet of the screen: every style, named for
// meaning, for the text panes and (as drawing classes) for the drawn ones.
// Colours come only from the 16 basic ANSI colours, so a 16-colour terminal
// shows exactly what was meant and each colour follows the terminal's own
// palette. Every status also carries a word or symbol, and focus is shown by
// inverse (reverse) display and a marker, so the screen still reads under
// NO_COLOR.
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
	LabelFocused lipgloss.Style // field label with the focus; a selected cell
	Input        lipgloss.Style // raw text as typed
	InputFocused lipgloss.Style // raw text in the focused field
	Value        lipgloss.Style // a computed value
	Big          lipgloss.Style // the leading number (flow); the hose in a drawing
	Unit         lipgloss.Style // a converted value beside an input; liquid in a drawing
	Muted        lipgloss.Style // secondary text

	OK      lipgloss.Style // runs
	Warning lipgloss.Style // near a limit; stale result
	Danger  lipgloss.Style // will not run; invalid field
	Limit   lipgloss.Style // crest-limit and target lines; the caution box frame

	HelpKey  lipgloss.Style
	HelpDesc lipgloss.Style
	HelpSep  lipgloss.Style

	// fast holds the same styles as fixed escape sequences (see paint), for
	// the text drawn on every keystroke; class the paint of each drawing
	// class.
	fast  fastStyles
	class [clsCount]paint
}

// paint is a style reduced to the escape sequences before and after a
// single line of text. lipgloss's Render works out a style's frame, margins
// and widths on every call; for the plain colour-and-attribute styles used
// here that is fixed, so it is worked out once.
type paint struct{ pre, post string }

// paintMark is a private-use character that no style changes.
const paintMark = "\uE000"

func newPaint(st lipgloss.Style) paint {
	r := st.Render(paintMark)
	i := strings.Index(r, paintMark)
	if i < 0 {
		return paint{}
	}
	return paint{pre: r[:i], post: r[i+len(paintMark):]}
}

// Render styles one line of text (several lines are styled line by line).
func (p paint) Render(s string) string {
	if s == "" {
		return ""
	}
	if strings.IndexByte(s, '\n') >= 0 {
		ls := strings.Split(s, "\n")
		for i, l := range ls {
			ls[i] = p.Render(l)
		}
		return strings.Join(ls, "\n")
	}
	return p.pre + s + p.post
}

type fastStyles struct {
	Title, Mode, Tab, TabActive, PaneTitle               paint
	Label, LabelFocused, Input, InputFocused, Value, Big paint
	Unit, Muted, OK, Warning, Danger, Stale              paint
	HelpKey, HelpDesc, HelpSep                           paint
}

func newFastStyles(s Styles) fastStyles {
	return fastStyles{
		Title: newPaint(s.Title), Mode: newPaint(s.Mode), Tab: newPaint(s.Tab), TabActive: newPaint(s.TabActive),
		PaneTitle: newPaint(s.PaneTitle), Label: newPaint(s.Label), LabelFocused: newPaint(s.LabelFocused),
		Input: newPaint(s.Input), InputFocused: newPaint(s.InputFocused), Value: newPaint(s.Value), Big: newPaint(s.Big),
		Unit: newPaint(s.Unit), Muted: newPaint(s.Muted), OK: newPaint(s.OK), Warning: newPaint(s.Warning),
		Danger: newPaint(s.Danger), Stale: newPaint(s.Warning.Reverse(true)),
		HelpKey: newPaint(s.HelpKey), HelpDesc: newPaint(s.HelpDesc), HelpSep: newPaint(s.HelpSep),
	}
}

// classStyle is the style of a drawing class.
func (s Styles) classStyle(c drawClass) lipgloss.Style {
	switch c {
	case clsMuted:
		return s.Muted
	case clsLiquid:
		return s.Unit
	case clsHose:
		return s.Big
	case clsLimit, clsBox:
		return s.Limit
	case clsOK:
		return s.OK
	case clsWarn:
		return s.Warning
	case clsDanger:
		return s.Danger
	case clsTitle:
		return s.PaneTitle
	case clsSelected:
		return s.LabelFocused
	case clsText, clsCount:
	}
	return s.Value
}

// fastStyle is the paint for a status.
func (s Styles) fastStyle(st present.Status) paint {
	switch st {
	case present.OK:
		return s.fast.OK
	case present.Warn:
		return s.fast.Warning
	case present.Bad:
		return s.fast.Danger
	case present.Info:
		return s.fast.Muted
	}
	return s.fast.Value
}

// statusClass is the drawing class for a status.
func statusClass(st present.Status) drawClass {
	switch st {
	case present.OK:
		return clsOK
	case present.Warn:
		return clsWarn
	case present.Bad:
		return clsDanger
	case present.Info:
		return clsMuted
	}
	return clsText
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
	s.Limit = lipgloss.NewStyle().Foreground(warn)

	s.HelpKey = lipgloss.NewStyle().Foreground(accent).Bold(true)
	s.HelpDesc = lipgloss.NewStyle().Foreground(text)
	s.HelpSep = lipgloss.NewStyle().Foreground(muted)
	s.fast = newFastStyles(s)
	for c := drawClass(0); c < clsCount; c++ {
		s.class[c] = newPaint(s.classStyle(c))
	}
	return s
}

// cursorColor is the colour of the real terminal cursor in a text field.
func (s Styles) cursorColor() color.Color {
	return lipgloss.LightDark(s.IsDark)(lipgloss.Blue, lipgloss.BrightCyan)
}
