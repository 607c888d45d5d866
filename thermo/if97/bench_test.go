package if97

import (
	"math"
	"math/rand/v2"
	"testing"
)

var (
	sinkF float64
	sinkS State
)

// Inputs vary a little per iteration so no call can be hoisted.

func BenchmarkH1PT(b *testing.B) {
	for i := 0; i < b.N; i++ {
		sinkF += h1(3, 400+float64(i&7))
	}
}

func BenchmarkH2PT(b *testing.B) {
	for i := 0; i < b.N; i++ {
		sinkF += h2(3, 700+float64(i&7))
	}
}

func BenchmarkTsat(b *testing.B) {
	for i := 0; i < b.N; i++ {
		t, _ := Tsat(1e6 + float64(i&7)*1e5)
		sinkF += t
	}
}

// benchStates is how many random states each benchmark cycles through: enough to spread over
// its region, few enough to stay in the cache like a solver's working set.
const benchStates = 1024

// regionStates samples benchStates states at random over a region: pressure log-uniform between
// pLo and pHi (MPa), temperature uniform between tLo and tHi (K), kept when regionPT puts the
// pair in the region (region 4: quality uniform over 0..1 at a pressure log-uniform on the
// line). The seed is fixed, so every run measures the same inputs.
func regionStates(tb testing.TB, region int, pLo, pHi, tLo, tHi float64) []State {
	r := rand.New(rand.NewPCG(uint64(region), uint64(pLo*1e6)))
	var out []State
	for tries := 0; len(out) < benchStates; tries++ {
		if tries > 100*benchStates {
			tb.Fatalf("region %d: too few states in %g-%g MPa, %g-%g K", region, pLo, pHi, tLo, tHi)
		}
		pm := pLo * math.Pow(pHi/pLo, r.Float64())
		if region == 4 {
			st, err := PX(pm*1e6, r.Float64())
			if err == nil {
				out = append(out, st)
			}
			continue
		}
		t := tLo + (tHi-tLo)*r.Float64()
		if err := checkPT(pm, t); err != nil {
			continue
		}
		if reg, err := regionPT(pm, t); err != nil || reg != region {
			continue
		}
		st, err := PT(pm*1e6, t)
		if err != nil {
			tb.Fatal(err)
		}
		out = append(out, st)
	}
	return out
}

// benchRegions are the regions the state benchmarks cover, with the ranges they sample. The
// high-pressure two-phase states lie on the part of the line in region 3 (above 623.15 K).
var benchRegions = []struct {
	name               string
	region             int
	pLo, pHi, tLo, tHi float64
	ph, ps, pt         bool
}{
	{"region1", 1, 0.001, 100, tMin, t13, true, true, true},
	{"region2", 2, 0.001, 100, tMin, tMax25, true, true, true},
	{"region3", 3, 16.5, 100, t13, 863.15, true, true, true},
	{"region5", 5, 0.01, 50, tMax25, tMax, true, false, true},
	{"two-phase", 4, pTriple, pCrit, 0, 0, true, true, false},
	{"two-phase-high-p", 4, 16.6, 22.0, 0, 0, true, true, false},
}

func BenchmarkStatePT(b *testing.B) {
	for _, c := range benchRegions {
		if !c.pt {
			continue
		}
		sts := regionStates(b, c.region, c.pLo, c.pHi, c.tLo, c.tHi)
		b.Run(c.name, func(b *testing.B) {
			cpu := cpuTime()
			for i := 0; b.Loop(); i++ {
				st := &sts[i%benchStates]
				sinkS, _ = PT(st.P, st.T)
			}
			reportCPU(b, cpu)
		})
	}
}

func BenchmarkStatePH(b *testing.B) {
	for _, c := range benchRegions {
		if !c.ph {
			continue
		}
		sts := regionStates(b, c.region, c.pLo, c.pHi, c.tLo, c.tHi)
		b.Run(c.name, func(b *testing.B) {
			cpu := cpuTime()
			for i := 0; b.Loop(); i++ {
				st := &sts[i%benchStates]
				sinkS, _ = PH(st.P, st.H)
			}
			reportCPU(b, cpu)
		})
	}
}

func BenchmarkStatePS(b *testing.B) {
	for _, c := range benchRegions {
		if !c.ps {
			continue
		}
		sts := regionStates(b, c.region, c.pLo, c.pHi, c.tLo, c.tHi)
		b.Run(c.name, func(b *testing.B) {
			cpu := cpuTime()
			for i := 0; b.Loop(); i++ {
				st := &sts[i%benchStates]
				sinkS, _ = PS(st.P, st.S)
			}
			reportCPU(b, cpu)
		})
	}
}

// reportCPU adds the CPU time per call since start (see cpuTime) as cpu-ns/op.
func reportCPU(b *testing.B, start int64) {
	if end := cpuTime(); end > start && b.N > 0 {
		b.ReportMetric(float64(end-start)/float64(b.N), "cpu-ns/op")
	}
}

func benchInverse(b *testing.B, f func(a, c float64) (State, error), a, c, dc float64) {
	for i := 0; i < b.N; i++ {
		sinkS, _ = f(a, c+float64(i&7)*dc)
	}
}

func BenchmarkStateHS(b *testing.B) {
	b.Run("region1", func(b *testing.B) { benchInverse(b, HS, 500e3, 1.5e3, 1) })
	b.Run("region2", func(b *testing.B) { benchInverse(b, HS, 3000e3, 8e3, 1) })
	b.Run("region4", func(b *testing.B) { benchInverse(b, HS, 2400e3, 6e3, 1) })
}
