// Package cubic gives the residual (departure) part of two-parameter cubic
// equations of state for mixtures: compressibility factor, molar volume,
// enthalpy, entropy and isochoric heat-capacity departures, the pressure
// derivatives (dP/dT)_v and (dP/dv)_T, fugacity coefficients, a
// tangent-plane stability test, pure-component vapour pressures and mixture
// dew temperatures. The ideal-gas part (cp_ig(T), h_ig, s_ig) is the
// caller's: physics/gas adds it.
//
// All cubics are written in the generic form
//
//	P = R T/(v − b) − a(T)/((v + δ1 b)(v + δ2 b))
//
// with δ1 = 1+√2, δ2 = 1−√2 for Peng-Robinson and δ1 = 1, δ2 = 0 for
// Soave-Redlich-Kwong, and van der Waals one-fluid mixing rules
//
//	a = Σi Σj xi xj √(ai aj) (1 − kij),  b = Σi xi bi.
//
// Units are SI: T in K, P in Pa, molar volume in m3/mol. Departures are
// dimensionless, divided by R T or R (R = physics.UniversalGasConstant).
// Every temperature derivative of a(T) is analytic.
//
// References:
//   - D.-Y. Peng and D. B. Robinson, "A New Two-Constant Equation of State",
//     Ind. Eng. Chem. Fundam. 15(1):59-64 (1976).
//   - D. B. Robinson and D.-Y. Peng, "The Characterization of the Heptanes
//     and Heavier Fractions for the GPA Peng-Robinson Programs", GPA
//     Research Report RR-28 (1978).
//   - G. Soave, "Equilibrium constants from a modified Redlich-Kwong equation
//     of state", Chem. Eng. Sci. 27(6):1197-1203 (1972).
//   - M. L. Michelsen, "The isothermal flash problem. Part I. Stability",
//     Fluid Phase Equilib. 9(1):1-19 (1982).
//   - M. L. Michelsen and J. M. Mollerup, Thermodynamic Models: Fundamentals
//     and Computational Aspects, 2nd ed., Tie-Line Publications (2007),
//     ch. 3 (generic cubic, residual Helmholtz energy and its derivatives;
//     chapter numbers cited in this package are from memory).
//   - G. M. Wilson, "A modified Redlich-Kwong equation of state, application
//     to general physical data calculations", AIChE 65th National Meeting,
//     Cleveland, paper 15C (1969) (K-value estimate, from memory).
package cubic
