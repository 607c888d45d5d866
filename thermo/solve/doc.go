// Package solve is the equation-oriented heat and material balance solver: from a model.Model it
// finds every stream's state, closes every balance, and reports with a position everything that is
// missing, conflicting or physically impossible.
//
// # Unknowns and equations
//
// Each stream contributes three unknowns: mass flow m (kg/s), pressure p (Pa) and specific
// enthalpy h (J/kg). Temperature, entropy and quality are derived from (p, h) by IAPWS-IF97.
// A unit parameter that a balance can produce (a heater's duty, a turbine's power or efficiency, a
// valve's pressure drop) is an unknown too; a given parameter adds the equation "unknown = given".
// Parameters that only modify a balance (heat_loss, and dp of every kind but the valve) are
// constants and default to zero when not given.
//
// Every given is one equation (m = given, p = given, h = given, T(p,h) = given, s(p,h) = given,
// x(p,h) = given) and every unit adds the equations documented in its own file (mixer.go,
// valve.go, ...). Quality equations use the quality extended outside the dome,
// x = (h - h_liq(p)) / (h_vap(p) - h_liq(p)), so that Newton sees a smooth function.
//
// # Method
//
// The system is analysed structurally before any number is computed: a maximum bipartite
// matching of equations to unknowns (Dulmage and Mendelsohn, 1958) shows unknowns that no
// equation can fix (under-specified: reported with the givens that would fix them) and equations
// left over (over-specified: checked after solving, as a closure when they hold and as a conflict
// when they do not). The matched graph is split into strongly connected blocks (Tarjan, 1972) and
// the blocks are solved in order by damped Newton, with bounded iterations and a wall-clock limit.
// Most blocks are one equation in one unknown; a given T, s or x with a known pressure is inverted
// directly by IF97.
//
// The matching is a cheap pass (each equation takes the first free unknown it lists) completed by
// depth-first searches for augmenting paths that remember which equations lead nowhere, so that
// a flowsheet is matched in work linear in its size; a budget hands the rest to Hopcroft and
// Karp's algorithm, O(E sqrt(V)), whatever the system (see matcher). The time limit covers the
// analysis as well as the solving.
//
// Givens are tried for the matching before unit equations, so when a balance is redundant it is
// the balance, not a given, that is left over and reported as a closure. One mass balance of each
// closed loop (a cycle with no feed or product) is left out of the matching beforehand: the
// balances of a loop sum to zero whatever the flows, a dependence no matching can see.
//
// A stream whose solved state lies on the saturation line (within 1e-8 in h) is reported as the
// saturated liquid or vapour itself, quality exactly 0 or 1.
package solve
