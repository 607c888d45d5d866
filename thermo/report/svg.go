package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// svgWriter accumulates SVG markup.
type svgWriter struct{ strings.Builder }

func num(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	if s == "-0" {
		s = "0"
	}
	return s
}

func (w *svgWriter) printf(format string, a ...any) { fmt.Fprintf(w, format, a...) }

// text writes a text element; anchor is start, middle or end.
func (w *svgWriter) text(x, y float64, anchor, class, s string) {
	w.printf(`<text x="%s" y="%s" text-anchor="%s" class="%s">%s</text>`+"\n", num(x), num(y), anchor, class, esc(s))
}

// polylines writes one polyline per unbroken run of points (NaN breaks a run).
func (w *svgWriter) polylines(pts [][2]float64, attrs string) {
	var run []string
	flush := func() {
		if len(run) >= 2 {
			w.printf(`<polyline %s points="%s"/>`+"\n", attrs, strings.Join(run, " "))
		}
		run = run[:0]
	}
	for _, p := range pts {
		if math.IsNaN(p[0]) || math.IsNaN(p[1]) || math.IsInf(p[0], 0) || math.IsInf(p[1], 0) {
			flush()
			continue
		}
		run = append(run, num(p[0])+","+num(p[1]))
	}
	flush()
}

// rect is a box in pixels, y downwards.
type rect struct{ x0, y0, x1, y1 float64 }

func (r rect) overlap(o rect) float64 {
	w := math.Min(r.x1, o.x1) - math.Max(r.x0, o.x0)
	h := math.Min(r.y1, o.y1) - math.Max(r.y0, o.y0)
	if w <= 0 || h <= 0 {
		return 0
	}
	return w * h
}

func (r rect) within(o rect) bool {
	return r.x0 >= o.x0 && r.x1 <= o.x1 && r.y0 >= o.y0 && r.y1 <= o.y1
}

// layout keeps labels off each other, off the points and, where it can, off the lines.
type layout struct {
	area  rect
	solid []rect // labels and markers: a label must not cover them
	faint []rect // samples of drawn lines: better avoided
}

// textBox estimates the box of a label of n runes: DejaVu Sans averages about 0.6 em a glyph.
func textBox(x, y float64, anchor string, n int, size float64) rect {
	w := 0.6 * size * float64(n)
	x0 := x
	switch anchor {
	case "middle":
		x0 = x - w/2
	case "end":
		x0 = x - w
	}
	return rect{x0, y - 0.8*size, x0 + w, y + 0.25*size}
}

// place picks the first least-covered position for a label beside (px, py) and claims it. It
// returns the text position and anchor, and whether the label sits far enough away to want a
// leader line.
func (l *layout) place(px, py float64, n int, size float64) (x, y float64, anchor string, far bool) {
	type cand struct {
		dx, dy float64
		anchor string
	}
	base := []cand{{1, 0.35, "start"}, {1, -0.8, "start"}, {1, 1.4, "start"}, {-1, 0.35, "end"},
		{0, -1.2, "middle"}, {0, 2, "middle"}, {-1, -0.8, "end"}, {-1, 1.4, "end"}}
	best, bestCost := -1, math.Inf(1)
	var bx, by float64
	var ba string
	for ring := 1; ring <= 3; ring++ {
		d := 8.0 * float64(ring) * float64(ring)
		for i, c := range base {
			x := px + c.dx*d
			y := py + c.dy*size*0.6*float64(ring)
			if c.dx == 0 {
				y = py + c.dy*(size*0.6+d)
			}
			r := textBox(x, y, c.anchor, n, size)
			cost := float64(ring-1) * 40
			if !r.within(l.area) {
				cost += 1e6
			}
			for _, o := range l.solid {
				cost += 20 * r.overlap(o)
			}
			for _, o := range l.faint {
				cost += r.overlap(o)
			}
			if cost < bestCost {
				best, bestCost, bx, by, ba = ring*10+i, cost, x, y, c.anchor
			}
		}
		if bestCost == 0 {
			break
		}
	}
	l.solid = append(l.solid, textBox(bx, by, ba, n, size))
	return bx, by, ba, best >= 20
}

// trace records the samples of a drawn line every few pixels.
func (l *layout) trace(pts [][2]float64) {
	for i, p := range pts {
		if math.IsNaN(p[0]) || math.IsNaN(p[1]) {
			continue
		}
		l.faint = append(l.faint, rect{p[0] - 1.5, p[1] - 1.5, p[0] + 1.5, p[1] + 1.5})
		if i+1 < len(pts) {
			q := pts[i+1]
			if math.IsNaN(q[0]) || math.IsNaN(q[1]) {
				continue
			}
			steps := int(math.Hypot(q[0]-p[0], q[1]-p[1]) / 6)
			for k := 1; k < steps && k < 500; k++ {
				t := float64(k) / float64(steps)
				x, y := p[0]+t*(q[0]-p[0]), p[1]+t*(q[1]-p[1])
				l.faint = append(l.faint, rect{x - 1.5, y - 1.5, x + 1.5, y + 1.5})
			}
		}
	}
}
