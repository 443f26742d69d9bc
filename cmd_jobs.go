package main

import (
	"errors"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"time"

	"drawdown/model"
	"drawdown/presets"
)

// runNew creates a job in the jobs folder and prints its path:
//
//	drawdown new NAME [--site S] [--template ID] [--units si|us]
//	    [--location L] [--date YYYY-MM-DD] [--supervisor P] [--source S]
//	    [--receiver R] [--notes N]
//
// The entry flags are the job's entries (model.InfoFields), named by their
// IDs. Without --template the job is blank: the name, the entries given,
// today's date and nothing else (no text of any template). The checklist is built
// for it at once, so the file is complete. The last-opened job is not
// changed.
func runNew(args []string, stdout, stderr io.Writer) int {
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "drawdown new: "+format+"\n", a...)
		return ExitUsage
	}
	defs := newFlagTable()
	pf, err := parseFlags("new", args, defs, 1)
	if err != nil {
		return fail("%s", err.Error())
	}
	if pf.help {
		newUsage(stdout, defs)
		return ExitOK
	}
	units := model.SI
	if pf.has("units") {
		sys, err := model.ParseSystem(pf.get("units"))
		if err != nil {
			return fail("--units: %q is not a unit system; accepted si or us", pf.get("units"))
		}
		units = sys
	}
	if len(pf.positional) == 0 || strings.TrimSpace(pf.positional[0]) == "" {
		return fail("which name? usage: drawdown new NAME [--site S] [--template ID] (quote a name with spaces)")
	}
	now := time.Now()
	j, err := newJob(pf.positional[0], pf.get("template"), units, now)
	if err != nil {
		return fail("%s", usageLine(err, "--template"))
	}
	for _, f := range model.InfoFields() {
		if pf.has(string(f)) {
			if err := j.SetInfo(f, pf.get(string(f)), now); err != nil {
				return fail("%s", usageLine(err, "--"+string(f)))
			}
		}
	}
	dir, err := model.JobsDir()
	if err != nil {
		fmt.Fprintln(stderr, "drawdown new: no folder for job files: "+err.Error())
		return ExitError
	}
	path := model.NewJobPath(dir, j.Name)
	if err := model.SaveAtomic(path, j); err != nil {
		fmt.Fprintln(stderr, "drawdown new: "+oneLine(err.Error()))
		return ExitError
	}
	fmt.Fprintln(stdout, path)
	return ExitOK
}

// newFlagTable: --template, --units and one flag per job entry
// (model.InfoFields, by their IDs).
func newFlagTable() []flagDef {
	defs := []flagDef{
		{name: "template", arg: "ID", help: "start from a template (see below) [blank]", complete: completeTemplates},
		{name: "units", arg: "si|us", help: "the job's unit system [si]", complete: completeUnits},
	}
	for _, f := range model.InfoFields() {
		defs = append(defs, flagDef{name: string(f), arg: "TEXT", help: f.Label()})
	}
	return defs
}

func completeTemplates(*presets.Catalogue) []completion {
	var out []completion
	for _, t := range model.Templates() {
		out = append(out, completion{t.ID, t.Name})
	}
	return out
}

// newJob makes the job: blank, or from a template, with its checklist
// built; a blank job is dated today.
func newJob(name, template string, units model.System, now time.Time) (model.Job, error) {
	j, err := model.FromTemplate(template, name, now)
	if err != nil {
		return j, err
	}
	if template == "" {
		j.Date = now.Format("2006-01-02")
	}
	j.SetUnits(units)
	return j, nil
}

// usageLine words a refused entry with the flag that gave it.
func usageLine(err error, flag string) string {
	var ie *model.InputError
	if errors.As(err, &ie) {
		switch ie.Field {
		case "Job name":
			return "NAME: " + ie.Detail
		case "Template":
			return "--template: " + ie.Detail
		}
		return flag + ": " + ie.Detail
	}
	return oneLine(err.Error())
}

func newUsage(w io.Writer, defs []flagDef) {
	fmt.Fprintln(w, "usage: drawdown new NAME [--site S] [--template ID] [--units si|us] [entries]")
	fmt.Fprintln(w, "Creates a job in the jobs folder and prints its path. Without --template the job is")
	fmt.Fprintln(w, "blank: its name, the entries given and today's date, no text of any template. The")
	fmt.Fprintln(w, "last-opened job is not changed. Exit status 0, 2 for bad input, 1 when the file")
	fmt.Fprintln(w, "cannot be written.")
	fmt.Fprintln(w)
	writeFlagHelp(w, defs)
	fmt.Fprintln(w, "templates:")
	for _, t := range model.Templates() {
		fmt.Fprintf(w, "  %-10s %s: %s\n", t.ID, t.Name, t.Summary)
	}
}

// runJobs lists the jobs in the jobs folder, newest first: name, site,
// date and state (planned, draining, closed), and the file. A file that
// cannot be read is listed with the reason, never hidden.
func runJobs(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("jobs", args, nil, 0)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown jobs: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		fmt.Fprintln(stdout, "usage: drawdown jobs\nLists the jobs in the jobs folder, newest first: name, site, date, state (planned,\ndraining, closed) and file. A file that cannot be read is listed with the reason.")
		return ExitOK
	}
	dir, err := model.JobsDir()
	if err != nil {
		fmt.Fprintln(stderr, "drawdown jobs: no folder for job files: "+err.Error())
		return ExitError
	}
	list, err := model.ListJobs(dir)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown jobs: cannot read "+dir+": "+err.Error())
		return ExitError
	}
	if len(list) == 0 {
		fmt.Fprintln(stdout, "No jobs yet in "+dir+"; start one with: drawdown new NAME")
		return ExitOK
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "NAME\tSITE\tDATE\tSTATE\tFILE")
	for _, s := range list {
		if s.Err != nil {
			fmt.Fprintf(tw, "(cannot be read)\t\t\t\t%s: %s\n", plain(s.Path), plain(oneLine(s.Err.Error())))
			continue
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", cell(s.Name), cell(s.Site), cell(s.Date), s.State, plain(s.Path))
	}
	tw.Flush()
	return ExitOK
}

// cell is a table cell: plain text on one line, a dash when empty.
func cell(s string) string {
	s = strings.TrimSpace(plain(s))
	if s == "" {
		return "—"
	}
	return s
}
