package feature

// This file implements completion: keywords, unit kinds, the roles and parameters of the unit
// being written, stream properties, the results an expectation may check on a unit, unit
// spellings of the right dimension, and stream and unit names.

import (
	"fmt"
	"slices"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// propOrder lists the properties a file may give, in the order completion offers them.
var propOrder = []model.Prop{model.Flow, model.P, model.T, model.H, model.S, model.X}

// Completion returns the candidates at byte offset off. Each item replaces the partly typed
// word, so that the client filters on it.
func Completion(snap *cache.Snapshot, off int) *protocol.CompletionList {
	syn := snap.Syntax()
	site := snap.Analyzer().Site(syn, off)
	rng := snap.Mapper.Range(site.Replace)
	list := &protocol.CompletionList{Items: []protocol.CompletionItem{}}
	add := func(label string, kind protocol.CompletionItemKind, detail string) {
		list.Items = append(list.Items, protocol.CompletionItem{
			Label:    label,
			Kind:     kind,
			Detail:   detail,
			SortText: fmt.Sprintf("%04d", len(list.Items)),
			TextEdit: &protocol.TextEdit{Range: rng, NewText: label},
		})
	}
	// Inside a block the properties come first: they are what is written there most.
	if site.Kinds&cache.SiteProp != 0 {
		for _, p := range propOrder {
			add(p.String(), protocol.CompletionItemKindProperty, propDoc(p.String()))
		}
	}
	if site.Kinds&cache.SiteKeyword != 0 {
		for _, k := range snap.Analyzer().Keywords() {
			add(k.Name, protocol.CompletionItemKindKeyword, k.Doc)
		}
	}
	if site.Kinds&cache.SiteUnitKind != 0 {
		names := make([]string, 0, len(model.Kinds))
		for n := range model.Kinds {
			names = append(names, n)
		}
		slices.Sort(names)
		for _, n := range names {
			add(n, protocol.CompletionItemKindClass, model.Kinds[n].Doc)
		}
	}
	if k := model.Kinds[site.UnitKind]; k != nil {
		if site.Kinds&cache.SiteRole != 0 {
			for _, p := range k.Ports {
				add(p.Role, protocol.CompletionItemKindField, p.Doc)
			}
		}
		if site.Kinds&cache.SiteParam != 0 {
			for _, p := range k.Params {
				add(p.Name, protocol.CompletionItemKindProperty, p.Dim.String()+": "+p.Doc)
			}
		}
	}
	if site.Kinds&cache.SiteSpelling != 0 {
		for _, s := range units.Spellings(site.Dim) {
			add(s, protocol.CompletionItemKindUnit, site.Dim.String())
		}
	}
	if site.Kinds&cache.SiteResult != 0 {
		k := model.Kinds[site.UnitKind]
		for _, r := range site.Results {
			spec := model.StreamResult(r)
			if k != nil {
				spec = k.Result(r)
			}
			doc := ""
			if spec != nil {
				doc = spec.Dim.String() + ": " + spec.Doc
			}
			add(r, protocol.CompletionItemKindProperty, doc)
		}
	}
	if site.Kinds&cache.SiteStream != 0 {
		for _, s := range syn.Symbols {
			if s.Kind == cache.StreamSymbol {
				add(s.Name, protocol.CompletionItemKindVariable, s.Label)
			}
		}
	}
	if site.Kinds&cache.SiteUnit != 0 {
		for _, s := range syn.Symbols {
			if s.Kind == cache.UnitSymbol {
				detail := s.UnitKind
				if s.Label != "" {
					detail += " " + s.Label
				}
				add(s.Name, protocol.CompletionItemKindClass, detail)
			}
		}
	}
	return list
}
