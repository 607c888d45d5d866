package solve

import (
	"fmt"
	"math"
	"strings"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Mixer: adiabatic mixing chamber, open feedwater heater, deaerator, header. Inlets k mix into
// one outlet.
//
//	mass:     sum_k m_k = m_out
//	energy:   sum_k m_k h_k = m_out h_out + heat_loss
//	pressure: p_out = min_k p_k - dp
//
// Unequal inlet pressures: the outlet takes the lowest inlet pressure less dp. Streams at a
// higher pressure throttle at their inlet nozzle, which the entropy generation accounts for;
// this is how a deaerator fed from several extraction pressures is drawn. dp is zero unless the
// file gives it or the outlet pressure is given too (a header's pressure): then the outlet
// takes the pressure given and every inlet throttles into it. An inlet below the outlet
// pressure is an error (HMB514): it cannot flow in. An inlet pressure the file does not give is
// not fixed by the mixer unless it is the only unknown of the pressure equation, and then it is
// taken as the lowest (p_out + dp).
//
// Entropy generation: S_gen = m_out s_out - sum_k m_k s_k + heat_loss / T_ambient.
func init() { ops["mixer"] = unitOp{buildMixer, finishMixer} }

func buildMixer(b *builder, u int) {
	ins, out := b.ports(u, "in"), b.ports(u, "out")
	loss := b.param(u, "heat_loss", false, 0)
	dp := b.drop(u, "dp")
	b.massBalance(u, ins, out)
	b.energyBalance(u, "", ins, out, nil, []term{loss})
	b.lowestInlet(u, ins, out[0], dp, "outlet")
}

// lowestInlet adds p_out = min_k p_in,k - dp: a vessel (a mixer, a deaerator's tank) runs at
// its lowest inlet pressure less its drop; the streams at higher pressures throttle in. what
// names the pressure in the equation ("outlet", "tank").
func (b *builder) lowestInlet(u int, ins []int, out int, dp term, what string) {
	pout := b.pv(out)
	vars := []int{pout}
	var pins []int
	for _, s := range ins {
		pins = append(pins, b.pv(s))
		vars = append(vars, b.pv(s))
	}
	vars = append(vars, dp.v)
	lowest := func(x []float64) float64 {
		p := math.Inf(1)
		for _, v := range pins {
			p = min(p, x[v])
		}
		return p
	}
	b.unitEq(u, Equation{
		Label: "pressure of " + b.uname(u), Kind: EqPressure, Dim: units.Pressure, LHS: what, RHS: "lowest inlet less drop", Vars: vars,
		eval: func(x []float64) (float64, float64, error) { return x[pout], lowest(x) - x[dp.v], nil },
		direct: func(x []float64, v int) (float64, error) {
			switch v {
			case pout:
				return lowest(x) - x[dp.v], nil
			case dp.v:
				return lowest(x) - x[pout], nil
			}
			return x[pout] + x[dp.v], nil
		},
		floor: 1,
	})
}

func finishMixer(c *unitCalc) {
	ins, out := c.ports("in"), c.ports("out")
	c.inletsAbove(ins, out[0], "inlet", "the outlet")
	loss := c.param("heat_loss", 0)
	if !c.flows(ins, out, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, out) + c.lossEntropy(loss)
	c.checkSgen()
}

// inletsAbove reports inlets below the pressure they flow into (the stream ref): a mixer's
// outlet, a desuperheater's steam. Nothing in such a unit lifts them. role names the inlets
// ("inlet", "spray water"), into names ref ("the outlet", "the steam").
func (c *unitCalc) inletsAbove(ins []int, ref int, role, into string) {
	rr := c.s.res.Streams[ref]
	if !rr.HasState {
		return
	}
	f := c.s.f
	p := rr.State.P
	for _, st := range ins {
		r := c.s.res.Streams[st]
		if st == ref || !r.HasState || r.State.P >= p-c.s.relTol*p {
			continue
		}
		c.rose = true
		c.s.diag(model.Error, CodePressureRise, c.un.Span, fmt.Sprintf("%s: %s %s at %s is below %s %s at %s: it cannot flow in",
			c.name(), role, c.s.b.sname(st), f.q(units.Pressure, r.State.P), into, c.s.b.sname(ref), f.q(units.Pressure, p)),
			related(c.s.m.Streams[st].Span, role+" "+c.s.b.sname(st)), related(c.s.m.Streams[ref].Span, strings.TrimPrefix(into, "the ")+" "+c.s.b.sname(ref)))
	}
}
