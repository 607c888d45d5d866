package analysis

import (
	"testing"

	"hmb/lang/check"
	"hmb/thermo/model"
)

// The fix that declares a stream keys on the diagnostic's code and its Undeclared field, never
// on its wording: a reworded message still gets it, and an undefined unit (no field) does not.
func TestDeclareFixKeysOnData(t *testing.T) {
	src := "stream A { p 1 bar }\nvalve V { in A; out S9 }\n"
	a := New(nil)
	syn := a.Check("t.hmb", []byte(src))
	var d model.Diagnostic
	for _, x := range syn.Diagnostics {
		if x.Code == check.CodeUndefined {
			d = x
		}
	}
	if d.Undeclared != "S9" {
		t.Fatalf("HMB201 without Undeclared: %+v", d)
	}
	d.Message = "reworded: the name is unknown"
	fixes := a.QuickFixes(syn, nil, d)
	if len(fixes) != 1 || fixes[0].Title != "Declare stream S9" || fixes[0].Edits[0].NewText != "stream S9\n" || fixes[0].Edits[0].Span.Start != 21 {
		t.Errorf("fixes %+v", fixes)
	}
	d.Undeclared = ""
	d.Message = "stream S9 is not declared (declare it with: stream S9)"
	if fixes := a.QuickFixes(syn, nil, d); len(fixes) != 0 {
		t.Errorf("fix without the structured field: %+v", fixes)
	}
}
