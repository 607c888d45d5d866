package reconcile

import (
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// Bad input gets an error with a position, never a panic or a number that is not one.
func TestBadMeasurements(t *testing.T) {
	feed := func(p *plant, name string, flow given) *plant {
		return p.stream(name, flow, exact(model.P, 10e5), exact(model.T, 473.15))
	}
	for _, tc := range []struct {
		name  string
		build func(p *plant)
		code  string // the error reported
		at    string // the given or unit it is reported at: "stream.prop", "unit.param" or "unit"
		words []string
	}{
		{"zero ±", func(p *plant) {
			feed(p, "A", meas(model.Flow, 5, 0)).stream("B").unit("V", "valve", ports("in A", "out B"), exactParam("dp", 1e5))
		}, CodeZeroUncertainty, "A.flow", []string{"A flow", "± of zero"}},
		{"± on h", func(p *plant) {
			p.stream("A", exact(model.Flow, 5), exact(model.P, 10e5), meas(model.H, 2.8e6, 0.03e6)).stream("B").
				unit("V", "valve", ports("in A", "out B"), exactParam("dp", 1e5))
		}, CodeNotMeasurable, "A.h", []string{"A h", "computed from measured pressure and temperature"}},
		{"± on a quality", func(p *plant) {
			p.stream("A", exact(model.Flow, 5), exact(model.P, 10e5), meas(model.X, 0.95, 0.02)).stream("B").
				unit("V", "valve", ports("in A", "out B"), exactParam("dp", 1e5))
		}, CodeNotMeasurable, "A.x", []string{"A x", "quality"}},
		{"± on an efficiency", func(p *plant) {
			feed(p, "A", exact(model.Flow, 5)).stream("B", exact(model.P, 1e5)).
				unit("T1", "turbine", ports("in A", "out B"), measParam("efficiency", 0.8, 0.02))
		}, CodeNotMeasurable, "T1.efficiency", []string{"T1 efficiency", "ratio of measured values"}},
		{"± on a heat loss", func(p *plant) {
			feed(p, "A", exact(model.Flow, 5)).feedTo("B", 3).stream("C").
				unit("M", "mixer", ports("in A", "in B", "out C"), measParam("heat_loss", 10e3, 5e3))
		}, CodeNotMeasurable, "M.heat_loss", []string{"M heat_loss", "allowance"}},
		{"meters in series disagree", func(p *plant) {
			feed(p, "A", meas(model.Flow, 3.00, 0.03)).stream("B", meas(model.Flow, 3.15, 0.0315)).
				unit("V", "valve", ports("in A", "out B"), exactParam("dp", 1e5))
		}, CodeIndistinct, "B.flow", []string{"B flow and A flow cannot be told apart", "a further meter"}},
		{"balances contradict", func(p *plant) {
			// The heater's exact duty and temperatures fix its flow near 4.7 kg/s; the valve after
			// it passes an exact 9 kg/s: no reading of the inlet flow reconciles both.
			p.stream("A", meas(model.Flow, 5, 0.1), exact(model.P, 5e5), exact(model.T, 373.15)).
				stream("B", exact(model.T, 423.15)).stream("C", exact(model.Flow, 9)).
				unit("H", "heater", ports("in A", "out B"), exactParam("duty", 1e6)).
				unit("V", "valve", ports("in B", "out C"), exactParam("dp", 1e5))
		}, CodeNotReconciled, "H", []string{"contradict each other"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := newPlant(t)
			tc.build(p)
			res, rec := p.solve()
			d := firstDiag(res, tc.code)
			if d == nil {
				logDiags(t, res)
				t.Fatalf("no %s", tc.code)
			}
			if d.Severity != model.Error {
				t.Errorf("%s is a %s", tc.code, d.Severity)
			}
			if want := p.spanOf(tc.at); d.Span != want {
				t.Errorf("%s at %v, want %v (%s)", tc.code, d.Span, want, tc.at)
			}
			for _, w := range tc.words {
				if !strings.Contains(d.Message, w) {
					t.Errorf("message %q lacks %q", d.Message, w)
				}
			}
			noNaN(t, res, rec)
		})
	}
}

// feedTo adds a feed stream of flow kg/s at 10 bar, 200 C, exact.
func (p *plant) feedTo(name string, flow float64) *plant {
	return p.stream(name, exact(model.Flow, flow), exact(model.P, 10e5), exact(model.T, 473.15))
}

// spanOf finds the span of "stream.prop", "unit.param" or "unit".
func (p *plant) spanOf(what string) model.Span {
	name, prop, _ := strings.Cut(what, ".")
	for _, s := range p.m.Streams {
		if s.Name == name {
			for k, g := range s.Given {
				if g != nil && model.Prop(k).String() == prop {
					return g.Span
				}
			}
			return s.Span
		}
	}
	for _, u := range p.m.Units {
		if u.Name == name {
			if g := u.Params[prop]; g != nil {
				return g.Span
			}
			return u.Span
		}
	}
	p.t.Fatalf("nothing named %s", what)
	return model.Span{}
}

// noNaN checks that no message shows a number that is not one and that a measurement's numbers
// are numbers wherever they are defined.
func noNaN(t *testing.T, res *solve.Result, rec *Result) {
	t.Helper()
	for _, d := range res.Diags {
		for _, bad := range []string{"NaN", "Inf"} {
			if strings.Contains(d.Message, bad) {
				t.Errorf("%s shows %s: %s", d.Code, bad, d.Message)
			}
		}
	}
	for _, m := range rec.Measurements {
		if m.Measured != m.Measured || m.UMeasured != m.UMeasured {
			t.Errorf("%s %s: measured %v ± %v", m.Name, m.Property, m.Measured, m.UMeasured)
		}
	}
}
