package gerg

import (
	"math"

	"stagewright/physics"
)

// noRoot is the error of a failed density search.
type noRoot struct{ de *physics.DomainError }

func (e noRoot) Error() string   { return e.de.Error() }
func (e noRoot) Unwrap() []error { return []error{ErrNoRoot, e.de} }

func noRootError(p float64, why string) error {
	return noRoot{&physics.DomainError{Name: "pressure", Value: p, Want: "a state with a density root",
		Reason: "GERG-2008 finds no " + why + " density at this temperature and pressure"}}
}

// density finds δ with p(δ) = p at the temperature of w.
//
// Vapour branch (liquid false): p(δ) rises from 0 at δ = 0 to the vapour
// spinodal, where (∂p/∂δ)_T first reaches 0. Newton steps start from the
// ideal gas inside a bracket [a, b]: a is the densest point seen with
// (∂p/∂δ) > 0, p < target and p above every earlier such point (so still on
// the rising vapour branch); b is any point with p ≥ target or with
// (∂p/∂δ) ≤ 0 or with p below an earlier point (past the spinodal). Steps
// that leave the bracket, or grow δ more than twofold, bisect. A bracket
// that shrinks without reaching the target means the vapour branch ends
// below it: then (and for liquid true) the liquid-like root is sought from
// above, where p(δ) is steep and convex so that Newton steps stay above the
// root. Below the critical region a dense "vapour" root is accepted only if
// p rises monotonically up to it (onVapourBranch): inside the two-phase
// region multiparameter equations have loops with (∂p/∂δ) > 0 far from the
// vapour branch (e.g. CO2 at 220 K and 20 MPa). Failure is an error, never a
// root on the wrong branch.
// Source: the strategy of the pack README ("start from the ideal gas, guard
// against the unstable region where dp/drho <= 0, and report failure"),
// with safeguarded Newton iteration (Press et al., Numerical Recipes, 3rd
// ed., 2007, §9.4).
func (mx *Mixture) density(t, p float64, w *tauWork, liquid bool) (float64, Branch, Residual, error) {
	k := mx.rhor * R * t // p = k δ (1 + δα_δ)
	eval := func(delta float64) (float64, float64, Residual) {
		r := mx.residual(delta, w)
		return k * delta * (1 + r.D), k * (1 + 2*r.D + r.DD), r
	}
	a, pa, b := 0.0, 0.0, math.Inf(1)
	vapour := 0.0 // the vapour root, when liquid is asked for
	delta := mx.virialStart(p/k, w)
	for range 200 {
		pd, dpd, r := eval(delta)
		stable := dpd > 0
		switch {
		case stable && pd < p && pd > pa:
			a, pa = delta, pd
		default:
			b = min(b, delta)
		}
		if stable {
			step := (p - pd) / dpd
			if math.Abs(step) <= 1e-13*delta && math.Abs(pd-p) <= 1e-7*p {
				if !mx.onVapourBranch(delta, t, eval) {
					a = 0 // a root of an unphysical loop: there is no vapour root
					break
				}
				if !liquid {
					return delta, Vapour, r, nil
				}
				vapour = delta
				a = delta
				break
			}
			if next := delta + step; next > a && next < b && next <= 2*delta && math.Abs(step) > 1e-13*delta {
				delta = next
				continue
			}
		}
		if b-a <= 1e-12*b {
			break // the vapour branch ends below the target
		}
		if math.IsInf(b, 1) {
			delta *= 2
		} else {
			delta = 0.5 * (a + b)
		}
	}
	// Liquid-like root, from above.
	lo := a
	delta = max(2*a, 2)
	found := false
	for range 60 {
		pd, dpd, _ := eval(delta)
		if dpd > 0 && pd > p {
			found = true
			break
		}
		delta *= 1.25
	}
	if !found {
		return 0, LiquidOnly, Residual{}, noRootError(p, "liquid-like")
	}
	hi := delta
	for range 200 {
		pd, dpd, r := eval(delta)
		stable := dpd > 0
		if stable && pd >= p {
			hi = delta
		} else {
			lo = max(lo, delta)
		}
		if stable {
			step := (p - pd) / dpd
			if math.Abs(step) <= 1e-13*delta && math.Abs(pd-p) <= 1e-7*p {
				if vapour > 0 && !(delta > vapour*(1+1e-6)) {
					return 0, LiquidOnly, Residual{}, noRootError(p, "distinct liquid-like")
				}
				return delta, LiquidOnly, r, nil
			}
			if next := delta + step; next > lo && next < hi && math.Abs(step) > 1e-13*delta {
				delta = next
				continue
			}
		}
		if hi-lo <= 1e-12*hi {
			break
		}
		delta = 0.5 * (lo + hi)
	}
	return 0, LiquidOnly, Residual{}, noRootError(p, "converged")
}

// virialStart returns the start of the vapour-root search: the root of the
// virial equation truncated after the second coefficient,
// p = k δ (1 + B δ) with B = ∂α_r/∂δ at δ = 0, i.e.
// δ = 2 δ_ig / (1 + sqrt(1 + 4 B δ_ig)) (δ_ig = p/k, the ideal gas); the
// ideal gas where that has no root. It saves one or two Newton steps.
func (mx *Mixture) virialStart(dIG float64, w *tauWork) float64 {
	b := 0.0
	for i, s := range mx.slope0 {
		b += s * w.b[i]
	}
	disc := 1 + 4*b*dIG
	if !(disc > 0) {
		return dIG
	}
	return 2 * dIG / (1 + math.Sqrt(disc))
}

// onVapourBranch says whether the root δ at temperature t is reached from
// δ = 0 along a rising p(δ): checked at 15 evenly spaced densities below it
// where the root is dense and the temperature below about 1.25 times the
// reducing temperature (elsewhere p(δ) has no loop before a gas root).
func (mx *Mixture) onVapourBranch(delta, t float64, eval func(float64) (float64, float64, Residual)) bool {
	if !(delta > 0.2 && t < 1.25*mx.tr) {
		return true
	}
	const n = 16
	prev := 0.0
	for k := 1; k < n; k++ {
		pd, dpd, _ := eval(delta * float64(k) / n)
		if !(dpd > 0) || !(pd > prev) {
			return false
		}
		prev = pd
	}
	return true
}
