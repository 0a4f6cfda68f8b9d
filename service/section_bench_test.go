package service_test

import (
	"context"
	"testing"

	"stagewright/service"
)

// benchSectionDuty is a 4-stage natural-gas section (Peng-Robinson) with
// everything chosen but the count: speeds, efficiencies, blading, eyes.
func benchSectionDuty() service.SectionDuty {
	return service.SectionDuty{StageDuty: service.StageDuty{Gas: naturalGas(), SuctionPressure: 2e6, SuctionTemperature: 300,
		PressureRatio: f(4), MassFlow: f(15)}, StageCount: ip(4), Intercooling: &service.Intercooling{OutletTemperature: f(310), PressureDrop: 50e3}}
}

// BenchmarkSizeSectionNaturalGas4: the whole section use case.
//
//	go test ./service -run xxx -bench SectionNaturalGas
func BenchmarkSizeSectionNaturalGas4(b *testing.B) {
	svc := service.New()
	d := benchSectionDuty()
	for b.Loop() {
		if _, err := svc.SizeSection(context.Background(), d); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRateSectionNaturalGas4: the stacked rating of that section's
// machine at its design duty and speed.
func BenchmarkRateSectionNaturalGas4(b *testing.B) {
	svc := service.New()
	d := benchSectionDuty()
	res, err := svc.SizeSection(context.Background(), d)
	if err != nil {
		b.Fatal(err)
	}
	mdot, n := res.Stages[0].MassFlow, res.Stages[0].Speed
	rd := service.RateDuty{Machine: res.Machine, Gas: d.Gas, SuctionPressure: d.SuctionPressure, SuctionTemperature: d.SuctionTemperature,
		MassFlow: &mdot, Speed: &n}
	for b.Loop() {
		if _, err := svc.RateMachine(context.Background(), rd); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSizeSectionNaturalGasChosenCount: the same duty with the
// stage count chosen too (every count up to the first inside its levels).
func BenchmarkSizeSectionNaturalGasChosenCount(b *testing.B) {
	svc := service.New()
	d := benchSectionDuty()
	d.StageCount = nil
	for b.Loop() {
		if _, err := svc.SizeSection(context.Background(), d); err != nil {
			b.Fatal(err)
		}
	}
}
