package flowbasis

import (
	"fmt"
	"math"
	"strings"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// Trade units of standard volume flow, as m3/s at their reference
// conditions: multiply a value in the trade unit by the constant
// (48 * MMSCFD), divide to convert back. The foot is 0.3048 m exactly
// (NIST SP 811 (2008), Appendix B.8), so ft3 = 0.028 316 846 592 m3.
const (
	// MMSCFD is one million standard cubic feet per day in m3/s at
	// USStandard: 1e6 · 0.3048³ / 86400 = 0.327 741 28 m3/s.
	MMSCFD physics.CubicMeterPerS = 1e6 * 0.3048 * 0.3048 * 0.3048 / 86400
	// SCFM is one standard cubic foot per minute in m3/s at USStandard:
	// 0.3048³ / 60 = 4.719 474 432e-4 m3/s. (Compressed-air catalogues often
	// state SCFM at other conditions; pass their Reference explicitly.)
	SCFM physics.CubicMeterPerS = 0.3048 * 0.3048 * 0.3048 / 60
	// NormalCubicMeterPerHour is one Nm3/h in m3/s at Normal.
	NormalCubicMeterPerHour physics.CubicMeterPerS = 1.0 / 3600
	// StandardCubicMeterPerHour is one Sm3/h in m3/s at Standard.
	StandardCubicMeterPerHour physics.CubicMeterPerS = 1.0 / 3600
)

// ReferenceDensity returns the density of model m at the reference
// conditions ref: m.State(ref.Temperature, ref.Pressure).Density, so a
// real-gas model applies its Z there.
//
// Source: ISO 13443:1996 (the standard volume is the volume at the
// reference conditions); ρ = p M / (Z R T). Valid where the model gives a
// single-phase gas at the reference conditions; a gas that would be liquid
// or two-phase there (heavy ends at 15 °C and 1 atm) has no real-gas
// standard volume, and an error says to use the ideal-gas basis
// (IdealReferenceDensity) instead.
func ReferenceDensity(m gas.Model, ref Reference) (physics.KgPerCubicMeter, error) {
	if err := ref.check(); err != nil {
		return 0, err
	}
	st, err := m.State(ref.Temperature, ref.Pressure)
	if err != nil {
		return 0, fmt.Errorf("density at %s reference conditions: %w", ref.Name, err)
	}
	if st.Phase == gas.PhaseLiquid || st.Phase == gas.PhaseTwoPhase {
		return 0, &physics.DomainError{Name: "reference", Value: float64(ref.Temperature), Want: "a gas at the reference conditions",
			Reason: fmt.Sprintf("the gas would be %s at the %s reference conditions (%g K, %g Pa), so it has no real-gas standard volume there; state the flow as mass flow or use the ideal-gas basis", st.Phase, ref.Name, float64(ref.Temperature), float64(ref.Pressure))}
	}
	if !(st.Density > 0) || math.IsInf(float64(st.Density), 0) {
		return 0, &physics.DomainError{Name: "density", Value: float64(st.Density), Want: "finite, > 0 kg/m3",
			Reason: fmt.Sprintf("the gas model gave no usable density at the %s reference conditions", ref.Name)}
	}
	return st.Density, nil
}

// IdealReferenceDensity returns the ideal-gas density at the reference
// conditions of a gas of molar mass molarMass (kg/mol):
//
//	ρ = p M / (R T)
//
// with R = 8.314 462 618 J/(mol K) (CODATA 2018). This is the basis of
// standard volumes that are defined for the ideal gas (Z = 1 at the
// reference). Valid for 0 < molarMass < 1 kg/mol.
func IdealReferenceDensity(molarMass float64, ref Reference) (physics.KgPerCubicMeter, error) {
	if !(molarMass > 0) || !(molarMass < 1) {
		return 0, &physics.DomainError{Name: "molar_mass", Value: molarMass, Want: "0 < M < 1 kg/mol",
			Reason: fmt.Sprintf("molar mass %g must be in kg/mol, above 0 and below 1 (air is 0.02897)", molarMass)}
	}
	v, err := IdealMolarVolume(ref)
	if err != nil {
		return 0, err
	}
	return physics.KgPerCubicMeter(molarMass / v), nil
}

// IdealMolarVolume returns the molar volume of an ideal gas at the
// reference conditions in m3/mol:
//
//	Vm = R T / p
//
// Source: CODATA 2018, R = 8.314 462 618 J/(mol K); at 273.15 K and
// 101.325 kPa Vm = 22.413 969 54e-3 m3/mol (CODATA 2018 molar volume of
// ideal gas). Valid for finite T > 0 and p > 0.
func IdealMolarVolume(ref Reference) (float64, error) {
	if err := ref.check(); err != nil {
		return 0, err
	}
	return physics.UniversalGasConstant * float64(ref.Temperature) / float64(ref.Pressure), nil
}

// IdealMolarFlow returns the molar flow (mol/s) that a standard volume flow
// q (m3/s at ref) stands for on the ideal-gas basis: n = q / Vm, with
// Vm = IdealMolarVolume(ref). Valid for finite q ≥ 0.
func IdealMolarFlow(q physics.CubicMeterPerS, ref Reference) (float64, error) {
	if err := checkFlow("standard_volume_flow", float64(q), "m3/s"); err != nil {
		return 0, err
	}
	v, err := IdealMolarVolume(ref)
	if err != nil {
		return 0, err
	}
	return float64(q) / v, nil
}

// MassFlow returns the mass flow of a volume flow q (m3/s) of fluid of
// density rho (kg/m3): ṁ = ρ q. It serves both an actual volume flow with
// the density at its state and a standard volume flow with the density at
// its reference conditions. Valid for finite q ≥ 0 and rho > 0.
func MassFlow(q physics.CubicMeterPerS, rho physics.KgPerCubicMeter) (physics.KgPerS, error) {
	if err := checkFlow("volume_flow", float64(q), "m3/s"); err != nil {
		return 0, err
	}
	if err := checkDensity(rho); err != nil {
		return 0, err
	}
	v, err := finite(float64(q)*float64(rho), "mass flow")
	return physics.KgPerS(v), err
}

// VolumeFlow returns the volume flow (m3/s) of a mass flow mdot (kg/s) at
// density rho (kg/m3): q = ṁ / ρ. With the density at a state it is the
// actual volume flow there; with the density at reference conditions it is
// the standard volume flow. Valid for finite mdot ≥ 0 and rho > 0.
func VolumeFlow(mdot physics.KgPerS, rho physics.KgPerCubicMeter) (physics.CubicMeterPerS, error) {
	if err := checkFlow("mass_flow", float64(mdot), "kg/s"); err != nil {
		return 0, err
	}
	if err := checkDensity(rho); err != nil {
		return 0, err
	}
	q, err := finite(float64(mdot)/float64(rho), "volume flow")
	return physics.CubicMeterPerS(q), err
}

// ActualVolumeFlow returns the actual volume flow (m3/s) of mass flow mdot
// at temperature t and pressure p: q = ṁ / ρ(T, p) with the density of
// model m. Valid where m gives a state at (t, p) and for finite mdot ≥ 0.
func ActualVolumeFlow(mdot physics.KgPerS, m gas.Model, t physics.Kelvin, p physics.Pascal) (physics.CubicMeterPerS, error) {
	st, err := m.State(t, p)
	if err != nil {
		return 0, fmt.Errorf("density at the flow state: %w", err)
	}
	return VolumeFlow(mdot, st.Density)
}

// MassFlowFromActual returns the mass flow (kg/s) of an actual volume flow
// q (m3/s) at temperature t and pressure p: ṁ = ρ(T, p) q with the density
// of model m. Valid where m gives a state at (t, p) and for finite q ≥ 0.
func MassFlowFromActual(q physics.CubicMeterPerS, m gas.Model, t physics.Kelvin, p physics.Pascal) (physics.KgPerS, error) {
	st, err := m.State(t, p)
	if err != nil {
		return 0, fmt.Errorf("density at the flow state: %w", err)
	}
	return MassFlow(q, st.Density)
}

// StandardVolumeFlow returns the standard volume flow (m3/s at ref) of
// mass flow mdot: q_ref = ṁ / ρ_ref with ρ_ref = ReferenceDensity(m, ref).
// Source: ISO 13443:1996 (volume at reference conditions). Valid as
// ReferenceDensity and for finite mdot ≥ 0.
func StandardVolumeFlow(mdot physics.KgPerS, m gas.Model, ref Reference) (physics.CubicMeterPerS, error) {
	rho, err := ReferenceDensity(m, ref)
	if err != nil {
		return 0, err
	}
	return VolumeFlow(mdot, rho)
}

// MassFlowFromStandard returns the mass flow (kg/s) of a standard volume
// flow q (m3/s at ref): ṁ = ρ_ref q with ρ_ref = ReferenceDensity(m, ref).
// Source: ISO 13443:1996 (volume at reference conditions). Valid as
// ReferenceDensity and for finite q ≥ 0.
func MassFlowFromStandard(q physics.CubicMeterPerS, m gas.Model, ref Reference) (physics.KgPerS, error) {
	rho, err := ReferenceDensity(m, ref)
	if err != nil {
		return 0, err
	}
	return MassFlow(q, rho)
}

// ActualFromStandard returns the actual volume flow (m3/s) at temperature
// t and pressure p of a standard volume flow q (m3/s at ref), through the
// mass flow:
//
//	q_act = q_ref · ρ_ref / ρ(T, p)
//
// which for an ideal gas is q_ref (p_ref/p)(T/T_ref). Both densities come
// from model m. Valid as ReferenceDensity and ActualVolumeFlow.
func ActualFromStandard(q physics.CubicMeterPerS, m gas.Model, ref Reference, t physics.Kelvin, p physics.Pascal) (physics.CubicMeterPerS, error) {
	mdot, err := MassFlowFromStandard(q, m, ref)
	if err != nil {
		return 0, err
	}
	return ActualVolumeFlow(mdot, m, t, p)
}

// StandardFromActual returns the standard volume flow (m3/s at ref) of an
// actual volume flow q (m3/s) at temperature t and pressure p:
//
//	q_ref = q_act · ρ(T, p) / ρ_ref
//
// with both densities from model m. Valid as ReferenceDensity and
// MassFlowFromActual.
func StandardFromActual(q physics.CubicMeterPerS, m gas.Model, t physics.Kelvin, p physics.Pascal, ref Reference) (physics.CubicMeterPerS, error) {
	mdot, err := MassFlowFromActual(q, m, t, p)
	if err != nil {
		return 0, err
	}
	return StandardVolumeFlow(mdot, m, ref)
}

func checkFlow(name string, v float64, unit string) error {
	if !(v >= 0) || math.IsInf(v, 0) {
		return &physics.DomainError{Name: name, Value: v, Want: "finite, >= 0 " + unit,
			Reason: fmt.Sprintf("%s %g must be a finite flow of at least 0 %s", strings.ReplaceAll(name, "_", " "), v, unit)}
	}
	return nil
}

func checkDensity(rho physics.KgPerCubicMeter) error {
	if !(rho > 0) || math.IsInf(float64(rho), 0) {
		return &physics.DomainError{Name: "density", Value: float64(rho), Want: "finite, > 0 kg/m3",
			Reason: fmt.Sprintf("density %g must be a finite value above 0 kg/m3", float64(rho))}
	}
	return nil
}

func finite(v float64, what string) (float64, error) {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, &physics.DomainError{Name: what, Value: v, Want: "a finite result",
			Reason: fmt.Sprintf("the %s would overflow; check the inputs' units", what)}
	}
	return v, nil
}
