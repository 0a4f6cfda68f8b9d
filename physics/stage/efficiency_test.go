package stage_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/stage"
)

// ours converts Casey's flow coefficient ṁ/(ρ01 U2 D2²) to this package's
// Q01/(U2 π D2²/4): φ = φ_CR · 4/π.
func ours(phiCR float64) float64 { return phiCR * 4 / math.Pi }

// TestPolytropicEfficiencyEstimatePoints: point values of the Casey &
// Robinson (2013) correlation, form and coefficients from memory (see the
// doc comment), evaluated here with python3 from that form.
func TestPolytropicEfficiencyEstimatePoints(t *testing.T) {
	cases := []struct {
		name       string
		phiCR, mu  float64
		want       float64
		wantInside bool
	}{
		{"peak, moderate Mach", 0.08, 0.7, 0.86000, true},
		{"phi_CR 0.01, edge of range", 0.01, 0.7, 0.64298, true},
		{"phi_CR 0.02", 0.02, 0.7, 0.72068, true},
		{"phi_CR 0.15, edge of range", 0.15, 0.7, 0.81786, true},
		{"peak, Mu2 1.2", 0.08, 1.2, 0.85533, true},
		{"phi_CR 0.12, Mu2 1.3", 0.12, 1.3, 0.83244, true},
		{"phi_CR 0.05, Mu2 0.9", 0.05, 0.9, 0.83529, true},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := stage.PolytropicEfficiencyEstimate(ours(tc.phiCR), tc.mu)
			require.NoError(t, err)
			assert.InDelta(t, tc.want, got.Value, 5e-5)
			assert.Equal(t, tc.wantInside, got.InRange)
			assert.Contains(t, got.Note, "Casey & Robinson (2013)")
		})
	}
}

// TestPolytropicEfficiencyEstimateShape checks the properties the figures
// of Casey & Robinson (2013) show (from memory): the peak lies near
// φ_CR = 0.08 at 0.86-0.88 for moderate Mach numbers, efficiency falls
// steeply below φ_CR ≈ 0.01-0.02 and more gently at high flow coefficient,
// and it falls with tip Mach number above about 0.8 (none below).
func TestPolytropicEfficiencyEstimateShape(t *testing.T) {
	eta := func(phiCR, mu float64) float64 {
		t.Helper()
		e, err := stage.PolytropicEfficiencyEstimate(ours(phiCR), mu)
		require.NoError(t, err)
		return e.Value
	}
	// the maximum over a grid of φ_CR at Mu2 = 0.7 lies at 0.08
	best, bestPhi := 0.0, 0.0
	for p := 0.01; p <= 0.15+1e-9; p += 0.0025 {
		if e := eta(p, 0.7); e > best {
			best, bestPhi = e, p
		}
	}
	assert.InDelta(t, 0.08, bestPhi, 0.0026)
	assert.GreaterOrEqual(t, best, 0.86-1e-9)
	assert.LessOrEqual(t, best, 0.88)
	// steep fall at low flow coefficient: more than 10 points from 0.08 to
	// 0.02, more than 20 to 0.01; the fall steepens towards low φ
	assert.Greater(t, eta(0.08, 0.7)-eta(0.02, 0.7), 0.10)
	assert.Greater(t, eta(0.08, 0.7)-eta(0.01, 0.7), 0.20)
	assert.Greater(t, eta(0.02, 0.7)-eta(0.01, 0.7), eta(0.04, 0.7)-eta(0.03, 0.7))
	// fall at high flow coefficient, gentler than at low flow
	assert.Less(t, eta(0.15, 0.7), eta(0.12, 0.7))
	assert.Less(t, eta(0.12, 0.7), eta(0.08, 0.7))
	assert.Less(t, eta(0.08, 0.7)-eta(0.15, 0.7), eta(0.08, 0.7)-eta(0.02, 0.7))
	// tip Mach: no effect at or below 0.8, a fall above, larger at high φ
	assert.InDelta(t, eta(0.08, 0.5), eta(0.08, 0.8), 1e-12)
	for _, p := range []float64{0.02, 0.08, 0.14} {
		assert.Less(t, eta(p, 1.0), eta(p, 0.8), "phi_CR %v", p)
		assert.Less(t, eta(p, 1.3), eta(p, 1.0), "phi_CR %v", p)
	}
	assert.Greater(t, eta(0.14, 0.8)-eta(0.14, 1.3), eta(0.02, 0.8)-eta(0.02, 1.3))
}

// TestPolytropicEfficiencyEstimateRange: outside the stated range
// (φ_CR 0.01-0.15, Mu2 <= 1.4, from memory) the input is clamped to the
// edge, InRange is false and the note says so.
func TestPolytropicEfficiencyEstimateRange(t *testing.T) {
	edge, err := stage.PolytropicEfficiencyEstimate(ours(0.01), 0.7)
	require.NoError(t, err)
	low, err := stage.PolytropicEfficiencyEstimate(ours(0.005), 0.7)
	require.NoError(t, err)
	assert.False(t, low.InRange)
	assert.InDelta(t, edge.Value, low.Value, 1e-12)
	assert.Contains(t, low.Note, "clamped")
	high, err := stage.PolytropicEfficiencyEstimate(ours(0.2), 0.7)
	require.NoError(t, err)
	assert.False(t, high.InRange)
	assert.InDelta(t, 0.81786, high.Value, 5e-5) // value at φ_CR = 0.15
	fast, err := stage.PolytropicEfficiencyEstimate(ours(0.08), 1.6)
	require.NoError(t, err)
	at14, err := stage.PolytropicEfficiencyEstimate(ours(0.08), 1.4)
	require.NoError(t, err)
	assert.False(t, fast.InRange)
	assert.True(t, at14.InRange)
	assert.InDelta(t, at14.Value, fast.Value, 1e-12)
	assert.Contains(t, fast.Note, "clamped")
	for _, bad := range []struct{ phi, mu float64 }{
		{math.NaN(), 0.8}, {0.1, math.NaN()}, {math.Inf(1), 0.8}, {0.1, math.Inf(1)},
		{0, 0.8}, {-0.1, 0.8}, {0.1, 0}, {0.1, -1},
	} {
		_, err := stage.PolytropicEfficiencyEstimate(bad.phi, bad.mu)
		require.ErrorIs(t, err, physics.ErrDomain, "%v", bad)
	}
}
