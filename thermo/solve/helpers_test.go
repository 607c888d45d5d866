package solve

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
)

// Helpers that build a model.Model by hand, the way the notation would hand it over: streams by
// name with givens in SI, units whose ports name streams.

// strm declares a stream: strm("S1", model.Flow, 2.0, model.P, 1e6, ...). Each given gets a
// distinct span so that tests can tell which given a diagnostic points at.
func strm(name string, kv ...any) *model.Stream {
	s := &model.Stream{Name: name, Fluid: "water"}
	for i := 0; i+1 < len(kv); i += 2 {
		p := kv[i].(model.Prop)
		s.Given[p] = &model.Given{Value: toF(kv[i+1])}
	}
	return s
}

func toF(v any) float64 {
	switch v := v.(type) {
	case float64:
		return v
	case int:
		return float64(v)
	}
	panic(fmt.Sprintf("not a number: %v", v))
}

// unitDef is a unit before its port names are resolved.
type unitDef struct {
	name, kind string
	ports      []string // "role stream"
	params     map[string]float64
}

func unit(name, kind string, ports []string, params ...any) unitDef {
	u := unitDef{name: name, kind: kind, ports: ports, params: map[string]float64{}}
	for i := 0; i+1 < len(params); i += 2 {
		u.params[params[i].(string)] = toF(params[i+1])
	}
	return u
}

func ports(p ...string) []string { return p }

// mk assembles the model and gives every element a unique span (streams from 1000, givens from
// 2000, units from 5000, ports and params after them) so that related ranges can be checked.
func mk(t testing.TB, streams []*model.Stream, units ...unitDef) *model.Model {
	t.Helper()
	m := &model.Model{Tolerance: 0.001, Atm: 101325}
	idx := map[string]int{}
	pos := 1000
	next := func() model.Span { pos += 10; return model.Span{Start: pos, End: pos + 5} }
	for i, s := range streams {
		idx[s.Name] = i
		s.Span = next()
		for _, g := range s.Given {
			if g != nil {
				g.Span = next()
			}
		}
		m.Streams = append(m.Streams, s)
	}
	for _, d := range units {
		k := model.Kinds[d.kind]
		if k == nil {
			t.Fatalf("no kind %q", d.kind)
		}
		u := &model.Unit{Name: d.name, Kind: k, Span: next(), Params: map[string]*model.Given{}}
		for _, p := range d.ports {
			f := strings.Fields(p)
			i, ok := idx[f[1]]
			if !ok {
				t.Fatalf("unit %s: no stream %s", d.name, f[1])
			}
			u.Ports = append(u.Ports, model.Port{Role: f[0], Stream: i, Span: next()})
		}
		for n, v := range d.params {
			u.Params[n] = &model.Given{Value: v, Span: next()}
		}
		m.Units = append(m.Units, u)
	}
	return m
}

func solveModel(t testing.TB, m *model.Model) *Result {
	t.Helper()
	return Solve(context.Background(), m, Options{})
}

// value looks a solved value up: "S3 T", "S3 x", "M1 Q", "T1 W", "T1 sgen", "B1 fuel".
func value(t testing.TB, m *model.Model, r *Result, what string) float64 {
	t.Helper()
	f := strings.Fields(what)
	for i, s := range m.Streams {
		if s.Name != f[0] {
			continue
		}
		sr := r.Streams[i]
		switch f[1] {
		case "flow":
			return sr.M
		}
		if !sr.HasState {
			return math.NaN()
		}
		switch f[1] {
		case "p":
			return sr.State.P
		case "T":
			return sr.State.T
		case "h":
			return sr.State.H
		case "s":
			return sr.State.S
		case "x":
			return sr.State.X
		}
	}
	for i, u := range m.Units {
		if u.Name != f[0] {
			continue
		}
		ur := r.Units[i]
		switch f[1] {
		case "Q":
			return ur.Q
		case "W":
			return ur.W
		case "sgen":
			return ur.Sgen
		case "fuel":
			return ur.Fuel
		case "eff":
			return ur.Efficiency
		case "massclosure":
			return ur.MassClosure
		}
	}
	t.Fatalf("no value %q", what)
	return 0
}

func errorsOf(r *Result) []model.Diagnostic {
	var out []model.Diagnostic
	for _, d := range r.Diags {
		if d.Severity == model.Error {
			out = append(out, d)
		}
	}
	return out
}

func logDiags(t testing.TB, r *Result) {
	t.Helper()
	for _, d := range r.Diags {
		t.Logf("%s %s [%d,%d]: %s", d.Severity, d.Code, d.Span.Start, d.Span.End, d.Message)
	}
}

// findDiag returns the first diagnostic with the code, or nil.
func findDiag(r *Result, code string) *model.Diagnostic {
	for i := range r.Diags {
		if r.Diags[i].Code == code {
			return &r.Diags[i]
		}
	}
	return nil
}
