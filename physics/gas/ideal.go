package gas

import (
	"math"

	"stagewright/physics"
)

// idealPart is the ideal-gas part of a mixture prepared for evaluation
// without allocation: the weighted cp terms of every species, the shared
// temperature limits, the molar mass and the mixing entropy.
type idealPart struct {
	terms  []cpTerm
	lo, hi float64 // correlation limits (K), before margins
	m      float64 // kg/mol
	smix   float64 // −R Σ x ln x, J/(mol K)
}

func newIdealPart(c Composition) (idealPart, error) {
	if c.Len() == 0 {
		return idealPart{}, &physics.DomainError{Name: "composition", Want: "at least one component",
			Reason: "the composition is empty: build it with NewComposition"}
	}
	ip := idealPart{lo: 0, hi: 1e300, m: c.MolarMass(), smix: c.MixingEntropy()}
	for i := 0; i < c.Len(); i++ {
		t, lo, hi := componentTerms(c.comps[i], c.x[i])
		ip.terms = append(ip.terms, t...)
		ip.lo, ip.hi = max(ip.lo, lo), min(ip.hi, hi)
	}
	return ip, nil
}

// molar returns the ideal-gas mixture cp (J/(mol K)), h (J/mol) and
// s (J/(mol K)) at temperature t and the reference pressure, mixing term
// included.
func (ip *idealPart) molar(t float64) (cp, h, s float64) {
	l := tLogs{t: t}
	for i := range ip.terms {
		tm := &ip.terms[i]
		c, hh, ss := evalPiecesLogs(tm.pieces, &l)
		cp += tm.weight * c
		h += tm.weight * hh
		s += tm.weight * ss
	}
	return cp, h, s + ip.smix
}

// limits returns the temperature limits including the extrapolation
// margins.
func (ip *idealPart) limits() (lo, hi physics.Kelvin) {
	return physics.Kelvin(max(1, ip.lo-float64(ExtrapolationBelow))), physics.Kelvin(ip.hi + float64(ExtrapolationAbove))
}

// Ideal is the "ideal" model: an ideal-gas mixture with temperature-
// dependent heat capacities,
//
//	p v = R T / M,  cp = Σ x_i cp_i(T) / M,  h = Σ x_i h_i(T) / M,
//	s = [Σ x_i s°_i(T) − R ln(p/p_ref) − R Σ x_i ln x_i] / M
//
// with Z = 1, Schultz X = 0, Y = 1, κ = cp/cv and a = sqrt(κ R T / M).
// Reference state: h = 0 and s = 0 for each pure component at 298.15 K,
// 101 325 Pa; the mixture entropy adds the ideal mixing term.
// Source: Smith, Van Ness & Abbott, Introduction to Chemical Engineering
// Thermodynamics, 7th ed. (2005), sec. 11.3 (ideal-gas mixture model);
// heat capacities per Component.HeatCapacity. Valid where the gas is ideal
// (low pressure, far from condensation) and inside the cp correlation
// ranges (TemperatureRange).
type Ideal struct {
	comp Composition
	ig   idealPart
}

// NewIdeal returns the "ideal" model of composition c.
func NewIdeal(c Composition) (Ideal, error) {
	ig, err := newIdealPart(c)
	if err != nil {
		return Ideal{}, err
	}
	return Ideal{comp: c, ig: ig}, nil
}

// Name returns "ideal".
func (m Ideal) Name() string { return "ideal" }

// MolarMass returns the mixture molar mass in kg/mol.
func (m Ideal) MolarMass() float64 { return m.ig.m }

// Composition returns the model's composition.
func (m Ideal) Composition() Composition { return m.comp }

// TemperatureRange returns the temperatures the model accepts (the cp
// correlation limits widened by the extrapolation margins).
func (m Ideal) TemperatureRange() (lo, hi physics.Kelvin) { return m.ig.limits() }

// State returns the ideal-gas mixture state at (t, p). It wants p > 0 and
// t inside TemperatureRange; states in the extrapolation margins carry
// CpExtrapolated in Validity.
func (m Ideal) State(t physics.Kelvin, p physics.Pascal) (State, error) {
	if err := checkTP(t, p); err != nil {
		return State{}, err
	}
	v, err := checkIdealRange(t, m.ig.lo, m.ig.hi)
	if err != nil {
		return State{}, err
	}
	const r = physics.UniversalGasConstant
	tt, pp := float64(t), float64(p)
	cp, h, s := m.ig.molar(tt)
	s -= r * math.Log(pp/float64(ReferencePressure))
	mm := m.ig.m
	cv := cp - r
	kappa := cp / cv
	return State{
		Temperature:        t,
		Pressure:           p,
		Density:            physics.KgPerCubicMeter(pp * mm / (r * tt)),
		Compressibility:    1,
		MolarMass:          mm,
		Enthalpy:           physics.JoulePerKg(h / mm),
		Entropy:            physics.JoulePerKgK(s / mm),
		Cp:                 physics.JoulePerKgK(cp / mm),
		Cv:                 physics.JoulePerKgK(cv / mm),
		IsentropicExponent: kappa,
		SoundSpeed:         physics.MeterPerS(math.Sqrt(kappa * r * tt / mm)),
		JouleThomson:       0,
		SchultzX:           0,
		SchultzY:           1,
		Phase:              PhaseGas,
		Validity:           v,
	}, nil
}

// StateFromPH returns the state at pressure p with specific enthalpy h by a
// bracketed Newton solve on T (TemperatureSolve) over TemperatureRange.
func (m Ideal) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	lo, hi := m.ig.limits()
	return TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.State(t, p) }, float64(h),
		stateEnthalpy, stateCp, lo, hi)
}

// StateFromPS returns the state at pressure p with specific entropy s by a
// bracketed Newton solve on T (TemperatureSolve) over TemperatureRange.
func (m Ideal) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	lo, hi := m.ig.limits()
	return TemperatureSolve(func(t physics.Kelvin) (State, error) { return m.State(t, p) }, float64(s),
		stateEntropy, stateCpOverT, lo, hi)
}

func stateEnthalpy(s State) float64 { return float64(s.Enthalpy) }
func stateEntropy(s State) float64  { return float64(s.Entropy) }
func stateCp(s State) float64       { return float64(s.Cp) }
func stateCpOverT(s State) float64  { return float64(s.Cp) / float64(s.Temperature) }
