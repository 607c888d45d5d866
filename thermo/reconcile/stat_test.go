package reconcile

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Statistical behaviour by simulation: measurements drawn from a known true state with their
// stated standard deviations (σ = ± / 1.96), on the header network of linear.json. The bounds are
// binomial and chi-square facts: with the true state inside the model, the global test at 95 %
// fails in 5 % of the draws and the mean chi-square equals the redundancy (properties of the
// chi-square distribution of the weighted sum of squared corrections).

// draw is the truth plus a normal error of each meter's σ, and gross σ more on one meter.
func draw(rng *rand.Rand, net *linearNet, truth map[string]float64, bad string, gross float64) map[string]float64 {
	f := map[string]float64{}
	for k, v := range truth {
		s := net.Flows[k].Tol / Coverage
		f[k] = v + s*rng.NormFloat64()
		if k == bad {
			f[k] += gross * s
		}
	}
	return f
}

func TestFalseAlarmRate(t *testing.T) {
	doc := readLinear(t)
	sim := doc.Simulation
	net := doc.Networks[sim.Network]
	const trials = 400
	rng := rand.New(rand.NewPCG(13, 2048))
	fails, sum := 0, 0.0
	for i := 0; i < trials; i++ {
		_, rec := net.build(t, draw(rng, net, sim.Truth, "", 0)).solve()
		if !rec.Reconciled || rec.Redundancy != net.Answer.Redundancy {
			t.Fatalf("trial %d: reconciled %v, redundancy %d", i, rec.Reconciled, rec.Redundancy)
		}
		if !near(rec.Chi2Limit, sim.Chi2, 1e-9) {
			t.Fatalf("chi-square limit %.12g, want %.12g (linear.py)", rec.Chi2Limit, sim.Chi2)
		}
		if !rec.Passed {
			fails++
		}
		sum += rec.Chi2
	}
	// Binomial(400, 0.05): mean 20, standard deviation 4.36; 8..34 is about ±3.2 of them.
	if fails < 8 || fails > 34 {
		t.Errorf("global test failed in %d of %d draws, want about 20 (8..34)", fails, trials)
	}
	// Chi-square(3): mean 3, variance 6; the mean of 400 draws has standard deviation 0.122.
	if mean := sum / trials; math.Abs(mean-3) > 0.5 {
		t.Errorf("mean chi-square %.3f over %d draws, want 3 ± 0.5", mean, trials)
	}
	t.Logf("%d of %d draws failed; mean chi-square %.3f", fails, trials, sum/trials)
}

// TestGrossErrorFound puts an error of 8σ on one meter at a time: the global test must fail and
// name the meter first (or level with a meter its correction cannot be told from, which the
// message names with it). linear.py gives, for each meter, the probability p of that outcome by
// Monte Carlo over the closed form; the count in n draws must reach n p less four binomial
// standard deviations. Meters with p below 0.9 (a meter whose error the balances can hardly see)
// are not held to it.
func TestGrossErrorFound(t *testing.T) {
	doc := readLinear(t)
	sim := doc.Simulation
	net := doc.Networks[sim.Network]
	const trials = 40
	rng := rand.New(rand.NewPCG(8, 1))
	checked := 0
	for bad, p := range sim.PFirst {
		if p < 0.9 {
			continue
		}
		checked++
		found := 0
		for i := 0; i < trials; i++ {
			res, rec := net.build(t, draw(rng, net, sim.Truth, bad, sim.Gross)).solve()
			var top *Measurement
			for k := range rec.Measurements {
				if m := &rec.Measurements[k]; m.Checked && (top == nil || m.Test > top.Test) {
					top = m
				}
			}
			d := firstDiag(res, CodeGlobalTest)
			if rec.Passed || d == nil || top == nil {
				continue
			}
			first := top.Name == bad || math.Abs(top.Test-rec.Find(bad, "flow").Test) <= 1e-9*top.Test
			if first && contains(d.Message, "most suspect: "+top.Name+" flow") && contains(d.Message, bad+" flow") {
				found++
			}
		}
		n := float64(trials)
		if want := n*p - 4*math.Sqrt(n*p*(1-p)); float64(found) < want {
			t.Errorf("an 8σ error on %s was found and named first in %d of %d draws, want at least %.1f (p = %.4g)", bad, found, trials, want, p)
		}
	}
	if checked < 4 {
		t.Errorf("only %d meters checked", checked)
	}
}
