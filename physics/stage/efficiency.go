package stage

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// EfficiencyEstimate is a correlated stage efficiency with a note on how it
// was obtained.
type EfficiencyEstimate struct {
	// Value is the estimated peak polytropic efficiency, total-to-total.
	Value float64
	// InRange is false when the flow coefficient or the tip Mach number lies
	// outside the range the correlation was fitted on.
	InRange bool
	// Note says which correlation gave Value and, out of range, what was
	// done (the input was clamped to the edge of the range).
	Note string
}

// Casey-Robinson correlation constants (see PolytropicEfficiencyEstimate;
// all from memory).
const (
	crEtaMax = 0.86  // peak polytropic efficiency at φ_CR = 0.08, Mu2 ≤ 0.8
	crPhiMax = 0.08  // flow coefficient ṁ/(ρ01 U2 D2²) of the peak
	crK1     = 27.0  // below the peak, quadratic term
	crK2     = 5000. // below the peak, quartic term
	crK3     = 10.0  // above the peak, quadratic term
	crK4     = 0.05  // tip Mach term, linear in P = φ_CR (Mu2 − 0.8)
	crK5     = 3.0   // tip Mach term, quadratic in P

	// Range of the correlation (from memory: the stages behind it span
	// about these flow coefficients and tip Mach numbers).
	crPhiLow  = 0.01
	crPhiHigh = 0.15
	crMuHigh  = 1.4
)

// PolytropicEfficiencyEstimate returns the peak (design-point) polytropic
// efficiency of a well-designed industrial or turbocharger centrifugal
// stage with a vaneless or vaned diffuser, in the flow coefficient and tip
// Mach number. With Casey's flow coefficient φ_CR = ṁ/(ρ01 U2 D2²) =
// φ π/4 (φ = Q01/(U2 π D2²/4) the flow coefficient of this package) and
// Mu2 = U2/a01 (tipMach):
//
//	φ_CR < 0.08:  η = η_max (1 − k1 (0.08 − φ_CR)² − k2 (0.08 − φ_CR)⁴) + Δη_M
//	φ_CR ≥ 0.08:  η = η_max (1 − k3 (φ_CR − 0.08)²) + Δη_M
//	Δη_M = −k4 P − k5 P²,  P = φ_CR (Mu2 − 0.8) for Mu2 > 0.8, else Δη_M = 0
//
// with η_max = 0.86, k1 = 27, k2 = 5000, k3 = 10, k4 = 0.05, k5 = 3.
// Source: M. V. Casey and C. J. Robinson, "A method to estimate the
// performance map of a centrifugal compressor stage", ASME J.
// Turbomachinery 135(2):021034 (2013). The form and every coefficient are
// from memory and could not be checked against the paper: a search of the
// stored literature (issue 12) found the paper's abstract but not its
// equations, nor those of the later papers of the same authors
// (EfficiencyCorrelationUncertainty says so in every answer). Two public
// third-party transcriptions turned up by the same search (code, not the
// paper) carry the same tip-Mach term −(0.05 + 3P)P with P = φ_CR (Mu2 −
// 0.8), and one the whole form with these coefficients: that supports the
// recall but does not verify it. The
// Reynolds-number and roughness corrections of the paper (η_max depends on
// them) are not included: η_max = 0.86 stands for a large industrial stage.
//
// Range (from memory): 0.01 ≤ φ_CR ≤ 0.15 (0.0127 ≤ φ ≤ 0.191) and
// 0 < Mu2 ≤ 1.4. Outside it InRange is false and the value is that at the
// nearest edge of the range (the input is clamped, not extrapolated: the
// quartic falls without bound below φ_CR = 0.01). NaN, ±Inf or
// non-positive inputs are a DomainError.
func PolytropicEfficiencyEstimate(flowCoefficient, tipMach float64) (EfficiencyEstimate, error) {
	switch {
	case !(flowCoefficient > 0) || math.IsInf(flowCoefficient, 0):
		return EfficiencyEstimate{}, &physics.DomainError{Name: "flow_coefficient", Value: flowCoefficient, Want: "finite, > 0",
			Reason: "the flow coefficient for the efficiency estimate must be a positive finite number"}
	case !(tipMach > 0) || math.IsInf(tipMach, 0):
		return EfficiencyEstimate{}, &physics.DomainError{Name: "tip_mach", Value: tipMach, Want: "finite, > 0",
			Reason: "the tip Mach number U2/a01 for the efficiency estimate must be a positive finite number"}
	}
	phi := flowCoefficient * math.Pi / 4
	mu := tipMach
	in := true
	note := "Casey & Robinson (2013) peak polytropic efficiency in flow coefficient and tip Mach number (form and coefficients from memory, not checked against the paper: the estimate may differ from the published correlation by an unknown amount; no Reynolds-number correction)"
	// the edges themselves are in range (1e-9 absorbs the φ π/4 round-off)
	if phi < crPhiLow*(1-1e-9) || phi > crPhiHigh*(1+1e-9) {
		in = false
		edge := math.Min(math.Max(phi, crPhiLow), crPhiHigh)
		note += fmt.Sprintf("; flow coefficient %.4g (Casey's φ = %.4g) outside 0.0127-0.191 (Casey's 0.01-0.15): evaluated at the edge of the range, φ_CR = %.3g (input clamped, not extrapolated)", flowCoefficient, phi, edge)
		phi = edge
	}
	if mu > crMuHigh {
		in = false
		note += fmt.Sprintf("; tip Mach number %.3g above 1.4: evaluated at 1.4 (input clamped, not extrapolated)", mu)
		mu = crMuHigh
	}
	var eta float64
	if x := crPhiMax - phi; x > 0 {
		eta = crEtaMax * (1 - crK1*x*x - crK2*x*x*x*x)
	} else {
		eta = crEtaMax * (1 - crK3*x*x)
	}
	if mu > 0.8 {
		p := phi * (mu - 0.8)
		eta -= crK4*p + crK5*p*p
	}
	return EfficiencyEstimate{Value: eta, InRange: in, Note: note}, nil
}
