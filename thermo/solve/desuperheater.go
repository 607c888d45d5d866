package solve

import "hmb/thermo/units"

// Desuperheater (attemperator): spray water mixes into superheated steam. The target outlet state
// comes from the out stream's givens (typically p or T); the balances then size the spray flow.
//
//	mass:     m_steam + m_water = m_out
//	energy:   m_steam h_steam + m_water h_water = m_out h_out + heat_loss
//	pressure: p_out = p_steam                 (spray water is supplied above it and throttles)
//
// Entropy generation: S_gen = m_out s_out - m_steam s_steam - m_water s_water + heat_loss / T0.
func init() { ops["desuperheater"] = unitOp{buildDesuperheater, finishDesuperheater} }

func buildDesuperheater(b *builder, u int) {
	st, w, out := b.port(u, "steam"), b.port(u, "water"), b.port(u, "out")
	loss := b.param(u, "heat_loss", false, 0)
	ins := []int{st, w}
	b.massBalance(u, ins, []int{out})
	b.energyBalance(u, "", ins, []int{out}, nil, []term{loss})
	b.equal(u, b.pv(out), b.pv(st), EqPressure, units.Pressure, "pressure of "+b.uname(u))
}

func finishDesuperheater(c *unitCalc) {
	ins := append(c.ports("steam"), c.ports("water")...)
	out := c.ports("out")
	loss := c.param("heat_loss", 0)
	if !c.flows(ins, out, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, out) + loss/T0
	c.checkSgen()
}
