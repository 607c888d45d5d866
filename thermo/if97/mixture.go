package if97

import "math"

// satEndsMix is satEnds up to 623.15 K for the ends a two-phase mixture is made of: P, T, V, U,
// H and S only, by the same expressions as region1, region2 and single (so the same bits), from
// gamma and its first derivatives alone. A mixture has no heat capacity or speed of sound, so
// the second derivatives that satEnds computes for them are not needed here.
func satEndsMix(ps, t float64) (liq, vap State) {
	// Region 1, IAPWS R7-97(2012) Eq. 7 and Table 3.
	pi, tau := ps/16.53, 1386/t
	g, gp, gt := gibbs1Lite(pi, tau)
	rt := rGas * t
	liq = State{P: ps * 1e6, T: t, V: rt * pi * gp / ps * 1e-3,
		U: rt * (tau*gt - pi*gp) * 1e3, H: rt * tau * gt * 1e3, S: rGas * (tau*gt - g) * 1e3}
	// Region 2, Eqs. 15-17 and Table 12, as gasProps applies them.
	pi, tau = ps, 540/t
	g0, g0t, _ := gibbs2Ideal(tau)
	g0 += math.Log(pi)
	g, gp, gt = gibbs2rLite(pi, tau)
	gt += g0t
	pg := pi * gp
	vap = State{P: ps * 1e6, T: t, V: rt * (1 + pg) / ps * 1e-3,
		U: rt * (tau*gt - 1 - pg) * 1e3, H: rt * tau * gt * 1e3, S: rGas * (tau*gt - g0 - g) * 1e3}
	return liq, vap
}
