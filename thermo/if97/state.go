package if97

import "math"

// Phase names the physical state of water as a steam table does.
type Phase uint8

const (
	_             Phase = iota
	Liquid              // compressed (subcooled) liquid
	SatLiquid           // saturated liquid, quality 0
	Mixture             // saturated liquid-vapour mixture, 0 < quality < 1
	SatVapor            // saturated vapour, quality 1
	Vapor               // superheated vapour
	Supercritical       // above both the critical pressure and temperature
)

func (ph Phase) String() string {
	switch ph {
	case Liquid:
		return "compressed liquid"
	case SatLiquid:
		return "saturated liquid"
	case Mixture:
		return "saturated mixture"
	case SatVapor:
		return "saturated vapour"
	case Vapor:
		return "superheated vapour"
	case Supercritical:
		return "supercritical fluid"
	}
	return "unknown phase"
}

// State is one equilibrium state of water in SI base units: P in Pa, T in
// K, V in m3/kg, Rho in kg/m3, U and H in J/kg, S, Cp and Cv in J/(kg K),
// W in m/s.
type State struct {
	P, T, V, Rho, U, H, S float64
	// Cp, Cv and W are NaN inside the two-phase dome (0 < X < 1), where they
	// are undefined; show them as "n/a".
	Cp, Cv, W float64
	// X is the vapour quality 0..1 of a saturated state (exactly 0 and 1
	// for the saturated ends) and NaN for a single-phase state.
	X      float64
	Phase  Phase
	Region int // IF97 region 1, 2, 3 or 5; 4 for states on or inside the dome
}

// single converts a single-phase state from release units to a State.
func single(pr props, region int) State {
	return State{
		P: pr.p * 1e6, T: pr.t, V: pr.v, Rho: 1 / pr.v,
		U: pr.u * 1e3, H: pr.h * 1e3, S: pr.s * 1e3,
		Cp: pr.cp * 1e3, Cv: pr.cv * 1e3, W: pr.w,
		X:      math.NaN(),
		Phase:  phaseOf(pr.p, pr.t, pr.v, region),
		Region: region,
	}
}

// phaseOf names a single-phase state. Above the critical pressure the
// fluid is liquid below the critical temperature and supercritical above;
// below it, region 3 is liquid-like or vapour-like by its density.
func phaseOf(p, t, v float64, region int) Phase {
	switch {
	case p > pCrit && t > tCrit:
		return Supercritical
	case p > pCrit:
		return Liquid
	case t > tCrit:
		return Vapor
	}
	switch region {
	case 1:
		return Liquid
	case 3:
		if 1/v > rhoCrit {
			return Liquid
		}
	}
	return Vapor
}
