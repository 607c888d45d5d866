package report

import (
	"math"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Column is one column of a table: a heading and the unit its numbers are in ("" for text and
// fractions).
type Column struct {
	Name string
	Unit string
	Num  bool // right-aligned numbers
}

// Table is a solved table, every cell already written out. A cell is "" where the quantity does
// not apply (the quality of a superheated stream, the shaft power of a heater) and Unsolved where
// it applies but was not found.
type Table struct {
	Name string // "streams", "units"
	Cols []Column
	Rows [][]string
	// Given marks the cells whose value the file states (a stream's given, a unit's parameter)
	// rather than the solver found; Source says, per cell, where a value came from (the
	// solver's provenance: "given S1 p", "energy balance of mixer DA"), "" when not known. Both
	// are parallel to Rows.
	Given  [][]bool
	Source [][]string
}

// Unsolved marks a cell whose value the solver did not find. It is the text units.Format gives a
// NaN, so a missing value never reads as a number.
const Unsolved = "n/a"

func sig(v float64, n int) string { return units.Format(v, n) }

// quantities writes SI values in a model's display units, through the units package's one
// formatter of quantities.
type quantities struct {
	sys units.System
	atm float64
}

func newQuantities(m *model.Model) quantities {
	atm := m.Atm
	if !(atm > 0) {
		atm = units.StandardAtmosphere
	}
	return quantities{sys: m.Display, atm: atm}
}

func (q quantities) disp() units.Display { return units.Display{System: q.sys, Atm: q.atm} }

func (q quantities) unit(d units.Dim) units.Unit { return q.sys.Default(d) }

func (q quantities) conv(d units.Dim, si float64) float64 { return q.disp().Value(d, si) }

// cell writes a value for a table cell whose heading names the unit.
func (q quantities) cell(d units.Dim, si float64) string { return q.disp().Number(d, si) }

// show writes a value with its unit.
func (q quantities) show(d units.Dim, si float64) string { return q.disp().Show(d, si) }

// streamColumns are the stream results the stream table shows, in order.
var streamColumns = []string{"flow", "p", "T", "h", "s", "x"}

// StreamTable is one row per stream: name, label, flow, p, T, h, s, quality and phase. The
// quality is blank for a single-phase state.
func StreamTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "streams", Cols: []Column{{Name: "stream"}, {Name: "label"}}}
	for _, name := range streamColumns {
		spec := model.StreamResult(name)
		t.Cols = append(t.Cols, Column{Name: name, Unit: q.unit(spec.Dim).Symbol(), Num: true})
	}
	t.Cols = append(t.Cols, Column{Name: "phase"})
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		sub := model.Subject{Kind: model.StreamSubject, Index: i}
		hasState := r != nil && i < len(r.Streams) && r.Streams[i].HasState
		row := []string{s.Name, s.Label}
		given := make([]bool, len(t.Cols))
		source := make([]string, len(t.Cols))
		for j, name := range streamColumns {
			v, spec, _ := r.Value(m, sub, name)
			switch {
			case name == "x" && hasState && math.IsNaN(v):
				row = append(row, "") // single phase: no quality
			default:
				row = append(row, q.cell(spec.Dim, v))
			}
			given[2+j], source[2+j] = streamProvenance(s, r, i, name)
		}
		phase := "unsolved"
		if hasState {
			phase = r.Streams[i].State.Phase.String()
		}
		t.Rows = append(t.Rows, append(row, phase))
		t.Given = append(t.Given, given)
		t.Source = append(t.Source, source)
	}
	return t
}

// streamProvenance says whether a stream's property was given in the file and where its value
// came from: the solver's provenance when the file was solved, the file's givens otherwise.
func streamProvenance(s *model.Stream, r *solve.Result, i int, name string) (given bool, source string) {
	p := model.NumProps
	for k := model.Prop(0); k < model.NumProps; k++ {
		if k.String() == name {
			p = k
		}
	}
	if p == model.NumProps {
		return false, ""
	}
	if r == nil || i >= len(r.Streams) {
		if s.Given[p] != nil {
			return true, "given " + s.Name + " " + name
		}
		return false, ""
	}
	src := r.Streams[i].Source[p]
	switch src.Kind {
	case solve.ProvGiven:
		return true, src.Label
	case solve.ProvNone:
		return s.Given[p] != nil, ""
	}
	return false, src.Label
}

// unitColumns are the unit results the unit table shows, with their headings. A cell is blank
// where the unit's kind has no such result.
var unitColumns = []struct{ name, heading string }{
	{"duty", "duty"}, {"power", "shaft power"}, {"sgen", "entropy generation"},
}

// UnitTable is one row per unit: name, label, kind, duty, shaft power and entropy generation.
// Duty and power are shown only for kinds that have them (in the catalogue), whatever their sign
// convention: see UnitNotes.
func UnitTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "units", Cols: []Column{{Name: "unit"}, {Name: "label"}, {Name: "kind"}}}
	for _, c := range unitColumns {
		t.Cols = append(t.Cols, Column{Name: c.heading, Unit: q.unit(resultDim(c.name)).Symbol(), Num: true})
	}
	for i, u := range m.Units {
		if u == nil {
			continue
		}
		kind := ""
		if u.Kind != nil {
			kind = u.Kind.Name
		}
		row := []string{u.Name, u.Label, kind}
		given := make([]bool, len(t.Cols))
		source := make([]string, len(t.Cols))
		for j, c := range unitColumns {
			v, spec, ok := r.Value(m, model.Subject{Kind: model.UnitSubject, Index: i}, c.name)
			if !ok {
				row = append(row, "")
				continue
			}
			if u.Params[c.name] != nil {
				given[3+j], source[3+j] = true, "given "+u.Name+" "+c.name
			}
			cell := q.cell(spec.Dim, v)
			if c.name == "sgen" && r != nil && i < len(r.Units) && r.Units[i].SgenFluidOnly && !math.IsNaN(v) {
				cell += FluidOnlyMark
			}
			row = append(row, cell)
		}
		t.Rows = append(t.Rows, row)
		t.Given = append(t.Given, given)
		t.Source = append(t.Source, source)
	}
	return t
}

// resultDim is the dimension of a unit result, as the catalogue gives it for any kind.
func resultDim(name string) units.Dim {
	for _, k := range model.Kinds {
		if r := k.Result(name); r != nil {
			return r.Dim
		}
	}
	return units.Dimensionless
}

// UnitNotes explains the signs of the unit table, for a footnote.
const UnitNotes = "Duty is heat added (heater, boiler), removed (cooler) or passed hot to cold side (exchanger); " +
	"shaft power is produced by a turbine and absorbed by a pump. " +
	"Entropy generation counts heat losses leaving at the ambient temperature and a duty crossing at the unit's T_boundary; " +
	"marked *, a duty crosses at no stated T_boundary and only what happens inside the fluid is counted."

// FluidOnlyMark follows an entropy generation that counts only what happens inside the fluid
// (solve.UnitResult.SgenFluidOnly); UnitNotes explains it.
const FluidOnlyMark = " *"

// Heading writes a column's heading with its unit: "p kPa", "x".
func (c Column) Heading() string {
	if c.Unit == "" {
		return c.Name
	}
	return c.Name + " (" + c.Unit + ")"
}
