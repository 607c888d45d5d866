package solve

import (
	"fmt"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Turbine: adiabatic expansion producing shaft power.
//
//	mass:       m_in = m_out
//	energy:     m h_in = m h_out + power
//	efficiency: h_in - h_out = efficiency * (h_in - h_s),  h_s = h(p_out, s(p_in, h_in))
//
// The outlet pressure is not fixed by the turbine: it comes from the file or the unit downstream.
// An outlet above the inlet pressure is an error (HMB514): a turbine expands.
// Entropy generation: S_gen = m (s_out - s_in).
func init() { ops["turbine"] = unitOp{buildTurbine, finishTurbine} }

func buildTurbine(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	w := b.param(u, "power", true, 0)
	eta := b.param(u, "efficiency", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, nil, []term{w})
	isentropicEfficiency(b, u, in, out, eta, true)
}

func finishTurbine(c *unitCalc) {
	in, out := c.ports("in"), c.ports("out")
	c.res.W = c.param("power", nanf)
	c.res.Efficiency = c.param("efficiency", nanf)
	if !c.pressureRise(in[0], out[0], "") {
		c.checkEfficiency(c.res.Efficiency)
	}
	if !c.flows(in, out, 0, c.res.W) {
		return
	}
	c.res.Sgen = c.entropyFlow(in, out)
	c.checkSgen()
	st, _, _ := c.state(out[0])
	// Exhaust wetter than about 10 % erodes the last-stage blades (common practice, no source).
	if twoPhase(st) && st.X < 0.9 {
		c.s.diag(model.Warning, CodeWetExhaust, c.un.Span, fmt.Sprintf("%s: exhaust %s has %s %% moisture, above the usual 10 %% limit (common practice, no source)",
			c.name(), c.s.b.sname(out[0]), units.Format(100*(1-st.X), 3)))
	}
}
