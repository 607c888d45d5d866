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

// basisTable carries what basis says that a spreadsheet needs as a number: the ambient
// temperature the entropy generation was computed with.
func basisTable(m *model.Model) Table {
	q := newQuantities(m)
	tu := q.unit(units.Temperature)
	return Table{Name: "basis", Cols: []Column{{Name: "ambient", Unit: tu.Symbol(), Num: true}},
		Rows: [][]string{{sig(tu.FromSI(m.AmbientOr(), q.atm), 5)}}}
}

// basis says in one line what the numbers are in.
func basis(m *model.Model) string {
	q := newQuantities(m)
	pu := q.unit(units.Pressure)
	reading := "absolute"
	if pu.Gauge() {
		reading = "gauge"
		pu = pu.DeltaUnit()
	}
	s := fmt.Sprintf("%s units; pressures %s", q.sys, reading)
	if q.atm != units.StandardAtmosphere || reading == "gauge" {
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
	for _, t := range Tables(in.Model, in.Result) {
		fmt.Fprintf(bw, "\n## %s\n\n", strings.ToUpper(t.Name[:1])+t.Name[1:])
		if len(t.Rows) == 0 {
			fmt.Fprintf(bw, "(no %s)\n", t.Name)
			continue
		}
		writeMDTable(bw, t)
		if n := Notes(t); n != "" {
			fmt.Fprintf(bw, "\n%s\n", n)
		}
	}
	writeCasesMD(bw, in)
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
	for k, t := range append(append(Tables(in.Model, in.Result), basisTable(in.Model)), CaseTables(in)...) {
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
// so any XML parser can read it), in the report's style.
func WriteHTML(w io.Writer, in *Input) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to tabulate: the file could not be read into a model")
	}
	return pageTemplates.ExecuteTemplate(w, "tablepage", struct {
		Title, Basis string
		Tables       []tableView
	}{Title(in.Model, in.Path), basis(in.Model), append(tableViews(in), reconciliationViews(in)...)})
}

func esc(s string) string { return html.EscapeString(s) }
