package report

import (
	"bytes"
	"context"
	"fmt"
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"
	"sync"

	"github.com/goccy/go-graphviz"

	"hmb/thermo/model"
)

// The heat and material balance diagram: every unit an equipment symbol in the manner of
// ISO 10628-2 (simplified), every stream an arrow from the unit it leaves to the unit it enters,
// tagged with its name and, optionally, its flow, pressure and temperature. Graphviz's dot lays
// the graph out (ranks left to right, splines routed around the nodes, room kept for the tags);
// this file draws the symbols, arrows and text at the places it found.

// symbol is how one kind of unit is drawn: its size in points (the layout's units, drawn one to
// one as SVG pixels), the Graphviz shape its arrows are clipped to, and where each port role
// attaches (a compass point of the symbol; "" lets the layout choose).
type symbol struct {
	w, h  float64
	shape string
	ports map[string]string
	draw  func(w *svgWriter, x, y, wd, ht float64) // centre and size
}

// Symbols by kind. Inlets enter from the west and outlets leave to the east unless a port says
// otherwise, so the process reads left to right and a recycle loops back visibly.
var symbols = map[string]symbol{
	"pump":    {w: 30, h: 30, shape: "circle", draw: drawPump},
	"turbine": {w: 34, h: 44, shape: "box", draw: drawTurbine},
	"valve":   {w: 28, h: 18, shape: "box", draw: drawValve},
	"exchanger": {w: 38, h: 38, shape: "circle", draw: drawExchanger,
		ports: map[string]string{"hot_in": "n", "hot_out": "s", "cold_in": "w", "cold_out": "e"}},
	"heater":    {w: 32, h: 32, shape: "circle", draw: drawHeater},
	"cooler":    {w: 32, h: 32, shape: "circle", draw: drawCooler},
	"boiler":    {w: 42, h: 54, shape: "box", draw: drawBoiler, ports: map[string]string{"blowdown": "s"}},
	"deaerator": {w: 56, h: 44, shape: "box", draw: drawDeaerator, ports: map[string]string{"vent": "n"}},
	"flash":     {w: 30, h: 58, shape: "box", draw: drawVerticalVessel, ports: map[string]string{"vapor": "n", "liquid": "s"}},
	"mixer":     {w: 54, h: 28, shape: "box", draw: drawHorizontalVessel},
	"splitter":  {w: 10, h: 10, shape: "circle", draw: drawTee},
	"desuperheater": {w: 42, h: 18, shape: "box", draw: drawDesuperheater,
		ports: map[string]string{"water": "s"}},
}

// unknownSymbol draws a unit whose kind is not in the catalogue.
var unknownSymbol = symbol{w: 30, h: 30, shape: "box", draw: drawUnknown}

const (
	fsStroke     = "#1a1a1a"
	fsFont       = 12.0 // stream tags and unit names, px
	fsFontValues = 10.5 // the values under a tag
	fsMargin     = 24.0
	fsTitle      = 40.0 // height of the title band
	fsLegend     = 30.0 // height of the legend band
)

// Stream colours by phase: the trade's habit of blue water and red steam.
var phaseColors = map[string]string{
	"compressed liquid":  "#1f5fa8",
	"saturated liquid":   "#1f5fa8",
	"saturated mixture":  "#7b3f9e",
	"saturated vapour":   "#b3261e",
	"superheated vapour": "#b3261e",
	"supercritical":      "#b3261e",
}

const unsolvedColor = "#888"

// fsStream is one stream as the flowsheet draws it.
type fsStream struct {
	idx      int
	from, to int // unit indices, -1 for the battery limit
	fromRole string
	toRole   string
	tag      []string // the name, then the values when asked
	tw, th   float64  // size of the tag box
	color    string
	// After layout, in SVG pixels:
	path  [][2]float64 // cubic Bezier control points: p0, then three per piece
	head  [2]float64   // the arrow's tip
	label [2]float64   // centre of the tag box
}

// fsUnit is one unit's symbol after layout.
type fsUnit struct {
	idx    int
	sym    symbol
	cx, cy float64
}

var graphvizMu sync.Mutex

// flowsheetSVG draws the heat and material balance diagram of a file.
func flowsheetSVG(in *Input, opt PlotOptions) (string, error) {
	m := in.Model
	id := opt.ID
	if id == "" {
		id = "flowsheet"
	}
	streams := fsStreams(in, opt.Values)
	dot := fsDot(m, streams)

	// go-graphviz keeps the WebAssembly module its parser and layout run in as package state:
	// two layouts at once corrupt each other (a report written on two goroutines crashed), so
	// they take turns.
	graphvizMu.Lock()
	defer graphvizMu.Unlock()
	ctx := context.Background()
	gv, err := graphviz.New(ctx)
	if err != nil {
		return "", fmt.Errorf("flowsheet layout: %v", err)
	}
	defer gv.Close()
	g, err := graphviz.ParseBytes([]byte(dot))
	if err != nil {
		return "", fmt.Errorf("flowsheet layout: %v", err)
	}
	defer g.Close()
	var discard bytes.Buffer
	if err := gv.Render(ctx, g, "dot", &discard); err != nil {
		return "", fmt.Errorf("flowsheet layout: %v", err)
	}

	// Read the layout back: node centres, edge splines and tag positions, in points with y up.
	units := map[int]*fsUnit{}
	terms := map[string][2]float64{}
	byID := map[string]*fsStream{}
	for i := range streams {
		byID["s"+strconv.Itoa(streams[i].idx)] = &streams[i]
	}
	type route struct {
		s       *fsStream
		pos, lp string
	}
	var raw []route
	for n, _ := g.FirstNode(); n != nil; n, _ = g.NextNode(n) {
		name, _ := n.Name()
		x, y, ok := parsePoint(n.GetStr("pos"))
		if !ok {
			return "", fmt.Errorf("flowsheet layout: node %s has no position", name)
		}
		if k, found := strings.CutPrefix(name, "u"); found {
			ui, _ := strconv.Atoi(k)
			units[ui] = &fsUnit{idx: ui, sym: symbolOf(m.Units[ui]), cx: x, cy: y}
		} else {
			terms[name] = [2]float64{x, y}
		}
		for e, _ := g.FirstOut(n); e != nil; e, _ = g.NextOut(e) {
			s := byID[e.GetStr("id")]
			if s == nil {
				continue
			}
			raw = append(raw, route{s, e.GetStr("pos"), e.GetStr("lp")})
		}
	}
	for _, r := range raw {
		pts, head, ok := parseSpline(r.pos)
		if !ok {
			return "", fmt.Errorf("flowsheet layout: stream %s has no route", m.Streams[r.s.idx].Name)
		}
		r.s.path, r.s.head = pts, head
		if x, y, ok := parsePoint(r.lp); ok {
			r.s.label = [2]float64{x, y}
		}
	}

	// Bounds of everything drawn, then flip y and shift by the margins.
	bx0, by0, bx1, by1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	grow := func(x, y, hw, hh float64) {
		bx0, by0 = math.Min(bx0, x-hw), math.Min(by0, y-hh)
		bx1, by1 = math.Max(bx1, x+hw), math.Max(by1, y+hh)
	}
	for _, u := range units {
		grow(u.cx, u.cy, u.sym.w/2, u.sym.h/2)
	}
	for _, t := range terms {
		grow(t[0], t[1], 4, 4)
	}
	for i := range streams {
		s := &streams[i]
		for _, p := range s.path {
			grow(p[0], p[1], 0, 0)
		}
		grow(s.head[0], s.head[1], 0, 0)
		grow(s.label[0], s.label[1], s.tw/2, s.th/2)
	}
	if math.IsInf(bx0, 1) {
		bx0, by0, bx1, by1 = 0, 0, 200, 60
	}
	title := fmt.Sprintf("%s: heat and material balance diagram", Title(m, in.Path))
	width := math.Max(bx1-bx0+2*fsMargin, textWidth(title, 16, true)+2*fsMargin)
	width = math.Max(width, 560)
	height := by1 - by0 + 2*fsMargin + fsTitle + fsLegend
	tr := func(x, y float64) [2]float64 {
		return [2]float64{x - bx0 + (width-(bx1-bx0))/2, by1 - y + fsMargin + fsTitle}
	}
	for _, u := range units {
		p := tr(u.cx, u.cy)
		u.cx, u.cy = p[0], p[1]
	}
	for k, t := range terms {
		terms[k] = tr(t[0], t[1])
	}
	for i := range streams {
		s := &streams[i]
		for j, p := range s.path {
			s.path[j] = tr(p[0], p[1])
		}
		s.head = tr(s.head[0], s.head[1])
		s.label = tr(s.label[0], s.label[1])
	}

	var w svgWriter
	w.printf(`<svg xmlns="http://www.w3.org/2000/svg" width="%s" height="%s" viewBox="0 0 %s %s" font-family="DejaVu Sans, Arial, Helvetica, sans-serif" id="%s" class="flowsheet">`+"\n",
		num(width), num(height), num(width), num(height), esc(id))
	w.printf("<title>%s</title>\n", esc(title))
	w.printf(`<style>.f-hd{font-size:16px;font-weight:bold}.f-tag{font-size:%spx;font-weight:bold;fill:#000}.f-val{font-size:%spx;fill:#222}.f-unit{font-size:%spx;fill:#333}.f-lg{font-size:%spx;fill:#222}</style>`+"\n",
		num(fsFont), num(fsFontValues), num(fsFont), num(fsFont-1))
	w.printf(`<rect x="0" y="0" width="%s" height="%s" fill="#fff"/>`+"\n", num(width), num(height))
	w.text(fsMargin, 26, "start", "f-hd", title)

	lay := layout{area: rect{4, fsTitle, width - 4, height - fsLegend}}
	for i := range streams {
		s := &streams[i]
		fsArrow(&w, m, s)
		lay.trace(bezierSamples(s.path))
		lay.solid = append(lay.solid, rect{s.head[0] - 4, s.head[1] - 4, s.head[0] + 4, s.head[1] + 4})
	}
	// In name order, so that the same file always draws the same bytes.
	for _, name := range slices.Sorted(maps.Keys(terms)) {
		t := terms[name]
		w.printf(`<circle class="terminal" cx="%s" cy="%s" r="3.5" fill="#fff" stroke="%s" stroke-width="1.4"/>`+"\n", num(t[0]), num(t[1]), fsStroke)
		lay.solid = append(lay.solid, rect{t[0] - 4, t[1] - 4, t[0] + 4, t[1] + 4})
	}
	for ui := range m.Units {
		u := units[ui]
		if u == nil {
			continue
		}
		x0, y0 := u.cx-u.sym.w/2, u.cy-u.sym.h/2
		w.printf(`<g class="symbol" data-unit="%s" data-kind="%s" data-shape="%s" data-box="%s %s %s %s">`+"\n",
			esc(m.Units[ui].Name), esc(kindName(m.Units[ui])), u.sym.shape, num(x0), num(y0), num(x0+u.sym.w), num(y0+u.sym.h))
		u.sym.draw(&w, u.cx, u.cy, u.sym.w, u.sym.h)
		w.printf("</g>\n")
		lay.solid = append(lay.solid, rect{x0 - 1, y0 - 1, x0 + u.sym.w + 1, y0 + u.sym.h + 1})
	}
	// Tags at the places the layout kept for them, then the unit names wherever there is room.
	for i := range streams {
		s := &streams[i]
		fsTag(&w, s)
		lay.solid = append(lay.solid, rect{s.label[0] - s.tw/2, s.label[1] - s.th/2, s.label[0] + s.tw/2, s.label[1] + s.th/2})
	}
	for ui := range m.Units {
		u := units[ui]
		if u == nil {
			continue
		}
		name := m.Units[ui].Name
		// The name goes under or over the symbol when it can: start the rings at its edge.
		x, y, anchor, _, ok := lay.place(u.cx, u.cy, name, fsFont, false, 8+int(u.sym.h/20))
		if !ok {
			continue
		}
		w.printf(`<text x="%s" y="%s" text-anchor="%s" class="f-unit" data-unit="%s">%s</text>`+"\n", num(x), num(y), anchor, esc(name), esc(name))
	}
	fsLegendBand(&w, width, height)
	w.printf("</svg>\n")
	return w.String(), nil
}

// fsStreams lists the streams with their ends and tag text.
func fsStreams(in *Input, values bool) []fsStream {
	m, r := in.Model, in.Result
	q := newQuantities(m)
	var out []fsStream
	for i, st := range m.Streams {
		if st == nil {
			continue
		}
		s := fsStream{idx: i, from: -1, to: -1, tag: []string{st.Name}, color: unsolvedColor}
		for ui, u := range m.Units {
			if u == nil || u.Kind == nil {
				continue
			}
			for _, p := range u.Ports {
				spec := u.Kind.Port(p.Role)
				if p.Stream != i || spec == nil {
					continue
				}
				if spec.Inlet {
					s.to, s.toRole = ui, p.Role
				} else {
					s.from, s.fromRole = ui, p.Role
				}
			}
		}
		if r != nil && i < len(r.Streams) && r.Streams[i].HasState {
			if c, ok := phaseColors[r.Streams[i].State.Phase.String()]; ok {
				s.color = c
			}
		}
		if values {
			sub := model.Subject{Kind: model.StreamSubject, Index: i}
			for _, name := range []string{"flow", "p", "T"} {
				v, spec, _ := r.Value(m, sub, name)
				if spec == nil {
					continue
				}
				s.tag = append(s.tag, q.cell(spec.Dim, v)+" "+printSymbol(q.unit(spec.Dim)))
			}
		}
		s.tw = textWidth(s.tag[0], fsFont, true) + 6
		s.th = fsFont + 4
		for _, line := range s.tag[1:] {
			s.tw = math.Max(s.tw, textWidth(line, fsFontValues, false)+8)
			s.th += fsFontValues + 2
		}
		out = append(out, s)
	}
	return out
}

// fsDot writes the graph for dot: units as fixed-size nodes of their symbol's shape, battery
// limits as points, streams as edges whose labels reserve the tag boxes.
func fsDot(m *model.Model, streams []fsStream) string {
	var b strings.Builder
	b.WriteString("digraph hmb {\n")
	b.WriteString("graph [rankdir=LR, nodesep=0.45, ranksep=0.55, splines=true, outputorder=edgesfirst, pad=0];\n")
	b.WriteString("node [fixedsize=true, label=\"\"];\n")
	b.WriteString("edge [arrowhead=normal, arrowsize=0.8];\n")
	for ui, u := range m.Units {
		if u == nil {
			continue
		}
		sym := symbolOf(u)
		fmt.Fprintf(&b, "u%d [shape=%s, width=%s, height=%s];\n", ui, sym.shape, inch(sym.w), inch(sym.h))
	}
	end := func(unit int, role string, inlet bool, term string) string {
		if unit < 0 {
			return term
		}
		if role == "" {
			return fmt.Sprintf("u%d", unit)
		}
		port := ""
		sym := symbolOf(m.Units[unit])
		if p, ok := sym.ports[role]; ok {
			port = p
		} else if inlet {
			port = "w"
		} else {
			port = "e"
		}
		return fmt.Sprintf("u%d:%s", unit, port)
	}
	back := backEdges(m, streams)
	for k, s := range streams {
		src := fmt.Sprintf("t%d_src", s.idx)
		dst := fmt.Sprintf("t%d_dst", s.idx)
		if s.from < 0 {
			fmt.Fprintf(&b, "%s [shape=point, width=0.1];\n", src)
		}
		if s.to < 0 {
			fmt.Fprintf(&b, "%s [shape=point, width=0.1];\n", dst)
		}
		tail, head := end(s.from, s.fromRole, false, src), end(s.to, s.toRole, true, dst)
		dir := ""
		if back[k] {
			// Written against the flow, so that dot ranks it forward and routes it around
			// the outside; the arrow is drawn at the tail, which is the stream's true head.
			// Free of ports, so that the return line leaves and enters where it is nearest
			// instead of curling round the symbols to reach their sides.
			tail, head, dir = end(s.to, "", true, dst), end(s.from, "", false, src), "dir=back, "
		}
		fmt.Fprintf(&b, "%s -> %s [%sid=\"s%d\", label=<<table border=\"0\" cellborder=\"0\" cellspacing=\"0\" cellpadding=\"0\"><tr><td fixedsize=\"true\" width=\"%s\" height=\"%s\"></td></tr></table>>];\n",
			tail, head, dir, s.idx, strconv.Itoa(int(math.Ceil(s.tw))), strconv.Itoa(int(math.Ceil(s.th))))
	}
	b.WriteString("}\n")
	return b.String()
}

// backEdges picks the streams that close a loop, so that the layout ranks a cycle the way it is
// drawn by hand: a depth-first walk along the flow from the steam generators first (a power
// cycle reads from its boiler), then from the units fed across the battery limit, then from any
// unit left; a stream back to a unit still on the walk's path closes a loop. Those streams do
// not rank their units; they return along the outside of the drawing.
func backEdges(m *model.Model, streams []fsStream) []bool {
	out := make([][]int, len(m.Units)) // stream positions leaving each unit
	for k, s := range streams {
		if s.from >= 0 && s.to >= 0 {
			out[s.from] = append(out[s.from], k)
		}
	}
	back := make([]bool, len(streams))
	state := make([]uint8, len(m.Units)) // 0 unseen, 1 on the path, 2 done
	var visit func(u int)
	visit = func(u int) {
		state[u] = 1
		for _, k := range out[u] {
			switch state[streams[k].to] {
			case 0:
				visit(streams[k].to)
			case 1:
				back[k] = true
			}
		}
		state[u] = 2
	}
	fed := make([]bool, len(m.Units))
	for _, s := range streams {
		if s.from < 0 && s.to >= 0 {
			fed[s.to] = true
		}
	}
	for _, pass := range []func(int) bool{
		func(u int) bool { return kindName(m.Units[u]) == "boiler" },
		func(u int) bool { return fed[u] },
		func(int) bool { return true },
	} {
		for u := range m.Units {
			if m.Units[u] != nil && state[u] == 0 && pass(u) {
				visit(u)
			}
		}
	}
	return back
}

func inch(pt float64) string { return strconv.FormatFloat(pt/72, 'f', 4, 64) }

func symbolOf(u *model.Unit) symbol {
	if u != nil && u.Kind != nil {
		if s, ok := symbols[u.Kind.Name]; ok {
			return s
		}
	}
	return unknownSymbol
}

func kindName(u *model.Unit) string {
	if u == nil || u.Kind == nil {
		return "unknown"
	}
	return u.Kind.Name
}

// parsePoint reads "x,y".
func parsePoint(s string) (x, y float64, ok bool) {
	xs, ys, found := strings.Cut(strings.TrimSpace(s), ",")
	if !found {
		return 0, 0, false
	}
	x, err1 := strconv.ParseFloat(xs, 64)
	y, err2 := strconv.ParseFloat(ys, 64)
	return x, y, err1 == nil && err2 == nil
}

// parseSpline reads a Graphviz edge position (the pos attribute of dot's output): the control
// points of a piecewise cubic Bezier curve, 3n+1 of them, and the arrow's tip, "e,x,y" at the
// head or, for an edge drawn against its direction (dir=back), "s,x,y" at the tail. The points
// come back in the direction of the flow, ending at the arrow.
func parseSpline(s string) (pts [][2]float64, head [2]float64, ok bool) {
	s = strings.ReplaceAll(s, "\\\n", "")
	hasHead, atTail := false, false
	for _, f := range strings.Fields(s) {
		switch {
		case strings.HasPrefix(f, "e,") || strings.HasPrefix(f, "s,"):
			x, y, ok := parsePoint(f[2:])
			if !ok {
				return nil, head, false
			}
			head, hasHead, atTail = [2]float64{x, y}, true, f[0] == 's'
		default:
			x, y, ok := parsePoint(f)
			if !ok {
				return nil, head, false
			}
			pts = append(pts, [2]float64{x, y})
		}
	}
	if len(pts) < 4 || (len(pts)-1)%3 != 0 {
		return nil, head, false
	}
	if atTail {
		slices.Reverse(pts)
	}
	if !hasHead {
		head = pts[len(pts)-1]
	}
	return pts, head, true
}

// bezierSamples are points along a piecewise cubic Bezier curve, a few pixels apart.
func bezierSamples(pts [][2]float64) [][2]float64 {
	var out [][2]float64
	for i := 0; i+3 < len(pts); i += 3 {
		p0, p1, p2, p3 := pts[i], pts[i+1], pts[i+2], pts[i+3]
		n := int(math.Hypot(p3[0]-p0[0], p3[1]-p0[1])/3) + 8
		for k := 0; k <= n; k++ {
			t := float64(k) / float64(n)
			a, b, c, d := (1-t)*(1-t)*(1-t), 3*(1-t)*(1-t)*t, 3*(1-t)*t*t, t*t*t
			out = append(out, [2]float64{a*p0[0] + b*p1[0] + c*p2[0] + d*p3[0], a*p0[1] + b*p1[1] + c*p2[1] + d*p3[1]})
		}
	}
	return out
}

// fsArrow draws a stream's route and arrowhead.
func fsArrow(w *svgWriter, m *model.Model, s *fsStream) {
	var d strings.Builder
	p := s.path
	fmt.Fprintf(&d, "M%s,%s", num(p[0][0]), num(p[0][1]))
	for i := 1; i+2 < len(p); i += 3 {
		fmt.Fprintf(&d, " C%s,%s %s,%s %s,%s", num(p[i][0]), num(p[i][1]), num(p[i+1][0]), num(p[i+1][1]), num(p[i+2][0]), num(p[i+2][1]))
	}
	last := p[len(p)-1]
	fmt.Fprintf(&d, " L%s,%s", num(s.head[0]), num(s.head[1]))
	dash := ""
	if s.color == unsolvedColor {
		dash = ` stroke-dasharray="5,3"`
	}
	w.printf(`<path class="stream" data-stream="%s" d="%s" fill="none" stroke="%s" stroke-width="1.8"%s/>`+"\n",
		esc(m.Streams[s.idx].Name), d.String(), s.color, dash)
	// The arrowhead: a filled triangle from the last control point's direction to the tip.
	dx, dy := s.head[0]-last[0], s.head[1]-last[1]
	if math.Hypot(dx, dy) < 1e-6 {
		q := p[len(p)-2]
		dx, dy = s.head[0]-q[0], s.head[1]-q[1]
	}
	l := math.Hypot(dx, dy)
	if l < 1e-6 {
		return
	}
	ux, uy := dx/l, dy/l
	const al, aw = 9.0, 3.6
	bx, by := s.head[0]-al*ux, s.head[1]-al*uy
	w.printf(`<polygon class="arrowhead" points="%s,%s %s,%s %s,%s" fill="%s"/>`+"\n",
		num(s.head[0]), num(s.head[1]), num(bx-aw*uy), num(by+aw*ux), num(bx+aw*uy), num(by-aw*ux), s.color)
}

// fsTag writes a stream's tag: its name in bold, the values under it in a small framed box.
func fsTag(w *svgWriter, s *fsStream) {
	x0, y0 := s.label[0]-s.tw/2, s.label[1]-s.th/2
	if len(s.tag) > 1 {
		w.printf(`<rect class="tag-box" x="%s" y="%s" width="%s" height="%s" fill="#fff" stroke="%s" stroke-width="0.8"/>`+"\n",
			num(x0), num(y0), num(s.tw), num(s.th), s.color)
	}
	y := y0 + 2 + 0.8*fsFont
	w.printf(`<text x="%s" y="%s" text-anchor="middle" class="f-tag" data-stream="%s" stroke="#fff" stroke-width="3" paint-order="stroke">%s</text>`+"\n",
		num(s.label[0]), num(y), esc(s.tag[0]), esc(s.tag[0]))
	y += 2
	for _, line := range s.tag[1:] {
		y += fsFontValues + 2
		w.printf(`<text x="%s" y="%s" text-anchor="middle" class="f-val">%s</text>`+"\n", num(s.label[0]), num(y-2), esc(line))
	}
}

func fsLegendBand(w *svgWriter, width, height float64) {
	y := height - fsLegend/2 + 4
	x := fsMargin
	for _, it := range []struct{ color, text string }{
		{"#1f5fa8", "water"}, {"#7b3f9e", "wet steam"}, {"#b3261e", "steam"}, {unsolvedColor, "not solved"},
	} {
		dash := ""
		if it.color == unsolvedColor {
			dash = ` stroke-dasharray="5,3"`
		}
		w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="1.8"%s/>`+"\n", num(x), num(y-4), num(x+24), num(y-4), it.color, dash)
		w.text(x+30, y, "start", "f-lg", it.text)
		x += 30 + textWidth(it.text, fsFont-1, false) + 22
	}
	w.printf(`<circle cx="%s" cy="%s" r="3.5" fill="#fff" stroke="%s" stroke-width="1.4"/>`+"\n", num(x+4), num(y-4), fsStroke)
	w.text(x+14, y, "start", "f-lg", "battery limit")
	_ = width
}

// The symbols. Each draws within its box centred on (x, y).

func symAttrs() string {
	return `fill="#fff" stroke="` + fsStroke + `" stroke-width="1.6" stroke-linejoin="round"`
}

// drawPump: a circle with the outlet drawn tangent at the top, the usual sign of a centrifugal
// pump.
func drawPump(w *svgWriter, x, y, wd, ht float64) {
	r := wd / 2
	w.printf(`<circle cx="%s" cy="%s" r="%s" %s/>`+"\n", num(x), num(y), num(r), symAttrs())
	w.printf(`<polyline points="%s,%s %s,%s %s,%s" fill="none" stroke="%s" stroke-width="1.4"/>`+"\n",
		num(x-r*0.7), num(y-r*0.7), num(x+r), num(y), num(x-r*0.7), num(y+r*0.7), fsStroke)
}

// drawTurbine: a trapezium widening from inlet to exhaust.
func drawTurbine(w *svgWriter, x, y, wd, ht float64) {
	x0, x1 := x-wd/2, x+wd/2
	w.printf(`<polygon points="%s,%s %s,%s %s,%s %s,%s" %s/>`+"\n",
		num(x0), num(y-ht*0.25), num(x1), num(y-ht/2), num(x1), num(y+ht/2), num(x0), num(y+ht*0.25), symAttrs())
}

// drawValve: two triangles meeting at their tips.
func drawValve(w *svgWriter, x, y, wd, ht float64) {
	x0, x1, y0, y1 := x-wd/2, x+wd/2, y-ht/2, y+ht/2
	w.printf(`<polygon points="%s,%s %s,%s %s,%s %s,%s %s,%s %s,%s" %s/>`+"\n",
		num(x0), num(y0), num(x), num(y), num(x1), num(y0), num(x1), num(y1), num(x), num(y), num(x0), num(y1), symAttrs())
}

// drawExchanger: a circle crossed by a zigzag, two streams apart.
func drawExchanger(w *svgWriter, x, y, wd, ht float64) {
	r := wd / 2
	w.printf(`<circle cx="%s" cy="%s" r="%s" %s/>`+"\n", num(x), num(y), num(r), symAttrs())
	w.printf(`<polyline points="%s,%s %s,%s %s,%s %s,%s %s,%s" fill="none" stroke="%s" stroke-width="1.4"/>`+"\n",
		num(x-r), num(y), num(x-r*0.45), num(y-r*0.45), num(x), num(y+r*0.45), num(x+r*0.45), num(y-r*0.45), num(x+r), num(y), fsStroke)
}

// drawHeater and drawCooler: the exchanger's circle with an arrow for the heat added or removed.
func drawHeater(w *svgWriter, x, y, wd, ht float64) { drawHeat(w, x, y, wd, true) }
func drawCooler(w *svgWriter, x, y, wd, ht float64) { drawHeat(w, x, y, wd, false) }

func drawHeat(w *svgWriter, x, y, wd float64, in bool) {
	r := wd / 2
	w.printf(`<circle cx="%s" cy="%s" r="%s" %s/>`+"\n", num(x), num(y), num(r), symAttrs())
	w.printf(`<polyline points="%s,%s %s,%s %s,%s %s,%s" fill="none" stroke="%s" stroke-width="1.4"/>`+"\n",
		num(x-r), num(y), num(x-r*0.4), num(y), num(x), num(y+r*0.45), num(x+r), num(y), fsStroke)
	tip, tail := y-r*0.75, y-r*0.1
	if !in {
		tip, tail = tail, tip
	}
	w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="1.4"/>`+"\n", num(x+r*0.25), num(tail), num(x+r*0.25), num(tip), fsStroke)
	dir := 1.0
	if !in {
		dir = -1
	}
	w.printf(`<polyline points="%s,%s %s,%s %s,%s" fill="none" stroke="%s" stroke-width="1.4"/>`+"\n",
		num(x+r*0.25-4), num(tip+4*dir), num(x+r*0.25), num(tip), num(x+r*0.25+4), num(tip+4*dir), fsStroke)
}

// drawBoiler: a furnace casing with the water-steam coil inside.
func drawBoiler(w *svgWriter, x, y, wd, ht float64) {
	x0, y0 := x-wd/2, y-ht/2
	w.printf(`<rect x="%s" y="%s" width="%s" height="%s" %s/>`+"\n", num(x0), num(y0), num(wd), num(ht), symAttrs())
	var pts []string
	for k := 0; k <= 6; k++ {
		px := x - wd*0.3
		if k%2 == 1 {
			px = x + wd*0.3
		}
		pts = append(pts, num(px)+","+num(y+ht*0.38-float64(k)*ht*0.76/6))
	}
	w.printf(`<polyline points="%s" fill="none" stroke="%s" stroke-width="1.3"/>`+"\n", strings.Join(pts, " "), fsStroke)
}

// drawVerticalVessel: a vessel with dished ends, standing (a flash tank or separator).
func drawVerticalVessel(w *svgWriter, x, y, wd, ht float64) {
	r := wd / 2
	w.printf(`<path d="M%s,%s A%s,%s 0 0 1 %s,%s L%s,%s A%s,%s 0 0 1 %s,%s Z" %s/>`+"\n",
		num(x-r), num(y-ht/2+r), num(r), num(r*0.8), num(x+r), num(y-ht/2+r), num(x+r), num(y+ht/2-r), num(r), num(r*0.8), num(x-r), num(y+ht/2-r), symAttrs())
	w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="1" stroke-dasharray="3,2"/>`+"\n", num(x-r), num(y+ht*0.1), num(x+r), num(y+ht*0.1), fsStroke)
}

// drawHorizontalVessel: a vessel with dished ends, lying (a mixing vessel, deaerator, open
// feedwater heater).
func drawHorizontalVessel(w *svgWriter, x, y, wd, ht float64) {
	r := ht / 2
	w.printf(`<path d="M%s,%s A%s,%s 0 0 0 %s,%s L%s,%s A%s,%s 0 0 0 %s,%s Z" %s/>`+"\n",
		num(x-wd/2+r), num(y-r), num(r*0.8), num(r), num(x-wd/2+r), num(y+r), num(x+wd/2-r), num(y+r), num(r*0.8), num(r), num(x+wd/2-r), num(y-r), symAttrs())
}

// drawTee: a junction dot.
func drawTee(w *svgWriter, x, y, wd, ht float64) {
	w.printf(`<circle cx="%s" cy="%s" r="%s" fill="%s"/>`+"\n", num(x), num(y), num(wd/2-1), fsStroke)
}

// drawDesuperheater: a pipe section with a spray nozzle from below.
func drawDesuperheater(w *svgWriter, x, y, wd, ht float64) {
	x0, y0 := x-wd/2, y-ht/2
	w.printf(`<rect x="%s" y="%s" width="%s" height="%s" %s/>`+"\n", num(x0), num(y0), num(wd), num(ht), symAttrs())
	w.printf(`<polygon points="%s,%s %s,%s %s,%s" fill="%s"/>`+"\n", num(x), num(y-ht*0.25), num(x-5), num(y+ht/2), num(x+5), num(y+ht/2), fsStroke)
	for _, dx := range []float64{-6, 0, 6} {
		w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="0.9"/>`+"\n", num(x), num(y-ht*0.25), num(x+dx), num(y0+2), fsStroke)
	}
}

func drawUnknown(w *svgWriter, x, y, wd, ht float64) {
	w.printf(`<rect x="%s" y="%s" width="%s" height="%s" %s stroke-dasharray="4,2"/>`+"\n", num(x-wd/2), num(y-ht/2), num(wd), num(ht), symAttrs())
	w.text(x, y+5, "middle", "f-unit", "?")
}
