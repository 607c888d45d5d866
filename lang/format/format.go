// Package format prints a calc file in its canonical layout: one statement per line, block
// entries on their own lines indented by two spaces, single spaces between tokens, comments where
// they were, runs of blank lines collapsed to one. A block written on one line ("{ p 15 psig }")
// stays on one line. The formatter changes only layout, never a token, aligns nothing into
// columns and wraps nothing, so its output is stable under repeated formatting.
package format

import (
	"bytes"
	"fmt"

	"hmb/lang/ast"
	"hmb/lang/parser"
	"hmb/lang/token"
	"hmb/thermo/model"
)

// Source formats a calc file. It refuses, with the first syntax error, a file that does not
// parse: layout is only safe to change once the statements are known.
func Source(filename string, src []byte) ([]byte, error) {
	f, diags := parser.Parse(filename, src)
	for _, d := range diags {
		if d.Severity == model.Error {
			return nil, fmt.Errorf("%s:%s: %s (%s)", filename, f.Src.Position(d.Span.Start), d.Message, d.Code)
		}
	}
	return File(f), nil
}

// File prints a parsed file. The file must have parsed without errors (see Source).
func File(f *ast.File) []byte {
	p := &printer{src: f.Src.Src, toks: f.Tokens}
	p.print()
	return p.out.Bytes()
}

type printer struct {
	src  []byte
	toks []token.Token
	out  bytes.Buffer

	depth   int  // 1 inside a block
	oneLine bool // inside a block written on one line
	empty   bool // nothing on the current output line yet
	opened  bool // the last token printed was a block's "{"
	prev    token.Kind
	nl      int  // newlines in the source since the last printed token
	brk     bool // a line break is due (";" at top level, after "{" or "}")
	semi    bool // a ";" is due inside a one-line block
}

func (p *printer) print() {
	p.empty = true
	for i, t := range p.toks {
		switch t.Kind {
		case token.EOF:
			if p.out.Len() > 0 {
				p.out.WriteByte('\n')
			}
			return
		case token.Newline:
			p.nl++
			continue
		case token.Semi:
			if p.oneLine {
				p.semi = true
			} else {
				p.brk = true
			}
			continue
		case token.Comment:
			if p.nl == 0 && !p.empty {
				p.out.WriteByte(' ')
			} else {
				p.newline(t.Kind, false)
			}
			p.out.Write(bytes.TrimRight(p.src[t.Pos:t.End], " \t"))
			p.empty, p.opened = false, false
			p.nl = 0
			continue
		case token.RBrace:
			if p.oneLine {
				p.semi = false
				p.out.WriteString(" }")
				p.oneLine = false
			} else {
				p.depth--
				p.newline(t.Kind, false)
				p.out.WriteByte('}')
			}
			p.depth = 0
			p.nl, p.brk, p.prev, p.opened, p.empty = 0, true, t.Kind, false, false
			continue
		}
		switch {
		case p.nl > 0 || p.brk:
			p.newline(t.Kind, p.prev == token.Comma && !p.brk)
		case p.semi:
			p.out.WriteString("; ")
		case !p.empty && t.Kind != token.Comma:
			p.out.WriteByte(' ')
		}
		p.semi = false
		p.out.Write(p.src[t.Pos:t.End])
		p.empty, p.opened, p.prev = false, false, t.Kind
		if t.Kind == token.LBrace {
			p.depth = 1
			p.opened = true
			if p.sameLine(i) {
				p.oneLine = true
			} else {
				p.brk = true
			}
		}
	}
}

// newline ends the current line before a token of kind k: with one blank line when the source had
// any there, except at the start of the file and just inside a block's braces. cont indents a
// list continued after a comma.
func (p *printer) newline(k token.Kind, cont bool) {
	if p.out.Len() > 0 {
		p.out.WriteByte('\n')
		if p.nl >= 2 && !p.opened && k != token.RBrace && !cont {
			p.out.WriteByte('\n')
		}
	}
	for range p.depth {
		p.out.WriteString("  ")
	}
	if cont {
		p.out.WriteString("    ")
	}
	p.nl, p.brk, p.empty = 0, false, true
}

// sameLine reports whether the "{" at token i is closed on the same source line with nothing
// but entries between.
func (p *printer) sameLine(i int) bool {
	for _, t := range p.toks[i+1:] {
		switch t.Kind {
		case token.RBrace:
			return true
		case token.Newline, token.Comment, token.EOF:
			return false
		}
	}
	return false
}
