package report

import (
	"fmt"
	"io"
	"math"
	"strings"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Caution is the notice every page carries.
const Caution = "These results support, and do not replace, code-compliant design and review by a licensed engineer. " +
	"Local codes and standards govern."

// PageOptions tune WritePage.
type PageOptions struct {
	Version string // the program's version, for the footer
	Kinds   []Kind // diagrams to include; nil means Ts and hs
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
			if d.Span != ex.Span {
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
	if u, err := units.Lookup(ex.Spelling); err == nil && ex.Spelling != "" && u.Measures(spec.Dim) {
		return units.ShowIn(u, v, q.atm)
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
// diagrams are inline. The markup is also well-formed XML.
func WritePage(w io.Writer, in *Input, opt PageOptions) error {
	if in == nil || in.Model == nil {
		return fmt.Errorf("nothing to report: the file could not be read into a model")
	}
	kinds := opt.Kinds
	if kinds == nil {
		kinds = []Kind{TS, HS}
	}
	var b strings.Builder
	title := Title(in.Model, in.Path)
	pageHead(&b, title)
	fmt.Fprintf(&b, "<h1>%s</h1>\n", esc(title))
	meta := []string{}
	if in.Path != "" {
		meta = append(meta, "calc file <code>"+esc(in.Path)+"</code>")
	}
	meta = append(meta, esc(basis(in.Model)))
	fmt.Fprintf(&b, "<p class=\"meta\">%s.</p>\n", strings.Join(meta, "; "))
	fmt.Fprintf(&b, "<div class=\"caution\"><strong>Caution.</strong> %s</div>\n", esc(Caution))

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
	exps := Expectations(in)
	npass := 0
	for _, e := range exps {
		if e.Verdict == Pass {
			npass++
		}
	}
	b.WriteString("<h2>Summary</h2>\n<ul class=\"summary\">\n")
	switch {
	case in.Result == nil:
		b.WriteString("<li class=\"fail\">The balance was not solved.</li>\n")
	case nerr > 0:
		fmt.Fprintf(&b, "<li class=\"fail\">%d error(s): the balance is not fit for sign-off until they are resolved.</li>\n", nerr)
	default:
		b.WriteString("<li class=\"pass\">No errors.</li>\n")
	}
	fmt.Fprintf(&b, "<li>%d warning(s), %d note(s).</li>\n", nwarn, nother)
	unsolved := 0
	for i := range in.Model.Streams {
		if in.Result == nil || i >= len(in.Result.Streams) || !in.Result.Streams[i].Solved {
			unsolved++
		}
	}
	fmt.Fprintf(&b, "<li>%d of %d stream(s) fully solved.</li>\n", len(in.Model.Streams)-unsolved, len(in.Model.Streams))
	if len(exps) > 0 {
		fmt.Fprintf(&b, "<li>%d of %d expectation(s) hold.</li>\n", npass, len(exps))
	}
	b.WriteString("</ul>\n")

	htmlTables(&b, in)

	b.WriteString("<h2>Diagrams</h2>\n")
	for _, k := range kinds {
		svg, err := PlotString(in, PlotOptions{Kind: k, ID: "fig-" + strings.ToLower(k.String())})
		if err != nil {
			fmt.Fprintf(&b, "<p class=\"error\">%s diagram: %s</p>\n", esc(k.String()), esc(err.Error()))
			continue
		}
		fmt.Fprintf(&b, "<figure>\n%s<figcaption>%s</figcaption>\n</figure>\n", svg, esc(figCaption(k)))
	}

	b.WriteString("<h2>Expectations</h2>\n")
	if len(exps) == 0 {
		b.WriteString("<p>The file states no expectations.</p>\n")
	} else {
		b.WriteString("<table class=\"expectations\">\n<thead><tr><th>expectation</th><th>solved value</th><th>result</th></tr></thead>\n<tbody>\n")
		for _, e := range exps {
			class := map[Verdict]string{Pass: "pass", Fail: "fail", NotChecked: "unchecked"}[e.Verdict]
			res := esc(e.Verdict.String())
			if e.Reason != "" {
				res += "<br/>" + esc(e.Reason)
			}
			fmt.Fprintf(&b, "<tr><td><code>%s</code></td><td class=\"num\">%s</td><td class=\"%s\">%s</td></tr>\n", esc(e.Text), esc(e.Value), class, res)
		}
		b.WriteString("</tbody>\n</table>\n")
	}

	b.WriteString("<h2>Findings</h2>\n")
	if len(in.Diags) == 0 {
		b.WriteString("<p>The checker reported nothing.</p>\n")
	} else {
		b.WriteString("<table class=\"findings\">\n<thead><tr><th>where</th><th>severity</th><th>code</th><th>message</th></tr></thead>\n<tbody>\n")
		for _, d := range in.Diags {
			sev := d.Severity.String()
			fmt.Fprintf(&b, "<tr><td>%s</td><td class=\"%s\">%s</td><td><code>%s</code></td><td>%s", esc(in.where(d.Span)), esc(sev), esc(sev), esc(d.Code), esc(d.Message))
			if len(d.Related) > 0 {
				b.WriteString("<ul>")
				for _, r := range d.Related {
					fmt.Fprintf(&b, "<li>%s: %s</li>", esc(in.where(r.Span)), esc(r.Message))
				}
				b.WriteString("</ul>")
			}
			b.WriteString("</td></tr>\n")
		}
		b.WriteString("</tbody>\n</table>\n")
	}
	foot := "Generated by hmb"
	if opt.Version != "" {
		foot += " " + opt.Version
	}
	fmt.Fprintf(&b, "<p class=\"meta\">%s. Water and steam properties: IAPWS-IF97.</p>\n</body>\n</html>\n", esc(foot))
	_, err := io.WriteString(w, b.String())
	return err
}

func figCaption(k Kind) string {
	switch k {
	case TS:
		return "Temperature-entropy diagram: saturation line, isobars through the streams' pressures, each unit as a coloured line between its streams; dashed: isentropic expansion or compression at the outlet pressure."
	case HS:
		return "Enthalpy-entropy diagram: the vertical drop of a dashed line is the isentropic enthalpy change a turbine or pump is measured against."
	}
	return "Pressure-enthalpy diagram (pressure by decades): isotherms through the streams' temperatures."
}
