package solve

import (
	"fmt"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// A flow given in volume units (flow 120 gpm) is a given of the stream's volumetric flow, not
// a mass flow converted up front: the density depends on the state the balances find.
//
//	m v(p, h) = V        (v the specific volume of IAPWS-IF97, V the given volume flow)
//
// Its two sides are volume flows, so a conflict reads in the unit the file wrote. A volume flow
// is a liquid's: steam and wet steam are metered and stated by mass, and their specific volume
// changes with every bar, so a volume flow on a stream that turns out not to be liquid is an
// error (HMB420) at the given.
func (b *builder) volumeGiven(i int) {
	g := b.m.Streams[i].VolFlow
	if g == nil {
		return
	}
	name := b.m.Streams[i].Name
	if !finite(g.Value) {
		b.diag(model.Error, CodeStructure, g.Span, fmt.Sprintf("%s flow is not a finite number", name))
		return
	}
	mv, pv, hv := b.mv(i), b.pv(i), b.hv(i)
	val := g.Value
	sys := b.sys
	vol := func(p, h float64) (float64, error) {
		st, err := statePH(p, h)
		if err != nil {
			return 0, err
		}
		sys.remember(i, p, h, st, false)
		return st.V, nil
	}
	b.addEq(Equation{
		Label: "given " + name + " flow (a volume flow)", Kind: EqGiven, Unit: -1, Stream: i, Prop: model.Flow, Given: g, Span: g.Span,
		Dim: units.VolumeFlow, LHS: "solved", RHS: "given", Vars: []int{mv, pv, hv},
		eval: func(x []float64) (float64, float64, error) {
			v, err := vol(x[pv], x[hv])
			return x[mv] * v, val, err
		},
		direct: func(x []float64, w int) (float64, error) {
			if w != mv {
				return 0, errNoDirect
			}
			v, err := vol(x[pv], x[hv])
			return val / v, err
		},
		floor: 1e-9,
	})
}

// volumeFlows reports every flow given in volume units on a stream whose solved state is not
// liquid.
func (s *solveRun) volumeFlows() {
	for i, st := range s.m.Streams {
		g := st.VolFlow
		if g == nil || i >= len(s.res.Streams) || !s.res.Streams[i].HasState {
			continue
		}
		r := &s.res.Streams[i]
		if ph := r.State.Phase; ph == if97.Liquid || ph == if97.SatLiquid {
			continue
		}
		s.diag(model.Error, CodeVolumeNotLiquid, g.Span, fmt.Sprintf("%s: flow %s is a volume flow, but %s is %s (%s, %s): a volume flow is taken at a liquid's density; give the flow of steam in mass units (kg/s, t/h, lbm/h)",
			st.Name, s.f.written(units.VolumeFlow, g.Value, g.Unit), st.Name, r.State.Phase, s.f.q(units.Pressure, r.State.P), s.f.q(units.Temperature, r.State.T)))
	}
}
