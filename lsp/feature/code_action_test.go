package feature

import (
	"testing"

	"hmb/lang"
	"hmb/lang/check"
	"hmb/thermo/model"
)

// The fix that declares a stream keys on the diagnostic's code and its Undeclared field, never
// on its wording: a reworded message still gets it, and one without the field does not.
func TestDeclareFixKeysOnData(t *testing.T) {
	src := "stream A { p 1 bar }\nvalve V { in A; out S9 }\n"
	res := lang.Check("t.hmb", []byte(src))
	var d model.Diagnostic
	for _, x := range res.Diags {
		if x.Code == check.CodeUndefined {
			d = x
		}
	}
	if d.Undeclared != "S9" {
		t.Fatalf("HMB201 without Undeclared: %+v", d)
	}
	d.Message = "reworded: the name is unknown"
	fixes := QuickFixes(res, d)
	if len(fixes) != 1 || fixes[0].Title != "Declare stream S9" || fixes[0].Edits[0].NewText != "stream S9\n" || fixes[0].Edits[0].Span.Start != 21 {
		t.Errorf("fixes %+v", fixes)
	}
	d.Undeclared = ""
	d.Message = "stream S9 is not declared (declare it with: stream S9)"
	if fixes := QuickFixes(res, d); len(fixes) != 0 {
		t.Errorf("fix without the structured field: %+v", fixes)
	}
}

// The fixes for an under-specified system read its Specify list.
func TestSpecifyFixes(t *testing.T) {
	src := "stream A { p 1 bar }\nstream B\n"
	res := lang.Check("t.hmb", []byte(src))
	d := model.Diagnostic{Code: "HMB501", Message: "anything", Specify: []model.Spec{{Name: "A", Prop: "T"}, {Name: "B", Prop: "p"}}}
	fixes := QuickFixes(res, d)
	if len(fixes) != 2 || fixes[0].Edits[0].NewText != "; T " || fixes[1].Edits[0].NewText != " { p }" {
		t.Errorf("fixes %+v", fixes)
	}
}
