package main

import (
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const dairy = "../../testdata/examples/dairy_loads.hmb"

// TestBrokenCasesKeepTheRest: cases and sweeps in error are reported at their place and not
// solved, while the base and the sound cases and sweeps are.
func TestBrokenCasesKeepTheRest(t *testing.T) {
	for _, tt := range []struct {
		file          string
		solvedCases   []string // cases solved without errors of their own
		unsolvedCases []string
		sweeps        map[string]int // sweeps run, with their points
	}{
		{"cases.hmb", []string{"hot"}, []string{"typo", "dims", "wiring"}, nil},
		{"sweeps.hmb", []string{"hot"}, nil, map[string]int{"rising": 7}},
	} {
		t.Run(tt.file, func(t *testing.T) {
			path := filepath.Join("../../testdata/broken", tt.file)
			src, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			fr := checkSource(path, src, nil)
			if len(fr.streams) != 2 || fr.streams[1].T != fr.streams[1].T { // LP solved: not NaN
				t.Fatalf("base not solved: %+v", fr.streams)
			}
			byName := map[string]jsonCase{}
			for _, c := range fr.cases {
				byName[c.Name] = c
			}
			for _, n := range tt.solvedCases {
				c, ok := byName[n]
				if !ok || len(c.Streams) != 2 || len(c.diags) != 0 {
					t.Errorf("case %s: %d streams, findings %v", n, len(c.Streams), c.diags)
				}
			}
			for _, n := range tt.unsolvedCases {
				c := byName[n]
				if len(c.Streams) != 0 || len(c.diags) == 0 {
					t.Errorf("case %s: solved, or its errors not listed with it: %v", n, c.diags)
				}
				for _, d := range c.diags {
					if d.Case != n || !strings.HasPrefix(d.Message, "case "+n+": ") {
						t.Errorf("case %s: finding not marked: %+v", n, d)
					}
				}
			}
			run := map[string]int{}
			for _, s := range fr.sweeps {
				run[s.Name] = len(s.Points)
			}
			for n, pts := range tt.sweeps {
				if run[n] != pts {
					t.Errorf("sweep %s: %d points, want %d", n, run[n], pts)
				}
			}
			if len(run) != len(tt.sweeps) {
				t.Errorf("sweeps run %v, want %v", run, tt.sweeps)
			}
		})
	}
}

// TestCaseJSONAndSARIF: the JSON of a file with cases keeps the base as it was and lists each
// case with the base's fields (the contract's keys); SARIF marks a case's findings.
func TestCaseJSONAndSARIF(t *testing.T) {
	file := "../../testdata/broken/solve/cases.hmb"
	code, out, _ := runReportCmd("check", "--format", "json", file)
	if code != 1 {
		t.Errorf("exit %d, want 1: cases fail", code)
	}
	var doc struct {
		Files []map[string]json.RawMessage `json:"files"`
	}
	if err := json.Unmarshal(out, &doc); err != nil {
		t.Fatal(err)
	}
	var cs []map[string]json.RawMessage
	if err := json.Unmarshal(doc.Files[0]["cases"], &cs); err != nil {
		t.Fatal(err)
	}
	want := []string{"name", "label", "streams", "units", "totals", "expectations", "diagnostics"}
	for _, c := range cs {
		if len(c) != len(want) {
			t.Errorf("case keys %d, want %v", len(c), want)
		}
		for _, k := range want {
			if _, ok := c[k]; !ok {
				t.Errorf("case without %q", k)
			}
		}
	}
	var base []struct{ Case string }
	json.Unmarshal(doc.Files[0]["diagnostics"], &base)
	for _, d := range base {
		if d.Case != "" {
			t.Errorf("the base lists a finding of case %s", d.Case)
		}
	}
	_, out, _ = runReportCmd("check", "--format", "sarif", file)
	var sarif struct {
		Runs []struct {
			Results []struct {
				Message    struct{ Text string }
				Properties map[string]string
			}
		}
	}
	if err := json.Unmarshal(out, &sarif); err != nil {
		t.Fatal(err)
	}
	marked := 0
	for _, r := range sarif.Runs[0].Results {
		if c := r.Properties["case"]; c != "" {
			marked++
			if !strings.HasPrefix(r.Message.Text, "case "+c+": ") {
				t.Errorf("SARIF %q marked %s", r.Message.Text, c)
			}
		}
	}
	if marked != 2 { // uphill's HMB514, wet's HMB601
		t.Errorf("%d SARIF results marked with a case, want 2", marked)
	}
}

// TestCaseAndSweepCommands: table --case, table --sweep (Markdown, CSV), plot --sweep and their
// usage errors.
func TestCaseAndSweepCommands(t *testing.T) {
	code, out, stderr := runReportCmd("table", "--case", "low", dairy)
	if code != 0 || !strings.HasPrefix(string(out), "# Fenwick Dale Dairy: process steam at three loads: case low (minimum load)") {
		t.Errorf("table --case: exit %d %s\n%.200s", code, stderr, out)
	}
	// python3-iapws, expected.py: the low case's FW flow is 4 kg/s.
	if !strings.Contains(string(out), "| FW     | boiler feedwater        |      4.0000 |") {
		t.Errorf("table --case low does not show the case's feedwater flow:\n%s", out)
	}
	code, out, _ = runReportCmd("table", "--sweep", "load", "--format", "csv", "--result", "SW flow", "--result", "T1 power", dairy)
	recs, err := csv.NewReader(strings.NewReader(string(out))).ReadAll()
	if code != 0 || err != nil || len(recs) != 2+7 || strings.Join(recs[0], ",") != "FW flow,SW flow,T1 power" || strings.Join(recs[1], ",") != "kg/s,kg/s,kW" {
		t.Fatalf("table --sweep csv: exit %d %v %q", code, err, recs)
	}
	code, out, _ = runReportCmd("plot", "--sweep", "load", dairy)
	if code != 0 || xmlWellFormed(out) != nil || strings.Count(string(out), `class="panel"`) != 4 || strings.Count(string(out), `class="point"`) != 4*7 {
		t.Errorf("plot --sweep: exit %d, %d panels", code, strings.Count(string(out), `class="panel"`))
	}
	for _, tt := range []struct {
		args []string
		msg  string
	}{
		{[]string{"table", "--case", "high", dairy}, "no case high in " + dairy + " (cases: low, dispatch, fouled)"},
		{[]string{"table", "--sweep", "spray", dairy}, "no sweep spray in " + dairy + " (sweeps: load)"},
		{[]string{"table", "--case", "low", "--sweep", "load", dairy}, "--case and --sweep exclude each other"},
		{[]string{"table", "--result", "SW flow", dairy}, "--result picks results of a sweep: give --sweep NAME"},
		{[]string{"table", "--sweep", "load", "--result", "SW", dairy}, `--result "SW": name a result as NAME RESULT`},
		{[]string{"plot", "--sweep", "load", "--result", "XX T", dairy}, `--result "XX T": no stream or unit is named XX`},
		{[]string{"table", "--sweep", "load", "--format", "html", dairy}, `a sweep's table is md or csv, not "html"`},
	} {
		code, _, stderr := runReportCmd(tt.args...)
		if code != 2 || !strings.Contains(stderr, tt.msg) {
			t.Errorf("%v: exit %d %q, want 2 and %q", tt.args, code, stderr, tt.msg)
		}
	}
}

// TestSweepPlotMarksFailures: points that did not solve are crossed out with their reason.
func TestSweepPlotMarksFailures(t *testing.T) {
	_, out, _ := runReportCmd("plot", "--sweep", "inlet", "../../testdata/broken/solve/cases.hmb")
	var svg struct {
		Groups []struct {
			Class  string `xml:"class,attr"`
			Groups []struct {
				Class string `xml:"class,attr"`
				Title string `xml:"title"`
			} `xml:"g"`
		} `xml:"g"`
	}
	if err := xml.Unmarshal(out, &svg); err != nil {
		t.Fatal(err)
	}
	var crosses []string
	for _, p := range svg.Groups {
		for _, g := range p.Groups {
			if g.Class == "failed" {
				crosses = append(crosses, g.Title)
			}
		}
	}
	// Two panels (S2 T, S2 x), two points below the outlet's 1 bar each.
	if len(crosses) != 4 || !strings.HasPrefix(crosses[0], "0.60000 bar: valve V1: outlet S2 at 100.00 kPa is above inlet S1") {
		t.Errorf("crosses %q", crosses)
	}
}
