package solve

import (
	"fmt"

	"hmb/thermo/if97"
	"hmb/thermo/model"
)

// Pump: adiabatic compression of liquid taking shaft power.
//
//	mass:       m_in = m_out
//	energy:     m h_in + power = m h_out
//	efficiency: efficiency * (h_out - h_in) = h_s - h_in,  h_s = h(p_out, s(p_in, h_in))
//
// Entropy generation: S_gen = m (s_out - s_in). An inlet that is not liquid is a warning: a pump
// fed with vapour cavitates. An outlet below the inlet pressure is an error (HMB514): a pump
// raises the pressure.
func init() { ops["pump"] = unitOp{buildPump, finishPump} }

func buildPump(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	w := b.param(u, "power", true, 0)
	eta := b.param(u, "efficiency", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, []term{w}, nil)
	isentropicEfficiency(b, u, in, out, eta, false)
}

func finishPump(c *unitCalc) {
	in, out := c.ports("in"), c.ports("out")
	c.res.W = c.param("power", nanf)
	c.res.Efficiency = c.param("efficiency", nanf)
	if !c.pressureFall(in[0], out[0]) {
		c.checkEfficiency(c.res.Efficiency)
	}
	if r := c.s.res.Streams[in[0]]; r.HasState {
		st := r.State
		if st.Phase != if97.Liquid && st.Phase != if97.SatLiquid {
			c.s.diag(model.Warning, CodePumpInlet, c.un.Span, fmt.Sprintf("%s: inlet %s is a %s, not liquid; the pump would cavitate",
				c.name(), c.s.b.sname(in[0]), st.Phase))
		}
	}
	if !c.flows(in, out, 0, -c.res.W) {
		return
	}
	c.res.Sgen = c.entropyFlow(in, out)
	c.checkSgen()
}
