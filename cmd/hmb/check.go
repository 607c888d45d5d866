package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// fileResult is everything hmb check reports about one file.
type fileResult struct {
	path    string
	src     []byte
	diags   []model.Diagnostic
	streams []jsonStream
	units   []jsonUnit
	totals  *jsonTotals  // nil when nothing was solved
	expects []jsonExpect // every expectation with its verdict
	table   string       // the solved-stream table in the file's units, for text output
	passes  []passed     // the expectations that hold, for text output with -v
	ambient float64      // K, the surroundings' temperature the entropy generation uses; 0 when there is no model
	recon   *jsonRecon   // nil when nothing could be solved
	cases   []jsonCase
	sweeps  []jsonSweep
}

func (f *fileResult) errors() int {
	n := 0
	for _, d := range f.diags {
		if d.Severity == model.Error {
			n++
		}
	}
	return n
}

func runCheck(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("check", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	format := fset.String("format", "text", "output format: text, json or sarif")
	sys := addSystemFlags(fset)
	quiet := fset.Bool("quiet", false, "errors and warnings only: no notes, no result tables")
	verbose := fset.Bool("v", false, "also list the expectations that hold")
	if err := parseFlags(fset, args, stdout); err != nil {
		return err
	}
	switch *format {
	case "text", "json", "sarif":
	default:
		return usageErr("unknown --format %q: use text, json or sarif", *format)
	}
	if fset.NArg() == 0 {
		return usageErr("no files: give calc files (*.hmb) or directories")
	}
	display, err := sys.display()
	if err != nil {
		return err
	}
	paths, err := collectFiles(fset.Args())
	if err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	results, err := checkFiles(paths, display)
	if err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	switch *format {
	case "json":
		err = writeJSON(stdout, results)
	case "sarif":
		err = writeSARIF(stdout, results)
	default:
		for _, f := range results {
			writeText(stdout, f, textOptions{quiet: *quiet, passes: *verbose && !*quiet})
			if !*quiet && f.table != "" {
				fmt.Fprintf(stdout, "%s\n%s\n", f.path, f.table)
			}
		}
	}
	if err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	nerr := 0
	for _, f := range results {
		nerr += f.errors()
	}
	if nerr > 0 {
		if *format == "text" {
			fmt.Fprintf(stderr, "hmb check: %d error(s) in %d file(s)\n", nerr, len(results))
		}
		return &exitError{code: 1}
	}
	return nil
}

// collectFiles expands directories to the *.hmb files below them, sorted; files named
// explicitly are taken whatever their extension.
func collectFiles(args []string) ([]string, error) {
	var out []string
	for _, a := range args {
		info, err := os.Stat(a)
		if err != nil {
			return nil, err
		}
		if !info.IsDir() {
			out = append(out, a)
			continue
		}
		err = filepath.WalkDir(a, func(p string, d fs.DirEntry, err error) error {
			if err != nil {
				return err
			}
			if d.IsDir() && p != a && strings.HasPrefix(d.Name(), ".") {
				return filepath.SkipDir
			}
			if !d.IsDir() && strings.HasSuffix(d.Name(), ".hmb") {
				out = append(out, p)
			}
			return nil
		})
		if err != nil {
			return nil, err
		}
	}
	if len(out) == 0 {
		return nil, errors.New("no *.hmb files found")
	}
	sort.Strings(out)
	return out, nil
}

// checkFiles checks files in parallel; results come back in the order of paths.
func checkFiles(paths []string, display *units.System) ([]*fileResult, error) {
	results := make([]*fileResult, len(paths))
	errs := make([]error, len(paths))
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.GOMAXPROCS(0))
	for i, p := range paths {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			defer func() { <-sem }()
			src, err := os.ReadFile(p)
			if err != nil {
				errs[i] = err
				return
			}
			results[i] = checkSource(p, src, display)
		}()
	}
	wg.Wait()
	return results, errors.Join(errs...)
}
