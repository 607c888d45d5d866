package region3

import "math"

// The subregion choice of SR5-05(2016) Table 2 and Table 10 compares T with
// the saturation temperature of IAPWS R7-97(2012) region 4. This package keeps
// its own copy of those two short equations so it depends on nothing else.

// IAPWS R7-97(2012) Table 34: coefficients n1..n10 of Eqs. 28-31 of region 4.
var table34 = [11]float64{0,
	0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
	0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
	-0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
	0.65017534844798e3,
}

// psat4 is the saturation-pressure equation, IAPWS R7-97(2012) Eq. 30 (MPa).
func psat4(T float64) float64 {
	n := &table34
	th := T + n[9]/(T-n[10])
	A := th*th + n[1]*th + n[2]
	B := n[3]*th*th + n[4]*th + n[5]
	C := n[6]*th*th + n[7]*th + n[8]
	x := 2 * C / (-B + math.Sqrt(B*B-4*A*C))
	x *= x
	return x * x
}

// tsat4 is the saturation-temperature equation, IAPWS R7-97(2012) Eq. 31 (K).
func tsat4(p float64) float64 {
	n := &table34
	beta := math.Sqrt(math.Sqrt(p))
	E := beta*beta + n[3]*beta + n[6]
	F := n[1]*beta*beta + n[4]*beta + n[7]
	G := n[2]*beta*beta + n[5]*beta + n[8]
	D := 2 * G / (-F - math.Sqrt(F*F-4*E*G))
	return (n[10] + D - math.Sqrt((n[10]+D)*(n[10]+D)-4*(n[9]+n[10]*D))) / 2
}

// Pressures that bound rows of SR5-05(2016) Table 2 and Table 10 (MPa).
var (
	psat643 = psat4(643.15) // p_sat(643.15 K), from Eq. 30
	psat623 = psat4(623.15) // p_sat(623.15 K), the lower end of region 3
)

const (
	p3cd = 19.00881189173929 // SR5-05(2016) Table 2 note: p at the 3c/3d/saturation corner
	p3uy = 21.93161551       // SR5-05(2016) Table 10: 3u/3y division on the liquid side
	p3xz = 21.90096265       // SR5-05(2016) Table 10: 3x/3z division on the vapour side
)
