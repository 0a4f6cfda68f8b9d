package stage

import "math"

// EfficiencyCorrelationSource names the correlation behind
// PolytropicEfficiencyEstimate, for provenance, with its uncertainty.
const EfficiencyCorrelationSource = "Casey & Robinson, A method to estimate the performance map of a centrifugal compressor stage, ASME J. Turbomach. 135(2):021034 (2013): peak polytropic efficiency in flow coefficient and tip Mach number. " +
	EfficiencyCorrelationUncertainty

// EfficiencyCorrelationUncertainty states plainly what is and is not known
// of the correlation as coded (issue 12).
const EfficiencyCorrelationUncertainty = "UNVERIFIED: the form and every coefficient are from memory; the paper's equations could not be read in any stored copy " +
	"(a search of the stored literature found only its abstract, which confirms that the design point is characterised by the flow coefficient, the work coefficient, the tip-speed Mach number and the efficiency), " +
	"so the estimate may differ from the published correlation by an unknown amount; no Reynolds-number or roughness correction (a large industrial stage is assumed). " +
	"Give the efficiency from the manufacturer or a test wherever one exists"

// EfficiencyCorrelationFlowRange returns the range of the flow coefficient
// φ = Q01/(U2 π D2²/4) over which PolytropicEfficiencyEstimate is in range:
// Casey's 0.01-0.15 in ṁ/(ρ01 U2 D2²) converted by 4/π.
func EfficiencyCorrelationFlowRange() (lo, hi float64) {
	return crPhiLow * 4 / math.Pi, crPhiHigh * 4 / math.Pi
}

// EfficiencyCorrelationMachRange returns the range of the tip Mach number
// U2/a01 over which PolytropicEfficiencyEstimate is in range.
func EfficiencyCorrelationMachRange() (lo, hi float64) { return 0, crMuHigh }
