package lsp

import (
	"context"
	"encoding/json"
	"fmt"
	"slices"
	"strings"
	"testing"

	"go.lsp.dev/protocol"
)

// Edges of the protocol found by stress tests, one regression test each.

// answers runs a whole session from raw input and returns every answer as "ID CODE" (0: a
// result), sorted.
func answers(t *testing.T, in string) []string {
	t.Helper()
	var out, log syncBuffer
	if err := run(context.Background(), strings.NewReader(in), &out, &log, newTestOptions(0)); err != nil {
		t.Errorf("run: %v\n%s", err, log.String())
	}
	var got []string
	for _, m := range frames(t, out.String()) {
		var r struct {
			ID    json.RawMessage `json:"id"`
			Error *struct{ Code int }
		}
		if err := json.Unmarshal(m, &r); err != nil {
			t.Fatalf("bad frame %s: %v", m, err)
		}
		code := 0
		if r.Error != nil {
			code = r.Error.Code
		}
		got = append(got, fmt.Sprintf("%s %d", r.ID, code))
	}
	slices.Sort(got)
	return got
}

// lying frames a body with a Content-Length off by delta.
func lying(body string, delta int) string {
	return fmt.Sprintf("Content-Length: %d\r\n\r\n%s", len(body)+delta, body)
}

const initialize = `{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`

func request(id int, method string) string {
	return fmt.Sprintf(`{"jsonrpc":"2.0","id":%d,"method":%q,"params":{"textDocument":{"uri":"file:///none.hmb"},"position":{"line":0,"character":0}}}`, id, method)
}

// TestWrongContentLength: one frame with a wrong Content-Length costs at most itself; the
// frames after it are read and answered (before the fix, every later message was a parse error).
func TestWrongContentLength(t *testing.T) {
	tail := frame(request(9, "textDocument/hover")) + frame(`{"jsonrpc":"2.0","id":10,"method":"shutdown"}`) + frame(`{"jsonrpc":"2.0","method":"exit"}`)
	tests := []struct {
		name string
		in   string
		want []string
	}{
		// Too long: the body runs into the next frame's header, which is read again; the body
		// cut there is the whole message, and is answered too.
		{"too long by a few bytes", frame(initialize) + lying(request(2, "textDocument/hover"), 7) + frame(request(3, "textDocument/hover")) + tail,
			[]string{"1 0", "10 0", "2 0", "3 0", "9 0"}},
		{"too long by two frames", frame(initialize) + lying(request(2, "textDocument/hover"), 150) + frame(request(3, "textDocument/hover")) + frame(request(4, "textDocument/hover")) + tail,
			[]string{"1 0", "10 0", "2 0", "3 0", "4 0", "9 0"}},
		// Too short: the cut body is a parse error; the rest of it is skipped up to the next
		// frame's header.
		{"too short", frame(initialize) + lying(request(2, "textDocument/hover"), -9) + frame(request(3, "textDocument/hover")) + tail,
			[]string{"1 0", "10 0", "3 0", "9 0", "null -32700"}},
		{"no length at all", frame(initialize) + "Content-Type: x\r\n\r\n" + request(2, "textDocument/hover") + frame(request(3, "textDocument/hover")) + tail,
			[]string{"1 0", "10 0", "3 0", "9 0", "null -32700"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := answers(t, tt.in); !slices.Equal(got, tt.want) {
				t.Errorf("answers %q, want %q", got, tt.want)
			}
		})
	}
}

// TestEmptyStringID: a request whose id is "" is answered with "id": "" (JSON-RPC 2.0: the
// response's id is the request's), not 0, and is not confused with a request whose id is 0.
func TestEmptyStringID(t *testing.T) {
	in := frame(initialize) + frame(strings.Replace(request(0, "textDocument/hover"), `"id":0`, `"id":""`, 1)) +
		frame(request(0, "textDocument/hover")) + frame(`{"jsonrpc":"2.0","id":"","method":"no/such"}`) +
		frame(`{"jsonrpc":"2.0","id":10,"method":"shutdown"}`) + frame(`{"jsonrpc":"2.0","method":"exit"}`)
	want := []string{`"" -32601`, `"" 0`, "0 0", "1 0", "10 0"}
	if got := answers(t, in); !slices.Equal(got, want) {
		t.Errorf("answers %q, want %q", got, want)
	}
}

// TestChangeRefused: a didChange whose range starts after it ends, or whose version is not newer
// than the document's, is refused and logged; the document keeps its text.
func TestChangeRefused(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 5, "stream A { p 1 bar }\n")
	c.waitDiags(uri, 5)
	reversed := protocol.Range{Start: protocol.Position{Line: 0, Character: 12}, End: protocol.Position{Line: 0, Character: 7}}
	c.change(uri, 6, map[string]any{"range": reversed, "text": "X"})
	c.change(uri, 4, map[string]any{"text": "stream Old\n"})
	c.change(uri, 5, map[string]any{"text": "stream Same\n"})
	// A good change after them applies to the text as it was.
	c.change(uri, 7, map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 0, Character: 7}, End: protocol.Position{Line: 0, Character: 8}}, "text": "B"})
	var syms []protocol.DocumentSymbol
	c.mustCall(protocol.MethodTextDocumentDocumentSymbol, map[string]any{"textDocument": map[string]any{"uri": uri}}, &syms)
	if len(syms) != 1 || syms[0].Name != "B" {
		t.Errorf("symbols after the changes: %+v", syms)
	}
	for _, want := range []string{"has its start (0:12) after its end (0:7)", "version 4 is not newer than the document's 5", "version 5 is not newer than the document's 5"} {
		if !strings.Contains(c.log.String(), want) {
			t.Errorf("log lacks %q:\n%s", want, c.log.String())
		}
	}
}
