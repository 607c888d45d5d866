package reconcile

import (
	"encoding/json"
	"math"
	"os"
	"sort"
	"testing"

	"hmb/thermo/model"
)

// The linear flow networks of testdata/reconcile/linear.json and their reconciliation in closed
// form, x = m - Sigma A^T (A Sigma A^T)^-1 A m, computed independently with numpy by linear.py
// beside it.

type linearNet struct {
	Units []struct {
		Kind, Name string
		In, Out    []string
	} `json:"units"`
	Flows map[string]*struct {
		Kind  string  `json:"kind"`
		Value float64 `json:"value"`
		Tol   float64 `json:"tol"`
	} `json:"flows"`
	Answer struct {
		Redundancy   int     `json:"redundancy"`
		Chi2         float64 `json:"chi2"`
		Measurements map[string]struct {
			Measured, Reconciled float64
			UReconciled          float64  `json:"u_reconciled"`
			Test                 *float64 `json:"test"`
		} `json:"measurements"`
		Unknown map[string]struct {
			Reconciled  float64 `json:"reconciled"`
			UReconciled float64 `json:"u_reconciled"`
		} `json:"unknown"`
	} `json:"answer"`
}

type linearDoc struct {
	Networks   map[string]*linearNet `json:"networks"`
	Simulation struct {
		Network string             `json:"network"`
		Gross   float64            `json:"gross"`
		Chi2    float64            `json:"chi2_95"`
		Truth   map[string]float64 `json:"truth"`
		PFirst  map[string]float64 `json:"p_found_first"`
	} `json:"simulation"`
}

func readLinear(t testing.TB) *linearDoc {
	t.Helper()
	b, err := os.ReadFile("../../testdata/reconcile/linear.json")
	if err != nil {
		t.Fatalf("%v (regenerate with /usr/bin/python3 testdata/reconcile/linear.py)", err)
	}
	var doc linearDoc
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	return &doc
}

// build makes the network's plant: every feed at 5 bar and 400 K (compressed liquid), each
// measured flow at values[name] when given, else at its value in the file.
func (net *linearNet) build(t testing.TB, values map[string]float64) *plant {
	p := newPlant(t)
	made := map[string]bool{}
	for _, u := range net.Units {
		for _, s := range u.Out {
			made[s] = true
		}
	}
	names := make([]string, 0, len(net.Flows))
	for s := range net.Flows {
		names = append(names, s)
	}
	sort.Strings(names)
	for _, s := range names {
		var gs []given
		if f := net.Flows[s]; f != nil {
			v, ok := values[s]
			if !ok {
				v = f.Value
			}
			if f.Kind == "m" {
				gs = append(gs, meas(model.Flow, v, f.Tol))
			} else {
				gs = append(gs, exact(model.Flow, v))
			}
		}
		if !made[s] {
			gs = append(gs, exact(model.P, 5e5), exact(model.T, 400))
		}
		p.stream(s, gs...)
	}
	for _, u := range net.Units {
		var ps []string
		for _, s := range u.In {
			ps = append(ps, "in "+s)
		}
		for _, s := range u.Out {
			ps = append(ps, "out "+s)
		}
		p.unit(u.Name, u.Kind, ps)
	}
	return p
}

func TestLinearNetworks(t *testing.T) {
	doc := readLinear(t)
	if len(doc.Networks) < 5 {
		t.Fatalf("want at least 5 networks, have %d", len(doc.Networks))
	}
	for name, net := range doc.Networks {
		t.Run(name, func(t *testing.T) {
			p := net.build(t, nil)
			res, rec := p.solve()
			logDiags(t, res)
			want := net.Answer
			if rec.Redundancy != want.Redundancy {
				t.Errorf("redundancy %d, want %d", rec.Redundancy, want.Redundancy)
			}
			if !near(rec.Chi2, want.Chi2, 1e-8) {
				t.Errorf("chi2 %.12g, want %.12g", rec.Chi2, want.Chi2)
			}
			if len(rec.Measurements) != len(want.Measurements) {
				t.Errorf("%d measurements, want %d", len(rec.Measurements), len(want.Measurements))
			}
			for _, m := range rec.Measurements {
				w, ok := want.Measurements[m.Name]
				if !ok || m.Property != "flow" {
					t.Errorf("unexpected measurement %s %s", m.Name, m.Property)
					continue
				}
				if !near(m.Reconciled, w.Reconciled, 1e-10) {
					t.Errorf("%s reconciled %.12g, want %.12g", m.Name, m.Reconciled, w.Reconciled)
				}
				if !near(m.UReconciled, w.UReconciled, 1e-8) {
					t.Errorf("%s u_reconciled %.12g, want %.12g", m.Name, m.UReconciled, w.UReconciled)
				}
				switch {
				case w.Test == nil && !math.IsNaN(m.Test):
					t.Errorf("%s test %.6g, want none (unchecked)", m.Name, m.Test)
				case w.Test != nil && !near(m.Test, *w.Test, 1e-7):
					t.Errorf("%s test %.12g, want %.12g", m.Name, m.Test, *w.Test)
				}
				// The stream's own uncertainty is the measurement's reconciled one.
				if u := rec.Stream(p.idx[m.Name], "flow"); !near(u, m.UReconciled, 1e-8) {
					t.Errorf("%s: stream u %.12g, measurement u_reconciled %.12g", m.Name, u, m.UReconciled)
				}
			}
			for s, w := range want.Unknown {
				i := p.idx[s]
				if got := res.Streams[i].M; !near(got, w.Reconciled, 1e-10) {
					t.Errorf("unknown %s %.12g, want %.12g", s, got, w.Reconciled)
				}
				if got := rec.Stream(i, "flow"); !near(got, w.UReconciled, 1e-7) {
					t.Errorf("unknown %s u %.12g, want %.12g", s, got, w.UReconciled)
				}
			}
			// Every mass balance holds at the reconciled flows (1e-9 relative).
			for _, u := range net.Units {
				var in, out float64
				for _, s := range u.In {
					in += res.Streams[p.idx[s]].M
				}
				for _, s := range u.Out {
					out += res.Streams[p.idx[s]].M
				}
				if math.Abs(in-out) > 1e-9*max(in, out) {
					t.Errorf("%s: in %.15g, out %.15g", u.Name, in, out)
				}
			}
		})
	}
}
