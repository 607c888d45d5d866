package lang

import (
	"fmt"
	"strings"
	"testing"
)

// generate writes an invented chain of n streams joined by n-1 valves (a unit per stream), each
// stream with three givens, and a few expectations.
func generate(n int) []byte {
	var b strings.Builder
	b.WriteString("title \"generated chain\"\ndisplay SI\natmosphere 101.325 kPa\n\n")
	for i := range n {
		fmt.Fprintf(&b, "stream S%d \"point %d\" {\n  flow %d kg/h ± 1 %%\n  p %d barg\n  T %d C\n}\n", i, i, 1000+i, 40-i%30, 250+i%50)
	}
	for i := range n - 1 {
		fmt.Fprintf(&b, "valve V%d { in S%d; out S%d; dp 0.5 bar }\n", i, i, i+1)
	}
	for i := 0; i < n; i += 100 {
		fmt.Fprintf(&b, "expect S%d T > 100 C\n", i)
	}
	return []byte(b.String())
}

func TestGeneratedIsClean(t *testing.T) {
	r := Check("gen.hmb", generate(50))
	for _, d := range r.Diags {
		t.Errorf("%s %s %s", r.File.Src.Position(d.Span.Start), d.Code, d.Message)
	}
	if len(r.Model.Streams) != 50 || len(r.Model.Units) != 49 || r.Model.Incomplete {
		t.Errorf("got %d streams, %d units, incomplete %v", len(r.Model.Streams), len(r.Model.Units), r.Model.Incomplete)
	}
}

// BenchmarkCheck measures parse and check together. Target: under 2 ms for 1,000 streams.
func BenchmarkCheck(b *testing.B) {
	for _, n := range []int{100, 1000, 10000} {
		src := generate(n)
		b.Run(fmt.Sprintf("streams=%d", n), func(b *testing.B) {
			b.SetBytes(int64(len(src)))
			for b.Loop() {
				if r := Check("gen.hmb", src); r.HasErrors() {
					b.Fatal("generated file has errors")
				}
			}
		})
	}
}
