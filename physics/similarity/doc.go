// Package similarity judges whether two operating points of one compressor
// are aerodynamically similar, in the sense of ASME PTC 10-1997
// (Performance Test Code on Compressors and Exhausters), section 3: the
// ratio of specific-volume ratios, the machine Mach number, the machine
// Reynolds number and the flow coefficient of the new point against those
// of the point the performance is known at. A point outside the code's
// bands means the machine's known performance is being extrapolated.
//
// The machine Reynolds number needs the gas viscosity: the dilute-gas
// viscosity of each component by the corresponding-states method of Lucas
// and the mixture by the rule of Wilke, both as given in Poling, Prausnitz
// & O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), §9-4 and
// §9-5.
//
// Units: SI (K, Pa, kg/mol, Pa s, m, m/s, m3/kg). The PTC 10 bands are
// quoted from memory (the code is not in the reference pack) and say so
// wherever they appear.
package similarity
