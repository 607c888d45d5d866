package reconcile

import (
	"encoding/json"
	"math"
	"os"
	"sort"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// The plants of testdata/reconcile/nonlinear.json, whose balances run through IAPWS-IF97, and
// their reconciliation computed independently by nonlinear.py beside it (python3-iapws for the
// properties, scipy's SLSQP for the minimisation, numpy for the covariance).

type nonlinearDoc struct {
	Cases map[string]struct {
		Plant struct {
			Streams map[string]map[string][2]float64 `json:"streams"`
			Units   []struct {
				Kind   string                `json:"kind"`
				Name   string                `json:"name"`
				Ports  []string              `json:"ports"`
				Params map[string][2]float64 `json:"params"`
			} `json:"units"`
		} `json:"plant"`
		Answer struct {
			Redundancy   int     `json:"redundancy"`
			Chi2         float64 `json:"chi2"`
			Measurements map[string]struct {
				Measured, Reconciled float64
				UReconciled          float64  `json:"u_reconciled"`
				Test                 *float64 `json:"test"`
			} `json:"measurements"`
			Derived map[string]struct{ Value, U float64 } `json:"derived"`
		} `json:"answer"`
	} `json:"cases"`
}

var propOf = map[string]model.Prop{"flow": model.Flow, "p": model.P, "T": model.T, "h": model.H, "s": model.S, "x": model.X}

func TestNonlinearPlants(t *testing.T) {
	b, err := os.ReadFile("../../testdata/reconcile/nonlinear.json")
	if err != nil {
		t.Fatalf("%v (regenerate with /usr/bin/python3 testdata/reconcile/nonlinear.py)", err)
	}
	var doc nonlinearDoc
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Cases) < 3 {
		t.Fatalf("want at least 3 cases, have %d", len(doc.Cases))
	}
	for name, c := range doc.Cases {
		t.Run(name, func(t *testing.T) {
			p := newPlant(t)
			names := make([]string, 0, len(c.Plant.Streams))
			for s := range c.Plant.Streams {
				names = append(names, s)
			}
			sort.Strings(names)
			for _, s := range names {
				var gs []given
				for prop, v := range c.Plant.Streams[s] {
					if v[1] > 0 {
						gs = append(gs, meas(propOf[prop], v[0], v[1]))
					} else {
						gs = append(gs, exact(propOf[prop], v[0]))
					}
				}
				p.stream(s, gs...)
			}
			for _, u := range c.Plant.Units {
				var gs []given
				for n, v := range u.Params {
					if v[1] > 0 {
						gs = append(gs, measParam(n, v[0], v[1]))
					} else {
						gs = append(gs, exactParam(n, v[0]))
					}
				}
				p.unit(u.Name, u.Kind, u.Ports, gs...)
			}
			res, rec := p.solve()
			logDiags(t, res)
			want := c.Answer
			if !rec.Reconciled || rec.Redundancy != want.Redundancy {
				t.Fatalf("reconciled %v, redundancy %d, want %d", rec.Reconciled, rec.Redundancy, want.Redundancy)
			}
			// Both sides converge to about 1e-10 of a standard deviation; the covariances rest
			// on numerical derivatives of different property codes.
			if !near(rec.Chi2, want.Chi2, 1e-6) {
				t.Errorf("chi2 %.10g, want %.10g", rec.Chi2, want.Chi2)
			}
			for key, w := range want.Measurements {
				who, what, _ := strings.Cut(key, " ")
				m := rec.Find(who, what)
				if m == nil {
					t.Errorf("no measurement %s", key)
					continue
				}
				if math.Abs(m.Reconciled-w.Reconciled) > 1e-6*m.Given.Sigma() {
					t.Errorf("%s reconciled %.12g, want %.12g", key, m.Reconciled, w.Reconciled)
				}
				if !near(m.UReconciled, w.UReconciled, 1e-5) {
					t.Errorf("%s u_reconciled %.10g, want %.10g", key, m.UReconciled, w.UReconciled)
				}
				if w.Test != nil && !near(m.Test, *w.Test, 1e-5) {
					t.Errorf("%s test %.10g, want %.10g", key, m.Test, *w.Test)
				}
			}
			for key, w := range want.Derived {
				who, what, _ := strings.Cut(key, " ")
				u := unitIndex(t, p.m, who)
				got, _, _ := res.Value(p.m, model.Subject{Kind: model.UnitSubject, Index: u}, what)
				if !near(got, w.Value, 1e-7) {
					t.Errorf("%s %.10g, want %.10g", key, got, w.Value)
				}
				if gu := rec.Unit(u, what); !near(gu, w.U, 1e-4) {
					t.Errorf("%s u %.8g, want %.8g", key, gu, w.U)
				}
			}
			balancesHold(t, res)
		})
	}
}

// balancesHold checks that every equation but the measurements' own holds at the reconciled
// values to 1e-9 of its scale: the balances and property relations are satisfied exactly.
func balancesHold(t *testing.T, res *solve.Result) {
	t.Helper()
	sys := res.System
	n := 0
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind == solve.EqGiven && sys.Eqs[e].Given != nil && sys.Eqs[e].Given.Measured {
			continue
		}
		r, sc, err := sys.Residual(e, res.X)
		if err != nil {
			t.Errorf("%s: %v", sys.Eqs[e].Label, err)
			continue
		}
		if math.Abs(r) > 1e-9*sc {
			t.Errorf("%s misses by %.3g of its scale", sys.Eqs[e].Label, math.Abs(r)/sc)
		}
		n++
	}
	if n == 0 {
		t.Error("no equation checked")
	}
}

func unitIndex(t *testing.T, m *model.Model, name string) int {
	t.Helper()
	for i, u := range m.Units {
		if u.Name == name {
			return i
		}
	}
	t.Fatalf("no unit %s", name)
	return -1
}
