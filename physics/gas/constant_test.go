package gas_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

func TestConstantState(t *testing.T) {
	air, err := gas.NewConstant(1005, 1.4)
	require.NoError(t, err)
	// R = cp (γ−1)/γ = 287.14 J/(kg K) (definition, Çengel & Boles ch. 7).
	assert.InEpsilon(t, 1005*0.4/1.4, float64(air.GasConstant()), 1e-12)
	st, err := air.State(288.15, 101325)
	require.NoError(t, err)
	// ISO 2533 sea-level density 1.225 kg/m3 (from memory); R differs from
	// the standard's 287.05 by 0.03 %.
	assert.InEpsilon(t, 1.225, float64(st.Density), 1e-3)
	// ISO 2533 sea-level speed of sound 340.29 m/s (from memory).
	assert.InEpsilon(t, 340.29, float64(st.SoundSpeed), 1e-3)
	// Reference state h = 0 at 298.15 K, s = 0 at (298.15 K, 101 325 Pa)
	// (definition of the model).
	ref, err := air.State(gas.ReferenceTemperature, gas.ReferencePressure)
	require.NoError(t, err)
	assert.InDelta(t, 0, float64(ref.Enthalpy), 1e-9)
	assert.InDelta(t, 0, float64(ref.Entropy), 1e-12)
}

func TestConstantDomainErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, in := range [][2]float64{{0, 1.4}, {-1, 1.4}, {nan, 1.4}, {inf, 1.4}, {1e6, 1.4},
		{1005, 1}, {1005, 1.7}, {1005, nan}, {1005, inf}} {
		_, err := gas.NewConstant(physics.JoulePerKgK(in[0]), in[1])
		require.ErrorIs(t, err, physics.ErrDomain, "cp=%g gamma=%g", in[0], in[1])
	}
	air, err := gas.NewConstant(1005, 1.4)
	require.NoError(t, err)
	// 1e-310 K is a positive (subnormal) float whose density overflows.
	for _, tp := range [][2]float64{{nan, 1e5}, {0, 1e5}, {-1, 1e5}, {inf, 1e5}, {300, nan}, {300, 0}, {300, inf}, {1e-310, 1e5}} {
		_, err := air.State(physics.Kelvin(tp[0]), physics.Pascal(tp[1]))
		require.ErrorIs(t, err, physics.ErrDomain, "%v", tp)
	}
	for _, h := range []float64{nan, inf, -1e9} {
		_, err := air.StateFromPH(1e5, physics.JoulePerKg(h))
		require.ErrorIs(t, err, physics.ErrDomain, "h=%g", h)
		_, err = air.StateFromPS(1e5, physics.JoulePerKgK(h))
		require.ErrorIs(t, err, physics.ErrDomain, "s=%g", h)
	}
	_, err = air.StateFromPS(physics.Pascal(nan), 0)
	require.ErrorIs(t, err, physics.ErrDomain)
	// The zero value is not a model (doc of Constant).
	_, err = gas.Constant{}.State(300, 1e5)
	require.ErrorIs(t, err, physics.ErrDomain)
}

// TestTemperatureSolveNaN: a value function that returns NaN fails the
// bracket check instead of being iterated on.
func TestTemperatureSolveNaN(t *testing.T) {
	air, err := gas.NewConstant(1005, 1.4)
	require.NoError(t, err)
	stateAt := func(tk physics.Kelvin) (gas.State, error) { return air.State(tk, 1e5) }
	nanValue := func(gas.State) float64 { return math.NaN() }
	_, err = gas.TemperatureSolve(stateAt, 0, nanValue, nanValue, 200, 400)
	require.ErrorIs(t, err, physics.ErrDomain)
	// the ordinary solve: h = cp (T − Tref) = 1005 × 1.85 J/kg at 300 K
	// (definition of the model).
	h := func(s gas.State) float64 { return float64(s.Enthalpy) }
	cp := func(s gas.State) float64 { return float64(s.Cp) }
	st, err := gas.TemperatureSolve(stateAt, 1005*1.85, h, cp, 200, 400)
	require.NoError(t, err)
	assert.InDelta(t, 300, float64(st.Temperature), 1e-8)
	_, err = gas.TemperatureSolve(stateAt, math.NaN(), h, cp, 200, 400)
	require.ErrorIs(t, err, physics.ErrDomain)
}
