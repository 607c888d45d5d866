package solve

import (
	"context"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// pressureDefaults decides which pressure-drop defaults ("dp = 0", see drop) apply: those that
// fix a pressure nothing else fixes. It matches the pressure equations alone (given pressures
// and drops, a T given with a quality, the units' pressure relations) to the pressures and
// drops, givens first, then the units' relations, then the defaults; a default left over is
// removed from the system, so that the drop follows from the pressures given at both ends.
// The defaults that stay are matched with the givens in the whole system (firstPass): a unit
// whose duty and end temperatures are all given then reports its energy balance, not a
// pressure that a liquid's temperature would fix.
//
// Only pressure equations take part: a temperature given beside an enthalpy fixes a pressure
// in principle, but so weakly for a liquid that it must not decide where a drop goes.
func (b *builder) pressureDefaults() {
	sys := b.sys
	isPressureVar := func(v int) bool { return sys.Vars[v].Dim == units.Pressure }
	pass := func(eq *Equation) int {
		switch {
		case eq.Kind == EqDefault:
			return 2
		case eq.Kind == EqPressure:
			return 1
		case eq.Kind != EqGiven:
			return -1
		case eq.Stream >= 0 && eq.Prop == model.P,
			eq.Stream >= 0 && eq.Prop == model.T && len(eq.Vars) == 1 && isPressureVar(eq.Vars[0]), // T with a quality: p = psat(T)
			eq.Param != "" && eq.Dim == units.Pressure:
			return 0
		}
		return -1
	}
	nDefault := 0
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind == EqDefault {
			nDefault++
		}
	}
	if nDefault == 0 {
		return
	}
	// The matching of analyse (matchClasses), on the pressure unknowns alone.
	st := newStructure(context.Background(), newGraphOf(sys, isPressureVar), len(sys.Eqs), len(sys.Vars))
	st.matchClasses(3, func(e int) int { return pass(&sys.Eqs[e]) })
	b.steps += st.steps
	matched := func(e int) bool { return st.matchEq[e] >= 0 }
	kept := sys.Eqs[:0]
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind == EqDefault && !matched(e) {
			continue
		}
		kept = append(kept, sys.Eqs[e])
	}
	clear(sys.Eqs[len(kept):])
	sys.Eqs = kept
}
