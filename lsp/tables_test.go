package lsp

// Tests of the file's solved tables, in the hover of its title and from the hmb.streamTable
// command, over the real solver. The reference values are python3-iapws's, quoted beside
// turbineFile's constants (solved_test.go).

import (
	"fmt"
	"hmb/thermo/units"
	"strings"
	"testing"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// mdRows reads the rows of the Markdown tables in text: first cell -> all cells, trimmed.
func mdRows(text string) map[string][]string {
	rows := map[string][]string{}
	for _, line := range strings.Split(text, "\n") {
		if !strings.HasPrefix(line, "|") {
			continue
		}
		cells := strings.Split(strings.Trim(line, "|"), "|")
		for i := range cells {
			cells[i] = strings.TrimSpace(cells[i])
		}
		if _, seen := rows[cells[0]]; !seen { // the first table's row: streams before their conditions
			rows[cells[0]] = cells
		}
	}
	return rows
}

func streamTableCommand(uri protocol.DocumentURI) map[string]any {
	return map[string]any{"command": "hmb.streamTable", "arguments": []any{uri}}
}

func TestTitleHoverAndCommand(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, turbineFile)
	c.waitDiags(solvedURI, 1)

	var onKeyword, onString *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(solvedURI, protocol.Position{Line: 0, Character: 2}), &onKeyword)
	c.mustCall(protocol.MethodTextDocumentHover, docPos(solvedURI, protocol.Position{Line: 0, Character: 10}), &onString)
	if onKeyword == nil || onString == nil {
		t.Fatalf("no hover on the title: %v, %v", onKeyword, onString)
	}
	// The range is the whole statement: `title "expansion"`, 17 columns.
	title := protocol.Range{End: protocol.Position{Line: 0, Character: 17}}
	if *onKeyword.Range != title || *onString.Range != title || onKeyword.Contents.Kind != protocol.Markdown {
		t.Errorf("ranges %v, %v, kind %s", *onKeyword.Range, *onString.Range, onKeyword.Contents.Kind)
	}
	text := onKeyword.Contents.Value
	if onString.Contents.Value != text {
		t.Errorf("the hovers on the keyword and on the string differ:\n%s\n%s", text, onString.Contents.Value)
	}
	var cmd string
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, streamTableCommand(solvedURI), &cmd)
	if cmd != text {
		t.Errorf("the command's table differs from the hover's:\n%s\n%s", cmd, text)
	}
	if !strings.HasPrefix(text, "# expansion\n") {
		t.Errorf("table starts %q", text)
	}
	rows := mdRows(text)
	// Headings in the file's (SI) display units.
	if got := strings.Join(rows["stream"], ","); got != "stream,label,flow (kg/s),p (kPa),T (C),h (kJ/kg),s (kJ/(kg K)),x,phase" {
		t.Errorf("stream table heading %s", got)
	}
	// S2 (python3-iapws: T 99.606 C, h 2607.60, s 7.17814, x 0.970168), rounded as the table
	// writes them: x to 1e-4, the rest to 5 figures.
	want := []string{"S2", "exhaust", "10.000", "100.00", units.Format(refT2, 5), units.Format(refH2, 5),
		units.Format(refS2, 5), fmt.Sprintf("%.4f", refX2), "saturated mixture"}
	if got := rows["S2"]; strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("S2 row %q, want %q", got, want)
	}
	if got := rows["S1"]; len(got) != 9 || got[5] != units.Format(refH1, 5) || got[7] != "" || got[8] != "superheated vapour" {
		t.Errorf("S1 row %q", got)
	}
	// T1: power 6067.69 kW and entropy generated 4.06946 kW/K, to 5 figures; a turbine has no duty.
	// Its efficiency as given, its pressure drop 4 MPa - 100 kPa.
	if got := strings.Join(rows["T1"], ","); got != "T1,,turbine,,6067.7,0.8000,3900.0,4.0695" {
		t.Errorf("T1 row %s", got)
	}
	if got := strings.Join(rows["unit"], ","); got != "unit,label,kind,duty (kW),shaft power (kW),efficiency,pressure drop (kPa),entropy generation (kW/K)" {
		t.Errorf("unit table heading %s", got)
	}
}

// TestTablesUSDisplay shows the tables in the file's US units.
func TestTablesUSDisplay(t *testing.T) {
	src := strings.Replace(turbineFile, "display SI", "display US", 1)
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, src)
	var cmd string
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, streamTableCommand(solvedURI), &cmd)
	rows := mdRows(cmd)
	if h := rows["stream"]; len(h) != 9 || h[4] != "T (F)" {
		t.Fatalf("heading %q in\n%s", h, cmd)
	}
	if got := rows["S2"][4]; got != units.Format(refT2F, 5) {
		t.Errorf("S2 T = %s F, want %.5g (python3-iapws)", got, refT2F)
	}
	// 6067.69 kW in hp, to 4 figures.
	near(t, "T1 power (US)", rows["T1"][4], refPowerHp, 5e-4)
	if h := rows["unit"]; len(h) != 8 || h[4] != "shaft power (hp)" {
		t.Errorf("unit heading %q", h)
	}
}

func TestExecuteCommandErrors(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	var res struct {
		Capabilities struct {
			ExecuteCommandProvider struct{ Commands []string }
		}
	}
	// The capability is announced in initialize's result; ask a fresh server.
	c2 := startRaw(t, newTestOptions(0))
	c2.mustCall(protocol.MethodInitialize, map[string]any{"capabilities": map[string]any{}}, &res)
	if got := res.Capabilities.ExecuteCommandProvider.Commands; strings.Join(got, " ") != "hmb.streamTable hmb.flowsheet" {
		t.Errorf("executeCommandProvider commands %q", got)
	}
	c.open(uri, 1, plant)
	tests := []struct {
		name   string
		params any
	}{
		{"unopened document", streamTableCommand("file:///nowhere.hmb")},
		{"unknown command", map[string]any{"command": "hmb.nothing", "arguments": []any{uri}}},
		{"no argument", map[string]any{"command": "hmb.streamTable"}},
		{"two arguments", map[string]any{"command": "hmb.streamTable", "arguments": []any{uri, uri}}},
		{"argument not a URI", map[string]any{"command": "hmb.streamTable", "arguments": []any{42}}},
	}
	for _, tt := range tests {
		if err := c.call(protocol.MethodWorkspaceExecuteCommand, tt.params, nil); errCode(err) != jsonrpc2.InvalidParams {
			t.Errorf("%s: %v, want InvalidParams", tt.name, err)
		}
	}
	// A text document identifier names the document as well as a bare URI (S2 as in
	// TestHoverGolden: T2 118.894 C, h2 2714.37 kJ/kg, s2 7.46194, python3-iapws).
	var text string
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, map[string]any{"command": "hmb.streamTable",
		"arguments": []any{map[string]any{"uri": uri}}}, &text)
	if got := strings.Join(mdRows(text)["S2"], ","); got != "S2,exhaust 🔥,10.000,100.00,118.89,2714.4,7.4619,,superheated vapour" {
		t.Errorf("S2 row: %s", got)
	}
	// A half-typed file tabulates what the checker could lower.
	c.change(uri, 2, map[string]any{"text": "title \"half\"\nstream S1 {\n"})
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, streamTableCommand(uri), &text)
	if got := strings.Join(mdRows(text)["S1"], ","); !strings.HasPrefix(text, "# half\n") || got != "S1,,n/a,n/a,n/a,n/a,n/a,n/a,unsolved" {
		t.Errorf("half-typed file: S1 row %s in\n%s", got, text)
	}
}
