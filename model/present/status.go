package present

// Status is a traffic state. Every reader shows it as a symbol or a word as
// well as a colour, never by colour alone.
type Status int

const (
	// OK: runs, done, within the limit.
	OK Status = iota
	// Warn: near a limit, stale, needs attention.
	Warn
	// Bad: will not run, invalid.
	Bad
	// Info: neutral.
	Info
)

// Symbol is the character that carries the status without colour.
func (s Status) Symbol() string {
	switch s {
	case OK:
		return "✓"
	case Warn:
		return "!"
	case Bad:
		return "✗"
	case Info:
		return "·"
	}
	return "?"
}

// Line is one worded finding: a warning, a note or a caution line.
type Line struct {
	// Code is a stable identifier for machines (JSON, tests); "" for
	// lines that have none.
	Code   string
	Status Status
	// Short fits a screen line (about 40 columns); Long is a sentence for
	// the command line and the record.
	Short, Long string
}
