// Package stage sizes one centrifugal impeller stage from its required work:
// the Euler equation with slip and power input factor gives the tip speed,
// the rotational speed gives the tip diameter, continuity at the static
// density of each station gives the inlet and exit flow areas, and the
// velocity triangles give the Mach numbers and flow angles that the limits
// are checked against.
//
// Conventions: angles in degrees; the blade exit angle β2' is measured from
// the radial direction, positive for backsweep; the slip factor σ is
// 1 − (slip velocity)/U2, so that the exit whirl is
//
//	cθ2 = U2 (σ − φ2 tan β2'),  φ2 = cr2/U2.
//
// An axial eye may have inlet guide-vane prewhirl α1 (deg from axial,
// positive with the rotation, constant across the span), which enters the
// Euler work as −U1 cθ1 at the rms eye diameter; a radial inlet has none.
// The eye tip diameter may be given, follow from a given meridional
// velocity, or be chosen for the least shroud relative Mach number.
// References: Dixon & Hall, Fluid
// Mechanics and Thermodynamics of Turbomachinery, 7th ed. (2014), ch. 7;
// Saravanamuttoo et al., Gas Turbine Theory, 6th ed. (2009), ch. 4.
package stage
