package gas

import "stagewright/physics"

// Phase says which root or region of the model a state belongs to.
type Phase string

// Phases a state can report.
const (
	PhaseGas           Phase = "gas"           // single-phase vapour or supercritical gas
	PhaseSupercritical Phase = "supercritical" // T > Tc and P > Pc (pure) or above the cricondenbar region
	PhaseLiquid        Phase = "liquid"        // the model's only root is liquid-like
	PhaseTwoPhase      Phase = "two-phase"     // inside the two-phase region: the gas would condense
)

// State is the thermodynamic state of a gas at (T, P): everything the
// compression path and the stage need. Specific quantities are per kg.
type State struct {
	Temperature physics.Kelvin
	Pressure    physics.Pascal
	Density     physics.KgPerCubicMeter
	// Compressibility is Z = P/(rho R T), dimensionless.
	Compressibility float64
	// MolarMass in kg/mol.
	MolarMass float64
	Enthalpy  physics.JoulePerKg
	Entropy   physics.JoulePerKgK
	Cp        physics.JoulePerKgK
	Cv        physics.JoulePerKgK
	// IsentropicExponent is the real-gas kappa = -(v/p)(dp/dv)_T · cp/cv,
	// so that p v^kappa = const along a small isentropic step.
	IsentropicExponent float64
	SoundSpeed         physics.MeterPerS
	// JouleThomson is (dT/dp)_h in K/Pa.
	JouleThomson float64
	// SchultzX is X = (T/v)(dv/dT)_p - 1 and SchultzY is
	// Y = -(p/v)(dv/dp)_T, the compressibility functions of Schultz (1962);
	// both are 0 and 1 for an ideal gas.
	SchultzX float64
	SchultzY float64
	Phase    Phase
	// Validity carries notes on extrapolation and phase (zero: none).
	Validity Validity
}

// Model is a gas property model: it returns the state at (T, P) and solves
// the two flashes that a compression path needs. Implementations are safe
// for concurrent use and hold no mutable state.
type Model interface {
	// Name is the model's name as the API selects it, e.g. "peng-robinson".
	Name() string
	// MolarMass is the (mixture) molar mass in kg/mol.
	MolarMass() float64
	// State returns the properties at temperature t and pressure p.
	State(t physics.Kelvin, p physics.Pascal) (State, error)
	// StateFromPH returns the state at pressure p and specific enthalpy h.
	StateFromPH(p physics.Pascal, h physics.JoulePerKg) (State, error)
	// StateFromPS returns the state at pressure p and specific entropy s.
	StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (State, error)
}
