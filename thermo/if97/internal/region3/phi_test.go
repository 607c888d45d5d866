package region3

import (
	"math"
	"testing"
)

// TestTauSums checks the generated straight-line sums against a plain loop over Table 30 (IAPWS
// R7-97(2012)), the table itself being checked against the release's verification values by
// TestTable33.
func TestTauSums(t *testing.T) {
	for tau := 0.7; tau <= 1.05; tau += 0.0013 {
		var want, size tauSums // size: the sums of the terms' magnitudes, which rounding scales with
		for _, r := range table30 {
			i, j := int(r.i), float64(r.j)
			y := r.n * math.Pow(tau, j)
			want[i].a += y
			want[i].b += j * y
			want[i].c += j * (j - 1) * y
			size[i].a += math.Abs(y)
			size[i].b += math.Abs(j * y)
			size[i].c += math.Abs(j * (j - 1) * y)
		}
		var got tauSums
		got.set(tau)
		for i := range want {
			w := want[i]
			w.ia, w.iia = float64(i)*w.a, float64(i*(i-1))*w.a
			sz := size[i]
			fi := float64(i)
			for k, c := range [][3]float64{{got[i].a, w.a, sz.a}, {got[i].b, w.b, sz.b}, {got[i].c, w.c, sz.c}, {got[i].ia, w.ia, fi * sz.a}, {got[i].iia, w.iia, fi * fi * sz.a}} {
				if d := math.Abs(c[0] - c[1]); d > 1e-14*c[2] {
					t.Errorf("tau %g, I %d, sum %d: %.17g, want %.17g", tau, i, k, c[0], c[1])
				}
			}
		}
	}
}
