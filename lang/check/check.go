// Package check checks a parsed calc file without solving it (names, wiring, units and
// dimensions, plain value ranges) and lowers what is valid to the solver's model.
//
// Streams and units share one namespace: an expectation names its target without saying which it
// is ("expect T1 power ...", "expect S5 x ..."), so a stream and a unit may not have the same name.
// Every stream is declared with a stream statement ("stream S4" or "stream S4, S5, S6" when it has
// no givens), so that a mistyped name in a unit is an error rather than a silent new stream.
package check

import (
	"cmp"
	"fmt"
	"slices"
	"strings"

	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Object is a declared stream or unit.
type Object struct {
	Name     string
	IsUnit   bool
	Kind     *model.Kind // the unit's kind; nil for a stream or an unknown kind
	KindName string      // the kind as written, for a unit
	Label    string
	Decl     *ast.Ident   // the name in its (first) declaration
	Span     model.Span   // that declaration: the statement, or the name alone in a list of streams
	Refs     []*ast.Ident // every other mention: port lists, expectation targets
	Index    int          // index in Model.Streams or Model.Units; -1 when left out of the model
}

// Info is what the checker learnt about names, for navigation, references and renaming.
type Info struct {
	Objects map[string]*Object
	Order   []*Object // in declaration order
	// Unresolved holds mentions of undeclared names, which rename and references leave alone.
	Unresolved []*ast.Ident
	// Cases and Sweeps are the declarations of the model's cases and sweeps, in the same order
	// (a sweep the checker left out of the model is left out here too).
	Cases  []*ast.CaseDecl
	Sweeps []*ast.SweepDecl
}

// At returns the object whose name (declaration or mention) covers the byte offset, and that
// name. An offset just past the end of a name counts, as editors place the cursor there.
func (in *Info) At(offset int) (*Object, *ast.Ident) {
	for _, o := range in.Order {
		if hit(o.Decl, offset) {
			return o, o.Decl
		}
		for _, r := range o.Refs {
			if hit(r, offset) {
				return o, r
			}
		}
	}
	return nil, nil
}

func hit(id *ast.Ident, off int) bool { return id != nil && id.Pos() <= off && off <= id.End() }

// DefaultTolerance is the relative closure tolerance of balances when a file sets none (0.1 %:
// common practice for plant heat balances, no source).
const DefaultTolerance = 0.001

// Check checks f and lowers it. The model holds the valid parts: a unit whose ports do not resolve
// is left out, a broken given is dropped, and Model.Incomplete is set whenever anything was left
// out or f has syntax errors. Diagnostics are sorted by position.
func Check(f *ast.File) (*model.Model, []model.Diagnostic, *Info) {
	c := &checker{f: f, m: &model.Model{Atm: units.StandardAtmosphere, Tolerance: DefaultTolerance, Display: units.SI}}
	c.size()
	c.settings()
	c.declare()
	c.streams()
	c.units()
	c.wiring()
	c.compact()
	c.expects()
	c.cases()
	c.sweeps()
	for _, d := range c.diags {
		if d.Severity == model.Error {
			c.m.Incomplete = true
		}
	}
	slices.SortStableFunc(c.diags, func(a, b model.Diagnostic) int { return cmp.Compare(a.Span.Start, b.Span.Start) })
	return c.m, c.diags, c.info
}

type checker struct {
	f     *ast.File
	m     *model.Model
	info  *Info
	diags []model.Diagnostic
	decls []decl // first declarations, in order
	ports []portUse
	// Counts of the file's declarations, for sizing what the checker makes.
	nStreams, nUnits, nPorts int

	// The model and the objects come from slabs cut to the file's size: one allocation per
	// stream, unit and given would dominate the check of a large file.
	objects []Object
	streamS []model.Stream
	unitS   []model.Unit
	givenS  []model.Given
	portS   []model.Port
	refS    []*ast.Ident

	unitMemo     [16]unitMemo // see lookupUnit
	lastKindName string       // see kind
	lastKind     *model.Kind
}

// decl is a first declaration with the object it declares.
type decl struct {
	stmt ast.Stmt
	obj  *Object
}

// size counts the declarations and entries of the file, and makes the slabs and tables to fit.
func (c *checker) size() {
	nGiven := 0
	for _, s := range c.f.Stmts {
		switch s := s.(type) {
		case *ast.StreamDecl:
			c.nStreams += 1 + len(s.More)
			if s.Block != nil {
				nGiven += len(s.Block.Entries)
			}
		case *ast.UnitDecl:
			c.nUnits++
			if s.Block != nil {
				for _, e := range s.Block.Entries {
					switch e := e.(type) {
					case *ast.Names:
						c.nPorts += len(e.Names)
					case *ast.Given:
						nGiven++
					}
				}
			}
		}
	}
	n := c.nStreams + c.nUnits
	c.info = &Info{Objects: make(map[string]*Object, n)}
	if n > 0 {
		c.info.Order = make([]*Object, 0, n)
	}
	c.decls = make([]decl, 0, n)
	c.objects = make([]Object, n)
	c.streamS = make([]model.Stream, c.nStreams)
	c.unitS = make([]model.Unit, c.nUnits)
	c.givenS = make([]model.Given, nGiven)
	c.portS = make([]model.Port, c.nPorts)
	c.refS = make([]*ast.Ident, 2*c.nStreams) // a stream is named twice: where it enters, where it leaves
	c.ports = make([]portUse, 0, c.nPorts)
}

// take returns the next element of a slab, or a new one should the count have been short. The
// element is zero and used by no one; callers set its fields one by one (see parser's slab).
func take[T any](s *[]T) *T {
	if len(*s) == 0 {
		return new(T)
	}
	x := &(*s)[0]
	*s = (*s)[1:]
	return x
}

// newGiven stores a lowered given.
func (c *checker) newGiven(v, tol float64, unit string, at model.Span) *model.Given {
	g := take(&c.givenS)
	g.Value, g.Tol, g.Unit, g.Span = v, tol, unit, at
	return g
}

func span(n ast.Node) model.Span { return model.Span{Start: n.Pos(), End: n.End()} }

func (c *checker) report(sev model.Severity, code string, n ast.Node, format string, args ...any) *model.Diagnostic {
	c.diags = append(c.diags, model.Diagnostic{Span: span(n), Severity: sev, Code: code,
		Message: fmt.Sprintf(format, args...)})
	return &c.diags[len(c.diags)-1]
}

func (c *checker) errorf(code string, n ast.Node, format string, args ...any) *model.Diagnostic {
	return c.report(model.Error, code, n, format, args...)
}

// suggest adds " (did you mean X?)" to d and sets its fix, when a candidate is near enough.
func suggest(d *model.Diagnostic, word string, candidates []string) {
	if s, ok := units.Nearest(word, candidates); ok && s != word && !tagsDiffer(word, s) {
		d.Message += fmt.Sprintf("; did you mean %s?", s)
		d.Fix = s
	}
}

func related(n ast.Node, msg string) []model.Related {
	return []model.Related{{Span: span(n), Message: msg}}
}

// declare enters every stream and unit name, reporting duplicates.
func (c *checker) declare() {
	add := func(id *ast.Ident, isUnit bool, s ast.Stmt) *Object {
		if prev, ok := c.info.Objects[id.Name]; ok {
			what := "stream"
			if prev.IsUnit {
				what = prev.KindName
			}
			d := c.errorf(CodeDuplicate, id, "%s is already declared as a %s", id.Name, what)
			d.Related = related(prev.Decl, "first declared here")
			return nil
		}
		o := take(&c.objects)
		o.Name, o.IsUnit, o.Decl, o.Index = id.Name, isUnit, id, -1
		o.Span = span(s)
		if sd, ok := s.(*ast.StreamDecl); ok && len(sd.More) > 0 {
			o.Span = span(id) // hints then sit beside each name, not all at the end of the list
		}
		c.info.Objects[id.Name] = o
		c.info.Order = append(c.info.Order, o)
		return o
	}
	for _, s := range c.f.Stmts {
		switch s := s.(type) {
		case *ast.StreamDecl:
			if len(s.More) > 0 && (s.Label != nil || s.Block != nil) {
				c.errorf(CodeStreamList, s.More[0], "a list of streams declares bare streams: give each its own stream statement for a label or givens")
			}
			if o := add(s.Name, false, s); o != nil {
				if s.Label != nil {
					o.Label = s.Label.Value
				}
				c.decls = append(c.decls, decl{s, o})
			}
			for _, n := range s.More {
				if o := add(n, false, s); o != nil {
					c.decls = append(c.decls, decl{&ast.StreamDecl{Keyword: s.Keyword, Name: n}, o})
				}
			}
		case *ast.UnitDecl:
			if o := add(s.Name, true, s); o != nil {
				o.KindName = s.Kind.Name
				o.Kind = c.kind(s.Kind.Name)
				if s.Label != nil {
					o.Label = s.Label.Value
				}
				c.decls = append(c.decls, decl{s, o})
			}
		}
	}
}

// kind looks up a unit kind, remembering the last: units of one kind tend to come together.
func (c *checker) kind(name string) *model.Kind {
	if name != c.lastKindName || c.lastKind == nil {
		c.lastKindName, c.lastKind = name, model.Kinds[name]
	}
	return c.lastKind
}

// lookup resolves a mention of a name and records it.
func (c *checker) lookup(id *ast.Ident) *Object {
	o, ok := c.info.Objects[id.Name]
	if !ok {
		c.info.Unresolved = append(c.info.Unresolved, id)
		return nil
	}
	if o.Refs == nil && len(c.refS) >= 2 {
		o.Refs, c.refS = c.refS[:0:2], c.refS[2:]
	}
	o.Refs = append(o.Refs, id)
	return o
}

// undefined reports an undeclared name, suggesting the nearest declared one of the right sort.
func (c *checker) undefined(id *ast.Ident, wantUnit, either bool) {
	what := "stream"
	switch {
	case either:
		what = "stream or unit"
	case wantUnit:
		what = "unit"
	}
	d := c.errorf(CodeUndefined, id, "%s %s is not declared", what, id.Name)
	if !either && !wantUnit {
		d.Message += fmt.Sprintf(" (declare it with: stream %s)", id.Name)
		d.Undeclared = id.Name
	}
	var cands []string
	for _, o := range c.info.Order {
		if either || o.IsUnit == wantUnit {
			cands = append(cands, o.Name)
		}
	}
	suggest(d, id.Name, cands)
}

// tagsDiffer reports whether two names differ only in their digits (S6 and S1, FW-101 and FW-102):
// numbered equipment tags are not misspellings of each other.
func tagsDiffer(a, b string) bool {
	strip := func(s string) string {
		return strings.Map(func(r rune) rune {
			if '0' <= r && r <= '9' {
				return '#'
			}
			return r
		}, s)
	}
	return len(a) == len(b) && strip(a) == strip(b)
}
