package reconcile

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// The linear reconciliation of one step, in units of the measurements' standard deviations.
// With v the normalised corrections of all measurements ((reconciled - measured)/σ), the
// linearised equations that hold among them are C v = c, and the step finds
//
//	min |v|²  subject to  C v = c,   so  v = Cᵀ (C Cᵀ)⁻¹ c,
//
// the weighted least-squares reconciliation in its closed form x = m - Σ Aᵀ (A Σ Aᵀ)⁻¹ A m
// (Narasimhan and Jordache, Data Reconciliation and Gross Error Detection, 2000, Ch. 3, from
// memory; the practice of VDI 2048 Part 1). It is solved through a QR factorisation of Cᵀ:
// C Cᵀ is never formed. With Cᵀ = [Q1 Q2] [R; 0], the corrections' covariance is Q1 Q1ᵀ and the
// reconciled values' Q2 Q2ᵀ (for measurements drawn with their stated σ): the redundancy of
// measurement i is |row i of Q1|², and the degrees of freedom of the global test are the rank
// of C.

// depTol is the size of a QR diagonal, relative to its row of C, below which that row is taken
// as a combination of the rows before it (a balance that is the sum of others).
const depTol = 1e-10

// lsq is the solution of one step.
type lsq struct {
	v    []float64 // normalised corrections
	keep []int     // rows of C that are independent; their number is the redundancy
	miss float64   // largest residual of a dependent row: rows that contradict each other
	qr   *mat.QR   // of the kept rows of Cᵀ; nil when there are none
	m    int       // measurements
}

// minNorm solves min |v|² subject to C v = c for C with rows rows and m columns (row-major).
func minNorm(cm []float64, c []float64, m int) (*lsq, bool) {
	rows := len(c)
	out := &lsq{v: make([]float64, m), m: m}
	var cand []int
	for i := 0; i < rows; i++ {
		if rowNorm(cm[i*m:(i+1)*m]) > 0 {
			cand = append(cand, i)
		}
	}
	// Rows are taken in order, at most m at a time (a QR needs no more columns than rows), and
	// each that its predecessors already span is dropped.
	var keep []int
	var qr *mat.QR
	for len(cand) > 0 && len(keep) < m {
		n := min(len(cand), m-len(keep))
		try := append(append([]int(nil), keep...), cand[:n]...)
		cand = cand[n:]
		for {
			qr = factorRows(cm, try, m)
			var r mat.Dense
			qr.RTo(&r)
			next := try[:0:0]
			for j, i := range try {
				if math.Abs(r.At(j, j)) > depTol*rowNorm(cm[i*m:(i+1)*m]) {
					next = append(next, i)
				}
			}
			if len(next) == len(try) {
				break
			}
			try = next
			if len(try) == 0 {
				qr = nil
				break
			}
		}
		keep = try
	}
	out.keep = keep
	if len(keep) > 0 {
		b := mat.NewDense(len(keep), 1, nil)
		for j, i := range keep {
			b.Set(j, 0, c[i])
		}
		var v mat.Dense
		if err := qr.SolveTo(&v, true, b); err != nil {
			if _, ok := err.(mat.Condition); !ok {
				return nil, false
			}
		}
		for k := 0; k < m; k++ {
			out.v[k] = v.At(k, 0)
		}
		out.qr = qr
	}
	// Rows left out must hold too: a dependent row whose c disagrees is a contradiction.
	kept := make([]bool, rows)
	for _, i := range keep {
		kept[i] = true
	}
	for i := 0; i < rows; i++ {
		if kept[i] {
			continue
		}
		s := -c[i]
		for k := 0; k < m; k++ {
			s += cm[i*m+k] * out.v[k]
		}
		out.miss = max(out.miss, math.Abs(s))
	}
	return out, true
}

// factorRows is the QR factorisation of the chosen rows of C, transposed.
func factorRows(cm []float64, rows []int, m int) *mat.QR {
	ct := mat.NewDense(m, len(rows), nil)
	for j, i := range rows {
		for k := 0; k < m; k++ {
			ct.Set(k, j, cm[i*m+k])
		}
	}
	qr := new(mat.QR)
	qr.Factorize(ct)
	return qr
}

func rowNorm(r []float64) float64 {
	s := 0.0
	for _, x := range r {
		s += x * x
	}
	return math.Sqrt(s)
}

// stats are the statistics of the linear problem at the reconciled values.
type stats struct {
	rho  []float64  // each measurement's redundancy, |row of Q1|², 0..1
	q1   *mat.Dense // m × redundancy: Cov(v) = q1 q1ᵀ; nil when nothing is redundant
	q2   *mat.Dense // m × (m - redundancy): Cov(reconciled) = q2 q2ᵀ (σ units); nil when all is
	rank int
}

// statistics completes the solution with the covariance factors.
func (s *lsq) statistics() *stats {
	m, r := s.m, len(s.keep)
	st := &stats{rho: make([]float64, m), rank: r}
	if r == 0 {
		st.q2 = identity(m)
		return st
	}
	var q mat.Dense
	s.qr.QTo(&q)
	st.q1 = mat.DenseCopyOf(q.Slice(0, m, 0, r))
	if r < m {
		st.q2 = mat.DenseCopyOf(q.Slice(0, m, r, m))
	}
	for i := 0; i < m; i++ {
		st.rho[i] = min(rowNorm(st.q1.RawRowView(i))*rowNorm(st.q1.RawRowView(i)), 1)
	}
	return st
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
func (s *stats) corr(i, j int) float64 {
	if s.q1 == nil || s.rho[i] <= 0 || s.rho[j] <= 0 {
		return 0
	}
	a, b := s.q1.RawRowView(i), s.q1.RawRowView(j)
	var sum float64
	for k := range a {
		sum += a[k] * b[k]
	}
	return sum / math.Sqrt(s.rho[i]*s.rho[j])
}
