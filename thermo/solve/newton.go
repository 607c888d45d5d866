package solve

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
)

// Newton settings. A block converges when every scaled residual is below tolScaled; the scale
// of an equation is the larger magnitude of its two sides, so this is a relative error.
const (
	tolScaled   = 1e-9
	maxHalvings = 30
)

// blockError says why a block was not solved. blockFailed words it for the engineer.
type blockError struct {
	reason   string
	prop     error   // the property library's error, when that was the cause
	singular bool    // the Jacobian was singular: the block's equations do not fix its unknowns
	miss     float64 // the worst relative mismatch of the equations at the closest point found; 0 when not known
}

func (e *blockError) Error() string {
	if e.prop != nil {
		return e.reason + ": " + e.prop.Error()
	}
	return e.reason
}

var errTimeout = errors.New("time limit reached")

type newton struct {
	ctx     context.Context
	sys     *System
	x       []float64
	solved  []bool
	maxIter int
	guess   func(v int) float64
	// start, when set, gives an unknown's value in an earlier solution (Options.Start), tried
	// when the first guesses do not already satisfy a block.
	start func(v int) (float64, bool)
	// buf and g are reused from block to block: most blocks are one equation, and allocating
	// their work arrays each time was a good part of solving a long chain.
	buf []float64
	g   []float64
	// evals counts equation evaluations for Work.
	evals int
}

// work returns zeroed residual, scale, Jacobian, step and start arrays for a block of k.
func (n *newton) work(k int) (r, scale, jac, dx, x0 []float64) {
	need := 4*k + k*k
	if cap(n.buf) < need {
		n.buf = make([]float64, need)
	}
	b := n.buf[:need]
	clear(b)
	return b[:k:k], b[k : 2*k : 2*k], b[2*k : 2*k+k*k : 2*k+k*k], b[2*k+k*k : 3*k+k*k : 3*k+k*k], b[3*k+k*k : need : need]
}

// solveBlock finds the unknowns vars so that the equations eqs hold, the other unknowns fixed.
func (n *newton) solveBlock(eqs, vars []int) error {
	sys := n.sys
	if len(eqs) == 1 && sys.Eqs[eqs[0]].hasDirect() {
		n.evals++
		v, err := sys.Eqs[eqs[0]].solveFor(n.x, vars[0])
		if err == nil && finite(v) {
			n.x[vars[0]] = v
			return nil
		}
		if err != errNoDirect {
			if err == nil {
				err = errNotFinite
			}
			return &blockError{reason: "no state satisfies " + sys.Eqs[eqs[0]].Label, prop: err}
		}
	}
	for _, v := range vars {
		n.x[v] = n.guess(v)
	}
	k := len(eqs)
	r, scale, jac, dx, x0 := n.work(k)
	var colMap map[int]int
	if k > 8 {
		colMap = make(map[int]int, k)
		for j, v := range vars {
			colMap[v] = j
		}
	}
	col := func(v int) (int, bool) {
		if colMap != nil {
			j, ok := colMap[v]
			return j, ok
		}
		for j, w := range vars {
			if w == v {
				return j, true
			}
		}
		return 0, false
	}
	eval := func(out []float64, keepScale bool) (float64, error) {
		worst := 0.0
		for i, e := range eqs {
			n.evals++
			res, sc, err := sys.Residual(e, n.x)
			if err != nil {
				return math.Inf(1), err
			}
			if !keepScale {
				scale[i] = sc
			}
			out[i] = res / scale[i]
			worst = max(worst, math.Abs(out[i]))
		}
		return worst, nil
	}
	norm, err := eval(r, false)
	if n.start != nil && !(err == nil && norm <= tolScaled) && n.nonlinear(eqs) {
		norm, err = n.tryStart(vars, x0, dx, scale, norm, err, eval, r)
	}
	if err != nil {
		return &blockError{reason: "cannot evaluate " + sys.Eqs[eqs[0]].Label + " at the first guess", prop: err}
	}
	g := n.g[:0]
	defer func() { n.g = g[:0] }()
	for it := 0; ; it++ {
		if norm <= tolScaled {
			return nil
		}
		if it >= n.maxIter {
			return &blockError{reason: fmt.Sprintf("the values did not settle within %d iterations", n.maxIter), miss: norm}
		}
		if n.ctx.Err() != nil {
			return errTimeout
		}
		clear(jac)
		for i, e := range eqs {
			eq := &sys.Eqs[e]
			g = g[:0]
			for range eq.Vars {
				g = append(g, 0)
			}
			sys.gradient(e, n.x, g)
			n.evals += 1 + 2*len(g)*b2i(eq.grad == nil && eq.lin == nil && eq.en == nil)
			for a, v := range eq.Vars {
				if j, ok := col(v); ok {
					jac[i*k+j] += g[a] / scale[i]
				}
			}
		}
		for i := range r {
			dx[i] = -r[i]
		}
		if !luSolve(jac, dx, k) {
			return &blockError{reason: "these equations do not fix these values: some of them can change together without upsetting any equation", singular: true}
		}
		for j, v := range vars {
			x0[j] = n.x[v]
		}
		t := 1.0
		accepted := false
		for h := 0; h < maxHalvings; h++ {
			for j, v := range vars {
				n.x[v] = x0[j] + t*dx[j]
			}
			nn, err := eval(r, true)
			if err == nil && nn < norm*(1-1e-4*t) || err == nil && nn <= tolScaled {
				norm, _ = eval(r, false)
				accepted = true
				break
			}
			t /= 2
		}
		if !accepted {
			for j, v := range vars {
				n.x[v] = x0[j]
			}
			return &blockError{reason: "no values satisfy these equations together", miss: norm}
		}
	}
}

// nonlinear reports whether a block has an equation through IF97 (one without an analytic
// gradient): Newton's method solves the linear and bilinear balances in one step from any
// start, so only such a block gains by starting nearer.
func (n *newton) nonlinear(eqs []int) bool {
	for _, e := range eqs {
		if n.sys.Eqs[e].grad == nil {
			return true
		}
	}
	return false
}

// tryStart puts the block's unknowns at their values of an earlier solution and keeps them
// there when the equations hold better than at the first guesses (a neighbour's value is exact
// for a tee or a valve, the earlier solution nearer for the rest); it returns the block's norm
// and error at the start kept. x0 and tmp are scratch; scale is the block's, set by eval.
func (n *newton) tryStart(vars []int, x0, tmp, scale []float64, norm float64, err error, eval func([]float64, bool) (float64, error), r []float64) (float64, error) {
	moved := false
	for j, v := range vars {
		x0[j] = n.x[v]
		if w, ok := n.start(v); ok && w != n.x[v] {
			n.x[v], moved = w, true
		}
	}
	if !moved {
		return norm, err
	}
	if err != nil { // the first guesses could not be evaluated: take the start whatever it gives
		return eval(r, false)
	}
	kept := slices.Clone(scale)
	if nn, e2 := eval(tmp, false); e2 == nil && nn < norm {
		copy(r, tmp)
		return nn, nil
	}
	copy(scale, kept)
	for j, v := range vars {
		n.x[v] = x0[j]
	}
	return norm, err
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// luSolve solves a x = b in place (b becomes x) by Gaussian elimination with partial pivoting.
func luSolve(a, b []float64, n int) bool {
	for c := 0; c < n; c++ {
		p := c
		for r := c + 1; r < n; r++ {
			if math.Abs(a[r*n+c]) > math.Abs(a[p*n+c]) {
				p = r
			}
		}
		if !(math.Abs(a[p*n+c]) > 1e-300) || !finite(a[p*n+c]) {
			return false
		}
		if p != c {
			for j := 0; j < n; j++ {
				a[p*n+j], a[c*n+j] = a[c*n+j], a[p*n+j]
			}
			b[p], b[c] = b[c], b[p]
		}
		for r := c + 1; r < n; r++ {
			f := a[r*n+c] / a[c*n+c]
			if f == 0 {
				continue
			}
			for j := c; j < n; j++ {
				a[r*n+j] -= f * a[c*n+j]
			}
			b[r] -= f * b[c]
		}
	}
	for c := n - 1; c >= 0; c-- {
		s := b[c]
		for j := c + 1; j < n; j++ {
			s -= a[c*n+j] * b[j]
		}
		b[c] = s / a[c*n+c]
		if !finite(b[c]) {
			return false
		}
	}
	return true
}
