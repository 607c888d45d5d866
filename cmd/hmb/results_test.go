package main

import (
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/report"
	"hmb/thermo/units"
)

// TestEveryResultRoundTrips keeps the layers that name results from drifting apart. For every
// example plant, in SI and in US display units, it writes an expectation on every result of every
// stream and unit (the catalogue's names), with the solved value as hmb prints it, label and all;
// then the notation must accept each one (name and unit label), the solver must find each one
// holding, and the report must show each one's value and verdict. A result known to one layer
// and not another, or a unit label hmb prints and does not read, fails here.
func TestEveryResultRoundTrips(t *testing.T) {
	paths, err := filepath.Glob(filepath.Join(examplesDir, "*.hmb"))
	if err != nil || len(paths) == 0 {
		t.Fatalf("no examples: %v", err)
	}
	total := 0
	for _, path := range paths {
		src, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		for _, sys := range []units.System{units.SI, units.US} {
			c := checkModel(context.Background(), path, src, &sys)
			if c.res == nil {
				t.Fatalf("%s: not solved", path)
			}
			m := c.model
			disp := units.Display{System: sys, Atm: m.Atm}
			var b strings.Builder
			for _, line := range strings.SplitAfter(string(src), "\n") {
				if !strings.HasPrefix(line, "display ") {
					b.WriteString(line)
				}
			}
			fmt.Fprintf(&b, "\ndisplay %s\n", sys)
			write := func(name string, sub model.Subject) {
				for _, r := range m.Results(sub) {
					v, _, ok := c.res.Value(m, sub, r.Name)
					if !ok {
						t.Errorf("%s %s: catalogue result %s has no value", path, name, r.Name)
						continue
					}
					if math.IsNaN(v) {
						continue // not solved, or a quality of a single-phase state
					}
					tol := "0.1 %"
					if r.Dim == units.Temperature { // a % of a temperature is refused (HMB319)
						tol = disp.Delta(r.Dim, 0.05)
					}
					fmt.Fprintf(&b, "expect %s %s = %s within %s\n", name, r.Name, disp.Show(r.Dim, v), tol)
					total++
				}
			}
			for i, s := range m.Streams {
				write(s.Name, model.Subject{Kind: model.StreamSubject, Index: i})
			}
			for i, u := range m.Units {
				write(u.Name, model.Subject{Kind: model.UnitSubject, Index: i})
			}
			text := b.String()
			c2 := checkModel(context.Background(), path, []byte(text), nil)
			for _, d := range c2.diags {
				if d.Severity == model.Error {
					line := text[max(0, d.Span.Start):min(len(text), d.Span.End)]
					t.Errorf("%s (%s): %s %s at %q", path, sys, d.Code, d.Message, line)
				}
			}
			in := &report.Input{Path: path, Src: []byte(text), Model: c2.model, Result: c2.res, Diags: c2.diags}
			for _, e := range report.Expectations(in) {
				if e.Verdict != report.Pass || e.Value == report.Unsolved {
					t.Errorf("%s (%s): report shows %q = %s, %v %s", path, sys, e.Text, e.Value, e.Verdict, e.Reason)
				}
			}
		}
	}
	if total < 500 {
		t.Errorf("only %d expectations written", total)
	}
}
