package parser_test

import (
	"fmt"
	"strings"
	"testing"

	"hmb/lang/ast"
	"hmb/lang/parser"
	"hmb/thermo/model"
)

// locate finds the span a pattern names in src: the first occurrence of the text, or, written
// "before|text", of text just after the first occurrence of before. "before|" alone is the empty
// span after before.
func locate(t *testing.T, src, at string) model.Span {
	t.Helper()
	before, text, ok := strings.Cut(at, "|")
	if !ok {
		before, text = "", at
	}
	i := strings.Index(src, before)
	if i < 0 {
		t.Fatalf("pattern %q: %q is not in the source", at, before)
	}
	i += len(before)
	j := strings.Index(src[i:], text)
	if j < 0 {
		t.Fatalf("pattern %q: %q is not in the source after %q", at, text, before)
	}
	return model.Span{Start: i + j, End: i + j + len(text)}
}

type want struct{ code, at, msg, rel string }

// TestDiagnostics checks each syntax diagnostic's code, exact range and message, and that
// nothing else is reported.
func TestDiagnostics(t *testing.T) {
	tests := []struct {
		name, src string
		want      []want
	}{
		{"control character", "stream A { p 1 bar }\x01",
			[]want{{"HMB101", "\x01", "unexpected control character", ""}}},
		{"invalid UTF-8", "stream A { p 1 bar \xff }",
			[]want{{"HMB101", "\xff", "invalid UTF-8 encoding", ""}}},
		{"string not closed", "stream A \"main steam\nstream B",
			[]want{{"HMB102", "\"main steam", "string not terminated before the end of the line", ""}}},
		{"statement starting with a number", "12 x\nstream A",
			[]want{{"HMB103", "12 x", "unexpected number \"12\": a statement starts with stream, expect, a unit kind or a setting", ""}}},
		{"extra number in an entry", "stream A {\n  T 100 C 5\n}",
			[]want{{"HMB103", "C |5", "unexpected number \"5\" in entry: expected ±, within or the end of the line", ""}}},
		{"two tolerances", "stream A { T 300 F ± 2 F ± 3 F }",
			[]want{{"HMB103", "2 F |± 3 F", "unexpected \"±\" in entry: expected the end of the line", ""}}},
		{"tolerance without its amount", "stream A { p 3 bar ± }",
			[]want{{"HMB103", "±|", "entry ends too early: expected a number", ""}}},
		{"stream keyword alone", "stream",
			[]want{{"HMB103", "stream|", "stream declaration ends too early: expected a name", ""}}},
		{"list of streams ending in a comma", "stream A,",
			[]want{{"HMB103", "A,|", "stream declaration ends too early: expected a name", ""}}},
		{"unit without a name", "valve { in A }",
			[]want{{"HMB103", "{", "unexpected \"{\" in unit declaration: expected a name", ""}}},
		{"two labels on a unit", "valve V \"x\" \"y\" { }",
			[]want{{"HMB103", "\"y\" {", "unexpected string \"\\\"y\\\"\" in unit declaration: expected {", ""}}},
		{"expectation without a comparison", "expect S1 x",
			[]want{{"HMB103", "S1 x|", "expectation ends too early: expected =, <, <=, > or >=", ""}}},
		{"expectation with ==", "expect S1 x == 3",
			[]want{{"HMB103", "x =|= 3", "unexpected \"=\" in expectation: expected a number", ""}}},
		{"within without an amount", "expect S1 x = 0.9 within",
			[]want{{"HMB103", "within|", "expectation ends too early: expected a number", ""}}},
		{"block not closed before the next statement", "stream A { p 3 bar\nvalve V { in A; out B }",
			[]want{{"HMB104", "{", "block of stream A is not closed: missing }", "bar\n|"}}},
		{"block not closed at the end", "valve V1 { in A",
			[]want{{"HMB104", "{", "block of valve V1 is not closed: missing }", ""}}},
		{"stray brace", "stream A { p 3 bar } }",
			[]want{{"HMB105", "bar } |}", "} with no block open", ""}}},
		{"key without a value in a block", "stream D {\n  p\n  T 100 C\n}",
			[]want{{"HMB106", "p", "p has no value after it", ""}}},
		{"missing ; between entries", "stream A { p 5 bar T 100 C }",
			[]want{{"HMB103", "T", "missing ; before T: T starts a new entry on the same line (separate them with ; or a line break)", ""}}},
		{"missing ; between three entries", "stream A { flow 2 kg/s p 5 bar T 100 C }",
			[]want{{"HMB103", "p", "missing ; before p: p starts a new entry on the same line (separate them with ; or a line break)", ""},
				{"HMB103", "T", "missing ; before T: T starts a new entry on the same line (separate them with ; or a line break)", ""}}},
		{"missing ; between roles", "valve V { in A out B }",
			[]want{{"HMB103", "out", "missing ; before out: out starts a new entry on the same line (separate them with ; or a line break)", ""}}},
		{"missing comma in a list", "mixer M { in A B }",
			[]want{{"HMB103", "B", "unexpected name \"B\" in list of names: expected ',' or the end of the line", ""}}},
		{"missing ; between settings", "title \"x\" display SI",
			[]want{{"HMB103", "display", "missing ; before display: display starts a new statement on the same line (separate them with ; or a line break)", ""}}},
		{"setting without a value", "title",
			[]want{{"HMB106", "title", "title has no value after it", ""}}},
		{"case without a block", "case low \"minimum load\"",
			[]want{{"HMB103", "load\"|", "case declaration ends too early: expected {", ""}}},
		{"case entry with two values", "case low {\n  FW flow 6 kg/s 7\n}",
			[]want{{"HMB103", "kg/s |7", "unexpected number \"7\" in case entry: expected ±, within or the end of the line", ""}}},
		{"case entry without a value", "case low { FW flow }",
			[]want{{"HMB103", "flow|", "case entry ends too early: expected a name or a number", ""}}},
		{"case not closed before the next statement", "case low { FW flow 6 kg/s\nstream A",
			[]want{{"HMB104", "{", "block of case low is not closed: missing }", "kg/s\n|"}}},
		{"sweep range without from", "sweep s { FW flow 4 kg/s to 8 kg/s step 1 kg/s }",
			[]want{{"HMB103", "4 kg/s to 8 kg/s step 1 kg/s", "unexpected number \"4\" in sweep range: expected from", ""}}},
		{"sweep range without a step", "sweep s { FW flow from 4 kg/s to 8 kg/s }",
			[]want{{"HMB103", "8 kg/s|", "sweep range ends too early: expected step or count", ""}}},
		{"sweep range with a misspelt step", "sweep s { FW flow from 4 kg/s to 8 kg/s stp 1 kg/s }",
			[]want{{"HMB103", "stp 1 kg/s", "unexpected name \"stp\" in sweep range: expected step or count", ""}}},
		{"show list without a result", "sweep s { FW flow from 4 kg/s to 8 kg/s count 3; show MS }",
			[]want{{"HMB103", "MS|", "show list ends too early: expected a name", ""}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, diags := parser.Parse("t.hmb", []byte(tt.src))
			got := diags
			for _, w := range tt.want {
				span := locate(t, tt.src, w.at)
				k := -1
				for i, d := range got {
					if d.Code == w.code && d.Span == span && d.Message == w.msg && d.Severity == model.Error {
						k = i
						break
					}
				}
				if k < 0 {
					t.Errorf("no %s at %q [%d,%d) with message %q; got:%s", w.code, w.at, span.Start, span.End, w.msg, list(got))
					continue
				}
				d := got[k]
				got = append(got[:k:k], got[k+1:]...)
				switch {
				case w.rel == "" && len(d.Related) > 0:
					t.Errorf("%s: unexpected related range %v", w.code, d.Related)
				case w.rel != "" && (len(d.Related) == 0 || d.Related[0].Span != locate(t, tt.src, w.rel)):
					t.Errorf("%s: related %v, want %q", w.code, d.Related, w.rel)
				}
			}
			if len(got) > 0 {
				t.Errorf("unexpected diagnostics:%s", list(got))
			}
		})
	}
}

func list(ds []model.Diagnostic) string {
	var b strings.Builder
	for _, d := range ds {
		fmt.Fprintf(&b, "\n\t%s [%d,%d) %s", d.Code, d.Span.Start, d.Span.End, d.Message)
	}
	return b.String()
}

// TestSplitUnit: a unit spelling broken by a space is named as such, with the joined spelling as
// its fix, when joining gives a spelling hmb knows; otherwise it is an ordinary syntax error.
func TestSplitUnit(t *testing.T) {
	tests := []struct{ src, at, fix string }{
		{"stream A { p 10 bar g }", "bar g", "barg"},
		{"stream A { p 10 psi g; T 300 F }", "psi g", "psig"},
		{"stream A { p 28 inHg vac }", "inHg vac", "inHg(vac)"},
		{"stream A { p 3 kPa (g) }", "kPa (g)", "kPa(g)"},
		{"stream A { flow 3 kg /s }", "kg /s", "kg/s"},
		{"stream A { p 2 bar g ± 0.1 bar }", "bar g", "barg"},
		{"stream A { p 3 psi x }", "", ""},
		{"stream A { T 100 C 5 }", "", ""},
	}
	for _, tt := range tests {
		_, diags := parser.Parse("t.hmb", []byte(tt.src))
		if len(diags) != 1 {
			t.Errorf("%q: %d diagnostics:%s", tt.src, len(diags), list(diags))
			continue
		}
		d := diags[0]
		if tt.fix == "" {
			if d.Code != "HMB103" {
				t.Errorf("%q: %s %s, want HMB103", tt.src, d.Code, d.Message)
			}
			continue
		}
		want := "unit written in two words \"" + tt.at + "\": did you mean " + tt.fix + "?"
		if d.Code != "HMB108" || d.Span != locate(t, tt.src, tt.at) || d.Message != want || d.Fix != tt.fix {
			t.Errorf("%q: %s [%d,%d) %q fix %q; want HMB108 at %q, %q, fix %q", tt.src, d.Code, d.Span.Start, d.Span.End, d.Message, d.Fix, tt.at, want, tt.fix)
		}
	}
}

// TestRecovery checks that a broken statement costs only itself: the statements after it are
// parsed in full.
func TestRecovery(t *testing.T) {
	tests := []struct {
		name, src string
		codes     []string // the diagnostics, in order
		stmts     string   // the statements parsed, summarised
	}{
		{"broken statement between two streams",
			"stream A { p 1 bar }\n12 x\nstream B { T 20 C }",
			[]string{"HMB103"}, "stream A [p] | bad | stream B [T]"},
		{"broken entry inside a block",
			"stream A {\n  p 1 bar bar\n  T 20 C\n}\nvalve V { in A; out B }",
			[]string{"HMB103"}, "stream A [bad T] | valve V [in out]"},
		{"unclosed block closed by the next statement",
			"stream A { p 1 bar\nvalve V { in A; out B }\nexpect B x = 1",
			[]string{"HMB104"}, "stream A [p] | valve V [in out] | expect B x"},
		{"unclosed string keeps the block",
			"stream A \"main { p 1 bar }\nstream B { T 20 C }",
			[]string{"HMB102"}, "stream A | stream B [T]"},
		{"stray brace skipped",
			"}\nstream A { p 1 bar }",
			[]string{"HMB105"}, "stream A [p]"},
		{"case entries, an expectation among them",
			"case low {\n  FW flow 6 kg/s\n  expect MS T > 400 C\n  T1 arrangement parallel\n  FW T free\n}\nstream A",
			nil, "case low [FW.flow expect T1.arrangement FW.T] | stream A"},
		{"broken case entry costs only itself",
			"case low {\n  FW flow 6 kg/s kg/s\n  FW T free\n}",
			[]string{"HMB103"}, "case low [bad FW.T]"},
		{"sweep entries; dimensionless bounds do not take to or step as units",
			"sweep s {\n  T1 efficiency from 0.7 to 0.9 step 0.05\n  show MS T, T1 power\n  case low\n}",
			nil, "sweep s [T1.efficiency(0.7..0.9 step 0.05) show(MS.T T1.power) case]"},
		{"sweep by count",
			"sweep s { FW p from 5 bar to 40 bar count 36 }",
			nil, "sweep s [FW.p(5..40 count 36)]"},
		{"half-typed last statement",
			"stream A { p 1 bar }\nvalve V { in A; out",
			[]string{"HMB104", "HMB106"}, "stream A [p] | valve V [in bad]"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			f, diags := parser.Parse("t.hmb", []byte(tt.src))
			var codes []string
			for _, d := range diags {
				codes = append(codes, d.Code)
			}
			if strings.Join(codes, " ") != strings.Join(tt.codes, " ") {
				t.Errorf("codes %v, want %v:%s", codes, tt.codes, list(diags))
			}
			if got := summarise(f); got != tt.stmts {
				t.Errorf("statements\n got %s\nwant %s", got, tt.stmts)
			}
		})
	}
}

func summarise(f *ast.File) string {
	var parts []string
	block := func(b *ast.Block) string {
		if b == nil {
			return ""
		}
		var es []string
		for _, e := range b.Entries {
			switch e := e.(type) {
			case *ast.Given:
				es = append(es, e.Key.Name)
			case *ast.Names:
				es = append(es, e.Key.Name)
			case *ast.Override:
				es = append(es, e.Target.Name+"."+e.Prop.Name)
			case *ast.Expect:
				es = append(es, "expect")
			case *ast.Range:
				es = append(es, fmt.Sprintf("%s.%s(%s..%s %s %s)", e.Target.Name, e.Prop.Name, e.From.Raw, e.To.Raw, e.By.Name, e.Step.Raw))
			case *ast.Show:
				var rs []string
				for _, it := range e.Items {
					rs = append(rs, it.Target.Name+"."+it.Prop.Name)
				}
				es = append(es, "show("+strings.Join(rs, " ")+")")
			default:
				es = append(es, "bad")
			}
		}
		return " [" + strings.Join(es, " ") + "]"
	}
	for _, s := range f.Stmts {
		switch s := s.(type) {
		case *ast.StreamDecl:
			parts = append(parts, "stream "+s.Name.Name+block(s.Block))
		case *ast.UnitDecl:
			parts = append(parts, s.Kind.Name+" "+s.Name.Name+block(s.Block))
		case *ast.Expect:
			parts = append(parts, "expect "+s.Target.Name+" "+s.Prop.Name)
		case *ast.Setting:
			parts = append(parts, "setting "+s.Key.Name)
		case *ast.CaseDecl:
			parts = append(parts, "case "+s.Name.Name+block(s.Block))
		case *ast.SweepDecl:
			parts = append(parts, "sweep "+s.Name.Name+block(s.Block))
		default:
			parts = append(parts, "bad")
		}
	}
	return strings.Join(parts, " | ")
}

// TestTooManyErrors: past MaxErrors, one diagnostic counts the rest, placed at the first one left
// out; the statements after are still parsed.
func TestTooManyErrors(t *testing.T) {
	const n = parser.MaxErrors + 7
	src := strings.Repeat("}\n", n) + "stream A { p 1 bar }"
	f, diags := parser.Parse("t.hmb", []byte(src))
	if len(diags) != parser.MaxErrors+1 {
		t.Fatalf("got %d diagnostics, want %d", len(diags), parser.MaxErrors+1)
	}
	for i, d := range diags[:parser.MaxErrors] {
		if d.Code != "HMB105" || d.Span.Start != 2*i {
			t.Fatalf("diagnostic %d: %s at %d, want HMB105 at %d", i, d.Code, d.Span.Start, 2*i)
		}
	}
	last := diags[parser.MaxErrors]
	at := 2 * parser.MaxErrors
	if last.Code != "HMB107" || last.Span != (model.Span{Start: at, End: at}) || last.Message != "7 more syntax errors from here on are not reported" {
		t.Errorf("last diagnostic %s %v %q", last.Code, last.Span, last.Message)
	}
	if got := summarise(f); got != "stream A [p]" {
		t.Errorf("statements %s, want stream A [p]", got)
	}
}

// After a missing ; both entries are still read: the quick fix is the separator, and the
// checker sees every given.
func TestMissingSeparatorRecovers(t *testing.T) {
	src := "stream A { p 5 bar T 100 C ± 2 C x 0.5 }"
	f, diags := parser.Parse("t.hmb", []byte(src))
	if len(diags) != 2 || diags[0].Fix != "; T" || diags[1].Fix != "; x" {
		t.Fatalf("diagnostics:%s", list(diags))
	}
	b := f.Stmts[0].(*ast.StreamDecl).Block
	var keys []string
	for _, e := range b.Entries {
		keys = append(keys, e.(*ast.Given).Key.Name)
	}
	if strings.Join(keys, " ") != "p T x" {
		t.Errorf("entries %q", keys)
	}
}
