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

// layout keeps labels off each other and off the markers (a hard rule), and off the drawn lines
// where it can (a cost).
type layout struct {
	area  rect
	solid []rect // labels and markers: a label never overlaps them
	faint grid   // samples of drawn lines: better avoided
}

// gridCell is the side of a cell of the line-sample index, in pixels.
const gridCell = 24.0

// grid indexes the samples of drawn lines by cell, so that a label's cost counts only the samples
// near it.
type grid struct{ cells map[[2]int][][2]float64 }

func (g *grid) add(x, y float64) {
	if g.cells == nil {
		g.cells = map[[2]int][][2]float64{}
	}
	k := [2]int{int(math.Floor(x / gridCell)), int(math.Floor(y / gridCell))}
	g.cells[k] = append(g.cells[k], [2]float64{x, y})
}

// count is the number of samples inside r.
func (g *grid) count(r rect) int {
	n := 0
	for i := int(math.Floor(r.x0 / gridCell)); i <= int(math.Floor(r.x1/gridCell)); i++ {
		for j := int(math.Floor(r.y0 / gridCell)); j <= int(math.Floor(r.y1/gridCell)); j++ {
			for _, p := range g.cells[[2]int{i, j}] {
				if p[0] >= r.x0 && p[0] <= r.x1 && p[1] >= r.y0 && p[1] <= r.y1 {
					n++
				}
			}
		}
	}
	return n
}

// textBox is the box of a label: the advance width of its text and the font's ascent and descent
// about the baseline (0.76 and 0.24 em in DejaVu Sans, rounded up).
func textBox(x, y float64, anchor, text string, size float64, bold bool) rect {
	w := textWidth(text, size, bold)
	x0 := x
	switch anchor {
	case "middle":
		x0 = x - w/2
	case "end":
		x0 = x - w
	}
	return rect{x0, y - 0.78*size, x0 + w, y + 0.26*size}
}

// labelGap is the clear space kept around every label, in pixels; the white halo under the text
// takes 1.5 of it.
const labelGap = 2.0

// place finds a spot for a label beside the point (px, py): the nearest position, on rings of
// growing radius in sixteen directions, whose box lies inside the area and overlaps no other
// label or marker, crossing as few drawn lines as it can. It claims the box and returns the text
// position and anchor; ok is false when no ring within maxRing has room.
func (l *layout) place(px, py float64, text string, size float64, bold bool, maxRing int) (x, y float64, anchor string, dist float64, ok bool) {
	w := textWidth(text, size, bold)
	h := 1.04 * size
	bestCost := math.Inf(1)
	var best rect
	for ring := 0; ring <= maxRing; ring++ {
		d := 7 + 10*float64(ring)
		for k := 0; k < 16; k++ {
			th := float64(k) * math.Pi / 8
			c, s := math.Cos(th), math.Sin(th)
			// The box touches the circle of radius d at the direction's point: beside the point
			// for a horizontal direction, above or below it for a vertical one.
			cx := px + d*c + sign(c, 0.3)*w/2
			cy := py + d*s + sign(s, 0.3)*h/2
			r := rect{cx - w/2, cy - h/2, cx + w/2, cy + h/2}
			if !r.within(l.area) {
				continue
			}
			g := r.grow(labelGap)
			free := true
			for _, o := range l.solid {
				if g.overlap(o) > 0 {
					free = false
					break
				}
			}
			if !free {
				continue
			}
			cost := d + 6*float64(l.faint.count(r))
			if cost < bestCost {
				bestCost, best, dist = cost, r, d
			}
		}
		// A free spot this close beats anything further out but for the lines it crosses:
		// look one ring further, then stop.
		if !math.IsInf(bestCost, 1) && bestCost < d+10 {
			break
		}
	}
	if math.IsInf(bestCost, 1) {
		return 0, 0, "", 0, false
	}
	l.solid = append(l.solid, best)
	// The text starts at the box's left edge, its baseline 0.78 em below the top.
	return best.x0, best.y0 + 0.78*size, "start", dist, true
}

func sign(v, dead float64) float64 {
	switch {
	case v > dead:
		return 1
	case v < -dead:
		return -1
	}
	return 0
}

func (r rect) grow(d float64) rect { return rect{r.x0 - d, r.y0 - d, r.x1 + d, r.y1 + d} }

// nearest is the point of r nearest to p.
func (r rect) nearest(p [2]float64) [2]float64 {
	return [2]float64{math.Max(r.x0, math.Min(r.x1, p[0])), math.Max(r.y0, math.Min(r.y1, p[1]))}
}

// trace records the samples of a drawn line every few pixels.
func (l *layout) trace(pts [][2]float64) {
	for i, p := range pts {
		if math.IsNaN(p[0]) || math.IsNaN(p[1]) {
			continue
		}
		l.faint.add(p[0], p[1])
		if i+1 < len(pts) {
			q := pts[i+1]
			if math.IsNaN(q[0]) || math.IsNaN(q[1]) {
				continue
			}
			steps := int(math.Hypot(q[0]-p[0], q[1]-p[1]) / 4)
			for k := 1; k < steps && k < 1000; k++ {
				t := float64(k) / float64(steps)
				l.faint.add(p[0]+t*(q[0]-p[0]), p[1]+t*(q[1]-p[1]))
			}
		}
	}
}
