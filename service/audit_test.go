package service_test

import (
	"context"
	"strings"
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

// co2 is pure carbon dioxide under Peng-Robinson.
func co2() service.GasInput {
	return service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"CO2": 1}}
}

func noteWith(notes []string, sub string) string {
	for _, n := range notes {
		if strings.Contains(n, sub) {
			return n
		}
	}
	return ""
}

// Finding 4: CO2 at 320 K and 60 bar (T/Tc = 1.052, p/Pc = 0.813; Tc and
// Pc of critical-constants.csv) got no near-critical note although
// Peng-Robinson's cp and isentropic exponent are off by about 6 % there
// (issue 12, against GERG-2008). The note names cp and the isentropic
// exponent and points to gerg-2008; the states where this service's PR
// stays within 2.5 % of the reference (real-gas-checks.csv: ethane 360 K
// 8 bar, methane 280 K 50 bar; CO2 300 K 10 bar of gerg2008/checks.csv)
// get none.
func TestNearCriticalNoteCoversCO2At320K(t *testing.T) {
	svc := service.New()
	res, err := svc.GasProperties(context.Background(), co2(), 320, 60e5)
	require.NoError(t, err)
	n := noteWith(res.Notes, "near its critical point")
	require.NotEmpty(t, n, "CO2 at 320 K, 60 bar")
	assert.Contains(t, n, "T/Tc = 1.052")
	assert.Contains(t, n, "cp")
	assert.Contains(t, n, "isentropic exponent")
	assert.Contains(t, n, "gerg-2008")
	// propane at 400 K and 70 bar (T/Tc 1.081, p/Pc 1.65): PR density -5.9 %
	// and cp -7.7 % against real-gas-checks.csv C3-YE-400
	res, err = svc.GasProperties(context.Background(), service.GasInput{Model: "srk", Composition: map[string]float64{"C3H8": 1}}, 400, 70e5)
	require.NoError(t, err)
	assert.NotEmpty(t, noteWith(res.Notes, "near its critical point"), "propane 400 K 70 bar")
	for _, tc := range []struct {
		gas  string
		t, p float64
	}{{"C2H6", 360, 8e5}, {"CH4", 280, 50e5}, {"CO2", 300, 10e5}} {
		res, err := svc.GasProperties(context.Background(), service.GasInput{Model: "peng-robinson", Composition: map[string]float64{tc.gas: 1}}, tc.t, tc.p)
		require.NoError(t, err)
		assert.Empty(t, noteWith(res.Notes, "near its critical point"), "%s %g K %g Pa", tc.gas, tc.t, tc.p)
	}
	// the ideal-gas model is not a cubic: no note
	res, err = svc.GasProperties(context.Background(), service.GasInput{Model: "ideal", Composition: map[string]float64{"CO2": 1}}, 320, 60e5)
	require.NoError(t, err)
	assert.Empty(t, noteWith(res.Notes, "near its critical point"))
}

// A CO2 stage from 320 K and 60 bar carries the near-critical-state warning
// at suction, with its basis.
func TestNearCriticalWarningOnCO2Stage(t *testing.T) {
	d := service.StageDuty{Gas: co2(), SuctionPressure: 60e5, SuctionTemperature: 320,
		DischargePressure: f(80e5), MassFlow: f(20), Speed: f(9000), PolytropicEfficiency: f(0.8),
		Impeller: service.ImpellerInput{BladeExitAngle: f(40)}}
	res := size(t, d)
	ws := warningsByCode(res, "near-critical-state")
	require.NotEmpty(t, ws)
	assert.Contains(t, ws[0].Message, "at the suction")
	assert.Contains(t, ws[0].Message, "gerg-2008")
	assert.InDelta(t, 1.2, ws[0].Limit, 1e-12)
	assert.Contains(t, ws[0].Basis, "derived here")
}
