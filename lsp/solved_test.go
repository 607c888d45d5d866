package lsp

// Tests of the server over the real solver: the values shown are checked against Debian's
// python3-iapws (IAPWS97 class), computed with the commands quoted beside them.

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lsp/cache"
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
)

// turbineFile is an invented test case: steam expands through a turbine of 80 % isentropic
// efficiency into the wet region.
const turbineFile = `title "expansion"
display SI

stream S1 "inlet" {
  flow 10 kg/s
  p 40 bar
  T 400 °C
}
stream S2 "exhaust" {
  p 1 bar
}
turbine T1 {
  in S1
  out S2
  efficiency 0.8
}
`

// Reference values from python3-iapws 1.5 (Debian), in its units (MPa, K, kJ/kg, kJ/(kg K)):
//
//	s1 = IAPWS97(P=4.0, T=673.15)            h 3214.3735  s 6.7711920  v 0.073431804
//	s2s = IAPWS97(P=0.1, s=s1.s)             h 2455.9117
//	h2 = s1.h - 0.8*(s1.h - s2s.h)           2607.6041
//	s2 = IAPWS97(P=0.1, h=h2)                T 372.75592  x 0.97016824  s 7.1781382  v 1.6435180
//	power 10*(s1.h - h2) = 6067.6945 kW; entropy generated 10*(s2.s - s1.s) = 4.0694617 kW/K
const (
	refH1, refS1, refV1       = 3214.3735, 6.7711920, 0.073431804
	refH2, refT2, refX2       = 2607.6041, 372.75592 - 273.15, 0.97016824
	refS2, refV2              = 7.1781382, 1.6435180
	refPowerKW, refSgenKWPerK = 6067.6945, 4.0694617
	refT2F                    = (372.75592-273.15)*9/5 + 32 // the same state in °F
	// Shaft power shows in hp in US units: 1 hp = 550 ft lbf/s = 745.69987158227022 W (NIST SP
	// 811 (2008) Appendix B.8, from the foot and the pound-force).
	refPowerHp                 = 6067.6945e3 / 745.69987158227022
	solvedTol                  = 1e-4 // the display rounds to 5 significant figures
	solvedURI                  = protocol.DocumentURI("file:///expansion.hmb")
	hoverTable, hoverUnitTable = "| | value | from |", "| balance | in | out |"
)

// near reports whether the number leading s is v to within rel (relative).
func near(t *testing.T, what, s string, v, rel float64) {
	t.Helper()
	f := strings.Fields(s)
	if len(f) == 0 {
		t.Errorf("%s: no value in %q", what, s)
		return
	}
	got, err := strconv.ParseFloat(f[0], 64)
	if err != nil || math.Abs(got-v) > rel*math.Abs(v) {
		t.Errorf("%s = %q, want %.6g (python3-iapws)", what, s, v)
	}
}

// tableRows reads a hover's Markdown table: first cell -> the other cells.
func tableRows(text string) map[string][]string {
	rows := map[string][]string{}
	for _, line := range strings.Split(text, "\n") {
		if !strings.HasPrefix(line, "| ") {
			continue
		}
		cells := strings.Split(strings.Trim(line, "|"), " | ")
		for i := range cells {
			cells[i] = strings.TrimSpace(cells[i])
		}
		rows[cells[0]] = cells[1:]
	}
	return rows
}

func hoverAt(t *testing.T, c *client, u protocol.DocumentURI, src, marker string) string {
	t.Helper()
	var h *protocol.Hover
	c.mustCall(protocol.MethodTextDocumentHover, docPos(u, at(t, src, marker, 0)), &h)
	if h == nil {
		t.Fatalf("no hover at %q", marker)
	}
	return h.Contents.Value
}

func TestSolvedStreamHover(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, turbineFile)
	if ds := c.waitDiags(solvedURI, 1); len(ds) != 0 {
		t.Fatalf("diagnostics %+v", ds)
	}
	exhaust := hoverAt(t, c, solvedURI, turbineFile, "S2 \"exhaust")
	if !strings.HasPrefix(exhaust, "**stream** `S2` exhaust\n\n"+hoverTable) {
		t.Errorf("hover starts %q", exhaust)
	}
	rows := tableRows(exhaust)
	tests := []struct {
		row, unit, from string
		want            float64
	}{
		{"flow", "kg/s", "mass balance of turbine T1", 10}, // given at S1
		{"p", "kPa", "given", 100},                         // given: 1 bar
		{"T", "C", "IAPWS-IF97 from p and h", refT2},
		{"h", "kJ/kg", "isentropic efficiency of turbine T1", refH2},
		{"s", "kJ/(kg K)", "IAPWS-IF97 from p and h", refS2},
		{"v", "m3/kg", "IAPWS-IF97 from p and h", refV2},
		{"x", "", "IAPWS-IF97 from p and h", refX2},
	}
	for _, tt := range tests {
		r := rows[tt.row]
		if len(r) != 2 {
			t.Errorf("row %s missing in\n%s", tt.row, exhaust)
			continue
		}
		near(t, "S2 "+tt.row, r[0], tt.want, solvedTol)
		if unit := strings.TrimSpace(strings.TrimLeft(r[0], "0123456789.-")); unit != tt.unit || r[1] != tt.from {
			t.Errorf("S2 %s: unit %q from %q, want %q from %q", tt.row, unit, r[1], tt.unit, tt.from)
		}
	}
	if got := rows["phase"]; len(got) == 0 || got[0] != "saturated mixture" {
		t.Errorf("S2 phase %q", got)
	}

	inlet := tableRows(hoverAt(t, c, solvedURI, turbineFile, "S1\n"))
	near(t, "S1 h", inlet["h"][0], refH1, solvedTol)
	near(t, "S1 s", inlet["s"][0], refS1, solvedTol)
	near(t, "S1 v", inlet["v"][0], refV1, solvedTol)
	for row, want := range map[string]string{"flow": "given", "T": "given", "h": "given S1 T", "x": ""} {
		if got := inlet[row]; len(got) != 2 || got[1] != want {
			t.Errorf("S1 %s from %q, want %q", row, got, want)
		}
	}
	if got := inlet["x"][0]; got != "none (single phase)" {
		t.Errorf("S1 x = %q", got)
	}
	if got := inlet["phase"][0]; got != "superheated vapour" {
		t.Errorf("S1 phase = %q", got)
	}
}

func TestSolvedUnitHoverAndHints(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, turbineFile)
	text := hoverAt(t, c, solvedURI, turbineFile, "T1")
	if !strings.HasPrefix(text, "**turbine** `T1`\n\nadiabatic expansion producing shaft power\n\n"+hoverUnitTable) {
		t.Errorf("hover starts %q", text)
	}
	rows := tableRows(text)
	near(t, "mass in", rows["mass"][0], 10, solvedTol)
	near(t, "mass out", rows["mass"][1], 10, solvedTol)
	near(t, "energy in", rows["energy"][0], 10*refH1, solvedTol) // m h1, kW
	near(t, "energy out", rows["energy"][1], 10*refH1, solvedTol)
	var power, sgen string
	for _, line := range strings.Split(text, "\n") {
		if v, ok := strings.CutPrefix(line, "power "); ok {
			power = v
		}
		if v, ok := strings.CutPrefix(line, "sgen "); ok {
			sgen = v
		}
	}
	near(t, "power", power, refPowerKW, solvedTol)
	near(t, "entropy generated", sgen, refSgenKWPerK, solvedTol)
	if !strings.HasSuffix(power, " kW") || !strings.HasSuffix(sgen, " kW/K") {
		t.Errorf("units: power %q, entropy generated %q", power, sgen)
	}

	var hints []struct {
		Position protocol.Position
		Label    string
	}
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": solvedURI},
		"range": protocol.Range{End: protocol.Position{Line: 100}}}, &hints)
	// S1 gives its T and is superheated: no hint. S2 shows T and x after its closing brace (line
	// 10), the turbine its power after its own (line 15).
	if len(hints) != 2 {
		t.Fatalf("hints %+v", hints)
	}
	if hints[0].Position != (protocol.Position{Line: 10, Character: 1}) || hints[1].Position != (protocol.Position{Line: 15, Character: 1}) {
		t.Errorf("hint positions %+v", hints)
	}
	var tv, xv, pv string
	if _, err := fmt.Sscanf(hints[0].Label, "T %s C, x %s", &tv, &xv); err != nil {
		t.Errorf("S2 hint %q: %v", hints[0].Label, err)
	}
	tv = strings.TrimSuffix(tv, ",")
	near(t, "S2 hint T", tv, refT2, solvedTol)
	near(t, "S2 hint x", xv, refX2, 1e-3) // 4 figures
	if _, err := fmt.Sscanf(hints[1].Label, "power %s kW", &pv); err != nil {
		t.Errorf("T1 hint %q: %v", hints[1].Label, err)
	}
	near(t, "T1 hint power", pv, refPowerKW, solvedTol)

	// A range that ends before the turbine's declaration leaves its hint out.
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": solvedURI},
		"range": protocol.Range{End: protocol.Position{Line: 11}}}, &hints)
	if len(hints) != 1 || !strings.HasPrefix(hints[0].Label, "T ") {
		t.Errorf("hints up to line 11: %+v", hints)
	}
}

// TestSolvedUSDisplay shows the same state in the file's US unit system.
func TestSolvedUSDisplay(t *testing.T) {
	src := strings.Replace(turbineFile, "display SI", "display US", 1)
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, src)
	rows := tableRows(hoverAt(t, c, solvedURI, src, "S2 \"exhaust"))
	near(t, "S2 T (US)", rows["T"][0], refT2F, solvedTol)
	if !strings.HasSuffix(rows["T"][0], " F") {
		t.Errorf("S2 T (US) = %q, want °F", rows["T"][0])
	}
	var hints []struct{ Label string }
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": solvedURI},
		"range": protocol.Range{End: protocol.Position{Line: 100}}}, &hints)
	if len(hints) != 2 || !strings.HasPrefix(hints[1].Label, "power ") {
		t.Fatalf("hints %+v", hints)
	}
	near(t, "T1 power (US)", strings.TrimPrefix(hints[1].Label, "power "), refPowerHp, solvedTol)
	if !strings.HasSuffix(hints[1].Label, " hp") {
		t.Errorf("T1 power (US) = %q, want hp", hints[1].Label)
	}
}

// TestDiagnosticsMatchCheck publishes, for every example and broken file of the repository, the
// diagnostics hmb check reports: lang.Check, then the solver on what was lowered.
func TestDiagnosticsMatchCheck(t *testing.T) {
	var files []string
	for _, dir := range []string{"examples", "broken", "cli", "lang"} {
		m, _ := filepath.Glob(filepath.Join("..", "testdata", dir, "*.hmb"))
		files = append(files, m...)
	}
	if len(files) < 5 {
		t.Fatalf("found only %d test files", len(files))
	}
	c := startServer(t, options{solve: cache.Solve})
	texts := make([][]byte, len(files))
	for i, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		// The protocol carries text as JSON strings, which hold no invalid UTF-8: the server sees
		// what a JSON round trip leaves (U+FFFD for each bad byte), and so does hmb check here.
		b, _ := json.Marshal(string(src))
		var text string
		if err := json.Unmarshal(b, &text); err != nil {
			t.Fatal(err)
		}
		texts[i] = []byte(text)
		c.open(protocol.DocumentURI(fmt.Sprintf("file:///doc%d.hmb", i)), 1, text)
	}
	for i, f := range files {
		u := protocol.DocumentURI(fmt.Sprintf("file:///doc%d.hmb", i))
		src := texts[i]
		got := c.waitDiags(u, 1)
		want := checkDiags(string(u), src)
		m := cache.NewMapper(string(u), src)
		var g, w []string
		for _, d := range got {
			g = append(g, fmt.Sprintf("%d:%d %v %s", d.Range.Start.Line, d.Range.Start.Character, d.Code, d.Message))
		}
		for _, d := range want {
			p := m.Position(d.Span.Start)
			w = append(w, fmt.Sprintf("%d:%d %s %s", p.Line, p.Character, d.Code, d.Message))
		}
		if !slices.Equal(g, w) {
			t.Errorf("%s:\n got %q\nwant %q", f, g, w)
		}
	}
}

// checkDiags is hmb check's pipeline (cmd/hmb checkModel): the notation's findings, then the
// solver's, then each case's the base does not make, sorted stably by position.
func checkDiags(name string, src []byte) []model.Diagnostic {
	lr := lang.Check(name, src)
	diags := slices.Clone(lr.Diags)
	if lr.Model != nil {
		res, _ := reconcile.Solve(context.Background(), lr.Model, solve.Options{})
		diags = append(diags, res.Diags...)
		for _, k := range cases.Solve(context.Background(), lr.Model, solve.Options{}) {
			diags = append(diags, cases.Distinct(k.Diags, res.Diags)...)
		}
	}
	slices.SortStableFunc(diags, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	return diags
}

// TestListHints puts the hints of streams declared in one list beside each name.
func TestListHints(t *testing.T) {
	// Invented: header steam throttled twice. python3-iapws: f = IAPWS97(P=0.5, T=473.15),
	// h 2855.8962; IAPWS97(P=0.4, h=f.h).T - 273.15 = 197.57404,
	// IAPWS97(P=0.1, h=f.h).T - 273.15 = 190.08818 (both superheated: no quality shown).
	src := "stream F { flow 2 kg/s; p 5 bar; T 200 C }\nstream A, B\nvalve V1 { in F; out A; dp 1 bar }\nvalve V2 { in A; out B; dp 3 bar }\n"
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, src)
	var hints []struct {
		Position protocol.Position
		Label    string
	}
	c.mustCall("textDocument/inlayHint", map[string]any{"textDocument": map[string]any{"uri": solvedURI},
		"range": protocol.Range{End: protocol.Position{Line: 2}}}, &hints)
	if len(hints) != 2 || hints[0].Position != (protocol.Position{Line: 1, Character: 8}) || hints[1].Position != (protocol.Position{Line: 1, Character: 11}) {
		t.Fatalf("hints %+v", hints)
	}
	for i, want := range []float64{197.57404, 190.08818} {
		v, ok := strings.CutPrefix(hints[i].Label, "T ")
		if !ok || !strings.HasSuffix(v, " C") {
			t.Errorf("hint %q", hints[i].Label)
		}
		near(t, "hint T", v, want, solvedTol)
	}
}

// TestSpecifyQuickFix offers, for an under-specified system, to add each value the solver names
// (HMB501: "specify one of: V1 dp, A p, B p, C p"), where the user then types its value.
func TestSpecifyQuickFix(t *testing.T) {
	src := "stream F { flow 2 kg/s; p 5 bar; T 200 C }\nstream A\nstream B { }\nvalve V1 {\n  in F\n  out A\n}\n" +
		"valve V2 { in A; out B; }\nstream C { }\nheater H { in B; out C; dp 0 bar }\n"
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, src)
	c.waitDiags(solvedURI, 1)
	actions := func(line uint32) []string {
		var acts []protocol.CodeAction
		c.mustCall(protocol.MethodTextDocumentCodeAction, map[string]any{"textDocument": map[string]any{"uri": solvedURI},
			"range":   protocol.Range{Start: protocol.Position{Line: line, Character: 7}, End: protocol.Position{Line: line, Character: 7}},
			"context": map[string]any{"diagnostics": []any{}}}, &acts)
		var out []string
		for _, a := range acts {
			for _, e := range a.Edit.Changes[solvedURI] {
				out = append(out, fmt.Sprintf("%s: %d:%d-%d:%d %q", a.Title, e.Range.Start.Line, e.Range.Start.Character, e.Range.End.Line, e.Range.End.Character, e.NewText))
			}
		}
		return out
	}
	tests := []struct {
		line uint32
		want []string
	}{
		{3, []string{
			`Specify V1 dp: 6:0-6:0 "  dp \n"`, // before the brace on its own line
			`Specify A p: 1:8-1:8 " { p }"`,    // a bare declaration gets a block
			`Specify B p: 2:10-2:11 " p "`,     // an empty block
			`Specify C p: 8:10-8:11 " p "`,
		}},
		{7, []string{`Specify V2 dp: 7:23-7:24 " dp "`, `Specify B p: 2:10-2:11 " p "`, `Specify C p: 8:10-8:11 " p "`}}, // after a semicolon
		{9, []string{`Specify H duty: 9:32-9:33 "; duty "`, `Specify C T: 8:10-8:11 " T "`}},                             // a one-line block; "T or h" offers T
	}
	for _, tt := range tests {
		if got := actions(tt.line); !slices.Equal(got, tt.want) {
			t.Errorf("code actions on line %d:\n got %q\nwant %q", tt.line, got, tt.want)
		}
	}
}
