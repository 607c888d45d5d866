package region3

import (
	"math"
	"testing"
)

// Round trips over the region 3 grid of region3PT (T 623.15..863.15 K,
// p_B23(T)..100 MPa, both sides of the saturation line and around the
// critical point): RhoPT must reproduce p; the 2-D solves must reproduce
// their inputs and give back the (rho, T) of the state.
func TestRoundTrips(t *testing.T) {
	worstRho, worstT := 0.0, 0.0
	for _, pt := range region3PT() {
		p, T := pt[0], pt[1]
		rho, ok := RhoPT(p, T)
		if !ok {
			t.Errorf("RhoPT(%g, %g) failed", p, T)
			continue
		}
		pr := Eval(rho, T)
		if d := relDiff(pr.P, p); d > 1e-11 {
			t.Errorf("RhoPT(%g, %g) = %g: p back %.15g (rel %.2g)", p, T, rho, pr.P, d)
		}
		// Right branch: below Tc, compressed liquid above psat and vapour
		// below; and near the start (the near-critical auxiliary equations of
		// SR5-05 are within 2 % of the basic equation, e.g. 1.5 % at 22.05 MPa, 647 K).
		if T < Tc && (p > psat4(T)) != (rho > Rc) {
			t.Errorf("RhoPT(%g, %g) = %g: wrong phase", p, T, rho)
		}
		if d := math.Abs(rho*VPT(p, T) - 1); d > 0.02 {
			t.Errorf("RhoPT(%g, %g) = %g is %.2g away from VPT: wrong root?", p, T, rho, d)
		}
		for _, c := range []struct {
			name   string
			f      func(a, b float64) (float64, float64, bool)
			a, b   float64
			ga, gb func(*Props) float64
		}{
			{"SolvePH", SolvePH, p, pr.H, func(q *Props) float64 { return q.P }, func(q *Props) float64 { return q.H }},
			{"SolvePS", SolvePS, p, pr.S, func(q *Props) float64 { return q.P }, func(q *Props) float64 { return q.S }},
			{"SolveHS", SolveHS, pr.H, pr.S, func(q *Props) float64 { return q.H }, func(q *Props) float64 { return q.S }},
		} {
			r2, T2, ok := c.f(c.a, c.b)
			if !ok {
				t.Errorf("%s(%.15g, %.15g) failed (state p=%g MPa, T=%g K)", c.name, c.a, c.b, p, T)
				continue
			}
			q := Eval(r2, T2)
			if d1, d2 := relDiff(c.ga(&q), c.a), relDiff(c.gb(&q), c.b); d1 > 1e-11 || d2 > 1e-11 {
				t.Errorf("%s(%g, %g): inputs back with rel %.2g, %.2g", c.name, c.a, c.b, d1, d2)
			}
			dT, dr := relDiff(T2, T), relDiff(r2, rho)
			worstT, worstRho = max(worstT, dT), max(worstRho, dr)
			// Near the critical point (dp/drho)_T -> 0 and a 1e-13 change of
			// p moves rho much more, so rho and T are checked loosely there.
			if dT > 1e-9 || dr > 1e-6 {
				t.Errorf("%s at (p=%g, T=%g): T %.12g (rel %.2g), rho %.12g vs %.12g (rel %.2g)", c.name, p, T, T2, dT, r2, rho, dr)
			}
		}
	}
	t.Logf("largest relative deviation of the 2-D solves: T %.2g, rho %.2g", worstT, worstRho)
}

// TestSatRho checks that the liquid and vapour roots at psat(T) are distinct,
// stable and reproduce psat, from 623.15 K up to 0.001 K below Tc.
func TestSatRho(t *testing.T) {
	for _, T := range []float64{623.15, 630, 635, 640, 643.15, 645, 646, 647, 647.05, 647.09, 647.095} {
		ps := psat4(T) // IAPWS R7-97(2012) Eq. 30
		rl, rv, ok := SatRho(T, ps)
		if !ok {
			t.Errorf("SatRho(%g, %g) failed", T, ps)
			continue
		}
		for _, r := range []float64{rl, rv} {
			q := Eval(r, T)
			if d := relDiff(q.P, ps); d > 1e-11 || q.DpDrho <= 0 {
				t.Errorf("SatRho(%g): rho %g gives p rel %.2g, dp/drho %g", T, r, d, q.DpDrho)
			}
		}
		if !(rl > Rc && rv < Rc) {
			t.Errorf("SatRho(%g) = %g, %g: not on both sides of the critical density", T, rl, rv)
		}
	}
	if _, _, ok := SatRho(Tc, Pc); ok {
		t.Error("SatRho(Tc) reported ok")
	}
}

// TestBadInput: no panic, no number from nonsense.
func TestBadInput(t *testing.T) {
	for _, x := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, ok := RhoPT(x, 700); ok {
			t.Errorf("RhoPT(%g, 700) ok", x)
		}
		if _, _, ok := SolvePH(x, 2000); ok {
			t.Errorf("SolvePH(%g, 2000) ok", x)
		}
		if v := VPT(25, x); !math.IsNaN(v) {
			t.Errorf("VPT(25, %g) = %g", x, v)
		}
	}
}

func BenchmarkEval(b *testing.B) {
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += Eval(500, 650+float64(i&7)).P
	}
	_ = s
}

func BenchmarkRhoPT(b *testing.B) {
	for i := 0; i < b.N; i++ {
		RhoPT(25, 650+float64(i&7))
	}
}

func BenchmarkSolvePH(b *testing.B) {
	for i := 0; i < b.N; i++ {
		SolvePH(25, 2000+float64(i&7))
	}
}
