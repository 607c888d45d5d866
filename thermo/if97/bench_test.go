package if97

import "testing"

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

func BenchmarkStatePT(b *testing.B) {
	for _, c := range []struct {
		name string
		p, T float64
	}{{"region1", 3e6, 400}, {"region2", 3e6, 700}, {"region5", 3e6, 1500}} {
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				sinkS, _ = PT(c.p, c.T+float64(i&7))
			}
		})
	}
}

func benchInverse(b *testing.B, f func(a, c float64) (State, error), a, c, dc float64) {
	for i := 0; i < b.N; i++ {
		sinkS, _ = f(a, c+float64(i&7)*dc)
	}
}

func BenchmarkStatePH(b *testing.B) {
	b.Run("region1", func(b *testing.B) { benchInverse(b, PH, 3e6, 500e3, 1e3) })
	b.Run("region2", func(b *testing.B) { benchInverse(b, PH, 3e6, 3000e3, 1e3) })
	b.Run("region4", func(b *testing.B) { benchInverse(b, PH, 1e6, 1500e3, 1e3) })
}

func BenchmarkStatePS(b *testing.B) {
	b.Run("region1", func(b *testing.B) { benchInverse(b, PS, 3e6, 1.5e3, 1) })
	b.Run("region2", func(b *testing.B) { benchInverse(b, PS, 3e6, 7e3, 1) })
}

func BenchmarkStateHS(b *testing.B) {
	b.Run("region1", func(b *testing.B) { benchInverse(b, HS, 500e3, 1.5e3, 1) })
	b.Run("region2", func(b *testing.B) { benchInverse(b, HS, 3000e3, 8e3, 1) })
	b.Run("region4", func(b *testing.B) { benchInverse(b, HS, 2400e3, 6e3, 1) })
}
