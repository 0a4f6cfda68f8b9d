package stage_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/stage"
)

// Saravanamuttoo et al., Gas Turbine Theory, Example 4.1 (inputs from
// memory; testdata/reference/stage-examples.md §2): n = 290 rev/s, D2 =
// 0.5 m gives U2 = 455.5 m/s. Inverting the peripheral-speed definition
// must give back 17 400 rev/min.
func TestSpeedForTipDiameter(t *testing.T) {
	n, err := stage.SpeedForTipDiameter(455.53, 0.5)
	require.NoError(t, err)
	assert.InDelta(t, 290*60.0, float64(n), 0.5)
	for _, bad := range [][2]float64{{0, 0.5}, {math.NaN(), 0.5}, {455, 0}, {455, math.Inf(1)}} {
		_, err := stage.SpeedForTipDiameter(physics.MeterPerS(bad[0]), physics.Meter(bad[1]))
		require.ErrorIs(t, err, physics.ErrDomain, bad)
	}
}

// The specific speed of the speed chosen is the target (round trip through
// the definition Ns = Ω√Q/Δh_s^0.75 of rules-of-thumb.md §9), and the flow
// coefficient of the diameter chosen is its target (definition of §5).
// Check value, computed here: Ns 0.7, Q 2 m3/s, Δh_s 100 kJ/kg give
// Ω = 0.7·(1e5)^0.75/√2 = 2783.4 rad/s = 26 580 rev/min.
func TestSpeedTargetsRoundTrip(t *testing.T) {
	n, err := stage.SpeedForSpecificSpeed(0.7, 2, 1e5)
	require.NoError(t, err)
	assert.InDelta(t, 26580, float64(n), 5)
	omega := float64(n) * 2 * math.Pi / 60
	assert.InDelta(t, 0.7, omega*math.Sqrt(2)/math.Pow(1e5, 0.75), 1e-12)

	d2, err := stage.TipDiameterForFlowCoefficient(0.08, 2, 400)
	require.NoError(t, err)
	assert.InDelta(t, 0.08, 2/(400*math.Pi*float64(d2)*float64(d2)/4), 1e-12)

	for _, bad := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		_, err = stage.SpeedForSpecificSpeed(bad, 2, 1e5)
		require.ErrorIs(t, err, physics.ErrDomain)
		_, err = stage.SpeedForSpecificSpeed(0.7, physics.CubicMeterPerS(bad), 1e5)
		require.ErrorIs(t, err, physics.ErrDomain)
		_, err = stage.SpeedForSpecificSpeed(0.7, 2, physics.JoulePerKg(bad))
		require.ErrorIs(t, err, physics.ErrDomain)
		_, err = stage.TipDiameterForFlowCoefficient(bad, 2, 400)
		require.ErrorIs(t, err, physics.ErrDomain)
		_, err = stage.TipDiameterForFlowCoefficient(0.08, 2, physics.MeterPerS(bad))
		require.ErrorIs(t, err, physics.ErrDomain)
	}
}

func TestRoundSpeed(t *testing.T) {
	cases := []struct{ n, step, want float64 }{
		{11_987, 50, 12_000}, {12_024, 50, 12_000}, {12_026, 50, 12_050}, {20, 50, 50}, {2_950, 3_000, 3_000},
	}
	for _, tc := range cases {
		got, err := stage.RoundSpeed(physics.RevPerMin(tc.n), physics.RevPerMin(tc.step))
		require.NoError(t, err)
		assert.InDelta(t, tc.want, float64(got), 1e-9, tc)
	}
	_, err := stage.RoundSpeed(12000, 0)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = stage.RoundSpeed(physics.RevPerMin(math.NaN()), 50)
	require.ErrorIs(t, err, physics.ErrDomain)
}
