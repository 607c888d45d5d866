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
// The unknowns x are parametrised by the corrections of the d measurements the solver matched
// to unknowns: with those corrections a fixed, the matched equations fix x (the matched Jacobian
// is square and regular where the solver converged). Every other equation is left over: a
// leftover measurement adds a correction to the objective, a leftover balance must hold. Each
// step linearises all of them at the current values (Gauss-Newton for the objective, Newton for
// the equations), solves the linear reconciliation (step.solve) and moves x; the iteration ends
// when the step no longer changes any normalised correction and every equation holds to 1e-9 of
// its scale.
type iteration struct {
	r       *run
	a       *solve.Adjustment
	matched []int     // equations solved for an unknown; row i of the matched Jacobian
	ms      []*measEq // the d matched measurements, then the leftover ones
	d       int
	cons    []int // leftover equations that are not measurements
	// judged are the leftover equations of cons the measurements move: the rest are identities
	// (a closed loop's last mass balance) or involve exact givens only, left to the solver.
	judged []int
	x0     []float64   // the solver's values, restored when the reconciliation fails
	sol    *stepResult // the linear problem at the reconciled values
	xs     *mat.Dense  // solved unknowns × d: change of x per unit change of w
	// before holds the mismatch of each judged balance at the solver's values and the 95 %
	// half-width the measurements' uncertainties give it.
	before map[int][2]float64
	iters  int
	colSc  []float64
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
		sol, ok := lin.p.solve()
		if !ok {
			it.fail(model.Span{}, "the reconciliation's least-squares problem could not be factorised")
			return false
		}
		if it.iters == 1 && sol.miss > 1e-6 {
			it.conflict(lin, sol)
			return false
		}
		it.sol, it.xs = sol, lin.xs
		// Move: corrections, then the unknowns along the matched equations.
		step := 0.0
		for k := 0; k < it.d; k++ {
			it.ms[k].corr += it.ms[k].sigma * sol.w[k]
			step = max(step, math.Abs(sol.w[k]))
		}
		for v, c := range it.r.cols {
			if c < 0 {
				continue
			}
			dx := lin.dx0[v]
			step = max(step, math.Abs(dx)/it.colSc[v])
			for k := 0; k < it.d; k++ {
				dx += lin.xs.At(c, k) * sol.w[k]
			}
			a.X[v] += dx
		}
		if step <= stepTol && it.holds(a.X) {
			for _, m := range it.ms[it.d:] {
				r, _, _ := a.System.Residual(m.eq, a.X)
				m.corr = r
			}
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

// linear is one linearisation.
type linear struct {
	p   *step
	xs  *mat.Dense
	dx0 []float64 // Newton step of the matched equations with the corrections held
	sc  map[int]float64
	b   map[int]float64 // leftover residuals after dx0
	arw map[int][]float64
}

func (it *iteration) linearise(x []float64, first bool) (*linear, bool) {
	sys := it.a.System
	cols := it.r.cols
	n := len(it.matched)
	row := make(map[int]int, n)
	for i, e := range it.matched {
		row[e] = i
	}
	lin := &linear{sc: map[int]float64{}, b: map[int]float64{}, arw: map[int][]float64{}}
	res := make([]float64, n)
	corrOf := map[int]float64{}
	for _, m := range it.ms[:it.d] {
		corrOf[m.eq] = m.corr
	}
	for i, e := range it.matched {
		r, sc, err := sys.Residual(e, x)
		if err != nil {
			it.fail(sys.Eqs[e].Span, "cannot evaluate "+sys.Eqs[e].Label+" while reconciling: "+err.Error())
			return nil, false
		}
		res[i] = (r - corrOf[e]) / sc
		lin.sc[e] = sc
	}
	leftover := make([]int, 0, len(it.ms)-it.d+len(it.cons))
	for _, m := range it.ms[it.d:] {
		leftover = append(leftover, m.eq)
	}
	leftover = append(leftover, it.cons...)
	lrow := map[int][]solve.Entry{}
	for _, e := range leftover {
		r, sc, err := sys.Residual(e, x)
		if err != nil {
			it.fail(sys.Eqs[e].Span, "cannot evaluate "+sys.Eqs[e].Label+" while reconciling: "+err.Error())
			return nil, false
		}
		lin.b[e], lin.sc[e] = r, sc
		lrow[e] = nil
	}
	js := mat.NewDense(n, n, nil)
	for _, en := range sys.Jacobian(x) {
		i, isRow := row[en.Row]
		_, isLeft := lrow[en.Row]
		if !isRow && !isLeft {
			continue
		}
		if math.IsNaN(en.Val) || math.IsInf(en.Val, 0) {
			it.fail(sys.Eqs[en.Row].Span, "cannot differentiate "+sys.Eqs[en.Row].Label+" while reconciling")
			return nil, false
		}
		if isLeft {
			lrow[en.Row] = append(lrow[en.Row], en)
			continue
		}
		if c := cols[en.Col]; c >= 0 {
			js.Set(i, c, js.At(i, c)+en.Val*it.colSc[en.Col]/lin.sc[en.Row])
		}
	}
	var lu mat.LU
	lu.Factorize(js)
	if lu.Cond() > condMax {
		it.singular(js)
		return nil, false
	}
	d := it.d
	rhs := mat.NewDense(n, 1+d, nil)
	for i := range res {
		rhs.Set(i, 0, -res[i])
	}
	for k, m := range it.ms[:d] {
		rhs.Set(m.row, 1+k, m.sigma/lin.sc[m.eq])
	}
	var y mat.Dense
	if err := lu.SolveTo(&y, false, rhs); err != nil {
		it.singular(js)
		return nil, false
	}
	lin.dx0 = make([]float64, len(x))
	xs := mat.NewDense(n, max(d, 1), nil)
	for v, c := range cols {
		if c < 0 {
			continue
		}
		lin.dx0[v] = it.colSc[v] * y.At(c, 0)
		for k := 0; k < d; k++ {
			xs.Set(c, k, it.colSc[v]*y.At(c, 1+k))
		}
	}
	lin.xs = xs
	// Leftover rows: b + A w.
	for _, e := range leftover {
		arow := make([]float64, d)
		for _, en := range lrow[e] {
			c := cols[en.Col]
			if c < 0 {
				continue
			}
			lin.b[e] += en.Val * lin.dx0[en.Col]
			for k := 0; k < d; k++ {
				arow[k] += en.Val * xs.At(c, k)
			}
		}
		lin.arw[e] = arow
	}
	if first {
		it.before = map[int][2]float64{}
		for _, e := range it.cons {
			infl := 0.0
			for _, v := range lin.arw[e] {
				infl = max(infl, math.Abs(v))
			}
			if infl > 1e-11*lin.sc[e] {
				it.judged = append(it.judged, e)
				it.before[e] = [2]float64{lin.b[e], Coverage * norm(lin.arw[e])}
			}
		}
	}
	p := &step{d: d, k: make([]float64, len(it.ms))}
	for k, m := range it.ms[:d] {
		p.k[k] = m.corr / m.sigma
	}
	if nl := len(it.ms) - d; nl > 0 && d > 0 {
		p.am = mat.NewDense(nl, d, nil)
	}
	for i, m := range it.ms[d:] {
		p.k[d+i] = lin.b[m.eq] / m.sigma
		if p.am != nil {
			for k, v := range lin.arw[m.eq] {
				p.am.Set(i, k, v/m.sigma)
			}
		}
	}
	if len(it.judged) > 0 && d > 0 {
		p.ac = mat.NewDense(len(it.judged), d, nil)
		p.bc = make([]float64, len(it.judged))
		for i, e := range it.judged {
			p.bc[i] = lin.b[e] / lin.sc[e]
			for k, v := range lin.arw[e] {
				p.ac.Set(i, k, v/lin.sc[e])
			}
		}
	}
	lin.p = p
	return lin, true
}

func norm(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x * x
	}
	return math.Sqrt(s)
}

// fail reports why the measurements could not be reconciled.
func (it *iteration) fail(span model.Span, msg string, rel ...model.Related) {
	it.r.diag(it.a, model.Error, CodeNotReconciled, span, msg, rel...)
}

// conflict reports leftover balances that contradict each other whatever the meters read.
func (it *iteration) conflict(lin *linear, sol *stepResult) {
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

// singular reports unknowns that the equations do not fix separately at the solved values: the
// direction of the matched Jacobian's smallest singular value names them.
func (it *iteration) singular(js *mat.Dense) {
	sys := it.a.System
	var svd mat.SVD
	var names []string
	var rel []model.Related
	span := model.Span{}
	if svd.Factorize(js, mat.SVDThin) {
		var v mat.Dense
		svd.VTo(&v)
		n, _ := v.Dims()
		type comp struct {
			v int
			w float64
		}
		var cs []comp
		for u, c := range it.r.cols {
			if c >= 0 {
				cs = append(cs, comp{u, math.Abs(v.At(c, n-1))})
			}
		}
		sort.SliceStable(cs, func(i, j int) bool { return cs[i].w > cs[j].w })
		for _, c := range cs {
			if c.w < 0.1*cs[0].w || len(names) == 4 {
				break
			}
			vr := sys.Vars[c.v]
			names = append(names, vr.Name)
			sp := it.r.varSpan(vr)
			if len(names) == 1 {
				span = sp
			} else {
				rel = append(rel, model.Related{Span: sp, Message: vr.Name + " is one of them"})
			}
		}
	}
	if len(names) == 0 {
		it.fail(span, "the measurements cannot be reconciled: at the solved values the equations do not fix every unknown")
		return
	}
	it.r.diag(it.a, model.Error, CodeNotReconciled, span, "the measurements cannot be reconciled: at the solved values the equations fix only a combination of "+andList(names)+
		", not each of them; a meter on one of them would tell them apart", rel...)
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
