package solve

import "hmb/thermo/units"

// Splitter (tee): one inlet divides into outlets k at the inlet state.
//
//	mass:  m_in = sum_k m_k
//	state: p_k = p_in, h_k = h_in   for every outlet k
//
// Entropy generation is zero up to rounding; it is computed all the same as a check.
func init() { ops["splitter"] = unitOp{buildSplitter, finishSplitter} }

func buildSplitter(b *builder, u int) {
	in, outs := b.ports(u, "in"), b.ports(u, "out")
	b.massBalance(u, in, outs)
	for _, o := range outs {
		b.equal(u, b.pv(o), b.pv(in[0]), EqPressure, units.Pressure, "pressure of "+b.uname(u)+" outlet "+b.sname(o))
		b.equal(u, b.hv(o), b.hv(in[0]), EqState, units.SpecificEnergy, "enthalpy of "+b.uname(u)+" outlet "+b.sname(o))
	}
}

func finishSplitter(c *unitCalc) {
	in, outs := c.ports("in"), c.ports("out")
	if !c.flows(in, outs, 0, 0) {
		return
	}
	c.res.Sgen = c.entropyFlow(in, outs)
	c.checkSgen()
}
