package gerg

import (
	"errors"
	"math"
	"strconv"

	"stagewright/physics"
)

// Branch says which density root a state is.
type Branch uint8

// Density branches.
const (
	// Vapour: the root on the branch that starts at zero density (gas,
	// and every state above the critical temperature).
	Vapour Branch = iota
	// LiquidOnly: no vapour-like root reaches the pressure; the state is
	// the liquid-like root.
	LiquidOnly
)

// Props are the properties of a state, molar (per mol) unless said.
type Props struct {
	T, P    float64 // K, Pa
	Rho     float64 // mol/m³
	Z       float64
	H, S    float64 // J/mol, J/(mol K): see RefTemperature
	Cp, Cv  float64 // J/(mol K)
	W       float64 // speed of sound, m/s
	Kappa   float64 // isentropic exponent −(v/p)(∂p/∂v)_s
	JT      float64 // Joule-Thomson coefficient (∂T/∂p)_h, K/Pa
	DPDRho  float64 // (∂p/∂ρ)_T, Pa m³/mol
	DPDT    float64 // (∂p/∂T)_ρ, Pa/K
	GibbsRT float64 // g/(R T) up to a function of T alone (to compare roots)
	Branch  Branch
}

// ErrNoRoot is matched by the error of a state whose density root cannot be
// found (a *physics.DomainError that also unwraps to it).
var ErrNoRoot = errors.New("gerg: no density root")

// Range checks T and p against the range of validity (MinTemperature to
// MaxTemperature, 0 < p ≤ MaxPressure) and returns a DomainError naming the
// quantity outside it.
func Range(t, p float64) error {
	if !(t >= MinTemperature && t <= MaxTemperature) {
		return &physics.DomainError{Name: "temperature", Value: t, Want: "60 K to 700 K",
			Reason: "temperature " + fmtG(t) + " K is outside the range of validity of GERG-2008 (60 K to 700 K)"}
	}
	if !(p > 0 && p <= MaxPressure) {
		return &physics.DomainError{Name: "pressure", Value: p, Want: "0 < p <= 70 MPa",
			Reason: "pressure " + fmtG(p) + " Pa is outside the range of validity of GERG-2008 (up to 70 MPa)"}
	}
	return nil
}

// PropsTRho returns the properties at temperature t (K) and molar density
// rho (mol/m³). It does not check the range.
func (mx *Mixture) PropsTRho(t, rho float64) Props {
	var w tauWork
	mx.setTau(mx.tr/t, &w)
	delta := rho / mx.rhor
	return mx.props(t, delta, mx.residual(delta, &w))
}

// props turns α_r and its derivatives into properties (Kunz & Wagner 2012,
// Table 3; e.g. Span, Multiparameter Equations of State, 2000, Table 3.3):
//
//	p = ρRT(1 + δα_δ),  h = h°(T) + RT(τα_τ + δα_δ),
//	s = s°(T) − R ln(p/p₀) + R ln Z + R(τα_τ − α),  cv = cv°(T) − R τ²α_ττ,
//	(∂p/∂ρ)_T = RT(1 + 2δα_δ + δ²α_δδ),  (∂p/∂T)_ρ = ρR(1 + δα_δ − δτα_δτ),
//	cp = cv + T (∂p/∂T)²/(ρ² (∂p/∂ρ)),  w² = (cp/cv)(∂p/∂ρ)/M,
//	κ = (ρ/p)(cp/cv)(∂p/∂ρ),  μ_JT = (T(∂p/∂T)/(ρ²(∂p/∂ρ)) − 1/ρ)/cp.
func (mx *Mixture) props(t, delta float64, r Residual) Props {
	rho := delta * mx.rhor
	z := 1 + r.D
	p := rho * R * t * z
	cp0, h0, s0 := mx.idealMolar(t)
	cv := cp0 - R - R*r.TT
	dpdr := R * t * (1 + 2*r.D + r.DD)
	dpdt := rho * R * (1 + r.D - r.DT)
	cp := cv + t*dpdt*dpdt/(rho*rho*dpdr)
	pr := Props{T: t, P: p, Rho: rho, Z: z, Cp: cp, Cv: cv, DPDRho: dpdr, DPDT: dpdt}
	pr.H = h0 + R*t*(r.T+r.D)
	pr.S = s0 - R*math.Log(p/RefPressure) + R*math.Log(z) + R*(r.T-r.A)
	pr.W = math.Sqrt(cp / cv * dpdr / mx.m)
	pr.Kappa = rho / p * cp / cv * dpdr
	pr.JT = (t*dpdt/(rho*rho*dpdr) - 1/rho) / cp
	pr.GibbsRT = r.A + r.D + math.Log(delta)
	return pr
}

// StateTP returns the properties at temperature t (K) and pressure p (Pa):
// the vapour-like density root where one exists (Branch Vapour), otherwise
// the liquid-like root (Branch LiquidOnly). It checks Range.
func (mx *Mixture) StateTP(t, p float64) (Props, error) {
	if err := Range(t, p); err != nil {
		return Props{}, err
	}
	var w tauWork
	mx.setTau(mx.tr/t, &w)
	delta, br, r, err := mx.density(t, p, &w, false)
	if err != nil {
		return Props{}, err
	}
	pr := mx.props(t, delta, r)
	pr.Branch = br
	if !pr.physical() {
		return Props{}, noRoot{&physics.DomainError{Name: "pressure", Value: p, Want: "a state with physical properties",
			Reason: "GERG-2008 gives no physical state at this temperature and pressure (negative heat capacity or compressibility: far outside the range of the equation for this mixture)"}}
	}
	return pr, nil
}

// physical says whether a state is thermodynamically stable and finite:
// cv > 0, (∂p/∂ρ)_T > 0, hence cp > cv and a real speed of sound.
func (pr *Props) physical() bool {
	for _, v := range []float64{pr.Rho, pr.Z, pr.H, pr.S, pr.Cp, pr.Cv, pr.W, pr.Kappa, pr.JT} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return pr.Cv > 0 && pr.Cp > 0 && pr.DPDRho > 0 && pr.Kappa > 0 && pr.Rho > 0
}

// LiquidTP returns the liquid-like root at (t, p) when the pressure lies
// above the liquid branch's lowest pressure (as StateTP otherwise returns
// for a LiquidOnly state), and false when there is none distinct from the
// vapour root. For the comparison of Gibbs energies of a pure fluid.
func (mx *Mixture) LiquidTP(t, p float64) (Props, bool) {
	if Range(t, p) != nil {
		return Props{}, false
	}
	var w tauWork
	mx.setTau(mx.tr/t, &w)
	delta, _, r, err := mx.density(t, p, &w, true)
	if err != nil {
		return Props{}, false
	}
	pr := mx.props(t, delta, r)
	pr.Branch = LiquidOnly
	return pr, pr.physical()
}

func fmtG(v float64) string {
	return strconv.FormatFloat(v, 'g', 6, 64)
}
