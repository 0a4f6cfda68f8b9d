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

// TestPolytropicEfficiencyEstimatePoints checks the code against the
// equation its doc comment states (form and coefficients from memory,
// unverified: no stored copy of the paper's equations was found), at
// values evaluated here with python3 from that equation. It checks the
// implementation of the stated equation, not the paper.
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

// TestPolytropicEfficiencyEstimateShape checks only the shape that has a
// source outside the recalled correlation:
//   - Casey & Robinson (2013), abstract (stored copy of the ASME page): the
//     design-point efficiency is characterised by the flow coefficient and
//     the tip-speed Mach number, so the estimate must depend on both;
//   - rules-of-thumb.md §6 (common practice, no source): a good process
//     stage reaches 0.75-0.86 polytropic, so the best estimate lies in that
//     band, and so does every estimate in the near-best-efficiency flow
//     coefficient band 0.06-0.10 of §5 at a moderate tip Mach number;
//   - rules-of-thumb.md §5 (common practice, no source): efficiency falls
//     steeply towards a flow coefficient of 0.01 (very narrow impellers):
//     at the low end of the range the estimate lies well (5 points, our
//     reading of "steeply") below every value in the near-best band.
//
// The figures of the paper (peak position, curvature, the Mach-number
// penalty's size) are not checked: they are known only from memory.
func TestPolytropicEfficiencyEstimateShape(t *testing.T) {
	eta := func(phi, mu float64) float64 {
		t.Helper()
		e, err := stage.PolytropicEfficiencyEstimate(phi, mu)
		require.NoError(t, err)
		return e.Value
	}
	lo, hi := stage.EfficiencyCorrelationFlowRange()
	best, worstNearBest := 0.0, 1.0
	for phi := lo; phi <= hi+1e-12; phi += 0.001 {
		best = math.Max(best, eta(phi, 0.7))
	}
	assert.GreaterOrEqual(t, best, 0.75, "best estimate in the band of a good process stage")
	assert.LessOrEqual(t, best, 0.86+1e-9, "best estimate in the band of a good process stage")
	for phi := 0.06; phi <= 0.10+1e-12; phi += 0.005 {
		e := eta(phi, 0.7)
		worstNearBest = math.Min(worstNearBest, e)
		assert.GreaterOrEqual(t, e, 0.75, "φ = %g", phi)
		assert.LessOrEqual(t, e, 0.86+1e-9, "φ = %g", phi)
	}
	assert.Greater(t, worstNearBest-eta(lo, 0.7), 0.05, "steep fall towards φ = 0.01")
	// depends on both the flow coefficient and the tip Mach number
	assert.NotEqual(t, eta(0.03, 0.7), eta(0.08, 0.7))
	assert.NotEqual(t, eta(0.08, 0.7), eta(0.08, 1.3))
	// the uncertainty is stated wherever the estimate is used
	e, err := stage.PolytropicEfficiencyEstimate(0.08, 0.7)
	require.NoError(t, err)
	assert.Contains(t, e.Note, "not checked against the paper")
	assert.Contains(t, stage.EfficiencyCorrelationSource, "UNVERIFIED")
	assert.Contains(t, stage.EfficiencyCorrelationSource, "from memory")
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
