package gerg_test

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gerg"
)

const ng5 = "CH4:0.9 C2H6:0.05 C3H8:0.02 N2:0.02 CO2:0.01" // the natural gas of checks.csv

const all21 = "CH4:0.77824 N2:0.02 CO2:0.06 C2H6:0.08 C3H8:0.03 i-C4H10:0.0015 n-C4H10:0.003 " +
	"i-C5H12:0.0005 n-C5H12:0.00165 n-C6H14:0.00215 n-C7H16:0.00088 n-C8H18:0.00024 n-C9H20:0.00015 " +
	"n-C10H22:0.00009 H2:0.004 O2:0.005 CO:0.002 H2O:0.0001 H2S:0.0025 He:0.007 Ar:0.001"

// TestDerivativesAgainstFiniteDifferences checks the analytic derivatives
// of α_r against central differences (step 1e-4 relative; second
// derivatives to 1e-6 of the scale of the terms), for mixtures that use
// every kind of term: polynomial, exp(−δ^c), and the departure
// exponentials (CH4-N2 model 3, CH4-CO2 4, N2-CO2 5, N2-C2H6 6, CH4-H2 7,
// the generalised model 10).
func TestDerivativesAgainstFiniteDifferences(t *testing.T) {
	mixes := map[string]string{"ng5": ng5, "all21": all21, "co2": "CO2:1", "h2ch4": "H2:0.3 CH4:0.7", "water": "H2O:1"}
	points := [][2]float64{{0.05, 1.3}, {0.8, 1.1}, {1.7, 0.9}, {2.6, 1.6}}
	for name, spec := range mixes {
		m := mixtureOf(t, spec)
		for _, pt := range points {
			d, tau := pt[0], pt[1]
			r := m.ResidualAt(d, tau)
			a := func(dd, tt float64) float64 { return m.ResidualAt(dd, tt).A }
			ad := func(dd, tt float64) float64 { return m.ResidualAt(dd, tt).D }
			scale := 1 + math.Abs(r.A) + math.Abs(r.D) + math.Abs(r.DD) + math.Abs(r.TT)
			// derivatives in a factor k on δ or τ at k = 1 (d/dk = δ ∂/∂δ,
			// d²/dk² = δ² ∂²/∂δ²) by central differences with one
			// Richardson step (error O(h⁴)).
			d1 := func(f func(float64) float64) float64 {
				c := func(h float64) float64 { return (f(1+h) - f(1-h)) / (2 * h) }
				return (4*c(5e-4) - c(1e-3)) / 3
			}
			d2 := func(f func(float64) float64) float64 {
				c := func(h float64) float64 { return (f(1+h) - 2*f(1) + f(1-h)) / (h * h) }
				return (4*c(5e-4) - c(1e-3)) / 3
			}
			inD := func(g func(float64, float64) float64) func(float64) float64 {
				return func(k float64) float64 { return g(d*k, tau) }
			}
			inT := func(g func(float64, float64) float64) func(float64) float64 {
				return func(k float64) float64 { return g(d, tau*k) }
			}
			assert.InDelta(t, r.D, d1(inD(a)), 1e-8*scale, "%s δα_δ at %v", name, pt)
			assert.InDelta(t, r.DD, d2(inD(a)), 1e-6*scale, "%s δ²α_δδ at %v", name, pt)
			assert.InDelta(t, r.T, d1(inT(a)), 1e-8*scale, "%s τα_τ at %v", name, pt)
			assert.InDelta(t, r.TT, d2(inT(a)), 1e-6*scale, "%s τ²α_ττ at %v", name, pt)
			assert.InDelta(t, r.DT, d1(inT(ad)), 1e-8*scale, "%s δτα_δτ at %v", name, pt)
		}
	}
}

// TestPropertiesConsistent checks the properties against numerical
// derivatives of the state at (T, p) (thermodynamic identities, e.g.
// Span 2000, Table 3.3): cp = (∂h/∂T)_p, cp/T = (∂s/∂T)_p,
// μ_JT = −(∂h/∂p)_T / cp, and κ = −(v/p)(∂p/∂v)_s from an isentropic
// pair of states.
func TestPropertiesConsistent(t *testing.T) {
	for _, c := range []struct {
		spec string
		t, p float64
	}{{ng5, 300, 5e6}, {"CO2:1", 330, 8e6}, {all21, 400, 20e6}, {"H2:0.2 CH4:0.8", 280, 10e6}} {
		m := mixtureOf(t, c.spec)
		st, err := m.StateTP(c.t, c.p)
		require.NoError(t, err)
		at := func(tt, pp float64) gerg.Props {
			s, err := m.StateTP(tt, pp)
			require.NoError(t, err)
			return s
		}
		// central differences with one Richardson step (error O(dt⁴))
		rich := func(f func(gerg.Props) float64, dt float64) float64 {
			c1 := (f(at(c.t+dt, c.p)) - f(at(c.t-dt, c.p))) / (2 * dt)
			c2 := (f(at(c.t+dt/2, c.p)) - f(at(c.t-dt/2, c.p))) / dt
			return (4*c2 - c1) / 3
		}
		dt := 1e-3 * c.t
		assert.InDelta(t, st.Cp, rich(func(s gerg.Props) float64 { return s.H }, dt), 1e-6*st.Cp, "cp %s", c.spec)
		assert.InDelta(t, st.Cp/c.t, rich(func(s gerg.Props) float64 { return s.S }, dt), 1e-6*st.Cp/c.t, "cp/T %s", c.spec)
		dp := 1e-4 * c.p
		ph, pl := at(c.t, c.p+dp), at(c.t, c.p-dp)
		assert.InDelta(t, st.JT, -(ph.H-pl.H)/(2*dp)/st.Cp, 1e-5*math.Abs(st.JT)+1e-12, "JT %s", c.spec)
		// isentropic neighbour at p+dp: T from s by Newton on cp/T
		tt := c.t
		for range 20 {
			s := at(tt, c.p+dp)
			tt -= (s.S - st.S) / (s.Cp / tt)
		}
		up := at(tt, c.p+dp)
		kappa := (math.Log(c.p+dp) - math.Log(c.p)) / (math.Log(up.Rho) - math.Log(st.Rho))
		assert.InDelta(t, st.Kappa, kappa, 2e-4*st.Kappa, "kappa %s", c.spec)
		assert.InDelta(t, c.p, st.Rho*gerg.R*c.t*st.Z, 1e-9*c.p, "p = ρRTZ %s", c.spec)
	}
}

// TestIdealGasLimit: as p → 0, Z → 1, cp → the ideal-gas cp of the
// equation and κ → cp/cv = cp/(cp − R) (any text on ideal gases); the
// ideal-gas cp of methane at 300 K is 2230.12 J/(kg K) (pack README, the
// row ideal-ch4-300 of checks.csv).
func TestIdealGasLimit(t *testing.T) {
	for _, spec := range []string{"CH4:1", ng5, all21, "He:1"} {
		m := mixtureOf(t, spec)
		st, err := m.StateTP(300, 1e-3)
		require.NoError(t, err)
		assert.InDelta(t, 1, st.Z, 1e-10, spec)
		assert.InDelta(t, st.Cp/(st.Cp-gerg.R), st.Kappa, 1e-9, spec)
		assert.InDelta(t, st.Cp-st.Cv, gerg.R, 1e-8, spec)
		// h is independent of p in the limit, s follows −R ln p
		st2, err := m.StateTP(300, 2e-3)
		require.NoError(t, err)
		assert.InDelta(t, st.H, st2.H, 1e-5, spec) // residual h ≈ (B − T dB/dT) p ~ 1e-7 J/mol here
		assert.InDelta(t, -gerg.R*math.Log(2), st2.S-st.S, 1e-9, spec)
		if spec == "CH4:1" {
			assert.InDelta(t, 2230.12, st.Cp/m.MolarMass(), 0.005, "pack README cp check")
		}
	}
	// reference state: h = 0 and s = 0 for a pure ideal gas at 298.15 K and
	// 101325 Pa (the catalogue's convention, physics/gas doc).
	m := mixtureOf(t, "N2:1")
	st, err := m.StateTP(gerg.RefTemperature, 1e-2)
	require.NoError(t, err)
	assert.InDelta(t, 0, st.H, 1e-6)
	assert.InDelta(t, 0, st.S+gerg.R*math.Log(1e-2/gerg.RefPressure), 1e-8)
}

// TestRange: outside 60-700 K or above 70 MPa (Kunz & Wagner 2012,
// extended range) every state is a DomainError naming the quantity.
func TestRange(t *testing.T) {
	m := mixtureOf(t, ng5)
	for _, c := range []struct {
		t, p float64
		name string
	}{{59.9, 1e5, "temperature"}, {700.1, 1e5, "temperature"}, {math.NaN(), 1e5, "temperature"},
		{300, 70.1e6, "pressure"}, {300, 0, "pressure"}, {300, math.NaN(), "pressure"}, {300, math.Inf(1), "pressure"}} {
		_, err := m.StateTP(c.t, c.p)
		var de *physics.DomainError
		require.True(t, errors.As(err, &de), "%v", c)
		assert.Equal(t, c.name, de.Name)
	}
	_, err := m.StateTP(700, 70e6)
	assert.NoError(t, err)
	_, err = m.StateTP(60, 1e3)
	assert.NoError(t, err)
}

// TestCompositionErrors: 21 fractions in [0, 1] summing to 1.
func TestCompositionErrors(t *testing.T) {
	for _, x := range [][]float64{make([]float64, 3), make([]float64, 21)} {
		_, err := gerg.NewMixture(x)
		assert.ErrorIs(t, err, physics.ErrDomain)
	}
	x := make([]float64, 21)
	x[0], x[1] = 1.5, -0.5
	_, err := gerg.NewMixture(x)
	assert.ErrorIs(t, err, physics.ErrDomain)
	x[0], x[1] = math.NaN(), 1
	_, err = gerg.NewMixture(x)
	assert.ErrorIs(t, err, physics.ErrDomain)
}

// TestLiquidAndSaturation: pure CO2 at 280 K. Its vapour pressure there is
// 4.161 MPa (Span & Wagner 1996, J. Phys. Chem. Ref. Data 25:1509, Table
// 34, from memory; GERG-2008's CO2 equation agrees within 0.1 %, Kunz &
// Wagner 2012). The equal-Gibbs-energy pressure of the vapour and liquid
// roots must land there within 0.3 %; above it at 10 MPa the vapour branch
// has ended and the root is liquid-like (about 900 kg/m³, from memory);
// at 3 MPa the state is a vapour with no lower-Gibbs liquid root.
func TestLiquidAndSaturation(t *testing.T) {
	m := mixtureOf(t, "CO2:1")
	liq, err := m.StateTP(280, 10e6)
	require.NoError(t, err)
	assert.Equal(t, gerg.LiquidOnly, liq.Branch)
	assert.InDelta(t, 900, liq.Rho*m.MolarMass(), 60)
	assert.Greater(t, liq.DPDRho, 0.0)
	assert.InDelta(t, 10e6, liq.P, 1e-3)

	vap, err := m.StateTP(280, 3e6)
	require.NoError(t, err)
	assert.Equal(t, gerg.Vapour, vap.Branch)
	l3, ok := m.LiquidTP(280, 3e6)
	require.True(t, ok)
	assert.Greater(t, l3.GibbsRT, vap.GibbsRT)
	assert.Greater(t, l3.Rho, 5*vap.Rho)

	dg := func(p float64) float64 {
		v, err := m.StateTP(280, p)
		require.NoError(t, err)
		l, ok := m.LiquidTP(280, p)
		require.True(t, ok, p)
		return l.GibbsRT - v.GibbsRT
	}
	lo, hi := 3.5e6, 4.5e6
	require.Greater(t, dg(lo), 0.0)
	require.Less(t, dg(hi), 0.0)
	for range 50 {
		mid := 0.5 * (lo + hi)
		if dg(mid) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	assert.InDelta(t, 4.161e6, lo, 0.003*4.161e6)
}

// TestDenseAndSupercritical: roots across the range agree with p(ρ) and
// lie on a branch with (∂p/∂ρ)_T > 0.
func TestDenseAndSupercritical(t *testing.T) {
	for _, spec := range []string{ng5, all21, "CO2:1", "H2:1", "N2:1", "H2O:1", "CH4:0.5 C3H8:0.5"} {
		m := mixtureOf(t, spec)
		for _, tt := range []float64{60, 100, 200, 304, 310, 400, 550, 700} {
			for _, p := range []float64{1e3, 1e5, 1e6, 5e6, 7.4e6, 2e7, 7e7} {
				st, err := m.StateTP(tt, p)
				if err != nil {
					assert.ErrorIs(t, err, gerg.ErrNoRoot, "%s %v %v", spec, tt, p)
					continue
				}
				assert.InDelta(t, p, st.P, 1e-9*p, "%s %v %v", spec, tt, p)
				assert.Greater(t, st.DPDRho, 0.0, "%s %v %v", spec, tt, p)
				for _, v := range []float64{st.H, st.S, st.Cp, st.Cv, st.W, st.Kappa, st.JT} {
					assert.False(t, math.IsNaN(v) || math.IsInf(v, 0), "%s %v %v", spec, tt, p)
				}
			}
		}
	}
}

// TestWorkArraysHoldEveryComponent: the stack work arrays hold the full
// 21-component mixture.
func TestWorkArraysHoldEveryComponent(t *testing.T) {
	m := mixtureOf(t, all21)
	_, err := m.StateTP(300, 1e6)
	require.NoError(t, err)
}

// TestNoLoopRoots: inside the two-phase region the equation's p(ρ) has
// loops with (∂p/∂ρ)_T > 0 away from both branches. CO2 at 220 K (above its
// triple point, 216.59 K, and far below Tc; vapour pressure about 0.6 MPa,
// Span & Wagner 1996, from memory) at 8 to 60 MPa is a compressed liquid of
// about 1180-1250 kg/m³ (from memory): the root must be that liquid, never
// a loop root near 470 kg/m³.
func TestNoLoopRoots(t *testing.T) {
	m := mixtureOf(t, "CO2:1")
	for _, p := range []float64{8e6, 20e6, 26e6, 40e6, 60e6} {
		st, err := m.StateTP(220, p)
		require.NoError(t, err)
		assert.Equal(t, gerg.LiquidOnly, st.Branch, "%g", p)
		assert.InDelta(t, 1215, st.Rho*m.MolarMass(), 60, "%g", p)
	}
}
