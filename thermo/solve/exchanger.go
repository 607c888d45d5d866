package solve

import (
	"fmt"
	"math"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Exchanger: two streams exchange heat without mixing (closed feedwater heater, condenser with
// its cooling water).
//
//	mass:     m_hot_in = m_hot_out,  m_cold_in = m_cold_out
//	energy:   m_hot (h_hot_in - h_hot_out) = duty + heat_loss
//	          m_cold (h_cold_out - h_cold_in) = duty
//	pressure: p_hot_out = p_hot_in - dp_hot,  p_cold_out = p_cold_in - dp_cold
//
// Entropy generation: S_gen = sum over both sides of m (s_out - s_in) + heat_loss / T_ambient;
// both sides lie inside the boundary, so the loss of passing heat across the temperature
// difference is counted.
//
// The second law along the whole unit (profile): the position along the unit is the share f of
// the heat passed, from the hot inlet end (f = 0) to the hot outlet end (f = 1). Each side's
// enthalpy and pressure change linearly in f (the heat loss taken as spread with the duty);
// counterflow (the default, arrangement counterflow) puts the cold outlet at f = 0, parallel
// flow puts the cold inlet there. Each side is split into zones where it changes phase (hot:
// desuperheating, condensing, subcooling; cold: preheating, boiling, superheating), at the f
// where its enthalpy meets the saturated vapour or liquid enthalpy at its local pressure. The
// hot side must be at least as warm as the cold side everywhere: every zone is sampled and the
// closest approach refined, so that a condensing hot side colder than the cold water inside
// the unit is found even when both ends look fine (HMB508). The zone-weighted LMTD follows:
// UA = sum over zones of Q_zone / LMTD_zone (each zone's LMTD from its end temperatures, the
// temperature taken as linear in the heat passed within a zone), LMTD = duty / UA.
func init() { ops["exchanger"] = unitOp{buildExchanger, finishExchanger} }

func buildExchanger(b *builder, u int) {
	hi, ho := b.port(u, "hot_in"), b.port(u, "hot_out")
	ci, co := b.port(u, "cold_in"), b.port(u, "cold_out")
	q := b.param(u, "duty", true, 0)
	loss := b.param(u, "heat_loss", false, 0)
	name := b.uname(u)
	b.unitEqLabel(u, "hot-side ", func() { b.massBalance(u, []int{hi}, []int{ho}) })
	b.unitEqLabel(u, "cold-side ", func() { b.massBalance(u, []int{ci}, []int{co}) })
	b.energyBalance(u, "hot-side energy balance of "+name, []int{hi}, []int{ho}, nil, []term{q, loss})
	b.energyBalance(u, "cold-side energy balance of "+name, []int{ci}, []int{co}, []term{q}, nil)
	b.pressureDrop(u, hi, ho, b.drop(u, "dp_hot"), "hot-side pressure drop of "+name)
	b.pressureDrop(u, ci, co, b.drop(u, "dp_cold"), "cold-side pressure drop of "+name)
}

// unitEqLabel prefixes the label of the equation add appends.
func (b *builder) unitEqLabel(u int, prefix string, add func()) {
	n := len(b.sys.Eqs)
	add()
	for i := n; i < len(b.sys.Eqs); i++ {
		b.sys.Eqs[i].Label = prefix + b.sys.Eqs[i].Label
	}
}

func finishExchanger(c *unitCalc) {
	hi, ho := c.port("hot_in"), c.port("hot_out")
	ci, co := c.port("cold_in"), c.port("cold_out")
	loss := c.param("heat_loss", 0)
	c.res.Q = c.param("duty", nanf)
	c.pressureRise(hi, ho, "hot side")
	c.pressureRise(ci, co, "cold side")
	c.reversedDuty(hi, ho, ci, co)
	if c.flows([]int{hi, ci}, []int{ho, co}, 0, loss) {
		c.res.Sgen = c.entropyFlow([]int{hi, ci}, []int{ho, co}) + c.lossEntropy(loss)
		c.checkSgen()
	}
	for _, st := range []int{hi, ho, ci, co} {
		if !c.s.res.Streams[st].HasState {
			return
		}
	}
	sd := func(st int) side {
		return side{name: c.s.b.sname(st), p: c.s.res.Streams[st].State.P, h: c.s.res.Streams[st].State.H}
	}
	pr := profile{hotIn: sd(hi), hotOut: sd(ho), coldIn: sd(ci), coldOut: sd(co),
		parallel: c.un.Option("arrangement") == "parallel"}
	if !pr.analyse() {
		return
	}
	c.res.DTMin, c.res.DTMinAt = pr.dtMin, pr.where(pr.fMin)
	duty := c.res.Q
	if !finite(duty) {
		if m := c.s.res.Streams[ci].M; finite(m) {
			duty = m * (pr.coldOut.h - pr.coldIn.h)
		}
	}
	c.res.Zones, c.res.LMTD, c.res.UA = pr.zones(duty)
	f := c.s.f
	const slack = 1e-6 // K: rounding of a pinch of exactly zero
	if pr.dtMin < -slack {
		th, tc := pr.temps(pr.fMin)
		var msg string
		switch {
		case pr.fMin == 0 || pr.fMin == 1:
			end := "hot inlet"
			if pr.fMin == 1 {
				end = "hot outlet"
			}
			hs, cs := pr.endStreams(pr.fMin)
			msg = fmt.Sprintf("%s: temperature cross at the %s end: %s %s is %s, colder than %s %s at %s",
				c.name(), end, end, hs, f.q(units.Temperature, th), pr.coldEnd(pr.fMin), cs, f.q(units.Temperature, tc))
		default:
			msg = fmt.Sprintf("%s: temperature cross inside the unit, %s: the hot side is at %s, %s colder than the cold side, already at %s; at the ends the hot side is warmer by %s (hot inlet end) and %s (hot outlet end)",
				c.name(), pr.where(pr.fMin), f.q(units.Temperature, th), f.dq(units.Temperature, -pr.dtMin), f.q(units.Temperature, tc),
				f.dq(units.Temperature, pr.dt(0)), f.dq(units.Temperature, pr.dt(1)))
		}
		c.s.diag(model.Error, CodeTempCross, c.un.Span, msg)
		return
	}
	if g := c.un.Params["min_approach"]; g != nil && finite(g.Value) && pr.dtMin < g.Value {
		c.s.diag(model.Warning, CodeApproach, c.un.Span, fmt.Sprintf("%s: the closest approach is %s %s, below min_approach %s",
			c.name(), f.dq(units.Temperature, pr.dtMin), pr.where(pr.fMin), f.writtenDelta(units.Temperature, g.Value, g.Unit)),
			related(g.Span, "min_approach given here"))
	}
}

// reversedDuty reports an exchanger whose duty is below zero: heat passes from the side named
// cold to the side named hot, which is a temperature cross of the roles as written.
func (c *unitCalc) reversedDuty(hi, ho, ci, co int) {
	q := c.res.Q
	rhi, rho, rci, rco := c.s.res.Streams[hi], c.s.res.Streams[ho], c.s.res.Streams[ci], c.s.res.Streams[co]
	if !finite(q) || !rhi.Solved || !rho.HasState || !rci.HasState || !rco.HasState {
		return
	}
	if q >= -max(1, c.s.relTol*math.Abs(rhi.M*(rhi.State.H-rho.State.H))) {
		return
	}
	c.rose = true // the entropy check would only repeat it
	f := c.s.f
	b := c.s.b
	c.s.diag(model.Error, CodeTempCross, c.un.Span, fmt.Sprintf("%s: the duty is %s: heat passes from the cold side (%s %s to %s %s) to the hot side (%s %s to %s %s); swap the hot and cold roles, or correct the givens",
		c.name(), f.q(units.Power, q), b.sname(ci), f.q(units.Temperature, rci.State.T), b.sname(co), f.q(units.Temperature, rco.State.T),
		b.sname(hi), f.q(units.Temperature, rhi.State.T), b.sname(ho), f.q(units.Temperature, rho.State.T)))
}

// pressureRise reports a side of a unit whose outlet pressure is above its inlet's: only a pump
// raises a stream's pressure. what names the side ("hot side", "" for a one-stream unit). It
// reports whether it found one.
func (c *unitCalc) pressureRise(in, out int, what string) bool {
	ri, ro := c.s.res.Streams[in], c.s.res.Streams[out]
	if !ri.HasState || !ro.HasState {
		return false
	}
	pin, pout := ri.State.P, ro.State.P
	if pout-pin <= c.s.relTol*pin {
		return false
	}
	c.rose = true
	f := c.s.f
	if what != "" {
		what += " "
	}
	c.s.diag(model.Error, CodePressureRise, c.un.Span, fmt.Sprintf("%s: %soutlet %s at %s is above inlet %s at %s: %s cannot raise the pressure (a gain of %s)",
		c.name(), what, c.s.b.sname(out), f.q(units.Pressure, pout), c.s.b.sname(in), f.q(units.Pressure, pin),
		articled(c.un.Kind.Name), f.dq(units.Pressure, pout-pin)),
		related(c.s.m.Streams[in].Span, "inlet "+c.s.b.sname(in)), related(c.s.m.Streams[out].Span, "outlet "+c.s.b.sname(out)))
	return true
}

// pressureFall reports a pump whose outlet pressure is below its inlet's.
func (c *unitCalc) pressureFall(in, out int) bool {
	ri, ro := c.s.res.Streams[in], c.s.res.Streams[out]
	if !ri.HasState || !ro.HasState {
		return false
	}
	pin, pout := ri.State.P, ro.State.P
	if pin-pout <= c.s.relTol*pin {
		return false
	}
	c.rose = true
	f := c.s.f
	c.s.diag(model.Error, CodePressureRise, c.un.Span, fmt.Sprintf("%s: outlet %s at %s is below inlet %s at %s: a pump raises the pressure (a fall of %s)",
		c.name(), c.s.b.sname(out), f.q(units.Pressure, pout), c.s.b.sname(in), f.q(units.Pressure, pin), f.dq(units.Pressure, pin-pout)),
		related(c.s.m.Streams[in].Span, "inlet "+c.s.b.sname(in)), related(c.s.m.Streams[out].Span, "outlet "+c.s.b.sname(out)))
	return true
}

// articled puts "a" or "an" before a kind's name.
func articled(kind string) string {
	if kind != "" && (kind[0] == 'a' || kind[0] == 'e' || kind[0] == 'i' || kind[0] == 'o' || kind[0] == 'u') {
		return "an " + kind
	}
	return "a " + kind
}

// Zone is a stretch of an exchanger where neither side changes phase.
type Zone struct {
	// Hot and Cold say what each side does there: "desuperheating", "condensing",
	// "subcooling" or "cooling" (a side that does not change phase); "preheating", "boiling",
	// "superheating" or "heating".
	Hot, Cold string
	// From and To bound the zone as shares of the heat passed, from the hot inlet end.
	From, To float64
	Duty     float64    // heat passed to the cold side in the zone, W (NaN when the duty is unknown)
	THot     [2]float64 // hot-side temperature at From and To, K
	TCold    [2]float64 // cold-side temperature at From and To, K
	LMTD     float64    // log-mean of the two ends' differences, K; NaN when they cross or touch
}

// side is one end of an exchanger side: its stream, pressure and enthalpy.
type side struct {
	name string
	p, h float64
}

// point is a place along the profile where a side changes phase.
type point struct {
	f    float64
	hot  bool   // the hot side changes phase there
	what string // "where the hot side HS1 starts condensing"
}

// profile is the temperature profile along an exchanger.
type profile struct {
	hotIn, hotOut, coldIn, coldOut side
	parallel                       bool
	points                         []point // phase changes, by f
	dtMin, fMin                    float64
	err                            bool
}

// hot and cold give each side's pressure and enthalpy at share f of the heat passed.
func (pr *profile) hot(f float64) (p, h float64) {
	return pr.hotIn.p + f*(pr.hotOut.p-pr.hotIn.p), pr.hotIn.h + f*(pr.hotOut.h-pr.hotIn.h)
}

func (pr *profile) cold(f float64) (p, h float64) {
	if pr.parallel {
		return pr.coldIn.p + f*(pr.coldOut.p-pr.coldIn.p), pr.coldIn.h + f*(pr.coldOut.h-pr.coldIn.h)
	}
	return pr.coldOut.p + f*(pr.coldIn.p-pr.coldOut.p), pr.coldOut.h + f*(pr.coldIn.h-pr.coldOut.h)
}

// temps gives both sides' temperatures at f; NaN after an evaluation outside IF97 (pr.err set).
func (pr *profile) temps(f float64) (th, tc float64) {
	p, h := pr.hot(f)
	sh, err1 := statePH(p, h)
	p, h = pr.cold(f)
	sc, err2 := statePH(p, h)
	if err1 != nil || err2 != nil {
		pr.err = true
		return math.NaN(), math.NaN()
	}
	return sh.T, sc.T
}

func (pr *profile) dt(f float64) float64 {
	th, tc := pr.temps(f)
	return th - tc
}

// analyse finds the phase changes of both sides and the closest approach; false when the profile
// cannot be drawn (a state outside IF97, or heat flowing from the cold side to the hot).
func (pr *profile) analyse() bool {
	if !(pr.hotIn.h > pr.hotOut.h) || !(pr.coldOut.h > pr.coldIn.h) {
		return false
	}
	pr.points = nil
	pr.phaseChanges(true)
	pr.phaseChanges(false)
	for i := 1; i < len(pr.points); i++ { // insertion sort: at most four points
		for j := i; j > 0 && pr.points[j].f < pr.points[j-1].f; j-- {
			pr.points[j], pr.points[j-1] = pr.points[j-1], pr.points[j]
		}
	}
	bounds := []float64{0}
	for _, pt := range pr.points {
		bounds = append(bounds, pt.f)
	}
	bounds = append(bounds, 1)
	pr.dtMin, pr.fMin = math.Inf(1), 0
	const samples = 8
	for k := 0; k+1 < len(bounds); k++ {
		a, b := bounds[k], bounds[k+1]
		best, fb := math.Inf(1), a
		for i := 0; i <= samples; i++ {
			f := a + (b-a)*float64(i)/samples
			if d := pr.dt(f); d < best {
				best, fb = d, f
			}
		}
		// Within a zone the difference is smooth: refine an interior minimum by golden section.
		if fb > a && fb < b {
			lo, hi := max(a, fb-(b-a)/samples), min(b, fb+(b-a)/samples)
			g := (math.Sqrt(5) - 1) / 2
			x1, x2 := hi-g*(hi-lo), lo+g*(hi-lo)
			d1, d2 := pr.dt(x1), pr.dt(x2)
			for n := 0; n < 40 && hi-lo > 1e-10; n++ {
				if d1 < d2 {
					hi, x2, d2 = x2, x1, d1
					x1 = hi - g*(hi-lo)
					d1 = pr.dt(x1)
				} else {
					lo, x1, d1 = x1, x2, d2
					x2 = lo + g*(hi-lo)
					d2 = pr.dt(x2)
				}
			}
			if d := min(d1, d2); d < best {
				best, fb = d, x1
				if d2 < d1 {
					fb = x2
				}
			}
		}
		// Ties go to the nearer end or phase change, which is the place an engineer names.
		if best < pr.dtMin-1e-9 {
			pr.dtMin, pr.fMin = best, fb
		}
	}
	return !pr.err && finite(pr.dtMin)
}

// phaseChanges adds the places where one side meets its saturation line: where its enthalpy
// equals the saturated vapour (dew point) or liquid (bubble point) enthalpy at its local
// pressure, found by bisection on f.
func (pr *profile) phaseChanges(hot bool) {
	at := pr.cold
	name := pr.coldIn.name
	if hot {
		at, name = pr.hot, pr.hotIn.name
	}
	for _, vap := range []bool{true, false} {
		g := func(f float64) (float64, bool) {
			p, h := at(f)
			hl, hv, err := satEnds(p)
			if err != nil {
				return 0, false
			}
			if vap {
				return h - hv, true
			}
			return h - hl, true
		}
		g0, ok0 := g(0)
		g1, ok1 := g(1)
		if !ok0 || !ok1 || g0 == 0 || g1 == 0 || (g0 > 0) == (g1 > 0) {
			continue
		}
		lo, hi := 0.0, 1.0
		for n := 0; n < 60 && hi-lo > 1e-13; n++ {
			mid := (lo + hi) / 2
			gm, ok := g(mid)
			if !ok {
				return
			}
			if (gm > 0) == (g0 > 0) {
				lo = mid
			} else {
				hi = mid
			}
		}
		var what string
		switch {
		case hot && vap:
			what = "where the hot side " + name + " starts condensing"
		case hot:
			what = "where the hot side " + name + " is fully condensed"
		case vap:
			what = "where the cold side " + name + " is fully evaporated"
		default:
			what = "where the cold side " + name + " starts boiling"
		}
		f := (lo + hi) / 2
		if f < 1e-9 || f > 1-1e-9 {
			continue // an end state a hair off the saturation line: no zone of its own
		}
		pr.points = append(pr.points, point{f: f, hot: hot, what: what})
	}
}

// where names the place at share f of the heat passed.
func (pr *profile) where(f float64) string {
	const near = 1e-7
	switch {
	case f <= near:
		return "at the hot inlet end"
	case f >= 1-near:
		return "at the hot outlet end"
	}
	for _, pt := range pr.points {
		if math.Abs(pt.f-f) <= near {
			return pt.what
		}
	}
	hotDo, coldDo := pr.regimes(f)
	return fmt.Sprintf("in the zone where the hot side is %s and the cold side %s, %s %% of the heat passed from the hot inlet end",
		hotDo, coldDo, units.Format(100*f, 3))
}

// endStreams names the hot and cold streams at an end (f = 0 or 1).
func (pr *profile) endStreams(f float64) (hot, cold string) {
	hot = pr.hotIn.name
	if f == 1 {
		hot = pr.hotOut.name
	}
	atColdOut := (f == 0) != pr.parallel
	cold = pr.coldIn.name
	if atColdOut {
		cold = pr.coldOut.name
	}
	return hot, cold
}

// coldEnd says which cold end lies at f = 0 or 1.
func (pr *profile) coldEnd(f float64) string {
	if (f == 0) != pr.parallel {
		return "cold outlet"
	}
	return "cold inlet"
}

// regimes says what each side does at f.
func (pr *profile) regimes(f float64) (hot, cold string) {
	return pr.regime(true, f), pr.regime(false, f)
}

func (pr *profile) regime(hot bool, f float64) string {
	at := pr.cold
	if hot {
		at = pr.hot
	}
	changes := false
	for _, pt := range pr.points {
		changes = changes || pt.hot == hot
	}
	p, h := at(f)
	x, err := qualityExt(p, h)
	if err != nil || !changes {
		if hot {
			return "cooling"
		}
		return "heating"
	}
	switch {
	case hot && x > 1:
		return "desuperheating"
	case hot && x >= 0:
		return "condensing"
	case hot:
		return "subcooling"
	case x < 0:
		return "preheating"
	case x <= 1:
		return "boiling"
	}
	return "superheating"
}

// zones splits the profile at the phase changes and sums the zones' UA: duty is the heat passed
// to the cold side, W.
func (pr *profile) zones(duty float64) (zs []Zone, lmtd, ua float64) {
	bounds := []float64{0}
	for _, pt := range pr.points {
		if pt.f > bounds[len(bounds)-1] {
			bounds = append(bounds, pt.f)
		}
	}
	bounds = append(bounds, 1)
	ua = 0
	for k := 0; k+1 < len(bounds); k++ {
		a, b := bounds[k], bounds[k+1]
		z := Zone{From: a, To: b, Duty: duty * (b - a)}
		z.Hot, z.Cold = pr.regimes((a + b) / 2)
		z.THot[0], z.TCold[0] = pr.temps(a)
		z.THot[1], z.TCold[1] = pr.temps(b)
		z.LMTD = logMean(z.THot[0]-z.TCold[0], z.THot[1]-z.TCold[1])
		ua += z.Duty / z.LMTD
		zs = append(zs, z)
	}
	if !finite(ua) || !(ua > 0) {
		return zs, math.NaN(), math.NaN()
	}
	return zs, duty / ua, ua
}

// logMean is the log-mean of two temperature differences, (a - b) / ln(a / b), and a itself
// when they are equal; NaN when either is not above zero.
func logMean(a, b float64) float64 {
	if !(a > 0 && b > 0) {
		return math.NaN()
	}
	if math.Abs(a-b) <= 1e-9*max(a, b) {
		return (a + b) / 2
	}
	return (a - b) / math.Log(a/b)
}
