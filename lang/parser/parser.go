// Package parser turns a calc file into a syntax tree and reports what does not fit the notation.
//
// participle has no error recovery, so the driver here cuts the token stream into pieces (the
// header of each top-level statement, and each entry of a block) and parses each piece with a
// participle production on its own. A broken piece becomes an *ast.Bad node and one diagnostic;
// every other piece of the file is still parsed, so that the language server can check a file
// while it is being typed. Braces are matched by the driver, which also notices a block left open
// when the next statement begins.
//
// A failure is read through participle's error types, never its message: the position of the
// token participle could not take, and what the grammar would have taken there, found by offering
// the production each kind of token in its place (expectedAt). From the same two facts the driver
// tells two entries run together on one line (a missing ;) and reads both.
package parser

import (
	"bytes"
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/alecthomas/participle/v2"
	"github.com/alecthomas/participle/v2/lexer"

	"hmb/lang/ast"
	"hmb/lang/source"
	"hmb/lang/token"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Parse parses a calc file. It never fails and never panics: what does not parse is reported in
// the diagnostics (sorted by position) and left out of the tree as *ast.Bad nodes.
func Parse(filename string, src []byte) (*ast.File, []model.Diagnostic) {
	toks, errs := token.Scan(src)
	p := &parser{src: src, str: string(src), toks: toks}
	p.file = &ast.File{Tokens: toks}
	lines := p.sizeArenas()
	p.file.Src = source.NewLines(filename, src, lines)
	for _, e := range errs {
		code := CodeIllegal
		if src[e.Pos] == '"' {
			code = CodeString
		}
		p.errorf(code, e.Pos, e.End, "%s", e.Msg)
	}
	if p.nComments > 0 {
		p.file.Comments = make([]*ast.Comment, p.nComments)
		cs := make([]ast.Comment, p.nComments)
		k := 0
		for _, t := range toks {
			if t.Kind == token.Comment {
				cs[k] = ast.Comment{Hash: int(t.Pos), Text: p.str[t.Pos:t.End]}
				p.file.Comments[k] = &cs[k]
				k++
			}
		}
	}
	p.parseFile()
	if len(p.file.Stmts) == 0 {
		p.file.Stmts = nil // as for a file that was never given a statement
	}
	slices.SortStableFunc(p.diags, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	if len(p.diags) > MaxErrors || p.dropped > 0 {
		more := len(p.diags) - MaxErrors + p.dropped
		at := p.diags[MaxErrors].Span.Start
		p.diags = append(p.diags[:MaxErrors], model.Diagnostic{Span: model.Span{Start: at, End: at},
			Severity: model.Error, Code: CodeTooMany,
			Message: fmt.Sprintf("%d more syntax errors from here on are not reported", more)})
	}
	return p.file, p.diags
}

// MaxErrors bounds the syntax errors Parse reports; one more diagnostic says how many were left
// out. A file of five megabytes of braces would otherwise make ten million diagnostics, more
// than an editor can show or a person read. Parsing goes on past the bound, so that the checker
// still sees every statement.
const MaxErrors = 100

// keepErrors bounds the syntax errors held before sorting: errors arrive nearly in source order
// (the scanner's first), so ten times the reported number leaves room to pick the first by
// position while holding memory to a few hundred kilobytes.
const keepErrors = 10 * MaxErrors

type parser struct {
	src       []byte
	str       string // src as one string; names are substrings of it
	toks      []token.Token
	file      *ast.File
	diags     []model.Diagnostic
	dropped   int           // syntax errors past keepErrors, counted but not kept
	piece     []token.Token // scratch: the significant tokens of the current piece
	mode      blockMode     // what the entries of the block being parsed are
	entries   []ast.Entry   // scratch: the entries of the current block
	shapes    localShapes   // this parse's view of the shape cache
	nComments int

	// Nodes come from slabs: a file has tens of thousands of names and numbers, and one
	// allocation each would dominate the parse (and the collector's work after it).
	idents  slab[ast.Ident]
	qtys    slab[ast.Quantity]
	givens  slab[ast.Given]
	names   slab[ast.Names]
	blocks  slab[ast.Block]
	streams slab[ast.StreamDecl]
	units   slab[ast.UnitDecl]
	strs    slab[ast.String]
	tols    slab[ast.Tol]
	// Slices of the tree (a block's entries, a list's names) are cut from shared arrays.
	entryArr arena[ast.Entry]
	identArr arena[*ast.Ident]
}

// sizeArenas counts the tokens by kind and sizes the first chunk of each slab, and the list of
// statements, to fit the file: a large file then takes one allocation per kind of node, a small
// one no more than it needs. Most counts bound the nodes from above (a name node per name token,
// a block per "{"); a slab whose count falls short grows.
//
// It returns the line starts of the file too, which the same pass finds: every "\n" of the file
// is a Newline token of its own.
func (p *parser) sizeArenas() (lines []int) {
	var n [32]int
	streamKw := 0
	lines = make([]int, 1, bytes.Count(p.src, newline)+1)
	for _, t := range p.toks {
		n[t.Kind&31]++
		switch {
		case t.Kind == token.Newline:
			lines = append(lines, int(t.End))
		case t.Kind == token.Ident && t.End-t.Pos == 6 && p.str[t.Pos:t.End] == "stream":
			streamKw++
		}
	}
	p.nComments = n[token.Comment]
	p.idents.next = n[token.Ident] + n[token.Word] - streamKw // the keyword is no name
	p.qtys.next = n[token.Number]
	p.givens.next = n[token.Number] - n[token.PlusMinus]
	p.names.next = n[token.LBrace]
	p.blocks.next = n[token.LBrace]
	p.streams.next = streamKw
	p.units.next = n[token.LBrace] - streamKw + 8 // most streams have a block; a unit always has
	p.strs.next = n[token.String]
	p.tols.next = n[token.PlusMinus]
	p.entryArr.next = n[token.Newline] + n[token.Semi]
	p.identArr.next = n[token.Comma] + n[token.LBrace]
	p.file.Stmts = make([]ast.Stmt, 0, n[token.LBrace]+n[token.Newline]/8+1)
	return lines
}

var newline = []byte{'\n'}

// slab hands out nodes from chunks; a chunk lives as long as any of its nodes. A node comes
// zeroed, never used before: callers set the fields they need one by one, which spares the
// collector's write barrier a pass over the whole node.
type slab[T any] struct {
	buf  []T
	next int // size of the next chunk
}

func (s *slab[T]) new() *T {
	if len(s.buf) == cap(s.buf) {
		s.buf = make([]T, 0, max(s.next, 8))
		s.next = min(2*cap(s.buf), 1<<14)
	}
	s.buf = s.buf[:len(s.buf)+1]
	return &s.buf[len(s.buf)-1]
}

// arena hands out slices cut from shared chunks. Each slice is capped at its length, so that an
// append to it copies rather than overwriting its neighbour.
type arena[T any] struct {
	buf  []T
	next int
}

func (a *arena[T]) take(n int) []T {
	if cap(a.buf)-len(a.buf) < n {
		a.buf = make([]T, 0, max(n, a.next, 8))
		a.next = min(2*cap(a.buf), 1<<14)
	}
	i := len(a.buf)
	a.buf = a.buf[:i+n]
	return a.buf[i : i+n : i+n]
}

// errorf reports a syntax error; it returns the diagnostic, or nil when too many are held already.
func (p *parser) errorf(code string, pos, end int, format string, args ...any) *model.Diagnostic {
	if len(p.diags) >= keepErrors {
		p.dropped++
		return nil
	}
	p.diags = append(p.diags, model.Diagnostic{Span: model.Span{Start: pos, End: end},
		Severity: model.Error, Code: code, Message: fmt.Sprintf(format, args...)})
	return &p.diags[len(p.diags)-1]
}

func (p *parser) text(t token.Token) string { return p.str[t.Pos:t.End] }

func (p *parser) isKeyword(t token.Token, kw string) bool {
	return t.Kind == token.Ident && int(t.End)-int(t.Pos) == len(kw) && p.str[t.Pos:t.End] == kw
}

// skip passes over separators and comments.
func (p *parser) skip(i int) int {
	for {
		switch p.toks[i].Kind {
		case token.Newline, token.Semi, token.Comment:
			i++
		default:
			return i
		}
	}
}

func (p *parser) parseFile() {
	for i := p.skip(0); p.toks[i].Kind != token.EOF; i = p.skip(i) {
		if t := p.toks[i]; t.Kind == token.RBrace {
			p.errorf(CodeStrayBrace, int(t.Pos), int(t.End), "} with no block open")
			i++
			continue
		}
		i = p.parseStmt(i)
	}
}

// parseStmt parses the statement starting at token i and returns the index after it.
func (p *parser) parseStmt(i int) int {
	j := i
	for !p.endsHeader(p.toks[j].Kind) {
		j++
	}
	hasBlock := p.toks[j].Kind == token.LBrace
	end := j
	if hasBlock {
		end++
	}
	piece := p.significant(i, end)
	if len(piece) == 0 { // only illegal characters, already reported
		return end
	}
	if !hasBlock {
		p.addStmts(piece)
		return end
	}
	var stmt ast.Stmt
	p.mode = plainBlock
	switch first := piece[0]; {
	case p.isKeyword(first, "stream"):
		stmt = p.streamDecl(piece)
	case p.isKeyword(first, "expect"):
		stmt = p.expect(piece)
	case p.isKeyword(first, "case"):
		stmt, p.mode = p.caseDecl(piece), caseBlock
	case p.isKeyword(first, "sweep"):
		stmt, p.mode = p.caseDecl(piece), sweepBlock
	case hasBlock:
		stmt = p.unitDecl(piece)
	default:
		stmt = p.setting(piece)
	}
	b, next := p.block(j, stmt)
	switch s := stmt.(type) {
	case *ast.StreamDecl:
		s.Block = b
	case *ast.UnitDecl:
		s.Block = b
	case *ast.CaseDecl:
		s.Block = b
	case *ast.SweepDecl:
		s.Block = b
	case *ast.Bad:
		s.To = max(s.To, b.End())
	}
	p.file.Stmts = append(p.file.Stmts, stmt)
	return next
}

func (p *parser) endsHeader(k token.Kind) bool {
	switch k {
	case token.Newline, token.Semi, token.Comment, token.EOF, token.LBrace, token.RBrace:
		return true
	}
	return false
}

// significant collects the tokens of toks[i:j] other than comments and newlines (a list of names
// may continue on the next line after a comma) into the scratch piece. Illegal characters are
// left out too: the scanner has reported them, once is enough. Most pieces hold none of these,
// and are returned as they stand in toks, without a copy.
func (p *parser) significant(i, j int) []token.Token {
	for k := i; k < j; k++ {
		if !isSignificant(p.toks[k].Kind) {
			p.piece = append(p.piece[:0], p.toks[i:k]...)
			for _, t := range p.toks[k+1 : j] {
				if isSignificant(t.Kind) {
					p.piece = append(p.piece, t)
				}
			}
			return p.piece
		}
	}
	return p.toks[i:j:j]
}

func isSignificant(k token.Kind) bool {
	return k != token.Comment && k != token.Newline && k != token.Illegal
}

// block parses the entries after the "{" at token lb, up to the matching "}", and returns the
// index after the block. A block still open at the end of the file, or when a line that can only
// start a statement comes, is reported and closed there.
func (p *parser) block(lb int, owner ast.Stmt) (*ast.Block, int) {
	b := p.blocks.new()
	b.Lbrace, b.Rbrace = int(p.toks[lb].Pos), -1
	p.entries = p.entries[:0]
	next := p.blockEntries(b, lb, owner)
	if len(p.entries) == 0 {
		b.Entries = p.entries[:0:0] // nil, or empty, as the scratch was
	} else {
		b.Entries = p.entryArr.take(len(p.entries))
		copy(b.Entries, p.entries)
	}
	return b, next
}

// blockEntries collects the entries of the block b into p.entries and returns the index after
// the block.
func (p *parser) blockEntries(b *ast.Block, lb int, owner ast.Stmt) int {
	i := lb + 1
	for {
		i = p.skip(i)
		switch t := p.toks[i]; t.Kind {
		case token.RBrace:
			b.Rbrace = int(t.Pos)
			return i + 1
		case token.EOF:
			p.unclosed(b, owner, -1)
			return i
		}
		j, afterComma, startsStmt := i, false, false
	line:
		for {
			switch k := p.toks[j].Kind; k {
			case token.EOF, token.RBrace, token.Semi:
				break line
			case token.Newline:
				if !afterComma {
					break line
				}
			case token.Comment:
			case token.LBrace:
				startsStmt = true
				break line
			default:
				afterComma = k == token.Comma
			}
			j++
		}
		first := p.toks[i]
		if startsStmt || p.isKeyword(first, "stream") || p.isKeyword(first, "expect") && p.mode != caseBlock {
			p.unclosed(b, owner, int(first.Pos))
			return i
		}
		if piece := p.significant(i, j); len(piece) > 0 {
			p.addEntries(piece)
		}
		i = j
	}
}

func (p *parser) unclosed(b *ast.Block, owner ast.Stmt, next int) {
	what := "block"
	switch s := owner.(type) {
	case *ast.StreamDecl:
		what = "block of stream " + s.Name.Name
	case *ast.UnitDecl:
		what = "block of " + s.Kind.Name + " " + s.Name.Name
	case *ast.CaseDecl:
		what = "block of case " + s.Name.Name
	case *ast.SweepDecl:
		what = "block of sweep " + s.Name.Name
	}
	d := p.errorf(CodeUnclosed, b.Lbrace, b.Lbrace+1, "%s is not closed: missing }", what)
	if next >= 0 && d != nil {
		d.Related = []model.Related{{Span: model.Span{Start: next, End: next}, Message: "the next statement starts here"}}
	}
}

// blockMode says which productions a block's entries take.
type blockMode uint8

const (
	plainBlock blockMode = iota // a stream's or a unit's: givens and names
	caseBlock                   // a case's: overrides and expectations
	sweepBlock                  // a sweep's: a range, show lists and the case it runs on
)

// Productions. Each returns its node, or an *ast.Bad after reporting the error.

// caseDecl parses the header of a case or a sweep (piece[0] says which): it has a unit's shape.
func (p *parser) caseDecl(piece []token.Token) ast.Stmt {
	kw := p.text(piece[0])
	g, bad := parseOrReport(p, prodCase, unitParser, piece, kw+" declaration")
	if bad != nil {
		return bad
	}
	name, label := p.ident(piece, &g.Name), p.label(piece, g.Label)
	if kw == "sweep" {
		return &ast.SweepDecl{Keyword: int(piece[0].Pos), Name: name, Label: label}
	}
	return &ast.CaseDecl{Keyword: int(piece[0].Pos), Name: name, Label: label}
}

// caseEntry parses an entry of a case: an expectation, or NAME PROPERTY VALUE.
func (p *parser) caseEntry(piece []token.Token) ast.Entry {
	if p.isKeyword(piece[0], "expect") {
		switch x := p.expect(piece).(type) {
		case *ast.Expect:
			return x
		case *ast.Bad:
			return x
		}
	}
	if len(piece) == 1 && piece[0].Kind == token.Ident {
		return p.missingValue(piece[0])
	}
	g, bad := parseOrReport(p, prodOverride, overrideParser, piece, "case entry")
	if bad != nil {
		return bad
	}
	x := &ast.Override{Target: p.ident(piece, &g.Target), Prop: p.ident(piece, &g.Prop)}
	if g.Word != nil {
		x.Word = p.ident(piece, g.Word)
	} else {
		x.Value, x.Tol = p.quantity(piece, g.Value), p.tol(piece, g.Tol)
	}
	return x
}

// sweepEntry parses an entry of a sweep: show ..., case NAME, or the range.
func (p *parser) sweepEntry(piece []token.Token) ast.Entry {
	switch {
	case len(piece) == 1 && piece[0].Kind == token.Ident:
		return p.missingValue(piece[0])
	case p.isKeyword(piece[0], "show"):
		g, bad := parseOrReport(p, prodShow, showParser, piece, "show list")
		if bad != nil {
			return bad
		}
		x := &ast.Show{Keyword: int(piece[0].Pos), Items: make([]*ast.ResultRef, len(g.Items))}
		for k := range g.Items {
			x.Items[k] = &ast.ResultRef{Target: p.ident(piece, &g.Items[k].Target), Prop: p.ident(piece, &g.Items[k].Prop)}
		}
		return x
	case p.isKeyword(piece[0], "case"):
		return p.entry(piece) // case NAME: a list of names, which the checker holds to one
	}
	g, bad := parseOrReport(p, prodRange, rangeParser, piece, "sweep range")
	if bad != nil {
		return bad
	}
	return &ast.Range{Target: p.ident(piece, &g.Target), Prop: p.ident(piece, &g.Prop),
		FromPos: int(piece[g.From.Pos.Offset].Pos), From: p.bound(piece, &g.Lo),
		ToPos: int(piece[g.To.Pos.Offset].Pos), To: p.bound(piece, &g.Hi),
		By: p.ident(piece, &g.By), Step: p.bound(piece, &g.Step)}
}

func (p *parser) bound(piece []token.Token, b *gBound) *ast.Quantity {
	return p.quantity(piece, &gQuantity{Num: b.Num, Unit: b.Unit})
}

func (p *parser) streamDecl(piece []token.Token) ast.Stmt {
	g, bad := parseOrReport(p, prodStream, streamParser, piece, "stream declaration")
	if bad != nil {
		return bad
	}
	d := p.streams.new()
	d.Keyword, d.Name, d.Label = int(piece[0].Pos), p.ident(piece, &g.Name), p.label(piece, g.Label)
	if len(g.More) > 0 {
		d.More = p.identArr.take(len(g.More))
		for k := range g.More {
			d.More[k] = p.ident(piece, &g.More[k].Tok)
		}
	}
	return d
}

func (p *parser) unitDecl(piece []token.Token) ast.Stmt {
	g, bad := parseOrReport(p, prodUnit, unitParser, piece, "unit declaration")
	if bad != nil {
		return bad
	}
	d := p.units.new()
	d.Kind, d.Name, d.Label = p.ident(piece, &g.Kind), p.ident(piece, &g.Name), p.label(piece, g.Label)
	return d
}

func (p *parser) setting(piece []token.Token) ast.Stmt {
	if len(piece) == 1 && piece[0].Kind == token.Ident {
		return p.missingValue(piece[0])
	}
	g, bad := parseOrReport(p, prodSetting, settingParser, piece, "statement")
	if bad != nil {
		return bad
	}
	s := &ast.Setting{Key: p.ident(piece, &g.Key), Str: p.label(piece, g.Str)}
	if g.Qty != nil {
		s.Qty = p.quantity(piece, g.Qty)
	}
	if g.Ident != nil {
		s.Word = p.ident(piece, g.Ident)
	}
	return s
}

func (p *parser) expect(piece []token.Token) ast.Stmt {
	g, bad := parseOrReport(p, prodExpect, expectParser, piece, "expectation")
	if bad != nil {
		return bad
	}
	op := piece[g.Op.Pos.Offset]
	return &ast.Expect{Keyword: int(piece[0].Pos), Target: p.ident(piece, &g.Target), Prop: p.ident(piece, &g.Prop),
		OpPos: int(op.Pos), Op: p.text(op), Value: p.quantity(piece, &g.Value), Tol: p.tol(piece, g.Tol),
		Label: p.label(piece, g.Label)}
}

func (p *parser) entry(piece []token.Token) ast.Entry {
	if len(piece) == 1 && piece[0].Kind == token.Ident {
		return p.missingValue(piece[0])
	}
	if len(piece) >= 2 && piece[1].Kind == token.Ident {
		g, bad := parseOrReport(p, prodNames, namesParser, piece, "list of names")
		if bad != nil {
			return bad
		}
		n := p.names.new()
		n.Key, n.Names = p.ident(piece, &g.Key), p.identArr.take(len(g.Names))
		for k := range g.Names {
			n.Names[k] = p.ident(piece, &g.Names[k].Tok)
		}
		return n
	}
	g, bad := parseOrReport(p, prodGiven, givenParser, piece, "entry")
	if bad != nil {
		return bad
	}
	x := p.givens.new()
	x.Key, x.Value, x.Tol = p.ident(piece, &g.Key), p.quantity(piece, &g.Value), p.tol(piece, g.Tol)
	return x
}

func (p *parser) missingValue(t token.Token) *ast.Bad {
	p.errorf(CodeMissingValue, int(t.Pos), int(t.End), "%s has no value after it", p.text(t))
	return &ast.Bad{From: int(t.Pos), To: int(t.End)}
}

// Conversions from a production's result. Captured tokens carry, in Pos.Offset, their index in the
// piece (see parsePiece), never text or positions of their own.

func (p *parser) ident(piece []token.Token, t *lexer.Token) *ast.Ident {
	tk := piece[t.Pos.Offset]
	id := p.idents.new()
	id.NamePos, id.Name = int(tk.Pos), p.text(tk)
	return id
}

func (p *parser) label(piece []token.Token, t *lexer.Token) *ast.String {
	if t == nil {
		return nil
	}
	tk := piece[t.Pos.Offset]
	raw := p.text(tk)
	x := p.strs.new()
	x.ValuePos, x.Raw, x.Value = int(tk.Pos), raw, Unquote(raw)
	return x
}

func (p *parser) quantity(piece []token.Token, q *gQuantity) *ast.Quantity {
	tk := piece[q.Num.Pos.Offset]
	raw := p.text(tk)
	v := parseNumber(raw)
	x := p.qtys.new()
	x.NumPos, x.Raw, x.Value = int(tk.Pos), raw, v
	if q.Unit != nil {
		x.Unit = p.ident(piece, q.Unit)
	}
	return x
}

// parseNumber converts a number as the scanner made it. A short integer ("150", "-4"), the
// common case, converts directly: up to 15 digits it is exact, as strconv.ParseFloat's result is.
func parseNumber(raw string) float64 {
	s, neg := raw, false
	if s != "" && (s[0] == '-' || s[0] == '+') {
		s, neg = s[1:], s[0] == '-'
	}
	if s != "" && len(s) <= 15 {
		n := 0
		for i := 0; i < len(s); i++ {
			d := s[i] - '0'
			if d > 9 {
				return parseFloat(raw)
			}
			n = n*10 + int(d)
		}
		if neg {
			return -float64(n)
		}
		return float64(n)
	}
	return parseFloat(raw)
}

func parseFloat(raw string) float64 {
	v, err := strconv.ParseFloat(raw, 64)
	if err != nil && v == 0 { // not a range error: the scanner only makes valid numbers
		v = 0
	}
	return v
}

func (p *parser) tol(piece []token.Token, t *gTol) *ast.Tol {
	if t == nil {
		return nil
	}
	op := piece[t.Op.Pos.Offset]
	x := p.tols.new()
	x.OpPos, x.Op, x.Amount = int(op.Pos), p.text(op), p.quantity(piece, &t.Amt)
	return x
}

// Unquote resolves the escapes \" and \\ of a string literal as written (with its quotes; the
// closing one may be missing). Any other backslash stands for itself.
func Unquote(raw string) string {
	s := strings.TrimPrefix(raw, `"`)
	if strings.HasSuffix(s, `"`) && !strings.HasSuffix(s, `\"`) || strings.HasSuffix(s, `\\"`) {
		s = s[:len(s)-1]
	}
	if !strings.Contains(s, `\`) {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '\\' && i+1 < len(s) && (s[i+1] == '"' || s[i+1] == '\\') {
			i++
		}
		b.WriteByte(s[i])
	}
	return b.String()
}

// parseErr is a production's failure: the index in the piece of the token participle could not
// take, and what the grammar would have taken there (see expectedAt).
type parseErr struct {
	at     int
	expect expected
}

// parsePiece parses a piece with a production. Results are kept per shape of piece: the
// sequence of token kinds, with the keywords the grammar spells out ("stream", "expect",
// "within") told apart from other names. The grammar looks at nothing else, so two pieces of one
// shape parse alike, and most lines of a file share a handful of shapes. The tokens handed to
// participle carry their index in the piece as their offset, which makes a result a template for
// every piece of its shape.
func parsePiece[G any](p *parser, prod byte, gp *participle.Parser[G], piece []token.Token) (*G, *parseErr) {
	short := len(piece) <= packMax
	var packed uint64
	var r any
	ok := false
	if short {
		packed = uint64(prod)
		for _, t := range piece {
			packed = packed<<5 | uint64(shapeCode(p.shapeByte(t)))
		}
		r, ok = p.shapes.get(packed)
	}
	if !ok {
		var kb [64]byte
		key := append(kb[:0], prod)
		for _, t := range piece {
			key = append(key, p.shapeByte(t))
		}
		if r, ok = cache.get(key); !ok {
			r = runParticiple(p, gp, piece)
			if len(key) <= maxShapeLen {
				cache.put(string(key), r)
			}
		}
		if short {
			p.shapes.put(packed, r)
		}
	}
	if e, isErr := r.(*parseErr); isErr {
		return nil, e
	}
	return r.(*G), nil
}

// parseOrReport is parsePiece, reporting a failure as a syntax error in what.
func parseOrReport[G any](p *parser, prod byte, gp *participle.Parser[G], piece []token.Token, what string) (*G, *ast.Bad) {
	g, e := parsePiece(p, prod, gp, piece)
	if e != nil {
		return nil, p.syntaxError(piece, e, what)
	}
	return g, nil
}

// shapeByte is a token's part of a shape: its kind, or a keyword the grammar spells out.
func (p *parser) shapeByte(t token.Token) byte {
	if t.Kind != token.Ident {
		return byte(t.Kind)
	}
	switch t.End - t.Pos { // the lengths of the keywords
	case 6:
		switch p.text(t) {
		case "stream":
			return 100
		case "expect":
			return 101
		case "within":
			return 102
		}
	case 2:
		if p.text(t) == "to" {
			return 103
		}
	case 4:
		switch p.text(t) {
		case "from":
			return 104
		case "step":
			return 105
		}
	case 5:
		if p.text(t) == "count" {
			return 106
		}
	}
	return byte(t.Kind)
}

// shapeCode numbers a shape byte from 1 to 25 (kinds, then the seven keywords) for packing.
func shapeCode(c byte) byte {
	if c >= 100 {
		return c - 100 + byte(token.PlusMinus) + 2
	}
	return c + 1
}

// runParticiple parses a piece with participle. A failure is read through participle's error
// types: participle.Error's Position gives the index in the piece of the token it could not take
// (tokens carry their index as their offset); what would have fitted there is found by asking
// the grammar itself (expectedAt), not by reading participle's message.
func runParticiple[G any](p *parser, gp *participle.Parser[G], piece []token.Token) any {
	g, err := participleParse(gp, p.lexTokens(piece))
	if err == nil {
		return g
	}
	e := &parseErr{at: len(piece)}
	var pe participle.Error
	if errors.As(err, &pe) {
		e.at = min(max(pe.Position().Offset, 0), len(piece))
	}
	e.expect = expectedAt(gp, p.lexTokens(piece[:e.at]))
	return e
}

// lexTokens makes participle's tokens of a piece, each carrying its index in the piece as its
// offset.
func (p *parser) lexTokens(piece []token.Token) []lexer.Token {
	lt := make([]lexer.Token, len(piece))
	for k, t := range piece {
		lt[k] = lexer.Token{Type: tokenType(t.Kind), Value: p.text(t), Pos: lexer.Position{Offset: k}}
	}
	return lt
}

// participleParse runs a production over tokens (an EOF is added).
func participleParse[G any](gp *participle.Parser[G], toks []lexer.Token) (*G, error) {
	lt := append(toks[:len(toks):len(toks)], lexer.Token{Type: lexer.EOF, Pos: lexer.Position{Offset: len(toks)}})
	pl, err := lexer.Upgrade(&pieceLexer{toks: lt})
	if err != nil {
		return nil, err
	}
	return gp.ParseFromLexer(pl)
}

// expected is a set of what a production takes at a place: token kinds, the keywords the
// grammar spells out, and the end of the piece.
type expected uint32

// probes are the candidates expectedAt tries, in the order a message names them.
var probes = []struct {
	kind  token.Kind
	value string // a keyword, or "" for any token of the kind
	bit   expected
	word  string
}{
	{token.Ident, "", 1 << 0, "a name"},
	{token.Number, "", 1 << 1, "a number"},
	{token.Word, "", 1 << 2, "a unit"},
	{token.String, "", 1 << 3, "a label string"},
	{token.Comma, "", 1 << 4, "','"},
	{token.Eq, "", 1 << 5, "="},
	{token.Lt, "", 1 << 6, "<"},
	{token.Le, "", 1 << 7, "<="},
	{token.Gt, "", 1 << 8, ">"},
	{token.Ge, "", 1 << 9, ">="},
	{token.PlusMinus, "", 1 << 10, "±"},
	{token.Ident, "within", 1 << 11, "within"},
	{token.LBrace, "", 1 << 12, "{"},
	{token.EOF, "", 1 << 13, "the end of the line"},
	{token.Ident, "from", 1 << 14, "from"},
	{token.Ident, "to", 1 << 15, "to"},
	{token.Ident, "step", 1 << 16, "step"},
	{token.Ident, "count", 1 << 17, "count"},
}

const (
	expectName = expected(1 << 0)
	expectUnit = expected(1 << 2)
	// expectKeywords are the keywords the grammar spells out after a statement's first word.
	expectKeywords = expected(1<<11 | 1<<14 | 1<<15 | 1<<16 | 1<<17)
	expectEnd      = expected(1 << 13)
)

// expectedAt asks the grammar what may follow the tokens before a failure: each candidate token
// is put after them, and it fits when participle then fails further on, or not at all.
func expectedAt[G any](gp *participle.Parser[G], before []lexer.Token) expected {
	var set expected
	for _, pr := range probes {
		toks := before
		if pr.kind != token.EOF {
			v := pr.value
			if v == "" {
				v = "x"
			}
			toks = append(before[:len(before):len(before)], lexer.Token{Type: tokenType(pr.kind), Value: v, Pos: lexer.Position{Offset: len(before)}})
		}
		_, err := participleParse(gp, toks)
		var pe participle.Error
		if err == nil || errors.As(err, &pe) && pe.Position().Offset >= len(before)+1 && pr.kind != token.EOF {
			set |= pr.bit
		}
	}
	return set
}

// String words the set for a message: "a number", "=, <, <=, >, >=", "{ or the end of the line".
func (x expected) String() string {
	var words []string
	for _, pr := range probes {
		switch {
		case x&pr.bit == 0:
		case pr.bit == expectName && x&expectUnit != 0:
			// A name where a unit spelling may stand is a unit spelling.
		case pr.bit&expectKeywords != 0 && x&expectName != 0 && x&expectUnit == 0:
			// Where any name fits, a keyword is only one of them.
		default:
			words = append(words, pr.word)
		}
	}
	switch len(words) {
	case 0:
		return "something else"
	case 1:
		return words[0]
	}
	return strings.Join(words[:len(words)-1], ", ") + " or " + words[len(words)-1]
}

func (p *parser) syntaxError(piece []token.Token, e *parseErr, what string) *ast.Bad {
	from, to := int(piece[0].Pos), int(piece[len(piece)-1].End)
	var msg string
	switch {
	case e.at == 0 && piece[0].Kind != token.Ident:
		t := piece[0]
		msg = fmt.Sprintf("unexpected %s: a statement starts with stream, expect, a unit kind or a setting", p.describe(t))
	case e.at < len(piece) && p.splitUnit(piece, e.at):
		return &ast.Bad{From: int(piece[0].Pos), To: to}
	case e.at < len(piece):
		t := piece[e.at]
		from = int(t.Pos)
		msg = fmt.Sprintf("unexpected %s in %s: expected %s", p.describe(t), what, e.expect)
	default:
		from = to
		msg = fmt.Sprintf("%s ends too early: expected %s", what, e.expect)
	}
	p.errorf(CodeSyntax, from, max(to, from), "%s", msg)
	return &ast.Bad{From: int(piece[0].Pos), To: to}
}

// splitUnit reports a unit spelling broken by a space, "10 bar g" for 10 barg, when the word at
// the syntax error joins the unit before it into a known spelling; it reports whether it did.
func (p *parser) splitUnit(piece []token.Token, at int) bool {
	if at < 2 || piece[at-2].Kind != token.Number {
		return false
	}
	u, w := piece[at-1], piece[at]
	isWord := func(k token.Kind) bool { return k == token.Ident || k == token.Word }
	if !isWord(u.Kind) || !isWord(w.Kind) {
		return false
	}
	first, second := p.text(u), p.text(w)
	for _, joined := range []string{first + second, first + "(" + second + ")"} {
		if _, err := units.Lookup(joined); err != nil {
			continue
		}
		d := p.errorf(CodeSplitUnit, int(u.Pos), int(w.End), "unit written in two words %q: did you mean %s?",
			p.str[u.Pos:w.End], joined)
		if d != nil {
			d.Fix = joined
		}
		return true
	}
	return false
}

// Two entries, or two statements, run together on one line (a missing ;) are found from the
// failure of the whole: the piece parsed completely up to the failing token, a name, and what
// follows from that name parses as entries (statements) of its own. The driver then reports the
// missing ; with the fix, and parses each part, so that the rest of the line is still checked.

// splitAt returns where a piece that does not parse as one entry (statement) splits into a
// complete one and a rest that parses as one or more, or 0.
func (p *parser) splitAt(piece []token.Token, fails func([]token.Token) *parseErr) int {
	e := fails(piece)
	if e == nil || e.at <= 0 || e.at >= len(piece)-1 || e.expect&expectEnd == 0 || piece[e.at].Kind != token.Ident {
		return 0
	}
	if rest := piece[e.at:]; fails(rest) == nil || p.splitAt(rest, fails) > 0 {
		return e.at
	}
	return 0
}

func (p *parser) missingSeparator(t token.Token, what string) {
	if d := p.errorf(CodeSyntax, int(t.Pos), int(t.End), "missing ; before %s: %s starts a new %s on the same line (separate them with ; or a line break)",
		p.text(t), p.text(t), what); d != nil {
		d.Fix = "; " + p.text(t)
	}
}

// entryErr is the failure of a piece as one block entry, nil when it parses.
func (p *parser) entryErr(piece []token.Token) *parseErr {
	if len(piece) < 2 {
		return &parseErr{} // a key alone
	}
	var e *parseErr
	switch {
	case p.mode == caseBlock && p.isKeyword(piece[0], "expect"):
		_, e = parsePiece(p, prodExpect, expectParser, piece)
		return e
	case p.mode == caseBlock:
		_, e = parsePiece(p, prodOverride, overrideParser, piece)
		return e
	case p.mode == sweepBlock && p.isKeyword(piece[0], "show"):
		_, e = parsePiece(p, prodShow, showParser, piece)
		return e
	case p.mode == sweepBlock && !p.isKeyword(piece[0], "case"):
		_, e = parsePiece(p, prodRange, rangeParser, piece)
		return e
	}
	if piece[1].Kind == token.Ident {
		_, e := parsePiece(p, prodNames, namesParser, piece)
		return e
	}
	_, e = parsePiece(p, prodGiven, givenParser, piece)
	return e
}

// addEntries parses a piece as block entries: one, or several run together on a line.
func (p *parser) addEntries(piece []token.Token) {
	if k := p.splitAt(piece, p.entryErr); k > 0 {
		p.missingSeparator(piece[k], "entry")
		p.addEntries(piece[:k])
		p.addEntries(piece[k:])
		return
	}
	switch p.mode {
	case caseBlock:
		p.entries = append(p.entries, p.caseEntry(piece))
	case sweepBlock:
		p.entries = append(p.entries, p.sweepEntry(piece))
	default:
		p.entries = append(p.entries, p.entry(piece))
	}
}

// stmtErr is the failure of a piece as one statement without a block, nil when it parses.
func (p *parser) stmtErr(piece []token.Token) *parseErr {
	var e *parseErr
	switch first := piece[0]; {
	case len(piece) < 2:
		return &parseErr{}
	case p.isKeyword(first, "stream"):
		_, e = parsePiece(p, prodStream, streamParser, piece)
	case p.isKeyword(first, "expect"):
		_, e = parsePiece(p, prodExpect, expectParser, piece)
	case p.isKeyword(first, "case"), p.isKeyword(first, "sweep"):
		_, e = parsePiece(p, prodCase, unitParser, piece)
	default:
		_, e = parsePiece(p, prodSetting, settingParser, piece)
	}
	return e
}

// addStmts parses a piece as statements without a block: one, or several run together.
func (p *parser) addStmts(piece []token.Token) {
	if k := p.splitAt(piece, p.stmtErr); k > 0 {
		p.missingSeparator(piece[k], "statement")
		p.addStmts(piece[:k])
		p.addStmts(piece[k:])
		return
	}
	var stmt ast.Stmt
	switch first := piece[0]; {
	case p.isKeyword(first, "stream"):
		stmt = p.streamDecl(piece)
	case p.isKeyword(first, "expect"):
		stmt = p.expect(piece)
	case p.isKeyword(first, "case"), p.isKeyword(first, "sweep"):
		stmt = p.caseDecl(piece) // a case or sweep needs its block: this reports the missing {
	default:
		stmt = p.setting(piece)
	}
	p.file.Stmts = append(p.file.Stmts, stmt)
}

func (p *parser) describe(t token.Token) string {
	if d := t.Kind.Describe(); d != "" {
		return fmt.Sprintf("%s %q", d, p.text(t))
	}
	return strconv.Quote(p.text(t))
}
