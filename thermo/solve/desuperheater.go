package solve

import (
	"fmt"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Desuperheater (attemperator): spray water mixes into superheated steam. The target outlet state
// comes from the out stream's givens (typically p or T); the balances then size the spray flow.
//
//	mass:     m_steam + m_water = m_out
//	energy:   m_steam h_steam + m_water h_water = m_out h_out + heat_loss
//	pressure: p_out = p_steam - dp            (dp = 0 unless given or fixed by both pressures)
//
// The spray water is injected into the steam, so it must be supplied at or above the steam
// pressure (HMB514 otherwise); it throttles through its nozzle. An outlet left wet is a
// warning (HMB409): more water than the steam can evaporate reaches the pipe downstream.
//
// Entropy generation: S_gen = m_out s_out - m_steam s_steam - m_water s_water + heat_loss / T_ambient.
func init() { ops["desuperheater"] = unitOp{buildDesuperheater, finishDesuperheater} }

func buildDesuperheater(b *builder, u int) {
	st, w, out := b.port(u, "steam"), b.port(u, "water"), b.port(u, "out")
	loss := b.param(u, "heat_loss", false, 0)
	ins := []int{st, w}
	b.massBalance(u, ins, []int{out})
	b.energyBalance(u, "", ins, []int{out}, nil, []term{loss})
	b.pressureDrop(u, st, out, b.drop(u, "dp"), "pressure of "+b.uname(u))
}

func finishDesuperheater(c *unitCalc) {
	steam, water, out := c.port("steam"), c.port("water"), c.port("out")
	c.inletsAbove([]int{water}, steam, "spray water", "the steam")
	c.pressureRise(steam, out, "")
	if r := c.s.res.Streams[out]; r.HasState && twoPhase(r.State) && r.State.X < 1 {
		c.s.diag(model.Warning, CodeOverspray, c.un.Span, fmt.Sprintf("%s: outlet %s is wet (quality %s at %s): more spray water than the steam can evaporate; aim above the saturation temperature %s",
			c.name(), c.s.b.sname(out), c.s.f.frac(r.State.X), c.s.f.q(units.Pressure, r.State.P), c.s.f.q(units.Temperature, r.State.T)),
			related(c.s.m.Streams[out].Span, "outlet "+c.s.b.sname(out)))
	}
	ins := []int{steam, water}
	loss := c.param("heat_loss", 0)
	if !c.flows(ins, []int{out}, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, []int{out}) + c.lossEntropy(loss)
	c.checkSgen()
}
