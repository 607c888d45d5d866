package check_test

import (
	"math"
	"testing"

	"hmb/thermo/model"
)

const casePlant = `atmosphere 14.2 psia
stream FW { flow 5 kg/s; p 10 bar; T 150 C }
stream MS
stream EX { p 1 bar }
boiler B1 { in FW; out MS; duty 10 MW }
turbine T1 { in MS; out EX; efficiency 0.85 }
exchanger HX { hot_in EX; hot_out C1; cold_in W1; cold_out W2 }
stream C1, W1, W2
`

// TestCaseLowering checks the SI values a case hands the solver (the conversion factors are
// those of thermo/units, NIST SP 811 Appendix B), and which values it frees.
func TestCaseLowering(t *testing.T) {
	src := casePlant + `case low "minimum load" {
  FW flow 36 t/h
  FW p 150 psig ± 2 psi
  T1 efficiency 80 %
  FW T free
  HX arrangement parallel
  B1 duty free
  expect MS T > 400 C
}`
	m, diags := run(src)
	for _, d := range diags {
		if d.Severity == model.Error {
			t.Fatalf("%s %s", d.Code, d.Message)
		}
	}
	if len(m.Cases) != 1 {
		t.Fatalf("%d cases", len(m.Cases))
	}
	k := m.Cases[0]
	if k.Name != "low" || k.Label != "minimum load" || k.Broken || len(k.Expects) != 1 {
		t.Fatalf("case %+v", k)
	}
	const psi = 6894.757293168361 // Pa, NIST SP 811 B.8 (lbf/in2)
	tests := []struct {
		what   string
		stream int
		prop   model.Prop
		unit   int
		param  string
		value  float64 // SI; NaN: freed
		tol    float64
	}{
		{"FW flow 36 t/h = 10 kg/s", 0, model.Flow, -1, "", 10, 0},
		{"FW p 150 psig at 14.2 psia", 0, model.P, -1, "", (150 + 14.2) * psi, 2 * psi},
		{"T1 efficiency 80 %", -1, 0, 1, "efficiency", 0.8, 0},
		{"FW T freed", 0, model.T, -1, "", math.NaN(), 0},
	}
	for i, tt := range tests {
		o := k.Set[i]
		if o.Stream != tt.stream || o.Unit != tt.unit || tt.stream >= 0 && o.Prop != tt.prop || o.Param != tt.param {
			t.Errorf("%s: override %+v", tt.what, o)
			continue
		}
		switch {
		case math.IsNaN(tt.value) && o.Given != nil:
			t.Errorf("%s: not freed: %+v", tt.what, o.Given)
		case !math.IsNaN(tt.value) && (o.Given == nil || math.Abs(o.Given.Value-tt.value) > 1e-9*tt.value || math.Abs(o.Given.Tol-tt.tol) > 1e-9):
			t.Errorf("%s: given %+v, want %g ± %g", tt.what, o.Given, tt.value, tt.tol)
		}
	}
	if o := k.Set[4]; o.Option == nil || o.Option.Value != "parallel" || o.Param != "arrangement" {
		t.Errorf("arrangement override %+v", o)
	}
	if o := k.Set[5]; o.Unit != 0 || o.Param != "duty" || o.Given != nil || o.Option != nil {
		t.Errorf("B1 duty freed: override %+v", o)
	}
	// The case applied: the base is left as it was.
	cm := m.WithCase(k)
	if cm.Streams[0].Given[model.Flow].Value != 10 || m.Streams[0].Given[model.Flow].Value != 5 {
		t.Errorf("flow in the case %g, in the base %g", cm.Streams[0].Given[model.Flow].Value, m.Streams[0].Given[model.Flow].Value)
	}
	if cm.Streams[0].Given[model.T] != nil || m.Streams[0].Given[model.T] == nil {
		t.Error("FW T is freed in the case only")
	}
	if _, ok := cm.Units[0].Params["duty"]; ok || m.Units[0].Params["duty"] == nil {
		t.Error("B1 duty is freed in the case only")
	}
	if cm.Units[2].Option("arrangement") != "parallel" || m.Units[2].Option("arrangement") != "counterflow" {
		t.Error("HX arrangement is parallel in the case only")
	}
	if len(cm.Expects) != len(m.Expects)+1 || cm.Streams[2] != m.Streams[2] {
		t.Error("the case adds its expectation and shares what it does not change")
	}
}

// TestSweepLowering checks a sweep's points in SI.
func TestSweepLowering(t *testing.T) {
	const psi = 6894.757293168361 // Pa, NIST SP 811 B.8
	tests := []struct {
		name, rng string
		n         int
		first     float64
		last      float64
	}{
		{"step in the values' unit", "FW flow from 4 kg/s to 8 kg/s step 0.5 kg/s", 9, 4, 8},
		{"a step that does not divide the range stops before its end", "FW flow from 4 kg/s to 8 kg/s step 0.3 kg/s", 14, 4, 4 + 13*0.3},
		{"falling range", "FW flow from 8 kg/s to 4 kg/s step -1 kg/s", 5, 8, 4},
		{"gauge pressures, a step in psi", "FW p from 50 psig to 150 psig step 10 psi", 11, (50 + 14.2) * psi, (150 + 14.2) * psi},
		{"temperatures, a step in K", "FW T from 100 C to 200 C step 25 K", 5, 373.15, 473.15},
		{"temperatures in F, a step in F", "FW T from 212 F to 392 F step 18 F", 11, 373.15, 473.15},
		{"count", "T1 efficiency from 70 % to 90 % count 5", 5, 0.7, 0.9},
		{"10,000 points are allowed", "FW flow from 1 kg/s to 10.999 kg/s step 0.001 kg/s", 10000, 1, 10.999},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m, diags := run(casePlant + "sweep s {\n  " + tt.rng + "\n}")
			for _, d := range diags {
				if d.Severity == model.Error {
					t.Fatalf("%s %s", d.Code, d.Message)
				}
			}
			sw := m.Sweeps[0]
			if sw.N != tt.n {
				t.Fatalf("%d points, want %d", sw.N, tt.n)
			}
			if first, last := sw.Value(0), sw.Value(sw.N-1); math.Abs(first-tt.first) > 1e-9*math.Abs(tt.first) || math.Abs(last-tt.last) > 1e-9*math.Abs(tt.last) {
				t.Errorf("points %g .. %g, want %g .. %g", first, last, tt.first, tt.last)
			}
		})
	}
}
