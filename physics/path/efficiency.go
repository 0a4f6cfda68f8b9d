package path

import (
	"math"

	"stagewright/physics"
)

// Basis says which definition an efficiency value follows.
type Basis int

// Efficiency bases. The zero Basis is invalid so that an unset efficiency is
// rejected rather than taken for one of them.
const (
	// Isentropic: ηs = (h2s − h1)/(h2 − h1), total-to-total.
	Isentropic Basis = iota + 1
	// Polytropic: the small-stage efficiency ηp = v dp/dh, constant along the path.
	Polytropic
)

// String returns "isentropic" or "polytropic".
func (b Basis) String() string {
	switch b {
	case Isentropic:
		return "isentropic"
	case Polytropic:
		return "polytropic"
	}
	return "unknown"
}

// Efficiency is an efficiency value in (0, 1] with its basis.
type Efficiency struct {
	Basis Basis
	Value float64
}

// Method selects how the polytropic head (and, for a polytropic efficiency,
// the discharge state) is computed.
type Method int

// Methods for the polytropic head. The zero Method is Stepwise.
const (
	// Stepwise integrates the path of constant polytropic efficiency
	// (the reference method for real gases).
	Stepwise Method = iota
	// Schultz applies the polytropic head factor of Schultz (1962) /
	// ASME PTC 10-1997 to the end states.
	Schultz
)

// String returns "stepwise" or "schultz".
func (m Method) String() string {
	switch m {
	case Stepwise:
		return "stepwise"
	case Schultz:
		return "schultz"
	}
	return "unknown"
}

func checkEfficiency(name string, eta float64) error {
	if !(eta > 0) || !(eta <= 1) {
		return &physics.DomainError{Name: name, Value: eta, Want: "0 < efficiency <= 1",
			Reason: "the " + name + " must be a number above 0 and at most 1"}
	}
	return nil
}

func checkPerfectGas(pr, gamma float64) error {
	switch {
	case !(pr > 1) || math.IsInf(pr, 1):
		return &physics.DomainError{Name: "pressure ratio", Value: pr, Want: "finite, > 1",
			Reason: "the pressure ratio must be a finite number above 1 (discharge pressure must exceed suction pressure)"}
	case !(gamma > 1) || !(gamma <= 5.0/3.0+1e-9):
		return &physics.DomainError{Name: "gamma", Value: gamma, Want: "1 < gamma <= 5/3",
			Reason: "the ratio of specific heats gamma must lie above 1 and at most 5/3 (monatomic gas)"}
	}
	return nil
}

// PerfectGasIsentropicEfficiency returns the total-to-total isentropic
// efficiency of a compression of a perfect gas (constant cp and γ) with
// pressure ratio pr and polytropic efficiency etaP:
//
//	ηs = (pr^((γ−1)/γ) − 1) / (pr^((γ−1)/(γ ηp)) − 1)
//
// Source: Dixon & Hall, Fluid Mechanics and Thermodynamics of
// Turbomachinery, 7th ed. (2014), ch. 2, small-stage efficiency of a
// compressor. Valid for pr > 1, 0 < etaP ≤ 1, 1 < gamma ≤ 5/3.
func PerfectGasIsentropicEfficiency(etaP, pr, gamma float64) (float64, error) {
	if err := checkEfficiency("polytropic efficiency", etaP); err != nil {
		return 0, err
	}
	if err := checkPerfectGas(pr, gamma); err != nil {
		return 0, err
	}
	e := (gamma - 1) / gamma * math.Log(pr)
	eta := math.Expm1(e) / math.Expm1(e/etaP)
	if !(eta > 0) || math.IsInf(eta, 0) {
		return 0, &physics.DomainError{Name: "pressure ratio", Value: pr, Want: "a finite result",
			Reason: "the pressure ratio and efficiency give a discharge temperature beyond any finite number"}
	}
	return eta, nil
}

// PerfectGasPolytropicEfficiency returns the polytropic efficiency of a
// compression of a perfect gas with pressure ratio pr and total-to-total
// isentropic efficiency etaS, the inverse of PerfectGasIsentropicEfficiency:
//
//	ηp = ((γ−1)/γ) ln pr / ln(1 + (pr^((γ−1)/γ) − 1)/ηs)
//
// Source: Dixon & Hall (2014), ch. 2, solved for ηp. Valid for pr > 1,
// 0 < etaS ≤ 1, 1 < gamma ≤ 5/3.
func PerfectGasPolytropicEfficiency(etaS, pr, gamma float64) (float64, error) {
	if err := checkEfficiency("isentropic efficiency", etaS); err != nil {
		return 0, err
	}
	if err := checkPerfectGas(pr, gamma); err != nil {
		return 0, err
	}
	e := (gamma - 1) / gamma * math.Log(pr)
	eta := e / math.Log1p(math.Expm1(e)/etaS)
	if !(eta > 0) || math.IsInf(eta, 0) {
		return 0, &physics.DomainError{Name: "isentropic efficiency", Value: etaS, Want: "a finite result",
			Reason: "the isentropic efficiency is too small for a finite polytropic efficiency"}
	}
	return math.Min(eta, 1), nil
}
