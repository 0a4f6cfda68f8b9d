package water_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/water"
)

// TestVaporizationEnthalpy against the IAPWS-95 steam tables (Wagner &
// Pruss 2002; values from memory): 2441.7 kJ/kg at 25 °C, 2382.0 kJ/kg at
// 50 °C, 2256.4 kJ/kg at 100 °C. The Clausius-Clapeyron form with an ideal
// vapour errs by under 0.5 % up to 50 °C and about 1.5 % at 100 °C.
func TestVaporizationEnthalpy(t *testing.T) {
	for _, c := range []struct{ t, want, tol float64 }{
		{298.15, 2441.7e3, 5e-3}, {323.15, 2382.0e3, 5e-3}, {373.15, 2256.4e3, 2e-2},
	} {
		h, err := water.VaporizationEnthalpy(physics.Kelvin(c.t))
		require.NoError(t, err)
		assert.InEpsilon(t, c.want, float64(h), c.tol, "%.2f K", c.t)
	}
	for _, bad := range []float64{math.NaN(), 200, 600, math.Inf(1)} {
		_, err := water.VaporizationEnthalpy(physics.Kelvin(bad))
		assert.ErrorIs(t, err, physics.ErrDomain)
	}
}
