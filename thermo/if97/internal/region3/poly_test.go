package region3

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestGeneratedSums: each generated sum returns the same bits as the generic loop over its
// table (powers formed by the same products, terms added in the same order), at random points.
func TestGeneratedSums(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	for _, g := range genSums {
		p := newPoly(g.rows) // without fast: the loop
		if !p.usable {
			t.Fatalf("%s: exponents outside the power tables", g.name)
		}
		for range 2000 {
			x, y := 0.2+r.Float64(), 0.2+r.Float64()
			want, got := p.sum(x, y), g.sum(x, y)
			if math.Float64bits(want) != math.Float64bits(got) {
				t.Fatalf("%s(%g, %g) = %.17g, the loop gives %.17g", g.name, x, y, got, want)
			}
		}
	}
}
