package solve

import (
	"fmt"
	"math"
	"strings"

	"hmb/thermo/if97"
	"hmb/thermo/model"
)

// ExpectResult is the verdict on one expectation.
type ExpectResult struct {
	// Solved is the value the expectation compared, SI base units; NaN when it could not be
	// checked (not solved, or not defined for the state).
	Solved float64
	// Tol is the tolerance an equality was judged with, SI: the one written, else the file's
	// relative tolerance of the target; NaN for a comparison.
	Tol    float64
	Passed bool
	// Text says what was compared, in the units the expectation was written in: "TG power
	// is 6.8087 MW, expected 6.81 MW ± 0.05 MW"; "" when it could not be checked.
	Text string
}

// expectations checks each model.Expect against the solved values.
//
// Quality in an inequality: a superheated vapour counts as x = 1 and a compressed liquid as
// x = 0, so "x >= 0.9" holds for a dry exhaust; an equality on the quality of a single-phase
// stream cannot be checked.
func (s *solveRun) expectations() {
	s.res.Expects = make([]ExpectResult, len(s.m.Expects))
	for i, ex := range s.m.Expects {
		out := &s.res.Expects[i]
		*out = ExpectResult{Solved: math.NaN(), Tol: math.NaN()}
		if ex.Op == model.Eq {
			out.Tol = ex.Tol
			if out.Tol <= 0 {
				out.Tol = s.relTol * math.Abs(ex.Value)
			}
		}
		val, spec, what, ok := s.expectValue(ex)
		if !ok {
			continue
		}
		if !finite(val) {
			s.diag(model.Error, CodeExpectUnsolved, ex.Span, fmt.Sprintf("cannot check %s: it was not solved", what))
			continue
		}
		out.Solved = val
		var pass bool
		switch ex.Op {
		case model.Eq:
			pass = math.Abs(val-ex.Value) <= out.Tol
		case model.Lt:
			pass = val < ex.Value
		case model.Le:
			pass = val <= ex.Value
		case model.Gt:
			pass = val > ex.Value
		case model.Ge:
			pass = val >= ex.Value
		}
		out.Passed = pass
		// Values and tolerances read in the unit the user wrote the expectation in.
		sp, dim := ex.Spelling, spec.Dim
		written, show := s.f.written(dim, ex.Value, sp), s.f.writtenQ(dim, val, sp)
		tol := s.f.writtenDelta(dim, ex.Tol, sp)
		if spec.Delta {
			written, show, tol = s.f.writtenDiff(dim, ex.Value, sp), s.f.writtenDeltaQ(dim, val, sp), s.f.writtenDiff(dim, ex.Tol, sp)
		}
		want := ex.Op.String() + " " + written
		if ex.Op == model.Eq {
			want = written
			if ex.Tol > 0 {
				want += " ± " + tol
			}
		}
		out.Text = fmt.Sprintf("%s is %s, expected %s", what, show, want)
		if !pass {
			s.diag(model.Error, CodeExpectFailed, ex.Span, "expectation failed: "+out.Text)
		}
	}
}

// expectValue finds the solved value an expectation names; ok is false when it was reported.
func (s *solveRun) expectValue(ex *model.Expect) (v float64, spec *model.ResultSpec, what string, ok bool) {
	sub := ex.Subject()
	if sub.Index < 0 {
		s.diag(model.Error, CodeExpectUnknown, ex.Span, "expectation names no stream or unit")
		return 0, nil, "", false
	}
	v, spec, found := s.res.Value(s.m, sub, ex.Prop)
	switch sub.Kind {
	case model.StreamSubject:
		what = s.m.Streams[sub.Index].Name + " " + ex.Prop
	case model.UnitSubject:
		what = s.m.Units[sub.Index].Name + " " + ex.Prop
	default:
		what = model.TotalName + " " + ex.Prop
	}
	if !found {
		var names []string
		for _, r := range s.m.Results(sub) {
			names = append(names, r.Name)
		}
		kind := "stream property"
		switch sub.Kind {
		case model.UnitSubject:
			kind = "unit result"
		case model.TotalSubject:
			kind = "total"
		}
		s.diag(model.Error, CodeExpectUnknown, ex.Span, fmt.Sprintf("%q is not a %s; use one of %s", ex.Prop, kind, strings.Join(names, ", ")))
		return 0, nil, "", false
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
	}
	// A value the state does not have (the superheat of a liquid, Tsat above the critical
	// pressure) is said so, rather than "not solved".
	if math.IsNaN(v) && s.res.Lacks(s.m, sub, ex.Prop) {
		if r := &s.res.Streams[sub.Index]; r.HasState {
			s.diag(model.Error, CodeExpectUnsolved, ex.Span, fmt.Sprintf("cannot check %s: %s is %s and has no %s", what, s.m.Streams[sub.Index].Name, r.State.Phase, noun(ex.Prop)))
			return 0, nil, "", false
		}
	}
	return v, spec, what, true
}

// noun names a stream result that a state may lack.
func noun(prop string) string {
	switch prop {
	case "x":
		return "quality"
	case "Tsat":
		return "saturation temperature (its pressure is at or above the critical pressure)"
	}
	return prop
}
