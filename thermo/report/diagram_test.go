package report

import (
	"bytes"
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// scale is an axis recovered from the tick marks of an SVG alone.
type scale struct {
	a, b float64 // pixel = a + b * f(value)
	log  bool
}

func (s scale) px(v float64) float64 {
	if s.log {
		v = math.Log10(v)
	}
	return s.a + s.b*v
}

// readScale fits pixel = a + b value (or log10 value) through the labelled ticks of one axis and
// fails when the ticks do not lie on one line.
func readScale(t *testing.T, root *node, class string, log bool) scale {
	t.Helper()
	var vs, ps []float64
	root.walk(func(n *node) {
		if n.XMLName.Local != "g" || n.attr("class") != class {
			return
		}
		tr := strings.TrimSuffix(strings.TrimPrefix(n.attr("transform"), "translate("), ")")
		xs, ys, _ := strings.Cut(tr, ",")
		coord := xs
		if class == "tick-y" {
			coord = ys
		}
		p, err1 := strconv.ParseFloat(coord, 64)
		var label string
		for _, c := range n.Nodes {
			if c.XMLName.Local == "text" {
				label = c.Text
			}
		}
		v, err2 := strconv.ParseFloat(label, 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("tick %q at %q", label, tr)
		}
		if log {
			v = math.Log10(v)
		}
		vs, ps = append(vs, v), append(ps, p)
	})
	if len(vs) < 3 {
		t.Fatalf("%d ticks of class %s", len(vs), class)
	}
	b := (ps[len(ps)-1] - ps[0]) / (vs[len(vs)-1] - vs[0])
	a := ps[0] - b*vs[0]
	for i := range vs {
		if math.Abs(a+b*vs[i]-ps[i]) > 0.02 {
			t.Errorf("%s tick %g at %g px, off the line through the end ticks", class, vs[i], ps[i])
		}
	}
	return scale{a: a, b: b, log: log}
}

func readPoints(t *testing.T, s string) [][2]float64 {
	t.Helper()
	var out [][2]float64
	for _, f := range strings.Fields(s) {
		xs, ys, _ := strings.Cut(f, ",")
		x, err1 := strconv.ParseFloat(xs, 64)
		y, err2 := strconv.ParseFloat(ys, 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("bad point %q", f)
		}
		out = append(out, [2]float64{x, y})
	}
	return out
}

func segDist(p, a, b [2]float64) float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l2 := dx*dx + dy*dy
	u := 0.0
	if l2 > 0 {
		u = math.Max(0, math.Min(1, ((p[0]-a[0])*dx+(p[1]-a[1])*dy)/l2))
	}
	return math.Hypot(p[0]-a[0]-u*dx, p[1]-a[1]-u*dy)
}

func distToLine(p [2]float64, line [][2]float64) float64 {
	d := math.Inf(1)
	for i := 0; i+1 < len(line); i++ {
		d = math.Min(d, segDist(p, line[i], line[i+1]))
	}
	return d
}

// diagramCoords gives a state's plane coordinates in SI-derived display units, written out here
// independently of the package: kJ/(kg K), C, kJ/kg and kPa.
func diagramCoords(k Kind, st if97.State) (float64, float64) {
	switch k {
	case TS:
		return st.S / 1e3, st.T - 273.15
	case HS:
		return st.S / 1e3, st.H / 1e3
	}
	return st.H / 1e3, st.P / 1e3
}

func findByID(root *node, id string) *node {
	var found *node
	root.walk(func(n *node) {
		if n.attr("id") == id {
			found = n
		}
	})
	return found
}

// TestDomeReadsBack reads the saturation line back out of each diagram: with the scale taken
// from the tick labels, every vertex of the drawn dome lies within a pixel of the saturation
// states the engine gives, and every one of those states lies within a pixel of the drawn line.
// Spot values from python3-iapws 1.5.2, IAPWS97(T=..., x=0 and 1), name the check outside the
// project: at 373.15 K s' 1.3070143278413395, s” 7.354077050958405 kJ/(kg K), h' 419.09915499770307,
// h” 2675.572029220834 kJ/kg, p 0.10141797792131013 MPa; at 573.15 K s' 3.254740550494215,
// s” 5.705763616827153, h' 1344.7713390197298, h” 2749.5737425439734, p 8.587708329557278 MPa.
// The critical point is Tc = 647.096 K, pc = 22.064 MPa (IAPWS R7-97(2012), Eqs. 2 and 3).
func TestDomeReadsBack(t *testing.T) {
	type spot struct{ T, p, s, h float64 }
	spots := []spot{
		{373.15, 0.10141797792131013e6, 1.3070143278413395e3, 419.09915499770307e3},
		{373.15, 0.10141797792131013e6, 7.354077050958405e3, 2675.572029220834e3},
		{573.15, 8.587708329557278e6, 3.254740550494215e3, 1344.7713390197298e3},
		{573.15, 8.587708329557278e6, 5.705763616827153e3, 2749.5737425439734e3},
	}
	// The engine's saturation line, sampled far more densely than the drawing, crowding to the
	// critical point.
	var ref []if97.State
	const n = 4000
	for j := 0; j <= n; j++ {
		u := float64(j) / n
		T := 273.16 + (647.096-273.16)*(1-math.Pow(1-u, 4))
		l, v, err := if97.SatPairT(T)
		if err != nil {
			// The engine's saturated densities do not converge within about 1e-4 K of the
			// critical temperature; the states either side bound the line there.
			if 647.096-T > 1e-3 {
				t.Fatalf("SatPairT(%g): %v", T, err)
			}
			continue
		}
		ref = append(ref, l, v)
	}
	in := testInput(t, units.SI)
	for _, k := range []Kind{TS, HS, PH} {
		var b bytes.Buffer
		if err := Plot(&b, in, PlotOptions{Kind: k, FullDome: true}); err != nil {
			t.Fatal(err)
		}
		root := parseXML(t, b.Bytes())
		if root.XMLName.Local != "svg" || root.XMLName.Space != "http://www.w3.org/2000/svg" {
			t.Fatalf("%s: root element %v", k, root.XMLName)
		}
		xs, ys := readScale(t, root, "tick-x", false), readScale(t, root, "tick-y", k == PH)
		toPx := func(st if97.State) [2]float64 {
			x, y := diagramCoords(k, st)
			return [2]float64{xs.px(x), ys.px(y)}
		}
		id := strings.ToLower(k.String())
		dn := findByID(root, id+"-dome")
		if dn == nil {
			t.Fatalf("%s: no dome", k)
		}
		dome := readPoints(t, dn.attr("points"))
		if len(dome) < 100 {
			t.Fatalf("%s: dome of %d points", k, len(dome))
		}
		// The reference as two branches joined at the top, like the drawing.
		var refLine [][2]float64
		for j := 0; j < len(ref); j += 2 {
			refLine = append(refLine, toPx(ref[j]))
		}
		for j := len(ref) - 1; j >= 1; j -= 2 {
			refLine = append(refLine, toPx(ref[j]))
		}
		worst := 0.0
		for _, p := range dome {
			worst = math.Max(worst, distToLine(p, refLine))
		}
		for j := 0; j < len(refLine); j += 7 {
			worst = math.Max(worst, distToLine(refLine[j], dome))
		}
		if worst > 1 {
			t.Errorf("%s: dome strays %.2f px from the engine's saturation line", k, worst)
		}
		for _, sp := range spots {
			st := if97.State{T: sp.T, P: sp.p, S: sp.s, H: sp.h}
			if d := distToLine(toPx(st), dome); d > 1 {
				t.Errorf("%s: saturation state at %g K, s %g is %.2f px off the dome", k, sp.T, sp.s, d)
			}
		}
		cn := findByID(root, id+"-critical")
		cx, _ := strconv.ParseFloat(cn.attr("cx"), 64)
		cy, _ := strconv.ParseFloat(cn.attr("cy"), 64)
		crit, _, err := if97.SatPairT(647.096)
		if err != nil {
			t.Fatal(err)
		}
		crit.T, crit.P = 647.096, 22.064e6
		if want := toPx(crit); math.Hypot(cx-want[0], cy-want[1]) > 1 {
			t.Errorf("%s: critical point drawn at %g,%g, want %v", k, cx, cy, want)
		}
	}
}

// TestStreamsAndIsentropicEnd reads back the stream markers and the end of the turbine's dashed
// isentropic line. python3-iapws 1.5.2: IAPWS97(P=0.2, h=2943.2221652336634) -> s
// 7.655671765571876, T 509.19490955867684 K; IAPWS97(P=0.01, s=7.655671765571876) -> T
// 318.9575482070235 K, h 2426.570433219117 kJ/kg.
func TestStreamsAndIsentropicEnd(t *testing.T) {
	in := testInput(t, units.SI)
	var b bytes.Buffer
	if err := Plot(&b, in, PlotOptions{Kind: TS, ID: "x1"}); err != nil {
		t.Fatal(err)
	}
	root := parseXML(t, b.Bytes())
	xs, ys := readScale(t, root, "tick-x", false), readScale(t, root, "tick-y", false)
	marks := map[string][2]float64{}
	var dashed [][2]float64
	root.walk(func(n *node) {
		switch {
		case n.XMLName.Local == "circle" && n.attr("class") == "stream":
			x, _ := strconv.ParseFloat(n.attr("cx"), 64)
			y, _ := strconv.ParseFloat(n.attr("cy"), 64)
			marks[n.attr("data-stream")] = [2]float64{x, y}
		case n.XMLName.Local == "polyline" && n.attr("class") == "isentropic":
			dashed = readPoints(t, n.attr("points"))
		}
	})
	wantB := [2]float64{xs.px(7.655671765571876), ys.px(509.19490955867684 - 273.15)}
	if p := marks["B"]; math.Hypot(p[0]-wantB[0], p[1]-wantB[1]) > 1 {
		t.Errorf("B drawn at %v, want %v", p, wantB)
	}
	if len(marks) != 3 {
		t.Errorf("stream markers %v", marks)
	}
	if len(dashed) != 2 {
		t.Fatalf("isentropic line %v", dashed)
	}
	wantEnd := [2]float64{xs.px(7.655671765571876), ys.px(318.9575482070235 - 273.15)}
	if e := dashed[1]; math.Hypot(e[0]-wantEnd[0], e[1]-wantEnd[1]) > 1 {
		t.Errorf("isentropic end at %v, want %v", e, wantEnd)
	}
	if findByID(root, "x1-dome") == nil || !strings.Contains(b.String(), `clip-path="url(#x1-clip)"`) {
		t.Error("element ids do not carry the requested prefix")
	}
}

// TestUnsolvedPlot draws a file with nothing solved: the dome alone, no error, no NaN.
func TestUnsolvedPlot(t *testing.T) {
	in := testInput(t, units.US)
	in.Result = nil
	for _, k := range []Kind{TS, HS, PH} {
		s, err := PlotString(in, PlotOptions{Kind: k})
		if err != nil {
			t.Fatal(err)
		}
		parseXML(t, []byte(s))
		if strings.Contains(s, "NaN") || strings.Contains(s, "Inf") {
			t.Errorf("%s: NaN or Inf in the SVG", k)
		}
		if !strings.Contains(s, "Btu/(lbm R)") && k != PH {
			t.Errorf("%s: axis not in the file's US units", k)
		}
	}
	if _, err := PlotString(&Input{}, PlotOptions{}); err == nil {
		t.Error("no model: want an error")
	}
}

func TestParseKind(t *testing.T) {
	for _, tt := range []struct {
		in   string
		want Kind
		ok   bool
	}{{"Ts", TS, true}, {"ts", TS, true}, {"HS", HS, true}, {"ph", PH, true}, {"pv", 0, false}, {"", 0, false}} {
		k, err := ParseKind(tt.in)
		if (err == nil) != tt.ok || (tt.ok && k != tt.want) {
			t.Errorf("ParseKind(%q) = %v, %v", tt.in, k, err)
		}
	}
}

func TestAxisTicks(t *testing.T) {
	a := axis{p0: 0, p1: 100}
	a.fit(-0.3, 9.2)
	if a.lo != -2 || a.hi != 10 { // a step of 2 for a span of 9.5 in about 8 steps
		t.Errorf("linear fit [%g, %g]", a.lo, a.hi)
	}
	l := axis{p0: 0, p1: 100, log: true}
	l.fit(0.47, 33000)
	if l.lo != 0.2 || l.hi != 50000 {
		t.Errorf("log fit [%g, %g]", l.lo, l.hi)
	}
	if got := l.ticks(); got[0] != 1 || got[len(got)-1] != 10000 {
		t.Errorf("log ticks %v", got)
	}
}

// TestLegendColours: a chain of eight valves and a pump gives nine units; each unit's legend
// colour differs from the saturation line's, from the isolines' and, within the palette's
// length, from every other unit's. The temperature axis is titled in degrees.
func TestLegendColours(t *testing.T) {
	g := func(v float64) *model.Given { return &model.Given{Value: v} }
	m := &model.Model{Title: "valve chain", Display: units.SI, Atm: units.StandardAtmosphere}
	m.Streams = append(m.Streams, &model.Stream{Name: "S0", Fluid: "water",
		Given: [model.NumProps]*model.Given{model.Flow: g(1), model.P: g(3e6), model.T: g(573.15)}})
	for i := 1; i <= 8; i++ {
		m.Streams = append(m.Streams, &model.Stream{Name: fmt.Sprintf("S%d", i), Fluid: "water",
			Given: [model.NumProps]*model.Given{model.P: g(3e6 - float64(i)*0.3e6)}})
		m.Units = append(m.Units, &model.Unit{Name: fmt.Sprintf("V%d", i), Kind: model.Kinds["valve"],
			Ports: []model.Port{{Role: "in", Stream: i - 1}, {Role: "out", Stream: i}}})
	}
	m.Streams = append(m.Streams,
		&model.Stream{Name: "W0", Fluid: "water", Given: [model.NumProps]*model.Given{model.Flow: g(1), model.P: g(1e5), model.T: g(313.15)}},
		&model.Stream{Name: "W1", Fluid: "water", Given: [model.NumProps]*model.Given{model.P: g(2e6)}})
	m.Units = append(m.Units, &model.Unit{Name: "P1", Kind: model.Kinds["pump"], Params: map[string]*model.Given{"efficiency": g(0.7)},
		Ports: []model.Port{{Role: "in", Stream: 9}, {Role: "out", Stream: 10}}})
	r := solve.Solve(context.Background(), m, solve.Options{})
	in := &Input{Model: m, Result: r, Diags: r.Diags}
	for _, sys := range []units.System{units.SI, units.US} {
		s, err := PlotString(in, PlotOptions{Kind: TS})
		if sys == units.US {
			m.Display = units.US
			s, err = PlotString(in, PlotOptions{Kind: TS})
		}
		if err != nil {
			t.Fatal(err)
		}
		root := parseXML(t, []byte(s))
		dome := findByID(root, "ts-dome").attr("stroke")
		var iso string
		seen := map[string]string{}
		n := 0
		root.walk(func(n2 *node) {
			switch n2.attr("class") {
			case "isoline":
				iso = n2.attr("stroke")
			case "legend-unit":
				n++
				c := strings.ToLower(n2.attr("stroke"))
				u := n2.attr("data-unit")
				if c == strings.ToLower(dome) || c == strings.ToLower(iso) {
					t.Errorf("unit %s drawn in %s, the colour of the saturation line or the isolines", u, c)
				}
				if o, dup := seen[c]; dup && len(seen) < len(palette) {
					t.Errorf("units %s and %s share %s", o, u, c)
				}
				seen[c] = u
			}
		})
		if n != 9 {
			t.Errorf("%d units in the legend, want 9", n)
		}
		want := map[units.System]string{units.SI: "temperature T (°C)", units.US: "temperature T (°F)"}[sys]
		if !strings.Contains(s, want) {
			t.Errorf("%v: no axis title %q", sys, want)
		}
	}
}
