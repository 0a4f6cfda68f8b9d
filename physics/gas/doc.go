// Package gas gives the thermodynamic properties of compressor gases: a
// component catalogue, mixtures, and the models selected by name
// ("ideal-constant", "ideal", "peng-robinson", "srk", "gerg-2008"), all
// behind the Model interface, with (P,h) and (P,s) flashes.
//
// Units are SI and specific quantities are per kg: enthalpy J/kg, entropy
// J/(kg K). Each model states its reference state; only differences of h
// and s within one model are meaningful.
//
// Reference state of "ideal", "peng-robinson", "srk" and "gerg-2008": h = 0 and s = 0
// for every pure component as an ideal gas at 298.15 K and 101 325 Pa
// (ReferenceTemperature, ReferencePressure); a mixture adds the ideal
// mixing entropy −R Σ x ln x. (This is not the NIST/JANAF convention of
// enthalpies of formation and third-law entropies.)
//
// Ideal-gas heat capacities: NIST Chemistry WebBook Shomate fits (Chase,
// NIST-JANAF Thermochemical Tables, 4th ed., 1998) where NIST gives them;
// otherwise the cp/R polynomials of Poling, Prausnitz & O'Connell, The
// Properties of Gases and Liquids, 5th ed. (2001), Appendix A (coefficients
// from memory, checked in the tests against NIST WebBook tables and other
// published values); 5/2 R for the monatomic gases. Enthalpy and entropy
// are the analytic integrals of each range, stitched continuous.
//
// Real gases: the residual part comes from package cubic
// (Peng & Robinson 1976, Soave 1972, van der Waals mixing with kij), or,
// for "gerg-2008", the whole model from package gerg (Kunz & Wagner 2012,
// with its own ideal-gas part and the same reference state).
package gas
