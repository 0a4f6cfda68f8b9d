package service_test

import (
	"errors"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// The ideal model's wet-suction screen judges water by IAPWS-IF97: at
// 303.15 K the IF97 saturation pressure is 4.2470 kPa (IF97 eq. 30, the
// value TestStandardVolumeOfHumidGasIsWet uses), so air saturated at
// 100 % relative humidity is a gas (it is what an intercooler leaves) and
// 2 % more water than saturation is wet: a 422 on suction.temperature.
func TestIdealScreenJudgesWaterByIF97(t *testing.T) {
	duty := func(g service.GasInput) service.StageDuty {
		return service.StageDuty{Gas: g, SuctionPressure: 99500, SuctionTemperature: 303.15, PressureRatio: f(1.6),
			MassFlow: f(2.5), Speed: f(18000), IsentropicEfficiency: f(0.82),
			Impeller: service.ImpellerInput{BladeExitAngle: f(45), SlipFactor: f(0.87), ExitMeridionalVelocity: f(90),
				Inlet: service.InletInput{Type: "axial-eye", HubRatio: f(0.3), MeridionalVelocity: f(120)}}}
	}
	saturated := duty(service.GasInput{Model: "ideal", Composition: map[string]float64{"air": 1}, RelativeHumidity: f(1)})
	res := size(t, saturated)
	assert.Greater(t, res.MassFlow, 0.0, "air saturated by IF97 is a gas")

	xw := 1.02 * 4247.0 / 99500
	over := duty(service.GasInput{Model: "ideal", Composition: map[string]float64{"air": 1 - xw, "H2O": xw}})
	_, err := service.New().SizeStage(t.Context(), over)
	require.Error(t, err)
	var ie *service.InputError
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "suction.temperature", ie.Field)
	assert.Contains(t, err.Error(), "wet or liquid gas at suction")
}
