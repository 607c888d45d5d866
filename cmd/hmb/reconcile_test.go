package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestMeteredExamples checks the reconciliation hmb check --format json reports for every example
// plant whose readings expected.py reconciles independently (scipy and python3-iapws, through
// testdata/reconcile/nonlinear.py): the JSON contract's keys and values, measurement by
// measurement, and the suspect flag against the normalised correction.
func TestMeteredExamples(t *testing.T) {
	b, err := os.ReadFile(expectedJSON)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Files map[string]struct {
			Reconciliation *struct {
				Redundancy   int     `json:"redundancy"`
				Chi2         float64 `json:"chi2"`
				Measurements []struct {
					Name, Property       string
					Measured, Reconciled float64
					UReconciled          float64  `json:"u_reconciled"`
					Test                 *float64 `json:"test"`
				} `json:"measurements"`
			} `json:"reconciliation"`
		} `json:"files"`
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	n := 0
	for base, f := range doc.Files {
		want := f.Reconciliation
		if want == nil {
			continue
		}
		n++
		t.Run(base, func(t *testing.T) {
			path := filepath.Join(examplesDir, base)
			src, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			var out struct {
				Files []map[string]json.RawMessage `json:"files"`
			}
			var buf jsonBuffer
			if err := writeJSON(&buf, []*fileResult{checkSource(path, src, nil)}); err != nil {
				t.Fatal(err)
			}
			if err := json.Unmarshal(buf.b, &out); err != nil {
				t.Fatal(err)
			}
			var got struct {
				Redundancy   *int     `json:"redundancy"`
				Chi2         *float64 `json:"chi2"`
				Chi2Limit    *float64 `json:"chi2_limit"`
				Passed       *bool    `json:"passed"`
				Measurements []struct {
					Name        *string  `json:"name"`
					Property    *string  `json:"property"`
					Measured    *float64 `json:"measured"`
					Reconciled  *float64 `json:"reconciled"`
					UMeasured   *float64 `json:"u_measured"`
					UReconciled *float64 `json:"u_reconciled"`
					Test        *float64 `json:"test"`
					Suspect     *bool    `json:"suspect"`
				} `json:"measurements"`
			}
			if err := json.Unmarshal(out.Files[0]["reconciliation"], &got); err != nil {
				t.Fatal(err)
			}
			if got.Redundancy == nil || got.Chi2 == nil || got.Chi2Limit == nil || got.Passed == nil {
				t.Fatalf("reconciliation lacks a key: %s", out.Files[0]["reconciliation"])
			}
			if *got.Redundancy != want.Redundancy || math.Abs(*got.Chi2-want.Chi2) > 1e-6*want.Chi2 {
				t.Errorf("redundancy %d, chi2 %.10g; want %d, %.10g", *got.Redundancy, *got.Chi2, want.Redundancy, want.Chi2)
			}
			if *got.Passed != (*got.Chi2 <= *got.Chi2Limit) {
				t.Errorf("passed %v with chi2 %g and limit %g", *got.Passed, *got.Chi2, *got.Chi2Limit)
			}
			if len(got.Measurements) != len(want.Measurements) {
				t.Fatalf("%d measurements, want %d", len(got.Measurements), len(want.Measurements))
			}
			for i, w := range want.Measurements {
				g := got.Measurements[i]
				if g.Name == nil || g.Property == nil || g.Measured == nil || g.Reconciled == nil || g.UMeasured == nil || g.UReconciled == nil || g.Test == nil || g.Suspect == nil {
					t.Fatalf("measurement %d lacks a key", i)
				}
				if *g.Name != w.Name || *g.Property != w.Property {
					t.Errorf("measurement %d is %s %s, want %s %s (the file's order)", i, *g.Name, *g.Property, w.Name, w.Property)
					continue
				}
				what := w.Name + " " + w.Property
				sigma := *g.UMeasured / 1.96
				if *g.Measured != w.Measured || math.Abs(*g.Reconciled-w.Reconciled) > 1e-6*sigma {
					t.Errorf("%s: measured %.10g, reconciled %.10g; want %.10g, %.10g", what, *g.Measured, *g.Reconciled, w.Measured, w.Reconciled)
				}
				if math.Abs(*g.UReconciled-w.UReconciled) > 1e-5*w.UReconciled {
					t.Errorf("%s: u_reconciled %.8g, want %.8g", what, *g.UReconciled, w.UReconciled)
				}
				if w.Test != nil && math.Abs(*g.Test-*w.Test) > 1e-5**w.Test {
					t.Errorf("%s: test %.8g, want %.8g", what, *g.Test, *w.Test)
				}
				if *g.Suspect != (*g.Test > 1.96) {
					t.Errorf("%s: suspect %v with test %.4g", what, *g.Suspect, *g.Test)
				}
			}
		})
	}
	if n == 0 {
		t.Error("no example plant has readings to reconcile")
	}
}

type jsonBuffer struct{ b []byte }

func (w *jsonBuffer) Write(p []byte) (int, error) { w.b = append(w.b, p...); return len(p), nil }

// TestReportReconciliation: the report page of a metered plant carries the reconciliation (the
// measurement table with the suspect meter flagged, the ± of every stream value, the unit
// results with theirs); a plant without measurements has no such section.
func TestReportReconciliation(t *testing.T) {
	metered := filepath.Join(examplesDir, "metered_turbine.hmb")
	code, out, stderr := runReportCmd("report", metered)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	page := string(out)
	i, j := strings.Index(page, "<h2>Reconciliation</h2>"), strings.Index(page, "<h2>Diagrams</h2>")
	if i < 0 || j < i {
		t.Fatal("no reconciliation section before the diagrams")
	}
	sec := page[i:j]
	for _, want := range []string{"Measurements", "Stream uncertainties", "Unit results", "efficiency", "95 % half-width"} {
		if !strings.Contains(sec, want) {
			t.Errorf("reconciliation section lacks %q", want)
		}
	}
	// The boiler-steam flow row: measured and reconciled with their ±, flagged suspect.
	row := sec[strings.Index(sec, "MS flow"):]
	row = row[:strings.Index(row, "</tr>")]
	if !strings.Contains(row, ">18.100<") || !strings.Contains(row, ">0.27<") || !strings.Contains(row, "suspect") {
		t.Errorf("MS flow row: %s", row)
	}
	_, out, _ = runReportCmd("report", filepath.Join(examplesDir, "steam_header.hmb"))
	if strings.Contains(string(out), "<h2>Reconciliation</h2>") {
		t.Error("a plant without measurements shows a reconciliation section")
	}
}
