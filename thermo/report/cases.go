package report

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"html/template"
	"io"
	"math"
	"strings"

	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// caseStreamResults and caseUnitResults are the results the side-by-side table compares.
var (
	caseStreamResults = []string{"flow", "p", "T", "h", "s", "x"}
	caseUnitResults   = []string{"duty", "power", "efficiency", "fuel", "sgen"}
)

// CaseTables puts the file's cases beside its base: the values that differ in any case (as
// written out), one column per case, then the verdict of every expectation in each. None when
// the file has no cases.
func CaseTables(in *Input) []Table {
	if in == nil || in.Model == nil || len(in.Cases) == 0 {
		return nil
	}
	return []Table{CaseTable(in.Model, in.Result, in.Cases), caseExpectTable(in)}
}

// studyTables are the tables of the cases and sweeps: the side-by-side tables, then a table per
// sweep that was run.
func studyTables(in *Input) []Table {
	out := CaseTables(in)
	for _, r := range in.Sweeps {
		if len(r.Points) > 0 {
			out = append(out, SweepTable(r))
		}
	}
	return out
}

// sweepFigures draws each sweep for the page.
func sweepFigures(in *Input) []figureView {
	var out []figureView
	for _, r := range in.Sweeps {
		f := figureView{Name: "sweep-" + r.Sweep.Name, Caption: "Sweep " + r.Sweep.Name + ": its results against the swept value; a red cross marks a point that did not solve."}
		var b strings.Builder
		if err := SweepPlot(&b, r, nil); err != nil {
			f.Err = err.Error()
		} else {
			f.SVG = template.HTML(b.String())
		}
		out = append(out, f)
	}
	return out
}

// CaseNote explains the side-by-side tables.
const CaseNote = "Each case is the base with the values its block states replaced, added or freed. " +
	"Only the quantities that differ between the base and a case are listed; n/a: not solved in that case."

// CaseTable is one row per stream or unit result whose value, as written out, differs between
// the base and any case, with the base's value and each case's beside it.
func CaseTable(m *model.Model, base *solve.Result, cs []*cases.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "cases", Cols: []Column{{Name: "name"}, {Name: "result"}, {Name: "unit"}, {Name: "base", Num: true}}}
	for _, c := range cs {
		t.Cols = append(t.Cols, Column{Name: c.Case.Name, Num: true})
	}
	add := func(name string, sub model.Subject, result string) {
		cell := func(mm *model.Model, r *solve.Result) (string, string) {
			v, spec, ok := r.Value(mm, sub, result)
			if !ok {
				return "", ""
			}
			unit := q.unit(spec.Dim).Symbol()
			switch {
			case r == nil:
				return Unsolved, unit
			case math.IsNaN(v) && result == "x" && sub.Index < len(r.Streams) && r.Streams[sub.Index].HasState:
				return "", unit // single phase
			}
			return q.cell(spec.Dim, v), unit
		}
		b, unit := cell(m, base)
		if unit == "" && b == "" {
			return
		}
		row := []string{name, result, unit, b}
		differ := false
		for _, c := range cs {
			v, _ := cell(c.Model, c.Res)
			differ = differ || v != b
			row = append(row, v)
		}
		if differ {
			t.Rows = append(t.Rows, row)
		}
	}
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		for _, r := range caseStreamResults {
			add(s.Name, model.Subject{Kind: model.StreamSubject, Index: i}, r)
		}
	}
	for i, u := range m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		for _, r := range caseUnitResults {
			if u.Kind.Result(r) != nil {
				add(u.Name, model.Subject{Kind: model.UnitSubject, Index: i}, r)
			}
		}
	}
	return t
}

// caseExpectTable is one row per expectation of the base or of any case: its verdict in the base
// and in each case ("" where the expectation is another case's own).
func caseExpectTable(in *Input) Table {
	t := Table{Name: "case expectations", Cols: []Column{{Name: "expectation"}, {Name: "base"}}}
	for _, c := range in.Cases {
		t.Cols = append(t.Cols, Column{Name: c.Case.Name})
	}
	type row struct {
		text  string
		cells []string
	}
	var rows []*row
	byText := map[string]*row{}
	put := func(col int, ers []ExpectResult) {
		for _, e := range ers {
			r := byText[e.Text]
			if r == nil {
				r = &row{text: e.Text, cells: make([]string, len(t.Cols)-1)}
				byText[e.Text] = r
				rows = append(rows, r)
			}
			r.cells[col] = e.Verdict.String()
		}
	}
	put(0, Expectations(in))
	for k, c := range in.Cases {
		ci := &Input{Src: in.Src, Model: c.Model, Result: c.Res, Diags: unmarked(c.Diags)}
		if c.Res == nil {
			for _, ex := range c.Model.Expects {
				ers := []ExpectResult{{Text: expectText(ci, ex), Verdict: NotChecked}}
				put(k+1, ers)
			}
			continue
		}
		put(k+1, Expectations(ci))
	}
	for _, r := range rows {
		t.Rows = append(t.Rows, append([]string{r.text}, r.cells...))
	}
	return t
}

// unmarked strips the case's mark from its diagnostics, to judge the case's model on its own.
func unmarked(diags []model.Diagnostic) []model.Diagnostic {
	out := make([]model.Diagnostic, len(diags))
	for i, d := range diags {
		d.Message = strings.TrimPrefix(d.Message, cases.Prefix(d.Case))
		d.Case = "" // read as the findings of the case's own model
		out[i] = d
	}
	return out
}

// caseHeading is the heading of a side-by-side table, "" for another table.
func caseHeading(name string) string {
	switch name {
	case "cases":
		return "Cases side by side"
	case "case expectations":
		return "Expectations in each case"
	}
	return ""
}

// caseNote is the footnote of a side-by-side table.
func caseNote(name string) string {
	if name == "cases" {
		return CaseNote
	}
	return ""
}

// writeCasesMD writes the side-by-side tables as Markdown sections.
func writeCasesMD(w io.Writer, in *Input) {
	for _, t := range CaseTables(in) {
		fmt.Fprintf(w, "\n## %s\n\n", caseHeading(t.Name))
		if len(t.Rows) == 0 {
			fmt.Fprintf(w, "(no differences)\n")
			continue
		}
		writeMDTable(w, t)
		if n := caseNote(t.Name); n != "" {
			fmt.Fprintf(w, "\n%s\n", n)
		}
	}
}

// SweepTable is one row per point of a sweep: the swept value, then the recorded results, then
// for a point that did not solve its reason. Without a show list, only the results that change
// along the sweep are columns.
func SweepTable(r *cases.SweepResult) Table {
	q := newQuantities(r.Model)
	name, u := r.Axis()
	t := Table{Name: "sweep " + r.Sweep.Name, Cols: []Column{{Name: name, Unit: u.Symbol(), Num: true}}}
	cols := make([][]string, len(r.Refs))
	keep := make([]bool, len(r.Refs))
	for k, ref := range r.Refs {
		spec := r.Model.Result(ref.Subject, ref.Name)
		if spec == nil {
			continue
		}
		cols[k] = make([]string, len(r.Points))
		for i, p := range r.Points {
			switch v := p.Values[k]; {
			case p.Failed:
				cols[k][i] = Unsolved
			case math.IsNaN(v) && ref.Name == "x":
				cols[k][i] = "" // single phase, or unsolved
			default:
				cols[k][i] = q.cell(spec.Dim, v)
			}
			keep[k] = keep[k] || len(r.Sweep.Show) > 0 || cols[k][i] != cols[k][0]
		}
		if keep[k] {
			t.Cols = append(t.Cols, Column{Name: cases.RefName(r.Model, ref), Unit: q.unit(spec.Dim).Symbol(), Num: true})
		}
	}
	failed := false
	for _, p := range r.Points {
		failed = failed || p.Failed
	}
	if failed {
		t.Cols = append(t.Cols, Column{Name: "not solved"})
	}
	for i, p := range r.Points {
		row := []string{r.Number(p.Value)}
		for k := range r.Refs {
			if keep[k] {
				row = append(row, cols[k][i])
			}
		}
		if failed {
			why := ""
			if p.Failed {
				why = p.Code + ": " + p.Reason
			}
			row = append(row, why)
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// WriteSweepMarkdown writes a sweep's table as Markdown.
func WriteSweepMarkdown(w io.Writer, r *cases.SweepResult) error {
	bw := bufio.NewWriter(w)
	title := "Sweep " + r.Sweep.Name
	if r.Sweep.Label != "" {
		title += ": " + r.Sweep.Label
	}
	fmt.Fprintf(bw, "# %s\n\n%s.\n\n", mdEscape(title), basis(r.Model))
	if len(r.Points) == 0 {
		for _, d := range r.Diags {
			fmt.Fprintf(bw, "%s\n", mdEscape(d.Message))
		}
		return bw.Flush()
	}
	writeMDTable(bw, SweepTable(r))
	for _, d := range r.Diags {
		fmt.Fprintf(bw, "\n%s (%s)\n", mdEscape(d.Message), d.Code)
	}
	return bw.Flush()
}

// WriteSweepCSV writes a sweep's table as CSV: a row of column names, a row of units, then one
// row per point; a value not solved is an empty cell.
func WriteSweepCSV(w io.Writer, r *cases.SweepResult) error {
	t := SweepTable(r)
	cw := csv.NewWriter(w)
	names := make([]string, len(t.Cols))
	us := make([]string, len(t.Cols))
	for j, c := range t.Cols {
		names[j], us[j] = c.Name, c.Unit
	}
	cw.Write(names)
	cw.Write(us)
	for _, row := range t.Rows {
		out := make([]string, len(row))
		for j, c := range row {
			if c != Unsolved {
				out[j] = c
			}
		}
		cw.Write(out)
	}
	cw.Flush()
	return cw.Error()
}
