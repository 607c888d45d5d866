package solve

import (
	"context"
	"math"

	"hmb/thermo/model"
)

// Adjustment is what Options.Adjust sees once the balances are solved and before any result is
// read from them: the system, its solution and the matching that produced it. A later stage (the
// reconciliation of measurements in thermo/reconcile) may move the solved values and take over
// the judgment of redundant equations.
type Adjustment struct {
	Model  *model.Model
	System *System
	// X holds the solved values, NaN where unsolved. Adjust may move them; every result the
	// solver reports afterwards (states, duties, closures, expectations) is read from X.
	X      []float64
	Solved []bool // unknowns that have a value
	// Matched maps each equation to the unknown it was solved for, or -1 when the matching left
	// it over: a redundant equation, checked after solving.
	Matched []int
	// Judged, which Adjust may set, marks redundant equations whose verdict it gives itself: the
	// solver then reports them neither as closures (HMB504) nor as conflicts (HMB502, HMB503).
	Judged []bool
	// Diags are Adjust's findings, reported with the solver's.
	Diags []model.Diagnostic
}

// adjust runs Options.Adjust, if any.
func (s *solveRun) adjust() {
	if s.opt.Adjust == nil {
		return
	}
	a := &Adjustment{Model: s.m, System: s.b.sys, X: s.x, Solved: s.solved, Matched: s.st.matchEq,
		Judged: make([]bool, len(s.b.sys.Eqs))}
	s.opt.Adjust(s.ctx, a)
	s.judged = a.Judged
	s.diags = append(s.diags, a.Diags...)
}

// isJudged reports whether Options.Adjust gave the verdict on redundant equation e.
func (s *solveRun) isJudged(e int) bool { return e < len(s.judged) && s.judged[e] }

// UnitAt returns unit u's results (duty, power, entropy generation, ...) at other values x of the
// unknowns (as long as Result.X), as the solver would report them there, without its checks:
// what uncertainty propagation differentiates. ok is false when the unit was not solved.
func (r *Result) UnitAt(u int, x []float64) (res UnitResult, ok bool) {
	s := r.run
	if s == nil || u < 0 || u >= len(s.m.Units) || s.b.badUnit[u] || len(x) != len(s.x) {
		return nanUnit(), false
	}
	sh := *s // a shadow run: its own values, states and (discarded) findings
	sh.x = x
	sh.diags = nil
	sh.res = &Result{Streams: make([]StreamResult, len(s.m.Streams)), Units: []UnitResult{nanUnit()}}
	sys := s.b.sys
	for _, p := range s.m.Units[u].Ports {
		sr := &sh.res.Streams[p.Stream]
		sr.M = math.NaN()
		pv, hv, mv := sys.StreamVar(p.Stream, model.P), sys.StreamVar(p.Stream, model.H), sys.StreamVar(p.Stream, model.Flow)
		if !s.solved[pv] || !s.solved[hv] || !s.solved[mv] {
			return nanUnit(), false
		}
		st, err := streamState(x[pv], x[hv])
		if err != nil {
			return nanUnit(), false
		}
		sr.State, sr.HasState, sr.M, sr.Solved = st, true, x[mv], true
	}
	c := &unitCalc{s: &sh, u: u, un: s.m.Units[u], res: &sh.res.Units[0]}
	ops[s.m.Units[u].Kind.Name].finish(c)
	return *c.res, true
}

// Adjust is the type of Options.Adjust.
type Adjust func(ctx context.Context, a *Adjustment)

// StreamAt returns stream i's result (flow and state) at other values x of the unknowns (as long
// as Result.X): what uncertainty propagation differentiates. ok is false when the stream was not
// solved or its state at x lies outside IAPWS-IF97.
func (r *Result) StreamAt(i int, x []float64) (res StreamResult, ok bool) {
	s := r.run
	res.M = math.NaN()
	if s == nil || i < 0 || i >= len(s.m.Streams) || len(x) != len(s.x) {
		return res, false
	}
	sys := s.b.sys
	pv, hv, mv := sys.StreamVar(i, model.P), sys.StreamVar(i, model.H), sys.StreamVar(i, model.Flow)
	if !s.solved[pv] || !s.solved[hv] {
		return res, false
	}
	st, err := streamState(x[pv], x[hv])
	if err != nil {
		return res, false
	}
	res.State, res.HasState = st, true
	if s.solved[mv] {
		res.M, res.Solved = x[mv], true
	}
	return res, true
}
