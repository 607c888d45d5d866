package region3

import "math"

// Exact inversions of the basic equation, IAPWS R7-97(2012) Eq. 28, started
// from the backward equations. Every loop is bounded; every function reports
// failure with ok=false instead of returning an unconverged number.

const (
	maxIter1 = 60 // 1-D density solves: Newton, with bisection as fallback
	maxIter2 = 50 // 2-D (rho, T) Newton solves
	maxHalve = 8  // step halvings per 2-D iteration

	tolP   = 1e-13 // 1-D target |p(rho,T)-p|/p
	okP    = 1e-12 // 1-D acceptance, the documented accuracy
	tol2   = 1e-13 // 2-D target, max relative residual of the two inputs
	ok2    = 1e-12 // 2-D acceptance (documented: 1e-11 or better)
	maxRel = 0.1   // largest relative change of rho per Newton step
)

// branch says which root of p(rho, T) = p a density solve wants when the
// isotherm is subcritical and has the van der Waals loop of Eq. 28.
type branch int

const (
	anyBranch branch = iota // stable root next to the start
	liquid                  // largest root: unstable states (dp/drho <= 0) lie below it
	vapour                  // smallest root: unstable states lie above it
)

// solveRho finds rho with p(rho, T) = p starting from rho0. p(rho) increases
// on the stable branches, so each evaluation tightens a bracket [lo, hi];
// a Newton step that leaves the bracket, or an evaluation in the unstable
// part of the loop, is replaced by bisection.
func solveRho(s *tauSums, p, T, rho0 float64, br branch) (float64, bool) {
	if !inRange(p) || !inRange(T) || !inRange(rho0) {
		return nan(), false
	}
	lo, hi := 0.0, math.Inf(1)
	rho := rho0
	for range maxIter1 {
		pr, dp := s.pressure(rho, T)
		if !finite(pr) || !finite(dp) {
			return nan(), false
		}
		f := pr - p
		if math.Abs(f) <= tolP*p && dp > 0 {
			return rho, true
		}
		next := nan()
		switch {
		case dp <= 0 && br == liquid:
			lo = rho
		case dp <= 0 && br == vapour:
			hi = rho
		case dp <= 0:
			if !(lo > 0 && hi < math.Inf(1)) {
				return nan(), false
			}
		case f < 0:
			lo = rho
			next = rho - f/dp
		default:
			hi = rho
			next = rho - f/dp
		}
		if finite(next) {
			next = min(max(next, rho*(1-maxRel)), rho*(1+maxRel))
		}
		if !(next > lo && next < hi) {
			switch {
			case lo > 0 && hi < math.Inf(1):
				next = 0.5 * (lo + hi)
			case lo > 0:
				next = rho * (1 + maxRel)
			default:
				next = rho * (1 - maxRel)
			}
		}
		if next == rho { // bracket exhausted at double precision
			if math.Abs(f) <= okP*p && dp > 0 {
				return rho, true
			}
			return nan(), false
		}
		rho = next
	}
	pr, dp := s.pressure(rho, T)
	if math.Abs(pr-p) <= okP*p && dp > 0 {
		return rho, true
	}
	return nan(), false
}

// A Point is a solved state of the basic equation: density (kg/m3), temperature (K) and its
// properties, so that a caller need not evaluate Eq. 28 once more at the solution.
type Point struct {
	Rho, T float64
	Props
}

// RhoPT returns the density (kg/m3) at which the basic equation gives
// pressure p (MPa) at T (K): VPT's value as start, then safeguarded Newton
// iterations until p is reproduced to 1e-12 relative (usually 1e-13). Valid
// where VPT is (region 3); ok is false if no stable root was found within
// the iteration bound.
func RhoPT(p, T float64) (rho float64, ok bool) {
	pt, ok := PointPT(p, T)
	return pt.Rho, ok
}

// PointPT is RhoPT with the properties at the density found.
func PointPT(p, T float64) (Point, bool) {
	v := VPT(p, T)
	if !inRange(v) || !inRange(T) {
		return Point{Rho: nan(), T: nan()}, false
	}
	var s tauSums
	s.set(Tc / T)
	rho, ok := solveRho(&s, p, T, 1/v, anyBranch)
	if !ok {
		return Point{Rho: nan(), T: nan()}, false
	}
	return Point{rho, T, s.props(rho, T)}, true
}

// Residual pairs of the 2-D solves.
type pair int

const (
	pairPH pair = iota
	pairPS
	pairHS
)

// residual returns the relative residuals of the two inputs and the rows of
// the Jacobian with respect to (rho, T), each divided by its input.
func residual(pr *Props, pp pair, x1, x2 float64) (r1, r2, a11, a12, a21, a22 float64) {
	switch pp {
	case pairPH:
		r1, a11, a12 = pr.P-x1, pr.DpDrho, pr.DpDT
		r2, a21, a22 = pr.H-x2, pr.DhDrho, pr.DhDT
	case pairPS:
		r1, a11, a12 = pr.P-x1, pr.DpDrho, pr.DpDT
		r2, a21, a22 = pr.S-x2, pr.DsDrho, pr.DsDT
	default:
		r1, a11, a12 = pr.H-x1, pr.DhDrho, pr.DhDT
		r2, a21, a22 = pr.S-x2, pr.DsDrho, pr.DsDT
	}
	s1, s2 := 1/math.Abs(x1), 1/math.Abs(x2)
	return r1 * s1, r2 * s2, a11 * s1, a12 * s1, a21 * s2, a22 * s2
}

func errNorm(r1, r2 float64) float64 {
	e := max(math.Abs(r1), math.Abs(r2))
	if !finite(e) {
		return math.Inf(1)
	}
	return e
}

// solve2 is Newton's method in (rho, T) on the basic equation with a
// backtracking line search on the larger relative residual.
func solve2(pp pair, x1, x2, rho, T float64) (Point, bool) {
	if !inRange(rho) || !inRange(T) || !finite(x1) || !finite(x2) || x1 == 0 || x2 == 0 {
		return Point{Rho: nan(), T: nan()}, false
	}
	pr := Eval(rho, T)
	r1, r2, a11, a12, a21, a22 := residual(&pr, pp, x1, x2)
	e := errNorm(r1, r2)
	for range maxIter2 {
		if e <= tol2 {
			break
		}
		det := a11*a22 - a12*a21
		if det == 0 || !finite(det) {
			break
		}
		dr := -(r1*a22 - r2*a12) / det
		dT := -(a11*r2 - a21*r1) / det
		// Keep each step within 10 % in rho and 5 % in T.
		lam := 1.0
		if s := math.Abs(dr) / (maxRel * rho); s > 1 {
			lam = 1 / s
		}
		if s := math.Abs(dT) / (0.05 * T); s*lam > 1 {
			lam = 1 / s
		}
		moved := false
		for range maxHalve {
			rn, Tn := rho+lam*dr, T+lam*dT
			if rn > 0 && Tn > 0 {
				pn := Eval(rn, Tn)
				q1, q2, b11, b12, b21, b22 := residual(&pn, pp, x1, x2)
				if en := errNorm(q1, q2); en < e {
					rho, T, pr, e = rn, Tn, pn, en
					r1, r2, a11, a12, a21, a22 = q1, q2, b11, b12, b21, b22
					moved = true
					break
				}
			}
			lam *= 0.5
		}
		if !moved {
			break
		}
	}
	if e <= ok2 && stable(pr.DpDrho, T) {
		return Point{rho, T, pr}, true
	}
	return Point{Rho: nan(), T: nan()}, false
}

// stable reports whether a state of Eq. 28 with (dp/drho)_T = dpdrho at T may be taken as a
// solution. Mechanical stability requires dpdrho > 0; within satClosed of Tc the isotherm is
// flat to within flatSlope across the loop that Eq. 28 keeps there (found: -5.7e-8 at 1e-4 K
// below Tc, -5.8e-13 at Tc), which no solution can avoid: where the dome has closed, such a
// state is the one the formulation gives.
func stable(dpdrho, T float64) bool {
	return dpdrho > 0 || math.Abs(T-Tc) <= satClosed && dpdrho > -flatSlope
}

// flatSlope bounds |(dp/drho)_T| (MPa/(kg/m3)) of the near-critical loop of Eq. 28.
const flatSlope = 1e-7

// SolvePH returns the (rho, T) at which the basic equation gives pressure p
// (MPa) and enthalpy h (kJ/kg), both reproduced to 1e-12 relative. Started
// from SR3-03(2014) T(p,h) and v(p,h). Valid in region 3; ok is false if the
// bounded Newton iteration does not converge to a mechanically stable state.
func SolvePH(p, h float64) (rho, T float64, ok bool) {
	pt, ok := PointPH(p, h)
	return pt.Rho, pt.T, ok
}

// PointPH is SolvePH with the properties at the solution.
func PointPH(p, h float64) (Point, bool) {
	return solve2(pairPH, p, h, 1/VPH(p, h), TPH(p, h))
}

// SolvePS is SolvePH for pressure p (MPa) and entropy s (kJ/(kg K)), started
// from SR3-03(2014) T(p,s) and v(p,s). Valid in region 3.
func SolvePS(p, s float64) (rho, T float64, ok bool) {
	pt, ok := PointPS(p, s)
	return pt.Rho, pt.T, ok
}

// PointPS is SolvePS with the properties at the solution.
func PointPS(p, s float64) (Point, bool) {
	return solve2(pairPS, p, s, 1/VPS(p, s), TPS(p, s))
}

// SolveHS is SolvePH for enthalpy h (kJ/kg) and entropy s (kJ/(kg K)): the
// pressure from SR4-04(2014) p(h,s), then T and v from SR3-03(2014) T(p,h),
// v(p,h) as start. Valid in region 3.
func SolveHS(h, s float64) (rho, T float64, ok bool) {
	pt, ok := PointHS(h, s)
	return pt.Rho, pt.T, ok
}

// PointHS is SolveHS with the properties at the solution.
func PointHS(h, s float64) (Point, bool) {
	p := PHS(h, s)
	if !inRange(p) {
		return Point{Rho: nan(), T: nan()}, false
	}
	return solve2(pairHS, h, s, 1/VPH(p, h), TPH(p, h))
}

// SatRho returns the saturated-liquid and saturated-vapour densities (kg/m3)
// of the region 3 basic equation at T (K), 623.15 K <= T < Tc, for the
// saturation pressure psat (MPa) the caller takes from the region 4 equation:
// the largest and smallest roots of p(rho, T) = psat, started from the
// SR5-05(2016) subregions that hold the saturated states (3c, 3s, 3u, 3y on
// the liquid side; 3t, 3r, 3x, 3z on the vapour side) and refined like RhoPT.
// ok is false outside that range or if the two roots are not distinct, except within
// satClosed of Tc, where both densities are the one root found.
func SatRho(T, psat float64) (rhoL, rhoV float64, ok bool) {
	l, v, ok := SatPoints(T, psat)
	return l.Rho, v.Rho, ok
}

// SatPoints is SatRho with the properties of both saturated states.
func SatPoints(T, psat float64) (liq, vap Point, ok bool) {
	rhoL, rhoV, st, ok := satRho(T, psat)
	if !ok {
		return Point{Rho: nan(), T: nan()}, Point{Rho: nan(), T: nan()}, false
	}
	liq = Point{rhoL, T, st.props(rhoL, T)}
	vap = liq
	if rhoV != rhoL {
		vap = Point{rhoV, T, st.props(rhoV, T)}
	}
	return liq, vap, true
}

func satRho(T, psat float64) (rhoL, rhoV float64, st tauSums, ok bool) {
	// Eq. 30 gives 22.064000000002 MPa at T = Tsat(pc) = Tc - 1.2e-9 K: a rounding, not a
	// pressure above the critical one.
	if !(T >= 623.15 && T < Tc) || !inRange(psat) || psat > Pc*(1+1e-12) {
		return nan(), nan(), st, false
	}
	var xl, xv byte
	switch {
	case psat < p3cd:
		xl = 'c'
	case psat < psat643:
		xl = 's'
	case psat <= p3uy:
		xl = 'u'
	default:
		xl = 'y'
	}
	switch {
	case psat < 20.5:
		xv = 't'
	case psat < psat643:
		xv = 'r'
	case psat <= p3xz:
		xv = 'x'
	default:
		xv = 'z'
	}
	st.set(Tc / T)
	rl, okl := solveRho(&st, psat, T, 1/vOf(xl, psat, T), liquid)
	rv, okv := solveRho(&st, psat, T, 1/vOf(xv, psat, T), vapour)
	switch {
	case okl && okv && rl > rv:
		return rl, rv, st, true
	case Tc-T > satClosed:
		return nan(), nan(), st, false
	case okl:
		return rl, rl, st, true
	case okv:
		return rv, rv, st, true
	}
	return nan(), nan(), st, false
}

// satClosed is the distance below Tc (K) within which SatRho may return one density for
// both phases. There the saturation pressure of Eq. 30 lies above the van der Waals loop of
// Eq. 28 (found: from 3.3e-5 K below Tc, 10 Pa below pc, upwards), so the isotherm meets it
// once: at the resolution of the formulation the two-phase region has closed, as it does at the
// critical point itself.
const satClosed = 1e-4
