package offdesign

import (
	"math"

	"stagewright/physics"
)

// Coefficients of the efficiency characteristic (see Efficiency). All are
// from memory after Casey & Robinson (2013), not checked against the
// paper: the paper calibrates its own coefficients per stage type.
const (
	// SurgeSideCoefficient G in η/ηpk = 1 − G (1 − φ/φpk)² towards surge:
	// about 5 % of the peak lost at 75 % of the peak flow.
	SurgeSideCoefficient = 0.8
	// ChokeSideExponentLow and ChokeSideExponentHigh bound n in
	// η/ηpk = 1 − yⁿ towards choke, y the flow's fraction of the way from
	// the peak to choke: n = low + (high − low) min(Mu2, 1)², so that a
	// low-speed line falls gradually (its choke is far and its losses grow
	// with negative incidence) and a transonic line stays flat and then
	// drops at choke; the efficiency reaches 0 at choke either way (shapes
	// of Casey & Robinson 2013, from memory; the numbers are ours).
	ChokeSideExponentLow  = 2.0
	ChokeSideExponentHigh = 4.0
	// PeakMachLinear and PeakMachQuadratic are the tip-Mach terms of the
	// peak efficiency, Δη = −k4 P − k5 P², P = φ_CR (Mu2 − 0.8) for
	// Mu2 > 0.8, φ_CR = ṁ/(ρ01 U2 D2²) (the same terms as the design-point
	// correlation of package stage).
	PeakMachLinear    = 0.05
	PeakMachQuadratic = 3.0
	// peakMachOnset is the tip Mach number below which the peak does not
	// depend on it.
	peakMachOnset = 0.8
)

// ChokeSideExponent returns n of the choke side at tip Mach number mu:
// ChokeSideExponentLow + (ChokeSideExponentHigh − ChokeSideExponentLow) min(mu, 1)².
func ChokeSideExponent(mu float64) float64 {
	m := math.Min(math.Max(mu, 0), 1)
	return ChokeSideExponentLow + (ChokeSideExponentHigh-ChokeSideExponentLow)*m*m
}

// Efficiency returns the polytropic efficiency at flow coefficient phi on
// a speed line whose peak efficiency etaPeak lies at phiPeak and which
// chokes at phiChoke (phiPeak < phiChoke), n the choke-side exponent
// (ChokeSideExponent of the line's tip Mach number):
//
//	φ ≤ φpk:        η = ηpk (1 − G (1 − φ/φpk)²)
//	φpk < φ < φch:  η = ηpk (1 − yⁿ),  y = (φ − φpk)/(φch − φpk)
//
// with G = SurgeSideCoefficient. Form after
// Casey & Robinson (2013) (efficiency relative to the line's peak, in the
// flow relative to the peak flow; a steep fall to choke); the exact
// expressions and coefficients are ours, from memory of the paper's
// shapes. Valid for 0 < φ < φch; at or beyond choke it is a DomainError.
// The result is at least 1 % of the peak (a floor far below surge).
func Efficiency(phi, phiPeak, phiChoke, etaPeak, n float64) (float64, error) {
	switch {
	case !(phiPeak > 0) || math.IsInf(phiPeak, 0):
		return 0, &physics.DomainError{Name: "peak_flow_coefficient", Value: phiPeak, Want: "finite, > 0"}
	case !(phiChoke > phiPeak) || math.IsInf(phiChoke, 0):
		return 0, &physics.DomainError{Name: "choke_flow_coefficient", Value: phiChoke, Want: "finite, above the peak flow coefficient"}
	case !(etaPeak > 0 && etaPeak <= 1):
		return 0, &physics.DomainError{Name: "peak_efficiency", Value: etaPeak, Want: "0 < η <= 1"}
	case !(n >= 1 && n <= 10):
		return 0, &physics.DomainError{Name: "choke_side_exponent", Value: n, Want: "1 <= n <= 10"}
	case !(phi > 0):
		return 0, &physics.DomainError{Name: "flow_coefficient", Value: phi, Want: "> 0"}
	case !(phi < phiChoke):
		return 0, &physics.DomainError{Name: "flow_coefficient", Value: phi, Want: "below the choke flow coefficient",
			Reason: "the flow is at or past choke"}
	}
	var r float64
	if phi <= phiPeak {
		d := 1 - phi/phiPeak
		r = 1 - SurgeSideCoefficient*d*d
	} else {
		y := (phi - phiPeak) / (phiChoke - phiPeak)
		r = 1 - math.Pow(y, n)
	}
	return etaPeak * math.Max(r, 0.01), nil
}

// PeakEfficiency returns the peak polytropic efficiency of the speed line
// at tip Mach number mu, from the design efficiency etaDesign at tip Mach
// number muDesign and design flow coefficient phiDesign
// (φ = Q01/(U2 π D2²/4)):
//
//	ηpk(Mu) = ηd − [L(Mu) − L(Mud)],  L(M) = k4 P + k5 P²,  P = φ_CR max(M − 0.8, 0)
//
// with φ_CR = φ π/4, k4 = PeakMachLinear, k5 = PeakMachQuadratic (tip
// Mach term of Casey & Robinson 2013, from memory). Below Mu = 0.8 the
// peak does not change with speed, so the fan laws hold in the limit.
// The result is clamped to (0.05, 1].
func PeakEfficiency(etaDesign, phiDesign, muDesign, mu float64) float64 {
	loss := func(m float64) float64 {
		p := phiDesign * math.Pi / 4 * math.Max(m-peakMachOnset, 0)
		return PeakMachLinear*p + PeakMachQuadratic*p*p
	}
	eta := etaDesign - (loss(mu) - loss(muDesign))
	return math.Min(math.Max(eta, 0.05), 1)
}
