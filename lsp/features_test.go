package lsp

// In-process tests of features the other test files leave out: quick fixes for misspelt names,
// rename of units, completion of expectations and settings, the exact semantic tokens of a
// file, edits whose positions depend on earlier edits of the same notification, the debounce,
// and text with a lone "\r" line break. Columns are counted by hand in UTF-16 units.

import (
	"context"
	"fmt"
	"reflect"
	"slices"
	"strings"
	"sync"
	"testing"
	"time"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/feature"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

func codeActions(t *testing.T, c *client, u protocol.DocumentURI, r protocol.Range) []string {
	t.Helper()
	var acts []protocol.CodeAction
	c.mustCall(protocol.MethodTextDocumentCodeAction, map[string]any{"textDocument": map[string]any{"uri": u},
		"range": r, "context": map[string]any{"diagnostics": []any{}}}, &acts)
	var out []string
	for _, a := range acts {
		if len(a.Diagnostics) != 1 || a.Kind != protocol.QuickFix {
			t.Errorf("action %q: kind %s, diagnostics %+v", a.Title, a.Kind, a.Diagnostics)
			continue
		}
		for _, e := range a.Edit.Changes[u] {
			out = append(out, fmt.Sprintf("%v %s %v: %d:%d-%d:%d %q", a.Diagnostics[0].Code, a.Title, a.IsPreferred,
				e.Range.Start.Line, e.Range.Start.Character, e.Range.End.Line, e.Range.End.Character, e.NewText))
		}
	}
	return out
}

// TestMisspeltNameQuickFixes replaces a misspelt property, stream name, role and unit kind with
// the checker's suggestion (the preferred fix); an undeclared stream may also be declared.
func TestMisspeltNameQuickFixes(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "stream Feed { flow 2 kg/s; temp 200 C; p 5 bar }\nstream Out\nvalve V1 { in Fed; outlet Out }\nheatr H1 { in Out }\n"
	c.open(uri, 1, src)
	c.waitDiags(uri, 1)
	all := codeActions(t, c, uri, protocol.Range{End: protocol.Position{Line: 9}})
	want := []string{
		`HMB306 Replace with "T" true: 0:27-0:31 "T"`,
		`HMB201 Replace with "Feed" true: 2:14-2:17 "Feed"`,
		`HMB201 Declare stream Fed false: 2:0-2:0 "stream Fed\n"`,
		`HMB208 Replace with "out" true: 2:19-2:25 "out"`,
		`HMB207 Replace with "heater" true: 3:0-3:5 "heater"`,
	}
	if !slices.Equal(all, want) {
		t.Errorf("code actions:\n got %q\nwant %q", all, want)
	}
	// Only the diagnostics the range touches: the cursor on Fed.
	if got := codeActions(t, c, uri, protocol.Range{Start: protocol.Position{Line: 2, Character: 15}, End: protocol.Position{Line: 2, Character: 15}}); !slices.Equal(got, want[1:3]) {
		t.Errorf("code actions at Fed: %q", got)
	}
}

// unitFile is an invented test file with a unit named in an expectation.
const unitFile = "stream A { flow 1 kg/s; p 10 bar; T 200 C }\nstream B { p 5 bar }\nvalve V1 { in A; out B }\nexpect V1 sgen > 0 kW/K\n"

func TestUnitRename(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, unitFile)
	decl := protocol.Range{Start: protocol.Position{Line: 2, Character: 6}, End: protocol.Position{Line: 2, Character: 8}}
	use := protocol.Range{Start: protocol.Position{Line: 3, Character: 7}, End: protocol.Position{Line: 3, Character: 9}}
	var locs []protocol.Location
	c.mustCall(protocol.MethodTextDocumentDefinition, docPos(uri, protocol.Position{Line: 3, Character: 8}), &locs)
	if len(locs) != 1 || locs[0].Range != decl {
		t.Errorf("definition of V1 = %+v", locs)
	}
	c.mustCall(protocol.MethodTextDocumentReferences, map[string]any{"textDocument": map[string]any{"uri": uri},
		"position": decl.Start, "context": map[string]any{"includeDeclaration": true}}, &locs)
	if len(locs) != 2 || locs[0].Range != decl || locs[1].Range != use {
		t.Errorf("references of V1 = %+v", locs)
	}
	var rng *protocol.Range
	c.mustCall(protocol.MethodTextDocumentPrepareRename, docPos(uri, decl.End), &rng)
	if rng == nil || *rng != decl {
		t.Errorf("prepareRename on V1 = %+v", rng)
	}
	var we protocol.WorkspaceEdit
	c.mustCall(protocol.MethodTextDocumentRename, map[string]any{"textDocument": map[string]any{"uri": uri},
		"position": use.Start, "newName": "PCV-7"}, &we)
	want := []protocol.TextEdit{{Range: decl, NewText: "PCV-7"}, {Range: use, NewText: "PCV-7"}}
	if !reflect.DeepEqual(we.Changes[uri], want) {
		t.Errorf("rename edits %+v", we.Changes[uri])
	}
	// A unit may not take a stream's name, nor a unit kind's.
	for _, bad := range []string{"A", "valve"} {
		if err := c.call(protocol.MethodTextDocumentRename, map[string]any{"textDocument": map[string]any{"uri": uri},
			"position": use.Start, "newName": bad}, nil); errCode(err) != requestFailed {
			t.Errorf("rename V1 to %q: %v", bad, err)
		}
	}
	// The result an expectation checks on a unit has its own help.
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{Line: 3, Character: 11}), &h)
	if h == nil || h.Contents.Value != "`sgen` (rate of entropy generation result of a valve): entropy generated: zero for a reversible process, below zero impossible" ||
		*h.Range != (protocol.Range{Start: protocol.Position{Line: 3, Character: 10}, End: protocol.Position{Line: 3, Character: 14}}) {
		t.Errorf("hover on sgen = %+v", h)
	}
	// Keywords, kinds, properties and numbers are not renamed: null.
	for _, p := range []protocol.Position{{Line: 2, Character: 1}, {Line: 0, Character: 1}, {Line: 3, Character: 11}, {Line: 1, Character: 13}} {
		rng = nil // a null result leaves it untouched
		c.mustCall(protocol.MethodTextDocumentPrepareRename, docPos(uri, p), &rng)
		if rng != nil {
			t.Errorf("prepareRename at %v = %+v, want null", p, rng)
		}
	}
}

func TestCompletionSites(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "atmosphere 99 \nstream A { p 1 bar }\nturbine T1 {\n  \n}\nexpect A \nexpect A h = 3 \nexpect T1 \nexpect T1 power = 5 \nexpect T1 sgen > 0 \n"
	c.open(uri, 1, src)
	labels := func(p protocol.Position) string {
		var l protocol.CompletionList
		c.mustCall(protocol.MethodTextDocumentCompletion, docPos(uri, p), &l)
		var out []string
		for _, it := range l.Items {
			if it.TextEdit == nil || it.TextEdit.Range != (protocol.Range{Start: p, End: p}) || it.TextEdit.NewText != it.Label {
				t.Errorf("item %q at %v: text edit %+v", it.Label, p, it.TextEdit)
			}
			out = append(out, it.Label)
		}
		return strings.Join(out, " ")
	}
	tests := []struct {
		name string
		pos  protocol.Position
		want string
	}{
		{"atmosphere spelling", protocol.Position{Line: 0, Character: 14}, "MPa MPa(a) MPa(g) MPaa MPag Pa atm bar bar(a) bar(g) bara barg hPa inH2O inH2O(a) inH2O(abs) inH2O(vac) inHg inHg(a) inHg(abs) inHg(vac) kPa kPa(a) kPa(g) kPaa kPag kg/cm2 kg/cm2(a) kg/cm2(g) kg/cm2a kg/cm2g kgf/cm2 kgf/cm2(a) kgf/cm2(g) kgf/cm2a kgf/cm2g mbar mmHg mmHg(a) mmHg(abs) mmHg(vac) psi psi(a) psi(d) psi(g) psia psid psig"},
		{"turbine roles and parameters", protocol.Position{Line: 3, Character: 2}, "in out efficiency power"},
		{"expect property", protocol.Position{Line: 5, Character: 9}, "flow p T h s x v rho vol_flow Tsat superheat subcooling"},
		{"enthalpy spelling", protocol.Position{Line: 6, Character: 15}, "Btu/lb Btu/lbm J/kg MJ/kg kJ/kg kcal/kg"},
		{"expect result of a turbine", protocol.Position{Line: 7, Character: 10}, "power efficiency dp sgen"},
		{"power spelling", protocol.Position{Line: 8, Character: 20}, "Btu/h Btu/hr GJ/h GJ/hr MBH MJ/h MJ/hr MMBtu/h MMBtu/hr MW TR W hp kBtu/h kBtu/hr kJ/h kJ/hr kW kcal/h kcal/hr ton"},
		{"entropy rate spelling", protocol.Position{Line: 9, Character: 19}, "Btu/(h R) Btu/(h*R) Btu/(hr R) Btu/(h·R) Btu/h-R Btu/h/R Btu/hR Btu/hr-R Btu/hr/R MW/K W/K kW/K"},
	}
	for _, tt := range tests {
		if got := labels(tt.pos); got != tt.want {
			t.Errorf("%s: got\n  %s\nwant\n  %s", tt.name, got, tt.want)
		}
	}
}

// decodeTokens turns semantic tokens' relative quintuples into "line:col+len type/modifiers".
func decodeTokens(data []uint32) []string {
	var line, col uint32
	var out []string
	for i := 0; i+4 < len(data); i += 5 {
		if data[i] > 0 {
			col = 0
		}
		line += data[i]
		col += data[i+1]
		out = append(out, fmt.Sprintf("%d:%d+%d %s/%d", line, col, data[i+2], tokenType(data[i+3]), data[i+4]))
	}
	return out
}

func TestSemanticTokensExact(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "title \"x°\" # note\nstream A { T 150 °C }\nvalve V1 { in A; dp 2 bar }\nexpect V1 sgen > 0 kW/K within 1 %\n"
	c.open(uri, 1, src)
	var toks protocol.SemanticTokens
	c.mustCall(protocol.MethodSemanticTokensFull, map[string]any{"textDocument": map[string]any{"uri": uri}}, &toks)
	want := []string{
		"0:0+5 keyword/0", "0:6+4 string/0", "0:11+6 comment/0",
		"1:0+6 keyword/0", "1:7+1 variable/1", "1:11+1 property/0", "1:13+3 number/0", "1:17+2 enumMember/0",
		"2:0+5 type/0", "2:6+2 class/1", "2:11+2 property/0", "2:14+1 variable/0", "2:17+2 property/0", "2:20+1 number/0", "2:22+3 enumMember/0",
		"3:0+6 keyword/0", "3:7+2 class/0", "3:10+4 property/0", "3:15+1 operator/0", "3:17+1 number/0", "3:19+4 enumMember/0",
		"3:24+6 keyword/0", "3:31+1 number/0", "3:33+1 enumMember/0",
	}
	if got := decodeTokens(toks.Data); !slices.Equal(got, want) {
		t.Errorf("tokens:\n got %q\nwant %q", got, want)
	}
}

// tokenType names a token type by the legend initialize announces.
func tokenType(i uint32) string {
	if int(i) < len(feature.TokenTypes) {
		return string(feature.TokenTypes[i])
	}
	return fmt.Sprint(i)
}

// TestIncrementalSync applies, in one notification, edits whose positions hold only after the
// edits before them, then a save, then a whole-text change.
func TestIncrementalSync(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	c.open(uri, 1, "stream A\n")
	c.change(uri, 2,
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 1}, End: protocol.Position{Line: 1}}, "text": "stream °B\nstream C\n"},
		// Line 1 is now "stream °B": replace B (column 8, after the one-unit degree sign).
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 1, Character: 8}, End: protocol.Position{Line: 1, Character: 9}}, "text": "Bee"},
		// Delete "°" and the line break before C, joining the lines with "; ".
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 1, Character: 7}, End: protocol.Position{Line: 1, Character: 8}}, "text": ""},
		map[string]any{"range": protocol.Range{Start: protocol.Position{Line: 1, Character: 10}, End: protocol.Position{Line: 2, Character: 0}}, "text": "; "})
	c.notifyServer(protocol.MethodTextDocumentDidSave, map[string]any{"textDocument": map[string]any{"uri": uri}})
	symbols := func() []string {
		var syms []protocol.DocumentSymbol
		c.mustCall(protocol.MethodTextDocumentDocumentSymbol, map[string]any{"textDocument": map[string]any{"uri": uri}}, &syms)
		var out []string
		for _, s := range syms {
			r := s.SelectionRange
			out = append(out, fmt.Sprintf("%s %d:%d-%d:%d", s.Name, r.Start.Line, r.Start.Character, r.End.Line, r.End.Character))
		}
		return out
	}
	// "stream A\nstream Bee; stream C\n"
	if got, want := symbols(), []string{"A 0:7-0:8", "Bee 1:7-1:10", "C 1:19-1:20"}; !slices.Equal(got, want) {
		t.Errorf("after the edits: %q, want %q", got, want)
	}
	if ds := withoutCode(c.waitDiags(uri, 2), "HMB501"); len(ds) != 3 || ds[2].Range.Start != (protocol.Position{Line: 1, Character: 19}) {
		t.Errorf("diagnostics after the edits: %+v", ds)
	}
	c.change(uri, 3, map[string]any{"text": "stream Z\n"})
	if got, want := symbols(), []string{"Z 0:7-0:8"}; !slices.Equal(got, want) {
		t.Errorf("after a whole-text change: %q", got)
	}
}

// solveLog records which models a solver finished and which it gave up when cancelled.
type solveLog struct {
	mu                  sync.Mutex
	finished, cancelled []string
	started             chan struct{} // closed when a "slow" solve begins, if not nil
}

// solver solves a model titled "slow" only when cancelled; others at once, with solveDouble.
func (l *solveLog) solver(ctx context.Context, m *model.Model) *solve.Result {
	if m.Title == "slow" {
		if l.started != nil {
			close(l.started)
		}
		<-ctx.Done()
		l.mu.Lock()
		l.cancelled = append(l.cancelled, m.Title)
		l.mu.Unlock()
		return nil
	}
	l.mu.Lock()
	l.finished = append(l.finished, m.Title)
	l.mu.Unlock()
	return solveDouble(ctx, m)
}

// TestDebounceSolvesOnce types a burst of edits while a solve is running: the running solve is
// cancelled, and of the burst only the last version is solved. The burst is five notifications
// written back to back; the debounce is long enough that a busy machine still delivers them
// within it.
func TestDebounceSolvesOnce(t *testing.T) {
	l := solveLog{started: make(chan struct{})}
	c := startServer(t, options{solve: l.solver, debounce: 3 * time.Second})
	c.open(uri, 1, "title \"slow\"\nstream S1\n")
	select { // the burst must find the first solve running, whatever the machine's load
	case <-l.started:
	case <-time.After(waitLimit):
		t.Fatal("the first solve never started")
	}
	for v := int32(2); v <= 6; v++ {
		c.change(uri, v, map[string]any{"text": fmt.Sprintf("title \"v%d\"\nstream S1\n", v)})
	}
	if ds := withoutCode(c.waitDiags(uri, 6), "HMB501"); len(ds) != 1 || ds[0].Code != "HMB209" {
		t.Errorf("version 6: %+v", ds)
	}
	l.mu.Lock()
	defer l.mu.Unlock()
	if !slices.Equal(l.finished, []string{"v6"}) || !slices.Equal(l.cancelled, []string{"slow"}) {
		t.Errorf("finished %q, cancelled %q; want [v6] and [slow]", l.finished, l.cancelled)
	}
}

// TestLoneCR serves text whose lines end in a lone "\r", as the protocol counts lines: every
// position the editor gets is on the line it shows, and the notation ends a line there too.
func TestLoneCR(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "stream S1 { p 1 barr }\rstream S2 { p 1 °C }\r\n\rvalve V1 { in S1; out S2 }\r"
	c.open(uri, 1, src)
	diags := func(v int32) []string {
		var out []string
		for _, d := range c.waitDiags(uri, v) {
			out = append(out, fmt.Sprintf("%v %d:%d-%d:%d", d.Code, d.Range.Start.Line, d.Range.Start.Character, d.Range.End.Line, d.Range.End.Character))
		}
		return out
	}
	if got, want := diags(1), []string{"HMB301 0:16-0:20", "HMB302 1:16-1:18"}; !slices.Equal(got, want) {
		t.Errorf("diagnostics %q, want %q", got, want)
	}
	// Line 3: `valve V1 { in S1; out ` is 22 units.
	s2 := protocol.Range{Start: protocol.Position{Line: 3, Character: 22}, End: protocol.Position{Line: 3, Character: 24}}
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(uri, protocol.Position{Line: 3, Character: 23}), &h)
	if h == nil || *h.Range != s2 || !strings.HasPrefix(h.Contents.Value, "**stream** `S2`") {
		t.Errorf("hover on S2 = %+v", h)
	}
	var toks protocol.SemanticTokens
	c.mustCall(protocol.MethodSemanticTokensFull, map[string]any{"textDocument": map[string]any{"uri": uri}}, &toks)
	abs := decodeTokens(toks.Data)
	for _, w := range []string{"1:0+6 keyword/0", "1:16+2 enumMember/0", "3:0+5 type/0", "3:14+2 variable/0", "3:22+2 variable/0"} {
		if !slices.Contains(abs, w) {
			t.Errorf("token %s missing from %q", w, abs)
		}
	}
	// A stream is declared at the start of the line, as the editor shows it, that uses it.
	other := protocol.DocumentURI("file:///cr.hmb")
	c.open(other, 1, "stream S1 { p 1 bar }\rvalve V1 { in S1; out S9 }\r")
	c.waitDiags(other, 1)
	if got := codeActions(t, c, other, protocol.Range{Start: protocol.Position{Line: 1, Character: 23}, End: protocol.Position{Line: 1, Character: 23}}); !slices.Equal(got, []string{`HMB201 Declare stream S9 false: 1:0-1:0 "stream S9\n"`}) {
		t.Errorf("code actions %q", got)
	}
	// An edit on line 3 by the protocol's count.
	c.change(uri, 2, map[string]any{"range": s2, "text": "S9"})
	if got := diags(2); !slices.Contains(got, "HMB201 3:22-3:24") {
		t.Errorf("after the edit: %q", got)
	}
}

// TestConflictRelated publishes a balance over-specified by two givens with both givens as
// related information, in the words of hmb check (lang.Check, then the solver).
func TestConflictRelated(t *testing.T) {
	src := "stream A { flow 10 kg/s; p 10 bar; T 200 C }\nstream B { flow 8 kg/s; p 5 bar }\nvalve V1 { in A; out B }\n"
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, src)
	var got *protocol.Diagnostic
	ds := c.waitDiags(solvedURI, 1)
	for i := range ds {
		if ds[i].Code == "HMB503" {
			got = &ds[i]
		}
	}
	var want *model.Diagnostic
	for _, d := range checkDiags(string(solvedURI), []byte(src)) {
		if d.Code == "HMB503" {
			want = &d
		}
	}
	if got == nil || want == nil {
		t.Fatalf("no HMB503: published %+v", ds)
	}
	v1 := protocol.Range{Start: protocol.Position{Line: 2, Character: 6}, End: protocol.Position{Line: 2, Character: 8}}
	if got.Range != v1 || got.Message != want.Message || got.Severity != protocol.DiagnosticSeverity(want.Severity) {
		t.Errorf("HMB503 = %+v, want at %v: %+v", got, v1, want)
	}
	// The two flows given: "flow 8 kg/s" on line 1 and "flow 10 kg/s" on line 0, from column 11.
	wantRel := []protocol.Range{
		{Start: protocol.Position{Line: 1, Character: 11}, End: protocol.Position{Line: 1, Character: 22}},
		{Start: protocol.Position{Line: 0, Character: 11}, End: protocol.Position{Line: 0, Character: 23}},
	}
	if len(got.RelatedInformation) != 2 || len(want.Related) != 2 {
		t.Fatalf("related %+v", got.RelatedInformation)
	}
	for i, r := range got.RelatedInformation {
		if r.Location.URI != solvedURI || r.Location.Range != wantRel[i] || r.Message != want.Related[i].Message {
			t.Errorf("related %d = %+v, want %v %q", i, r, wantRel[i], want.Related[i].Message)
		}
	}
}
