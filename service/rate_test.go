package service_test

import (
	"context"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// rateAt rates the machine of a sizing at the sizing's own duty and speed.
func rateAt(t *testing.T, d service.StageDuty, res service.StageResult) service.Rating {
	t.Helper()
	mdot := res.MassFlow
	rd := service.RateDuty{Machine: res.Machine, Gas: d.Gas, SuctionPressure: d.SuctionPressure, SuctionTemperature: d.SuctionTemperature,
		MassFlow: &mdot, Speed: f(res.Speed)}
	r, err := service.New().RateMachine(context.Background(), rd)
	require.NoError(t, err)
	return r
}

// TestRateRoundTrip: a sized stage's machine, rated at the design duty and
// speed, gives back the sizing's head, discharge, efficiency and power
// (the round-trip proof; the off-design model uses the sizing's
// relations, so agreement is to the solver tolerance).
func TestRateRoundTrip(t *testing.T) {
	cases := []struct {
		name string
		d    service.StageDuty
		tol  float64
	}{
		{"constant-property air, everything chosen", service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
			PressureRatio: f(1.8), MassFlow: f(5)}, 1e-6},
		{"constant-property air, radial inlet, given slip", service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
			PressureRatio: f(1.6), MassFlow: f(3), Speed: f(14000), PolytropicEfficiency: f(0.8),
			Impeller: service.ImpellerInput{SlipFactor: f(0.88), BladeExitAngle: f(30),
				Inlet: service.InletInput{Type: "radial", DiameterRatio: f(0.5), MeridionalVelocity: f(80)}}}, 1e-6},
		{"peng-robinson natural gas", service.StageDuty{Gas: service.GasInput{Model: "peng-robinson",
			Composition: map[string]float64{"CH4": 0.9, "C2H6": 0.05, "C3H8": 0.03, "N2": 0.01, "CO2": 0.01}},
			SuctionPressure: 30e5, SuctionTemperature: 300, PressureRatio: f(1.5), MassFlow: f(20)}, 1e-6},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res := size(t, tc.d)
			r := rateAt(t, tc.d, res)
			assert.InEpsilon(t, float64(res.Path.PolytropicHead), r.PolytropicHead, tc.tol, "polytropic head")
			assert.InEpsilon(t, float64(res.Path.IsentropicHead), r.IsentropicHead, tc.tol, "isentropic head")
			assert.InEpsilon(t, float64(res.Path.Discharge.Pressure), r.DischargePressure, tc.tol, "discharge pressure")
			assert.InEpsilon(t, float64(res.Path.Discharge.Temperature), r.DischargeTemperature, tc.tol, "discharge temperature")
			assert.InEpsilon(t, res.Path.PolytropicEfficiency, r.PolytropicEfficiency, tc.tol, "polytropic efficiency")
			assert.InEpsilon(t, res.Power.Shaft, r.Power.Shaft, tc.tol, "shaft power")
			assert.InDelta(t, 1, r.OperatingPoint.DesignFlowRatio, 1e-9)
			op := r.OperatingPoint
			assert.Greater(t, op.SurgeMargin, 0.0)
			assert.Greater(t, op.ChokeMargin, 0.0)
			t.Logf("surge margin %.3f choke margin %.3f surge %.4g choke %.4g m3/s; warnings %d", op.SurgeMargin, op.ChokeMargin, op.SurgeFlow, op.ChokeFlow, len(r.Warnings))
			assert.False(t, math.IsNaN(r.Power.DriverMargin))
		})
	}
}

func natGas() service.GasInput {
	return service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"CH4": 0.9, "C2H6": 0.05, "C3H8": 0.03, "N2": 0.01, "CO2": 0.01}}
}

// TestSpeedForDischargePressure: the speed solved for a discharge pressure,
// rated again at that speed, gives the pressure back (the proof);
// for the constant-property gas and Peng-Robinson, above and below design.
func TestSpeedForDischargePressure(t *testing.T) {
	for _, gasIn := range []service.GasInput{textbookAir(), natGas()} {
		p1 := 1e5
		if gasIn.Model != "ideal-constant" {
			p1 = 30e5
		}
		d := service.StageDuty{Gas: gasIn, SuctionPressure: p1, SuctionTemperature: 300, PressureRatio: f(1.6), MassFlow: f(5)}
		res := size(t, d)
		for _, target := range []float64{1.45 * p1, 1.6 * p1, 1.7 * p1} {
			rd := service.RateDuty{Machine: res.Machine, Gas: gasIn, SuctionPressure: p1, SuctionTemperature: 300, MassFlow: f(5), DischargePressure: f(target)}
			r, err := service.New().RateMachine(context.Background(), rd)
			require.NoError(t, err, "%s %g", gasIn.Model, target)
			assert.Equal(t, "discharge-pressure", r.SpeedBasis)
			assert.InEpsilon(t, target, r.DischargePressure, 1e-9)
			rd.DischargePressure, rd.Speed = nil, f(r.Speed)
			again, err := service.New().RateMachine(context.Background(), rd)
			require.NoError(t, err)
			assert.InEpsilon(t, target, again.DischargePressure, 1e-9, "rated at the solved speed %g", r.Speed)
		}
		rd := service.RateDuty{Machine: res.Machine, Gas: gasIn, SuctionPressure: p1, SuctionTemperature: 300, MassFlow: f(5), DischargePressure: f(50 * p1)}
		_, err := service.New().RateMachine(context.Background(), rd)
		requireField(t, err, "discharge_pressure")
	}
}

func requireField(t *testing.T, err error, field string) *service.InputError {
	t.Helper()
	var ie *service.InputError
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, field, ie.Field, ie.Error())
	return ie
}

// TestRateBadInput: clear problems naming the field, never a panic or NaN
// (the bad-input proof).
func TestRateBadInput(t *testing.T) {
	d := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300, PressureRatio: f(1.8), MassFlow: f(5)}
	res := size(t, d)
	base := func() service.RateDuty {
		m := res.Machine
		m.Stages = append([]service.MachineStage(nil), m.Stages...)
		return service.RateDuty{Machine: m, Gas: d.Gas, SuctionPressure: 1e5, SuctionTemperature: 300, MassFlow: f(5), Speed: f(res.Speed)}
	}
	cases := []struct {
		name  string
		edit  func(*service.RateDuty)
		field string
		shape bool
	}{
		{"empty stage list", func(r *service.RateDuty) { r.Machine.Stages = nil }, "machine.stages", true},
		{"exit width wider than the tip diameter", func(r *service.RateDuty) { r.Machine.Stages[0].ExitWidth = 2 * r.Machine.Stages[0].TipDiameter }, "machine.stages.0.exit_width", false},
		{"negative tip diameter", func(r *service.RateDuty) { r.Machine.Stages[0].TipDiameter = -0.3 }, "machine.stages.0.tip_diameter", false},
		{"NaN exit width", func(r *service.RateDuty) { r.Machine.Stages[0].ExitWidth = math.NaN() }, "machine.stages.0.exit_width", false},
		{"missing eye", func(r *service.RateDuty) { r.Machine.Stages[0].Inlet.EyeTipDiameter = nil }, "machine.stages.0.inlet.eye_tip_diameter", true},
		{"absurd speed", func(r *service.RateDuty) { r.Speed = f(1e7) }, "speed", false},
		{"zero speed", func(r *service.RateDuty) { r.Speed = f(0) }, "speed", false},
		{"speed and discharge pressure", func(r *service.RateDuty) { r.DischargePressure = f(2e5) }, "speed", true},
		{"no flow", func(r *service.RateDuty) { r.MassFlow = nil }, "flow", true},
		{"flow past choke", func(r *service.RateDuty) { r.MassFlow = f(50) }, "flow", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			rd := base()
			tc.edit(&rd)
			_, err := service.New().RateMachine(context.Background(), rd)
			ie := requireField(t, err, tc.field)
			assert.Equal(t, tc.shape, ie.Shape)
			if tc.name == "flow past choke" {
				assert.Contains(t, ie.Sentence(), "choke flow of")
			}
		})
	}
}
