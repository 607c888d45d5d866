package solve

import (
	"context"
	"math"
	"testing"

	"hmb/thermo/model"
)

// Throttling 2 MPa, 300 C steam to 0.5 MPa: h is conserved and the steam cools (Joule-Thomson)
// but stays superheated: between Tsat(0.5 MPa) = 151.8 C (from memory, any steam table) and 300 C.
// Exact values against python3-iapws are still to be written.
func TestSmokeValve(t *testing.T) {
	g := func(v float64) *model.Given { return &model.Given{Value: v} }
	m := &model.Model{
		Streams: []*model.Stream{
			{Name: "S1", Fluid: "water", Given: [model.NumProps]*model.Given{model.Flow: g(2), model.P: g(2e6), model.T: g(573.15)}},
			{Name: "S2", Fluid: "water", Given: [model.NumProps]*model.Given{model.P: g(0.5e6)}},
		},
		Units: []*model.Unit{{Name: "V1", Kind: model.Kinds["valve"], Ports: []model.Port{{Role: "in", Stream: 0}, {Role: "out", Stream: 1}}}},
	}
	r := Solve(context.Background(), m, Options{})
	for _, d := range r.Diags {
		t.Log(d.Code, d.Message)
	}
	s1, s2 := r.Streams[0], r.Streams[1]
	if !s2.Solved || math.Abs(s1.State.H-s2.State.H) > 1e-9*s1.State.H || s2.State.T-273.15 < 151.8 || s2.State.T-273.15 >= 300 || !(r.Units[0].Sgen > 0) {
		t.Fatalf("S2 T %g h %g vs %g, sgen %g", s2.State.T, s2.State.H, s1.State.H, r.Units[0].Sgen)
	}
	t.Logf("T2 = %.3f C, sgen %g", s2.State.T-273.15, r.Units[0].Sgen)
}
