package solve

import "hmb/thermo/units"

// Valve: adiabatic throttling, no work.
//
//	mass:     m_in = m_out
//	energy:   h_out = h_in
//	pressure: p_out = p_in - dp
//
// Unlike the other kinds, a valve's dp is an unknown when not given: a valve exists to drop the
// pressure, so the outlet pressure (or dp) must come from the file.
//
// An outlet above the inlet pressure is an error (HMB514): a valve only drops the pressure.
// Entropy generation: S_gen = m (s_out - s_in), positive for any real pressure drop.
func init() { ops["valve"] = unitOp{buildValve, finishValve} }

func buildValve(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	dp := b.param(u, "dp", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.equal(u, b.hv(out), b.hv(in), EqEnergy, units.SpecificEnergy, "energy balance of "+b.uname(u))
	b.pressureDrop(u, in, out, dp, "")
}

func finishValve(c *unitCalc) {
	in, out := c.ports("in"), c.ports("out")
	c.pressureRise(in[0], out[0], "")
	if !c.flows(in, out, 0, 0) {
		return
	}
	c.res.Sgen = c.entropyFlow(in, out)
	c.checkSgen()
}
