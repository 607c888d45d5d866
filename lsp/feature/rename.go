package feature

// This file implements rename of streams and units.

import (
	"fmt"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// PrepareRename returns the range of the name at off, or nil (the protocol's "no rename here")
// when off is on no stream or unit name.
func PrepareRename(snap *cache.Snapshot, off int) (*protocol.Range, error) {
	syn := snap.Syntax()
	i := refAt(syn, off)
	if i < 0 || syn.Refs[i].Symbol < 0 {
		return nil, nil
	}
	r := snap.Mapper.Range(syn.Refs[i].Span)
	return &r, nil
}

// Rename renames the stream or unit named at off, everywhere. It refuses a name the notation does
// not accept and one that another stream or unit already has.
func Rename(snap *cache.Snapshot, off int, newName string) (*protocol.WorkspaceEdit, error) {
	syn := snap.Syntax()
	i := refAt(syn, off)
	if i < 0 || syn.Refs[i].Symbol < 0 {
		return nil, fmt.Errorf("no stream or unit name here")
	}
	ref := syn.Refs[i]
	if !snap.Analyzer().ValidName(newName) {
		return nil, fmt.Errorf("%q is not a valid name", newName)
	}
	for j, s := range syn.Symbols {
		if s.Name == newName && j != ref.Symbol {
			return nil, fmt.Errorf("%s %q already exists", s.Kind, newName)
		}
	}
	edits := []protocol.TextEdit{}
	for _, r := range sameName(syn, i) {
		edits = append(edits, protocol.TextEdit{Range: snap.Mapper.Range(r.Span), NewText: newName})
	}
	return &protocol.WorkspaceEdit{Changes: map[protocol.DocumentURI][]protocol.TextEdit{snap.URI: edits}}, nil
}
