package water_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/water"
)

func TestSaturationPressure(t *testing.T) {
	tests := []struct {
		name string
		t    physics.Kelvin
		want physics.Pascal
		rel  float64
	}{
		// IAPWS-IF97 (2007), Table 35, verification values of eq. 30
		// (from memory; not read from a stored copy of the release). They
		// carry 9 significant digits; 5e-9 relative covers half a unit of
		// the last digit for all three.
		{"IF97 T35 300 K", 300, 0.353658941e-2 * 1e6, 5e-9},
		{"IF97 T35 500 K", 500, 0.263889776e1 * 1e6, 5e-9},
		{"IF97 T35 600 K", 600, 0.123443146e2 * 1e6, 5e-9},
		// Çengel & Boles, 6th ed. (2008), Table A-4, saturated water (from
		// memory): 20 °C 2.3392 kPa, 25 °C 3.1698 kPa, 100 °C 101.42 kPa.
		// The table is from IAPWS-95; IF97 agrees to better than 0.05 %.
		{"Cengel A-4 20 degC", 293.15, 2339.2, 5e-4},
		{"Cengel A-4 25 degC", 298.15, 3169.8, 5e-4},
		{"Cengel A-4 100 degC", 373.15, 101420, 5e-4},
		// Lower end of region 4: psat(273.15 K) = 611.213 Pa, IAPWS-IF97
		// (2007), range of eq. 31 (from memory).
		{"IF97 lower limit", 273.15, 611.213, 1e-6},
		// Upper end: the critical point 22.064 MPa at 647.096 K, IAPWS-IF97
		// (2007) critical parameters; eq. 30 meets it to about 1e-6.
		{"critical point", 647.096, 22.064e6, 1e-5},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := water.SaturationPressure(tc.t)
			require.NoError(t, err)
			assert.InEpsilon(t, float64(tc.want), float64(got), tc.rel)
		})
	}
}

func TestSaturationTemperature(t *testing.T) {
	tests := []struct {
		name string
		p    physics.Pascal
		want physics.Kelvin
		tol  float64 // K
	}{
		// IAPWS-IF97 (2007), Table 36, verification values of eq. 31
		// (from memory; not read from a stored copy of the release), given
		// to 1e-6 K.
		{"IF97 T36 0.1 MPa", 0.1e6, 372.755919, 1e-6},
		{"IF97 T36 1 MPa", 1e6, 453.035632, 1e-6},
		{"IF97 T36 10 MPa", 10e6, 584.149488, 1e-6},
		// Normal boiling point of water at 101.325 kPa: 99.974 °C
		// (IAPWS-95 / ITS-90, from memory).
		{"normal boiling point", 101325, 373.124, 5e-3},
		// Çengel & Boles, 6th ed. (2008), Table A-5, saturated water,
		// pressure table (from memory): 1 MPa 179.88 °C, 500 kPa 151.83 °C.
		{"Cengel A-5 1 MPa", 1e6, 179.88 + 273.15, 0.01},
		{"Cengel A-5 500 kPa", 500e3, 151.83 + 273.15, 0.01},
		// Range ends: 611.213 Pa -> 273.15 K and 22.064 MPa -> 647.096 K
		// (IAPWS-IF97 (2007), region 4 limits).
		{"IF97 lower limit", 611.213, 273.15, 1e-4},
		{"critical point", 22.064e6, 647.096, 1e-3},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := water.SaturationTemperature(tc.p)
			require.NoError(t, err)
			assert.InDelta(t, float64(tc.want), float64(got), tc.tol)
		})
	}
}

// TestSaturationRoundTrip checks that the forward eq. 30 and the backward
// eq. 31 are consistent: IAPWS-IF97 (2007) derives both from the same
// implicit eq. 29, so they invert each other exactly up to rounding.
func TestSaturationRoundTrip(t *testing.T) {
	// The loop starts just above 273.15 K because psat(273.15 K) =
	// 611.2127 Pa lies a hair below the rounded lower limit 611.213 Pa of
	// eq. 31.
	for tk := 273.16; tk <= 647.0; tk += 7.3 {
		p, err := water.SaturationPressure(physics.Kelvin(tk))
		require.NoError(t, err)
		back, err := water.SaturationTemperature(p)
		require.NoError(t, err)
		assert.InDelta(t, tk, float64(back), 1e-8, "T = %g K", tk)
	}
}

func TestSaturationErrors(t *testing.T) {
	for _, tk := range []float64{273.14, 647.1, 0, -10, math.NaN(), math.Inf(1), math.Inf(-1)} {
		_, err := water.SaturationPressure(physics.Kelvin(tk))
		require.ErrorIs(t, err, physics.ErrDomain, "T = %g", tk)
		assert.Contains(t, err.Error(), "saturation line")
	}
	for _, p := range []float64{611.2, 22.065e6, 0, -1, math.NaN(), math.Inf(1)} {
		_, err := water.SaturationTemperature(physics.Pascal(p))
		require.ErrorIs(t, err, physics.ErrDomain, "p = %g", p)
		assert.Contains(t, err.Error(), "saturation line")
	}
}

func FuzzSaturationPressure(f *testing.F) {
	for _, v := range []float64{273.15, 300, 647.096, 0, -1, 1e300} {
		f.Add(v)
	}
	f.Fuzz(func(t *testing.T, tk float64) {
		p, err := water.SaturationPressure(physics.Kelvin(tk))
		if err == nil && (!physics.Finite(float64(p)) || !(p > 0)) {
			t.Fatalf("SaturationPressure(%g) = %g without error", tk, p)
		}
	})
}

func FuzzSaturationTemperature(f *testing.F) {
	for _, v := range []float64{611.213, 101325, 22.064e6, 0, -1, 1e300} {
		f.Add(v)
	}
	f.Fuzz(func(t *testing.T, p float64) {
		tk, err := water.SaturationTemperature(physics.Pascal(p))
		if err == nil && (!physics.Finite(float64(tk)) || !(tk > 0)) {
			t.Fatalf("SaturationTemperature(%g) = %g without error", p, tk)
		}
	})
}

func BenchmarkSaturationPressure(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		_, _ = water.SaturationPressure(310)
	}
}

func BenchmarkSaturationTemperature(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		_, _ = water.SaturationTemperature(3.5e6)
	}
}
