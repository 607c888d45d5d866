package report

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Kind is a property diagram: which two properties span the plane.
type Kind uint8

const (
	TS        Kind = iota // temperature over specific entropy
	HS                    // specific enthalpy over specific entropy
	PH                    // pressure (by decades) over specific enthalpy
	Flowsheet             // not a property diagram: the heat and material balance diagram
)

var kindNames = [...]string{TS: "Ts", HS: "hs", PH: "ph", Flowsheet: "flowsheet"}

func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return fmt.Sprintf("Kind(%d)", uint8(k))
}

// ParseKind reads "Ts", "hs", "ph" or "flowsheet" in any letter case.
func ParseKind(s string) (Kind, error) {
	for k, n := range kindNames {
		if strings.EqualFold(s, n) {
			return Kind(k), nil
		}
	}
	return 0, fmt.Errorf("unknown diagram kind %q: use Ts, hs, ph or flowsheet", s)
}

// PlotOptions choose a diagram. ID prefixes the element ids, so that several diagrams can share
// one page; it defaults to the kind's name in lower case.
type PlotOptions struct {
	Kind Kind
	ID   string
	// FullDome spans the axes over the whole saturation dome as well as the streams. By default
	// the axes fit what the file draws: the streams, the units' paths between them and the
	// isentropic ends, so that a low-pressure system fills the plot.
	FullDome bool
	// Values adds each stream's flow, pressure and temperature under its tag on the flowsheet.
	Values bool
}

// Critical point of water, IAPWS R7-97(2012), Eqs. 2 and 3 (Tc = 647.096 K, pc = 22.064 MPa);
// the triple-point temperature 273.16 K is the lower end of the saturation line, Eq. 30.
const (
	tCrit   = 647.096
	tTriple = 273.16
)

// Page geometry in SVG pixels. At 960 px across an A4 page (180 mm printable), a 14 px label
// prints at about 7.5 pt.
const (
	svgW, svgH       = 960.0, 680.0
	plotL, plotR     = 86.0, 712.0
	plotT, plotB     = 58.0, 598.0
	legendX          = 732.0
	fontTick         = 14.0
	fontLabel        = 15.0
	fontSmall        = 13.0
	maxIsolines      = 6
	samplesPerCurve  = 240
	samplesPerBranch = 160
)

// palette tells units apart: Okabe and Ito's colour-blind-safe set without its yellow (too pale on
// white) and its black (the saturation line's colour), then a brown and a purple.
var palette = []string{"#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#8C564B", "#6A3D9A"}

// Colours of the diagram's fixed lines; no unit is drawn in them.
const (
	domeColor    = "#000"
	isolineColor = "#888"
)

type diagram struct {
	kind   Kind
	full   bool
	id     string
	q      quantities
	m      *model.Model
	in     *Input
	x, y   axis
	dome   []if97.State
	crit   if97.State
	states []*if97.State // per stream, nil when unsolved
	lay    layout
	w      svgWriter
}

// Plot writes a property diagram of a solved file as a standalone SVG document.
func Plot(w io.Writer, in *Input, opt PlotOptions) error {
	s, err := PlotString(in, opt)
	if err != nil {
		return err
	}
	_, err = io.WriteString(w, s)
	return err
}

// PlotString is Plot into a string, for pages that inline the diagram.
func PlotString(in *Input, opt PlotOptions) (string, error) {
	if in == nil || in.Model == nil {
		return "", fmt.Errorf("nothing to plot: the file could not be read into a model")
	}
	if int(opt.Kind) >= len(kindNames) {
		return "", fmt.Errorf("unknown diagram kind %d", opt.Kind)
	}
	if opt.Kind == Flowsheet {
		return flowsheetSVG(in, opt)
	}
	d := &diagram{kind: opt.Kind, id: opt.ID, full: opt.FullDome, q: newQuantities(in.Model), m: in.Model, in: in}
	if d.id == "" {
		d.id = strings.ToLower(opt.Kind.String())
	}
	if err := d.build(); err != nil {
		return "", err
	}
	return d.w.String(), nil
}

// coords places a state in the plane, in display units.
func (d *diagram) coords(st *if97.State) (x, y float64) {
	s := d.q.conv(units.SpecificEntropy, st.S)
	h := d.q.conv(units.SpecificEnergy, st.H)
	switch d.kind {
	case TS:
		return s, d.q.conv(units.Temperature, st.T)
	case HS:
		return s, h
	}
	return h, d.q.conv(units.Pressure, st.P)
}

func (d *diagram) px(st *if97.State) [2]float64 {
	x, y := d.coords(st)
	if d.y.log && !(y > 0) {
		return [2]float64{math.NaN(), math.NaN()}
	}
	return [2]float64{d.x.px(x), d.y.px(y)}
}

func (d *diagram) inPlot(p [2]float64) bool {
	return p[0] >= plotL-0.5 && p[0] <= plotR+0.5 && p[1] >= plotT-0.5 && p[1] <= plotB+0.5
}

// saturationDome samples the saturated liquid line up to the critical point and the vapour line
// back down, by IAPWS-IF97 region 4 and the region 1, 2 and 3 equations at saturation. The
// temperatures crowd towards the critical point, where the dome turns sharply.
func saturationDome() (dome []if97.State, crit if97.State, err error) {
	n := samplesPerBranch
	liq := make([]if97.State, 0, n+1)
	vap := make([]if97.State, 0, n+1)
	for i := 0; i <= n; i++ {
		u := float64(i) / float64(n)
		T := tTriple + (tCrit-tTriple)*(1-(1-u)*(1-u)*(1-u))
		if i == n {
			T = tCrit
		}
		l, v, err := if97.SatPairT(T)
		if err != nil {
			continue
		}
		liq = append(liq, l)
		vap = append(vap, v)
	}
	if len(liq) < 2 {
		return nil, crit, fmt.Errorf("saturation line could not be computed")
	}
	crit = liq[len(liq)-1]
	dome = append(dome, liq...)
	for i := len(vap) - 2; i >= 0; i-- {
		dome = append(dome, vap[i])
	}
	return dome, crit, nil
}

func (d *diagram) build() error {
	var err error
	d.dome, d.crit, err = saturationDome()
	if err != nil {
		return err
	}
	d.states = make([]*if97.State, len(d.m.Streams))
	if d.in.Result != nil {
		for i := range d.m.Streams {
			if i < len(d.in.Result.Streams) && d.in.Result.Streams[i].HasState {
				st := d.in.Result.Streams[i].State
				d.states[i] = &st
			}
		}
	}
	refs := d.isentropicEnds()
	paths := d.unitLines()
	d.setAxes(refs, paths)
	d.lay.area = rect{plotL, plotT, plotR, plotB}

	w := &d.w
	w.printf(`<svg xmlns="http://www.w3.org/2000/svg" width="%s" height="%s" viewBox="0 0 %s %s" font-family="DejaVu Sans, Arial, Helvetica, sans-serif" id="%s">`+"\n",
		num(svgW), num(svgH), num(svgW), num(svgH), esc(d.id))
	title := fmt.Sprintf("%s: %s diagram", Title(d.m, d.in.Path), d.kind)
	w.printf("<title>%s</title>\n", esc(title))
	w.printf(`<style>.d-t{font-size:%spx;fill:#222}.d-tl{font-size:%spx;font-weight:bold;fill:#000}.d-ax{font-size:%spx;fill:#000}.d-sm{font-size:%spx;fill:#555}.d-hd{font-size:18px;font-weight:bold}.d-lg{font-size:%spx;fill:#222}</style>`+"\n",
		num(fontTick), num(fontLabel), num(fontLabel+1), num(fontSmall), num(fontSmall))
	w.printf(`<rect x="0" y="0" width="%s" height="%s" fill="#fff"/>`+"\n", num(svgW), num(svgH))
	w.printf(`<defs><clipPath id="%s-clip"><rect x="%s" y="%s" width="%s" height="%s"/></clipPath></defs>`+"\n",
		esc(d.id), num(plotL), num(plotT), num(plotR-plotL), num(plotB-plotT))
	w.text(plotL, 32, "start", "d-hd", title)
	d.drawAxes()

	w.printf(`<g clip-path="url(#%s-clip)">`+"\n", esc(d.id))
	isoLabels := d.drawIsolines()
	qualLabels := d.drawQualityLines()
	dome := make([][2]float64, len(d.dome))
	for i := range d.dome {
		dome[i] = d.px(&d.dome[i])
	}
	w.polylines(dome, fmt.Sprintf(`id="%s-dome" fill="none" stroke="%s" stroke-width="2"`, esc(d.id), domeColor))
	d.lay.trace(dome)
	units := d.drawUnits(refs, paths)
	w.printf("</g>\n")

	// Markers first, then labels, most important first: streams, the critical point, the
	// isolines, the quality lines. A label that finds no free spot is left out rather than
	// drawn over another; stream labels search furthest.
	cp := d.px(&d.crit)
	critIn := d.inPlot(cp)
	if critIn {
		w.printf(`<circle id="%s-critical" cx="%s" cy="%s" r="5" fill="#fff" stroke="%s" stroke-width="2"/>`+"\n", esc(d.id), num(cp[0]), num(cp[1]), domeColor)
		d.lay.solid = append(d.lay.solid, rect{cp[0] - 6, cp[1] - 6, cp[0] + 6, cp[1] + 6})
	}
	d.drawStreams()
	if critIn {
		d.label(cp, "critical point", "d-sm", fontSmall, false, 4)
	}
	for _, l := range isoLabels {
		d.label(l.at, l.text, "d-sm", fontSmall, false, 12)
	}
	for _, l := range qualLabels {
		d.label(l.at, l.text, "d-sm", fontSmall, false, 3)
	}
	w.printf(`<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="#000" stroke-width="1.2"/>`+"\n",
		num(plotL), num(plotT), num(plotR-plotL), num(plotB-plotT))
	d.drawLegend(units, critIn, len(qualLabels) > 0)
	w.printf("</svg>\n")
	return nil
}

// isoRef is an isentropic end state: what a turbine or pump outlet would be at the outlet
// pressure with the inlet's entropy.
type isoRef struct {
	unit     int
	from, to int // streams
	end      if97.State
}

func (d *diagram) isentropicEnds() []isoRef {
	var out []isoRef
	for ui, u := range d.m.Units {
		if u == nil || u.Kind == nil || (u.Kind.Name != "turbine" && u.Kind.Name != "pump") {
			continue
		}
		for _, pr := range unitPaths(u) {
			a, b := d.stateOf(pr[0]), d.stateOf(pr[1])
			if a == nil || b == nil {
				continue
			}
			// Isentropic outlet: the state at the outlet pressure with the inlet entropy.
			end, err := if97.PS(b.P, a.S)
			if err != nil {
				continue
			}
			out = append(out, isoRef{unit: ui, from: pr[0], to: pr[1], end: end})
		}
	}
	return out
}

func (d *diagram) stateOf(i int) *if97.State {
	if i < 0 || i >= len(d.states) {
		return nil
	}
	return d.states[i]
}

// setAxes spans what the diagram draws (or the whole dome too, when asked or when nothing is
// solved) and rounds outwards.
func (d *diagram) setAxes(refs []isoRef, paths []unitPath) {
	type box struct{ xlo, xhi, ylo, yhi float64 }
	empty := func() box { return box{math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)} }
	add := func(b *box, st *if97.State) {
		x, y := d.coords(st)
		if math.IsNaN(x) || math.IsNaN(y) || (d.kind == PH && !(y > 0)) {
			return
		}
		b.xlo, b.xhi, b.ylo, b.yhi = math.Min(b.xlo, x), math.Max(b.xhi, x), math.Min(b.ylo, y), math.Max(b.yhi, y)
	}
	dome, data := empty(), empty()
	for i := range d.dome {
		add(&dome, &d.dome[i])
	}
	for _, st := range d.states {
		if st != nil {
			add(&data, st)
		}
	}
	for i := range refs {
		add(&data, &refs[i].end)
	}
	for _, p := range paths {
		for i := range p.states {
			add(&data, &p.states[i])
		}
	}
	b := data
	if d.full || math.IsInf(data.xlo, 1) {
		b = dome
		if !math.IsInf(data.xlo, 1) {
			b = box{math.Min(b.xlo, data.xlo), math.Max(b.xhi, data.xhi), math.Min(b.ylo, data.ylo), math.Max(b.yhi, data.yhi)}
		}
	} else {
		// Never zoom in so far that a lone state or a short path fills the plot: each axis
		// spans at least a tenth of the dome's (a decade of pressure), centred on the data.
		widen := func(lo, hi, min float64) (float64, float64) {
			if hi-lo >= min {
				return lo, hi
			}
			c := (lo + hi) / 2
			return c - min/2, c + min/2
		}
		b.xlo, b.xhi = widen(b.xlo, b.xhi, 0.1*(dome.xhi-dome.xlo))
		if d.kind == PH {
			l, h := widen(math.Log10(b.ylo), math.Log10(b.yhi), 1)
			b.ylo, b.yhi = math.Pow(10, l), math.Pow(10, h)
		} else {
			b.ylo, b.yhi = widen(b.ylo, b.yhi, 0.1*(dome.yhi-dome.ylo))
		}
	}
	pad := func(lo, hi float64) (float64, float64) {
		m := 0.06 * (hi - lo)
		nlo := lo - m
		// The saturated liquid's entropy at the triple point is zero but for rounding (-6e-5
		// J/(kg K) in IF97); do not let that open a whole negative tick.
		if lo >= -1e-4*(hi-lo) && nlo < 0 {
			nlo = 0
		}
		return nlo, hi + m
	}
	q := d.q
	sU, tU, hU, pU := q.unit(units.SpecificEntropy), q.unit(units.Temperature), q.unit(units.SpecificEnergy), q.unit(units.Pressure)
	d.x = axis{p0: plotL, p1: plotR}
	d.y = axis{p0: plotB, p1: plotT}
	switch d.kind {
	case TS:
		d.x.title = "specific entropy s (" + sU.Symbol() + ")"
		d.y.title = "temperature T (" + printSymbol(tU) + ")"
	case HS:
		d.x.title = "specific entropy s (" + sU.Symbol() + ")"
		d.y.title = "specific enthalpy h (" + hU.Symbol() + ")"
	case PH:
		d.x.title = "specific enthalpy h (" + hU.Symbol() + ")"
		d.y.title = "pressure p (" + pU.Symbol() + ", absolute)"
		d.y.log = true
	}
	lo, hi := pad(b.xlo, b.xhi)
	d.x.fit(lo, hi)
	if d.y.log {
		d.y.fit(b.ylo/1.3, b.yhi*1.3)
	} else {
		lo, hi = pad(b.ylo, b.yhi)
		d.y.fit(lo, hi)
	}
}

// printSymbol is a unit's symbol as a drawing prints it: degrees Celsius and Fahrenheit with
// the degree sign (ISO 80000-5 writes °C; the notation accepts the bare C for typing).
func printSymbol(u units.Unit) string {
	if u.Dim() == units.Temperature && (u.Symbol() == "C" || u.Symbol() == "F") {
		return "°" + u.Symbol()
	}
	return u.Symbol()
}

func (d *diagram) drawAxes() {
	w := &d.w
	w.printf(`<g id="%s-grid" stroke="#ddd" stroke-width="1">`+"\n", esc(d.id))
	xt, yt := d.x.ticks(), d.y.ticks()
	for _, v := range xt {
		p := d.x.px(v)
		w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(p), num(plotT), num(p), num(plotB))
	}
	for _, v := range yt {
		p := d.y.px(v)
		w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(plotL), num(p), num(plotR), num(p))
	}
	w.printf("</g>\n")
	// Each tick is a group translated to the tick's pixel, so a reader can recover the scale
	// from the SVG alone.
	for _, v := range xt {
		w.printf(`<g class="tick-x" transform="translate(%s,%s)"><line x1="0" y1="0" x2="0" y2="6" stroke="#000"/><text x="0" y="22" text-anchor="middle" class="d-t">%s</text></g>`+"\n",
			num(d.x.px(v)), num(plotB), tickText(v))
	}
	for _, v := range yt {
		w.printf(`<g class="tick-y" transform="translate(%s,%s)"><line x1="-6" y1="0" x2="0" y2="0" stroke="#000"/><text x="-9" y="5" text-anchor="end" class="d-t">%s</text></g>`+"\n",
			num(plotL), num(d.y.px(v)), tickText(v))
	}
	w.text((plotL+plotR)/2, plotB+50, "middle", "d-ax", d.x.title)
	cy := (plotT + plotB) / 2
	w.printf(`<text x="0" y="0" text-anchor="middle" class="d-ax" transform="translate(20,%s) rotate(-90)">%s</text>`+"\n", num(cy), esc(d.y.title))
}

type pendingLabel struct {
	at   [2]float64
	text string
}

// drawIsolines draws isobars (Ts, hs) or isotherms (ph) through the streams' own pressures or
// temperatures, so each stream sits on a labelled line.
func (d *diagram) drawIsolines() []pendingLabel {
	var vals []float64 // SI
	for _, st := range d.states {
		if st == nil {
			continue
		}
		v := st.P
		if d.kind == PH {
			v = st.T
		}
		dup := false
		for _, o := range vals {
			if (d.kind != PH && math.Abs(v/o-1) < 0.03) || (d.kind == PH && math.Abs(v-o) < 3) {
				dup = true
			}
		}
		if !dup {
			vals = append(vals, v)
		}
	}
	slices.Sort(vals)
	if len(vals) > maxIsolines {
		// Keep the ends and an even spread between them.
		keep := make([]float64, 0, maxIsolines)
		for k := 0; k < maxIsolines; k++ {
			keep = append(keep, vals[k*(len(vals)-1)/(maxIsolines-1)])
		}
		vals = keep
	}
	var labels []pendingLabel
	for _, v := range vals {
		var pts [][2]float64
		var text string
		if d.kind == PH {
			pts = d.isotherm(v)
			u := d.q.unit(units.Temperature)
			text = tickText(roundSig(u.FromSI(v, d.q.atm), 4)) + " " + printSymbol(u)
		} else {
			pts = d.isobar(v)
			u := d.q.unit(units.Pressure)
			text = tickText(roundSig(u.FromSI(v, d.q.atm), 4)) + " " + u.Symbol()
		}
		d.w.polylines(pts, `class="isoline" fill="none" stroke="`+isolineColor+`" stroke-width="1.2"`)
		d.lay.trace(pts)
		// Label the line where it leaves the plot: the hot or high-pressure end.
		for i := len(pts) - 1; i >= 0; i-- {
			if !math.IsNaN(pts[i][0]) && d.inPlot(pts[i]) {
				labels = append(labels, pendingLabel{pts[i], text})
				break
			}
		}
	}
	return labels
}

// isobar follows a pressure from the triple-point temperature to 800 C (the top of IF97 region
// 2), through the dome at the saturation temperature when below the critical pressure.
func (d *diagram) isobar(p float64) [][2]float64 {
	var pts [][2]float64
	ts, tsErr := if97.Tsat(p)
	sat := tsErr == nil
	tHi := 1073.15
	for i := 0; i <= samplesPerCurve; i++ {
		T := tTriple + (tHi-tTriple)*float64(i)/samplesPerCurve
		if sat && i > 0 {
			prev := tTriple + (tHi-tTriple)*float64(i-1)/samplesPerCurve
			if prev < ts && T >= ts {
				if l, v, err := if97.SatPair(p); err == nil {
					pts = append(pts, d.px(&l), d.px(&v))
				}
			}
		}
		if sat && math.Abs(T-ts) < 1e-6 {
			continue
		}
		st, err := if97.PT(p, T)
		if err != nil {
			pts = append(pts, [2]float64{math.NaN(), math.NaN()})
			continue
		}
		pts = append(pts, d.px(&st))
	}
	return pts
}

// isotherm follows a temperature from the top of the pressure axis down to its bottom, across
// the dome at the saturation pressure.
func (d *diagram) isotherm(T float64) [][2]float64 {
	pu := d.q.unit(units.Pressure)
	pHi := math.Min(pu.ToSI(d.y.hi, d.q.atm), 100e6)
	pLo := math.Max(pu.ToSI(d.y.lo, d.q.atm), 611.2)
	ps, psErr := if97.Psat(T)
	sat := psErr == nil
	var pts [][2]float64
	lr := math.Log(pHi / pLo)
	for i := 0; i <= samplesPerCurve; i++ {
		p := pHi * math.Exp(-lr*float64(i)/samplesPerCurve)
		if sat && i > 0 {
			prev := pHi * math.Exp(-lr*float64(i-1)/samplesPerCurve)
			if prev > ps && p <= ps {
				if l, v, err := if97.SatPairT(T); err == nil {
					pts = append(pts, d.px(&l), d.px(&v))
				}
			}
		}
		if sat && math.Abs(p/ps-1) < 1e-9 {
			continue
		}
		st, err := if97.PT(p, T)
		if err != nil {
			pts = append(pts, [2]float64{math.NaN(), math.NaN()})
			continue
		}
		pts = append(pts, d.px(&st))
	}
	// Labelled at the low-pressure end, where isotherms fan out.
	slices.Reverse(pts)
	return pts
}

// drawQualityLines draws lines of constant quality inside the dome.
func (d *diagram) drawQualityLines() []pendingLabel {
	var labels []pendingLabel
	for _, x := range []float64{0.2, 0.4, 0.6, 0.8} {
		var pts [][2]float64
		for i := 0; i <= samplesPerBranch; i++ {
			u := float64(i) / float64(samplesPerBranch)
			T := tTriple + (tCrit-0.01-tTriple)*(1-(1-u)*(1-u)*(1-u))
			st, err := if97.TX(T, x)
			if err != nil {
				continue
			}
			pts = append(pts, d.px(&st))
		}
		d.w.polylines(pts, `class="quality" fill="none" stroke="#999" stroke-width="1" stroke-dasharray="2,3"`)
		for _, p := range pts {
			if d.inPlot(p) {
				labels = append(labels, pendingLabel{p, fmt.Sprintf("x=%g", x)})
				break
			}
		}
	}
	return labels
}

// unitPaths pairs each inlet of a unit with the outlets it feeds: hot_in with hot_out, and any
// other inlet with every unpaired outlet.
func unitPaths(u *model.Unit) [][2]int {
	var ins, outs []model.Port
	for _, p := range u.Ports {
		spec := u.Kind.Port(p.Role)
		if spec == nil || p.Stream < 0 {
			continue
		}
		if spec.Inlet {
			ins = append(ins, p)
		} else {
			outs = append(outs, p)
		}
	}
	var out [][2]int
	paired := map[int]bool{}
	for _, in := range ins {
		if side, ok := strings.CutSuffix(in.Role, "_in"); ok {
			for k, o := range outs {
				if o.Role == side+"_out" {
					out = append(out, [2]int{in.Stream, o.Stream})
					paired[k] = true
				}
			}
		}
	}
	for _, in := range ins {
		if strings.HasSuffix(in.Role, "_in") {
			continue
		}
		for k, o := range outs {
			if !paired[k] {
				out = append(out, [2]int{in.Stream, o.Stream})
			}
		}
	}
	return out
}

// followsPath reports whether a unit's stream changes state along a path worth drawing: heat
// added or removed (nearly at constant pressure) or throttling (at constant enthalpy). Mixing,
// splitting and the machines are drawn as straight chords.
func followsPath(kind string) bool {
	switch kind {
	case "heater", "cooler", "boiler", "exchanger", "valve":
		return true
	}
	return false
}

type unitKey struct {
	name, label, kind, color string
	dashed                   bool
}

// unitPath is the line a unit draws between one inlet and one outlet, as states.
type unitPath struct {
	unit   int
	states []if97.State
}

// unitLines follows each unit from inlet to outlet: along the process for heat exchange and
// throttling, a straight chord otherwise.
func (d *diagram) unitLines() []unitPath {
	var out []unitPath
	for ui, u := range d.m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		for _, pr := range unitPaths(u) {
			a, b := d.stateOf(pr[0]), d.stateOf(pr[1])
			if a == nil || b == nil {
				continue
			}
			p := unitPath{unit: ui}
			if followsPath(u.Kind.Name) {
				// Linear in p and h between the ends: the isobar when there is no pressure drop,
				// the isenthalp of a valve.
				const n = 48
				for i := 0; i <= n; i++ {
					t := float64(i) / n
					st, err := if97.PH(a.P+t*(b.P-a.P), a.H+t*(b.H-a.H))
					if err != nil {
						continue
					}
					p.states = append(p.states, st)
				}
			} else {
				p.states = []if97.State{*a, *b}
			}
			out = append(out, p)
		}
	}
	return out
}

func (d *diagram) drawUnits(refs []isoRef, paths []unitPath) []unitKey {
	var keys []unitKey
	k := 0
	for ui, u := range d.m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		color := palette[k%len(palette)]
		drawn := false
		for _, p := range paths {
			if p.unit != ui {
				continue
			}
			pts := make([][2]float64, len(p.states))
			for i := range p.states {
				pts[i] = d.px(&p.states[i])
			}
			d.w.polylines(pts, fmt.Sprintf(`class="unit" data-unit="%s" fill="none" stroke="%s" stroke-width="2.5" stroke-linejoin="round"`, esc(u.Name), color))
			d.lay.trace(pts)
			drawn = true
		}
		dashed := false
		for _, r := range refs {
			if r.unit != ui {
				continue
			}
			a := d.stateOf(r.from)
			pts := [][2]float64{d.px(a), d.px(&r.end)}
			d.w.polylines(pts, fmt.Sprintf(`class="isentropic" data-unit="%s" fill="none" stroke="%s" stroke-width="1.6" stroke-dasharray="7,5"`, esc(u.Name), color))
			e := pts[1]
			d.w.printf(`<circle cx="%s" cy="%s" r="3.5" fill="#fff" stroke="%s" stroke-width="1.5"/>`+"\n", num(e[0]), num(e[1]), color)
			d.lay.trace(pts)
			d.lay.solid = append(d.lay.solid, rect{e[0] - 4, e[1] - 4, e[0] + 4, e[1] + 4})
			dashed = true
		}
		if drawn {
			keys = append(keys, unitKey{name: u.Name, label: u.Label, kind: u.Kind.Name, color: color, dashed: dashed})
			k++
		}
	}
	return keys
}

// drawStreams marks every solved stream; streams drawn on the same spot share one label.
func (d *diagram) drawStreams() {
	type group struct {
		at    [2]float64
		names []string
	}
	var groups []*group
	for i, st := range d.states {
		if st == nil || d.m.Streams[i] == nil {
			continue
		}
		p := d.px(st)
		if math.IsNaN(p[0]) || !d.inPlot(p) {
			continue
		}
		var g *group
		for _, o := range groups {
			if math.Hypot(o.at[0]-p[0], o.at[1]-p[1]) < 4 {
				g = o
			}
		}
		if g == nil {
			g = &group{at: p}
			groups = append(groups, g)
		}
		g.names = append(g.names, d.m.Streams[i].Name)
		d.w.printf(`<circle class="stream" data-stream="%s" cx="%s" cy="%s" r="5" fill="#1a1a1a"/>`+"\n", esc(d.m.Streams[i].Name), num(p[0]), num(p[1]))
		d.lay.solid = append(d.lay.solid, rect{p[0] - 6, p[1] - 6, p[0] + 6, p[1] + 6})
	}
	for _, g := range groups {
		text := strings.Join(g.names, ", ")
		if !d.label(g.at, text, "d-tl", fontLabel, true, 12) {
			d.label(g.at, text, "d-tl", fontLabel, true, 40)
		}
	}
}

// label places a text beside a point where it overlaps no other label or marker, with a leader
// line when it had to move away; it reports false, drawing nothing, when there is no room within
// maxRing rings of the point.
func (d *diagram) label(at [2]float64, text, class string, size float64, bold bool, maxRing int) bool {
	x, y, anchor, dist, ok := d.lay.place(at[0], at[1], text, size, bold, maxRing)
	if !ok {
		return false
	}
	if dist > 20 {
		box := textBox(x, y, anchor, text, size, bold)
		e := box.grow(1).nearest(at)
		d.w.printf(`<line class="leader" x1="%s" y1="%s" x2="%s" y2="%s" stroke="#666" stroke-width="0.8"/>`+"\n", num(at[0]), num(at[1]), num(e[0]), num(e[1]))
	}
	// A white halo keeps labels readable over lines.
	d.w.printf(`<text x="%s" y="%s" text-anchor="%s" class="%s" stroke="#fff" stroke-width="3" paint-order="stroke">%s</text>`+"\n",
		num(x), num(y), anchor, class, esc(text))
	return true
}

func (d *diagram) drawLegend(keys []unitKey, crit, quality bool) {
	w := &d.w
	y := plotT + 4
	line := func(attrs, text string) {
		w.printf(`<line x1="%s" y1="%s" x2="%s" y2="%s" %s/>`+"\n", num(legendX), num(y-4), num(legendX+30), num(y-4), attrs)
		w.text(legendX+38, y, "start", "d-lg", text)
		y += 21
	}
	w.text(legendX, y, "start", "d-ax", "Legend")
	y += 24
	line(`stroke="`+domeColor+`" stroke-width="2"`, "saturation line")
	if crit {
		w.printf(`<circle cx="%s" cy="%s" r="5" fill="#fff" stroke="%s" stroke-width="2"/>`+"\n", num(legendX+15), num(y-4), domeColor)
		w.text(legendX+38, y, "start", "d-lg", "critical point")
		y += 21
	}
	if d.kind == PH {
		line(`stroke="`+isolineColor+`" stroke-width="1.2"`, "isotherm (at streams)")
	} else {
		line(`stroke="`+isolineColor+`" stroke-width="1.2"`, "isobar (at streams)")
	}
	if quality {
		line(`stroke="#999" stroke-width="1" stroke-dasharray="2,3"`, "quality x")
	}
	w.printf(`<circle cx="%s" cy="%s" r="5" fill="#1a1a1a"/>`+"\n", num(legendX+15), num(y-4))
	w.text(legendX+38, y, "start", "d-lg", "stream")
	y += 21
	line(`stroke="#444" stroke-width="1.6" stroke-dasharray="7,5"`, "isentropic reference")
	y += 10
	if len(keys) > 0 {
		w.text(legendX, y, "start", "d-ax", "Units")
		y += 24
	}
	for i, k := range keys {
		if y > svgH-30 {
			w.text(legendX, y, "start", "d-lg", fmt.Sprintf("... and %d more", len(keys)-i))
			break
		}
		line(fmt.Sprintf(`class="legend-unit" data-unit="%s" stroke="%s" stroke-width="2.5"`, esc(k.name), k.color), k.name+" ("+k.kind+")")
		if k.label != "" {
			lbl := k.label
			if r := []rune(lbl); len(r) > 26 {
				lbl = string(r[:25]) + "…"
			}
			w.text(legendX+38, y-4, "start", "d-sm", lbl)
			y += 19
		}
	}
	if len(keys) == 0 {
		w.text(legendX, y, "start", "d-lg", "no solved units")
	}
}
