package model

import (
	"testing"

	"hmb/thermo/units"
)

// The first stream results are the properties a file may give, in Prop order and dimension.
func TestStreamResultsStartWithProps(t *testing.T) {
	for p := Prop(0); p < NumProps; p++ {
		r := StreamResults[p]
		if r.Name != p.String() || r.Dim != p.Dim() {
			t.Errorf("StreamResults[%d] = %s (%v), want %s (%v)", p, r.Name, r.Dim, p, p.Dim())
		}
	}
}

// Every kind reports its entropy generation; every result has help and no name twice; a result
// named like a parameter has the parameter's dimension.
func TestKindResults(t *testing.T) {
	for name, k := range Kinds {
		if k.Name != name {
			t.Errorf("Kinds[%q].Name = %q", name, k.Name)
		}
		if r := k.Result("sgen"); r == nil || r.Dim != units.EntropyRate {
			t.Errorf("%s: sgen result %+v", name, r)
		}
		seen := map[string]bool{}
		for _, r := range k.Results {
			if seen[r.Name] || r.Doc == "" {
				t.Errorf("%s: result %q twice or without help", name, r.Name)
			}
			seen[r.Name] = true
			if p := k.Param(r.Name); p != nil && p.Dim != r.Dim {
				t.Errorf("%s: result %s is %v, parameter %v", name, r.Name, r.Dim, p.Dim)
			}
		}
	}
}

func TestModelResult(t *testing.T) {
	m := &Model{Streams: []*Stream{{Name: "A"}}, Units: []*Unit{{Name: "T1", Kind: Kinds["turbine"]}, {Name: "X"}}}
	for _, tt := range []struct {
		sub  Subject
		name string
		dim  units.Dim
		ok   bool
	}{
		{Subject{StreamSubject, 0}, "T", units.Temperature, true},
		{Subject{StreamSubject, 0}, "v", units.SpecificVolume, true},
		{Subject{StreamSubject, 0}, "power", 0, false},
		{Subject{StreamSubject, 1}, "T", 0, false},
		{Subject{UnitSubject, 0}, "power", units.ShaftPower, true},
		{Subject{UnitSubject, 0}, "sgen", units.EntropyRate, true},
		{Subject{UnitSubject, 0}, "duty", 0, false},
		{Subject{UnitSubject, 1}, "sgen", 0, false}, // unknown kind
		{Subject{UnitSubject, -1}, "sgen", 0, false},
	} {
		r := m.Result(tt.sub, tt.name)
		if (r != nil) != tt.ok || r != nil && r.Dim != tt.dim {
			t.Errorf("Result(%v, %s) = %+v, want ok %v dim %v", tt.sub, tt.name, r, tt.ok, tt.dim)
		}
	}
	e := &Expect{Stream: -1, Unit: 0}
	if e.Subject() != (Subject{UnitSubject, 0}) {
		t.Errorf("Subject of a unit expectation: %v", e.Subject())
	}
}
