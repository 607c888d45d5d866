package if97

import (
	"fmt"
	"math"

	"hmb/thermo/if97/internal/backward"
	"hmb/thermo/if97/internal/region3"
)

// Entropies (kJ/(kg K)) that split the h-s plane, IAPWS SR4-04(2014)
// Sec. 4 and Figs. 2-5.
const (
	sB13lo  = 3.397782955 // s(623.15 K, 100 MPa), region 1
	s13sat  = 3.778281340 // saturated liquid at 623.15 K
	sCrit   = 4.41202148223476
	sB23lo  = 5.048096828 // saturated vapour at 623.15 K (B23 starts)
	sB23hi  = 5.260578707 // s(863.15 K, 100 MPa)
	s2bc    = 5.85
	sVapMin = 9.155759395 // saturated vapour at 273.15 K
)

// HS returns the state with specific enthalpy h (J/kg) and entropy s
// (J/(kg K)): the region from the SR4-04 h-s boundaries, the backward
// equations p(h,s) as the start, Newton steps on the forward equations.
func HS(h, s float64) (State, error) {
	hk, sk := h*1e-3, s*1e-3
	if !finite(hk) {
		return State{}, notFinite("enthalpy", h)
	}
	if !finite(sk) {
		return State{}, notFinite("entropy", s)
	}
	var order []int
	if hk < hSatApprox(sk) {
		order = []int{4, singleRegionHS(hk, sk), 1, 2, 3, 5}
	} else {
		order = []int{singleRegionHS(hk, sk), 4, 1, 2, 3, 5}
	}
	for _, r := range order {
		if st, ok := solveHS(r, hk, sk); ok {
			return st, nil
		}
	}
	return State{}, fmt.Errorf("%w: h = %g kJ/kg, s = %g kJ/(kg K) is outside the range of IF97", ErrNoSolution, hk, sk)
}

// hSatApprox is the saturation line in the h-s plane, SR4-04(2014) Eqs. 3,
// 4, 5 and 7; below it a state is two-phase (or below 273.15 K).
func hSatApprox(s float64) float64 {
	switch {
	case s < -0.0002 || s > sVapMin:
		return math.Inf(-1)
	case s <= s13sat:
		return backward.HSat1(s)
	case s <= sCrit:
		return backward.HSat3(s)
	case s < s2bc:
		return backward.HSat2c3b(s)
	}
	return backward.HSat2ab(s)
}

// singleRegionHS picks the single-phase region by the SR4-04(2014)
// boundaries B13 (Eq. 7) and B23 (Eq. 8).
func singleRegionHS(h, s float64) int {
	switch {
	case s <= sB13lo:
		return 1
	case s <= s13sat && h <= backward.HB13(s):
		return 1
	case s < sB23lo:
		return 3
	case s < sB23hi:
		if backward.P2hs(h, s) > pB23(backward.TB23hs(h, s)) {
			return 3
		}
	}
	return 2
}

func solveHS(region int, h, s float64) (State, bool) {
	switch region {
	case 4:
		return domeHS(h, s)
	case 3:
		pt, ok := region3.PointHS(h, s)
		rho, t := pt.Rho, pt.T
		if !ok || t < t13 {
			return State{}, false
		}
		st := state3(pt)
		pm := st.P * 1e-6
		if pm > pMax*(1+1e-9) || pm < pB23(t) {
			return State{}, false
		}
		if t < tCrit && pm < psat(t) == (rho > rhoCrit) {
			return State{}, false
		}
		return st, true
	}
	var pm, t float64
	switch region {
	case 1:
		pm = backward.P1hs(h, s)
		t = backward.T1ph(pm, h)
	case 2:
		pm = backward.P2hs(h, s)
		t = backward.T2ph(pm, h)
	case 5:
		t0, _ := solveT(5, 1, h, byH, tMax25, tMax)
		t = t0.T
		pm = math.Exp((t0.S*1e-3 - s) / rGas)
	}
	if !(pm > 0) || !finite(pm) || !(t > 0) || !finite(t) {
		return State{}, false
	}
	var pr props
	for i := 0; i < 50; i++ {
		pr = gibbsRegion(region, pm, t)
		fh, fs := pr.h-h, pr.s-s
		// Jacobian in (p MPa, T K): dh/dT = cp, ds/dT = cp/T,
		// dh/dp = v(1 - T alpha), ds/dp = -v alpha (kJ/kg per MPa).
		hp := pr.v * (1 - t*pr.alpha) * 1e3
		sp := -pr.v * pr.alpha * 1e3
		det := hp*pr.cp/t - pr.cp*sp
		dp := (fh*pr.cp/t - fs*pr.cp) / det
		dt := (fs*hp - fh*sp) / det
		if !finite(dp) || !finite(dt) {
			return State{}, false
		}
		if pm-dp <= 0 {
			dp = 0.5 * pm
		}
		pm -= dp
		t -= dt
		if t < 200 || t > 2500 {
			return State{}, false
		}
		if math.Abs(dp) <= 1e-13*pm && math.Abs(dt) <= 1e-13*t {
			break
		}
	}
	// A solution on an edge of the range lands a rounding error outside.
	pm = snap(pm, pMax)
	pm = snap(pm, pMax5)
	t = snap(t, tMin)
	t = snap(t, tMax25)
	t = snap(t, tMax)
	pr = gibbsRegion(region, pm, t)
	if math.Abs(pr.h-h) > 1e-11*math.Max(math.Abs(h), 1) || math.Abs(pr.s-s) > 1e-11*math.Max(math.Abs(s), 1) {
		return State{}, false
	}
	if checkPT(pm, t) != nil {
		return State{}, false
	}
	r, err := regionPT(pm, t)
	if err == ErrOnSaturation && region != 5 {
		// On the saturation line to within 1e-9 in T: a saturated end.
		st := single(pr, region)
		st.X, st.Phase = 0, SatLiquid
		if region == 2 {
			st.X, st.Phase = 1, SatVapor
		}
		st.Region = 4
		return st, true
	}
	if err != nil || r != region {
		return State{}, false
	}
	return single(pr, region), true
}

// domeHS solves a two-phase (h,s): the temperature where the mix of the
// saturated ends with the quality that gives s also gives h. Along an
// isentrope in the dome h rises with T, so a bracketed secant converges.
func domeHS(h, s float64) (State, bool) {
	f := func(t float64) (float64, State, State, bool) {
		liq, vap, err := satEnds(psat(t), t)
		if err != nil {
			return 0, liq, vap, false
		}
		x := (s - liq.S*1e-3) / (vap.S*1e-3 - liq.S*1e-3)
		return liq.H*1e-3 + x*(vap.H-liq.H)*1e-3 - h, liq, vap, true
	}
	// Fast path: SR4-04(2014) Eq. 9, Tsat(h,s), holds for s >= s''(623.15 K);
	// from there a few secant steps on the forward equations.
	if s >= sB23lo {
		if st, ok := domeSecant(h, s, backward.TSatHS(h, s), f); ok {
			return st, true
		}
	}
	lo, hi := tMin, satEdge(s)
	flo, _, _, ok1 := f(lo)
	fhi, _, _, ok2 := f(hi)
	tol := 1e-12 * math.Max(math.Abs(h), 1)
	if !ok1 || !ok2 || flo > tol || fhi < -tol {
		return State{}, false
	}
	t := backward.TSatHS(h, s)
	if !(t > lo && t < hi) {
		t = lo - flo*(hi-lo)/(fhi-flo)
	}
	var liq, vap State
	for i := 0; i < 200; i++ {
		ft, l, v, ok := f(t)
		if !ok {
			return State{}, false
		}
		liq, vap = l, v
		if ft == 0 {
			break
		}
		if ft > 0 {
			hi, fhi = t, ft
		} else {
			lo, flo = t, ft
		}
		tn := lo - flo*(hi-lo)/(fhi-flo)
		// Fall back to bisection when the secant stalls at one end.
		if i%3 == 2 || !(tn > lo && tn < hi) {
			tn = 0.5 * (lo + hi)
		}
		if math.Abs(tn-t) <= 1e-13*t || hi-lo <= 1e-13*t {
			t = tn
			break
		}
		t = tn
	}
	liq, vap, err := satEnds(psat(t), t)
	if err != nil {
		return State{}, false
	}
	x := (s - liq.S*1e-3) / (vap.S*1e-3 - liq.S*1e-3)
	if !(x >= -1e-9 && x <= 1+1e-9) {
		return State{}, false
	}
	return mix(liq, vap, math.Min(math.Max(x, 0), 1)), true
}

// satEdge is the temperature where the isentrope s (kJ/(kg K)) meets the
// saturation line: on the liquid side below the critical entropy, on the
// vapour side above. Bisection: the liquid's entropy rises with T, the vapour's falls.
func satEdge(s float64) float64 {
	lo, hi := tMin, tCrit
	for hi-lo > 1e-12*hi {
		m := 0.5 * (lo + hi)
		liq, vap, err := satEnds(psat(m), m)
		if err != nil {
			return lo
		}
		var inside bool
		if s <= sCrit {
			inside = liq.S*1e-3 <= s
		} else {
			inside = vap.S*1e-3 >= s
		}
		if inside {
			lo = m
		} else {
			hi = m
		}
	}
	return hi
}

// snap moves x onto the limit when it is within 1e-9 relative of it.
func snap(x, limit float64) float64 {
	if math.Abs(x-limit) <= 1e-9*limit {
		return limit
	}
	return x
}

// domeSecant runs secant steps from t0 on f; ok only if it converges
// inside 273.15-623.15 K to a quality within 0..1.
func domeSecant(h, s, t0 float64, f func(float64) (float64, State, State, bool)) (State, bool) {
	if !(t0 > tMin && t0 < t13) {
		return State{}, false
	}
	ta, tb := t0, t0*(1+1e-7)
	fa, _, _, ok := f(ta)
	if !ok {
		return State{}, false
	}
	for i := 0; i < 20; i++ {
		fb, _, _, ok := f(tb)
		if !ok || fb == fa {
			return State{}, false
		}
		tn := tb - fb*(tb-ta)/(fb-fa)
		if !(tn > tMin && tn < t13) {
			return State{}, false
		}
		ta, fa, tb = tb, fb, tn
		if math.Abs(tb-ta) <= 1e-11*tb {
			liq, vap, err := satEnds(psat(tb), tb)
			if err != nil {
				return State{}, false
			}
			x := (s - liq.S*1e-3) / (vap.S*1e-3 - liq.S*1e-3)
			if !(x >= 0 && x <= 1) {
				return State{}, false
			}
			return mix(liq, vap, x), true
		}
	}
	return State{}, false
}
