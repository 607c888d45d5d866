package model

import (
	"math"
	"slices"

	"hmb/thermo/units"
)

// Case is a variant of a model: the same streams and units, with some givens and parameters
// replaced, added or removed, and expectations of its own. Solving a case is solving
// Model.WithCase(c): the solver never sees a case as such.
type Case struct {
	Name  string
	Label string
	Span  Span // the case's name where it is declared
	Decl  Span // the whole case statement, block and all
	Set   []Override
	// Expects hold in this case only, besides the model's own.
	Expects []*Expect
	// Broken is set when the notation found an error in the case: it is then not solved, since
	// an override that was meant and left out would give numbers that look right and are not.
	Broken bool
}

// Override replaces, adds or removes one value of a model: a stream's given (Stream, Prop) or a
// unit's parameter (Unit, Param). Given nil and Option nil removes the value.
type Override struct {
	Stream int  // index into Model.Streams, or -1
	Prop   Prop // for a stream
	Unit   int  // index into Model.Units, or -1
	Param  string
	Given  *Given  // the new value; nil with Option nil: removed
	Option *Option // a parameter stated as a word
	Span   Span    // the entry that states it
}

// Ref names a result of a stream or a unit ("MS T", "T1 power").
type Ref struct {
	Subject Subject
	Name    string // a stream result or a unit result of the catalogue
	Span    Span
}

// Sweep varies one given or parameter of a model (or of one of its cases) over a range and
// solves the model at every point.
type Sweep struct {
	Name  string
	Label string
	Span  Span // the sweep's name where it is declared
	Decl  Span // the whole sweep statement
	Case  int  // index into Model.Cases of the case it varies, or -1 for the model itself
	// Vary is the value varied; its Given holds the unit the user wrote and the range's span,
	// and takes each point's value in turn (see Point).
	Vary Override
	Dim  units.Dim
	// From, To and Step give the points From + i Step, i = 0 .. N-1, in SI; the last is To
	// when the range was given by a count.
	From, To, Step float64
	N              int
	// Show lists the results the sweep's table shows; empty: every result that changes.
	Show []Ref
}

// Value is the swept value at point i, SI.
func (s *Sweep) Value(i int) float64 {
	if i == s.N-1 && s.N > 1 && math.Abs(s.From+float64(i)*s.Step-s.To) <= 1e-9*math.Abs(s.Step) {
		return s.To // no rounding at the end of a counted range
	}
	return s.From + float64(i)*s.Step
}

// Point is the override that puts a sweep at value v.
func (s *Sweep) Point(v float64) Override {
	o := s.Vary
	g := *s.Vary.Given
	g.Value, g.Tol, g.Measured = v, 0, false
	o.Given = &g
	return o
}

// WithCase is the model with c's overrides applied and c's expectations added: a shallow copy
// that shares every stream and unit the case does not change, so that the base is left as it
// was and the copy costs little. The copy has no cases or sweeps of its own.
//
// The base's expectations hold in the case too (a limit holds at every load), except those on a
// result the case states an expectation of its own on: the case's replace them (a design
// point's shaft power is not the minimum load's).
func (m *Model) WithCase(c *Case) *Model {
	out := m.With(c.Set...)
	if len(c.Expects) > 0 {
		out.Expects = make([]*Expect, 0, len(m.Expects)+len(c.Expects))
		for _, e := range m.Expects {
			if !slices.ContainsFunc(c.Expects, func(x *Expect) bool { return x.Subject() == e.Subject() && x.Prop == e.Prop }) {
				out.Expects = append(out.Expects, e)
			}
		}
		out.Expects = append(out.Expects, c.Expects...)
	}
	return out
}

// With is the model with the overrides applied: a shallow copy, as for WithCase.
func (m *Model) With(set ...Override) *Model {
	out := *m
	out.Cases, out.Sweeps = nil, nil
	out.Streams = append([]*Stream(nil), m.Streams...)
	out.Units = append([]*Unit(nil), m.Units...)
	copied := map[any]bool{}
	for _, o := range set {
		switch {
		case o.Stream >= 0 && o.Stream < len(out.Streams) && out.Streams[o.Stream] != nil && o.Prop < NumProps:
			s := out.Streams[o.Stream]
			if !copied[s] {
				cp := *s
				s = &cp
				out.Streams[o.Stream] = s
				copied[s] = true
			}
			s.Given[o.Prop] = o.Given
		case o.Unit >= 0 && o.Unit < len(out.Units) && out.Units[o.Unit] != nil:
			u := out.Units[o.Unit]
			if !copied[u] {
				cp := *u
				cp.Params = make(map[string]*Given, len(u.Params)+1)
				for k, v := range u.Params {
					cp.Params[k] = v
				}
				if u.Options != nil {
					cp.Options = make(map[string]*Option, len(u.Options)+1)
					for k, v := range u.Options {
						cp.Options[k] = v
					}
				}
				u = &cp
				out.Units[o.Unit] = u
				copied[u] = true
			}
			switch {
			case o.Option != nil:
				if u.Options == nil {
					u.Options = map[string]*Option{}
				}
				u.Options[o.Param] = o.Option
			case o.Given != nil:
				u.Params[o.Param] = o.Given
			default:
				delete(u.Params, o.Param)
				delete(u.Options, o.Param)
			}
		}
	}
	return &out
}
