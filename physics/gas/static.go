package gas

import (
	"math"

	"stagewright/physics"
)

// StateFromHS returns the state of model m with specific enthalpy h and
// entropy s, starting the search at pressure pGuess. It takes one (P,s)
// flash at pGuess and then Newton steps in (T, p) on the two equations
// h(T,p) = h, s(T,p) = s, with the Jacobian from the Gibbs relations
//
//	dh = cp dT + (v − T (∂v/∂T)_p) dp,   ds = (cp/T) dT − (∂v/∂T)_p dp,
//	(∂v/∂T)_p = (1 + X) v/T   (X the Schultz function of State),
//
// whose determinant is −cp v/T (never zero for a gas). Should the Newton
// steps not converge, it falls back to Newton in p alone on the (P,s)
// flash, (dh/dp)_s = v. Source: the Gibbs equation and Maxwell relations,
// e.g. Çengel & Boles, Thermodynamics: An Engineering Approach, 6th ed.
// (2008), §7-7 and §12-3. Used for static states (stagnation enthalpy less
// kinetic energy at the stagnation entropy).
func StateFromHS(m Model, h physics.JoulePerKg, s physics.JoulePerKgK, pGuess physics.Pascal) (State, error) {
	if !physics.Finite(float64(h), float64(s), float64(pGuess)) || !(pGuess > 0) {
		return State{}, &physics.DomainError{Name: "pressure", Value: float64(pGuess), Want: "finite h, s and p > 0"}
	}
	st, err := m.StateFromPS(pGuess, s)
	if err != nil {
		return State{}, err
	}
	if done(st, h, s) {
		return st, nil
	}
	if out, ok := newtonHS(m, st, h, s); ok {
		return out, nil
	}
	return pressureNewtonHS(m, h, s, pGuess)
}

func done(st State, h physics.JoulePerKg, s physics.JoulePerKgK) bool {
	tol := 1e-9 * math.Max(1, math.Abs(float64(h)))
	return math.Abs(float64(h-st.Enthalpy)) <= tol &&
		math.Abs(float64(s-st.Entropy))*float64(st.Temperature) <= tol
}

// newtonHS runs the two-variable Newton iteration of StateFromHS from st.
func newtonHS(m Model, st State, h physics.JoulePerKg, s physics.JoulePerKgK) (State, bool) {
	for range 30 {
		t, p := float64(st.Temperature), float64(st.Pressure)
		v := 1 / float64(st.Density)
		cp := float64(st.Cp)
		dvdT := (1 + st.SchultzX) * v / t
		dh, ds := float64(h-st.Enthalpy), float64(s-st.Entropy)
		det := -cp * v / t
		dT := (dh*(-dvdT) - (v-t*dvdT)*ds) / det
		dp := (cp*ds - cp/t*dh) / det
		if !physics.Finite(dT, dp) || !(det < 0) {
			return State{}, false
		}
		// Bound the step: T and p change by at most a factor 2.
		nt := math.Min(math.Max(t+dT, t/2), 2*t)
		np := math.Min(math.Max(p+dp, p/2), 2*p)
		next, err := m.State(physics.Kelvin(nt), physics.Pascal(np))
		if err != nil {
			return State{}, false
		}
		st = next
		if done(st, h, s) {
			return st, true
		}
	}
	return State{}, false
}

// pressureNewtonHS is the fallback of StateFromHS: Newton in p along the
// isentrope, p_{k+1} = p_k + ρ_k (h − h(p_k, s)).
func pressureNewtonHS(m Model, h physics.JoulePerKg, s physics.JoulePerKgK, pGuess physics.Pascal) (State, error) {
	p := float64(pGuess)
	for range 60 {
		st, err := m.StateFromPS(physics.Pascal(p), s)
		if err != nil {
			return State{}, err
		}
		dh := float64(h - st.Enthalpy)
		if math.Abs(dh) <= 1e-9*math.Max(1, math.Abs(float64(h))) {
			return st, nil
		}
		next := p + float64(st.Density)*dh
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
