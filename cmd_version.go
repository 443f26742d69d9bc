package main

import (
	"fmt"
	"io"
	"runtime/debug"
	"strings"
)

const versionHelp = `usage: drawdown version   (or drawdown --version)
Prints the module version, the version-control revision and time the binary was built
from, and the Go version. A build from a checkout says "devel" for the version; a build
without version-control information (go build outside a Git checkout, or -buildvcs=false)
says so instead of a revision.
`

func runVersion(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("version", args, nil, 0)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown version: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		fmt.Fprint(stdout, versionHelp)
		return ExitOK
	}
	bi, ok := debug.ReadBuildInfo()
	fmt.Fprintln(stdout, versionLine(bi, ok))
	return ExitOK
}

// versionLine words the build information on one line:
//
//	drawdown v1.2.0, revision 0123abcd… (2026-01-02T03:04:05Z), go1.26.8
//	drawdown devel, revision 0123abcd… (2026-01-02T03:04:05Z, uncommitted changes), go1.26.8
//	drawdown devel, no revision recorded (built without version control information), go1.26.8
func versionLine(bi *debug.BuildInfo, ok bool) string {
	if !ok || bi == nil {
		return "drawdown devel, no build information recorded"
	}
	version := bi.Main.Version
	if version == "" || version == "(devel)" {
		version = "devel"
	}
	s := map[string]string{}
	for _, kv := range bi.Settings {
		s[kv.Key] = kv.Value
	}
	var b strings.Builder
	b.WriteString("drawdown " + version)
	if rev := s["vcs.revision"]; rev != "" {
		b.WriteString(", revision " + rev)
		var when []string
		if t := s["vcs.time"]; t != "" {
			when = append(when, t)
		}
		if s["vcs.modified"] == "true" {
			when = append(when, "uncommitted changes")
		}
		if len(when) > 0 {
			b.WriteString(" (" + strings.Join(when, ", ") + ")")
		}
	} else {
		b.WriteString(", no revision recorded (built without version control information)")
	}
	if bi.GoVersion != "" {
		b.WriteString(", " + bi.GoVersion)
	}
	return b.String()
}
