package main

import (
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"hmb/thermo/model"
)

// chain is an invented flowsheet of n streams: superheated steam throttled through n-1 valves in
// series, each with a small stated drop. Fully specified; every state is solved.
func chain(n int) []byte {
	var b strings.Builder
	b.WriteString("title \"generated valve chain\"\ndisplay SI\n\n")
	b.WriteString("stream S0 { flow 10 kg/s; p 200 bar; T 560 C }\n")
	for i := 1; i < n; i++ {
		fmt.Fprintf(&b, "stream S%d\n", i)
	}
	for i := 1; i < n; i++ {
		fmt.Fprintf(&b, "valve V%d { in S%d; out S%d; dp %g bar }\n", i, i-1, i, 150.0/float64(n))
	}
	return []byte(b.String())
}

// network is an invented flowsheet of n streams (rounded to whole cells) in cells of five: a tee
// splits the flow, each branch is throttled, and a mixer joins them again. Each cell closes a
// loop of two balances, so the solver sees a real network, not a chain.
func network(n int) []byte {
	cells := max(1, n/5)
	var b strings.Builder
	b.WriteString("title \"generated split-throttle-mix network\"\ndisplay SI\n\n")
	b.WriteString("stream N0 { flow 10 kg/s; p 160 bar; T 540 C }\n")
	dp := 120.0 / float64(cells)
	for c := range cells {
		in, out := fmt.Sprintf("N%d", c), fmt.Sprintf("N%d", c+1)
		fmt.Fprintf(&b, "stream A%d { flow %g kg/s }\nstream B%d\nstream A%dx\nstream B%dx\nstream %s\n", c, 3+float64(c%4), c, c, c, out)
		fmt.Fprintf(&b, "splitter T%d { in %s; out A%d, B%d }\n", c, in, c, c)
		fmt.Fprintf(&b, "valve VA%d { in A%d; out A%dx; dp %g bar }\n", c, c, c, dp)
		fmt.Fprintf(&b, "valve VB%d { in B%d; out B%dx; dp %g bar }\n", c, c, c, dp)
		fmt.Fprintf(&b, "mixer M%d { in A%dx, B%dx; out %s }\n", c, c, c, out)
	}
	return []byte(b.String())
}

// TestGeneratedFlowsheets: the benchmark inputs solve cleanly, and the chain's last state is
// what one throttling from the first state gives (a valve conserves h, so a chain does too).
func TestGeneratedFlowsheets(t *testing.T) {
	for name, src := range map[string][]byte{"chain": chain(50), "network": network(50)} {
		c := checkModel(context.Background(), name+".hmb", src, nil)
		for _, d := range c.diags {
			if d.Severity == model.Error {
				t.Errorf("%s: %s %s", name, d.Code, d.Message)
			}
		}
		if c.res == nil {
			t.Fatalf("%s: not solved", name)
		}
		first, last := c.res.Streams[0], c.res.Streams[len(c.res.Streams)-1]
		if !first.HasState || !last.HasState || math.Abs(first.State.H-last.State.H) > 1e-9*first.State.H || math.Abs(first.M-last.M) > 1e-9*first.M {
			t.Errorf("%s: first h %g m %g, last h %g m %g", name, first.State.H, first.M, last.State.H, last.M)
		}
	}
}

// BenchmarkPipeline measures parse, check and solve together (what hmb check and the language
// server do per file). Target: 1,000 streams in under 10 ms, cost growing about linearly.
func BenchmarkPipeline(b *testing.B) {
	for _, kind := range []struct {
		name string
		gen  func(int) []byte
	}{{"chain", chain}, {"network", network}} {
		for _, n := range []int{100, 1000, 10000} {
			src := kind.gen(n)
			b.Run(fmt.Sprintf("%s/streams=%d", kind.name, n), func(b *testing.B) {
				for b.Loop() {
					c := checkModel(context.Background(), "gen.hmb", src, nil)
					if c.res == nil || !c.res.Streams[len(c.res.Streams)-1].HasState {
						b.Fatal("not solved")
					}
				}
			})
		}
	}
}

// FuzzCheck runs the whole pipeline (parse, check, solve, every output format) on arbitrary
// text: it must never panic, and never print NaN or Inf as a number.
func FuzzCheck(f *testing.F) {
	for _, dir := range []string{"examples", "broken", "broken/solve", "cli", "lang"} {
		files, _ := filepath.Glob(filepath.Join("..", "..", "testdata", dir, "*.hmb"))
		for _, p := range files {
			if src, err := os.ReadFile(p); err == nil {
				f.Add(src)
			}
		}
	}
	f.Add([]byte(""))
	f.Add([]byte("stream A { p 1 bar; x 2 }\nvalve V { in A; out A }"))
	f.Fuzz(func(t *testing.T, src []byte) {
		fr := checkSource("fuzz.hmb", src, nil)
		var out strings.Builder
		writeText(&out, fr)
		out.WriteString(fr.table)
		if err := writeJSON(&out, []*fileResult{fr}); err != nil {
			t.Fatal(err)
		}
		if err := writeSARIF(&out, []*fileResult{fr}); err != nil {
			t.Fatal(err)
		}
		s := out.String()
		for _, bad := range []string{"NaN", "+Inf", "-Inf"} {
			if i := strings.Index(s, bad); i >= 0 && !strings.Contains(string(src), bad) {
				t.Fatalf("output shows %s: ...%s...", bad, s[max(0, i-80):min(len(s), i+40)])
			}
		}
	})
}
