package physics

import "math"

// Kelvin is a thermodynamic temperature in K.
type Kelvin float64

// Pascal is an absolute pressure in Pa.
type Pascal float64

// JoulePerKg is a specific energy (enthalpy, work, head) in J/kg.
type JoulePerKg float64

// JoulePerKgK is a specific heat capacity or entropy in J/(kg K).
type JoulePerKgK float64

// KgPerS is a mass flow in kg/s.
type KgPerS float64

// CubicMeterPerS is a volume flow in m3/s.
type CubicMeterPerS float64

// KgPerCubicMeter is a density in kg/m3.
type KgPerCubicMeter float64

// MeterPerS is a velocity in m/s.
type MeterPerS float64

// Meter is a length in m.
type Meter float64

// Watt is a power in W.
type Watt float64

// RevPerMin is a rotational speed in rev/min.
type RevPerMin float64

// UniversalGasConstant is the molar gas constant R in J/(mol K).
//
// Source: CODATA 2018 (exact since the 2019 SI redefinition),
// R = N_A k = 8.314462618... J/(mol K).
const UniversalGasConstant = 8.314462618

// StandardAtmosphere is the standard atmospheric pressure in Pa
// (ISO 2533; 101 325 Pa by definition).
const StandardAtmosphere Pascal = 101325

// Finite reports whether every value is a finite number (no NaN, no ±Inf).
func Finite(values ...float64) bool {
	for _, v := range values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}
