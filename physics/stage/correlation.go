package stage

import "math"

// EfficiencyCorrelationSource names the correlation behind
// PolytropicEfficiencyEstimate, for provenance.
const EfficiencyCorrelationSource = "Casey & Robinson, A method to estimate the performance map of a centrifugal compressor stage, ASME J. Turbomach. 135(2):021034 (2013): peak polytropic efficiency in flow coefficient and tip Mach number (form and coefficients from memory; no Reynolds-number correction)"

// EfficiencyCorrelationFlowRange returns the range of the flow coefficient
// φ = Q01/(U2 π D2²/4) over which PolytropicEfficiencyEstimate is in range:
// Casey's 0.01-0.15 in ṁ/(ρ01 U2 D2²) converted by 4/π.
func EfficiencyCorrelationFlowRange() (lo, hi float64) {
	return crPhiLow * 4 / math.Pi, crPhiHigh * 4 / math.Pi
}

// EfficiencyCorrelationMachRange returns the range of the tip Mach number
// U2/a01 over which PolytropicEfficiencyEstimate is in range.
func EfficiencyCorrelationMachRange() (lo, hi float64) { return 0, crMuHigh }
