package lsp

// Tests of cases in the editor: every case checked as the file is typed, findings naming their
// case, hover with each case's value, completion of the base's names inside a case. Values are
// checked against Debian's python3-iapws (IAPWS97 class), with the calls quoted beside them.

import (
	"strings"
	"testing"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// caseFile is invented: 2 kg/s of steam at 40 bar, 400 C expands through a turbine to 5 bar; a
// worn turbine, a cooler inlet, and an exhaust above the inlet (which fails in that case only).
const caseFile = `stream S1 { flow 2 kg/s; p 40 bar; T 400 C }
stream S2 { p 5 bar }
turbine T1 { in S1; out S2; efficiency 0.85 }

case worn "worn blading" {
  T1 efficiency 0.75
}
case cold {
  S1 T 350 C
}
case uphill {
  S2 p 50 bar
}
`

// Reference values, python3-iapws 1.5 (MPa, K, kJ/kg):
//
//	a = IAPWS97(P=4, T=673.15); b = IAPWS97(P=0.5, s=a.s)
//	base: h2 = a.h - 0.85 (a.h - b.h); IAPWS97(P=0.5, h=h2).T - 273.15 = 174.47501; power 2 (a.h - h2) = 828.33424 kW
//	worn: 0.75 in place of 0.85: T 196.75885 C; power 730.88315 kW
//	cold: a = IAPWS97(P=4, T=623.15): x 0.98406719 (wet); power 757.59145 kW
const (
	refCaseT2Base, refCaseT2Worn                   = 174.47501, 196.75885
	refCasePowBase, refCasePowWorn, refCasePowCold = 828.33424, 730.88315, 757.59145
)

func TestCaseDiagnosticsNameTheirCase(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, caseFile)
	var uphill []protocol.Diagnostic
	for _, d := range c.waitDiags(solvedURI, 1) {
		if d.Severity == protocol.DiagnosticSeverityError {
			uphill = append(uphill, d)
		}
	}
	if len(uphill) != 1 || uphill[0].Code != "HMB514" || !strings.HasPrefix(uphill[0].Message, "case uphill: ") {
		t.Fatalf("errors %+v, want one HMB514 of case uphill", uphill)
	}
}

func TestCaseHover(t *testing.T) {
	c := startServer(t, options{solve: cache.Solve})
	c.open(solvedURI, 1, caseFile)
	c.waitDiags(solvedURI, 1)
	rows := tableRows(hoverAt(t, c, solvedURI, caseFile, "S2 {"))
	// The case table's header row: base, then the cases in the file's order.
	if got := strings.Join(rows["in each case"], " "); got != "base worn cold uphill" {
		t.Fatalf("case columns %q", got)
	}
	near(t, "S2 T base", rows["T"][0], refCaseT2Base, solvedTol)
	near(t, "S2 T worn", rows["T"][1], refCaseT2Worn, solvedTol)
	near(t, "S2 x cold", rows["x"][2], 0.98406719, solvedTol)
	unit := tableRows(hoverAt(t, c, solvedURI, caseFile, "T1 {"))
	near(t, "T1 power base", unit["power"][0], refCasePowBase, solvedTol)
	near(t, "T1 power worn", unit["power"][1], refCasePowWorn, solvedTol)
	near(t, "T1 power cold", unit["power"][2], refCasePowCold, solvedTol)
	if h := hoverAt(t, c, solvedURI, caseFile, "worn \""); !strings.Contains(h, "**case** `worn` worn blading") {
		t.Errorf("hover on the case's name: %q", h)
	}
}

func TestCaseCompletion(t *testing.T) {
	c := startServer(t, newTestOptions(0))
	src := "stream S1 { p 1 bar }\nstream S2\nvalve V1 { in S1; out S2 }\ncase low {\n  \n  S1 \n  V1 \n}\n"
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
	for _, tt := range []struct {
		name string
		pos  protocol.Position
		want string
	}{
		{"the base's names", protocol.Position{Line: 4, Character: 2}, "expect S1 S2 V1"},
		{"a stream's properties", protocol.Position{Line: 5, Character: 5}, "flow p T h s x"},
		{"a valve's parameters", protocol.Position{Line: 6, Character: 5}, "dp"},
	} {
		if got := labels(tt.pos); got != tt.want {
			t.Errorf("%s: got %q, want %q", tt.name, got, tt.want)
		}
	}
}
