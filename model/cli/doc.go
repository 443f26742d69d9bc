// Package cli holds drawdown's commands that run without a screen:
//
//	drawdown calc [flags]     one case, as text or --json (design §4)
//	drawdown presets          the catalogue with sources and ranges
//	drawdown report JOB       the job record (Markdown) and readings CSV
//
// It turns flags into a job's inputs, runs model.Compute — the same path as
// the terminal UI — and prints. Bad input exits with status 2 and one line on
// stderr naming the flag and the accepted range. cli imports model, calc and
// presets; it must not import tui.
package cli
