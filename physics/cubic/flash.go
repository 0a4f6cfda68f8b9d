package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// Tolerances of the two-phase flash.
const (
	flashStep    = 1e-12 // Σ (Δ ln Ki)² at convergence
	flashMaxIter = 500   // successive-substitution steps
	flashTrivial = 1e-8  // Σ (ln Ki)² below this: the phases have merged
)

// Flash is the result of an isothermal flash at (T, P).
type Flash struct {
	// TwoPhase is false when the feed is stable (one phase); then
	// VapourFraction is 1, Vapour is the feed and Liquid is nil.
	TwoPhase bool
	// VapourFraction is β, moles of vapour per mole of feed.
	VapourFraction float64
	// Vapour and Liquid are the phase mole fractions.
	Vapour, Liquid []float64
	// CondensationEnthalpy is the enthalpy the split releases, J per mole
	// of feed: R T [HDep(z, vapour root) − β HDep(y) − (1−β) HDep(x, liquid
	// root)], the ideal-gas parts cancelling (they are linear in the
	// composition). Positive when liquid forms.
	CondensationEnthalpy float64
	// Iterations is the number of successive-substitution steps taken.
	Iterations int
}

// Flash splits a feed of composition z at (t, p) into an equilibrium vapour
// and liquid: equal fugacities fi^V = fi^L with the material balance
// solved by Rachford and Rice (J. Pet. Technol. 4(10), 1952):
//
//	Σi zi (Ki − 1)/(1 + β (Ki − 1)) = 0,  xi = zi/(1 + β (Ki − 1)),  yi = Ki xi,
//
// and the K-values updated by successive substitution
// ln Ki = ln φi^L(x) − ln φi^V(y) (Michelsen & Mollerup, Thermodynamic
// Models: Fundamentals & Computational Aspects, 2nd ed. 2007, ch. 10).
// The feed is first tested with Stable's tangent-plane method (Michelsen,
// Fluid Phase Equilib. 9:1, 1982): a stable feed is one phase; for an
// unstable one the K-values start from the trial phase that proved the
// instability (Michelsen 1982, §5), else from Wilson's estimate. The
// liquid takes the root of lowest Gibbs energy, the vapour the largest.
// Valid for the inputs Residual accepts; slow near a critical point (an
// error is returned when 500 steps do not converge).
func (m *Mixture) Flash(z []float64, t physics.Kelvin, p physics.Pascal) (Flash, error) {
	tt, pp := float64(t), float64(p)
	if err := m.checkTP(tt, pp); err != nil {
		return Flash{}, err
	}
	if err := m.checkX(z); err != nil {
		return Flash{}, err
	}
	n := m.n
	lnk, ok, err := m.instability(z, tt, pp)
	if err != nil {
		return Flash{}, err
	}
	single := Flash{VapourFraction: 1, Vapour: append([]float64(nil), z...)}
	if !ok {
		return single, nil
	}
	x, y := make([]float64, n), make([]float64, n)
	phiL, phiV := make([]float64, n), make([]float64, n)
	beta := 0.5
	for it := 1; it <= flashMaxIter; it++ {
		beta = rachfordRice(z, lnk, beta)
		for i, zi := range z {
			k := math.Exp(lnk[i])
			x[i] = zi / (1 + beta*(k-1))
			y[i] = k * x[i]
		}
		normalise(x)
		normalise(y)
		m.lnPhi(x, tt, pp, pickMinGibbs, phiL)
		m.lnPhi(y, tt, pp, pickLargest, phiV)
		step, trivial := 0.0, 0.0
		for i, zi := range z {
			if zi == 0 {
				continue
			}
			next := phiL[i] - phiV[i]
			step += (next - lnk[i]) * (next - lnk[i])
			trivial += next * next
			lnk[i] = next
		}
		if !physics.Finite(step) {
			return Flash{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a convergent flash",
				Reason: fmt.Sprintf("the %s flash diverged at %g K and %g Pa", m.kind, tt, pp)}
		}
		if trivial < flashTrivial {
			return single, nil // the phases merged: one phase after all
		}
		if step < flashStep {
			beta = rachfordRice(z, lnk, beta)
			if beta >= 1 {
				return single, nil
			}
			for i, zi := range z {
				k := math.Exp(lnk[i])
				x[i] = zi / (1 + beta*(k-1))
				y[i] = k * x[i]
			}
			normalise(x)
			normalise(y)
			out := Flash{TwoPhase: true, VapourFraction: beta, Vapour: y, Liquid: x, Iterations: it}
			hz := m.hDep(z, tt, pp, pickLargest)
			hy := m.hDep(y, tt, pp, pickLargest)
			hx := m.hDep(x, tt, pp, pickMinGibbs)
			out.CondensationEnthalpy = physics.UniversalGasConstant * tt * (hz - beta*hy - (1-beta)*hx)
			if !physics.Finite(out.CondensationEnthalpy) {
				return Flash{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with a finite solution",
					Reason: fmt.Sprintf("the %s flash gave no finite enthalpy at %g K and %g Pa", m.kind, tt, pp)}
			}
			return out, nil
		}
	}
	return Flash{}, &physics.DomainError{Name: "temperature", Value: tt, Want: "a convergent flash",
		Reason: fmt.Sprintf("the %s two-phase flash did not converge in %d steps at %g K and %g Pa (a state near a critical point)", m.kind, flashMaxIter, tt, pp)}
}

// instability runs Stable's trial phases and, when one proves the feed
// unstable, returns ln K from it: Ki = wi/zi for a vapour-like trial
// phase, zi/wi for a liquid-like one (by its Z against the feed's).
func (m *Mixture) instability(z []float64, t, p float64) ([]float64, bool, error) {
	n := m.n
	d, lnw, w, phi := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	zf, _, _ := m.lnPhi(z, t, p, pickLargest, phi)
	for i, zi := range z {
		if zi > 0 {
			d[i] = math.Log(zi) + phi[i]
		}
	}
	if !physics.Finite(d...) {
		return nil, false, &physics.DomainError{Name: "pressure", Value: p, Want: "a state with a finite solution",
			Reason: fmt.Sprintf("the %s equation gives no finite fugacity at %g K and %g Pa", m.kind, t, p)}
	}
	lnk := make([]float64, n)
	for _, sign := range [2]float64{1, -1} {
		for i, zi := range z {
			if zi > 0 {
				lnw[i] = math.Log(zi) + sign*m.wilsonLnK(i, t, p)
			}
		}
		unstable, err := m.trialPhase(z, t, p, zf, d, lnw, w, phi)
		if err != nil {
			return nil, false, err
		}
		if !unstable {
			continue
		}
		// w holds the normalised trial phase that proved the instability.
		zt, _, _ := m.lnPhi(w, t, p, pickMinGibbs, phi)
		for i, zi := range z {
			if zi > 0 && w[i] > 0 {
				lnk[i] = math.Log(w[i]) - math.Log(zi)
				if zt < zf { // liquid-like trial: K = y/x = z/w
					lnk[i] = -lnk[i]
				}
			} else if zi > 0 {
				lnk[i] = m.wilsonLnK(i, t, p)
			}
		}
		if !physics.Finite(lnk...) {
			for i := range lnk {
				lnk[i] = m.wilsonLnK(i, t, p)
			}
		}
		return lnk, true, nil
	}
	return nil, false, nil
}

// rachfordRice solves Σ zi (Ki−1)/(1+β(Ki−1)) = 0 for β in [0, 1] by
// safeguarded Newton steps from guess; it returns 0 or 1 when the root lies
// outside (all liquid or all vapour at these K-values).
func rachfordRice(z, lnk []float64, guess float64) float64 {
	f := func(b float64) (float64, float64) {
		s, ds := 0.0, 0.0
		for i, zi := range z {
			if zi == 0 {
				continue
			}
			c := math.Exp(lnk[i]) - 1
			q := 1 + b*c
			s += zi * c / q
			ds -= zi * c * c / (q * q)
		}
		return s, ds
	}
	if f0, _ := f(0); f0 <= 0 {
		return 0
	}
	if f1, _ := f(1); f1 >= 0 {
		return 1
	}
	lo, hi := 0.0, 1.0
	b := math.Min(math.Max(guess, 1e-12), 1-1e-12)
	for range 100 {
		v, dv := f(b)
		if v > 0 {
			lo = b
		} else {
			hi = b
		}
		next := b - v/dv
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if math.Abs(next-b) < 1e-15 {
			return next
		}
		b = next
	}
	return b
}

func normalise(x []float64) {
	s := 0.0
	for _, v := range x {
		s += v
	}
	if s > 0 {
		for i := range x {
			x[i] /= s
		}
	}
}

// hDep is (h − h_ig)/(R T) at (t, p, x) on the root pick chooses (as
// Residual.HDep, which takes the largest).
func (m *Mixture) hDep(x []float64, t, p float64, pick rootPick) float64 {
	phi := make([]float64, m.n)
	z, _, _ := m.lnPhi(x, t, p, pick, phi)
	a, da, _, b := m.params(x, t)
	const r = physics.UniversalGasConstant
	rt := r * t
	bb := b * p / rt
	l := math.Log1p((m.d1 - m.d2) * bb / (z + m.d2*bb))
	ii := l / ((m.d1 - m.d2) * b)
	return (t*da-a)*ii/rt + z - 1
}
