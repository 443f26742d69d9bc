package main

import (
	"fmt"
	"io"

	"drawdown/model/present"
	"drawdown/presets"
)

// loadCatalogue returns the built-in catalogue merged with the user's preset
// file when there is one (presets.Load, the one loader for the screen and the
// command line). A
// bad user file is reported on warn and skipped: the built-in catalogue
// always loads.
func loadCatalogue(warn io.Writer) *presets.Catalogue {
	cat, err := presets.Load("")
	if err != nil && warn != nil {
		fmt.Fprintf(warn, "drawdown: user presets not loaded (built-in catalogue in use): %v\n", err)
	}
	return cat
}

const presetsHelp = `usage: drawdown presets
Lists the catalogue: liquids (with the basis and source of each property), hose materials
and sizes, fittings with their loss coefficients K, priming methods and tank templates,
each with its source. The IDs shown are what the calc flags and the screen's pickers take.
User presets in $XDG_CONFIG_HOME/drawdown/presets.toml (~/.config/drawdown/presets.toml)
are merged in; a bad user file is named on stderr and the built-in catalogue is used.
`

func runPresets(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("presets", args, nil, 0)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown presets: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		fmt.Fprint(stdout, presetsHelp)
		return ExitOK
	}
	if err := present.WriteListing(stdout, loadCatalogue(stderr)); err != nil {
		fmt.Fprintf(stderr, "drawdown presets: %v\n", err)
		return ExitError
	}
	return ExitOK
}
