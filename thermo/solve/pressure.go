package solve

import (
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
	var eqs []int
	nDefault := 0
	for e := range sys.Eqs {
		if pass(&sys.Eqs[e]) >= 0 {
			eqs = append(eqs, e)
		}
		if sys.Eqs[e].Kind == EqDefault {
			nDefault++
		}
	}
	if nDefault == 0 {
		return
	}
	matchVar := make([]int, len(sys.Vars))
	for i := range matchVar {
		matchVar[i] = -1
	}
	matched := make(map[int]bool, len(eqs))
	seen := make([]int, len(sys.Vars))
	stamp := 0
	var try func(e int) bool
	try = func(e int) bool {
		for _, v := range sys.Eqs[e].Vars {
			if !isPressureVar(v) || seen[v] == stamp {
				continue
			}
			seen[v] = stamp
			if matchVar[v] < 0 || try(matchVar[v]) {
				matchVar[v] = e
				matched[e] = true
				return true
			}
		}
		return false
	}
	for p := range 3 {
		for _, e := range eqs { // a free unknown at hand first: chains match without searching
			if pass(&sys.Eqs[e]) != p {
				continue
			}
			for _, v := range sys.Eqs[e].Vars {
				if isPressureVar(v) && matchVar[v] < 0 {
					matchVar[v], matched[e] = e, true
					break
				}
			}
		}
		for _, e := range eqs {
			if pass(&sys.Eqs[e]) == p && !matched[e] {
				stamp++
				try(e)
			}
		}
	}
	kept := sys.Eqs[:0]
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind == EqDefault && !matched[e] {
			continue
		}
		kept = append(kept, sys.Eqs[e])
	}
	clear(sys.Eqs[len(kept):])
	sys.Eqs = kept
}
