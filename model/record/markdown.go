package record

import (
	"fmt"
	"strings"
	"time"

	"drawdown/model/present"
)

// cell makes text safe inside a Markdown table cell.
func cell(s string) string { return present.MarkdownCell(oneLine(s)) }

// mdText keeps free text from breaking the record's structure: one line, no
// leading heading or list markers.
func mdText(s string) string { return present.Markdown(oneLine(s)) }

func oneLine(s string) string {
	return strings.TrimSpace(strings.Join(strings.Fields(s), " "))
}

func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func zoneName(t time.Time) string {
	name, off := t.Zone()
	sign := "+"
	if off < 0 {
		sign, off = "-", -off
	}
	return fmt.Sprintf("%s (UTC%s%02d:%02d)", name, sign, off/3600, off%3600/60)
}
