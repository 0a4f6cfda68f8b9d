// Package water gives the saturation line of ordinary water and the
// humid-gas helpers built on it: the water mole fraction of a gas at a
// relative humidity, its dew point, and whether water condenses at a
// station.
//
// Units are SI: K and Pa absolute; mole fractions and relative humidity are
// plain fractions (0.65 for 65 %).
//
// References:
//   - IAPWS, Revised Release on the IAPWS Industrial Formulation 1997 for
//     the Thermodynamic Properties of Water and Steam (IAPWS-IF97), Lucerne
//     (2007), region 4: eqs. 30 and 31, Table 34 (coefficients), Tables 35
//     and 36 (verification values).
//   - ASHRAE Handbook - Fundamentals (2017), ch. 1 Psychrometrics
//     (relative humidity, dew point, enhancement factor); Y. A. Çengel and
//     M. A. Boles, Thermodynamics: An Engineering Approach, 6th ed. (2008),
//     ch. 14 (gas-vapour mixtures).
package water
