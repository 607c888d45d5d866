package feature

// This file implements the document outline: streams and units in source order, then the cases
// and sweeps.

import (
	"go.lsp.dev/protocol"

	"hmb/lang/ast"
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
	// Cases and sweeps after them, as a reader looks for them.
	for _, d := range res.Info.Cases {
		out = append(out, studySymbol(snap, "case", d.Name, d.Label, d))
	}
	for _, d := range res.Info.Sweeps {
		out = append(out, studySymbol(snap, "sweep", d.Name, d.Label, d))
	}
	return out
}

func studySymbol(snap *cache.Snapshot, kw string, name *ast.Ident, label *ast.String, decl ast.Node) protocol.DocumentSymbol {
	detail := kw
	if label != nil {
		detail += " " + label.Value
	}
	return protocol.DocumentSymbol{Name: name.Name, Detail: detail, Kind: protocol.SymbolKindNamespace,
		Range: snap.Mapper.Range(spanOf(decl)), SelectionRange: snap.Mapper.Range(spanOf(name))}
}

// unitDetail is a unit's kind and label: "turbine hp turbine".
func unitDetail(kind, label string) string {
	if label != "" {
		return kind + " " + label
	}
	return kind
}
