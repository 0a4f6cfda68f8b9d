package cubic_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// TestStabilityCO2 at 280 K: Span & Wagner 1996 (JPCRD 25:1509) put the
// vapour pressure at 4.1607 MPa, so 0.5 MPa is a stable gas, 5 MPa a
// compressed liquid (the vapour root of the cubic is then metastable, not
// stable) and 6 MPa beyond the vapour spinodal of PR, where the liquid is
// the only root.
func TestStabilityCO2(t *testing.T) {
	for _, kind := range []cubic.Kind{cubic.PengRobinson, cubic.SoaveRedlichKwong} {
		m := newMixture(t, kind, nil, carbonDioxide)
		x := []float64{1}
		ok, err := m.Stable(x, 280, 0.5e6)
		require.NoError(t, err)
		assert.True(t, ok, "%v: CO2 gas at 280 K, 0.5 MPa", kind)

		ok, err = m.Stable(x, 280, 5e6)
		require.NoError(t, err)
		assert.False(t, ok, "%v: CO2 at 280 K, 5 MPa is liquid: the vapour root is not stable", kind)
		r, err := m.Residual(x, 280, 5e6)
		require.NoError(t, err)
		assert.Equal(t, cubic.RootVapourOfThree, r.Root)

		r, err = m.Residual(x, 280, 6e6)
		require.NoError(t, err)
		assert.Equal(t, cubic.RootOnlyLiquidLike, r.Root, "%v: CO2 at 280 K, 6 MPa: only a liquid root", kind)
		// a liquid with v/b well below the critical 3.95 (liquid density of
		// CO2 at 280 K and 6 MPa ~ 900 kg/m3, Span & Wagner 1996, from memory)
		assert.InEpsilon(t, 900, carbonDioxide.mm/r.MolarVolume, 0.15)
	}
}

// TestRootKinds: a supercritical dense propane state (C3-YE-400 in
// real-gas-checks.csv: 244.8 kg/m3, above the critical density 220 kg/m3 of
// Lemmon et al. 2009 = 5.0 mol/L × 44.1 g/mol) is reported liquid-like by
// the density criterion; CO2 at 280 K just below its vapour pressure
// (4.0 MPa < 4.1607 MPa, Span & Wagner 1996) has three roots.
func TestRootKinds(t *testing.T) {
	c3 := newMixture(t, cubic.PengRobinson, nil, propane)
	r, err := c3.Residual([]float64{1}, 400, 7e6)
	require.NoError(t, err)
	assert.Equal(t, cubic.RootOnlyLiquidLike, r.Root)
	r, err = c3.Residual([]float64{1}, 400, 1e6)
	require.NoError(t, err)
	assert.Equal(t, cubic.RootOnlyGasLike, r.Root)
	co2 := newMixture(t, cubic.PengRobinson, nil, carbonDioxide)
	r, err = co2.Residual([]float64{1}, 280, 4e6)
	require.NoError(t, err)
	assert.Equal(t, cubic.RootVapourOfThree, r.Root)
	assert.Equal(t, "vapour-of-three", r.Root.String())
	assert.Equal(t, "only-liquid-like", cubic.RootOnlyLiquidLike.String())
	assert.Equal(t, "only-gas-like", cubic.RootOnlyGasLike.String())
	assert.Equal(t, "peng-robinson", cubic.PengRobinson.String())
	assert.Equal(t, "srk", cubic.SoaveRedlichKwong.String())
}

// TestStabilityMixtures: a pipeline-quality natural gas at compressor
// suction and discharge conditions is single-phase (common practice:
// hydrocarbon dew points of such gases lie well below 0 °C); a rich gas
// with 20 % C3-C4 at 280 K and 3 MPa condenses (its dew point lies far above
// that temperature: Raoult's law with the Wilson K-values already gives
// Σ yi/Ki > 1 there). The instability found by Stable must coincide with
// the dew temperature found by DewTemperature within 0.1 K.
func TestStabilityMixtures(t *testing.T) {
	ng, x := naturalGas(t, cubic.PengRobinson)
	for _, st := range []struct{ t, p float64 }{{288.15, 3e6}, {300, 6e6}, {420, 15e6}, {250, 0.1e6}} {
		ok, err := ng.Stable(x, physics.Kelvin(st.t), physics.Pascal(st.p))
		require.NoError(t, err)
		assert.True(t, ok, "natural gas at %g K %g Pa", st.t, st.p)
	}
	rich := newMixture(t, cubic.PengRobinson, nil, methane, ethane, propane, nButane, isoButane)
	xr := []float64{0.7, 0.1, 0.1, 0.05, 0.05}
	ok, err := rich.Stable(xr, 280, 3e6)
	require.NoError(t, err)
	assert.False(t, ok, "rich gas at 280 K, 3 MPa is two-phase")

	for _, tc := range []struct {
		name string
		m    *cubic.Mixture
		x    []float64
		p    float64
	}{
		{"natural gas 1 MPa", ng, x, 1e6},
		{"natural gas 5 MPa", ng, x, 5e6},
		{"rich gas 0.1 MPa", rich, xr, 0.1e6},
		{"rich gas 3 MPa", rich, xr, 3e6},
		{"rich gas 10 MPa (retrograde side)", rich, xr, 10e6},
	} {
		t.Run(tc.name, func(t *testing.T) {
			td, err := tc.m.DewTemperature(tc.x, physics.Pascal(tc.p))
			require.NoError(t, err)
			above, err := tc.m.Stable(tc.x, td+0.1, physics.Pascal(tc.p))
			require.NoError(t, err)
			assert.True(t, above, "stable 0.1 K above the dew point %g K", float64(td))
			below, err := tc.m.Stable(tc.x, td-0.1, physics.Pascal(tc.p))
			require.NoError(t, err)
			assert.False(t, below, "unstable 0.1 K below the dew point %g K", float64(td))
		})
	}
	// Above the cricondenbar there is no dew point.
	_, err = ng.DewTemperature(x, 20e6)
	require.ErrorIs(t, err, physics.ErrDomain)
}

// TestDewTemperatureBinary checks the dew point of a methane-propane vapour
// with 10 % propane at 0.1 MPa against Raoult's law, which holds at low
// pressure (J. M. Smith, H. C. Van Ness and M. M. Abbott, Introduction to
// Chemical Engineering Thermodynamics, 7th ed. (2005), §10.4, from memory):
// the incipient liquid is nearly pure propane, so the dew temperature is
// the propane saturation temperature at its partial pressure 0.01 MPa,
// found here with VapourPressure (an independent algorithm). The methane
// dissolved in the liquid (about 1 %, common practice for light gases near
// 0.1 MPa) and the vapour non-ideality shift it by a few tenths of a
// kelvin: tolerance 1 K.
func TestDewTemperatureBinary(t *testing.T) {
	m := newMixture(t, cubic.PengRobinson, nil, methane, propane)
	x := []float64{0.9, 0.1}
	td, err := m.DewTemperature(x, 0.1e6)
	require.NoError(t, err)
	lo, hi := 150.0, 250.0
	for range 60 {
		mid := 0.5 * (lo + hi)
		ps, err := m.VapourPressure(1, physics.Kelvin(mid))
		require.NoError(t, err)
		if ps < 0.01e6 {
			lo = mid
		} else {
			hi = mid
		}
	}
	t.Logf("dew %.3f K, propane Tsat(10 kPa) %.3f K", float64(td), lo)
	assert.InDelta(t, lo, float64(td), 1)

	// The dew temperature rises with pressure below the cricondentherm
	// (common practice for the dew branch of a lean gas).
	prev := float64(td)
	for _, p := range []float64{0.5e6, 1e6, 2e6} {
		td, err := m.DewTemperature(x, physics.Pascal(p))
		require.NoError(t, err)
		assert.Greater(t, float64(td), prev)
		prev = float64(td)
	}
}
