// Package feature implements the editor features of calc files over a cache.Snapshot: hover,
// inlay hints, completion, navigation, rename, outline, highlighting, formatting and quick fixes.
// Each file holds one feature; the functions take byte offsets and return protocol values, so
// tests call them directly, without a connection. What the notation knows (tokens, what may be
// written where, keywords, names) comes from package lang; what the solver found, from
// solve.Result and its one lookup of a result by name.
package feature

import (
	"slices"

	"hmb/lang"
	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/thermo/model"
)

// contains reports whether off lies in sp or at its end (a cursor just after a word is on it).
func contains(sp model.Span, off int) bool { return sp.Start <= off && off <= sp.End }

func spanOf(n ast.Node) model.Span { return model.Span{Start: n.Pos(), End: n.End()} }

// nameAt returns the stream or unit name at off: its object (nil for an undeclared name) and the
// occurrence. A cursor between two names touching each other is taken to be on the one it starts.
func nameAt(res *lang.Result, off int) (*check.Object, *ast.Ident) {
	var bestObj *check.Object
	var best *ast.Ident
	consider := func(o *check.Object, id *ast.Ident) bool {
		if id == nil || !contains(spanOf(id), off) {
			return false
		}
		bestObj, best = o, id
		return off < id.End()
	}
	for _, o := range res.Info.Order {
		if consider(o, o.Decl) {
			return o, o.Decl
		}
		for _, r := range o.Refs {
			if consider(o, r) {
				return o, r
			}
		}
	}
	for _, r := range res.Info.Unresolved {
		if consider(nil, r) {
			return nil, r
		}
	}
	return bestObj, best
}

// occurrences returns every occurrence of what id names, in source order: the object's
// declaration and mentions, or for an undeclared name every mention of the same spelling.
func occurrences(res *lang.Result, o *check.Object, id *ast.Ident) []*ast.Ident {
	var out []*ast.Ident
	if o != nil {
		out = append(append(out, o.Decl), o.Refs...)
	} else {
		for _, r := range res.Info.Unresolved {
			if r.Name == id.Name {
				out = append(out, r)
			}
		}
	}
	slices.SortFunc(out, func(a, b *ast.Ident) int { return a.Pos() - b.Pos() })
	return out
}

// tokenAt returns the index of the token at off, or -1, with the same rule as nameAt.
func tokenAt(toks []lang.Token, off int) int {
	// Binary search for the first token that ends at or after off.
	lo, hi := 0, len(toks)
	for lo < hi {
		m := (lo + hi) / 2
		if toks[m].End < off {
			lo = m + 1
		} else {
			hi = m
		}
	}
	best := -1
	for i := lo; i < len(toks) && toks[i].Pos <= off; i++ {
		if contains(model.Span{Start: toks[i].Pos, End: toks[i].End}, off) {
			best = i
			if off < toks[i].End {
				return i
			}
		}
	}
	return best
}

// enclosingUnit returns the unit whose declaration contains off, or nil.
func enclosingUnit(res *lang.Result, off int) *check.Object {
	for _, o := range res.Info.Order {
		if o.IsUnit && o.Span.Start <= off && off < o.Span.End {
			return o
		}
	}
	return nil
}
