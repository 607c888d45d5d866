package solve

import "hmb/thermo/units"

// Blowdown: a boiler's purge of drum water, which keeps the dissolved solids of the feedwater
// from concentrating in the drum. It leaves as saturated liquid at the drum pressure, taken as
// the steam outlet pressure (the drum and the steam leave together; a superheater's own drop is
// not split out of dp). With a blowdown stream BD the boiler's balances become
//
//	mass:     m_in = m_out + m_BD
//	energy:   m_in h_in + duty = m_out h_out + m_BD h_BD
//	drum:     p_BD = p_out,  x(p_BD, h_BD) = 0
//	rate:     m_BD = blowdown_rate * m_in      (only when blowdown_rate is given)
//
// so the duty counts the heat the blowdown carries away too, and the boiler efficiency stays
// duty over fuel.
func (b *builder) blowdown(u, in, out, bd int) {
	b.equal(u, b.pv(bd), b.pv(out), EqPressure, units.Pressure, "blowdown at the drum pressure of "+b.uname(u))
	b.saturated(u, bd, 0, "saturated blowdown of "+b.uname(u))
	b.share(u, "blowdown_rate", bd, in)
}
