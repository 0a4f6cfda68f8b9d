package units

import "math"

// Exact base factors, NIST SP 811 (2008), Appendix B.8.
const (
	foot            = 0.3048          // m, exact
	inch            = 0.0254          // m, exact
	pound           = 0.45359237      // kg (avoirdupois), exact
	poundForce      = 4.4482216152605 // N, exact (lb · standard gravity)
	standardGrav    = 9.80665         // m/s2, exact (CGPM 1901)
	cubicFoot       = foot * foot * foot
	minute          = 60.0
	hour            = 3600.0
	day             = 86400.0
	psiPa           = poundForce / (inch * inch) // 6894.757 293 168… Pa
	atmPa           = 101325.0                   // Pa, exact
	barPa           = 1e5                        // Pa, exact
	mmHgPa          = 133.322387415              // conventional mmHg, 13.5951 g/cm3 · g_n · 1 mm (definition from memory; SP 811 B.8 prints 1.333 224 E+02)
	inHgPa          = mmHgPa * 25.4              // conventional inHg, 3386.388 640 341 Pa (SP 811 B.8 prints 3.386 389 E+03)
	torrPa          = atmPa / 760                // Pa, exact
	horsepowerW     = 550 * foot * poundForce    // 550 ft·lbf/s = 745.699 871 582 270 2 W
	metricHPW       = 75 * standardGrav          // 75 kgf·m/s = 735.498 75 W
	btuPerLb        = 2326.0                     // J/kg per Btu(IT)/lb, exact
	footPoundPerLbm = foot * standardGrav        // ft·lbf/lbm in J/kg: lbf/lbm = g_n, 2.989 066 92
)

// StandardAtmosphere is the standard atmospheric pressure in Pa
// (101 325 Pa by definition; NIST SP 811 (2008), B.8), the usual ambient
// for gauge pressures when none is given.
const StandardAtmosphere = atmPa

// Reference-condition names of standard volume flows; they match the names
// of stagewright/physics/flowbasis.
const (
	// ReferenceNormal is 273.15 K and 101 325 Pa (DIN 1343), the Nm3.
	ReferenceNormal = "normal"
	// ReferenceStandard is 288.15 K and 101 325 Pa (ISO 13443), the Sm3.
	ReferenceStandard = "standard"
	// ReferenceUSStandard is 60 °F and 14.696 psia, the standard cubic
	// foot of MMSCFD and SCFM.
	ReferenceUSStandard = "us-standard"
)

// unit converts a value in some unit to SI: si = v·factor + offset, plus
// the ambient pressure when gauge is set.
type unit struct {
	factor float64
	offset float64
	gauge  bool
	ref    string // reference conditions, for standard volume flows
}

func lin(f float64) (unit, bool) { return unit{factor: f}, true }

// pressureUnit returns the unit to Pa absolute.
func pressureUnit(s string) (unit, bool) {
	switch s {
	case "pa", "pa(a)", "paa":
		return lin(1)
	case "hpa":
		return lin(100)
	case "kpa", "kpa(a)", "kpaa":
		return lin(1e3)
	case "kpag", "kpa(g)":
		return unit{factor: 1e3, gauge: true}, true
	case "mpa", "mpa(a)", "mpaa":
		return lin(1e6)
	case "mpag", "mpa(g)":
		return unit{factor: 1e6, gauge: true}, true
	case "mbar", "mbar(a)", "mbara":
		return lin(barPa / 1000)
	case "mbarg", "mbar(g)":
		return unit{factor: barPa / 1000, gauge: true}, true
	case "bar", "bara", "bar(a)", "bar.a":
		return lin(barPa)
	case "barg", "bar(g)", "bar.g":
		return unit{factor: barPa, gauge: true}, true
	case "psia", "psi(a)":
		return lin(psiPa)
	case "psig", "psi(g)":
		return unit{factor: psiPa, gauge: true}, true
	case "atm":
		return lin(atmPa)
	case "mmhg":
		return lin(mmHgPa)
	case "inhg":
		return lin(inHgPa)
	case "torr":
		return lin(torrPa)
	}
	return unit{}, false
}

const pressureUnits = "Pa, kPa, MPa, bar, bara, barg, psia, psig, atm, mmHg (also hPa, mbar, kPag, MPag, inHg, torr)"

// temperatureUnit returns the unit to K.
func temperatureUnit(s string) (unit, bool) {
	switch s {
	case "k", "kelvin", "degk":
		return lin(1)
	case "degc", "c", "celsius":
		return unit{factor: 1, offset: 273.15}, true
	case "degf", "f", "fahrenheit":
		return unit{factor: 5.0 / 9.0, offset: 459.67 * 5.0 / 9.0}, true
	case "r", "degr", "rankine":
		return lin(5.0 / 9.0)
	}
	return unit{}, false
}

const temperatureUnits = "K, degC (°C), degF (°F), R (degR)"

// massFlowUnit returns the unit to kg/s.
func massFlowUnit(s string) (unit, bool) {
	switch s {
	case "kg/s":
		return lin(1)
	case "g/s":
		return lin(1e-3)
	case "kg/min":
		return lin(1 / minute)
	case "kg/h", "kg/hr":
		return lin(1 / hour)
	case "t/h", "t/hr", "tonne/h":
		return lin(1000 / hour)
	case "t/d", "tonne/d":
		return lin(1000 / day)
	case "lb/s", "lbm/s":
		return lin(pound)
	case "lb/min", "lbm/min":
		return lin(pound / minute)
	case "lb/h", "lb/hr", "lbm/h", "lbm/hr":
		return lin(pound / hour)
	}
	return unit{}, false
}

const massFlowUnits = "kg/s, kg/h, t/h, lb/s, lb/h (also kg/min, t/d, lb/min)"

// volumeFlowUnit returns the unit of actual volume flow to m3/s.
func volumeFlowUnit(s string) (unit, bool) {
	switch s {
	case "m3/s", "am3/s":
		return lin(1)
	case "m3/min", "am3/min":
		return lin(1 / minute)
	case "m3/h", "m3/hr", "am3/h", "am3/hr":
		return lin(1 / hour)
	case "l/s":
		return lin(1e-3)
	case "l/min":
		return lin(1e-3 / minute)
	case "ft3/s", "acfs":
		return lin(cubicFoot)
	case "ft3/min", "acfm":
		return lin(cubicFoot / minute)
	case "ft3/h", "ft3/hr", "acfh":
		return lin(cubicFoot / hour)
	}
	return unit{}, false
}

const volumeFlowUnits = "m3/s, m3/h, ACFM, ft3/min, L/s (also m3/min, L/min, ft3/s, ft3/h)"

// speedUnit returns the unit of rotational speed to rev/min.
func speedUnit(s string) (unit, bool) {
	switch s {
	case "rpm", "rev/min", "r/min", "1/min":
		return lin(1)
	case "rev/s", "rps", "hz":
		return lin(60)
	case "rad/s":
		return lin(60 / (2 * math.Pi))
	}
	return unit{}, false
}

const speedUnits = "rpm (rev/min), rev/s, Hz, rad/s"

// velocityUnit returns the unit to m/s.
func velocityUnit(s string) (unit, bool) {
	switch s {
	case "m/s":
		return lin(1)
	case "km/h":
		return lin(1000 / hour)
	case "ft/s":
		return lin(foot)
	case "ft/min":
		return lin(foot / minute)
	}
	return unit{}, false
}

const velocityUnits = "m/s, ft/s, ft/min, km/h"

// lengthUnit returns the unit to m.
func lengthUnit(s string) (unit, bool) {
	switch s {
	case "m":
		return lin(1)
	case "cm":
		return lin(1e-2)
	case "mm":
		return lin(1e-3)
	case "in", "inch":
		return lin(inch)
	case "ft":
		return lin(foot)
	}
	return unit{}, false
}

const lengthUnits = "m, mm, cm, in, ft"

// powerUnit returns the unit to W.
func powerUnit(s string) (unit, bool) {
	switch s {
	case "w":
		return lin(1)
	case "kw":
		return lin(1e3)
	case "mw":
		return lin(1e6)
	case "hp", "bhp":
		return lin(horsepowerW)
	case "hp(metric)":
		return lin(metricHPW)
	}
	return unit{}, false
}

const powerUnits = "W, kW, MW, hp (550 ft·lbf/s), hp(metric)"

// specificEnergyUnit returns the unit of specific energy or head to J/kg.
// Head in a length ("m", "ft") is a column of the fluid under standard
// gravity: J/kg = g_n · height.
func specificEnergyUnit(s string) (unit, bool) {
	switch s {
	case "j/kg", "m2/s2":
		return lin(1)
	case "kj/kg":
		return lin(1e3)
	case "btu/lb", "btu/lbm":
		return lin(btuPerLb)
	case "ft.lbf/lbm", "ft.lbf/lb", "ftlbf/lbm", "ftlbf/lb", "ft.lb/lb":
		return lin(footPoundPerLbm)
	case "m":
		return lin(standardGrav)
	case "ft":
		return lin(footPoundPerLbm)
	}
	return unit{}, false
}

const specificEnergyUnits = "J/kg, kJ/kg, Btu/lb, ft·lbf/lbm, head in m or ft (× g_n)"

// standardFlowUnit returns the unit of standard volume flow to m3/s at its
// reference conditions.
func standardFlowUnit(s string) (unit, bool) {
	switch s {
	case "nm3/s":
		return unit{factor: 1, ref: ReferenceNormal}, true
	case "nm3/h", "nm3/hr":
		return unit{factor: 1 / hour, ref: ReferenceNormal}, true
	case "nm3/d":
		return unit{factor: 1 / day, ref: ReferenceNormal}, true
	case "sm3/s":
		return unit{factor: 1, ref: ReferenceStandard}, true
	case "sm3/h", "sm3/hr":
		return unit{factor: 1 / hour, ref: ReferenceStandard}, true
	case "sm3/d":
		return unit{factor: 1 / day, ref: ReferenceStandard}, true
	case "mmscfd", "mmscf/d":
		return unit{factor: 1e6 * cubicFoot / day, ref: ReferenceUSStandard}, true
	case "mscfd", "mscf/d":
		return unit{factor: 1e3 * cubicFoot / day, ref: ReferenceUSStandard}, true
	case "scfd", "scf/d":
		return unit{factor: cubicFoot / day, ref: ReferenceUSStandard}, true
	case "scfh", "scf/h":
		return unit{factor: cubicFoot / hour, ref: ReferenceUSStandard}, true
	case "scfm", "scf/min":
		return unit{factor: cubicFoot / minute, ref: ReferenceUSStandard}, true
	}
	return unit{}, false
}

const standardFlowUnits = "Nm3/h, Sm3/h, MMSCFD, SCFM (also Nm3/s, Nm3/d, Sm3/s, Sm3/d, MSCFD, SCFD, SCFH)"
