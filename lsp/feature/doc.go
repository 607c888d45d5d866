// Package feature implements the editor features of calc files over a cache.Snapshot: hover,
// inlay hints, completion, navigation, rename, outline, highlighting, formatting and quick fixes.
// Each file holds one feature; the functions take byte offsets and return protocol values, so
// tests call them directly, without a connection.
package feature

import (
	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// contains reports whether off lies in sp or at its end (a cursor just after a word is on it).
func contains(sp model.Span, off int) bool { return sp.Start <= off && off <= sp.End }

// refAt returns the index of the name occurrence at off, or -1. A cursor between two names
// touching each other is taken to be on the one it starts.
func refAt(syn *cache.Syntax, off int) int {
	best := -1
	for i, r := range syn.Refs {
		if r.Span.Start > off {
			break
		}
		if contains(r.Span, off) {
			best = i
			if off < r.Span.End {
				return i
			}
		}
	}
	return best
}

// tokenAt returns the index of the token at off, or -1, with the same rule as refAt.
func tokenAt(syn *cache.Syntax, off int) int {
	toks := syn.Tokens
	// Binary search for the first token that ends at or after off.
	lo, hi := 0, len(toks)
	for lo < hi {
		m := (lo + hi) / 2
		if toks[m].Span.End < off {
			lo = m + 1
		} else {
			hi = m
		}
	}
	best := -1
	for i := lo; i < len(toks) && toks[i].Span.Start <= off; i++ {
		if contains(toks[i].Span, off) {
			best = i
			if off < toks[i].Span.End {
				return i
			}
		}
	}
	return best
}

// enclosingUnit returns the unit symbol whose declaration contains off, or nil.
func enclosingUnit(syn *cache.Syntax, off int) *cache.Symbol {
	for i := range syn.Symbols {
		s := &syn.Symbols[i]
		if s.Kind == cache.UnitSymbol && s.Span.Start <= off && off < s.Span.End {
			return s
		}
	}
	return nil
}
