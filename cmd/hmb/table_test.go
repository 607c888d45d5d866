package main

import (
	"bytes"
	"encoding/csv"
	"encoding/xml"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

const (
	reportExamples = "../../testdata/examples"
	reportGoldens  = "../../testdata/report"
)

func exampleFiles(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(reportExamples, "*.hmb"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no examples in %s: %v", reportExamples, err)
	}
	return files
}

// runReportCmd runs one hmb subcommand and returns its exit status, stdout and stderr.
func runReportCmd(args ...string) (int, []byte, string) {
	var out, errb bytes.Buffer
	code := run(args, nil, &out, &errb)
	return code, out.Bytes(), errb.String()
}

// TestTableGolden keeps the tables of every example as reviewed golden files. The examples are
// invented demos; the numbers in them are checked against python3-iapws in the report package's
// own tests, these goldens only pin what a reviewer has seen.
func TestTableGolden(t *testing.T) {
	for _, f := range exampleFiles(t) {
		base := strings.TrimSuffix(filepath.Base(f), ".hmb")
		for _, format := range []string{"md", "csv", "html"} {
			t.Run(base+"."+format, func(t *testing.T) {
				code, out, stderr := runReportCmd("table", "--format", format, f)
				if code == 2 {
					t.Fatalf("exit 2: %s", stderr)
				}
				golden(t, filepath.Join(reportGoldens, base+".table."+format), out)
			})
		}
	}
}

// TestTableCSVParses reads each example's CSV back with encoding/csv: the sections of the
// streams, their conditions and the units, then those of the exchangers and the totals when the
// plant has any, and the basis (the ambient); each a row of names, a row of units and rows of
// equal length whose numeric
// cells parse as numbers.
func TestTableCSVParses(t *testing.T) {
	for _, f := range exampleFiles(t) {
		for _, sys := range []string{"--si", "--us"} {
			_, out, stderr := runReportCmd("table", "--format", "csv", sys, f)
			if len(out) == 0 {
				t.Fatalf("%s %s: no output: %s", f, sys, stderr)
			}
			sections := strings.Split(strings.TrimSuffix(string(out), "\n"), "\n\n")
			// A metered plant's reconciliation (its measurements, the ± of the stream values,
			// the unit results with theirs) comes before the basis.
			var metered []string
			if strings.Contains(string(out), "\nmeter,") || strings.HasPrefix(string(out), "meter,") {
				metered = []string{"meter", "stream"}
				if strings.Contains(string(out), "\nunit,result,") {
					metered = append(metered, "unit")
				}
			}
			// The cases side by side and their expectations come after it.
			var cased []string
			if strings.Contains(string(out), "\nname,result,unit,base,") {
				cased = []string{"name", "expectation"}
			}
			n := len(sections) - len(metered) - len(cased)
			if n < 4 || n > 6 {
				t.Fatalf("%s: %d sections", f, len(sections))
			}
			first := []string{"stream", "stream", "unit"}
			switch n {
			case 5:
				first = append(first, "total")
			case 6:
				first = append(first, "unit", "total")
			}
			first = append(append(append(first[:len(first):len(first)], metered...), "ambient"), cased...)
			for k, sec := range sections {
				recs, err := csv.NewReader(strings.NewReader(sec)).ReadAll() // equal lengths enforced
				if err != nil {
					t.Fatalf("%s section %d: %v", f, k, err)
				}
				if len(recs) < 2 || recs[0][0] != first[k] {
					t.Fatalf("%s section %d: %q", f, k, recs)
				}
				units := recs[1]
				if k == 0 && sys == "--us" && (units[2] != "lbm/h" || units[3] != "psia" || units[4] != "F") {
					t.Errorf("%s: US unit row %q", f, units)
				}
				for _, rec := range recs[2:] {
					for j, c := range rec {
						if units[j] == "" && recs[0][j] != "x" && recs[0][j] != "efficiency" || c == "" || recs[0][j] == "given" {
							continue
						}
						if _, err := strconv.ParseFloat(c, 64); err != nil {
							t.Errorf("%s: %s %q is not a number", f, recs[0][j], c)
						}
					}
				}
			}
		}
	}
}

// TestTableHTMLWellFormed parses each example's HTML table page as XML.
func TestTableHTMLWellFormed(t *testing.T) {
	for _, f := range exampleFiles(t) {
		_, out, stderr := runReportCmd("table", "--format", "html", f)
		if err := xmlWellFormed(out); err != nil {
			t.Errorf("%s: %v\n%s", f, err, stderr)
		}
	}
}

// xmlWellFormed reads a document to its end with a strict XML decoder.
func xmlWellFormed(data []byte) error {
	d := xml.NewDecoder(bytes.NewReader(data))
	d.Strict = true
	depth, roots := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return err
		}
		switch tok.(type) {
		case xml.StartElement:
			if depth == 0 {
				roots++
			}
			depth++
		case xml.EndElement:
			depth--
		}
	}
	if roots != 1 || depth != 0 {
		return &xml.SyntaxError{Msg: "want exactly one root element", Line: 0}
	}
	return nil
}

func TestTableUsage(t *testing.T) {
	for _, tt := range []struct {
		args []string
		code int
		msg  string
	}{
		{[]string{"table"}, 2, "exactly one calc file"},
		{[]string{"table", "a.hmb", "b.hmb"}, 2, "exactly one calc file"},
		{[]string{"table", "--format", "xlsx", "x.hmb"}, 2, "unknown --format"},
		{[]string{"table", "--si", "--us", "x.hmb"}, 2, "exclude each other"},
		{[]string{"table", "no/such/file.hmb"}, 2, "no such file"},
		{[]string{"plot", "--kind", "pv", "x.hmb"}, 2, "unknown diagram kind"},
		{[]string{"report", "--bogus", "x.hmb"}, 2, "bogus"},
	} {
		code, _, stderr := runReportCmd(tt.args...)
		if code != tt.code || !strings.Contains(stderr, tt.msg) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", tt.args, code, stderr, tt.code, tt.msg)
		}
	}
}
