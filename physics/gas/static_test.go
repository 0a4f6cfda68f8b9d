package gas_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// TestStaticStatePerfectGas checks the static state against the closed
// form of testdata/reference/stage-examples.md §1 (T1 = T01 − C1²/(2 cp),
// p1 = p01 (T1/T01)^(γ/(γ−1))) and the §2 values computed there
// (T01 = 295 K, p01 = 1.1 bar, Ca = 142.6 m/s: T1 = 284.9 K, p1 = 0.974 bar).
func TestStaticStatePerfectGas(t *testing.T) {
	air, err := gas.NewConstant(1005, 1.4)
	require.NoError(t, err)
	stag, err := air.State(295, 1.1e5)
	require.NoError(t, err)
	st, err := gas.StaticState(air, stag, 142.6)
	require.NoError(t, err)
	t1 := 295 - 142.6*142.6/(2*1005)
	assert.InEpsilon(t, t1, float64(st.Temperature), 1e-9)
	assert.InEpsilon(t, 1.1e5*math.Pow(t1/295, 3.5), float64(st.Pressure), 1e-8)
	assert.InEpsilon(t, 284.9, float64(st.Temperature), 2e-4)
	assert.InEpsilon(t, 0.974e5, float64(st.Pressure), 1e-3)

	_, err = gas.StaticState(air, stag, 800) // c²/2 > cp T0
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = gas.StaticState(air, stag, physics.MeterPerS(math.NaN()))
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = gas.StateFromHS(air, 0, 0, physics.Pascal(math.NaN()))
	require.ErrorIs(t, err, physics.ErrDomain)
}

// TestStateFromHSRealGas: the (h, s) solve returns a state with the asked
// enthalpy and entropy (definition) for a Peng-Robinson natural gas at
// 50 bar, where the two-variable Newton steps need the real-gas Jacobian.
func TestStateFromHSRealGas(t *testing.T) {
	comp, err := gas.NewComposition([]gas.Fraction{{Name: "CH4", Value: 0.9}, {Name: "C2H6", Value: 0.07}, {Name: "CO2", Value: 0.03}}, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewModel("peng-robinson", comp, nil)
	require.NoError(t, err)
	target, err := m.State(320, 5e6)
	require.NoError(t, err)
	got, err := gas.StateFromHS(m, target.Enthalpy, target.Entropy, 4e6)
	require.NoError(t, err)
	assert.InEpsilon(t, 320, float64(got.Temperature), 1e-7)
	assert.InEpsilon(t, 5e6, float64(got.Pressure), 1e-7)
	// static state at 150 m/s lies on the same isentrope, 150²/2 J/kg lower
	st, err := gas.StaticState(m, target, 150)
	require.NoError(t, err)
	assert.InDelta(t, float64(target.Enthalpy)-150*150/2.0, float64(st.Enthalpy), 1e-3)
	assert.InDelta(t, float64(target.Entropy), float64(st.Entropy), 1e-6)
	assert.Less(t, float64(st.Pressure), 5e6)
}
