package feature

// This file implements the document outline: streams and units in source order.

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// Symbols returns the outline of the document.
func Symbols(snap *cache.Snapshot) []protocol.DocumentSymbol {
	res := snap.Check()
	out := make([]protocol.DocumentSymbol, 0, len(res.Info.Order))
	for _, o := range res.Info.Order {
		ds := protocol.DocumentSymbol{
			Name:           o.Name,
			Detail:         o.Label,
			Kind:           protocol.SymbolKindVariable,
			Range:          snap.Mapper.Range(o.Span),
			SelectionRange: snap.Mapper.Range(spanOf(o.Decl)),
		}
		if o.IsUnit {
			ds.Kind = protocol.SymbolKindClass
			ds.Detail = unitDetail(o.KindName, o.Label)
		}
		out = append(out, ds)
	}
	return out
}

// unitDetail is a unit's kind and label: "turbine hp turbine".
func unitDetail(kind, label string) string {
	if label != "" {
		return kind + " " + label
	}
	return kind
}
