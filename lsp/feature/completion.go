package feature

// This file implements completion: keywords, unit kinds, the roles and parameters of the unit
// being written, stream properties, the results an expectation may check, unit spellings of the
// right dimension, fixed words (SI, US, water) and stream and unit names. What may be written
// where is the notation's own answer (lang.Result.SiteAt).

import (
	"fmt"
	"maps"
	"slices"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Completion returns the candidates at byte offset off. Each item replaces the partly typed
// word, so that the client filters on it.
func Completion(snap *cache.Snapshot, off int) *protocol.CompletionList {
	res := snap.Check()
	site := res.SiteAt(off)
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
	if site.Kinds&lang.SiteProp != 0 {
		for p := model.Prop(0); p < model.NumProps; p++ {
			add(p.String(), protocol.CompletionItemKindProperty, model.StreamResults[p].Doc)
		}
	}
	if site.Kinds&lang.SiteKeyword != 0 {
		for _, k := range lang.Keywords() {
			if site.Kinds&lang.SiteProp != 0 && k.Name != "fluid" {
				continue // in a stream block only fluid is a keyword
			}
			if site.Kinds&lang.SiteProp == 0 && k.Inner {
				continue // a word inside a statement starts none
			}
			add(k.Name, protocol.CompletionItemKindKeyword, k.Doc)
		}
	}
	if site.Kinds&lang.SiteUnitKind != 0 {
		for _, n := range slices.Sorted(maps.Keys(model.Kinds)) {
			add(n, protocol.CompletionItemKindClass, model.Kinds[n].Doc)
		}
	}
	if k := site.Kind; k != nil {
		if site.Kinds&lang.SiteRole != 0 {
			for _, p := range k.Ports {
				add(p.Role, protocol.CompletionItemKindField, p.Doc)
			}
		}
		if site.Kinds&lang.SiteParam != 0 {
			for _, p := range k.Params {
				add(p.Name, protocol.CompletionItemKindProperty, p.Dim.String()+": "+p.Doc)
			}
		}
	}
	if site.Kinds&lang.SiteSpelling != 0 {
		for _, s := range units.Spellings(site.Dim) {
			add(s, protocol.CompletionItemKindUnit, site.Dim.String())
		}
	}
	if site.Kinds&lang.SiteResult != 0 {
		for _, r := range site.Results {
			add(r.Name, protocol.CompletionItemKindProperty, r.Dim.String()+": "+r.Doc)
		}
	}
	if site.Kinds&lang.SiteWord != 0 {
		for _, w := range site.Words {
			add(w, protocol.CompletionItemKindEnumMember, "")
		}
	}
	for _, want := range []struct {
		kind   lang.SiteKind
		isUnit bool
	}{{lang.SiteStream, false}, {lang.SiteUnit, true}} {
		if site.Kinds&want.kind == 0 {
			continue
		}
		for _, o := range res.Info.Order {
			if o.IsUnit != want.isUnit {
				continue
			}
			if o.IsUnit {
				add(o.Name, protocol.CompletionItemKindClass, unitDetail(o.KindName, o.Label))
			} else {
				add(o.Name, protocol.CompletionItemKindVariable, o.Label)
			}
		}
	}
	return list
}
