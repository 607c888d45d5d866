package lsp

import (
	"bytes"
	"context"
	"fmt"
	"hmb/lsp/cache"
	"strings"
	"testing"
	"time"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"hmb/lang/format"
	"hmb/lsp/feature"
)

// fragments are the pieces fuzzed documents and edits are built from: enough of the notation to
// reach the checker and the solver, and the characters that make UTF-16 columns differ from
// bytes and runes (degree sign, superscript, an emoji outside the BMP, CRLF, a lone CR).
var fragments = []string{
	"stream ", "S1", "S2", " {", "}", "\n", " ", ";", "p 40 bar", "T 400 °C", "flow 10 kg/s", "x 0",
	"valve V1 { in S1; out S2 }", "turbine T1 {\n  in S1\n  out S2\n  efficiency 0.8\n}\n",
	"mixer M { in S1, S2; out S3 }", "expect S2 T < 200 C", "display US\n", "title \"t\"\n",
	"°", "²", "🔥", "\r\n", "\"", "#", "barr", "1e400", "-", "=", ",", "heater H { in S1; out S2; duty 5 MW }",
	"stream S1\nstream S1\n", "elevation 100 m\n", "dp 3 psi", "h 2800 kJ/kg", "\r",
}

// docMethods are the document requests a fuzzed script may send.
var docMethods = []string{
	protocol.MethodTextDocumentHover, "textDocument/inlayHint", protocol.MethodTextDocumentCompletion,
	protocol.MethodTextDocumentDefinition, protocol.MethodTextDocumentReferences,
	protocol.MethodTextDocumentPrepareRename, protocol.MethodTextDocumentRename,
	protocol.MethodTextDocumentDocumentSymbol, protocol.MethodSemanticTokensFull,
	protocol.MethodTextDocumentFormatting, protocol.MethodTextDocumentCodeAction,
}

// script reads a fuzzer's bytes as a sequence of choices; past the end every choice is 0.
type script struct{ b []byte }

func (s *script) next() int {
	if len(s.b) == 0 {
		return 0
	}
	c := s.b[0]
	s.b = s.b[1:]
	return int(c)
}

func (s *script) text() string {
	var b strings.Builder
	for n := s.next() % 12; n > 0; n-- {
		c := s.next()
		if c >= 224 {
			b.WriteRune(rune(0xA0 + c)) // Latin-1 and beyond: two bytes, one UTF-16 unit
			continue
		}
		b.WriteString(fragments[c%len(fragments)])
	}
	return b.String()
}

// coord is a line or column: small mostly, sometimes far past the end.
func (s *script) coord() uint32 {
	c := s.next()
	if c >= 250 {
		return uint32(c) * 1000
	}
	return uint32(c % 24)
}

func (s *script) pos() protocol.Position {
	return protocol.Position{Line: s.coord(), Character: s.coord()}
}

// offsetUTF16 is the test's own reading of a protocol position in text: lines end at "\n",
// "\r\n" or a lone "\r" (the break is not part of the line), columns count UTF-16 units and are
// clamped to the line, a line past the end means the end, and a column inside a surrogate pair
// stays before it.
func offsetUTF16(text string, p protocol.Position) int {
	// lineEnd is where the line starting at i ends, and where the next one starts (-1: none).
	lineEnd := func(i int) (end, next int) {
		k := strings.IndexAny(text[i:], "\r\n")
		if k < 0 {
			return len(text), -1
		}
		end = i + k
		if strings.HasPrefix(text[end:], "\r\n") {
			return end, end + 2
		}
		return end, end + 1
	}
	start := 0
	for l := uint32(0); l < p.Line; l++ {
		_, next := lineEnd(start)
		if next < 0 {
			return len(text)
		}
		start = next
	}
	end, _ := lineEnd(start)
	n := uint32(0)
	for off, r := range text[start:end] {
		w := uint32(len(utf16.Encode([]rune{r})))
		if n+w > p.Character {
			return start + off
		}
		n += w
	}
	return end
}

func applyUTF16(text string, r protocol.Range, newText string) string {
	a, b := offsetUTF16(text, r.Start), offsetUTF16(text, r.End)
	if b < a {
		a, b = b, a
	}
	return text[:a] + newText + text[b:]
}

// FuzzServer drives one server with a sequence of opens, edits (incremental and whole-text),
// closes, cancellations, document requests at any position and the table command, decoded from the fuzzer's bytes.
// The server must answer every request, never show NaN, and end up holding the same text as the
// test's own copy: formatting, which the server computes from its text, must turn the test's copy
// into what hmb fmt makes of it.
func FuzzServer(f *testing.F) {
	f.Add([]byte{0, 0, 5, 12, 1, 5, 6, 3, 0, 2, 2})
	f.Add([]byte{0, 0, 4, 13, 6, 12, 5, 3, 0, 1, 4, 3, 0, 0, 3, 1, 0, 0, 0, 2, 0, 4, 18, 20, 19, 21})
	f.Add([]byte{0, 1, 3, 14, 9, 10, 1, 1, 0, 250, 0, 255, 2, 20, 21, 3, 3, 1, 2, 3, 10, 2, 2, 4, 1, 5, 9})
	f.Add([]byte{0, 0, 6, 13, 20, 21, 22, 230, 23, 1, 0, 2, 1, 2, 6, 2, 22, 3, 0, 2, 4, 3, 11, 0, 3})
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) > 400 {
			return
		}
		c := startServer(t, options{solve: cache.Solve})
		uris := []protocol.DocumentURI{"file:///a.hmb", "file:///b.hmb"}
		texts := map[protocol.DocumentURI]string{}
		versions := map[protocol.DocumentURI]int32{}
		s := &script{b: data}
		for len(s.b) > 0 {
			u := uris[s.next()%len(uris)]
			_, open := texts[u]
			switch op := s.next() % 7; {
			case op == 0:
				texts[u], versions[u] = s.text(), 1
				c.open(u, 1, texts[u])
			case op == 1 && open:
				r := protocol.Range{Start: s.pos(), End: s.pos()}
				nt := s.text()
				if !(r.Start.Line > r.End.Line || r.Start.Line == r.End.Line && r.Start.Character > r.End.Character) {
					texts[u] = applyUTF16(texts[u], r, nt) // a range that starts after its end is refused
				}
				versions[u]++
				c.change(u, versions[u], map[string]any{"range": r, "text": nt})
			case op == 2 && open:
				texts[u] = s.text()
				versions[u]++
				c.change(u, versions[u], map[string]any{"text": texts[u]})
			case op == 3:
				m := docMethods[s.next()%len(docMethods)]
				params := map[string]any{"textDocument": map[string]any{"uri": u}, "position": s.pos(),
					"range": protocol.Range{Start: s.pos(), End: s.pos()}, "newName": fragments[s.next()%len(fragments)],
					"context": map[string]any{"includeDeclaration": true, "diagnostics": []any{}}, "options": map[string]any{}}
				var res any
				err := c.call(m, params, &res)
				if err != nil && errCode(err) == 0 {
					t.Fatalf("%s: %v (not a protocol error: the connection failed)", m, err)
				}
				if out := fmt.Sprint(res); strings.Contains(out, "NaN") || strings.Contains(out, "Inf") {
					t.Fatalf("%s shows %s", m, out)
				}
			case op == 4 && open:
				delete(texts, u)
				c.notifyServer(protocol.MethodTextDocumentDidClose, map[string]any{"textDocument": map[string]any{"uri": u}})
			case op == 5:
				c.notifyServer(protocol.MethodCancelRequest, map[string]any{"id": s.next()})
			case op == 6:
				var table string
				err := c.call(protocol.MethodWorkspaceExecuteCommand, streamTableCommand(u), &table)
				if err != nil && errCode(err) == 0 {
					t.Fatalf("%s: %v (not a protocol error: the connection failed)", feature.CommandStreamTable, err)
				}
				if strings.Contains(table, "NaN") || strings.Contains(table, "Inf") {
					t.Fatalf("the table shows %s", table)
				}
			}
		}
		for _, u := range uris {
			text, open := texts[u]
			if !open {
				continue
			}
			var edits []protocol.TextEdit
			err := c.call(protocol.MethodTextDocumentFormatting, map[string]any{"textDocument": map[string]any{"uri": u}, "options": map[string]any{}}, &edits)
			want, werr := format.Source(string(u), []byte(text))
			if (err != nil) != (werr != nil) {
				t.Fatalf("%s: formatting error %v, hmb fmt error %v, text %q", u, err, werr, text)
			}
			if err != nil {
				continue
			}
			got := text
			for i := len(edits) - 1; i >= 0; i-- {
				got = applyUTF16(got, edits[i].Range, edits[i].NewText)
			}
			if !bytes.Equal([]byte(got), want) {
				t.Fatalf("%s: the server's text differs from the test's %q:\nformatted by the server %q\nby hmb fmt %q", u, text, got, want)
			}
		}
		if log := c.log.String(); strings.Contains(log, "panic") {
			t.Fatalf("panic: %s", log)
		}
	})
}

// FuzzStream feeds arbitrary bytes to the server as its input: it must end, without a panic,
// when the input does.
func FuzzStream(f *testing.F) {
	f.Add([]byte(frame(`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`) + frame(`{"jsonrpc":"2.0","method":"initialized","params":{}}`) +
		frame(`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///a","version":1,"text":"stream S1 { p 1 bar }"}}}`) +
		frame(`{"jsonrpc":"2.0","id":2,"method":"textDocument/hover","params":{"textDocument":{"uri":"file:///a"},"position":{"line":0,"character":8}}}`)))
	f.Add([]byte(frame(`{"jsonrpc":"2.0","id":1.5,"method":"x"}`) + "Content-Length: -1\r\n\r\n" + frame(`[]`)))
	f.Add([]byte("Content-Length: 5\r\n\r\n{\"a\":"))
	f.Fuzz(func(t *testing.T, data []byte) {
		var out, log syncBuffer
		done := make(chan struct{})
		go func() {
			_ = run(context.Background(), bytes.NewReader(data), &out, &log, options{solve: cache.Solve})
			close(done)
		}()
		select {
		case <-done:
		case <-time.After(5 * time.Second):
			t.Fatalf("run did not end with its input: %q\nlog %s", data, log.String())
		}
		if strings.Contains(log.String(), "panic") {
			t.Fatalf("panic: %s", log.String())
		}
		if !utf8.ValidString(out.String()) {
			t.Fatalf("invalid UTF-8 written: %q", out.String())
		}
	})
}
