package solve

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"
	"testing"
	"time"

	"hmb/thermo/model"
)

// Palettes the fuzzer picks givens from: ordinary plant values, edges of IF97 and of the
// saturation dome, and values no calc file should hold (zero, negative, NaN, infinities).
var fuzzPalette = [model.NumProps][]float64{
	model.Flow: {1, 2.5, 10, 0, -1, 1e-9, 1e9, math.NaN(), math.Inf(1)},
	model.P:    {0.01e6, 0.1e6, 1e6, 4e6, 22.064e6, 25e6, 100e6, 611.657, 0, -5, math.NaN(), 1e12},
	model.T:    {273.15, 300, 373.15, 453.0356, 573.15, 647.096, 900, 2273.15, 100, 3000, math.Inf(-1)},
	model.H:    {1e5, 4e5, 1e6, 2.0e6, 2.8e6, 3.3e6, -1e5, 1e8, 0},
	model.S:    {500, 1500, 4000, 6500, 7500, 9000, -10, 0},
	model.X:    {0, 0.5, 0.9, 1, 1.5, -0.1},
}

var paramPalette = []float64{0, 0.5, 0.85, 1, 1.2, -0.3, 1e3, 1e5, 1e6, -1e6, 1e12, math.NaN()}

var fuzzKinds = func() []string {
	var k []string
	for n := range model.Kinds {
		k = append(k, n)
	}
	sort.Strings(k)
	return k
}()

// fuzzModel decodes bytes into a small model. Every byte string makes some model; ports may be
// missing or doubled and parameters absurd, as a half-typed file can make them.
func fuzzModel(data []byte) *model.Model {
	i := 0
	next := func() int {
		if i >= len(data) {
			return 0
		}
		i++
		return int(data[i-1])
	}
	m := &model.Model{Tolerance: 0.001, Atm: 101325}
	ns := 1 + next()%6
	pos := 0
	span := func() model.Span { pos += 3; return model.Span{Start: pos, End: pos + 2} }
	for s := 0; s < ns; s++ {
		st := &model.Stream{Name: fmt.Sprintf("S%d", s), Fluid: "water", Span: span()}
		mask := next()
		for p := model.Prop(0); p < model.NumProps; p++ {
			if mask&(1<<p) != 0 {
				pal := fuzzPalette[p]
				st.Given[p] = &model.Given{Value: pal[next()%len(pal)], Span: span()}
			}
		}
		m.Streams = append(m.Streams, st)
	}
	nu := next() % 5
	for u := 0; u < nu; u++ {
		k := model.Kinds[fuzzKinds[next()%len(fuzzKinds)]]
		un := &model.Unit{Name: fmt.Sprintf("U%d", u), Kind: k, Span: span(), Params: map[string]*model.Given{}}
		for _, ps := range k.Ports {
			n := 1
			switch c := next() % 8; {
			case c == 0:
				n = 0 // a missing port
			case c == 1 || (c == 2 && ps.Many):
				n = 2
			}
			for j := 0; j < n; j++ {
				un.Ports = append(un.Ports, model.Port{Role: ps.Role, Stream: next() % ns, Span: span()})
			}
		}
		for _, ps := range k.Params {
			if next()%3 == 0 {
				un.Params[ps.Name] = &model.Given{Value: paramPalette[next()%len(paramPalette)], Span: span()}
			}
		}
		m.Units = append(m.Units, un)
	}
	if next()%2 == 1 {
		props := []string{"flow", "p", "T", "h", "s", "x", "duty", "power", "sgen", "bogus"}
		e := &model.Expect{Stream: -1, Unit: -1, Prop: props[next()%len(props)], Op: model.Op(next() % 5), Value: 1, Span: span()}
		if len(m.Units) > 0 && next()%2 == 0 {
			e.Unit = next() % len(m.Units)
		} else {
			e.Stream = next() % ns
		}
		m.Expects = append(m.Expects, e)
	}
	return m
}

func FuzzSolve(f *testing.F) {
	for _, seed := range [][]byte{
		{1, 0x07, 2, 3, 4, 0x00, 1, 6, 0, 0, 0},                            // valve
		{2, 0x07, 0, 1, 4, 0x01, 3, 3, 7, 1, 1, 2, 2, 1},                   // two streams, a unit
		{3, 0x23, 0, 2, 3, 0x02, 1, 0x01, 0, 4, 2, 3, 1, 0, 1, 2, 5, 0, 0}, // three streams
		{5, 0xff, 1, 2, 3, 4, 5, 6, 0x0f, 1, 1, 1, 1, 4, 9, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12},
		{},
	} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		m := fuzzModel(data)
		start := time.Now()
		r := Solve(context.Background(), m, Options{Timeout: 2 * time.Second})
		if el := time.Since(start); el > 10*time.Second {
			t.Fatalf("solve took %v", el)
		}
		if len(r.Streams) != len(m.Streams) || len(r.Units) != len(m.Units) {
			t.Fatalf("results for %d streams and %d units, model has %d and %d", len(r.Streams), len(r.Units), len(m.Streams), len(m.Units))
		}
		for _, d := range r.Diags {
			if strings.Contains(d.Message, "NaN") || strings.Contains(d.Message, "Inf") {
				t.Errorf("%s shows a non-number: %q", d.Code, d.Message)
			}
			if d.Message == "" || d.Code == "" {
				t.Errorf("empty diagnostic %+v", d)
			}
		}
		for i, s := range r.Streams {
			if s.Solved && (!finite(s.M) || !finite(s.State.H)) {
				t.Errorf("stream %d solved with flow %v h %v", i, s.M, s.State.H)
			}
		}
	})
}
