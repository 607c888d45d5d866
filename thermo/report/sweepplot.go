package report

import (
	"fmt"
	"io"
	"math"

	"hmb/thermo/cases"
)

// Geometry of a sweep plot, SVG pixels: one panel per result, stacked, sharing the swept axis.
const (
	swW, swPanelH     = 960.0, 250.0
	swL, swR          = 96.0, 930.0
	swTop, swGap      = 56.0, 84.0
	swMaxPanels       = 12
	swMarkerR         = 3.5
	swFailColor       = "#b00"
	swLineColor       = "#0072B2" // the first of the diagrams' palette
	swTitleSize       = 17.0
	swAxisTitleOffset = 50.0
)

// SweepPlot draws results of a sweep against the swept value as a standalone SVG document: one
// panel per result (picks index r.Refs; nil: every result recorded, up to twelve), each a line
// through the points that solved. A point that did not solve breaks the line and is marked with
// a red cross on the panel's floor, its reason in the cross's tooltip.
func SweepPlot(w io.Writer, r *cases.SweepResult, picks []int) error {
	if r == nil || len(r.Points) == 0 {
		return fmt.Errorf("nothing to plot: the sweep has no points")
	}
	if picks == nil {
		for k := range r.Refs {
			picks = append(picks, k)
		}
	}
	if len(picks) > swMaxPanels {
		return fmt.Errorf("%d results are more than a plot shows (%d): pick them with --result", len(picks), swMaxPanels)
	}
	if len(picks) == 0 {
		return fmt.Errorf("nothing to plot: the sweep records no results")
	}
	q := newQuantities(r.Model)
	name, xu := r.Axis()
	xs := make([]float64, len(r.Points))
	for i, p := range r.Points {
		xs[i] = xu.FromSI(p.Value, q.atm)
	}
	var x axis
	x.p0, x.p1 = swL, swR
	lo, hi := minMax(xs)
	x.fit(lo, hi)
	x.title = name + " (" + printSymbol(xu) + ")"
	height := swTop + float64(len(picks))*(swPanelH+swGap)
	var s svgWriter
	s.printf(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %s %s" width="%s" height="%s" font-family="DejaVu Sans, Arial, sans-serif">`+"\n",
		num(swW), num(height), num(swW), num(height))
	s.printf(`<style>.d-t{font-size:%spx}.d-ax{font-size:%spx}.d-title{font-size:%spx;font-weight:bold}</style>`+"\n",
		num(fontTick), num(fontLabel), num(swTitleSize))
	s.printf(`<rect width="100%%" height="100%%" fill="#fff"/>` + "\n")
	title := "sweep " + r.Sweep.Name
	if r.Sweep.Label != "" {
		title += ": " + r.Sweep.Label
	}
	s.text(swL, 30, "start", "d-title", title)
	for n, k := range picks {
		if k < 0 || k >= len(r.Refs) {
			return fmt.Errorf("no result %d in the sweep", k)
		}
		top := swTop + float64(n)*(swPanelH+swGap)
		sweepPanel(&s, r, k, xs, x, top, q)
	}
	s.printf("</svg>\n")
	_, err := io.WriteString(w, s.String())
	return err
}

func sweepPanel(s *svgWriter, r *cases.SweepResult, k int, xs []float64, x axis, top float64, q quantities) {
	ref := r.Refs[k]
	spec := r.Model.Result(ref.Subject, ref.Name)
	bottom := top + swPanelH
	var y axis
	y.p0, y.p1 = bottom, top
	y.title = cases.RefName(r.Model, ref)
	ys := make([]float64, len(r.Points))
	for i, p := range r.Points {
		ys[i] = math.NaN()
		if spec != nil && !p.Failed {
			ys[i] = q.conv(spec.Dim, p.Values[k])
		}
	}
	if spec != nil {
		if sym := printSymbol(q.unit(spec.Dim)); sym != "" {
			y.title += " (" + sym + ")"
		}
	}
	lo, hi := minMax(ys)
	if math.IsNaN(lo) {
		lo, hi = 0, 1
	}
	if hi-lo < 1e-9*math.Max(math.Abs(lo), 1) { // a flat line sits mid-panel
		d := math.Max(math.Abs(lo)*0.01, 0.5)
		lo, hi = lo-d, hi+d
	}
	y.fit(lo, hi)
	s.printf(`<g class="panel" id="panel-%d">`+"\n", k)
	s.printf(`<g stroke="#ddd" stroke-width="1">` + "\n")
	for _, v := range x.ticks() {
		s.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(x.px(v)), num(top), num(x.px(v)), num(bottom))
	}
	for _, v := range y.ticks() {
		s.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(swL), num(y.px(v)), num(swR), num(y.px(v)))
	}
	s.printf("</g>\n")
	s.printf(`<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="#000"/>`+"\n", num(swL), num(top), num(swR-swL), num(swPanelH))
	for _, v := range x.ticks() {
		s.printf(`<g class="tick-x" transform="translate(%s,%s)"><line x1="0" y1="0" x2="0" y2="6" stroke="#000"/><text x="0" y="22" text-anchor="middle" class="d-t">%s</text></g>`+"\n",
			num(x.px(v)), num(bottom), tickText(v))
	}
	for _, v := range y.ticks() {
		s.printf(`<g class="tick-y" transform="translate(%s,%s)"><line x1="-6" y1="0" x2="0" y2="0" stroke="#000"/><text x="-9" y="5" text-anchor="end" class="d-t">%s</text></g>`+"\n",
			num(swL), num(y.px(v)), tickText(v))
	}
	s.text((swL+swR)/2, bottom+44, "middle", "d-ax", x.title)
	s.printf(`<text x="0" y="0" text-anchor="middle" class="d-ax" transform="translate(24,%s) rotate(-90)">%s</text>`+"\n", num((top+bottom)/2), esc(y.title))
	pts := make([][2]float64, len(xs))
	for i := range xs {
		pts[i] = [2]float64{x.px(xs[i]), math.NaN()}
		if !math.IsNaN(ys[i]) {
			pts[i][1] = y.px(ys[i])
		}
	}
	s.polylines(pts, `fill="none" stroke="`+swLineColor+`" stroke-width="2"`)
	for i, p := range pts {
		pt := r.Points[i]
		switch {
		case pt.Failed:
			cx, cy := p[0], bottom-8
			s.printf(`<g class="failed"><title>%s: %s (%s)</title><path d="M%s %sL%s %sM%s %sL%s %s" stroke="%s" stroke-width="2"/></g>`+"\n",
				esc(r.Show(pt.Value)), esc(pt.Reason), esc(pt.Code), num(cx-4), num(cy-4), num(cx+4), num(cy+4), num(cx-4), num(cy+4), num(cx+4), num(cy-4), swFailColor)
		case !math.IsNaN(p[1]):
			s.printf(`<circle class="point" cx="%s" cy="%s" r="%s" fill="%s"/>`+"\n", num(p[0]), num(p[1]), num(swMarkerR), swLineColor)
		}
	}
	s.printf("</g>\n")
}

// minMax is the least and greatest finite value, NaN when there is none.
func minMax(v []float64) (lo, hi float64) {
	lo, hi = math.NaN(), math.NaN()
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		if math.IsNaN(lo) || x < lo {
			lo = x
		}
		if math.IsNaN(hi) || x > hi {
			hi = x
		}
	}
	return lo, hi
}
