package feature

// This file implements the document outline: streams and units in source order.

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// Symbols returns the outline of the document.
func Symbols(snap *cache.Snapshot) []protocol.DocumentSymbol {
	syn := snap.Syntax()
	out := make([]protocol.DocumentSymbol, 0, len(syn.Symbols))
	for _, s := range syn.Symbols {
		ds := protocol.DocumentSymbol{
			Name:           s.Name,
			Detail:         s.Label,
			Kind:           protocol.SymbolKindVariable,
			Range:          snap.Mapper.Range(s.Span),
			SelectionRange: snap.Mapper.Range(s.NameSpan),
		}
		if s.Kind == cache.UnitSymbol {
			ds.Kind = protocol.SymbolKindClass
			ds.Detail = s.UnitKind
			if s.Label != "" {
				ds.Detail += " " + s.Label
			}
		}
		out = append(out, ds)
	}
	return out
}
