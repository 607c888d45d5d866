package lsp

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	goldenfile "hmb/lang/golden"
	"hmb/lsp/cache"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
	"testing"
	"time"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lang"
)

// plant is an invented test file. Its second stream's label holds a character outside the Basic
// Multilingual Plane (two UTF-16 code units), its temperature a degree sign (one UTF-16 unit, two
// bytes).
const plant = `title "test loop"
display SI

stream S1 "main steam" {
  flow 10 kg/s
  p 40 bar
  T 400 °C
}
stream S2 "exhaust 🔥" {
  p 1 bar
}
turbine T1 "hp turbine" {
  in S1
  out S2
  power 5000 kW
}
`

const uri = protocol.DocumentURI("file:///plant.hmb")

func TestLifecycle(t *testing.T) {
	c := startRaw(t, newTestOptions(0))
	// A request before initialize is refused with the protocol's code.
	err := c.call(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{}), nil)
	if code := errCode(err); code != jsonrpc2.ServerNotInitialized {
		t.Errorf("hover before initialize: %v (code %d), want ServerNotInitialized", err, code)
	}
	var res struct {
		Capabilities map[string]json.RawMessage `json:"capabilities"`
		ServerInfo   struct{ Name string }      `json:"serverInfo"`
	}
	c.mustCall(protocol.MethodInitialize, map[string]any{"capabilities": map[string]any{}}, &res)
	for _, k := range []string{"inlayHintProvider", "hoverProvider", "definitionProvider", "referencesProvider",
		"documentSymbolProvider", "documentFormattingProvider"} {
		if string(res.Capabilities[k]) != "true" {
			t.Errorf("capability %s = %s, want true", k, res.Capabilities[k])
		}
	}
	if got := string(res.Capabilities["textDocumentSync"]); got != `{"openClose":true,"change":2,"save":{}}` {
		t.Errorf("textDocumentSync = %s", got)
	}
	if !strings.Contains(string(res.Capabilities["semanticTokensProvider"]), `"full":true`) || res.ServerInfo.Name != "hmb" {
		t.Errorf("semanticTokensProvider = %s, serverInfo %q", res.Capabilities["semanticTokensProvider"], res.ServerInfo.Name)
	}
	if err := c.call(protocol.MethodInitialize, map[string]any{}, nil); errCode(err) != jsonrpc2.InvalidRequest {
		t.Errorf("second initialize: %v", err)
	}
	c.notifyServer(protocol.MethodInitialized, map[string]any{})
	c.mustCall(protocol.MethodShutdown, nil, nil)
	if err := c.call(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{}), nil); errCode(err) != jsonrpc2.InvalidRequest {
		t.Errorf("hover after shutdown: %v", err)
	}
	c.notifyServer(protocol.MethodExit, nil)
	select {
	case err := <-c.done:
		if err != nil {
			t.Errorf("Run after shutdown and exit: %v", err)
		}
	case <-time.After(5 * time.Second):
		t.Fatal("Run did not return after exit")
	}
}

func TestExitWithoutShutdown(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.notifyServer(protocol.MethodExit, nil)
	select {
	case err := <-c.done:
		if err == nil {
			t.Error("Run after exit without shutdown returned nil, want an error (exit code 1)")
		}
	case <-time.After(5 * time.Second):
		t.Fatal("Run did not return after exit")
	}
}

func errCode(err error) jsonrpc2.Code {
	var e *jsonrpc2.Error
	if errors.As(err, &e) {
		return e.Code
	}
	return 0
}

// checkMessages is the message of each code lang.Check reports for src.
func checkMessages(src string) map[string]string {
	out := map[string]string{}
	for _, d := range lang.Check("plant.hmb", []byte(src)).Diags {
		out[d.Code] = d.Message
	}
	return out
}

type wantDiag struct {
	line, col, endCol uint32
	code, msg         string
}

func diagsOf(ds []protocol.Diagnostic) []wantDiag {
	var out []wantDiag
	for _, d := range ds {
		out = append(out, wantDiag{d.Range.Start.Line, d.Range.Start.Character, d.Range.End.Character, fmt.Sprint(d.Code), d.Message})
	}
	return out
}

func TestDiagnostics(t *testing.T) {
	c := startServer(t, newTestOptions(defaultDebounce))
	// Columns counted by hand in UTF-16 units: the emoji is two, the dash one.
	src := "stream S1 \"boiler 🔥 out\" { p 40 barr }\nvalve V1 { in S1; out S9 }\n"
	c.open(uri, 1, src)
	got := diagsOf(c.waitDiags(uri, 1))
	// The messages are hmb check's own: the same lang.Check the command line runs.
	msgs := checkMessages(src)
	want := []wantDiag{
		{0, 33, 37, "HMB301", msgs["HMB301"]},
		{1, 22, 24, "HMB201", msgs["HMB201"]},
	}
	if !strings.Contains(msgs["HMB301"], "barr") || !strings.Contains(msgs["HMB201"], "S9") {
		t.Fatalf("lang.Check gave %q", msgs)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("diagnostics:\n got %+v\nwant %+v", got, want)
	}
	// Fixing the unit by an incremental edit leaves only the wiring error.
	c.change(uri, 2, map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 0, Character: 33}, End: protocol.Position{Line: 0, Character: 37}}, "text": "bar"})
	got = diagsOf(c.waitDiags(uri, 2))
	if len(got) != 1 || got[0].code != "HMB201" {
		t.Errorf("after the edit: %+v", got)
	}
	// A full-text change (no range) replaces everything: an empty file has no diagnostics, and []
	// is published, not null.
	c.change(uri, 3, map[string]any{"text": ""})
	if got := c.waitDiags(uri, 3); got == nil || len(got) != 0 {
		t.Errorf("empty file: %#v", got)
	}
	// Closing clears.
	c.open("file:///other.hmb", 1, "stream S1 { p 40 barr }\n")
	c.waitDiags("file:///other.hmb", 1)
	c.notifyServer(protocol.MethodTextDocumentDidClose, map[string]any{"textDocument": map[string]any{"uri": "file:///other.hmb"}})
	deadline := time.Now().Add(5 * time.Second)
	for {
		pubs := c.published()
		last := pubs[len(pubs)-1]
		if last.URI == "file:///other.hmb" && last.Diagnostics != nil && len(last.Diagnostics) == 0 && last.Version == 0 {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("close did not clear diagnostics; last %+v", last)
		}
		time.Sleep(5 * time.Millisecond)
	}
}

func TestRelatedInformation(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, "stream S1\nstream S1\n")
	ds := c.waitDiags(uri, 1)
	var dup *protocol.Diagnostic
	for i := range ds {
		if ds[i].Code == "HMB202" {
			dup = &ds[i]
		}
	}
	if dup == nil || len(dup.RelatedInformation) != 1 {
		t.Fatalf("no HMB202 with related information in %+v", ds)
	}
	r := dup.RelatedInformation[0]
	if r.Location.URI != uri || r.Location.Range.Start != (protocol.Position{Line: 0, Character: 7}) || r.Message != "first declared here" {
		t.Errorf("related = %+v", r)
	}
}

// TestLatestEditWins sends edits while the analysis of each version is still running (the
// solves of versions 1 to 5 never end by themselves): only the last version may be published
// (none of these versions has a syntax error, which would be published at once).
func TestLatestEditWins(t *testing.T) {
	c := startServer(t, newTestOptions(3*time.Second)) // the burst must fit in it on a busy machine
	c.open(uri, 1, "title \"slow\"\nstream S1\n")
	for v := int32(2); v <= 6; v++ {
		text := fmt.Sprintf("title \"slow\"\nstream S%d\n", v)
		if v == 6 {
			text = "stream S6\n"
		}
		c.change(uri, v, map[string]any{"text": text})
	}
	ds := withoutCode(c.waitDiags(uri, 6), "HMB501")
	if len(ds) != 1 || ds[0].Message != "stream S6 is not connected to any unit" {
		t.Errorf("version 6: %+v", ds)
	}
	for _, p := range c.published() {
		if p.Version != 6 {
			t.Errorf("published superseded version %d", p.Version)
		}
	}
}

// TestHoverGolden records the hovers over plant, solved by the real solver, for review. The
// solved values in the golden file were checked against python3-iapws: with
// s1 = IAPWS97(P=4.0, T=673.15), h2 = s1.h - 500 (5000 kW over 10 kg/s) and
// s2 = IAPWS97(P=0.1, h=h2): h1 3214.37, s1 6.77119, v1 0.0734318; h2 2714.37 kJ/kg, T2 118.894 C,
// s2 7.46194, v2 1.78790; entropy generated 10*(s2.s - s1.s) = 6.90744 kW/K; efficiency
// 500/(s1.h - IAPWS97(P=0.1, s=s1.s).h) = 0.659229. The title's tables show the same values,
// rounded as hmb table rounds them.
func TestHoverGolden(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(uri, 1, plant)
	c.waitDiags(uri, 1)
	cases := []struct{ marker string }{
		{"S1 \"main"},   // stream declaration
		{"S2\n  power"}, // stream mention in a unit
		{"T1"},          // unit
		{"°C"},          // unit spelling
		{"bar\n}"},      // unit spelling, absolute
		{"stream S2"},   // keyword
		{"turbine"},     // kind
		{"in S1"},       // role
		{"power"},       // parameter
		{"flow"},        // property
		{"title"},       // the file's title: its stream and unit tables
	}
	var b strings.Builder
	for _, tc := range cases {
		var h *protocol.Hover
		c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, at(t, plant, tc.marker, 0)), &h)
		fmt.Fprintf(&b, "-- %s --\n", tc.marker)
		if h == nil {
			b.WriteString("(none)\n")
			continue
		}
		r := h.Range
		fmt.Fprintf(&b, "range %d:%d-%d:%d\n%s\n", r.Start.Line, r.Start.Character, r.End.Line, r.End.Character, h.Contents.Value)
	}
	golden(t, "hover.golden", b.String())
}

func golden(t *testing.T, name, got string) {
	t.Helper()
	goldenfile.Check(t, filepath.Join("testdata", name), []byte(got))
}

func TestInlayHints(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, plant)
	var hints []struct {
		Position protocol.Position
		Label    string
	}
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": uri},
		"range": protocol.Range{End: protocol.Position{Line: 100}}}, &hints)
	// S1 (all given) has no hint; S2 shows its solved temperature (T2 118.894 C, python3-iapws:
	// see TestHoverGolden) after its closing brace, line 10 (0-based), column 1; the turbine its
	// given power after its own, line 15.
	want := "10:1 T 118.89 C|15:1 power 5000.0 kW"
	var got []string
	for _, h := range hints {
		got = append(got, fmt.Sprintf("%d:%d %s", h.Position.Line, h.Position.Character, h.Label))
	}
	if strings.Join(got, "|") != want {
		t.Errorf("hints = %q, want %q", got, want)
	}
}

func TestCompletion(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := plant + "valve V1 {\n  in S2\n  dp 3 \n}\nstream S3 {\n  T 10 \n  \n}\nexpect S1 \n"
	c.open(uri, 1, src)
	labels := func(p protocol.Position) string {
		var l protocol.CompletionList
		c.mustCall(protocol.MethodTextDocumentCompletion, docPos(uri, p), &l)
		var out []string
		for _, it := range l.Items {
			out = append(out, it.Label)
		}
		return strings.Join(out, " ")
	}
	tests := []struct {
		name string
		pos  protocol.Position
		want string
	}{
		{"top level", protocol.Position{Line: 2, Character: 0}, "stream expect case sweep title display atmosphere elevation tolerance ambient project document revision prepared_by checked_by date display_flow display_vol_flow display_pressure display_temperature display_enthalpy display_entropy display_volume display_density display_power display_duty display_heat_rate boiler cooler deaerator desuperheater exchanger flash heater mixer pump splitter turbine valve"},
		{"stream after role", at(t, src, "in S2", 5), "S1 S2 S3"},
		{"role or param", at(t, src, "in S2", 0), "in out dp"},
		{"pressure-drop spelling", at(t, src, "dp 3 ", 5), "MPa MPa(a) MPa(g) MPaa MPag Pa atm bar bar(a) bar(g) bara barg hPa inH2O inH2O(a) inH2O(abs) inH2O(vac) inHg inHg(a) inHg(abs) inHg(vac) kPa kPa(a) kPa(g) kPaa kPag kg/cm2 kg/cm2(a) kg/cm2(g) kg/cm2a kg/cm2g kgf/cm2 kgf/cm2(a) kgf/cm2(g) kgf/cm2a kgf/cm2g mbar mmHg mmHg(a) mmHg(abs) mmHg(vac) psi psi(a) psi(d) psi(g) psia psid psig"},
		{"temperature spelling", at(t, src, "T 10 ", 5), "C F K R degC degF degK degR °C °F °R ℃ ℉"},
		{"stream property", at(t, src, "T 10 \n  \n", 8), "flow p T h s x fluid"},
		{"expect target", at(t, src, "expect S1", 7), "total S1 S2 S3 T1 V1"},
		{"partial word", at(t, src, "in S2", 4), "S1 S2 S3"},
	}
	for _, tt := range tests {
		if got := labels(tt.pos); got != tt.want {
			t.Errorf("%s: got\n  %s\nwant\n  %s", tt.name, got, tt.want)
		}
	}
	// The item replaces the partly typed word.
	var l protocol.CompletionList
	c.mustCall(protocol.MethodTextDocumentCompletion, docPos(uri, at(t, src, "in S2", 4)), &l)
	if te := l.Items[0].TextEdit; te == nil || te.Range != (protocol.Range{Start: at(t, src, "in S2", 3), End: at(t, src, "in S2", 5)}) {
		t.Errorf("text edit %+v", l.Items[0].TextEdit)
	}
}

func TestNavigation(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, plant)
	var locs []protocol.Location
	c.mustCall(protocol.MethodTextDocumentDefinition, docPos(uri, at(t, plant, "S2\n  power", 1)), &locs)
	if len(locs) != 1 || locs[0].Range != (protocol.Range{Start: at(t, plant, "S2 \"", 0), End: at(t, plant, "S2 \"", 2)}) {
		t.Errorf("definition = %+v", locs)
	}
	refs := func(include bool) []protocol.Range {
		var locs []protocol.Location
		c.mustCall(protocol.MethodTextDocumentReferences, map[string]any{"textDocument": map[string]any{"uri": uri},
			"position": at(t, plant, "S1 \"", 0), "context": map[string]any{"includeDeclaration": include}}, &locs)
		var out []protocol.Range
		for _, l := range locs {
			out = append(out, l.Range)
		}
		return out
	}
	decl := protocol.Range{Start: at(t, plant, "S1 \"", 0), End: at(t, plant, "S1 \"", 2)}
	use := protocol.Range{Start: at(t, plant, "in S1", 3), End: at(t, plant, "in S1", 5)}
	if got := refs(true); !reflect.DeepEqual(got, []protocol.Range{decl, use}) {
		t.Errorf("references with declaration = %+v", got)
	}
	if got := refs(false); !reflect.DeepEqual(got, []protocol.Range{use}) {
		t.Errorf("references = %+v", got)
	}
	var rng *protocol.Range
	c.mustCall(protocol.MethodTextDocumentPrepareRename, docPos(uri, at(t, plant, "in S1", 4)), &rng)
	if rng == nil || *rng != use {
		t.Errorf("prepareRename = %+v", rng)
	}
	var we protocol.WorkspaceEdit
	c.mustCall(protocol.MethodTextDocumentRename, map[string]any{"textDocument": map[string]any{"uri": uri},
		"position": at(t, plant, "in S1", 4), "newName": "MS-1"}, &we)
	edits := we.Changes[uri]
	if len(edits) != 2 || edits[0].Range != decl || edits[1].Range != use || edits[0].NewText != "MS-1" {
		t.Errorf("rename edits = %+v", edits)
	}
	for _, bad := range []string{"S2", "T1", "stream", "two words", ""} {
		err := c.call(protocol.MethodTextDocumentRename, map[string]any{"textDocument": map[string]any{"uri": uri},
			"position": at(t, plant, "in S1", 4), "newName": bad}, nil)
		if err == nil {
			t.Errorf("rename to %q accepted", bad)
		}
	}
}

func TestSymbolsAndTokens(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, plant)
	var syms []protocol.DocumentSymbol
	c.mustCall(protocol.MethodTextDocumentDocumentSymbol, map[string]any{"textDocument": map[string]any{"uri": uri}}, &syms)
	var got []string
	for _, s := range syms {
		got = append(got, fmt.Sprintf("%s %d %q %d-%d", s.Name, int(s.Kind), s.Detail, s.Range.Start.Line, s.Range.End.Line))
	}
	want := []string{`S1 13 "main steam" 3-7`, `S2 13 "exhaust 🔥" 8-10`, `T1 5 "turbine hp turbine" 11-15`}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("symbols = %q", got)
	}
	var toks protocol.SemanticTokens
	c.mustCall(protocol.MethodSemanticTokensFull, map[string]any{"textDocument": map[string]any{"uri": uri}}, &toks)
	// Decode the relative quintuples back to absolute line:col+len type.
	var line, col uint32
	var abs []string
	for i := 0; i+4 < len(toks.Data); i += 5 {
		if toks.Data[i] > 0 {
			col = 0
		}
		line += toks.Data[i]
		col += toks.Data[i+1]
		abs = append(abs, fmt.Sprintf("%d:%d+%d/%d/%d", line, col, toks.Data[i+2], toks.Data[i+3], toks.Data[i+4]))
	}
	// Line 6 "  T 400 °C": property, number, spelling of 2 UTF-16 units. Line 8: the label with the
	// emoji is 12 units long ("exhaust " 8 + quotes 2 + emoji 2).
	for _, w := range []string{"6:2+1/6/0", "6:4+3/7/0", "6:8+2/8/0", "8:0+6/0/0", "8:7+2/1/1", "8:10+12/9/0", "11:0+7/3/0", "11:8+2/2/1", "12:2+2/4/0", "12:5+2/1/0"} {
		found := false
		for _, a := range abs {
			found = found || a == w
		}
		if !found {
			t.Errorf("token %s missing from %v", w, abs)
		}
	}
}

func TestFormatting(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "stream S1   {\n    p 40 bar\n}\n"
	c.open(uri, 1, src)
	var edits []protocol.TextEdit
	c.mustCall(protocol.MethodTextDocumentFormatting, map[string]any{"textDocument": map[string]any{"uri": uri}, "options": map[string]any{"tabSize": 2, "insertSpaces": true}}, &edits)
	want := []protocol.TextEdit{{Range: protocol.Range{End: protocol.Position{Line: 2}}, NewText: "stream S1 {\n  p 40 bar\n"}}
	if !reflect.DeepEqual(edits, want) {
		t.Errorf("edits = %+v", edits)
	}
	// A file that does not parse is not formatted.
	c.change(uri, 2, map[string]any{"text": "stream S1 { p 40 bar\n"})
	if err := c.call(protocol.MethodTextDocumentFormatting, map[string]any{"textDocument": map[string]any{"uri": uri}, "options": map[string]any{}}, &edits); err == nil {
		t.Error("formatting a broken file succeeded")
	}
}

// TestFormattingDoesNotWait formats while the solve of the same version never ends.
func TestFormattingDoesNotWait(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, "title \"slow\"\nstream S1 {  p 40 bar }\n")
	var hoverErr = make(chan error, 1)
	go func() {
		hoverErr <- c.call(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{Line: 1, Character: 8}), nil)
	}()
	hoverID := c.sentID(protocol.MethodTextDocumentHover)
	var edits []protocol.TextEdit
	c.mustCall(protocol.MethodTextDocumentFormatting, map[string]any{"textDocument": map[string]any{"uri": uri}, "options": map[string]any{}}, &edits)
	if len(edits) != 1 || edits[0].NewText != "stream S1 { p 40 bar }\n" {
		t.Errorf("edits = %+v", edits)
	}
	select {
	case err := <-hoverErr:
		t.Fatalf("the hover ended before the solve: %v", err)
	default:
	}
	// The hover waits for the solve; cancelling it ends it with RequestCancelled. The id goes as a
	// JSON number, which the server decodes as float64.
	c.notifyServer(protocol.MethodCancelRequest, map[string]any{"id": &hoverID})
	select {
	case err := <-hoverErr:
		if errCode(err) != requestCancelled {
			t.Errorf("cancelled hover: %v", err)
		}
	case <-time.After(5 * time.Second):
		t.Fatal("cancel did not end the hover")
	}
}

func TestCodeActions(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "stream S1 { p 40 barr }\nvalve V1 { in S1; out S9 }\n"
	c.open(uri, 1, src)
	c.waitDiags(uri, 1)
	var acts []protocol.CodeAction
	c.mustCall(protocol.MethodTextDocumentCodeAction, map[string]any{"textDocument": map[string]any{"uri": uri},
		"range": protocol.Range{End: protocol.Position{Line: 2}}, "context": map[string]any{"diagnostics": []any{}}}, &acts)
	var got []string
	for _, a := range acts {
		for _, e := range a.Edit.Changes[uri] {
			got = append(got, fmt.Sprintf("%s: %d:%d-%d:%d %q", a.Title, e.Range.Start.Line, e.Range.Start.Character, e.Range.End.Line, e.Range.End.Character, e.NewText))
		}
	}
	want := []string{`Replace with "bar": 0:17-0:21 "bar"`, `Declare stream S9: 1:0-1:0 "stream S9\n"`}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("code actions:\n got %q\nwant %q", got, want)
	}
}

func TestRobustness(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	// Unknown method.
	if err := c.call("hmb/nothing", map[string]any{}, nil); errCode(err) != jsonrpc2.MethodNotFound {
		t.Errorf("unknown method: %v", err)
	}
	// A document never opened: null results, no error.
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos("file:///nowhere.hmb", protocol.Position{}), &h)
	if h != nil {
		t.Errorf("hover on unopened document = %+v", h)
	}
	// Bad params.
	if err := c.call(protocol.MethodTextDocumentHover, "not an object", nil); errCode(err) != jsonrpc2.InvalidParams {
		t.Errorf("bad params: %v", err)
	}
	// Positions past the end, on an empty and on a half-typed file.
	for _, src := range []string{"", "stream", "turbine T1 { in ", "stream S1 {\n  p 40 ba"} {
		c.open(uri, 1, src)
		for _, p := range []protocol.Position{{Line: 0, Character: 999}, {Line: 99, Character: 0}, {Line: 0, Character: 3}} {
			for _, m := range []string{protocol.MethodTextDocumentHover, protocol.MethodTextDocumentCompletion, protocol.MethodTextDocumentDefinition, protocol.MethodTextDocumentPrepareRename} {
				err := c.call(m, docPos(uri, p), nil)
				if err != nil && m != protocol.MethodTextDocumentPrepareRename {
					t.Errorf("%s at %+v in %q: %v", m, p, src, err)
				}
			}
		}
		// An edit range past the end is clamped.
		c.change(uri, 2, map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 50}, End: protocol.Position{Line: 60}}, "text": "\n"})
	}
	// Garbage on the wire: the server answers a parse error and goes on.
	c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{}), nil)
}

func TestMalformedJSON(t *testing.T) {
	in := strings.NewReader(frame(`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`) +
		frame(`{not json`) + "Garbage: header\r\n" + frame(`{"jsonrpc":"2.0","id":1.5,"method":"x"}`) +
		frame(`{"jsonrpc":"2.0","id":true,"method":"x"}`) + frame(`{"jsonrpc":"2.0","id":4294967296,"method":"x"}`) +
		frame(`{"jsonrpc":"2.0","id":"s1","method":"hmb/none"}`) + frame(`[1,2]`) +
		"Content-Length: 99999999999\r\n\r\n" +
		frame(`{"jsonrpc":"2.0","id":2,"method":"shutdown"}`) + frame(`{"jsonrpc":"2.0","method":"exit"}`))
	var out, log syncBuffer
	err := run(context.Background(), in, &out, &log, newTestOptions(0))
	if err != nil {
		t.Errorf("Run: %v", err)
	}
	// Each answer, in order, as id and error code (0: a result). JSON-RPC 2.0, section 5.1: -32700
	// for a body that is not JSON, -32600 for JSON that is not a valid request; the id is echoed
	// when it could be read, null otherwise.
	var got []string
	for _, m := range frames(t, out.String()) {
		var r struct {
			ID     json.RawMessage `json:"id"`
			Result json.RawMessage `json:"result"`
			Error  *jsonrpc2.Error `json:"error"`
		}
		if err := json.Unmarshal(m, &r); err != nil {
			t.Fatalf("bad frame %s: %v", m, err)
		}
		var code jsonrpc2.Code
		if r.Error != nil {
			code = r.Error.Code
		} else if r.ID != nil && !strings.HasPrefix(string(r.Result), "{") && string(r.Result) != "null" {
			t.Errorf("result %s", r.Result)
		}
		got = append(got, fmt.Sprintf("%s %d", r.ID, code))
	}
	// Requests are answered as they finish, the framing errors at once: compare in order.
	want := []string{"1 0", "null -32700", "1.5 -32600", "null -32600", "4294967296 -32600", `"s1" -32601`, "null -32600", "null -32700", "2 0"}
	slices.Sort(got)
	slices.Sort(want)
	if !reflect.DeepEqual(got, want) {
		t.Errorf("answers:\n got %q\nwant %q", got, want)
	}
}

// frames splits Content-Length framed output into its bodies, skipping window/logMessage.
func frames(t *testing.T, s string) [][]byte {
	t.Helper()
	var out [][]byte
	for s != "" {
		head, rest, ok := strings.Cut(s, "\r\n\r\n")
		if !ok {
			t.Fatalf("unframed output %q", s)
		}
		var n int
		if _, err := fmt.Sscanf(head, "Content-Length: %d", &n); err != nil || n > len(rest) {
			t.Fatalf("bad header %q", head)
		}
		body := rest[:n]
		s = rest[n:]
		if !strings.Contains(body, `"method":"window/logMessage"`) {
			out = append(out, []byte(body))
		}
	}
	return out
}

func frame(s string) string { return fmt.Sprintf("Content-Length: %d\r\n\r\n%s", len(s), s) }

var _ = context.Background
