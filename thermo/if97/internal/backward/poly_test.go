package backward

import (
	"math"
	"math/rand/v2"
	"testing"
)

// powers sets p[k] = x^k for 0 <= k < len(p). Each power is the product of two lower ones
// (x^k = x^(k/2)·x^(k-k/2)), so the multiplications form a tree of depth log2(len) rather than
// a chain, and no math.Pow is needed.
func powers(p []float64, x float64) {
	if len(p) == 0 {
		return
	}
	p[0] = 1
	if len(p) == 1 {
		return
	}
	p[1] = x
	for k := 2; k < len(p); k++ {
		p[k] = p[k>>1] * p[k-k>>1]
	}
}

// powersSigned sets p[lo+k] = x^k for -lo <= k < len(p)-lo, for exponent ranges that reach
// below zero. Negative powers come from 1/x, one division.
func powersSigned(p []float64, lo int, x float64) {
	powers(p[lo:], x)
	if lo == 0 {
		return
	}
	p[lo-1] = 1 / x
	for k := 2; k <= lo; k++ {
		p[lo-k] = p[lo-k>>1] * p[lo-(k-k>>1)]
	}
}

// sum returns Σ n·x[i+xo]·y[j+yo] over tab, where x and y hold powers laid out by powers or
// powersSigned (xo and yo are their offsets).
func sum(tab []term, x []float64, xo int, y []float64, yo int) float64 {
	s := 0.0
	for _, t := range tab {
		s += t.n * x[int(t.i)+xo] * y[int(t.j)+yo]
	}
	return s
}

// TestGeneratedSums: each generated sum returns the same bits as the generic loop over its
// table (powers formed by the same products, terms added in the same order), at random points
// over the ranges the equations use.
func TestGeneratedSums(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for _, g := range genSums {
		ilo, jlo, ihi, jhi := 0, 0, 0, 0
		for _, t := range g.rows {
			ilo, ihi = min(ilo, int(t.i)), max(ihi, int(t.i))
			jlo, jhi = min(jlo, int(t.j)), max(jhi, int(t.j))
		}
		for range 2000 {
			x, y := 0.05+2*r.Float64(), -1.5+3*r.Float64()
			if ilo < 0 {
				x = 0.2 + r.Float64()
			}
			if jlo < 0 {
				y = 0.2 + r.Float64()
			}
			xp, yp := make([]float64, ihi-ilo+1), make([]float64, jhi-jlo+1)
			powersSigned(xp, -ilo, x)
			powersSigned(yp, -jlo, y)
			want, got := sum(g.rows, xp, -ilo, yp, -jlo), g.sum(x, y)
			if math.Float64bits(want) != math.Float64bits(got) {
				t.Fatalf("%s(%g, %g) = %.17g, the loop gives %.17g", g.name, x, y, got, want)
			}
		}
	}
}
