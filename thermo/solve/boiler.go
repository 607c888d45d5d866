package solve

import "hmb/thermo/units"

// Boiler: steam generator heating feedwater to steam.
//
//	mass:     m_in = m_out
//	energy:   m h_in + duty = m h_out
//	pressure: p_out = p_in - dp
//	fuel:     duty = efficiency * fuel      (only when efficiency or fuel is given)
//
// With a blowdown stream the mass and energy balances take it as a second outlet (blowdown.go).
//
// Entropy generation as for the heater (heater.go): with T_boundary (the flue gas temperature the
// heat comes from) S_gen = m (s_out - s_in) - duty / T_boundary; without it the furnace lies
// outside the boundary and only the fluid's pressure drop counts.
func init() { ops["boiler"] = unitOp{buildBoiler, finishBoiler} }

func buildBoiler(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	q := b.param(u, "duty", true, 0)
	outs := []int{out}
	if bd := b.port(u, "blowdown"); bd >= 0 {
		outs = append(outs, bd)
		b.blowdown(u, in, out, bd)
	}
	b.massBalance(u, []int{in}, outs)
	b.energyBalance(u, "", []int{in}, outs, []term{q}, nil)
	b.pressureDrop(u, in, out, b.drop(u, "dp"), "")
	un := b.m.Units[u]
	if un.Params["efficiency"] == nil && un.Params["fuel"] == nil {
		return
	}
	fuel := b.param(u, "fuel", true, 0)
	eff := b.param(u, "efficiency", true, 0)
	b.unitEq(u, Equation{
		Label: "fuel balance of " + b.uname(u), Kind: EqFuel, Dim: units.Power, LHS: "duty", RHS: "efficiency x fuel",
		Vars:  []int{fuel.v, eff.v, q.v},
		eval:  func(x []float64) (float64, float64, error) { return x[q.v], x[eff.v] * x[fuel.v], nil },
		grad:  func(x []float64, g []float64) { g[0], g[1], g[2] = -x[eff.v], -x[fuel.v], 1 },
		floor: 1e-3,
	})
}

func finishBoiler(c *unitCalc) {
	finishHeated(c)
	c.res.Fuel = c.param("fuel", nanf)
	c.res.Efficiency = c.param("efficiency", nanf)
	if g := c.un.Params["efficiency"]; g == nil && finite(c.res.Efficiency) && !(c.res.Efficiency > 0 && c.res.Efficiency <= 1) {
		c.s.diag(errSev, CodeEfficiency, c.un.Span, c.name()+": solved boiler efficiency "+c.s.f.frac(c.res.Efficiency)+" is outside 0..1")
	}
}
