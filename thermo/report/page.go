package report

import (
	"crypto/sha256"
	_ "embed"
	"fmt"
	"html/template"
	"io"
	"math"
	"strconv"
	"strings"

	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Caution is the notice every page carries.
const Caution = "These results support, and do not replace, code-compliant design and review by a licensed engineer. " +
	"Local codes and standards govern."

// PageOptions tune WritePage.
type PageOptions struct {
	Version string // the program's version, for the footer
	Kinds   []Kind // property diagrams to include; nil means Ts, hs and ph
}

// Verdict is the outcome of one expectation.
type Verdict uint8

const (
	Pass       Verdict = iota
	Fail               // the solved value does not satisfy it
	NotChecked         // the value was not solved, or the expectation names nothing the solver computes
)

func (v Verdict) String() string { return [...]string{"pass", "FAIL", "not checked"}[v] }

// ExpectResult is one expectation with its solved value and verdict.
type ExpectResult struct {
	Text    string // the statement as written, or rebuilt from the model
	Value   string // the solved value in the expectation's own unit; Unsolved when not found
	Verdict Verdict
	Reason  string // the solver's message when it did not pass
}

// Expectations judges every expectation of the model. The verdict is the solver's: an
// expectation fails exactly when the solver reported it (codes HMB601 to HMB603) at its span, so the
// page and hmb check cannot disagree.
func Expectations(in *Input) []ExpectResult {
	if in == nil || in.Model == nil {
		return nil
	}
	var out []ExpectResult
	for _, ex := range in.Model.Expects {
		if ex == nil {
			continue
		}
		er := ExpectResult{Text: expectText(in, ex), Value: expectValue(in, ex), Verdict: Pass}
		if in.Result == nil {
			er.Verdict, er.Reason = NotChecked, "the file was not solved"
		}
		for _, d := range in.Diags {
			if d.Span != ex.Span || d.Case != "" { // a case's verdicts are the case's (CaseTables)
				continue
			}
			switch d.Code {
			case solve.CodeExpectFailed:
				er.Verdict, er.Reason = Fail, d.Message
			case solve.CodeExpectUnsolved, solve.CodeExpectUnknown:
				er.Verdict, er.Reason = NotChecked, d.Message
			}
		}
		out = append(out, er)
	}
	return out
}

func expectText(in *Input, ex *model.Expect) string {
	if s, e := ex.Span.Start, ex.Span.End; in.Src != nil && 0 <= s && s < e && e <= len(in.Src) {
		return strings.Join(strings.Fields(string(in.Src[s:e])), " ")
	}
	m := in.Model
	subject := "?"
	switch {
	case ex.Total:
		subject = model.TotalName
	case ex.Stream >= 0 && ex.Stream < len(m.Streams) && m.Streams[ex.Stream] != nil:
		subject = m.Streams[ex.Stream].Name
	case ex.Unit >= 0 && ex.Unit < len(m.Units) && m.Units[ex.Unit] != nil:
		subject = m.Units[ex.Unit].Name
	}
	return fmt.Sprintf("%s %s %s %s %s", subject, ex.Prop, ex.Op, sig(ex.Value, 5), ex.Spelling)
}

// expectValue writes the solved value an expectation names, in the unit the expectation was
// written in when that is a unit of the right kind.
func expectValue(in *Input, ex *model.Expect) string {
	if in.Result == nil {
		return Unsolved
	}
	sub := ex.Subject()
	v, spec, ok := in.Result.Value(in.Model, sub, ex.Prop)
	if !ok || math.IsNaN(v) {
		if ok && sub.Kind == model.StreamSubject && ex.Prop == "x" && sub.Index < len(in.Result.Streams) && in.Result.Streams[sub.Index].HasState {
			return in.Result.Streams[sub.Index].State.Phase.String()
		}
		return Unsolved
	}
	q := newQuantities(in.Model)
	u, err := units.Lookup(ex.Spelling)
	fits := err == nil && ex.Spelling != "" && (u.Measures(spec.Dim) || spec.Delta && spec.Dim == units.Temperature && u.Dim() == units.TemperatureDiff)
	switch {
	case fits && spec.Delta:
		return units.ShowDelta(u, v)
	case fits:
		return units.ShowIn(u, v, q.atm)
	case spec.Delta:
		return q.disp().Delta(spec.Dim, v)
	}
	return q.show(spec.Dim, v)
}

func (in *Input) where(sp model.Span) string {
	if in.Where == nil {
		return fmt.Sprintf("byte %d", sp.Start)
	}
	return in.Where(sp.Start)
}

// WritePage writes the whole report as one HTML page that needs no other file: styles and
// diagrams are inline, the markup well-formed XML as well as HTML, laid out to print on A4 and
// US Letter. It opens with a title block for the names of who prepared and who checked the calc,
// the caution and a summary; then the heat and material balance diagram above the stream and
// unit tables (given values marked apart from solved ones) and the plant totals,
// the property diagrams, the expectations with their verdicts, every finding, and the calc file
// itself in an appendix.
func WritePage(w io.Writer, in *Input, opt PageOptions) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to report: the file could not be read into a model")
	}
	kinds := opt.Kinds
	if kinds == nil {
		kinds = []Kind{TS, HS, PH}
	}
	v := pageView{
		Title:   Title(in.Model, in.Path),
		Sheet:   in.Model.Sheet,
		Path:    in.Path,
		Basis:   basis(in.Model),
		Caution: Caution,
		Tables:  tableViews(in),
	}
	v.Reconciliation = reconciliationViews(in)
	v.NoTotals = TotalTable(in.Model, in.Result) == nil
	if in.Src != nil {
		v.Hash = fmt.Sprintf("%x", sha256.Sum256(in.Src))
		for n, line := range sourceLines(in.Src) {
			v.Listing = append(v.Listing, listingLine{N: n + 1, Text: line})
		}
	}
	v.Summary, v.Expectations = summary(in)
	if len(v.Reconciliation) > 0 {
		v.ReconSummary = reconSummary(reconcile.Of(in.Result))
	}
	v.Flowsheet = figure(in, PlotOptions{Kind: Flowsheet, ID: "fig-flowsheet"})
	for _, k := range kinds {
		v.Diagrams = append(v.Diagrams, figure(in, PlotOptions{Kind: k, ID: "fig-" + strings.ToLower(k.String())}))
	}
	v.Diagrams = append(v.Diagrams, sweepFigures(in)...)
	for _, d := range in.Diags {
		f := findingView{Where: in.where(d.Span), Severity: d.Severity.String(), Code: d.Code, Message: d.Message}
		for _, r := range d.Related {
			f.Related = append(f.Related, findingView{Where: in.where(r.Span), Message: r.Message})
		}
		v.Findings = append(v.Findings, f)
	}
	v.Footer = "Generated by hmb"
	if opt.Version != "" {
		v.Footer += " " + opt.Version
	}
	v.Footer += ". Water and steam properties: IAPWS-IF97."
	return pageTemplates.ExecuteTemplate(w, "page", v)
}

// sourceLines splits a file into its lines where the notation ends them, at \n, \r\n and a lone
// \r, so that the appendix numbers lines as the findings do; a final line break opens no line.
func sourceLines(src []byte) []string {
	var out []string
	start := 0
	for i := 0; i < len(src); i++ {
		switch src[i] {
		case '\n':
			out = append(out, string(src[start:i]))
			start = i + 1
		case '\r':
			out = append(out, string(src[start:i]))
			if i+1 < len(src) && src[i+1] == '\n' {
				i++
			}
			start = i + 1
		}
	}
	if start < len(src) {
		out = append(out, string(src[start:]))
	}
	return out
}

//go:embed page.tmpl
var pageTemplateText string

var pageTemplates = template.Must(template.New("page.tmpl").Parse(pageTemplateText))

// pageView is everything the page template shows, already written out.
type pageView struct {
	Title, Path, Hash, Basis, Caution, Footer string
	Sheet                                     model.Sheet
	Summary                                   []summaryItem
	Flowsheet                                 figureView
	Tables                                    []tableView
	Reconciliation                            []tableView
	ReconSummary                              string
	NoTotals                                  bool
	Diagrams                                  []figureView
	Expectations                              []expectView
	Findings                                  []findingView
	Listing                                   []listingLine
}

type summaryItem struct{ Class, Text string }

type figureView struct {
	Name, Caption, Err string
	SVG                template.HTML // drawn by this package, every text escaped
}

type tableView struct {
	Name, Heading, Note string
	Cols                []Column
	Rows                [][]cellView
}

type cellView struct{ Text, Class, Title string }

type expectView struct {
	ExpectResult
	Class string
}

type findingView struct {
	Where, Severity, Code, Message string
	Related                        []findingView
}

type listingLine struct {
	N    int
	Text string
}

// reconSummary says in a sentence how the measurements fit the balances: the global test.
func reconSummary(rec *reconcile.Result) string {
	n := len(rec.Measurements)
	switch {
	case !rec.Reconciled:
		return fmt.Sprintf("%d measurement(s) could not be reconciled (the findings say why); the values shown are the solver's.", n)
	case rec.Redundancy == 0:
		return fmt.Sprintf("%d measurement(s), none redundant: the balances cannot test them, and they are taken as read.", n)
	}
	verdict := "the measurements agree with the balances within their uncertainties"
	if !rec.Passed {
		verdict = "the measurements do not agree with the balances within their uncertainties: look for the suspect meters below"
	}
	return fmt.Sprintf("%d measurement(s), %d redundant. Global test: chi-square %s against %s at 95 %% with %d degree(s) of freedom; %s.",
		n, rec.Redundancy, strconv.FormatFloat(rec.Chi2, 'f', 2, 64), strconv.FormatFloat(rec.Chi2Limit, 'f', 2, 64), rec.Redundancy, verdict)
}

// figure draws one diagram for the page, or says why it could not.
func figure(in *Input, opt PlotOptions) figureView {
	f := figureView{Name: opt.Kind.String(), Caption: figCaption(opt.Kind)}
	svg, err := PlotString(in, opt)
	if err != nil {
		f.Err = err.Error()
		return f
	}
	f.SVG = template.HTML(svg)
	return f
}

// summary counts the findings and judges the expectations.
func summary(in *Input) ([]summaryItem, []expectView) {
	var nerr, nwarn, nother int
	for _, d := range in.Diags {
		switch d.Severity {
		case model.Error:
			nerr++
		case model.Warning:
			nwarn++
		default:
			nother++
		}
	}
	var exps []expectView
	npass := 0
	for _, e := range Expectations(in) {
		if e.Verdict == Pass {
			npass++
		}
		exps = append(exps, expectView{ExpectResult: e, Class: map[Verdict]string{Pass: "pass", Fail: "fail", NotChecked: "unchecked"}[e.Verdict]})
	}
	var out []summaryItem
	switch {
	case in.Result == nil:
		out = append(out, summaryItem{"fail", "The balance was not solved."})
	case nerr > 0:
		out = append(out, summaryItem{"fail", fmt.Sprintf("%d error(s): the balance is not fit for sign-off until they are resolved.", nerr)})
	default:
		out = append(out, summaryItem{"pass", "No errors."})
	}
	out = append(out, summaryItem{"", fmt.Sprintf("%d warning(s), %d note(s).", nwarn, nother)})
	unsolved := 0
	for i := range in.Model.Streams {
		if in.Result == nil || i >= len(in.Result.Streams) || !in.Result.Streams[i].Solved {
			unsolved++
		}
	}
	out = append(out, summaryItem{"", fmt.Sprintf("%d of %d stream(s) fully solved.", len(in.Model.Streams)-unsolved, len(in.Model.Streams))})
	if len(exps) > 0 {
		out = append(out, summaryItem{"", fmt.Sprintf("%d of %d expectation(s) hold.", npass, len(exps))})
	}
	return out, exps
}

// tableViews writes the stream and unit tables for the page: units with degree signs, given
// values marked, every value titled with where it came from.
func tableViews(in *Input) []tableView {
	var out []tableView
	for _, t := range append(Tables(in.Model, in.Result), studyTables(in)...) {
		if reconciliationTable(t) {
			continue // a section of its own
		}
		v := viewOf(t)
		v.Note = Notes(t)
		if t.Name == "totals" {
			v.Heading = "Plant totals"
		}
		if h := caseHeading(t.Name); h != "" {
			v.Heading, v.Note = h, caseNote(t.Name)
		}
		out = append(out, v)
	}
	return out
}

// viewOf writes a table for the page.
func viewOf(t Table) tableView {
	v := tableView{Name: t.Name, Heading: strings.ToUpper(t.Name[:1]) + t.Name[1:]}
	for _, c := range t.Cols {
		if c.Unit == "C" || c.Unit == "F" {
			c.Unit = "°" + c.Unit
		}
		v.Cols = append(v.Cols, c)
	}
	for i, r := range t.Rows {
		row := make([]cellView, len(r))
		for j, c := range r {
			cell := cellView{Text: c}
			switch {
			case c == Unsolved:
				cell.Class = "unsolved"
			case j < len(t.Cols) && t.Cols[j].Num:
				cell.Class = "num"
			}
			if i < len(t.Given) && j < len(t.Given[i]) && t.Given[i][j] {
				cell.Class += " given"
			}
			if i < len(t.Source) && j < len(t.Source[i]) && c != "" && c != Unsolved {
				cell.Title = t.Source[i][j]
			}
			row[j] = cell
		}
		v.Rows = append(v.Rows, row)
	}
	return v
}

func figCaption(k Kind) string {
	switch k {
	case TS:
		return "Temperature-entropy diagram: saturation line, isobars through the streams' pressures, each unit as a coloured line between its streams; dashed: isentropic expansion or compression at the outlet pressure."
	case HS:
		return "Enthalpy-entropy diagram: the vertical drop of a dashed line is the isentropic enthalpy change a turbine or pump is measured against."
	case Flowsheet:
		return "Heat and material balance diagram: each unit an equipment symbol, each stream an arrow tagged with its name (its values are in the stream table); blue water, purple wet steam, red steam; small circles mark the battery limits."
	}
	return "Pressure-enthalpy diagram (pressure by decades): isotherms through the streams' temperatures."
}
