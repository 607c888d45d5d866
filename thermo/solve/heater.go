package solve

import (
	"fmt"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Heater: heat added to one stream from a source the file does not describe.
//
//	mass:     m_in = m_out
//	energy:   m h_in + duty = m h_out
//	pressure: p_out = p_in - dp   (dp = 0 unless given, or fixed by both pressures; see drop)
//
// An outlet above the inlet pressure is an error (HMB514): a heater raises no pressure. A
// T_boundary below the fluid's hottest temperature is a temperature cross (HMB508): a source at
// one temperature cannot heat above it (a cooler's sink, conversely, must be at most the fluid's
// coldest temperature).
// Entropy generation: with T_boundary given (the temperature of the source: a flue gas, a
// heating medium) the duty crosses the boundary there, S_gen = m (s_out - s_in) - duty /
// T_boundary, which counts the loss of transferring heat across the temperature difference.
// Without it the heat is taken as crossing at the fluid's own temperature (the boundary hugs
// the fluid): S_gen = m (s_out - s(p_in, h_out)), only the pressure drop inside the fluid, and
// the result is marked fluid-only (UnitResult.SgenFluidOnly). The same serves the cooler (duty
// leaving, so + duty / T_boundary) and the boiler.
func init() { ops["heater"] = unitOp{buildHeater, finishHeated} }

func buildHeater(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	q := b.param(u, "duty", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, []term{q}, nil)
	b.pressureDrop(u, in, out, b.drop(u, "dp"), "")
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
	c.pressureRise(in[0], out[0], "")
	outs := append(out, c.ports("blowdown")...) // a boiler's blowdown leaves too
	if !c.flows(in, outs, sign*q, 0) {
		return
	}
	ds := c.entropyFlow(in, outs)
	if tb := c.param("T_boundary", nanf); finite(tb) {
		c.res.TBoundary = tb
		c.res.Sgen = ds - c.heatEntropy(sign*q, tb, "the duty crossing at T_boundary")
		if !c.boundaryCross(in[0], out[0], tb, sign) {
			c.checkSgen()
		}
		return
	}
	sin, _, _ := c.state(in[0])
	var sg float64
	for _, o := range outs {
		so, m, _ := c.state(o)
		iso, err := statePH(sin.P, so.H)
		if err != nil {
			return
		}
		sg += m * (so.S - iso.S)
	}
	c.res.Sgen = sg
	c.res.SgenFluidOnly = true
	c.checkSgen()
}

// boundaryCross reports a T_boundary on the wrong side of the fluid's temperatures: heat added
// (sign +1) must come from at least the fluid's hottest temperature, heat removed (sign -1) must
// go to at most its coldest; a constant-temperature source or sink cannot do otherwise.
func (c *unitCalc) boundaryCross(in, out int, tb, sign float64) bool {
	si, _, _ := c.state(in)
	so, _, _ := c.state(out)
	const slack = 1e-6 // K
	f := c.s.f
	g := c.un.Params["T_boundary"]
	var msg string
	switch {
	case sign > 0 && max(si.T, so.T) > tb+slack:
		hot, name := so.T, c.s.b.sname(out)
		if si.T > so.T {
			hot, name = si.T, c.s.b.sname(in)
		}
		msg = fmt.Sprintf("%s: temperature cross: its heat comes in at T_boundary %s, but %s is at %s; heat cannot flow up to it",
			c.name(), f.written(units.Temperature, tb, g.Unit), name, f.q(units.Temperature, hot))
	case sign < 0 && min(si.T, so.T) < tb-slack:
		cold, name := so.T, c.s.b.sname(out)
		if si.T < so.T {
			cold, name = si.T, c.s.b.sname(in)
		}
		msg = fmt.Sprintf("%s: temperature cross: it rejects its heat at T_boundary %s, but %s is at %s; heat cannot flow up to the boundary",
			c.name(), f.written(units.Temperature, tb, g.Unit), name, f.q(units.Temperature, cold))
	default:
		return false
	}
	c.s.diag(model.Error, CodeTempCross, c.un.Span, msg, related(g.Span, "T_boundary given here"))
	return true
}
