package feature

// This file implements inlay hints: the solved values beside each stream that the file did not
// give, and the duty or power beside each unit, each with its 95 % ± when the file has
// measurements; the reconciled value beside each measurement (measurement.go).

import (
	"context"
	"math"
	"strings"

	"hmb/lang"
	"hmb/lsp/cache"
	"hmb/lsp/ext"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
)

// streamHinted are the stream results a hint may show, in order: the two that say at a glance
// where a state lies. The rest stays in the hover.
var streamHinted = []string{"T", "x"}

// unitHinted are the unit results a hint may show, where the unit's kind has them: an
// exchanger's closest approach says at a glance whether its duty is buildable.
var unitHinted = []string{"duty", "power", "dT_min"}

// InlayHints returns the hints for declarations that end inside span. It waits (under ctx) for
// the solution; a superseded snapshot gets none.
func InlayHints(ctx context.Context, snap *cache.Snapshot, span model.Span) ([]ext.InlayHint, error) {
	res := snap.Check()
	out := []ext.InlayHint{}
	if res.Model == nil {
		return out, nil
	}
	sol, err := snap.Solution(ctx)
	if err != nil {
		if ctx.Err() != nil {
			return nil, err
		}
		return out, nil
	}
	for _, o := range res.Info.Order {
		if o.Span.End < span.Start || o.Span.End > span.End || o.Index < 0 {
			continue
		}
		var label string
		if o.IsUnit {
			label = UnitHint(res, sol, o.Index)
		} else {
			label = StreamHint(res, sol, o.Index)
		}
		if label == "" {
			continue
		}
		out = append(out, ext.InlayHint{
			Position:    snap.Mapper.Position(o.Span.End),
			Label:       label,
			Kind:        ext.InlayHintType,
			PaddingLeft: true,
		})
	}
	out = append(out, MeasurementHints(snap, res, sol, span)...)
	return out, nil
}

// StreamHint lists the solved temperature and quality of stream i, when the file did not give
// them: "T 99.606 C, x 0.9702". Quality shows only on and inside the saturation dome.
func StreamHint(res *lang.Result, sol *solve.Result, i int) string {
	if i >= len(sol.Streams) {
		return ""
	}
	sub := model.Subject{Kind: model.StreamSubject, Index: i}
	var parts []string
	for _, name := range streamHinted {
		v, r, _ := sol.Value(res.Model, sub, name)
		if math.IsNaN(v) || math.IsInf(v, 0) || source(&sol.Streams[i], name, v) == given {
			continue
		}
		parts = append(parts, name+" "+showU(display(res), r, v, reconcile.Of(sol).U(sub, name)))
	}
	return strings.Join(parts, ", ")
}

// UnitHint shows unit i's duty and shaft power, when it has them.
func UnitHint(res *lang.Result, sol *solve.Result, i int) string {
	sub := model.Subject{Kind: model.UnitSubject, Index: i}
	var parts []string
	for _, name := range unitHinted {
		if v, r, ok := sol.Value(res.Model, sub, name); ok && !math.IsNaN(v) {
			parts = append(parts, name+" "+showU(display(res), r, v, reconcile.Of(sol).U(sub, name)))
		}
	}
	return strings.Join(parts, ", ")
}
