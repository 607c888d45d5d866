package reconcile

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// propagate fills the uncertainty of every result of every stream and unit: the law of
// propagation of uncertainty with correlated inputs (ISO/IEC Guide 98-3 (GUM), 5.2.2, Eq. 13),
// u²(y) = ∇yᵀ Cov(x) ∇y, with Cov(x) = lx lxᵀ from the reconciliation (from the measurements
// alone when nothing is redundant), expanded to 95 % by the factor 1.96 (GUM 6.2.1, Eq. 18;
// Table G.1). Each result is read through the solver's one lookup by name (solve.Result.Value)
// at moved values of the unknowns, so a derivative is a central difference of exactly what the
// solver reports.
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
	ev := res.Evaluator()
	if ev == nil {
		return
	}
	xp := append([]float64(nil), x...)
	// derive fills u (one entry per result name) for a subject whose results depend on the
	// unknowns vars. The covariance of those unknowns, L Lᵀ with L their rows of lx, is factored
	// as D Dᵀ with D = Rᵀ from a QR of Lᵀ (or D = L when it has fewer columns than rows); each
	// column of D moves the unknowns together as they vary together, and the result's variance is
	// the sum of the squares of its derivatives along the columns. Moving correlated unknowns
	// together keeps what the equations tie (a tee's outlets at its inlet pressure) tied, where a
	// value computed from them has a corner (the lowest of equal pressures).
	derive := func(sub model.Subject, names []model.ResultSpec, vars []int, u []float64) {
		vals := make([]float64, len(names))
		for k, spec := range names {
			vals[k], _, _ = res.Value(m, sub, spec.Name)
		}
		dirs := directions(vars, rowOf, q)
		sum := make([]float64, len(names))
		bad := make([]bool, len(names))
		hi, lo := make([]float64, len(names)), make([]float64, len(names))
		for _, d := range dirs {
			for side, sign := range []float64{1, -1} {
				for j, v := range vars {
					xp[v] = x[v] + sign*stepDir*d[j]
				}
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
			for _, v := range vars {
				xp[v] = x[v]
			}
			for k := range names {
				var g float64
				switch {
				case finite(hi[k]) && finite(lo[k]):
					g = (hi[k] - lo[k]) / (2 * stepDir)
				case finite(hi[k]): // one side past a phase boundary: one-sided
					g = (hi[k] - vals[k]) / stepDir
				case finite(lo[k]):
					g = (vals[k] - lo[k]) / stepDir
				default:
					bad[k] = true
				}
				sum[k] += g * g
			}
		}
		for k := range names {
			switch {
			case !finite(vals[k]) || bad[k]:
				u[k] = nan
			default:
				u[k] = Coverage * math.Sqrt(sum[k])
			}
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

// stepDir is the fraction of one standard deviation the unknowns move by for a derivative: small
// enough that a result is linear over it, large enough that rounding does not show.
const stepDir = 1e-3

// directions factors the covariance of the unknowns vars (their rows of lx, q columns) as D Dᵀ
// and returns the columns of D, each as long as vars; none when no unknown is uncertain.
func directions(vars []int, rowOf func(int) []float64, q int) [][]float64 {
	nv := len(vars)
	if nv == 0 || q == 0 {
		return nil
	}
	l := mat.NewDense(nv, q, nil)
	for j, v := range vars {
		if row := rowOf(v); row != nil {
			l.SetRow(j, row)
		}
	}
	var out [][]float64
	if q <= nv {
		for k := 0; k < q; k++ {
			out = append(out, mat.Col(nil, k, l))
		}
		return out
	}
	var qr mat.QR
	qr.Factorize(l.T())
	var r mat.Dense
	qr.RTo(&r) // q × nv, upper triangular in its first nv rows
	for k := 0; k < nv; k++ {
		d := make([]float64, nv)
		nonzero := false
		for j := 0; j < nv; j++ {
			d[j] = r.At(k, j) // column k of Rᵀ is row k of R
			nonzero = nonzero || d[j] != 0
		}
		if nonzero {
			out = append(out, d)
		}
	}
	return out
}
