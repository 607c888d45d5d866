package main

import (
	"context"
	"math"
	"slices"
	"strings"

	"hmb/lang"
	"hmb/lang/format"
	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// jsonStream is one solved stream in SI base units: kg/s, Pa, K, J/kg, J/(kg K); x is null when
// the state is single phase or unknown.
type jsonStream struct {
	Name  string  `json:"name"`
	Label string  `json:"label,omitempty"`
	M     jsonNum `json:"m"`
	P     jsonNum `json:"p"`
	T     jsonNum `json:"T"`
	H     jsonNum `json:"h"`
	S     jsonNum `json:"s"`
	X     jsonNum `json:"x"`
	Phase string  `json:"phase"`
}

// jsonUnit is one unit's balance in SI base units: W and W/K.
type jsonUnit struct {
	Name string  `json:"name"`
	Kind string  `json:"kind"`
	Q    jsonNum `json:"Q"`
	W    jsonNum `json:"W"`
	Sgen jsonNum `json:"S_gen"`
	// SgenFluidOnly: a duty crosses the unit's boundary at no stated T_boundary, so S_gen counts
	// only what happens inside the fluid (see solve.UnitResult.SgenFluidOnly).
	SgenFluidOnly bool `json:"S_gen_fluid_only,omitempty"`
}

// checked is one file after the whole check: notation, then the solver.
type checked struct {
	lang  *lang.Result
	model *model.Model // nil when nothing could be lowered
	res   *solve.Result
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
		lr.Model.Display = *display
	}
	c.res = solve.Solve(ctx, lr.Model, solve.Options{})
	c.diags = append(c.diags, c.res.Diags...)
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
	for i, s := range m.Streams {
		r := c.res.Streams[i]
		js := jsonStream{Name: s.Name, Label: s.Label, M: jsonNum(r.M), P: nan, T: nan, H: nan, S: nan, X: nan}
		if r.HasState {
			st := r.State
			js.P, js.T, js.H, js.S, js.Phase = jsonNum(st.P), jsonNum(st.T), jsonNum(st.H), jsonNum(st.S), st.Phase.String()
			if !math.IsNaN(st.X) {
				js.X = jsonNum(st.X)
			}
		}
		fr.streams = append(fr.streams, js)
	}
	for i, u := range m.Units {
		r := c.res.Units[i]
		fr.units = append(fr.units, jsonUnit{Name: u.Name, Kind: u.Kind.Name, Q: jsonNum(r.Q), W: jsonNum(r.W), Sgen: jsonNum(r.Sgen), SgenFluidOnly: r.SgenFluidOnly})
	}
	fr.table = streamTable(m, c.res)
	return fr
}

var nan = jsonNum(math.NaN())

// streamTable is the compact text table of solved streams that ends hmb check's text output,
// in the model's display units.
func streamTable(m *model.Model, r *solve.Result) string {
	if len(m.Streams) == 0 {
		return ""
	}
	disp := units.Display{System: m.Display, Atm: m.Atm}
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
				row = append(row, disp.Number(spec.Dim, v))
			}
		}
		phase := "unsolved"
		if sr.HasState {
			phase = sr.State.Phase.String()
		}
		rows = append(rows, append(row, phase))
	}
	width := make([]int, len(head))
	for _, row := range rows {
		for j, c := range row {
			width[j] = max(width[j], len([]rune(c)))
		}
	}
	var b strings.Builder
	b.WriteString("  ambient " + amb + " (heat losses leave at it)\n")
	for _, row := range rows {
		var line strings.Builder
		for j, c := range row {
			pad := strings.Repeat(" ", width[j]-len([]rune(c)))
			switch {
			case j == 0 || j == len(row)-1:
				line.WriteString(c + pad)
			default:
				line.WriteString(pad + c)
			}
			if j < len(row)-1 {
				line.WriteString("  ")
			}
		}
		b.WriteString("  " + strings.TrimRight(line.String(), " ") + "\n")
	}
	return b.String()
}

// formatSource is hmb fmt's transformation: exactly what the language server's formatting does.
func formatSource(path string, src []byte) ([]byte, error) { return format.Source(path, src) }

// allCodes lists every diagnostic code hmb reports, in code order.
func allCodes() []model.CodeInfo {
	return slices.Concat(lang.Codes, solve.Codes)
}
