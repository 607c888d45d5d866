package solve

import (
	"fmt"
	"math"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// unitCalc is what a unit's finish function sees after solving.
type unitCalc struct {
	s   *solveRun
	u   int
	un  *model.Unit
	res *UnitResult
	// sIn, sOut and sHeat are the entropy flows of the unit, W/K: sum |m s| over inlets and
	// outlets, and the largest |Q/T| of heat crossing its boundary (see checkSgen).
	sIn, sOut, sHeat float64
	bounds           []string // the heat crossing the boundary, in words: "the heat loss leaving at the ambient 25.000 C"
	// rose is set once a pressure rise the unit cannot make is reported: the negative entropy
	// generation that follows from it is not reported again.
	rose bool
}

// unitResults fills each unit's duties, balances and entropy generation and runs its checks.
func (s *solveRun) unitResults() {
	if s.res.Units == nil {
		s.res.Units = make([]UnitResult, len(s.m.Units))
		for i := range s.res.Units {
			s.res.Units[i] = nanUnit()
		}
	}
	for u, un := range s.m.Units {
		if s.b.badUnit[u] {
			continue
		}
		c := &unitCalc{s: s, u: u, un: un, res: &s.res.Units[u]}
		ops[un.Kind.Name].finish(c)
	}
}

func (c *unitCalc) name() string { return c.s.b.uname(c.u) }

func (c *unitCalc) ports(role string) []int { return c.s.b.ports(c.u, role) }
func (c *unitCalc) port(role string) int    { return c.s.b.port(c.u, role) }

// state returns a stream's solved state and flow; ok is false when either is missing.
func (c *unitCalc) state(st int) (if97.State, float64, bool) {
	r := &c.s.res.Streams[st]
	return r.State, r.M, r.Solved
}

// param is a unit parameter's solved or given value, def when neither.
func (c *unitCalc) param(name string, def float64) float64 {
	if v := c.s.b.sys.UnitVar(c.u, name); v >= 0 {
		if c.s.solved[v] {
			return c.s.x[v]
		}
		return math.NaN()
	}
	if g := c.un.Params[name]; g != nil && finite(g.Value) {
		return g.Value
	}
	return def
}

// flows sets the mass and energy sums over inlets and outlets; heatIn and workIn cross into the
// fluid, heatOut and workOut leave it. It reports whether every stream was solved.
func (c *unitCalc) flows(ins, outs []int, heatIn, heatOut float64) bool {
	var mi, mo, ei, eo float64
	for _, st := range ins {
		state, m, ok := c.state(st)
		if !ok {
			return false
		}
		mi += m
		ei += m * state.H
	}
	for _, st := range outs {
		state, m, ok := c.state(st)
		if !ok {
			return false
		}
		mo += m
		eo += m * state.H
	}
	c.res.MassIn, c.res.MassOut = mi, mo
	c.res.EnergyIn, c.res.EnergyOut = ei+max(heatIn, 0)-min(heatOut, 0), eo+max(heatOut, 0)-min(heatIn, 0)
	return true
}

// entropyFlow is sum m s over outlets minus over inlets, W/K. It keeps the sums of |m s| on
// each side as the scale checkSgen judges the result against.
func (c *unitCalc) entropyFlow(ins, outs []int) float64 {
	var sin, sout float64
	for _, st := range outs {
		state, m, _ := c.state(st)
		sout += m * state.S
		c.sOut += math.Abs(m * state.S)
	}
	for _, st := range ins {
		state, m, _ := c.state(st)
		sin += m * state.S
		c.sIn += math.Abs(m * state.S)
	}
	return sout - sin
}

// heatEntropy is the entropy a heat flow q (W, any sign) carries across the boundary at
// temperature t (K); its size joins the scale checkSgen judges against.
// what words the heat and where it crosses, for the message of checkSgen.
func (c *unitCalc) heatEntropy(q, t float64, what string) float64 {
	if q == 0 {
		return 0
	}
	c.sHeat = max(c.sHeat, math.Abs(q/t))
	c.bounds = append(c.bounds, what+" "+c.s.f.q(units.Temperature, t))
	return q / t
}

// lossEntropy is the entropy a heat loss carries out at the ambient temperature.
func (c *unitCalc) lossEntropy(loss float64) float64 {
	return c.heatEntropy(loss, c.s.ambient(), "the heat loss leaving at the ambient")
}

// checkSgen reports a negative entropy generation beyond what the closure tolerance allows. The
// tolerance is relTol of the unit's own entropy flows (the larger of sum |m s| in and out, and
// of the entropy its heat carries across the boundary): an entropy balance judged by the same
// measure as the mass balance is, and never by enthalpy, whose zero is a convention.
func (c *unitCalc) checkSgen() {
	// A generation within the rounding of the unit's own entropy flows (3e-15 kW/K of a heater
	// at zero duty) is the 0 it stands for.
	c.res.Sgen = units.Resolved(c.res.Sgen, c.sIn+c.sOut+c.sHeat)
	sg := c.res.Sgen
	if !finite(sg) {
		return
	}
	tol := c.s.relTol * max(c.sIn, c.sOut, c.sHeat)
	if sg < -tol && !c.rose {
		with := ""
		if len(c.bounds) > 0 {
			with = ", with " + andList(c.bounds)
		}
		c.s.diag(model.Error, CodeEntropy, c.un.Span, fmt.Sprintf("%s is impossible: it destroys entropy (generation %s%s); check its givens",
			c.name(), c.s.f.sgen(sg), with))
	}
}

// checkEfficiency reports an isentropic efficiency outside 0..1 that the balances produced (a
// given one is reported where it is written).
func (c *unitCalc) checkEfficiency(eta float64) {
	if g := c.un.Params["efficiency"]; g != nil {
		return
	}
	if finite(eta) && !(eta > 0 && eta <= 1) {
		c.s.diag(model.Error, CodeEfficiency, c.un.Span, fmt.Sprintf("%s: solved isentropic efficiency %s is outside 0..1", c.name(), c.s.f.frac(eta)))
	}
}

func (c *unitCalc) power(v float64) string { return c.s.f.q(units.Power, v) }

var nanf = math.NaN()

const errSev = model.Error

// ambient is the temperature of the surroundings, K, at which heat losses leave.
func (s *solveRun) ambient() float64 { return s.m.AmbientOr() }
