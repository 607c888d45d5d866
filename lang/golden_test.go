package lang

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"hmb/lang/format"
	goldenfile "hmb/lang/golden"
	"hmb/lang/source"
	"hmb/thermo/model"
)

// Diagnostics renders diagnostics one per line as "line:col-line:col severity CODE: message",
// with related positions and fixes indented below; lines and columns 1-based, columns in code
// points (see lang/source).
func renderDiags(f *source.File, diags []model.Diagnostic) string {
	var b strings.Builder
	rng := func(s model.Span) string { return f.Position(s.Start).String() + "-" + f.Position(s.End).String() }
	for _, d := range diags {
		fmt.Fprintf(&b, "%s %s %s: %s\n", rng(d.Span), d.Severity, d.Code, d.Message)
		for _, r := range d.Related {
			fmt.Fprintf(&b, "\trelated %s: %s\n", rng(r.Span), r.Message)
		}
		if d.Fix != "" {
			fmt.Fprintf(&b, "\tfix: %s\n", d.Fix)
		}
	}
	return b.String()
}

func golden(t *testing.T, path string, got []byte) { goldenfile.Check(t, path, got) }

func files(t *testing.T, dir string) []string {
	t.Helper()
	names, err := filepath.Glob(filepath.Join("..", "testdata", dir, "*.hmb"))
	if err != nil || len(names) == 0 {
		t.Fatalf("no calc files in testdata/%s: %v", dir, err)
	}
	return names
}

// TestBroken checks the exact diagnostics of every file of the broken corpus, and that the corpus
// triggers every code the notation documents.
func TestBroken(t *testing.T) {
	seen := map[string]bool{}
	for _, name := range files(t, "broken") {
		src, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		r := Check(filepath.Base(name), src)
		for _, d := range r.Diags {
			seen[d.Code] = true
		}
		golden(t, strings.TrimSuffix(name, ".hmb")+".golden", []byte(renderDiags(r.File.Src, r.Diags)))
	}
	for _, c := range Codes {
		if !seen[c.Code] {
			t.Errorf("code %s (%s) is triggered by no file of testdata/broken", c.Code, c.Summary)
		}
	}
}

// TestGood formats the good files against their golden layout; they must have no errors.
func TestGood(t *testing.T) {
	for _, dir := range []string{"lang", "examples"} {
		for _, name := range files(t, dir) {
			src, err := os.ReadFile(name)
			if err != nil {
				t.Fatal(err)
			}
			r := Check(filepath.Base(name), src)
			if r.HasErrors() || r.Model.Incomplete {
				t.Errorf("%s:\n%s", name, renderDiags(r.File.Src, r.Diags))
			}
			if dir == "lang" {
				out, err := format.Source(name, src)
				if err != nil {
					t.Fatal(err)
				}
				golden(t, strings.TrimSuffix(name, ".hmb")+".golden", out)
			}
		}
	}
}

// TestFormatIdempotent formats every file of the test data that parses, twice.
func TestFormatIdempotent(t *testing.T) {
	for _, dir := range []string{"lang", "examples", "broken"} {
		for _, name := range files(t, dir) {
			src, _ := os.ReadFile(name)
			once, err := format.Source(name, src)
			if err != nil {
				continue // files with syntax errors are refused, as they should be
			}
			twice, err := format.Source(name, once)
			if err != nil || !bytes.Equal(once, twice) {
				t.Errorf("%s: formatting is not stable (%v):\n%s\n---\n%s", name, err, once, twice)
			}
			// Formatting changes layout only: the checked model is the same.
			a, b := Check(name, src), Check(name, once)
			if len(a.Diags) != len(b.Diags) || len(a.Model.Streams) != len(b.Model.Streams) || len(a.Model.Units) != len(b.Model.Units) {
				t.Errorf("%s: formatting changed the meaning", name)
			}
		}
	}
}
