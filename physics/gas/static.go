package gas

import (
	"math"

	"stagewright/physics"
)

// StateFromHS returns the state of model m with specific enthalpy h and
// entropy s, starting the search at pressure pGuess. Along an isentrope
// (dh/dp)_s = v = 1/ρ (Gibbs relation dh = T ds + v dp), so Newton steps in
// p on the (P,s) flash converge in a few iterations:
//
//	p_{k+1} = p_k + ρ_k (h − h(p_k, s))
//
// Source: the Gibbs equation, e.g. Çengel & Boles, Thermodynamics: An
// Engineering Approach, 6th ed. (2008), eq. 7-24. Used for static states
// (stagnation enthalpy less kinetic energy at the stagnation entropy).
func StateFromHS(m Model, h physics.JoulePerKg, s physics.JoulePerKgK, pGuess physics.Pascal) (State, error) {
	if !physics.Finite(float64(h), float64(s), float64(pGuess)) || !(pGuess > 0) {
		return State{}, &physics.DomainError{Name: "pressure", Value: float64(pGuess), Want: "finite h, s and p > 0"}
	}
	p := float64(pGuess)
	var st State
	var err error
	for range 60 {
		st, err = m.StateFromPS(physics.Pascal(p), s)
		if err != nil {
			return State{}, err
		}
		dh := float64(h - st.Enthalpy)
		if math.Abs(dh) <= 1e-9*math.Max(1, math.Abs(float64(h))) {
			return st, nil
		}
		next := p + float64(st.Density)*dh
		// Keep p positive and the step bounded: at most a factor 4 either way.
		next = math.Min(math.Max(next, p/4), 4*p)
		if math.Abs(next-p) <= 1e-12*p {
			return st, nil
		}
		p = next
	}
	return State{}, &physics.DomainError{Name: "enthalpy", Value: float64(h), Want: "a state reachable at this entropy",
		Reason: "no state of the gas has this enthalpy at this entropy (the (h,s) solve did not converge)"}
}

// StaticState returns the static state of a stream whose stagnation state is
// stag and whose speed is c: h = h0 − c²/2 at the stagnation entropy.
//
// Source: definition of stagnation enthalpy, Dixon & Hall, Fluid Mechanics
// and Thermodynamics of Turbomachinery, 7th ed. (2014), eq. 2.10; the
// static state is isentropic with the stagnation state by definition.
func StaticState(m Model, stag State, c physics.MeterPerS) (State, error) {
	if !(c >= 0) || math.IsInf(float64(c), 0) {
		return State{}, &physics.DomainError{Name: "velocity", Value: float64(c), Want: "finite, >= 0 m/s"}
	}
	ke := 0.5 * float64(c) * float64(c)
	// Guard: the static temperature must stay positive. A first-order check
	// with the stagnation cp catches the gross cases before any flash.
	if ke >= float64(stag.Cp)*float64(stag.Temperature) {
		return State{}, staticTooCold(c)
	}
	st, err := StateFromHS(m, stag.Enthalpy-physics.JoulePerKg(ke), stag.Entropy, stag.Pressure)
	if err != nil {
		return State{}, staticTooCold(c)
	}
	return st, nil
}

func staticTooCold(c physics.MeterPerS) error {
	return &physics.DomainError{Name: "velocity", Value: float64(c), Want: "a static temperature above 0 K",
		Reason: "the velocity is so high that the static temperature of the gas would fall below absolute zero or outside the gas model; lower the velocity"}
}
