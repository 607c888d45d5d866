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
	// Blocks are the matched equations in the groups the solver solved together, in solving
	// order: the Jacobian of the matched equations is block lower triangular in this order.
	Blocks [][]int
	// Judged, which Adjust may set, marks redundant equations whose verdict it gives itself: the
	// solver then reports them neither as closures (HMB504) nor as conflicts (HMB502, HMB503).
	Judged []bool
	// Diags are Adjust's findings, reported with the solver's.
	Diags []model.Diagnostic
	// Product is what Adjust found, kept as Result.Adjusted for the stages after the solve (the
	// reconciliation of measurements: thermo/reconcile.Of reads it back).
	Product any
}

// adjust runs Options.Adjust, if any.
func (s *solveRun) adjust() {
	if s.opt.Adjust == nil {
		return
	}
	a := &Adjustment{Model: s.m, System: s.b.sys, X: s.x, Solved: s.solved, Matched: s.st.matchEq,
		Blocks: s.st.blocks, Judged: make([]bool, len(s.b.sys.Eqs))}
	s.opt.Adjust(s.ctx, a)
	s.judged = a.Judged
	s.diags = append(s.diags, a.Diags...)
	s.res.Adjusted = a.Product
}

// isJudged reports whether Options.Adjust gave the verdict on redundant equation e.
func (s *solveRun) isJudged(e int) bool { return e < len(s.judged) && s.judged[e] }

// Adjust is the type of Options.Adjust.
type Adjust func(ctx context.Context, a *Adjustment)

// Evaluator reads a subject's results at other values of the unknowns than the solved ones, as
// the solver would report them there but without its checks: what uncertainty propagation
// differentiates. It reuses its buffers and is not safe for concurrent use.
type Evaluator struct {
	sh  solveRun // a shadow of the run: its own values, states and (discarded) findings
	res Result
}

// Evaluator returns an evaluator of r's results, or nil when r was not solved.
func (r *Result) Evaluator() *Evaluator {
	if r == nil || r.run == nil {
		return nil
	}
	ev := &Evaluator{sh: *r.run}
	ev.res.Streams = make([]StreamResult, len(r.Streams))
	ev.res.Units = make([]UnitResult, len(r.Units))
	ev.sh.res = &ev.res
	return ev
}

// At evaluates the results of stream or unit sub at x (as long as Result.X) and returns a Result
// to read them from with Value; nil when they cannot be evaluated there (a state outside
// IAPWS-IF97, a value not solved).
func (ev *Evaluator) At(sub model.Subject, x []float64) *Result {
	s := &ev.sh
	if len(x) != len(s.x) || sub.Index < 0 {
		return nil
	}
	s.x, s.diags, s.explained = x, s.diags[:0], map[int]bool{}
	switch sub.Kind {
	case model.StreamSubject:
		if sub.Index >= len(s.m.Streams) || !ev.stream(sub.Index, false) {
			return nil
		}
	case model.UnitSubject:
		u := sub.Index
		if u >= len(s.m.Units) || s.b.badUnit[u] {
			return nil
		}
		for _, p := range s.m.Units[u].Ports {
			if !ev.stream(p.Stream, true) {
				return nil
			}
		}
		ev.res.Units[u] = nanUnit()
		c := &unitCalc{s: s, u: u, un: s.m.Units[u], res: &ev.res.Units[u]}
		ops[s.m.Units[u].Kind.Name].finish(c)
	default:
		return nil
	}
	return &ev.res
}

// stream sets stream i's state and flow at the shadow's values; needFlow: fail without a flow.
func (ev *Evaluator) stream(i int, needFlow bool) bool {
	s := &ev.sh
	sys := s.b.sys
	sr := &ev.res.Streams[i]
	*sr = StreamResult{M: math.NaN()}
	pv, hv, mv := sys.StreamVar(i, model.P), sys.StreamVar(i, model.H), sys.StreamVar(i, model.Flow)
	if !s.solved[pv] || !s.solved[hv] || needFlow && !s.solved[mv] {
		return false
	}
	st, err := streamState(s.x[pv], s.x[hv])
	if err != nil {
		return false
	}
	sr.State, sr.HasState = st, true
	if s.solved[mv] {
		sr.M, sr.Solved = s.x[mv], true
	}
	return true
}
