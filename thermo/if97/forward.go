package if97

import "math"

// Release constants, IAPWS R7-97(2012) Eqs. 1-2: specific gas constant and
// the critical point.
const (
	rGas    = 0.461526 // kJ/(kg K)
	tCrit   = 647.096  // K
	pCrit   = 22.064   // MPa
	rhoCrit = 322.0    // kg/m3
)

// Domain of validity, IAPWS R7-97(2012) Sec. 4 (Fig. 1).
const (
	tMin   = 273.15  // K
	tMax25 = 1073.15 // K: top of region 2, foot of region 5
	tMax   = 2273.15 // K
	pMax   = 100.0   // MPa, up to 1073.15 K
	pMax5  = 50.0    // MPa, region 5
	t13    = 623.15  // K: boundary between regions 1 and 3
)

// gibbsDerivs holds a dimensionless Gibbs free energy gamma(pi, tau) and its
// derivatives: gp = d gamma/d pi, gpt = d2 gamma/(d pi d tau), and so on.
type gibbsDerivs struct{ g, gp, gpp, gt, gtt, gpt float64 }

// props is one single-phase state in the release's units: MPa, K, m3/kg,
// kJ/kg, kJ/(kg K), m/s; alpha is the cubic expansion coefficient (1/K).
type props struct {
	p, t, v, h, u, s, cp, cv, w, alpha float64
}

// region1 evaluates IAPWS R7-97(2012) Eq. 7 with the relations of Table 3;
// reducing quantities p* = 16.53 MPa, T* = 1386 K.
func region1(p, t float64) props {
	pi := p / 16.53
	tau := 1386 / t
	d := gibbs1(pi, tau)
	rt := rGas * t
	a := d.gp - tau*d.gpt
	tt := tau * tau
	return props{
		p: p, t: t,
		v:     rt * pi * d.gp / p * 1e-3,
		h:     rt * tau * d.gt,
		u:     rt * (tau*d.gt - pi*d.gp),
		s:     rGas * (tau*d.gt - d.g),
		cp:    -rGas * tt * d.gtt,
		cv:    rGas * (-tt*d.gtt + a*a/d.gpp),
		w:     math.Sqrt(rt * 1e3 * d.gp * d.gp / (a*a/(tt*d.gtt) - d.gpp)),
		alpha: (1 - tau*d.gpt/d.gp) / t,
	}
}

// h1 is the enthalpy alone of region 1 (kJ/kg), the fast path for callers
// that need nothing else.
func h1(p, t float64) float64 {
	tau := 1386 / t
	return rGas * t * tau * gibbs1Gt(p/16.53, tau)
}

// region1HCp gives h and cp of region 1: what a Newton step in T on the enthalpy needs.
func region1HCp(p, t float64) (h, cp float64) {
	tau := 1386 / t
	gt, gtt := gibbs1TauH(p/16.53, tau)
	return rGas * t * tau * gt, -rGas * tau * tau * gtt
}

// region1HS gives h, s and cp of region 1: what a Newton step in T needs.
func region1HS(p, t float64) (h, s, cp float64) {
	tau := 1386 / t
	g, gt, gtt := gibbs1Tau(p/16.53, tau)
	return rGas * t * tau * gt, rGas * (tau*gt - g), -rGas * tau * tau * gtt
}

// gibbs2Ideal evaluates the ideal-gas part of region 2, IAPWS R7-97(2012)
// Eq. 16 and Table 10, without the ln(pi) term: g0 = sum n tau^J,
// J = 0, 1, -5, -4, -3, -2, -1, 2, 3.
func gibbs2Ideal(tau float64) (g, gt, gtt float64) {
	const (
		n1 = -0.96927686500217e1
		n2 = 0.10086655968018e2
		n3 = -0.56087911283020e-2
		n4 = 0.71452738081455e-1
		n5 = -0.40710498223928
		n6 = 0.14240819171444e1
		n7 = -0.43839511319450e1
		n8 = -0.28408632460772
		n9 = 0.21268463753307e-1
	)
	r1 := 1 / tau
	r2 := r1 * r1
	r3 := r2 * r1
	r4 := r2 * r2
	r5 := r4 * r1
	r6 := r3 * r3
	r7 := r6 * r1
	t2 := tau * tau
	t3 := t2 * tau
	g = (n1 + n2*tau) + (n3*r5 + n4*r4) + (n5*r3 + n6*r2) + (n7*r1 + n8*t2 + n9*t3)
	gt = (n2 - 5*n3*r6) + (-4*n4*r5 - 3*n5*r4) + (-2*n6*r3 - n7*r2) + (2*n8*tau + 3*n9*t2)
	gtt = (30*n3*r7 + 20*n4*r6) + (12*n5*r5 + 6*n6*r4) + (2*n7*r3 + 2*n8 + 6*n9*tau)
	return g, gt, gtt
}

// region2 evaluates IAPWS R7-97(2012) Eqs. 15-17 with the relations of
// Table 12; p* = 1 MPa, T* = 540 K.
func region2(p, t float64) props {
	pi := p
	tau := 540 / t
	g0, g0t, g0tt := gibbs2Ideal(tau)
	d := gibbs2r(pi, tau)
	return gasProps(p, t, pi, tau, math.Log(pi)+g0, g0t, g0tt, d)
}

// gasProps applies the property relations shared by regions 2 and 5
// (IAPWS R7-97(2012) Tables 12 and 39): an ideal part g0 (with ln pi) plus
// a residual part d.
func gasProps(p, t, pi, tau, g0, g0t, g0tt float64, d gibbsDerivs) props {
	rt := rGas * t
	tt := tau * tau
	gt := g0t + d.gt
	gtt := g0tt + d.gtt
	pg := pi * d.gp
	a := 1 + pg - tau*pi*d.gpt
	b := 1 - pi*pi*d.gpp
	return props{
		p: p, t: t,
		v:     rt * (1 + pg) / p * 1e-3,
		h:     rt * tau * gt,
		u:     rt * (tau*gt - 1 - pg),
		s:     rGas * (tau*gt - g0 - d.g),
		cp:    -rGas * tt * gtt,
		cv:    rGas * (-tt*gtt - a*a/b),
		w:     math.Sqrt(rt * 1e3 * (1 + 2*pg + pg*pg) / (b + a*a/(tt*gtt))),
		alpha: a / (1 + pg) / t,
	}
}

// h2 is the enthalpy alone of region 2 (kJ/kg).
func h2(p, t float64) float64 {
	tau := 540 / t
	_, g0t, _ := gibbs2Ideal(tau)
	return rGas * t * tau * (g0t + gibbs2rGt(p, tau))
}

// region2HCp gives h and cp of region 2.
func region2HCp(p, t float64) (h, cp float64) {
	tau := 540 / t
	_, g0t, g0tt := gibbs2Ideal(tau)
	gt, gtt := gibbs2rTauH(p, tau)
	return rGas * t * tau * (g0t + gt), -rGas * tau * tau * (g0tt + gtt)
}

// region2HS gives h, s and cp of region 2.
func region2HS(p, t float64) (h, s, cp float64) {
	tau := 540 / t
	g0, g0t, g0tt := gibbs2Ideal(tau)
	g, gt, gtt := gibbs2rTau(p, tau)
	gt += g0t
	return rGas * t * tau * gt, rGas * (tau*gt - math.Log(p) - g0 - g), -rGas * tau * tau * (g0tt + gtt)
}

// gibbs5Ideal evaluates the ideal-gas part of region 5, IAPWS R7-97(2012)
// Eq. 33 and Table 37, without ln(pi): J = 0, 1, -3, -2, -1, 2.
func gibbs5Ideal(tau float64) (g, gt, gtt float64) {
	const (
		n1 = -0.13179983674201e2
		n2 = 0.68540841634434e1
		n3 = -0.24805148933466e-1
		n4 = 0.36901534980333
		n5 = -0.31161318213925e1
		n6 = -0.32961626538917
	)
	r1 := 1 / tau
	r2 := r1 * r1
	r3 := r2 * r1
	r4 := r2 * r2
	r5 := r4 * r1
	g = (n1 + n2*tau) + (n3*r3 + n4*r2) + (n5*r1 + n6*tau*tau)
	gt = (n2 - 3*n3*r4) + (-2*n4*r3 - n5*r2) + 2*n6*tau
	gtt = (12*n3*r5 + 6*n4*r4) + (2*n5*r3 + 2*n6)
	return g, gt, gtt
}

// region5 evaluates IAPWS R7-97(2012) Eqs. 32-34 with the relations of
// Table 39; p* = 1 MPa, T* = 1000 K.
func region5(p, t float64) props {
	pi := p
	tau := 1000 / t
	g0, g0t, g0tt := gibbs5Ideal(tau)
	d := gibbs5r(pi, tau)
	return gasProps(p, t, pi, tau, math.Log(pi)+g0, g0t, g0tt, d)
}

// region5HS gives h, s and cp of region 5.
func region5HS(p, t float64) (h, s, cp float64) {
	tau := 1000 / t
	g0, g0t, g0tt := gibbs5Ideal(tau)
	g, gt, gtt := gibbs5rTau(p, tau)
	gt += g0t
	return rGas * t * tau * gt, rGas * (tau*gt - math.Log(p) - g0 - g), -rGas * tau * tau * (g0tt + gtt)
}

// Saturation line, IAPWS R7-97(2012) Eqs. 28-31 and Table 34.
const (
	sat1  = 0.11670521452767e4
	sat2  = -0.72421316703206e6
	sat3  = -0.17073846940092e2
	sat4  = 0.12020824702470e5
	sat5  = -0.32325550322333e7
	sat6  = 0.14915108613530e2
	sat7  = -0.48232657361591e4
	sat8  = 0.40511340542057e6
	sat9  = -0.23855557567849
	sat10 = 0.65017534844798e3
)

// psat is Eq. 30 (MPa), valid 273.15 K <= T <= Tc.
func psat(t float64) float64 {
	th := t + sat9/(t-sat10)
	th2 := th * th
	a := th2 + sat1*th + sat2
	b := sat3*th2 + sat4*th + sat5
	c := sat6*th2 + sat7*th + sat8
	x := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	x2 := x * x
	return x2 * x2
}

// tsat is Eq. 31 (K), valid 611.213 Pa <= p <= pc.
func tsat(p float64) float64 {
	beta := math.Sqrt(math.Sqrt(p))
	b2 := beta * beta
	e := b2 + sat3*beta + sat6
	f := sat1*b2 + sat4*beta + sat7
	g := sat2*b2 + sat5*beta + sat8
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	nd := sat10 + d
	return (nd - math.Sqrt(nd*nd-4*(sat9+sat10*d))) / 2
}

// Boundary between regions 2 and 3, IAPWS R7-97(2012) Eqs. 5-6, Table 1.
const (
	b23n1 = 0.34805185628969e3
	b23n2 = -0.11671859879975e1
	b23n3 = 0.10192970039326e-2
	b23n4 = 0.57254459862746e3
	b23n5 = 0.13918839778870e2
)

// pB23 is Eq. 5: the pressure (MPa) on the 2-3 boundary at T (K).
func pB23(t float64) float64 { return b23n1 + b23n2*t + b23n3*t*t }

// tB23 is Eq. 6: the temperature (K) on the 2-3 boundary at p (MPa).
func tB23(p float64) float64 { return b23n4 + math.Sqrt((p-b23n5)/b23n3) }

// Fixed points of the boundaries, computed once from the equations above.
var (
	pSat623 = psat(t13)  // MPa: saturation pressure at the 1-3 boundary
	pTriple = psat(tMin) // MPa: lowest saturation pressure of IF97
)

// gibbsRegion evaluates the basic equation of region 1, 2 or 5 (any other region number means
// 5): the regions whose equations are Gibbs free energies in p and T.
func gibbsRegion(region int, pm, t float64) props {
	switch region {
	case 1:
		return region1(pm, t)
	case 2:
		return region2(pm, t)
	}
	return region5(pm, t)
}
