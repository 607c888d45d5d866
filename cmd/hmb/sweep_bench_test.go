package main

import (
	"context"
	"testing"

	"hmb/lang"
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// sweepPlants are the generated flowsheets of about 100 streams with a sweep of 100 points of
// their feed's temperature (pipeline_test.go draws them).
var sweepPlants = []struct {
	name string
	src  []byte
}{
	{"mixed", append(mixed(100), "\nsweep feed { H0 T from 480 C to 540 C count 100 }\n"...)},
	{"network", append(network(100), "\nsweep feed { N0 T from 500 C to 560 C count 100 }\n"...)},
	{"chain", append(chain(100), "\nsweep feed { S0 T from 540 C to 580 C count 100 }\n"...)},
}

// BenchmarkSweep solves a sweep of 100 points on a plant of about 100 streams, each point from
// the previous one's solution (the target is 100 ms a sweep).
func BenchmarkSweep(b *testing.B) {
	for _, p := range sweepPlants {
		b.Run(p.name, func(b *testing.B) {
			r := lang.Check(p.name+".hmb", p.src)
			if r.HasErrors() || len(r.Model.Sweeps) != 1 {
				b.Fatalf("%v", r.Diags)
			}
			sw := r.Model.Sweeps[0]
			for b.Loop() {
				res := cases.Sweep(context.Background(), r.Model, sw, nil, solve.Options{})
				if len(res.Diags) > 0 {
					b.Fatal(res.Diags)
				}
			}
		})
	}
}

// TestSweepPlants: the benchmark's sweeps solve at every point.
func TestSweepPlants(t *testing.T) {
	for _, p := range sweepPlants {
		r := lang.Check(p.name+".hmb", p.src)
		for _, d := range r.Diags {
			if d.Severity == model.Error {
				t.Fatalf("%s: %s %s", p.name, d.Code, d.Message)
			}
		}
		res := cases.Sweep(context.Background(), r.Model, r.Model.Sweeps[0], nil, solve.Options{})
		if len(res.Points) != 100 || len(res.Diags) > 0 {
			t.Errorf("%s: %d points, %v", p.name, len(res.Points), res.Diags)
		}
	}
}
