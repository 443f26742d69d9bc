package cli

import (
	"fmt"
	"io"
	"os"

	"drawdown/presets"
)

// Exit statuses.
const (
	ExitOK    = 0
	ExitError = 1 // a file could not be read or written
	ExitUsage = 2 // bad input: a flag or its value
)

// Run runs the command named by args[0] ("calc", "presets", "report") with
// the remaining arguments and returns the process exit status.
func Run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprintln(stderr, "drawdown: no command; try: drawdown calc --help")
		return ExitUsage
	}
	switch args[0] {
	case "calc":
		return runCalc(args[1:], stdout, stderr)
	case "presets":
		return runPresets(args[1:], stdout, stderr)
	case "report":
		return runReport(args[1:], stdout, stderr)
	case "help", "-h", "--help":
		fmt.Fprint(stdout, usage)
		return ExitOK
	}
	fmt.Fprintf(stderr, "drawdown: unknown command %q; commands: calc, presets, report (no command opens the screen)\n", args[0])
	return ExitUsage
}

const usage = `drawdown — plan, run and record a siphon drain

  drawdown                 open the planning screen on the last job (or the demo job)
  drawdown calc [flags]    compute one case without the screen (drawdown calc --help)
  drawdown presets         list the built-in liquids, hoses, fittings and tanks with sources
  drawdown report JOB      write the job record (Markdown) and its readings CSV

drawdown plans and records; it does not authorise a discharge or an entry. Local codes,
permits and licensed practice govern.
`

// Catalogue returns the built-in catalogue merged with the user's preset
// file when there is one. A bad user file is reported on warn and skipped:
// the built-in catalogue always loads.
func Catalogue(warn io.Writer) *presets.Catalogue {
	cat := presets.Builtin()
	path := presets.UserFile()
	if path == "" {
		return cat
	}
	f, err := os.Open(path)
	if err != nil {
		if !os.IsNotExist(err) && warn != nil {
			fmt.Fprintf(warn, "drawdown: user presets not loaded: %v\n", err)
		}
		return cat
	}
	defer f.Close()
	u, err := presets.LoadUser(f, path)
	if err != nil {
		if warn != nil {
			fmt.Fprintf(warn, "drawdown: user presets not loaded (built-in catalogue in use): %v\n", err)
		}
		return cat
	}
	return cat.Merge(u)
}

func runPresets(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		fmt.Fprintf(stderr, "drawdown presets: takes no arguments (got %q)\n", args[0])
		return ExitUsage
	}
	if err := Catalogue(stderr).WriteListing(stdout); err != nil {
		fmt.Fprintf(stderr, "drawdown presets: %v\n", err)
		return ExitError
	}
	return ExitOK
}
