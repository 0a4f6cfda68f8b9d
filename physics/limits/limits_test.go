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
		assert.InDelta(t, tc.caution, r.Warning, 1e-12)
		assert.InDelta(t, tc.critical, r.Limit, 1e-12)
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
	assert.Equal(t, limits.OK, a.Severity)
	assert.InDelta(t, (300-280)/300.0, a.Margin, 1e-12)
	a, err = r.Check(320)
	require.NoError(t, err)
	assert.Equal(t, limits.Warning, a.Severity)
	assert.InDelta(t, 300.0, a.Level, 1e-12)
	assert.Less(t, a.Margin, 0.0)
	a, err = r.Check(372)
	require.NoError(t, err)
	assert.Equal(t, limits.Limit, a.Severity)
	assert.InDelta(t, 350.0, a.Level, 1e-12)
	assert.Equal(t, "impeller tip speed (closed-steel) 372 m/s exceeds the limit of 350 m/s", a.Message())

	low := limits.FlowCoefficientLow() // §5: below 0.01, no critical level
	a, err = low.Check(0.004)
	require.NoError(t, err)
	assert.Equal(t, limits.Warning, a.Severity)
	assert.InDelta(t, -0.6, a.Margin, 1e-12)
	assert.Contains(t, a.Message(), "is below the warning level of 0.01")
	a, err = low.Check(0.05)
	require.NoError(t, err)
	assert.Equal(t, limits.OK, a.Severity)

	_, err = r.Check(math.NaN())
	require.Error(t, err)
	_, err = r.Check(math.Inf(1))
	require.Error(t, err)
	// A hand-built rule with a NaN or infinite caution limit is refused
	// rather than graded with a NaN margin.
	bad := r
	bad.Warning = math.NaN()
	_, err = bad.Check(280)
	require.Error(t, err)
	bad.Warning = math.Inf(1)
	_, err = bad.Check(280)
	require.Error(t, err)
}

func TestDischargeTemperatureRules(t *testing.T) {
	// §4: process 175 degC caution, air 200/230 degC, fouling 100/120 degC.
	r, err := limits.DischargeTemperature(limits.ServiceAir)
	require.NoError(t, err)
	assert.InDelta(t, 473.15, r.Warning, 1e-9)
	assert.InDelta(t, 503.15, r.Limit, 1e-9)
	r, err = limits.DischargeTemperature(limits.ServiceFouling)
	require.NoError(t, err)
	assert.InDelta(t, 373.15, r.Warning, 1e-9)
	r, err = limits.DischargeTemperature(limits.ServiceProcess)
	require.NoError(t, err)
	assert.InDelta(t, 448.15, r.Warning, 1e-9)
	_, err = limits.DischargeTemperature("lava")
	require.Error(t, err)
	assert.Len(t, limits.Services(), 3)
}

func TestOtherRulesHaveSources(t *testing.T) {
	for _, r := range []limits.Rule{limits.InducerRelativeMach(), limits.MachineMach(), limits.DiffuserInletMach(false),
		limits.DiffuserInletMach(true), limits.DiffuserFlowAngle(), limits.FlowCoefficientLow(), limits.FlowCoefficientHigh(),
		limits.ExitWidthNarrow(), limits.ExitWidthWide(), limits.HeadCoefficientLow(), limits.HeadCoefficientHigh(),
		limits.ClosedImpellerHead(), limits.RelativeVelocityRatio(), limits.RelativeVelocityRatioHigh(), limits.SpecificSpeedLow(), limits.SpecificSpeedHigh(),
		limits.EyeTipRatio(), limits.DriverMarginRule(), limits.StagePressureRatio(limits.ClosedSteel),
		limits.StagePressureRatio(limits.OpenSteel)} {
		assert.NotEmpty(t, r.Basis, r.ID)
		assert.NotEmpty(t, r.Code)
		assert.NotEmpty(t, r.ID)
		if !math.IsNaN(r.Limit) {
			if r.Sense == limits.Above {
				assert.Greater(t, r.Limit, r.Warning, r.Code)
			} else {
				assert.Less(t, r.Limit, r.Warning, r.Code)
			}
		}
	}
	// §2, §3, §7 numbers
	assert.InDelta(t, 0.85, limits.InducerRelativeMach().Warning, 1e-12)
	assert.InDelta(t, 0.95, limits.InducerRelativeMach().Limit, 1e-12)
	assert.InDelta(t, 0.85, limits.DiffuserInletMach(true).Warning, 1e-12)
	assert.InDelta(t, 70.0, limits.DiffuserFlowAngle().Warning, 1e-12)
	assert.InDelta(t, 0.015, limits.ExitWidthNarrow().Warning, 1e-12)
	assert.InDelta(t, 0.01, limits.ExitWidthNarrow().Limit, 1e-12)
}

// The warning codes are a contract other systems key on (issue 4 names
// them); two-sided quantities share a code and differ in ID.
func TestWarningCodes(t *testing.T) {
	tip, err := limits.TipSpeed(limits.OpenAluminium)
	require.NoError(t, err)
	dt, err := limits.DischargeTemperature(limits.ServiceProcess)
	require.NoError(t, err)
	cases := []struct {
		r        limits.Rule
		code, id string
	}{
		{tip, "tip-speed", "tip-speed"},
		{limits.MachineMach(), "machine-mach", "machine-mach"},
		{limits.InducerRelativeMach(), "inducer-mach", "inducer-mach"},
		{limits.DiffuserInletMach(false), "diffuser-inlet-mach", "diffuser-inlet-mach"},
		{limits.DiffuserFlowAngle(), "diffuser-inlet-angle", "diffuser-inlet-angle"},
		{dt, "discharge-temperature", "discharge-temperature"},
		{limits.FlowCoefficientLow(), "flow-coefficient", "flow-coefficient-low"},
		{limits.FlowCoefficientHigh(), "flow-coefficient", "flow-coefficient-high"},
		{limits.ExitWidthNarrow(), "exit-width-ratio", "exit-width-ratio-low"},
		{limits.ExitWidthWide(), "exit-width-ratio", "exit-width-ratio-high"},
		{limits.StagePressureRatio(limits.OpenSteel), "stage-pressure-ratio", "stage-pressure-ratio"},
		{limits.DriverMarginRule(), "driver-margin", "driver-margin"},
		{limits.RelativeVelocityRatio(), "relative-velocity-ratio", "relative-velocity-ratio"},
		{limits.RelativeVelocityRatioHigh(), "relative-velocity-ratio", "relative-velocity-ratio-high"},
	}
	for _, tc := range cases {
		assert.Equal(t, tc.code, tc.r.Code)
		assert.Equal(t, tc.id, tc.r.ID)
	}
}

// Grading at and around each level: just inside the warning level with room
// (OK), within 5 % of it (notice), exactly at it (still inside: a concern
// starts past the level), past it (warning), at the limit (warning), past
// the limit (limit). Levels from rules-of-thumb.md (common practice, no
// source); the grading is the definition in Rule.Check.
func TestGradingAroundLevels(t *testing.T) {
	tip, err := limits.TipSpeed(limits.ClosedSteel) // 300 / 350 m/s
	require.NoError(t, err)
	above := []struct {
		v    float64
		want limits.Severity
	}{{280, limits.OK}, {286, limits.Notice}, {300, limits.Notice}, {300.01, limits.Warning}, {350, limits.Warning}, {350.01, limits.Limit}}
	for _, tc := range above {
		a, err := tip.Check(tc.v)
		require.NoError(t, err)
		assert.Equal(t, tc.want, a.Severity, "tip speed %g", tc.v)
	}
	dm := limits.DriverMarginRule() // below 1.10 warning, below 1.0 limit
	below := []struct {
		v    float64
		want limits.Severity
	}{{1.25, limits.OK}, {1.14, limits.Notice}, {1.10, limits.Notice}, {1.09, limits.Warning}, {1.0, limits.Warning}, {0.99, limits.Limit}}
	for _, tc := range below {
		a, err := dm.Check(tc.v)
		require.NoError(t, err)
		assert.Equal(t, tc.want, a.Severity, "driver margin %g", tc.v)
	}
	for _, c := range []limits.Construction{limits.ClosedSteel, limits.OpenSteel} {
		pr := limits.StagePressureRatio(c)
		a, err := pr.Check(pr.Warning * 1.01)
		require.NoError(t, err)
		assert.Equal(t, limits.Warning, a.Severity, c)
	}
	assert.Equal(t, 3, limits.Limit.Rank())
	assert.Greater(t, limits.Warning.Rank(), limits.Notice.Rank())
	assert.Greater(t, limits.Notice.Rank(), limits.OK.Rank())
}

func TestOverride(t *testing.T) {
	tip, err := limits.TipSpeed(limits.ClosedSteel)
	require.NoError(t, err)
	o, err := tip.Override(320, 380)
	require.NoError(t, err)
	a, err := o.Check(330)
	require.NoError(t, err)
	assert.Equal(t, limits.Warning, a.Severity)
	assert.Contains(t, o.Basis, "caller override")
	_, err = tip.Override(380, 320) // limit under the warning level
	require.Error(t, err)
	_, err = tip.Override(math.NaN(), 380)
	require.Error(t, err)
	_, err = tip.Override(320, math.Inf(1))
	require.Error(t, err)
	dm := limits.DriverMarginRule()
	_, err = dm.Override(1.05, 1.1) // Below: the limit must not exceed the warning level
	require.Error(t, err)
	o, err = dm.Override(1.15, math.NaN())
	require.NoError(t, err)
	a, err = o.Check(1.12)
	require.NoError(t, err)
	assert.Equal(t, limits.Warning, a.Severity)
}

// allRules lists every rule the package offers, for the grading table.
func allRules(t *testing.T) []limits.Rule {
	t.Helper()
	rules := []limits.Rule{limits.InducerRelativeMach(), limits.MachineMach(), limits.DiffuserInletMach(false),
		limits.DiffuserInletMach(true), limits.DiffuserFlowAngle(), limits.FlowCoefficientLow(), limits.FlowCoefficientHigh(),
		limits.ExitWidthNarrow(), limits.ExitWidthWide(), limits.HeadCoefficientLow(), limits.HeadCoefficientHigh(),
		limits.ClosedImpellerHead(), limits.RelativeVelocityRatio(), limits.RelativeVelocityRatioHigh(), limits.SpecificSpeedLow(), limits.SpecificSpeedHigh(),
		limits.EyeTipRatio(), limits.DriverMarginRule()}
	for _, c := range limits.Constructions() {
		r, err := limits.TipSpeed(c)
		require.NoError(t, err)
		rules = append(rules, r, limits.StagePressureRatio(c))
	}
	for _, s := range limits.Services() {
		r, err := limits.DischargeTemperature(s)
		require.NoError(t, err)
		rules = append(rules, r)
	}
	return rules
}

// Every rule graded at and around its levels (the levels are those of
// rules-of-thumb.md, each labelled at its constructor; the grading is the
// definition in Rule.Check): well inside → ok, 2 % inside → notice, at
// the warning level → notice (a concern starts past it), 1 % past →
// warning, at the limit → warning, 1 % past the limit → limit (rules with
// no limit stay at warning).
func TestEveryRuleAroundItsLevels(t *testing.T) {
	for _, r := range allRules(t) {
		toward := 1.0 // multiplier that moves a value toward the concern
		if r.Sense == limits.Below {
			toward = -1
		}
		w := r.Warning
		at := func(frac float64) float64 { return w + toward*frac*math.Abs(w) }
		grade := func(v float64) limits.Severity {
			a, err := r.Check(v)
			require.NoError(t, err, r.ID)
			return a.Severity
		}
		assert.Equal(t, limits.OK, grade(at(-0.2)), "%s well inside", r.ID)
		assert.Equal(t, limits.Notice, grade(at(-0.02)), "%s 2 %% inside", r.ID)
		assert.Equal(t, limits.Notice, grade(w), "%s at the warning level", r.ID)
		past := at(0.01)
		if !math.IsNaN(r.Limit) && toward*(past-r.Limit) > 0 {
			past = (w + r.Limit) / 2 // the two levels closer than 1 %
		}
		assert.Equal(t, limits.Warning, grade(past), "%s just past the warning level", r.ID)
		if math.IsNaN(r.Limit) {
			assert.Equal(t, limits.Warning, grade(at(10)), "%s has no limit", r.ID)
			continue
		}
		assert.Equal(t, limits.Warning, grade(r.Limit), "%s at the limit", r.ID)
		assert.Equal(t, limits.Limit, grade(r.Limit+toward*0.01*math.Abs(r.Limit)), "%s past the limit", r.ID)
	}
}

// W2/W1 is graded on both sides (issue 12): diffusion below 0.7 and
// acceleration above 1.0 (warning) and 1.2 (limit), common practice, no
// source (see the rules' Basis). The values of the audit: 1.05 and 1.12 in
// two demo duties (warnings) and 2.06 for a natural-gas duty (limit); 0.85,
// inside the usual diffusion range, is ok on both sides.
func TestRelativeVelocityRatioBothSides(t *testing.T) {
	low, high := limits.RelativeVelocityRatio(), limits.RelativeVelocityRatioHigh()
	assert.Equal(t, low.Code, high.Code, "the low and high rules of one quantity share a code")
	assert.NotEqual(t, low.ID, high.ID, "each has its own limit_overrides key")
	assert.Equal(t, limits.Above, high.Sense)
	assert.InDelta(t, 1.0, high.Warning, 1e-12)
	assert.InDelta(t, 1.2, high.Limit, 1e-12)
	assert.Contains(t, high.Basis, "common practice")
	cases := []struct {
		v         float64
		low, high limits.Severity
	}{
		{0.60, limits.Warning, limits.OK},
		{0.70, limits.Notice, limits.OK},
		{0.85, limits.OK, limits.OK},
		{0.94, limits.OK, limits.OK},
		{0.96, limits.OK, limits.Notice},
		{1.00, limits.OK, limits.Notice},
		{1.05, limits.OK, limits.Warning},
		{1.12, limits.OK, limits.Warning},
		{1.20, limits.OK, limits.Warning},
		{1.21, limits.OK, limits.Limit},
		{2.06, limits.OK, limits.Limit},
	}
	for _, tc := range cases {
		a, err := low.Check(tc.v)
		require.NoError(t, err)
		assert.Equal(t, tc.low, a.Severity, "low rule at W2/W1 = %g", tc.v)
		b, err := high.Check(tc.v)
		require.NoError(t, err)
		assert.Equal(t, tc.high, b.Severity, "high rule at W2/W1 = %g", tc.v)
	}
	b, err := high.Check(1.05)
	require.NoError(t, err)
	assert.Contains(t, b.Message(), "exceeds the warning level of 1")
}
