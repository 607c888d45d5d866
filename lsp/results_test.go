package lsp

// Tests of issue 12's results in the editor: the totals on hover of an expectation's subject
// total, derived stream results and the file's display units in the stream hover, and an
// exchanger's closest approach as an inlay hint. References from python3-iapws 1.5.2.

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// The turbine file of solved_test.go, shown in t/h and MW, with expectations on its totals.
const totalsFile = turbineFile + `display_flow t/h
display_power MW
expect total net_power > 5 MW
expect S1 superheat > 100 K
`

func TestTotalsHover(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, totalsFile)
	if ds := c.waitDiags(solvedURI, 1); len(ds) != 0 {
		t.Fatalf("diagnostics %+v", ds)
	}
	tot := hoverAt(t, c, solvedURI, totalsFile, "total net_power")
	rows := tableRows(tot)
	if !strings.HasPrefix(tot, "**total**") || !strings.HasSuffix(rows["net_power"][0], " MW") || !strings.HasSuffix(rows["power_out"][0], " MW") {
		t.Fatalf("totals hover:\n%s", tot)
	}
	// The turbine's power, 6067.6945 kW (solved_test.go), is the whole file's: no pump, no heat.
	near(t, "net_power", rows["net_power"][0], refPowerKW/1000, solvedTol)
	if rows["efficiency"][0] != "none" || rows["heat_rate"][0] != "none" {
		t.Errorf("efficiency %q, heat rate %q: want none without heat in", rows["efficiency"], rows["heat_rate"])
	}
	if doc := hoverAt(t, c, solvedURI, totalsFile, "net_power >"); !strings.Contains(doc, "power_out - power_in") {
		t.Errorf("hover on net_power: %q", doc)
	}
	// S1 at 4 MPa, 673.15 K: W(P=4, x=0).T = 523.5075191240655 K, so 149.64248 K of superheat;
	// 10 kg/s is 36 t/h. S2 is wet: no superheat, no subcooling.
	s1 := tableRows(hoverAt(t, c, solvedURI, totalsFile, "S1\n"))
	near(t, "S1 superheat", s1["superheat"][0], 673.15-523.5075191240655, solvedTol)
	near(t, "S1 Tsat", s1["Tsat"][0], 523.5075191240655-273.15, solvedTol)
	if !strings.HasSuffix(s1["superheat"][0], " dK") || s1["flow"][0] != "36.000 t/h" {
		t.Errorf("S1 superheat %q, flow %q", s1["superheat"], s1["flow"])
	}
	s2 := tableRows(hoverAt(t, c, solvedURI, totalsFile, "S2 \"exhaust"))
	if s2["superheat"][0] != "none (saturated mixture)" || s2["subcooling"][0] != "none (saturated mixture)" {
		t.Errorf("S2 superheat %q, subcooling %q", s2["superheat"], s2["subcooling"])
	}
}

// The condensing turbine example's condenser comes within Tsat(10 kPa) - 35 C of its cooling
// water: W(P=0.01, x=0).T = 318.9575482070235 K, so 10.8075 K; the hint shows it beside the
// duty.
func TestApproachHint(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("..", "testdata", "examples", "condensing_turbine.hmb"))
	if err != nil {
		t.Fatal(err)
	}
	uri := protocol.DocumentURI("file:///condensing_turbine.hmb")
	c := startServer(t, options{solve: cache.Solve})
	c.open(uri, 1, string(src))
	c.waitDiags(uri, 1)
	var hints []struct{ Label string }
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": uri},
		"range": protocol.Range{End: protocol.Position{Line: 1000}}}, &hints)
	for _, h := range hints {
		if _, rest, ok := strings.Cut(h.Label, "dT_min "); ok {
			near(t, "CD dT_min", rest, 318.9575482070235-308.15, solvedTol)
			if !strings.HasPrefix(h.Label, "duty ") || !strings.HasSuffix(rest, " dK") {
				t.Errorf("hint %q", h.Label)
			}
			return
		}
	}
	t.Errorf("no dT_min hint in %+v", hints)
}
