package feature

// This file implements go-to-definition and find-references for stream and unit names.

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// Definition returns where the name at off is declared, or nil.
func Definition(snap *cache.Snapshot, off int) []protocol.Location {
	o, _ := nameAt(snap.Check(), off)
	if o == nil {
		return nil
	}
	return []protocol.Location{{URI: snap.URI, Range: snap.Mapper.Range(spanOf(o.Decl))}}
}

// References returns every occurrence of the name at off, in source order; the declaration only
// when includeDecl.
func References(snap *cache.Snapshot, off int, includeDecl bool) []protocol.Location {
	res := snap.Check()
	o, id := nameAt(res, off)
	if id == nil {
		return nil
	}
	out := []protocol.Location{}
	for _, r := range occurrences(res, o, id) {
		if o != nil && r == o.Decl && !includeDecl {
			continue
		}
		out = append(out, protocol.Location{URI: snap.URI, Range: snap.Mapper.Range(spanOf(r))})
	}
	return out
}
