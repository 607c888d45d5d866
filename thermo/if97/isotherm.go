package if97

import (
	"fmt"
	"math"
)

// TH returns the state at temperature T (K) and specific enthalpy h
// (J/kg) when exactly one IF97 state has them. Along an isotherm h is not
// monotonic in p (cold compressed liquid reaches the enthalpies of the
// two-phase states), so several states may fit: that is ErrNotUnique.
func TH(T, h float64) (State, error) { return isotherm(T, h*1e-3, byH) }

// TS returns the state at temperature T (K) and specific entropy s
// (J/(kg K)) when exactly one IF97 state has them (below 277 K the liquid's
// entropy rises with pressure, so two may fit: ErrNotUnique).
func TS(T, s float64) (State, error) { return isotherm(T, s*1e-3, byS) }

func isotherm(t, y float64, k second) (State, error) {
	if !finite(t) {
		return State{}, notFinite("temperature", t)
	}
	if !finite(y) {
		return State{}, notFinite(k.name(), y*1e3)
	}
	if t < tMin || t > tMax {
		return State{}, &LimitError{Quantity: "temperature", Value: t, Min: tMin, Max: tMax}
	}
	pHi := pMax
	if t > tMax25 {
		pHi = pMax5
	}
	const pLo = 1e-9 // MPa: the vapour's h no longer changes, its s still does
	of := func(st State) float64 {
		if k == byH {
			return st.H * 1e-3
		}
		return st.S * 1e-3
	}
	var found []State
	type branch struct{ a, b, ya, yb float64 } // log-pressure ends; end values
	var branches []branch
	if t < tCrit {
		liq, vap, err := SatPairT(t)
		if err != nil {
			return State{}, err
		}
		yl, yv := of(liq), of(vap)
		lo, hi := math.Min(yl, yv), math.Max(yl, yv)
		if y >= lo && y <= hi {
			found = append(found, mix(liq, vap, (y-yl)/(yv-yl)))
		}
		ps := psat(t)
		branches = append(branches,
			branch{math.Log(pLo), math.Log(ps), math.NaN(), yv},
			branch{math.Log(ps), math.Log(pHi), yl, math.NaN()})
	} else {
		branches = append(branches, branch{math.Log(pLo), math.Log(pHi), math.NaN(), math.NaN()})
	}
	val := func(lp float64) (float64, State, bool) {
		pm := math.Exp(lp)
		r, err := regionPT(pm, t)
		if err != nil {
			return 0, State{}, false
		}
		st, err := stateAt(pm, t, r)
		if err != nil {
			return 0, State{}, false
		}
		return of(st) - y, st, true
	}
	const n = 150
	for _, br := range branches {
		prevX := br.a
		prevF := br.ya - y
		for i := 1; i <= n; i++ {
			x := br.a + (br.b-br.a)*float64(i)/n
			var f float64
			if i == n && !math.IsNaN(br.yb) {
				f = br.yb - y
			} else {
				v, _, ok := val(x)
				if !ok {
					continue
				}
				f = v
			}
			if !math.IsNaN(prevF) && (prevF < 0) != (f < 0) && prevF != 0 && !(i == n && f == 0 && !math.IsNaN(br.yb)) {
				lo, hi, flo := prevX, x, prevF
				for j := 0; j < 100 && hi-lo > 1e-15; j++ {
					m := 0.5 * (lo + hi)
					fm, _, ok := val(m)
					if !ok {
						break
					}
					if (fm < 0) == (flo < 0) {
						lo, flo = m, fm
					} else {
						hi = m
					}
				}
				if _, st, ok := val(0.5 * (lo + hi)); ok {
					found = append(found, st)
				}
			}
			prevX, prevF = x, f
		}
	}
	switch len(found) {
	case 0:
		return State{}, fmt.Errorf("%w: T = %g K, %s %s", ErrNoSolution, t, k.name(), show(k.name(), y*1e3))
	case 1:
		return found[0], nil
	}
	return State{}, fmt.Errorf("%w: T = %g K and %s %s fit %d states (pressures %s); give the pressure",
		ErrNotUnique, t, k.name(), show(k.name(), y*1e3), len(found), pressures(found))
}

func pressures(sts []State) string {
	s := ""
	for i, st := range sts {
		if i > 0 {
			s += ", "
		}
		s += show("pressure", st.P)
	}
	return s
}
