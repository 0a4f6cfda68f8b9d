package stage

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// MaxBladeExitAngle is the largest backsweep (deg from radial) the sizing
// accepts; process impellers use 0-60 deg (common practice, no source).
const MaxBladeExitAngle = 75.0

// TipSpeed returns the impeller tip speed U2 at which the Euler work with
// slip and power input factor equals the required actual work w:
//
//	w = ψ U2 cθ2 = ψ (σ U2² − cr2 U2 tan β2')
//	U2 = [cr2 tan β2' + √((cr2 tan β2')² + 4 σ w/ψ)] / (2σ)
//
// (positive root of the quadratic). Euler turbomachinery equation with no
// pre-whirl: Dixon & Hall (2014), eq. 7.1 and §7.9 (slip); power input
// factor ψ as in Saravanamuttoo et al. (2009), §4.2 (w = ψ σ U2² for radial
// vanes). Valid for w > 0, 0 < σ ≤ 1, ψ ≥ 1, 0 ≤ β2' ≤ 75°, cr2 ≥ 0.
func TipSpeed(w physics.JoulePerKg, slip, powerInput, bladeExitAngle float64, cr2 physics.MeterPerS) (physics.MeterPerS, error) {
	if err := checkImpeller(slip, powerInput, bladeExitAngle); err != nil {
		return 0, err
	}
	switch {
	case !(w > 0) || math.IsInf(float64(w), 0):
		return 0, &physics.DomainError{Name: "work", Value: float64(w), Want: "finite, > 0 J/kg",
			Reason: "the stage must do positive work on the gas"}
	case !(cr2 >= 0) || math.IsInf(float64(cr2), 0):
		return 0, &physics.DomainError{Name: "exit_meridional_velocity", Value: float64(cr2), Want: "finite, >= 0 m/s"}
	}
	bt := float64(cr2) * math.Tan(bladeExitAngle*math.Pi/180)
	u2 := (bt + math.Sqrt(bt*bt+4*slip*float64(w)/powerInput)) / (2 * slip)
	if !physics.Finite(u2) {
		return 0, &physics.DomainError{Name: "work", Value: float64(w), Want: "a finite tip speed"}
	}
	return physics.MeterPerS(u2), nil
}

// TipSpeedWithPrewhirl returns the tip speed U2 at which the Euler work
// with inlet whirl cθ1 at blade speed u1 equals the actual work w:
//
//	w = ψ (U2 cθ2 − U1 cθ1),  i.e. TipSpeed with w' = w + ψ U1 cθ1
//
// (Euler turbomachinery equation, Dixon & Hall 2014, eq. 7.1, with the
// power input factor on the whole Euler work as in TipSpeed). For an axial
// eye U1 is taken at the rms eye diameter √((D1t² + Dh²)/2). Prewhirl with
// the rotation (cθ1 > 0) lowers the work at a given U2, so U2 rises.
// Valid for the ranges of TipSpeed, finite u1 ≥ 0 and finite cθ1 with
// w + ψ U1 cθ1 > 0.
func TipSpeedWithPrewhirl(w physics.JoulePerKg, slip, powerInput, bladeExitAngle float64, cr2, u1, ct1 physics.MeterPerS) (physics.MeterPerS, error) {
	if err := checkImpeller(slip, powerInput, bladeExitAngle); err != nil {
		return 0, err
	}
	switch {
	case !(w > 0) || math.IsInf(float64(w), 0):
		return 0, &physics.DomainError{Name: "work", Value: float64(w), Want: "finite, > 0 J/kg",
			Reason: "the stage must do positive work on the gas"}
	case !(u1 >= 0) || math.IsInf(float64(u1), 0):
		return 0, &physics.DomainError{Name: "inlet_blade_speed", Value: float64(u1), Want: "finite, >= 0 m/s"}
	case !physics.Finite(float64(ct1)):
		return 0, &physics.DomainError{Name: "inlet_whirl", Value: float64(ct1), Want: "finite m/s"}
	}
	we := float64(w) + powerInput*float64(u1)*float64(ct1)
	if !(we > 0) {
		return 0, &physics.DomainError{Name: "inlet_whirl", Value: float64(ct1), Want: "w + ψ U1 cθ1 > 0",
			Reason: fmt.Sprintf("the counter-rotating inlet whirl (%.4g m/s at a blade speed of %.4g m/s) alone gives more Euler work than the stage is to do: use less counter-swirl", float64(ct1), float64(u1))}
	}
	return TipSpeed(physics.JoulePerKg(we), slip, powerInput, bladeExitAngle, cr2)
}

// EulerWorkWithPrewhirl returns the actual specific work
// ψ (U2 cθ2 − U1 cθ1) of an impeller at tip speed u2 whose inflow has whirl
// ct1 at blade speed u1 (the inverse of TipSpeedWithPrewhirl; source as
// there). Valid for the ranges of EulerWork and finite u1, ct1.
func EulerWorkWithPrewhirl(u2 physics.MeterPerS, slip, powerInput, bladeExitAngle float64, cr2, u1, ct1 physics.MeterPerS) (physics.JoulePerKg, error) {
	w, err := EulerWork(u2, slip, powerInput, bladeExitAngle, cr2)
	if err != nil {
		return 0, err
	}
	if !physics.Finite(float64(u1), float64(ct1)) || !(u1 >= 0) {
		return 0, &physics.DomainError{Name: "inlet_whirl", Value: float64(ct1), Want: "finite cθ1 and U1 >= 0"}
	}
	return w - physics.JoulePerKg(powerInput*float64(u1)*float64(ct1)), nil
}

// EulerWork returns the actual specific work ψ U2 cθ2 of an impeller at tip
// speed u2 (the inverse of TipSpeed), with cθ2 = U2 (σ − φ2 tan β2').
// Source as TipSpeed.
func EulerWork(u2 physics.MeterPerS, slip, powerInput, bladeExitAngle float64, cr2 physics.MeterPerS) (physics.JoulePerKg, error) {
	if err := checkImpeller(slip, powerInput, bladeExitAngle); err != nil {
		return 0, err
	}
	if !(u2 > 0) || math.IsInf(float64(u2), 0) {
		return 0, &physics.DomainError{Name: "tip_speed", Value: float64(u2), Want: "finite, > 0 m/s"}
	}
	ct := Whirl(u2, slip, bladeExitAngle, cr2)
	return physics.JoulePerKg(powerInput * float64(u2) * float64(ct)), nil
}

// Whirl returns the absolute tangential velocity at impeller exit,
// cθ2 = U2 σ − cr2 tan β2' (Dixon & Hall 2014, §7.9 with σ = 1 − Δcθ/U2).
// Valid for the ranges of TipSpeed (u2 > 0, 0 < σ ≤ 1, 0 ≤ β2' ≤ 75°,
// cr2 ≥ 0). It does not check its inputs, and NaN in gives NaN out;
// callers pass checked values.
func Whirl(u2 physics.MeterPerS, slip, bladeExitAngle float64, cr2 physics.MeterPerS) physics.MeterPerS {
	return physics.MeterPerS(float64(u2)*slip - float64(cr2)*math.Tan(bladeExitAngle*math.Pi/180))
}

// TipDiameter returns D2 = 60 U2 / (π N) for tip speed u2 at rotational
// speed n (rev/min). Definition of peripheral speed. Valid for finite
// u2 > 0 and n > 0.
func TipDiameter(u2 physics.MeterPerS, n physics.RevPerMin) (physics.Meter, error) {
	switch {
	case !(u2 > 0) || math.IsInf(float64(u2), 0):
		return 0, &physics.DomainError{Name: "tip_speed", Value: float64(u2), Want: "finite, > 0 m/s"}
	case !(n > 0) || math.IsInf(float64(n), 0):
		return 0, &physics.DomainError{Name: "speed", Value: float64(n), Want: "finite, > 0 rev/min",
			Reason: "the rotational speed must be a positive number of rev/min"}
	}
	return physics.Meter(60 * float64(u2) / (math.Pi * float64(n))), nil
}

// PeripheralSpeed returns U = π D N / 60 for diameter d (m) at speed n
// (rev/min). Definition of peripheral speed. Valid for finite d ≥ 0 and
// n ≥ 0; it does not check its inputs, and NaN in gives NaN out.
func PeripheralSpeed(d physics.Meter, n physics.RevPerMin) physics.MeterPerS {
	return physics.MeterPerS(math.Pi * float64(d) * float64(n) / 60)
}

func checkImpeller(slip, powerInput, bladeExitAngle float64) error {
	switch {
	case !(slip > 0 && slip <= 1):
		return &physics.DomainError{Name: "slip_factor", Value: slip, Want: "0 < slip_factor <= 1",
			Reason: "the slip factor must lie in (0, 1]: it is 1 minus the slip velocity over the tip speed"}
	case !(powerInput >= 1) || math.IsInf(powerInput, 0) || powerInput > 2:
		return &physics.DomainError{Name: "power_input_factor", Value: powerInput, Want: "1 <= power_input_factor <= 2",
			Reason: "the power input factor must be at least 1 (it adds disc friction and windage to the Euler work) and at most 2"}
	case !(bladeExitAngle >= 0 && bladeExitAngle <= MaxBladeExitAngle):
		return &physics.DomainError{Name: "blade_exit_angle", Value: bladeExitAngle, Want: "0 <= blade_exit_angle <= 75 deg",
			Reason: "the blade exit angle is the backsweep from radial in degrees: 0 for radial blades, at most 75"}
	}
	return nil
}
