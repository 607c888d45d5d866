package solve

import (
	"context"
	"fmt"
	"testing"

	"hmb/thermo/model"
)

// chainModel is n streams in a line: a feed of steam, then alternately a valve (given drop) and
// a heater (given duty), so that every stream's state takes an IF97 inversion.
func chainModel(tb testing.TB, n int) *model.Model {
	ss := []*model.Stream{strm("S0", flow, 5, pp, 20e6, tt, 823.15)}
	var us []unitDef
	for i := 1; i < n; i++ {
		ss = append(ss, strm(fmt.Sprintf("S%d", i)))
		in, out := fmt.Sprintf("in S%d", i-1), fmt.Sprintf("out S%d", i)
		if i%2 == 1 {
			us = append(us, unit(fmt.Sprintf("V%d", i), "valve", ports(in, out), "dp", 15e6/float64(n)))
		} else {
			us = append(us, unit(fmt.Sprintf("H%d", i), "heater", ports(in, out), "duty", 1e3))
		}
	}
	return mk(tb, ss, us...)
}

// networkModel is about n streams in repeated cells: a splitter sends a given 2 kg/s of the main
// stream through a valve and the rest through a cooler, and a mixer joins the two again, so that
// mass and energy balances couple across branches.
func networkModel(tb testing.TB, n int) *model.Model {
	ss := []*model.Stream{strm("M0", flow, 10, pp, 4e6, tt, 673.15)}
	var us []unitDef
	for c := 0; c < (n-1)/5; c++ {
		m, a, b, v, k, o := fmt.Sprintf("M%d", c), fmt.Sprintf("A%d", c), fmt.Sprintf("B%d", c),
			fmt.Sprintf("V%d", c), fmt.Sprintf("K%d", c), fmt.Sprintf("M%d", c+1)
		ss = append(ss, strm(a, flow, 2), strm(b), strm(v), strm(k), strm(o))
		us = append(us,
			unit("T"+m, "splitter", ports("in "+m, "out "+a, "out "+b)),
			unit("V"+m, "valve", ports("in "+a, "out "+v), "dp", 500),
			unit("C"+m, "cooler", ports("in "+b, "out "+k), "duty", 5e3),
			unit("X"+m, "mixer", ports("in "+v, "in "+k, "out "+o)),
		)
	}
	return mk(tb, ss, us...)
}

func benchSolve(b *testing.B, m *model.Model) {
	ctx := context.Background()
	r := Solve(ctx, m, Options{})
	if errs := errorsOf(r); len(errs) > 0 {
		b.Fatalf("%d errors, first: %s", len(errs), errs[0].Message)
	}
	b.ResetTimer()
	for b.Loop() {
		Solve(ctx, m, Options{})
	}
}

func BenchmarkSolveChain100(b *testing.B)   { benchSolve(b, chainModel(b, 100)) }
func BenchmarkSolveChain1000(b *testing.B)  { benchSolve(b, chainModel(b, 1000)) }
func BenchmarkSolveChain10000(b *testing.B) { benchSolve(b, chainModel(b, 10000)) }

func BenchmarkSolveNetwork1000(b *testing.B)  { benchSolve(b, networkModel(b, 1000)) }
func BenchmarkSolveNetwork10000(b *testing.B) { benchSolve(b, networkModel(b, 10000)) }
