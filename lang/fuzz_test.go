package lang

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"hmb/lang/format"
	"hmb/lang/parser"
	"hmb/lang/source"
)

func addCorpus(f *testing.F) {
	for _, dir := range []string{"lang", "examples", "broken"} {
		names, _ := filepath.Glob(filepath.Join("..", "testdata", dir, "*.hmb"))
		for _, n := range names {
			src, err := os.ReadFile(n)
			if err == nil {
				f.Add(src)
			}
		}
	}
	f.Add([]byte(""))
	f.Add([]byte("stream S1 { p 150"))
	f.Add([]byte("{{{ }}} ;;; , = <= ± +- +/-"))
}

// FuzzParse: the parser never panics, every diagnostic lies within the file, and the line
// starts the parser takes from its tokens are those source.New finds in the text.
func FuzzParse(f *testing.F) {
	addCorpus(f)
	f.Fuzz(func(t *testing.T, src []byte) {
		file, diags := parser.Parse("fuzz.hmb", src)
		lines := source.New("fuzz.hmb", src)
		if n := lines.LineCount(); file.Src.LineCount() != n {
			t.Fatalf("the parser's file has %d lines, the text %d", file.Src.LineCount(), n)
		}
		for l := range lines.LineCount() {
			if a, b := file.Src.LineStart(l), lines.LineStart(l); a != b {
				t.Fatalf("line %d starts at %d in the parser's file, at %d in the text", l, a, b)
			}
		}
		for _, d := range diags {
			if d.Span.Start < 0 || d.Span.End > len(src) || d.Span.Start > d.Span.End {
				t.Fatalf("diagnostic %s %q has span %v outside [0,%d]", d.Code, d.Message, d.Span, len(src))
			}
		}
		for _, s := range file.Stmts {
			if s.Pos() < 0 || s.End() > len(src) || s.Pos() > s.End() {
				t.Fatalf("statement %T has span [%d,%d) outside the file", s, s.Pos(), s.End())
			}
		}
	})
}

// FuzzCheck: checking never panics; a file without syntax errors formats, and formatting is
// stable and keeps the diagnostics' count.
func FuzzCheck(f *testing.F) {
	addCorpus(f)
	f.Fuzz(func(t *testing.T, src []byte) {
		r := Check("fuzz.hmb", src)
		r.Tokens()
		r.SiteAt(len(src) / 2)
		once, err := format.Source("fuzz.hmb", src)
		if err != nil {
			return
		}
		twice, err := format.Source("fuzz.hmb", once)
		if err != nil {
			t.Fatalf("formatted output does not parse: %v\n%s", err, once)
		}
		if !bytes.Equal(once, twice) {
			t.Fatalf("formatting is not stable:\n%q\n%q", once, twice)
		}
		if n, m := len(r.Diags), len(Check("fuzz.hmb", once).Diags); n != m {
			t.Fatalf("formatting changed the diagnostics: %d before, %d after\n%q\n%q", n, m, src, once)
		}
	})
}
