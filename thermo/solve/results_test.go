package solve

import (
	"context"
	"math"
	"slices"
	"testing"

	"hmb/thermo/model"
)

// Every result in the catalogue has its computation here, and every computation a catalogue
// row: a new result is one of each.
func TestResultsMatchCatalogue(t *testing.T) {
	for _, r := range model.StreamResults {
		if streamValues[r.Name] == nil {
			t.Errorf("stream result %s has no computation", r.Name)
		}
	}
	for name := range streamValues {
		if model.StreamResult(name) == nil {
			t.Errorf("stream computation %s has no catalogue row", name)
		}
	}
	used := map[string]bool{}
	for _, k := range model.Kinds {
		for _, r := range k.Results {
			used[r.Name] = true
			if unitValues[r.Name] == nil {
				t.Errorf("%s result %s has no computation", k.Name, r.Name)
			}
		}
	}
	for name := range unitValues {
		if !used[name] {
			t.Errorf("unit computation %s is in no kind's results", name)
		}
	}
}

// Value on a solved mixer: heat_loss reads the given, sgen the solved entropy generation, and a
// result the kind does not have is refused. The mixer: 2 kg/s at 1 MPa, 200 C and 3 kg/s at
// 1 MPa, 100 C mix at 1 MPa, losing 50 kW.
func TestValue(t *testing.T) {
	g := func(v float64) *model.Given { return &model.Given{Value: v} }
	m := &model.Model{
		Streams: []*model.Stream{
			{Name: "A", Fluid: "water", Given: [model.NumProps]*model.Given{model.Flow: g(2), model.P: g(1e6), model.T: g(473.15)}},
			{Name: "B", Fluid: "water", Given: [model.NumProps]*model.Given{model.Flow: g(3), model.P: g(1e6), model.T: g(373.15)}},
			{Name: "C", Fluid: "water", Given: [model.NumProps]*model.Given{model.P: g(1e6)}},
		},
		Units: []*model.Unit{{Name: "M1", Kind: model.Kinds["mixer"],
			Ports:  []model.Port{{Role: "in", Stream: 0}, {Role: "in", Stream: 1}, {Role: "out", Stream: 2}},
			Params: map[string]*model.Given{"heat_loss": g(50e3)}}},
	}
	r := Solve(context.Background(), m, Options{})
	unit := model.Subject{Kind: model.UnitSubject, Index: 0}
	if v, spec, ok := r.Value(m, unit, "heat_loss"); !ok || v != 50e3 || spec.Name != "heat_loss" {
		t.Errorf("heat_loss = %g, %v, %v", v, spec, ok)
	}
	if v, _, ok := r.Value(m, unit, "sgen"); !ok || v != r.Units[0].Sgen || math.IsNaN(v) {
		t.Errorf("sgen = %g, %v; unit result %g", v, ok, r.Units[0].Sgen)
	}
	if _, _, ok := r.Value(m, unit, "power"); ok {
		t.Error("a mixer has no power result")
	}
	c := model.Subject{Kind: model.StreamSubject, Index: 2}
	for _, name := range []string{"flow", "p", "T", "h", "s", "v"} {
		if v, _, ok := r.Value(m, c, name); !ok || math.IsNaN(v) {
			t.Errorf("C %s = %g, %v", name, v, ok)
		}
	}
	if v, _, _ := r.Value(m, c, "flow"); math.Abs(v-5) > 1e-9 {
		t.Errorf("C flow = %g, want 5 (mass balance)", v)
	}
	// Nothing solved: every value NaN, names still known.
	var none *Result
	if v, _, ok := none.Value(m, c, "T"); !ok || !math.IsNaN(v) {
		t.Errorf("unsolved T = %g, %v", v, ok)
	}
	names := []string{}
	for _, s := range m.Results(unit) {
		names = append(names, s.Name)
	}
	if !slices.Equal(names, []string{"heat_loss", "dp", "sgen"}) {
		t.Errorf("mixer results %v", names)
	}
}
