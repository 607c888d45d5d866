package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"os"
)

func runFmt(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("fmt", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	write := fset.Bool("w", false, "rewrite files in place")
	check := fset.Bool("check", false, "list files whose layout differs; exit 1 if any")
	if err := parseFlags(fset, args, stdout); err != nil {
		return err
	}
	if *write && *check {
		return usageErr("-w and --check exclude each other")
	}
	if fset.NArg() == 0 {
		return usageErr("no files: give calc files (*.hmb) or directories")
	}
	paths, err := collectFiles(fset.Args())
	if err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	differ, failed, unwritten := 0, 0, 0
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			return &exitError{code: 2, msg: err.Error()}
		}
		out, err := formatSource(p, src)
		if err != nil {
			// A file that does not parse is never rewritten.
			fmt.Fprintf(stderr, "%v\n", err)
			failed++
			continue
		}
		same := bytes.Equal(src, out)
		switch {
		case *check:
			if !same {
				fmt.Fprintln(stdout, p)
				differ++
			}
		case *write:
			if !same {
				if err := writeFileAtomic(p, out); err != nil {
					fmt.Fprintf(stderr, "hmb fmt: %v\n", err)
					unwritten++
				}
			}
		default:
			stdout.Write(out)
		}
	}
	if unwritten > 0 {
		return &exitError{code: 2, msg: fmt.Sprintf("%d file(s) could not be rewritten; left unchanged", unwritten)}
	}
	if failed > 0 {
		return &exitError{code: 1, msg: fmt.Sprintf("%d file(s) do not parse; left unchanged", failed)}
	}
	if differ > 0 {
		return &exitError{code: 1}
	}
	return nil
}
