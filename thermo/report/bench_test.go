package report

import (
	"testing"

	"hmb/thermo/units"
)

// BenchmarkPlot draws the Ts diagram of the test line-up: dome, isobars, quality lines and paths.
func BenchmarkPlot(b *testing.B) {
	in := testInput(b, units.SI)
	for b.Loop() {
		if _, err := PlotString(in, PlotOptions{Kind: TS}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPage writes the whole page with its two diagrams.
func BenchmarkPage(b *testing.B) {
	in := testInput(b, units.SI)
	for b.Loop() {
		var sb discard
		if err := WritePage(&sb, in, PageOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

type discard struct{}

func (discard) Write(p []byte) (int, error) { return len(p), nil }
