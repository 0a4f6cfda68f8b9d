// Package physics holds the pure computation of stagewright: unit types,
// domain errors and, in sub-packages by subject, gas properties (gas),
// cubic equations of state (cubic), water saturation (water), the
// compression path (path), stage aerodynamics (stage) and design limits
// (limits).
//
// Everything here is a pure function of its arguments: no I/O, no package
// state that changes, no imports from the rest of the project. Quantities
// are SI: K, Pa absolute, kg/s, m3/s, m, m/s, J/kg, J/(kg K), W; rotational
// speed is in rev/min, the unit of the trade. Ratios are plain float64 named
// for what they are.
//
// Bad input returns a *DomainError (it unwraps to ErrDomain); no function
// returns NaN or ±Inf or panics on input.
//
// References used across the sub-packages:
//   - S. L. Dixon and C. A. Hall, Fluid Mechanics and Thermodynamics of
//     Turbomachinery, 7th ed., Butterworth-Heinemann (2014).
//   - H. I. H. Saravanamuttoo, G. F. C. Rogers, H. Cohen, P. V. Straznicky,
//     Gas Turbine Theory, 6th ed., Pearson (2009), centrifugal compressors.
//   - J. M. Schultz, "The Polytropic Analysis of Centrifugal Compressors",
//     ASME J. Eng. Power 84(1):69-82 (1962); ASME PTC 10-1997.
//   - D.-Y. Peng and D. B. Robinson, Ind. Eng. Chem. Fundam. 15:59 (1976);
//     G. Soave, Chem. Eng. Sci. 27:1197 (1972).
package physics
