package report

import (
	"html/template"
	"strings"
)

// The HTML hmb writes, as html/template templates: every value is escaped by the template
// package for the place it stands in. "head" opens a self-contained page (its stylesheet inline),
// "tables" writes the stream and unit tables, "tables-page" is hmb table --format html.
var htmlTmpl = template.Must(template.New("report").Funcs(template.FuncMap{
	"css": func() template.CSS { return template.CSS(style) },
}).Parse(`{{define "head"}}<!DOCTYPE html>
<html xmlns="http://www.w3.org/1999/xhtml" lang="en">
<head>
<meta charset="utf-8"/>
<title>{{.}}</title>
<style>
{{css}}</style>
</head>
<body>
{{end}}{{define "table"}}<table class="{{.Name}}">
<thead>
<tr>{{range .Cols}}<th>{{.Name}}</th>{{end}}</tr>
<tr class="units">{{range .Cols}}<th>{{.Unit}}</th>{{end}}</tr>
</thead>
<tbody>
{{range .Rows}}<tr>{{range .}}<td{{with .Class}} class="{{.}}"{{end}}>{{.Text}}</td>{{end}}</tr>
{{end}}</tbody>
</table>
{{end}}{{define "tables"}}{{range .}}<h2>{{.Heading}}</h2>
{{if not .Rows}}<p>No {{.Name}}.</p>
{{else}}{{template "table" .}}{{with .Note}}<p class="note">{{.}}</p>
{{end}}{{end}}{{end}}{{end}}{{define "tables-page"}}{{template "head" .Title}}<h1>{{.Title}}</h1>
<p class="basis">{{.Basis}}.</p>
{{template "tables" .Tables}}</body>
</html>
{{end}}`))

// tablesPage is what "tables-page" shows.
type tablesPage struct {
	Title, Basis string
	Tables       []htmlTable
}

// htmlTable is a Table as the "table" template shows it: every cell with its class.
type htmlTable struct {
	Name, Heading, Note string
	Cols                []Column
	Rows                [][]htmlCell
}

type htmlCell struct{ Text, Class string }

func htmlTableViews(in *Input) []htmlTable {
	var out []htmlTable
	for _, t := range []Table{StreamTable(in.Model, in.Result), UnitTable(in.Model, in.Result)} {
		v := htmlTable{Name: t.Name, Heading: strings.ToUpper(t.Name[:1]) + t.Name[1:], Cols: t.Cols}
		if t.Name == "units" {
			v.Note = UnitNotes
		}
		for _, r := range t.Rows {
			row := make([]htmlCell, len(r))
			for j, c := range r {
				row[j].Text = c
				switch {
				case c == Unsolved:
					row[j].Class = "unsolved"
				case j < len(t.Cols) && t.Cols[j].Num:
					row[j].Class = "num"
				}
			}
			v.Rows = append(v.Rows, row)
		}
		out = append(out, v)
	}
	return out
}
