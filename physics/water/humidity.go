package water

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// WaterMoleFraction returns the mole fraction of water vapour in a gas at
// temperature t and total pressure p whose relative humidity is
// relativeHumidity (a fraction, 0.65 for 65 %):
//
//	x_w = φ · psat(T) / p
//
// It treats the gas and the vapour as an ideal mixture (Dalton's law) and
// neglects the enhancement factor f, which is about 1.004 for moist air near
// atmospheric pressure (it grows with pressure), so x_w is low by that
// factor. psat is SaturationPressure (IAPWS-IF97 region 4).
//
// Source: ASHRAE Handbook - Fundamentals (2017), ch. 1 Psychrometrics,
// definition of relative humidity φ = x_w/x_ws and the enhancement factor;
// Çengel & Boles, Thermodynamics: An Engineering Approach, 6th ed. (2008),
// ch. 14 (φ = Pv/Pg). Valid for 0 ≤ φ ≤ 1, p > 0 and, when φ > 0,
// 273.15 K ≤ t ≤ 647.096 K (saturation over liquid water; below 0 °C the
// humidity would refer to ice, which is not covered). An error is returned
// when x_w would exceed 1: then φ psat(T) > p, the water would boil at p.
func WaterMoleFraction(relativeHumidity float64, t physics.Kelvin, p physics.Pascal) (float64, error) {
	switch {
	case !(relativeHumidity >= 0) || !(relativeHumidity <= 1):
		return 0, &physics.DomainError{Name: "relative_humidity", Value: relativeHumidity, Want: "0 <= RH <= 1",
			Reason: fmt.Sprintf("relative humidity %g must be a fraction between 0 and 1 (0.65 for 65 %%)", relativeHumidity)}
	case !(p > 0) || math.IsInf(float64(p), 0):
		return 0, &physics.DomainError{Name: "pressure", Value: float64(p), Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	case !(t > 0) || math.IsInf(float64(t), 0):
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "finite, > 0 K",
			Reason: "temperature must be a finite absolute temperature above 0 K"}
	}
	if relativeHumidity == 0 {
		return 0, nil
	}
	if t < MinSaturationTemperature {
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: ">= 273.15 K for RH > 0",
			Reason: fmt.Sprintf("at %g K (below 0 °C) relative humidity refers to saturation over ice, which is not covered; give the water content as a mole fraction instead", float64(t))}
	}
	if t > CriticalTemperature {
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "<= 647.096 K for RH > 0",
			Reason: fmt.Sprintf("at %g K, above the critical temperature of water (647.096 K), relative humidity is not defined; give the water content as a mole fraction instead", float64(t))}
	}
	psat, err := SaturationPressure(t)
	if err != nil {
		return 0, err
	}
	x := relativeHumidity * float64(psat) / float64(p)
	if !(x <= 1) {
		return 0, &physics.DomainError{Name: "relative_humidity", Value: relativeHumidity, Want: "RH psat(T) <= p",
			Reason: fmt.Sprintf("at %g K the water vapour pressure at relative humidity %g (%.6g Pa) exceeds the total pressure %g Pa: the water would boil, so no humid gas exists at this state", float64(t), relativeHumidity, relativeHumidity*float64(psat), float64(p))}
	}
	return x, nil
}

// DewPointTemperature returns the temperature at which a gas at total
// pressure p with water mole fraction waterMoleFraction starts to condense
// liquid water: the saturation temperature at the water partial pressure,
//
//	T_dp = Tsat(x_w · p)
//
// for an ideal mixture without enhancement factor (see WaterMoleFraction).
// Tsat is SaturationTemperature (IAPWS-IF97 region 4).
//
// Source: ASHRAE Handbook - Fundamentals (2017), ch. 1 Psychrometrics,
// dew-point temperature; Çengel & Boles, Thermodynamics: An Engineering
// Approach, 6th ed. (2008), ch. 14 (T_dp = Tsat @ Pv). Valid for
// 0 < x_w ≤ 1 and 611.213 Pa ≤ x_w p ≤ 22.064 MPa. Below 611.213 Pa the
// water would deposit as frost at a frost point below 0 °C; that needs the
// sublimation line of ice, which is not covered, and an error says so.
func DewPointTemperature(waterMoleFraction float64, p physics.Pascal) (physics.Kelvin, error) {
	switch {
	case !(waterMoleFraction > 0) || !(waterMoleFraction <= 1):
		return 0, &physics.DomainError{Name: "water_mole_fraction", Value: waterMoleFraction, Want: "0 < x_w <= 1",
			Reason: fmt.Sprintf("water mole fraction %g must lie above 0 and at most 1 (a dry gas has no dew point)", waterMoleFraction)}
	case !(p > 0) || math.IsInf(float64(p), 0):
		return 0, &physics.DomainError{Name: "pressure", Value: float64(p), Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	}
	pw := waterMoleFraction * float64(p)
	switch {
	case pw < float64(MinSaturationPressure):
		return 0, &physics.DomainError{Name: "water_partial_pressure", Value: pw, Want: ">= 611.213 Pa",
			Reason: fmt.Sprintf("the water partial pressure %.6g Pa lies below the triple-point pressure (611.213 Pa): the water would deposit as frost at a frost point below 0 °C, which is not computed", pw)}
	case pw > float64(CriticalPressure):
		return 0, &physics.DomainError{Name: "water_partial_pressure", Value: pw, Want: "<= 22.064 MPa",
			Reason: fmt.Sprintf("the water partial pressure %.6g Pa lies above the critical pressure of water (22.064 MPa): no dew point is defined", pw)}
	}
	return SaturationTemperature(physics.Pascal(pw))
}

// Condensation is the answer of WaterCondensation for one station.
type Condensation struct {
	// Condenses is true when liquid water forms: T below the dew point.
	Condenses bool
	// PartialPressure is the water partial pressure x_w p.
	PartialPressure physics.Pascal
	// DewPointKnown is false when the dew point is not defined or not
	// covered (dry gas, or a partial pressure below the triple point, where
	// the gas would frost, not dew); DewPoint and Margin are then 0.
	DewPointKnown bool
	// DewPoint is the dew-point temperature at the station.
	DewPoint physics.Kelvin
	// Margin is T − T_dp: how far the station lies above its dew point
	// (negative when water condenses).
	Margin physics.Kelvin
}

// WaterCondensation reports whether water condenses at a station at
// temperature t and pressure p carrying water mole fraction
// waterMoleFraction: it does when T < T_dp (DewPointTemperature), that is
// when x_w p exceeds psat(T).
//
// Source: ASHRAE Handbook - Fundamentals (2017), ch. 1 Psychrometrics
// (condensation below the dew point); ideal mixture, enhancement factor
// neglected (see WaterMoleFraction). Valid for 0 ≤ x_w ≤ 1, p > 0, t > 0.
// A dry gas never condenses. Above 647.096 K water cannot be liquid. When
// the partial pressure lies below the triple point (611.213 Pa) the answer
// is "no" for t ≥ 273.16 K (no liquid and no frost can form); below
// 273.16 K frost could form and an error says that this is not covered.
func WaterCondensation(t physics.Kelvin, waterMoleFraction float64, p physics.Pascal) (Condensation, error) {
	switch {
	case !(t > 0) || math.IsInf(float64(t), 0):
		return Condensation{}, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "finite, > 0 K",
			Reason: "temperature must be a finite absolute temperature above 0 K"}
	case !(waterMoleFraction >= 0) || !(waterMoleFraction <= 1):
		return Condensation{}, &physics.DomainError{Name: "water_mole_fraction", Value: waterMoleFraction, Want: "0 <= x_w <= 1",
			Reason: fmt.Sprintf("water mole fraction %g must lie between 0 and 1", waterMoleFraction)}
	case !(p > 0) || math.IsInf(float64(p), 0):
		return Condensation{}, &physics.DomainError{Name: "pressure", Value: float64(p), Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	}
	pw := waterMoleFraction * float64(p)
	out := Condensation{PartialPressure: physics.Pascal(pw)}
	if waterMoleFraction == 0 {
		return out, nil
	}
	if pw >= float64(MinSaturationPressure) && pw <= float64(CriticalPressure) {
		tdp, err := SaturationTemperature(physics.Pascal(pw))
		if err != nil {
			return Condensation{}, err
		}
		out.DewPointKnown = true
		out.DewPoint = tdp
		out.Margin = t - tdp
		out.Condenses = t < tdp
		return out, nil
	}
	switch {
	case pw > float64(CriticalPressure):
		// No saturation at this partial pressure; liquid can form only
		// below the critical temperature, where psat(T) < pw always holds.
		out.Condenses = t < CriticalTemperature
		return out, nil
	case t >= TriplePointTemperature:
		// pw below the triple point: psat(T) > pw for every T at or above
		// the triple point, so neither dew nor frost forms.
		return out, nil
	}
	return Condensation{}, &physics.DomainError{Name: "temperature", Value: float64(t), Want: ">= 273.16 K when x_w p < 611.213 Pa",
		Reason: fmt.Sprintf("at %g K with a water partial pressure of %.6g Pa (below the triple point) water may deposit as frost; the frost point is not computed", float64(t), pw)}
}
