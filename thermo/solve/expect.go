package solve

import (
	"fmt"
	"math"

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
		show := func(v float64) string {
			if dim == sgenDim {
				return s.f.sgenIn(v, sp, false)
			}
			return s.f.writtenQ(dim, v, sp)
		}
		target := func(v float64) string {
			if dim == sgenDim {
				return s.f.sgenIn(v, sp, true)
			}
			return s.f.written(dim, v, sp)
		}
		want := ex.Op.String() + " " + target(ex.Value)
		if ex.Op == model.Eq {
			want = target(ex.Value)
			if ex.Tol > 0 {
				if dim == sgenDim {
					want += " ± " + s.f.sgenIn(ex.Tol, sp, true)
				} else {
					want += " ± " + s.f.writtenDelta(dim, ex.Tol, sp)
				}
			}
		}
		s.diag(model.Error, CodeExpectFailed, ex.Span, fmt.Sprintf("expectation failed: %s is %s, expected %s", what, show(val), want))
	}
}

// sgenDim marks an entropy rate, which has no units.Dim of its own.
const sgenDim = units.Dim(255)

// expectValue finds the solved value an expectation names; ok is false when it was reported.
func (s *solveRun) expectValue(ex *model.Expect) (v float64, dim units.Dim, what string, ok bool) {
	if ex.Stream >= 0 && ex.Stream < len(s.m.Streams) {
		st := s.m.Streams[ex.Stream]
		r := &s.res.Streams[ex.Stream]
		what = st.Name + " " + ex.Prop
		for p := model.Prop(0); p < model.NumProps; p++ {
			if p.String() != ex.Prop {
				continue
			}
			if p == model.Flow {
				return r.M, p.Dim(), what, true
			}
			if !r.HasState {
				return math.NaN(), p.Dim(), what, true
			}
			switch p {
			case model.P:
				return r.State.P, p.Dim(), what, true
			case model.T:
				return r.State.T, p.Dim(), what, true
			case model.H:
				return r.State.H, p.Dim(), what, true
			case model.S:
				return r.State.S, p.Dim(), what, true
			}
			x := r.State.X
			if math.IsNaN(x) && ex.Op != model.Eq {
				switch r.State.Phase {
				case if97.Vapor:
					x = 1
				case if97.Liquid:
					x = 0
				}
			}
			if math.IsNaN(x) {
				s.diag(model.Error, CodeExpectUnsolved, ex.Span, fmt.Sprintf("cannot check %s: %s is %s and has no quality", what, st.Name, r.State.Phase))
				return 0, 0, "", false
			}
			return x, units.Dimensionless, what, true
		}
		s.diag(model.Error, CodeExpectUnknown, ex.Span, fmt.Sprintf("%q is not a stream property; use one of flow, p, T, h, s, x", ex.Prop))
		return 0, 0, "", false
	}
	if ex.Unit >= 0 && ex.Unit < len(s.m.Units) {
		r := &s.res.Units[ex.Unit]
		what = s.m.Units[ex.Unit].Name + " " + ex.Prop
		switch ex.Prop {
		case "duty":
			return r.Q, units.Power, what, true
		case "power":
			return r.W, units.Power, what, true
		case "fuel":
			return r.Fuel, units.Power, what, true
		case "efficiency":
			return r.Efficiency, units.Dimensionless, what, true
		case "sgen":
			return r.Sgen, sgenDim, what, true
		case "heat_loss":
			// Never solved, only given: an expectation on it checks the file against itself.
			loss := 0.0
			if g := s.m.Units[ex.Unit].Params["heat_loss"]; g != nil {
				loss = g.Value
			}
			return loss, units.Power, what, true
		}
		s.diag(model.Error, CodeExpectUnknown, ex.Span, fmt.Sprintf("%q is not a unit result; use one of duty, power, fuel, efficiency, heat_loss, sgen", ex.Prop))
		return 0, 0, "", false
	}
	s.diag(model.Error, CodeExpectUnknown, ex.Span, "expectation names no stream or unit")
	return 0, 0, "", false
}
