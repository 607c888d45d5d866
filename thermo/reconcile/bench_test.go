package reconcile

import (
	"fmt"
	"testing"

	"hmb/thermo/model"
)

// benchPlant is a metered plant of stages: each stage splits its feed into a branch through a
// heater (duty metered) and a branch through a valve, and mixes them again; flows, temperatures
// and pressures are metered on most streams. The states cross from compressed liquid into the
// two-phase region and superheated steam along the train, so IF97's regions all take part.
func benchPlant(b testing.TB, stages int) *plant {
	p := newPlant(b)
	flow, pres, temp := 20.0, 150e5, 420.0
	p.stream("X0", meas(model.Flow, flow, 0.02*flow), exact(model.P, pres), meas(model.T, temp, 1))
	for i := 0; i < stages; i++ {
		x, y := fmt.Sprintf("X%d", i), fmt.Sprintf("X%d", i+1)
		a, b1, a2, b2 := fmt.Sprintf("A%d", i), fmt.Sprintf("B%d", i), fmt.Sprintf("C%d", i), fmt.Sprintf("D%d", i)
		fa := 0.6 * flow
		duty := fa * 40e3 // 40 kJ/kg on the heated branch
		p.stream(a, meas(model.Flow, fa, 0.01*fa))
		p.stream(b1, meas(model.Flow, flow-fa, 0.01*(flow-fa)))
		p.unit("S"+x, "splitter", ports("in "+x, "out "+a, "out "+b1))
		p.stream(a2, meas(model.Flow, fa*1.002, 0.01*fa), meas(model.P, pres, 0.005*pres))
		p.unit("H"+x, "heater", ports("in "+a, "out "+a2), measParam("duty", duty*0.99, 0.02*duty))
		pres -= 2e5
		p.stream(b2, meas(model.P, pres, 0.005*pres))
		p.unit("V"+x, "valve", ports("in "+b1, "out "+b2))
		flow *= 1.0
		p.stream(y, meas(model.Flow, flow*0.998, 0.02*flow), meas(model.T, temp+0.6*40e3/4300, 1.5))
		temp += 0.6 * 40e3 / 4300
		p.unit("M"+x, "mixer", ports("in "+a2, "in "+b2, "out "+y))
	}
	return p
}

func TestBenchPlant(t *testing.T) {
	res, rec := benchPlant(t, 25).solve()
	if !rec.Reconciled {
		logDiags(t, res)
		t.Fatal("not reconciled")
	}
	t.Logf("%d measurements, redundancy %d, chi2 %.3g (limit %.3g)", len(rec.Measurements), rec.Redundancy, rec.Chi2, rec.Chi2Limit)
}

// BenchmarkReconcile200 solves and reconciles a plant of 202 measurements (25 stages), with the
// uncertainty of every result. The target is under 50 ms.
func BenchmarkReconcile200(b *testing.B) {
	p := benchPlant(b, 25)
	_, rec := p.solve()
	if n := len(rec.Measurements); n < 200 || !rec.Reconciled {
		b.Fatalf("%d measurements, reconciled %v", n, rec.Reconciled)
	}
	b.ResetTimer()
	for range b.N {
		p.solve()
	}
}
