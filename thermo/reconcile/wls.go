package reconcile

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// step is one linearised reconciliation problem in units of the measurements' standard
// deviations. The d measurements the solver matched to unknowns are the free inputs; w is the
// change of their corrections. The normalised corrections of all measurements are
//
//	v = k + B w,   B = [I_d; Am]   (the matched measurements, then the leftover ones)
//
// and the redundant equations that are no measurements must hold: Ac w = -bc. The step minimises
// |v|² subject to that: the weighted least-squares problem of data reconciliation, Gauss-Newton
// linearised (the practice of VDI 2048 Part 1; Narasimhan and Jordache, Data Reconciliation and
// Gross Error Detection, 2000, Ch. 3 and 5, from memory).
type step struct {
	d  int
	k  []float64  // d + leftover measurements
	am *mat.Dense // leftover measurements × d; nil when there are none
	ac *mat.Dense // leftover constraints × d; nil when there are none
	bc []float64
}

// stepResult is the solution of a step and the statistics of the linear problem.
type stepResult struct {
	w []float64 // change of the matched measurements' normalised corrections
	v []float64 // normalised corrections of every measurement after the step
	// rho is each measurement's redundancy: the share of its variance the balances check,
	// Var(v_i)/σ_i² = 1 - h_ii, in 0..1 (0: no balance checks it). The shares add up to the
	// redundancy of the whole system.
	rho []float64
	q   int // free directions: inputs less independent leftover constraints
	// nr is N R⁻¹ (d × q): the covariance of w is nr nrᵀ, in units of σ.
	nr *mat.Dense
	// comp spans the complement of the range of G = B N (measurements × (measurements - q)):
	// the normalised corrections are comp compᵀ k', and corr(v_i, v_j) follows from its rows.
	comp *mat.Dense
	// miss is the largest residual of Ac w = -bc that the step could not remove: leftover
	// constraints that contradict each other whatever the measurements say.
	miss float64
}

// rankTol is the relative singular value below which a direction of the leftover constraints
// counts as absent (a balance that is the sum of others, a closed loop's identity).
const rankTol = 1e-10

func (p *step) solve() (*stepResult, bool) {
	d := p.d
	nm := len(p.k)
	// Null space of Ac and the least-norm w that satisfies it (SVD).
	var n *mat.Dense // d × q
	wp := make([]float64, d)
	res := &stepResult{}
	if p.ac == nil || d == 0 {
		n = identity(d)
	} else {
		var svd mat.SVD
		if !svd.Factorize(p.ac, mat.SVDFull) {
			return nil, false
		}
		s := svd.Values(nil)
		rank := 0
		for _, sv := range s {
			if sv > rankTol*s[0] && s[0] > 0 {
				rank++
			}
		}
		var u, v mat.Dense
		svd.UTo(&u)
		svd.VTo(&v)
		for i := 0; i < rank; i++ {
			var c float64
			for r := range p.bc {
				c -= u.At(r, i) * p.bc[r]
			}
			c /= s[i]
			for j := 0; j < d; j++ {
				wp[j] += c * v.At(j, i)
			}
		}
		if rank < d {
			n = mat.DenseCopyOf(v.Slice(0, d, rank, d))
		}
		for r := range p.bc {
			var sum float64
			for j := 0; j < d; j++ {
				sum += p.ac.At(r, j) * wp[j]
			}
			res.miss = max(res.miss, math.Abs(sum+p.bc[r]))
		}
	}
	q := 0
	if n != nil {
		_, q = n.Dims()
	}
	res.q = q
	// G = B N and c = k + B wp.
	c := make([]float64, nm)
	copy(c, p.k)
	for j := 0; j < d; j++ {
		c[j] += wp[j]
	}
	if p.am != nil {
		for r := d; r < nm; r++ {
			for j := 0; j < d; j++ {
				c[r] += p.am.At(r-d, j) * wp[j]
			}
		}
	}
	res.w = wp
	res.rho = make([]float64, nm)
	if q == 0 {
		// Nothing is free: every correction is fixed, and fully checked.
		res.v = c
		for i := range res.rho {
			res.rho[i] = 1
		}
		res.nr = nil
		res.comp = identity(nm)
		return res, true
	}
	g := mat.NewDense(nm, q, nil)
	g.Slice(0, d, 0, q).(*mat.Dense).Copy(n)
	if p.am != nil {
		g.Slice(d, nm, 0, q).(*mat.Dense).Mul(p.am, n)
	}
	var qr mat.QR
	qr.Factorize(g)
	var qf, rf mat.Dense
	qr.QTo(&qf)
	qr.RTo(&rf)
	r := mat.NewTriDense(q, mat.Upper, nil)
	for i := 0; i < q; i++ {
		for j := i; j < q; j++ {
			r.SetTri(i, j, rf.At(i, j))
		}
	}
	var rinv mat.TriDense
	if err := rinv.InverseTri(r); err != nil {
		if _, ok := err.(mat.Condition); !ok {
			return nil, false
		}
	}
	// z = -R⁻¹ Q1ᵀ c; v = Q2 Q2ᵀ c.
	q1c := make([]float64, q)
	for j := 0; j < q; j++ {
		for i := 0; i < nm; i++ {
			q1c[j] += qf.At(i, j) * c[i]
		}
	}
	z := make([]float64, q)
	for i := 0; i < q; i++ {
		for j := i; j < q; j++ {
			z[i] -= rinv.At(i, j) * q1c[j]
		}
	}
	res.w = make([]float64, d)
	for j := 0; j < d; j++ {
		s := wp[j]
		for k := 0; k < q; k++ {
			s += n.At(j, k) * z[k]
		}
		res.w[j] = s
	}
	res.v = make([]float64, nm)
	if nm > q {
		comp := mat.DenseCopyOf(qf.Slice(0, nm, q, nm))
		res.comp = comp
		q2c := make([]float64, nm-q)
		for j := range q2c {
			for i := 0; i < nm; i++ {
				q2c[j] += comp.At(i, j) * c[i]
			}
		}
		for i := 0; i < nm; i++ {
			var s, rho float64
			for j := range q2c {
				s += comp.At(i, j) * q2c[j]
				rho += comp.At(i, j) * comp.At(i, j)
			}
			res.v[i] = s
			res.rho[i] = min(rho, 1)
		}
	}
	res.nr = mat.NewDense(d, q, nil)
	res.nr.Mul(n, &rinv)
	return res, true
}

func identity(n int) *mat.Dense {
	if n == 0 {
		return nil
	}
	m := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		m.Set(i, i, 1)
	}
	return m
}

// corr is the correlation of the normalised corrections of measurements i and j.
func (r *stepResult) corr(i, j int) float64 {
	if r.comp == nil || r.rho[i] <= 0 || r.rho[j] <= 0 {
		return 0
	}
	_, c := r.comp.Dims()
	var s float64
	for k := 0; k < c; k++ {
		s += r.comp.At(i, k) * r.comp.At(j, k)
	}
	return s / math.Sqrt(r.rho[i]*r.rho[j])
}
