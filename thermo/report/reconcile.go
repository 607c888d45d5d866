package report

import (
	"math"
	"strconv"

	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/units"
)

// ReconciliationTable is one row per measurement: the value as measured and as reconciled, each
// with its 95 % ±, the correction, the normalised correction (the measurement test, against 1.96)
// and a flag, in the model's display units.
func ReconciliationTable(m *model.Model, rec *reconcile.Result) Table {
	q := newQuantities(m)
	t := Table{Name: "measurements", Cols: []Column{
		{Name: "meter"}, {Name: "unit"},
		{Name: "measured", Num: true}, {Name: "reconciled", Num: true},
		{Name: "correction", Num: true}, {Name: "test", Num: true}, {Name: "flag"},
	}}
	if rec == nil {
		return t
	}
	for _, ms := range rec.Measurements {
		dim := ms.Dim
		u := q.unit(dim)
		delta := ms.Stream < 0 && ms.Unit >= 0 && ms.Unit < len(m.Units) && isDelta(m.Units[ms.Unit], ms.Property)
		pm := func(v, half float64) string {
			if math.IsNaN(v) {
				return Unsolved
			}
			num := q.cell(dim, v)
			if delta {
				num = units.Number(u, u.DeltaFromSI(v))
			}
			return num + " ± " + reconcile.FormatU(u, half)
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
			pm(ms.Measured, ms.UMeasured), pm(ms.Reconciled, ms.UReconciled), corr, test, flag})
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
