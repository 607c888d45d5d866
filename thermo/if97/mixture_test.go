package if97

import (
	"math"
	"testing"
)

// TestSatEndsMix: the light saturated ends carry the same bits as satEnds in every field a
// mixture is made of, along the line from the triple point to 623.15 K.
func TestSatEndsMix(t *testing.T) {
	for k := 0; k <= 2000; k++ {
		pm := pTriple * math.Pow(pSat623/pTriple, float64(k)/2000)
		ts := clampT(tsat(pm))
		if ts > t13 {
			continue // satEnds takes region 3 there, and so does pressureAnd
		}
		l, v, err := satEnds(pm, ts)
		if err != nil {
			t.Fatal(err)
		}
		ml, mv := satEndsMix(pm, ts)
		for _, c := range [][2]State{{l, ml}, {v, mv}} {
			full, lite := c[0], c[1]
			for _, f := range [][2]float64{{full.P, lite.P}, {full.T, lite.T}, {full.V, lite.V}, {full.U, lite.U}, {full.H, lite.H}, {full.S, lite.S}} {
				if math.Float64bits(f[0]) != math.Float64bits(f[1]) {
					t.Fatalf("at %g MPa: satEnds %v, satEndsMix %v", pm, full, lite)
				}
			}
		}
	}
}
