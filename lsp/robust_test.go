package lsp

import (
	"context"
	"encoding/json"
	"fmt"
	"hmb/thermo/model"
	"hmb/thermo/solve"
	"reflect"
	"runtime"
	"strings"
	"testing"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// TestUnopenedDocument sends every document request, and edits, for a file never opened: null
// or empty answers, never an error, and the server goes on.
func TestUnopenedDocument(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	nowhere := protocol.DocumentURI("file:///nowhere.hmb")
	c.change(nowhere, 2, map[string]any{"text": "stream S1\n"})
	c.notifyServer(protocol.MethodTextDocumentDidClose, map[string]any{"textDocument": map[string]any{"uri": nowhere}})
	c.notifyServer(protocol.MethodTextDocumentDidSave, map[string]any{"textDocument": map[string]any{"uri": nowhere}})
	for _, m := range docMethods {
		// jsonrpc2's client leaves the result untouched when it is null on the wire.
		res := json.RawMessage("untouched")
		params := map[string]any{"textDocument": map[string]any{"uri": nowhere}, "position": protocol.Position{},
			"range": protocol.Range{}, "newName": "X", "context": map[string]any{}, "options": map[string]any{}}
		if err := c.call(m, params, &res); err != nil || string(res) != "untouched" {
			t.Errorf("%s on an unopened document: %s, %v; want null", m, res, err)
		}
	}
	c.open(uri, 1, plant)
	var syms []protocol.DocumentSymbol
	c.mustCall(protocol.MethodTextDocumentDocumentSymbol, map[string]any{"textDocument": map[string]any{"uri": uri}}, &syms)
	if len(syms) != 3 {
		t.Errorf("after the unopened requests: %d symbols", len(syms))
	}
	if !strings.Contains(c.log.String(), "not open") {
		t.Errorf("the change to an unopened document was not logged: %q", c.log.String())
	}
}

// utf16Src has a degree sign and superscripts (one UTF-16 unit, two bytes each) and an emoji (two
// units, four bytes) before names on the same line. Columns below are counted by hand in UTF-16
// units.
const utf16Src = "stream S1 \"200 °C ² 🔥\" { p 1 barr }\nstream S2\nvalve V1 \"°C²\" { in S1; out S2 }\n"

func TestUTF16Columns(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, utf16Src)
	// Line 0: `stream S1 "200 °C ² 🔥" { p 1 ` is 30 units (the emoji two), so barr is 30-34.
	ds := c.waitDiags(uri, 1)
	if len(ds) != 1 || ds[0].Code != "HMB301" || ds[0].Range != (protocol.Range{Start: protocol.Position{Line: 0, Character: 30}, End: protocol.Position{Line: 0, Character: 34}}) {
		t.Errorf("diagnostics %+v", ds)
	}
	// Line 2: `valve V1 "°C²" { in ` is 20 units, so S1 is 20-22 and S2 28-30.
	s1 := protocol.Range{Start: protocol.Position{Line: 2, Character: 20}, End: protocol.Position{Line: 2, Character: 22}}
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{Line: 2, Character: 21}), &h)
	if h == nil || *h.Range != s1 || !strings.HasPrefix(h.Contents.Value, "**stream** `S1`") {
		t.Errorf("hover on S1 = %+v", h)
	}
	var locs []protocol.Location
	c.mustCall(protocol.MethodTextDocumentDefinition, docPos(uri, protocol.Position{Line: 2, Character: 29}), &locs)
	if len(locs) != 1 || locs[0].Range != (protocol.Range{Start: protocol.Position{Line: 1, Character: 7}, End: protocol.Position{Line: 1, Character: 9}}) {
		t.Errorf("definition of S2 = %+v", locs)
	}
	var we protocol.WorkspaceEdit
	c.mustCall(protocol.MethodTextDocumentRename, map[string]any{"textDocument": map[string]any{"uri": uri},
		"position": protocol.Position{Line: 2, Character: 20}, "newName": "feed"}, &we)
	want := []protocol.TextEdit{{Range: protocol.Range{Start: protocol.Position{Line: 0, Character: 7}, End: protocol.Position{Line: 0, Character: 9}}, NewText: "feed"}, {Range: s1, NewText: "feed"}}
	if !reflect.DeepEqual(we.Changes[uri], want) {
		t.Errorf("rename edits %+v", we.Changes[uri])
	}
	// An incremental edit by UTF-16 columns: S2 becomes S3 on line 2, which is undeclared there.
	// A column inside the emoji's surrogate pair (line 0, 21) stays before it: inserting there
	// leaves the emoji whole and moves barr one unit right.
	c.change(uri, 2,
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 2, Character: 28}, End: protocol.Position{Line: 2, Character: 30}}, "text": "S3"},
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 0, Character: 21}, End: protocol.Position{Line: 0, Character: 21}}, "text": "!"})
	var codes []string
	for _, d := range c.waitDiags(uri, 2) {
		codes = append(codes, fmt.Sprintf("%v %d:%d-%d", d.Code, d.Range.Start.Line, d.Range.Start.Character, d.Range.End.Character))
	}
	if got := strings.Join(codes, ", "); !strings.Contains(got, "HMB301 0:31-35") || !strings.Contains(got, "HMB201 2:28-30") {
		t.Errorf("after the edits: %s", got)
	}
	var syms []protocol.DocumentSymbol
	c.mustCall(protocol.MethodTextDocumentDocumentSymbol, map[string]any{"textDocument": map[string]any{"uri": uri}}, &syms)
	if len(syms) == 0 || syms[0].Detail != "200 °C ² !🔥" {
		t.Errorf("label after the edit: %+v", syms)
	}
}

// TestPanicIsReported: a request whose handler has a bug (here a method added for the test that
// panics) is answered with an internal error, logged, and the server goes on.
func TestPanicIsReported(t *testing.T) {
	methods["test/panic"] = docMethod(func(*Server, context.Context, *cache.Snapshot, *protocol.TextDocumentPositionParams) (any, error) {
		panic("bug in the handler")
	})
	defer delete(methods, "test/panic")
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, plant)
	err := c.call("test/panic", docPos(uri, protocol.Position{}), nil)
	if errCode(err) != jsonrpc2.InternalError || !strings.Contains(err.Error(), "bug in the handler") {
		t.Errorf("a panicking handler: %v", err)
	}
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, at(t, plant, "T1", 0)), &h)
	if h == nil {
		t.Error("no hover after the panic")
	}
	if !strings.Contains(c.log.String(), "panic in test/panic: bug in the handler") {
		t.Errorf("log %q", c.log.String())
	}
}

// bigDocument is about size bytes of valid notation: pairs of streams joined by valves, labels
// with degree signs.
func bigDocument(size int) string {
	var b strings.Builder
	b.WriteString("title \"big\"\n")
	for i := 0; b.Len() < size; i++ {
		fmt.Fprintf(&b, "stream A%d \"at 200 °C\" { flow 1 kg/s; p 10 bar; T 200 °C }\nstream B%d { p 5 bar }\nvalve V%d {\n  in A%d\n  out B%d\n}\n", i, i, i, i, i)
	}
	return b.String()
}

// TestLargeDocument opens a 5 MB document, edits it deep inside and asks about its last lines.
func TestLargeDocument(t *testing.T) {
	if testing.Short() {
		t.Skip("5 MB document")
	}
	src := bigDocument(5 << 20)
	// The solver's own time limit (5 s) is for editors; this test is about a large document, not
	// about speed (that is BenchmarkEditLarge's), so a busy machine gets all the time it needs.
	patient := func(ctx context.Context, m *model.Model) *solve.Result {
		return solve.Solve(ctx, m, solve.Options{Timeout: waitLimit})
	}
	c := startServer(t, options{solve: patient})
	big := protocol.DocumentURI("file:///big.hmb")
	c.open(big, 1, src)
	if ds := c.waitDiags(big, 1); len(ds) != 0 {
		t.Fatalf("%d diagnostics, first %+v", len(ds), ds[0])
	}
	// Misspell the unit of B40000's pressure: one diagnostic, on that line.
	line := uint32(strings.Count(src[:strings.Index(src, "stream B40000 ")], "\n"))
	col := uint32(len("stream B40000 { p 5 "))
	c.change(big, 2, map[string]any{"range": protocol.Range{Start: protocol.Position{Line: line, Character: col}, End: protocol.Position{Line: line, Character: col + 3}}, "text": "barr"})
	ds := c.waitDiags(big, 2)
	if len(ds) != 1 || ds[0].Code != "HMB301" || ds[0].Range.Start != (protocol.Position{Line: line, Character: col}) {
		t.Fatalf("after the edit: %+v", ds)
	}
	last := strings.Count(src, "\n") - 2 // "  out Bn" of the last valve
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(big, protocol.Position{Line: uint32(last), Character: 7}), &h)
	if h == nil || !strings.Contains(h.Contents.Value, "| p | 500.00 kPa | given |") {
		t.Errorf("hover at the end: %+v", h)
	}
}

// BenchmarkHoverLarge is the hover latency on a solved 1,000-stream document.
func BenchmarkHoverLarge(b *testing.B) {
	src := bigDocument(1000 * 150 / 2) // about 500 stream pairs
	c := startServer(b, options{solve: cache.Solve})
	c.open(uri, 1, src)
	c.waitDiags(uri, 1)
	pos := protocol.Position{Line: uint32(strings.Count(src, "\n") - 2), Character: 7}
	b.ResetTimer()
	for range b.N {
		var h *protocol.Hover
		c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, pos), &h)
	}
}

var benchDebounce = defaultDebounce

// BenchmarkChangeToDiagnostics is the time from a didChange on a 1,000-stream document to the
// publication of its diagnostics (the server's own debounce included).
func BenchmarkChangeToDiagnostics(b *testing.B) {
	src := bigDocument(1000 * 150 / 2)
	c := startServer(b, options{solve: cache.Solve, debounce: benchDebounce})
	c.open(uri, 1, src)
	c.waitDiags(uri, 1)
	b.ResetTimer()
	for i := range b.N {
		v := int32(i + 2)
		c.change(uri, v, map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 0, Character: 7}, End: protocol.Position{Line: 0, Character: 10}}, "text": fmt.Sprintf("b%02d", i%100)})
		c.waitPublished(uri, v)
	}
}

// BenchmarkOpenMemory reports the heap a solved 1,000-stream document keeps while open.
func BenchmarkOpenMemory(b *testing.B) {
	src := bigDocument(1000 * 150 / 2)
	c := startServer(b, options{solve: cache.Solve})
	var before, after runtime.MemStats
	for i := range b.N {
		u := protocol.DocumentURI(fmt.Sprintf("file:///m%d.hmb", i))
		runtime.GC()
		runtime.ReadMemStats(&before)
		c.open(u, 1, src)
		c.waitPublished(u, 1)
		var h *protocol.Hover
		c.mustCall(protocol.MethodTextDocumentHover, docPos(u, protocol.Position{Line: 1, Character: 8}), &h)
		runtime.GC()
		runtime.ReadMemStats(&after)
		b.ReportMetric(float64(after.HeapAlloc)-float64(before.HeapAlloc), "heap-B/doc")
		c.notifyServer(protocol.MethodTextDocumentDidClose, map[string]any{"textDocument": map[string]any{"uri": u}})
	}
}

// TestPipelinedExit sends a session at once, exit right behind a hover that waits for the solve:
// the hover still gets the solved state.
func TestPipelinedExit(t *testing.T) {
	open, _ := json.Marshal(map[string]any{"textDocument": map[string]any{"uri": solvedURI, "version": 1, "text": turbineFile}})
	hover, _ := json.Marshal(docPos(solvedURI, at(t, turbineFile, "S2 \"", 0)))
	in := strings.NewReader(frame(`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`) +
		frame(`{"jsonrpc":"2.0","method":"initialized","params":{}}`) +
		frame(`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":`+string(open)+`}`) +
		frame(`{"jsonrpc":"2.0","id":2,"method":"textDocument/hover","params":`+string(hover)+`}`) +
		frame(`{"jsonrpc":"2.0","id":3,"method":"shutdown"}`) + frame(`{"jsonrpc":"2.0","method":"exit"}`))
	var out, log syncBuffer
	if err := run(context.Background(), in, &out, &log, options{solve: cache.Solve}); err != nil {
		t.Fatal(err)
	}
	for _, m := range frames(t, out.String()) {
		var r struct {
			ID     int
			Result struct{ Contents struct{ Value string } }
		}
		if json.Unmarshal(m, &r) == nil && r.ID == 2 {
			rows := tableRows(r.Result.Contents.Value)
			if len(rows["T"]) == 0 {
				t.Fatalf("hover %q", r.Result.Contents.Value)
			}
			near(t, "S2 T", rows["T"][0], refT2, solvedTol)
			return
		}
	}
	t.Fatalf("no answer to the hover in %s", out.String())
}
