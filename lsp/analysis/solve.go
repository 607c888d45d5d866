package analysis

import (
	"context"
	"math"

	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// Solver is the balance solver hmb check runs, with its default options, as a SolveFunc.
func Solver(ctx context.Context, m *model.Model) *cache.Solution {
	return FromResult(m, solve.Solve(ctx, m, solve.Options{}))
}

// propQuantity maps the properties the solver tracks to the quantities the editor shows.
var propQuantity = [model.NumProps]cache.Quantity{
	model.Flow: cache.QFlow, model.P: cache.QP, model.T: cache.QT,
	model.H: cache.QH, model.S: cache.QS, model.X: cache.QX,
}

// FromResult converts the solver's result for m. Values stay in SI base units; anything the
// solver did not find is NaN, never a zero that would read as a value.
func FromResult(m *model.Model, r *solve.Result) *cache.Solution {
	sol := &cache.Solution{Diagnostics: r.Diags, Data: r}
	nan := math.NaN()
	sol.Streams = make([]cache.StreamState, len(m.Streams))
	for i := range sol.Streams {
		st := &sol.Streams[i]
		for q := range st.Values {
			st.Values[q] = nan
		}
		if i >= len(r.Streams) {
			continue
		}
		sr := &r.Streams[i]
		st.Values[cache.QFlow] = sr.M
		for p := model.Prop(0); p < model.NumProps; p++ {
			st.Source[propQuantity[p]] = source(sr.Source[p])
		}
		if !sr.HasState {
			continue
		}
		s := sr.State
		st.Values[cache.QP], st.Values[cache.QT], st.Values[cache.QH] = s.P, s.T, s.H
		st.Values[cache.QS], st.Values[cache.QV], st.Values[cache.QX] = s.S, s.V, s.X
		st.Phase = s.Phase.String()
		st.Source[cache.QV] = derived // v is never given
		if math.IsNaN(s.X) {
			st.Source[cache.QX] = "" // single phase: there is no quality to come from anywhere
		}
	}
	sol.Units = make([]cache.UnitBalance, len(m.Units))
	for i := range sol.Units {
		if i >= len(r.Units) {
			sol.Units[i] = cache.UnitBalance{MassIn: nan, MassOut: nan, EnergyIn: nan, EnergyOut: nan,
				Duty: nan, Power: nan, Sgen: nan, Efficiency: nan, MassClosure: nan, EnergyClosure: nan}
			continue
		}
		u := &r.Units[i]
		sol.Units[i] = cache.UnitBalance{
			MassIn: u.MassIn, MassOut: u.MassOut, EnergyIn: u.EnergyIn, EnergyOut: u.EnergyOut,
			Duty: u.Q, Power: u.W, Sgen: u.Sgen, Efficiency: u.Efficiency,
			MassClosure: u.MassClosure, EnergyClosure: u.EnergyClosure,
		}
	}
	return sol
}

// derived is the source of a value IAPWS-IF97 gives from the stream's p and h. The solver's own
// label also names the sources of p and h, which the hover shows in their rows already.
const derived = "IAPWS-IF97 from p and h"

// source says where a value came from: "given" for the stream's own given, else the solver's
// label ("energy balance of mixer DA", "given S1 T"); "" when not solved.
func source(p solve.Provenance) string {
	switch p.Kind {
	case solve.ProvNone:
		return ""
	case solve.ProvGiven:
		return cache.Given
	case solve.ProvDerived:
		return derived
	}
	return p.Label
}
