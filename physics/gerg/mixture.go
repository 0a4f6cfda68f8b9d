package gerg

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// Gas constants of GERG-2008 (Kunz & Wagner 2012, sec. 4): R is the molar
// gas constant the equation was fitted with, RStar the one of the ideal-gas
// heat-capacity fits (Jaeschke & Schley 1995). Both differ slightly from
// the current CODATA value (physics.UniversalGasConstant); the equation is
// used with its own.
const (
	R     = 8.314472
	RStar = 8.314510
)

// Reference state of enthalpy and entropy, the catalogue's (package gas):
// h = 0 and s = 0 for each pure component as an ideal gas at 298.15 K and
// 101 325 Pa; a mixture adds the ideal mixing entropy −R Σ x ln x.
const (
	RefTemperature = 298.15
	RefPressure    = 101325.0
)

// Range of validity of GERG-2008, the "extended range" of Kunz & Wagner
// (2012), sec. 5.1: 60 K to 700 K, up to 70 MPa.
const (
	MinTemperature = 60.0
	MaxTemperature = 700.0
	MaxPressure    = 70e6
)

// Sizes of the evaluation work arrays, kept on the stack. They hold the
// full 21-component mixture (TestWorkArraysHoldEveryComponent).
const (
	maxGroups = 96
	maxTVals  = 320
	maxD      = 10
	maxC      = 6
	maxTInt   = 31 // largest integer part of a tabulated exponent t
	maxA      = 8  // largest 8η of a tabulated departure exponential
	maxB      = 16 // largest 4β of a tabulated departure exponential
)

// group is a set of terms sharing the δ function: kind 0 is δ^d exp(−δ^c)
// (c = 0: δ^d), kind 1 is δ^d exp(−η(δ−ε)² − β(δ−γ)) of a departure model.
type group struct {
	kind                  uint8
	d, c                  int
	eta, eps, beta, gamma float64
}

// slope0 returns f'(0) of the group's δ function: the group's share of
// the second virial coefficient (only d = 1 contributes).
func (g group) slope0() float64 {
	switch {
	case g.d != 1:
		return 0
	case g.kind == 1:
		return math.Exp(-g.eta*g.eps*g.eps + g.beta*g.gamma)
	}
	return 1
}

// tDiv is the denominator of the exponents t that are formed from tables:
// every t of GERG-2008 is a multiple of 1/40 (of 1/8 in the pure-fluid
// equations, of 1/20 in the departure functions), so τ^t = τ^i · (τ^(1/40))^j
// with t = i + j/40 costs two table look-ups instead of an exp and a log.
const tDiv = 40

// tPow says how τ^t is formed: from the tables (i, j) or, for an exponent
// that is not a multiple of 1/tDiv, by exp(t ln τ) (exp true).
type tPow struct {
	i, j int32
	exp  bool
}

// term is a weighted coefficient of a group: w τ^t, with t = tvals[ti].
type term struct {
	g, ti int32
	w     float64
}

// idealComp is the ideal-gas part of one component in T form, with the
// offsets that put h = 0 and s° = 0 at RefTemperature.
type idealComp struct {
	x, a    float64    // mole fraction, n3 − 1
	n, th   [4]float64 // Planck-Einstein terms: sinh, cosh, sinh, cosh
	hOff, s float64
}

// Mixture is GERG-2008 for one composition: everything that depends only on
// the composition (reducing functions, merged term lists, ideal-gas part) is
// computed once by NewMixture. A Mixture is immutable and safe for
// concurrent use; its evaluations do not allocate.
type Mixture struct {
	x      [NumComponents]float64
	m      float64 // kg/mol
	tr     float64 // K
	rhor   float64 // mol/m³
	groups []group
	slope0 []float64 // group.slope0 of each group
	terms  []term
	tvals  []float64
	tpow   []tPow // how to form τ^t for each of tvals
	// departure exponentials exp(−η(δ−ε)² − β(δ−γ)): with ε = γ = 1/2 and
	// 8η, 4β integers (every GERG-2008 term) they are A^(8η) B^(4β) with
	// A = exp(−u²/8), B = exp(−u/4), u = δ − 1/2: two exp calls per δ
	// instead of one per group. expTab[g] holds (8η, 4β), or −1 where a
	// group is evaluated directly.
	expTab [][2]int8
	tMaxI  int // largest integer part of a tabulated τ^t
	ideal  []idealComp
	smix   float64 // −R Σ x ln x
	dMax   int
	cMax   int
}

// Formula returns the formula of GERG-2008 component i (0-based, the
// order of Kunz & Wagner 2012 and of the tables): "CH4", "N2", ... "Ar".
func Formula(i int) string {
	tb, err := loadTables()
	if err != nil || i < 0 || i >= NumComponents {
		return ""
	}
	return tb.comps[i].formula
}

// Index returns the 0-based index of the component with formula f (as in
// components.csv, e.g. "n-C4H10"), and whether GERG-2008 covers it.
func Index(f string) (int, bool) {
	tb, err := loadTables()
	if err != nil {
		return -1, false
	}
	for i := range tb.comps {
		if tb.comps[i].formula == f {
			return i, true
		}
	}
	return -1, false
}

// MolarMassOf returns the molar mass of component i in kg/mol (the value
// of the GERG-2008 tables).
func MolarMassOf(i int) float64 {
	tb, err := loadTables()
	if err != nil || i < 0 || i >= NumComponents {
		return 0
	}
	return tb.comps[i].m
}

// NewMixture prepares GERG-2008 for the mole fractions x (indexed as the
// tables, len(x) = NumComponents, each in [0, 1], summing to 1 within 1e-9;
// they are normalised).
func NewMixture(x []float64) (*Mixture, error) {
	tb, err := loadTables()
	if err != nil {
		return nil, err
	}
	if len(x) != NumComponents {
		return nil, &physics.DomainError{Name: "composition", Value: float64(len(x)), Want: "21 mole fractions",
			Reason: fmt.Sprintf("GERG-2008 takes %d mole fractions, got %d", NumComponents, len(x))}
	}
	sum := 0.0
	for i, v := range x {
		if !(v >= 0 && v <= 1) {
			return nil, &physics.DomainError{Name: "composition", Value: v, Want: "mole fractions in [0, 1]",
				Reason: fmt.Sprintf("the mole fraction of %s must lie in [0, 1]", tb.comps[i].formula)}
		}
		sum += v
	}
	if !(math.Abs(sum-1) <= 1e-9) {
		return nil, &physics.DomainError{Name: "composition", Value: sum, Want: "mole fractions summing to 1",
			Reason: fmt.Sprintf("the mole fractions sum to %g, not 1", sum)}
	}
	mx := &Mixture{}
	for i, v := range x {
		mx.x[i] = v / sum
	}
	mx.reducing(tb)
	mx.compile(tb)
	if len(mx.groups) > maxGroups || len(mx.tvals) > maxTVals || mx.dMax > maxD || mx.cMax > maxC {
		return nil, fmt.Errorf("gerg: work arrays too small (%d groups, %d exponents)", len(mx.groups), len(mx.tvals))
	}
	mx.prepareIdeal(tb)
	return mx, nil
}

// reducing evaluates the reducing functions T_r(x) and ρ_r(x) (Kunz &
// Wagner 2012, eqs. 7.9-7.10, as written in the reference pack README).
func (mx *Mixture) reducing(tb *tables) {
	var v, t float64
	x := &mx.x
	for i := range NumComponents {
		if x[i] == 0 {
			continue
		}
		c := &tb.comps[i]
		mx.m += x[i] * c.m
		v += x[i] * x[i] / c.rhoc
		t += x[i] * x[i] * c.tc
		if x[i] < 1 {
			mx.smix -= R * x[i] * math.Log(x[i])
		}
		for j := i + 1; j < NumComponents; j++ {
			if x[j] == 0 {
				continue
			}
			cj := &tb.comps[j]
			p := &tb.pairs[i][j]
			xi, xj := x[i], x[j]
			cv := math.Cbrt(1/c.rhoc) + math.Cbrt(1/cj.rhoc)
			v += 2 * xi * xj * p.betaV * p.gammaV * (xi + xj) / (p.betaV*p.betaV*xi + xj) * cv * cv * cv / 8
			t += 2 * xi * xj * p.betaT * p.gammaT * (xi + xj) / (p.betaT*p.betaT*xi + xj) * math.Sqrt(c.tc*cj.tc)
		}
	}
	mx.rhor, mx.tr = 1/v, t
}

// compile merges every residual term of the mixture into groups that share
// their δ function and a list of distinct τ exponents: α_r is then
//
//	Σ_g f_g(δ) Σ_{k∈g} w_k τ^{t_k},
//
// with w = x_i n for pure-fluid terms and x_i x_j F_ij n for departure
// terms (the terms of every pair sharing a departure model add up).
func (mx *Mixture) compile(tb *tables) {
	nG, nT := len(tb.groups), len(tb.tvals)
	acc := make([]float64, nG*nT)
	touched := make([]bool, nG*nT)
	add := func(gi, ti int32, w float64) {
		k := int(gi)*nT + int(ti)
		acc[k] += w
		touched[k] = true
	}
	x := &mx.x
	for i := range NumComponents {
		if x[i] == 0 {
			continue
		}
		for _, rt := range tb.comps[i].res {
			add(rt.gi, rt.ti, x[i]*rt.n)
		}
	}
	var weights [maxModel + 1]float64
	var used [maxModel + 1]bool
	for i := range NumComponents {
		for j := i + 1; j < NumComponents; j++ {
			p := &tb.pairs[i][j]
			if x[i] == 0 || x[j] == 0 || p.model < 0 || p.f == 0 {
				continue
			}
			weights[p.model] += x[i] * x[j] * p.f
			used[p.model] = true
		}
	}
	for m := range weights {
		if !used[m] {
			continue
		}
		for _, dt := range tb.dep[m] {
			add(dt.gi, dt.ti, weights[m]*dt.n)
		}
	}
	// compact: the groups and exponents this mixture uses, in table order
	localT := make([]int32, nT)
	for i := range localT {
		localT[i] = -1
	}
	for gi := range nG {
		lg := int32(-1)
		for ti := range nT {
			k := gi*nT + ti
			if !touched[k] {
				continue
			}
			if lg < 0 {
				lg = int32(len(mx.groups))
				g := tb.groups[gi]
				mx.groups = append(mx.groups, g)
				mx.dMax = max(mx.dMax, g.d)
				mx.cMax = max(mx.cMax, g.c)
			}
			if localT[ti] < 0 {
				localT[ti] = int32(len(mx.tvals))
				mx.tvals = append(mx.tvals, tb.tvals[ti])
			}
			mx.terms = append(mx.terms, term{g: lg, ti: localT[ti], w: acc[k]})
		}
	}
	for _, g := range mx.groups {
		mx.slope0 = append(mx.slope0, g.slope0())
		tab := [2]int8{-1, -1}
		if g.kind == 1 && g.eps == 0.5 && g.gamma == 0.5 {
			a, b := g.eta*8, g.beta*4
			if a == math.Trunc(a) && b == math.Trunc(b) && a >= 0 && a <= maxA && b >= 0 && b <= maxB {
				tab = [2]int8{int8(a), int8(b)}
			}
		}
		mx.expTab = append(mx.expTab, tab)
	}
	for _, t := range mx.tvals {
		k := math.Round(t * tDiv)
		if t >= 0 && math.Abs(k-t*tDiv) <= 1e-9 && k < tDiv*(maxTInt+1) {
			tp := tPow{i: int32(k) / tDiv, j: int32(k) % tDiv}
			mx.tpow = append(mx.tpow, tp)
			mx.tMaxI = max(mx.tMaxI, int(tp.i))
			continue
		}
		mx.tpow = append(mx.tpow, tPow{exp: true})
	}
}

// prepareIdeal keeps the ideal-gas part of the components present.
func (mx *Mixture) prepareIdeal(tb *tables) {
	for i := range NumComponents {
		if mx.x[i] == 0 {
			continue
		}
		id := tb.comps[i].ideal
		ic := idealComp{x: mx.x[i], a: id[2] - 1}
		for k := range 4 {
			ic.n[k], ic.th[k] = id[3+2*k], id[4+2*k]
		}
		_, h, s := ic.eval(RefTemperature)
		ic.hOff, ic.s = -h, -s
		mx.ideal = append(mx.ideal, ic)
	}
}

// eval returns the ideal-gas cp (J/(mol K)), h (J/mol) and s° (J/(mol K),
// at RefPressure) of one component without its offsets:
//
//	cp = R + R* [n3 − 1 + Σ n_k (u_k/sinh u_k)² (k = 4, 6) + Σ n_k (u_k/cosh u_k)² (k = 5, 7)],
//	h  = R T + R* [(n3 − 1) T + Σ n_k θ_k coth u_k − Σ n_k θ_k tanh u_k],
//	s° = R ln T + R* [(n3 − 1) ln T + Σ n_k (u_k coth u_k − ln sinh u_k) + Σ n_k (ln cosh u_k − u_k tanh u_k)],
//
// u_k = θ_k/T: cp from the pack README (Kunz & Wagner 2012, eq. 7.4 in T
// form), h and s° its integrals in T and in ln T.
func (ic *idealComp) eval(t float64) (cp, h, s float64) {
	lnT := math.Log(t)
	sc, sh, ss := ic.a, ic.a*t, ic.a*lnT
	for k := range 4 {
		th := ic.th[k]
		if th == 0 || ic.n[k] == 0 {
			continue
		}
		u := th / t
		n := ic.n[k]
		e1 := math.Exp(-u)
		e := e1 * e1
		if k%2 == 0 { // sinh terms
			coth := (1 + e) / (1 - e)
			lnSinh := u + math.Log((1-e)/2)
			q := u * 2 * e1 / (1 - e) // u/sinh u
			sc += n * q * q
			sh += n * th * coth
			ss += n * (u*coth - lnSinh)
		} else { // cosh terms
			tanh := (1 - e) / (1 + e)
			lnCosh := u + math.Log((1+e)/2)
			q := u * 2 * e1 / (1 + e) // u/cosh u
			sc += n * q * q
			sh -= n * th * tanh
			ss += n * (lnCosh - u*tanh)
		}
	}
	return R + RStar*sc, R*t + RStar*sh, R*lnT + RStar*ss
}

// idealMolar returns the ideal-gas mixture cp, h and s° (molar, at
// RefPressure, mixing entropy included) at t.
func (mx *Mixture) idealMolar(t float64) (cp, h, s float64) {
	for i := range mx.ideal {
		ic := &mx.ideal[i]
		c, hh, ss := ic.eval(t)
		cp += ic.x * c
		h += ic.x * (hh + ic.hOff)
		s += ic.x * (ss + ic.s)
	}
	return cp, h, s + mx.smix
}

// MolarMass returns the mixture molar mass in kg/mol.
func (mx *Mixture) MolarMass() float64 { return mx.m }

// Reducing returns the reducing temperature T_r (K) and density ρ_r
// (mol/m³) of the mixture.
func (mx *Mixture) Reducing() (tr, rhor float64) { return mx.tr, mx.rhor }

// MoleFractions returns the normalised mole fractions (a copy).
func (mx *Mixture) MoleFractions() [NumComponents]float64 { return mx.x }

// IdealCp returns the ideal-gas isobaric heat capacity of component i
// (0-based) at t in J/(mol K), the GERG-2008 correlation (Jaeschke & Schley
// 1995, as the pack README writes it); 0 for an unknown index.
func IdealCp(i int, t float64) float64 {
	tb, err := loadTables()
	if err != nil || i < 0 || i >= NumComponents {
		return 0
	}
	id := tb.comps[i].ideal
	ic := idealComp{x: 1, a: id[2] - 1}
	for k := range 4 {
		ic.n[k], ic.th[k] = id[3+2*k], id[4+2*k]
	}
	cp, _, _ := ic.eval(t)
	return cp
}
