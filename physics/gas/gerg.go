package gas

import (
	"errors"
	"math"

	"stagewright/physics"
	"stagewright/physics/cubic"
	"stagewright/physics/gerg"
)

// GERGName is the name of the GERG-2008 model as the API selects it.
const GERGName = "gerg-2008"

// GERGCovers says whether GERG-2008 covers catalogue component c (its 21
// components: CH4, N2, CO2, C2H6, C3H8, i-C4H10, n-C4H10, i-C5H12,
// n-C5H12, n-C6H14, n-C7H16, n-C8H18, n-C9H20, n-C10H22, H2, O2, CO, H2O,
// H2S, He, Ar; not the air pseudo-component, which is dry air's mixture
// N2 + O2 + Ar + CO2 instead).
func GERGCovers(c Component) bool {
	_, ok := gerg.Index(c.Formula)
	return ok
}

// GERG is the "gerg-2008" model: the GERG-2008 wide-range equation of state
// for natural gases and related mixtures (Kunz & Wagner, J. Chem. Eng.
// Data 57:3032, 2012; ISO 20765-2; AGA Report No. 8 Part 2, 2017),
// package gerg, with its own ideal-gas part (Jaeschke & Schley 1995) and
// molar masses. Reference state as the other models: h = 0 and s = 0 for
// each pure component as an ideal gas at 298.15 K and 101 325 Pa, plus the
// ideal mixing entropy. Range of validity 60-700 K, up to 70 MPa: a state
// outside it is a DomainError.
//
// Phase: the density root is the vapour-like one where it exists. Above
// the Kay's-rule pseudo-critical temperature and pressure (Σ x Tc, Σ x Pc of
// the catalogue) a state is PhaseSupercritical, as for Real; otherwise a
// state where only a liquid-like root reaches the pressure is PhaseLiquid.
// Below
// the highest critical temperature of its components, State also tests
// stability: a pure fluid whose liquid-like root has the lower Gibbs energy
// is PhaseLiquid (GERG-2008's own saturation condition); a mixture is
// screened with the Michelsen (1982) tangent-plane test on the
// Peng-Robinson equation of the same composition (the documented screen of
// issue 12: a GERG-2008 stability test for mixtures would need its
// composition derivatives) and is PhaseTwoPhase where that splits. Both set
// TwoPhaseRisk. As for the cubic models, the properties are those of the
// vapour-like root also where Phase says the gas would condense.
type GERG struct {
	comp   Composition
	mix    *gerg.Mixture
	screen Real // Peng-Robinson of the same composition (phase screen, dew point)
	x      []float64
	pure   bool
	tcMax  float64 // highest Tc of the components present (catalogue)
	tcK    float64 // Kay's-rule pseudo-critical temperature Σ x Tc
	pcK    float64 // Kay's-rule pseudo-critical pressure Σ x Pc
}

// NewGERG returns the GERG-2008 model of composition c. A component that
// GERG-2008 does not cover is a DomainError naming it (Name "component").
func NewGERG(c Composition) (GERG, error) {
	if c.Len() == 0 {
		return GERG{}, &physics.DomainError{Name: "composition", Want: "at least one component",
			Reason: "the composition is empty: build it with NewComposition"}
	}
	xg := make([]float64, gerg.NumComponents)
	m := GERG{comp: c, x: c.MoleFractions()}
	nonzero := 0
	for i := range c.Len() {
		comp := c.Component(i)
		k, ok := gerg.Index(comp.Formula)
		if !ok {
			return GERG{}, &physics.DomainError{Name: "component", Want: "a GERG-2008 component",
				Reason: "GERG-2008 does not cover " + comp.ID + " (" + comp.Formula + "); its components are CH4, N2, CO2, C2H6, C3H8, i-C4H10, n-C4H10, i-C5H12, n-C5H12, n-C6H14, n-C7H16, n-C8H18, n-C9H20, n-C10H22, H2, O2, CO, H2O, H2S, He and Ar"}
		}
		xg[k] += m.x[i]
		if m.x[i] > 0 {
			nonzero++
			m.tcMax = max(m.tcMax, float64(comp.Tc))
		}
		m.tcK += m.x[i] * float64(comp.Tc)
		m.pcK += m.x[i] * float64(comp.Pc)
	}
	m.pure = nonzero == 1
	mix, err := gerg.NewMixture(xg)
	if err != nil {
		return GERG{}, err
	}
	m.mix = mix
	if m.screen, err = NewReal(cubic.PengRobinson, c, nil); err != nil {
		return GERG{}, err
	}
	return m, nil
}

// Name returns "gerg-2008".
func (m GERG) Name() string { return GERGName }

// MolarMass returns the mixture molar mass in kg/mol (GERG-2008's molar
// masses, which differ from the catalogue's by < 3e-5 relative).
func (m GERG) MolarMass() float64 { return m.mix.MolarMass() }

// Composition returns the model's composition.
func (m GERG) Composition() Composition { return m.comp }

// TemperatureRange returns GERG-2008's range of validity, 60 K to 700 K.
func (m GERG) TemperatureRange() (lo, hi physics.Kelvin) {
	return gerg.MinTemperature, gerg.MaxTemperature
}

// State returns the state at (t, p) with the phase test (see GERG).
func (m GERG) State(t physics.Kelvin, p physics.Pascal) (State, error) {
	return m.state(t, p, true)
}

// GasState is State without the stability test: the phase comes from the
// density root alone (the fast path for loops whose caller checks the end
// states with State, as Real.GasState).
func (m GERG) GasState(t physics.Kelvin, p physics.Pascal) (State, error) {
	return m.state(t, p, false)
}

func (m GERG) state(t physics.Kelvin, p physics.Pascal, stability bool) (State, error) {
	if err := checkTP(t, p); err != nil {
		return State{}, err
	}
	tt, pp := float64(t), float64(p)
	pr, err := m.mix.StateTP(tt, pp)
	if err != nil {
		return State{}, err
	}
	st := m.fromProps(pr)
	if !(st.Cv > 0) || !(st.Cp > 0) || !(st.IsentropicExponent > 0) ||
		!physics.Finite(float64(st.Enthalpy), float64(st.Entropy), float64(st.SoundSpeed), st.JouleThomson, st.SchultzX, st.SchultzY, float64(st.Density)) {
		return State{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with finite properties",
			Reason: "GERG-2008 gives no physical heat capacity at this temperature and pressure"}
	}
	switch { // the order of Real.State: above the pseudo-critical point the root's kind does not matter
	case tt > m.tcK && pp > m.pcK:
		st.Phase = PhaseSupercritical
	case pr.Branch == gerg.LiquidOnly:
		st.Phase = PhaseLiquid
		st.Validity |= TwoPhaseRisk
	}
	if !stability || st.Phase == PhaseLiquid || !(tt < m.tcMax) {
		return st, nil
	}
	if m.pure {
		if liq, ok := m.mix.LiquidTP(tt, pp); ok && liq.GibbsRT < pr.GibbsRT {
			st.Phase = PhaseLiquid
			st.Validity |= TwoPhaseRisk
		}
		return st, nil
	}
	stable, err := m.screen.eos.Stable(m.x, t, p)
	if err == nil && !stable {
		st.Phase = PhaseTwoPhase
		st.Validity |= TwoPhaseRisk
	}
	return st, nil
}

// fromProps converts molar GERG-2008 properties into a State (per kg).
func (m GERG) fromProps(pr gerg.Props) State {
	mm := m.mix.MolarMass()
	return State{
		Temperature:        physics.Kelvin(pr.T),
		Pressure:           physics.Pascal(pr.P),
		Density:            physics.KgPerCubicMeter(pr.Rho * mm),
		Compressibility:    pr.Z,
		MolarMass:          mm,
		Enthalpy:           physics.JoulePerKg(pr.H / mm),
		Entropy:            physics.JoulePerKgK(pr.S / mm),
		Cp:                 physics.JoulePerKgK(pr.Cp / mm),
		Cv:                 physics.JoulePerKgK(pr.Cv / mm),
		IsentropicExponent: pr.Kappa,
		SoundSpeed:         physics.MeterPerS(pr.W),
		JouleThomson:       pr.JT,
		SchultzX:           pr.T*pr.DPDT/(pr.Rho*pr.DPDRho) - 1,
		SchultzY:           pr.P / (pr.Rho * pr.DPDRho),
		Phase:              PhaseGas,
	}
}

// flash solves a (P,h) or (P,s) flash: the temperature in 60-700 K at
// which value(state) equals target, value rising with temperature and slope
// its derivative (cp or cp/T). Newton steps from 300 K inside a bracket
// that every evaluated state narrows; a step that leaves the bracket
// bisects it, and a temperature where the equation has no physical root
// (far below a mixture's dew point) counts as below the answer. Newton
// converges in 3-6 states for a gas; the bracket guarantees an answer or an
// error (Press et al., Numerical Recipes, 3rd ed., 2007, §9.4, rtsafe).
func (m GERG) flash(p physics.Pascal, target float64, value, slope func(State) float64) (State, error) {
	a, b := gerg.MinTemperature, gerg.MaxTemperature
	haveA, haveB := false, false
	tol := 1e-10 * math.Max(1, math.Abs(target))
	t := 300.0
	for range 200 {
		st, err := m.GasState(physics.Kelvin(t), p)
		var next float64
		if err != nil {
			if !errors.Is(err, physics.ErrDomain) {
				return State{}, err
			}
			a, haveA = t, false // no usable state here: the answer lies above
			next = 0.5 * (a + b)
		} else {
			f := value(st) - target
			if math.Abs(f) <= tol {
				return st, nil
			}
			if f < 0 {
				a, haveA = t, true
			} else {
				b, haveB = t, true
			}
			next = t - f/slope(st)
			if !(next > a && next < b) {
				next = 0.5 * (a + b)
			}
		}
		if b-a <= 1e-11*b || next == t {
			break
		}
		t = next
	}
	reason := "no single-phase state of the gas has this value at this pressure (the model's value jumps across it, e.g. at condensation)"
	switch {
	case !haveB:
		reason = "the requested state lies above GERG-2008's range of validity (700 K) at this pressure"
	case !haveA:
		reason = "the requested state lies below the lowest temperature at which GERG-2008 gives a state at this pressure"
	}
	return State{}, &physics.DomainError{Name: "target", Value: target, Want: "a value taken by a state between 60 K and 700 K", Reason: reason}
}

// StateFromPH returns the state at pressure p with specific enthalpy h: a
// bracketed Newton solve on T (TemperatureSolve, slope cp) over
// TemperatureRange on the stability-free state, then State at the solution.
func (m GERG) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	st, err := m.GasStateFromPH(p, h)
	if err != nil {
		return State{}, err
	}
	return m.State(st.Temperature, p)
}

// StateFromPS returns the state at pressure p with specific entropy s (as
// StateFromPH, slope cp/T).
func (m GERG) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	st, err := m.GasStateFromPS(p, s)
	if err != nil {
		return State{}, err
	}
	return m.State(st.Temperature, p)
}

// GasStateFromPH is StateFromPH without the phase test at the solution.
func (m GERG) GasStateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	if err := checkFlash(p, float64(h)); err != nil {
		return State{}, err
	}
	return m.flash(p, float64(h), stateEnthalpy, stateCp)
}

// GasStateFromPS is StateFromPS without the phase test at the solution.
func (m GERG) GasStateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	if err := checkFlash(p, float64(s)); err != nil {
		return State{}, err
	}
	return m.flash(p, float64(s), stateEntropy, stateCpOverT)
}

// checkFlash checks the pressure of a flash against the range of validity.
func checkFlash(p physics.Pascal, target float64) error {
	if err := gerg.Range(gerg.MinTemperature, float64(p)); err != nil {
		return err
	}
	if math.IsNaN(target) || math.IsInf(target, 0) {
		return &physics.DomainError{Name: "target", Value: target, Want: "finite"}
	}
	return nil
}

// DewTemperature returns the dew-point temperature at pressure p of the
// Peng-Robinson screen of the same composition (Real.DewTemperature): an
// estimate for GERG-2008's own, which it does not compute.
func (m GERG) DewTemperature(p physics.Pascal) (physics.Kelvin, error) {
	return m.screen.DewTemperature(p)
}
