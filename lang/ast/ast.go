// Package ast declares the syntax tree of a calc file. Every node knows its byte range [Pos, End)
// in the source; lines and columns come from lang/source when someone asks.
//
// The tree is deliberately loose: a block's entries are "a key and a quantity" or "a key and some
// names" whatever the block, and a top-level "key value" line is a Setting whatever the key. Which
// keys exist (properties, roles, parameters, settings) is the checker's business, so that a typo is
// reported as an unknown name with a suggestion rather than as a syntax error.
package ast

import (
	"hmb/lang/source"
	"hmb/lang/token"
)

// Node is any node of the tree.
type Node interface {
	Pos() int // offset of the first byte
	End() int // offset just past the last byte
}

// Stmt is a top-level statement: *Setting, *StreamDecl, *UnitDecl, *Expect, *CaseDecl,
// *SweepDecl or *Bad.
type Stmt interface {
	Node
	stmtNode()
}

// Entry is a line of a block: *Given, *Names or *Bad in a stream's or a unit's block; *Override,
// *Expect or *Bad in a case's; *Range, *Show, *Names (the case it runs on) or *Bad in a sweep's.
type Entry interface {
	Node
	entryNode()
}

// File is a parsed calc file.
type File struct {
	Src      *source.File
	Stmts    []Stmt
	Comments []*Comment    // every comment, in source order
	Tokens   []token.Token // every token, comments and newlines included, ending with EOF
}

func (f *File) Pos() int { return 0 }
func (f *File) End() int { return len(f.Src.Src) }

// Ident is a name or keyword.
type Ident struct {
	NamePos int
	Name    string
}

func (x *Ident) Pos() int { return x.NamePos }
func (x *Ident) End() int { return x.NamePos + len(x.Name) }

// String is a quoted label; Value has the escapes resolved.
type String struct {
	ValuePos int
	Raw      string // as written, with quotes
	Value    string
}

func (x *String) Pos() int { return x.ValuePos }
func (x *String) End() int { return x.ValuePos + len(x.Raw) }

// Quantity is a number with an optional unit spelling: 150 psig, 0.85, 2 %.
type Quantity struct {
	NumPos int
	Raw    string  // the number as written
	Value  float64 // the number; ±Inf when it overflows (the checker reports it)
	Unit   *Ident  // nil when no unit was written; Name holds the spelling (lbm/h, °F, %)
}

func (x *Quantity) Pos() int { return x.NumPos }
func (x *Quantity) End() int {
	if x.Unit != nil {
		return x.Unit.End()
	}
	return x.NumPos + len(x.Raw)
}

// Tol is a stated tolerance: "± 2 %", "+- 10 lbm/h", "within 2 %".
type Tol struct {
	OpPos  int
	Op     string // "±", "+-", "+/-" or "within", as written
	Amount *Quantity
}

func (x *Tol) Pos() int { return x.OpPos }
func (x *Tol) End() int { return x.Amount.End() }

// Block is "{ entries }". Rbrace is -1 when the closing brace is missing.
type Block struct {
	Lbrace, Rbrace int
	Entries        []Entry
}

func (x *Block) Pos() int { return x.Lbrace }
func (x *Block) End() int {
	if x.Rbrace >= 0 {
		return x.Rbrace + 1
	}
	if n := len(x.Entries); n > 0 {
		return x.Entries[n-1].End()
	}
	return x.Lbrace + 1
}

// Setting is a top-level "key value": title "...", display US, atmosphere 14.2 psia. Exactly one
// of Str, Qty and Word is set.
type Setting struct {
	Key  *Ident
	Str  *String
	Qty  *Quantity
	Word *Ident
}

func (x *Setting) Pos() int { return x.Key.Pos() }
func (x *Setting) End() int {
	switch {
	case x.Str != nil:
		return x.Str.End()
	case x.Qty != nil:
		return x.Qty.End()
	}
	return x.Word.End()
}

// StreamDecl is "stream NAME [label] [{ givens }]", or "stream NAME, NAME..." declaring several
// streams that have no givens. Block is nil for a bare declaration.
type StreamDecl struct {
	Keyword int
	Name    *Ident
	More    []*Ident // the further names of a list (the checker refuses a label or block then)
	Label   *String  // or nil
	Block   *Block   // or nil
}

func (x *StreamDecl) Pos() int { return x.Keyword }
func (x *StreamDecl) End() int {
	name := x.Name
	if n := len(x.More); n > 0 {
		name = x.More[n-1]
	}
	return declEnd(name, x.Label, x.Block)
}

// UnitDecl is "KIND NAME [label] { ports and parameters }".
type UnitDecl struct {
	Kind  *Ident
	Name  *Ident
	Label *String // or nil
	Block *Block
}

func (x *UnitDecl) Pos() int { return x.Kind.Pos() }
func (x *UnitDecl) End() int { return declEnd(x.Name, x.Label, x.Block) }

func declEnd(name *Ident, label *String, b *Block) int {
	switch {
	case b != nil:
		return b.End()
	case label != nil:
		return label.End()
	}
	return name.End()
}

// Expect is "expect TARGET PROP OP VALUE [within TOL] [label]".
type Expect struct {
	Keyword int
	Target  *Ident // a stream or a unit
	Prop    *Ident // a stream property or a unit result
	OpPos   int
	Op      string // "=", "<", "<=", ">", ">="
	Value   *Quantity
	Tol     *Tol    // or nil
	Label   *String // or nil
}

func (x *Expect) Pos() int { return x.Keyword }
func (x *Expect) End() int {
	switch {
	case x.Label != nil:
		return x.Label.End()
	case x.Tol != nil:
		return x.Tol.End()
	}
	return x.Value.End()
}

// Given is a block entry "KEY quantity [tol]": a stream's given (p 150 psig) or a unit's
// parameter (efficiency 85 %).
type Given struct {
	Key   *Ident
	Value *Quantity
	Tol   *Tol // or nil
}

func (x *Given) Pos() int { return x.Key.Pos() }
func (x *Given) End() int {
	if x.Tol != nil {
		return x.Tol.End()
	}
	return x.Value.End()
}

// Names is a block entry "KEY NAME, NAME...": a unit's port role with its streams (in S6, S7) or
// a stream's fluid (fluid water).
type Names struct {
	Key   *Ident
	Names []*Ident
}

func (x *Names) Pos() int { return x.Key.Pos() }
func (x *Names) End() int { return x.Names[len(x.Names)-1].End() }

// Bad is a statement or entry that did not parse; the parser has reported it.
type Bad struct {
	From, To int
}

func (x *Bad) Pos() int { return x.From }
func (x *Bad) End() int { return x.To }

// Comment is "# ..." to the end of the line.
type Comment struct {
	Hash int // offset of the "#"
	Text string
}

func (x *Comment) Pos() int { return x.Hash }
func (x *Comment) End() int { return x.Hash + len(x.Text) }

// CaseDecl is "case NAME [label] { entries }": a variant of the file (design, minimum load, one
// boiler out) that replaces, adds or frees givens and parameters and checks expectations of its
// own. Its entries are *Override, *Expect and *Bad.
type CaseDecl struct {
	Keyword int
	Name    *Ident
	Label   *String // or nil
	Block   *Block
}

func (x *CaseDecl) Pos() int { return x.Keyword }
func (x *CaseDecl) End() int { return declEnd(x.Name, x.Label, x.Block) }

// Override is a case's entry "NAME PROPERTY VALUE [tol]": a stream's given or a unit's parameter
// replaced or added; or "NAME PROPERTY WORD": a parameter stated as a word (arrangement parallel),
// or the word free, which removes the base's given. Exactly one of Value and Word is set.
type Override struct {
	Target *Ident // a stream or a unit
	Prop   *Ident // a stream property or a unit parameter
	Value  *Quantity
	Tol    *Tol // or nil
	Word   *Ident
}

func (x *Override) Pos() int { return x.Target.Pos() }
func (x *Override) End() int {
	switch {
	case x.Word != nil:
		return x.Word.End()
	case x.Tol != nil:
		return x.Tol.End()
	}
	return x.Value.End()
}

// SweepDecl is "sweep NAME [label] { entries }": one given or parameter varied over a range,
// the file solved at each point. Its entries are *Range, *Show, *Names ("case NAME": the case
// it varies, instead of the base) and *Bad.
type SweepDecl struct {
	Keyword int
	Name    *Ident
	Label   *String // or nil
	Block   *Block
}

func (x *SweepDecl) Pos() int { return x.Keyword }
func (x *SweepDecl) End() int { return declEnd(x.Name, x.Label, x.Block) }

// Range is a sweep's entry "NAME PROPERTY from VALUE to VALUE step VALUE", or with "count N"
// in place of the step.
type Range struct {
	Target *Ident
	Prop   *Ident
	From   *Quantity
	To     *Quantity
	By     *Ident    // "step" or "count"
	Step   *Quantity // the step, or the number of points
	// FromPos and ToPos are the offsets of the keywords from and to.
	FromPos, ToPos int
}

func (x *Range) Pos() int { return x.Target.Pos() }
func (x *Range) End() int { return x.Step.End() }

// Show is a sweep's entry "show NAME RESULT, NAME RESULT...": the results its table lists.
type Show struct {
	Keyword int
	Items   []*ResultRef
}

func (x *Show) Pos() int { return x.Keyword }
func (x *Show) End() int { return x.Items[len(x.Items)-1].End() }

// ResultRef names a result of a stream or a unit: "MS T", "T1 power".
type ResultRef struct {
	Target *Ident
	Prop   *Ident
}

func (x *ResultRef) Pos() int { return x.Target.Pos() }
func (x *ResultRef) End() int { return x.Prop.End() }

func (*Setting) stmtNode()    {}
func (*CaseDecl) stmtNode()   {}
func (*SweepDecl) stmtNode()  {}
func (*Override) entryNode()  {}
func (*Expect) entryNode()    {}
func (*Range) entryNode()     {}
func (*Show) entryNode()      {}
func (*StreamDecl) stmtNode() {}
func (*UnitDecl) stmtNode()   {}
func (*Expect) stmtNode()     {}
func (*Bad) stmtNode()        {}
func (*Given) entryNode()     {}
func (*Names) entryNode()     {}
func (*Bad) entryNode()       {}
