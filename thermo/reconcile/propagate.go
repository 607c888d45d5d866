package reconcile

import (
	"math"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// propagate fills the uncertainty of every result of every stream and unit: the law of
// propagation of uncertainty with correlated inputs (ISO/IEC Guide 98-3 (GUM), 5.2.2, Eq. 13),
// u²(y) = ∇yᵀ Cov(x) ∇y, with Cov(x) = lx lxᵀ from the reconciliation (from the measurements
// alone when nothing is redundant), expanded to 95 % by the factor 1.96 (GUM 6.2.1, Eq. 18;
// Table G.1). Each result is read through the solver's one lookup by name (solve.Result.Value)
// at values of the unknowns moved one at a time, so a derivative is a central difference of
// exactly what the solver reports.
func (r *run) propagate(res *solve.Result) {
	m := r.m
	out := r.out
	out.m = m
	out.streamU = make([][]float64, len(m.Streams))
	out.unitU = make([][]float64, len(m.Units))
	nan := math.NaN()
	fill := func(n int) []float64 {
		u := make([]float64, n)
		for i := range u {
			u[i] = nan
		}
		return u
	}
	for i := range m.Streams {
		out.streamU[i] = fill(len(model.StreamResults))
	}
	for i, un := range m.Units {
		if un != nil && un.Kind != nil {
			out.unitU[i] = fill(len(un.Kind.Results))
		}
	}
	if res == nil || res.System == nil || len(res.X) == 0 || !out.Reconciled {
		return
	}
	sys, x := res.System, res.X
	q := 0
	if r.lx != nil {
		_, q = r.lx.Dims()
	}
	rowOf := func(v int) []float64 { // the unknown's row of lx; nil when exact or unsolved
		if v < 0 || r.lx == nil || r.cols == nil || r.cols[v] < 0 {
			return nil
		}
		return r.lx.RawRowView(r.cols[v])
	}
	acc := make([]float64, q)
	combine := func(value float64, vars []int, grad []float64) float64 {
		if !finite(value) {
			return nan
		}
		clear(acc)
		for i, v := range vars {
			if !finite(grad[i]) {
				return nan
			}
			for k, l := range rowOf(v) {
				acc[k] += grad[i] * l
			}
		}
		return Coverage * rowNorm(acc)
	}
	ev := res.Evaluator()
	if ev == nil {
		return
	}
	xp := append([]float64(nil), x...)
	// derive fills u (one entry per result name) for a subject, from its results at values of
	// the unknowns vars moved one at a time.
	derive := func(sub model.Subject, names []model.ResultSpec, vars []int, u []float64) {
		vals := make([]float64, len(names))
		for k, spec := range names {
			vals[k], _, _ = res.Value(m, sub, spec.Name)
		}
		grads := make([][]float64, len(names))
		for k := range grads {
			grads[k] = make([]float64, len(vars))
		}
		hi, lo := make([]float64, len(names)), make([]float64, len(names))
		for j, v := range vars {
			h := 1e-6 * max(math.Abs(x[v]), typical(sys.Vars[v].Dim))
			for side, sign := range []float64{1, -1} {
				xp[v] = x[v] + sign*h
				at := ev.At(sub, xp)
				for k, spec := range names {
					val := nan
					if at != nil {
						val, _, _ = at.Value(m, sub, spec.Name)
					}
					if side == 0 {
						hi[k] = val
					} else {
						lo[k] = val
					}
				}
			}
			xp[v] = x[v]
			for k := range names {
				switch {
				case finite(hi[k]) && finite(lo[k]):
					grads[k][j] = (hi[k] - lo[k]) / (2 * h)
				case finite(hi[k]): // one side past a phase boundary: one-sided
					grads[k][j] = (hi[k] - vals[k]) / h
				case finite(lo[k]):
					grads[k][j] = (vals[k] - lo[k]) / h
				default:
					grads[k][j] = nan
				}
			}
		}
		for k := range names {
			u[k] = combine(vals[k], vars, grads[k])
		}
	}
	for i := range m.Streams {
		var vars []int
		for _, p := range []model.Prop{model.Flow, model.P, model.H} {
			if v := sys.StreamVar(i, p); rowOf(v) != nil {
				vars = append(vars, v)
			}
		}
		sub := model.Subject{Kind: model.StreamSubject, Index: i}
		derive(sub, model.StreamResults, vars, out.streamU[i])
	}
	for ui, un := range m.Units {
		if un == nil || un.Kind == nil {
			continue
		}
		var vars []int
		seen := map[int]bool{}
		add := func(v int) {
			if v >= 0 && !seen[v] && rowOf(v) != nil {
				seen[v] = true
				vars = append(vars, v)
			}
		}
		for _, p := range un.Ports {
			add(sys.StreamVar(p.Stream, model.Flow))
			add(sys.StreamVar(p.Stream, model.P))
			add(sys.StreamVar(p.Stream, model.H))
		}
		for _, ps := range un.Kind.Params {
			add(sys.UnitVar(ui, ps.Name))
		}
		sub := model.Subject{Kind: model.UnitSubject, Index: ui}
		derive(sub, un.Kind.Results, vars, out.unitU[ui])
	}
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// U returns the 95 % half-width of the result name of a subject (the names solve.Result.Value
// takes), SI: 0 for a value that follows from exact givens alone, NaN when the value is not known.
func (r *Result) U(sub model.Subject, name string) float64 {
	if r == nil || r.m == nil {
		return math.NaN()
	}
	switch sub.Kind {
	case model.StreamSubject:
		if sub.Index >= 0 && sub.Index < len(r.streamU) {
			for k, spec := range model.StreamResults {
				if spec.Name == name {
					return r.streamU[sub.Index][k]
				}
			}
		}
	case model.UnitSubject:
		if sub.Index >= 0 && sub.Index < len(r.unitU) && r.m.Units[sub.Index].Kind != nil {
			for k, spec := range r.m.Units[sub.Index].Kind.Results {
				if spec.Name == name {
					return r.unitU[sub.Index][k]
				}
			}
		}
	}
	return math.NaN()
}

// Stream is U of stream i's result name ("flow", "p", "T", ...).
func (r *Result) Stream(i int, name string) float64 {
	return r.U(model.Subject{Kind: model.StreamSubject, Index: i}, name)
}

// Unit is U of unit i's result name ("duty", "power", "sgen", ...).
func (r *Result) Unit(i int, name string) float64 {
	return r.U(model.Subject{Kind: model.UnitSubject, Index: i}, name)
}
