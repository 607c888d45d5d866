package solve

import (
	"fmt"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

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
	// A negative outlet flow is already flagged on its stream; say why, in the tank's terms.
	vs, mv, _ := c.state(outs[0])
	_, ml, _ := c.state(outs[1])
	tol := c.s.relTol * c.res.MassIn
	switch {
	case mv < -tol:
		c.s.diag(model.Warning, CodeNegativeFlow, c.un.Span, fmt.Sprintf("%s: the feed is subcooled at the tank pressure %s, so nothing flashes (vapour flow %s)",
			c.name(), c.s.f.q(units.Pressure, vs.P), c.s.f.q(units.MassFlow, mv)))
	case ml < -tol:
		c.s.diag(model.Warning, CodeNegativeFlow, c.un.Span, fmt.Sprintf("%s: the feed is superheated at the tank pressure %s, so no liquid is left (liquid flow %s)",
			c.name(), c.s.f.q(units.Pressure, vs.P), c.s.f.q(units.MassFlow, ml)))
	}
}
