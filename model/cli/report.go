package cli

import (
	"fmt"
	"io"
)

func runReport(args []string, stdout, stderr io.Writer) int {
	fmt.Fprintln(stderr, "drawdown report: not wired yet")
	return ExitError
}
