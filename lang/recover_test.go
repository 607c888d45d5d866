package lang

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"hmb/thermo/model"
)

// TestEveryPrefix checks every prefix of every example and notation-tour file, byte by byte, as
// the language server sees a file being typed from the top: parsing and checking never panic,
// every range lies within the text, and a prefix that stops inside a block is reported as an
// unclosed block.
func TestEveryPrefix(t *testing.T) {
	var names []string
	for _, dir := range []string{"examples", "lang"} {
		n, err := filepath.Glob(filepath.Join("..", "testdata", dir, "*.hmb"))
		if err != nil || len(n) == 0 {
			t.Fatalf("no calc files in testdata/%s: %v", dir, err)
		}
		names = append(names, n...)
	}
	for _, name := range names {
		src, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		for n := 0; n <= len(src); n++ {
			prefix := src[:n:n] // capacity n: nothing may write into the bytes past the prefix
			checkPrefix(t, filepath.Base(name), prefix)
			if t.Failed() {
				return // one prefix's failures are enough to read
			}
		}
	}
}

func checkPrefix(t *testing.T, name string, src []byte) {
	t.Helper()
	defer func() {
		if p := recover(); p != nil {
			t.Fatalf("%s, first %d bytes: panic: %v\n%s", name, len(src), p, src)
		}
	}()
	r := Check(name, src)
	in := func(what string, s model.Span) {
		if s.Start < 0 || s.End > len(src) || s.Start > s.End {
			t.Errorf("%s, first %d bytes: %s has range [%d,%d) outside [0,%d]\n%s", name, len(src), what, s.Start, s.End, len(src), src)
		}
	}
	for _, d := range r.Diags {
		in(d.Code+" "+d.Message, d.Span)
		for _, rel := range d.Related {
			in(d.Code+" related "+rel.Message, rel.Span)
		}
		if d.Code == "" || d.Message == "" {
			t.Errorf("%s, first %d bytes: diagnostic without code or message: %+v", name, len(src), d)
		}
	}
	for _, s := range r.File.Stmts {
		in("statement", model.Span{Start: s.Pos(), End: s.End()})
	}
	for _, s := range r.Model.Streams {
		in("stream "+s.Name, s.Span)
		for _, g := range s.Given {
			if g != nil {
				in("given of "+s.Name, g.Span)
			}
		}
	}
	for _, u := range r.Model.Units {
		in("unit "+u.Name, u.Span)
		for _, p := range u.Ports {
			in("port of "+u.Name, p.Span)
			if p.Stream < 0 || p.Stream >= len(r.Model.Streams) {
				t.Errorf("%s, first %d bytes: port of %s names stream %d of %d", name, len(src), u.Name, p.Stream, len(r.Model.Streams))
			}
		}
	}
	for _, x := range r.Model.Expects {
		in("expectation", x.Span)
	}
	for _, tk := range r.Tokens() {
		in("token", model.Span{Start: tk.Pos, End: tk.End})
	}
	r.SiteAt(len(src))
	if openBlock(src) {
		found := false
		for _, d := range r.Diags {
			found = found || d.Code == "HMB104"
		}
		if !found || !r.Model.Incomplete {
			t.Errorf("%s, first %d bytes: stops inside a block, but no HMB104 (incomplete %v)\n%s", name, len(src), r.Model.Incomplete, src)
		}
	}
}

// openBlock reports whether src ends inside a { } block, counting braces outside comments and
// strings: a deliberately plain reading of the notation, independent of the scanner.
func openBlock(src []byte) bool {
	depth, inComment, inString := 0, false, false
	for i := 0; i < len(src); i++ {
		switch c := src[i]; {
		case c == '\n':
			inComment, inString = false, false
		case inComment:
		case inString:
			if c == '\\' {
				i++
			} else if c == '"' {
				inString = false
			}
		case c == '#':
			inComment = true
		case c == '"':
			inString = true
		case c == '{':
			depth++
		case c == '}':
			depth = max(0, depth-1)
		}
	}
	return depth > 0
}

// TestRecoveryChecksTheRest: after a broken statement, the rest of the file is still checked
// (names, dimensions, wiring), and the model keeps the valid parts.
func TestRecoveryChecksTheRest(t *testing.T) {
	src := "stream A { p 10 bar; T 200 C; flow 1 kg/s }\n" +
		"stream B {\n  p 2 bar bar\n  T 150 C\n}\n" + // broken entry: the block goes on
		"12 x\n" + // broken statement
		"stream C { p 40 lbm/h }\n" + // wrong dimension, after the breakage
		"valve V { in A; out B }\n" +
		"valve W { in A; out C }\n" + // A consumed twice
		"expect B x = 1.5\n"
	r := Check("t.hmb", []byte(src))
	var got []string
	for _, d := range r.Diags {
		got = append(got, d.Code+" "+src[d.Span.Start:d.Span.End])
	}
	want := []string{"HMB103 bar", "HMB103 12 x", "HMB302 lbm/h", "HMB204 A", "HMB303 1.5"}
	if strings.Join(got, "; ") != strings.Join(want, "; ") {
		t.Errorf("diagnostics\n got %q\nwant %q", got, want)
	}
	if len(r.Model.Streams) != 3 || len(r.Model.Units) != 1 || !r.Model.Incomplete {
		t.Errorf("model: %d streams, %d units, incomplete %v; want 3, 1, true", len(r.Model.Streams), len(r.Model.Units), r.Model.Incomplete)
	}
	if g := r.Model.Streams[1].Given[model.T]; g == nil || g.Value != 423.15 { // 150 °C + 273.15 K
		t.Errorf("T of B after the broken entry: %+v, want 423.15 K", g)
	}
}
