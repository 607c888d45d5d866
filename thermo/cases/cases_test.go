package cases

import (
	"context"
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// Reference values in this file were computed with Debian's python3-iapws 1.5.2, the balance of
// each unit written out by hand in Python:
//
//	from iapws import IAPWS97 as W   # P in MPa, T in K, h in kJ/kg, s in kJ/(kg K)
//
// Each row names the call that produced its number. The plants are invented.

// plant builds a model by hand, as the notation would hand it over.
type plant struct {
	m   *model.Model
	pos int
}

func newPlant() *plant { return &plant{m: &model.Model{Tolerance: 0.001, Atm: 101325}} }

func (p *plant) span() model.Span { p.pos += 10; return model.Span{Start: p.pos, End: p.pos + 5} }

func (p *plant) stream(name string, kv ...any) *plant {
	s := &model.Stream{Name: name, Fluid: "water", Span: p.span()}
	for i := 0; i+1 < len(kv); i += 2 {
		s.Given[kv[i].(model.Prop)] = &model.Given{Value: kv[i+1].(float64), Span: p.span()}
	}
	p.m.Streams = append(p.m.Streams, s)
	return p
}

func (p *plant) index(name string) int {
	for i, s := range p.m.Streams {
		if s.Name == name {
			return i
		}
	}
	for i, u := range p.m.Units {
		if u.Name == name {
			return i
		}
	}
	panic("no " + name)
}

// unit adds a unit: ports "in S1", params name, value pairs.
func (p *plant) unit(name, kind string, ports []string, params ...any) *plant {
	u := &model.Unit{Name: name, Kind: model.Kinds[kind], Span: p.span(), Params: map[string]*model.Given{}}
	for _, pt := range ports {
		f := strings.Fields(pt)
		u.Ports = append(u.Ports, model.Port{Role: f[0], Stream: p.index(f[1]), Span: p.span()})
	}
	for i := 0; i+1 < len(params); i += 2 {
		u.Params[params[i].(string)] = &model.Given{Value: params[i+1].(float64), Span: p.span()}
	}
	p.m.Units = append(p.m.Units, u)
	return p
}

// set is an override of a stream's given (prop set) or a unit's parameter; v NaN frees it.
func (p *plant) set(name string, prop any, v float64) model.Override {
	o := model.Override{Stream: -1, Unit: -1, Span: p.span()}
	if pr, ok := prop.(model.Prop); ok {
		o.Stream, o.Prop = p.index(name), pr
	} else {
		o.Unit, o.Param = p.index(name), prop.(string)
	}
	if !math.IsNaN(v) {
		o.Given = &model.Given{Value: v, Span: o.Span}
	}
	return o
}

func (p *plant) ref(name, result string) model.Ref {
	for i, s := range p.m.Streams {
		if s.Name == name {
			return model.Ref{Subject: model.Subject{Kind: model.StreamSubject, Index: i}, Name: result}
		}
	}
	return model.Ref{Subject: model.Subject{Kind: model.UnitSubject, Index: p.index(name)}, Name: result}
}

func near(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }

// turbinePlant: 2 kg/s of steam at 4 MPa, 400 C expands through a turbine to 0.5 MPa.
func turbinePlant() *plant {
	return newPlant().
		stream("S1", model.Flow, 2.0, model.P, 4e6, model.T, 673.15).
		stream("S2", model.P, 0.5e6).
		unit("T1", "turbine", []string{"in S1", "out S2"}, "efficiency", 0.85)
}

// TestCases solves a base and its cases and checks each against python3-iapws; a case that
// fails does so alone, with its findings marked as its own.
func TestCases(t *testing.T) {
	p := turbinePlant()
	nan := math.NaN()
	p.m.Cases = []*model.Case{
		{Name: "worn", Label: "worn blading", Set: []model.Override{p.set("T1", "efficiency", 0.75)}},
		{Name: "cold", Set: []model.Override{p.set("S1", model.T, 623.15)}},
		// Free the efficiency and state the power the base makes: the solver finds the base's
		// efficiency again.
		{Name: "rated", Set: []model.Override{p.set("T1", "efficiency", nan), p.set("T1", "power", 828334.2386226432)}},
		// The outlet above the inlet: only this case fails.
		{Name: "uphill", Set: []model.Override{p.set("S2", model.P, 5e6)}},
		{Name: "broken", Broken: true, Set: []model.Override{p.set("T1", "efficiency", 0.5)}},
	}
	// An expectation of the case worn only, which fails there.
	p.m.Cases[0].Expects = []*model.Expect{{Stream: 1, Unit: -1, Prop: "T", Op: model.Gt, Value: 473.15, Span: p.span()}}
	base := solve.Solve(context.Background(), p.m, solve.Options{})
	for _, d := range base.Diags {
		if d.Severity == model.Error {
			t.Fatalf("base: %s %s", d.Code, d.Message)
		}
	}
	rs := Solve(context.Background(), p.m, solve.Options{})
	byName := map[string]*Result{}
	for _, r := range rs {
		byName[r.Case.Name] = r
	}
	tests := []struct {
		cas, what string
		want      float64
		src       string
	}{
		{"", "S2 T", 447.6250127374329, "h2 = h1 - 0.85 (h1 - W(P=0.5,s=W(P=4,T=673.15).s).h); W(P=0.5,h=h2).T"},
		{"", "T1 power", 828334.2386226432, "2 (W(P=4,T=673.15).h - h2) kW"},
		{"worn", "S2 T", 469.9088476292002, "h2 = h1 - 0.75 (h1 - h2s); W(P=0.5,h=h2).T"},
		{"worn", "T1 power", 730883.1517258614, "2 (h1 - h2) with efficiency 0.75"},
		{"cold", "S2 x", 0.9840671949288489, "W(P=0.5,h=h1 - 0.85 (h1 - W(P=0.5,s=W(P=4,T=623.15).s).h)).x"},
		{"cold", "T1 power", 757591.4513100233, "2 (W(P=4,T=623.15).h - h2)"},
		{"rated", "T1 efficiency", 0.85, "the base's efficiency, found from its power"},
		{"rated", "S2 T", 447.6250127374329, "as the base"},
	}
	for _, tt := range tests {
		m, r := p.m, base
		if tt.cas != "" {
			m, r = byName[tt.cas].Model, byName[tt.cas].Res
		}
		f := strings.Fields(tt.what)
		ref := p.ref(f[0], f[1])
		got, _, _ := r.Value(m, ref.Subject, ref.Name)
		if !near(got, tt.want, 1e-6) {
			t.Errorf("case %q %s = %.10g, want %.10g (%s)", tt.cas, tt.what, got, tt.want, tt.src)
		}
	}
	codes := func(r *Result) []string {
		var out []string
		for _, d := range r.Diags {
			if d.Severity == model.Error {
				out = append(out, d.Code)
				if d.Case != r.Case.Name || !strings.HasPrefix(d.Message, "case "+r.Case.Name+": ") {
					t.Errorf("%s: diagnostic not marked as the case's: %q %q", r.Case.Name, d.Case, d.Message)
				}
			}
		}
		return out
	}
	for name, want := range map[string]string{"worn": "HMB601", "cold": "", "rated": "", "uphill": "HMB514"} {
		if got := strings.Join(codes(byName[name]), " "); !strings.Contains(got, want) || want == "" && got != "" {
			t.Errorf("case %s: errors %q, want %q", name, got, want)
		}
	}
	if r := byName["broken"]; r.Res != nil || r.Diags != nil {
		t.Error("a broken case is not solved")
	}
	// The base is left as it was.
	if p.m.Units[0].Params["efficiency"].Value != 0.85 || len(p.m.Expects) != 0 {
		t.Error("solving the cases changed the base")
	}
}

// TestDistinct: a finding the base makes word for word is said once, by the base.
func TestDistinct(t *testing.T) {
	sp := model.Span{Start: 3, End: 9}
	base := []model.Diagnostic{{Span: sp, Code: "HMB510", Message: "wet exhaust"}}
	cas := Mark([]model.Diagnostic{{Span: sp, Code: "HMB510", Message: "wet exhaust"}, {Span: sp, Code: "HMB510", Message: "wetter exhaust"}}, "low")
	got := Distinct(cas, base)
	if len(got) != 1 || got[0].Message != "case low: wetter exhaust" || got[0].Case != "low" {
		t.Errorf("%+v", got)
	}
}

// valvePlant: wet steam of quality 0.97 throttled to 0.1 MPa.
func valvePlant() *plant {
	return newPlant().
		stream("S1", model.Flow, 1.0, model.P, 0.2e6, model.X, 0.97).
		stream("S2", model.P, 0.1e6).
		unit("V1", "valve", []string{"in S1", "out S2"})
}

// TestSweepCrossesTheDome sweeps the inlet pressure of a valve: the outlet goes from wet to
// superheated as the inlet's enthalpy rises (python3-iapws: the outlet state from the inlet's h).
func TestSweepCrossesTheDome(t *testing.T) {
	p := valvePlant()
	sw := &model.Sweep{Name: "inlet", Case: -1, Vary: p.set("S1", model.P, 0.2e6), Dim: model.P.Dim(), From: 0.2e6, To: 3e6, Step: 0.2e6, N: 15}
	p.m.Sweeps = []*model.Sweep{sw}
	r := Sweep(context.Background(), p.m, sw, []model.Ref{p.ref("S2", "T"), p.ref("S2", "x"), p.ref("S1", "h")}, solve.Options{})
	if len(r.Points) != 15 || len(r.Diags) != 0 {
		t.Fatalf("%d points, diagnostics %+v", len(r.Points), r.Diags)
	}
	tests := []struct {
		point   int
		T, x, h float64
		src     string
	}{
		{0, 372.7559186113376, 0.9846047300960279, 2640194.616498909, "W(P=0.1,h=W(P=0.2,x=0.97).h): two phases"},
		{1, 372.7559186113376, 0.9996044265070061, 2674056.628467937, "W(P=0.1,h=W(P=0.4,x=0.97).h): two phases"},
		{2, 381.8023242562015, math.NaN(), 2693569.7590911886, "W(P=0.1,h=W(P=0.6,x=0.97).h): vapour"},
		{4, 393.1890834498291, math.NaN(), 2716686.436884184, "W(P=0.1,h=W(P=1.0,x=0.97).h): vapour"},
		{9, 405.63435548797617, math.NaN(), 2741691.2715683643, "W(P=0.1,h=W(P=2.0,x=0.97).h): vapour"},
		{14, 409.5000214792528, math.NaN(), 2749417.9378988183, "W(P=0.1,h=W(P=3.0,x=0.97).h): vapour"},
	}
	for _, tt := range tests {
		pt := r.Points[tt.point]
		if pt.Failed || !near(pt.Values[0], tt.T, 1e-7) || !near(pt.Values[2], tt.h, 1e-8) ||
			math.IsNaN(tt.x) != math.IsNaN(pt.Values[1]) || !math.IsNaN(tt.x) && !near(pt.Values[1], tt.x, 1e-7) {
			t.Errorf("point %d (p %g Pa): T %.10g x %.10g h %.10g, want %.10g %.10g %.10g (%s) %s",
				tt.point, pt.Value, pt.Values[0], pt.Values[1], pt.Values[2], tt.T, tt.x, tt.h, tt.src, pt.Reason)
		}
	}
}

// TestSweepGoesOnPastFailures: the inlet below the outlet's pressure cannot flow through the
// valve; those points are reported with their reason and the points after them still solve.
func TestSweepGoesOnPastFailures(t *testing.T) {
	p := valvePlant()
	sw := &model.Sweep{Name: "inlet", Case: -1, Vary: p.set("S1", model.P, 0.06e6), Dim: model.P.Dim(), From: 0.06e6, To: 0.4e6, Step: 0.02e6, N: 18}
	r := Sweep(context.Background(), p.m, sw, []model.Ref{p.ref("S2", "x")}, solve.Options{})
	var failed []int
	for i, pt := range r.Points {
		if pt.Failed {
			failed = append(failed, i)
			if pt.Code != solve.CodePressureRise {
				t.Errorf("point %d: %s %s", i, pt.Code, pt.Reason)
			}
		}
	}
	// 0.06 and 0.08 MPa are below the outlet's 0.1 MPa (0.1 MPa itself is a valve that drops nothing).
	if len(failed) != 2 || failed[0] != 0 || failed[1] != 1 {
		t.Errorf("failed points %v, want [0 1]", failed)
	}
	if len(r.Diags) != 1 || r.Diags[0].Code != CodePointFailed || r.Diags[0].Severity != model.Warning ||
		!strings.Contains(r.Diags[0].Message, "2 of 18 points did not solve; at 60.000 kPa: ") {
		t.Errorf("diagnostics %+v", r.Diags)
	}
	// The last point as in TestSweepCrossesTheDome's second: W(P=0.1,h=W(P=0.4,x=0.97).h).x
	if last := r.Points[17]; last.Failed || !near(last.Values[0], 0.9996044265070061, 1e-7) {
		t.Errorf("last point %+v", last)
	}
}

// TestWarmStart: a sweep's points start from the previous point's solution. The turbine's
// exhaust temperature is given and its pressure solved, a block Newton's method iterates on
// through IF97: from the previous point it takes fewer evaluations than from the inlet's state,
// to the same answers.
func TestWarmStart(t *testing.T) {
	p := newPlant().
		stream("S1", model.Flow, 1.0, model.P, 4e6, model.T, 673.15).
		stream("S2", model.T, 473.15).
		unit("T1", "turbine", []string{"in S1", "out S2"}, "efficiency", 0.8)
	sw := &model.Sweep{Name: "eff", Case: -1, Vary: p.set("T1", "efficiency", 0.7), From: 0.7, To: 0.9, Step: 0.01, N: 21}
	refs := []model.Ref{p.ref("S2", "p")}
	warm := Sweep(context.Background(), p.m, sw, refs, solve.Options{})
	cold := 0
	for i := range sw.N {
		r := solve.Solve(context.Background(), p.m.With(sw.Point(sw.Value(i))), solve.Options{})
		cold += r.Work.Evals
		v, _, _ := r.Value(p.m, refs[0].Subject, "p")
		if got := warm.Points[i].Values[0]; !near(got, v, 1e-9) {
			t.Errorf("point %d: S2 p %.12g warm, %.12g cold", i, got, v)
		}
	}
	// p2 with W(P=p2,T=473.15).h = h1 - eff (h1 - W(P=p2,s=W(P=4,T=673.15).s).h), by bisection.
	for _, w := range []struct {
		point int
		p     float64
	}{{0, 446321.82539785013}, {10, 595811.7399246554}, {20, 738666.6689868054}} {
		if got := warm.Points[w.point].Values[0]; !near(got, w.p, 1e-7) {
			t.Errorf("point %d: S2 p %.10g, want %.10g", w.point, got, w.p)
		}
	}
	if 2*warm.Work.Evals > cold {
		t.Errorf("warm start took %d evaluations, solving each point afresh %d", warm.Work.Evals, cold)
	}
}
