package limits_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/limits"
)

// The limit numbers are the reference pack's (testdata/reference/
// rules-of-thumb.md, each labelled there); these tests pin the table and the
// grading arithmetic.
func TestTipSpeedRules(t *testing.T) {
	cases := []struct {
		c                 limits.Construction
		caution, critical float64
	}{ // rules-of-thumb.md §1 (common practice, no source)
		{limits.ClosedSteel, 300, 350},
		{limits.OpenSteel, 420, 500},
		{limits.OpenAluminium, 450, 500},
		{limits.OpenTitanium, 500, 600},
	}
	for _, tc := range cases {
		r, err := limits.TipSpeed(tc.c)
		require.NoError(t, err)
		assert.InDelta(t, tc.caution, r.Caution, 1e-12)
		assert.InDelta(t, tc.critical, r.Critical, 1e-12)
	}
	_, err := limits.TipSpeed("cardboard")
	require.Error(t, err)
	assert.Len(t, limits.Constructions(), 4)
}

func TestCheckGrades(t *testing.T) {
	// rules-of-thumb.md §1 numbers (common practice, no source); the margin
	// and grading arithmetic are the definitions in Rule.Check.
	r, err := limits.TipSpeed(limits.ClosedSteel)
	require.NoError(t, err)
	a, err := r.Check(280)
	require.NoError(t, err)
	assert.Equal(t, limits.Within, a.Severity)
	assert.InDelta(t, (300-280)/300.0, a.Margin, 1e-12)
	a, err = r.Check(320)
	require.NoError(t, err)
	assert.Equal(t, limits.Caution, a.Severity)
	assert.InDelta(t, 300.0, a.Limit, 1e-12)
	assert.Less(t, a.Margin, 0.0)
	a, err = r.Check(372)
	require.NoError(t, err)
	assert.Equal(t, limits.Critical, a.Severity)
	assert.InDelta(t, 350.0, a.Limit, 1e-12)
	assert.Equal(t, "impeller tip speed (closed-steel) 372 m/s exceeds the critical limit of 350 m/s", a.Message())

	low := limits.FlowCoefficientLow() // §5: below 0.01, no critical level
	a, err = low.Check(0.004)
	require.NoError(t, err)
	assert.Equal(t, limits.Caution, a.Severity)
	assert.InDelta(t, -0.6, a.Margin, 1e-12)
	assert.Contains(t, a.Message(), "is below the caution limit of 0.01")
	a, err = low.Check(0.05)
	require.NoError(t, err)
	assert.Equal(t, limits.Within, a.Severity)

	_, err = r.Check(math.NaN())
	require.Error(t, err)
	_, err = r.Check(math.Inf(1))
	require.Error(t, err)
	// A hand-built rule with a NaN or infinite caution limit is refused
	// rather than graded with a NaN margin.
	bad := r
	bad.Caution = math.NaN()
	_, err = bad.Check(280)
	require.Error(t, err)
	bad.Caution = math.Inf(1)
	_, err = bad.Check(280)
	require.Error(t, err)
}

func TestDischargeTemperatureRules(t *testing.T) {
	// §4: process 175 degC caution, air 200/230 degC, fouling 100/120 degC.
	r, err := limits.DischargeTemperature(limits.ServiceAir)
	require.NoError(t, err)
	assert.InDelta(t, 473.15, r.Caution, 1e-9)
	assert.InDelta(t, 503.15, r.Critical, 1e-9)
	r, err = limits.DischargeTemperature(limits.ServiceFouling)
	require.NoError(t, err)
	assert.InDelta(t, 373.15, r.Caution, 1e-9)
	r, err = limits.DischargeTemperature(limits.ServiceProcess)
	require.NoError(t, err)
	assert.InDelta(t, 448.15, r.Caution, 1e-9)
	_, err = limits.DischargeTemperature("lava")
	require.Error(t, err)
	assert.Len(t, limits.Services(), 3)
}

func TestOtherRulesHaveSources(t *testing.T) {
	for _, r := range []limits.Rule{limits.InducerRelativeMach(), limits.MachineMach(), limits.DiffuserInletMach(false),
		limits.DiffuserInletMach(true), limits.DiffuserFlowAngle(), limits.FlowCoefficientLow(), limits.FlowCoefficientHigh(),
		limits.ExitWidthNarrow(), limits.ExitWidthWide(), limits.HeadCoefficientLow(), limits.HeadCoefficientHigh(),
		limits.ClosedImpellerHead(), limits.RelativeVelocityRatio(), limits.SpecificSpeedLow(), limits.SpecificSpeedHigh(),
		limits.EyeTipRatio()} {
		assert.NotEmpty(t, r.Source, r.Code)
		assert.NotEmpty(t, r.Code)
		if !math.IsNaN(r.Critical) {
			if r.Sense == limits.Above {
				assert.Greater(t, r.Critical, r.Caution, r.Code)
			} else {
				assert.Less(t, r.Critical, r.Caution, r.Code)
			}
		}
	}
	// §2, §3, §7 numbers
	assert.InDelta(t, 0.85, limits.InducerRelativeMach().Caution, 1e-12)
	assert.InDelta(t, 0.95, limits.InducerRelativeMach().Critical, 1e-12)
	assert.InDelta(t, 0.85, limits.DiffuserInletMach(true).Caution, 1e-12)
	assert.InDelta(t, 70.0, limits.DiffuserFlowAngle().Caution, 1e-12)
	assert.InDelta(t, 0.015, limits.ExitWidthNarrow().Caution, 1e-12)
	assert.InDelta(t, 0.01, limits.ExitWidthNarrow().Critical, 1e-12)
}
