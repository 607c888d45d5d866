package main

import (
	"bytes"
	"context"
	"encoding/json"
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
					if r.Dim == units.Temperature || v == 0 { // a % of a temperature is refused (HMB319)
						tol = disp.Delta(r.Dim, 0.05)
					}
					shown := disp.Show(r.Dim, v)
					if r.Delta {
						shown = disp.Delta(r.Dim, v)
					}
					fmt.Fprintf(&b, "expect %s %s = %s within %s\n", name, r.Name, shown, tol)
					total++
				}
			}
			for i, s := range m.Streams {
				write(s.Name, model.Subject{Kind: model.StreamSubject, Index: i})
			}
			for i, u := range m.Units {
				write(u.Name, model.Subject{Kind: model.UnitSubject, Index: i})
			}
			write(model.TotalName, model.Subject{Kind: model.TotalSubject})
			text := b.String()
			c2 := checkModel(context.Background(), path, []byte(text), nil)
			for _, d := range c2.diags {
				// The expectations written hold in the base; a case's values differ by design.
				if d.Severity == model.Error && d.Case == "" {
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

// TestCheckJSONResults checks the JSON contract of issue 12 on testdata/cli/plant.hmb: the
// derived stream values, each unit's drop, efficiency and ports, the file's totals and every
// expectation with its verdict, in SI base units under exactly these keys. References from
// python3-iapws 1.5.2 (W = IAPWS97, P in MPa): MS at 43 barg (4.401325 MPa) has
// W(P=4.401325, x=0).T = 529.2412401419949 K, so 693.15 K is 163.90875985800506 K of superheat;
// FW at 45 barg, 378.15 K: W(P=4.601325, x=0).T - 378.15 = 153.80039034401625 K of subcooling,
// W(P=4.601325, T=378.15).rho = 956.8254978100406 kg/m3, 30 t/h of it 0.008709355417896438 m3/s.
func TestCheckJSONResults(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	var out, errb bytes.Buffer
	if code := run([]string{"check", "--format", "json", "testdata/cli/plant.hmb"}, nil, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var doc struct {
		Files []struct {
			Streams      []map[string]any
			Units        []map[string]any
			Totals       map[string]any
			Expectations []map[string]any
		}
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	f := doc.Files[0]
	num := func(what string, v any, want, rel float64) {
		t.Helper()
		g, ok := v.(float64)
		if !ok || math.Abs(g-want) > rel*math.Abs(want) {
			t.Errorf("%s = %v, want %.10g", what, v, want)
		}
	}
	null := func(what string, obj map[string]any, key string) {
		t.Helper()
		if v, ok := obj[key]; !ok || v != nil {
			t.Errorf("%s %s = %v (present %v), want null", what, key, v, ok)
		}
	}
	fw, ms, ps := f.Streams[0], f.Streams[1], f.Streams[2]
	num("MS Tsat", ms["Tsat"], 529.2412401419949, 1e-8)
	num("MS superheat", ms["superheat"], 163.90875985800506, 1e-7)
	null("MS", ms, "subcooling")
	num("FW subcooling", fw["subcooling"], 153.80039034401625, 1e-7)
	null("FW", fw, "superheat")
	num("FW rho", fw["rho"], 956.8254978100406, 1e-7)
	num("FW v", fw["v"], 1/956.8254978100406, 1e-7)
	num("FW vol_flow", fw["vol_flow"], 0.008709355417896438, 1e-7)
	if g := fmt.Sprint(fw["given"]); g != "[flow p T]" {
		t.Errorf("FW given %s", g)
	}
	if g := fmt.Sprint(ms["given"]); g != "[T]" {
		t.Errorf("MS given %s", g)
	}
	if g := fmt.Sprint(ps["given"]); g != "[flow p]" {
		t.Errorf("PS given %s", g)
	}
	b1, bp := f.Units[0], f.Units[1]
	num("B1 dp", b1["dp"], 2e5, 1e-9)
	num("B1 efficiency", b1["efficiency"], 0.88, 1e-12)
	num("B1 fuel", b1["fuel"], b1["Q"].(float64)/0.88, 1e-9)
	num("BP dp", bp["dp"], 39e5, 1e-9) // 43 barg - 4 barg
	num("BP efficiency", bp["efficiency"], 0.72, 1e-12)
	for _, k := range []string{"dp_hot", "dp_cold", "dT_min", "lmtd", "UA", "fuel"} {
		null("BP", bp, k)
	}
	if g := fmt.Sprint(bp["ports"]); g != "map[in:[MS] out:[PS]]" {
		t.Errorf("BP ports %s", g)
	}
	tot := f.Totals
	num("net_power", tot["net_power"], bp["W"].(float64), 1e-12)
	num("power_out", tot["power_out"], bp["W"].(float64), 1e-12)
	num("power_in", tot["power_in"], 0, 0)
	num("heat_in", tot["heat_in"], b1["Q"].(float64), 1e-12)
	num("heat_out", tot["heat_out"], 0, 0)
	num("efficiency", tot["efficiency"], bp["W"].(float64)/b1["Q"].(float64), 1e-12)
	num("heat_rate", tot["heat_rate"], b1["Q"].(float64)/bp["W"].(float64), 1e-12)
	if len(f.Expectations) != 6 {
		t.Fatalf("%d expectations", len(f.Expectations))
	}
	e := f.Expectations[3] // expect PS superheat = 60 dK within 1 dK
	if e["subject"] != "PS" || e["property"] != "superheat" || e["operator"] != "=" || e["passed"] != true {
		t.Errorf("expectation %v", e)
	}
	num("value", e["value"], 60, 1e-12)
	num("tolerance", e["tolerance"], 1, 1e-12)
	num("solved", e["solved"], ps["superheat"].(float64), 1e-12)
	if e := f.Expectations[0]; e["subject"] != "total" || e["property"] != "net_power" || e["operator"] != ">" || e["tolerance"] != nil {
		t.Errorf("expectation %v", e)
	}
	for _, e := range f.Expectations {
		if len(e) != 7 {
			t.Errorf("expectation keys %v", e)
		}
	}
}
