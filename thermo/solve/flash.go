package solve

import (
	"fmt"
	"math"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Flash tank or separator: feeds k enter, saturated vapour and saturated liquid leave at the
// tank pressure.
//
//	mass:       sum_k m_k = m_vap + m_liq
//	energy:     sum_k m_k h_k = m_vap h_vap + m_liq h_liq + heat_loss
//	pressure:   p_vap = p_liq                 (the tank pressure, given on either outlet)
//	saturation: x(p_vap, h_vap) = 1,  x(p_liq, h_liq) = 0
//
// Feed pressures are not tied to the tank: a feed flashes across its inlet valve, so a feed below
// the tank pressure is an error (HMB514), as is a feed that is not inside the saturation dome at
// the tank pressure once mixed (HMB513: subcooled, nothing flashes; superheated, no liquid).
// Entropy generation: S_gen = m_vap s_vap + m_liq s_liq - sum_k m_k s_k + heat_loss / T_ambient.
func init() { ops["flash"] = unitOp{buildFlash, finishFlash} }

func buildFlash(b *builder, u int) {
	ins := b.ports(u, "in")
	vap, liq := b.port(u, "vapor"), b.port(u, "liquid")
	loss := b.param(u, "heat_loss", false, 0)
	outs := []int{vap, liq}
	b.massBalance(u, ins, outs)
	b.energyBalance(u, "", ins, outs, nil, []term{loss})
	b.equal(u, b.pv(liq), b.pv(vap), EqPressure, units.Pressure, "tank pressure of "+b.uname(u))
	b.saturated(u, vap, 1, "saturated vapour outlet of "+b.uname(u))
	b.saturated(u, liq, 0, "saturated liquid outlet of "+b.uname(u))
}

func finishFlash(c *unitCalc) {
	ins := c.ports("in")
	vap, liq := c.port("vapor"), c.port("liquid")
	outs := []int{vap, liq}
	loss := c.param("heat_loss", 0)
	c.flashFeed(ins, vap, liq, loss)
	if !c.flows(ins, outs, 0, loss) {
		return
	}
	c.res.Sgen = c.entropyFlow(ins, outs) + c.lossEntropy(loss)
	c.checkSgen()
}

// flashFeed checks what the tank can do with its feed: every feed must come from a pressure at
// or above the tank's (it throttles in; nothing lifts it), and the feed, mixed and throttled to
// the tank pressure, must lie inside the saturation dome. A subcooled feed cannot flash: the
// balances would send steam into the tank through its vapour outlet (a negative vapour flow); a
// superheated one leaves no liquid. Either is reported here, in the tank's terms, instead of
// as the negative flows it produces.
func (c *unitCalc) flashFeed(ins []int, vap, liq int, loss float64) {
	f := c.s.f
	tank := c.s.res.Streams[vap]
	if !tank.HasState {
		return
	}
	pt := tank.State.P
	for _, st := range ins {
		if r := c.s.res.Streams[st]; r.HasState && r.State.P < pt-c.s.relTol*pt {
			c.rose = true
			c.s.diag(model.Error, CodePressureRise, c.un.Span, fmt.Sprintf("%s: feed %s at %s is below the tank pressure %s (%s): it cannot flow into the tank",
				c.name(), c.s.b.sname(st), f.q(units.Pressure, r.State.P), f.q(units.Pressure, pt), c.s.b.sname(vap)),
				related(c.s.m.Streams[st].Span, "feed "+c.s.b.sname(st)), related(c.s.m.Streams[vap].Span, "tank pressure"))
		}
	}
	hl, hv, err := satEnds(pt)
	if err != nil {
		return
	}
	// The feed's enthalpy once mixed and throttled to the tank pressure, after the heat loss.
	var m, mh float64
	below, above, known := true, true, true
	for _, st := range ins {
		r := c.s.res.Streams[st]
		if !r.HasState {
			return
		}
		below = below && r.State.H < hl
		above = above && r.State.H > hv
		if !(r.M > 0) {
			known = false
		}
		m += r.M
		mh += r.M * r.State.H
	}
	h := math.NaN()
	if known {
		h = (mh - loss) / m
		tol := c.s.relTol * (hv - hl)
		below, above = h < hl-tol, h > hv+tol
	}
	if !below && !above {
		return
	}
	feed := "the feed " + c.s.b.sname(ins[0])
	if len(ins) > 1 {
		feed = "the mixed feed"
	}
	if loss != 0 {
		feed += " less the heat loss"
	}
	ts, _ := if97.Tsat(pt)
	at := ""
	if finite(h) {
		if st, err := statePH(pt, h); err == nil {
			at = fmt.Sprintf(" (%s at the tank pressure, against the saturation temperature %s)", f.q(units.Temperature, st.T), f.q(units.Temperature, ts))
		}
	}
	var msg string
	if below {
		msg = fmt.Sprintf("%s: %s is subcooled at the tank pressure %s%s, so nothing can flash; the balances would draw steam in through the vapour outlet %s",
			c.name(), feed, f.q(units.Pressure, pt), at, c.s.b.sname(vap))
	} else {
		msg = fmt.Sprintf("%s: %s is superheated at the tank pressure %s%s, so no liquid is left; the balances would draw water in through the liquid outlet %s",
			c.name(), feed, f.q(units.Pressure, pt), at, c.s.b.sname(liq))
	}
	c.s.diag(model.Error, CodeFlashFeed, c.un.Span, msg)
	c.s.explained[vap], c.s.explained[liq] = true, true
}

// flashShare is the share of a flash tank's feed that leaves as vapour at the tank pressure,
// from the feeds' solved flows and states and the heat loss: (h_feed - h_liq) / (h_vap - h_liq).
// ok is false for another kind or when a value is missing.
func (s *solveRun) flashShare(u int) (float64, bool) {
	un := s.m.Units[u]
	if un.Kind.Name != "flash" {
		return 0, false
	}
	vap := s.b.port(u, "vapor")
	p := s.x[s.b.pv(vap)]
	hl, hv, err := satEnds(p)
	if err != nil {
		return 0, false
	}
	var m, mh float64
	for _, st := range s.b.ports(u, "in") {
		r := s.res.Streams[st]
		if !r.HasState || !finite(r.M) {
			return 0, false
		}
		m += r.M
		mh += r.M * r.State.H
	}
	loss := 0.0
	if g := un.Params["heat_loss"]; g != nil && finite(g.Value) {
		loss = g.Value
	}
	if !(m > 0) {
		return 0, false
	}
	return ((mh-loss)/m - hl) / (hv - hl), true
}
