package analysis

import (
	"strings"

	"hmb/lang/check"
	"hmb/lsp/cache"
	"hmb/thermo/model"
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
		// Only an undeclared stream can be declared for the user; the checker says so in its message.
		if !strings.Contains(d.Message, "declare it with: stream") {
			return nil
		}
		if d.Span.Start < 0 || d.Span.End > len(f.Src.Src) || d.Span.Start >= d.Span.End {
			return nil
		}
		name := string(f.Src.Src[d.Span.Start:d.Span.End])
		// Declare it just before the statement that uses it, at the start of that statement's line.
		at := d.Span.Start
		for _, s := range f.Stmts {
			if s.Pos() <= d.Span.Start && d.Span.Start < s.End() {
				at = s.Pos()
				break
			}
		}
		line := f.Src.Position(at).Line
		start := f.Src.LineStart(line)
		return []cache.QuickFix{{
			Title: "Declare stream " + name,
			Edits: []cache.Edit{{Span: model.Span{Start: start, End: start}, NewText: "stream " + name + "\n"}},
		}}
	}
	return nil
}
