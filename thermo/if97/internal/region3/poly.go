package region3

// The backward and boundary equations of the supplementary releases are all
// sums of the form  sum n_i * x^I_i * y^J_i  with integer exponents between
// -12 and 36. A poly evaluates one such sum from two tables of powers built
// by repeated squaring, so no term needs math.Pow and no call allocates.

// term is one row of a coefficient table: exponents I, J and coefficient n.
type term struct {
	i, j int8
	n    float64
}

const (
	minExp  = -12
	maxExp  = 36
	nPowers = maxExp - minExp + 1
)

// poly is a coefficient table together with the exponent range it needs.
type poly struct {
	terms    []term
	ilo, ihi int
	jlo, jhi int
	usable   bool // exponents all lie in [minExp, maxExp]
	// fast is the table's sum as straight-line code (poly_gen.go, by ../polygen): the same bits
	// as the loop in sum, which remains for a table without it.
	fast func(x, y float64) float64
}

func newPoly(t []term) poly {
	p := poly{terms: t, ilo: maxExp, ihi: minExp, jlo: maxExp, jhi: minExp, usable: len(t) > 0}
	for _, r := range t {
		i, j := int(r.i), int(r.j)
		p.ilo, p.ihi = min(p.ilo, i), max(p.ihi, i)
		p.jlo, p.jhi = min(p.jlo, j), max(p.jhi, j)
		if i < minExp || i > maxExp || j < minExp || j > maxExp {
			p.usable = false
		}
	}
	return p
}

// powers fills tab[k-minExp] = x^k for lo <= k <= hi. Each power is the
// product of two smaller ones (x^k = x^(k/2) * x^(k-k/2)), so x^36 carries
// about six roundings instead of the 35 of a plain running product.
func powers(tab *[nPowers]float64, x float64, lo, hi int) {
	const z = -minExp
	tab[z] = 1
	if hi >= 1 {
		tab[z+1] = x
		for k := 2; k <= hi; k++ {
			tab[z+k] = tab[z+k/2] * tab[z+k-k/2]
		}
	}
	if lo <= -1 {
		r := 1 / x
		tab[z-1] = r
		for k := 2; k <= -lo; k++ {
			tab[z-k] = tab[z-k/2] * tab[z-k+k/2]
		}
	}
}

// sum returns sum n_i x^I_i y^J_i in table order (the order of the release).
func (p *poly) sum(x, y float64) float64 {
	if !p.usable {
		return nan()
	}
	if p.fast != nil {
		return p.fast(x, y)
	}
	var px, py [nPowers]float64
	powers(&px, x, p.ilo, p.ihi)
	powers(&py, y, p.jlo, p.jhi)
	s := 0.0
	for _, t := range p.terms {
		s += t.n * px[int(t.i)-minExp] * py[int(t.j)-minExp]
	}
	return s
}
