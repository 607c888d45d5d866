package feature

// This file adds the file's cases to hover: a stream's or unit's values in the base and in every
// case side by side, and a case's or sweep's own description on its name.

import (
	"fmt"
	"math"
	"strings"

	"hmb/lang"
	"hmb/lang/check"
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// caseStreamRows are the stream results a hover compares across the cases.
var caseStreamRows = []string{"flow", "p", "T", "h", "x"}

// CaseHover is a small table of the object's values in the base and in every case ("" for a
// file without cases, or before its cases are solved).
func CaseHover(res *lang.Result, sol *solve.Result, cs []*cases.Result, o *check.Object) string {
	if len(cs) == 0 || res.Model == nil || o.Index < 0 {
		return ""
	}
	sub := model.Subject{Kind: model.StreamSubject, Index: o.Index}
	names := caseStreamRows
	if o.IsUnit {
		sub.Kind = model.UnitSubject
		names = nil
		for _, r := range res.Model.Results(sub) {
			names = append(names, r.Name)
		}
	}
	disp := display(res)
	var b strings.Builder
	b.WriteString("\n\n| in each case | base |")
	for _, c := range cs {
		fmt.Fprintf(&b, " %s |", mdCell(c.Case.Name))
	}
	b.WriteString("\n|---|---:|")
	for range cs {
		b.WriteString("---:|")
	}
	b.WriteString("\n")
	rows := 0
	for _, name := range names {
		spec := res.Model.Result(sub, name)
		if spec == nil {
			continue
		}
		cell := func(m *model.Model, r *solve.Result) string {
			if r == nil {
				return "not solved"
			}
			v, _, _ := r.Value(m, sub, name)
			if math.IsNaN(v) {
				return "–"
			}
			return spec.Show(disp, v)
		}
		base := cell(res.Model, sol)
		line := fmt.Sprintf("| %s | %s |", name, base)
		same := base == "–"
		for _, c := range cs {
			v := cell(c.Model, c.Res)
			same = same && v == "–"
			line += " " + mdCell(v) + " |"
		}
		if same {
			continue // a result that is known nowhere, such as a superheated stream's quality
		}
		b.WriteString(line + "\n")
		rows++
	}
	if rows == 0 {
		return ""
	}
	return b.String()
}

// caseNameHover describes a case or a sweep on its name: its label and what it states.
func caseNameHover(res *lang.Result, word string) string {
	if res.Model == nil {
		return ""
	}
	for i, d := range res.Info.Cases {
		if d.Name.Name != word || i >= len(res.Model.Cases) {
			continue
		}
		c := res.Model.Cases[i]
		var b strings.Builder
		fmt.Fprintf(&b, "**case** `%s`", c.Name)
		if c.Label != "" {
			fmt.Fprintf(&b, " %s", c.Label)
		}
		fmt.Fprintf(&b, "\n\nthe base with %d value(s) replaced, added or freed", len(c.Set))
		if len(c.Expects) > 0 {
			fmt.Fprintf(&b, " and %d expectation(s) of its own", len(c.Expects))
		}
		if c.Broken {
			b.WriteString("; not solved until the errors in it are fixed")
		}
		return b.String()
	}
	for _, sw := range res.Model.Sweeps {
		if sw.Name != word {
			continue
		}
		var b strings.Builder
		fmt.Fprintf(&b, "**sweep** `%s`", sw.Name)
		if sw.Label != "" {
			fmt.Fprintf(&b, " %s", sw.Label)
		}
		r := &cases.SweepResult{Sweep: sw, Model: res.Model}
		name, _ := r.Axis()
		fmt.Fprintf(&b, "\n\n%s from %s to %s, %d points", name, r.Show(sw.Value(0)), r.Show(sw.Value(sw.N-1)), sw.N)
		if sw.Case >= 0 && sw.Case < len(res.Model.Cases) {
			fmt.Fprintf(&b, ", in case %s", res.Model.Cases[sw.Case].Name)
		}
		b.WriteString("\n\n`hmb table --sweep " + sw.Name + "` tabulates it, `hmb plot --sweep " + sw.Name + "` draws it.")
		return b.String()
	}
	return ""
}
