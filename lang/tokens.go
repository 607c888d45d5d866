package lang

import (
	"slices"

	"hmb/lang/ast"
	"hmb/thermo/model"
)

// TokenKind is the role of a token, as highlighting and hover see it.
type TokenKind uint8

const (
	KeywordToken  TokenKind = iota // stream, expect, within, settings and their words, fluid
	StreamToken                    // a stream's name, declared or mentioned
	UnitToken                      // a unit's name, declared or mentioned
	KindToken                      // a unit kind: mixer, turbine...
	RoleToken                      // a port role: in, out, hot_in...
	ParamToken                     // a unit parameter: duty, efficiency...
	PropToken                      // a stream property, or the result an expectation checks
	NumberToken                    // 150, -4.5
	SpellingToken                  // psig, lbm/h, °F, %
	StringToken                    // a label or a title
	CommentToken                   // # to the end of the line
	OperatorToken                  // = < <= > >= ±
	CaseToken                      // a case's or a sweep's name
	NumTokenKinds
)

var tokenKindNames = [NumTokenKinds]string{"keyword", "stream", "unit", "kind", "role", "parameter",
	"property", "number", "unit spelling", "string", "comment", "operator", "case"}

func (k TokenKind) String() string {
	if k < NumTokenKinds {
		return tokenKindNames[k]
	}
	return "?"
}

// Token is a classified byte range [Pos, End) of the source.
type Token struct {
	Pos, End int
	Kind     TokenKind
	Decl     bool // a stream's or unit's name where it is declared
}

// Tokens classifies the tokens of a checked file, in source order. Names that do not resolve are
// classed by where they stand (a port list and an expectation name streams). Syntax the parser
// could not place (inside *ast.Bad) is left out.
func (r *Result) Tokens() []Token {
	t := tokenizer{r: r, out: make([]Token, 0, len(r.File.Tokens))}
	for _, s := range r.File.Stmts {
		t.stmt(s)
	}
	for _, c := range r.File.Comments {
		t.node(c, CommentToken, false)
	}
	slices.SortStableFunc(t.out, func(a, b Token) int { return a.Pos - b.Pos })
	return t.out
}

type tokenizer struct {
	r   *Result
	out []Token
}

func (t *tokenizer) add(pos, end int, k TokenKind, decl bool) {
	if end > pos {
		t.out = append(t.out, Token{Pos: pos, End: end, Kind: k, Decl: decl})
	}
}

func (t *tokenizer) node(n ast.Node, k TokenKind, decl bool) {
	if n != nil {
		t.add(n.Pos(), n.End(), k, decl)
	}
}

func (t *tokenizer) ident(id *ast.Ident, k TokenKind, decl bool) {
	if id != nil {
		t.add(id.Pos(), id.End(), k, decl)
	}
}

func (t *tokenizer) str(s *ast.String) {
	if s != nil {
		t.add(s.Pos(), s.End(), StringToken, false)
	}
}

func (t *tokenizer) qty(q *ast.Quantity) {
	if q != nil {
		t.add(q.NumPos, q.NumPos+len(q.Raw), NumberToken, false)
		t.ident(q.Unit, SpellingToken, false)
	}
}

func (t *tokenizer) tol(tl *ast.Tol) {
	if tl == nil {
		return
	}
	k := OperatorToken
	if tl.Op == "within" {
		k = KeywordToken
	}
	t.add(tl.OpPos, tl.OpPos+len(tl.Op), k, false)
	t.qty(tl.Amount)
}

// name classes a mention of a stream or unit by what it names; an unresolved one is a stream.
func (t *tokenizer) name(id *ast.Ident) {
	if id == nil {
		return
	}
	k := StreamToken
	if t.r.Info != nil {
		if o := t.r.Info.Objects[id.Name]; o != nil && o.IsUnit {
			k = UnitToken
		}
	}
	t.ident(id, k, false)
}

func (t *tokenizer) block(b *ast.Block, unit bool) {
	if b == nil {
		return
	}
	for _, e := range b.Entries {
		switch e := e.(type) {
		case *ast.Given:
			if unit {
				t.ident(e.Key, ParamToken, false)
			} else {
				t.ident(e.Key, PropToken, false)
			}
			t.qty(e.Value)
			t.tol(e.Tol)
		case *ast.Names:
			if !unit { // fluid water
				t.ident(e.Key, KeywordToken, false)
				for _, n := range e.Names {
					t.ident(n, KeywordToken, false)
				}
				continue
			}
			t.ident(e.Key, RoleToken, false)
			for _, n := range e.Names {
				t.name(n)
			}
		}
	}
}

func (t *tokenizer) stmt(s ast.Stmt) {
	switch s := s.(type) {
	case *ast.Setting:
		t.ident(s.Key, KeywordToken, false)
		t.str(s.Str)
		t.qty(s.Qty)
		t.ident(s.Word, KeywordToken, false)
	case *ast.StreamDecl:
		t.add(s.Keyword, s.Keyword+len("stream"), KeywordToken, false)
		t.ident(s.Name, StreamToken, true)
		for _, n := range s.More {
			t.ident(n, StreamToken, true)
		}
		t.str(s.Label)
		t.block(s.Block, false)
	case *ast.UnitDecl:
		t.ident(s.Kind, KindToken, false)
		t.ident(s.Name, UnitToken, true)
		t.str(s.Label)
		t.block(s.Block, true)
	case *ast.Expect:
		t.expect(s)
	case *ast.CaseDecl:
		t.add(s.Keyword, s.Keyword+len("case"), KeywordToken, false)
		t.ident(s.Name, CaseToken, true)
		t.str(s.Label)
		if s.Block != nil {
			for _, e := range s.Block.Entries {
				switch e := e.(type) {
				case *ast.Expect:
					t.expect(e)
				case *ast.Override:
					t.ref(e.Target, e.Prop, true)
					t.qty(e.Value)
					t.tol(e.Tol)
					t.word(e.Word)
				}
			}
		}
	case *ast.SweepDecl:
		t.add(s.Keyword, s.Keyword+len("sweep"), KeywordToken, false)
		t.ident(s.Name, CaseToken, true)
		t.str(s.Label)
		if s.Block != nil {
			for _, e := range s.Block.Entries {
				t.sweepEntry(e)
			}
		}
	}
}

func (t *tokenizer) expect(s *ast.Expect) {
	t.add(s.Keyword, s.Keyword+len("expect"), KeywordToken, false)
	if IsTotal(t.r, s.Target) {
		t.ident(s.Target, KeywordToken, false) // the whole file, not a name
	} else {
		t.name(s.Target)
	}
	t.ident(s.Prop, PropToken, false)
	t.add(s.OpPos, s.OpPos+len(s.Op), OperatorToken, false)
	t.qty(s.Value)
	t.tol(s.Tol)
	t.str(s.Label)
}

// ref classes "NAME PROPERTY" of a case or a sweep: the property is a unit's parameter (given)
// or result, or a stream's property.
func (t *tokenizer) ref(target, prop *ast.Ident, given bool) {
	t.name(target)
	k := PropToken
	if given && t.isUnit(target) {
		k = ParamToken
	}
	t.ident(prop, k, false)
}

// word classes the word a case states: free, or a parameter's word.
func (t *tokenizer) word(w *ast.Ident) { t.ident(w, KeywordToken, false) }

func (t *tokenizer) isUnit(id *ast.Ident) bool {
	if t.r.Info == nil {
		return false
	}
	o := t.r.Info.Objects[id.Name]
	return o != nil && o.IsUnit
}

func (t *tokenizer) sweepEntry(e ast.Entry) {
	switch e := e.(type) {
	case *ast.Range:
		t.ref(e.Target, e.Prop, true)
		t.add(e.FromPos, e.FromPos+len("from"), KeywordToken, false)
		t.qty(e.From)
		t.add(e.ToPos, e.ToPos+len("to"), KeywordToken, false)
		t.qty(e.To)
		t.ident(e.By, KeywordToken, false)
		t.qty(e.Step)
	case *ast.Show:
		t.add(e.Keyword, e.Keyword+len("show"), KeywordToken, false)
		for _, it := range e.Items {
			t.ref(it.Target, it.Prop, false)
		}
	case *ast.Names:
		t.ident(e.Key, KeywordToken, false)
		for _, n := range e.Names {
			t.ident(n, CaseToken, false)
		}
	}
}

// IsTotal reports whether an expectation's target names the whole file's totals: the word
// total, when no stream or unit of the file is named so.
func IsTotal(r *Result, target *ast.Ident) bool {
	if target == nil || target.Name != model.TotalName {
		return false
	}
	return r.Info == nil || r.Info.Objects[model.TotalName] == nil
}
