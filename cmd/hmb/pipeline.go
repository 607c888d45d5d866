package main

import (
	"bytes"
	"context"
	"math"
	"slices"
	"strings"
	"unicode/utf8"

	"hmb/lang"
	"hmb/lang/format"
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/report"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// jsonStream is one solved stream in SI base units: kg/s, Pa, K, J/kg, J/(kg K), m3/kg, kg/m3,
// m3/s; x is null when the state is single phase or unknown, Tsat above the critical pressure,
// superheat unless vapour, subcooling unless liquid. Given lists the properties the file gave
// (vol_flow for a flow given in volume units); the rest were solved.
type jsonStream struct {
	Name       string   `json:"name"`
	Label      string   `json:"label,omitempty"`
	M          jsonNum  `json:"m"`
	P          jsonNum  `json:"p"`
	T          jsonNum  `json:"T"`
	H          jsonNum  `json:"h"`
	S          jsonNum  `json:"s"`
	X          jsonNum  `json:"x"`
	Phase      string   `json:"phase"`
	Tsat       jsonNum  `json:"Tsat"`
	Superheat  jsonNum  `json:"superheat"`
	Subcooling jsonNum  `json:"subcooling"`
	V          jsonNum  `json:"v"`
	Rho        jsonNum  `json:"rho"`
	VolFlow    jsonNum  `json:"vol_flow"`
	Given      []string `json:"given"`
	// U holds the 95 % half-widths of the values above, from the file's measurements (0 for a
	// value that follows from exact givens alone).
	U jsonStreamU `json:"u"`
}

type jsonStreamU struct {
	M jsonNum `json:"m"`
	P jsonNum `json:"p"`
	T jsonNum `json:"T"`
	H jsonNum `json:"h"`
	S jsonNum `json:"s"`
	X jsonNum `json:"x"`
}

// jsonUnit is one unit's balance in SI base units: W, W/K, Pa, K. A result the unit's kind does
// not have is null: dp for an exchanger (dp_hot and dp_cold instead), efficiency for a valve.
type jsonUnit struct {
	Name string  `json:"name"`
	Kind string  `json:"kind"`
	Q    jsonNum `json:"Q"`
	W    jsonNum `json:"W"`
	Sgen jsonNum `json:"S_gen"`
	// SgenFluidOnly: a duty crosses the unit's boundary at no stated T_boundary, so S_gen counts
	// only what happens inside the fluid (see solve.UnitResult.SgenFluidOnly).
	SgenFluidOnly bool      `json:"S_gen_fluid_only,omitempty"`
	U             jsonUnitU `json:"u"` // 95 % half-widths
	Dp            jsonNum   `json:"dp"`
	DpHot         jsonNum   `json:"dp_hot"`
	DpCold        jsonNum   `json:"dp_cold"`
	Efficiency    jsonNum   `json:"efficiency"`
	Fuel          jsonNum   `json:"fuel"`
	DTMin         jsonNum   `json:"dT_min"`
	LMTD          jsonNum   `json:"lmtd"`
	UA            jsonNum   `json:"UA"`
	// Ports are the stream names by role, in the order the file lists them.
	Ports map[string][]string `json:"ports"`
}

type jsonUnitU struct {
	Q    jsonNum `json:"Q"`
	W    jsonNum `json:"W"`
	Sgen jsonNum `json:"S_gen"`
}

// jsonRecon is the reconciliation of a file's measurements, SI base units.
type jsonRecon struct {
	Redundancy   int               `json:"redundancy"`
	Chi2         jsonNum           `json:"chi2"`
	Chi2Limit    jsonNum           `json:"chi2_limit"` // null when nothing is redundant
	Passed       bool              `json:"passed"`
	Measurements []jsonMeasurement `json:"measurements"`
}

type jsonMeasurement struct {
	Name        string  `json:"name"`
	Property    string  `json:"property"`
	Measured    jsonNum `json:"measured"`
	Reconciled  jsonNum `json:"reconciled"`
	UMeasured   jsonNum `json:"u_measured"`
	UReconciled jsonNum `json:"u_reconciled"`
	Test        jsonNum `json:"test"` // null when no balance checks the measurement
	Suspect     bool    `json:"suspect"`
}

// jsonTotals are the whole file's totals (model.TotalResults) in SI base units: W, and
// efficiency and heat_rate as ratios (heat_rate J/J; 1 J/J is 3600 kJ/kWh).
type jsonTotals struct {
	PowerOut   jsonNum `json:"power_out"`
	PowerIn    jsonNum `json:"power_in"`
	NetPower   jsonNum `json:"net_power"`
	HeatIn     jsonNum `json:"heat_in"`
	HeatOut    jsonNum `json:"heat_out"`
	Efficiency jsonNum `json:"efficiency"`
	HeatRate   jsonNum `json:"heat_rate"`
}

// jsonExpect is one expectation and its verdict, values in SI base units. Tolerance is the
// one an equality was judged with (written, or the file's relative tolerance); null for a
// comparison. Solved is null when the value could not be checked.
type jsonExpect struct {
	Subject   string  `json:"subject"`
	Property  string  `json:"property"`
	Operator  string  `json:"operator"`
	Value     jsonNum `json:"value"`
	Tolerance jsonNum `json:"tolerance"`
	Solved    jsonNum `json:"solved"`
	Passed    bool    `json:"passed"`
}

// checked is one file after the whole check: notation, then the solver.
type checked struct {
	lang  *lang.Result
	model *model.Model // nil when nothing could be lowered
	res   *solve.Result
	rec   *reconcile.Result
	cases []*cases.Result // the file's cases, solved
	diags []model.Diagnostic
}

// checkModel runs the same check the language server runs: parse and check the notation, then
// solve what could be lowered. display, when not nil, overrides the file's display system.
func checkModel(ctx context.Context, path string, src []byte, display *units.System) *checked {
	lr := lang.Check(path, src)
	c := &checked{lang: lr, model: lr.Model, diags: slices.Clone(lr.Diags)}
	if lr.Model == nil {
		return c
	}
	if display != nil {
		lr.Model.SetSystem(*display)
	}
	c.res, c.rec = reconcile.Solve(ctx, lr.Model, solve.Options{})
	c.diags = append(c.diags, c.res.Diags...)
	c.cases = cases.Solve(ctx, lr.Model, solve.Options{})
	for _, k := range c.cases {
		c.diags = append(c.diags, cases.Distinct(k.Diags, c.res.Diags)...) // the base says what it shares
	}
	slices.SortStableFunc(c.diags, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	return c
}

// checkSource checks one file for hmb check.
func checkSource(path string, src []byte, display *units.System) *fileResult {
	c := checkModel(context.Background(), path, src, display)
	fr := &fileResult{path: path, src: src, diags: c.diags}
	if c.model != nil {
		fr.ambient = c.model.AmbientOr()
	}
	if c.res == nil {
		return fr
	}
	m := c.model
	p := solvedJSON(m, c.res, c.rec)
	fr.streams, fr.units, fr.totals, fr.expects, fr.passes = p.streams, p.units, p.totals, p.expects, p.passes
	fr.recon = reconJSON(c.rec)
	fr.table = streamTable(m, c.res, c.rec)
	if len(c.rec.Measurements) > 0 {
		fr.table += "\n" + alignRows(tableRows(report.ReconciliationTable(m, c.rec)))
		if t := report.UncertaintyTable(m, c.res, c.rec); len(t.Rows) > 0 {
			fr.table += "\n" + alignRows(tableRows(t))
		}
	}
	if t := report.TotalTable(m, c.res); t != nil {
		fr.table += totalsLine(m, c.res)
	}
	checkCases(fr, c)
	return fr
}

// totalsLine is the one line of the file's totals that follows the stream table.
func totalsLine(m *model.Model, r *solve.Result) string {
	disp := m.Shown()
	var parts []string
	for _, spec := range model.TotalResults {
		v, _, _ := r.Value(m, model.Subject{Kind: model.TotalSubject}, spec.Name)
		if !math.IsNaN(v) {
			parts = append(parts, spec.Name+" "+spec.Show(disp, v))
		}
	}
	return "  totals: " + strings.Join(parts, ", ") + "\n"
}

// solvedParts is what JSON reports of a solved model: the base's or a case's.
type solvedParts struct {
	streams []jsonStream
	units   []jsonUnit
	totals  *jsonTotals
	expects []jsonExpect
	passes  []passed
}

// solvedJSON is the solved streams, units, totals and expectations of a model, for JSON.
func solvedJSON(m *model.Model, res *solve.Result, rec *reconcile.Result) solvedParts {
	var p solvedParts
	p.streams = make([]jsonStream, 0, len(m.Streams))
	p.units = make([]jsonUnit, 0, len(m.Units))
	for i, s := range m.Streams {
		r := res.Streams[i]
		val := func(name string) jsonNum {
			v, _, _ := res.Value(m, model.Subject{Kind: model.StreamSubject, Index: i}, name)
			return jsonNum(v)
		}
		js := jsonStream{Name: s.Name, Label: s.Label, M: jsonNum(r.M), P: nan, T: nan, H: nan, S: nan, X: nan,
			Tsat: val("Tsat"), Superheat: val("superheat"), Subcooling: val("subcooling"), V: val("v"), Rho: val("rho"), VolFlow: val("vol_flow"),
			Given: givenNames(s)}
		if r.HasState {
			st := r.State
			js.P, js.T, js.H, js.S, js.Phase = jsonNum(st.P), jsonNum(st.T), jsonNum(st.H), jsonNum(st.S), st.Phase.String()
			if !math.IsNaN(st.X) {
				js.X = jsonNum(st.X)
			}
		}
		u := func(name string) jsonNum { return jsonNum(rec.Stream(i, name)) }
		js.U = jsonStreamU{M: u("flow"), P: u("p"), T: u("T"), H: u("h"), S: u("s"), X: u("x")}
		p.streams = append(p.streams, js)
	}
	for i, u := range m.Units {
		r := res.Units[i]
		ru := func(name string) jsonNum { return jsonNum(rec.Unit(i, name)) }
		val := func(name string) jsonNum {
			v, _, _ := res.Value(m, model.Subject{Kind: model.UnitSubject, Index: i}, name)
			return jsonNum(v)
		}
		ju := jsonUnit{Name: u.Name, Kind: u.Kind.Name, Q: jsonNum(r.Q), W: jsonNum(r.W), Sgen: jsonNum(r.Sgen), SgenFluidOnly: r.SgenFluidOnly,
			Dp: val("dp"), DpHot: val("dp_hot"), DpCold: val("dp_cold"), Efficiency: val("efficiency"), Fuel: val("fuel"),
			DTMin: val("dT_min"), LMTD: val("lmtd"), UA: val("UA"), Ports: map[string][]string{}}
		for _, p := range u.Ports {
			ju.Ports[p.Role] = append(ju.Ports[p.Role], m.Streams[p.Stream].Name)
		}
		ju.U = jsonUnitU{Q: ru("duty"), W: ru("power"), Sgen: ru("sgen")}
		p.units = append(p.units, ju)
	}
	total := func(name string) jsonNum {
		v, _, _ := res.Value(m, model.Subject{Kind: model.TotalSubject}, name)
		return jsonNum(v)
	}
	p.totals = &jsonTotals{PowerOut: total("power_out"), PowerIn: total("power_in"), NetPower: total("net_power"),
		HeatIn: total("heat_in"), HeatOut: total("heat_out"), Efficiency: total("efficiency"), HeatRate: total("heat_rate")}
	for i, ex := range m.Expects {
		je := jsonExpect{Subject: subjectName(m, ex), Property: ex.Prop, Operator: ex.Op.String(), Value: jsonNum(ex.Value), Tolerance: nan, Solved: nan}
		if i < len(res.Expects) {
			er := res.Expects[i]
			je.Tolerance, je.Solved, je.Passed = jsonNum(er.Tol), jsonNum(er.Solved), er.Passed
			if er.Passed {
				p.passes = append(p.passes, passed{span: ex.Span, text: er.Text})
			}
		}
		p.expects = append(p.expects, je)
	}
	return p
}

func reconJSON(r *reconcile.Result) *jsonRecon {
	out := &jsonRecon{Redundancy: r.Redundancy, Chi2: jsonNum(r.Chi2), Chi2Limit: jsonNum(r.Chi2Limit), Passed: r.Passed,
		Measurements: []jsonMeasurement{}}
	for _, ms := range r.Measurements {
		out.Measurements = append(out.Measurements, jsonMeasurement{Name: ms.Name, Property: ms.Property,
			Measured: jsonNum(ms.Measured), Reconciled: jsonNum(ms.Reconciled), UMeasured: jsonNum(ms.UMeasured),
			UReconciled: jsonNum(ms.UReconciled), Test: jsonNum(ms.Test), Suspect: ms.Suspect})
	}
	return out
}

// givenNames lists the properties a stream's file block gave, in the order of the catalogue.
func givenNames(s *model.Stream) []string {
	out := []string{}
	if s.VolFlow != nil {
		out = append(out, "vol_flow")
	}
	for p := model.Prop(0); p < model.NumProps; p++ {
		if s.Given[p] != nil {
			out = append(out, p.String())
		}
	}
	return out
}

// subjectName is the stream or unit an expectation names, or model.TotalName.
func subjectName(m *model.Model, ex *model.Expect) string {
	sub := ex.Subject()
	switch {
	case sub.Kind == model.TotalSubject:
		return model.TotalName
	case sub.Kind == model.UnitSubject && sub.Index < len(m.Units):
		return m.Units[sub.Index].Name
	case sub.Kind == model.StreamSubject && sub.Index >= 0 && sub.Index < len(m.Streams):
		return m.Streams[sub.Index].Name
	}
	return ""
}

var nan = jsonNum(math.NaN())

// streamTable is the compact text table of solved streams that ends hmb check's text output,
// in the model's display units; with measurements, every value carries its 95 % ±.
func streamTable(m *model.Model, r *solve.Result, rec *reconcile.Result) string {
	if len(m.Streams) == 0 {
		return ""
	}
	disp := m.Shown()
	cols := []string{"flow", "p", "T", "h", "s", "x"}
	head := []string{"stream"}
	for _, c := range cols {
		if u := disp.Unit(model.StreamResult(c).Dim).Symbol(); u != "" {
			c += " " + u
		}
		head = append(head, c)
	}
	head = append(head, "phase")
	amb := disp.Show(units.Temperature, m.AmbientOr())
	rows := [][]string{head}
	withU := rec != nil && len(rec.Measurements) > 0
	for i, s := range m.Streams {
		sr := r.Streams[i]
		row := []string{s.Name}
		for _, c := range cols {
			v, spec, _ := r.Value(m, model.Subject{Kind: model.StreamSubject, Index: i}, c)
			switch {
			case math.IsNaN(v) && c == "x":
				row = append(row, "") // single phase, or unsolved
			case math.IsNaN(v):
				row = append(row, "-")
			default:
				cell := disp.Number(spec.Dim, v)
				if u := rec.Stream(i, c); withU && u > 0 {
					cell += " ± " + reconcile.FormatU(disp.Unit(spec.Dim), u)
				}
				row = append(row, cell)
			}
		}
		phase := "unsolved"
		if sr.HasState {
			phase = sr.State.Phase.String()
		}
		rows = append(rows, append(row, phase))
	}
	return "  ambient " + amb + " (heat losses leave at it)\n" + alignRows(rows)
}

// tableRows is a report table's headings and rows.
func tableRows(t report.Table) [][]string {
	head := make([]string, len(t.Cols))
	for i, c := range t.Cols {
		head[i] = c.Heading()
	}
	return append([][]string{head}, t.Rows...)
}

// alignRows writes rows as an indented text table: the first and last columns left-aligned,
// the numbers between right-aligned.
func alignRows(rows [][]string) string {
	if len(rows) == 0 {
		return ""
	}
	width := make([]int, len(rows[0]))
	for _, row := range rows {
		for j, c := range row {
			width[j] = max(width[j], utf8.RuneCountInString(c))
		}
	}
	size := 3
	for _, w := range width {
		size += w + 2
	}
	var b strings.Builder
	b.Grow(len(rows) * size)
	var line []byte // one row, built here and written without its trailing blanks
	for _, row := range rows {
		line = append(line[:0], "  "...)
		for j, c := range row {
			pad := width[j] - utf8.RuneCountInString(c)
			if j == 0 || j == len(row)-1 {
				line = append(line, c...)
				line = append(line, blanks(pad)...)
			} else {
				line = append(line, blanks(pad)...)
				line = append(line, c...)
			}
			if j < len(row)-1 {
				line = append(line, "  "...)
			}
		}
		b.Write(bytes.TrimRight(line, " "))
		b.WriteByte('\n')
	}
	return b.String()
}

// blanks returns n spaces.
func blanks(n int) string {
	const spaces = "                                                                "
	if n > len(spaces) {
		return strings.Repeat(" ", n)
	}
	return spaces[:max(n, 0)]
}

// formatSource is hmb fmt's transformation: exactly what the language server's formatting does.
func formatSource(path string, src []byte) ([]byte, error) { return format.Source(path, src) }

// allCodes lists every diagnostic code hmb reports, in code order.
func allCodes() []model.CodeInfo {
	return slices.Concat(lang.Codes, solve.Codes, reconcile.Codes, cases.Codes)
}
