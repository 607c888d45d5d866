package if97

import (
	"fmt"
	"math"

	"hmb/thermo/if97/internal/backward"
	"hmb/thermo/if97/internal/region3"
)

// PH returns the state at pressure p (Pa) and specific enthalpy h (J/kg).
func PH(p, h float64) (State, error) { return pressureAnd(p, h*1e-3, byH) }

// PS returns the state at pressure p (Pa) and specific entropy s (J/(kg K)).
func PS(p, s float64) (State, error) { return pressureAnd(p, s*1e-3, byS) }

// second names the property given with the pressure.
type second uint8

const (
	byH second = iota
	byS
)

func (k second) name() string {
	if k == byH {
		return "enthalpy"
	}
	return "entropy"
}

// fwd gives h or s (release units) and its derivative in T at fixed p.
func fwd(region int, pm, t float64, k second) (y, dy float64) {
	var h, s, cp float64
	switch {
	case region == 1 && k == byH:
		return region1HCp(pm, t) // spares gamma itself, which only s needs
	case region == 1:
		h, s, cp = region1HS(pm, t)
	case region == 2 && k == byH:
		return region2HCp(pm, t) // spares the logarithm s needs
	case region == 2:
		h, s, cp = region2HS(pm, t)
	default:
		h, s, cp = region5HS(pm, t)
	}
	if k == byH {
		return h, cp
	}
	return s, cp / t
}

// pressureAnd solves (p, h) or (p, s): the region from the boundaries of
// IAPWS R7-97(2012) Fig. 1 mapped to this pressure, then the backward
// equation as the start and Newton steps on the forward equation.
func pressureAnd(p, y float64, k second) (State, error) {
	pm := p * 1e-6
	if !finite(pm) {
		return State{}, notFinite("pressure", p)
	}
	if !finite(y) {
		return State{}, notFinite(k.name(), y*1e3)
	}
	if pm <= 0 || pm > pMax {
		return State{}, &LimitError{Quantity: "pressure", Value: p, Min: 0, Max: pMax * 1e6}
	}
	at := func(region int, t float64) float64 {
		if k == byH {
			switch region {
			case 1:
				return h1(pm, t)
			case 2:
				return h2(pm, t)
			}
		}
		v, _ := fwd(region, pm, t, k)
		return v
	}
	limit := func() error {
		lo := at(1, tMin)
		if pm < pTriple {
			lo = at(2, tMin)
		}
		hi := at(2, tMax25)
		if pm <= pMax5 {
			hi = at(5, tMax)
		}
		return &LimitError{Quantity: k.name(), Value: y * 1e3, Min: lo * 1e3, Max: hi * 1e3,
			Cond: "at " + show("pressure", p)}
	}
	var ts float64 // saturation temperature, needed by both sides
	if pm >= pTriple && pm <= pSat623 {
		ts = tsat(pm)
	}
	// below and above compare y with a dividing line at pm: the tabulated curve decides when it
	// can (see curve), else the line's value at(region, t) does.
	lines := &boundaries[k]
	lnp := math.Log(pm)
	below := func(c *curve, region int, t float64) bool {
		if s := c.side(pm, lnp, y); s != 0 {
			return s < 0
		}
		return y < at(region, t)
	}
	above := func(c *curve, region int, t float64) bool {
		if s := c.side(pm, lnp, y); s != 0 {
			return s > 0
		}
		return y > at(region, t)
	}
	// Region 1 lies below the liquid side or the 623.15 K isotherm.
	liquid := func() (State, bool, error) {
		if pm < pTriple {
			return State{}, false, nil
		}
		t1hi, line := t13, &lines.top1
		if pm <= pSat623 {
			t1hi, line = ts, &lines.liq
		}
		if above(line, 1, t1hi) {
			return State{}, false, nil
		}
		if below(&lines.min1, 1, tMin) {
			return State{}, true, limit()
		}
		st, err := solveT(1, pm, y, k, tMin, t1hi)
		return st, true, err
	}
	// Regions 2 and 5 lie above the vapour side or the 2-3 boundary.
	vapour := func() (State, bool, error) {
		var t2lo float64
		line := &lines.vap
		switch {
		case pm < pTriple:
			t2lo = tMin
		case pm <= pSat623:
			t2lo = ts
		default:
			t2lo, line = tB23(pm), &lines.b23
		}
		if pm < pTriple {
			line = &noCurve // no table below the triple point: always evaluated
		}
		if below(line, 2, t2lo) {
			if pm >= pTriple {
				return State{}, false, nil
			}
			return State{}, true, limit()
		}
		if !above(&lines.max2, 2, tMax25) {
			st, err := solveT(2, pm, y, k, t2lo, tMax25)
			return st, true, err
		}
		if pm > pMax5 || y > at(5, tMax) {
			return State{}, true, limit()
		}
		st, err := solveT(5, pm, y, k, tMax25, tMax)
		return st, true, err
	}
	// The two sides are disjoint, so the order of the tests only matters
	// for speed: try first the side y most likely lies on.
	first, then := liquid, vapour
	if (k == byH && y > 2000) || (k == byS && y > 5) {
		first, then = vapour, liquid
	}
	if st, done, err := first(); done {
		return st, err
	}
	if st, done, err := then(); done {
		return st, err
	}
	// Above 623.15 K the saturation line lies in region 3; a (p, y) surely outside it is single
	// phase without evaluating the saturated ends.
	outside := pm > pSat623 && (lines.liq3.side(pm, lnp, y) < 0 || lines.vap3.side(pm, lnp, y) > 0)
	// Between the saturated ends in regions 1 and 2 (satEnds takes region 3 for a Tsat that
	// rounds above 623.15 K): a mixture needs only their first derivatives (satEndsMix); an end
	// itself is the full state.
	if pm <= pSat623 && pm >= pTriple && clampT(ts) <= t13 {
		liq, vap := satEndsMix(pm, clampT(ts))
		yl, yv := liq.H, vap.H
		if k == byS {
			yl, yv = liq.S, vap.S
		}
		yl, yv = yl*1e-3, yv*1e-3
		if x := math.Min(math.Max((y-yl)/(yv-yl), 0), 1); x > 0 && x < 1 {
			return mix(liq, vap, x), nil
		}
	}
	if pm <= pCrit && !outside {
		if ts == 0 {
			ts = tsat(pm)
		}
		liq, vap, err := satEnds(pm, clampT(ts))
		if err != nil {
			return State{}, err
		}
		yl, yv := liq.H, vap.H
		if k == byS {
			yl, yv = liq.S, vap.S
		}
		yl, yv = yl*1e-3, yv*1e-3
		if pm <= pSat623 || (y > yl && y < yv) {
			x := (y - yl) / (yv - yl)
			return mix(liq, vap, math.Min(math.Max(x, 0), 1)), nil
		}
	}
	var pt region3.Point
	var ok bool
	if k == byH {
		pt, ok = region3.PointPH(pm, y)
	} else {
		pt, ok = region3.PointPS(pm, y)
	}
	if !ok {
		return State{}, fmt.Errorf("%w: region 3 at %g MPa, %s %g did not converge", ErrNoSolution, pm, k.name(), y)
	}
	st := state3(pt)
	st.P = p
	return st, nil
}

// solveT finds T in [tlo, thi] where the region's h or s equals y at pm:
// backward-equation start, then Newton steps kept inside a shrinking
// bracket, until the step is below 1e-8 relative (error then ~1e-16).
func solveT(region int, pm, y float64, k second, tlo, thi float64) (State, error) {
	var t float64
	switch {
	case region == 1 && k == byH:
		t = backward.T1ph(pm, y)
	case region == 1:
		t = backward.T1ps(pm, y)
	case region == 2 && k == byH:
		t = backward.T2ph(pm, y)
	case region == 2:
		t = backward.T2ps(pm, y)
	default:
		t = 0.5 * (tlo + thi)
	}
	if !(t > tlo && t < thi) {
		t = 0.5 * (tlo + thi)
	}
	for i := 0; i < 60; i++ {
		v, dv := fwd(region, pm, t, k)
		f := v - y
		if f == 0 {
			break
		}
		if f > 0 {
			thi = t
		} else {
			tlo = t
		}
		tn := t - f/dv
		// A root on an end of the bracket (a saturated state) may land a
		// rounding error outside it: keep that Newton step, on the end.
		if tn < tlo && tlo-tn <= 1e-9*t {
			tn = tlo
		} else if tn > thi && tn-thi <= 1e-9*t {
			tn = thi
		}
		if !(tn >= tlo && tn <= thi) {
			t = 0.5 * (tlo + thi) // bisection: never a reason to stop
			continue
		}
		// Newton converges quadratically: after a step below 1e-8 of T the
		// error left is of order 1e-16, so no evaluation is needed to
		// confirm it.
		if math.Abs(tn-t) <= 1e-8*t {
			t = tn
			break
		}
		t = tn
	}
	var pr props
	pr = gibbsRegion(region, pm, t)
	return single(pr, region), nil
}
