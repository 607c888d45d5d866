package lsp

// Tests of what the editor shows of measurements, on the metered example plant: hover on a
// reading, ± on solved values, the reconciled value as an inlay hint, the suspect meter's
// diagnostic. The reference is expected.json, where testdata/examples/expected.py reconciles the
// same readings independently (python3-iapws, scipy).

import (
	"encoding/json"
	"fmt"
	"os"
	"strings"
	"testing"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

func TestMeasurementFeatures(t *testing.T) {
	src, err := os.ReadFile("../testdata/examples/metered_turbine.hmb")
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile("../testdata/examples/expected.json")
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Files map[string]struct {
			Reconciliation struct {
				Measurements []struct {
					Name, Property string
					Reconciled     float64
					UReconciled    float64 `json:"u_reconciled"`
					Test           float64
				}
			}
		}
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	want := map[string][3]float64{} // "MS flow" -> reconciled (kg/s), u, test
	for _, m := range doc.Files["metered_turbine.hmb"].Reconciliation.Measurements {
		want[m.Name+" "+m.Property] = [3]float64{m.Reconciled, m.UReconciled, m.Test}
	}
	ms := want["MS flow"]
	if ms[0] == 0 {
		t.Fatal("expected.json has no reconciliation of metered_turbine.hmb")
	}
	u := protocol.DocumentURI("file:///metered.hmb")
	text := string(src)
	c := startServer(t, options{solve: cache.Solve})
	c.open(u, 1, text)

	suspect := false
	for _, d := range c.waitDiags(u, 1) {
		if d.Code == "HMB704" && strings.HasPrefix(d.Message, "MS flow is suspect") {
			suspect = d.Range.Start == at(t, text, "flow 18.1", 0)
		}
	}
	if !suspect {
		t.Error("no HMB704 on the boiler-steam flow reading")
	}

	// Hover on the reading itself (its number).
	h := hoverAt(t, c, u, text, "18.1 kg/s")
	rows := tableRows(h)
	near(t, "reconciled MS flow", cell(rows, "reconciled"), ms[0], 1e-4)
	if r := cell(rows, "reconciled"); !strings.Contains(r, fmt.Sprintf("± %.2g kg/s", ms[1])) {
		t.Errorf("reconciled cell %q lacks ± %.2g kg/s", r, ms[1])
	}
	if m := cell(rows, "measured"); !strings.HasPrefix(m, "18.100 ± 0.27 kg/s") {
		t.Errorf("measured cell %q", m)
	}
	if w := fmt.Sprintf("normalised correction %.3g, above 1.96: a suspect meter", ms[2]); !strings.Contains(h, w) {
		t.Errorf("hover lacks %q:\n%s", w, h)
	}
	// The unit spelling inside the reading keeps its own hover.
	if h := hoverAt(t, c, u, text, "kg/s ± 1.5"); !strings.Contains(h, "mass flow") {
		t.Errorf("hover on the spelling: %q", h)
	}
	// The stream's hover shows every value with its ±.
	h = hoverAt(t, c, u, text, "MS \"boiler")
	if flow := cell(tableRows(h), "flow"); !strings.Contains(flow, "±") {
		t.Errorf("stream hover flow %q has no ±", flow)
	} else {
		near(t, "stream hover MS flow", flow, ms[0], 1e-4)
	}
	// The turbine's efficiency with its uncertainty (thermo/reconcile's tests check both numbers
	// against an independent computation).
	h = hoverAt(t, c, u, text, "TG1 \"back")
	var eff, half float64
	if _, err := fmt.Sscanf(h[strings.Index(h, "\nefficiency ")+1:], "efficiency %g ± %g", &eff, &half); err != nil || !(eff > 0.7 && eff < 0.8 && half > 0 && half < 0.05) {
		t.Errorf("turbine hover lacks its efficiency with ± (%v):\n%s", err, h)
	}

	var hints []struct {
		Position protocol.Position
		Label    string
	}
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": u},
		"range": protocol.Range{End: protocol.Position{Line: 100}}}, &hints)
	found := false
	for _, hn := range hints {
		if strings.HasPrefix(hn.Label, "reconciled ") && strings.HasSuffix(hn.Label, "(suspect)") {
			near(t, "reconciled hint", strings.TrimPrefix(hn.Label, "reconciled "), ms[0], 1e-4)
			found = hn.Position == at(t, text, "; p 42 bar", 0)
		}
	}
	if !found {
		t.Errorf("no reconciled hint after the MS flow reading: %+v", hints)
	}
}

// cell is the first value cell of a hover table's row.
func cell(rows map[string][]string, key string) string {
	if r := rows[key]; len(r) > 0 {
		return r[0]
	}
	return ""
}
