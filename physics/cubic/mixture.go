package cubic

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// Kind selects the cubic equation of state.
type Kind int

// Equations of state.
const (
	// PengRobinson is the Peng-Robinson (1976) equation,
	//
	//	P = R T/(v − b) − a(T)/(v² + 2 b v − b²),
	//	a = 0.45724 R² Tc²/Pc · α(T),  b = 0.07780 R Tc/Pc,
	//	α = [1 + κ(1 − √(T/Tc))]²,  κ = 0.37464 + 1.54226 ω − 0.26992 ω²,
	//
	// Source: Peng & Robinson, Ind. Eng. Chem. Fundam. 15:59 (1976),
	// eqs. (4), (9)-(12), (17) (equation numbers from memory). For ω > 0.49 κ is the 1978 form
	// κ = 0.379642 + 1.48503 ω − 0.164423 ω² + 0.016666 ω³ of Robinson &
	// Peng, GPA Research Report RR-28 (1978).
	PengRobinson Kind = iota + 1
	// SoaveRedlichKwong is the Soave (1972) equation,
	//
	//	P = R T/(v − b) − a(T)/(v (v + b)),
	//	a = 0.42747 R² Tc²/Pc · α(T),  b = 0.08664 R Tc/Pc,
	//	α = [1 + m(1 − √(T/Tc))]²,  m = 0.480 + 1.574 ω − 0.176 ω²,
	//
	// Source: Soave, Chem. Eng. Sci. 27:1197 (1972), eqs. (1), (4), (5),
	// (13) (equation numbers from memory).
	SoaveRedlichKwong
)

// String returns "peng-robinson" or "srk".
func (k Kind) String() string {
	switch k {
	case PengRobinson:
		return "peng-robinson"
	case SoaveRedlichKwong:
		return "srk"
	}
	return fmt.Sprintf("cubic.Kind(%d)", int(k))
}

// Ωa, Ωb and the critical compressibility factor Zc of the two equations,
// as printed in the papers: Peng & Robinson (1976) eqs. (9), (10) and
// Zc = 0.307; Soave (1972) eqs. (4), (5) and Zc = 1/3 (SRK digits and all
// equation numbers from memory). (The exact roots of
// the critical conditions are 0.4572355289, 0.0777960739 for PR and
// 0.4274802335, 0.0866403500 for SRK; the printed values move the
// equation's critical point by less than 1e-4 relative and are what
// published PR/SRK numbers, including the reference pack, use.)
const (
	prOmegaA  = 0.45724
	prOmegaB  = 0.07780
	prZc      = 0.3074
	srkOmegaA = 0.42747
	srkOmegaB = 0.08664
	srkZc     = 1.0 / 3.0
)

// MaxOmega and MinOmega bound the acentric factor NewMixture accepts: the
// κ correlations were fitted for 0 ≤ ω ≤ 0.5 (PR 1976), up to ω ≈ 1.3
// (RR-28), and the quantum gases He (ω ≈ −0.39) and H2 (ω ≈ −0.22) are
// common compressor components.
const (
	MinOmega = -0.5
	MaxOmega = 2.0
)

// Mixture is a cubic equation of state for a fixed set of components with
// their critical constants and binary interaction parameters. It is
// immutable after NewMixture and safe for concurrent use.
type Mixture struct {
	kind   Kind
	n      int
	d1, d2 float64 // δ1, δ2 of the generic cubic
	omA    float64 // Ωa
	omB    float64 // Ωb
	zc     float64 // critical Z of the equation
	tc     []float64
	pc     []float64
	omega  []float64
	b      []float64 // bi = Ωb R Tci/Pci, m3/mol
	// √ai(T) = qa[i] + qb[i]·√T, with qa = √aci (1+κ), qb = −√aci κ/√Tci
	qa, qb []float64
	c      []float64 // 1 − kij, row-major n×n
	tMax   float64   // temperature at which some √αi reaches 0 (α turns up again)
}

// NewMixture returns the equation of state kind for components with
// critical temperatures tc (K), critical pressures pc (Pa), acentric factors
// omega and binary interaction parameters kij (n×n, symmetric, zero
// diagonal; nil means all zero). The slices are copied.
//
// Each component gets
//
//	ai(T) = Ωa R² Tci²/Pci · [1 + κi(1 − √(T/Tci))]²,  bi = Ωb R Tci/Pci
//
// with κi from Kind. Valid for 1 ≤ n, 0 < Tc, Pc finite,
// MinOmega ≤ ω ≤ MaxOmega, |kij| < 1.
func NewMixture(kind Kind, tc []physics.Kelvin, pc []physics.Pascal, omega []float64, kij [][]float64) (*Mixture, error) {
	m := &Mixture{kind: kind}
	switch kind {
	case PengRobinson:
		m.d1, m.d2 = 1+math.Sqrt2, 1-math.Sqrt2
		m.omA, m.omB, m.zc = prOmegaA, prOmegaB, prZc
	case SoaveRedlichKwong:
		m.d1, m.d2 = 1, 0
		m.omA, m.omB, m.zc = srkOmegaA, srkOmegaB, srkZc
	default:
		return nil, &physics.DomainError{Name: "kind", Value: float64(kind), Want: "PengRobinson or SoaveRedlichKwong",
			Reason: fmt.Sprintf("unknown cubic equation of state kind %d", int(kind))}
	}
	n := len(tc)
	if n == 0 {
		return nil, &physics.DomainError{Name: "tc", Value: 0, Want: "at least one component",
			Reason: "a mixture needs at least one component"}
	}
	if len(pc) != n || len(omega) != n {
		return nil, &physics.DomainError{Name: "pc", Value: float64(len(pc)), Want: fmt.Sprintf("%d values", n),
			Reason: fmt.Sprintf("tc, pc and omega must have the same length (got %d, %d, %d)", n, len(pc), len(omega))}
	}
	if kij != nil && len(kij) != n {
		return nil, &physics.DomainError{Name: "kij", Value: float64(len(kij)), Want: fmt.Sprintf("%d rows", n),
			Reason: fmt.Sprintf("the interaction matrix kij must be %d×%d (got %d rows)", n, n, len(kij))}
	}
	m.n = n
	m.tc = make([]float64, n)
	m.pc = make([]float64, n)
	m.omega = make([]float64, n)
	m.b = make([]float64, n)
	m.qa = make([]float64, n)
	m.qb = make([]float64, n)
	m.c = make([]float64, n*n)
	m.tMax = math.Inf(1)
	const r = physics.UniversalGasConstant
	for i := range n {
		t, p, w := float64(tc[i]), float64(pc[i]), omega[i]
		switch {
		case !(t > 0) || math.IsInf(t, 0):
			return nil, &physics.DomainError{Name: fmt.Sprintf("tc[%d]", i), Value: t, Want: "finite, > 0 K",
				Reason: fmt.Sprintf("critical temperature of component %d must be a finite temperature above 0 K", i)}
		case !(p > 0) || math.IsInf(p, 0):
			return nil, &physics.DomainError{Name: fmt.Sprintf("pc[%d]", i), Value: p, Want: "finite, > 0 Pa",
				Reason: fmt.Sprintf("critical pressure of component %d must be a finite pressure above 0 Pa", i)}
		case !(w >= MinOmega && w <= MaxOmega):
			return nil, &physics.DomainError{Name: fmt.Sprintf("omega[%d]", i), Value: w,
				Want:   fmt.Sprintf("%g <= omega <= %g", MinOmega, MaxOmega),
				Reason: fmt.Sprintf("acentric factor of component %d must lie between %g and %g", i, MinOmega, MaxOmega)}
		}
		k := m.kappa(w)
		ac := m.omA * r * r * t * t / p
		m.tc[i], m.pc[i], m.omega[i] = t, p, w
		m.b[i] = m.omB * r * t / p
		sq := math.Sqrt(ac)
		m.qa[i] = sq * (1 + k)
		m.qb[i] = -sq * k / math.Sqrt(t)
		if k > 0 {
			m.tMax = math.Min(m.tMax, t*(1+1/k)*(1+1/k))
		}
		if !physics.Finite(m.b[i], m.qa[i], m.qb[i]) || !(m.b[i] > 0) {
			return nil, &physics.DomainError{Name: fmt.Sprintf("pc[%d]", i), Value: p, Want: "Tc/Pc giving finite a and b",
				Reason: fmt.Sprintf("critical constants of component %d give no finite equation-of-state parameters", i)}
		}
	}
	for i := range n {
		if kij != nil && len(kij[i]) != n {
			return nil, &physics.DomainError{Name: fmt.Sprintf("kij[%d]", i), Value: float64(len(kij[i])), Want: fmt.Sprintf("%d columns", n),
				Reason: fmt.Sprintf("row %d of the interaction matrix kij must have %d entries (got %d)", i, n, len(kij[i]))}
		}
		for j := range n {
			k := 0.0
			if kij != nil {
				k = kij[i][j]
				switch {
				case !(k > -1 && k < 1):
					return nil, &physics.DomainError{Name: fmt.Sprintf("kij[%d][%d]", i, j), Value: k, Want: "-1 < kij < 1",
						Reason: fmt.Sprintf("interaction parameter kij[%d][%d] must be a finite number between -1 and 1", i, j)}
				case i == j && k != 0:
					return nil, &physics.DomainError{Name: fmt.Sprintf("kij[%d][%d]", i, j), Value: k, Want: "0 on the diagonal",
						Reason: fmt.Sprintf("interaction parameter kij[%d][%d] of a component with itself must be 0", i, j)}
				case !(math.Abs(k-kij[j][i]) <= 1e-12):
					return nil, &physics.DomainError{Name: fmt.Sprintf("kij[%d][%d]", i, j), Value: k, Want: fmt.Sprintf("equal to kij[%d][%d]", j, i),
						Reason: fmt.Sprintf("interaction matrix must be symmetric: kij[%d][%d] = %g but kij[%d][%d] = %g", i, j, k, j, i, kij[j][i])}
				}
			}
			m.c[i*n+j] = 1 - k
		}
	}
	return m, nil
}

// kappa returns the α-function slope κ (PR) or m (SRK) for acentric factor w.
func (m *Mixture) kappa(w float64) float64 {
	if m.kind == SoaveRedlichKwong {
		return 0.480 + w*(1.574-0.176*w)
	}
	if w > 0.49 {
		return 0.379642 + w*(1.48503+w*(-0.164423+0.016666*w))
	}
	return 0.37464 + w*(1.54226-0.26992*w)
}

// Kind returns the equation of state.
func (m *Mixture) Kind() Kind { return m.kind }

// Len returns the number of components.
func (m *Mixture) Len() int { return m.n }

// MaxTemperature returns the highest temperature Residual accepts: the
// lowest Tci (1 + 1/κi)² over the components, where √αi reaches zero and
// the Soave α function would rise again with temperature (a non-physical
// branch). It is above 2000 K for the usual gas components; +Inf when no
// component has κ > 0.
func (m *Mixture) MaxTemperature() physics.Kelvin { return physics.Kelvin(m.tMax) }

// checkTP validates temperature and pressure.
func (m *Mixture) checkTP(t, p float64) error {
	switch {
	case !(t > 0) || math.IsInf(t, 0):
		return &physics.DomainError{Name: "temperature", Value: t, Want: "finite, > 0 K",
			Reason: "temperature must be a finite absolute temperature above 0 K"}
	case !(t < m.tMax):
		return &physics.DomainError{Name: "temperature", Value: t, Want: fmt.Sprintf("< %.6g K", m.tMax),
			Reason: fmt.Sprintf("temperature %g K lies above %.6g K, where the %s alpha function of a component stops being valid", t, m.tMax, m.kind)}
	case !(p > 0) || math.IsInf(p, 0):
		return &physics.DomainError{Name: "pressure", Value: p, Want: "finite, > 0 Pa",
			Reason: "pressure must be a finite absolute pressure above 0 Pa"}
	}
	return nil
}

// checkX validates a composition: n mole fractions, each finite and ≥ 0,
// summing to 1 within 1e-9.
func (m *Mixture) checkX(x []float64) error {
	if len(x) != m.n {
		return &physics.DomainError{Name: "x", Value: float64(len(x)), Want: fmt.Sprintf("%d mole fractions", m.n),
			Reason: fmt.Sprintf("the composition must give %d mole fractions, one per component (got %d)", m.n, len(x))}
	}
	sum := 0.0
	for i, xi := range x {
		if !(xi >= 0 && xi <= 1) {
			return &physics.DomainError{Name: fmt.Sprintf("x[%d]", i), Value: xi, Want: "0 <= x <= 1",
				Reason: fmt.Sprintf("mole fraction x[%d] = %g must be a number between 0 and 1", i, xi)}
		}
		sum += xi
	}
	if !(math.Abs(sum-1) <= 1e-9) {
		return &physics.DomainError{Name: "x", Value: sum, Want: "sum of mole fractions = 1 within 1e-9",
			Reason: fmt.Sprintf("mole fractions must sum to 1 (they sum to %.12g)", sum)}
	}
	return nil
}
