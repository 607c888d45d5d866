// Package if97 computes the thermodynamic properties of water and steam by
// the IAPWS Industrial Formulation 1997 (IAPWS R7-97(2012)) and its
// supplementary releases on backward equations.
//
// The public functions take and return SI base units (Pa, K, J/kg,
// J/(kg K), m3/kg, kg/m3, m/s); internally every equation runs in the
// release's own units (MPa, kJ/kg), so its coefficients stay as printed.
// Inputs given as (p,h), (p,s) or (h,s) start from the backward equations
// and are refined on the forward equations until those reproduce the
// inputs, so a state round-trips exactly rather than to backward-equation
// accuracy.
package if97

//go:generate go run gen.go
