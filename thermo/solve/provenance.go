package solve

import "hmb/thermo/model"

// provenance records, for every stream property, the given or equation that produced it: the
// equation the matching assigned to the unknown, or, for T, s and x, IF97 from p and h.
func (s *solveRun) provenance() {
	sys := s.b.sys
	of := func(v int) Provenance {
		if !s.solved[v] {
			return Provenance{Unit: -1}
		}
		e := s.st.matchVar[v]
		eq := &sys.Eqs[e]
		k := ProvEquation
		if eq.Kind == EqGiven && eq.Stream >= 0 && eq.Stream == sys.Vars[v].Stream && eq.Prop == sys.Vars[v].Prop {
			k = ProvGiven
		}
		return Provenance{Kind: k, Label: eq.Label, Span: eq.Span, Unit: eq.Unit}
	}
	for i, st := range s.m.Streams {
		r := &s.res.Streams[i]
		r.Source[model.Flow] = of(sys.StreamVar(i, model.Flow))
		r.Source[model.P] = of(sys.StreamVar(i, model.P))
		r.Source[model.H] = of(sys.StreamVar(i, model.H))
		derived := "" // shared by T, s and x: built once
		for _, p := range []model.Prop{model.T, model.S, model.X} {
			switch {
			case !r.HasState:
				r.Source[p] = Provenance{Unit: -1}
			case st.Given[p] != nil:
				r.Source[p] = Provenance{Kind: ProvGiven, Label: "given " + st.Name + " " + p.String(), Span: st.Given[p].Span, Unit: -1}
			default:
				if derived == "" {
					derived = "IAPWS-IF97 from p (" + r.Source[model.P].Label + ") and h (" + r.Source[model.H].Label + ")"
				}
				r.Source[p] = Provenance{Kind: ProvDerived, Unit: -1, Label: derived}
			}
		}
	}
}
