package feature

// This file implements the hover of an expectation's subject total: the whole file's totals
// (power out and in, net power, heat in and out, efficiency, heat rate), as the tables show them.

import (
	"fmt"
	"math"
	"strings"

	"hmb/lang"
	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// isTotalAt reports whether off starts the subject total of an expectation.
func isTotalAt(res *lang.Result, off int) bool {
	if res == nil || res.File == nil {
		return false
	}
	for _, s := range res.File.Stmts {
		if e, ok := s.(*ast.Expect); ok && e.Target != nil && e.Target.Pos() == off {
			return lang.IsTotal(res, e.Target)
		}
	}
	return false
}

// TotalsHover is the Markdown table of the file's totals; sol may be nil (not solved).
func TotalsHover(res *lang.Result, sol *solve.Result) string {
	var b strings.Builder
	b.WriteString("**total**: the whole file's shaft powers and heat duties")
	if sol == nil || res.Model == nil {
		b.WriteString("\n\nnot solved")
		return b.String()
	}
	disp := display(res)
	b.WriteString("\n\n| total | value |\n|---|---:|\n")
	for i := range model.TotalResults {
		r := &model.TotalResults[i]
		v, _, _ := sol.Value(res.Model, model.Subject{Kind: model.TotalSubject}, r.Name)
		val := show(disp, r, v)
		if math.IsNaN(v) {
			val = "none"
		}
		fmt.Fprintf(&b, "| %s | %s |\n", r.Name, val)
	}
	b.WriteString("\nTurbines make power out, pumps take power in; boilers and heaters add heat, coolers remove it; " +
		"an exchanger counts when one side comes from outside the file. No efficiency or heat rate without net power.")
	return b.String()
}
