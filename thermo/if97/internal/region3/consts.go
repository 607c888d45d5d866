// Package region3 implements IAPWS-IF97 region 3 (the near-critical and
// supercritical region between 623.15 K and the B23 boundary, up to 100 MPa):
// the Helmholtz basic equation of IAPWS R7-97(2012), the backward equations of
// the supplementary releases SR3-03(2014), SR4-04(2014) and SR5-05(2016), and
// exact inversions of the basic equation started from those backward values.
//
// Units are those of the releases: rho kg/m3, v m3/kg, T K, p MPa, h and u
// kJ/kg, s, cp and cv kJ/(kg K), w m/s.
package region3

import "math"

// Critical point, IAPWS R7-97(2012) Eqs. 4-6 (kg/m3, K, MPa).
const Rc, Tc, Pc = 322.0, 647.096, 22.064

// R is the specific gas constant of IAPWS R7-97(2012) Eq. 1, kJ/(kg K).
const R = 0.461526

// Specific entropy at the critical point, kJ/(kg K): the 3a/3b boundary of
// SR3-03(2014) Sec. 3.4 and SR4-04(2014) Sec. 3.3 (value as used by
// python3-iapws, which takes it from the basic equation at (Rc, Tc)).
const sc = 4.41202148223476

func nan() float64 { return math.NaN() }

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

//go:generate go run ../polygen
