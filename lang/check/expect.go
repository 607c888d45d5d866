package check

import (
	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

var ops = map[string]model.Op{"=": model.Eq, "<": model.Lt, "<=": model.Le, ">": model.Gt, ">=": model.Ge}

// Results lists what an expectation may check on a unit of kind k: the kind's results in the
// catalogue.
func Results(k *model.Kind) []string { return resultNames(k.Results) }

// StreamProps lists what an expectation may check on a stream: the stream results in the
// catalogue.
var StreamProps = resultNames(model.StreamResults)

func resultNames(rs []model.ResultSpec) []string {
	out := make([]string, len(rs))
	for i, r := range rs {
		out[i] = r.Name
	}
	return out
}

// compact removes the units wiring dropped; the model's indices are final after it.
func (c *checker) compact() {
	kept := make([]*model.Unit, 0, len(c.m.Units))
	for _, o := range c.info.Order {
		if o.IsUnit && o.Index >= 0 {
			u := c.m.Units[o.Index]
			o.Index = len(kept)
			kept = append(kept, u)
		}
	}
	c.m.Units = kept
}

func (c *checker) expects() {
	for _, s := range c.f.Stmts {
		if e, ok := s.(*ast.Expect); ok {
			c.expect(e)
		}
	}
}

// TotalResults lists what an expectation may check on the whole file (model.TotalName).
var TotalResults = resultNames(model.TotalResults)

func (c *checker) expect(e *ast.Expect) {
	if x := c.lowerExpect(e); x != nil {
		c.m.Expects = append(c.m.Expects, x)
	}
}

// lowerExpect checks an expectation and lowers it; nil after a report, or when its target was
// left out of the model.
func (c *checker) lowerExpect(e *ast.Expect) *model.Expect {
	o := c.lookup(e.Target)
	if o == nil && e.Target.Name != model.TotalName {
		c.undefined(e.Target, false, true)
		return nil
	}
	prop := e.Prop.Name
	x := &model.Expect{Stream: -1, Unit: -1, Prop: prop, Op: ops[e.Op], Spelling: spelling(e.Value), Span: span(e)}
	var spec *model.ResultSpec
	name := e.Target.Name
	switch {
	case o == nil: // the whole file: a stream or unit named total would have been found first
		if spec = findSpec(model.TotalResults, prop); spec == nil {
			d := c.errorf(CodeUnknownResult, e.Prop, "the totals have no result %s (they have %s)", prop, joinOr(TotalResults))
			suggest(d, prop, TotalResults)
			return nil
		}
		x.Total = true
	case o.IsUnit:
		if o.Kind == nil {
			return nil // reported at the declaration
		}
		if spec = o.Kind.Result(prop); spec == nil {
			rs := Results(o.Kind)
			d := c.errorf(CodeUnknownResult, e.Prop, "%s %s has no result %s (it has %s)", o.KindName, o.Name, prop, joinOr(rs))
			suggest(d, prop, rs)
			return nil
		}
		x.Unit = o.Index
	default:
		if spec = model.StreamResult(prop); spec == nil {
			d := c.errorf(CodeUnknownResult, e.Prop, "a stream has no property %s (it has %s)", prop, joinOr(StreamProps))
			suggestProp(d, prop, StreamProps)
			return nil
		}
		x.Stream = o.Index
	}
	dim := spec.Dim
	what := prop + " of " + name
	var v float64
	var u units.Unit
	var ok bool
	if spec.Delta {
		v, u, ok = c.convertDelta(e.Value, dim, what)
	} else {
		v, u, ok = c.convert(e.Value, dim, what, false)
	}
	if !ok {
		return nil
	}
	// A comparison may name a bound no state reaches (x > 0, p > 0 bar); only a flow, absolute
	// pressure or temperature below zero, or a quality outside 0..1, can never be met.
	// (Enthalpy and entropy may be below zero: IAPWS-IF97 sets them near zero at the
	// triple-point liquid, and liquid at 0 °C lies slightly below.)
	if sp, isProp := propByName[prop]; o != nil && !o.IsUnit && isProp && sp != model.H && sp != model.S && (v < 0 || sp == model.X && v > 1) {
		c.plausible(sp, e.Value, v, u)
		return nil
	}
	x.Value = v
	if e.Tol != nil {
		if !c.checkWithin(e) {
			return nil
		}
		if x.Tol, ok = c.tolerance(e.Tol, e.Value, u, dim, what); !ok {
			return nil
		}
	}
	if x.Unit < 0 && x.Stream < 0 && !x.Total {
		return nil // the target was left out of the model; its errors are reported
	}
	return x
}

func (c *checker) checkWithin(e *ast.Expect) bool {
	if e.Op != "=" {
		c.errorf(CodeTolerance, e.Tol, "a tolerance applies to = only, not to %s", e.Op)
		return false
	}
	return true
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}

func joinOr(s []string) string {
	switch len(s) {
	case 0:
		return "none"
	case 1:
		return s[0]
	}
	out := ""
	for i, w := range s[:len(s)-1] {
		if i > 0 {
			out += ", "
		}
		out += w
	}
	return out + " or " + s[len(s)-1]
}

func findSpec(rs []model.ResultSpec, name string) *model.ResultSpec {
	for i := range rs {
		if rs[i].Name == name {
			return &rs[i]
		}
	}
	return nil
}
