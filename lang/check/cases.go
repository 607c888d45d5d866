package check

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// MaxSweepPoints bounds the points of one sweep: each is a whole solve of the file.
const MaxSweepPoints = 10000

// FreeWord, written as a case's value, removes the base's given: "FW T free".
const FreeWord = "free"

// cases lowers every case declaration. A case is checked as far as it goes: a broken entry is
// reported and the case marked Broken, so that it is not solved, while the base and the other
// cases are.
func (c *checker) cases() {
	seen := map[string]*ast.Ident{}
	for _, s := range c.f.Stmts {
		cd, ok := s.(*ast.CaseDecl)
		if !ok {
			continue
		}
		if prev, dup := seen[cd.Name.Name]; dup {
			d := c.errorf(CodeDuplicateCase, cd.Name, "case %s is already declared", cd.Name.Name)
			d.Related = related(prev, "first declared here")
			continue
		}
		seen[cd.Name.Name] = cd.Name
		c.info.Cases = append(c.info.Cases, cd)
		c.m.Cases = append(c.m.Cases, c.lowerCase(cd))
	}
}

func (c *checker) lowerCase(cd *ast.CaseDecl) *model.Case {
	k := &model.Case{Name: cd.Name.Name, Span: span(cd.Name), Decl: span(cd)}
	if cd.Label != nil {
		k.Label = cd.Label.Value
	}
	before := c.errors()
	type key struct {
		target string
		prop   string
	}
	stated := map[key]ast.Node{}
	for _, e := range cd.Block.Entries {
		switch e := e.(type) {
		case *ast.Bad:
			k.Broken = true
		case *ast.Expect:
			if x := c.lowerExpect(e); x != nil {
				k.Expects = append(k.Expects, x)
			}
		case *ast.Override:
			o := c.caseTarget(e.Target)
			if o == nil {
				continue
			}
			kk := key{o.Name, e.Prop.Name}
			if o.IsUnit {
				kk.prop = canonicalRole(kk.prop)
			}
			if prev, dup := stated[kk]; dup {
				d := c.errorf(CodeDuplicateGiven, e, "%s of %s is stated twice in case %s", e.Prop.Name, o.Name, cd.Name.Name)
				d.Related = related(prev, "first stated here")
				continue
			}
			stated[kk] = e
			if ov, ok := c.override(o, e.Prop, e.Value, e.Tol, e.Word, e); ok {
				k.Set = append(k.Set, ov)
			}
		}
	}
	if c.errors() > before {
		k.Broken = true
	}
	return k
}

// errors counts the errors reported so far.
func (c *checker) errors() int {
	n := 0
	for _, d := range c.diags {
		if d.Severity == model.Error {
			n++
		}
	}
	return n
}

// caseTarget resolves the stream or unit a case or sweep names, reporting an undeclared one
// with the names that exist.
func (c *checker) caseTarget(id *ast.Ident) *Object {
	o := c.lookup(id)
	if o == nil {
		c.undefined(id, false, true)
		d := &c.diags[len(c.diags)-1]
		if names := c.someNames(8); names != "" {
			d.Message = strings.Replace(d.Message, " is not declared", " is not declared (streams and units: "+names+")", 1)
		}
		return nil
	}
	return o
}

// someNames lists the first n declared names, saying how many more there are.
func (c *checker) someNames(n int) string {
	var names []string
	for _, o := range c.info.Order {
		if len(names) == n {
			return strings.Join(names, ", ") + fmt.Sprintf(" and %d more", len(c.info.Order)-n)
		}
		names = append(names, o.Name)
	}
	return strings.Join(names, ", ")
}

// override checks one value a case (or a sweep) states for a stream's property or a unit's
// parameter, and lowers it. Exactly one of q and word is set; word may be FreeWord.
func (c *checker) override(o *Object, prop *ast.Ident, q *ast.Quantity, tol *ast.Tol, word *ast.Ident, at ast.Node) (model.Override, bool) {
	ov := model.Override{Stream: -1, Unit: -1, Span: span(at)}
	if o.IsUnit {
		return c.unitOverride(o, prop, q, tol, word, at, ov)
	}
	name := prop.Name
	ki := slices.Index(StreamKeys[:], name)
	switch {
	case name == "fluid":
		c.errorf(CodeCaseForm, at, "a case changes values, not a stream's fluid")
		return ov, false
	case ki < 0:
		d := c.errorf(CodeUnknownParam, prop, "a stream has no property %s (a case may state flow, p, T, h, s or x)", name)
		suggestProp(d, name, StreamKeys[:len(StreamKeys)-1])
		return ov, false
	}
	ov.Stream, ov.Prop = o.Index, streamProps[ki]
	if word != nil {
		if word.Name != FreeWord {
			c.errorf(CodeEntryForm, word, "%s takes a number with its unit, or %s to remove the base's value", name, FreeWord)
			return ov, false
		}
		if o.Index < 0 || c.m.Streams[o.Index].Given[ov.Prop] == nil {
			c.errorf(CodeFreeNothing, at, "%s of %s is not given in the base: there is nothing to free", name, o.Name)
			return ov, false
		}
		return ov, true
	}
	var st model.Stream
	var seen [len(StreamKeys)]ast.Node
	c.streamEntry(&st, &ast.Given{Key: prop, Value: q, Tol: tol}, &seen)
	ov.Given = st.Given[ov.Prop]
	if ov.Given == nil {
		return ov, false // reported
	}
	ov.Given.Span = ov.Span
	return ov, o.Index >= 0
}

func (c *checker) unitOverride(o *Object, prop *ast.Ident, q *ast.Quantity, tol *ast.Tol, word *ast.Ident, at ast.Node, ov model.Override) (model.Override, bool) {
	k := o.Kind
	if k == nil {
		return ov, false // the unknown kind is reported at the declaration
	}
	name := canonicalRole(prop.Name)
	if k.Port(name) != nil {
		c.errorf(CodeCaseForm, prop, "%s is a port of %s %s: a case changes values, not connections", name, k.Name, o.Name)
		return ov, false
	}
	spec := k.Param(name)
	if spec == nil {
		var ps []string
		for _, p := range k.Params {
			ps = append(ps, p.Name)
		}
		d := c.errorf(CodeUnknownParam, prop, "%s has no parameter %s (parameters: %s)", article(k.Name), name, joinOr(ps))
		suggest(d, name, ps)
		return ov, false
	}
	ov.Unit, ov.Param = o.Index, name
	var base *model.Unit
	if o.Index >= 0 && o.Index < len(c.m.Units) {
		base = c.m.Units[o.Index]
	}
	u := &model.Unit{Params: map[string]*model.Given{}}
	switch {
	case word != nil && word.Name == FreeWord:
		if base == nil || base.Params[name] == nil && base.Options[name] == nil {
			c.errorf(CodeFreeNothing, at, "%s of %s is not given in the base: there is nothing to free", name, o.Name)
			return ov, false
		}
		return ov, true
	case word != nil:
		if len(spec.Words) == 0 {
			c.errorf(CodeEntryForm, word, "%s takes a number with its unit, or %s to remove the base's value", name, FreeWord)
			return ov, false
		}
		if _, ok := c.option(o, &ast.Names{Key: prop, Names: []*ast.Ident{word}}, spec, u, nil); !ok {
			return ov, false
		}
		ov.Option = u.Options[name]
		ov.Option.Span = ov.Span
	default:
		if _, ok := c.param(o, &ast.Given{Key: prop, Value: q, Tol: tol}, u, nil); !ok {
			return ov, false
		}
		ov.Given = u.Params[name]
		ov.Given.Span = ov.Span
	}
	return ov, base != nil
}

// sweeps lowers every sweep declaration; a broken sweep is reported and left out.
func (c *checker) sweeps() {
	seen := map[string]*ast.Ident{}
	for _, s := range c.f.Stmts {
		sd, ok := s.(*ast.SweepDecl)
		if !ok {
			continue
		}
		if prev, dup := seen[sd.Name.Name]; dup {
			d := c.errorf(CodeDuplicateCase, sd.Name, "sweep %s is already declared", sd.Name.Name)
			d.Related = related(prev, "first declared here")
			continue
		}
		seen[sd.Name.Name] = sd.Name
		if sw := c.lowerSweep(sd); sw != nil {
			c.info.Sweeps = append(c.info.Sweeps, sd)
			c.m.Sweeps = append(c.m.Sweeps, sw)
		}
	}
}

func (c *checker) lowerSweep(sd *ast.SweepDecl) *model.Sweep {
	sw := &model.Sweep{Name: sd.Name.Name, Span: span(sd.Name), Decl: span(sd), Case: -1}
	if sd.Label != nil {
		sw.Label = sd.Label.Value
	}
	before := c.errors()
	var rng *ast.Range
	var caseEntry *ast.Names
	broken := false
	for _, e := range sd.Block.Entries {
		switch e := e.(type) {
		case *ast.Bad:
			broken = true
		case *ast.Range:
			if rng != nil {
				d := c.errorf(CodeSweepRange, e, "sweep %s varies one value: give each range a sweep of its own", sd.Name.Name)
				d.Related = related(rng, "the range of this sweep")
				continue
			}
			rng = e
		case *ast.Show:
			for _, it := range e.Items {
				if r, ok := c.resultRef(it); ok {
					sw.Show = append(sw.Show, r)
				}
			}
		case *ast.Names:
			// The parser makes a list of names of the entry "case NAME" only.
			if caseEntry != nil {
				d := c.errorf(CodeDuplicateGiven, e, "case of sweep %s is given twice", sd.Name.Name)
				d.Related = related(caseEntry, "first given here")
				continue
			}
			caseEntry = e
			if len(e.Names) != 1 {
				c.errorf(CodeEntryForm, e, "case takes one case's name")
				continue
			}
			sw.Case = slices.IndexFunc(c.m.Cases, func(k *model.Case) bool { return k.Name == e.Names[0].Name })
			if sw.Case < 0 {
				var names []string
				for _, k := range c.m.Cases {
					names = append(names, k.Name)
				}
				list := "none are declared"
				if len(names) > 0 {
					list = "cases: " + strings.Join(names, ", ")
				}
				d := c.errorf(CodeUnknownCase, e.Names[0], "case %s is not declared (%s)", e.Names[0].Name, list)
				suggest(d, e.Names[0].Name, names)
			}
		}
	}
	if rng == nil {
		if !broken {
			c.errorf(CodeSweepRange, sd.Name, "sweep %s varies nothing: add a range such as FW flow from 4 kg/s to 8 kg/s step 0.5 kg/s", sd.Name.Name)
		}
		return nil
	}
	if !c.sweepRange(sw, rng) || broken || c.errors() > before {
		return nil
	}
	return sw
}

// resultRef resolves a result a sweep shows.
func (c *checker) resultRef(r *ast.ResultRef) (model.Ref, bool) {
	o := c.caseTarget(r.Target)
	if o == nil {
		return model.Ref{}, false
	}
	name := r.Prop.Name
	ref := model.Ref{Name: name, Span: span(r)}
	if o.IsUnit {
		if o.Kind == nil {
			return ref, false
		}
		if o.Kind.Result(name) == nil {
			rs := Results(o.Kind)
			d := c.errorf(CodeUnknownResult, r.Prop, "%s %s has no result %s (it has %s)", o.KindName, o.Name, name, joinOr(rs))
			suggest(d, name, rs)
			return ref, false
		}
		ref.Subject = model.Subject{Kind: model.UnitSubject, Index: o.Index}
	} else {
		if model.StreamResult(name) == nil {
			d := c.errorf(CodeUnknownResult, r.Prop, "a stream has no property %s (it has %s)", name, joinOr(StreamProps))
			suggestProp(d, name, StreamProps)
			return ref, false
		}
		ref.Subject = model.Subject{Kind: model.StreamSubject, Index: o.Index}
	}
	return ref, o.Index >= 0
}

// sweepRange checks a sweep's range and sets its points.
func (c *checker) sweepRange(sw *model.Sweep, r *ast.Range) bool {
	o := c.caseTarget(r.Target)
	if o == nil {
		return false
	}
	from, ok := c.override(o, r.Prop, r.From, nil, nil, r)
	if !ok {
		return false
	}
	to, ok := c.override(o, r.Prop, r.To, nil, nil, r)
	if !ok {
		return false
	}
	sw.Vary, sw.From, sw.To = from, from.Given.Value, to.Given.Value
	sw.Dim = valueDim(o, from)
	what := r.Prop.Name + " of " + o.Name
	if sw.From == sw.To {
		c.errorf(CodeSweepStep, r.To, "sweep %s goes from %s%s to the same value: give %s two different ends", sw.Name, r.From.Raw, unitSuffix(r.From), what)
		return false
	}
	span := sw.To - sw.From
	if r.By.Name == "count" {
		n := r.Step.Value
		switch {
		case r.Step.Unit != nil:
			c.errorf(CodeSweepStep, r.Step, "count is a number of points, without a unit")
			return false
		case n != math.Trunc(n) || n < 2:
			c.errorf(CodeSweepStep, r.Step, "count %s is not a whole number of points of 2 or more", r.Step.Raw)
			return false
		case n > MaxSweepPoints:
			c.errorf(CodeSweepPoints, r.Step, "count %s is more than %d points", r.Step.Raw, MaxSweepPoints)
			return false
		}
		sw.N = int(n)
		sw.Step = span / float64(sw.N-1)
		return true
	}
	step, ok := c.sweepStep(r, sw.Dim, what)
	if !ok {
		return false
	}
	switch {
	case step == 0:
		c.errorf(CodeSweepStep, r.Step, "a step of zero never reaches %s", r.To.Raw+unitSuffix(r.To))
		return false
	case step > 0 != (span > 0):
		dir, sign := "down", "below zero"
		if span > 0 {
			dir, sign = "up", "above zero"
		}
		d := c.errorf(CodeSweepStep, r.Step, "step %s%s points away from %s%s: the range goes %s, so the step must be %s",
			r.Step.Raw, unitSuffix(r.Step), r.To.Raw, unitSuffix(r.To), dir, sign)
		if strings.HasPrefix(r.Step.Raw, "-") {
			d.Fix = strings.TrimPrefix(r.Step.Raw, "-")
		} else {
			d.Fix = "-" + r.Step.Raw
		}
		d.Span = span0(r.Step.NumPos, r.Step.NumPos+len(r.Step.Raw))
		return false
	}
	n := span/step + 1e-9
	if math.Floor(n)+1 > MaxSweepPoints {
		c.errorf(CodeSweepPoints, r.Step, "step %s%s makes %.0f points; a sweep takes at most %d", r.Step.Raw, unitSuffix(r.Step), math.Floor(n)+1, MaxSweepPoints)
		return false
	}
	sw.N, sw.Step = int(n)+1, step
	return true
}

func span0(a, b int) model.Span { return model.Span{Start: a, End: b} }

// valueDim is the dimension of the value an override states.
func valueDim(o *Object, ov model.Override) units.Dim {
	if ov.Stream >= 0 || !o.IsUnit {
		return ov.Prop.Dim()
	}
	if p := o.Kind.Param(ov.Param); p != nil {
		return p.Dim
	}
	return units.Dimensionless
}

// sweepStep converts a sweep's step, a difference of the swept value's dimension, to SI.
func (c *checker) sweepStep(r *ast.Range, dim units.Dim, what string) (float64, bool) {
	q := r.Step
	if math.IsInf(q.Value, 0) {
		c.errorf(CodeRange, q, "%s is too large a number", q.Raw)
		return 0, false
	}
	if q.Unit != nil && q.Unit.Name == "%" && dim != units.Dimensionless {
		c.errorf(CodeDimension, q.Unit, "the step of %s is a difference of a %s: give it in a unit of one, such as %s", what, dim, examples(dim))
		return 0, false
	}
	if q.Unit == nil && dim != units.Dimensionless {
		c.errorf(CodeNoUnit, q, "the step %s of %s has no unit: a %s needs one, such as %s", q.Raw, what, dim, examples(dim))
		return 0, false
	}
	u, ok := c.unitOf(q, dim, "the step of "+what, true)
	if !ok {
		return 0, false
	}
	return u.DeltaToSI(q.Value), true
}
