package parser

import (
	"io"

	"github.com/alecthomas/participle/v2"
	"github.com/alecthomas/participle/v2/lexer"

	"hmb/lang/token"
)

// The grammar, one participle production per kind of piece. The recovering driver (parser.go)
// cuts the token stream into pieces (a statement's header, one entry of a block) and picks the
// production from the piece's first tokens, so that no production needs backtracking and a broken
// piece costs only itself.
//
//	stream  = "stream" Ident {"," Ident} [String] ["{"]    (several names: bare declarations)
//	unit    = Ident Ident [String] "{"                   (kind, name, label)
//	setting = Ident (String | quantity | Ident | Word)   (display_flow t/h: a unit spelling alone)
//	expect  = "expect" Ident Ident op quantity [tol] [String]
//	given   = Ident quantity [tol]                       (in a block: p 150 psig ± 2 %)
//	names   = Ident Ident {"," Ident}                    (in a block: in S6, S7; fluid water)
//	case    = "case" Ident [String] "{"                  (its entries: override, expect)
//	override = Ident Ident (quantity [tol] | Ident)      (in a case: FW flow 6 kg/s; FW T free)
//	sweep   = "sweep" Ident [String] "{"                 (its entries: range, show, names)
//	range   = Ident Ident "from" bound "to" bound ("step" | "count") bound
//	show    = "show" Ident Ident {"," Ident Ident}       (in a sweep: show MS T, T1 power)
//	quantity = Number [Ident | Word]                    (a unit spelling; not "within")
//	bound   = Number [Ident | Word]                     (a unit spelling; not "to", "step", "count")
//	tol     = (PlusMinus | "within") quantity
//	op      = "=" | "<" | "<=" | ">" | ">="

type gQuantity struct {
	Num  lexer.Token  `parser:"@Number"`
	Unit *lexer.Token `parser:"( (?! 'within') @(Ident | Word) )?"`
}

type gTol struct {
	Op  lexer.Token `parser:"@(PlusMinus | 'within')"`
	Amt gQuantity   `parser:"@@"`
}

type gStream struct {
	Kw    lexer.Token  `parser:"@'stream'"`
	Name  lexer.Token  `parser:"@Ident"`
	More  []gName      `parser:"( Comma @@ )*"`
	Label *lexer.Token `parser:"@String?"`
	Brace *lexer.Token `parser:"@LBrace?"`
}

type gUnit struct {
	Kind  lexer.Token  `parser:"@Ident"`
	Name  lexer.Token  `parser:"@Ident"`
	Label *lexer.Token `parser:"@String?"`
	Brace lexer.Token  `parser:"@LBrace"`
}

type gSetting struct {
	Key   lexer.Token  `parser:"@Ident"`
	Str   *lexer.Token `parser:"( @String"`
	Qty   *gQuantity   `parser:"| @@"`
	Ident *lexer.Token `parser:"| @(Ident | Word) )"`
}

type gExpect struct {
	Kw     lexer.Token  `parser:"@'expect'"`
	Target lexer.Token  `parser:"@Ident"`
	Prop   lexer.Token  `parser:"@Ident"`
	Op     lexer.Token  `parser:"@(Eq | Lt | Le | Gt | Ge)"`
	Value  gQuantity    `parser:"@@"`
	Tol    *gTol        `parser:"@@?"`
	Label  *lexer.Token `parser:"@String?"`
}

type gGiven struct {
	Key   lexer.Token `parser:"@Ident"`
	Value gQuantity   `parser:"@@"`
	Tol   *gTol       `parser:"@@?"`
}

type gNames struct {
	Key   lexer.Token `parser:"@Ident"`
	Names []gName     `parser:"@@ ( Comma @@ )*"`
}

type gOverride struct {
	Target lexer.Token  `parser:"@Ident"`
	Prop   lexer.Token  `parser:"@Ident"`
	Value  *gQuantity   `parser:"( @@"`
	Tol    *gTol        `parser:"  @@?"`
	Word   *lexer.Token `parser:"| @Ident )"`
}

type gBound struct {
	Num  lexer.Token  `parser:"@Number"`
	Unit *lexer.Token `parser:"( (?! 'to' | 'step' | 'count') @(Ident | Word) )?"`
}

type gRange struct {
	Target lexer.Token `parser:"@Ident"`
	Prop   lexer.Token `parser:"@Ident"`
	From   lexer.Token `parser:"@'from'"`
	Lo     gBound      `parser:"@@"`
	To     lexer.Token `parser:"@'to'"`
	Hi     gBound      `parser:"@@"`
	By     lexer.Token `parser:"@('step' | 'count')"`
	Step   gBound      `parser:"@@"`
}

// gShow's keyword is any name: the driver picks the production when the entry starts with show.
type gShow struct {
	Kw    lexer.Token `parser:"@Ident"`
	Items []gRef      `parser:"@@ ( Comma @@ )*"`
}

type gRef struct {
	Target lexer.Token `parser:"@Ident"`
	Prop   lexer.Token `parser:"@Ident"`
}

// gName wraps a name of a list: participle overwrites, rather than appends to, a []lexer.Token.
type gName struct {
	Tok lexer.Token `parser:"@Ident"`
}

// definition is participle's view of the scanner. The driver hands participle pre-scanned pieces
// through pieceLexer; Lex exists to satisfy lexer.Definition and scans a whole reader the same way.
type definition struct{}

var symbols = func() map[string]lexer.TokenType {
	m := map[string]lexer.TokenType{}
	for k := token.EOF; k <= token.PlusMinus; k++ {
		m[k.String()] = tokenType(k)
	}
	return m
}()

func tokenType(k token.Kind) lexer.TokenType { return lexer.TokenType(-1 - int(k)) }

func (definition) Symbols() map[string]lexer.TokenType { return symbols }

func (definition) Lex(filename string, r io.Reader) (lexer.Lexer, error) {
	src, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	toks, _ := token.Scan(src)
	s := string(src)
	out := make([]lexer.Token, len(toks))
	for i, t := range toks {
		out[i] = lexer.Token{Type: tokenType(t.Kind), Value: s[t.Pos:t.End],
			Pos: lexer.Position{Filename: filename, Offset: int(t.Pos)}}
	}
	return &pieceLexer{toks: out}, nil
}

// pieceLexer replays already-made tokens; the last must be EOF.
type pieceLexer struct {
	toks []lexer.Token
	i    int
}

func (l *pieceLexer) Next() (lexer.Token, error) {
	t := l.toks[l.i]
	if l.i < len(l.toks)-1 {
		l.i++
	}
	return t, nil
}

func build[G any]() *participle.Parser[G] {
	return participle.MustBuild[G](participle.Lexer(definition{}), participle.UseLookahead(2))
}

var (
	streamParser  = build[gStream]()
	unitParser    = build[gUnit]()
	settingParser = build[gSetting]()
	expectParser  = build[gExpect]()
	givenParser   = build[gGiven]()
	namesParser   = build[gNames]()
	// A case's or a sweep's header has a unit's shape: keyword, name, label, brace.
	overrideParser = build[gOverride]()
	rangeParser    = build[gRange]()
	showParser     = build[gShow]()
)
