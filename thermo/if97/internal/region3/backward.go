package region3

// H3ab is the boundary between subregions 3a and 3b in terms of enthalpy,
// IAPWS SR3-03(2014) Eq. 1: h (kJ/kg) on the critical isentrope for
// p (MPa) from the saturation pressure at 623.15 K up to 100 MPa.
func H3ab(p float64) float64 {
	return 0.201464004206875e4 + p*(3.74696550136983+p*(-0.219921901054187e-1+p*0.875131686009950e-4))
}

func inRange(x float64) bool { return x > 0 && finite(x) }

// TPH is the backward equation T(p,h) of IAPWS SR3-03(2014): Eq. 2 for
// subregion 3a (h <= H3ab(p)) and Eq. 3 for 3b. Valid in region 3, p up to
// 100 MPa; returns T in K (NaN for non-positive or non-finite p).
func TPH(p, h float64) float64 {
	if !inRange(p) || !finite(h) {
		return nan()
	}
	pi := p / 100
	if h <= H3ab(p) {
		return 760 * tph3a.sum(pi+0.240, h/2300-0.615)
	}
	return 860 * tph3b.sum(pi+0.298, h/2800-0.720)
}

// VPH is the backward equation v(p,h) of IAPWS SR3-03(2014): Eq. 4 for
// subregion 3a (h <= H3ab(p)) and Eq. 5 for 3b. Valid in region 3, p up to
// 100 MPa; returns v in m3/kg (NaN for non-positive or non-finite p).
func VPH(p, h float64) float64 {
	if !inRange(p) || !finite(h) {
		return nan()
	}
	pi := p / 100
	if h <= H3ab(p) {
		return 0.0028 * vph3a.sum(pi+0.128, h/2100-0.727)
	}
	return 0.0088 * vph3b.sum(pi+0.0661, h/2800-0.720)
}

// TPS is the backward equation T(p,s) of IAPWS SR3-03(2014): Eq. 6 for
// subregion 3a (s <= s_c, the critical entropy) and Eq. 7 for 3b. Valid in
// region 3, p up to 100 MPa; returns T in K (NaN for bad p).
func TPS(p, s float64) float64 {
	if !inRange(p) || !finite(s) {
		return nan()
	}
	pi := p / 100
	if s <= sc {
		return 760 * tps3a.sum(pi+0.240, s/4.4-0.703)
	}
	return 860 * tps3b.sum(pi+0.760, s/5.3-0.818)
}

// VPS is the backward equation v(p,s) of IAPWS SR3-03(2014): Eq. 8 for
// subregion 3a (s <= s_c) and Eq. 9 for 3b. Valid in region 3, p up to
// 100 MPa; returns v in m3/kg (NaN for bad p).
func VPS(p, s float64) float64 {
	if !inRange(p) || !finite(s) {
		return nan()
	}
	pi := p / 100
	if s <= sc {
		return 0.0028 * vps3a.sum(pi+0.187, s/4.4-0.755)
	}
	return 0.0088 * vps3b.sum(pi+0.298, s/5.3-0.816)
}

// PHS is the backward equation p(h,s) of IAPWS SR4-04(2014) for region 3:
// subregion 3a (s <= s_c) and 3b. Valid in region 3 (p up to 100 MPa) as
// delimited in (h, s) by that release; returns p in MPa (NaN for non-finite
// input).
func PHS(h, s float64) float64 {
	if !finite(h) || !finite(s) {
		return nan()
	}
	if s <= sc {
		return 99 * phs3a.sum(h/2300-1.01, s/4.4-0.750)
	}
	return 16.6 / phs3b.sum(h/2800-0.681, s/5.3-0.792)
}
