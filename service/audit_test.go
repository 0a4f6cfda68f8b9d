package service_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// Checks for the five findings of the physics audit of issue 12.

func warningsByCode(res service.StageResult, code string) []service.Warning {
	var out []service.Warning
	for _, w := range res.Warnings {
		if w.Code == code {
			out = append(out, w)
		}
	}
	return out
}

// naturalGasDuty is the audit's natural-gas duty: 30 to 60 bar, 10 kg/s,
// 12 000 rpm, the default exit velocity (0.25 U2).
func naturalGasDuty() service.StageDuty {
	return service.StageDuty{Gas: fuelGas("peng-robinson"), SuctionPressure: 30e5, SuctionTemperature: 300,
		DischargePressure: f(60e5), MassFlow: f(10), Speed: f(12000), PolytropicEfficiency: f(0.8),
		Impeller: service.ImpellerInput{BladeExitAngle: f(40)}}
}

// Finding 1: W2/W1 had only a lower level. The audit's natural-gas duty
// reaches W2/W1 = 2.06 (relative flow accelerating through the impeller)
// and was graded "ok"; it is now past the limit of the high rule
// (warning above 1.0, limit above 1.2; common practice, no source).
func TestAcceleratingImpellerIsFlagged(t *testing.T) {
	res := size(t, naturalGasDuty())
	w2w1 := res.Sizing.Velocities.RelativeVelocityRatio
	require.Greater(t, w2w1, 1.2, "the duty accelerates the relative flow")
	ws := warningsByCode(res, "relative-velocity-ratio")
	require.Len(t, ws, 1)
	assert.Equal(t, "limit", ws[0].Severity)
	assert.InDelta(t, 1.2, ws[0].Limit, 1e-12)
	assert.InDelta(t, w2w1, ws[0].Value, 1e-12)
	assert.Less(t, ws[0].Margin, 0.0)
	found := false
	for _, a := range res.Assessments {
		if a.Rule.ID == "relative-velocity-ratio-high" {
			found = true
		}
	}
	assert.True(t, found, "the high rule is graded and listed")
	// its level is the key of limit_overrides like any other rule
	d := naturalGasDuty()
	d.LimitOverrides = map[string]service.LevelOverride{"relative-velocity-ratio-high": {Warning: 2.5, Limit: f(3)}}
	res = size(t, d)
	assert.Empty(t, warningsByCode(res, "relative-velocity-ratio"))
}
