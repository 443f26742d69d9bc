package main

import (
	"fmt"
	"io"
	"os"

	"drawdown/presets"
)

// loadCatalogue returns the built-in catalogue merged with the user's preset
// file when there is one. A bad user file is reported on warn and skipped:
// the built-in catalogue always loads.
func loadCatalogue(warn io.Writer) *presets.Catalogue {
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
	if err := loadCatalogue(stderr).WriteListing(stdout); err != nil {
		fmt.Fprintf(stderr, "drawdown presets: %v\n", err)
		return ExitError
	}
	return ExitOK
}
