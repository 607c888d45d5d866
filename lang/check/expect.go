package check

import (
	"slices"

	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

var ops = map[string]model.Op{"=": model.Eq, "<": model.Lt, "<=": model.Le, ">": model.Gt, ">=": model.Ge}

// Results lists what an expectation may check on a unit of kind k: its entropy generation (sgen)
// and every power-valued parameter (duty, power, heat_loss, fuel), solved or given.
func Results(k *model.Kind) []string {
	out := []string{"sgen"}
	for _, p := range k.Params {
		if p.Dim == units.Power {
			out = append(out, p.Name)
		}
	}
	return out
}

// StreamProps lists what an expectation may check on a stream.
var StreamProps = []string{"flow", "p", "T", "h", "s", "x"}

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

func (c *checker) expect(e *ast.Expect) {
	o := c.lookup(e.Target)
	if o == nil {
		c.undefined(e.Target, false, true)
		return
	}
	prop := e.Prop.Name
	x := &model.Expect{Stream: -1, Unit: -1, Prop: prop, Op: ops[e.Op], Spelling: spelling(e.Value), Span: span(e)}
	var dim units.Dim
	if o.IsUnit {
		if o.Kind == nil {
			return // reported at the declaration
		}
		rs := Results(o.Kind)
		if !slices.Contains(rs, prop) {
			d := c.errorf(CodeUnknownResult, e.Prop, "%s %s has no result %s (it has %s)", o.KindName, o.Name, prop, joinOr(rs))
			suggest(d, prop, rs)
			return
		}
		x.Unit = o.Index
		dim = units.Power
	} else {
		p, ok := propByName[prop]
		if !ok {
			d := c.errorf(CodeUnknownResult, e.Prop, "a stream has no property %s (it has %s)", prop, joinOr(StreamProps))
			suggestProp(d, prop, StreamProps)
			return
		}
		x.Stream = o.Index
		dim = p.Dim()
	}
	what := prop + " of " + o.Name
	var u units.Unit
	if prop == "sgen" {
		scale, ok := entropyRate(spelling(e.Value))
		if !ok {
			c.errorf(CodeDimension, e.Value, "sgen is an entropy generation rate: give it in a power unit per kelvin or rankine, such as kW/K or Btu/h/R")
			return
		}
		x.Value = e.Value.Value * scale
		if e.Tol != nil {
			if !c.checkWithin(e) {
				return
			}
			a := e.Tol.Amount
			switch s, ok := entropyRate(spelling(a)); {
			case a.Unit != nil && a.Unit.Name == "%":
				x.Tol = abs(x.Value) * a.Value / 100
			case ok:
				x.Tol = a.Value * s
			default:
				c.errorf(CodeDimension, a, "the tolerance of sgen needs a unit such as kW/K, or %%")
				return
			}
		}
	} else {
		v, un, ok := c.convert(e.Value, dim, what, false)
		if !ok {
			return
		}
		// A comparison may name a bound no state reaches (x > 0, p > 0 bar); only a flow, absolute
		// pressure or temperature below zero, or a quality outside 0..1, can never be met.
		// (Enthalpy and entropy may be below zero: IAPWS-IF97 sets them near zero at the
		// triple-point liquid, and liquid at 0 °C lies slightly below.)
		switch sp := propByName[prop]; {
		case o.IsUnit || sp == model.H || sp == model.S:
		case v < 0 || sp == model.X && v > 1:
			c.plausible(sp, e.Value, v, un)
			return
		}
		x.Value, u = v, un
		if e.Tol != nil {
			if !c.checkWithin(e) {
				return
			}
			if x.Tol, ok = c.tolerance(e.Tol, e.Value, u, dim, what); !ok {
				return
			}
		}
	}
	if x.Unit < 0 && x.Stream < 0 {
		return // the target was left out of the model; its errors are reported
	}
	c.m.Expects = append(c.m.Expects, x)
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
