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

// runReport writes the job record: `drawdown report JOB [--out DIR]`. JOB
// is a job file path, or the name of a job in the jobs folder. The record
// (Markdown) and the readings CSV are written atomically into DIR (default:
// the current directory) as <job>-record.md and <job>-readings.csv; the
// paths are printed. With --stdout the Markdown goes to standard output
// instead.
func runReport(args []string, stdout, stderr io.Writer) int {
	var job, out string
	toStdout := false
	for i := 0; i < len(args); i++ {
		a := args[i]
		switch {
		case a == "--stdout":
			toStdout = true
		case a == "--out" || a == "-out":
			if i+1 >= len(args) {
				fmt.Fprintln(stderr, "drawdown report: --out needs a folder")
				return ExitUsage
			}
			i++
			out = args[i]
		case strings.HasPrefix(a, "--out="):
			out = strings.TrimPrefix(a, "--out=")
		case strings.HasPrefix(a, "-"):
			fmt.Fprintf(stderr, "drawdown report: unknown flag %s; usage: drawdown report JOB [--out DIR] [--stdout]\n", a)
			return ExitUsage
		case job == "":
			job = a
		default:
			fmt.Fprintf(stderr, "drawdown report: one job at a time (got %q and %q)\n", job, a)
			return ExitUsage
		}
	}
	if job == "" {
		fmt.Fprintln(stderr, "drawdown report: which job? usage: drawdown report JOB [--out DIR] [--stdout] (JOB is a file or a job name)")
		return ExitUsage
	}
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
	in := record.Input{Job: j, Plan: model.Compute(j, cat), Now: time.Now()}
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
		out = "."
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
