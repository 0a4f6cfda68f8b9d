package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// dewStepDown is the factor by which DewTemperature lowers the temperature
// while it searches, from above, for the first unstable state.
const dewStepDown = 0.98

// DewTemperature returns the (upper) dew-point temperature of a vapour of
// composition x at pressure p: the highest temperature at which an
// incipient liquid w appears, i.e. where the liquid-like stationary point
// of the tangent-plane distance of Stable reaches zero,
//
//	S(T) = Σi xi φi^V(x)/φi^L(w) = 1,  wi = xi φi^V(x)/(φi^L(w) S),
//
// which is the classical dew-point condition Σ yi/Ki = 1 with
// Ki = φi^L/φi^V. For each trial temperature w comes from Michelsen's
// successive substitution (Michelsen 1982, see Stable); the temperature is
// searched downward from above the Wilson estimate in 2 % steps and then
// refined by regula falsi with bisection (a two-phase band narrower than
// 2 % of T, close to the cricondentherm, can be missed); for a single component a state
// whose only root is liquid-like counts as below the dew point. Below the returned
// temperature (and above any lower dew point) Stable reports false or
// Residual a liquid-like root.
//
// Sources: Michelsen, Fluid Phase Equilib. 9:1-19 (1982); Michelsen &
// Mollerup (2007), ch. 12 (saturation points). For a pure component it is
// the temperature where VapourPressure equals p. Valid for the compositions
// and pressures Residual accepts, below the cricondenbar (above it there
// is no dew point and an error is returned). Near a critical point the
// result can be the bubble point of the same envelope: the two merge there.
func (m *Mixture) DewTemperature(x []float64, p physics.Pascal) (physics.Kelvin, error) {
	pp := float64(p)
	if !(pp > 0) || math.IsInf(pp, 0) {
		return 0, &physics.DomainError{Name: "pressure", Value: pp, Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	}
	if err := m.checkX(x); err != nil {
		return 0, err
	}
	n := m.n
	var buf [4 * stackComponents]float64
	d, lnw, w, phi := m.scratch(&buf)

	// Wilson estimate: Σ xi/Ki(T) = 1, decreasing in T; bisection on 1/T.
	tMin := math.Inf(1)
	for i := range n {
		tMin = math.Min(tMin, MinReducedTemperature*m.tc[i])
	}
	tTop := math.Min(m.tMax*0.999, 5000)
	wilson := func(t float64) float64 {
		sum := 0.0
		for i, xi := range x {
			if xi > 0 {
				sum += xi * math.Exp(-m.wilsonLnK(i, t, pp))
			}
		}
		return sum - 1
	}
	tw := tTop
	if wilson(tTop) < 0 {
		lo, hi := 1/tTop, 1/tMin
		for range 100 {
			mid := 0.5 * (lo + hi)
			if wilson(1/mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		tw = 1 / (0.5 * (lo + hi))
	}

	// A single component whose only root is liquid-like (below p < Pc this
	// happens only below its saturation temperature) is below the dew
	// point even where the 2 % search steps jump over the narrow metastable
	// vapour range near Tc. For a mixture a liquid-like only root just means
	// a dense fluid and the stationary point decides.
	present := 0
	for _, xi := range x {
		if xi > 0 {
			present++
		}
	}
	pure := present == 1

	// f returns ln S at t and where t lies: below the dew point (the vapour
	// is unstable, ln S > 0, or a pure fluid is already liquid), above it
	// (trivial solution or ln S ≤ 0), and whether ln S is known.
	f := func(t float64) (lnS float64, below, known bool, err error) {
		if !(t > 0 && t < m.tMax) {
			return 0, false, false, nil
		}
		zf, _, liquid := m.lnPhi(x, t, pp, pickLargest, phi)
		if liquid && pure {
			return 0, true, false, nil
		}
		for i, xi := range x {
			if xi > 0 {
				d[i] = math.Log(xi) + phi[i]
				lnw[i] = math.Log(xi) - m.wilsonLnK(i, t, pp)
			}
		}
		lnS, trivial := m.stationary(x, t, pp, zf, d, lnw, w, phi)
		if trivial {
			return 0, false, false, nil
		}
		if !physics.Finite(lnS) {
			return 0, false, false, &physics.DomainError{Name: "pressure", Value: pp, Want: "a convergent dew-point solve",
				Reason: fmt.Sprintf("the dew-point iteration gave no finite result at %g K and %g Pa", t, pp)}
		}
		return lnS, lnS > 0, true, nil
	}

	// Start above the estimate, where the vapour is stable, then search
	// downward for the first state below the dew point.
	hiT := math.Min(tTop, 1.5*tw)
	hiF, below, hiKnown, err := f(hiT)
	if err != nil {
		return 0, err
	}
	for below && hiT < tTop {
		hiT = math.Min(tTop, hiT*1.5)
		if hiF, below, hiKnown, err = f(hiT); err != nil {
			return 0, err
		}
	}
	if below {
		return 0, m.noDew(pp)
	}
	loT, loF, loKnown := hiT, 0.0, false
	found := false
	for loT > tMin {
		loT *= dewStepDown
		g, b, known, err := f(loT)
		if err != nil {
			return 0, err
		}
		if b {
			loF, loKnown, found = g, known, true
			break
		}
		hiT, hiF, hiKnown = loT, g, known
	}
	if !found {
		return 0, m.noDew(pp)
	}
	for range 200 {
		t := 0.5 * (loT + hiT)
		if loKnown && hiKnown && hiF < loF {
			t = loT + (hiT-loT)*loF/(loF-hiF)
			if !(t > loT+0.01*(hiT-loT) && t < hiT-0.01*(hiT-loT)) {
				t = 0.5 * (loT + hiT)
			}
		}
		g, b, known, err := f(t)
		if err != nil {
			return 0, err
		}
		if b {
			loT, loF, loKnown = t, g, known
		} else {
			hiT, hiF, hiKnown = t, g, known
		}
		if hiT-loT < 1e-9*hiT || (known && math.Abs(g) < 1e-12) {
			return physics.Kelvin(t), nil
		}
	}
	return 0, &physics.DomainError{Name: "pressure", Value: pp, Want: "a convergent dew-point solve",
		Reason: fmt.Sprintf("the dew-point temperature at %g Pa did not converge", pp)}
}

func (m *Mixture) noDew(p float64) error {
	return &physics.DomainError{Name: "pressure", Value: p, Want: "below the cricondenbar",
		Reason: fmt.Sprintf("the gas has no dew point at %g Pa: the pressure lies above the two-phase region of the %s equation", p, m.kind)}
}

// stationary runs Michelsen's successive substitution ln Wi ← di − ln φi(w)
// to convergence from ln W = lnw and returns ln ΣW at the stationary point
// (tm = 1 − ΣW there) and whether it reached the trivial solution (w = x
// on the feed's root, Z = zf).
func (m *Mixture) stationary(x []float64, t, p, zf float64, d, lnw, w, phi []float64) (float64, bool) {
	sum := 0.0
	for range tpdMaxIter {
		sum = 0
		for i, xi := range x {
			w[i] = 0
			if xi > 0 {
				w[i] = math.Exp(lnw[i])
				sum += w[i]
			}
		}
		if !(sum > 0) || math.IsInf(sum, 0) {
			return math.NaN(), false
		}
		for i := range w {
			w[i] /= sum
		}
		zt, _, _ := m.lnPhi(w, t, p, pickMinGibbs, phi)
		step, dist := 0.0, 0.0
		for i, xi := range x {
			if xi == 0 {
				continue
			}
			dl := math.Log(w[i]) - math.Log(xi)
			dist += dl * dl
			next := d[i] - phi[i]
			step += (next - lnw[i]) * (next - lnw[i])
			lnw[i] = next
		}
		if isTrivial(dist, zt, zf) {
			return 0, true
		}
		if step < tpdStep {
			break
		}
	}
	sum = 0
	for i, xi := range x {
		if xi > 0 {
			sum += math.Exp(lnw[i])
		}
	}
	return math.Log(sum), false
}
