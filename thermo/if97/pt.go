package if97

import (
	"fmt"
	"math"

	"hmb/thermo/if97/internal/region3"
)

// PT returns the single-phase state at pressure p (Pa) and temperature T
// (K). A pair on the saturation line gives ErrOnSaturation: use PX or TX.
func PT(p, T float64) (State, error) {
	pm := p * 1e-6
	if err := checkPT(pm, T); err != nil {
		return State{}, err
	}
	region, err := regionPT(pm, T)
	if err != nil {
		return State{}, err
	}
	return stateAt(pm, T, region)
}

// checkPT enforces the range of validity, IAPWS R7-97(2012) Sec. 4:
// 273.15-1073.15 K up to 100 MPa, 1073.15-2273.15 K up to 50 MPa.
func checkPT(pm, t float64) error {
	if !finite(pm) {
		return notFinite("pressure", pm*1e6)
	}
	if !finite(t) {
		return notFinite("temperature", t)
	}
	switch {
	case t < tMin:
		return &LimitError{Quantity: "temperature", Value: t, Min: tMin, Max: tMax}
	case t > tMax:
		return &LimitError{Quantity: "temperature", Value: t, Min: tMin, Max: tMax}
	case pm <= 0:
		return &LimitError{Quantity: "pressure", Value: pm * 1e6, Min: 0, Max: pMax * 1e6}
	case pm > pMax:
		return &LimitError{Quantity: "pressure", Value: pm * 1e6, Min: 0, Max: pMax * 1e6}
	case t > tMax25 && pm > pMax5:
		return &LimitError{Quantity: "temperature", Value: t, Min: tMin, Max: tMax25,
			Cond: "at pressures over 50 MPa"}
	}
	return nil
}

// regionPT picks the region of an in-range (p,T), IAPWS R7-97(2012) Fig. 1.
func regionPT(pm, t float64) (int, error) {
	switch {
	case t > tMax25:
		return 5, nil
	case t <= t13:
		if pm > pSat623 {
			return 1, nil
		}
		ts := tsat(pm)
		if math.Abs(t-ts) <= 1e-9*t {
			return 0, ErrOnSaturation
		}
		if t < ts {
			return 1, nil
		}
		return 2, nil
	case pm > pB23(t):
		if pm <= pCrit && t < tCrit && math.Abs(t-tsat(pm)) <= 1e-9*t {
			return 0, ErrOnSaturation
		}
		return 3, nil
	}
	return 2, nil
}

// stateAt evaluates a single-phase region at (p MPa, T K).
func stateAt(pm, t float64, region int) (State, error) {
	switch region {
	case 1:
		return single(region1(pm, t), 1), nil
	case 2:
		return single(region2(pm, t), 2), nil
	case 5:
		return single(region5(pm, t), 5), nil
	}
	pt, ok := region3.PointPT(pm, t)
	if !ok {
		return State{}, fmt.Errorf("%w: region 3 density at %g MPa, %g K did not converge", ErrNoSolution, pm, t)
	}
	st := state3(pt)
	st.P = pm * 1e6 // the input itself, not its reproduction to 1e-12
	return st, nil
}

// state3 converts a solved region-3 state to a State.
func state3(pt region3.Point) State {
	rho, t, pr := pt.Rho, pt.T, pt.Props
	if !(pr.DpDrho > 0) {
		// Inside the near-critical loop of Eq. 28 (see region3.SolvePH): cp diverges at the
		// critical point and has no value there.
		pr.Cp = math.NaN()
	}
	v := 1 / rho
	return State{
		P: pr.P * 1e6, T: t, V: v, Rho: rho,
		U: pr.U * 1e3, H: pr.H * 1e3, S: pr.S * 1e3,
		Cp: pr.Cp * 1e3, Cv: pr.Cv * 1e3, W: pr.W,
		X:      math.NaN(),
		Phase:  phaseOf(pr.P, t, v, 3),
		Region: 3,
	}
}

// Psat returns the saturation pressure (Pa) at T (K), IAPWS R7-97(2012)
// Eq. 30, for 273.15 K <= T <= 647.096 K.
func Psat(T float64) (float64, error) {
	if !finite(T) {
		return 0, notFinite("temperature", T)
	}
	if T < tMin || T > tCrit {
		return 0, &LimitError{Quantity: "temperature", Value: T, Min: tMin, Max: tCrit, Cond: "for saturation"}
	}
	return psat(T) * 1e6, nil
}

// Tsat returns the saturation temperature (K) at p (Pa), IAPWS R7-97(2012)
// Eq. 31, for 611.213 Pa <= p <= 22.064 MPa.
func Tsat(p float64) (float64, error) {
	pm := p * 1e-6
	if !finite(pm) {
		return 0, notFinite("pressure", p)
	}
	if pm < pTriple || pm > pCrit {
		return 0, &LimitError{Quantity: "pressure", Value: p, Min: pTriple * 1e6, Max: pCrit * 1e6, Cond: "for saturation"}
	}
	return clampT(tsat(pm)), nil
}

// clampT keeps a saturation temperature computed from the ends of the
// pressure range inside [273.15 K, Tc] against rounding.
func clampT(t float64) float64 {
	// Plain comparisons: math.Min and math.Max are not inlined.
	if t < tMin {
		return tMin
	}
	if t > tCrit {
		return tCrit
	}
	return t
}
