package service_test

import (
	"context"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// rateSection rates a section's machine at its suction state, with the
// mass flow scaled by flowFactor, at the first stage's design speed.
func rateSection(t *testing.T, d service.SectionDuty, res service.SectionResult, flowFactor float64) service.Rating {
	t.Helper()
	mdot := res.Stages[0].MassFlow * flowFactor
	rd := service.RateDuty{Machine: res.Machine, Gas: d.Gas, SuctionPressure: d.SuctionPressure, SuctionTemperature: d.SuctionTemperature,
		MassFlow: &mdot, Speed: f(res.Stages[0].Speed)}
	r, err := service.New().RateMachine(context.Background(), rd)
	require.NoError(t, err)
	return r
}

// TestSectionStackingRoundTrip: the machine of a designed section, rated by
// stage stacking at its own duty and speed, gives the design back, stage by
// stage (suction state after each cooler, head, discharge) and in total;
// at 8 % more flow at the same speed the stages no longer match: the later
// stages see relatively more volume flow (the density rise of the earlier
// stages falls with their head): the flow over design rises from stage to
// stage, and where the stages share a design flow coefficient (geared,
// hence about one design choke margin) the last is the first to near
// choke; inline stages at one speed start from different margins. This
// is the stage-matching behaviour of multistage machines described by
// Lüdtke, Process Centrifugal Compressors (2004), ch. 6 and Cumpsty,
// Compressor Aerodynamics (1989), ch. 1 (from memory).
func TestSectionStackingRoundTrip(t *testing.T) {
	cases := []struct {
		name string
		d    service.SectionDuty
	}{
		{"geared air, intercooled, efficiency estimated", service.SectionDuty{StageDuty: service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
			PressureRatio: f(6), MassFlow: f(4)}, StageCount: ip(3), Intercooling: &service.Intercooling{OutletTemperature: f(305), PressureDrop: 4e3}}},
		{"inline natural gas, no cooling", service.SectionDuty{StageDuty: service.StageDuty{Gas: naturalGas(), SuctionPressure: 3e6, SuctionTemperature: 300,
			PressureRatio: f(2.2), MassFlow: f(20), PolytropicEfficiency: f(0.8)}, StageCount: ip(3), Arrangement: "inline"}},
		{"geared humid air, condensate", service.SectionDuty{StageDuty: service.StageDuty{Gas: service.GasInput{Model: "ideal",
			Composition: map[string]float64{"dry-air": 1}, RelativeHumidity: f(0.8)}, SuctionPressure: 1e5, SuctionTemperature: 303,
			PressureRatio: f(5), MassFlow: f(3), PolytropicEfficiency: f(0.82)}, StageCount: ip(2), Intercooling: &service.Intercooling{OutletTemperature: f(308)}}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res := sizeSection(t, tc.d)
			r := rateSection(t, tc.d, res, 1)
			require.Len(t, r.Stages, len(res.Stages))
			for k, st := range res.Stages {
				rs := r.Stages[k]
				assert.InEpsilon(t, float64(st.Path.Suction.Pressure), rs.SuctionPressure, 1e-6, "stage %d suction pressure", k+1)
				assert.InEpsilon(t, float64(st.Path.Suction.Temperature), rs.SuctionTemperature, 1e-6, "stage %d suction temperature", k+1)
				assert.InEpsilon(t, st.MassFlow, rs.MassFlow, 1e-6, "stage %d mass flow", k+1)
				assert.InEpsilon(t, float64(st.Path.PolytropicHead), float64(rs.Point.Compression.PolytropicHead), 1e-5, "stage %d head", k+1)
			}
			assert.InEpsilon(t, float64(res.Discharge.Pressure), r.DischargePressure, 1e-5, "discharge pressure")
			assert.InEpsilon(t, float64(res.Discharge.Temperature), r.DischargeTemperature, 1e-5, "discharge temperature")
			assert.InEpsilon(t, res.Power.Gas, r.Power.Gas, 1e-5, "gas power")

			more := rateSection(t, tc.d, res, 1.08)
			n := len(more.Stages)
			last := more.Stages[n-1]
			for k := range n - 1 {
				assert.Less(t, more.Stages[k].DesignFlowRatio, last.DesignFlowRatio, "stage %d sees less of the extra flow than the last", k+1)
				if tc.d.Arrangement != "inline" {
					// Geared stages share one design flow coefficient, hence
					// one design choke margin: the last is nearest choke.
					assert.Less(t, last.ChokeMargin, more.Stages[k].ChokeMargin, "the last stage is nearer choke than stage %d", k+1)
				}
			}
			if tc.d.Arrangement != "inline" {
				assert.Equal(t, n, more.OperatingPoint.ChokeStage, "the rating names the last stage as the one nearest choke")
			}
			t.Logf("at 108 %% flow: design-flow ratios %.4f .. %.4f, choke margins first %.3f last %.3f (design %.3f, %.3f); choke stage named %d",
				more.Stages[0].DesignFlowRatio, last.DesignFlowRatio, more.Stages[0].ChokeMargin, last.ChokeMargin, r.Stages[0].ChokeMargin, r.Stages[n-1].ChokeMargin, more.OperatingPoint.ChokeStage)
		})
	}
}
