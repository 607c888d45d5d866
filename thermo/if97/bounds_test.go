package if97

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestCurveSides: a tabulated dividing line never contradicts the line itself. At random
// pressures over each table, values of h or s close to the line (within 1 %, where the tables'
// bands lie) and further off are placed against the exact value; the table must either agree or
// decline to answer, and it must answer for values well clear of the line.
func TestCurveSides(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for _, k := range []second{byH, byS} {
		l := &boundaries[k]
		for _, c := range []struct {
			name string
			c    *curve
		}{{"liq", &l.liq}, {"vap", &l.vap}, {"b23", &l.b23}, {"top1", &l.top1}, {"min1", &l.min1}, {"max2", &l.max2}, {"liq3", &l.liq3}, {"vap3", &l.vap3}} {
			answered, clear := 0, 0
			for range 4000 {
				pm := c.c.pLo * math.Pow(c.c.pHi/c.c.pLo, r.Float64())
				f := c.c.f(pm)
				if math.IsNaN(f) {
					continue
				}
				for _, rel := range []float64{-0.05, -0.01, -1e-4, -1e-9, 0, 1e-9, 1e-4, 0.01, 0.05} {
					y := f + rel*math.Abs(f) + rel
					switch c.c.side(pm, math.Log(pm), y) {
					case -1:
						if !(y < f) {
							t.Fatalf("%s %s at %g MPa: %.17g said below %.17g", k.name(), c.name, pm, y, f)
						}
						answered++
					case 1:
						if !(y > f) {
							t.Fatalf("%s %s at %g MPa: %.17g said above %.17g", k.name(), c.name, pm, y, f)
						}
						answered++
					default:
						if math.Abs(rel) == 0.05 {
							clear++
						}
					}
				}
			}
			// Where a line is steep in ln p (near the critical point, liquid at 100 MPa) an
			// interval spans more than 5 %; the table should still answer for most values.
			if clear > 2000 {
				t.Errorf("%s %s: no answer for %d of 8000 values 5 %% off the line", k.name(), c.name, clear)
			}
			if answered == 0 {
				t.Errorf("%s %s: never answered", k.name(), c.name)
			}
		}
	}
}
