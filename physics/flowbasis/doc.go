// Package flowbasis converts between the three ways a compressor duty
// states its flow: mass flow (kg/s), actual volume flow at a state (m3/s at
// that temperature and pressure) and standard volume flow (m3/s at named
// reference conditions), with the density a gas model gives at each state.
//
// Reference conditions are named: "normal" (0 °C, 101.325 kPa), "standard"
// (15 °C, 101.325 kPa, ISO 13443) and "us-standard" (60 °F, 14.696 psia).
// A standard volume is the volume the same mass occupies at the reference
// conditions with the model's density there: a real-gas model applies its
// compressibility Z at the reference, an ideal model Z = 1. Contracts that
// define standard volume on the ideal-gas basis use IdealReferenceDensity.
//
// Units are SI: kg/s, m3/s, kg/m3, K, Pa absolute; molar quantities in mol.
//
// References:
//   - ISO 13443:1996, Natural gas - Standard reference conditions.
//   - DIN 1343:1990, Reference conditions, normal conditions, normal volume.
//   - NIST Special Publication 811 (2008), Guide for the Use of the SI,
//     Appendix B (ft, psi, °F conversions).
//   - CODATA 2018 recommended values (molar gas constant; molar volume of
//     an ideal gas at 273.15 K and 101.325 kPa).
package flowbasis
