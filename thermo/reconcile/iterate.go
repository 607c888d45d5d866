package reconcile

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/mat"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// iteration reconciles the measurements among the solved equations.
//
// The unknowns x are parametrised by the values of the d measurements the solver matched to
// unknowns: with those held, the matched equations fix x (their Jacobian is square, regular
// where the solver converged, and block lower triangular in the solver's order, so it is solved
// block by block). Every other equation is left over: a leftover measurement adds a correction,
// a leftover balance must hold. Each step linearises all of them at the current values
// (Gauss-Newton for the corrections, Newton for the equations), solves the linear
// reconciliation (minNorm) and moves x; the iteration ends when the step changes no normalised
// correction by more than 1e-7 and every equation holds to 1e-9 of its scale.
type iteration struct {
	r       *run
	a       *solve.Adjustment
	matched []int   // equations solved for an unknown; position i is column r.cols of its unknown
	blocks  [][]int // matched equations in the solver's blocks, in solving order
	ms      []*measEq
	d       int   // the first d of ms are matched
	cons    []int // leftover equations that are not measurements
	// judged are the leftover equations of cons the measurements move: the rest are identities
	// (a closed loop's last mass balance) or involve exact givens only, left to the solver.
	judged []int
	x0     []float64 // the solver's values, restored when the reconciliation fails
	colSc  []float64
	// At the reconciled values: the linear problem's statistics, and the change of the solved
	// unknowns per unit change of each matched measurement's normalised value (unknowns × d).
	st *stats
	y  []float64 // unknowns in column order × (1 + d): the Newton step, then the change per unit of each matched measurement's normalised value, SI
	// buffers reused from step to step
	ybuf, cmbuf []float64
	// before holds the mismatch of each judged balance at the solver's values and the 95 %
	// half-width the measurements' uncertainties give it.
	before map[int][2]float64
	iters  int
	out    []Measurement // the measurements in the order of ms
	order  []int         // the file's order of out
}

func (it *iteration) run(ctx context.Context) bool {
	a := it.a
	it.x0 = append([]float64(nil), a.X...)
	it.colSc = make([]float64, len(a.X))
	for v := range a.System.Vars {
		it.colSc[v] = max(math.Abs(a.X[v]), typical(a.System.Vars[v].Dim))
	}
	for it.iters = 1; it.iters <= maxIter; it.iters++ {
		if ctx.Err() != nil {
			it.fail(model.Span{}, "the reconciliation stopped at the time limit; the values shown are not reconciled")
			return false
		}
		lin, ok := it.linearise(a.X, it.iters == 1)
		if !ok {
			return false
		}
		if it.iters == 1 && lin.sol.miss > 1e-6 {
			it.conflict()
			return false
		}
		// Move: corrections, then the unknowns along the matched equations.
		step := 0.0
		w := make([]float64, it.d)
		for k, m := range it.ms[:it.d] {
			w[k] = lin.sol.v[k] - m.corr/m.sigma
			m.corr = lin.sol.v[k] * m.sigma
			step = max(step, math.Abs(w[k]))
		}
		d, n := it.d, len(it.matched)
		for v, c := range it.r.cols {
			if c < 0 || c >= n {
				continue
			}
			row := lin.y[c*(1+d) : (c+1)*(1+d)]
			dx := row[0]
			for k, wk := range w {
				dx += row[1+k] * wk
			}
			a.X[v] += dx
		}
		if step <= stepTol && it.holds(a.X) {
			it.st, it.y = lin.sol.statistics(), lin.y
			return true
		}
	}
	it.fail(model.Span{}, fmt.Sprintf("the reconciliation did not converge within %d steps; the values shown are not reconciled", maxIter))
	return false
}

// holds reports whether every matched equation (with its measurement's correction) and every
// judged balance holds to resTol of its scale.
func (it *iteration) holds(x []float64) bool {
	sys := it.a.System
	corr := make(map[int]float64, it.d)
	for _, m := range it.ms[:it.d] {
		corr[m.eq] = m.corr
	}
	check := func(e int) bool {
		r, sc, err := sys.Residual(e, x)
		return err == nil && math.Abs(r-corr[e]) <= resTol*sc
	}
	for _, e := range it.matched {
		if !check(e) {
			return false
		}
	}
	for _, e := range it.judged {
		if !check(e) {
			return false
		}
	}
	return true
}

// typical is the magnitude below which an unknown's scale is not taken smaller.
func typical(d units.Dim) float64 {
	switch d {
	case units.Pressure, units.SpecificEnergy:
		return 1e5
	case units.Power:
		return 1e6
	}
	return 1
}

// linear is one linearisation and its solution.
type linear struct {
	sol *lsq
	// y holds, for each solved unknown in column order, the Newton step of the matched
	// equations with the measurements held, then its change per unit change of each matched
	// measurement's normalised value (row-major, 1 + d per unknown), SI.
	y []float64
}

// entry is one nonzero of a row of the Jacobian: the column of a solved unknown.
type entry struct {
	col int
	val float64
}

func (it *iteration) linearise(x []float64, first bool) (*linear, bool) {
	sys := it.a.System
	cols := it.r.cols
	n, d := len(it.matched), it.d
	pos := make(map[int]int, n) // matched equation -> its position
	for i, e := range it.matched {
		pos[e] = i
	}
	leftover := make([]int, 0, len(it.ms)-d+len(it.cons))
	for _, m := range it.ms[d:] {
		leftover = append(leftover, m.eq)
	}
	leftover = append(leftover, it.cons...)
	rows := make(map[int][]entry, n+len(leftover))
	res := make(map[int]float64, n+len(leftover))
	sc := make(map[int]float64, n+len(leftover))
	for _, e := range append(append([]int(nil), it.matched...), leftover...) {
		r, s, err := sys.Residual(e, x)
		if err != nil {
			it.fail(sys.Eqs[e].Span, "cannot evaluate "+sys.Eqs[e].Label+" while reconciling: "+err.Error())
			return nil, false
		}
		res[e], sc[e] = r, s
		rows[e] = nil
	}
	for _, m := range it.ms[:d] {
		res[m.eq] -= m.corr
	}
	for _, en := range sys.Jacobian(x) {
		if _, ok := rows[en.Row]; !ok {
			continue
		}
		if math.IsNaN(en.Val) || math.IsInf(en.Val, 0) {
			it.fail(sys.Eqs[en.Row].Span, "cannot differentiate "+sys.Eqs[en.Row].Label+" while reconciling")
			return nil, false
		}
		if c := cols[en.Col]; c >= 0 && en.Val != 0 {
			rows[en.Row] = append(rows[en.Row], entry{c, en.Val})
		}
	}
	// Solve the matched equations block by block, scaled (rows by their residual scale, columns
	// by their unknown's), for the right-hand sides [-residual | σ of each matched measurement].
	w := 1 + d
	colSc := make([]float64, n)
	for v, c := range cols {
		if c >= 0 && c < n {
			colSc[c] = it.colSc[v]
		}
	}
	if cap(it.ybuf) < n*w {
		it.ybuf = make([]float64, n*w)
	}
	y := it.ybuf[:n*w] // the solution, by column position, SI
	measOf := make(map[int]int, d)
	for k, m := range it.ms[:d] {
		measOf[m.eq] = k
	}
	rhs := make([]float64, w)
	for _, blk := range it.blocks {
		k := len(blk)
		if k == 1 { // most blocks: one equation in its one unknown
			e := blk[0]
			i := pos[e]
			yi := y[i*w : (i+1)*w]
			clear(yi)
			yi[0] = -res[e]
			if mk, ok := measOf[e]; ok {
				yi[1+mk] = it.ms[mk].sigma
			}
			diag := 0.0
			for _, en := range rows[e] {
				if en.col == i {
					diag += en.val
					continue
				}
				yr := y[en.col*w : (en.col+1)*w]
				for q := range yi {
					yi[q] -= en.val * yr[q]
				}
			}
			if !(math.Abs(diag)*colSc[i] > sc[e]/condMax) {
				it.singular(blk)
				return nil, false
			}
			for q := range yi {
				yi[q] /= diag
			}
			continue
		}
		in := make(map[int]int, k) // column position -> index in the block
		for j, e := range blk {
			in[pos[e]] = j
		}
		b := mat.NewDense(k, w, nil)
		jb := mat.NewDense(k, k, nil)
		for j, e := range blk {
			clear(rhs)
			rhs[0] = -res[e]
			if mk, ok := measOf[e]; ok {
				rhs[1+mk] = it.ms[mk].sigma
			}
			for _, en := range rows[e] {
				if jj, ok := in[en.col]; ok {
					jb.Set(j, jj, jb.At(j, jj)+en.val*colSc[en.col]/sc[e])
					continue
				}
				yr := y[en.col*w : (en.col+1)*w]
				for q := range rhs {
					rhs[q] -= en.val * yr[q]
				}
			}
			for q := range rhs {
				b.Set(j, q, rhs[q]/sc[e])
			}
		}
		var sol mat.Dense
		var lu mat.LU
		lu.Factorize(jb)
		if lu.Cond() > condMax {
			it.singular(blk)
			return nil, false
		}
		if err := lu.SolveTo(&sol, false, b); err != nil {
			it.singular(blk)
			return nil, false
		}
		for j, e := range blk {
			c := pos[e]
			yr := y[c*w : (c+1)*w]
			for q, v := range sol.RawRowView(j) {
				yr[q] = v * colSc[c]
			}
		}
	}
	lin := &linear{y: y}
	// Leftover rows: their residual after dx0 (b) and their change per unit w (arow).
	b := make(map[int]float64, len(leftover))
	arow := make(map[int][]float64, len(leftover))
	for _, e := range leftover {
		ar := make([]float64, d)
		be := res[e]
		for _, en := range rows[e] {
			yr := y[en.col*w : (en.col+1)*w]
			be += en.val * yr[0]
			for k := range ar {
				ar[k] += en.val * yr[1+k]
			}
		}
		b[e], arow[e] = be, ar
	}
	if first {
		it.before = map[int][2]float64{}
		for _, e := range it.cons {
			infl := 0.0
			for _, v := range arow[e] {
				infl = max(infl, math.Abs(v))
			}
			if infl > 1e-11*sc[e] {
				it.judged = append(it.judged, e)
				it.before[e] = [2]float64{b[e], Coverage * rowNorm(arow[e])}
			}
		}
	}
	// C v = c over all measurements' normalised corrections v (the d matched ones first): a
	// leftover measurement l reads v_l - (a_l/σ_l)·v_M = (b_l - a_l·v_M0)/σ_l, a judged balance
	// (a_e/s_e)·v_M = (a_e·v_M0 - b_e)/s_e, where v_M0 are the matched corrections now.
	m := len(it.ms)
	v0 := make([]float64, d)
	for k, ms := range it.ms[:d] {
		v0[k] = ms.corr / ms.sigma
	}
	nr := m - d + len(it.judged)
	if cap(it.cmbuf) < nr*m {
		it.cmbuf = make([]float64, nr*m)
	}
	cm := it.cmbuf[:nr*m]
	clear(cm)
	c := make([]float64, nr)
	for i, ms := range it.ms[d:] {
		row := cm[i*m : (i+1)*m]
		ar := arow[ms.eq]
		dot := 0.0
		for k := 0; k < d; k++ {
			row[k] = -ar[k] / ms.sigma
			dot += ar[k] * v0[k]
		}
		row[d+i] = 1
		c[i] = (b[ms.eq] - dot) / ms.sigma
	}
	for j, e := range it.judged {
		i := m - d + j
		row := cm[i*m : (i+1)*m]
		ar := arow[e]
		dot := 0.0
		for k := 0; k < d; k++ {
			row[k] = ar[k] / sc[e]
			dot += ar[k] * v0[k]
		}
		c[i] = (dot - b[e]) / sc[e]
	}
	sol, ok := minNorm(cm, c, m)
	if !ok {
		it.fail(model.Span{}, "the reconciliation's least-squares problem could not be factorised")
		return nil, false
	}
	lin.sol = sol
	return lin, true
}

// fail reports why the measurements could not be reconciled.
func (it *iteration) fail(span model.Span, msg string, rel ...model.Related) {
	it.r.diag(it.a, model.Error, CodeNotReconciled, span, msg, rel...)
}

// conflict reports leftover balances that contradict each other whatever the meters read.
func (it *iteration) conflict() {
	sys := it.a.System
	var labels []string
	var rel []model.Related
	for _, e := range it.judged {
		labels = append(labels, sys.Eqs[e].Label)
		rel = append(rel, model.Related{Span: sys.Eqs[e].Span, Message: sys.Eqs[e].Label})
	}
	span := model.Span{}
	if len(rel) > 0 {
		span, rel = rel[0].Span, rel[1:]
	}
	it.fail(span, "the measurements cannot be reconciled: "+andList(labels)+" contradict each other whatever the meters read; check the exact givens they involve", rel...)
}

// singular reports a block of equations that does not fix its unknowns at the current values:
// the direction of the block Jacobian's smallest singular value names them.
func (it *iteration) singular(blk []int) {
	sys := it.a.System
	var names []string
	var rel []model.Related
	span := model.Span{}
	vars := make([]int, len(blk))
	for j, e := range blk {
		vars[j] = it.a.Matched[e]
	}
	weight := make([]float64, len(vars))
	for j := range weight {
		weight[j] = 1
	}
	if len(blk) > 1 {
		// The block's Jacobian, unscaled, is enough to say which unknowns move together.
		jb := mat.NewDense(len(blk), len(blk), nil)
		idx := map[int]int{}
		for j, v := range vars {
			idx[v] = j
		}
		for _, en := range sys.Jacobian(it.a.X) {
			for j, e := range blk {
				if en.Row == e {
					if jj, ok := idx[en.Col]; ok {
						jb.Set(j, jj, en.Val*it.colSc[en.Col])
					}
				}
			}
		}
		var svd mat.SVD
		if svd.Factorize(jb, mat.SVDThin) {
			var v mat.Dense
			svd.VTo(&v)
			for j := range weight {
				weight[j] = math.Abs(v.At(j, len(blk)-1))
			}
		}
	}
	order := make([]int, len(vars))
	for j := range order {
		order[j] = j
	}
	sort.SliceStable(order, func(i, j int) bool { return weight[order[i]] > weight[order[j]] })
	for _, j := range order {
		if weight[j] < 0.1*weight[order[0]] || len(names) == 4 {
			break
		}
		vr := sys.Vars[vars[j]]
		names = append(names, vr.Name)
		sp := it.r.varSpan(vr)
		if len(names) == 1 {
			span = sp
		} else {
			rel = append(rel, model.Related{Span: sp, Message: vr.Name + " is one of them"})
		}
	}
	var labels []string
	for _, e := range blk {
		labels = append(labels, sys.Eqs[e].Label)
	}
	what := "fix only a combination of " + andList(names) + ", not each of them"
	if len(names) == 1 {
		what = "do not fix " + names[0] + " (a value that does not change what they measure)"
	}
	it.fail(span, "the measurements cannot be reconciled: at the solved values "+andList(labels)+" "+what+"; a measurement of another kind, or on another stream, would", rel...)
}

// varSpan is where an unknown's stream or unit is declared.
func (r *run) varSpan(v solve.Variable) model.Span {
	if v.Stream >= 0 && v.Stream < len(r.m.Streams) {
		return r.m.Streams[v.Stream].Span
	}
	if v.Unit >= 0 && v.Unit < len(r.m.Units) {
		return r.m.Units[v.Unit].Span
	}
	return model.Span{}
}

// andList writes "a, b and c".
func andList(s []string) string {
	if len(s) <= 1 {
		return strings.Join(s, "")
	}
	return strings.Join(s[:len(s)-1], ", ") + " and " + s[len(s)-1]
}
