package solve

import (
	"math"

	"hmb/thermo/units"
)

// Mixer: adiabatic mixing chamber, open feedwater heater, deaerator. Inlets k mix into one outlet.
//
//	mass:     sum_k m_k = m_out
//	energy:   sum_k m_k h_k = m_out h_out + heat_loss
//	pressure: p_out = min_k p_k - dp
//
// Unequal inlet pressures: the outlet takes the lowest inlet pressure (less dp). Streams at a
// higher pressure are taken to throttle at their inlet nozzle, which the entropy generation
// accounts for; this is how a deaerator fed from several extraction pressures is drawn. An inlet
// pressure the file does not give is not fixed by the mixer unless it is the only unknown of the
// pressure equation, and then it is taken as the lowest (p_out + dp).
//
// Entropy generation: S_gen = m_out s_out - sum_k m_k s_k + heat_loss / T0.
func init() { ops["mixer"] = unitOp{buildMixer, finishMixer} }

func buildMixer(b *builder, u int) {
	ins, out := b.ports(u, "in"), b.ports(u, "out")
	loss := b.param(u, "heat_loss", false, 0)
	dp := b.param(u, "dp", false, 0)
	b.massBalance(u, ins, out)
	b.energyBalance(u, "", ins, out, nil, []term{loss})
	pout := b.pv(out[0])
	vars := []int{pout}
	var pins []int
	for _, s := range ins {
		pins = append(pins, b.pv(s))
		vars = append(vars, b.pv(s))
	}
	lowest := func(x []float64) float64 {
		p := math.Inf(1)
		for _, v := range pins {
			p = min(p, x[v])
		}
		return p
	}
	b.unitEq(u, Equation{
		Label: "pressure of " + b.uname(u), Kind: EqPressure, Dim: units.Pressure, LHS: "outlet", RHS: "lowest inlet less drop", Vars: vars,
		eval: func(x []float64) (float64, float64, error) { return x[pout], lowest(x) - dp.c, nil },
		direct: func(x []float64, v int) (float64, error) {
			if v == pout {
				return lowest(x) - dp.c, nil
			}
			return x[pout] + dp.c, nil
		},
		floor: 1,
	})
}

func finishMixer(c *unitCalc) {
	ins, out := c.ports("in"), c.ports("out")
	loss := c.param("heat_loss", 0)
	if !c.flows(ins, out, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, out) + loss/T0
	c.checkSgen()
}
