package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
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

// mixed is an invented plant of about n streams in cells of thirteen streams and eleven units
// (fourteen streams counting the header each cell takes in), mixing the kinds a real plant has.
// A tee splits the header; one branch is throttled, cooled to saturated liquid, pumped and
// boiled back to a given (p,T) state; the other expands through a turbine, takes a spray of water
// whose flow is solved to reach a desuperheated target, is cooled, pumped and boiled again; a
// mixer joins both into the next header. Targets and flows vary from cell to cell.
func mixed(n int) []byte { return mixedPlant(n, "") }

// mixedPlant is mixed with a fault in every cell: "under" leaves out the flow that sets the
// split, so each cell is under-specified by one value; "over" also states the spray flow the
// desuperheater solves for, so each cell has a balance that does not close.
func mixedPlant(n int, fault string) []byte {
	cells := max(1, n/13)
	var b strings.Builder
	b.WriteString("title \"generated mixed plant\"\ndisplay SI\n\n")
	b.WriteString("stream H0 { flow 10 kg/s; p 100 bar; T 500 C }\n")
	for c := range cells {
		split, spray := fmt.Sprintf("{ flow %d kg/s }", 3+c%4), ""
		switch fault {
		case "under":
			split = ""
		case "over":
			spray = "flow 0.2 kg/s; "
		}
		fmt.Fprintf(&b, "stream A%da, A%db\nstream A%dc { x 0 }\nstream A%dd\nstream A%de { p 100 bar; T %d C }\n", c, c, c, c, c, 480+10*(c%5))
		fmt.Fprintf(&b, "stream B%da %s\nstream B%db { p %d bar }\nstream W%d { %sp 40 bar; T 150 C }\n", c, split, c, 18+c%5, c, spray)
		fmt.Fprintf(&b, "stream B%dc { T %d C }\nstream B%dd { T 180 C }\nstream B%de\nstream B%df { p 100 bar; T 500 C }\nstream H%d\n", c, 240+5*(c%3), c, c, c, c+1)
		fmt.Fprintf(&b, "splitter T%d { in H%d; out A%da, B%da }\n", c, c, c, c)
		fmt.Fprintf(&b, "valve VA%d { in A%da; out A%db; dp 90 bar }\n", c, c, c)
		fmt.Fprintf(&b, "cooler KA%d { in A%db; out A%dc }\n", c, c, c)
		fmt.Fprintf(&b, "pump PA%d { in A%dc; out A%dd; efficiency 0.8 }\n", c, c, c)
		fmt.Fprintf(&b, "boiler BA%d { in A%dd; out A%de; dp 5 bar }\n", c, c, c)
		fmt.Fprintf(&b, "turbine TB%d { in B%da; out B%db; efficiency 0.85 }\n", c, c, c)
		fmt.Fprintf(&b, "desuperheater D%d { steam B%db; water W%d; out B%dc }\n", c, c, c, c)
		fmt.Fprintf(&b, "cooler KB%d { in B%dc; out B%dd }\n", c, c, c)
		fmt.Fprintf(&b, "pump PB%d { in B%dd; out B%de; efficiency 0.8 }\n", c, c, c)
		fmt.Fprintf(&b, "boiler BB%d { in B%de; out B%df; dp 5 bar }\n", c, c, c)
		fmt.Fprintf(&b, "mixer M%d { in A%de, B%df; out H%d }\n", c, c, c, c+1)
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

// TestMixedPlant checks the mixed plant's first spray flow against python3-iapws: a turbine at
// 85 % from 100 bar, 500 C to 18 bar, then spray water at 40 bar, 150 C to bring 3 kg/s to
// 240 C. m_w = 3 (h1 - h2) / (h2 - h_w) with h_in = W(P=10,T=773.15).h, h_s = W(P=1.8,s=s_in).h,
// h1 = h_in - 0.85 (h_in - h_s), h2 = W(P=1.8,T=513.15).h, h_w = W(P=4,T=423.15).h: 0.120518 kg/s.
func TestMixedPlant(t *testing.T) {
	c := checkModel(context.Background(), "mixed.hmb", mixed(100), nil)
	for _, d := range c.diags {
		if d.Severity == model.Error {
			t.Errorf("%s %s", d.Code, d.Message)
		}
	}
	if c.res == nil {
		t.Fatal("not solved")
	}
	for i, s := range c.model.Streams {
		if s.Name == "W0" {
			if got := c.res.Streams[i].M; math.Abs(got-0.120518) > 1e-6 {
				t.Errorf("spray W0 %.6f kg/s, want 0.120518 (python3-iapws)", got)
			}
			return
		}
	}
	t.Fatal("no stream W0")
}

// TestScaling: doubling a generated plant at most about doubles the solver's work, counted in
// steps of the structural analysis and in equation evaluations (never in time, which depends on
// the machine and its load). The faulted plants hold the searches behind the under- and
// over-specified diagnostics to the same rule.
func TestScaling(t *testing.T) {
	gens := []struct {
		name string
		gen  func(int) []byte
	}{
		{"chain", chain}, {"network", network}, {"mixed", mixed},
		{"mixed-under", func(n int) []byte { return mixedPlant(n, "under") }},
		{"mixed-over", func(n int) []byte { return mixedPlant(n, "over") }},
	}
	for _, g := range gens {
		var prev solve.Work
		for _, n := range []int{1000, 2000, 4000} {
			c := checkModel(context.Background(), g.name+".hmb", g.gen(n), nil)
			if c.res == nil {
				t.Fatalf("%s %d: not solved", g.name, n)
			}
			w := c.res.Work
			if w.Structure == 0 || w.Evals == 0 {
				t.Fatalf("%s %d: no work counted: %+v", g.name, n, w)
			}
			if prev.Structure > 0 {
				for _, r := range []struct {
					what      string
					now, then int
				}{{"structure steps", w.Structure, prev.Structure}, {"evaluations", w.Evals, prev.Evals}} {
					if ratio := float64(r.now) / float64(r.then); ratio > 2.5 {
						t.Errorf("%s: %s grow %.2fx from %d to %d streams (%d to %d)", g.name, r.what, ratio, n/2, n, r.then, r.now)
					}
				}
			}
			prev = w
		}
	}
}

// BenchmarkPipeline measures parse, check and solve together (what hmb check and the language
// server do per file). Target: 1,000 streams in under 10 ms, cost growing about linearly.
func BenchmarkPipeline(b *testing.B) {
	for _, kind := range []struct {
		name string
		gen  func(int) []byte
	}{{"chain", chain}, {"network", network}, {"mixed", mixed}} {
		sizes := []int{100, 1000, 10000}
		if kind.name == "mixed" {
			sizes = append(sizes, 100000)
		}
		for _, n := range sizes {
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

// BenchmarkCheckCommand is hmb check of a mixed plant from the file to the printed stream table,
// as a user runs it. Target: 100,000 streams in under 2 s and 1 GB. peak-MB is the process's
// peak resident memory (run this benchmark alone for it to mean the command's).
func BenchmarkCheckCommand(b *testing.B) {
	for _, n := range []int{10000, 100000} {
		path := filepath.Join(b.TempDir(), "mixed.hmb")
		if err := os.WriteFile(path, mixed(n), 0o644); err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("mixed/streams=%d", n), func(b *testing.B) {
			for b.Loop() {
				var out strings.Builder
				if err := runCheck([]string{path}, &out, io.Discard); err != nil {
					b.Fatalf("%v: %.300s", err, out.String())
				}
				if out.Len() < 50*n {
					b.Fatalf("%d bytes of output", out.Len())
				}
			}
			if mb := peakMB(); mb > 0 {
				b.ReportMetric(mb, "peak-MB")
			}
		})
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
		writeText(&out, fr, textOptions{})
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
