package check_test

import (
	"strings"
	"testing"

	"hmb/thermo/model"
)

// TestAmbientAndUnitWords checks the ambient setting and the unit parameters stated as a word
// (an exchanger's flow arrangement) or as a temperature (T_boundary, min_approach). The
// temperature scales are exact: 0 C = 273.15 K, 1 F = 5/9 K (NIST SP 811 (2008), B.8).
func TestAmbientAndUnitWords(t *testing.T) {
	const ex = "stream A, B, C, D\nexchanger X { hot_in A; hot_out B; cold_in C; cold_out D; "
	tests := []struct {
		name, src string
		check     func(t *testing.T, m *model.Model)
		code, msg string // an expected error, or none
	}{
		{name: "ambient in Celsius", src: "ambient 20 C", check: func(t *testing.T, m *model.Model) {
			if !near(m.Ambient, 293.15) || !near(m.AmbientOr(), 293.15) {
				t.Errorf("ambient %v", m.Ambient)
			}
		}},
		{name: "ambient in Fahrenheit", src: "ambient 68 F", check: func(t *testing.T, m *model.Model) {
			if !near(m.Ambient, 293.15) {
				t.Errorf("ambient %v", m.Ambient)
			}
		}},
		{name: "no ambient: 25 C", src: "title \"x\"", check: func(t *testing.T, m *model.Model) {
			if m.Ambient != 0 || m.AmbientOr() != model.DefaultAmbient || model.DefaultAmbient != 298.15 {
				t.Errorf("ambient %v, default %v", m.Ambient, m.AmbientOr())
			}
		}},
		{name: "ambient is a temperature", src: "ambient 3 bar", code: "HMB302"},
		{name: "ambient below absolute zero", src: "ambient -300 C", code: "HMB304", msg: "the ambient temperature must be above absolute zero"},
		{name: "arrangement parallel", src: ex + "arrangement parallel }", check: func(t *testing.T, m *model.Model) {
			if got := m.Units[0].Option("arrangement"); got != "parallel" {
				t.Errorf("arrangement %q", got)
			}
		}},
		{name: "arrangement by default", src: ex + "duty 1 MW }", check: func(t *testing.T, m *model.Model) {
			if got := m.Units[0].Option("arrangement"); got != "counterflow" {
				t.Errorf("arrangement %q", got)
			}
		}},
		{name: "arrangement misspelt", src: ex + "arrangement paralel }", code: "HMB314",
			msg: "arrangement takes one of counterflow, parallel; did you mean parallel?"},
		{name: "arrangement as a number", src: ex + "arrangement 2 }", code: "HMB314", msg: "arrangement takes one of counterflow, parallel, not a number"},
		{name: "arrangement twice", src: ex + "arrangement parallel; arrangement counterflow }", code: "HMB305"},
		{name: "min_approach in F is a difference", src: ex + "min_approach 9 F }", check: func(t *testing.T, m *model.Model) {
			if g := m.Units[0].Params["min_approach"]; g == nil || !near(g.Value, 5) {
				t.Errorf("min_approach %+v", g)
			}
		}},
		{name: "min_approach in a difference unit", src: ex + "min_approach 9 dF }", check: func(t *testing.T, m *model.Model) {
			if g := m.Units[0].Params["min_approach"]; g == nil || !near(g.Value, 5) {
				t.Errorf("min_approach %+v", g)
			}
		}},
		{name: "T_boundary of a heater", src: "stream A, B\nheater H { in A; out B; T_boundary 400 C }", check: func(t *testing.T, m *model.Model) {
			if g := m.Units[0].Params["T_boundary"]; g == nil || !near(g.Value, 673.15) {
				t.Errorf("T_boundary %+v", g)
			}
		}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m, diags := run(tt.src)
			var errs []model.Diagnostic
			for _, d := range diags {
				if d.Severity == model.Error {
					errs = append(errs, d)
				}
			}
			if tt.code == "" {
				if len(errs) > 0 {
					t.Fatalf("%s %s", errs[0].Code, errs[0].Message)
				}
				tt.check(t, m)
				return
			}
			if len(errs) != 1 || errs[0].Code != tt.code || !strings.Contains(errs[0].Message, tt.msg) {
				t.Fatalf("got %+v, want one %s %q", errs, tt.code, tt.msg)
			}
		})
	}
}
