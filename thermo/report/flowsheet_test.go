package report

import (
	"fmt"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// TestParseSpline reads Graphviz edge positions (dot output, the pos attribute: "e,x,y" or
// "s,x,y" for the arrow, then 3n+1 Bezier control points, lines continued with a backslash).
func TestParseSpline(t *testing.T) {
	for _, tt := range []struct {
		in         string
		first, tip [2]float64
		n          int
		ok         bool
	}{
		{"e,113.42,47.023 58.021,30.18 71.53,34.287 87.925,39.271 102.61,43.735", [2]float64{58.021, 30.18}, [2]float64{113.42, 47.023}, 4, true},
		// Drawn against the flow (dir=back): the points come back reversed, ending at the arrow.
		{"s,10,0 20,0 30,0 40,0 50,0 60,0 70,0 80,0", [2]float64{80, 0}, [2]float64{10, 0}, 7, true},
		{"e,1,1 1,2 3,4 \\\n5,6 7,8", [2]float64{1, 2}, [2]float64{1, 1}, 4, true},
		{"e,1,1 1,2 3,4 5,6", [2]float64{}, [2]float64{}, 0, false}, // not 3n+1 points
		{"e,1,1 1,2 3,x 5,6 7,8", [2]float64{}, [2]float64{}, 0, false},
		{"", [2]float64{}, [2]float64{}, 0, false},
	} {
		pts, tip, ok := parseSpline(tt.in)
		if ok != tt.ok || (ok && (len(pts) != tt.n || pts[0] != tt.first || tip != tt.tip)) {
			t.Errorf("parseSpline(%q) = %v, %v, %v", tt.in, pts, tip, ok)
		}
	}
}

// TestBackEdges: in a Rankine loop the walk starts at the boiler, so the feedwater stream into
// the boiler closes the loop; in a line with a recycle the bypass back to the mixer does.
func TestBackEdges(t *testing.T) {
	unit := func(name, kind string, ports ...model.Port) *model.Unit {
		return &model.Unit{Name: name, Kind: model.Kinds[kind], Ports: ports}
	}
	p := func(role string, s int) model.Port { return model.Port{Role: role, Stream: s} }
	streams := func(names ...string) []*model.Stream {
		var out []*model.Stream
		for _, n := range names {
			out = append(out, &model.Stream{Name: n})
		}
		return out
	}
	for _, tt := range []struct {
		name string
		m    *model.Model
		back []string
	}{
		{"rankine", &model.Model{Streams: streams("FW", "MS", "EX", "CN"), Units: []*model.Unit{
			unit("FP", "pump", p("in", 3), p("out", 0)),
			unit("TB", "turbine", p("in", 1), p("out", 2)),
			unit("CD", "cooler", p("in", 2), p("out", 3)),
			unit("SG", "boiler", p("in", 0), p("out", 1)),
		}}, []string{"FW"}},
		{"recycle", &model.Model{Streams: streams("F", "M", "P", "B", "B2", "S"), Units: []*model.Unit{
			unit("MX", "mixer", p("in", 0), p("in", 4), p("out", 1)),
			unit("PU", "pump", p("in", 1), p("out", 2)),
			unit("SP", "splitter", p("in", 2), p("out", 3), p("out", 5)),
			unit("BV", "valve", p("in", 3), p("out", 4)),
		}}, []string{"B2"}},
	} {
		in := &Input{Model: tt.m}
		ss := fsStreams(in, false)
		back := backEdges(tt.m, ss)
		var got []string
		for k, b := range back {
			if b {
				got = append(got, tt.m.Streams[ss[k].idx].Name)
			}
		}
		if strings.Join(got, " ") != strings.Join(tt.back, " ") {
			t.Errorf("%s: loops closed by %v, want %v", tt.name, got, tt.back)
		}
	}
}

// TestFlowsheetUnsolved draws the test line-up without a solution: every stream dashed, grey,
// tagged, no values, no NaN.
func TestFlowsheetUnsolved(t *testing.T) {
	in := testInput(t, units.SI)
	in.Result = nil
	s, err := PlotString(in, PlotOptions{Kind: Flowsheet, Values: true})
	if err != nil {
		t.Fatal(err)
	}
	parseXML(t, []byte(s))
	if strings.Contains(s, "NaN") || strings.Count(s, `class="stream"`) != 3 || strings.Count(s, `stroke-dasharray="5,3"`) < 3 {
		t.Errorf("unsolved flowsheet:\n%s", s)
	}
	for _, n := range []string{">A<", ">B<", ">C<", ">V1<", ">T1<", Unsolved} {
		if !strings.Contains(s, n) {
			t.Errorf("no %q", n)
		}
	}
}

// BenchmarkFlowsheet lays out and draws the test line-up's flowsheet.
func BenchmarkFlowsheet(b *testing.B) {
	in := testInput(b, units.SI)
	for b.Loop() {
		if _, err := PlotString(in, PlotOptions{Kind: Flowsheet, Values: true}); err != nil {
			b.Fatal(err)
		}
	}
}

// TestFlowsheetConcurrent draws flowsheets on several goroutines at once, as a language server
// or a parallel test does: every drawing must come out whole (the layout engine's WebAssembly
// module is shared package state in go-graphviz).
func TestFlowsheetConcurrent(t *testing.T) {
	in := testInput(t, units.SI)
	want, err := PlotString(in, PlotOptions{Kind: Flowsheet})
	if err != nil {
		t.Fatal(err)
	}
	errs := make(chan error, 8)
	for range 8 {
		go func() {
			got, err := PlotString(in, PlotOptions{Kind: Flowsheet})
			if err == nil && got != want {
				err = fmt.Errorf("a concurrent drawing differs from the lone one")
			}
			errs <- err
		}()
	}
	for range 8 {
		if err := <-errs; err != nil {
			t.Error(err)
		}
	}
}
