package main

import (
	"bytes"
	"context"
	"flag"
	"fmt"
	"hmb/lang/source"
	"io"
	"os"

	"hmb/thermo/model"
	"hmb/thermo/report"
)

// runReport writes one self-contained HTML page for a calc file: tables, diagrams, findings.
func runReport(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("report", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	out := fset.String("o", "", "write the page to this file instead of standard output")
	sys := addSystemFlags(fset)
	if err := parseFlags(fset, args, stdout); err != nil {
		return err
	}
	in, err := loadReportInput(fset, sys, stderr)
	if err != nil {
		return err
	}
	in.Sweeps = sweepsOf(context.Background(), in.Model)
	for _, r := range in.Sweeps {
		in.Diags = append(in.Diags, r.Diags...)
	}
	var buf bytes.Buffer
	if err := report.WritePage(&buf, in, report.PageOptions{Version: version}); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	if err := emit(*out, buf.Bytes(), stdout); err != nil {
		return err
	}
	return findingsExit(in)
}

// loadReportInput checks the one file named on the command line. A file whose notation could not
// be read into a model is an error (exit 1) with its diagnostics on stderr; a file that reads but
// does not solve cleanly is still reported, with its findings.
func loadReportInput(fset *flag.FlagSet, sys systemFlags, stderr io.Writer) (*report.Input, error) {
	display, err := sys.display()
	if err != nil {
		return nil, err
	}
	if fset.NArg() != 1 {
		return nil, usageErr("give exactly one calc file (got %d arguments)", fset.NArg())
	}
	path := fset.Arg(0)
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, &exitError{code: 2, msg: err.Error()}
	}
	c := checkModel(context.Background(), path, src, display)
	if c.model == nil {
		writeText(stderr, &fileResult{path: path, src: src, diags: c.diags}, textOptions{})
		return nil, &exitError{code: 1, msg: fmt.Sprintf("%s could not be read into a model", path)}
	}
	lines := source.New(path, src)
	where := func(off int) string { return lines.Position(off).String() }
	return &report.Input{Path: path, Src: src, Model: c.model, Result: c.res, Diags: c.diags, Where: where, Cases: c.cases}, nil
}

// emit writes output to stdout, or to path atomically.
func emit(path string, data []byte, stdout io.Writer) error {
	if path == "" || path == "-" {
		_, err := stdout.Write(data)
		return err
	}
	if err := writeFileAtomic(path, data); err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	return nil
}

// findingsExit gives the exit status after the output is written: 1 when the file has errors,
// as hmb check would, so a script notices; the output itself was written either way.
func findingsExit(in *report.Input) error {
	n := 0
	for _, d := range in.Diags {
		if d.Severity == model.Error {
			n++
		}
	}
	if n > 0 {
		return &exitError{code: 1, msg: fmt.Sprintf("%s has %d error(s); output written (hmb check lists them)", in.Path, n)}
	}
	return nil
}
