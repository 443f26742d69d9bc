package main

import (
	"fmt"
	"io"

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

func runPresets(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		fmt.Fprintf(stderr, "drawdown presets: takes no arguments (got %q)\n", args[0])
		return ExitUsage
	}
	if err := loadCatalogue(stderr).WriteListing(stdout); err != nil {
		fmt.Fprintf(stderr, "drawdown presets: %v\n", err)
		return ExitError
	}
	return ExitOK
}
