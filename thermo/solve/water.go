package solve

import (
	"errors"
	"math"

	"hmb/thermo/if97"
)

// pCrit is the critical pressure of IAPWS-IF97 (IAPWS R7-97(2012), Eq. 2), Pa.
const pCrit = 22.064e6

// tCrit is the critical temperature of IAPWS-IF97 (IAPWS R7-97(2012), Eq. 1), K.
const tCrit = 647.096

// statePH is the only door to the property library for a stream state.
func statePH(p, h float64) (if97.State, error) {
	if !finite(p) || !finite(h) {
		return if97.State{}, errNotFinite
	}
	return if97.PH(p, h)
}

// satSnap is the relative enthalpy difference within which a state is taken as exactly saturated:
// IF97's (p, h) inversion reproduces h to about 1e-9 relative, so a saturated outlet solved as
// the saturated-liquid or saturated-vapour enthalpy can come back a hair outside the dome.
const satSnap = 1e-8

// streamState is a solved stream's state from (p, h), with a state on the saturation line
// (within satSnap) reported as the saturated liquid or vapour itself, quality exactly 0 or 1.
func streamState(p, h float64) (if97.State, error) {
	st, err := statePH(p, h)
	if err != nil {
		return st, err
	}
	return snapSat(st, p, h), nil
}

// snapSat is streamState's snapping of a state st found at (p, h), however it was found.
func snapSat(st if97.State, p, h float64) if97.State {
	if !(p < pCrit) {
		return st
	}
	if math.IsNaN(st.X) {
		// Single phase: near the line only if T is within a hair of Tsat(p) (the cheap test,
		// before the saturated ends, which near the critical point need an iteration).
		ts, err := if97.Tsat(p)
		if err != nil || math.Abs(st.T-ts) > 1e-3 {
			return st
		}
	} else if st.X > satSnap && st.X < 1-satSnap {
		return st
	}
	hl, hv, err := satEnds(p)
	if err != nil {
		return st
	}
	switch {
	case math.Abs(h-hl) <= satSnap*math.Abs(hl):
		if sat, err := if97.PX(p, 0); err == nil {
			return sat
		}
	case math.Abs(h-hv) <= satSnap*math.Abs(hv):
		if sat, err := if97.PX(p, 1); err == nil {
			return sat
		}
	}
	return st
}

var errNotFinite = errors.New("not a finite number")

// satEnds returns the saturated liquid and vapour enthalpies at p.
func satEnds(p float64) (hl, hv float64, err error) {
	if !(p > 0 && p < pCrit) {
		return 0, 0, errNoDome
	}
	l, v, err := if97.SatPair(p)
	if err != nil {
		return 0, 0, err
	}
	return l.H, v.H, nil
}

var errNoDome = errors.New("no two-phase region at this pressure (at or above the critical pressure)")

// qualityExt is the quality extended past the saturation line: below 0 for subcooled liquid,
// above 1 for superheated vapour. It is continuous and linear in h at fixed p.
func qualityExt(p, h float64) (float64, error) {
	hl, hv, err := satEnds(p)
	if err != nil {
		return math.NaN(), err
	}
	return (h - hl) / (hv - hl), nil
}

// isentropicH is the enthalpy at pressure p2 with the entropy of the state (p1, h1).
func isentropicH(p1, h1, p2 float64) (float64, error) {
	st, err := statePH(p1, h1)
	if err != nil {
		return math.NaN(), err
	}
	if !finite(p2) {
		return math.NaN(), errNotFinite
	}
	st2, err := if97.PS(p2, st.S)
	if err != nil {
		return math.NaN(), err
	}
	return st2.H, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// twoPhase reports whether a state lies on or inside the saturation dome.
func twoPhase(st if97.State) bool { return !math.IsNaN(st.X) }
