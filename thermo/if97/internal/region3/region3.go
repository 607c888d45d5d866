package region3

import "math"

// Props holds the properties of one (rho, T) state of the region 3 basic
// equation and the partial derivatives a Newton solver in (rho, T) needs.
type Props struct {
	P, U, H, S, Cp, Cv, W float64
	DpDrho, DpDT          float64 // (dp/drho)_T MPa/(kg/m3), (dp/dT)_rho MPa/K
	DhDrho, DhDT          float64 // (dh/drho)_T kJ/kg/(kg/m3), (dh/dT)_rho kJ/(kg K)
	DsDrho, DsDT          float64 // (ds/drho)_T kJ/(kg K)/(kg/m3), (ds/dT)_rho kJ/(kg K2)
}

// IAPWS R7-97(2012) Table 30: coefficients n_i and exponents I_i, J_i of the
// region 3 basic equation, Eq. 28, for i = 2..40. n_1 multiplies ln(delta).
const n1 = 0.10658070028513e1

var table30 = [...]term{
	{0, 0, -0.15732845290239e2},    // n2
	{0, 1, 0.20944396974307e2},     // n3
	{0, 2, -0.76867707878716e1},    // n4
	{0, 7, 0.26185947787954e1},     // n5
	{0, 10, -0.28080781148620e1},   // n6
	{0, 12, 0.12053369696517e1},    // n7
	{0, 23, -0.84566812812502e-2},  // n8
	{1, 2, -0.12654315477714e1},    // n9
	{1, 6, -0.11524407806681e1},    // n10
	{1, 15, 0.88521043984318},      // n11
	{1, 17, -0.64207765181607},     // n12
	{2, 0, 0.38493460186671},       // n13
	{2, 2, -0.85214708824206},      // n14
	{2, 6, 0.48972281541877e1},     // n15
	{2, 7, -0.30502617256965e1},    // n16
	{2, 22, 0.39420536879154e-1},   // n17
	{2, 26, 0.12558408424308},      // n18
	{3, 0, -0.27999329698710},      // n19
	{3, 2, 0.13899799569460e1},     // n20
	{3, 4, -0.20189915023570e1},    // n21
	{3, 16, -0.82147637173963e-2},  // n22
	{3, 26, -0.47596035734923},     // n23
	{4, 0, 0.43984074473500e-1},    // n24
	{4, 2, -0.44476435428739},      // n25
	{4, 4, 0.90572070719733},       // n26
	{4, 26, 0.70522450087967},      // n27
	{5, 1, 0.10770512626332},       // n28
	{5, 3, -0.32913623258954},      // n29
	{5, 26, -0.50871062041158},     // n30
	{6, 0, -0.22175400873096e-1},   // n31
	{6, 2, 0.94260751665092e-1},    // n32
	{6, 26, 0.16436278447961},      // n33
	{7, 2, -0.13503372241348e-1},   // n34
	{8, 26, -0.14834345352472e-1},  // n35
	{9, 2, 0.57922953628084e-3},    // n36
	{9, 26, 0.32308904703711e-2},   // n37
	{10, 0, 0.80964802996215e-4},   // n38
	{10, 1, -0.16557679795037e-3},  // n39
	{11, 26, -0.44923899061815e-4}, // n40
}

// phiCoef is a row of table30 with the exponent factors the derivatives of
// Eq. 28 need, so the hot loop does no integer-to-float conversions.
type phiCoef struct {
	i, j                     int
	n, ni, nii, nj, njj, nij float64
}

var phiCoefs = func() (c [len(table30)]phiCoef) {
	for k, t := range table30 {
		i, j := float64(t.i), float64(t.j)
		c[k] = phiCoef{int(t.i), int(t.j), t.n, t.n * i, t.n * i * (i - 1), t.n * j, t.n * j * (j - 1), t.n * i * j}
	}
	return
}()

// phi holds the dimensionless Helmholtz energy of Eq. 28 and its reduced
// derivatives: d = delta*phi_delta, dd = delta^2*phi_deltadelta,
// t = tau*phi_tau, tt = tau^2*phi_tautau, dt = delta*tau*phi_deltatau.
// Scaled this way every term of the sum is n*I*...*delta^I*tau^J, which needs
// neither divisions nor negative powers.
type phi struct {
	f, d, dd, t, tt, dt float64
}

// Largest exponents of Table 30.
const maxI30, maxJ30 = 11, 26

// groups30 splits table30 (sorted by I) into runs of equal I, so evalPhi can
// sum the tau polynomial of each run first and multiply by delta^I once.
var groups30 = func() (g [maxI30 + 1]struct{ lo, hi int }) {
	for k, t := range table30 {
		i := int(t.i)
		if g[i].hi == 0 {
			g[i].lo = k
		}
		g[i].hi = k + 1
	}
	return
}()

func evalPhi(delta, tau float64) phi {
	var tp [maxJ30 + 1]float64
	tp[0], tp[1] = 1, tau
	for k := 2; k <= maxJ30; k++ {
		tp[k] = tp[k/2] * tp[k-k/2]
	}
	var f phi
	x := 1.0 // delta^I
	for i := range groups30 {
		g := groups30[i]
		var a, b, c float64 // sum n tau^J, sum n J tau^J, sum n J(J-1) tau^J
		for k := g.lo; k < g.hi; k++ {
			cf := &phiCoefs[k]
			y := tp[cf.j]
			a += cf.n * y
			b += cf.nj * y
			c += cf.njj * y
		}
		fi := float64(i)
		xa, xb := x*a, x*b
		f.f += xa
		f.d += fi * xa
		f.dd += fi * (fi - 1) * xa
		f.t += xb
		f.tt += x * c
		f.dt += fi * xb
		x *= delta
	}
	// n1*ln(delta): delta*d/ddelta = n1, delta^2*d2/ddelta2 = -n1.
	f.f += n1 * math.Log(delta)
	f.d += n1
	f.dd -= n1
	return f
}

// Eval evaluates the region 3 basic equation, IAPWS R7-97(2012) Eq. 28 with
// the relations of Table 31, at density rho (kg/m3) and temperature T (K).
// The release states it for 623.15 K <= T <= T_B23(p), p_B23(T) <= p <= 100 MPa
// and for the metastable states next to the saturation line; outside that it
// still returns the equation's values, and NaN for rho <= 0 or T <= 0.
func Eval(rho, T float64) Props {
	if !(rho > 0) || !(T > 0) {
		n := nan()
		return Props{n, n, n, n, n, n, n, n, n, n, n, n, n}
	}
	delta, tau := rho/Rc, Tc/T
	f := evalPhi(delta, tau)
	RT := R * T
	// a = delta*phi_delta - delta*tau*phi_deltatau, b = 2 delta phi_delta + delta^2 phi_deltadelta.
	a := f.d - f.dt
	b := 2*f.d + f.dd
	var pr Props
	pr.P = rho * RT * f.d / 1000
	pr.U = RT * f.t
	pr.H = RT * (f.t + f.d)
	pr.S = R * (f.t - f.f)
	pr.Cv = -R * f.tt
	pr.Cp = R * (-f.tt + a*a/b)
	pr.W = math.Sqrt(1000 * RT * (b - a*a/f.tt))
	pr.DpDrho = RT * b / 1000
	pr.DpDT = rho * R * a / 1000
	pr.DhDrho = RT / rho * (f.dt + f.d + f.dd)
	pr.DhDT = R * (f.d - f.tt - f.dt)
	pr.DsDrho = R / rho * (f.dt - f.d)
	pr.DsDT = pr.Cv / T
	return pr
}

// pressure returns p and (dp/drho)_T only; the 1-D density solvers need no more.
func pressure(rho, T float64) (p, dpdrho float64) {
	delta, tau := rho/Rc, Tc/T
	f := evalPhiDelta(delta, tau)
	RT := R * T
	return rho * RT * f.d / 1000, RT * (2*f.d + f.dd) / 1000
}

// evalPhiDelta is evalPhi restricted to the delta derivatives.
func evalPhiDelta(delta, tau float64) phi {
	var dp [maxI30 + 1]float64
	var tp [maxJ30 + 1]float64
	dp[0], dp[1] = 1, delta
	for k := 2; k <= maxI30; k++ {
		dp[k] = dp[k/2] * dp[k-k/2]
	}
	tp[0], tp[1] = 1, tau
	for k := 2; k <= maxJ30; k++ {
		tp[k] = tp[k/2] * tp[k-k/2]
	}
	var f phi
	for k := range phiCoefs {
		c := &phiCoefs[k]
		x := dp[c.i] * tp[c.j]
		f.d += c.ni * x
		f.dd += c.nii * x
	}
	f.d += n1
	f.dd -= n1
	return f
}
