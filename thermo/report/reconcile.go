package report

import (
	"math"
	"strconv"

	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// ReconciliationTable is one row per measurement: the value as measured and as reconciled, each
// with its 95 % ±, the correction, the normalised correction (the measurement test, against 1.96)
// and a flag, in the model's display units (the unit column names each row's). Numbers stand in
// cells of their own, so a spreadsheet keeps them numeric.
func ReconciliationTable(m *model.Model, rec *reconcile.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "measurements", Cols: []Column{
		{Name: "meter"}, {Name: "unit"},
		{Name: "measured", Num: true}, {Name: "± measured", Num: true},
		{Name: "reconciled", Num: true}, {Name: "± reconciled", Num: true},
		{Name: "correction", Num: true}, {Name: "test", Num: true}, {Name: "flag"},
	}}
	if rec == nil {
		return t
	}
	for _, ms := range rec.Measurements {
		dim := ms.Dim
		u := q.unit(dim)
		delta := ms.Stream < 0 && ms.Unit >= 0 && ms.Unit < len(m.Units) && isDelta(m.Units[ms.Unit], ms.Property)
		num := func(v float64) string {
			if math.IsNaN(v) {
				return Unsolved
			}
			if delta {
				return units.Number(u, u.DeltaFromSI(v))
			}
			return q.cell(dim, v)
		}
		half := func(v float64) string {
			if math.IsNaN(v) {
				return Unsolved
			}
			return reconcile.FormatU(u, v)
		}
		test, flag := Unsolved, ""
		switch {
		case !rec.Reconciled:
			flag = "not reconciled"
		case !ms.Checked:
			test, flag = "", "not checked"
		default:
			test = strconv.FormatFloat(ms.Test, 'f', 2, 64)
			if ms.Suspect {
				flag = "suspect"
			}
		}
		corr := Unsolved
		if c := ms.Reconciled - ms.Measured; !math.IsNaN(c) {
			corr = units.Format(u.DeltaFromSI(c), 3)
		}
		t.Rows = append(t.Rows, []string{ms.Name + " " + ms.Property, units.DeltaSymbol(u),
			num(ms.Measured), half(ms.UMeasured), num(ms.Reconciled), half(ms.UReconciled), corr, test, flag})
	}
	return t
}

func isDelta(u *model.Unit, param string) bool {
	if u == nil || u.Kind == nil {
		return false
	}
	p := u.Kind.Param(param)
	return p != nil && p.Delta
}

// ReconciliationNotes explains the reconciliation table, for a footnote.
const ReconciliationNotes = "± is the 95 % half-width (1.96 standard deviations). The test is the normalised correction, " +
	"|correction| over its standard deviation; above 1.96 the meter is suspect. A meter no balance checks is taken as read."

// UncertaintyTable is one row per unit result that has an uncertainty: the unit, the result
// (named as the kind catalogue names it: duty, power, efficiency, sgen, ...), its value and its
// 95 % ±, in the model's display units. Results that follow from exact givens alone (± 0) are
// left out; the table is empty when the file has no measurements.
func UncertaintyTable(m *model.Model, r *solve.Result, rec *reconcile.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "unit results", Cols: []Column{{Name: "unit"}, {Name: "result"},
		{Name: "value", Num: true}, {Name: "±", Num: true}, {Name: "in"}}}
	if r == nil || rec == nil {
		return t
	}
	for i, u := range m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		sub := model.Subject{Kind: model.UnitSubject, Index: i}
		for _, spec := range u.Kind.Results {
			half := rec.U(sub, spec.Name)
			v, _, _ := r.Value(m, sub, spec.Name)
			un := q.unit(spec.Dim)
			// Below a millionth of the display unit a ± is rounding of the derivative, not an
			// uncertainty to show.
			if !(un.DeltaFromSI(half) >= 1e-6) || math.IsNaN(v) {
				continue
			}
			t.Rows = append(t.Rows, []string{u.Name, spec.Name, q.cell(spec.Dim, v), reconcile.FormatU(un, half), un.Symbol()})
		}
	}
	return t
}

// StreamUncertaintyTable is one row per stream: the 95 % ± of each value of the stream table,
// in the model's display units; blank where a value is not solved, 0 where it follows from exact
// givens alone.
func StreamUncertaintyTable(m *model.Model, rec *reconcile.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "stream uncertainties", Cols: []Column{{Name: "stream"}}}
	for _, name := range streamColumns {
		spec := model.StreamResult(name)
		u := q.unit(spec.Dim)
		if spec.Dim == units.Temperature {
			u = q.unit(units.TemperatureDiff)
		}
		t.Cols = append(t.Cols, Column{Name: "± " + name, Unit: u.Symbol(), Num: true})
	}
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		row := []string{s.Name}
		for _, name := range streamColumns {
			half := rec.Stream(i, name)
			if math.IsNaN(half) {
				row = append(row, "")
				continue
			}
			dim := model.StreamResult(name).Dim
			u := q.unit(dim)
			if dim == units.Temperature {
				u = q.unit(units.TemperatureDiff)
			}
			row = append(row, reconcile.FormatU(u, half))
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// ReconciliationTables are the tables of a file's measurements (Tables ends with them): the
// measurement table, the ± of every stream value and the unit results with theirs; none when
// the file has no measurements.
func ReconciliationTables(m *model.Model, r *solve.Result) []Table {
	rec := reconcile.Of(r)
	if rec == nil || len(rec.Measurements) == 0 {
		return nil
	}
	out := []Table{ReconciliationTable(m, rec), StreamUncertaintyTable(m, rec)}
	if t := UncertaintyTable(m, r, rec); len(t.Rows) > 0 {
		out = append(out, t)
	}
	return out
}

// reconciliationTable reports whether t is one of ReconciliationTables, which the report page
// shows in a section of their own.
func reconciliationTable(t Table) bool {
	switch t.Name {
	case "measurements", "stream uncertainties", "unit results":
		return true
	}
	return false
}

// reconciliationViews are the report page's reconciliation section.
func reconciliationViews(in *Input) []tableView {
	if !in.solved() {
		return nil
	}
	var out []tableView
	for _, t := range ReconciliationTables(in.Model, in.Result) {
		v := viewOf(t)
		v.Note = Notes(t)
		out = append(out, v)
	}
	return out
}
