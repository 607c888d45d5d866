package solve

import (
	"fmt"
	"math"
	"sort"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// negativeFlows reports every solved flow below zero as an error that names the givens forcing
// it: no stream of a plant runs against the direction its units give it. A flow within the
// closure tolerance of zero (relTol of the largest flow through the units it joins) is taken as
// zero: it is what "this branch takes all of the header" looks like after rounding.
//
// A stream whose flow follows from another reversed flow (the pipe after a reversed branch) is
// named on that stream's error instead of getting one of its own, and a stream a unit has
// explained in its own terms (s.explained: the vapour outlet of a flash tank fed subcooled
// liquid) is not reported again, nor is what follows from it.
func (s *solveRun) negativeFlows() {
	sys := s.b.sys
	var neg []int
	for i := range s.m.Streams {
		if m := s.res.Streams[i].M; m < 0 && m < -s.flowTol(i) {
			neg = append(neg, i)
		}
	}
	if len(neg) == 0 {
		return
	}
	block := s.blockOfVar()
	sort.SliceStable(neg, func(a, b int) bool {
		return block[sys.StreamVar(neg[a], model.Flow)] < block[sys.StreamVar(neg[b], model.Flow)]
	})
	origin := map[int]int{} // reported stream -> index into s.diags, or -1 when explained
	for _, i := range neg {
		st := s.m.Streams[i]
		v := sys.StreamVar(i, model.Flow)
		e := s.st.matchVar[v]
		if s.explained[i] {
			origin[i] = -1
			continue
		}
		if e >= 0 {
			from, follows := -2, false
			for _, w := range sys.Eqs[e].Vars {
				if o := sys.Vars[w].Stream; o >= 0 && o != i && sys.Vars[w].Prop == model.Flow {
					if d, ok := origin[o]; ok {
						from, follows = d, true
						break
					}
				}
			}
			if follows {
				origin[i] = from
				if from >= 0 {
					d := &s.diags[from]
					d.Related = append(d.Related, related(st.Span, fmt.Sprintf("%s follows from it and runs backwards too (%s)", st.Name, s.f.q(units.MassFlow, s.res.Streams[i].M))))
				}
				continue
			}
		}
		msg := fmt.Sprintf("%s: solved flow %s is negative: the stream would run against its stated direction", st.Name, s.f.q(units.MassFlow, s.res.Streams[i].M))
		var rel []model.Related
		if e >= 0 && sys.Eqs[e].Kind != EqGiven {
			eq := &sys.Eqs[e]
			var by []string
			for _, g := range s.st.determining(sys, e) {
				by = append(by, s.givenText(g))
				rel = append(rel, related(sys.Eqs[g].Span, sys.Eqs[g].Label))
			}
			msg += "; the " + eq.Label + " forces it"
			if len(by) > 0 {
				msg += " from " + andList(by)
			}
			if eq.Unit >= 0 {
				rel = append([]model.Related{related(s.m.Units[eq.Unit].Span, eq.Label)}, rel...)
			}
		}
		origin[i] = len(s.diags)
		s.diag(model.Error, CodeNegativeFlow, st.Span, msg, rel...)
	}
}

// flowTol is the least flow below zero that stream i reports: relTol of the largest flow
// through the units it joins.
func (s *solveRun) flowTol(i int) float64 {
	big := math.Abs(s.res.Streams[i].M)
	for _, n := range s.nbr[i] {
		if m := s.res.Streams[n].M; finite(m) {
			big = max(big, math.Abs(m))
		}
	}
	return s.relTol * big
}

// blockOfVar maps each unknown to the index of the block that solved it (0 when none).
func (s *solveRun) blockOfVar() []int {
	out := make([]int, len(s.b.sys.Vars))
	for bi, blk := range s.st.blocks {
		for _, e := range blk {
			if v := s.st.matchEq[e]; v >= 0 {
				out[v] = bi
			}
		}
	}
	return out
}

// givenText writes a given equation as a message names it, with its value as the file wrote
// it: "given BR1 flow 4 kg/s", "given duty of heater H1 2 MW".
func (s *solveRun) givenText(e int) string {
	eq := &s.b.sys.Eqs[e]
	if eq.Given == nil {
		return eq.Label
	}
	if eq.Param != "" && eq.Unit >= 0 {
		if spec := s.m.Units[eq.Unit].Kind.Param(eq.Param); spec != nil && spec.Delta {
			return eq.Label + " " + s.f.writtenDelta(eq.Dim, eq.Given.Value, eq.Given.Unit)
		}
	}
	return eq.Label + " " + s.f.written(eq.Dim, eq.Given.Value, eq.Given.Unit)
}
