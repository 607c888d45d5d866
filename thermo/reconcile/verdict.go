package reconcile

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Quality tests of the reconciliation (the practice of VDI 2048 Part 1; the global test and the
// measurement test of Narasimhan and Jordache, 2000, Ch. 7, from memory):
//
//	global:      chi2 = sum_i (v_i/σ_i)² <= chi-square quantile(0.95, r)
//	measurement: |v_i| / sqrt(Var(v_i)) <= 1.96,   Var(v_i) = σ_i² - Var(reconciled_i)
//
// v_i is the correction (reconciled - measured) and r the redundancy.
const (
	confidence = 0.95
	testLimit  = Coverage // the two-sided 95 % quantile of the standard normal distribution
	// shareMin is the share of a measurement's variance below which no balance checks it.
	shareMin = 1e-9
	// twins is the correlation of two measurements' corrections above which the tests cannot
	// tell which of the two is wrong.
	twins = 0.999
	// maxNamed is how many suspects a failed global test names.
	maxNamed = 5
)

// measurements fills Result.Measurements, in the order of the file.
func (r *run) measurements(it *iteration, ok bool) {
	sys := r.sys
	out := make([]Measurement, len(it.ms))
	for i, m := range it.ms {
		eq := &sys.Eqs[m.eq]
		ms := Measurement{Stream: eq.Stream, Unit: eq.Unit, Given: m.g, Dim: eq.Dim,
			Measured: m.g.Value, UMeasured: m.g.Tol, Reconciled: math.NaN(), UReconciled: math.NaN(), Test: math.NaN()}
		if eq.Stream >= 0 {
			ms.Name, ms.Property = r.m.Streams[eq.Stream].Name, eq.Prop.String()
		} else if eq.Unit >= 0 {
			ms.Name, ms.Property = r.m.Units[eq.Unit].Name, eq.Param
		}
		if ok {
			res, _, _ := sys.Residual(m.eq, r.x)
			ms.Reconciled = m.g.Value + res
			rho := it.st.rho[i]
			ms.Share = rho
			ms.UReconciled = m.g.Tol
			if it.st.q2 != nil {
				ms.UReconciled = Coverage * m.sigma * rowNorm(it.st.q2.RawRowView(i))
			}
			if rho > shareMin {
				ms.Checked = true
				ms.Test = math.Abs(res) / (m.sigma * math.Sqrt(rho))
				ms.Suspect = ms.Test > testLimit
			} else {
				// Nothing moves it: it is taken as read (the residual is rounding).
				ms.Share = 0
				ms.Reconciled, ms.UReconciled = m.g.Value, m.g.Tol
			}
		}
		out[i] = ms
	}
	it.order = make([]int, len(out))
	for i := range it.order {
		it.order[i] = i
	}
	sort.SliceStable(it.order, func(i, j int) bool {
		return out[it.order[i]].Given.Span.Start < out[it.order[j]].Given.Span.Start
	})
	r.out.Measurements = make([]Measurement, len(out))
	for k, i := range it.order {
		r.out.Measurements[k] = out[i]
	}
	it.out = out
}

// verdict runs the global test and reports suspects, unchecked measurements and the balances the
// reconciliation closed.
func (r *run) verdict(it *iteration, a *solve.Adjustment) {
	out := r.out
	nm := len(it.ms)
	out.Redundancy = it.st.rank
	for _, m := range it.out {
		v := (m.Reconciled - m.Measured) / m.Given.Sigma()
		out.Chi2 += v * v
	}
	if out.Redundancy > 0 {
		out.Chi2Limit = distuv.ChiSquared{K: float64(out.Redundancy)}.Quantile(confidence)
		out.Passed = out.Chi2 <= out.Chi2Limit
	}
	// Suspects, most suspect first.
	var sus []int // indices into it.out
	for i, m := range it.out {
		if m.Checked {
			sus = append(sus, i)
		}
	}
	sort.SliceStable(sus, func(i, j int) bool { return it.out[sus[i]].Test > it.out[sus[j]].Test })
	name := func(i int) string { return it.out[i].Name + " " + it.out[i].Property }
	twin := func(i int) []int { // measurements whose correction cannot be told from i's
		var t []int
		for j := range it.out {
			if j != i && it.out[j].Checked && math.Abs(it.st.corr(i, j)) > twins {
				t = append(t, j)
			}
		}
		return t
	}
	apart := func(i int) string {
		var names []string
		for _, j := range twin(i) {
			names = append(names, name(j))
		}
		if len(names) == 0 {
			return ""
		}
		return "; it cannot be told apart from " + andList(names)
	}
	if !out.Passed && len(sus) > 0 {
		top := sus[0]
		var parts []string
		var rel []model.Related
		for k, i := range sus {
			if k == maxNamed || k > 0 && !it.out[i].Suspect {
				break
			}
			parts = append(parts, fmt.Sprintf("%s (normalised correction %s)", name(i), units.Format(it.out[i].Test, 3)))
			if k > 0 {
				rel = append(rel, model.Related{Span: it.out[i].Given.Span, Message: fmt.Sprintf("%s: normalised correction %s", name(i), units.Format(it.out[i].Test, 3))})
			}
		}
		r.diag(a, model.Error, CodeGlobalTest, it.out[top].Given.Span, fmt.Sprintf("the measurements fail the global test: chi-square %s is above %s, the 95 %% limit for redundancy %d; most suspect: %s",
			units.Format(out.Chi2, 3), units.Format(out.Chi2Limit, 3), out.Redundancy, strings.Join(parts, ", ")), rel...)
		if t := twin(top); len(t) > 0 {
			names := []string{name(top)}
			var rel []model.Related
			for _, j := range t {
				names = append(names, name(j))
				rel = append(rel, model.Related{Span: it.out[j].Given.Span, Message: name(j) + " reads here"})
			}
			r.diag(a, model.Error, CodeIndistinct, it.out[top].Given.Span, fmt.Sprintf("%s cannot be told apart: the balances see only a combination of them (their corrections move together), so no test can say which one is wrong; a further meter in a balance that holds only one of them would",
				andList(names)), rel...)
		}
	}
	for _, i := range sus {
		m := &it.out[i]
		if !m.Suspect {
			continue
		}
		r.diag(a, model.Warning, CodeSuspect, m.Given.Span, fmt.Sprintf("%s is suspect: measured %s ± %s, reconciled %s ± %s; normalised correction %s is above %s%s",
			name(i), r.value(m, m.Measured), r.delta(m, m.UMeasured), r.value(m, m.Reconciled), r.delta(m, m.UReconciled),
			units.Format(m.Test, 3), units.Format(testLimit, 3), apart(i)))
	}
	for i := range it.out {
		m := &it.out[i]
		if m.Checked {
			continue
		}
		r.diag(a, model.Info, CodeUnchecked, m.Given.Span, fmt.Sprintf("%s: no balance checks this measurement (its redundancy is zero); it is taken as read, %s ± %s",
			name(i), r.value(m, m.Measured), r.delta(m, m.UMeasured)))
	}
	for _, e := range it.judged {
		eq := &r.sys.Eqs[e]
		b := it.before[e]
		within := "inside"
		if math.Abs(b[0]) > b[1] {
			within = "outside"
		}
		verdict := "closed by the reconciliation"
		if !out.Passed {
			verdict = "part of the failed global test"
		}
		r.diag(a, model.Info, CodeBalanceWithin, eq.Span, fmt.Sprintf("%s is over-determined by measurements and %s: the readings miss it by %s, %s the ± %s their uncertainties allow",
			eq.Label, verdict, r.mismatch(eq.Dim, math.Abs(b[0])), within, r.mismatch(eq.Dim, b[1])))
	}
	if out.Passed && out.Redundancy > 0 {
		r.diag(a, model.Info, CodeReconciled, model.Span{}, fmt.Sprintf("%d measurements reconciled: chi-square %s is within %s, the 95 %% limit for redundancy %d",
			nm, units.Format(out.Chi2, 3), units.Format(out.Chi2Limit, 3), out.Redundancy))
	}
}

// value writes a measured or reconciled value in the unit the measurement was written in.
func (r *run) value(m *Measurement, si float64) string {
	u := r.unitFor(m.Dim, m.Given.Unit)
	switch {
	case m.Dim == units.Dimensionless:
		return r.disp.Show(m.Dim, si)
	case r.isDelta(m):
		return units.ShowDelta(u, si)
	}
	return units.ShowIn(u, si, r.disp.Atm)
}

// delta writes a ± in the unit the measurement was written in.
func (r *run) delta(m *Measurement, si float64) string { return r.uncertainty(m.Dim, si, m.Given.Unit) }

// uncertainty writes a ± or a difference of dimension d, in the unit spelled when it is one of d,
// else in the display unit: to two significant figures, as uncertainties are quoted (GUM 7.2.6).
func (r *run) uncertainty(d units.Dim, si float64, spelling string) string {
	u := r.unitFor(d, spelling)
	if spelling == "" && d == units.Temperature {
		u = r.disp.Unit(units.TemperatureDiff)
	}
	return label(FormatU(u, si), units.DeltaSymbol(u))
}

// mismatch writes a balance's miss or allowance to three significant figures, so that the two
// read apart, in the display unit.
func (r *run) mismatch(d units.Dim, si float64) string {
	u := r.disp.Unit(d)
	if d == units.Temperature {
		u = r.disp.Unit(units.TemperatureDiff)
	}
	return label(units.Format(u.DeltaFromSI(si), 3), units.DeltaSymbol(u))
}

func label(num, sym string) string {
	if sym == "" {
		return num
	}
	return num + " " + sym
}

// FormatU writes an uncertainty si (SI) as a number in the unit u, to two significant figures
// (GUM 7.2.6): how every ± hmb prints is written.
func FormatU(u units.Unit, si float64) string { return units.Format(u.DeltaFromSI(si), 2) }

// unitFor is the unit a user's value is shown in: the unit they wrote when it measures d, else
// the display unit.
func (r *run) unitFor(d units.Dim, spelling string) units.Unit {
	if spelling != "" {
		if u, err := units.Lookup(spelling); err == nil && u.Dim() == d {
			return u
		}
	}
	return r.disp.Unit(d)
}

// isDelta reports a unit parameter that is a difference (a pressure drop).
func (r *run) isDelta(m *Measurement) bool {
	if m.Unit < 0 || m.Stream >= 0 {
		return false
	}
	spec := r.m.Units[m.Unit].Kind.Param(m.Property)
	return spec != nil && spec.Delta
}
