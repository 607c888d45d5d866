package lang

import (
	"slices"

	"hmb/lang/ast"
)

// TokenKind classifies a token for highlighting (the language server's semantic tokens).
type TokenKind uint8

const (
	Keyword    TokenKind = iota // stream, expect, within, settings, unit kinds, roles, fluid names
	Property                    // a stream property, unit parameter or result: p, T, efficiency, duty
	StreamName                  // a stream's name, declared or mentioned
	UnitName                    // a unit's name, declared or mentioned
	Number
	UnitSpelling // psig, lbm/h, °F, %
	String
	Comment
	Operator // = < <= > >= ±
)

var tokenKindNames = [...]string{"keyword", "property", "stream", "unit", "number", "unit spelling", "string", "comment", "operator"}

func (k TokenKind) String() string { return tokenKindNames[k] }

// Token is a classified byte range of the source.
type Token struct {
	Pos, End int
	Kind     TokenKind
}

// Tokens classifies the tokens of a checked file, in source order. Names that do not resolve are
// classed by where they stand (a port list names streams). Syntax the parser could not place
// (inside *ast.Bad) is left out.
func (r *Result) Tokens() []Token {
	var out []Token
	add := func(pos, end int, k TokenKind) { out = append(out, Token{pos, end, k}) }
	id := func(x *ast.Ident, k TokenKind) {
		if x != nil {
			add(x.Pos(), x.End(), k)
		}
	}
	str := func(s *ast.String) {
		if s != nil {
			add(s.Pos(), s.End(), String)
		}
	}
	qty := func(q *ast.Quantity) {
		if q != nil {
			add(q.NumPos, q.NumPos+len(q.Raw), Number)
			id(q.Unit, UnitSpelling)
		}
	}
	tol := func(t *ast.Tol) {
		if t != nil {
			k := Operator
			if t.Op == "within" {
				k = Keyword
			}
			add(t.OpPos, t.OpPos+len(t.Op), k)
			qty(t.Amount)
		}
	}
	name := func(x *ast.Ident, isUnit bool) {
		if o := r.Info.Objects[x.Name]; o != nil {
			isUnit = o.IsUnit
		}
		if isUnit {
			id(x, UnitName)
		} else {
			id(x, StreamName)
		}
	}
	block := func(b *ast.Block, inUnit bool) {
		if b == nil {
			return
		}
		for _, e := range b.Entries {
			switch e := e.(type) {
			case *ast.Given:
				id(e.Key, Property)
				qty(e.Value)
				tol(e.Tol)
			case *ast.Names:
				if !inUnit { // fluid water
					id(e.Key, Property)
					for _, n := range e.Names {
						id(n, Keyword)
					}
					continue
				}
				id(e.Key, Keyword)
				for _, n := range e.Names {
					name(n, false)
				}
			}
		}
	}
	for _, s := range r.File.Stmts {
		switch s := s.(type) {
		case *ast.Setting:
			id(s.Key, Keyword)
			str(s.Str)
			qty(s.Qty)
			id(s.Word, Keyword)
		case *ast.StreamDecl:
			add(s.Keyword, s.Keyword+len("stream"), Keyword)
			id(s.Name, StreamName)
			for _, n := range s.More {
				id(n, StreamName)
			}
			str(s.Label)
			block(s.Block, false)
		case *ast.UnitDecl:
			id(s.Kind, Keyword)
			id(s.Name, UnitName)
			str(s.Label)
			block(s.Block, true)
		case *ast.Expect:
			add(s.Keyword, s.Keyword+len("expect"), Keyword)
			name(s.Target, false)
			id(s.Prop, Property)
			add(s.OpPos, s.OpPos+len(s.Op), Operator)
			qty(s.Value)
			tol(s.Tol)
			str(s.Label)
		}
	}
	for _, c := range r.File.Comments {
		add(c.Pos(), c.End(), Comment)
	}
	slices.SortFunc(out, func(a, b Token) int { return a.Pos - b.Pos })
	return out
}
