package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPlotExamples draws every example in every kind; each SVG must be well-formed XML, carry the
// file's units on its axes and mark every stream the table shows as solved. The dome's accuracy
// is read back from the SVG in the report package's tests.
func TestPlotExamples(t *testing.T) {
	for _, f := range exampleFiles(t) {
		_, table, _ := runReportCmd("table", "--format", "csv", f)
		recs := strings.Split(strings.Split(string(table), "\n\n")[0], "\n")
		for _, kind := range []string{"Ts", "hs", "ph", "flowsheet"} {
			code, out, stderr := runReportCmd("plot", "--kind", kind, f)
			if code == 2 || len(out) == 0 {
				t.Fatalf("%s %s: exit %d: %s", f, kind, code, stderr)
			}
			if err := xmlWellFormed(out); err != nil {
				t.Errorf("%s %s: %v", f, kind, err)
			}
			svg := string(out)
			if strings.Contains(svg, "NaN") {
				t.Errorf("%s %s: NaN in the SVG", f, kind)
			}
			unitRow := strings.Split(recs[1], ",")
			if kind == "ph" && !strings.Contains(svg, "pressure p ("+unitRow[3]+", absolute)") {
				t.Errorf("%s %s: pressure axis not in %s", f, kind, unitRow[3])
			}
			for _, rec := range recs[2:] {
				name, _, _ := strings.Cut(rec, ",")
				if strings.HasSuffix(rec, ",unsolved") {
					continue
				}
				if !strings.Contains(svg, `data-stream="`+name+`"`) {
					t.Errorf("%s %s: stream %s not drawn", f, kind, name)
				}
			}
		}
	}
}

// TestPlotWritesFileAtomically writes with -o twice (creating, then replacing) and leaves no
// temporary file behind.
func TestPlotWritesFileAtomically(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "d.svg")
	f := exampleFiles(t)[0]
	for i := 0; i < 2; i++ {
		if code, _, stderr := runReportCmd("plot", "--kind", "hs", "-o", out, f); code == 2 {
			t.Fatalf("exit 2: %s", stderr)
		}
	}
	data, err := os.ReadFile(out)
	if err != nil || xmlWellFormed(data) != nil {
		t.Fatalf("%v %v", err, xmlWellFormed(data))
	}
	if info, _ := os.Stat(out); info.Mode().Perm() != 0o644 {
		t.Errorf("mode %v", info.Mode())
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("directory holds %d entries, want only d.svg", len(ents))
	}
	if code, _, _ := runReportCmd("plot", "-o", filepath.Join(dir, "missing", "d.svg"), f); code != 2 {
		t.Errorf("unwritable output: exit %d, want 2", code)
	}
}
