package gas

import (
	"math"
	"strconv"
	"strings"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// BinaryParameter is a binary interaction parameter kij of the cubic
// equations' van der Waals mixing rule a = Σ Σ xi xj (1 − kij) √(ai aj)
// for the components named A and B (catalogue names or aliases).
type BinaryParameter struct {
	A, B   string
	Kij    float64
	Source string
}

// Source of the default interaction parameters.
const srcKnapp = "H. Knapp, R. Döring, L. Oellrich, U. Plöcker, J. M. Prausnitz, Vapor-Liquid Equilibria for Mixtures of Low Boiling Substances, DECHEMA Chemistry Data Series Vol. VI (1982); values from memory"

// DefaultBinaryParameters returns the built-in kij table of the model
// ("peng-robinson" or "srk"; any other name has none), a fresh slice. Pairs
// not listed have kij = 0; a caller's BinaryParameter for the same pair
// replaces the table value. Values are from memory (Knapp et al. 1982) and
// rounded to what is commonly used for natural gas and air: treat them as
// typical, not fitted to a particular data set.
func DefaultBinaryParameters(model string) []BinaryParameter {
	switch model {
	case "peng-robinson":
		return []BinaryParameter{
			{"methane", "carbon-dioxide", 0.0919, srcKnapp},
			{"nitrogen", "methane", 0.0311, srcKnapp},
			{"nitrogen", "ethane", 0.0515, srcKnapp},
			{"nitrogen", "carbon-dioxide", -0.0170, srcKnapp},
			{"ethane", "carbon-dioxide", 0.1322, srcKnapp},
			{"propane", "carbon-dioxide", 0.1241, srcKnapp},
			{"methane", "hydrogen-sulfide", 0.0850, srcKnapp},
			{"carbon-dioxide", "hydrogen-sulfide", 0.0974, srcKnapp},
			{"nitrogen", "oxygen", -0.0119, srcKnapp},
			{"nitrogen", "argon", -0.0026, srcKnapp},
			{"oxygen", "argon", 0.0104, srcKnapp},
		}
	case "srk":
		return []BinaryParameter{
			{"methane", "carbon-dioxide", 0.0933, srcKnapp},
			{"nitrogen", "methane", 0.0278, srcKnapp},
			{"ethane", "carbon-dioxide", 0.1363, srcKnapp},
		}
	}
	return nil
}

// Real is a cubic real-gas model ("peng-robinson" or "srk"): the
// ideal-gas mixture of Ideal plus the residual part of package cubic,
//
//	h = h_ig(T) + R T·HDep,  s = s_ig(T, p) + R·SDep,  cv = cv_ig + R·CvDep,
//	cp = cv + T (∂P/∂T)_v² / (−(∂P/∂v)_T),
//	κ = −(v/p)(∂P/∂v)_T · cp/cv,  a = sqrt(κ p v / M),
//	μ_JT = (T (∂v/∂T)_p − v)/cp,  (∂v/∂T)_p = −(∂P/∂T)_v/(∂P/∂v)_T,
//	X = (T/v)(∂v/∂T)_p − 1,  Y = −(p/v)(∂v/∂p)_T
//
// per mole, divided by M for per-kg values. Reference state as Ideal:
// h = 0 and s = 0 for each pure component as an ideal gas at 298.15 K,
// 101 325 Pa. Sources: Peng & Robinson (1976), Soave (1972), the cubic
// package; the derivative identities are those of Schultz (1962) and e.g.
// Smith, Van Ness & Abbott, 7th ed. (2005), ch. 6.
// Valid inside the ideal-gas cp ranges (TemperatureRange) and below the
// cubic's MaxTemperature; accuracy is that of the cubic (a few percent in
// density near the critical point, see real-gas-checks.csv).
type Real struct {
	name  string
	comp  Composition
	ig    idealPart
	eos   *cubic.Mixture
	x     []float64
	pure  bool
	tcMax float64 // highest Tc of the components present
	tcK   float64 // Kay's-rule pseudo-critical temperature Σ x Tc
	pcK   float64 // Kay's-rule pseudo-critical pressure Σ x Pc
	tLo   float64
	tHi   float64
}

// NewReal returns the Peng-Robinson (kind cubic.PengRobinson) or SRK
// (cubic.SoaveRedlichKwong) model of composition c. kij overrides or adds
// to DefaultBinaryParameters of the model; each pair must name two
// different components of c, once, with a finite |kij| < 1.
func NewReal(kind cubic.Kind, c Composition, kij []BinaryParameter) (Real, error) {
	ig, err := newIdealPart(c)
	if err != nil {
		return Real{}, err
	}
	name := kind.String()
	n := c.Len()
	k, err := interactionMatrix(name, c, kij)
	if err != nil {
		return Real{}, err
	}
	tc := make([]physics.Kelvin, n)
	pc := make([]physics.Pascal, n)
	om := make([]float64, n)
	r := Real{name: name, comp: c, ig: ig, x: c.MoleFractions()}
	nonzero := 0
	for i := 0; i < n; i++ {
		comp := c.Component(i)
		tc[i], pc[i], om[i] = comp.Tc, comp.Pc, comp.Omega
		if r.x[i] > 0 {
			nonzero++
			r.tcMax = max(r.tcMax, float64(comp.Tc))
		}
		r.tcK += r.x[i] * float64(comp.Tc)
		r.pcK += r.x[i] * float64(comp.Pc)
	}
	r.pure = nonzero == 1
	r.eos, err = cubic.NewMixture(kind, tc, pc, om, k)
	if err != nil {
		return Real{}, err
	}
	lo, hi := ig.limits()
	r.tLo, r.tHi = float64(lo), min(float64(hi), 0.999*float64(r.eos.MaxTemperature()))
	return r, nil
}

// interactionMatrix builds the n×n kij matrix from the default table of
// model and the caller's overrides.
func interactionMatrix(model string, c Composition, kij []BinaryParameter) ([][]float64, error) {
	n := c.Len()
	k := make([][]float64, n)
	for i := range k {
		k[i] = make([]float64, n)
	}
	index := func(name string) int {
		id, ok := componentID(name)
		if !ok {
			return -1
		}
		for i := 0; i < n; i++ {
			if c.comps[i].ID == id {
				return i
			}
		}
		return -1
	}
	for _, bp := range DefaultBinaryParameters(model) {
		i, j := index(bp.A), index(bp.B)
		if i >= 0 && j >= 0 {
			k[i][j], k[j][i] = bp.Kij, bp.Kij
		}
	}
	seen := make(map[[2]int]bool, len(kij))
	for q, bp := range kij {
		field := "kij[" + itoa(q) + "]"
		for _, nm := range []string{bp.A, bp.B} {
			if _, err := LookupComponent(nm); err != nil {
				return nil, err
			}
		}
		i, j := index(bp.A), index(bp.B)
		switch {
		case i < 0 || j < 0:
			return nil, &physics.DomainError{Name: field, Value: bp.Kij, Want: "a pair of components of the gas",
				Reason: "binary parameter " + bp.A + "/" + bp.B + " names a component that is not in the gas composition"}
		case i == j:
			return nil, &physics.DomainError{Name: field, Value: bp.Kij, Want: "two different components",
				Reason: "binary parameter " + bp.A + "/" + bp.B + " must name two different components"}
		case !(math.Abs(bp.Kij) < 1):
			return nil, &physics.DomainError{Name: field, Value: bp.Kij, Want: "finite, -1 < kij < 1",
				Reason: "binary parameter " + bp.A + "/" + bp.B + " must be a number between -1 and 1"}
		}
		key := [2]int{min(i, j), max(i, j)}
		if seen[key] {
			return nil, &physics.DomainError{Name: field, Value: bp.Kij, Want: "each pair once",
				Reason: "binary parameter " + bp.A + "/" + bp.B + " is given more than once"}
		}
		seen[key] = true
		k[i][j], k[j][i] = bp.Kij, bp.Kij
	}
	return k, nil
}

// NewModel returns the gas model the service selects by name: "ideal"
// (NewIdeal), "peng-robinson" or "srk" (NewReal, with kij overriding the
// default interaction parameters; kij must be empty for "ideal"). The
// "ideal-constant" model is built with NewConstant from cp and gamma
// instead. An unknown name returns a DomainError naming it.
func NewModel(name string, comp Composition, kij []BinaryParameter) (Model, error) {
	switch strings.ToLower(strings.TrimSpace(name)) {
	case "ideal":
		if len(kij) > 0 {
			return nil, &physics.DomainError{Name: "kij", Value: float64(len(kij)), Want: "none for the ideal model",
				Reason: "binary interaction parameters apply only to the peng-robinson and srk models"}
		}
		return NewIdeal(comp)
	case "peng-robinson", "pr":
		return NewReal(cubic.PengRobinson, comp, kij)
	case "srk", "soave-redlich-kwong":
		return NewReal(cubic.SoaveRedlichKwong, comp, kij)
	case "ideal-constant":
		return nil, &physics.DomainError{Name: "model", Want: "ideal, peng-robinson or srk",
			Reason: "the ideal-constant model takes cp and gamma, not a composition (use NewConstant)"}
	}
	return nil, &physics.DomainError{Name: "model", Want: "ideal, peng-robinson or srk",
		Reason: "unknown gas model \"" + name + "\"; choose ideal, peng-robinson or srk (or ideal-constant with cp and gamma)"}
}

// Name returns "peng-robinson" or "srk".
func (m Real) Name() string { return m.name }

// MolarMass returns the mixture molar mass in kg/mol.
func (m Real) MolarMass() float64 { return m.ig.m }

// Composition returns the model's composition.
func (m Real) Composition() Composition { return m.comp }

// TemperatureRange returns the temperatures the model accepts.
func (m Real) TemperatureRange() (lo, hi physics.Kelvin) {
	return physics.Kelvin(m.tLo), physics.Kelvin(m.tHi)
}

// State returns the real-gas state at (t, p). The phase comes from the
// cubic root and, where a component is below its critical temperature,
// from the Michelsen (1982) tangent-plane stability test
// (cubic.Mixture.Stable):
//   - PhaseSupercritical above the pseudo-critical T and P (Kay's rule,
//     Σ x Tc and Σ x Pc; exact for a pure fluid);
//   - PhaseLiquid for a liquid-like only root below it, or for a pure fluid
//     whose vapour root is unstable (above its vapour pressure);
//   - PhaseTwoPhase for a mixture that the stability test splits;
//   - PhaseGas otherwise.
//
// PhaseLiquid and PhaseTwoPhase also set TwoPhaseRisk in Validity. The
// properties are those of the root the cubic package returns (the largest),
// also when Phase says the gas would condense.
func (m Real) State(t physics.Kelvin, p physics.Pascal) (State, error) {
	return m.state(t, p, true)
}

// GasState is State without the stability test: the phase comes from the
// cubic root alone. It is the fast path for loops (path integration,
// flashes) whose caller checks the phase of the end states with State.
func (m Real) GasState(t physics.Kelvin, p physics.Pascal) (State, error) {
	return m.state(t, p, false)
}

func (m Real) state(t physics.Kelvin, p physics.Pascal, stability bool) (State, error) {
	if err := checkTP(t, p); err != nil {
		return State{}, err
	}
	tt, pp := float64(t), float64(p)
	if !(tt <= m.tHi) {
		return State{}, &physics.DomainError{Name: "temperature", Value: tt, Want: "within the model's temperature range",
			Reason: "temperature " + formatK(tt) + " lies above the " + m.name + " model's range (" + formatK(m.tHi) + ")"}
	}
	v, err := checkIdealRange(t, m.ig.lo, m.ig.hi)
	if err != nil {
		return State{}, err
	}
	res, err := m.eos.Residual(m.x, t, p)
	if err != nil {
		return State{}, err
	}
	if !(res.DPdV < 0) {
		return State{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a mechanically stable root",
			Reason: "the " + m.name + " equation has no mechanically stable state at this temperature and pressure"}
	}
	const r = physics.UniversalGasConstant
	cpIG, hIG, sIG := m.ig.molar(tt)
	vm := res.MolarVolume
	h := hIG + r*tt*res.HDep
	s := sIG - r*math.Log(pp/float64(ReferencePressure)) + r*res.SDep
	cv := cpIG - r + r*res.CvDep
	cp := cv + tt*res.DPdT*res.DPdT/(-res.DPdV)
	kappa := -(vm / pp) * res.DPdV * cp / cv
	dvdT := -res.DPdT / res.DPdV
	mm := m.ig.m
	st := State{
		Temperature:        t,
		Pressure:           p,
		Density:            physics.KgPerCubicMeter(mm / vm),
		Compressibility:    res.Z,
		MolarMass:          mm,
		Enthalpy:           physics.JoulePerKg(h / mm),
		Entropy:            physics.JoulePerKgK(s / mm),
		Cp:                 physics.JoulePerKgK(cp / mm),
		Cv:                 physics.JoulePerKgK(cv / mm),
		IsentropicExponent: kappa,
		SoundSpeed:         physics.MeterPerS(math.Sqrt(kappa * pp * vm / mm)),
		JouleThomson:       (tt*dvdT - vm) / cp,
		SchultzX:           tt/vm*dvdT - 1,
		SchultzY:           -pp / (vm * res.DPdV),
		Phase:              PhaseGas,
		Validity:           v,
	}
	if !(cv > 0) || !(cp > 0) || !(kappa > 0) ||
		!physics.Finite(float64(st.Enthalpy), float64(st.Entropy), float64(st.SoundSpeed), st.JouleThomson, st.SchultzX, st.SchultzY) {
		return State{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with finite properties",
			Reason: "the " + m.name + " equation gives no physical heat capacity at this temperature and pressure"}
	}
	super := tt > m.tcK && pp > m.pcK
	switch {
	case super:
		st.Phase = PhaseSupercritical
	case res.Root == cubic.RootOnlyLiquidLike:
		st.Phase = PhaseLiquid
		st.Validity |= TwoPhaseRisk
	}
	if stability && tt < m.tcMax && st.Phase != PhaseLiquid {
		stable, err := m.eos.Stable(m.x, t, p)
		if err != nil {
			return State{}, err
		}
		if !stable {
			st.Validity |= TwoPhaseRisk
			if m.pure {
				st.Phase = PhaseLiquid
			} else {
				st.Phase = PhaseTwoPhase
			}
		}
	}
	return st, nil
}

// StateFromPH returns the state at pressure p with specific enthalpy h: a
// bracketed Newton solve on T (TemperatureSolve, slope cp) over
// TemperatureRange on the stability-free state, then State at the solution.
func (m Real) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	st, err := TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.GasState(t, p) }, float64(h),
		stateEnthalpy, stateCp, physics.Kelvin(m.tLo), physics.Kelvin(m.tHi))
	if err != nil {
		return State{}, err
	}
	return m.State(st.Temperature, p)
}

// StateFromPS returns the state at pressure p with specific entropy s: a
// bracketed Newton solve on T (TemperatureSolve, slope cp/T) over
// TemperatureRange on the stability-free state, then State at the solution.
func (m Real) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	st, err := TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.GasState(t, p) }, float64(s),
		stateEntropy, stateCpOverT, physics.Kelvin(m.tLo), physics.Kelvin(m.tHi))
	if err != nil {
		return State{}, err
	}
	return m.State(st.Temperature, p)
}

func itoa(i int) string { return strconv.Itoa(i) }

// GasStateFromPH is StateFromPH without the phase-stability test at the
// solution (as GasState is to State): for callers that evaluate many states
// along a path and check the phase of its end states themselves.
func (m Real) GasStateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	return TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.GasState(t, p) }, float64(h),
		stateEnthalpy, stateCp, physics.Kelvin(m.tLo), physics.Kelvin(m.tHi))
}

// GasStateFromPS is StateFromPS without the phase-stability test at the
// solution (see GasStateFromPH).
func (m Real) GasStateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	return TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.GasState(t, p) }, float64(s),
		stateEntropy, stateCpOverT, physics.Kelvin(m.tLo), physics.Kelvin(m.tHi))
}

// DewTemperature returns the (upper) dew-point temperature of the gas at
// pressure p: the temperature below which a liquid phase forms. It is
// cubic.Mixture.DewTemperature on the model's composition (Michelsen,
// Fluid Phase Equilib. 9:1-19, 1982; Michelsen & Mollerup 2007, ch. 12),
// with the same range: an error above the cricondenbar, where there is no
// dew point.
func (m Real) DewTemperature(p physics.Pascal) (physics.Kelvin, error) {
	return m.eos.DewTemperature(m.x, p)
}

// Flash splits the gas at (t, p) into an equilibrium vapour and liquid
// with the model's cubic equation (cubic.Mixture.Flash: Michelsen's
// stability test, then Rachford-Rice with successive substitution on the
// fugacities). The phase compositions are in the order of Composition.
func (m Real) Flash(t physics.Kelvin, p physics.Pascal) (cubic.Flash, error) {
	if err := checkTP(t, p); err != nil {
		return cubic.Flash{}, err
	}
	return m.eos.Flash(m.x, t, p)
}
