package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// brokenSolveDir holds calc files that are wrong on purpose in ways only the solver can find
// (the notation's own broken files sit one level up, with goldens from lang's test).
const brokenSolveDir = "testdata/broken/solve"

// unreachableCodes are the documented codes no calc file can produce, each with the reason.
// A code on this list that a file does trigger fails TestBrokenCorpusCoversEveryCode, so the
// list cannot go stale silently.
var unreachableCodes = map[string]string{
	// lang refuses a quality outside 0..1 itself (HMB303) and leaves the given out of the model,
	// so the solver's own range check never sees one.
	"HMB405": "quality outside 0..1 is HMB303 in the notation",
	// The solver matches every given to an unknown before any balance (structure.go), and the
	// state checks (HMB401-HMB403, HMB406) drop a stream's extra givens before they become equations,
	// so the equation left over is always a balance: a wrong given shows as HMB503 instead.
	"HMB502": "a redundant given is never the equation left over; it shows as HMB503",
	// The limit is 5 s of wall clock per file; a calc file big enough to reach it would make
	// this test slow and its outcome depend on the machine.
	"HMB512": "the 5 s solve limit is not reached by a file of test size",
	// lang checks an expectation's property against the same stream properties and unit results
	// the solver computes (HMB212), and drops the expectation when it is not one of them.
	"HMB603": "an unknown expectation property is HMB212 in the notation",
}

// renderBroken is hmb check's text output for one file, then the exact range of every
// diagnostic: the caret line shows where a range starts and its width on that line only.
func renderBroken(fr *fileResult) []byte {
	var b bytes.Buffer
	writeText(&b, fr, textOptions{})
	li := newLineIndex(fr.src)
	b.WriteString("-- ranges (line:column, end exclusive) --\n")
	for _, d := range fr.diags {
		r := li.rng(d.Span)
		fmt.Fprintf(&b, "%s %d:%d-%d:%d\n", d.Code, r.Start.Line, r.Start.Column, r.End.Line, r.End.Column)
	}
	return b.Bytes()
}

func brokenFiles(t *testing.T, dir string) []string {
	t.Helper()
	names, err := filepath.Glob(filepath.Join(dir, "*.hmb"))
	if err != nil || len(names) == 0 {
		t.Fatalf("no calc files in %s: %v", dir, err)
	}
	for i := range names {
		names[i] = filepath.ToSlash(names[i])
	}
	return names
}

// TestBrokenSolveGolden runs the whole check (notation, then solver) over every file of
// testdata/broken/solve and compares hmb check's text output with NAME.golden beside it. The
// goldens are reviewed output: each file's header says what is wrong in it on purpose, and the
// physical facts behind the solved numbers are checked against python3-iapws in thermo/solve's
// tests, not here.
func TestBrokenSolveGolden(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	for _, name := range brokenFiles(t, brokenSolveDir) {
		t.Run(filepath.Base(name), func(t *testing.T) {
			src, err := os.ReadFile(name)
			if err != nil {
				t.Fatal(err)
			}
			fr := checkSource(name, src, nil)
			solverCodes := 0
			for _, d := range fr.diags {
				if len(d.Code) == 6 && strings.ContainsAny(d.Code[3:4], "4567") {
					solverCodes++
				}
				// A message never shows a number that is not one.
				for _, bad := range []string{"NaN", "Inf", "n/a"} {
					if strings.Contains(d.Message, bad) {
						t.Errorf("%s %s shows %q: %s", name, d.Code, bad, d.Message)
					}
				}
			}
			if solverCodes == 0 {
				t.Errorf("%s: the solver reports nothing; every file here is broken on purpose", name)
			}
			golden(t, strings.TrimSuffix(name, ".hmb")+".golden", renderBroken(fr))
		})
	}
}

// TestBrokenCorpusCoversEveryCode checks that the two broken corpora, through the same check
// hmb check runs, trigger every documented code except those no calc file can produce, and
// that each diagnostic carries the severity the code table documents.
func TestBrokenCorpusCoversEveryCode(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	documented := map[string]string{}
	for _, c := range allCodes() {
		documented[c.Code] = c.Severity.String()
	}
	seen := map[string]string{} // code -> first file that triggers it
	for _, dir := range []string{"testdata/broken", brokenSolveDir} {
		for _, name := range brokenFiles(t, dir) {
			src, err := os.ReadFile(name)
			if err != nil {
				t.Fatal(err)
			}
			for _, d := range checkSource(name, src, nil).diags {
				sev, ok := documented[d.Code]
				switch {
				case !ok:
					t.Errorf("%s: code %s is not in the code table: %s", name, d.Code, d.Message)
				case d.Severity.String() != sev:
					t.Errorf("%s: %s reported as %s, documented as %s: %s", name, d.Code, d.Severity, sev, d.Message)
				}
				if _, ok := seen[d.Code]; !ok {
					seen[d.Code] = name
				}
			}
		}
	}
	for code := range unreachableCodes {
		if _, ok := documented[code]; !ok {
			t.Errorf("unreachable code %s is not in the code table", code)
		}
	}
	for _, c := range allCodes() {
		file, hit := seen[c.Code]
		why, skip := unreachableCodes[c.Code]
		switch {
		case skip && hit:
			t.Errorf("%s is listed as unreachable (%s) but %s triggers it: take it off the list", c.Code, why, file)
		case !skip && !hit:
			t.Errorf("code %s (%s) is triggered by no file of testdata/broken or %s", c.Code, c.Summary, brokenSolveDir)
		}
	}
}
