package feature

// This file implements go-to-definition and find-references for stream and unit names.

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// Definition returns where the name at off is declared, or nil.
func Definition(snap *cache.Snapshot, off int) []protocol.Location {
	syn := snap.Syntax()
	i := refAt(syn, off)
	if i < 0 || syn.Refs[i].Symbol < 0 {
		return nil
	}
	sym := syn.Symbols[syn.Refs[i].Symbol]
	return []protocol.Location{{URI: snap.URI, Range: snap.Mapper.Range(sym.NameSpan)}}
}

// References returns every occurrence of the name at off, in source order; the declaration only
// when includeDecl.
func References(snap *cache.Snapshot, off int, includeDecl bool) []protocol.Location {
	syn := snap.Syntax()
	i := refAt(syn, off)
	if i < 0 {
		return nil
	}
	out := []protocol.Location{}
	for _, r := range sameName(syn, i) {
		if r.Decl && !includeDecl {
			continue
		}
		out = append(out, protocol.Location{URI: snap.URI, Range: snap.Mapper.Range(r.Span)})
	}
	return out
}

// sameName returns the occurrences of what ref i names: the same symbol, or for an undefined
// name every undefined use of the same spelling.
func sameName(syn *cache.Syntax, i int) []cache.Ref {
	ref := syn.Refs[i]
	var out []cache.Ref
	for _, r := range syn.Refs {
		if ref.Symbol >= 0 && r.Symbol == ref.Symbol || ref.Symbol < 0 && r.Symbol < 0 && r.Name == ref.Name && r.Kind == ref.Kind {
			out = append(out, r)
		}
	}
	return out
}
