package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// RootKind says which root of the cubic a Residual describes.
type RootKind int

// Root kinds.
const (
	// RootVapourOfThree: the cubic has three roots with v > b and the
	// largest (vapour-like) is returned. It may be metastable: Stable tells.
	RootVapourOfThree RootKind = iota + 1
	// RootOnlyGasLike: the only root, with v/b ≥ Zc/Ωb (3.951 PR, 3.847
	// SRK), i.e. less dense than the critical density of the one-fluid
	// (a, b) pseudo-component: a gas or light supercritical fluid.
	RootOnlyGasLike
	// RootOnlyLiquidLike: the only root, with v/b < Zc/Ωb: denser than the
	// one-fluid critical density, a liquid or dense supercritical fluid.
	RootOnlyLiquidLike
)

// String returns a short name of the root kind.
func (k RootKind) String() string {
	switch k {
	case RootVapourOfThree:
		return "vapour-of-three"
	case RootOnlyGasLike:
		return "only-gas-like"
	case RootOnlyLiquidLike:
		return "only-liquid-like"
	}
	return fmt.Sprintf("cubic.RootKind(%d)", int(k))
}

// Residual is the departure of a cubic-EOS state from the ideal gas at the
// same temperature, pressure and composition (HDep, SDep, ln φ) or at the
// same temperature and molar volume (CvDep), with the pressure derivatives
// that a caller needs for cp, the isentropic exponent, the speed of sound,
// the Joule-Thomson coefficient and the Schultz functions:
//
//	cp − cp_ig = R·CvDep + T·DPdT²/(−DPdV) − R
//	X = (T/v)(∂v/∂T)_p − 1 = −T·DPdT/(v·DPdV) − 1,  Y = −(p/v)(∂v/∂p)_T = −p/(v·DPdV)
type Residual struct {
	// Z is the compressibility factor P v/(R T).
	Z float64
	// MolarVolume is v in m3/mol.
	MolarVolume float64
	// Root says which root of the cubic Z belongs to.
	Root RootKind
	// HDep is (h − h_ig)/(R T) at (T, P).
	HDep float64
	// SDep is (s − s_ig(T, P))/R.
	SDep float64
	// CvDep is (cv − cv_ig)/R.
	CvDep float64
	// DPdT is (∂P/∂T)_v in Pa/K.
	DPdT float64
	// DPdV is (∂P/∂v)_T in Pa/(m3/mol); negative on a stable root.
	DPdV float64
}

// mixSums are the composition sums of the van der Waals one-fluid rules
//
//	a = Σi Σj xi xj (1 − kij) √ai √aj,  b = Σi xi bi.
//
// With √ai = qa_i + qb_i √T (linear in √T for the Soave α function),
// a = a0 + a1 √T + a2 T (Pa m6/mol2), so da/dT = a1/(2√T) + a2 and
// d²a/dT² = −a1/(4 T √T), all exact; b in m3/mol. The sums depend on the
// composition only, so a model of fixed composition computes them once
// (Fixed).
type mixSums struct{ a0, a1, a2, b float64 }

func (m *Mixture) sums(x []float64) (s mixSums) {
	n := m.n
	x = x[:n]
	for i, xi := range x {
		if xi == 0 {
			continue
		}
		s.b += xi * m.b[i]
		row := m.c[i*n : i*n+n]
		qa, qb := m.qa[:n], m.qb[:n]
		var sa, sb float64
		for j, xj := range x {
			cx := row[j] * xj
			sa += cx * qa[j]
			sb += cx * qb[j]
		}
		s.a0 += xi * m.qa[i] * sa
		s.a1 += 2 * xi * m.qb[i] * sa
		s.a2 += xi * m.qb[i] * sb
	}
	return s
}

// at returns a, da/dT, d²a/dT² and b at temperature t.
func (s mixSums) at(t float64) (a, da, d2a, b float64) {
	u := math.Sqrt(t)
	a = s.a0 + s.a1*u + s.a2*t
	da = s.a1/(2*u) + s.a2
	d2a = -s.a1 / (4 * u * t)
	return a, da, d2a, s.b
}

// Fixed is a Mixture at one composition, its mixing-rule sums computed
// once (Mixture.At): the residual properties of a state then cost no
// O(n²) sum. It gives exactly Mixture.Residual's numbers.
type Fixed struct {
	m *Mixture
	s mixSums
}

// At returns the mixture at composition x (checked as Residual checks it).
func (m *Mixture) At(x []float64) (*Fixed, error) {
	if err := m.checkX(x); err != nil {
		return nil, err
	}
	return &Fixed{m: m, s: m.sums(x)}, nil
}

// Residual is Mixture.Residual at the fixed composition. It does not
// allocate.
func (f *Fixed) Residual(t physics.Kelvin, p physics.Pascal) (Residual, error) {
	if err := f.m.checkTP(float64(t), float64(p)); err != nil {
		return Residual{}, err
	}
	return f.m.residual(f.s, float64(t), float64(p))
}

// Residual returns the residual properties at temperature t, pressure p
// and mole fractions x. When the cubic has three roots with v > b it takes
// the largest (vapour-like) one. With L = ln((v + δ1 b)/(v + δ2 b)) and
// I = L/((δ1 − δ2) b):
//
//	HDep  = (T a′ − a) I/(R T) + Z − 1
//	SDep  = ln(Z − B) + a′ I/R,       B = b P/(R T)
//	CvDep = T a″ I/R
//	DPdT  = R/(v − b) − a′/((v + δ1 b)(v + δ2 b))
//	DPdV  = −R T/(v − b)² + a (2v + (δ1+δ2) b)/((v + δ1 b)(v + δ2 b))²
//
// Source: Michelsen & Mollerup, Thermodynamic Models (2007), ch. 3 (the
// residual Helmholtz energy of the generic cubic and its derivatives); the
// PR forms are eqs. (13)-(15) of Peng & Robinson (1976).
// Valid for finite 0 < t < MaxTemperature, finite p > 0, x ≥ 0 summing to
// 1 within 1e-9. It does not allocate.
func (m *Mixture) Residual(x []float64, t physics.Kelvin, p physics.Pascal) (Residual, error) {
	tt, pp := float64(t), float64(p)
	if err := m.checkTP(tt, pp); err != nil {
		return Residual{}, err
	}
	if err := m.checkX(x); err != nil {
		return Residual{}, err
	}
	return m.residual(m.sums(x), tt, pp)
}

// residual is Residual with checked inputs and the composition's sums.
func (m *Mixture) residual(s mixSums, tt, pp float64) (Residual, error) {
	a, da, d2a, b := s.at(tt)
	const r = physics.UniversalGasConstant
	rt := r * tt
	aa := a * pp / (rt * rt)
	bb := b * pp / rt
	d1, d2 := m.d1, m.d2
	_, z, three := zRoots(aa, bb, d1+d2, d1*d2)
	kind := RootOnlyGasLike
	switch {
	case three:
		kind = RootVapourOfThree
	case z < bb*m.zc/m.omB:
		kind = RootOnlyLiquidLike
	}
	v := z * rt / pp
	l := math.Log1p((d1 - d2) * bb / (z + d2*bb))
	ii := l / ((d1 - d2) * b)
	dd := (v + d1*b) * (v + d2*b)
	res := Residual{
		Z:           z,
		MolarVolume: v,
		Root:        kind,
		HDep:        (tt*da-a)*ii/rt + z - 1,
		SDep:        math.Log(z-bb) + da*ii/r,
		CvDep:       tt * d2a * ii / r,
		DPdT:        r/(v-b) - da/dd,
		DPdV:        -rt/((v-b)*(v-b)) + a*(2*v+(d1+d2)*b)/(dd*dd),
	}
	if !(z > bb) || !physics.Finite(res.Z, res.MolarVolume, res.HDep, res.SDep, res.CvDep, res.DPdT, res.DPdV) {
		return Residual{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with a finite solution",
			Reason: fmt.Sprintf("the %s equation has no finite solution at %g K and %g Pa", m.kind, tt, pp)}
	}
	return res, nil
}

// rootPick selects a root for lnPhi.
type rootPick int

const (
	pickLargest  rootPick = iota // vapour-like, as Residual
	pickSmallest                 // liquid-like when three roots exist
	pickMinGibbs                 // the root of lowest Gibbs energy (Michelsen 1982)
)

// lnPhi writes ln φi of every component at composition x into out and
// returns the chosen Z, the mixture ln φ = Σ xi ln φi (= g_res/(R T)) and
// whether the chosen root is the only one and liquid-like:
//
//	ln φi = (bi/b)(Z − 1) − ln(Z − B) − A/((δ1−δ2)B) · (2 Σj xj aij/a − bi/b) · L
//
// with A = a P/(R T)², aij = (1 − kij)√(ai aj), L = ln((Z + δ1 B)/(Z + δ2 B)).
// Source: Peng & Robinson (1976), eq. (19); Michelsen & Mollerup (2007),
// ch. 3. Inputs are not checked; out has at least n elements.
func (m *Mixture) lnPhi(x []float64, t, p float64, pick rootPick, out []float64) (z, g float64, liquidOnly bool) {
	n := m.n
	x, out = x[:n], out[:n]
	u := math.Sqrt(t)
	var a, b float64
	qa, qb := m.qa[:n], m.qb[:n]
	for i := range n {
		row := m.c[i*n : i*n+n]
		s := 0.0
		for j, xj := range x {
			s += row[j] * xj * (qa[j] + qb[j]*u)
		}
		out[i] = (qa[i] + qb[i]*u) * s // Σj xj aij
		a += x[i] * out[i]
		b += x[i] * m.b[i]
	}
	const r = physics.UniversalGasConstant
	rt := r * t
	aa := a * p / (rt * rt)
	bb := b * p / rt
	d1, d2 := m.d1, m.d2
	lo, hi, three := zRoots(aa, bb, d1+d2, d1*d2)
	c := aa / ((d1 - d2) * bb)
	gOf := func(z float64) (float64, float64) {
		l := math.Log1p((d1 - d2) * bb / (z + d2*bb))
		return z - 1 - math.Log(z-bb) - c*l, l
	}
	z = hi
	g, l := gOf(hi)
	if three && pick != pickLargest {
		gl, ll := gOf(lo)
		if pick == pickSmallest || gl < g {
			z, g, l = lo, gl, ll
		}
	}
	lnzb := math.Log(z - bb)
	for i := range n {
		bi := m.b[i] / b
		out[i] = bi*(z-1) - lnzb - c*(2*out[i]/a-bi)*l
	}
	return z, g, !three && z < bb*m.zc/m.omB
}

// LnPhi writes the natural logarithms of the fugacity coefficients
// φi = fi/(xi P) at (t, p, x) into out (len(out) == number of components)
// and returns Z, on the same root Residual uses (the largest):
//
//	ln φi = (bi/b)(Z − 1) − ln(Z − B) − A/((δ1−δ2)B) · (2 Σj xj aij/a − bi/b) · ln((Z + δ1 B)/(Z + δ2 B))
//
// Source: Peng & Robinson (1976), eq. (19), written for the generic cubic
// (Michelsen & Mollerup 2007, ch. 3). Σ xi ln φi equals HDep − SDep of
// Residual. Valid for the inputs Residual accepts. It does not allocate.
func (m *Mixture) LnPhi(x []float64, t physics.Kelvin, p physics.Pascal, out []float64) (float64, error) {
	tt, pp := float64(t), float64(p)
	if err := m.checkTP(tt, pp); err != nil {
		return 0, err
	}
	if err := m.checkX(x); err != nil {
		return 0, err
	}
	if len(out) != m.n {
		return 0, &physics.DomainError{Name: "out", Value: float64(len(out)), Want: fmt.Sprintf("%d elements", m.n),
			Reason: fmt.Sprintf("the output slice for fugacity coefficients must have %d elements (got %d)", m.n, len(out))}
	}
	z, g, _ := m.lnPhi(x, tt, pp, pickLargest, out)
	if !physics.Finite(z, g) || !physics.Finite(out...) {
		return 0, &physics.DomainError{Name: "pressure", Value: pp, Want: "a state with a finite solution",
			Reason: fmt.Sprintf("the %s equation gives no finite fugacity at %g K and %g Pa", m.kind, tt, pp)}
	}
	return z, nil
}
