package solve

import (
	"fmt"
	"math"
	"strings"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// expectations checks each model.Expect against the solved values.
//
// Quality in an inequality: a superheated vapour counts as x = 1 and a compressed liquid as
// x = 0, so "x >= 0.9" holds for a dry exhaust; an equality on the quality of a single-phase
// stream cannot be checked.
func (s *solveRun) expectations() {
	for _, ex := range s.m.Expects {
		val, dim, what, ok := s.expectValue(ex)
		if !ok {
			continue
		}
		if !finite(val) {
			s.diag(model.Error, CodeExpectUnsolved, ex.Span, fmt.Sprintf("cannot check %s: it was not solved", what))
			continue
		}
		var pass bool
		switch ex.Op {
		case model.Eq:
			tol := ex.Tol
			if tol <= 0 {
				tol = s.relTol * math.Abs(ex.Value)
			}
			pass = math.Abs(val-ex.Value) <= tol
		case model.Lt:
			pass = val < ex.Value
		case model.Le:
			pass = val <= ex.Value
		case model.Gt:
			pass = val > ex.Value
		case model.Ge:
			pass = val >= ex.Value
		}
		if pass {
			continue
		}
		// Values and tolerances read in the unit the user wrote the expectation in.
		sp := ex.Spelling
		want := ex.Op.String() + " " + s.f.written(dim, ex.Value, sp)
		if ex.Op == model.Eq {
			want = s.f.written(dim, ex.Value, sp)
			if ex.Tol > 0 {
				want += " ± " + s.f.writtenDelta(dim, ex.Tol, sp)
			}
		}
		show := s.f.writtenQ(dim, val, sp)
		s.diag(model.Error, CodeExpectFailed, ex.Span, fmt.Sprintf("expectation failed: %s is %s, expected %s", what, show, want))
	}
}

// expectValue finds the solved value an expectation names; ok is false when it was reported.
func (s *solveRun) expectValue(ex *model.Expect) (v float64, dim units.Dim, what string, ok bool) {
	sub := ex.Subject()
	if sub.Index < 0 {
		s.diag(model.Error, CodeExpectUnknown, ex.Span, "expectation names no stream or unit")
		return 0, 0, "", false
	}
	v, spec, found := s.res.Value(s.m, sub, ex.Prop)
	if sub.Kind == model.StreamSubject {
		what = s.m.Streams[sub.Index].Name + " " + ex.Prop
	} else {
		what = s.m.Units[sub.Index].Name + " " + ex.Prop
	}
	if !found {
		var names []string
		for _, r := range s.m.Results(sub) {
			names = append(names, r.Name)
		}
		kind := "stream property"
		if sub.Kind == model.UnitSubject {
			kind = "unit result"
		}
		s.diag(model.Error, CodeExpectUnknown, ex.Span, fmt.Sprintf("%q is not a %s; use one of %s", ex.Prop, kind, strings.Join(names, ", ")))
		return 0, 0, "", false
	}
	if sub.Kind == model.StreamSubject && ex.Prop == "x" {
		r := &s.res.Streams[sub.Index]
		if math.IsNaN(v) && r.HasState && ex.Op != model.Eq {
			switch r.State.Phase {
			case if97.Vapor:
				v = 1
			case if97.Liquid:
				v = 0
			}
		}
		if math.IsNaN(v) && r.HasState {
			s.diag(model.Error, CodeExpectUnsolved, ex.Span, fmt.Sprintf("cannot check %s: %s is %s and has no quality", what, s.m.Streams[sub.Index].Name, r.State.Phase))
			return 0, 0, "", false
		}
	}
	return v, spec.Dim, what, true
}
