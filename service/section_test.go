package service_test

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"

	"stagewright/service"
)

func TestSectionSmoke(t *testing.T) {
	n := 2
	d := service.SectionDuty{StageDuty: service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
		PressureRatio: f(4), MassFlow: f(5), PolytropicEfficiency: f(0.8)}, StageCount: &n,
		Intercooling: &service.Intercooling{OutletTemperature: f(300)}}
	res, err := service.New().SizeSection(context.Background(), d)
	require.NoError(t, err)
	for _, st := range res.Stages {
		t.Logf("stage p1 %.0f T1 %.2f p2 %.0f T2 %.2f Hp %.0f speed %.0f U2 %.1f gas %.0f", float64(st.Path.Suction.Pressure), float64(st.Path.Suction.Temperature), float64(st.Path.Discharge.Pressure), float64(st.Path.Discharge.Temperature), float64(st.Path.PolytropicHead), st.Speed, float64(st.Sizing.Velocities.TipSpeed), st.Power.Gas)
	}
	for _, c := range res.Coolers {
		t.Logf("cooler %d duty %.0f", c.AfterStage, c.Duty)
	}
	t.Logf("count %d head %.0f power %+v verdict %s", res.StageCount, res.PolytropicHead, res.Power, res.Verdict)
	d.StageCount = nil
	d.PressureRatio = f(8)
	res, err = service.New().SizeSection(context.Background(), d)
	require.NoError(t, err)
	t.Logf("chosen %d: %v", res.StageCount, res.Provenance.Methods[len(res.Provenance.Methods)-3:])
	for _, w := range res.Warnings {
		t.Logf("%d %s %s", w.Stage, w.Code, w.Message)
	}
}
