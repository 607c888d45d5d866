package check

import (
	"fmt"
	"slices"
	"strings"

	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// portUse is one stream named in a unit's port list.
type portUse struct {
	unit   *Object
	spec   *model.PortSpec
	stream *Object
	name   *ast.Ident
}

type seenKey[T any] struct {
	key  string
	node T
}

func find[T any](s []seenKey[T], key string) (T, bool) {
	for _, k := range s {
		if k.key == key {
			return k.node, true
		}
	}
	var zero T
	return zero, false
}

// RoleAliases are the other spellings accepted for a role, with the role they stand for.
var RoleAliases = map[string]string{"vapour": "vapor"}

// canonicalRole maps other spellings accepted for a role to the role's name.
func canonicalRole(role string) string {
	if r, ok := RoleAliases[role]; ok {
		return r
	}
	return role
}

// Keys lists the roles and parameters of a kind, for completion and suggestions.
func Keys(k *model.Kind) []string {
	var out []string
	for _, p := range k.Ports {
		out = append(out, p.Role)
	}
	for _, p := range k.Params {
		out = append(out, p.Name)
	}
	return out
}

// units checks every unit declaration and lowers those whose ports all resolve.
func (c *checker) units() {
	if c.nUnits > 0 {
		c.m.Units = make([]*model.Unit, 0, c.nUnits)
	}
	for _, d := range c.decls {
		s, ok := d.stmt.(*ast.UnitDecl)
		if !ok {
			continue
		}
		o := d.obj
		if o.Kind == nil {
			d := c.errorf(CodeUnknownKind, s.Kind, "unknown unit kind %s (kinds: %s)", s.Kind.Name, strings.Join(kindNames(), ", "))
			suggest(d, s.Kind.Name, kindNames())
			continue
		}
		if u := c.unit(s, o); u != nil {
			o.Index = len(c.m.Units)
			c.m.Units = append(c.m.Units, u)
		}
	}
}

func (c *checker) unit(s *ast.UnitDecl, o *Object) *model.Unit {
	k := o.Kind
	u := take(&c.unitS)
	u.Name, u.Label, u.Kind, u.Span = o.Name, o.Label, k, span(s.Name)
	u.Params = make(map[string]*model.Given, len(k.Params))
	complete := true
	// Kinds have a handful of roles and parameters: small slices beat maps here.
	var rs [8]seenKey[*ast.Names]
	var ms [8]string
	var ps [8]seenKey[ast.Node]
	roleSeen := rs[:0]
	mentioned := ms[:0] // roles named, even wrongly: no "missing" report for them
	paramSeen := ps[:0]
	if n := len(k.Ports); len(c.portS) >= n {
		u.Ports, c.portS = c.portS[:0:n], c.portS[n:]
	} else {
		u.Ports = make([]model.Port, 0, n)
	}
	broken := false // a syntax error may hide a port: then missing ports are not reported
	for _, e := range s.Block.Entries {
		switch e := e.(type) {
		case *ast.Bad:
			broken, complete = true, false
		case *ast.Names:
			role := canonicalRole(e.Key.Name)
			spec := k.Port(role)
			mentioned = append(mentioned, role)
			if spec == nil {
				if ps := k.Param(role); ps != nil && len(ps.Words) > 0 {
					var ok bool
					if paramSeen, ok = c.option(o, e, ps, u, paramSeen); !ok {
						complete = false
					}
					continue
				}
				complete = false
				if k.Param(role) != nil {
					c.errorf(CodeEntryForm, e, "%s takes a number with its unit, not names", role)
					continue
				}
				d := c.errorf(CodeUnknownRole, e.Key, "%s has no role %s (roles: %s)", article(k.Name), role, roles(k))
				if r := longRole(k, role); r != "" {
					d.Message += fmt.Sprintf("; did you mean %s?", r)
					d.Fix = r
				} else {
					suggest(d, role, Keys(k))
				}
				if d.Fix != "" && k.Port(d.Fix) != nil {
					// The port is there, misspelt: reporting it missing too would say it twice.
					mentioned = append(mentioned, d.Fix)
				}
				continue
			}
			if prev, dup := find(roleSeen, role); dup && !spec.Many {
				d := c.errorf(CodeExtraPort, e, "%s %s takes one %s stream", k.Name, o.Name, role)
				d.Related = related(prev, "already given here")
				complete = false
				continue
			}
			if len(e.Names) > 1 && !spec.Many {
				c.errorf(CodeExtraPort, e.Names[1], "%s %s takes one %s stream, not %d", k.Name, o.Name, role, len(e.Names))
				complete = false
			}
			roleSeen = append(roleSeen, seenKey[*ast.Names]{role, e})
			for _, n := range e.Names {
				st := c.lookup(n)
				switch {
				case st == nil:
					c.undefined(n, false, false)
					complete = false
					continue
				case st.IsUnit:
					c.errorf(CodeNotAStream, n, "%s is a %s, not a stream", n.Name, st.KindName)
					complete = false
					continue
				}
				c.ports = append(c.ports, portUse{unit: o, spec: spec, stream: st, name: n})
				u.Ports = append(u.Ports, model.Port{Role: role, Stream: st.Index, Span: span(n)})
			}
		case *ast.Given:
			role := canonicalRole(e.Key.Name)
			mentioned = append(mentioned, role)
			var ok bool
			if paramSeen, ok = c.param(o, e, u, paramSeen); !ok {
				complete = false
			}
		}
	}
	for _, ps := range paramSeen {
		if spec := k.Param(ps.key); spec != nil && spec.Needs != "" && !slices.Contains(mentioned, spec.Needs) && !broken {
			c.errorf(CodeNeedsRole, ps.node, "%s of %s %s needs a %s stream: add %s NAME to the %s", ps.key, k.Name, o.Name, spec.Needs, spec.Needs, k.Name)
			complete = false
		}
	}
	for i := range k.Ports {
		if k.Ports[i].Optional {
			continue
		}
		if !slices.Contains(mentioned, k.Ports[i].Role) && !broken {
			c.errorf(CodeMissingPort, s.Name, "%s %s has no %s stream (%s)", k.Name, o.Name, k.Ports[i].Role, k.Ports[i].Doc)
			complete = false
		}
	}
	if !complete {
		return nil
	}
	return u
}

// longRole recognises a role written out as the trade's word (inlet, outlet, hot_inlet): the
// notation's short role names are the word without "let".
func longRole(k *model.Kind, word string) string {
	short, ok := strings.CutSuffix(word, "let")
	if !ok {
		return ""
	}
	if k.Port(short) != nil {
		return short
	}
	return ""
}

// article puts "a" or "an" before a kind's name (an exchanger, a heater).
func article(kind string) string {
	if kind != "" && strings.ContainsRune("aeiou", rune(kind[0])) {
		return "an " + kind
	}
	return "a " + kind
}

func roles(k *model.Kind) string {
	var rs []string
	for _, p := range k.Ports {
		rs = append(rs, p.Role)
	}
	return strings.Join(rs, ", ")
}

// param checks one parameter of a unit and stores it; false when the unit should be left out.
func (c *checker) param(o *Object, g *ast.Given, u *model.Unit, seen []seenKey[ast.Node]) ([]seenKey[ast.Node], bool) {
	k := o.Kind
	name := g.Key.Name
	spec := k.Param(name)
	if spec == nil {
		role := canonicalRole(name)
		if k.Port(role) != nil {
			c.errorf(CodeEntryForm, g, "%s takes stream names, not a number", name)
			return seen, false
		}
		var ps []string
		for _, p := range k.Params {
			ps = append(ps, p.Name)
		}
		list := "none"
		if len(ps) > 0 {
			list = strings.Join(ps, ", ")
		}
		d := c.errorf(CodeUnknownParam, g.Key, "%s has no parameter %s (parameters: %s)", article(k.Name), name, list)
		suggest(d, name, Keys(k))
		return seen, false
	}
	if prev, dup := find(seen, name); dup {
		d := c.errorf(CodeDuplicateGiven, g, "%s of %s is given twice", name, o.Name)
		d.Related = related(prev, "first given here")
		return seen, false
	}
	seen = append(seen, seenKey[ast.Node]{name, g})
	if len(spec.Words) > 0 {
		c.errorf(CodeEntryForm, g, "%s takes one of %s, not a number", name, strings.Join(spec.Words, ", "))
		return seen, false
	}
	v, un, ok := c.convert(g.Value, spec.Dim, name, spec.Delta)
	if !ok {
		return seen, false
	}
	if spec.Dim == units.Dimensionless && !c.fraction(g.Value, v, name, false) {
		return seen, false
	}
	// Every pressure difference of the catalogue (dp, dp_hot, dp_cold) is documented as a drop,
	// inlet to outlet: a valve, a heater or an exchanger side has no work input to raise the
	// pressure, so a value below zero is a sign slip, which the solver would take as a gain.
	if spec.Dim == units.Pressure && spec.Delta && v < 0 {
		c.errorf(CodeNegativeDrop, g.Value, "%s %s%s is a pressure drop below zero: %s does not raise the pressure",
			name, g.Value.Raw, unitSuffix(g.Value), article(k.Name))
		return seen, false
	}
	gv := model.Given{Value: v, Unit: spelling(g.Value), Span: span(g)}
	if g.Tol != nil {
		if gv.Tol, ok = c.tolerance(g.Tol, g.Value, un, spec.Dim, name+" of "+o.Name); !ok {
			return seen, false
		}
	}
	u.Params[name] = c.newGiven(gv.Value, gv.Tol, gv.Unit, gv.Span)
	u.Params[name].Measured = g.Tol != nil // a ± marks a measurement
	return seen, true
}

// option checks a parameter stated as a word (an exchanger's "arrangement parallel") and stores it.
func (c *checker) option(o *Object, e *ast.Names, spec *model.ParamSpec, u *model.Unit, seen []seenKey[ast.Node]) ([]seenKey[ast.Node], bool) {
	name := spec.Name
	if prev, dup := find(seen, name); dup {
		d := c.errorf(CodeDuplicateGiven, e, "%s of %s is given twice", name, o.Name)
		d.Related = related(prev, "first given here")
		return seen, false
	}
	seen = append(seen, seenKey[ast.Node]{name, e})
	if len(e.Names) != 1 {
		c.errorf(CodeEntryForm, e, "%s takes one of %s", name, strings.Join(spec.Words, ", "))
		return seen, false
	}
	if !slices.Contains(spec.Words, e.Names[0].Name) {
		d := c.errorf(CodeEntryForm, e.Names[0], "%s takes one of %s", name, strings.Join(spec.Words, ", "))
		suggest(d, e.Names[0].Name, spec.Words)
		return seen, false
	}
	if u.Options == nil {
		u.Options = map[string]*model.Option{}
	}
	u.Options[name] = &model.Option{Value: e.Names[0].Name, Span: span(e)}
	return seen, true
}

// wiring checks that each stream leaves at most one unit and enters at most one, never the same.
func (c *checker) wiring() {
	// Every stream object has its index in m.Streams by now: the ends are kept by that index.
	type ends struct{ from, to *portUse }
	byStream := make([]ends, len(c.m.Streams))
	for i := range c.ports {
		p := &c.ports[i]
		e := &byStream[p.stream.Index]
		slot, code, verb := &e.to, CodeTwoConsumers, "enters"
		if !p.spec.Inlet {
			slot, code, verb = &e.from, CodeTwoProducers, "leaves"
		}
		if *slot != nil {
			prev := *slot
			d := c.errorf(code, p.name, "stream %s already %s %s %s", p.stream.Name, verb, prev.unit.KindName, prev.unit.Name)
			if prev.unit == p.unit {
				d.Message = fmt.Sprintf("stream %s %s %s %s twice", p.stream.Name, verb, p.unit.KindName, p.unit.Name)
			}
			d.Related = related(prev.name, "named here")
			c.dropUnit(p.unit)
			continue
		}
		*slot = p
		if e.from != nil && e.to != nil && e.from.unit == e.to.unit {
			d := c.errorf(CodeSelfLoop, p.name, "stream %s both enters and leaves %s %s", p.stream.Name, p.unit.KindName, p.unit.Name)
			other := e.from
			if other == p {
				other = e.to
			}
			d.Related = related(other.name, "named here")
			c.dropUnit(p.unit)
		}
	}
	for _, o := range c.info.Order {
		if !o.IsUnit && byStream[o.Index] == (ends{}) {
			c.report(model.Warning, CodeUnconnected, o.Decl, "stream %s is not connected to any unit", o.Name)
		}
	}
}

// dropUnit leaves a wrongly wired unit out of the model: the solver must not see a stream with
// two sources.
func (c *checker) dropUnit(o *Object) {
	if o.Index < 0 {
		return
	}
	c.m.Units[o.Index] = nil
	o.Index = -1
}
