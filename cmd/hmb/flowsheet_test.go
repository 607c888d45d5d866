package main

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// fsGeom is what a flowsheet SVG draws, read back from its markup.
type fsGeom struct {
	boxes    map[string][4]float64 // unit name -> symbol box
	round    map[string]bool       // unit name -> the symbol is the circle in its box
	kinds    map[string]string     // unit name -> kind drawn
	inside   map[string][][2]float64
	routes   map[string][][2]float64 // stream name -> points along its arrow, in flow order
	tips     map[string][2]float64   // stream name -> arrowhead tip
	terms    [][2]float64            // battery-limit circles
	tagBoxes [][4]float64            // value boxes under the tags
}

// readFlowsheet parses the drawing: the symbol boxes and every coordinate drawn inside each
// symbol, the arrows (paths sampled along their Bezier pieces), the arrowheads and the
// battery-limit markers.
func readFlowsheet(t *testing.T, svg []byte) *fsGeom {
	t.Helper()
	var root xnode
	if err := xml.NewDecoder(bytes.NewReader(svg)).Decode(&root); err != nil {
		t.Fatal(err)
	}
	g := &fsGeom{boxes: map[string][4]float64{}, round: map[string]bool{}, kinds: map[string]string{}, inside: map[string][][2]float64{},
		routes: map[string][][2]float64{}, tips: map[string][2]float64{}}
	num := func(s string) float64 {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("bad number %q", s)
		}
		return v
	}
	pairs := func(s string) [][2]float64 {
		var out [][2]float64
		for _, f := range strings.Fields(s) {
			x, y, _ := strings.Cut(f, ",")
			out = append(out, [2]float64{num(x), num(y)})
		}
		return out
	}
	var walk func(n *xnode, unit string)
	walk = func(n *xnode, unit string) {
		switch n.XMLName.Local {
		case "g":
			if n.attr("class") == "symbol" {
				unit = n.attr("data-unit")
				f := strings.Fields(n.attr("data-box"))
				if len(f) != 4 {
					t.Fatalf("symbol %s: data-box %q", unit, n.attr("data-box"))
				}
				g.boxes[unit] = [4]float64{num(f[0]), num(f[1]), num(f[2]), num(f[3])}
				g.kinds[unit] = n.attr("data-kind")
				g.round[unit] = n.attr("data-shape") == "circle"
			}
		case "path":
			if n.attr("class") == "stream" {
				g.routes[n.attr("data-stream")] = samplePath(t, n.attr("d"))
			} else if unit != "" {
				for _, p := range samplePath(t, n.attr("d")) {
					g.inside[unit] = append(g.inside[unit], p)
				}
			}
		case "polygon", "polyline":
			if n.attr("class") == "arrowhead" {
				pts := pairs(n.attr("points"))
				g.tips[fmt.Sprint(len(g.tips))] = pts[0]
			} else if unit != "" {
				g.inside[unit] = append(g.inside[unit], pairs(n.attr("points"))...)
			}
		case "circle":
			c := [2]float64{num(n.attr("cx")), num(n.attr("cy"))}
			r := num(n.attr("r"))
			switch {
			case n.attr("class") == "terminal":
				g.terms = append(g.terms, c)
			case unit != "":
				g.inside[unit] = append(g.inside[unit], [2]float64{c[0] - r, c[1] - r}, [2]float64{c[0] + r, c[1] + r})
			}
		case "rect":
			x, y := num(n.attr("x")), num(n.attr("y"))
			w, h := num(n.attr("width")), num(n.attr("height"))
			switch {
			case n.attr("class") == "tag-box":
				g.tagBoxes = append(g.tagBoxes, [4]float64{x, y, x + w, y + h})
			case unit != "":
				g.inside[unit] = append(g.inside[unit], [2]float64{x, y}, [2]float64{x + w, y + h})
			}
		case "line":
			if unit != "" {
				g.inside[unit] = append(g.inside[unit], [2]float64{num(n.attr("x1")), num(n.attr("y1"))}, [2]float64{num(n.attr("x2")), num(n.attr("y2"))})
			}
		}
		for i := range n.Nodes {
			walk(&n.Nodes[i], unit)
		}
	}
	walk(&root, "")
	return g
}

// samplePath reads an SVG path of M, C, L and A commands (absolute) and samples it densely;
// an arc is sampled along its chord and end points, enough for a symbol's extent.
func samplePath(t *testing.T, d string) [][2]float64 {
	t.Helper()
	f := strings.FieldsFunc(d, func(r rune) bool { return r == ' ' || r == ',' })
	var out [][2]float64
	var cur [2]float64
	i := 0
	next := func() float64 {
		if i >= len(f) {
			t.Fatalf("path %q ends early", d)
		}
		v, err := strconv.ParseFloat(f[i], 64)
		if err != nil {
			t.Fatalf("path %q: %v", d, err)
		}
		i++
		return v
	}
	cmd := byte(0)
	for i < len(f) {
		if c := f[i][0]; c >= 'A' && c <= 'Z' {
			cmd = c
			f[i] = f[i][1:]
			if f[i] == "" {
				i++
				if cmd == 'Z' {
					continue
				}
			}
		}
		switch cmd {
		case 'M':
			cur = [2]float64{next(), next()}
			out = append(out, cur)
		case 'L':
			p := [2]float64{next(), next()}
			for k := 1; k <= 20; k++ {
				u := float64(k) / 20
				out = append(out, [2]float64{cur[0] + u*(p[0]-cur[0]), cur[1] + u*(p[1]-cur[1])})
			}
			cur = p
		case 'C':
			p1, p2, p3 := [2]float64{next(), next()}, [2]float64{next(), next()}, [2]float64{next(), next()}
			for k := 1; k <= 60; k++ {
				u := float64(k) / 60
				a, b, c, e := (1-u)*(1-u)*(1-u), 3*(1-u)*(1-u)*u, 3*(1-u)*u*u, u*u*u
				out = append(out, [2]float64{a*cur[0] + b*p1[0] + c*p2[0] + e*p3[0], a*cur[1] + b*p1[1] + c*p2[1] + e*p3[1]})
			}
			cur = p3
		case 'A':
			next()
			next()
			next()
			next()
			next()
			cur = [2]float64{next(), next()}
			out = append(out, cur)
		case 'Z':
			i++
		default:
			t.Fatalf("path %q: command %q", d, cmd)
		}
	}
	return out
}

// inSymbol reports whether p lies inside a symbol by more than margin: inside its box, or inside
// the circle the box holds for a round symbol.
func inSymbol(p [2]float64, b [4]float64, round bool, margin float64) bool {
	if round {
		r := (b[2] - b[0]) / 2
		return math.Hypot(p[0]-(b[0]+b[2])/2, p[1]-(b[1]+b[3])/2) < r-margin
	}
	return p[0] > b[0]+margin && p[0] < b[2]-margin && p[1] > b[1]+margin && p[1] < b[3]-margin
}

// boxDist is the distance from p to the box (zero inside).
func boxDist(p [2]float64, b [4]float64) float64 {
	dx := math.Max(0, math.Max(b[0]-p[0], p[0]-b[2]))
	dy := math.Max(0, math.Max(b[1]-p[1], p[1]-b[3]))
	return math.Hypot(dx, dy)
}

// checkFlowsheet draws one file's flowsheet, with and without values, and checks it: every unit
// is a symbol of its kind, drawn inside its box; every stream is an arrow carrying its tag, from
// the unit it leaves (or a battery-limit marker) to the unit it enters; no arrow runs through a
// symbol; no text overlaps another or a symbol; nothing leaves the drawing.
func checkFlowsheet(t *testing.T, f *dejaVu, file string) {
	t.Helper()
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	c := checkModel(context.Background(), file, src, nil)
	m := c.model
	base := filepath.Base(file)
	for _, values := range []bool{false, true} {
		args := []string{"plot", "--kind", "flowsheet", file}
		if values {
			args = []string{"plot", "--kind", "flowsheet", "--values", file}
		}
		code, out, stderr := runReportCmd(args...)
		if code == 2 || len(out) == 0 {
			t.Fatalf("%v: exit %d: %s", args, code, stderr)
		}
		if err := xmlWellFormed(out); err != nil {
			t.Fatalf("%s: %v", base, err)
		}
		where := fmt.Sprintf("%s (values %v)", base, values)
		g := readFlowsheet(t, out)
		texts, _, w, h := svgTexts(t, f, out)

		for _, u := range m.Units {
			b, ok := g.boxes[u.Name]
			if !ok {
				t.Errorf("%s: unit %s has no symbol", where, u.Name)
				continue
			}
			if g.kinds[u.Name] != u.Kind.Name {
				t.Errorf("%s: unit %s drawn as %q, want %q", where, u.Name, g.kinds[u.Name], u.Kind.Name)
			}
			for _, p := range g.inside[u.Name] {
				if boxDist(p, b) > 1 {
					t.Errorf("%s: symbol %s draws at %v, outside its box %v", where, u.Name, p, b)
					break
				}
			}
		}
		tags := map[string]bool{}
		names := map[string]bool{}
		for _, tx := range texts {
			switch tx.class {
			case "f-tag":
				tags[tx.text] = true
			case "f-unit":
				names[tx.text] = true
			}
		}
		for _, u := range m.Units {
			if !names[u.Name] {
				t.Errorf("%s: unit %s has no name printed", where, u.Name)
			}
		}
		for si, s := range m.Streams {
			if !tags[s.Name] {
				t.Errorf("%s: stream %s has no tag", where, s.Name)
			}
			route := g.routes[s.Name]
			if len(route) < 2 {
				t.Errorf("%s: stream %s has no arrow", where, s.Name)
				continue
			}
			from, to := -1, -1
			for ui, u := range m.Units {
				for _, p := range u.Ports {
					if p.Stream != si {
						continue
					}
					if u.Kind.Port(p.Role).Inlet {
						to = ui
					} else {
						from = ui
					}
				}
			}
			// The arrow starts at the unit it leaves and ends at the one it enters.
			near := func(p [2]float64, unit int) (float64, string) {
				if unit >= 0 {
					return boxDist(p, g.boxes[m.Units[unit].Name]), m.Units[unit].Name
				}
				d := math.Inf(1)
				for _, c := range g.terms {
					d = math.Min(d, math.Hypot(p[0]-c[0], p[1]-c[1])-3.5)
				}
				return d, "a battery limit"
			}
			if d, n := near(route[0], from); d > 2.5 {
				t.Errorf("%s: stream %s starts %.1f px from %s", where, s.Name, d, n)
			}
			if d, n := near(route[len(route)-1], to); d > 2.5 {
				t.Errorf("%s: stream %s ends %.1f px from %s", where, s.Name, d, n)
			}
			// No arrow through a symbol, its own ends included.
			for _, u := range m.Units {
				for _, p := range route {
					if inSymbol(p, g.boxes[u.Name], g.round[u.Name], 1.5) {
						t.Errorf("%s: stream %s runs through %s at %.0f,%.0f", where, s.Name, u.Name, p[0], p[1])
						break
					}
				}
			}
		}
		if len(g.tips) != len(m.Streams) {
			t.Errorf("%s: %d arrowheads for %d streams", where, len(g.tips), len(m.Streams))
		}
		// Texts: none on another, none on a symbol, none off the drawing.
		for _, b := range overlapCheck(texts, nil, w, h) {
			t.Errorf("%s: %s", where, b)
		}
		for _, tx := range texts {
			for name, b := range g.boxes {
				tb := [4]float64{tx.box[0], tx.box[1], tx.box[2], tx.box[3]}
				if math.Min(tb[2], b[2])-math.Max(tb[0], b[0]) > 0.5 && math.Min(tb[3], b[3])-math.Max(tb[1], b[1]) > 0.5 {
					t.Errorf("%s: text %q over symbol %s", where, tx.text, name)
				}
			}
		}
		for _, tb := range g.tagBoxes {
			for name, b := range g.boxes {
				if math.Min(tb[2], b[2])-math.Max(tb[0], b[0]) > 0.5 && math.Min(tb[3], b[3])-math.Max(tb[1], b[1]) > 0.5 {
					t.Errorf("%s: a value box covers symbol %s", where, name)
				}
			}
		}
		if values && len(g.tagBoxes) != len(m.Streams) {
			t.Errorf("%s: %d value boxes for %d streams", where, len(g.tagBoxes), len(m.Streams))
		}
	}
}

// TestFlowsheetExamples draws every example's heat and material balance diagram; the power
// cycles are closed loops, the deaerator and desuperheater join several feeds.
func TestFlowsheetExamples(t *testing.T) {
	f := loadDejaVu(t)
	for _, file := range exampleFiles(t) {
		checkFlowsheet(t, f, file)
	}
}

// TestFlowsheetRecycle draws an invented loop with a recycle inside a cycle: a hot-water circuit
// whose pump discharge is split, part returning through a bypass valve to the mixer ahead of the
// pump, and a heater and a cooler closing the outer loop; and a file with a stream joined to no
// unit.
func TestFlowsheetRecycle(t *testing.T) {
	f := loadDejaVu(t)
	dir := t.TempDir()
	recycle := `title "circuit with a pump bypass"
display SI
stream R1 "circuit return" { p 3 bar; T 60 C }
stream M1 "pump suction"
stream P1 "pump discharge" { p 6 bar }
stream B1 "bypass" { flow 0.5 kg/s }
stream B2 "bypass after valve" { p 3 bar }
stream S1 "to heater" { flow 4 kg/s }
stream H1 "heated" { T 90 C }
mixer MX { in R1, B2; out M1 }
pump PU { in M1; out P1; efficiency 70 % }
splitter SP { in P1; out B1, S1 }
valve BV { in B1; out B2 }
heater HT { in S1; out H1; dp 0.5 bar }
cooler LD { in H1; out R1; dp 2.5 bar }
`
	lone := "title \"lone stream\"\ndisplay SI\nstream A { flow 1 kg/s; p 2 bar; T 20 C }\nstream B\nstream Z { flow 1 kg/s; p 1 bar; T 20 C }\nvalve V { in A; out B }\n"
	for name, text := range map[string]string{"recycle.hmb": recycle, "lone.hmb": lone} {
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		if code, out, _ := runReportCmd("check", "--quiet", path); name == "recycle.hmb" && code != 0 {
			t.Fatalf("%s does not check clean:\n%s", name, out)
		}
		checkFlowsheet(t, f, path)
	}
}
