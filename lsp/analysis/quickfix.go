package analysis

import (
	"fmt"
	"strings"

	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// QuickFixes implements cache.Analyzer. The replacement a diagnostic suggests (Diagnostic.Fix)
// is offered by the server for every code; these are the fixes that need the notation.
func (a *Analyzer) QuickFixes(syn *cache.Syntax, sol *cache.Solution, d model.Diagnostic) []cache.QuickFix {
	dd, ok := syn.Data.(*data)
	if !ok || dd.res == nil || dd.res.File == nil {
		return nil
	}
	f := dd.res.File
	switch d.Code {
	case check.CodeUndefined:
		// Only an undeclared stream can be declared for the user; the checker names it.
		name := d.Undeclared
		if name == "" || d.Span.Start < 0 || d.Span.End > len(f.Src.Src) || d.Span.Start > d.Span.End {
			return nil
		}
		// Declare it just before the statement that uses it, at the start of that statement's line.
		at := d.Span.Start
		for _, s := range f.Stmts {
			if s.Pos() <= d.Span.Start && d.Span.Start < s.End() {
				at = s.Pos()
				break
			}
		}
		// The line start as the editor counts lines: after "\n" or a lone "\r".
		src := f.Src.Src
		start := at
		for start > 0 && src[start-1] != '\n' && src[start-1] != '\r' {
			start--
		}
		return []cache.QuickFix{{
			Title: "Declare stream " + name,
			Edits: []cache.Edit{{Span: model.Span{Start: start, End: start}, NewText: "stream " + name + "\n"}},
		}}
	case solve.CodeUnderSpecified:
		var fixes []cache.QuickFix
		for _, c := range d.Specify[:min(len(d.Specify), maxSpecifyFixes)] {
			if e, ok := addEntry(f, c.Name, c.Prop); ok {
				fixes = append(fixes, cache.QuickFix{Title: fmt.Sprintf("Specify %s %s", c.Name, c.Prop), Edits: []cache.Edit{e}})
			}
		}
		return fixes
	}
	return nil
}

// maxSpecifyFixes bounds the fixes offered for one under-specified system: the first few
// candidates are the ones nearest the missing value.
const maxSpecifyFixes = 6

// addEntry returns the edit that adds an entry "what " to the block of the stream or unit
// named name, for the user to type its value: on a line of its own before a closing brace on its
// own line, after a semicolon in a one-line block, or in a new block after a bare declaration. A
// stream declared in a list, or a block left open, gets none.
func addEntry(f *ast.File, name, what string) (cache.Edit, bool) {
	src := f.Src.Src
	for _, st := range f.Stmts {
		var id *ast.Ident
		var b *ast.Block
		switch st := st.(type) {
		case *ast.StreamDecl:
			if len(st.More) > 0 {
				continue
			}
			id, b = st.Name, st.Block
		case *ast.UnitDecl:
			id, b = st.Name, st.Block
		}
		if id == nil || id.Name != name {
			continue
		}
		if b == nil {
			end := st.End()
			return cache.Edit{Span: model.Span{Start: end, End: end}, NewText: " { " + what + " }"}, true
		}
		if b.Rbrace < 0 || b.Rbrace > len(src) {
			return cache.Edit{}, false
		}
		// Back over the blanks before the brace.
		q := b.Rbrace
		for q > b.Lbrace+1 && (src[q-1] == ' ' || src[q-1] == '\t') {
			q--
		}
		switch {
		case src[q-1] == '\n':
			// The brace is on its own line: a new line before it, indented like the entry above.
			indent := "  "
			if n := len(b.Entries); n > 0 {
				ls := f.Src.LineStart(f.Src.Position(b.Entries[n-1].Pos()).Line)
				if in := string(src[ls:b.Entries[n-1].Pos()]); strings.Trim(in, " \t") == "" {
					indent = in
				}
			}
			return cache.Edit{Span: model.Span{Start: q, End: q}, NewText: indent + what + " \n"}, true
		case len(b.Entries) == 0:
			return cache.Edit{Span: model.Span{Start: b.Lbrace + 1, End: b.Rbrace}, NewText: " " + what + " "}, true
		case src[q-1] == ';':
			return cache.Edit{Span: model.Span{Start: q, End: b.Rbrace}, NewText: " " + what + " "}, true
		default:
			return cache.Edit{Span: model.Span{Start: q, End: b.Rbrace}, NewText: "; " + what + " "}, true
		}
	}
	return cache.Edit{}, false
}
