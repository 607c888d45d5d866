package report

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"html"
	"io"
	"strings"
	"unicode/utf8"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Title is the heading of a file's report: its title, or else its path.
func Title(m *model.Model, path string) string {
	if m != nil && strings.TrimSpace(m.Title) != "" {
		return m.Title
	}
	if path != "" {
		return path
	}
	return "untitled calc file"
}

// basis says in one line what the numbers are in.
func basis(m *model.Model) string {
	q := newQuantities(m)
	s := fmt.Sprintf("%s units; pressures absolute", q.sys)
	if q.atm != units.StandardAtmosphere {
		pu := q.unit(units.Pressure)
		s += fmt.Sprintf(" (site atmosphere %s %s)", sig(pu.FromSI(q.atm, q.atm), 4), pu.Symbol())
	}
	tu := q.unit(units.Temperature)
	return s + fmt.Sprintf("; ambient %s %s", sig(tu.FromSI(m.AmbientOr(), q.atm), 4), tu.Symbol())
}

// WriteMarkdown writes the stream and unit tables as Markdown, padded so the text reads as a
// table too.
func WriteMarkdown(w io.Writer, in *Input) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to tabulate: the file could not be read into a model")
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "# %s\n\n", mdEscape(Title(in.Model, in.Path)))
	fmt.Fprintf(bw, "%s.\n", basis(in.Model))
	for _, t := range []Table{StreamTable(in.Model, in.Result), UnitTable(in.Model, in.Result)} {
		fmt.Fprintf(bw, "\n## %s\n\n", strings.ToUpper(t.Name[:1])+t.Name[1:])
		if len(t.Rows) == 0 {
			fmt.Fprintf(bw, "(no %s)\n", t.Name)
			continue
		}
		writeMDTable(bw, t)
		if t.Name == "units" {
			fmt.Fprintf(bw, "\n%s\n", UnitNotes)
		}
	}
	return bw.Flush()
}

func mdEscape(s string) string { return strings.ReplaceAll(s, "|", `\|`) }

func writeMDTable(w io.Writer, t Table) {
	cells := [][]string{make([]string, len(t.Cols))}
	for j, c := range t.Cols {
		cells[0][j] = mdEscape(c.Heading())
	}
	for _, r := range t.Rows {
		row := make([]string, len(t.Cols))
		for j := range row {
			if j < len(r) {
				row[j] = mdEscape(r[j])
			}
		}
		cells = append(cells, row)
	}
	width := make([]int, len(t.Cols))
	for _, r := range cells {
		for j, c := range r {
			width[j] = max(width[j], utf8.RuneCountInString(c), 3)
		}
	}
	line := func(r []string) {
		var b strings.Builder
		b.WriteString("|")
		for j, c := range r {
			pad := strings.Repeat(" ", width[j]-utf8.RuneCountInString(c))
			if t.Cols[j].Num {
				b.WriteString(" " + pad + c + " |")
			} else {
				b.WriteString(" " + c + pad + " |")
			}
		}
		fmt.Fprintln(w, b.String())
	}
	line(cells[0])
	var b strings.Builder
	b.WriteString("|")
	for j, c := range t.Cols {
		if c.Num {
			b.WriteString(" " + strings.Repeat("-", width[j]-1) + ": |")
		} else {
			b.WriteString(" :" + strings.Repeat("-", width[j]-1) + " |")
		}
	}
	fmt.Fprintln(w, b.String())
	for _, r := range cells[1:] {
		line(r)
	}
}

// WriteCSV writes the stream table, an empty line, then the unit table. Each starts with a row
// of column names and a row of units, so a spreadsheet keeps the numbers numeric; a value the
// solver did not find is an empty cell.
func WriteCSV(w io.Writer, in *Input) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to tabulate: the file could not be read into a model")
	}
	bw := bufio.NewWriter(w)
	for k, t := range []Table{StreamTable(in.Model, in.Result), UnitTable(in.Model, in.Result)} {
		if k > 0 {
			bw.WriteString("\n")
		}
		cw := csv.NewWriter(bw)
		names := make([]string, len(t.Cols))
		us := make([]string, len(t.Cols))
		for j, c := range t.Cols {
			names[j], us[j] = c.Name, c.Unit
		}
		cw.Write(names)
		cw.Write(us)
		for _, r := range t.Rows {
			row := make([]string, len(r))
			for j, c := range r {
				if c != Unsolved {
					row[j] = strings.TrimSuffix(c, FluidOnlyMark) // a spreadsheet keeps the number
				}
			}
			cw.Write(row)
		}
		cw.Flush()
		if err := cw.Error(); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// WriteHTML writes the two tables as a small standalone page (well-formed XML as well as HTML,
// so any XML parser can read it), through html/template (html.go).
func WriteHTML(w io.Writer, in *Input) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to tabulate: the file could not be read into a model")
	}
	title := Title(in.Model, in.Path)
	return htmlTmpl.ExecuteTemplate(w, "tables-page", tablesPage{Title: title, Basis: basis(in.Model), Tables: htmlTableViews(in)})
}

func esc(s string) string { return html.EscapeString(s) }

// htmlTables writes the stream and unit tables for a page being built as a string.
func htmlTables(b *strings.Builder, in *Input) {
	if err := htmlTmpl.ExecuteTemplate(b, "tables", htmlTableViews(in)); err != nil {
		fmt.Fprintf(b, "<p class=\"error\">%s</p>\n", esc(err.Error()))
	}
}

// style is the whole stylesheet: the page must need no other file.
const style = `body{font-family:"DejaVu Sans",Arial,sans-serif;font-size:11pt;color:#111;max-width:60em;margin:1.5em auto;padding:0 1em}
h1{font-size:1.6em;margin-bottom:.2em}h2{font-size:1.25em;border-bottom:1px solid #999;margin-top:1.6em}
table{border-collapse:collapse;margin:.5em 0}th,td{border:1px solid #bbb;padding:.2em .5em;vertical-align:top}
th{background:#eee;text-align:left}tr.units th{font-weight:normal;font-style:italic;background:#f6f6f6}
td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}td.unsolved{text-align:center;color:#a00}
.basis,.note,.meta{color:#444}.caution{border:2px solid #b36b00;background:#fff6e5;padding:.6em 1em;margin:1em 0}
.pass{color:#060;font-weight:bold}.fail{color:#b00;font-weight:bold}.unchecked{color:#a60;font-weight:bold}
.error{color:#b00}.warning{color:#a60}.info,.hint{color:#036}code{font-family:"DejaVu Sans Mono",monospace}
figure{margin:1em 0}figure svg{width:100%;height:auto;border:1px solid #ccc}figcaption{color:#444;font-size:.9em}
@media print{body{max-width:none;margin:0}h2{page-break-after:avoid}figure{page-break-inside:avoid}}
`

func pageHead(b *strings.Builder, title string) {
	if err := htmlTmpl.ExecuteTemplate(b, "head", title); err != nil {
		fmt.Fprintf(b, "<!-- %s -->", esc(err.Error()))
	}
}
