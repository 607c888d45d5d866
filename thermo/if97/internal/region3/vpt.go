package region3

import "math"

// Boundary equations between the subregions, IAPWS SR5-05(2016) Eq. 1:
// T3xy(p)/K = sum n_i pi^I_i with I_i = 0..N-1 and pi = p/(1 MPa).
// Coefficients from the release's table of boundary-equation coefficients.
var (
	b3cd = [...]float64{0.585276966696349e3, 0.278233532206915e1, -0.127283549295878e-1, 0.159090746562729e-3}
	b3gh = [...]float64{-0.249284240900418e5, 0.428143584791546e4, -0.269029173140130e3, 0.751608051114157e1, -0.787105249910383e-1}
	b3ij = [...]float64{0.584814781649163e3, -0.616179320924617, 0.260763050899562, -0.587071076864459e-2, 0.515308185433082e-4}
	b3jk = [...]float64{0.617229772068439e3, -0.770600270141675e1, 0.697072596851896, -0.157391839848015e-1, 0.137897492684194e-3}
	b3mn = [...]float64{0.535339483742384e3, 0.761978122720128e1, -0.158365725441648, 0.192871054508108e-2}
	b3qu = [...]float64{0.565603648239126e3, 0.529062258221222e1, -0.102020639611016, 0.122240301070145e-2}
	b3rx = [...]float64{0.584561202520006e3, -0.102961025163669e1, 0.243293362700452, -0.294905044740799e-2}
	b3uv = [...]float64{0.528199646263062e3, 0.890579602135307e1, -0.222814134903755, 0.286791682263697e-2}
)

// Boundary equations of the logarithmic form, IAPWS SR5-05(2016) Eq. 2:
// T/K = sum n_i (ln pi)^I_i with I_i = 0, 1, 2, -1, -2 in this order.
var (
	b3ab = [5]float64{0.154793642129415e4, -0.187661219490113e3, 0.213144632222113e2, -0.191887498864292e4, 0.918419702359447e3}
	b3op = [5]float64{0.969461372400213e3, -0.332500170441278e3, 0.642859598466067e2, 0.773845935768222e3, -0.152313732937084e4}
	b3wx = [5]float64{0.728052609145380e1, 0.973505869861952e2, 0.147370491183191e2, 0.329196213998375e3, 0.873371668682417e3}
)

func tPoly(n []float64, p float64) float64 {
	t := 0.0
	for i := len(n) - 1; i >= 0; i-- {
		t = t*p + n[i]
	}
	return t
}

func tLog(n *[5]float64, p float64) float64 {
	l := math.Log(p)
	return n[0] + n[1]*l + n[2]*l*l + n[3]/l + n[4]/(l*l)
}

// t3ef is the 3e/3f boundary, IAPWS SR5-05(2016) Eq. 3 (the critical isochore).
func t3ef(p float64) float64 { return 3.727888004*(p-22.064) + 647.096 }

// subregion picks the subregion of v(p,T) by IAPWS SR5-05(2016) Table 2,
// and Table 10 for the near-critical states between T3qu and T3rx.
func subregion(p, T float64) byte {
	switch {
	case p > 40:
		if T <= tLog(&b3ab, p) {
			return 'a'
		}
		return 'b'
	case p > 25:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tLog(&b3ab, p):
			return 'd'
		case T <= t3ef(p):
			return 'e'
		}
		return 'f'
	case p > 23.5:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tPoly(b3gh[:], p):
			return 'g'
		case T <= t3ef(p):
			return 'h'
		case T <= tPoly(b3ij[:], p):
			return 'i'
		case T <= tPoly(b3jk[:], p):
			return 'j'
		}
		return 'k'
	case p > 23:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tPoly(b3gh[:], p):
			return 'l'
		case T <= t3ef(p):
			return 'h'
		case T <= tPoly(b3ij[:], p):
			return 'i'
		case T <= tPoly(b3jk[:], p):
			return 'j'
		}
		return 'k'
	case p > 22.5:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tPoly(b3gh[:], p):
			return 'l'
		case T <= tPoly(b3mn[:], p):
			return 'm'
		case T <= t3ef(p):
			return 'n'
		case T <= tLog(&b3op, p):
			return 'o'
		case T <= tPoly(b3ij[:], p):
			return 'p'
		case T <= tPoly(b3jk[:], p):
			return 'j'
		}
		return 'k'
	case p > psat643:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tPoly(b3qu[:], p):
			return 'q'
		case T <= tPoly(b3rx[:], p):
			return nearCritical(p, T)
		case T <= tPoly(b3jk[:], p):
			return 'r'
		}
		return 'k'
	case p > 20.5:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tsat4(p):
			return 's'
		case T <= tPoly(b3jk[:], p):
			return 'r'
		}
		return 'k'
	case p > p3cd:
		switch {
		case T <= tPoly(b3cd[:], p):
			return 'c'
		case T <= tsat4(p):
			return 's'
		}
		return 't'
	}
	if T <= tsat4(p) {
		return 'c'
	}
	return 't'
}

// nearCritical is SR5-05(2016) Table 10: the auxiliary subregions 3u..3z
// between T3qu(p) and T3rx(p) for p_sat(643.15 K) < p <= 22.5 MPa.
func nearCritical(p, T float64) byte {
	switch {
	case p > 22.11:
		switch {
		case T <= tPoly(b3uv[:], p):
			return 'u'
		case T <= t3ef(p):
			return 'v'
		case T <= tLog(&b3wx, p):
			return 'w'
		}
		return 'x'
	case p > Pc:
		switch {
		case T <= tPoly(b3uv[:], p):
			return 'u'
		case T <= t3ef(p):
			return 'y'
		case T <= tLog(&b3wx, p):
			return 'z'
		}
		return 'x'
	}
	if T <= tsat4(p) { // liquid side
		if p <= p3uy || T <= tPoly(b3uv[:], p) {
			return 'u'
		}
		return 'y'
	}
	if p <= p3xz || T > tLog(&b3wx, p) { // vapour side
		return 'x'
	}
	return 'z'
}

// vsub describes Eq. 4 of SR5-05(2016) for one subregion:
// v/v* = [sum n_i ((pi-a)^c)^I_i ((theta-b)^d)^J_i]^e, pi = p/p*, theta = T/T*.
// Only c in {1, 1/2}, d in {1, 1/4} and e in {1, 4} occur. 3n uses Eq. 5,
// v/v* = exp(sum n_i (pi-a)^I_i (theta-b)^J_i).
type vsub struct {
	vs, ps, ts, a, b float64
	halfC, quarterD  bool // c = 1/2, d = 1/4
	e4, exp5         bool // e = 4; Eq. 5 (subregion 3n)
	poly             *poly
}

// Reducing quantities and exponents of Eq. 4 for each subregion,
// IAPWS SR5-05(2016) (table of v*, p*, T*, a, b, c, d, e for 3a..3t, and its
// Sec. 4 counterpart for 3u..3z).
var vsubs = [26]vsub{
	{vs: 0.0024, ps: 100, ts: 760, a: 0.085, b: 0.817, poly: &vpt3a},
	{vs: 0.0041, ps: 100, ts: 860, a: 0.280, b: 0.779, poly: &vpt3b},
	{vs: 0.0022, ps: 40, ts: 690, a: 0.259, b: 0.903, poly: &vpt3c},
	{vs: 0.0029, ps: 40, ts: 690, a: 0.559, b: 0.939, e4: true, poly: &vpt3d},
	{vs: 0.0032, ps: 40, ts: 710, a: 0.587, b: 0.918, poly: &vpt3e},
	{vs: 0.0064, ps: 40, ts: 730, a: 0.587, b: 0.891, halfC: true, e4: true, poly: &vpt3f},
	{vs: 0.0027, ps: 25, ts: 660, a: 0.872, b: 0.971, e4: true, poly: &vpt3g},
	{vs: 0.0032, ps: 25, ts: 660, a: 0.898, b: 0.983, e4: true, poly: &vpt3h},
	{vs: 0.0041, ps: 25, ts: 660, a: 0.910, b: 0.984, halfC: true, e4: true, poly: &vpt3i},
	{vs: 0.0054, ps: 25, ts: 670, a: 0.875, b: 0.964, halfC: true, e4: true, poly: &vpt3j},
	{vs: 0.0077, ps: 25, ts: 680, a: 0.802, b: 0.935, poly: &vpt3k},
	{vs: 0.0026, ps: 24, ts: 650, a: 0.908, b: 0.989, e4: true, poly: &vpt3l},
	{vs: 0.0028, ps: 23, ts: 650, a: 1.000, b: 0.997, quarterD: true, poly: &vpt3m},
	{vs: 0.0031, ps: 23, ts: 650, a: 0.976, b: 0.997, exp5: true, poly: &vpt3n},
	{vs: 0.0034, ps: 23, ts: 650, a: 0.974, b: 0.996, halfC: true, poly: &vpt3o},
	{vs: 0.0041, ps: 23, ts: 650, a: 0.972, b: 0.997, halfC: true, poly: &vpt3p},
	{vs: 0.0022, ps: 23, ts: 650, a: 0.848, b: 0.983, e4: true, poly: &vpt3q},
	{vs: 0.0054, ps: 23, ts: 650, a: 0.874, b: 0.982, poly: &vpt3r},
	{vs: 0.0022, ps: 21, ts: 640, a: 0.886, b: 0.990, e4: true, poly: &vpt3s},
	{vs: 0.0088, ps: 20, ts: 650, a: 0.803, b: 1.020, poly: &vpt3t},
	{vs: 0.0026, ps: 23, ts: 650, a: 0.902, b: 0.988, poly: &vpt3u},
	{vs: 0.0031, ps: 23, ts: 650, a: 0.960, b: 0.995, poly: &vpt3v},
	{vs: 0.0039, ps: 23, ts: 650, a: 0.959, b: 0.995, e4: true, poly: &vpt3w},
	{vs: 0.0049, ps: 23, ts: 650, a: 0.910, b: 0.988, poly: &vpt3x},
	{vs: 0.0031, ps: 22, ts: 650, a: 0.996, b: 0.994, e4: true, poly: &vpt3y},
	{vs: 0.0038, ps: 22, ts: 650, a: 0.993, b: 0.994, e4: true, poly: &vpt3z},
}

// vOf evaluates the backward equation of subregion x ('a'..'z') at (p, T),
// whether or not (p, T) lies in that subregion.
func vOf(x byte, p, T float64) float64 {
	if x < 'a' || x > 'z' {
		return nan()
	}
	s := &vsubs[x-'a']
	P, Th := p/s.ps-s.a, T/s.ts-s.b
	if s.exp5 {
		return s.vs * math.Exp(s.poly.sum(P, Th))
	}
	if s.halfC {
		P = math.Sqrt(P)
	}
	if s.quarterD {
		Th = math.Sqrt(math.Sqrt(Th))
	}
	w := s.poly.sum(P, Th)
	if s.e4 {
		w *= w
		w *= w
	}
	return s.vs * w
}

// VPT is the backward equation v(p,T) of IAPWS SR5-05(2016): the subregion by
// Table 2 (with the boundary equations Eqs. 1-3) and Table 10 near the critical
// point, then Eq. 4 or Eq. 5 of that subregion. Valid in region 3:
// 623.15 K <= T <= T_B23(p) and p_B23(T) <= p <= 100 MPa; it returns v in m3/kg
// (NaN for non-positive or non-finite input). Its values agree with the basic
// equation to the release's tolerances, not exactly: RhoPT refines them.
func VPT(p, T float64) float64 {
	if !(p > 0) || !(T > 0) || !finite(p) || !finite(T) {
		return nan()
	}
	return vOf(subregion(p, T), p, T)
}
