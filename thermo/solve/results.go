package solve

import (
	"math"

	"hmb/thermo/model"
)

// This file is the one lookup of a result by name: expectations, tables, the report, hover and
// JSON all read results through Value. The names, dimensions and help are the catalogue's
// (model.StreamResults, model.Kind.Results); each name has its computation here.

// streamValues computes each stream result from the stream's solved state (SI base units, NaN
// when not solved). A quality is NaN for a single-phase state.
var streamValues = map[string]func(r *StreamResult) float64{
	"flow": func(r *StreamResult) float64 { return r.M },
	"p":    stateValue(func(r *StreamResult) float64 { return r.State.P }),
	"T":    stateValue(func(r *StreamResult) float64 { return r.State.T }),
	"h":    stateValue(func(r *StreamResult) float64 { return r.State.H }),
	"s":    stateValue(func(r *StreamResult) float64 { return r.State.S }),
	"x":    stateValue(func(r *StreamResult) float64 { return r.State.X }),
	"v":    stateValue(func(r *StreamResult) float64 { return r.State.V }),
}

func stateValue(f func(r *StreamResult) float64) func(r *StreamResult) float64 {
	return func(r *StreamResult) float64 {
		if !r.HasState {
			return math.NaN()
		}
		return f(r)
	}
}

// unitValues computes each unit result from the unit's solved balance and its givens.
var unitValues = map[string]func(u *model.Unit, r *UnitResult) float64{
	"duty":       func(_ *model.Unit, r *UnitResult) float64 { return r.Q },
	"power":      func(_ *model.Unit, r *UnitResult) float64 { return r.W },
	"efficiency": func(_ *model.Unit, r *UnitResult) float64 { return r.Efficiency },
	"fuel":       func(_ *model.Unit, r *UnitResult) float64 { return r.Fuel },
	"sgen":       func(_ *model.Unit, r *UnitResult) float64 { return r.Sgen },
	// Never solved, only given (zero when not): an expectation on it checks the file against
	// itself, and a table shows what the balance took.
	"heat_loss": func(u *model.Unit, _ *UnitResult) float64 {
		if g := u.Params["heat_loss"]; g != nil {
			return g.Value
		}
		return 0
	},
}

// Value returns the result name of a subject of m: its solved value in SI base units (NaN when
// it was not solved) and its catalogue entry. ok is false when the subject has no result of that
// name. r may be nil (nothing solved: every value is NaN).
func (r *Result) Value(m *model.Model, sub model.Subject, name string) (v float64, spec *model.ResultSpec, ok bool) {
	spec = m.Result(sub, name)
	if spec == nil {
		return math.NaN(), nil, false
	}
	v = math.NaN()
	switch sub.Kind {
	case model.StreamSubject:
		if f := streamValues[name]; f != nil && r != nil && sub.Index < len(r.Streams) {
			v = f(&r.Streams[sub.Index])
		}
	case model.UnitSubject:
		if f := unitValues[name]; f != nil && r != nil && sub.Index < len(r.Units) {
			v = f(m.Units[sub.Index], &r.Units[sub.Index])
		}
	}
	return v, spec, true
}
