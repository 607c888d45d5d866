package analysis

import (
	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lang/token"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Site implements cache.Site: it reads the tokens of the entry or statement being written, back
// to the last separator, and whether a block is open around it. Blocks do not nest, so the
// nearest brace before the cursor decides.
func (a *Analyzer) Site(syn *cache.Syntax, off int) cache.Site {
	d, ok := syn.Data.(*data)
	if !ok || d.res == nil || d.res.File == nil {
		return cache.Site{Replace: model.Span{Start: off, End: off}}
	}
	f := d.res.File
	src := f.Src.Src
	toks := f.Tokens
	site := cache.Site{Replace: model.Span{Start: off, End: off}}
	// The token ending at or containing off is the word being typed, when it is a word.
	end := len(toks)
	for i, t := range toks {
		if int(t.Pos) >= off {
			end = i
			break
		}
		if int(t.Pos) < off && off <= int(t.End) && (t.Kind == token.Ident || t.Kind == token.Word) {
			site.Replace = model.Span{Start: int(t.Pos), End: int(t.End)}
			end = i
			break
		}
	}
	// The entry: tokens back to a separator, comments skipped.
	var entry []token.Token
	i := end - 1
	for ; i >= 0; i-- {
		t := toks[i]
		if t.IsSeparator() || t.Kind == token.LBrace || t.Kind == token.RBrace {
			break
		}
		if t.Kind != token.Comment {
			entry = append([]token.Token{t}, entry...)
		}
	}
	// The nearest brace decides whether a block is open.
	var lbrace = -1
	for j := i; j >= 0; j-- {
		if toks[j].Kind == token.RBrace {
			break
		}
		if toks[j].Kind == token.LBrace {
			lbrace = int(toks[j].Pos)
			break
		}
	}
	text := func(t token.Token) string { return string(src[t.Pos:t.End]) }
	last := func() token.Kind { return entry[len(entry)-1].Kind }
	if lbrace >= 0 {
		for _, s := range f.Stmts {
			switch s := s.(type) {
			case *ast.StreamDecl:
				if s.Block != nil && s.Block.Lbrace == lbrace {
					switch {
					case len(entry) == 0:
						site.Kinds = cache.SiteProp | cache.SiteKeyword
					case last() == token.Number:
						if dim, ok := propDim(text(entry[0])); ok {
							site.Kinds, site.Dim = cache.SiteSpelling, dim
						}
					}
					return site
				}
			case *ast.UnitDecl:
				if s.Block != nil && s.Block.Lbrace == lbrace {
					k := model.Kinds[s.Kind.Name]
					if k == nil {
						return site
					}
					site.UnitKind = k.Name
					switch {
					case len(entry) == 0:
						site.Kinds = cache.SiteRole | cache.SiteParam
					case k.Port(text(entry[0])) != nil && last() != token.Number:
						site.Kinds = cache.SiteStream
					case last() == token.Number:
						if p := k.Param(text(entry[0])); p != nil {
							site.Kinds, site.Dim = cache.SiteSpelling, p.Dim
						}
					}
					return site
				}
			}
		}
		return site
	}
	if len(entry) == 0 {
		site.Kinds = cache.SiteKeyword | cache.SiteUnitKind
		return site
	}
	// The unit an expectation names, if it names one of a known kind.
	expectUnit := func() *model.Kind {
		if len(entry) < 2 || d.res.Info == nil {
			return nil
		}
		if o := d.res.Info.Objects[text(entry[1])]; o != nil && o.IsUnit {
			return o.Kind
		}
		return nil
	}
	switch first := text(entry[0]); {
	case first == "expect" && len(entry) == 1:
		site.Kinds = cache.SiteStream | cache.SiteUnit
	case first == "expect" && len(entry) == 2:
		if k := expectUnit(); k != nil {
			site.Kinds, site.UnitKind, site.Results = cache.SiteResult, k.Name, check.Results(k)
		} else {
			site.Kinds, site.Results = cache.SiteResult, check.StreamProps
		}
	case first == "expect" && last() == token.Number:
		if k := expectUnit(); k != nil {
			if r := k.Result(text(entry[2])); r != nil {
				site.Kinds, site.Dim = cache.SiteSpelling, r.Dim
			}
		} else if r := model.StreamResult(text(entry[2])); r != nil {
			site.Kinds, site.Dim = cache.SiteSpelling, r.Dim
		}
	case first == "atmosphere" && last() == token.Number:
		site.Kinds, site.Dim = cache.SiteSpelling, units.Pressure
	case first == "elevation" && last() == token.Number:
		site.Kinds, site.Dim = cache.SiteSpelling, units.Length
	}
	return site
}

// propDim is the dimension of a stream property.
func propDim(name string) (units.Dim, bool) {
	for p := model.Prop(0); p < model.NumProps; p++ {
		if p.String() == name {
			return p.Dim(), true
		}
	}
	return 0, false
}
