// Package units is the one place that turns a physical input of the API
// into SI: a JSON number is taken as already in the field's SI unit, a
// string carries its own unit ("14.7 psia", "35 degC", "12 barg",
// "2400 Nm3/h").
//
// Results are SI: Pa absolute, K, kg/s, m3/s, m/s, m, W, J/kg. Rotational
// speed is the exception the service uses throughout: rev/min, the unit of
// the trade. Standard volume flows are returned as m3/s at their reference
// conditions together with the name of those conditions ("normal",
// "standard", "us-standard"), so that the service converts them with the
// gas model's density there (see stagewright/physics/flowbasis, whose
// reference names these match).
//
// Gauge pressures ("barg", "psig", "kPag") need the ambient pressure; the
// caller passes it (the service applies and reports the default, the
// standard atmosphere 101 325 Pa, StandardAtmosphere).
//
// Unit symbols are matched without regard to case or spaces ("MPa",
// "mpa", "bar g" and "barg" are all accepted); the degree sign may be
// written "°", "º" or "deg". A number alone in a string ("101325") is
// rejected: send a JSON number for SI, or add the unit.
//
// Conversion factors are exact where the unit is defined exactly, from
// NIST Special Publication 811 (2008 ed.), Guide for the Use of the
// International System of Units, Appendix B (B.8 factors by alphabet, B.9
// by kind of quantity): ft = 0.3048 m, in = 0.0254 m, lb = 0.453 592 37 kg,
// lbf = 4.448 221 615 260 5 N, standard gravity 9.806 65 m/s2,
// atm = 101 325 Pa, bar = 1e5 Pa.
//
// This package imports only the standard library.
package units
