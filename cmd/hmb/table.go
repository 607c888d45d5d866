package main

import (
	"bytes"
	"flag"
	"io"

	"hmb/thermo/cases"
	"hmb/thermo/report"
)

// runTable prints the solved stream and unit tables of one calc file.
func runTable(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("table", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	format := fset.String("format", "md", "output format: md, csv or html")
	out := fset.String("o", "", "write to this file instead of standard output")
	sys := addSystemFlags(fset)
	cf := addCaseFlags(fset, false)
	if err := parseFlags(fset, args, stdout); err != nil {
		return err
	}
	if err := cf.check(); err != nil {
		return err
	}
	if *cf.sweep != "" {
		return sweepTable(fset, sys, cf, *format, *out, stdout, stderr)
	}
	write := map[string]func(io.Writer, *report.Input) error{
		"md": report.WriteMarkdown, "csv": report.WriteCSV, "html": report.WriteHTML,
	}[*format]
	if write == nil {
		return usageErr("unknown --format %q: use md, csv or html", *format)
	}
	in, err := loadReportInput(fset, sys, stderr)
	if err != nil {
		return err
	}
	if *cf.kase != "" {
		if in, err = caseInput(in, *cf.kase); err != nil {
			return err
		}
	}
	var buf bytes.Buffer
	if err := write(&buf, in); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	if err := emit(*out, buf.Bytes(), stdout); err != nil {
		return err
	}
	return findingsExit(in)
}

// sweepTable prints a sweep's results against the swept value.
func sweepTable(fset *flag.FlagSet, sys systemFlags, cf caseFlags, format, out string, stdout, stderr io.Writer) error {
	write := map[string]func(io.Writer, *cases.SweepResult) error{"md": report.WriteSweepMarkdown, "csv": report.WriteSweepCSV}[format]
	if write == nil {
		return usageErr("a sweep's table is md or csv, not %q", format)
	}
	in, err := loadReportInput(fset, sys, stderr)
	if err != nil {
		return err
	}
	r, err := sweepOf(in, *cf.sweep, *cf.results)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := write(&buf, r); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	return emit(out, buf.Bytes(), stdout)
}
