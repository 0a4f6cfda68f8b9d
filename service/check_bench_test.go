package service_test

import (
	"context"
	"testing"

	"stagewright/service"
)

// k4101Gas is the fuel gas of the demo asset K-4101 (invented Kestrel
// Ridge plant; testdata/checks/kestrel-k4101.size.json).
func k4101Gas() service.GasInput {
	return service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"CH4": 0.89, "C2H6": 0.06, "C3H8": 0.02, "N2": 0.015, "CO2": 0.015}}
}

func benchCheck(b *testing.B, m service.Machine, d service.CheckDuty) {
	svc := service.New()
	req := service.CheckRequest{Machine: m, Duty: d}
	if _, err := svc.CheckMachine(context.Background(), req); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := svc.CheckMachine(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCheckOneStagePR: K-4101 (one stage, Peng-Robinson fuel gas)
// checked at 5 % more flow than its design (two speed solves: baseline and
// duty).
func BenchmarkCheckOneStagePR(b *testing.B) {
	svc := service.New()
	res, err := svc.SizeStage(context.Background(), service.StageDuty{Gas: k4101Gas(), SuctionPressure: 25e5, SuctionTemperature: 303.15,
		DischargePressure: f(38e5), MassFlow: f(12)})
	if err != nil {
		b.Fatal(err)
	}
	benchCheck(b, res.Machine, service.CheckDuty{Gas: k4101Gas(), SuctionPressure: 25e5, SuctionTemperature: 303.15, MassFlow: f(12.6), DischargePressure: 38e5})
}

// BenchmarkCheckFourStagePR: a four-stage in-line section of the same gas
// (25 to 90 bar, 12 kg/s, intercooled to 35 degC with 0.5 bar drop),
// checked at 5 % more flow.
func BenchmarkCheckFourStagePR(b *testing.B) {
	svc := service.New()
	n, out := 4, 308.15
	res, err := svc.SizeSection(context.Background(), service.SectionDuty{
		StageDuty: service.StageDuty{Gas: k4101Gas(), SuctionPressure: 25e5, SuctionTemperature: 303.15,
			DischargePressure: f(90e5), MassFlow: f(12)},
		StageCount: &n, Arrangement: "inline",
		Intercooling: &service.Intercooling{OutletTemperature: &out, PressureDrop: 0.5e5}})
	if err != nil {
		b.Fatal(err)
	}
	if len(res.Machine.Stages) != 4 {
		b.Fatalf("%d stages", len(res.Machine.Stages))
	}
	benchCheck(b, res.Machine, service.CheckDuty{Gas: k4101Gas(), SuctionPressure: 25e5, SuctionTemperature: 303.15, MassFlow: f(12.6),
		DischargePressure: float64(res.Discharge.Pressure)})
}
