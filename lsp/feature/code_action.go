package feature

// This file implements quick fixes: the replacement a diagnostic suggests (a misspelt unit or
// name), and the notation's own fixes (declare an undefined stream, add a missing specification).
// Each keys on the diagnostic's code and structured data, never on its message.

import (
	"fmt"
	"strings"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// CodeActions returns the quick fixes for the diagnostics of the snapshot that touch span. The
// solver's diagnostics count only when its solution is already there: a code action request must
// not wait for a solve.
func CodeActions(snap *cache.Snapshot, span model.Span) []protocol.CodeAction {
	res := snap.Check()
	out := []protocol.CodeAction{}
	for _, d := range snap.Diagnostics(snap.Solved()) {
		if d.Span.End < span.Start || d.Span.Start > span.End {
			continue
		}
		pd := Diagnostic(snap.URI, snap.Mapper, d)
		if d.Fix != "" {
			out = append(out, action(snap, pd, fmt.Sprintf("Replace with %q", d.Fix), true,
				[]Edit{{Span: d.Span, NewText: d.Fix}}))
		}
		for _, f := range QuickFixes(res, d) {
			out = append(out, action(snap, pd, f.Title, false, f.Edits))
		}
	}
	return out
}

// QuickFix is one proposed change.
type QuickFix struct {
	Title string
	Edits []Edit
}

// QuickFixes proposes the notation's own fixes for one diagnostic, beyond its Fix.
func QuickFixes(res *lang.Result, d model.Diagnostic) []QuickFix {
	f := res.File
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
		start := f.Src.LineStart(f.Src.Position(at).Line)
		return []QuickFix{{
			Title: "Declare stream " + name,
			Edits: []Edit{{Span: model.Span{Start: start, End: start}, NewText: "stream " + name + "\n"}},
		}}
	case solve.CodeUnderSpecified:
		var fixes []QuickFix
		for _, c := range d.Specify[:min(len(d.Specify), maxSpecifyFixes)] {
			if e, ok := addEntry(f, c.Name, c.Prop); ok {
				fixes = append(fixes, QuickFix{Title: fmt.Sprintf("Specify %s %s", c.Name, c.Prop), Edits: []Edit{e}})
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
func addEntry(f *ast.File, name, what string) (Edit, bool) {
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
			return Edit{Span: model.Span{Start: end, End: end}, NewText: " { " + what + " }"}, true
		}
		if b.Rbrace < 0 || b.Rbrace > len(src) {
			return Edit{}, false
		}
		// Back over the blanks before the brace.
		q := b.Rbrace
		for q > b.Lbrace+1 && (src[q-1] == ' ' || src[q-1] == '\t') {
			q--
		}
		switch {
		case src[q-1] == '\n' || src[q-1] == '\r':
			// The brace is on its own line: a new line before it, indented like the entry above.
			indent := "  "
			if n := len(b.Entries); n > 0 {
				ls := f.Src.LineStart(f.Src.Position(b.Entries[n-1].Pos()).Line)
				if in := string(src[ls:b.Entries[n-1].Pos()]); strings.Trim(in, " \t") == "" {
					indent = in
				}
			}
			return Edit{Span: model.Span{Start: q, End: q}, NewText: indent + what + " \n"}, true
		case len(b.Entries) == 0:
			return Edit{Span: model.Span{Start: b.Lbrace + 1, End: b.Rbrace}, NewText: " " + what + " "}, true
		case src[q-1] == ';':
			return Edit{Span: model.Span{Start: q, End: b.Rbrace}, NewText: " " + what + " "}, true
		default:
			return Edit{Span: model.Span{Start: q, End: b.Rbrace}, NewText: "; " + what + " "}, true
		}
	}
	return Edit{}, false
}

func action(snap *cache.Snapshot, d protocol.Diagnostic, title string, preferred bool, edits []Edit) protocol.CodeAction {
	te := make([]protocol.TextEdit, 0, len(edits))
	for _, e := range edits {
		te = append(te, protocol.TextEdit{Range: snap.Mapper.Range(e.Span), NewText: e.NewText})
	}
	return protocol.CodeAction{
		Title:       title,
		Kind:        protocol.QuickFix,
		Diagnostics: []protocol.Diagnostic{d},
		IsPreferred: preferred,
		Edit:        &protocol.WorkspaceEdit{Changes: map[protocol.DocumentURI][]protocol.TextEdit{snap.URI: te}},
	}
}
