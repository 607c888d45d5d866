package solve

import "hmb/thermo/units"

// share adds m_part = rate * m_whole for a parameter that states one stream's flow as a share
// of another's (a boiler's blowdown_rate, a deaerator's vent_rate). The rate is an unknown, fixed
// by the file's given when there is one and otherwise solved from the two flows, so that the
// result reads the share whichever way it was fixed. Nothing is added when the file gives no
// rate: then the equation would only define the rate.
func (b *builder) share(u int, name string, part, whole int) {
	if b.m.Units[u].Params[name] == nil {
		return
	}
	r := b.param(u, name, true, 0)
	mp, mw := b.mv(part), b.mv(whole)
	b.unitEq(u, Equation{
		Label: name + " of " + b.uname(u), Kind: EqState, Dim: units.MassFlow,
		LHS: b.sname(part) + " flow", RHS: name + " x " + b.sname(whole) + " flow", Vars: []int{mp, mw, r.v},
		eval: func(x []float64) (float64, float64, error) { return x[mp], x[r.v] * x[mw], nil },
		grad: func(x []float64, g []float64) { g[0], g[1], g[2] = 1, -x[r.v], -x[mw] },
		direct: func(x []float64, v int) (float64, error) {
			switch v {
			case mp:
				return x[r.v] * x[mw], nil
			case mw:
				return x[mp] / x[r.v], nil
			}
			return x[mp] / x[mw], nil
		},
		floor: 1e-9,
	})
}
