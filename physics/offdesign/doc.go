// Package offdesign rates a built centrifugal stage away from its design
// point: the work at any flow and speed from the Euler equation with slip
// and backsweep (the exit density from the off-design compression,
// iterated), the efficiency from a map method scaled on the design point,
// choke at sonic flow in the narrowest passage and surge by a critical
// diffuser-inlet flow angle. It designs nothing (that is package stage);
// it takes the geometry as built.
//
// Units are SI (m, m/s, kg/s, Pa absolute, K, J/kg); rotational speed is
// in rev/min; angles in degrees. The compression uses the same gas models
// (package gas) and path integration (package path) as the sizing, so
// the fan laws are not assumed: they come out of the model as the tip
// Mach number falls.
//
// References:
//   - M. V. Casey and C. J. Robinson, "A method to estimate the
//     performance map of a centrifugal compressor stage", ASME J.
//     Turbomachinery 135(2):021034 (2013): the map is scaled from four
//     design-point numbers (flow coefficient, work coefficient, tip Mach
//     number, efficiency). The efficiency characteristic here follows its
//     structure (efficiency relative to the peak of each speed line in the
//     flow relative to the peak flow, gentle towards surge, steep towards
//     choke, the peak falling with tip Mach number); the exponents and
//     coefficients are from memory, not checked against the paper.
//   - S. L. Dixon and C. A. Hall, Fluid Mechanics and Thermodynamics of
//     Turbomachinery, 7th ed. (2014), ch. 7: Euler work with slip, the
//     relative frame at the inducer (rothalpy), choking of the inducer.
//   - Y. Senoo and Y. Kinoshita, "Influence of inlet flow conditions and
//     geometries of centrifugal vaneless diffusers on critical flow angle
//     for reverse flow", ASME J. Fluids Eng. 99:98 (1977): the critical
//     diffuser-inlet flow angle of 70-80 deg from radial (from memory).
//
// Surge and choke are estimates: the surge line of real stages scatters
// by some ±10-15 % in flow about any such criterion (Casey & Robinson
// 2013 say the surge line is the least certain part of the map; the band
// is common practice, no source).
package offdesign
