package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// MinReducedTemperature is the lowest T/Tc that VapourPressure accepts;
// below it vapour pressures fall to about 1e-8 Pc and the α function is
// far outside the range it was fitted to (0.7 ≤ Tr ≤ 1 in Peng & Robinson
// 1976; Soave 1972 fits ω at Tr = 0.7).
const MinReducedTemperature = 0.3

// pureLnPhi returns ln φ = Z − 1 − ln(Z − B) − A/((δ1−δ2)B) ln((Z+δ1B)/(Z+δ2B))
// of a pure fluid on root z.
func (m *Mixture) pureLnPhi(z, aa, bb float64) float64 {
	d1, d2 := m.d1, m.d2
	return z - 1 - math.Log(z-bb) - aa/((d1-d2)*bb)*math.Log1p((d1-d2)*bb/(z+d2*bb))
}

// VapourPressure returns the vapour pressure of pure component i at
// temperature t predicted by the equation of state: the pressure where the
// liquid and vapour roots have equal fugacity,
//
//	ln φ(Z_L) = ln φ(Z_V),
//
// solved by Newton's method in ln P, d(ln φL − ln φV)/d ln P = Z_L − Z_V,
// safeguarded by bisection, from the Wilson estimate
// ln(P/Pc) = 5.373 (1 + ω)(1 − Tc/T). Sources: Peng & Robinson (1976),
// eq. (19) and Figs. 1-3 (PR reproduces vapour pressures of light
// hydrocarbons to about 1 %, from memory); Michelsen & Mollerup (2007).
// Valid for MinReducedTemperature·Tc ≤ t < Tc. With the printed Ωa, Ωb
// the equation's own critical temperature lies a few 1e-5·Tc below Tc
// (about 0.99997 Tc for CO2 with PR); closer to Tc an error is returned.
func (m *Mixture) VapourPressure(i int, t physics.Kelvin) (physics.Pascal, error) {
	if i < 0 || i >= m.n {
		return 0, &physics.DomainError{Name: "i", Value: float64(i), Want: fmt.Sprintf("0 <= i < %d", m.n),
			Reason: fmt.Sprintf("component index %d does not exist in a mixture of %d components", i, m.n)}
	}
	tt := float64(t)
	tc := m.tc[i]
	if !(tt >= MinReducedTemperature*tc && tt < tc) {
		return 0, &physics.DomainError{Name: "temperature", Value: tt, Want: fmt.Sprintf("%.6g K <= T < %.6g K", MinReducedTemperature*tc, tc),
			Reason: fmt.Sprintf("a vapour pressure of component %d exists only below its critical temperature %g K (and is computed down to %g Tc)", i, tc, MinReducedTemperature)}
	}
	const r = physics.UniversalGasConstant
	rt := r * tt
	q := m.qa[i] + m.qb[i]*math.Sqrt(tt)
	a, b := q*q, m.b[i]
	d1, d2 := m.d1, m.d2
	vapourLike := m.zc / m.omB // v/b above this: vapour branch (subcritical)
	lnP := math.Log(m.pc[i]) + wilsonC*(1+m.omega[i])*(1-tc/tt)
	lo, hi := math.Inf(-1), math.Log(m.pc[i])
	if !(lnP < hi) {
		lnP = hi - 0.1
	}
	seen := false // a three-root state was met: a solution exists
	for range 200 {
		p := math.Exp(lnP)
		aa, bb := a*p/(rt*rt), b*p/rt
		zl, zv, three := zRoots(aa, bb, d1+d2, d1*d2)
		next := lnP
		switch {
		case three:
			seen = true
			f := m.pureLnPhi(zl, aa, bb) - m.pureLnPhi(zv, aa, bb)
			if math.Abs(f) < 1e-12 {
				return physics.Pascal(p), nil
			}
			if f > 0 {
				lo = lnP
			} else {
				hi = lnP
			}
			next = lnP + f/(zv-zl)
		case zv > bb*vapourLike: // only a vapour root: below the liquid spinodal range
			lo = lnP
			next = lnP + 0.5
		default: // only a liquid root
			hi = lnP
			next = lnP - 0.5
		}
		if !(next > lo && next < hi) {
			switch {
			case math.IsInf(lo, -1):
				next = hi - 0.5
			default:
				next = 0.5 * (lo + hi)
			}
		}
		if math.Abs(next-lnP) < 1e-13 {
			if !seen {
				break
			}
			return physics.Pascal(math.Exp(next)), nil
		}
		lnP = next
	}
	return 0, &physics.DomainError{Name: "temperature", Value: tt, Want: "a convergent vapour-pressure solve",
		Reason: fmt.Sprintf("the vapour pressure of component %d at %g K did not converge (too close to the critical point)", i, tt)}
}
