package service_test

import (
	"context"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/stage"
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

func methodWith(res service.StageResult, subject, sub string) (service.Method, bool) {
	for _, m := range res.Provenance.Methods {
		if m.Subject == subject && (strings.Contains(m.Name, sub) || strings.Contains(m.Source, sub)) {
			return m, true
		}
	}
	return service.Method{}, false
}

// Finding 5: the Casey & Robinson (2013) correlation's form and
// coefficients are from memory and could not be checked against the paper
// (no stored copy of its equations was found). Every answer that uses it
// says so: the method's source, the default's note and a caution; a
// correlation-out-of-range warning says so too.
func TestEstimatedEfficiencyStatesItsUncertainty(t *testing.T) {
	d := naturalGasDuty()
	d.PolytropicEfficiency = nil
	res := size(t, d)
	require.True(t, res.EfficiencyEstimated)
	m, ok := methodWith(res, "efficiency", "estimated")
	require.True(t, ok)
	assert.Contains(t, m.Source, "UNVERIFIED")
	assert.Contains(t, m.Source, "from memory")
	note := ""
	for _, df := range res.Provenance.Defaults {
		if df.Field == "efficiency.polytropic" {
			note = df.Note
		}
	}
	assert.Contains(t, note, "not checked against the paper")
	caution := ""
	for _, c := range res.Cautions {
		if strings.HasPrefix(c, "Efficiency:") {
			caution = c
		}
	}
	assert.Contains(t, caution, "could not check")
	// out of the correlation's range the warning says it too
	for _, w := range warningsByCode(res, "correlation-out-of-range") {
		assert.Contains(t, w.Message, "unverified")
		assert.Contains(t, w.Basis, "UNVERIFIED")
	}
	// a given efficiency: no such caution
	res = size(t, naturalGasDuty())
	for _, c := range res.Cautions {
		assert.False(t, strings.HasPrefix(c, "Efficiency:"))
	}
}

// Wiesner's limiting radius ratio is compared with the eye tip (shroud)
// diameter ratio D1t/D2 (an inferred choice, stated in provenance): the
// slip factor equals Wiesner's correlation (ASME J. Eng. Power 89:558, 1967,
// form from memory; stage.WiesnerSlip) at D1t/D2 of the sized eye, not at
// the RMS eye radius. 5 blades at 40 deg backsweep put the limiting ratio
// at exp(-8.16 cos 40°/5) = 0.287, below the eye (D1t/D2 about 0.44, RMS
// about 0.35), so the correction acts and the choice moves σ by 0.007.
func TestWiesnerUsesEyeTipRatio(t *testing.T) {
	// the air stage of stage-examples.md §2 (an eye of 0.6 D2), with a
	// backswept 5-blade impeller whose slip comes from Wiesner
	d := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1.1e5, SuctionTemperature: 295,
		PressureRatio: f(4.241), MassFlow: f(9), Speed: f(17400), IsentropicEfficiency: f(0.78),
		Impeller: service.ImpellerInput{BladeExitAngle: f(40), SlipModel: "wiesner", BladeCount: 5, ExitMeridionalVelocity: f(142.6),
			Inlet: service.InletInput{Type: "axial-eye", HubRatio: f(0.5), MeridionalVelocity: f(142.6)}}}
	res := size(t, d)
	g := res.Sizing.Geometry
	tip := float64(g.InletDiameter) / float64(g.TipDiameter)
	require.Greater(t, tip, stage.WiesnerLimitRatio(5, 40), "the correction applies")
	want, err := stage.WiesnerSlip(5, 40, tip)
	require.NoError(t, err)
	assert.InDelta(t, want, res.SlipFactor, 1e-6)
	rms := math.Sqrt((math.Pow(float64(g.InletDiameter), 2)+math.Pow(float64(g.EyeHubDiameter), 2))/2) / float64(g.TipDiameter)
	atRMS, err := stage.WiesnerSlip(5, 40, rms)
	require.NoError(t, err)
	assert.Greater(t, math.Abs(atRMS-res.SlipFactor), 1e-3, "the choice matters here")
	m, ok := methodWith(res, "slip factor", "D1t/D2")
	require.True(t, ok)
	assert.Contains(t, m.Name, "correction applied")
	assert.Contains(t, m.Source, service.WiesnerRadiusChoice)
}

// Standard volume flows of a humid gas are on the wet basis (an inferred
// choice, stated in provenance): 0.75 relative humidity at 303.15 K and
// 99.5 kPa gives x_w = 0.75 psat/p with IAPWS-IF97 psat(303.15 K) =
// 4.2470 kPa (IF97 eq. 30); at the ISO 13443 standard condition (288.15 K,
// 101.325 kPa) the ideal humid air of molar mass (1-x_w) M_air + x_w M_H2O
// (critical-constants.csv) has ρ = pM/(RT), and mass flow = q ρ. A
// dry-basis volume would give (1-x_w) q moles of dry air instead.
func TestStandardVolumeOfHumidGasIsWet(t *testing.T) {
	d := service.StageDuty{Gas: service.GasInput{Model: "ideal", Composition: map[string]float64{"air": 1}, RelativeHumidity: f(0.75)},
		SuctionPressure: 99500, SuctionTemperature: 303.15, PressureRatio: f(1.6), StandardVolumeFlow: f(2.5),
		StandardReference: "standard", Speed: f(18000), IsentropicEfficiency: f(0.82),
		Impeller: service.ImpellerInput{BladeExitAngle: f(45), SlipFactor: f(0.87), ExitMeridionalVelocity: f(90),
			Inlet: service.InletInput{Type: "axial-eye", HubRatio: f(0.3), MeridionalVelocity: f(120)}}}
	res := size(t, d)
	xw := 0.75 * 4247.0 / 99500
	mwet := (1-xw)*0.02896546 + xw*0.018015268
	rho := 101325 * mwet / (physics.UniversalGasConstant * 288.15)
	assert.InEpsilon(t, 2.5*rho, res.MassFlow, 2e-4, "wet basis")
	dry := 2.5 * 101325 / (physics.UniversalGasConstant * 288.15) * (0.02896546 + xw/(1-xw)*0.018015268)
	assert.Greater(t, math.Abs(dry-res.MassFlow)/res.MassFlow, 0.01, "the dry basis would differ by more than 1 %%")
	assert.InEpsilon(t, 2.5, res.StandardFlows.Standard, 1e-9, "the reported standard flow is on the same basis")
	m, ok := methodWith(res, "flow basis", "wet basis")
	require.True(t, ok)
	assert.Contains(t, m.Name, service.WetBasis)
}
