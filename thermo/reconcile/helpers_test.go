package reconcile

import (
	"context"
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// Helpers that build a model.Model by hand, as the notation would hand it over: givens in SI,
// a measurement marked Measured with its 95 % half-width in Tol. Every element gets its own span.

type plant struct {
	t   testing.TB
	m   *model.Model
	idx map[string]int
	pos int
}

func newPlant(t testing.TB) *plant {
	return &plant{t: t, m: &model.Model{Tolerance: 0.001, Atm: 101325}, idx: map[string]int{}, pos: 1000}
}

func (p *plant) span() model.Span { p.pos += 10; return model.Span{Start: p.pos, End: p.pos + 5} }

// given is one stated value: exact, or measured with a 95 % half-width.
type given struct {
	prop  model.Prop
	param string
	v     float64
	tol   float64
	meas  bool
}

func exact(prop model.Prop, v float64) given { return given{prop: prop, v: v} }
func meas(prop model.Prop, v, tol float64) given {
	return given{prop: prop, v: v, tol: tol, meas: true}
}
func exactParam(name string, v float64) given { return given{param: name, v: v} }
func measParam(name string, v, tol float64) given {
	return given{param: name, v: v, tol: tol, meas: true}
}

func (p *plant) stream(name string, gs ...given) *plant {
	s := &model.Stream{Name: name, Fluid: "water", Span: p.span()}
	for _, g := range gs {
		s.Given[g.prop] = &model.Given{Value: g.v, Tol: g.tol, Measured: g.meas, Span: p.span()}
	}
	p.idx[name] = len(p.m.Streams)
	p.m.Streams = append(p.m.Streams, s)
	return p
}

// unit adds a unit; ports are "role stream".
func (p *plant) unit(name, kind string, ports []string, gs ...given) *plant {
	k := model.Kinds[kind]
	if k == nil {
		p.t.Fatalf("no kind %q", kind)
	}
	u := &model.Unit{Name: name, Kind: k, Span: p.span(), Params: map[string]*model.Given{}}
	for _, pt := range ports {
		f := strings.Fields(pt)
		i, ok := p.idx[f[1]]
		if !ok {
			p.t.Fatalf("unit %s: no stream %s", name, f[1])
		}
		u.Ports = append(u.Ports, model.Port{Role: f[0], Stream: i, Span: p.span()})
	}
	for _, g := range gs {
		u.Params[g.param] = &model.Given{Value: g.v, Tol: g.tol, Measured: g.meas, Span: p.span()}
	}
	p.m.Units = append(p.m.Units, u)
	return p
}

func ports(s ...string) []string { return s }

func (p *plant) solve() (*solve.Result, *Result) {
	p.t.Helper()
	return Solve(context.Background(), p.m, solve.Options{})
}

func logDiags(t testing.TB, r *solve.Result) {
	t.Helper()
	for _, d := range r.Diags {
		t.Logf("%s %s [%d,%d]: %s", d.Severity, d.Code, d.Span.Start, d.Span.End, d.Message)
	}
}

func codes(r *solve.Result) map[string]int {
	out := map[string]int{}
	for _, d := range r.Diags {
		out[d.Code]++
	}
	return out
}

func near(a, b, rel float64) bool { return math.Abs(a-b) <= rel*max(math.Abs(a), math.Abs(b)) }

func firstDiag(r *solve.Result, code string) *model.Diagnostic {
	for i := range r.Diags {
		if r.Diags[i].Code == code {
			return &r.Diags[i]
		}
	}
	return nil
}

func contains(s, sub string) bool { return strings.Contains(s, sub) }
