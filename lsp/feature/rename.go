package feature

// This file implements rename of streams and units.

import (
	"fmt"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lsp/cache"
)

// PrepareRename returns the range of the name at off, or nil (the protocol's "no rename here")
// when off is on no declared stream or unit name.
func PrepareRename(snap *cache.Snapshot, off int) (*protocol.Range, error) {
	o, id := nameAt(snap.Check(), off)
	if o == nil {
		return nil, nil
	}
	r := snap.Mapper.Range(spanOf(id))
	return &r, nil
}

// Rename renames the stream or unit named at off, everywhere. It refuses a name the notation does
// not accept and one that another stream or unit already has.
func Rename(snap *cache.Snapshot, off int, newName string) (*protocol.WorkspaceEdit, error) {
	res := snap.Check()
	o, id := nameAt(res, off)
	if o == nil {
		return nil, fmt.Errorf("no stream or unit name here")
	}
	if !lang.ValidName(newName) {
		return nil, fmt.Errorf("%q is not a valid name", newName)
	}
	if other := res.Info.Objects[newName]; other != nil && other != o {
		what := "stream"
		if other.IsUnit {
			what = "unit"
		}
		return nil, fmt.Errorf("%s %q already exists", what, newName)
	}
	edits := []protocol.TextEdit{}
	for _, r := range occurrences(res, o, id) {
		edits = append(edits, protocol.TextEdit{Range: snap.Mapper.Range(spanOf(r)), NewText: newName})
	}
	return &protocol.WorkspaceEdit{Changes: map[protocol.DocumentURI][]protocol.TextEdit{snap.URI: edits}}, nil
}
