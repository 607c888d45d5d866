package backward

// term is one summand n·x^i·y^j of the polynomial form shared by every equation here.
// Exponents are small integers; where a release uses quarter exponents the table stores 4·I
// and says so.
type term struct {
	i, j int8
	n    float64
}

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
