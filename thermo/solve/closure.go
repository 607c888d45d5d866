package solve

import (
	"fmt"
	"math"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// overSpecified checks every equation the matching left over. Each one is redundant: all its
// unknowns are fixed without it. Within tolerance it is a closure (reported when two or more
// independent givens meet in it, so a closed loop's identity is not reported); beyond, a given
// conflicts (HMB502) or a balance does not close (HMB503).
func (s *solveRun) overSpecified() {
	sys := s.b.sys
	for e := range sys.Eqs {
		if s.st.matchEq[e] >= 0 {
			continue
		}
		eq := &sys.Eqs[e]
		if eq.Kind == EqDefault {
			continue // something else fixed the unknown: the default does not apply
		}
		ready := true
		for _, v := range eq.Vars {
			if !s.solved[v] {
				ready = false
			}
		}
		if !ready {
			continue
		}
		lhs, rhs, err := eq.value(s.x)
		if err != nil || !finite(lhs) || !finite(rhs) {
			continue
		}
		diff := lhs - rhs
		mag := max(math.Abs(lhs), math.Abs(rhs))
		if eq.en != nil {
			mag = max(eq.en.scale(s.x), math.Abs(diff))
		}
		rel := 0.0
		if mag > 0 {
			rel = math.Abs(diff) / mag
		}
		ok := rel <= s.relTol || math.Abs(diff) <= eq.floor
		if eq.quality {
			rel = math.Abs(diff)
			ok = rel <= s.relTol
		}
		if eq.Given != nil && eq.Given.Tol > 0 {
			ok = math.Abs(diff) <= eq.Given.Tol
		}
		if eq.Unit >= 0 && eq.Kind != EqGiven {
			ur := &s.res.Units[eq.Unit]
			switch eq.Kind {
			case EqMass:
				ur.MassClosure = rel
			case EqEnergy:
				ur.EnergyClosure = rel
			}
		}
		if s.isJudged(e) {
			continue // Options.Adjust judged it (a balance of measurements)
		}
		givens := s.st.determining(sys, e)
		if eq.Kind == EqMass {
			// Around a closed loop one mass balance is the sum of the others whatever the
			// values: it says something only where two stated flows meet in it.
			var flows []int
			for _, g := range givens {
				if sys.Eqs[g].Stream >= 0 && sys.Eqs[g].Prop == model.Flow {
					flows = append(flows, g)
				}
			}
			givens = flows
		}
		var rel2 []model.Related
		var by []string
		for _, g := range givens {
			rel2 = append(rel2, related(sys.Eqs[g].Span, sys.Eqs[g].Label))
			by = append(by, sys.Eqs[g].Label)
		}
		byText := ""
		if len(by) > 0 {
			byText = " (fixed by " + andList(by) + ")"
		}
		sides := fmt.Sprintf("%s %s, %s %s (%s)", eq.LHS, s.value(eq, lhs), eq.RHS, s.value(eq, rhs), pct(rel))
		if eq.Kind == EqEnergy {
			sides = s.energySides(e, diff, mag, rel)
		}
		switch {
		case ok && eq.Kind == EqGiven:
			s.diag(model.Info, CodeClosure, eq.Span, fmt.Sprintf("%s is redundant and agrees: %s given, %s from the rest%s (%s)",
				eq.Label, s.value(eq, rhs), s.value(eq, lhs), byText, pct(rel)), rel2...)
		case ok && (len(givens) >= 2 && (eq.Kind == EqMass || eq.Kind == EqEnergy)):
			s.diag(model.Info, CodeClosure, eq.Span, fmt.Sprintf("%s closes: %s", eq.Label, sides), rel2...)
		case ok:
		case eq.Kind == EqState && eq.quality && eq.Unit >= 0:
			s.outletState(e, lhs, rhs, givens)
		case eq.Kind == EqGiven:
			s.diag(model.Error, CodeConflict, eq.Span, fmt.Sprintf("%s conflicts: %s given, but %s follows from the rest%s; the difference is %s (%s)",
				eq.Label, s.value(eq, rhs), s.value(eq, lhs), byText, s.f.dq(eq.Dim, diff), pct(rel)), rel2...)
		default:
			over := ""
			if len(by) > 0 {
				// Name the givens that meet in the balance: one of them is wrong, or one too many.
				over = "; over-specified by " + andList(by)
			}
			s.diag(model.Error, CodeNotClosed, eq.Span, fmt.Sprintf("%s does not close: %s%s", eq.Label, sides, over), rel2...)
		}
	}
}

// value writes one side of an equation in the file's units.
func (s *solveRun) value(eq *Equation, v float64) string {
	if eq.Given != nil && eq.Param != "" {
		if spec := s.m.Units[eq.Unit].Kind.Param(eq.Param); spec != nil && spec.Delta {
			return s.f.dq(eq.Dim, v)
		}
	}
	if eq.Kind == EqPressure || eq.Kind == EqState && eq.Dim != 0 {
		return s.f.q(eq.Dim, v)
	}
	return s.f.q(eq.Dim, v)
}

// energySides words an energy balance's closure without the datum-dependent totals. With a duty
// or power in the balance (given, or fixed by the rest), it sets that value against the one the
// stream states imply: "duty 340 kW given, the stream states imply 314.2 kW (7.6 %)". Otherwise it
// gives the difference against the largest enthalpy change across the unit (see energyBalance).
func (s *solveRun) energySides(e int, diff, scale, rel float64) string {
	sys := s.b.sys
	eq := &sys.Eqs[e]
	g := make([]float64, len(eq.Vars))
	sys.gradient(e, s.x, g)
	for k, v := range eq.Vars {
		vr := &sys.Vars[v]
		if vr.Unit != eq.Unit || vr.Dim.Measure() != units.Power || !s.solved[v] || !(math.Abs(g[k]) > 0.5) {
			continue
		}
		// The value of this term that would close the balance, the rest held.
		implied := s.x[v] - diff/g[k]
		name := vr.Param
		stated := s.f.q(vr.Dim, s.x[v]) + " (" + s.source(v) + ")"
		if gv := s.m.Units[eq.Unit].Params[name]; gv != nil && finite(gv.Value) && gv.Value == s.x[v] {
			stated = s.f.written(vr.Dim, gv.Value, gv.Unit) + " given"
		}
		return fmt.Sprintf("%s %s, the stream states imply %s (%s)", name, stated, s.f.q(vr.Dim, implied), pct(rel))
	}
	return fmt.Sprintf("the streams and duties differ by %s, %s of the largest enthalpy change across the unit (%s)",
		s.f.q(units.Power, math.Abs(diff)), pct(rel), s.f.q(units.Power, scale))
}

// outletState reports a unit's saturation condition that the givens leave unmet: the balances
// put an outlet in a state the unit cannot deliver (a flash tank's "vapour" wet or superheated
// when all three flows are metered). lhs is the outlet's solved (extended) quality, rhs the
// quality the unit's model requires.
func (s *solveRun) outletState(e int, lhs, rhs float64, givens []int) {
	sys := s.b.sys
	eq := &sys.Eqs[e]
	st := sys.Vars[eq.Vars[0]].Stream
	name := s.m.Streams[st].Name
	p := s.x[sys.StreamVar(st, model.P)]
	state := "a wet mixture of quality " + s.f.frac(lhs)
	switch {
	case lhs < 0:
		state = "subcooled liquid"
	case lhs > 1:
		state = "superheated vapour"
	}
	if r := s.res.Streams[st]; r.HasState && !twoPhase(r.State) {
		state += " at " + s.f.q(units.Temperature, r.State.T)
	}
	want := "saturated liquid (quality 0)"
	if rhs == 1 {
		want = "saturated vapour (quality 1)"
	}
	var by []string
	var rel []model.Related
	for _, g := range givens {
		by = append(by, s.givenText(g))
		rel = append(rel, related(sys.Eqs[g].Span, sys.Eqs[g].Label))
	}
	role := ""
	for _, pt := range s.m.Units[eq.Unit].Ports {
		if pt.Stream == st {
			role = pt.Role + " "
		}
	}
	msg := fmt.Sprintf("%s: the balances leave its %soutlet %s as %s at %s, but it delivers %s there", s.b.uname(eq.Unit), role, name, state, s.f.q(units.Pressure, p), want)
	if share, ok := s.flashShare(eq.Unit); ok {
		msg += fmt.Sprintf(" (the feed would flash %s %% to vapour at that pressure)", units.Format(100*share, 4))
	}
	if len(by) > 0 {
		msg += "; over-specified by " + andList(by) + ": one of them is wrong or one too many"
	}
	s.diag(model.Error, CodeOutletState, eq.Span, msg, rel...)
}
