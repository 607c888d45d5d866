package main

import (
	"bytes"
	"flag"
	"io"

	"hmb/thermo/report"
)

// runPlot draws a property diagram of one calc file as SVG.
func runPlot(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("plot", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	kindArg := fset.String("kind", "Ts", "diagram: Ts, hs, ph, or flowsheet (the heat and material balance diagram)")
	full := fset.Bool("full-dome", false, "span the axes over the whole saturation dome, not just the streams")
	values := fset.Bool("values", false, "flowsheet: show each stream's flow, p and T under its tag")
	out := fset.String("o", "", "write the SVG to this file instead of standard output")
	sys := addSystemFlags(fset)
	cf := addCaseFlags(fset, true)
	if err := parseFlags(fset, args, stdout); err != nil {
		return err
	}
	if err := cf.check(); err != nil {
		return err
	}
	if *cf.sweep != "" {
		return sweepPlot(fset, sys, cf, *out, stdout, stderr)
	}
	kind, err := report.ParseKind(*kindArg)
	if err != nil {
		return usageErr("%v", err)
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
	if err := report.Plot(&buf, in, report.PlotOptions{Kind: kind, FullDome: *full, Values: *values}); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	if err := emit(*out, buf.Bytes(), stdout); err != nil {
		return err
	}
	return findingsExit(in)
}

// sweepPlot draws results of a sweep against the swept value.
func sweepPlot(fset *flag.FlagSet, sys systemFlags, cf caseFlags, out string, stdout, stderr io.Writer) error {
	in, err := loadReportInput(fset, sys, stderr)
	if err != nil {
		return err
	}
	r, err := sweepOf(in, *cf.sweep, *cf.results)
	if err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := report.SweepPlot(&buf, r, nil); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	return emit(out, buf.Bytes(), stdout)
}
