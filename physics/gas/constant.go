package gas

import (
	"math"

	"stagewright/physics"
)

// Reference state of the ideal-gas models: h = 0 at ReferenceTemperature and
// s = 0 at (ReferenceTemperature, ReferencePressure).
const (
	ReferenceTemperature physics.Kelvin = 298.15
	ReferencePressure    physics.Pascal = 101325
)

// Constant is the "ideal-constant" model: a thermally and calorically
// perfect gas with constant cp and ratio of specific heats gamma:
//
//	R = cp (γ−1)/γ,  p = ρ R T,  h = cp (T − Tref),  s = cp ln(T/Tref) − R ln(p/pref)
//
// Source: Y. A. Çengel and M. A. Boles, Thermodynamics: An Engineering
// Approach, 6th ed. (2008), ch. 7 (entropy change of ideal gases with
// constant specific heats). Valid where the gas is far from condensation
// and cp varies little over the path. The zero value is not usable: build
// one with NewConstant.
type Constant struct {
	cp    float64
	gamma float64
	r     float64
}

// GammaMax is the largest ratio of specific heats accepted: 5/3 (the
// monatomic limit) as it is written to four decimals, so that 1.6667 for
// helium or argon is not refused for a rounding.
const GammaMax = 1.6667

// NewConstant returns the constant-property ideal gas with isobaric heat
// capacity cp (J/(kg K)) and ratio of specific heats gamma. It wants
// 0 < cp < 1e6 and 1 < gamma ≤ GammaMax (5/3, the monatomic limit).
func NewConstant(cp physics.JoulePerKgK, gamma float64) (Constant, error) {
	switch {
	case !(cp > 0):
		return Constant{}, &physics.DomainError{Name: "cp", Value: float64(cp), Want: "finite, > 0 J/(kg K)",
			Reason: "the gas cp must be a positive heat capacity in J/(kg K)"}
	case !(cp >= 100):
		return Constant{}, &physics.DomainError{Name: "cp", Value: float64(cp), Want: ">= 100 J/(kg K)",
			Reason: "the gas cp is out of range: too small (at least 100 J/(kg K); heavy gases such as SF6 have about 600)"}
	case !(cp < 1e6):
		return Constant{}, &physics.DomainError{Name: "cp", Value: float64(cp), Want: "< 1e6 J/(kg K)",
			Reason: "the gas cp is out of range: too large (below 1e6 J/(kg K); hydrogen's is about 14 300)"}
	case !(gamma > 1) || !(gamma <= GammaMax):
		return Constant{}, &physics.DomainError{Name: "gamma", Value: gamma, Want: "1 < gamma <= 1.6667",
			Reason: "the ratio of specific heats gamma is out of range: it must lie above 1 and at most 5/3 (monatomic gas; 1.6667 accepted)"}
	}
	return Constant{cp: float64(cp), gamma: gamma, r: float64(cp) * (gamma - 1) / gamma}, nil
}

// Name returns "ideal-constant".
func (c Constant) Name() string { return "ideal-constant" }

// MolarMass returns Ru/R in kg/mol.
func (c Constant) MolarMass() float64 { return physics.UniversalGasConstant / c.r }

// GasConstant returns the specific gas constant R = cp (γ−1)/γ in J/(kg K).
func (c Constant) GasConstant() physics.JoulePerKgK { return physics.JoulePerKgK(c.r) }

// Gamma returns the ratio of specific heats.
func (c Constant) Gamma() float64 { return c.gamma }

// State returns the perfect-gas state at (t, p). It wants finite t > 0 and
// p > 0.
func (c Constant) State(t physics.Kelvin, p physics.Pascal) (State, error) {
	if err := checkTP(t, p); err != nil {
		return State{}, err
	}
	if !(c.cp > 0) {
		return State{}, &physics.DomainError{Name: "cp", Value: c.cp, Want: "a model built by NewConstant",
			Reason: "the constant-property gas has no heat capacity: build it with NewConstant"}
	}
	tt, pp := float64(t), float64(p)
	s := c.cp*math.Log(tt/float64(ReferenceTemperature)) - c.r*math.Log(pp/float64(ReferencePressure))
	if rho := pp / (c.r * tt); !physics.Finite(rho, c.cp*tt) {
		return State{}, &physics.DomainError{Name: "temperature", Value: tt, Want: "a state with a finite density",
			Reason: "the temperature is so close to 0 K (or the pressure so high) that the perfect-gas density is not a finite number"}
	}
	return State{
		Temperature:        t,
		Pressure:           p,
		Density:            physics.KgPerCubicMeter(pp / (c.r * tt)),
		Compressibility:    1,
		MolarMass:          c.MolarMass(),
		Enthalpy:           physics.JoulePerKg(c.cp * (tt - float64(ReferenceTemperature))),
		Entropy:            physics.JoulePerKgK(s),
		Cp:                 physics.JoulePerKgK(c.cp),
		Cv:                 physics.JoulePerKgK(c.cp / c.gamma),
		IsentropicExponent: c.gamma,
		SoundSpeed:         physics.MeterPerS(math.Sqrt(c.gamma * c.r * tt)),
		JouleThomson:       0,
		SchultzX:           0,
		SchultzY:           1,
		Phase:              PhaseGas,
	}, nil
}

// StateFromPH returns the state at pressure p with enthalpy h, in closed
// form T = Tref + h/cp.
func (c Constant) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error) {
	t := float64(ReferenceTemperature) + float64(h)/c.cp
	if !(t > 0) || math.IsInf(t, 0) {
		return State{}, &physics.DomainError{Name: "enthalpy", Value: float64(h), Want: "a temperature above 0 K",
			Reason: "the enthalpy asked for lies below absolute zero for this gas"}
	}
	return c.State(physics.Kelvin(t), p)
}

// StateFromPS returns the state at pressure p with entropy s, in closed form
// T = Tref exp((s + R ln(p/pref))/cp).
func (c Constant) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error) {
	if !(p > 0) || math.IsInf(float64(p), 0) {
		return State{}, &physics.DomainError{Name: "pressure", Value: float64(p), Want: "finite, > 0 Pa"}
	}
	t := float64(ReferenceTemperature) * math.Exp((float64(s)+c.r*math.Log(float64(p)/float64(ReferencePressure)))/c.cp)
	if !(t > 0) || math.IsInf(t, 0) {
		return State{}, &physics.DomainError{Name: "entropy", Value: float64(s), Want: "a finite temperature above 0 K"}
	}
	return c.State(physics.Kelvin(t), p)
}

func checkTP(t physics.Kelvin, p physics.Pascal) error {
	switch {
	case !(t > 0) || math.IsInf(float64(t), 0):
		return &physics.DomainError{Name: "temperature", Value: float64(t), Want: "finite, > 0 K",
			Reason: "temperature must be a finite absolute temperature above 0 K"}
	case !(p > 0) || math.IsInf(float64(p), 0):
		return &physics.DomainError{Name: "pressure", Value: float64(p), Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	}
	return nil
}
