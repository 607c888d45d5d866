package report

import (
	"math"
	"strings"

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
	sys  units.System
	atm  float64
	pick units.Picks // the units the file chose per quantity
}

func newQuantities(m *model.Model) quantities {
	atm := m.Atm
	if !(atm > 0) {
		atm = units.StandardAtmosphere
	}
	return quantities{sys: m.Display, atm: atm, pick: m.Pick}
}

func (q quantities) disp() units.Display {
	return units.Display{System: q.sys, Atm: q.atm, Pick: q.pick}
}

func (q quantities) unit(d units.Dim) units.Unit { return q.disp().Unit(d) }

func (q quantities) conv(d units.Dim, si float64) float64 { return q.disp().Value(d, si) }

// cell writes a value for a table cell whose heading names the unit.
func (q quantities) cell(d units.Dim, si float64) string { return q.disp().Number(d, si) }

// deltaUnit is the unit a difference of dimension d is shown in (dK, bar for bar(g)).
func (q quantities) deltaUnit(d units.Dim) units.Unit {
	if d == units.Temperature {
		return q.unit(units.TemperatureDiff)
	}
	return q.unit(d).DeltaUnit()
}

// deltaCell writes a difference for a table cell whose heading names deltaUnit(d).
func (q quantities) deltaCell(d units.Dim, si float64) string {
	u := q.deltaUnit(d)
	return units.Number(u, u.DeltaFromSI(si))
}

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
	switch {
	case src.Kind == solve.ProvGiven && s.Given[p] != nil && s.Given[p].Measured:
		return true, "measured " + s.Name + " " + name + ", shown reconciled"
	case src.Kind == solve.ProvGiven:
		return true, src.Label
	case src.Kind == solve.ProvNone:
		return s.Given[p] != nil, ""
	}
	return false, src.Label
}

// detailColumns are the stream results the stream conditions table shows, with their
// headings; a cell is blank where the state has no such value (the superheat of a liquid).
var detailColumns = []struct{ name, heading string }{
	{"Tsat", "Tsat"}, {"superheat", "superheat"}, {"subcooling", "subcooling"},
	{"v", "v"}, {"rho", "rho"}, {"vol_flow", "volume flow"},
}

// ConditionTable is one row per stream: its saturation temperature, superheat or subcooling,
// specific volume, density and volumetric flow, and which of its properties the file gave (the
// rest were solved).
func ConditionTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "stream conditions", Cols: []Column{{Name: "stream"}}}
	for _, c := range detailColumns {
		spec := model.StreamResult(c.name)
		u := q.unit(spec.Dim)
		if spec.Delta {
			u = q.deltaUnit(spec.Dim)
		}
		t.Cols = append(t.Cols, Column{Name: c.heading, Unit: u.Symbol(), Num: true})
	}
	t.Cols = append(t.Cols, Column{Name: "given"})
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		sub := model.Subject{Kind: model.StreamSubject, Index: i}
		row := []string{s.Name}
		for _, c := range detailColumns {
			v, spec, _ := r.Value(m, sub, c.name)
			switch {
			case r.Lacks(m, sub, c.name):
				row = append(row, "") // the state has none
			case spec.Delta:
				row = append(row, q.deltaCell(spec.Dim, v))
			default:
				row = append(row, q.cell(spec.Dim, v))
			}
		}
		t.Rows = append(t.Rows, append(row, strings.Join(Given(s), ", ")))
	}
	return t
}

// Given lists the properties a stream's block gives, in catalogue order: vol_flow for a flow
// given in volume units.
func Given(s *model.Stream) []string {
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

// unitColumns are the unit results the unit table shows, with their headings. A cell is blank
// where the unit's kind has no such result.
var unitColumns = []struct{ name, heading string }{
	{"duty", "duty"}, {"power", "shaft power"}, {"efficiency", "efficiency"}, {"dp", "pressure drop"}, {"sgen", "entropy generation"},
}

// UnitTable is one row per unit: name, label, kind, duty, shaft power and entropy generation.
// Duty and power are shown only for kinds that have them (in the catalogue), whatever their sign
// convention: see UnitNotes.
func UnitTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "units", Cols: []Column{{Name: "unit"}, {Name: "label"}, {Name: "kind"}}}
	for _, c := range unitColumns {
		u := q.unit(resultDim(c.name))
		if c.name == "dp" {
			u = q.deltaUnit(units.Pressure)
		}
		t.Cols = append(t.Cols, Column{Name: c.heading, Unit: u.Symbol(), Num: true})
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
			if g := u.Params[c.name]; g != nil {
				given[3+j], source[3+j] = true, "given "+u.Name+" "+c.name
				if g.Measured {
					source[3+j] = "measured " + u.Name + " " + c.name + ", shown reconciled"
				}
			}
			cell := q.cell(spec.Dim, v)
			if spec.Delta {
				cell = q.deltaCell(spec.Dim, v)
			}
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

// ExchangerTable is one row per exchanger: its duty, the pressure drop of each side, the least
// temperature difference along its profile and where it lies, the zone-weighted LMTD and UA.
// Nil when the file has no exchanger.
func ExchangerTable(m *model.Model, r *solve.Result) *Table {
	q := newQuantities(m)
	t := &Table{Name: "exchangers", Cols: []Column{{Name: "unit"}}}
	cols := []string{"duty", "dp_hot", "dp_cold", "dT_min", "lmtd", "UA"}
	k := model.Kinds["exchanger"]
	for _, c := range cols {
		spec := k.Result(c)
		u := q.unit(spec.Dim)
		if spec.Delta {
			u = q.deltaUnit(spec.Dim)
		}
		t.Cols = append(t.Cols, Column{Name: c, Unit: u.Symbol(), Num: true})
		if c == "dT_min" {
			t.Cols = append(t.Cols, Column{Name: "dT_min at"})
		}
	}
	for i, u := range m.Units {
		if u == nil || u.Kind != k {
			continue
		}
		sub := model.Subject{Kind: model.UnitSubject, Index: i}
		row := []string{u.Name}
		for _, c := range cols {
			v, spec, _ := r.Value(m, sub, c)
			if spec.Delta {
				row = append(row, q.deltaCell(spec.Dim, v))
			} else {
				row = append(row, q.cell(spec.Dim, v))
			}
			if c == "dT_min" {
				at := ""
				if r != nil && i < len(r.Units) {
					at = r.Units[i].DTMinAt
				}
				row = append(row, at)
			}
		}
		t.Rows = append(t.Rows, row)
	}
	if len(t.Rows) == 0 {
		return nil
	}
	return t
}

// TotalTable is one row per total of the whole file (model.TotalResults): its value and unit.
// Nil when no unit contributes to any (no turbine, pump, boiler, heater, cooler or exchanger
// with a side from outside the file).
func TotalTable(m *model.Model, r *solve.Result) *Table {
	if r == nil || r.Totals == nil {
		return nil
	}
	tot := r.Totals
	if tot.PowerOut == 0 && tot.PowerIn == 0 && tot.HeatIn == 0 && tot.HeatOut == 0 {
		return nil
	}
	q := newQuantities(m)
	t := &Table{Name: "totals", Cols: []Column{{Name: "total"}, {Name: "value", Num: true}, {Name: "unit"}}}
	for _, spec := range model.TotalResults {
		v, _, _ := r.Value(m, model.Subject{Kind: model.TotalSubject}, spec.Name)
		t.Rows = append(t.Rows, []string{spec.Name, q.cell(spec.Dim, v), q.unit(spec.Dim).Symbol()})
	}
	return t
}

// Tables are the result tables of a file in the order every output shows them: streams, their
// conditions, units, then the exchangers and the totals when there are any.
func Tables(m *model.Model, r *solve.Result) []Table {
	out := []Table{StreamTable(m, r), ConditionTable(m, r), UnitTable(m, r)}
	if t := ExchangerTable(m, r); t != nil {
		out = append(out, *t)
	}
	if t := TotalTable(m, r); t != nil {
		out = append(out, *t)
	}
	return append(out, ReconciliationTables(m, r)...)
}

// Notes is the footnote of a table, "" for none.
func Notes(t Table) string {
	switch t.Name {
	case "units":
		return UnitNotes
	case "stream conditions":
		return ConditionNotes
	case "exchangers":
		return ExchangerNotes
	case "totals":
		return TotalNotes
	case "measurements":
		return ReconciliationNotes
	}
	return ""
}

// ConditionNotes explains the stream conditions table, for a footnote.
const ConditionNotes = "Superheat is shown for vapour, subcooling for liquid, neither for wet steam or above the critical pressure; " +
	"the volume flow is at the stream's own state. Given lists what the file states; the rest was solved."

// ExchangerNotes explains the exchanger table, for a footnote.
const ExchangerNotes = "The profile is split into zones where a side changes phase; dT_min is the least hot-minus-cold difference over them, " +
	"LMTD the duty over UA, and UA the sum of each zone's duty over its log-mean temperature difference."

// TotalNotes says which units the totals count, for a footnote.
const TotalNotes = "Power out is the turbines', power in the pumps'; heat in is the boilers' and heaters' duty (the heat the water takes, not the fuel's), " +
	"heat out the coolers'; an exchanger counts only when one side comes from and returns to outside the file (a surface condenser's cooling water). " +
	"Efficiency is net power over heat in, heat rate its inverse."

// UnitNotes explains the signs of the unit table, for a footnote.
const UnitNotes = "Duty is heat added (heater, boiler), removed (cooler) or passed hot to cold side (exchanger); " +
	"shaft power is produced by a turbine and absorbed by a pump; the pressure drop is the lowest inlet's pressure less the highest outlet's (below zero: a rise). " +
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
