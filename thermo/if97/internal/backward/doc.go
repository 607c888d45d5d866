// Package backward holds the IAPWS-IF97 backward and boundary equations: explicit
// approximations that give the starting point for an exact solve on the basic equations.
//
// Sources:
//   - IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the
//     Thermodynamic Properties of Water and Steam: T(p,h), T(p,s) for regions 1 and 2 and the
//     B2bc boundary.
//   - IAPWS SR2-01(2014), Revised Supplementary Release on Backward Equations for Pressure as a
//     Function of Enthalpy and Entropy p(h,s) for Regions 1 and 2.
//   - IAPWS SR4-04(2014), Revised Supplementary Release on Backward Equations p(h,s) for Region 3,
//     Equations as a Function of h and s for the Region Boundaries, and an Equation Tsat(h,s)
//     for Region 4.
//
// Units are those of the releases: p in MPa, T in K, h in kJ/kg, s in kJ/(kg K). The functions
// are pure and allocation-free. They do not check their inputs: outside the stated range of
// validity they return a number (or NaN/Inf) of no meaning, and the caller decides the region.
package backward

//go:generate go run ../polygen
