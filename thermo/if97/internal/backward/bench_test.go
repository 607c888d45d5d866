package backward

import "testing"

var sink float64

// Inputs spread over the subregions so the benchmarks see every branch.
var (
	benchPH1 = [...][2]float64{{3, 500}, {80, 500}, {80, 1500}, {20, 1200}}
	benchPH2 = [...][2]float64{{0.001, 3000}, {3, 4000}, {5, 3500}, {25, 3500}, {40, 2700}, {60, 3200}}
	benchPS2 = [...][2]float64{{0.1, 7.5}, {2.5, 8}, {8, 6}, {90, 6}, {20, 5.75}, {80, 5.25}}
	benchHS2 = [...][2]float64{{2800, 6.5}, {4100, 9.5}, {2800, 6}, {3600, 7}, {2800, 5.1}, {3400, 5.8}}
)

func BenchmarkT1ph(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		x := benchPH1[i%len(benchPH1)]
		sink += T1ph(x[0], x[1])
	}
}

func BenchmarkT2ph(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		x := benchPH2[i%len(benchPH2)]
		sink += T2ph(x[0], x[1])
	}
}

func BenchmarkT2ps(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		x := benchPS2[i%len(benchPS2)]
		sink += T2ps(x[0], x[1])
	}
}

func BenchmarkP2hs(b *testing.B) {
	for i := 0; b.Loop(); i++ {
		x := benchHS2[i%len(benchHS2)]
		sink += P2hs(x[0], x[1])
	}
}
