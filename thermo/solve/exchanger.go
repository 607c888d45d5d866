package solve

import (
	"fmt"

	"hmb/thermo/model"
)

// Exchanger: two streams exchange heat without mixing (closed feedwater heater, condenser with
// its cooling water).
//
//	mass:     m_hot_in = m_hot_out,  m_cold_in = m_cold_out
//	energy:   m_hot (h_hot_in - h_hot_out) = duty + heat_loss
//	          m_cold (h_cold_out - h_cold_in) = duty
//	pressure: p_hot_out = p_hot_in - dp_hot,  p_cold_out = p_cold_in - dp_cold
//
// Entropy generation: S_gen = sum over both sides of m (s_out - s_in) + heat_loss / T0.
// Temperature cross (counterflow): the hot side must be warmer than the cold side at both ends,
// T_hot_in >= T_cold_out and T_hot_out >= T_cold_in.
func init() { ops["exchanger"] = unitOp{buildExchanger, finishExchanger} }

func buildExchanger(b *builder, u int) {
	hi, ho := b.port(u, "hot_in"), b.port(u, "hot_out")
	ci, co := b.port(u, "cold_in"), b.port(u, "cold_out")
	q := b.param(u, "duty", true, 0)
	loss := b.param(u, "heat_loss", false, 0)
	name := b.uname(u)
	b.unitEqLabel(u, "hot-side ", func() { b.massBalance(u, []int{hi}, []int{ho}) })
	b.unitEqLabel(u, "cold-side ", func() { b.massBalance(u, []int{ci}, []int{co}) })
	b.energyBalance(u, "hot-side energy balance of "+name, []int{hi}, []int{ho}, nil, []term{q, loss})
	b.energyBalance(u, "cold-side energy balance of "+name, []int{ci}, []int{co}, []term{q}, nil)
	b.pressureDrop(u, hi, ho, b.param(u, "dp_hot", false, 0), "hot-side pressure drop of "+name)
	b.pressureDrop(u, ci, co, b.param(u, "dp_cold", false, 0), "cold-side pressure drop of "+name)
}

// unitEqLabel prefixes the label of the equation add appends.
func (b *builder) unitEqLabel(u int, prefix string, add func()) {
	n := len(b.sys.Eqs)
	add()
	for i := n; i < len(b.sys.Eqs); i++ {
		b.sys.Eqs[i].Label = prefix + b.sys.Eqs[i].Label
	}
}

func finishExchanger(c *unitCalc) {
	hi, ho := c.ports("hot_in"), c.ports("hot_out")
	ci, co := c.ports("cold_in"), c.ports("cold_out")
	loss := c.param("heat_loss", 0)
	c.res.Q = c.param("duty", nanf)
	if !c.flows(append(hi, ci...), append(ho, co...), 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(append(hi, ci...), append(ho, co...)) + loss/T0
	c.checkSgen()
	thi, _, _ := c.state(hi[0])
	tho, _, _ := c.state(ho[0])
	tci, _, _ := c.state(ci[0])
	tco, _, _ := c.state(co[0])
	const slack = 1e-6 // K: rounding of a pinch of exactly zero
	f := c.s.f
	switch {
	case thi.T < tco.T-slack:
		c.s.diag(model.Error, CodeTempCross, c.un.Span, fmt.Sprintf("%s: temperature cross: hot inlet %s is %s, colder than cold outlet %s at %s",
			c.name(), c.s.b.sname(hi[0]), f.q(model.T.Dim(), thi.T), c.s.b.sname(co[0]), f.q(model.T.Dim(), tco.T)))
	case tho.T < tci.T-slack:
		c.s.diag(model.Error, CodeTempCross, c.un.Span, fmt.Sprintf("%s: temperature cross: hot outlet %s is %s, colder than cold inlet %s at %s",
			c.name(), c.s.b.sname(ho[0]), f.q(model.T.Dim(), tho.T), c.s.b.sname(ci[0]), f.q(model.T.Dim(), tci.T)))
	}
}
