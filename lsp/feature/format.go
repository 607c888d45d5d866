package feature

// This file implements formatting: the layout hmb fmt writes, as one minimal edit.

import (
	"bytes"

	"go.lsp.dev/protocol"

	"hmb/lang/format"
	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// Format returns the edits that give the document its canonical layout: none when it has it,
// otherwise one edit covering the lines that differ. A file that does not parse is an error.
// Formatting needs neither the check nor the solve, so it never waits for them.
func Format(snap *cache.Snapshot) ([]protocol.TextEdit, error) {
	src := snap.Src()
	out, err := format.Source(string(snap.URI), src)
	if err != nil {
		return nil, err
	}
	e, ok := MinimalEdit(src, out)
	if !ok {
		return []protocol.TextEdit{}, nil
	}
	return []protocol.TextEdit{{Range: snap.Mapper.Range(e.Span), NewText: e.NewText}}, nil
}

// MinimalEdit returns one edit turning a into b: the span between their common prefix and common
// suffix, widened to whole lines so that an editor keeps the cursor on unchanged lines. ok is
// false when a and b are equal.
func MinimalEdit(a, b []byte) (e Edit, ok bool) {
	if bytes.Equal(a, b) {
		return Edit{}, false
	}
	p := 0
	for p < len(a) && p < len(b) && a[p] == b[p] {
		p++
	}
	p = bytes.LastIndexByte(a[:p], '\n') + 1 // back to a line start (0 when none)
	s := 0
	for s < len(a)-p && s < len(b)-p && a[len(a)-1-s] == b[len(b)-1-s] {
		s++
	}
	// Forward to just after a newline, so the edit ends at a line start (or at the end).
	for s > 0 && a[len(a)-s-1] != '\n' {
		s--
	}
	return Edit{Span: model.Span{Start: p, End: len(a) - s}, NewText: string(b[p : len(b)-s])}, true
}

// Edit replaces the text at Span.
type Edit struct {
	Span    model.Span
	NewText string
}
