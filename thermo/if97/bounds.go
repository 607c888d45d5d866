package if97

import (
	"math"
	"sync"
)

// A curve is h or s along one of the lines that divide the regions in the (p, h) and (p, s)
// planes (IAPWS R7-97(2012) Fig. 1: the saturation line, the 2-3 boundary, the isotherms that
// close regions 1, 2 and 5), tabulated on a grid even in ln p. Where the curve is monotone
// between two grid points it lies between their values, so pressureAnd can tell on which side
// of the line a (p, y) lies without evaluating the line, unless y falls between those values.
// Every decision a curve makes is one the exact evaluation makes too; it only spares the
// evaluation.
type curve struct {
	f        func(pm float64) float64 // the line, in the release's units (pm in MPa)
	pLo, pHi float64                  // range of the table, MPa
	once     sync.Once
	lnLo     float64
	step     float64   // of ln p between grid points
	y        []float64 // f at the grid points
	mono     []bool    // per interval: f is monotone on it
}

// curveIntervals is the number of intervals of a curve: a few hundred evaluations when it is
// first used, and bands of a few kJ/kg (or J/(kg K)) in which the exact evaluation decides.
const curveIntervals = 128

func (c *curve) build() {
	n := curveIntervals
	c.lnLo = math.Log(c.pLo)
	c.step = (math.Log(c.pHi) - c.lnLo) / float64(n)
	c.y = make([]float64, n+1)
	c.mono = make([]bool, n)
	at := func(u float64) float64 { // u in grid units
		if u >= float64(n) {
			return c.f(c.pHi)
		}
		if u <= 0 {
			return c.f(c.pLo)
		}
		return c.f(math.Exp(c.lnLo + u*c.step))
	}
	for k := range c.y {
		c.y[k] = at(float64(k))
	}
	const d = 1e-4 // grid units: a step for the slope at each end
	for k := range c.mono {
		// Monotone where five points across the interval are strictly in order and the slope has
		// the same sign at both ends. The lines are smooth with at most one extremum (the vapour
		// line's highest enthalpy, near 3 MPa), which changes the slope's sign and is left to the
		// exact evaluation; one within d of an end differs from that end's value by less than
		// side's margin.
		u := float64(k)
		v := [7]float64{at(u + d), c.y[k], at(u + 0.25), at(u + 0.5), at(u + 0.75), c.y[k+1], at(u + 1 - d)}
		up := v[0] > v[1] && v[5] > v[6]
		down := v[0] < v[1] && v[5] < v[6]
		for i := 2; i <= 5; i++ {
			up = up && v[i] > v[i-1]
			down = down && v[i] < v[i-1]
		}
		c.mono[k] = up || down
	}
}

// side says where y lies against the curve at pm: -1 surely below it, +1 surely above it, 0
// when the table cannot tell (y close to the curve, pm outside the table, or an interval not
// known to be monotone).
// lnp is ln(pm), which the caller computes once for all the curves it asks.
func (c *curve) side(pm, lnp, y float64) int {
	if !(pm >= c.pLo && pm <= c.pHi) {
		return 0
	}
	c.once.Do(c.build)
	u := (lnp - c.lnLo) / c.step
	k := int(u)
	if k >= len(c.mono) {
		k = len(c.mono) - 1
	}
	if k < 0 || !c.mono[k] {
		return 0
	}
	lo, hi := c.y[k], c.y[k+1]
	if lo > hi {
		lo, hi = hi, lo
	}
	// A margin for the rounding of an evaluation at pm against the tabulated ones.
	m := 1e-11 * (math.Abs(lo) + math.Abs(hi) + 1)
	switch {
	case y < lo-m:
		return -1
	case y > hi+m:
		return 1
	}
	return 0
}

// sat is the saturated liquid's (or vapour's) h or s at pm, in the release's units; NaN where
// the saturated ends cannot be found.
func sat(k second, vapour bool) func(pm float64) float64 {
	return func(pm float64) float64 {
		liq, vap, err := satEnds(pm, clampT(tsat(pm)))
		if err != nil {
			return math.NaN()
		}
		st := liq
		if vapour {
			st = vap
		}
		if k == byS {
			return st.S * 1e-3
		}
		return st.H * 1e-3
	}
}

// lines are the curves pressureAnd consults, for h (index byH) and s (byS).
type lines struct {
	liq, vap   curve // saturated liquid (region 1) and vapour (region 2) up to 623.15 K
	b23        curve // region 2 along the 2-3 boundary, above the saturation pressure at 623.15 K
	top1       curve // region 1 at 623.15 K, above the saturation pressure at 623.15 K
	min1, max2 curve // region 1 at 273.15 K, region 2 at 1073.15 K
	liq3, vap3 curve // saturated liquid and vapour above 623.15 K (region 3)
}

// noCurve has no table: its side is always unknown.
var noCurve curve

var boundaries = func() (l [2]lines) {
	for _, k := range []second{byH, byS} {
		y := func(region int, t func(pm float64) float64) func(float64) float64 {
			return func(pm float64) float64 { v, _ := fwd(region, pm, t(pm), k); return v }
		}
		fixed := func(t float64) func(float64) float64 { return func(float64) float64 { return t } }
		l[k] = lines{
			liq:  curve{f: y(1, tsat), pLo: pTriple, pHi: pSat623},
			vap:  curve{f: y(2, tsat), pLo: pTriple, pHi: pSat623},
			b23:  curve{f: y(2, tB23), pLo: pSat623, pHi: pMax},
			top1: curve{f: y(1, fixed(t13)), pLo: pSat623, pHi: pMax},
			min1: curve{f: y(1, fixed(tMin)), pLo: pTriple, pHi: pMax},
			max2: curve{f: y(2, fixed(tMax25)), pLo: 1e-6, pHi: pMax},
			liq3: curve{f: sat(k, false), pLo: pSat623, pHi: pCrit},
			vap3: curve{f: sat(k, true), pLo: pSat623, pHi: pCrit},
		}
	}
	return
}()
