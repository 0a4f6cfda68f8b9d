package path

import (
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// SchultzResult is the polytropic analysis of two end states by the method
// of Schultz (1962) as adopted by ASME PTC 10-1997.
type SchultzResult struct {
	// X and Y are the compressibility functions averaged over suction and
	// discharge: X = (T/v)(∂v/∂T)_p − 1, Y = −(p/v)(∂v/∂p)_T.
	X, Y float64
	// M is the temperature exponent m = (Z R/cp)(1/ηp + X) with Z R/cp =
	// p v/(T cp) and X averaged over the end states, ηp = Efficiency.
	M float64
	// N is the polytropic volume exponent from the end states,
	// n = ln(p2/p1)/ln(v1/v2); it is the n of the head.
	N float64
	// NFromXY is Schultz's n = 1/(Y − m(1 + X)) from the averaged X, Y and
	// M; it is 0 where Y = m(1 + X) leaves it undefined.
	NFromXY float64
	// IsentropicN is n_s = ln(p2/p1)/ln(v1/v2s) from the end states.
	IsentropicN float64
	// HeadFactor is the polytropic head factor
	// f = (h2s − h1)/[(n_s/(n_s − 1))(p2 v2s − p1 v1)].
	HeadFactor float64
	// Head is Hp = f (n/(n − 1))(p2 v2 − p1 v1).
	Head physics.JoulePerKg
	// Efficiency is ηp = Hp/(h2 − h1).
	Efficiency float64
}

// SchultzAnalysis returns the polytropic head and efficiency of a
// compression from its suction, discharge and isentropic discharge states
// (the last two at the same pressure), by the polytropic head factor:
//
//	n_s = ln(p2/p1)/ln(v1/v2s),   n = ln(p2/p1)/ln(v1/v2)
//	f   = (h2s − h1) / [(n_s/(n_s − 1))(p2 v2s − p1 v1)]
//	Hp  = f (n/(n − 1))(p2 v2 − p1 v1),   ηp = Hp/(h2 − h1)
//
// The products are evaluated in the equivalent logarithmic-mean form
// (n/(n − 1))(p2 v2 − p1 v1) = ln(p2/p1)·(p2 v2 − p1 v1)/ln(p2 v2/(p1 v1)),
// which stays finite through p2 v2 = p1 v1. Schultz's X, Y, m and his
// n = 1/(Y − m(1 + X)) are reported from the averaged end-state values.
//
// Source: J. M. Schultz, ASME J. Eng. Power 84(1):69-82 (1962); ASME PTC
// 10-1997 (equation forms from memory, as in the reference pack,
// stage-examples.md §8). For an ideal gas f = 1 and n_s = γ. Valid for
// compressions (p2 > p1, h2 ≥ h2s > h1, h2 within StepTolerance of h2s
// allowed for a path at ηp = 1) of single-phase states; the head
// factor is known to lose accuracy for strongly non-ideal gases (Sandberg &
// Colby, Texas A&M Turbomachinery Symposium 2013).
func SchultzAnalysis(suction, discharge, isentropic gas.State) (SchultzResult, error) {
	if err := checkState("suction", suction); err != nil {
		return SchultzResult{}, err
	}
	if err := checkState("discharge", discharge); err != nil {
		return SchultzResult{}, err
	}
	if err := checkState("isentropic discharge", isentropic); err != nil {
		return SchultzResult{}, err
	}
	p1, p2 := float64(suction.Pressure), float64(discharge.Pressure)
	if !(p2 > p1) {
		return SchultzResult{}, pressureNotAbove(discharge.Pressure)
	}
	if !(math.Abs(float64(isentropic.Pressure)-p2) <= 1e-9*p2) {
		return SchultzResult{}, &physics.DomainError{Name: "isentropic discharge pressure", Value: float64(isentropic.Pressure),
			Want: "the discharge pressure", Reason: "the isentropic discharge state must be at the discharge pressure"}
	}
	h1 := float64(suction.Enthalpy)
	hs := float64(isentropic.Enthalpy) - h1
	work := float64(discharge.Enthalpy) - h1
	if !(hs > 0) || !(work >= hs*(1-StepTolerance)) {
		return SchultzResult{}, &physics.DomainError{Name: "discharge enthalpy", Value: work, Want: "h2 >= h2s > h1",
			Reason: "the end states are not a compression: the discharge enthalpy must be at least the isentropic discharge enthalpy, which must exceed the suction enthalpy"}
	}
	lnPr := math.Log(p2 / p1)
	pv1 := p1 / float64(suction.Density)
	pv2 := p2 / float64(discharge.Density)
	pv2s := p2 / float64(isentropic.Density)
	lnV := math.Log(float64(discharge.Density) / float64(suction.Density))
	lnVs := math.Log(float64(isentropic.Density) / float64(suction.Density))
	if !(math.Abs(lnV) > 1e-12) || !(math.Abs(lnVs) > 1e-12) {
		return SchultzResult{}, &physics.DomainError{Name: "discharge density", Value: float64(discharge.Density),
			Want:   "a density different from the suction density",
			Reason: "the discharge density equals the suction density, so the polytropic volume exponent is undefined"}
	}
	f := hs / (lnPr * logMean(pv1, pv2s))
	head := f * lnPr * logMean(pv1, pv2)
	eta := head / work

	x := 0.5 * (suction.SchultzX + discharge.SchultzX)
	y := 0.5 * (suction.SchultzY + discharge.SchultzY)
	zrcp := 0.5 * (pv1/(float64(suction.Temperature)*float64(suction.Cp)) +
		pv2/(float64(discharge.Temperature)*float64(discharge.Cp)))
	mExp := zrcp * (1/eta + x)
	nXY := 1 / (y - mExp*(1+x))
	if !physics.Finite(nXY) || math.Abs(y-mExp*(1+x)) < 1e-12 {
		nXY = 0
	}
	r := SchultzResult{
		X: x, Y: y, M: mExp,
		N: lnPr / lnV, NFromXY: nXY, IsentropicN: lnPr / lnVs,
		HeadFactor: f, Head: physics.JoulePerKg(head), Efficiency: eta,
	}
	if !physics.Finite(r.X, r.Y, r.M, r.N, r.IsentropicN, r.HeadFactor, head, eta) {
		return SchultzResult{}, &physics.DomainError{Name: "state", Value: 0, Want: "finite properties",
			Reason: "the Schultz analysis of these states is not a finite number; the gas model returned inconsistent states"}
	}
	return r, nil
}

// logMean returns the logarithmic mean (b − a)/ln(b/a) of a, b > 0, with
// its series a(1 + x/2 − x²/12 + x³/24) for b/a = 1 + x near 1.
func logMean(a, b float64) float64 {
	x := b/a - 1
	if math.Abs(x) < 1e-4 {
		return a * (1 + x/2 - x*x/12 + x*x*x/24)
	}
	return (b - a) / math.Log(b/a)
}
