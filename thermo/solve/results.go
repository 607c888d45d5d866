package solve

import (
	"math"

	"hmb/thermo/if97"
	"hmb/thermo/model"
)

// This file is the one lookup of a result by name: expectations, tables, the report, hover and
// JSON all read results through Value. The names, dimensions and help are the catalogue's
// (model.StreamResults, model.Kind.Results, model.TotalResults); each name has its computation
// here.

// streamValues computes each stream result from the stream's solved state (SI base units, NaN
// when not solved or not defined). A quality is NaN for a single-phase state.
var streamValues = map[string]func(r *StreamResult) float64{
	"flow":     func(r *StreamResult) float64 { return r.M },
	"p":        stateValue(func(r *StreamResult) float64 { return r.State.P }),
	"T":        stateValue(func(r *StreamResult) float64 { return r.State.T }),
	"h":        stateValue(func(r *StreamResult) float64 { return r.State.H }),
	"s":        stateValue(func(r *StreamResult) float64 { return r.State.S }),
	"x":        stateValue(func(r *StreamResult) float64 { return r.State.X }),
	"v":        stateValue(func(r *StreamResult) float64 { return r.State.V }),
	"rho":      stateValue(func(r *StreamResult) float64 { return r.State.Rho }),
	"vol_flow": stateValue(func(r *StreamResult) float64 { return r.M * r.State.V }),
	"Tsat":     stateValue(func(r *StreamResult) float64 { return tsatOf(r.State) }),
	// Vapour (saturated or superheated) only: a wet mixture, a liquid and a supercritical fluid
	// have none.
	"superheat": stateValue(func(r *StreamResult) float64 {
		if r.State.Phase != if97.Vapor && r.State.Phase != if97.SatVapor {
			return math.NaN()
		}
		return max(r.State.T-tsatOf(r.State), 0)
	}),
	// Liquid (saturated or compressed) below the critical pressure only.
	"subcooling": stateValue(func(r *StreamResult) float64 {
		if r.State.Phase != if97.Liquid && r.State.Phase != if97.SatLiquid {
			return math.NaN()
		}
		return max(tsatOf(r.State)-r.State.T, 0)
	}),
}

// tsatOf is the saturation temperature at a state's pressure, K; NaN at or above the critical
// pressure, where water has none. A saturated state answers its own temperature, so that its
// superheat or subcooling is zero to the last digit.
func tsatOf(st if97.State) float64 {
	if st.P >= pCrit {
		return math.NaN()
	}
	if st.Phase == if97.SatLiquid || st.Phase == if97.SatVapor || st.Phase == if97.Mixture {
		return st.T
	}
	ts, err := if97.Tsat(st.P)
	if err != nil {
		return math.NaN()
	}
	return ts
}

func stateValue(f func(r *StreamResult) float64) func(r *StreamResult) float64 {
	return func(r *StreamResult) float64 {
		if !r.HasState {
			return math.NaN()
		}
		return f(r)
	}
}

// unitCtx is what a unit result's computation reads: the unit, its solved balance and the
// solved streams.
type unitCtx struct {
	m   *model.Model
	res *Result
	un  *model.Unit
	r   *UnitResult
}

// pressure is the solved pressure of a stream, Pa; NaN when its state was not found.
func (c unitCtx) pressure(st int) float64 {
	if st < 0 || st >= len(c.res.Streams) || !c.res.Streams[st].HasState {
		return math.NaN()
	}
	return c.res.Streams[st].State.P
}

// drop is the lowest pressure among the unit's streams of the inlet roles less the highest
// among its outlets (all inlets and outlets when roles is empty), Pa: the pressure drop
// across the unit, below zero for a rise (a pump).
func (c unitCtx) drop(roles ...string) float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	n := 0
	for _, p := range c.un.Ports {
		spec := c.un.Kind.Port(p.Role)
		if spec == nil || len(roles) > 0 && !has(roles, p.Role) {
			continue
		}
		v := c.pressure(p.Stream)
		if math.IsNaN(v) {
			return math.NaN()
		}
		if spec.Inlet {
			lo = min(lo, v)
		} else {
			hi = max(hi, v)
		}
		n++
	}
	if n == 0 || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return math.NaN()
	}
	return lo - hi
}

// share is the solved flow of the unit's stream of role part over that of role whole; NaN
// when the unit has no such stream or a flow is missing.
func (c unitCtx) share(part, whole string) float64 {
	p, w := portOf(c.un, part), portOf(c.un, whole)
	if p < 0 || w < 0 || p >= len(c.res.Streams) || w >= len(c.res.Streams) {
		return math.NaN()
	}
	mp, mw := c.res.Streams[p].M, c.res.Streams[w].M
	if mw == 0 {
		return math.NaN()
	}
	return mp / mw
}

func has(s []string, v string) bool {
	for _, w := range s {
		if w == v {
			return true
		}
	}
	return false
}

// unitValues computes each unit result from the unit's solved balance, its streams and its
// givens.
var unitValues = map[string]func(c unitCtx) float64{
	"duty":       func(c unitCtx) float64 { return c.r.Q },
	"power":      func(c unitCtx) float64 { return c.r.W },
	"efficiency": func(c unitCtx) float64 { return c.r.Efficiency },
	"fuel":       func(c unitCtx) float64 { return c.r.Fuel },
	"sgen":       func(c unitCtx) float64 { return c.r.Sgen },
	// Never solved, only given (zero when not): an expectation on it checks the file against
	// itself, and a table shows what the balance took.
	"heat_loss": func(c unitCtx) float64 {
		if g := c.un.Params["heat_loss"]; g != nil {
			return g.Value
		}
		return 0
	},
	// A desuperheater's drop is the steam's: its spray water comes from a higher pressure.
	"dp": func(c unitCtx) float64 {
		if c.un.Kind.Name == "desuperheater" {
			return c.drop("steam", "out")
		}
		return c.drop()
	},
	"dp_hot":        func(c unitCtx) float64 { return c.drop("hot_in", "hot_out") },
	"dp_cold":       func(c unitCtx) float64 { return c.drop("cold_in", "cold_out") },
	"blowdown_rate": func(c unitCtx) float64 { return c.share("blowdown", "in") },
	"vent_rate":     func(c unitCtx) float64 { return c.share("vent", "out") },
	"dT_min":        func(c unitCtx) float64 { return c.r.DTMin },
	"lmtd":          func(c unitCtx) float64 { return c.r.LMTD },
	"UA":            func(c unitCtx) float64 { return c.r.UA },
}

// totalValues computes each result of the whole file from its Totals.
var totalValues = map[string]func(t *Totals) float64{
	"power_out": func(t *Totals) float64 { return t.PowerOut },
	"power_in":  func(t *Totals) float64 { return t.PowerIn },
	"net_power": func(t *Totals) float64 { return t.PowerOut - t.PowerIn },
	"heat_in":   func(t *Totals) float64 { return t.HeatIn },
	"heat_out":  func(t *Totals) float64 { return t.HeatOut },
	// A plant that makes no net power (a process steam plant: pumps only) has no cycle
	// efficiency and no heat rate.
	"efficiency": func(t *Totals) float64 {
		if net := t.PowerOut - t.PowerIn; net > 0 && t.HeatIn > 0 {
			return net / t.HeatIn
		}
		return math.NaN()
	},
	"heat_rate": func(t *Totals) float64 {
		if net := t.PowerOut - t.PowerIn; net > 0 && t.HeatIn > 0 {
			return t.HeatIn / net
		}
		return math.NaN()
	},
}

// Value returns the result name of a subject of m: its solved value in SI base units (NaN when
// it was not solved, or does not apply to the state: the superheat of a liquid) and its
// catalogue entry. ok is false when the subject has no result of that name. r may be nil
// (nothing solved: every value is NaN).
func (r *Result) Value(m *model.Model, sub model.Subject, name string) (v float64, spec *model.ResultSpec, ok bool) {
	spec = m.Result(sub, name)
	if spec == nil {
		return math.NaN(), nil, false
	}
	v = math.NaN()
	switch sub.Kind {
	case model.StreamSubject:
		if f := streamValues[name]; f != nil && r != nil && sub.Index < len(r.Streams) {
			v = f(&r.Streams[sub.Index])
		}
	case model.UnitSubject:
		if f := unitValues[name]; f != nil && r != nil && sub.Index < len(r.Units) {
			v = f(unitCtx{m: m, res: r, un: m.Units[sub.Index], r: &r.Units[sub.Index]})
		}
	case model.TotalSubject:
		if f := totalValues[name]; f != nil && r != nil && r.Totals != nil {
			v = f(r.Totals)
		}
	}
	return v, spec, true
}

// stateOnly are the stream results a solved state may not have.
var stateOnly = []string{"x", "Tsat", "superheat", "subcooling"}

// Lacks reports whether a result of a subject is undefined for its solved state (the quality of
// a superheated vapour, the superheat of a liquid, Tsat above the critical pressure) rather than
// not solved: outputs show "none" for it, not a missing value.
func (r *Result) Lacks(m *model.Model, sub model.Subject, name string) bool {
	if r == nil || sub.Kind != model.StreamSubject || sub.Index < 0 || sub.Index >= len(r.Streams) || !has(stateOnly, name) {
		return false
	}
	v, _, ok := r.Value(m, sub, name)
	return ok && math.IsNaN(v) && r.Streams[sub.Index].HasState
}
