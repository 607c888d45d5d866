package if97

import (
	"fmt"
	"math"

	"hmb/thermo/if97/internal/region3"
)

// SatPair returns the saturated liquid and vapour at pressure p (Pa).
func SatPair(p float64) (liq, vap State, err error) {
	pm := p * 1e-6
	if !finite(pm) {
		return liq, vap, notFinite("pressure", p)
	}
	if pm < pTriple || pm > pCrit {
		return liq, vap, &LimitError{Quantity: "pressure", Value: p, Min: pTriple * 1e6, Max: pCrit * 1e6, Cond: "for saturation"}
	}
	return satEnds(pm, clampT(tsat(pm)))
}

// SatPairT returns the saturated liquid and vapour at temperature T (K).
func SatPairT(T float64) (liq, vap State, err error) {
	if !finite(T) {
		return liq, vap, notFinite("temperature", T)
	}
	if T < tMin || T > tCrit {
		return liq, vap, &LimitError{Quantity: "temperature", Value: T, Min: tMin, Max: tCrit, Cond: "for saturation"}
	}
	return satEnds(psat(T), T)
}

// satEnds builds both saturated states at (ps MPa, T K) on the saturation
// line: regions 1 and 2 up to 623.15 K, the region-3 basic equation above.
func satEnds(ps, t float64) (liq, vap State, err error) {
	switch {
	case t <= t13:
		liq = single(region1(ps, t), 1)
		vap = single(region2(ps, t), 2)
	case t >= tCrit:
		liq = state3(region3.Point{Rho: rhoCrit, T: tCrit, Props: region3.Eval(rhoCrit, tCrit)})
		vap = liq
	default:
		l, v, ok := region3.SatPoints(t, ps)
		if !ok {
			return liq, vap, fmt.Errorf("%w: saturated densities at %g K did not converge", ErrNoSolution, t)
		}
		liq, vap = state3(l), state3(v)
	}
	// Both ends carry the saturation pressure the line gives, exactly.
	liq.P, vap.P = ps*1e6, ps*1e6
	liq.X, vap.X = 0, 1
	liq.Phase, vap.Phase = SatLiquid, SatVapor
	liq.Region, vap.Region = 4, 4
	return liq, vap, nil
}

// mix is the two-phase state of quality x between the saturated ends.
func mix(liq, vap State, x float64) State {
	switch x {
	case 0:
		return liq
	case 1:
		return vap
	}
	v := liq.V + x*(vap.V-liq.V)
	return State{
		P: liq.P, T: liq.T, V: v, Rho: 1 / v,
		U:  liq.U + x*(vap.U-liq.U),
		H:  liq.H + x*(vap.H-liq.H),
		S:  liq.S + x*(vap.S-liq.S),
		Cp: math.NaN(), Cv: math.NaN(), W: math.NaN(),
		X: x, Phase: Mixture, Region: 4,
	}
}

func checkQuality(x float64) error {
	if !finite(x) || x < 0 || x > 1 {
		return &LimitError{Quantity: "quality", Value: x, Min: 0, Max: 1}
	}
	return nil
}

// PX returns the saturated state of quality x (0..1) at pressure p (Pa).
func PX(p, x float64) (State, error) {
	if err := checkQuality(x); err != nil {
		return State{}, err
	}
	liq, vap, err := SatPair(p)
	if err != nil {
		return State{}, err
	}
	return mix(liq, vap, x), nil
}

// TX returns the saturated state of quality x (0..1) at temperature T (K).
func TX(T, x float64) (State, error) {
	if err := checkQuality(x); err != nil {
		return State{}, err
	}
	liq, vap, err := SatPairT(T)
	if err != nil {
		return State{}, err
	}
	return mix(liq, vap, x), nil
}
