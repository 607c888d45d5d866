package report

import (
	"math"
	"strconv"
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
}

// Unsolved marks a cell whose value the solver did not find. It is the text units.Format gives a
// NaN, so a missing value never reads as a number.
const Unsolved = "n/a"

// Significant figures and decimals. Temperatures, enthalpies and entropies are shown to fixed
// decimals, as steam tables print them; flows, pressures and duties span decades and get
// significant figures instead.
const (
	sigFlow  = 4
	sigP     = 4
	decT     = 1
	decH     = 1
	decS     = 4
	decX     = 4
	sigPower = 4
	sigSgen  = 4
)

// fixed writes v with d decimals; NaN is Unsolved and a rounded negative zero loses its sign.
func fixed(v float64, d int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Unsolved
	}
	s := strconv.FormatFloat(v, 'f', d, 64)
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		s = s[1:]
	}
	return s
}

func sig(v float64, n int) string { return units.Format(v, n) }

// quantities converts SI values to a model's display units.
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

func (q quantities) unit(d units.Dim) units.Unit { return q.sys.Default(d) }

func (q quantities) conv(d units.Dim, si float64) float64 {
	return q.sys.Default(d).FromSI(si, q.atm)
}

// sgenUnit and sgenConv show an entropy rate, which the units package has no dimension for: W/K
// is shown as kW/K, or as Btu/(h R) with 1 Btu_IT = 1055.05585262 J and 1 R = 5/9 K (NIST SP 811
// (2008), Appendix B.8).
func (q quantities) sgenUnit() string {
	if q.sys == units.US {
		return "Btu/(h R)"
	}
	return "kW/K"
}

func (q quantities) sgenConv(si float64) float64 {
	if q.sys == units.US {
		return si * 3600 / 1055.05585262 * 5 / 9
	}
	return si / 1e3
}

// StreamTable is one row per stream: name, label, flow, p, T, h, s, quality and phase.
func StreamTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "streams", Cols: []Column{
		{Name: "stream"}, {Name: "label"},
		{Name: "flow", Unit: q.unit(units.MassFlow).Symbol(), Num: true},
		{Name: "p", Unit: q.unit(units.Pressure).Symbol(), Num: true},
		{Name: "T", Unit: q.unit(units.Temperature).Symbol(), Num: true},
		{Name: "h", Unit: q.unit(units.SpecificEnergy).Symbol(), Num: true},
		{Name: "s", Unit: q.unit(units.SpecificEntropy).Symbol(), Num: true},
		{Name: "x", Num: true},
		{Name: "phase"},
	}}
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		var sr solve.StreamResult
		sr.M = math.NaN()
		if r != nil && i < len(r.Streams) {
			sr = r.Streams[i]
		}
		row := []string{s.Name, s.Label, sig(q.conv(units.MassFlow, sr.M), sigFlow)}
		if !sr.HasState {
			row = append(row, Unsolved, Unsolved, Unsolved, Unsolved, Unsolved, "unsolved")
			t.Rows = append(t.Rows, row)
			continue
		}
		st := sr.State
		x := ""
		if !math.IsNaN(st.X) {
			x = fixed(st.X, decX)
		}
		row = append(row,
			sig(q.conv(units.Pressure, st.P), sigP),
			fixed(q.conv(units.Temperature, st.T), decT),
			fixed(q.conv(units.SpecificEnergy, st.H), decH),
			fixed(q.conv(units.SpecificEntropy, st.S), decS),
			x, st.Phase.String())
		t.Rows = append(t.Rows, row)
	}
	return t
}

// UnitTable is one row per unit: name, label, kind, duty, shaft power and entropy generation.
// Duty and power are shown only for kinds that have them (a duty or power parameter in the
// model's catalogue), whatever their sign convention: see UnitNotes.
func UnitTable(m *model.Model, r *solve.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "units", Cols: []Column{
		{Name: "unit"}, {Name: "label"}, {Name: "kind"},
		{Name: "duty", Unit: q.unit(units.Power).Symbol(), Num: true},
		{Name: "shaft power", Unit: q.unit(units.Power).Symbol(), Num: true},
		{Name: "entropy generation", Unit: q.sgenUnit(), Num: true},
	}}
	for i, u := range m.Units {
		if u == nil {
			continue
		}
		nan := math.NaN()
		ur := solve.UnitResult{Q: nan, W: nan, Sgen: nan}
		if r != nil && i < len(r.Units) {
			ur = r.Units[i]
		}
		kind := ""
		hasDuty, hasPower := false, false
		if u.Kind != nil {
			kind = u.Kind.Name
			hasDuty = u.Kind.Param("duty") != nil
			hasPower = u.Kind.Param("power") != nil
		}
		cell := func(applies bool, v string, si float64) string {
			if !applies && math.IsNaN(si) {
				return ""
			}
			return v
		}
		t.Rows = append(t.Rows, []string{u.Name, u.Label, kind,
			cell(hasDuty, sig(q.conv(units.Power, ur.Q), sigPower), ur.Q),
			cell(hasPower, sig(q.conv(units.Power, ur.W), sigPower), ur.W),
			sig(q.sgenConv(ur.Sgen), sigSgen),
		})
	}
	return t
}

// UnitNotes explains the signs of the unit table, for a footnote.
const UnitNotes = "Duty is heat added (heater, boiler), removed (cooler) or passed hot to cold side (exchanger); " +
	"shaft power is produced by a turbine and absorbed by a pump."

// Heading writes a column's heading with its unit: "p kPa", "x".
func (c Column) Heading() string {
	if c.Unit == "" {
		return c.Name
	}
	return c.Name + " (" + c.Unit + ")"
}
