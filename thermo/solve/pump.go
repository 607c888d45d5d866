package solve

import (
	"fmt"
	"math"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Pump: adiabatic compression of liquid taking shaft power.
//
//	mass:       m_in = m_out
//	energy:     m h_in + power = m h_out
//	efficiency: efficiency * (h_out - h_in) = h_s - h_in,  h_s = h(p_out, s(p_in, h_in))
//
// Entropy generation: S_gen = m (s_out - s_in). An inlet that is not liquid is a warning: a pump
// fed with vapour cavitates.
func init() { ops["pump"] = unitOp{buildPump, finishPump} }

func buildPump(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	w := b.param(u, "power", true, 0)
	eta := b.param(u, "efficiency", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, []term{w}, nil)
	hi, ho, pi, po := b.hv(in), b.hv(out), b.pv(in), b.pv(out)
	b.unitEq(u, Equation{
		Label: "isentropic efficiency of " + b.uname(u), Kind: EqWork, Dim: units.SpecificEnergy,
		LHS: "efficiency x actual rise", RHS: "isentropic rise", Vars: []int{ho, eta.v, hi, po, pi},
		eval: func(x []float64) (float64, float64, error) {
			hs, err := isentropicH(x[pi], x[hi], x[po])
			return x[eta.v] * (x[ho] - x[hi]), hs - x[hi], err
		},
		direct: func(x []float64, v int) (float64, error) {
			if v != ho && v != eta.v {
				// A pressure or the inlet enthalpy: only Newton can invert the
				// isentropic enthalpy. Checked first, since that unknown has no value yet.
				return math.NaN(), errNoDirect
			}
			hs, err := isentropicH(x[pi], x[hi], x[po])
			if err != nil {
				return math.NaN(), err
			}
			switch v {
			case ho:
				return x[hi] + (hs-x[hi])/x[eta.v], nil
			case eta.v:
				return (hs - x[hi]) / (x[ho] - x[hi]), nil
			}
			return math.NaN(), errNoDirect
		},
		floor: 1,
	})
}

func finishPump(c *unitCalc) {
	in, out := c.ports("in"), c.ports("out")
	c.res.W = c.param("power", nanf)
	c.res.Efficiency = c.param("efficiency", nanf)
	c.checkEfficiency(c.res.Efficiency)
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
