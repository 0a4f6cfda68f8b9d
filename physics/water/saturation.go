package water

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// Limits of the IAPWS-IF97 saturation line (region 4).
const (
	// MinSaturationTemperature is the lower temperature limit of region 4,
	// 273.15 K (IAPWS-IF97 (2007), eq. 30 range).
	MinSaturationTemperature physics.Kelvin = 273.15
	// CriticalTemperature is the critical temperature of water, 647.096 K
	// (IAPWS-IF97 (2007), critical parameters), the upper end of the
	// saturation line.
	CriticalTemperature physics.Kelvin = 647.096
	// MinSaturationPressure is psat(273.15 K) = 611.213 Pa, the lower
	// pressure limit of eq. 31 (IAPWS-IF97 (2007), region 4).
	MinSaturationPressure physics.Pascal = 611.213
	// CriticalPressure is the critical pressure of water, 22.064 MPa
	// (IAPWS-IF97 (2007), critical parameters), the upper end of the
	// saturation line.
	CriticalPressure physics.Pascal = 22.064e6
	// TriplePointTemperature is the triple point of water, 273.16 K (the
	// defining point of the kelvin before 2019, exact then). Below it water
	// vapour deposits as frost, not dew.
	TriplePointTemperature physics.Kelvin = 273.16
)

// Coefficients n1..n10 of the region-4 equations, IAPWS-IF97 (2007),
// Table 34.
const (
	n1  = 0.11670521452767e4
	n2  = -0.72421316703206e6
	n3  = -0.17073846940092e2
	n4  = 0.12020824702470e5
	n5  = -0.32325550322333e7
	n6  = 0.14915108613530e2
	n7  = -0.48232657361591e4
	n8  = 0.40511340542057e6
	n9  = -0.23855557567849
	n10 = 0.65017534844798e3
)

// SaturationPressure returns the vapour pressure of water at temperature t
// from the basic equation of IAPWS-IF97 region 4 (with T* = 1 K, p* = 1 MPa):
//
//	ϑ = T/T* + n9/(T/T* − n10)
//	A = ϑ² + n1 ϑ + n2,  B = n3 ϑ² + n4 ϑ + n5,  C = n6 ϑ² + n7 ϑ + n8
//	psat/p* = [2C / (−B + (B² − 4AC)^½)]⁴
//
// Source: IAPWS, Revised Release on the IAPWS Industrial Formulation 1997
// (2007), eqs. 29b and 30, Table 34. Valid for 273.15 K ≤ t ≤ 647.096 K.
func SaturationPressure(t physics.Kelvin) (physics.Pascal, error) {
	if !(t >= MinSaturationTemperature) || !(t <= CriticalTemperature) {
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "273.15 K <= T <= 647.096 K",
			Reason: fmt.Sprintf("temperature %g K lies outside the water saturation line of IAPWS-IF97 (273.15 K to 647.096 K, the critical point)", float64(t))}
	}
	tt := float64(t)
	theta := tt + n9/(tt-n10)
	a := theta*theta + n1*theta + n2
	b := n3*theta*theta + n4*theta + n5
	c := n6*theta*theta + n7*theta + n8
	x := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	x *= x
	return physics.Pascal(1e6 * x * x), nil
}

// SaturationTemperature returns the boiling temperature of water at
// pressure p from the backward equation of IAPWS-IF97 region 4 (with
// T* = 1 K, p* = 1 MPa):
//
//	β = (p/p*)^¼
//	E = β² + n3 β + n6,  F = n1 β² + n4 β + n7,  G = n2 β² + n5 β + n8
//	D = 2G / (−F − (F² − 4EG)^½)
//	Tsat/T* = [n10 + D − ((n10 + D)² − 4(n9 + n10 D))^½] / 2
//
// Source: IAPWS, Revised Release on the IAPWS Industrial Formulation 1997
// (2007), eqs. 29a and 31, Table 34. Valid for 611.213 Pa ≤ p ≤ 22.064 MPa.
func SaturationTemperature(p physics.Pascal) (physics.Kelvin, error) {
	if !(p >= MinSaturationPressure) || !(p <= CriticalPressure) {
		return 0, &physics.DomainError{Name: "pressure", Value: float64(p), Want: "611.213 Pa <= p <= 22.064 MPa",
			Reason: fmt.Sprintf("pressure %g Pa lies outside the water saturation line of IAPWS-IF97 (611.213 Pa to 22.064 MPa, the critical point)", float64(p))}
	}
	beta := math.Sqrt(math.Sqrt(float64(p) / 1e6))
	e := beta*beta + n3*beta + n6
	f := n1*beta*beta + n4*beta + n7
	g := n2*beta*beta + n5*beta + n8
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	s := n10 + d
	return physics.Kelvin(0.5 * (s - math.Sqrt(s*s-4*(n9+n10*d)))), nil
}

// MolarMass of water, kg/mol (IAPWS-95, Wagner & Pruss 2002; from memory).
const MolarMass = 0.018015268

// VaporizationEnthalpy returns the enthalpy of vaporisation of water at
// saturation temperature t by the Clausius-Clapeyron equation with an ideal
// vapour and a negligible liquid volume,
//
//	h_fg = (R/M) T² d ln psat/dT,
//
// the slope taken from the IAPWS-IF97 region 4 saturation pressure by a
// central difference. Below 373 K the vapour's non-ideality and the
// liquid volume change h_fg by less than about 0.5 % (at 25 °C it gives
// 2.44 MJ/kg against 2441.7 kJ/kg of the IAPWS-95 steam tables, from
// memory); valid 273.16 K <= t <= 473.15 K.
func VaporizationEnthalpy(t physics.Kelvin) (physics.JoulePerKg, error) {
	tt := float64(t)
	if !(tt >= float64(TriplePointTemperature)) || !(tt <= 473.15) {
		return 0, &physics.DomainError{Name: "temperature", Value: tt, Want: "273.16 K <= T <= 473.15 K",
			Reason: fmt.Sprintf("temperature %g K lies outside the range of the vaporisation enthalpy (273.16 K to 473.15 K)", tt)}
	}
	const dt = 0.01
	lo, err := SaturationPressure(physics.Kelvin(tt - dt))
	if err != nil {
		return 0, err
	}
	hi, err := SaturationPressure(physics.Kelvin(tt + dt))
	if err != nil {
		return 0, err
	}
	slope := (math.Log(float64(hi)) - math.Log(float64(lo))) / (2 * dt)
	return physics.JoulePerKg(physics.UniversalGasConstant / MolarMass * tt * tt * slope), nil
}
