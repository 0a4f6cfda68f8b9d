package stage

import (
	"math"

	"stagewright/physics"
)

// DefaultSpecificSpeed is the specific speed Ns = Ω √Q01 / Δh_s^0.75 a
// stage is given when the caller names neither a speed nor a target: the
// middle of the best-efficiency band Ns ≈ 0.6-0.8 of the Balje-type charts
// (Balje, Turbomachines, Wiley 1981, as reproduced in Dixon & Hall, Fluid
// Mechanics and Thermodynamics of Turbomachinery, 7th ed., 2014, ch. 7;
// from memory; testdata/reference/rules-of-thumb.md §9).
const DefaultSpecificSpeed = 0.7

// SpeedForSpecificSpeed returns the rotational speed at which a stage of
// suction volume flow q and isentropic head dhs has specific speed ns:
//
//	Ns = Ω √Q01 / Δh_s^0.75   ⇒   N = (60/2π) Ns Δh_s^0.75 / √Q01
//
// with Ω in rad/s, Q01 in m3/s and Δh_s in J/kg (dimensionless Ns; Dixon &
// Hall 2014, ch. 1 and 7, definition). Valid for finite ns, q and dhs > 0.
func SpeedForSpecificSpeed(ns float64, q physics.CubicMeterPerS, dhs physics.JoulePerKg) (physics.RevPerMin, error) {
	switch {
	case !(ns > 0) || math.IsInf(ns, 0):
		return 0, &physics.DomainError{Name: "specific_speed", Value: ns, Want: "finite, > 0",
			Reason: "the target specific speed must be a positive number"}
	case !(q > 0) || math.IsInf(float64(q), 0):
		return 0, &physics.DomainError{Name: "flow", Value: float64(q), Want: "finite, > 0 m3/s"}
	case !(dhs > 0) || math.IsInf(float64(dhs), 0):
		return 0, &physics.DomainError{Name: "isentropic_head", Value: float64(dhs), Want: "finite, > 0 J/kg"}
	}
	omega := ns * math.Pow(float64(dhs), 0.75) / math.Sqrt(float64(q))
	return physics.RevPerMin(omega * 60 / (2 * math.Pi)), nil
}

// TipDiameterForFlowCoefficient returns the tip diameter at which a stage
// of suction volume flow q and tip speed u2 has flow coefficient phi:
//
//	φ = Q01 / (U2 π D2²/4)   ⇒   D2 = √(4 Q01 / (π U2 φ))
//
// (definition of testdata/reference/rules-of-thumb.md §5). Valid for
// finite phi, q, u2 > 0.
func TipDiameterForFlowCoefficient(phi float64, q physics.CubicMeterPerS, u2 physics.MeterPerS) (physics.Meter, error) {
	switch {
	case !(phi > 0) || math.IsInf(phi, 0):
		return 0, &physics.DomainError{Name: "flow_coefficient", Value: phi, Want: "finite, > 0",
			Reason: "the target flow coefficient must be a positive number"}
	case !(q > 0) || math.IsInf(float64(q), 0):
		return 0, &physics.DomainError{Name: "flow", Value: float64(q), Want: "finite, > 0 m3/s"}
	case !(u2 > 0) || math.IsInf(float64(u2), 0):
		return 0, &physics.DomainError{Name: "tip_speed", Value: float64(u2), Want: "finite, > 0 m/s"}
	}
	return physics.Meter(math.Sqrt(4 * float64(q) / (math.Pi * float64(u2) * phi))), nil
}

// SpeedForTipDiameter returns N = 60 U2 / (π D2), the speed at which an
// impeller of tip diameter d2 has tip speed u2 (definition of peripheral
// speed). Valid for finite u2, d2 > 0.
func SpeedForTipDiameter(u2 physics.MeterPerS, d2 physics.Meter) (physics.RevPerMin, error) {
	switch {
	case !(u2 > 0) || math.IsInf(float64(u2), 0):
		return 0, &physics.DomainError{Name: "tip_speed", Value: float64(u2), Want: "finite, > 0 m/s"}
	case !(d2 > 0) || math.IsInf(float64(d2), 0):
		return 0, &physics.DomainError{Name: "tip_diameter", Value: float64(d2), Want: "finite, > 0 m",
			Reason: "the tip diameter must be a positive number of metres"}
	}
	return physics.RevPerMin(60 * float64(u2) / (math.Pi * float64(d2))), nil
}

// RoundSpeed rounds n to the nearest whole multiple of step (rev/min), at
// least one step, so that a chosen speed lands on a gear-ratio or
// motor-pole grid the caller names. Valid for finite n, step > 0.
func RoundSpeed(n, step physics.RevPerMin) (physics.RevPerMin, error) {
	switch {
	case !(n > 0) || math.IsInf(float64(n), 0):
		return 0, &physics.DomainError{Name: "speed", Value: float64(n), Want: "finite, > 0 rev/min"}
	case !(step > 0) || math.IsInf(float64(step), 0):
		return 0, &physics.DomainError{Name: "speed_step", Value: float64(step), Want: "finite, > 0 rev/min",
			Reason: "the speed step must be a positive number of rev/min"}
	}
	k := math.Max(1, math.Round(float64(n)/float64(step)))
	return physics.RevPerMin(k * float64(step)), nil
}
