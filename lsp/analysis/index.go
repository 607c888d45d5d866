package analysis

import (
	"cmp"
	"slices"

	"hmb/lang"
	"hmb/lang/ast"
	"hmb/lsp/cache"
	"hmb/thermo/model"
)

func spanOf(n ast.Node) model.Span { return model.Span{Start: n.Pos(), End: n.End()} }

// index fills the syntax's declarations, mentions and token roles from the tree and the
// checker's name information.
func index(syn *cache.Syntax, res *lang.Result) {
	f, info := res.File, res.Info
	declSpan := map[*ast.Ident]model.Span{}
	var toks []cache.Token
	tok := func(n ast.Node, k cache.TokenKind, decl bool) {
		if n != nil && n.End() > n.Pos() {
			toks = append(toks, cache.Token{Span: spanOf(n), Kind: k, Decl: decl})
		}
	}
	word := func(pos int, w string, k cache.TokenKind) {
		toks = append(toks, cache.Token{Span: model.Span{Start: pos, End: pos + len(w)}, Kind: k})
	}
	qty := func(q *ast.Quantity) {
		if q == nil {
			return
		}
		word(q.NumPos, q.Raw, cache.NumberToken)
		if q.Unit != nil {
			tok(q.Unit, cache.SpellingToken, false)
		}
	}
	tol := func(t *ast.Tol) {
		if t == nil {
			return
		}
		k := cache.OperatorToken
		if t.Op == "within" {
			k = cache.KeywordToken
		}
		word(t.OpPos, t.Op, k)
		qty(t.Amount)
	}
	label := func(s *ast.String) {
		if s != nil {
			tok(s, cache.StringToken, false)
		}
	}
	nameKind := func(id *ast.Ident) cache.TokenKind {
		if o := info.Objects[id.Name]; o != nil && o.IsUnit {
			return cache.UnitToken
		}
		return cache.StreamToken
	}
	block := func(b *ast.Block, unit bool) {
		if b == nil {
			return
		}
		for _, e := range b.Entries {
			switch e := e.(type) {
			case *ast.Given:
				if unit {
					tok(e.Key, cache.ParamToken, false)
				} else {
					tok(e.Key, cache.PropToken, false)
				}
				qty(e.Value)
				tol(e.Tol)
			case *ast.Names:
				if unit {
					tok(e.Key, cache.RoleToken, false)
					for _, n := range e.Names {
						tok(n, nameKind(n), false)
					}
				} else {
					tok(e.Key, cache.KeywordToken, false)
					for _, n := range e.Names {
						tok(n, cache.KeywordToken, false)
					}
				}
			}
		}
	}
	for _, s := range f.Stmts {
		switch s := s.(type) {
		case *ast.Setting:
			tok(s.Key, cache.KeywordToken, false)
			label(s.Str)
			qty(s.Qty)
			if s.Word != nil {
				tok(s.Word, cache.KeywordToken, false)
			}
		case *ast.StreamDecl:
			word(s.Keyword, "stream", cache.KeywordToken)
			tok(s.Name, cache.StreamToken, true)
			declSpan[s.Name] = spanOf(s)
			if len(s.More) > 0 {
				// A list declares each stream by its name alone: hints then sit beside each
				// name, not all at the end of the list.
				declSpan[s.Name] = spanOf(s.Name)
			}
			for _, n := range s.More {
				tok(n, cache.StreamToken, true)
				declSpan[n] = spanOf(n)
			}
			label(s.Label)
			block(s.Block, false)
		case *ast.UnitDecl:
			tok(s.Kind, cache.KindToken, false)
			tok(s.Name, cache.UnitToken, true)
			declSpan[s.Name] = spanOf(s)
			label(s.Label)
			block(s.Block, true)
		case *ast.Expect:
			word(s.Keyword, "expect", cache.KeywordToken)
			if s.Target != nil {
				tok(s.Target, nameKind(s.Target), false)
			}
			if s.Prop != nil {
				tok(s.Prop, cache.PropToken, false)
			}
			word(s.OpPos, s.Op, cache.OperatorToken)
			qty(s.Value)
			tol(s.Tol)
			label(s.Label)
		}
	}
	for _, c := range f.Comments {
		tok(c, cache.CommentToken, false)
	}
	slices.SortStableFunc(toks, func(a, b cache.Token) int { return cmp.Compare(a.Span.Start, b.Span.Start) })
	syn.Tokens = toks

	if info == nil {
		return
	}
	for _, o := range info.Order {
		k := cache.StreamSymbol
		if o.IsUnit {
			k = cache.UnitSymbol
		}
		sp, ok := declSpan[o.Decl]
		if !ok {
			sp = spanOf(o.Decl)
		}
		i := len(syn.Symbols)
		syn.Symbols = append(syn.Symbols, cache.Symbol{
			Kind: k, Name: o.Name, Label: o.Label, UnitKind: o.KindName,
			NameSpan: spanOf(o.Decl), Span: sp, Index: o.Index,
		})
		syn.Refs = append(syn.Refs, cache.Ref{Name: o.Name, Span: spanOf(o.Decl), Symbol: i, Decl: true, Kind: k})
		for _, r := range o.Refs {
			syn.Refs = append(syn.Refs, cache.Ref{Name: o.Name, Span: spanOf(r), Symbol: i, Kind: k})
		}
	}
	for _, r := range info.Unresolved {
		syn.Refs = append(syn.Refs, cache.Ref{Name: r.Name, Span: spanOf(r), Symbol: -1})
	}
	slices.SortStableFunc(syn.Refs, func(a, b cache.Ref) int { return cmp.Compare(a.Span.Start, b.Span.Start) })
}
