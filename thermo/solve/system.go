package solve

import (
	"math"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Variable is one unknown of the system: a stream's m, p or h, or a unit parameter.
type Variable struct {
	Name   string     // as a message names it: "S3 flow", "S3 p", "H1 duty"
	Stream int        // index into Model.Streams, or -1
	Unit   int        // index into Model.Units, or -1
	Param  string     // parameter name for a unit unknown
	Prop   model.Prop // Flow, P or H for a stream unknown
	Dim    units.Dim  // for messages
	Delta  bool       // shown as a difference (pressure drop)
	typ    float64    // typical magnitude: finite-difference steps and first guesses
}

// EqKind classifies an equation for messages and for weighting in a later reconciliation.
type EqKind uint8

const (
	EqGiven    EqKind = iota // a stated value of a stream property or unit parameter
	EqMass                   // mass balance
	EqEnergy                 // energy balance
	EqPressure               // pressure relation (drop, equality)
	EqState                  // equal state or saturation condition
	EqWork                   // shaft power or isentropic efficiency
	EqFuel                   // boiler duty = efficiency x fuel
	// EqDefault is a default of a unit parameter ("dp = 0") that holds only when nothing else
	// fixes the unknown: the matching takes defaults after every other equation, and a default
	// left over is dropped, never reported.
	EqDefault
)

// Equation is one scalar relation lhs(x) = rhs(x). Its residual is lhs - rhs in SI units of Dim.
// Splitting the two sides lets a balance that does not close say "in 25.31, out 25.10".
//
// The one-byte fields sit together: a large plant has hundreds of thousands of equations.
type Equation struct {
	Label string // "energy balance of mixer DA", "given S3 T"
	Kind  EqKind
	Prop  model.Prop // the property of a stream given
	Dim   units.Dim  // dimension of lhs and rhs
	// quality marks an equation in the (extended) quality: left over, it closes when the two
	// sides differ by at most the relative tolerance in x itself (relTol of the latent heat in
	// h), not relative to a quality that may be zero.
	quality bool
	Unit    int    // index into Model.Units, or -1
	Stream  int    // index into Model.Streams for a stream given, or -1
	Param   string // the parameter of a unit given
	Given   *model.Given
	Span    model.Span
	LHS     string // names of the two sides for a closure message ("in", "out")
	RHS     string
	Vars    []int // unknowns the equation touches, in the order the matching prefers them

	// lin, when set, is the equation in linear form, in place of eval, grad and direct: each
	// side sums lin[i].c x[Vars[i]] over its terms, plus lc or rc. Givens of m, p and h, mass
	// balances, pressure drops and equalities take this form: most of a flowsheet's equations,
	// built without a closure each.
	lin    []linTerm
	lc, rc float64
	// en, set on energy balances, is the balance in closed form, in place of eval and grad;
	// closures of energy balances are judged against its scale (see energyForm.scale).
	en *energyForm

	eval   func(x []float64) (lhs, rhs float64, err error)
	grad   func(x []float64, g []float64) // d(lhs-rhs)/d(Vars[i]); nil: finite differences
	direct func(x []float64, v int) (float64, error)
	floor  float64 // scale below which the residual is not scaled further
}

// linTerm is one term of a linear equation: coefficient c on the left side, or on the right.
type linTerm struct {
	c   float64
	rhs bool
}

// value evaluates both sides of the equation at x.
func (eq *Equation) value(x []float64) (lhs, rhs float64, err error) {
	if eq.en != nil {
		lhs, rhs = eq.en.value(x)
		return lhs, rhs, nil
	}
	if eq.lin == nil {
		return eq.eval(x)
	}
	lhs, rhs = eq.lc, eq.rc
	for i, t := range eq.lin {
		if t.rhs {
			rhs += t.c * x[eq.Vars[i]]
		} else {
			lhs += t.c * x[eq.Vars[i]]
		}
	}
	return lhs, rhs, nil
}

// hasDirect reports whether the equation solves directly for one unknown (see solveFor).
func (eq *Equation) hasDirect() bool {
	return eq.direct != nil || eq.lin != nil && len(eq.lin) == 1
}

// solveFor returns the value of unknown v that satisfies the equation, the others held.
func (eq *Equation) solveFor(x []float64, v int) (float64, error) {
	if eq.lin == nil {
		return eq.direct(x, v)
	}
	t := eq.lin[0]
	if len(eq.lin) != 1 || eq.Vars[0] != v || t.c == 0 {
		return math.NaN(), errNoDirect
	}
	if t.rhs {
		return (eq.lc - eq.rc) / t.c, nil
	}
	return (eq.rc - eq.lc) / t.c, nil
}

// System is the whole set of unknowns and equations built from a model. It is kept explicit so
// that a later stage can propagate measurement uncertainties and reconcile redundant givens by
// weighted least squares on the same residuals and Jacobian.
type System struct {
	Vars []Variable
	Eqs  []Equation
	// streamVar[i] holds the indices of stream i's m, p and h unknowns.
	streamVar [][3]int
	unitVar   []map[string]int
	// memo holds, while Solve runs, the last state each stream's equations computed and the
	// (p, h) it was computed at: when the solve ends on that pair, the stream's result reuses it
	// rather than inverting (p, h) once more. Nil outside Solve, so that a later user of the
	// System (which may evaluate it from several goroutines) writes nothing.
	memo []memoState
}

// memoState is one stream's remembered state. final marks a saturated end from PX, which is
// already what streamState would snap to.
type memoState struct {
	p, h  float64
	st    if97.State
	final bool
}

// remember keeps st as stream i's state at (p, h) while Solve runs.
func (s *System) remember(i int, p, h float64, st if97.State, final bool) {
	if s.memo != nil && i >= 0 && i < len(s.memo) {
		s.memo[i] = memoState{p: p, h: h, st: st, final: final}
	}
}

// stateBook gives the states of the solved streams: the one a stream's equations computed at
// its final (p, h) when there is one, else a fresh inversion of (p, h); every stream at the same
// (p, h) (a tee's outlets and inlet) gets the same state, so that their entropies cancel exactly.
// Each shows its solved p and h as they are, not as the property library rounds them on the
// way through its own units.
type stateBook map[[2]float64]if97.State

// book collects the remembered states that the solution x ended on.
func (s *System) book(x []float64) stateBook {
	b := stateBook{}
	for i, m := range s.memo {
		if m.p != x[s.streamVar[i][1]] || m.h != x[s.streamVar[i][2]] || !finite(m.p) || !finite(m.h) {
			continue
		}
		st := m.st
		if !m.final {
			st = snapSat(st, m.p, m.h)
		}
		st.P, st.H = m.p, m.h
		b[[2]float64{m.p, m.h}] = st
	}
	return b
}

// state is the state at (p, h).
func (b stateBook) state(p, h float64) (if97.State, error) {
	if st, ok := b[[2]float64{p, h}]; ok {
		return st, nil
	}
	st, err := streamState(p, h)
	if err == nil {
		st.P, st.H = p, h
		b[[2]float64{p, h}] = st
	}
	return st, err
}

// Work counts what a solve did: a measure of its cost that, unlike time, does not depend on the
// machine or on what else runs on it, so that tests can hold the solver's growth linear.
type Work struct {
	Structure int // equation-unknown incidences scanned: matching, block order, and the searches behind diagnostics
	Evals     int // equation evaluations: residuals (one per side pair), gradients (one per finite difference), direct solutions
}

// StreamVar returns the index of stream i's unknown for prop (Flow, P or H), or -1.
func (s *System) StreamVar(i int, prop model.Prop) int {
	if i < 0 || i >= len(s.streamVar) {
		return -1
	}
	switch prop {
	case model.Flow:
		return s.streamVar[i][0]
	case model.P:
		return s.streamVar[i][1]
	case model.H:
		return s.streamVar[i][2]
	}
	return -1
}

// UnitVar returns the index of unit u's unknown parameter, or -1.
func (s *System) UnitVar(u int, param string) int {
	if u < 0 || u >= len(s.unitVar) {
		return -1
	}
	if v, ok := s.unitVar[u][param]; ok {
		return v
	}
	return -1
}

// Residual evaluates equation e at x: lhs - rhs in SI, and the scale it is judged against.
func (s *System) Residual(e int, x []float64) (r, scale float64, err error) {
	eq := &s.Eqs[e]
	l, rr, err := eq.value(x)
	if err != nil {
		return math.NaN(), math.NaN(), err
	}
	if !finite(l) || !finite(rr) {
		return math.NaN(), math.NaN(), errNotFinite
	}
	return l - rr, max(math.Abs(l), math.Abs(rr), eq.floor), nil
}

// Residuals fills r (len(Eqs)) with lhs - rhs in SI for every equation at x; NaN where an
// equation cannot be evaluated (a state outside IF97).
func (s *System) Residuals(x, r []float64) {
	for e := range s.Eqs {
		v, _, err := s.Residual(e, x)
		if err != nil {
			v = math.NaN()
		}
		r[e] = v
	}
}

// Entry is one nonzero of a sparse matrix.
type Entry struct {
	Row, Col int
	Val      float64
}

// Jacobian returns the nonzeros of d(residual)/d(unknown) at x: analytic for the linear and
// bilinear balances, central differences for equations through IF97. Entries that cannot be
// evaluated are NaN.
func (s *System) Jacobian(x []float64) []Entry {
	var out []Entry
	g := make([]float64, 0, 8)
	for e := range s.Eqs {
		eq := &s.Eqs[e]
		g = g[:0]
		for range eq.Vars {
			g = append(g, 0)
		}
		s.gradient(e, x, g)
		for i, v := range eq.Vars {
			out = append(out, Entry{Row: e, Col: v, Val: g[i]})
		}
	}
	return out
}

// gradient fills g with the derivatives of equation e's raw residual with respect to its Vars.
func (s *System) gradient(e int, x []float64, g []float64) {
	eq := &s.Eqs[e]
	if eq.lin != nil {
		for i, t := range eq.lin {
			g[i] = t.c
			if t.rhs {
				g[i] = -t.c
			}
		}
		return
	}
	if eq.en != nil {
		eq.en.grad(x, g)
		return
	}
	if eq.grad != nil {
		eq.grad(x, g)
		return
	}
	for i, v := range eq.Vars {
		x0 := x[v]
		d := 1e-6 * max(math.Abs(x0), s.Vars[v].typ)
		x[v] = x0 + d
		rp, _, e1 := s.Residual(e, x)
		x[v] = x0 - d
		rm, _, e2 := s.Residual(e, x)
		x[v] = x0
		switch {
		case e1 == nil && e2 == nil:
			g[i] = (rp - rm) / (2 * d)
		case e1 == nil:
			r0, _, err := s.Residual(e, x)
			if err != nil {
				g[i] = math.NaN()
			} else {
				g[i] = (rp - r0) / d
			}
		case e2 == nil:
			r0, _, err := s.Residual(e, x)
			if err != nil {
				g[i] = math.NaN()
			} else {
				g[i] = (r0 - rm) / d
			}
		default:
			g[i] = math.NaN()
		}
	}
}
