package solve

import "hmb/thermo/units"

// Flash tank or separator: feeds k enter, saturated vapour and saturated liquid leave at the
// tank pressure.
//
//	mass:       sum_k m_k = m_vap + m_liq
//	energy:     sum_k m_k h_k = m_vap h_vap + m_liq h_liq + heat_loss
//	pressure:   p_vap = p_liq                 (the tank pressure, given on either outlet)
//	saturation: x(p_vap, h_vap) = 1,  x(p_liq, h_liq) = 0
//
// Feed pressures are not tied to the tank: a feed flashes across its inlet valve.
// Entropy generation: S_gen = m_vap s_vap + m_liq s_liq - sum_k m_k s_k + heat_loss / T0.
func init() { ops["flash"] = unitOp{buildFlash, finishFlash} }

func buildFlash(b *builder, u int) {
	ins := b.ports(u, "in")
	vap, liq := b.port(u, "vapor"), b.port(u, "liquid")
	loss := b.param(u, "heat_loss", false, 0)
	outs := []int{vap, liq}
	b.massBalance(u, ins, outs)
	b.energyBalance(u, "", ins, outs, nil, []term{loss})
	b.equal(u, b.pv(liq), b.pv(vap), EqPressure, units.Pressure, "tank pressure of "+b.uname(u))
	b.saturated(u, vap, 1, "saturated vapour outlet of "+b.uname(u))
	b.saturated(u, liq, 0, "saturated liquid outlet of "+b.uname(u))
}

func finishFlash(c *unitCalc) {
	ins := c.ports("in")
	outs := append(c.ports("vapor"), c.ports("liquid")...)
	loss := c.param("heat_loss", 0)
	if !c.flows(ins, outs, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, outs) + loss/T0
	c.checkSgen()
}
