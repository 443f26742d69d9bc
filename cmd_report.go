package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"

	"drawdown/model"
	"drawdown/model/record"
)

// reportFlagDefs are the flags of `drawdown report`.
var reportFlagDefs = []flagDef{
	{name: "out", arg: "DIR", path: "dir", help: "write the record and the readings CSV into DIR [beside the job file]"},
	{name: "stdout", help: "print the record (Markdown) on standard output instead; no files written"},
}

const reportHelp = `usage: drawdown report JOB [--out DIR] [--stdout]
Writes the job record (Markdown) and its readings CSV as <job>-record.md and
<job>-readings.csv beside the job file, or into DIR, and prints their paths. JOB is a job
file, or the name of a job in the jobs folder ($DRAWDOWN_HOME/jobs). An existing record is
replaced whole (written to a temporary file, then renamed).

`

// reportNow is the record's time (a variable so that the golden test can fix
// it).
var reportNow = time.Now

// runReport writes the job record: `drawdown report JOB [--out DIR]`. JOB
// is a job file path, or the name of a job in the jobs folder. The record
// (Markdown) and the readings CSV are written atomically into DIR (default:
// the folder of the job file) as <job>-record.md and <job>-readings.csv; the
// paths are printed. With --stdout the Markdown goes to standard output
// instead.
func runReport(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("report", args, reportFlagDefs, 1)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown report: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		fmt.Fprint(stdout, reportHelp)
		writeFlagHelp(stdout, reportFlagDefs)
		return ExitOK
	}
	out, toStdout := pf.get("out"), pf.has("stdout")
	if len(pf.positional) == 0 {
		fmt.Fprintln(stderr, "drawdown report: which job? usage: drawdown report JOB [--out DIR] [--stdout] (JOB is a file or a job name)")
		return ExitUsage
	}
	job := pf.positional[0]
	path, err := findJob(job)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown report: "+err.Error())
		return ExitUsage
	}
	j, err := model.Load(path)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown report: "+oneLine(err.Error()))
		return ExitError
	}
	cat := loadCatalogue(stderr)
	p := model.Compute(j, cat)
	// the checklist as the screen shows it for this plan and these facts
	// (marks kept), so the record and the screen agree
	j.RebuildChecklist(p)
	in := record.Input{Job: j, Plan: p, Now: reportNow()}
	var md, csv bytes.Buffer
	if err := record.Write(&md, in); err != nil {
		fmt.Fprintln(stderr, "drawdown report: "+err.Error())
		return ExitError
	}
	if toStdout {
		stdout.Write(md.Bytes())
		return ExitOK
	}
	if err := record.WriteCSV(&csv, in); err != nil {
		fmt.Fprintln(stderr, "drawdown report: "+err.Error())
		return ExitError
	}
	if out == "" {
		out = filepath.Dir(path)
	}
	base := strings.TrimSuffix(filepath.Base(path), ".json")
	for _, f := range []struct {
		name string
		data []byte
	}{{base + "-record.md", md.Bytes()}, {base + "-readings.csv", csv.Bytes()}} {
		p := filepath.Join(out, f.name)
		if err := model.WriteFileAtomic(p, f.data); err != nil {
			fmt.Fprintln(stderr, "drawdown report: "+err.Error())
			return ExitError
		}
		fmt.Fprintln(stdout, p)
	}
	return ExitOK
}

// findJob resolves JOB: an existing file, else a job name in the jobs folder.
func findJob(job string) (string, error) {
	if fi, err := os.Stat(job); err == nil && !fi.IsDir() {
		return job, nil
	}
	dir, err := model.JobsDir()
	if err != nil {
		return "", err
	}
	for _, p := range []string{filepath.Join(dir, job), filepath.Join(dir, job+".json"), filepath.Join(dir, model.JobFileName(job))} {
		if fi, err := os.Stat(p); err == nil && !fi.IsDir() {
			return p, nil
		}
	}
	return "", fmt.Errorf("no job file %q here or in %s", job, dir)
}
