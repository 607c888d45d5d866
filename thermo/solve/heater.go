package solve

// Heater: heat added to one stream from a source the file does not describe.
//
//	mass:     m_in = m_out
//	energy:   m h_in + duty = m h_out
//	pressure: p_out = p_in - dp
//
// Entropy generation: the heat crosses the boundary at the heated stream's mean temperature
// along its inlet isobar, T_b = (h_out - h_in) / (s(p_in, h_out) - s_in), so that
// S_gen = m (s_out - s_in) - duty / T_b = m (s_out - s(p_in, h_out)): only the pressure drop
// generates entropy inside the boundary; the loss of heat transfer from the unknown source lies
// outside it. The same boundary serves the cooler and the boiler.
func init() { ops["heater"] = unitOp{buildHeater, finishHeated} }

func buildHeater(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	q := b.param(u, "duty", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, []term{q}, nil)
	b.pressureDrop(u, in, out, b.param(u, "dp", false, 0), "")
}

// finishHeated serves heater, cooler and boiler: Q is the duty in the kind's own sense, sign
// +1 when it is heat added to the fluid and -1 when removed.
func finishHeated(c *unitCalc) {
	sign := 1.0
	if c.un.Kind.Name == "cooler" {
		sign = -1
	}
	q := c.param("duty", 0)
	c.res.Q = q
	in, out := c.ports("in"), c.ports("out")
	if !c.flows(in, out, sign*q, 0) {
		return
	}
	sin, m, _ := c.state(in[0])
	sout, _, _ := c.state(out[0])
	if iso, err := statePH(sin.P, sout.H); err == nil {
		c.res.Sgen = m * (sout.S - iso.S)
		c.checkSgen()
	}
}
