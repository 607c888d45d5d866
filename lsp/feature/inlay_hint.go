package feature

// This file implements inlay hints: the solved values beside each stream that the file did not
// give, and the duty or power beside each unit.

import (
	"context"
	"math"
	"strings"

	"hmb/lsp/cache"
	"hmb/lsp/ext"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// hinted are the quantities a stream hint may show, in order: the two that say at a glance where
// a state lies. The rest stays in the hover.
var hinted = []cache.Quantity{cache.QT, cache.QX}

// InlayHints returns the hints for declarations that end inside span. It waits (under ctx) for
// the solution; a superseded snapshot gets none.
func InlayHints(ctx context.Context, snap *cache.Snapshot, span model.Span) ([]ext.InlayHint, error) {
	syn := snap.Syntax()
	out := []ext.InlayHint{}
	if syn.Model == nil {
		return out, nil
	}
	sol, err := snap.Solution(ctx)
	if err != nil {
		if ctx.Err() != nil {
			return nil, err
		}
		return out, nil
	}
	for i := range syn.Symbols {
		sym := &syn.Symbols[i]
		if sym.Span.End < span.Start || sym.Span.End > span.End || sym.Index < 0 {
			continue
		}
		var label string
		if sym.Kind == cache.StreamSymbol {
			if sym.Index < len(sol.Streams) {
				label = StreamHint(syn, &sol.Streams[sym.Index])
			}
		} else if sym.Index < len(sol.Units) {
			label = UnitHint(syn, &sol.Units[sym.Index])
		}
		if label == "" {
			continue
		}
		out = append(out, ext.InlayHint{
			Position:    snap.Mapper.Position(sym.Span.End),
			Label:       label,
			Kind:        ext.InlayHintType,
			PaddingLeft: true,
		})
	}
	return out, nil
}

// StreamHint lists the solved temperature and quality of a stream, when the file did not give
// them: "T 99.606 C, x 0.9702". Quality shows only on and inside the saturation dome.
func StreamHint(syn *cache.Syntax, st *cache.StreamState) string {
	var parts []string
	for _, q := range hinted {
		v := st.Values[q]
		if math.IsNaN(v) || math.IsInf(v, 0) || st.Source[q] == cache.Given {
			continue
		}
		if q == cache.QX {
			if v < 0 || v > 1 {
				continue
			}
			parts = append(parts, "x "+show(v, units.Dimensionless, syn.Display, syn.Atm))
			continue
		}
		parts = append(parts, q.String()+" "+show(v, q.Dim(), syn.Display, syn.Atm))
	}
	return strings.Join(parts, ", ")
}

// UnitHint shows a unit's duty and shaft power, when it has them.
func UnitHint(syn *cache.Syntax, u *cache.UnitBalance) string {
	var parts []string
	if !math.IsNaN(u.Duty) {
		parts = append(parts, "duty "+show(u.Duty, units.Power, syn.Display, syn.Atm))
	}
	if !math.IsNaN(u.Power) {
		parts = append(parts, "power "+show(u.Power, units.Power, syn.Display, syn.Atm))
	}
	return strings.Join(parts, ", ")
}
