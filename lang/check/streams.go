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

// StreamKeys lists what a stream block may state, for completion and suggestions.
var StreamKeys = [...]string{"flow", "p", "T", "h", "s", "x", "fluid"}

var propByName = map[string]model.Prop{"flow": model.Flow, "p": model.P, "T": model.T, "h": model.H, "s": model.S, "x": model.X}

// streamProps is the property of each of StreamKeys but fluid, by index.
var streamProps = [...]model.Prop{model.Flow, model.P, model.T, model.H, model.S, model.X}

// propWords maps the words of the trade, written out, to the notation's short property names:
// their edit distance is too large for a spelling suggestion to find them. (One-letter names in
// the wrong case, P for p, are found by the spelling suggestion.)
var propWords = map[string]string{
	"temperature": "T", "temp": "T",
	"pressure": "p", "pres": "p", "press": "p",
	"quality": "x", "dryness": "x",
	"enthalpy": "h", "entropy": "s",
	"mass_flow": "flow", "massflow": "flow", "m": "flow", "mdot": "flow",
}

// suggestProp adds the property a misspelt or written-out name stands for.
func suggestProp(d *model.Diagnostic, word string, candidates []string) {
	if p, ok := propWords[strings.ToLower(word)]; ok && slices.Contains(candidates, p) {
		d.Message += fmt.Sprintf("; did you mean %s?", p)
		d.Fix = p
		return
	}
	suggest(d, word, candidates)
}

// streams lowers every declared stream with its givens.
func (c *checker) streams() {
	if c.nStreams > 0 {
		c.m.Streams = make([]*model.Stream, 0, c.nStreams)
	}
	for _, d := range c.decls {
		s, ok := d.stmt.(*ast.StreamDecl)
		if !ok {
			continue
		}
		st := take(&c.streamS)
		st.Name, st.Fluid, st.Span = s.Name.Name, "water", span(s.Name)
		if s.Label != nil {
			st.Label = s.Label.Value
		}
		d.obj.Index = len(c.m.Streams)
		c.m.Streams = append(c.m.Streams, st)
		if s.Block == nil {
			continue
		}
		var given [len(StreamKeys)]ast.Node // by index in StreamKeys
		for _, e := range s.Block.Entries {
			c.streamEntry(st, e, &given)
		}
	}
}

func (c *checker) streamEntry(st *model.Stream, e ast.Entry, seen *[len(StreamKeys)]ast.Node) {
	var key *ast.Ident
	switch e := e.(type) {
	case *ast.Given:
		key = e.Key
	case *ast.Names:
		key = e.Key
	default:
		return
	}
	ki := slices.Index(StreamKeys[:], key.Name)
	if ki < 0 {
		d := c.errorf(CodeUnknownParam, key, "a stream has no property %s (it takes flow, p, T, h, s, x and fluid)", key.Name)
		suggestProp(d, key.Name, StreamKeys[:])
		return
	}
	if prev := seen[ki]; prev != nil {
		d := c.errorf(CodeDuplicateGiven, e, "%s of stream %s is given twice", key.Name, st.Name)
		d.Related = related(prev, "first given here")
		return
	}
	seen[ki] = e
	if key.Name == "fluid" {
		n, ok := e.(*ast.Names)
		if !ok || len(n.Names) != 1 {
			c.errorf(CodeEntryForm, e, "fluid takes one name: fluid water")
			return
		}
		switch n.Names[0].Name {
		case "water", "steam": // one fluid, liquid or vapour
		default:
			c.errorf(CodeFluid, n.Names[0], "fluid %s is not supported: only water (steam) is", n.Names[0].Name)
		}
		return
	}
	g, ok := e.(*ast.Given)
	if !ok {
		c.errorf(CodeEntryForm, e, "%s takes a number with its unit, not names", key.Name)
		return
	}
	prop := streamProps[ki]
	if prop == model.Flow && g.Value.Unit != nil {
		if u, err := c.lookupUnit(g.Value.Unit.Name); err == nil && u.Dim() == units.VolumeFlow {
			c.volumeFlow(st, g, u)
			return
		}
	}
	v, u, ok := c.convert(g.Value, prop.Dim(), key.Name, false)
	if !ok {
		return
	}
	if !c.plausible(prop, g.Value, v, u) {
		return
	}
	gv := model.Given{Value: v, Unit: spelling(g.Value), Span: span(g)}
	if g.Tol != nil {
		if gv.Tol, ok = c.tolerance(g.Tol, g.Value, u, prop.Dim(), key.Name); !ok {
			return
		}
	}
	st.Given[prop] = c.newGiven(gv.Value, gv.Tol, gv.Unit, gv.Span)
	st.Given[prop].Measured = g.Tol != nil // a ± marks a measurement
}

// plausible rejects values no state can have: below absolute zero, negative flow, a quality
// outside 0..1.
func (c *checker) plausible(prop model.Prop, q *ast.Quantity, v float64, u units.Unit) bool {
	switch prop {
	case model.X:
		return c.fraction(q, v, "quality", true)
	case model.Flow:
		if v < 0 {
			c.errorf(CodeImpossible, q, "flow %s %s is below zero: give streams in the direction they flow", q.Raw, spelling(q))
			return false
		}
	case model.P:
		if v <= 0 {
			switch {
			case u.Reading() == units.Vacuum:
				c.errorf(CodeImpossible, q, "p %s %s is a vacuum at or beyond zero absolute: at this site's atmosphere a full vacuum is %s %s",
					q.Raw, spelling(q), units.Format(u.DeltaFromSI(c.m.Atm), 4), spelling(q))
			case u.Gauge():
				c.errorf(CodeImpossible, q, "p %s %s is at or below zero absolute: at this site's atmosphere a full vacuum is -%s %s",
					q.Raw, spelling(q), units.Format(u.DeltaFromSI(c.m.Atm), 4), spelling(q))
			default:
				c.errorf(CodeImpossible, q, "p %s %s is not above zero absolute", q.Raw, spelling(q))
			}
			return false
		}
	case model.T:
		if v <= 0 {
			c.errorf(CodeImpossible, q, "T %s %s is at or below absolute zero", q.Raw, spelling(q))
			return false
		}
	}
	return true
}

// volumeFlow lowers a flow given in volume units (flow 120 gpm): the solver takes the mass flow
// from it and the stream's density, which it requires to be a liquid's.
func (c *checker) volumeFlow(st *model.Stream, g *ast.Given, u units.Unit) {
	q := g.Value
	if math.IsInf(q.Value, 0) {
		c.errorf(CodeRange, q, "%s is too large a number", q.Raw)
		return
	}
	v := u.ToSI(q.Value, c.m.Atm)
	if v < 0 {
		c.errorf(CodeImpossible, q, "flow %s %s is below zero: give streams in the direction they flow", q.Raw, spelling(q))
		return
	}
	var tol float64
	if g.Tol != nil {
		var ok bool
		if tol, ok = c.tolerance(g.Tol, q, u, units.VolumeFlow, "flow"); !ok {
			return
		}
	}
	st.VolFlow = c.newGiven(v, tol, spelling(q), span(g))
}
