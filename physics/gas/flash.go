package gas

import (
	"math"

	"stagewright/physics"
)

// TemperatureSolve finds the temperature in [lo, hi] at which value(state)
// equals target, where value rises with temperature and slope is its
// derivative d(value)/dT. It is a bracketed (safeguarded) Newton method:
// Newton steps that leave the bracket fall back to bisection, so it
// converges for any monotone value.
//
// Use it for the (P,h) flash (value = h, slope = cp) and the (P,s) flash
// (value = s, slope = cp/T). Source: W. H. Press et al., Numerical Recipes,
// 3rd ed. (2007), §9.4 (Newton-Raphson with bracketing, rtsafe).
func TemperatureSolve(stateAt func(physics.Kelvin) (State, error), target float64,
	value func(State) float64, slope func(State) float64, lo, hi physics.Kelvin) (State, error) {
	if !physics.Finite(target, float64(lo), float64(hi)) || !(lo > 0) || !(hi > lo) {
		return State{}, &physics.DomainError{Name: "target", Value: target, Want: "finite target and 0 < lo < hi"}
	}
	sLo, err := stateAt(lo)
	if err != nil {
		return State{}, err
	}
	sHi, err := stateAt(hi)
	if err != nil {
		return State{}, err
	}
	fLo, fHi := value(sLo)-target, value(sHi)-target
	if !(fLo <= 0) || !(fHi >= 0) { // written so that a NaN value fails too
		return State{}, &physics.DomainError{Name: "target", Value: target,
			Want:   "a value reached between the model's temperature limits",
			Reason: "the requested state lies outside the temperature range of the gas model"}
	}
	a, b := float64(lo), float64(hi)
	t := a + (b-a)*(-fLo)/(fHi-fLo) // regula falsi start
	for range 100 {
		st, err := stateAt(physics.Kelvin(t))
		if err != nil {
			return State{}, err
		}
		f := value(st) - target
		if math.Abs(f) <= 1e-10*math.Max(1, math.Abs(target)) {
			return st, nil
		}
		if f < 0 {
			a = t
		} else {
			b = t
		}
		next := t
		if d := slope(st); d > 0 && physics.Finite(d) {
			next = t - f/d
		}
		if !(next > a && next < b) {
			next = 0.5 * (a + b)
		}
		if math.Abs(next-t) <= 1e-11*t {
			st, err := stateAt(physics.Kelvin(next))
			if err != nil {
				return State{}, err
			}
			// The bracket can also shrink onto a jump of value(T) (e.g. where
			// an equation of state's vapour root ends): then no state has the
			// target value.
			if math.Abs(value(st)-target) > 1e-6*math.Max(1, math.Abs(target)) {
				return State{}, &physics.DomainError{Name: "target", Value: target, Want: "a value taken by a single-phase state",
					Reason: "no single-phase state of the gas has this value at this pressure (the model's value jumps across it, e.g. at condensation)"}
			}
			return st, nil
		}
		t = next
	}
	return State{}, &physics.DomainError{Name: "target", Value: target, Want: "a converged temperature",
		Reason: "the temperature solve did not converge"}
}
