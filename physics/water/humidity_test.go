package water_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/water"
)

func TestWaterMoleFraction(t *testing.T) {
	// Saturated moist air at 20 °C and 101.325 kPa: ASHRAE Handbook -
	// Fundamentals (2017), ch. 1, Table 2, humidity ratio Ws = 0.014758
	// kg/kg (from memory). With Mw/Mda = 0.621945 (same chapter) that is
	// x_ws = Ws/(Ws + 0.621945). ASHRAE includes the enhancement factor
	// (about 1.004 here); this function neglects it, so x·1.004 must match.
	ws := 0.014758
	xASHRAE := ws / (ws + 0.621945)
	x, err := water.WaterMoleFraction(1, 293.15, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, xASHRAE, x*1.004, 1e-3)
	assert.Less(t, x, xASHRAE, "neglecting the enhancement factor gives a slightly drier gas")

	// Çengel & Boles, 6th ed. (2008), Table A-4 (from memory): psat(25 °C)
	// = 3.1698 kPa, so 60 % RH at 25 °C and 1 atm is x = 0.6·3.1698/101.325.
	x, err = water.WaterMoleFraction(0.6, 298.15, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 0.6*3169.8/101325, x, 5e-4)

	// At 110 °C and 1 atm half-saturated steam-air is possible: Çengel &
	// Boles Table A-4 (from memory) psat(110 °C) = 143.38 kPa.
	x, err = water.WaterMoleFraction(0.5, 383.15, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 0.5*143380/101325, x, 5e-4)

	// Dry gas: x = 0 at any temperature, even below 0 °C (definition).
	x, err = water.WaterMoleFraction(0, 250, 101325)
	require.NoError(t, err)
	assert.InDelta(t, 0, x, 1e-15)
}

func TestWaterMoleFractionErrors(t *testing.T) {
	tests := []struct {
		name   string
		rh     float64
		t      physics.Kelvin
		p      physics.Pascal
		reason string
	}{
		// psat(110 °C) = 143.38 kPa > 1 atm (Çengel & Boles Table A-4, from
		// memory): saturated "air" at 110 °C and 1 atm cannot exist.
		{"boils above the boiling point", 1, 383.15, 101325, "would boil"},
		{"RH above 1", 1.2, 300, 101325, "fraction between 0 and 1"},
		{"RH percent by mistake", 65, 300, 101325, "fraction between 0 and 1"},
		{"RH negative", -0.1, 300, 101325, "fraction"},
		{"RH NaN", math.NaN(), 300, 101325, "fraction"},
		{"below 0 degC", 0.5, 263.15, 101325, "ice"},
		{"above critical", 0.5, 700, 30e6, "critical temperature"},
		{"T NaN", 0.5, physics.Kelvin(math.NaN()), 101325, "temperature"},
		{"T zero", 0.5, 0, 101325, "temperature"},
		{"p zero", 0.5, 300, 0, "pressure"},
		{"p NaN", 0.5, 300, physics.Pascal(math.NaN()), "pressure"},
		{"p Inf", 0.5, 300, physics.Pascal(math.Inf(1)), "pressure"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := water.WaterMoleFraction(tc.rh, tc.t, tc.p)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Contains(t, err.Error(), tc.reason)
		})
	}
}

func TestDewPointTemperature(t *testing.T) {
	// Çengel & Boles, 6th ed. (2008), Example 14-3 (from memory): house air
	// at 20 °C, 75 % RH, 1 atm has a dew point of 15.4 °C (Pv = 0.75 ·
	// 2.3392 kPa = 1.754 kPa, T_dp = Tsat @ 1.754 kPa).
	x, err := water.WaterMoleFraction(0.75, 293.15, 101325)
	require.NoError(t, err)
	tdp, err := water.DewPointTemperature(x, 101325)
	require.NoError(t, err)
	assert.InDelta(t, 15.4+273.15, float64(tdp), 0.1)

	// Saturated gas: the dew point is the gas temperature (definition of
	// RH = 1). Checked at 40 °C and 3 MPa.
	x, err = water.WaterMoleFraction(1, 313.15, 3e6)
	require.NoError(t, err)
	tdp, err = water.DewPointTemperature(x, 3e6)
	require.NoError(t, err)
	assert.InDelta(t, 313.15, float64(tdp), 1e-6)

	// Pure steam at 1 MPa: the dew point is the saturation temperature,
	// IAPWS-IF97 (2007) Table 36: 453.035632 K (from memory).
	tdp, err = water.DewPointTemperature(1, 1e6)
	require.NoError(t, err)
	assert.InDelta(t, 453.035632, float64(tdp), 1e-6)
}

func TestDewPointTemperatureErrors(t *testing.T) {
	tests := []struct {
		name   string
		x      float64
		p      physics.Pascal
		reason string
	}{
		// 0.1 % water at 1 atm: pw = 101 Pa < 611.213 Pa (IF97 lower limit),
		// a frost point, not a dew point.
		{"frost point region", 0.001, 101325, "frost"},
		{"above critical pressure", 1, 30e6, "critical pressure"},
		{"dry gas", 0, 101325, "dry gas has no dew point"},
		{"x above 1", 1.01, 101325, "at most 1"},
		{"x NaN", math.NaN(), 101325, "water mole fraction"},
		{"p zero", 0.01, 0, "pressure"},
		{"p NaN", 0.01, physics.Pascal(math.NaN()), "pressure"},
		{"p Inf", 0.01, physics.Pascal(math.Inf(1)), "pressure"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := water.DewPointTemperature(tc.x, tc.p)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Contains(t, err.Error(), tc.reason)
		})
	}
}

func TestWaterCondensation(t *testing.T) {
	// Çengel & Boles Example 14-3 (from memory): the 20 °C / 75 % RH room
	// air has a dew point of 15.4 °C, so a 10 °C window pane fogs and a
	// 18 °C surface does not.
	x, err := water.WaterMoleFraction(0.75, 293.15, 101325)
	require.NoError(t, err)

	cold, err := water.WaterCondensation(283.15, x, 101325)
	require.NoError(t, err)
	assert.True(t, cold.Condenses)
	assert.True(t, cold.DewPointKnown)
	assert.InDelta(t, 15.4+273.15, float64(cold.DewPoint), 0.1)
	assert.InDelta(t, 10-15.4, float64(cold.Margin), 0.1)
	assert.InEpsilon(t, 0.75*2339.2, float64(cold.PartialPressure), 1e-3)

	warm, err := water.WaterCondensation(291.15, x, 101325)
	require.NoError(t, err)
	assert.False(t, warm.Condenses)
	assert.InDelta(t, 18-15.4, float64(warm.Margin), 0.1)

	// Compressing that air isothermally to 3 bar triples pw above psat:
	// water drops out at 20 °C (the reason intercoolers drain condensate).
	hot, err := water.WaterCondensation(293.15, x, 3*101325)
	require.NoError(t, err)
	assert.True(t, hot.Condenses)

	// Dry gas never condenses (definition).
	dry, err := water.WaterCondensation(200, 0, 101325)
	require.NoError(t, err)
	assert.False(t, dry.Condenses)
	assert.False(t, dry.DewPointKnown)

	// pw = 101 Pa, below the triple point: at 300 K psat = 3537 Pa (IF97
	// Table 35, from memory) is far above pw, so no water forms.
	thin, err := water.WaterCondensation(300, 0.001, 101325)
	require.NoError(t, err)
	assert.False(t, thin.Condenses)
	assert.False(t, thin.DewPointKnown)

	// pw above the critical pressure: liquid forms below 647.096 K, not
	// above it (IAPWS-IF97 critical temperature).
	dense, err := water.WaterCondensation(600, 1, 25e6)
	require.NoError(t, err)
	assert.True(t, dense.Condenses)
	super, err := water.WaterCondensation(700, 1, 25e6)
	require.NoError(t, err)
	assert.False(t, super.Condenses)
}

func TestWaterCondensationErrors(t *testing.T) {
	tests := []struct {
		name   string
		t      physics.Kelvin
		x      float64
		p      physics.Pascal
		reason string
	}{
		{"frost possible", 250, 0.001, 101325, "frost"},
		{"T zero", 0, 0.01, 101325, "temperature"},
		{"T NaN", physics.Kelvin(math.NaN()), 0.01, 101325, "temperature"},
		{"T Inf", physics.Kelvin(math.Inf(1)), 0.01, 101325, "temperature"},
		{"x negative", 300, -0.01, 101325, "water mole fraction"},
		{"x NaN", 300, math.NaN(), 101325, "water mole fraction"},
		{"p zero", 300, 0.01, 0, "pressure"},
		{"p NaN", 300, 0.01, physics.Pascal(math.NaN()), "pressure"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := water.WaterCondensation(tc.t, tc.x, tc.p)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Contains(t, err.Error(), tc.reason)
		})
	}
}

func FuzzDewPointTemperature(f *testing.F) {
	f.Add(0.02, 101325.0)
	f.Add(1.0, 22.064e6)
	f.Add(0.0, 0.0)
	f.Fuzz(func(t *testing.T, x, p float64) {
		tdp, err := water.DewPointTemperature(x, physics.Pascal(p))
		if err == nil && (!physics.Finite(float64(tdp)) || !(tdp > 0)) {
			t.Fatalf("DewPointTemperature(%g, %g) = %g without error", x, p, tdp)
		}
		c, err := water.WaterCondensation(300, x, physics.Pascal(p))
		if err == nil && !physics.Finite(float64(c.DewPoint), float64(c.Margin), float64(c.PartialPressure)) {
			t.Fatalf("WaterCondensation(300, %g, %g) = %+v without error", x, p, c)
		}
	})
}

func FuzzWaterMoleFraction(f *testing.F) {
	f.Add(0.5, 300.0, 101325.0)
	f.Add(1.0, 647.096, 1.0)
	f.Fuzz(func(t *testing.T, rh, tk, p float64) {
		x, err := water.WaterMoleFraction(rh, physics.Kelvin(tk), physics.Pascal(p))
		if err == nil && (!physics.Finite(x) || x < 0 || x > 1) {
			t.Fatalf("WaterMoleFraction(%g, %g, %g) = %g without error", rh, tk, p, x)
		}
	})
}
