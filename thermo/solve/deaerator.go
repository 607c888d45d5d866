package solve

import (
	"fmt"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Deaerator with a vent: water to be deaerated and heating steam enter a tank; the steam heats
// the water to saturation at the tank pressure (which drives the dissolved gases out), a little
// saturated steam leaves by the vent carrying them, and saturated water leaves below. The vent
// is what distinguishes it from a mixer (no vent) and from a flash tank (whose feed flashes into
// steam: here steam is condensed into the water).
//
//	mass:       sum_k m_k = m_vent + m_out
//	energy:     sum_k m_k h_k = m_vent h_vent + m_out h_out + heat_loss
//	pressure:   p_out = min_k p_k - dp          (the tank runs at its lowest inlet less dp;
//	            p_vent = p_out                    dp = 0 unless given or fixed by a given p_out)
//	saturation: x(p_vent, h_vent) = 1,  x(p_out, h_out) = 0
//	vent:       m_vent = vent_rate * m_out     (only when vent_rate is given)
//
// The unknown a design usually solves is the heating steam's flow: the water's flows and states,
// the steam's state, the tank pressure and the vent flow (or vent_rate) fix it. Inlets below the
// tank pressure cannot flow in (HMB514). Inlets that, mixed, are subcooled at the tank pressure
// leave the water short of saturation: the balances would draw steam in through the vent; mixed
// inlets superheated at the tank pressure leave no water to deaerate (HMB530).
// Entropy generation: S_gen = m_vent s_vent + m_out s_out - sum_k m_k s_k + heat_loss / T_ambient.
func init() { ops["deaerator"] = unitOp{buildDeaerator, finishDeaerator} }

func buildDeaerator(b *builder, u int) {
	ins := b.ports(u, "in")
	vent, out := b.port(u, "vent"), b.port(u, "out")
	loss := b.param(u, "heat_loss", false, 0)
	outs := []int{vent, out}
	b.massBalance(u, ins, outs)
	b.energyBalance(u, "", ins, outs, nil, []term{loss})
	b.lowestInlet(u, ins, out, b.drop(u, "dp"), "tank")
	b.equal(u, b.pv(vent), b.pv(out), EqPressure, units.Pressure, "vent at the tank pressure of "+b.uname(u))
	b.saturated(u, vent, 1, "saturated steam vent of "+b.uname(u))
	b.saturated(u, out, 0, "saturated water outlet of "+b.uname(u))
	b.share(u, "vent_rate", vent, out)
}

func finishDeaerator(c *unitCalc) {
	ins := c.ports("in")
	vent, out := c.port("vent"), c.port("out")
	outs := []int{vent, out}
	c.inletsAbove(ins, out, "inlet", "the tank")
	loss := c.param("heat_loss", 0)
	c.deaeratorFeed(ins, vent, out, loss)
	if !c.flows(ins, outs, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, outs) + c.lossEntropy(loss)
	c.checkSgen()
}

// deaeratorFeed reports inlets that, mixed at the tank pressure after the heat loss, are not
// inside the saturation dome: subcooled, the heating steam is too little to bring the water to
// saturation (the vent would run backwards, drawing steam in); superheated, no water is left
// (the outlet would run backwards). It needs every inlet's flow: when the balances solved one of
// them, its sign is the flows' judgment (flows.go).
func (c *unitCalc) deaeratorFeed(ins []int, vent, out int, loss float64) {
	tank := c.s.res.Streams[out]
	if !tank.HasState {
		return
	}
	pt := tank.State.P
	hl, hv, err := satEnds(pt)
	if err != nil {
		return
	}
	var m, mh float64
	for _, st := range ins {
		r := c.s.res.Streams[st]
		if !r.HasState || !(r.M > 0) {
			return
		}
		m += r.M
		mh += r.M * r.State.H
	}
	h := (mh - loss) / m
	tol := c.s.relTol * (hv - hl)
	if h >= hl-tol && h <= hv+tol {
		return
	}
	f := c.s.f
	at := ""
	if st, err := statePH(pt, h); err == nil {
		ts, _ := if97.Tsat(pt)
		at = fmt.Sprintf(" (%s mixed, against the saturation temperature %s)", f.q(units.Temperature, st.T), f.q(units.Temperature, ts))
	}
	feed := "the inlets"
	if loss != 0 {
		feed += " less the heat loss"
	}
	var msg string
	if h < hl {
		msg = fmt.Sprintf("%s: %s are subcooled at the tank pressure %s%s: too little heating steam to bring the water to saturation; the balances would draw steam in through the vent %s",
			c.name(), feed, f.q(units.Pressure, pt), at, c.s.b.sname(vent))
	} else {
		msg = fmt.Sprintf("%s: %s are superheated at the tank pressure %s%s: more heating steam than the water can condense, so no water is left; the balances would draw water in through the outlet %s",
			c.name(), feed, f.q(units.Pressure, pt), at, c.s.b.sname(out))
	}
	c.s.diag(model.Error, CodeDeaeratorFeed, c.un.Span, msg)
	c.s.explained[vent], c.s.explained[out] = true, true
}
