package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// stackComponents is the component count up to which Stable and
// DewTemperature keep their work arrays on the stack (no allocation).
const stackComponents = 24

// Tolerances of the tangent-plane iteration.
const (
	tpdUnstable = -1e-9 // tm below this proves instability
	tpdStep     = 1e-20 // Σ (Δ ln Wi)² at convergence
	tpdTrivial  = 1e-8  // Σ (ln wi − ln zi)² below this and the same root: the trivial solution
	tpdMaxIter  = 2000  // successive-substitution steps per trial phase
	wilsonC     = 5.373 // Wilson K-value constant, 5.373 = ln(10)·7/3
)

// wilsonLnK returns the Wilson estimate of ln Ki = ln(yi/xi) for component i:
//
//	ln Ki = ln(Pci/P) + 5.373 (1 + ωi)(1 − Tci/T)
//
// Source: Wilson (1969) (from memory); Michelsen (1982) uses it for the
// initial trial phases.
func (m *Mixture) wilsonLnK(i int, t, p float64) float64 {
	return math.Log(m.pc[i]/p) + wilsonC*(1+m.omega[i])*(1-m.tc[i]/t)
}

// Stable reports whether the state that Residual returns at (t, p, x), the
// largest (vapour-like) root, is thermodynamically stable: no trial phase
// w has a negative tangent-plane distance
//
//	tm(W) = 1 + Σi Wi (ln Wi + ln φi(w) − di − 1),  di = ln zi + ln φi(z),
//
// with w = W/ΣW. false means the gas as Residual describes it would not
// stay single-phase: inside the two-phase region, or a metastable vapour
// root of a compressed liquid (a pure component above its vapour
// pressure). A liquid-like only root (Residual.Root) can be stable.
//
// Method: Michelsen, Fluid Phase Equilib. 9:1-19 (1982), eqs. (21)-(24):
// successive substitution ln Wi ← di − ln φi(w) from a vapour-like
// (Wi = zi Ki) and a liquid-like (Wi = zi/Ki) Wilson start, each trial
// phase on its root of lowest Gibbs energy; the state is unstable as soon
// as tm < −1e−9, stable when both trials converge to tm ≥ 0 or to the
// trivial solution. Valid for the inputs Residual accepts. It does not
// allocate for up to 24 components.
func (m *Mixture) Stable(x []float64, t physics.Kelvin, p physics.Pascal) (bool, error) {
	tt, pp := float64(t), float64(p)
	if err := m.checkTP(tt, pp); err != nil {
		return false, err
	}
	if err := m.checkX(x); err != nil {
		return false, err
	}
	var buf [4 * stackComponents]float64
	d, lnw, w, phi := m.scratch(&buf)
	zf, _, _ := m.lnPhi(x, tt, pp, pickLargest, phi)
	for i, xi := range x {
		if xi > 0 {
			d[i] = math.Log(xi) + phi[i]
		}
	}
	if !physics.Finite(d...) {
		return false, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with a finite solution",
			Reason: fmt.Sprintf("the %s equation gives no finite fugacity at %g K and %g Pa", m.kind, tt, pp)}
	}
	for _, sign := range [2]float64{1, -1} { // vapour-like, then liquid-like trial
		for i, xi := range x {
			if xi > 0 {
				lnw[i] = math.Log(xi) + sign*m.wilsonLnK(i, tt, pp)
			}
		}
		unstable, err := m.trialPhase(x, tt, pp, zf, d, lnw, w, phi)
		if err != nil {
			return false, err
		}
		if unstable {
			return false, nil
		}
	}
	return true, nil
}

// trialPhase runs Michelsen's successive substitution from ln W = lnw and
// reports whether it finds tm < tpdUnstable. zf is the feed's Z; lnw, w
// and phi are work arrays; components with x = 0 stay absent.
func (m *Mixture) trialPhase(x []float64, t, p, zf float64, d, lnw, w, phi []float64) (bool, error) {
	converged := false
	for range tpdMaxIter {
		sum := 0.0
		for i, xi := range x {
			w[i] = 0
			if xi > 0 {
				w[i] = math.Exp(lnw[i])
				sum += w[i]
			}
		}
		if !(sum > 0) || math.IsInf(sum, 0) {
			return false, &physics.DomainError{Name: "pressure", Value: p, Want: "a convergent stability test",
				Reason: fmt.Sprintf("the phase-stability test diverged at %g K and %g Pa", t, p)}
		}
		tm := 1.0
		for i, xi := range x {
			if xi > 0 {
				tm -= w[i] // the −1 of each term
			}
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
			wi := w[i] * sum
			tm += wi * (lnw[i] + phi[i] - d[i])
			dl := math.Log(w[i]) - math.Log(xi)
			dist += dl * dl
			next := d[i] - phi[i]
			step += (next - lnw[i]) * (next - lnw[i])
			lnw[i] = next
		}
		if !physics.Finite(tm, step) {
			return false, &physics.DomainError{Name: "pressure", Value: p, Want: "a convergent stability test",
				Reason: fmt.Sprintf("the phase-stability test gave no finite result at %g K and %g Pa", t, p)}
		}
		if tm < tpdUnstable {
			return true, nil
		}
		if converged || isTrivial(dist, zt, zf) {
			return false, nil
		}
		converged = step < tpdStep
	}
	// Not converged (a state very close to a stability limit): the last
	// iterate had tm ≥ tpdUnstable, so no instability was found.
	return false, nil
}

// isTrivial reports whether a trial phase has reached the trivial solution:
// the feed composition (squared log distance dist) on the feed's own root
// (zt ≈ zf). A trial phase of the feed composition on another root (a
// pure component's liquid against its vapour) is not trivial.
func isTrivial(dist, zt, zf float64) bool {
	return dist < tpdTrivial && math.Abs(zt-zf) < 1e-3*zf
}

// scratch splits four work vectors of length n out of buf, or out of a new
// slice when the mixture has more than stackComponents components (so the
// common case allocates nothing).
func (m *Mixture) scratch(buf *[4 * stackComponents]float64) (d, lnw, w, phi []float64) {
	n := m.n
	var s []float64
	if n <= stackComponents {
		s = buf[:4*n]
	} else {
		s = make([]float64, 4*n)
	}
	return s[:n], s[n : 2*n], s[2*n : 3*n], s[3*n : 4*n]
}
