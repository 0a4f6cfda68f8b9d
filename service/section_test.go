package service_test

import (
	"context"
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/gas"
	"stagewright/physics/path"
	"stagewright/service"
)

func sizeSection(t *testing.T, d service.SectionDuty) service.SectionResult {
	t.Helper()
	res, err := service.New().SizeSection(context.Background(), d)
	require.NoError(t, err)
	return res
}

func ip(v int) *int { return &v }

// TestSectionMinimumWorkIntercooling: two stages of a constant-property
// gas (cp = 1005 J/(kg K), γ = 1.4), ηp = 0.8 each, cooled back to the
// suction temperature with no pressure drop. The minimum-work result of
// perfect intercooling (Çengel & Boles, Thermodynamics: An Engineering
// Approach, 6th ed. 2008, §7-10 "Multistage compression with
// intercooling", from memory: equal ratios P_x = √(P1 P2)) gives each
// stage √PR and, with the polytropic exponent (γ−1)/(γ ηp) (Dixon & Hall
// 2014, ch. 2), a power and a cooler duty of
// m cp T1 ((√PR)^((γ−1)/(γ ηp)) − 1) per stage.
func TestSectionMinimumWorkIntercooling(t *testing.T) {
	const pr, t1, mdot, eta, cp, g = 4.0, 300.0, 5.0, 0.8, 1005.0, 1.4
	res := sizeSection(t, service.SectionDuty{StageDuty: service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: t1,
		PressureRatio: f(pr), MassFlow: f(mdot), PolytropicEfficiency: f(eta)}, StageCount: ip(2),
		Intercooling: &service.Intercooling{OutletTemperature: f(t1)}})
	require.Len(t, res.Stages, 2)
	require.Len(t, res.Coolers, 1)
	want := mdot * cp * t1 * (math.Pow(math.Sqrt(pr), (g-1)/(g*eta)) - 1)
	for k, st := range res.Stages {
		ratio := float64(st.Path.Discharge.Pressure / st.Path.Suction.Pressure)
		assert.InEpsilon(t, math.Sqrt(pr), ratio, 1e-6, "stage %d ratio", k+1)
		assert.InEpsilon(t, want, st.Power.Gas, 1e-6, "stage %d power", k+1)
	}
	assert.InEpsilon(t, want, res.Coolers[0].Duty, 1e-6, "cooler duty")
	assert.InEpsilon(t, 2*want, res.Power.Gas, 1e-6)
	assert.InEpsilon(t, 2*want/0.98, res.Power.Shaft, 1e-6, "mechanical losses once: default 0.98")
	assert.InDelta(t, t1, float64(res.Stages[1].Path.Suction.Temperature), 1e-9)
	assert.Equal(t, "given", res.StageCountBasis)
	require.Len(t, res.Machine.Stages, 2)
	require.Len(t, res.Machine.Coolers, 1)
	assert.Equal(t, 1, res.Machine.Coolers[0].AfterStage)
	assert.InEpsilon(t, res.Stages[1].Speed, res.Machine.Stages[1].Design.Speed, 1e-12)
}

// TestSectionHumidAirCondensate: moist air (4 % water by mole) cooled to
// 300 K between two stages. The condensate is the mass balance with the
// IAPWS-IF97 saturation pressure at 300 K, psat = 3536.58941 Pa (IAPWS
// R7-97, Table 35 verification value, from memory), at the cooler outlet
// pressure: water left per mole of dry gas y/(1−y), y = psat/p (Dalton);
// the next stage's mass flow is the inlet's less the condensate.
func TestSectionHumidAirCondensate(t *testing.T) {
	const xw = 0.04
	gi := service.GasInput{Model: "ideal", Composition: map[string]float64{"dry-air": 1 - xw, "H2O": xw}}
	res := sizeSection(t, service.SectionDuty{StageDuty: service.StageDuty{Gas: gi, SuctionPressure: 1e5, SuctionTemperature: 320,
		PressureRatio: f(6), MassFlow: f(3), PolytropicEfficiency: f(0.82)}, StageCount: ip(2),
		Intercooling: &service.Intercooling{OutletTemperature: f(300), PressureDrop: 5e3}})
	require.Len(t, res.Coolers, 1)
	c := res.Coolers[0]
	p := float64(c.Outlet.Pressure)
	assert.InDelta(t, float64(c.Inlet.Pressure)-5e3, p, 1e-6)
	y := 3536.58941 / p
	removed := xw - y/(1-y)*(1-xw)
	comp, err := gas.NewComposition([]gas.Fraction{{Name: "dry-air", Value: 1 - xw}, {Name: "H2O", Value: xw}}, gas.BasisMole)
	require.NoError(t, err)
	want := 3 * removed * 0.018015268 / comp.MolarMass() // water 18.015268 g/mol (IAPWS-95, from memory)
	assert.InEpsilon(t, want, c.Condensate, 2e-4)
	assert.InEpsilon(t, 3-c.Condensate, res.Stages[1].MassFlow, 1e-9)
	codes := map[string]bool{}
	for _, w := range res.Warnings {
		codes[w.Code] = true
	}
	assert.True(t, codes["stage-inlet-condensate"])
	assert.True(t, codes["cooler-condensate"])
}

// naturalGas is a lean pipeline gas (mole fractions, invented for the
// checks).
func naturalGas() service.GasInput {
	return service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"CH4": 0.90, "C2H6": 0.05, "C3H8": 0.02, "N2": 0.02, "CO2": 0.01}}
}

// TestSectionMatchesOneStepwisePath: with no cooling, the stages of a
// real-gas section at one polytropic efficiency are pieces of one path of
// constant small-stage efficiency (Huntington, ASME J. Eng. Gas Turbines
// Power 107:872, 1985; Mallen & Saville 1977): the polytropic head is
// additive along it, so the sum of the stage heads and the section's
// discharge state equal those of one stepwise path over the whole ratio.
// Not exact: each stage integrates its own path on its own step grid and
// ends on a (P,h) flash, so the pieces carry their own discretisation and
// flash tolerances; agreement within 1e-5 relative on the head and 0.01 K
// on the discharge temperature (a few orders above those errors).
func TestSectionMatchesOneStepwisePath(t *testing.T) {
	d := service.SectionDuty{StageDuty: service.StageDuty{Gas: naturalGas(), SuctionPressure: 3e6, SuctionTemperature: 300,
		PressureRatio: f(3), MassFlow: f(20), PolytropicEfficiency: f(0.8)}, StageCount: ip(3), Arrangement: "inline"}
	res := sizeSection(t, d)
	require.Len(t, res.Stages, 3)
	require.Empty(t, res.Coolers)

	comp, err := gas.NewComposition([]gas.Fraction{{Name: "CH4", Value: 0.90}, {Name: "C2H6", Value: 0.05}, {Name: "C3H8", Value: 0.02},
		{Name: "N2", Value: 0.02}, {Name: "CO2", Value: 0.01}}, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewModel("peng-robinson", comp, nil)
	require.NoError(t, err)
	suction, err := m.State(300, 3e6)
	require.NoError(t, err)
	one, err := path.Compression(m, suction, 9e6, path.Efficiency{Basis: path.Polytropic, Value: 0.8}, path.Stepwise)
	require.NoError(t, err)
	assert.InEpsilon(t, float64(one.PolytropicHead), res.PolytropicHead, 1e-5)
	assert.InDelta(t, float64(one.Discharge.Temperature), float64(res.Discharge.Temperature), 0.01)
	assert.InEpsilon(t, 9e6, float64(res.Discharge.Pressure), 1e-9)
	// Equal heads per stage.
	for _, st := range res.Stages {
		assert.InEpsilon(t, res.PolytropicHead/3, float64(st.Path.PolytropicHead), 1e-5)
	}
	// Inline: one speed.
	assert.Equal(t, res.Stages[0].Speed, res.Stages[2].Speed)
	assert.Equal(t, res.Speed, res.Stages[0].Speed)
}

// TestSectionStageCountTipSpeed: air at 12:1 on closed steel impellers
// (tip-speed levels 300/350 m/s, common practice in physics/limits) needs
// several stages; with the closed-impeller pressure-ratio and head levels
// lifted (overrides, so that the tip speed alone bounds the count) the
// count chosen keeps every stage below 350 m/s and one stage fewer passes
// it (the head per stage, hence U2² = w/λ, rises as the count falls).
func TestSectionStageCountTipSpeed(t *testing.T) {
	big := 1e9
	d := service.SectionDuty{StageDuty: service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
		PressureRatio: f(12), MassFlow: f(8), PolytropicEfficiency: f(0.82),
		LimitOverrides: map[string]service.LevelOverride{"stage-pressure-ratio": {Warning: big}, "impeller-head": {Warning: big}}},
		Intercooling: &service.Intercooling{OutletTemperature: f(305)}}
	res := sizeSection(t, d)
	n := res.StageCount
	assert.Equal(t, "chosen", res.StageCountBasis)
	require.Greater(t, n, 1)
	maxTip := func(r service.SectionResult) float64 {
		m := 0.0
		for _, st := range r.Stages {
			m = math.Max(m, float64(st.Sizing.Velocities.TipSpeed))
		}
		return m
	}
	assert.LessOrEqual(t, maxTip(res), 350.0)
	d.StageCount = ip(n - 1)
	fewer := sizeSection(t, d)
	assert.Greater(t, maxTip(fewer), 350.0, "one stage fewer passes the closed-steel tip-speed limit")
	t.Logf("chosen %d stages: max tip speed %.1f m/s; %d stages: %.1f m/s", n, maxTip(res), n-1, maxTip(fewer))
}

// TestSectionBadInput: each impossible section names its field.
func TestSectionBadInput(t *testing.T) {
	base := func() service.SectionDuty {
		return service.SectionDuty{StageDuty: service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
			PressureRatio: f(4), MassFlow: f(5), PolytropicEfficiency: f(0.8)}, StageCount: ip(2),
			Intercooling: &service.Intercooling{OutletTemperature: f(300)}}
	}
	for _, c := range []struct {
		name  string
		edit  func(d *service.SectionDuty)
		field string
	}{
		{"stage count 0", func(d *service.SectionDuty) { d.StageCount = ip(0) }, "stage_count"},
		{"stage count absurd", func(d *service.SectionDuty) { d.StageCount = ip(1000) }, "stage_count"},
		{"cooler hotter than inlet", func(d *service.SectionDuty) { d.Intercooling.OutletTemperature = f(800) }, "intercooling.outlet_temperature"},
		{"cooler colder than coolant", func(d *service.SectionDuty) { d.Intercooling.CoolantTemperature = f(310) }, "intercooling.outlet_temperature"},
		{"after a stage past the last", func(d *service.SectionDuty) {
			d.Intercooling.AfterStages, d.Intercooling.AfterStagesGiven = []int{2}, true
		}, "intercooling.after_stages.0"},
		{"after stage 0", func(d *service.SectionDuty) {
			d.Intercooling.AfterStages, d.Intercooling.AfterStagesGiven = []int{0}, true
		}, "intercooling.after_stages.0"},
		{"unknown arrangement", func(d *service.SectionDuty) { d.Arrangement = "stacked" }, "arrangement"},
		{"pressure drop above the pressure", func(d *service.SectionDuty) { d.Intercooling.PressureDrop = 5e6 }, "intercooling.pressure_drop"},
		{"NaN pressure drop", func(d *service.SectionDuty) { d.Intercooling.PressureDrop = math.NaN() }, "intercooling.pressure_drop"},
	} {
		d := base()
		c.edit(&d)
		_, err := service.New().SizeSection(context.Background(), d)
		var ie *service.InputError
		require.True(t, errors.As(err, &ie), "%s: %v", c.name, err)
		assert.Equal(t, c.field, ie.Field, c.name)
	}
}
