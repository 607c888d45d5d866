package lsp

// Tests of the heat and material balance diagram from the hmb.flowsheet command, over the real
// solver. The values under S2's tag are python3-iapws's, quoted beside turbineFile's constants
// (solved_test.go).

import (
	"encoding/xml"
	"strings"
	"testing"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/units"
)

func TestFlowsheetCommand(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, turbineFile)
	c.waitDiags(solvedURI, 1)

	var svg string
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, map[string]any{"command": "hmb.flowsheet", "arguments": []any{solvedURI}}, &svg)
	d := xml.NewDecoder(strings.NewReader(svg))
	var root struct {
		XMLName xml.Name
		Class   string `xml:"class,attr"`
	}
	if err := d.Decode(&root); err != nil || root.XMLName.Local != "svg" || root.Class != "flowsheet" {
		t.Fatalf("not a flowsheet SVG (%v): %.200s", err, svg)
	}
	// The turbine as a symbol, both streams as tagged arrows, S2's values under its tag: 10
	// kg/s at 100 kPa and python3-iapws's 99.606 C, as the stream table writes them.
	for _, want := range []string{
		`data-unit="T1" data-kind="turbine"`, `class="stream" data-stream="S1"`, `class="stream" data-stream="S2"`,
		">S1<", ">S2<", ">10.000 kg/s<", ">100.00 kPa<", ">" + units.Format(refT2, 5) + " °C<",
	} {
		if !strings.Contains(svg, want) {
			t.Errorf("flowsheet lacks %q", want)
		}
	}

	// A half-typed file draws what the checker could lower: here nothing, and still an SVG.
	c.change(solvedURI, 2, map[string]any{"text": "title \"half\"\nstream {{{"})
	c.mustCall(protocol.MethodWorkspaceExecuteCommand, map[string]any{"command": "hmb.flowsheet", "arguments": []any{solvedURI}}, &svg)
	if !strings.HasPrefix(svg, "<svg ") || strings.Contains(svg, `class="stream"`) || !strings.Contains(svg, "half: heat and material balance diagram") {
		t.Errorf("half-typed file: %.300s", svg)
	}
	// Wrong arguments are the caller's error.
	if err := c.call(protocol.MethodWorkspaceExecuteCommand, map[string]any{"command": "hmb.flowsheet"}, nil); errCode(err) != jsonrpc2.InvalidParams {
		t.Errorf("no argument: %v, want InvalidParams", err)
	}
}
