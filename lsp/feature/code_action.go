package feature

// This file implements quick fixes: the replacement a diagnostic suggests (a misspelt unit or
// name), and the notation's own fixes (declare an undefined stream, add a missing specification).

import (
	"fmt"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// CodeActions returns the quick fixes for the diagnostics of the snapshot that touch span. The
// solver's diagnostics count only when its solution is already there: a code action request must
// not wait for a solve.
func CodeActions(snap *cache.Snapshot, span model.Span) []protocol.CodeAction {
	syn := snap.Syntax()
	sol := snap.Solved()
	out := []protocol.CodeAction{}
	for _, d := range snap.Diagnostics(sol) {
		if d.Span.End < span.Start || d.Span.Start > span.End {
			continue
		}
		pd := Diagnostic(snap.URI, snap.Mapper, d)
		if d.Fix != "" {
			out = append(out, action(snap, pd, fmt.Sprintf("Replace with %q", d.Fix), true,
				[]cache.Edit{{Span: d.Span, NewText: d.Fix}}))
		}
		for _, f := range snap.Analyzer().QuickFixes(syn, sol, d) {
			out = append(out, action(snap, pd, f.Title, false, f.Edits))
		}
	}
	return out
}

func action(snap *cache.Snapshot, d protocol.Diagnostic, title string, preferred bool, edits []cache.Edit) protocol.CodeAction {
	te := make([]protocol.TextEdit, 0, len(edits))
	for _, e := range edits {
		te = append(te, protocol.TextEdit{Range: snap.Mapper.Range(e.Span), NewText: e.NewText})
	}
	return protocol.CodeAction{
		Title:       title,
		Kind:        protocol.QuickFix,
		Diagnostics: []protocol.Diagnostic{d},
		IsPreferred: preferred,
		Edit:        &protocol.WorkspaceEdit{Changes: map[protocol.DocumentURI][]protocol.TextEdit{snap.URI: te}},
	}
}
